//! Two-sided comparison of two binomial proportions `x_a / n_a` and `x_b / n_b`.
//!
//! # Method
//! When every expected cell of the 2×2 table is at least 5 (Cochran's rule, common practice), the
//! pooled two-proportion z test: `z = (x_a/n_a - x_b/n_b) / sqrt(p̄ (1 - p̄)(1/n_a + 1/n_b))`,
//! `p = 2 P(Z > |z|)`. Otherwise Fisher's exact test conditional on the margins; its two-sided p-value
//! sums the hypergeometric probabilities not exceeding that of the observed table times `1 + 1e-7`
//! (the relative tolerance used by R's `fisher.test` and scipy's `fisher_exact`).
//! If all or none of the pooled observations are successes the tables carry no information:
//! p-value 1, [`ProportionTest::Degenerate`].

use serde::{Deserialize, Serialize};
use statrs::function::gamma::ln_gamma;

use crate::chi_square_dist::normal_sf;

/// Which test produced a two-proportion p-value.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum ProportionTest {
    /// Pooled two-proportion z test (all expected cells >= 5).
    PooledZ,
    /// Fisher's exact test (some expected cell < 5).
    FisherExact,
    /// No successes or no failures at all: nothing to test, p-value 1.
    Degenerate,
}

/// Smallest expected cell count for which the z test is used.
pub const Z_TEST_MIN_EXPECTED: f64 = 5.0;

/// Two-sided p-value for `x_a` of `n_a` against `x_b` of `n_b` (both `n > 0`, `x <= n`).
pub fn two_proportion_p_value(x_a: u64, n_a: u64, x_b: u64, n_b: u64) -> (f64, ProportionTest) {
    let n = n_a + n_b;
    let k = x_a + x_b;
    if k == 0 || k == n {
        return (1.0, ProportionTest::Degenerate);
    }
    let nf = n as f64;
    let kf = k as f64;
    let min_expected = (n_a.min(n_b) as f64) * kf.min(nf - kf) / nf;
    if min_expected >= Z_TEST_MIN_EXPECTED {
        let pbar = kf / nf;
        let se = (pbar * (1.0 - pbar) * (1.0 / n_a as f64 + 1.0 / n_b as f64)).sqrt();
        let z = (x_a as f64 / n_a as f64 - x_b as f64 / n_b as f64) / se;
        ((2.0 * normal_sf(z.abs())).min(1.0), ProportionTest::PooledZ)
    } else {
        (
            fisher_exact_p_value(x_a, n_a, k, n),
            ProportionTest::FisherExact,
        )
    }
}

fn ln_choose(n: u64, k: u64) -> f64 {
    ln_gamma(n as f64 + 1.0) - ln_gamma(k as f64 + 1.0) - ln_gamma((n - k) as f64 + 1.0)
}

/// Fisher's exact two-sided p-value: `x_a` successes among `n_a` draws from `n` items of which `k`
/// are successes.
pub fn fisher_exact_p_value(x_a: u64, n_a: u64, k: u64, n: u64) -> f64 {
    let n_b = n - n_a;
    let lo = k.saturating_sub(n_b);
    let hi = k.min(n_a);
    let ln_den = ln_choose(n, n_a);
    let ln_pmf = |x: u64| ln_choose(k, x) + ln_choose(n - k, n_a - x) - ln_den;
    let observed = ln_pmf(x_a);
    let threshold = observed + (1.0f64 + 1e-7).ln();
    let mut sum = 0.0;
    for x in lo..=hi {
        let l = ln_pmf(x);
        if l <= threshold {
            sum += l.exp();
        }
    }
    sum.min(1.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fisher_matches_reference() {
        // scipy 1.17.1, scipy.stats.fisher_exact([[2, 98], [6, 94]]).pvalue = 0.27904331794260917
        // (pooled 8 of 200: smallest expected cell 4 < 5, so the exact test is chosen).
        let p = fisher_exact_p_value(2, 100, 8, 200);
        assert!((p - 0.27904331794260917).abs() < 1e-12, "{p}");
        let (p2, t) = two_proportion_p_value(2, 100, 6, 100);
        assert_eq!(t, ProportionTest::FisherExact);
        assert_eq!(p2, p);
        // scipy 1.17.1, scipy.stats.fisher_exact([[1, 9], [11, 3]]).pvalue = 0.0027594561852200836
        let p = fisher_exact_p_value(1, 10, 12, 24);
        assert!((p - 0.0027594561852200836).abs() < 1e-12, "{p}");
    }

    #[test]
    fn z_test_matches_reference() {
        // Pooled z for 520/1000 vs 480/1000: p̄ = 0.5, se = sqrt(0.25 * 0.002), z = 1.7888543819998317;
        // scipy 1.17.1, 2 * scipy.stats.norm.sf(1.7888543819998317) = 0.07363827012030266
        let (p, t) = two_proportion_p_value(520, 1000, 480, 1000);
        assert_eq!(t, ProportionTest::PooledZ);
        assert!((p - 0.07363827012030266).abs() < 1e-12, "{p}");
        assert_eq!(
            two_proportion_p_value(0, 10, 0, 20),
            (1.0, ProportionTest::Degenerate)
        );
    }
}
