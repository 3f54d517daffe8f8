//! Fuzzing the loader: `load_str` (and, when it accepts, the plan and the cost estimate) never
//! panics, whatever the text. Five seeded generators, 110 000 cases in all: random bytes, YAML
//! punctuation soup, mutations of valid scenarios (the worked ones and a few that touch every
//! read-out), random scenarios assembled from the known keys with extreme values, and random trees
//! of known key names. The seeds are fixed, so a failure reproduces exactly.

use motley_scenario::cost::estimate;
use motley_scenario::load_str;
use motley_scenario::plan::plan;
use proptest::prelude::*;
use proptest::strategy::ValueTree;
use proptest::test_runner::{Config, RngAlgorithm, TestRng, TestRunner};

/// Valid scenarios the mutations start from.
const BASES: &[&str] = &[
    include_str!("../../../scenarios/packed-inverse.yaml"),
    include_str!("../../../scenarios/rainbow-near-miss.yaml"),
    include_str!("../../../scenarios/rainbow-symmetry.yaml"),
    include_str!("../../../scenarios/second-class-tasep.yaml"),
    include_str!("../../../scenarios/second-third-swap.yaml"),
    include_str!("../../../scenarios/step-height.yaml"),
    // Every six-vertex read-out and boundary.
    "name: six
seed: 3
samples: 500
exact: auto
models:
  a:
    six-vertex:
      width: 4
      height: 3
      b1: \"1/3\"
      b2: 0.6
      left: rainbow
      bottom: {blocks: {first: 2, color: 1, rest: 0}}
      strength: smaller-wins
  b:
    six-vertex: {width: 3, height: 4, b1: 0.4, b2: 0.5, left: {bernoulli: {density: 0.5, color: rainbow}}, bottom: {list: [1, 0, 2]}}
observables:
  t: {of: a, read: {top: colors}, map: reflection}
  r: {of: a, read: {right: positions}, threshold: 2}
  row: {of: b, read: {row: {y: 2, as: positions}}, map: identity}
  col: {of: b, read: {column: {x: 1, as: colors}}}
  h: {of: a, read: {height: {x: 2, y: 3}}, scale: 0.5}
  e: {of: a, read: {exit-column: 2}}
claims:
  - {id: one, same-law: [t, r]}
  - {id: two, law-of: {observable: h, reference: {normal: {mean: 1, sd: 2}}}}
  - {id: three, describe: e, reference: {uniform: [0, 4]}, limit: 2}
  - {id: four, describe: row}
  - {id: five, describe: col, exact: off}
",
    // Every exclusion read-out.
    "name: excl
seed: 4
samples: 500
alpha: 0.05
power: 0.9
models:
  s:
    exclusion: {lattice: {segment: 5}, p: 1, q: \"1/2\", initial: packed, strength: smaller-wins}
  r:
    exclusion: {lattice: {ring: 6}, p: 0.7, q: 0.3, initial: {list: [1, 2, 3, 0, 0, 4]}}
  l:
    exclusion: {lattice: line, p: 1, q: 0, initial: {step: {left: 1, right: 0, at: 0, block: [2, 3]}}, strength: smaller-wins}
observables:
  sig: {of: s, read: {arrangement: {time: 1}}}
  inv: {of: s, read: {inverse-arrangement: {time: 1}}}
  win: {of: r, read: {window: {from: 1, to: 6, time: 2, as: positions}}, threshold: 2}
  pos: {of: l, read: {position: {class: 2, time: 5}}}
  cur: {of: r, read: {current: {bond: 3, time: 2}}}
  hx: {of: l, read: {height: {x: 0, time: 5}}}
  sw: {of: l, read: {swapped: {classes: [2, 3], time: 5}}}
  at: {of: r, read: {attempted: {classes: [1, 2], time: 1}}}
  prof: {of: l, read: {window: {from: -10, to: 10, time: 5, as: positions}}}
claims:
  - {id: a, same-law: [sig, inv], exact: on}
  - {id: b, describe: win}
  - {id: c, law-of: {observable: pos, reference: {tail-from-profile: prof}}}
  - {id: d, probability: {event: sw, equals: 0.5}}
  - {id: e, probability: {event: at}}
  - {id: f, same-law: [cur, hx]}
",
];

/// Replacement values: extremes, wrong types, special floats.
const EXTREMES: &[&str] = &[
    "1e308",
    "-1e308",
    "1e309",
    "-1",
    "0",
    "-0",
    "1",
    "2",
    "0.5",
    "4.9e-324",
    ".nan",
    ".NaN",
    "NaN",
    ".inf",
    "-.inf",
    "inf",
    "9223372036854775807",
    "-9223372036854775808",
    "9223372036854775808",
    "18446744073709551615",
    "18446744073709551616",
    "99999999999999999999999999",
    "1048576",
    "1048577",
    "1099511627776",
    "1099511627777",
    "65536",
    "65537",
    "\"1/0\"",
    "\"0/0\"",
    "\"-1/3\"",
    "\"1/-3\"",
    "\"9223372036854775807/1\"",
    "\"-9223372036854775808/-1\"",
    "\"3/2\"",
    "0x10",
    "1_000",
    "~",
    "null",
    "true",
    "''",
    "[]",
    "{}",
    "[1, 2]",
    "rainbow",
    "\"\"",
    "\"a b\"",
    "&x 1",
    "*x",
    "!!str 3",
];

/// Key names of the scenario format and a few names.
const KEYS: &[&str] = &[
    "name",
    "title",
    "description",
    "seed",
    "samples",
    "alpha",
    "power",
    "exact",
    "models",
    "observables",
    "claims",
    "six-vertex",
    "exclusion",
    "width",
    "height",
    "b1",
    "b2",
    "left",
    "bottom",
    "strength",
    "rainbow",
    "empty",
    "step",
    "list",
    "blocks",
    "first",
    "color",
    "rest",
    "bernoulli",
    "density",
    "lattice",
    "segment",
    "ring",
    "line",
    "p",
    "q",
    "initial",
    "packed",
    "at",
    "block",
    "of",
    "read",
    "threshold",
    "map",
    "scale",
    "identity",
    "reflection",
    "shift",
    "top",
    "right",
    "row",
    "column",
    "exit-column",
    "window",
    "position",
    "arrangement",
    "inverse-arrangement",
    "current",
    "swapped",
    "attempted",
    "x",
    "y",
    "time",
    "from",
    "to",
    "as",
    "class",
    "bond",
    "classes",
    "id",
    "says",
    "same-law",
    "law-of",
    "probability",
    "describe",
    "reference",
    "limit",
    "observable",
    "uniform",
    "normal",
    "mean",
    "sd",
    "tail-from-profile",
    "event",
    "equals",
    "m",
    "o",
    "a",
    "b",
];

/// Plain scalars for trees.
const SCALARS: &[&str] = &[
    "m",
    "o",
    "a",
    "b",
    "colors",
    "positions",
    "rainbow",
    "empty",
    "packed",
    "line",
    "auto",
    "on",
    "off",
    "larger-wins",
    "smaller-wins",
    "identity",
    "reflection",
    "0",
    "1",
    "2",
    "3",
    "5",
    "-1",
    "0.5",
    "1e308",
    ".nan",
    ".inf",
    "1048576",
    "9223372036854775807",
    "\"1/3\"",
    "\"1/0\"",
    "~",
    "true",
];

/// Checks one text: loading never panics; an error names the file first; an accepted scenario
/// plans and gets a finite, positive memory estimate.
fn check(text: &str) -> Result<(), TestCaseError> {
    match load_str(text, "fuzz.yaml") {
        Err(e) => {
            if !e.path.is_empty() {
                KEYED.with(|c| c.set(c.get() + 1));
            }
            prop_assert!(
                e.first_line().starts_with("fuzz.yaml"),
                "{}",
                e.first_line()
            );
            prop_assert!(!e.message.is_empty());
        }
        Ok(s) => {
            ACCEPTED.with(|c| c.set(c.get() + 1));
            let p = plan(&s, "fuzz.yaml").expect("load_str already planned it");
            let c = estimate(&s, &p, 4);
            prop_assert!(c.bytes.is_finite() && c.bytes > 0.0, "{c:?}");
            prop_assert!(!c.seconds.is_nan(), "{c:?}");
        }
    }
    Ok(())
}

thread_local! {
    /// Cases of this thread's test that loaded, and that failed with a keyed (located) error.
    static ACCEPTED: std::cell::Cell<u32> = const { std::cell::Cell::new(0) };
    static KEYED: std::cell::Cell<u32> = const { std::cell::Cell::new(0) };
}

fn runner(cases: u32, seed: u8) -> TestRunner {
    let config = Config {
        cases,
        failure_persistence: None,
        rng_algorithm: RngAlgorithm::ChaCha,
        max_shrink_iters: 2000,
        ..Config::default()
    };
    let mut key = [0u8; 32];
    key[0] = seed;
    key[31] = 0x7e;
    TestRunner::new_with_rng(config, TestRng::from_seed(RngAlgorithm::ChaCha, &key))
}

fn run_all<S: Strategy>(cases: u32, seed: u8, strategy: S, to_text: impl Fn(S::Value) -> String) {
    let mut r = runner(cases, seed);
    let result = r.run(&strategy, |v| check(&to_text(v)));
    if let Err(e) = result {
        panic!("{e}");
    }
    eprintln!(
        "seed {seed}: {cases} cases, {} accepted, {} refused with a key path",
        ACCEPTED.with(|c| c.get()),
        KEYED.with(|c| c.get())
    );
}

#[test]
fn bases_are_valid() {
    // The mutations start from valid scenarios, so they reach the deep checks.
    for b in BASES {
        if let Err(e) = load_str(b, "base.yaml") {
            panic!("{e}");
        }
    }
    // And the runner really is deterministic: the same seed gives the same first values.
    let s = proptest::collection::vec(any::<u8>(), 8);
    let a = s.new_tree(&mut runner(1, 1)).unwrap().current();
    let b = s.new_tree(&mut runner(1, 1)).unwrap().current();
    assert_eq!(a, b);
}

#[test]
fn random_bytes() {
    run_all(
        15_000,
        1,
        proptest::collection::vec(any::<u8>(), 0..300),
        |b| String::from_utf8_lossy(&b).into_owned(),
    );
}

#[test]
fn punctuation_soup() {
    let tokens = prop::sample::select(vec![
        "{",
        "}",
        "[",
        "]",
        ":",
        ": ",
        ", ",
        " ",
        "\n",
        "\n  ",
        "\n    ",
        "- ",
        "-",
        "---",
        "...",
        "&a ",
        "*a",
        "!t ",
        "!!map ",
        "'",
        "\"",
        "#",
        "?",
        "? ",
        "|",
        ">",
        "%YAML 1.2\n",
        "\t",
        "\\",
        "\u{0}",
        "\u{feff}",
        "é",
        "name",
        "seed",
        "samples",
        "models",
        "x",
        "1",
        "-1",
        ".nan",
        "1e999",
        "<<: *a",
    ]);
    run_all(20_000, 2, proptest::collection::vec(tokens, 0..80), |v| {
        v.concat()
    });
}

/// One edit of a text.
#[derive(Debug, Clone)]
enum Edit {
    DeleteLine(usize),
    DuplicateLine(usize),
    SwapLines(usize, usize),
    ReplaceNumber(usize, &'static str),
    ReplaceWord(usize, &'static str),
    Indent(usize, bool),
    Truncate(usize),
    Insert(usize, &'static str),
}

fn apply(text: &str, e: &Edit) -> String {
    let mut lines: Vec<String> = text.lines().map(str::to_string).collect();
    let n = lines.len().max(1);
    match *e {
        Edit::DeleteLine(i) if !lines.is_empty() => {
            lines.remove(i % n);
        }
        Edit::DuplicateLine(i) if !lines.is_empty() => {
            let l = lines[i % n].clone();
            lines.insert(i % n, l);
        }
        Edit::SwapLines(i, j) if !lines.is_empty() => lines.swap(i % n, j % n),
        Edit::Indent(i, deeper) if !lines.is_empty() => {
            let l = &mut lines[i % n];
            if deeper {
                l.insert_str(0, "  ");
            } else if l.starts_with("  ") {
                l.replace_range(..2, "");
            }
        }
        Edit::ReplaceNumber(k, v) => {
            return replace_token(text, k, v, |t| {
                t.chars().all(|c| c.is_ascii_digit() || "-.e".contains(c))
                    && t.chars().any(|c| c.is_ascii_digit())
            })
        }
        Edit::ReplaceWord(k, v) => {
            return replace_token(text, k, v, |t| {
                t.chars().all(|c| c.is_ascii_alphanumeric() || c == '-')
            })
        }
        Edit::Truncate(k) => {
            let cut = (0..=k % (text.len() + 1))
                .rev()
                .find(|&c| text.is_char_boundary(c))
                .unwrap_or(0);
            return text[..cut].to_string();
        }
        Edit::Insert(k, v) => {
            let at = (0..=k % (text.len() + 1))
                .rev()
                .find(|&c| text.is_char_boundary(c))
                .unwrap_or(0);
            return format!("{}{v}{}", &text[..at], &text[at..]);
        }
        _ => {}
    }
    let mut out = lines.join("\n");
    out.push('\n');
    out
}

/// Replaces the `k`-th (cyclically) token satisfying `is` by `v`.
fn replace_token(text: &str, k: usize, v: &str, is: impl Fn(&str) -> bool) -> String {
    let mut spans = Vec::new();
    let mut start = None;
    for (i, c) in text.char_indices().chain([(text.len(), ' ')]) {
        let part = c.is_ascii_alphanumeric() || "-._".contains(c);
        match (part, start) {
            (true, None) => start = Some(i),
            (false, Some(s)) => {
                if is(&text[s..i]) {
                    spans.push((s, i));
                }
                start = None;
            }
            _ => {}
        }
    }
    if spans.is_empty() {
        return text.to_string();
    }
    let (s, e) = spans[k % spans.len()];
    format!("{}{v}{}", &text[..s], &text[e..])
}

#[test]
fn mutated_scenarios() {
    let extreme = prop::sample::select(EXTREMES.to_vec());
    let key = prop::sample::select(KEYS.to_vec());
    let edit = prop_oneof![
        1 => any::<usize>().prop_map(Edit::DeleteLine),
        1 => any::<usize>().prop_map(Edit::DuplicateLine),
        1 => (any::<usize>(), any::<usize>()).prop_map(|(i, j)| Edit::SwapLines(i, j)),
        4 => (any::<usize>(), extreme.clone()).prop_map(|(k, v)| Edit::ReplaceNumber(k, v)),
        2 => (any::<usize>(), key.clone()).prop_map(|(k, v)| Edit::ReplaceWord(k, v)),
        1 => (any::<usize>(), any::<bool>()).prop_map(|(i, d)| Edit::Indent(i, d)),
        1 => any::<usize>().prop_map(Edit::Truncate),
        1 => (any::<usize>(), prop_oneof![extreme, key, Just("\n"), Just(": "), Just("{"), Just("- "), Just("---\n")])
            .prop_map(|(k, v)| Edit::Insert(k, v)),
    ];
    let case = (0..BASES.len(), proptest::collection::vec(edit, 1..5));
    run_all(40_000, 3, case, |(b, edits)| {
        edits.iter().fold(BASES[b].to_string(), |t, e| apply(&t, e))
    });
    // The mutations must reach past the parser: some still load, many fail a keyed check.
    assert!(ACCEPTED.with(|c| c.get()) >= 2_000, "too few mutants load");
    assert!(
        KEYED.with(|c| c.get()) >= 10_000,
        "too few mutants reach keyed checks"
    );
}

/// A random scenario assembled from the format's own pieces, values drawn from small pools with
/// extremes mixed in, so that many cases pass the syntax and type checks and reach validation.
fn assembled() -> impl Strategy<Value = String> {
    // Mostly plausible values, one in ten drawn from the bad ones.
    fn mix(good: Vec<&'static str>, bad: Vec<&'static str>) -> BoxedStrategy<&'static str> {
        prop_oneof![9 => prop::sample::select(good), 1 => prop::sample::select(bad)].boxed()
    }
    let int = || {
        mix(
            vec!["1", "2", "3", "4", "5"],
            vec![
                "7",
                "0",
                "-1",
                "1048576",
                "1048577",
                "9223372036854775807",
                "2.5",
            ],
        )
    };
    let num = || {
        mix(
            vec!["0.5", "1", "\"1/3\"", "0.2"],
            vec![
                "0", "\"1/0\"", "-0.1", "1.5", ".nan", ".inf", "1e7", "\"x\"",
            ],
        )
    };
    let time = || {
        mix(
            vec!["1", "0.5", "3"],
            vec!["100", "0", "-1", ".nan", ".inf", "1e10", "1e9"],
        )
    };
    let model_name = || mix(vec!["a", "b"], vec!["c", "zz", "o1"]);
    let name = || mix(vec!["o1", "o2", "o3"], vec!["a", "zz", "o4"]);
    let boundary = prop::sample::select(vec![
        "rainbow",
        "empty",
        "{step: 1}",
        "{step: 3}",
        "{step: -1}",
        "{list: [1, 2, 3]}",
        "{list: []}",
        "{blocks: {first: 2, color: 2, rest: 1}}",
        "{blocks: {first: 9, color: 1, rest: 0}}",
        "{bernoulli: {density: 0.5, color: 1}}",
        "{bernoulli: {density: .nan, color: rainbow}}",
        "{bernoulli: {density: 1, color: blue}}",
        "{bernoulli: {density: 0.2, color: 0}}",
    ]);
    let six = (int(), int(), num(), num(), boundary.clone(), boundary, prop::sample::select(vec!["", ", strength: smaller-wins", ", strength: larger-wins"]))
        .prop_map(|(w, h, b1, b2, l, b, st)| format!("{{six-vertex: {{width: {w}, height: {h}, b1: {b1}, b2: {b2}, left: {l}, bottom: {b}{st}}}}}"));
    let lattice =
        (prop::sample::select(vec!["segment", "ring", "line"]), int()).prop_map(|(k, n)| {
            if k == "line" {
                "line".to_string()
            } else {
                format!("{{{k}: {n}}}")
            }
        });
    let initial = prop::sample::select(vec![
        "packed",
        "{list: [1, 2, 3]}",
        "{list: [2, 1, 3, 4, 5]}",
        "{list: [1, 0, 0, 2, 0]}",
        "{step: {left: 1, right: 0, at: 0, block: [2, 3]}}",
        "{step: {left: 1, right: 0}}",
        "{step: {left: 1, right: 1, block: [2]}}",
    ]);
    let excl = (
        lattice,
        num(),
        num(),
        initial,
        prop::sample::select(vec!["", ", strength: smaller-wins"]),
    )
        .prop_map(|(la, p, q, i, st)| {
            format!("{{exclusion: {{lattice: {la}, p: {p}, q: {q}, initial: {i}{st}}}}}")
        });
    let model = prop_oneof![six, excl];
    let read = (
        prop::sample::select(vec![
            "{top: colors}",
            "{top: positions}",
            "{right: colors}",
            "{row: {y: Y, as: positions}}",
            "{column: {x: X, as: colors}}",
            "{height: {x: X, y: Y}}",
            "{height: {x: X, time: T}}",
            "{exit-column: X}",
            "{window: {from: X, to: Y, time: T, as: positions}}",
            "{window: {from: X, to: Y, time: T, as: colors}}",
            "{position: {class: X, time: T}}",
            "{arrangement: {time: T}}",
            "{inverse-arrangement: {time: T}}",
            "{current: {bond: X, time: T}}",
            "{swapped: {classes: [X, Y], time: T}}",
            "{attempted: {classes: [X, Y], time: T}}",
        ]),
        int(),
        int(),
        time(),
    )
        .prop_map(|(r, x, y, t)| r.replace('X', x).replace('Y', y).replace('T', t));
    let modifier = prop::sample::select(vec![
        "",
        "",
        "",
        "",
        "",
        ", threshold: 2",
        ", threshold: 9",
        ", map: reflection",
        ", map: identity",
        ", map: {shift: 1}",
        ", map: {shift: -9223372036854775808}",
        ", scale: 0.5",
        ", scale: 0",
    ]);
    let observable =
        (model_name(), read, modifier).prop_map(|(of, r, m)| format!("{{of: {of}, read: {r}{m}}}"));
    let claim = (
        prop::sample::select(vec!["c1", "c2", "c3", "c1"]),
        prop::sample::select(vec![
            "same-law: [A, B]",
            "law-of: {observable: A, reference: {uniform: [0, 1]}}",
            "law-of: {observable: A, reference: {normal: {mean: 0, sd: 1}}}",
            "law-of: {observable: A, reference: {tail-from-profile: B}}",
            "probability: {event: A}",
            "probability: {event: A, equals: 0.5}",
            "describe: A",
            "describe: A, limit: 3",
            "describe: A, reference: {uniform: [1, 0]}",
            "describe: A",
            "describe: A",
        ]),
        name(),
        name(),
        prop::sample::select(vec!["", ", exact: on", ", exact: off"]),
    )
        .prop_map(|(id, k, a, b, ex)| {
            format!("{{id: {id}, {}{ex}}}", k.replace('A', a).replace('B', b))
        });
    (
        mix(
            vec!["1", "1000"],
            vec!["0", "1099511627776", "1099511627777"],
        ),
        mix(
            vec!["", "exact: off\n"],
            vec!["exact: on\n", "alpha: 0.6\n"],
        ),
        proptest::collection::vec(model, 1..4),
        proptest::collection::vec(observable, 1..4),
        proptest::collection::vec(claim, 0..3),
    )
        .prop_map(|(samples, extra, models, obs, claims)| {
            let mut t = format!("name: fuzz\nseed: 7\nsamples: {samples}\n{extra}models:\n");
            for (m, name) in models.iter().zip(["a", "b", "c"]) {
                t.push_str(&format!("  {name}: {m}\n"));
            }
            t.push_str("observables:\n");
            for (i, o) in obs.iter().enumerate() {
                t.push_str(&format!("  o{}: {o}\n", i + 1));
            }
            t.push_str("claims:\n");
            for c in &claims {
                t.push_str(&format!("  - {c}\n"));
            }
            t
        })
}

#[test]
fn assembled_scenarios() {
    run_all(25_000, 4, assembled(), |t| t);
    // Nearly all fail some check (several bad draws per file): this generator is for the checks
    // themselves; the mutations above are the ones that load.
    assert!(
        KEYED.with(|c| c.get()) >= 20_000,
        "too few assembled scenarios reach validation"
    );
}

/// A YAML-ish tree: known keys, scalars from the pools, nested maps and lists.
#[derive(Debug, Clone)]
enum Tree {
    Leaf(&'static str),
    Map(Vec<(&'static str, Tree)>),
    List(Vec<Tree>),
}

fn render(t: &Tree, out: &mut String) {
    match t {
        Tree::Leaf(s) => out.push_str(s),
        Tree::Map(kv) => {
            out.push('{');
            for (i, (k, v)) in kv.iter().enumerate() {
                if i > 0 {
                    out.push_str(", ");
                }
                out.push_str(k);
                out.push_str(": ");
                render(v, out);
            }
            out.push('}');
        }
        Tree::List(v) => {
            out.push('[');
            for (i, x) in v.iter().enumerate() {
                if i > 0 {
                    out.push_str(", ");
                }
                render(x, out);
            }
            out.push(']');
        }
    }
}

#[test]
fn random_trees() {
    let leaf = prop::sample::select(SCALARS.iter().chain(EXTREMES).copied().collect::<Vec<_>>())
        .prop_map(Tree::Leaf);
    let tree = leaf.prop_recursive(5, 48, 6, |inner| {
        prop_oneof![
            3 => proptest::collection::vec((prop::sample::select(KEYS.to_vec()), inner.clone()), 0..6).prop_map(Tree::Map),
            1 => proptest::collection::vec(inner, 0..4).prop_map(Tree::List),
        ]
    });
    // Top level: a mapping of top-level keys (block style), so the serde and validation layers see
    // plausible shapes.
    let top = proptest::collection::vec((prop::sample::select(KEYS[..11].to_vec()), tree), 0..9);
    run_all(10_000, 5, top, |kv| {
        let mut t = String::new();
        for (k, v) in kv {
            t.push_str(k);
            t.push_str(": ");
            render(&v, &mut t);
            t.push('\n');
        }
        t
    });
}

#[test]
fn deep_nesting_and_long_names() {
    // Stack depth and edit-distance memory: neither may blow up.
    for text in [
        "[".repeat(100_000),
        "{a: ".repeat(50_000),
        format!("name: {}\n", "[".repeat(20_000)),
        format!("models:\n  a: {{six-vertx: {{}}}}\nx{}: 1\n", "y".repeat(200_000)),
        format!("name: a\nseed: 1\nsamples: 1\nmodels:\n  m: {{six-vertex: {{width: 1, height: 1, b1: 0, b2: 0, left: empty, bottom: empty}}}}\nobservables:\n  o: {{of: \"{}\", read: {{top: colors}}}}\nclaims: []\n", "n".repeat(1_000_000)),
    ] {
        check(&text).unwrap();
    }
}
