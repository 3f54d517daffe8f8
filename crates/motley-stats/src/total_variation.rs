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

use std::hash::Hash;

use serde::{Deserialize, Serialize};

use crate::categorical_counts::aligned_counts;
use crate::{CategoricalCounts, ExactLaw, StatsError};

/// A total variation estimate with its upper confidence bound.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct TvEstimate {
    /// Plug-in estimate `½ Σ |p̂_a − p̂_b|`.
    pub estimate: f64,
    /// Upper confidence bound at level `1 − alpha` (capped at 1).
    pub upper_bound: f64,
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
    let na = a.total() as f64;
    let nb = b.total() as f64;
    let mut s = 0.0;
    for (_, x, y) in aligned_counts(a, b) {
        s += (x as f64 / na - y as f64 / nb).abs();
    }
    let estimate = (0.5 * s).min(1.0);
    Ok(TvEstimate {
        estimate,
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
    Ok(TvEstimate {
        estimate,
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
}
