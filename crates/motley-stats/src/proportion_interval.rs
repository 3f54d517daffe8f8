//! Confidence intervals for a binomial proportion: Wilson score and Clopper–Pearson ("exact").
//!
//! # Formula
//! Wilson (1927, JASA 22:209–212): the roots of `(p̂ − p)² = z² p(1 − p)/n`, i.e.
//! `(x + z²/2 ± z sqrt(x(n − x)/n + z²/4)) / (n + z²)`; the lower root is computed as
//! `x² / (n (n + z²) upper)` (product of the roots) to avoid cancellation when `x ≪ n`.
//! Clopper–Pearson (1934, Biometrika 26:404–413): `L` solves `P(X >= x | L) = α/2` and `U` solves
//! `P(X <= x | U) = α/2` (equivalently Beta quantiles `B(α/2; x, n−x+1)`, `B(1−α/2; x+1, n−x)`).
//! We solve them by bisection on `ln p` with our own binomial tails ([`crate::binomial_dist`]
//! documents them), which stay accurate for `n = 10⁹` where `statrs`' Beta inverse fails; `x = 0`
//! and `x = n` use the closed forms `1 − (α/2)^{1/n}` and `(α/2)^{1/n}`.
//!
//! # Precision
//! Bisection to 1e-15 in `ln p` (relative 1e-15 in `p`), so the bounds are as good as the tails,
//! about 1e-11 relative at `n = 10⁹`.

use serde::{Deserialize, Serialize};

use crate::binomial_dist::{binomial_lower_tail, binomial_upper_tail};
use crate::chi_square_dist::normal_upper_quantile;
use crate::StatsError;

/// A two-sided confidence interval.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Interval {
    /// Lower bound.
    pub lower: f64,
    /// Upper bound.
    pub upper: f64,
    /// Confidence level, e.g. 0.95.
    pub confidence: f64,
}

pub(crate) fn check_counts(successes: u64, trials: u64) -> Result<(), StatsError> {
    if trials == 0 {
        return Err(StatsError::NoTrials);
    }
    if successes > trials {
        return Err(StatsError::SuccessesExceedTrials { successes, trials });
    }
    Ok(())
}

fn check_confidence(c: f64) -> Result<(), StatsError> {
    if !(c > 0.0 && c < 1.0) {
        return Err(StatsError::InvalidConfidence(c));
    }
    Ok(())
}

/// Wilson score interval for `successes` out of `trials` at level `confidence`.
///
/// # Errors
/// [`StatsError::NoTrials`], [`StatsError::SuccessesExceedTrials`], [`StatsError::InvalidConfidence`].
pub fn wilson_interval(
    successes: u64,
    trials: u64,
    confidence: f64,
) -> Result<Interval, StatsError> {
    check_counts(successes, trials)?;
    check_confidence(confidence)?;
    let z = normal_upper_quantile((1.0 - confidence) / 2.0);
    let (x, n) = (successes as f64, trials as f64);
    let z2 = z * z;
    let denom = n + z2;
    let root = z * (x * (n - x) / n + z2 / 4.0).sqrt();
    let upper = if successes == trials {
        1.0
    } else {
        ((x + z2 / 2.0 + root) / denom).min(1.0)
    };
    let lower = if successes == 0 {
        0.0
    } else {
        // Product of the two roots is x² / (n (n + z²)).
        let hi = (x + z2 / 2.0 + root) / denom;
        x * x / (n * denom * hi)
    };
    Ok(Interval {
        lower,
        upper,
        confidence,
    })
}

/// Bisection on `t = ln p ∈ [−745, 0]` for the point where `increasing(p)` crosses `target`.
fn solve_log(target: f64, f: impl Fn(f64) -> f64, increasing: bool) -> f64 {
    let (mut lo, mut hi) = (-745.0f64, 0.0f64);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        let v = f(mid.exp());
        let below = if increasing { v < target } else { v > target };
        if below {
            lo = mid;
        } else {
            hi = mid;
        }
        if hi - lo <= 1e-15 {
            break;
        }
    }
    (0.5 * (lo + hi)).exp()
}

