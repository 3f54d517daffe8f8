//! The sparse exact solver and the multiline queues against independent code: the enumerating
//! `ExactSolver` (breadth-first search with a hash table, its own generator), merged laws against
//! the pushforward of unmerged ones (lumpability), the queue counts against the generator's null
//! vector, and Monte Carlo against each new path (chi-square, false alarm 1e-6 per test).

use crate::common;

use std::collections::BTreeMap;

use motley_colorblind::Color;
use motley_exclusion::{
    multiline_queue_law, total_variation, ExactSolver, FiniteLattice, FiniteProcess, FiniteSystem,
    Law, Rates, SparseSolver, StationarySampler, DEFAULT_TAIL,
};
use num_bigint::BigUint;
use rayon::prelude::*;

/// ℓ¹ distance between two laws on arrangements.
fn l1(a: &Law, b: &Law) -> f64 {
    2.0 * total_variation(
        &a.pushforward(|x| x.to_vec()),
        &b.pushforward(|x| x.to_vec()),
    )
}

fn system(lattice: FiniteLattice, colors: &[Color]) -> FiniteSystem {
    FiniteSystem::new(lattice, colors.to_vec()).unwrap()
}

/// Every size the enumerator also does (it stops at 10 sites and 400 000 arrangements): segments and
/// rings, ASEP, TASEP and leftward-only rates, short and long times. The two agree within the sum of
/// their stated bounds (plus the enumerator's rounding, which it does not state: 1e-13 here).
#[test]
fn agrees_with_the_enumerator_on_every_shared_size() {
    let cases: Vec<(FiniteLattice, Vec<Color>, f64, f64)> = vec![
        (FiniteLattice::Segment, vec![5, 4, 3, 2, 1], 1.0, 0.4),
        (FiniteLattice::Segment, vec![0, 1, 2, 0, 3], 0.0, 1.2),
        (FiniteLattice::Segment, vec![2, 2, 1, 1, 0, 0, 0], 0.7, 0.0),
        (FiniteLattice::Ring, vec![3, 2, 2, 1, 0, 0], 1.0, 0.5),
        (FiniteLattice::Ring, vec![2, 1, 1, 0, 0, 0, 0], 1.0, 0.0),
        (FiniteLattice::Ring, vec![1, 0], 2.0, 0.3),
        (FiniteLattice::Segment, vec![7, 6, 5, 4, 3, 2, 1], 1.0, 0.3),
    ];
    for (lattice, colors, p, q) in cases {
        let rates = Rates::new(p, q).unwrap();
        let s = system(lattice, &colors);
        let old = ExactSolver::new(&FiniteProcess::new(s.clone(), rates)).unwrap();
        let new = SparseSolver::new(&s, rates).unwrap();
        for t in [0.0, 0.3, 1.7, 12.0] {
            let a = old.law_at(t, DEFAULT_TAIL).unwrap();
            let b = new.law_at(t, DEFAULT_TAIL).unwrap().to_law();
            let d = l1(&a, &b);
            let allowed = a.error_bound() + b.error_bound() + 1e-13;
            assert!(d <= allowed, "{colors:?} t={t}: ℓ¹ {d:e} > {allowed:e}");
            assert!(b.error_bound() < 1e-12, "{}", b.error_bound());
        }
    }
}

/// Merging contiguous colors commutes with the dynamics: the merged chain's law at t is the
/// pushforward of the unmerged law (enumerator) under the merge.
#[test]
fn merged_colors_give_the_pushforward_law() {
    let rates = Rates::new(1.0, 0.35).unwrap();
    let colors = [6, 5, 4, 3, 2, 1];
    // Classes {1, 2}, {3}, {4, 5, 6}: represented by 1, 3, 4.
    let merge = |c: Color| match c {
        1 | 2 => 1,
        3 => 3,
        _ => 4,
    };
    for lattice in [FiniteLattice::Segment, FiniteLattice::Ring] {
        let full = ExactSolver::new(&FiniteProcess::new(system(lattice, &colors), rates))
            .unwrap()
            .law_at(1.3, DEFAULT_TAIL)
            .unwrap();
        let merged_colors: Vec<Color> = colors.iter().map(|&c| merge(c)).collect();
        let merged = SparseSolver::new(&system(lattice, &merged_colors), rates)
            .unwrap()
            .law_at(1.3, DEFAULT_TAIL)
            .unwrap();
        assert_eq!(merged.state_count(), 60); // 6! / (2! 1! 3!)
        let push = full.pushforward(|a| a.iter().map(|&c| merge(c)).collect::<Vec<_>>());
        let d = 2.0 * total_variation(&push, &merged.to_law().pushforward(|a| a.to_vec()));
        assert!(
            d < full.error_bound() + merged.error_bound() + 1e-13,
            "{d:e}"
        );
    }
}

