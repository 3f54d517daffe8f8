//! Seeded A/A calibration of every claim kind: the false-alarm rate of each claim's deciding test at
//! α = 0.05, measured over 2 000 replications in which the claim is true, must lie in
//! [0.035, 0.065]. Slow tier.
//!
//! Every claim below is true by construction: two replicas of one model read the same way, or a
//! law computed exactly (here, from motley's exact enumeration, or in closed form for a two-site
//! exclusion process: the pair swaps at rate 1 each way, so the swap time is Exp(1), e^{−T} is
//! uniform on [0, 1] and P(swapped at t) = (1 − e^{−2t})/2).
//!
//! False-alarm rate of this test itself: with 2 000 replications of a test of exact size 0.05 the
//! rate has standard deviation 0.0049, and the window ±0.015 is 3.08 standard deviations: a correctly
//! sized claim kind falls outside with probability 0.002, so 0.03 for the 12 kinds together. Seeds are
//! fixed, so the outcome is the same on every run.

use std::sync::atomic::{AtomicBool, AtomicU64};

use motley_scenario::family::exact_law;
use motley_scenario::finish::finish;
use motley_scenario::plan::plan;
use motley_scenario::result::{Decision, RunResult};
use motley_scenario::run::{advance, Partial, Shard, Workers};
use motley_scenario::{load_str, Scenario};

const FILE: &str = "calibration.yaml";

/// Runs a scenario in-process, start to finish, on `workers`.
pub fn run_text(text: &str, workers: &Workers) -> RunResult {
    let s = load_str(text, FILE).unwrap_or_else(|e| panic!("{e}\n{text}"));
    run_scenario(&s, workers)
}

/// Runs a loaded scenario in-process.
pub fn run_scenario(s: &Scenario, workers: &Workers) -> RunResult {
    let p = plan(s, FILE).unwrap();
    let mut part = Partial::empty(s, &p, Shard::WHOLE);
    advance(
        s,
        &p,
        &mut part,
        workers,
        &AtomicU64::new(0),
        &AtomicBool::new(false),
        None,
    )
    .unwrap();
    finish(s, &p, &[part], "test")
}

/// Runs `f(seed, workers)` for seeds `1..=reps` on two threads (each with its own one-thread
/// pool), results in seed order.
pub fn replicate<T: Send>(reps: u64, f: impl Fn(u64, &Workers) -> T + Sync) -> Vec<T> {
    let halves: Vec<Vec<T>> = std::thread::scope(|scope| {
        let f = &f;
        let handles: Vec<_> = (0..2u64)
            .map(|h| {
                scope.spawn(move || {
                    let workers = Workers::new(1).unwrap();
                    (1..=reps)
                        .filter(|s| s % 2 == h)
                        .map(|s| (s, f(s, &workers)))
                        .collect::<Vec<_>>()
                })
            })
            .collect();
        let mut all: Vec<(u64, T)> = handles
            .into_iter()
            .flat_map(|h| h.join().unwrap())
            .collect();
        all.sort_by_key(|(s, _)| *s);
        vec![all.into_iter().map(|(_, t)| t).collect()]
    });
    halves.into_iter().flatten().collect()
}

/// Wilson 95% interval of `k` successes in `n`.
pub fn wilson(k: u64, n: u64) -> (f64, f64) {
    let i = motley_stats::wilson_interval(k, n, 0.95).unwrap();
    (i.lower, i.upper)
}

const MODELS: &str = r#"
models:
  rect:
    six-vertex: {width: 4, height: 3, b1: 0.35, b2: 0.6, left: {list: [5, 6, 7]}, bottom: {list: [4, 3, 2, 1]}}
  pair:
    exclusion: {lattice: {segment: 2}, p: 1, q: 1, initial: packed}
  with-second-class:
    exclusion: {lattice: line, p: 1, q: 0, strength: smaller-wins, initial: {step: {left: 1, right: 0, at: 0, block: [2]}}}
  one-species:
    exclusion: {lattice: line, p: 1, q: 0, initial: {step: {left: 1, right: 0, at: 1}}}
