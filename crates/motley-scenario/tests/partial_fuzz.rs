//! Fuzzed checkpoints and shard results: 10 000 byte-level mutations of each (bit flips, deletions,
//! insertions, digit changes, duplicated spans, swapped lines), none re-sealed. Every one must be
//! refused (unreadable, damaged, foreign or inconsistent with the plan) or give exactly the result
//! of the untouched file; none may be accepted with other numbers.

use std::sync::atomic::{AtomicBool, AtomicU64};

use motley_scenario::finish::{check_partials, finish};
use motley_scenario::plan::{plan, Plan};
use motley_scenario::run::{advance, Partial, Shard, Workers};
use motley_scenario::Scenario;

const TEXT: &str = "
name: fuzzed
seed: 11
samples: 60
models:
  rect:
    six-vertex: {width: 4, height: 3, b1: 0.4, b2: 0.6, left: rainbow, bottom: empty}
observables:
  top: {of: rect, read: {top: colors}}
  h: {of: rect, read: {height: {x: 2, y: 3}}}
claims:
  - id: top
    describe: top
  - id: h
    describe: h
";

/// Mutations per file.
const MUTATIONS: u64 = 10_000;

/// SplitMix64 (Steele, Lea and Flood 2014), the fuzzer's seeded generator.
struct Mix(u64);

impl Mix {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut x = self.0;
        x = (x ^ (x >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        x = (x ^ (x >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        x ^ (x >> 31)
    }

    fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }
}

/// One random mutation of `bytes`.
fn mutate(bytes: &[u8], r: &mut Mix) -> Vec<u8> {
    let mut b = bytes.to_vec();
    let i = r.below(b.len());
    match r.below(6) {
        0 => b[i] ^= 1 << r.below(8),
        1 => {
            b.remove(i);
        }
        2 => b.insert(i, b" 0123456789,[]{}\"-.e:"[r.below(21)]),
        3 => {
            // A digit changed into another digit: the most plausible silent corruption.
            let digits: Vec<usize> = (0..b.len()).filter(|&k| b[k].is_ascii_digit()).collect();
            let k = digits[r.below(digits.len())];
            b[k] = b'0' + ((b[k] - b'0' + 1 + r.below(9) as u8) % 10);
        }
        4 => {
            let j = (i + 1 + r.below(40)).min(b.len());
            let span = b[i..j].to_vec();
            b.splice(i..i, span);
        }
        _ => {
            let text = String::from_utf8(b).unwrap();
            let mut lines: Vec<&str> = text.lines().collect();
            let (x, y) = (r.below(lines.len()), r.below(lines.len()));
            lines.swap(x, y);
            b = lines.join("\n").into_bytes();
        }
    }
    b
}

fn setup() -> (Scenario, Plan, Workers) {
    let s = motley_scenario::load_str(TEXT, "fuzzed.yaml").unwrap();
    let p = plan(&s, "fuzzed.yaml").unwrap();
    (s, p, Workers::new(1).unwrap())
}

fn run(s: &Scenario, p: &Plan, w: &Workers, partial: &mut Partial, budget: Option<u64>) {
    let (progress, stop) = (AtomicU64::new(0), AtomicBool::new(false));
    advance(s, p, partial, w, &progress, &stop, budget).unwrap();
}

/// The result of `partials` without its timing.
fn result(s: &Scenario, p: &Plan, partials: &[Partial]) -> serde_json::Value {
    let mut v = serde_json::to_value(finish(s, p, partials, "test")).unwrap();
    v.as_object_mut().unwrap().remove("timing");
    v
}

#[test]
fn fuzzed_checkpoints_are_refused_or_resume_to_the_same_result() {
    let (s, p, w) = setup();
    let mut cp = Partial::empty(&s, &p, Shard::WHOLE);
    run(&s, &p, &w, &mut cp, Some(25));
    let text = cp.to_json();
    let mut whole = Partial::empty(&s, &p, Shard::WHOLE);
    run(&s, &p, &w, &mut whole, None);
    let expected = result(&s, &p, &[whole]);
    let mut r = Mix(2024);
    let (mut refused, mut same) = (0, 0);
    for _ in 0..MUTATIONS {
        let bytes = mutate(text.as_bytes(), &mut r);
        let Ok(t) = String::from_utf8(bytes) else {
            refused += 1;
            continue;
        };
        let mut q = match Partial::from_json(&t) {
            Ok(q) => q,
            Err(_) => {
                refused += 1;
                continue;
            }
        };
        if q.check_resume(&s, &p, Shard::WHOLE).is_err() {
            refused += 1;
            continue;
        }
        run(&s, &p, &w, &mut q, None);
        assert_eq!(result(&s, &p, &[q]), expected, "accepted mutation:\n{t}");
        same += 1;
    }
    assert_eq!(refused + same, MUTATIONS);
    // Most mutations change the content, and the digest refuses all of those; the rest (about a
    // tenth: whitespace, a swap of two equal lines) parse to the untouched partial.
    assert!(
        refused > MUTATIONS * 8 / 10,
        "{refused} refused, {same} same"
    );
}

#[test]
fn fuzzed_shards_are_refused_or_merge_to_the_same_result() {
    let (s, p, w) = setup();
    let shards: Vec<Partial> = (1..=2)
        .map(|index| {
            let mut q = Partial::empty(&s, &p, Shard { index, count: 2 });
            run(&s, &p, &w, &mut q, None);
            q
        })
        .collect();
    let expected = result(&s, &p, &shards);
    let text = shards[1].to_json();
    let mut r = Mix(77);
    let (mut refused, mut same) = (0, 0);
    for _ in 0..MUTATIONS {
        let bytes = mutate(text.as_bytes(), &mut r);
        let read = String::from_utf8(bytes)
            .ok()
            .and_then(|t| Partial::from_json(&t).ok());
        let Some(q) = read else {
            refused += 1;
            continue;
        };
        let mut list = vec![("1".to_string(), shards[0].clone()), ("2".to_string(), q)];
        if check_partials(&s, &p, &mut list).is_err() {
            refused += 1;
            continue;
        }
        let merged: Vec<Partial> = list.into_iter().map(|(_, q)| q).collect();
        assert_eq!(result(&s, &p, &merged), expected);
        same += 1;
    }
    assert_eq!(refused + same, MUTATIONS);
    assert!(
        refused > MUTATIONS * 8 / 10,
        "{refused} refused, {same} same"
    );
}
