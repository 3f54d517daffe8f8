//! The Kolmogorov distribution: the law of `K = sup_t |B(t)|` for a Brownian bridge `B`, the limit of
//! `sqrt(n) D_n` for the Kolmogorov–Smirnov statistic.
//!
//! # Formula
//! Two classical series (Kolmogorov 1933; see e.g. Marsaglia, Tsang & Wang 2003, J. Stat. Softw. 8(18)):
//! `P(K > x) = 2 Σ_{j>=1} (−1)^{j−1} exp(−2 j² x²)`, used for `x >= 1`, where it converges after a
//! handful of terms and gives the survival function directly (accurate relative precision in the far
//! tail, no `1 − cdf` cancellation); and
//! `P(K <= x) = sqrt(2π)/x Σ_{j>=1} exp(−(2j − 1)² π² / (8 x²))`, used for `x < 1`.
//!
//! # Precision
//! Both series are summed until the next term is below 1e-17 of the sum; the switch at `x = 1` keeps
//! either series within a few terms. Absolute error about 1e-16, relative error of the survival
//! function about 1e-15 for `x >= 1`.

use std::f64::consts::PI;

/// `P(K <= x)`.
pub fn kolmogorov_cdf(x: f64) -> f64 {
    if x <= 0.0 {
        return 0.0;
    }
    if x < 1.0 {
        small_x_cdf(x)
    } else {
        1.0 - large_x_sf(x)
    }
}

/// `P(K > x)`.
///
/// # Examples
/// ```
/// // Common table: the 5% critical value of the Kolmogorov distribution is 1.358.
/// assert!((motley_stats::kolmogorov_sf(1.358) - 0.05).abs() < 5e-4);
/// ```
pub fn kolmogorov_sf(x: f64) -> f64 {
    if x <= 0.0 {
        return 1.0;
    }
    if x < 1.0 {
        1.0 - small_x_cdf(x)
    } else {
        large_x_sf(x)
    }
}

/// The upper `alpha` quantile of the Kolmogorov distribution: the `x` with `P(K > x) = alpha`, by
/// bisection on [`kolmogorov_sf`] over `[0.2, 5]` (100 halvings; `alpha` outside
/// `(P(K > 5), P(K > 0.2))` gives the nearer end).
///
/// # Examples
/// ```
/// // Common table: the 5% critical value of the Kolmogorov distribution is 1.358.
/// assert!((motley_stats::kolmogorov_quantile(0.05) - 1.358).abs() < 1e-3);
/// ```
pub fn kolmogorov_quantile(alpha: f64) -> f64 {
    // P(K > 40) = 2e^{-3200} underflows to 0: every level a float can hold lies below 40.
    let (mut lo, mut hi) = (0.2, 40.0);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if kolmogorov_sf(mid) > alpha {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

fn small_x_cdf(x: f64) -> f64 {
    let c = PI * PI / (8.0 * x * x);
    let mut sum = 0.0;
    let mut j = 1.0f64;
    loop {
        let odd = 2.0 * j - 1.0;
        let t = (-odd * odd * c).exp();
        sum += t;
        if t <= 1e-17 * sum || t == 0.0 {
            break;
        }
        j += 1.0;
    }
    ((2.0 * PI).sqrt() / x * sum).min(1.0)
}

fn large_x_sf(x: f64) -> f64 {
    let mut sum = 0.0;
    let mut sign = 1.0;
    let mut j = 1.0f64;
    loop {
        let t = (-2.0 * j * j * x * x).exp();
        sum += sign * t;
        if t <= 1e-17 * sum.abs() || t == 0.0 {
            break;
        }
        sign = -sign;
        j += 1.0;
    }
    (2.0 * sum).clamp(0.0, 1.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn table_values() {
        // Common table of the Kolmogorov distribution: P(K <= 1.358) ≈ 0.95, P(K <= 1.628) ≈ 0.99,
        // P(K <= 1.224) ≈ 0.90 (three-decimal critical values).
        assert!((kolmogorov_cdf(1.358) - 0.95).abs() < 5e-4);
        assert!((kolmogorov_cdf(1.628) - 0.99).abs() < 1e-4);
        assert!((kolmogorov_cdf(1.224) - 0.90).abs() < 5e-4);
        // scipy 1.17.1, scipy.special.kolmogorov(x) (survival function):
        let refs = [
            (0.3, 0.9999906941986655),
            (0.5, 0.9639452436648751),
            (0.9, 0.3927307079406543),
            (1.0, 0.26999967167735456),
            (1.5, 0.022217962616525127),
            (3.0, 3.045995948942526e-08),
            (6.0, 1.0760372320042276e-31),
        ];
        for (x, want) in refs {
            let got = kolmogorov_sf(x);
            assert!((got / want - 1.0).abs() < 1e-12, "x = {x}: {got} vs {want}");
            assert!((kolmogorov_cdf(x) + got - 1.0).abs() < 1e-15);
        }
        // Continuity at the switch.
        assert!((small_x_cdf(1.0) - (1.0 - large_x_sf(1.0))).abs() < 1e-15);
    }
}