observables:
  top-a: {of: rect, read: {top: colors}}
  top-b: {of: rect, read: {top: colors}}
  perm-a: {of: rect, read: {exit-permutation: colors}}
  perm-b: {of: rect, read: {exit-permutation: colors}}
  h-a: {of: rect, read: {height: {x: 2, y: 2}}, threshold: 4}
  h-b: {of: rect, read: {height: {x: 2, y: 2}}, threshold: 4}
  h-scaled-a: {of: rect, read: {height: {x: 2, y: 2}}, threshold: 4, shift: 0.25, scale: 0.5}
  h-scaled-b: {of: rect, read: {height: {x: 2, y: 2}}, threshold: 4, shift: 0.25, scale: 0.5}
  h-other: {of: rect, read: {height: {x: 3, y: 1}}, threshold: 3}
  pair-a: {of: rect, combine: {tuple: [h-a, h-other]}}
  pair-b: {of: rect, combine: {tuple: [h-b, h-other]}}
  time-a: {of: pair, read: {swap-time: {classes: [1, 2], time: 50}}}
  time-b: {of: pair, read: {swap-time: {classes: [1, 2], time: 50}}}
  uniform: {of: pair, read: {swap-time: {classes: [1, 2], time: 50}}, scale: 1.4426950408889634, base: 0.5}
  swapped-a: {of: pair, read: {swapped: {classes: [1, 2], time: 0.5}}}
  swapped-b: {of: pair, read: {swapped: {classes: [1, 2], time: 0.5}}}
  x: {of: with-second-class, read: {position: {class: 2, time: 10}}}
  density: {of: one-species, read: {window: {from: -25, to: 25, time: 10, as: positions}}}
"#;

/// The exact law of `h-a` (height at (2, 2) of `rect`) as table rows and its mean.
fn exact_height_law() -> (String, f64) {
    let text = format!(
        "name: exact-helper\nseed: 1\nsamples: 1\n{MODELS}\nclaims:\n  - id: d\n    describe: h-a\n"
    );
    let s = load_str(&text, FILE).unwrap();
    let o = s.observables.iter().position(|o| o.name == "h-a").unwrap();
    let law = exact_law(&s, o).unwrap();
    let mut rows = Vec::new();
    let mut mean = 0.0;
    for (k, p) in &law.cells {
        let v = match k {
            motley_scenario::family::ValueKey::Number(r) => r.0,
            other => panic!("height is a number, got {other:?}"),
        };
        mean += v * p;
        rows.push(format!("[{v}, {p:.17}]"));
    }
    (format!("[{}]", rows.join(", ")), mean)
}

fn calibration_scenario(seed: u64, table: &str, mean: f64) -> String {
    let swap_p = (1.0 - (-1.0f64).exp()) / 2.0;
    format!(
        r#"name: calibration
seed: {seed}
samples: 2000
alpha: 0.05
exact: off
{MODELS}
claims:
  - {{id: sets, same-law: [top-a, top-b]}}
  - {{id: sequences, same-law: [perm-a, perm-b]}}
  - {{id: integers, same-law: [h-a, h-b]}}
  - {{id: scaled-integers, same-law: [h-scaled-a, h-scaled-b]}}
  - {{id: tuples, same-law: [pair-a, pair-b]}}
  - {{id: reals, same-law: [time-a, time-b]}}
  - {{id: events, same-law: [swapped-a, swapped-b]}}
  - {{id: probability, probability: {{event: swapped-a, equals: {swap_p:.17}}}}}
  - {{id: continuous-reference, law-of: {{observable: uniform, reference: {{uniform: [0, 1]}}}}}}
  - {{id: tail-from-profile, law-of: {{observable: x, reference: {{tail-from-profile: density}}}}}}
  - {{id: table, law-of: {{observable: h-a, reference: {{table: {table}}}}}}}
  - {{id: mean, mean: {{observable: h-a, equals: {mean:.17}}}}}
"#
    )
}

#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn every_claim_kind_has_size_alpha() {
    const REPS: u64 = 2000;
    let (table, mean) = exact_height_law();
    let results = replicate(REPS, |seed, workers| {
        run_text(&calibration_scenario(seed, &table, mean), workers)
    });
    let ids: Vec<String> = results[0].claims.iter().map(|c| c.id.clone()).collect();
    let mut rejected = vec![0u64; ids.len()];
    for r in &results {
        for (k, c) in r.claims.iter().enumerate() {
            assert_ne!(c.decision, Decision::NoClaim, "{}", c.id);
            // Exactly one deciding test per claim.
            let deciding = c
                .tests
                .iter()
                .filter(|t| t.role == motley_scenario::result::TestRole::Deciding)
                .count();
            assert_eq!(deciding, 1, "{}: {:?}", c.id, c.tests);
            rejected[k] += c.rejected as u64;
        }
    }
    let mut bad = Vec::new();
    for (id, &k) in ids.iter().zip(&rejected) {
        let rate = k as f64 / REPS as f64;
        let (lo, hi) = wilson(k, REPS);
        println!("A/A false-alarm rate at α = 0.05, {id:<22} {rate:.4}  95% [{lo:.4}, {hi:.4}]  ({k} of {REPS})");
        if !(0.035..=0.065).contains(&rate) {
            bad.push(format!("{id}: {rate:.4} [{lo:.4}, {hi:.4}]"));
        }
    }
    assert!(bad.is_empty(), "outside [0.035, 0.065]: {bad:?}");
}

