//! Two-species TASEP on a ring of 3 sites (one first-class particle, one second-class, one hole):
//! the stationary law.
//!
//! Reference values: 2/9 for each arrangement with the second-class particle just left of the
//! first-class one, 1/9 where it is just right — our own check computation from the generator
//! (issue 3), redone by hand here: from "2 then 1" (cyclically) the chain leaves at rate 2 (the 2 jumps
//! over the 1, the 1 over the hole), from "1 then 2" at rate 1, each exit going to the other type,
//! so π(1 then 2) · 1 = π(2 then 1) · 2 per pair of types, 3 rotations each: 2/9 and 1/9.
//! The exact solver computes them independently (power iteration on the enumerated generator), and
//! a Monte Carlo run recovers them.

use crate::common;

use motley_exclusion::{
    total_variation, ExactSolver, FiniteProcess, FiniteSystem, Rates, DEFAULT_TAIL,
};
use rayon::prelude::*;

/// Colors: first class 2, second class 1, hole 0 (larger is stronger).
fn second_just_left_of_first(a: &[u32]) -> bool {
    (0..3).any(|x| a[x] == 1 && a[(x + 1) % 3] == 2)
}

fn process() -> FiniteProcess {
    FiniteProcess::new(
        FiniteSystem::ring(vec![2, 1, 0]).unwrap(),
        Rates::tasep(1.0).unwrap(),
    )
}

fn expected(a: &[u32]) -> f64 {
    if second_just_left_of_first(a) {
        2.0 / 9.0
    } else {
        1.0 / 9.0
    }
}

#[test]
fn exact_stationary_law() {
    let solver = ExactSolver::new(&process()).unwrap();
    let pi = solver.stationary(1e-16, 1_000_000);
    assert_eq!(pi.entries().len(), 6);
    for (a, p) in pi.entries() {
        println!("{a:?}: {p:.15} (expected {:.15})", expected(a));
        assert!((p - expected(a)).abs() < 1e-12);
    }
}

/// Independent samples at t = 40 (the relaxation rate of this chain is of order 1: the exact law at
/// t = 40 is within 1e-12 of stationarity in total variation, asserted), 1e5 of them; each of the
/// six probabilities must lie in its Wilson interval at simultaneous false-alarm level 1e-6
/// (Bonferroni: 1e-6 / 6 per cell; normal quantile from statrs 0.19).
#[test]
fn monte_carlo_recovers_the_stationary_law() {
    let proc = process();
    let t = 40.0;
    let solver = ExactSolver::new(&proc).unwrap();
    let at_t = solver.law_at(t, DEFAULT_TAIL).unwrap();
    let pi = solver.stationary(1e-16, 1_000_000);
    let tv = total_variation(
        &at_t.pushforward(|a| a.to_vec()),
        &pi.pushforward(|a| a.to_vec()),
    );
    assert!(tv < 1e-12, "not yet stationary: {tv:e}");

    let n = 100_000u64;
    let samples: Vec<Vec<u32>> = (0..n)
        .into_par_iter()
        .map(|i| proc.configurations(2024, i, &[t]).pop().unwrap())
        .collect();
    let z = common::z_two_sided(1e-6 / 6.0);
    for (a, _) in pi.entries() {
        let k = samples.iter().filter(|s| *s == a).count() as u64;
        let (lo, hi) = common::wilson(k, n, z);
        println!(
            "{a:?}: {:.5} in [{lo:.5}, {hi:.5}] (expected {:.5})",
            k as f64 / n as f64,
            expected(a)
        );
        assert!(lo <= expected(a) && expected(a) <= hi);
    }
    // Near-miss: the uniform law 1/6 lies outside the interval of every arrangement.
    for (a, _) in pi.entries() {
        let k = samples.iter().filter(|s| *s == a).count() as u64;
        let (lo, hi) = common::wilson(k, n, z);
        assert!(!(lo <= 1.0 / 6.0 && 1.0 / 6.0 <= hi));
    }
}