/// The multiline-queue counts, as probabilities, are the null vector of the generator (computed by
/// iterating the enumerated chain, residual below 1e-15; the distance allowed, 1e-9, is far above
/// the iteration's error on chains this small and far below any single probability).
#[test]
fn multiline_queues_give_the_generators_null_vector() {
    let cases: Vec<(Vec<Color>, f64, f64)> = vec![
        (vec![2, 1, 0, 0], 1.0, 0.0),
        (vec![3, 2, 1, 0, 0], 1.0, 0.0),
        (vec![2, 2, 1, 1, 0, 0], 0.6, 0.0),
        (vec![4, 3, 2, 1, 0], 1.0, 0.0),
        (vec![5, 4, 3, 2, 1], 1.0, 0.0),
        (vec![3, 2, 1, 0, 0], 0.0, 1.0),
    ];
    for (colors, p, q) in cases {
        let rates = Rates::new(p, q).unwrap();
        let s = system(FiniteLattice::Ring, &colors);
        let (law, total) = multiline_queue_law(&s, &rates).unwrap();
        let sum: BigUint = law.iter().map(|(_, c)| c).sum();
        assert_eq!(sum, total);
        let total = total.to_string().parse::<f64>().unwrap();
        let pi = ExactSolver::new(&FiniteProcess::new(s, rates))
            .unwrap()
            .stationary(1e-15, 10_000_000);
        assert!(pi.error_bound() < 1e-15);
        let mlq: Vec<(Vec<Color>, f64)> = law
            .iter()
            .map(|(a, c)| (a.clone(), c.to_string().parse::<f64>().unwrap() / total))
            .collect();
        let d = 2.0 * total_variation(&mlq, &pi.pushforward(|a| a.to_vec()));
        assert!(d < 1e-9, "{colors:?} p={p}: ℓ¹ {d:e}");
    }
}

/// Counts of sampled arrangements.
fn tally(samples: Vec<Vec<Color>>) -> BTreeMap<Vec<Color>, u64> {
    let mut out = BTreeMap::new();
    for s in samples {
        *out.entry(s).or_insert(0) += 1;
    }
    out
}

/// Samples per chi-square test below.
const SAMPLES: u64 = 100_000;
/// Each test fails only if p < 1e-6 under the null: false alarm 1e-6 per test.
const ALPHA: f64 = 1e-6;

/// Monte Carlo (the dynamics' own sampler) against the sparse solver's law of merged colors.
#[test]
fn monte_carlo_matches_the_sparse_law() {
    let rates = Rates::new(1.0, 0.3).unwrap();
    let s = system(FiniteLattice::Ring, &[2, 2, 1, 1, 1, 0, 0, 0]);
    let process = FiniteProcess::new(s.clone(), rates);
    let law = SparseSolver::new(&s, rates)
        .unwrap()
        .law_at(0.9, DEFAULT_TAIL)
        .unwrap()
        .to_law();
    let samples: Vec<Vec<Color>> = (0..SAMPLES)
        .into_par_iter()
        .map(|i| process.configurations(77, i, &[0.9]).pop().unwrap())
        .collect();
    let (stat, df, p) = common::chi_square(&tally(samples), law.entries());
    println!("chi2 = {stat:.1} on {df} df, p = {p:.3e}");
    assert!(p > ALPHA, "p = {p}");
}

/// Stationary samples by multiline queues against the exact queue counts, and a wrong law (the
/// uniform one) rejected by the same test.
#[test]
fn stationary_samples_match_the_queue_counts() {
    let rates = Rates::tasep(1.0).unwrap();
    let s = system(FiniteLattice::Ring, &[3, 2, 2, 1, 0, 0]);
    let (law, total) = multiline_queue_law(&s, &rates).unwrap();
    let total = total.to_string().parse::<f64>().unwrap();
    let expected: Vec<(Vec<Color>, f64)> = law
        .iter()
        .map(|(a, c)| (a.clone(), c.to_string().parse::<f64>().unwrap() / total))
        .collect();
    let sampler = StationarySampler::new(&s, &rates).unwrap();
    let samples: Vec<Vec<Color>> = (0..SAMPLES)
        .into_par_iter()
        .map(|i| sampler.sample(2026, i))
        .collect();
    let observed = tally(samples);
    let (stat, df, p) = common::chi_square(&observed, &expected);
    println!("chi2 = {stat:.1} on {df} df, p = {p:.3e}");
    assert!(p > ALPHA, "p = {p}");
    let uniform: Vec<(Vec<Color>, f64)> = expected
        .iter()
        .map(|(a, _)| (a.clone(), 1.0 / expected.len() as f64))
        .collect();
    let (_, _, p) = common::chi_square(&observed, &uniform);
    assert!(p < ALPHA, "the uniform law was not rejected: p = {p}");
}

/// The ASEP stationary iteration of the sparse solver (used for `time: stationary` with p, q > 0)
/// against the enumerator's own iteration, on merged and unmerged colors of a ring: both reach a
/// residual below 1e-15, and they agree within 1e-9 in ℓ¹ (far below any probability here).
#[test]
fn asep_stationary_iteration_agrees_with_the_enumerator() {
    let rates = Rates::new(1.0, 0.4).unwrap();
    for colors in [vec![3, 2, 1, 0, 0], vec![2, 2, 1, 0, 0, 0]] {
        let s = system(FiniteLattice::Ring, &colors);
        let a = ExactSolver::new(&FiniteProcess::new(s.clone(), rates))
            .unwrap()
            .stationary(1e-16, 10_000_000);
        let b = SparseSolver::new(&s, rates)
            .unwrap()
            .stationary(1e-16, 10_000_000)
            .to_law();
        assert!(a.error_bound() < 1e-15 && b.error_bound() < 1e-15);
        let d = l1(&a, &b);
        assert!(d < 1e-9, "{colors:?}: ℓ¹ {d:e}");
    }
}