/// Clopper–Pearson interval for `successes` out of `trials` at level `confidence`.
///
/// # Errors
/// [`StatsError::NoTrials`], [`StatsError::SuccessesExceedTrials`], [`StatsError::InvalidConfidence`].
///
/// # Examples
/// ```
/// let ci = motley_stats::clopper_pearson_interval(1, 1_000_000_000, 0.95).unwrap();
/// // Closed form for x = 1 lower bound: 1 − 0.975^(1/n).
/// assert!((ci.lower / 2.53178079839694e-11 - 1.0).abs() < 1e-9);
/// assert!(ci.upper > 5.57e-9 && ci.upper < 5.58e-9);
/// ```
pub fn clopper_pearson_interval(
    successes: u64,
    trials: u64,
    confidence: f64,
) -> Result<Interval, StatsError> {
    check_counts(successes, trials)?;
    check_confidence(confidence)?;
    let half = (1.0 - confidence) / 2.0;
    let (x, n) = (successes, trials);
    let root = half.ln() / n as f64;
    let lower = if x == 0 {
        0.0
    } else if x == n {
        root.exp()
    } else {
        solve_log(half, |p| binomial_upper_tail(x, n, p), true)
    };
    let upper = if x == n {
        1.0
    } else if x == 0 {
        -root.exp_m1()
    } else {
        solve_log(half, |p| binomial_lower_tail(x, n, p), false)
    };
    Ok(Interval {
        lower,
        upper,
        confidence,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    // Clopper–Pearson: scipy 1.17.1, scipy.stats.beta.ppf(0.025, x, n - x + 1) and
    // beta.ppf(0.975, x + 1, n - x). (scipy's binomtest(...).proportion_ci(method='exact') returns
    // 2.5353853913364266e-11 for x = 1, n = 1e9, which is 1.4e-3 off the closed form
    // 1 − 0.975^(1/n) = 2.53178079839694e-11, so beta.ppf is the reference used here.)
    // Exception: the upper bound for x = 1, n = 1e9, where beta.ppf(0.975, 2, 1e9 - 1) =
    // 5.571643429123389e-09 leaves a residual of 1.1e-9 in (1-p)^(n-1) (1 - p + n p) = 0.025; the value
    // used, 5.571643378203115e-09, is the root of that equation found by bisection in Python
    // `decimal` with 60 digits (residual below 1e-40).
    // Wilson: scipy 1.17.1, scipy.stats.binomtest(x, n).proportion_ci(0.95, method='wilson').
    // (x, n, exact low, exact high, wilson low, wilson high)
    const REFS: [(u64, u64, f64, f64, f64, f64); 7] = [
        (0, 10, 0.0, 0.3084971078187607, 0.0, 0.27753279986288926),
        (
            3,
            10,
            0.06673951117773447,
            0.6524528500599973,
            0.10779126740630102,
            0.6032218525388546,
        ),
        (10, 10, 0.6915028921812392, 1.0, 0.7224672001371109, 1.0),
        (
            7,
            50,
            0.05819170034037209,
            0.2673960024970084,
            0.06950833427016292,
            0.26186193710585537,
        ),
        (
            1,
            1_000_000_000,
            2.531780798396938e-11,
            5.571643378203115e-09,
            1.765245549569633e-10,
            5.664934243297439e-09,
        ),
        (
            500_000_000,
            1_000_000_000,
            0.4999690097484223,
            0.5000309902515777,
            0.4999690102484443,
            0.5000309897515557,
        ),
        (
            17,
            1_000_000,
            9.90315665885742e-06,
            2.721850774684384e-05,
            1.0614492680504599e-05,
            2.722682077434217e-05,
        ),
    ];

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * b.abs().max(1e-300)
    }

    #[test]
    fn clopper_pearson_matches_reference() {
        for (x, n, lo, hi, _, _) in REFS {
            let ci = clopper_pearson_interval(x, n, 0.95).unwrap();
            assert!(
                close(ci.lower, lo, 1e-9),
                "{x}/{n}: lower {} vs {lo}",
                ci.lower
            );
            assert!(
                close(ci.upper, hi, 1e-9),
                "{x}/{n}: upper {} vs {hi}",
                ci.upper
            );
        }
    }

    #[test]
    fn wilson_matches_reference() {
        for (x, n, _, _, lo, hi) in REFS {
            let ci = wilson_interval(x, n, 0.95).unwrap();
            assert!(
                close(ci.lower, lo, 1e-12),
                "{x}/{n}: lower {} vs {lo}",
                ci.lower
            );
            assert!(
                close(ci.upper, hi, 1e-12),
                "{x}/{n}: upper {} vs {hi}",
                ci.upper
            );
        }
    }

    #[test]
    fn errors() {
        assert_eq!(
            clopper_pearson_interval(1, 0, 0.95),
            Err(StatsError::NoTrials)
        );
        assert_eq!(
            wilson_interval(5, 4, 0.95),
            Err(StatsError::SuccessesExceedTrials {
                successes: 5,
                trials: 4
            })
        );
        assert_eq!(
            wilson_interval(1, 4, 1.0),
            Err(StatsError::InvalidConfidence(1.0))
        );
    }
}
