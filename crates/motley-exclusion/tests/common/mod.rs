//! Shared helpers of the integration tests: Pearson's chi-square with pooling, binomial intervals.
#![allow(dead_code)]

use std::collections::BTreeMap;

use statrs::distribution::{ChiSquared, ContinuousCDF};

/// Pearson's chi-square of `observed` counts (by key) against `expected` probabilities, pooling every
/// cell with expected count < 5 into one cell (and that cell into the smallest other one if it is
/// still below 5) — the usual rule of thumb (common practice, Cochran 1954). Returns
/// `(statistic, degrees of freedom, p-value)`; the p-value is the upper tail of χ²(df) from statrs
/// 0.19.
pub fn chi_square<K: Ord + Clone>(
    observed: &BTreeMap<K, u64>,
    expected: &[(K, f64)],
) -> (f64, usize, f64) {
    let n: u64 = observed.values().sum();
    let n = n as f64;
    // (expected count, observed count) per cell; observations outside the support count against.
    let mut cells: Vec<(f64, f64)> = Vec::new();
    let mut small = (0.0, 0.0);
    let mut covered = 0u64;
    for (k, p) in expected {
        let e = p * n;
        let o = observed.get(k).copied().unwrap_or(0);
        covered += o;
        if e < 5.0 {
            small.0 += e;
            small.1 += o as f64;
        } else {
            cells.push((e, o as f64));
        }
    }
    let outside = observed.values().sum::<u64>() - covered;
    small.1 += outside as f64;
    if small.0 > 0.0 || small.1 > 0.0 {
        if small.0 >= 5.0 || cells.is_empty() {
            cells.push(small);
        } else {
            let i = (0..cells.len())
                .min_by(|&a, &b| cells[a].0.total_cmp(&cells[b].0))
                .unwrap();
            cells[i].0 += small.0;
            cells[i].1 += small.1;
        }
    }
    let stat: f64 = cells
        .iter()
        .map(|&(e, o)| {
            if e > 0.0 {
                (o - e).powi(2) / e
            } else if o > 0.0 {
                f64::INFINITY
            } else {
                0.0
            }
        })
        .sum();
    let df = cells.len().saturating_sub(1).max(1);
    let p = if stat.is_finite() {
        ChiSquared::new(df as f64).unwrap().sf(stat)
    } else {
        0.0
    };
    (stat, df, p)
}

/// The Wilson score interval for `k` successes in `n` trials at normal quantile `z`
/// (Wilson 1927).
pub fn wilson(k: u64, n: u64, z: f64) -> (f64, f64) {
    let n = n as f64;
    let phat = k as f64 / n;
    let denom = 1.0 + z * z / n;
    let centre = (phat + z * z / (2.0 * n)) / denom;
    let half = z * (phat * (1.0 - phat) / n + z * z / (4.0 * n * n)).sqrt() / denom;
    (centre - half, centre + half)
}

/// The two-sided standard normal quantile for tail mass `alpha` (statrs 0.19 inverse CDF).
pub fn z_two_sided(alpha: f64) -> f64 {
    use statrs::distribution::Normal;
    Normal::new(0.0, 1.0)
        .unwrap()
        .inverse_cdf(1.0 - alpha / 2.0)
}
