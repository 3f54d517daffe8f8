//! Estimated total variation distance between two empirical categorical laws (or between an
//! empirical law and an exact one), with a distribution-free upper confidence bound.
//!
//! # Formula
//! `TV̂ = ½ Σ_k |a_k / n_a − b_k / n_b|`, summed in sorted key order.
//!
//! Upper bound: `TV ≤ TV̂ + sqrt(ln(1/α) (1/n_a + 1/n_b) / 2)` with probability at least `1 − α`.
//! Proof: `TV̂` is a function of the `n_a + n_b` independent draws, and replacing one draw of sample a
//! moves mass `1/n_a` between two cells, changing `TV̂` by at most `1/n_a` (likewise `1/n_b`).
//! McDiarmid's bounded-differences inequality (McDiarmid 1989, "On the method of bounded
//! differences", Surveys in Combinatorics) gives `P(TV̂ ≤ E TV̂ − t) ≤ exp(−2t² / (1/n_a + 1/n_b))`,
//! and `E TV̂ ≥ TV` by Jensen's inequality (`E|X| ≥ |E X|` cell by cell). The bound needs no
//! knowledge of the number of cells. Against an exact law the `1/n_b` term is absent.
//! The estimate itself is biased upward (by about `sqrt(cells / n)` for sparse laws), so it is not
//! turned into a lower bound here.
//!
//! **Plug-in bias.** [`TvEstimate::same_law_level`] estimates what `TV̂` would be on average if
//! both samples came from one law: `½ Σ_k E|X_k/n_a − Y_k/n_b|` with `X_k ~ Bin(n_a, p̂_k)` and
//! `Y_k ~ Bin(n_b, p̂_k)` independent and `p̂_k` the pooled frequency of cell `k` (against an exact
//! law: `½ Σ_k E|X_k/n − p_k|`). Each expectation is an exact sum over the binomial laws when the
//! expected counts are below 100, else the normal value `sqrt(2/π) · sd`. [`TvEstimate::corrected`]
//! `= max(0, TV̂ − same_law_level)` is the headline estimate: on a large outcome space with a true
//! identity the plug-in value is all bias (about 0.2 with 10⁴ outcomes in 5·10⁴ samples), while the
//! corrected value stays near 0. It is an estimate, not a bound; the bound is `upper_bound`.

use std::hash::Hash;

use serde::{Deserialize, Serialize};

use crate::binomial_dist::binomial_pmf;
use crate::categorical_counts::aligned_counts;
use crate::{CategoricalCounts, ExactLaw, StatsError};

/// A total variation estimate with its upper confidence bound.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TvEstimate {
    /// Plug-in estimate `½ Σ |p̂_a − p̂_b|`.
    pub estimate: f64,
    /// Upper confidence bound at level `1 − alpha` (capped at 1).
    pub upper_bound: f64,
    /// The plug-in value expected if both samples came from one law (see the file header).
    pub same_law_level: f64,
    /// `max(0, estimate − same_law_level)`: the estimate with the plug-in bias removed.
    pub corrected: f64,
    /// The `alpha` used for the bound.
    pub alpha: f64,
    /// Size of the first sample.
    pub n_a: u64,
    /// Size of the second sample (0 when comparing with an exact law).
    pub n_b: u64,
}

fn check_alpha(alpha: f64) -> Result<(), StatsError> {
    if !(alpha > 0.0 && alpha < 1.0) {
        return Err(StatsError::InvalidAlpha(alpha));
    }
    Ok(())
}

/// Half-width `sqrt(ln(1/α)(1/n_a + 1/n_b)/2)` of the McDiarmid bound (`n_b = 0` means "exact law").
pub fn tv_bound_margin(n_a: u64, n_b: u64, alpha: f64) -> f64 {
    let inv = 1.0 / n_a as f64 + if n_b == 0 { 0.0 } else { 1.0 / n_b as f64 };
    ((1.0 / alpha).ln() * inv / 2.0).sqrt()
}

