//! Exact two-sided binomial test of `successes` out of `trials` against a stated probability `p0`.
//!
//! # Method
//! "Minimum likelihood" two-sided p-value: the total probability under `p0` of all outcomes whose
//! probability does not exceed that of the observed one (times `1 + 1e-7` to absorb rounding), as in
//! R's `binom.test` and scipy's `binomtest`. Since the binomial point probabilities increase up to the
//! mode and then decrease, the outcomes on the far side form one tail, found by binary search, so the
//! cost is two tail sums even for `n = 10⁹`.

use serde::{Deserialize, Serialize};

use crate::binomial_dist::{binomial_lower_tail, binomial_pmf, binomial_upper_tail};
use crate::proportion_interval::check_counts;
use crate::StatsError;

/// Outcome of an exact binomial test.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct BinomialTestResult {
    /// Number of successes.
    pub successes: u64,
    /// Number of trials.
    pub trials: u64,
    /// Null probability.
    pub p0: f64,
    /// `successes / trials`.
    pub estimate: f64,
    /// Two-sided p-value.
    pub p_value: f64,
}

/// Exact two-sided binomial test (see the file header).
///
/// # Errors
/// [`StatsError::NoTrials`], [`StatsError::SuccessesExceedTrials`], [`StatsError::InvalidNullProbability`].
///
/// # Examples
/// ```
/// let r = motley_stats::binomial_test(3, 10, 0.5).unwrap();
/// assert!((r.p_value - 0.34375).abs() < 1e-12);
/// ```
pub fn binomial_test(
    successes: u64,
    trials: u64,
    p0: f64,
) -> Result<BinomialTestResult, StatsError> {
    check_counts(successes, trials)?;
    if !(0.0..=1.0).contains(&p0) {
        return Err(StatsError::InvalidNullProbability(p0));
    }
    let (x, n) = (successes, trials);
    let p_value = if p0 == 0.0 {
        if x == 0 {
            1.0
        } else {
            0.0
        }
    } else if p0 == 1.0 {
        if x == n {
            1.0
        } else {
            0.0
        }
    } else {
        let mean = n as f64 * p0;
        let d = binomial_pmf(x, n, p0) * (1.0 + 1e-7);
        if x as f64 == mean {
            1.0
        } else if (x as f64) < mean {
            // Smallest i in [ceil(mean), n] with pmf(i) <= d; pmf is non-increasing there.
            let (mut lo, mut hi) = (mean.ceil() as u64, n);
            if binomial_pmf(hi, n, p0) > d {
                binomial_lower_tail(x, n, p0)
            } else {
                while lo < hi {
                    let mid = lo + (hi - lo) / 2;
                    if binomial_pmf(mid, n, p0) <= d {
                        hi = mid;
                    } else {
                        lo = mid + 1;
                    }
                }
                binomial_lower_tail(x, n, p0) + binomial_upper_tail(lo, n, p0)
            }
        } else {
            // Largest i in [0, floor(mean)] with pmf(i) <= d; pmf is non-decreasing there.
            let (mut lo, mut hi) = (0u64, mean.floor() as u64);
            if binomial_pmf(0, n, p0) > d {
                binomial_upper_tail(x, n, p0)
            } else {
                while lo < hi {
                    let mid = lo + (hi - lo).div_ceil(2);
                    if binomial_pmf(mid, n, p0) <= d {
                        lo = mid;
                    } else {
                        hi = mid - 1;
                    }
                }
                binomial_lower_tail(lo, n, p0) + binomial_upper_tail(x, n, p0)
            }
        }
    };
    Ok(BinomialTestResult {
        successes,
        trials,
        p0,
        estimate: x as f64 / n as f64,
        p_value: p_value.min(1.0),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn matches_reference_library() {
        // scipy 1.17.1, scipy.stats.binomtest(x, n, p).pvalue
        let refs = [
            (3u64, 10u64, 0.5, 0.34375),
            (7, 50, 0.25, 0.07398900632569533),
            (60, 100, 0.5, 0.05688793364098089),
            (2, 1000, 0.01, 0.005967791781518967),
            (9, 20, 0.3, 0.1488145951754469),
            (500_050_000, 1_000_000_000, 0.5, 0.0015655722610772485),
        ];
        for (x, n, p, want) in refs {
            let got = binomial_test(x, n, p).unwrap().p_value;
            assert!(
                (got / want - 1.0).abs() < 1e-9,
                "{x}/{n} vs {p}: {got} vs {want}"
            );
        }
        assert_eq!(binomial_test(5, 10, 0.5).unwrap().p_value, 1.0);
        assert!(binomial_test(1, 10, 1.5).is_err());
    }
}