/// Two 2 × 2 rainbow squares whose stronger colors enter from below, the second with `b1` raised
/// by `shift`; `top` colors of each, and their same-law claim (with `tolerance`, if any).
fn square_pair(seed: u64, samples: u64, shift: f64, tolerance: Option<f64>, looks: &str) -> String {
    let tol = tolerance.map_or(String::new(), |t| format!(", tolerance: {t}"));
    format!(
        r#"name: square-pair
seed: {seed}
samples: {samples}
alpha: 0.05
power: 0.8
exact: off
{looks}
models:
  a:
    six-vertex: {{width: 2, height: 2, b1: 0.3, b2: 0.8, left: {{list: [1, 2]}}, bottom: {{list: [4, 3]}}}}
  b:
    six-vertex: {{width: 2, height: 2, b1: {b1}, b2: 0.8, left: {{list: [1, 2]}}, bottom: {{list: [4, 3]}}}}
observables:
  top-a: {{of: a, read: {{top: colors}}}}
  top-b: {{of: b, read: {{top: colors}}}}
claims:
  - {{id: pair, same-law: [top-a, top-b]{tol}}}
"#,
        b1 = 0.3 + shift
    )
}

/// The exact total variation between the two sides of `square_pair(…, shift, …)`.
fn exact_square_tv(shift: f64) -> f64 {
    let s = load_str(&square_pair(1, 1, shift, None, ""), FILE).unwrap();
    let law = |name: &str| {
        let o = s.observables.iter().position(|o| o.name == name).unwrap();
        exact_law(&s, o).unwrap().cells
    };
    let (a, b) = (law("top-a"), law("top-b"));
    let mut keys: Vec<_> = a.iter().chain(&b).map(|(k, _)| k.clone()).collect();
    keys.sort();
    keys.dedup();
    let p = |l: &[(motley_scenario::family::ValueKey, f64)], k| {
        l.iter().find(|(x, _)| x == k).map_or(0.0, |(_, p)| *p)
    };
    0.5 * keys
        .iter()
        .map(|k| (p(&a, k) - p(&b, k)).abs())
        .sum::<f64>()
}

/// Power at the printed detectable difference, on a real near miss: `b1` perturbed by 0.02 on one
/// side (exact total variation 0.0268 between the laws of the top colors). The sample size is the
/// smallest at which the printed detectable total variation is at most the true one; then the
/// deciding chi-square must reject in at least 0.8 − 2 standard errors = 0.76 of 400 replications.
/// A real alternative has noncentrality at least that of the hardest one of its size (Cauchy–
/// Schwarz, `motley-stats/src/power.rs`), so its power is at least 0.8 and this fails with
/// probability at most P(Bin(400, 0.8) < 304) = 0.023 (normal approximation; less for a real
/// alternative, whose power is higher).
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn a_real_near_miss_is_detected_with_the_promised_power_at_the_printed_difference() {
    const REPS: u64 = 400;
    let tv = exact_square_tv(0.02);
    assert!((tv - 0.02683).abs() < 1e-4, "exact TV {tv}");
    // 6 outcomes, none rare at these sizes: the chi-square compares 6 cells.
    let n = (1000..100_000u64)
        .step_by(100)
        .find(|&n| {
            motley_stats::detectable_total_variation(n, n, 6, 0.05, 0.8)
                .unwrap()
                .is_some_and(|d| d <= tv)
        })
        .unwrap();
    let results = replicate(REPS, |seed, w| {
        run_text(&square_pair(seed, n, 0.02, None, ""), w)
    });
    let mut rejected = 0;
    for r in &results {
        let c = &r.claims[0];
        let e = c.effect.as_ref().unwrap();
        assert!(
            e.detectable <= tv,
            "printed d {} above the true {tv}",
            e.detectable
        );
        rejected += c.rejected as u64;
    }
    let (lo, hi) = wilson(rejected, REPS);
    let rate = rejected as f64 / REPS as f64;
    println!("near miss (TV {tv:.5}) at n = {n}: power {rate:.4}, 95% [{lo:.4}, {hi:.4}]");
    assert!(
        rate >= 0.76,
        "power {rate} at the printed detectable difference"
    );
}