/// `E|X/n_a − Y/n_b|` for independent `X ~ Bin(n_a, p)`, `Y ~ Bin(n_b, p)`; `n_b = 0` means the
/// second side is the exact value `p`.
fn expected_gap(p: f64, n_a: u64, n_b: u64) -> f64 {
    const EXACT_BELOW: f64 = 100.0;
    let sd = |n: u64| (p * (1.0 - p) / n as f64).sqrt();
    let var = sd(n_a).powi(2) + if n_b == 0 { 0.0 } else { sd(n_b).powi(2) };
    let expected = |n: u64| n as f64 * p;
    if expected(n_a) > EXACT_BELOW && (n_b == 0 || expected(n_b) > EXACT_BELOW) {
        return (2.0 / std::f64::consts::PI).sqrt() * var.sqrt();
    }
    // The binomial law of X/n on the indices that carry its mass (mean ± 12 sd + 12).
    let law = |n: u64| -> Vec<(f64, f64)> {
        let mean = n as f64 * p;
        let spread = 12.0 * (mean * (1.0 - p)).sqrt() + 12.0;
        let lo = (mean - spread).max(0.0).floor() as u64;
        let hi = ((mean + spread).ceil() as u64).min(n);
        (lo..=hi)
            .map(|k| (k as f64 / n as f64, binomial_pmf(k, n, p)))
            .filter(|&(_, w)| w > 0.0)
            .collect()
    };
    let a = law(n_a);
    let b = if n_b == 0 { vec![(p, 1.0)] } else { law(n_b) };
    let mut e = 0.0;
    for &(x, wx) in &a {
        for &(y, wy) in &b {
            e += wx * wy * (x - y).abs();
        }
    }
    e
}

/// `½ Σ_k E|…|` over cells grouped by equal probability (see the file header).
fn plug_in_level(probabilities: impl Iterator<Item = f64>, n_a: u64, n_b: u64) -> f64 {
    let mut groups: std::collections::BTreeMap<u64, (f64, u64)> = Default::default();
    for p in probabilities.filter(|&p| p > 0.0) {
        groups.entry(p.to_bits()).or_insert((p, 0)).1 += 1;
    }
    0.5 * groups
        .values()
        .map(|&(p, m)| m as f64 * expected_gap(p, n_a, n_b))
        .sum::<f64>()
}

/// Total variation between the empirical laws of `a` and `b`, with an upper bound at `1 − alpha`.
///
/// # Errors
/// [`StatsError::InvalidAlpha`], [`StatsError::EmptySample`].
pub fn total_variation<K: Ord + Hash + Clone>(
    a: &CategoricalCounts<K>,
    b: &CategoricalCounts<K>,
    alpha: f64,
) -> Result<TvEstimate, StatsError> {
    check_alpha(alpha)?;
    if a.total() == 0 {
        return Err(StatsError::EmptySample { which: "a" });
    }
    if b.total() == 0 {
        return Err(StatsError::EmptySample { which: "b" });
    }
    let (na, nb) = (a.total(), b.total());
    let mut s = 0.0;
    for (_, x, y) in aligned_counts(a, b) {
        s += (x as f64 / na as f64 - y as f64 / nb as f64).abs();
    }
    let estimate = (0.5 * s).min(1.0);
    let pooled = (na + nb) as f64;
    let level = plug_in_level(
        aligned_counts(a, b)
            .into_iter()
            .map(|(_, x, y)| (x + y) as f64 / pooled),
        a.total(),
        b.total(),
    );
    Ok(TvEstimate {
        estimate,
        same_law_level: level,
        corrected: (estimate - level).max(0.0),
        upper_bound: (estimate + tv_bound_margin(a.total(), b.total(), alpha)).min(1.0),
        alpha,
        n_a: a.total(),
        n_b: b.total(),
    })
}

