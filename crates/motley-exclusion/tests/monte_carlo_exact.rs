//! Monte Carlo against the exact law on small segments and rings (chi-square), and the same test
//! failing for a deliberately wrong rate.
//!
//! The exact law comes from `ExactSolver` (uniformization of the generator), which enumerates
//! arrangements and rates directly and shares no code with the samplers' event loops.

use crate::common;

use std::collections::BTreeMap;

use motley_exclusion::{
    ExactSolver, FiniteLattice, FiniteProcess, FiniteSystem, Rates, DEFAULT_TAIL,
};
use rayon::prelude::*;

/// Samples per chi-square test (issue: ≥ 1e5).
const SAMPLES: u64 = 100_000;
/// Fail only if p < 1e-6 under the null: false alarm 1e-6 per test (each test below checks one or
/// two times; with two, each is held at 5e-7, Bonferroni).
const ALPHA: f64 = 1e-6;

fn counts(process: &FiniteProcess, times: &[f64], seed: u64) -> Vec<BTreeMap<Vec<u32>, u64>> {
    let per_sample: Vec<Vec<Vec<u32>>> = (0..SAMPLES)
        .into_par_iter()
        .map(|i| process.configurations(seed, i, times))
        .collect();
    let mut out = vec![BTreeMap::new(); times.len()];
    for s in per_sample {
        for (k, c) in s.into_iter().enumerate() {
            *out[k].entry(c).or_insert(0) += 1;
        }
    }
    out
}

/// p-values of the chi-square tests of `simulated` at each time against the exact law of `truth`.
fn p_values(
    simulated: &FiniteProcess,
    truth: &FiniteProcess,
    times: &[f64],
    seed: u64,
) -> Vec<f64> {
    let solver = ExactSolver::new(truth).unwrap();
    let observed = counts(simulated, times, seed);
    times
        .iter()
        .zip(&observed)
        .map(|(&t, obs)| {
            let law = solver.law_at(t, DEFAULT_TAIL).unwrap();
            let (stat, df, p) = common::chi_square(obs, law.entries());
            println!("t={t}: chi2 = {stat:.1} on {df} df, p = {p:.3e}");
            p
        })
        .collect()
}

fn process(lattice: FiniteLattice, colors: Vec<u32>, p: f64, q: f64) -> FiniteProcess {
    FiniteProcess::new(
        FiniteSystem::new(lattice, colors).unwrap(),
        Rates::new(p, q).unwrap(),
    )
}

#[test]
fn asep_segment_packed() {
    let pr = process(FiniteLattice::Segment, vec![5, 4, 3, 2, 1], 1.0, 0.4);
    for p in p_values(&pr, &pr, &[0.8, 2.0], 11) {
        assert!(p > ALPHA / 2.0, "p = {p}");
    }
}

#[test]
fn asep_ring_multispecies() {
    let pr = process(FiniteLattice::Ring, vec![3, 2, 2, 1, 0, 0], 1.0, 0.5);
    for p in p_values(&pr, &pr, &[0.4, 1.1], 12) {
        assert!(p > ALPHA / 2.0, "p = {p}");
    }
}

#[test]
fn tasep_ring_and_segment() {
    let ring = process(FiniteLattice::Ring, vec![2, 1, 1, 0, 0, 0], 1.0, 0.0);
    let p = p_values(&ring, &ring, &[1.5], 13)[0];
    assert!(p > ALPHA, "p = {p}");
    let seg = process(FiniteLattice::Segment, vec![4, 3, 2, 1], 0.7, 0.0);
    let p = p_values(&seg, &seg, &[1.0], 14)[0];
    assert!(p > ALPHA, "p = {p}");
}

#[test]
fn leftward_only_segment() {
    let seg = process(FiniteLattice::Segment, vec![0, 1, 2, 0, 3], 0.0, 1.2);
    let p = p_values(&seg, &seg, &[0.9], 15)[0];
    assert!(p > ALPHA, "p = {p}");
}

/// Simulating with q = 0.55 instead of 0.4 must be rejected by the same test (printed p-values are
/// astronomically small), and likewise a ring run with p and q exchanged.
#[test]
fn wrong_rates_are_rejected() {
    let truth = process(FiniteLattice::Segment, vec![5, 4, 3, 2, 1], 1.0, 0.4);
    let wrong = process(FiniteLattice::Segment, vec![5, 4, 3, 2, 1], 1.0, 0.55);
    let p = p_values(&wrong, &truth, &[0.8], 11)[0];
    assert!(p < ALPHA, "wrong q not detected: p = {p}");
    let truth = process(FiniteLattice::Ring, vec![3, 2, 2, 1, 0, 0], 1.0, 0.5);
    let wrong = process(FiniteLattice::Ring, vec![3, 2, 2, 1, 0, 0], 0.5, 1.0);
    let p = p_values(&wrong, &truth, &[0.4], 12)[0];
    assert!(p < ALPHA, "exchanged p, q not detected: p = {p}");
}
