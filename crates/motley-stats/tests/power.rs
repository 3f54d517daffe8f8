//! Power: with 10⁵ samples per side, a total variation of 0.02 between two laws of random sets is
//! detected in at least 99% of seeded trials, and the reported detectable TV agrees with simulated
//! power within a factor 1.5.
//!
//! # Design
//! Base law `p`: random subset of {0, 1, 2, 3} with independent inclusions (0.5, 0.3, 0.6, 0.2),
//! 16 cells. Alternatives `p_a = p (1 + t s)`, `p_b = p (1 − t s)` with `s = (−1)^{|S ∩ {0,1,2}|}`:
//! because element 0 has probability 1/2, `Σ p s = 0`, both are laws, `TV(p_a, p_b) = t` exactly, and
//! `|δ| ∝ p̄`: the hardest alternative for its TV (see `power.rs`), invisible in every one-element
//! marginal (a three-way interaction).
//!
//! # False alarms (scipy 1.17.1, scipy.stats.ncx2 / binom; χ² critical value for 15 dof at 0.05)
//! - t = 0.02: noncentrality λ = 4 n_eff t² = 80, power ncx2.sf(25.0, 15, 80) = 0.99999969; the
//!   test needs ≥ 198 of 200 detections, P(fail) = binom.sf(2, 200, 3.1e-7) = 4e-14.
//! - detectable TV at power 0.9: t* = sqrt(λ*/(4 n_eff)), λ* = 23.583 -> t* = 0.010859.
//!   At 1.5 t* (λ = 53.06) the power is 0.99971: "≥ 180 of 200" fails with probability < 1e-30.
//!   At t*/1.5 (λ = 10.48) the power is 0.482: "< 180 of 200" fails with probability < 1e-30.
//!   At t* itself the simulated power must lie in [0.75, 0.99]: P(outside) = 1.7e-8 at power 0.9.
//! - TV upper bound (95%) must cover the true t in ≥ 85% of trials; with guaranteed coverage
//!   ≥ 0.95, P(fail) <= binom.cdf(169, 200, 0.95) = 2.5e-8.

use crate::common::{product_set_law, rng, Finite};
use motley_stats::{
    chi_square_homogeneity, detectable_total_variation, total_variation, CategoricalCounts,
    ChiSquareOptions,
};

const N: usize = 100_000;
const TRIALS: u64 = 200;

fn laws(t: f64) -> (Finite, Finite) {
    let p = product_set_law(&[0.5, 0.3, 0.6, 0.2]);
    let sign = |s: usize| {
        if (s & 0b111).count_ones().is_multiple_of(2) {
            1.0
        } else {
            -1.0
        }
    };
    let a: Vec<f64> = p
        .iter()
        .enumerate()
        .map(|(s, x)| x * (1.0 + t * sign(s)))
        .collect();
    let b: Vec<f64> = p
        .iter()
        .enumerate()
        .map(|(s, x)| x * (1.0 - t * sign(s)))
        .collect();
    let tv: f64 = 0.5 * a.iter().zip(&b).map(|(x, y)| (x - y).abs()).sum::<f64>();
    assert!((tv - t).abs() < 1e-12, "constructed TV {tv} != {t}");
    assert!((a.iter().sum::<f64>() - 1.0).abs() < 1e-12);
    (Finite::new(&a), Finite::new(&b))
}

fn counts_of(c: &[u64]) -> CategoricalCounts<u64> {
    let mut out = CategoricalCounts::new();
    for (k, &n) in c.iter().enumerate() {
        out.add_count(k as u64, n);
    }
    out
}

/// Number of trials (of 200) in which the level-0.05 chi-square test rejects, and how often the
/// TV upper bound covers `t`.
fn simulate(t: f64, test_id: u64) -> (u64, u64) {
    simulate_at(t, test_id, N, TRIALS)
}

/// `simulate` with `n` samples per side and `trials` trials.
fn simulate_at(t: f64, test_id: u64, n: usize, trials: u64) -> (u64, u64) {
    let (la, lb) = laws(t);
    let mut detected = 0;
    let mut covered = 0;
    for trial in 0..trials {
        let mut r = rng(test_id, trial);
        let a = counts_of(&la.counts(&mut r, n));
        let b = counts_of(&lb.counts(&mut r, n));
        let res = chi_square_homogeneity(&a, &b, &ChiSquareOptions::default()).unwrap();
        assert_eq!(res.tested_cells, 16);
        if res.p_value <= 0.05 {
            detected += 1;
        }
        if total_variation(&a, &b, 0.05).unwrap().upper_bound >= t {
            covered += 1;
        }
    }
    (detected, covered)
}

#[test]
fn tv_of_two_percent_is_detected() {
    let (detected, covered) = simulate(0.02, 201);
    eprintln!("t = 0.02: detected {detected} / {TRIALS}, TV bound covered {covered} / {TRIALS}");
    assert!(detected >= 198, "detected only {detected} of {TRIALS}");
    assert!(
        covered >= 170,
        "TV upper bound covered t in only {covered} of {TRIALS}"
    );
}

#[test]
fn detectable_tv_agrees_with_simulated_power() {
    let det = detectable_total_variation(N as u64, N as u64, 16, 0.05, 0.9)
        .unwrap()
        .unwrap();
    assert!((det - 0.010859).abs() < 1e-5, "{det}");
    let (hi, _) = simulate(1.5 * det, 202);
    let (lo, _) = simulate(det / 1.5, 203);
    let (at, _) = simulate(det, 204);
    eprintln!("detectable TV {det}: power at 1.5x {hi}/200, at 1x {at}/200, at 1/1.5x {lo}/200");
    assert!(
        hi >= 180,
        "at 1.5 x detectable TV only {hi} of 200 detected"
    );
    assert!(
        lo < 180,
        "at detectable TV / 1.5 already {lo} of 200 detected"
    );
    assert!(
        (150..=198).contains(&at),
        "at detectable TV {at} of 200 detected"
    );
}

/// The promise a report makes: at the printed detectable total variation d (α = 0.05, power 0.8,
/// 5000 samples per side, 16 cells), the deciding chi-square detects the hardest alternative of
/// size d with probability 0.8. Measured over 400 seeded trials, the rate must be at least
/// 0.8 − 2 standard errors = 0.76 (false alarm P(Bin(400, 0.8) < 304) = 0.023, normal
/// approximation, if the power is exactly 0.8; the noncentral approximation of the formula is the
/// only other source of error).
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn the_printed_detectable_difference_has_the_promised_power() {
    let n = 5000;
    let d = detectable_total_variation(n as u64, n as u64, 16, 0.05, 0.8)
        .unwrap()
        .unwrap();
    let (k, _) = simulate_at(d, 205, n, 400);
    let rate = k as f64 / 400.0;
    let i = motley_stats::wilson_interval(k, 400, 0.95).unwrap();
    eprintln!(
        "worst case at the printed d = {d:.5}: power {rate:.4}, 95% [{:.4}, {:.4}]",
        i.lower, i.upper
    );
    assert!(
        rate >= 0.76,
        "power {rate} at the printed detectable difference"
    );
}