/// Total variation between the empirical law of `observed` and the exact law `law`.
///
/// # Errors
/// [`StatsError::InvalidAlpha`], [`StatsError::EmptySample`].
pub fn total_variation_to_law<K: Ord + Hash + Clone>(
    observed: &CategoricalCounts<K>,
    law: &ExactLaw<K>,
    alpha: f64,
) -> Result<TvEstimate, StatsError> {
    check_alpha(alpha)?;
    if observed.total() == 0 {
        return Err(StatsError::EmptySample { which: "observed" });
    }
    let n = observed.total() as f64;
    // Σ|p̂ − p| = Σ_{law cells} |p̂ − p| + (mass of p̂ outside the law's cells).
    let mut s = 0.0;
    let mut inside = 0u64;
    for (k, p) in law.cells() {
        let c = observed.count(k);
        inside += c;
        s += (c as f64 / n - p).abs();
    }
    s += (observed.total() - inside) as f64 / n;
    let estimate = (0.5 * s).min(1.0);
    let level = plug_in_level(law.cells().iter().map(|(_, p)| *p), observed.total(), 0);
    Ok(TvEstimate {
        estimate,
        same_law_level: level,
        corrected: (estimate - level).max(0.0),
        upper_bound: (estimate + tv_bound_margin(observed.total(), 0, alpha)).min(1.0),
        alpha,
        n_a: observed.total(),
        n_b: 0,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn plug_in_values() {
        let mut a = CategoricalCounts::new();
        let mut b = CategoricalCounts::new();
        a.add_count(0u64, 50);
        a.add_count(1, 50);
        b.add_count(1, 25);
        b.add_count(2, 75);
        let t = total_variation(&a, &b, 0.05).unwrap();
        // ½(|0.5 − 0| + |0.5 − 0.25| + |0 − 0.75|) = 0.75
        assert!((t.estimate - 0.75).abs() < 1e-12);
        let margin = ((20.0f64).ln() * 0.02 / 2.0).sqrt();
        assert!((t.upper_bound - (0.75 + margin)).abs() < 1e-12);
        let law = ExactLaw::new(vec![(0u64, 0.5), (1, 0.5)]).unwrap();
        let t = total_variation_to_law(&b, &law, 0.05).unwrap();
        // ½(0.5 + 0.25 + 0.75) = 0.75
        assert!((t.estimate - 0.75).abs() < 1e-12);
        assert_eq!(t.n_b, 0);
        assert!(total_variation(&a, &b, 1.0).is_err());
    }

    #[test]
    fn same_law_level_matches_closed_forms() {
        // One cell of probability p against its exact value with n = 1: E|X − p| = 2p(1 − p).
        let e = expected_gap(0.3, 1, 0);
        assert!((e - 2.0 * 0.3 * 0.7).abs() < 1e-15, "{e}");
        // Two samples of size 1: E|X − Y| = P(X ≠ Y) = 2p(1 − p).
        let e = expected_gap(0.3, 1, 1);
        assert!((e - 0.42).abs() < 1e-15, "{e}");
        // Large counts: the normal value sqrt(2/π)·sd, and the exact sum just below the switch
        // agrees with it to 1e-3 relative (de Moivre–Laplace).
        let (p, n) = (0.5, 199u64);
        let exact = expected_gap(p, n, n);
        let normal = (2.0 / std::f64::consts::PI).sqrt() * (2.0 * p * (1.0 - p) / n as f64).sqrt();
        assert!((exact / normal - 1.0).abs() < 1e-3, "{exact} {normal}");
    }

    #[test]
    fn corrected_estimate_is_near_zero_for_one_law_on_a_large_space() {
        // 5000 outcomes, 20000 draws per side from the same uniform law (a fixed LCG stands in
        // for a random stream): the plug-in TV is mostly bias, the corrected one is small.
        let mut state = 12345u64;
        let mut draw = || {
            state = state
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (state >> 33) % 5000
        };
        let (mut a, mut b) = (CategoricalCounts::new(), CategoricalCounts::new());
        for _ in 0..20000 {
            a.add(draw());
            b.add(draw());
        }
        let t = total_variation(&a, &b, 0.05).unwrap();
        assert!(t.estimate > 0.25, "plug-in {t:?}");
        assert!(t.corrected < 0.03, "corrected {t:?}");
        assert!((t.estimate - t.same_law_level).abs() < 0.03, "{t:?}");
    }
}