/// EQUAL WITHIN ε: with the sample size `motley check` gives for ε = 0.05 (power 0.8), two
/// replicas of one law come out EQUAL WITHIN 0.05 in at least 0.8 − 2 SE = 0.76 of 400
/// replications, and a near miss at total variation above ε (b1 perturbed by 0.05: exact TV
/// 0.0668) in at most α + 2 SE = 0.05 + 0.022 of them. The sample size is a worst case over laws,
/// so the first share is near 1 here; the bound is valid for every pair of laws, so the second is
/// near 0. False alarms: at most P(Bin(400, 0.8) < 304) = 0.023 and P(Bin(400, 0.05) > 28) = 0.02.
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn equal_within_tolerance_keeps_its_promises() {
    const REPS: u64 = 400;
    let s = load_str(&square_pair(1, 1000, 0.0, Some(0.05), ""), FILE).unwrap();
    let n = motley_scenario::confirm::samples_to_confirm_claim(&s, 0)
        .expect("a tolerance claim on sets has a sample size");
    let near = exact_square_tv(0.05);
    assert!(near > 0.05, "the near miss must lie beyond ε: {near}");
    let identity = replicate(REPS, |seed, w| {
        run_text(&square_pair(seed, n, 0.0, Some(0.05), ""), w)
    });
    let miss = replicate(REPS, |seed, w| {
        run_text(&square_pair(seed, n, 0.05, Some(0.05), ""), w)
    });
    let count = |rs: &[RunResult]| {
        rs.iter()
            .filter(|r| r.claims[0].decision == Decision::EqualWithin)
            .count() as u64
    };
    let (k_id, k_miss) = (count(&identity), count(&miss));
    let (lo, hi) = wilson(k_id, REPS);
    println!("n = {n}: identity EQUAL WITHIN 0.05 in {k_id}/{REPS}, 95% [{lo:.4}, {hi:.4}]");
    let (lo, hi) = wilson(k_miss, REPS);
    println!(
        "near miss (TV {near:.4}) EQUAL WITHIN 0.05 in {k_miss}/{REPS}, 95% [{lo:.4}, {hi:.4}]"
    );
    assert!(k_id as f64 >= 0.76 * REPS as f64, "{k_id} of {REPS}");
    assert!(k_miss as f64 <= 0.072 * REPS as f64, "{k_miss} of {REPS}");
}

/// Runs a sequential scenario in-process as `motley run` does: look by look, settled claims kept,
/// stopping when every claim is settled.
pub fn run_sequential(s: &Scenario, workers: &Workers) -> RunResult {
    let p = plan(s, FILE).unwrap();
    let mut part = Partial::empty(s, &p, Shard::WHOLE);
    let stop = AtomicBool::new(false);
    loop {
        let budget = motley_scenario::sequential::next_look(s, part.done + 1) - part.done;
        advance(
            s,
            &p,
            &mut part,
            workers,
            &AtomicU64::new(0),
            &stop,
            Some(budget),
        )
        .unwrap();
        let r = finish(s, &p, std::slice::from_ref(&part), "test");
        if motley_scenario::sequential::freeze_settled(&mut part, &r) || part.done == s.samples {
            return finish(s, &p, std::slice::from_ref(&part), "test");
        }
    }
}

/// Sampling until decided keeps the false-alarm rate over all looks at most α: a true identity
/// (two replicas) without a tolerance runs through looks at 500, 1000, 2000, 4000 samples per side,
/// 1 000 times; it must be rejected at some look in at most α + 2 SE = 0.05 + 0.0138 of them
/// (false alarm P(Bin(1000, 0.05) > 63) = 0.03 if the size over all looks were exactly α; the union
/// bound makes it smaller).
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn looks_keep_the_false_alarm_rate_over_all_looks() {
    const REPS: u64 = 1000;
    let results = replicate(REPS, |seed, w| {
        let text = square_pair(seed, 4000, 0.0, None, "looks: [500, 1000, 2000]");
        let text = text.replace("top-b: {of: b,", "top-b: {of: a,");
        run_sequential(&load_str(&text, FILE).unwrap(), w)
    });
    let k = results.iter().filter(|r| r.claims[0].rejected).count() as u64;
    let (lo, hi) = wilson(k, REPS);
    println!(
        "sequential A/A over 4 looks: false-alarm rate {:.4}, 95% [{lo:.4}, {hi:.4}]",
        k as f64 / REPS as f64
    );
    assert!(k as f64 <= 0.0638 * REPS as f64, "{k} of {REPS}");
    // Every run without a rejection went on to the last look.
    for r in &results {
        let q = r.sequential.as_ref().unwrap();
        assert_eq!(q.looks, vec![500, 1000, 2000, 4000]);
        if !r.claims[0].rejected {
            assert_eq!(q.looks_taken, 4);
        }
    }
}
