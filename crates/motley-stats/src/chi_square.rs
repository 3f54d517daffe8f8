//! Chi-square (Pearson) and G (likelihood-ratio) tests on categorical laws: homogeneity of two
//! samples and goodness of fit against an exact law, with sparse cells pooled by the rule in
//! [`crate::pooling`](self) (documented on [`ChiSquareOptions::min_expected`]).
//!
//! Cells are visited in sorted key order and the rest cell comes last, so the statistic is a fixed
//! sequence of floating-point operations on the counts: bit-identical across runs and merge orders.
//!
//! # Formula
//! Homogeneity: `E_{s,g} = n_s T_g / N`, Pearson `X² = Σ (O - E)² / E`, G `= 2 Σ O ln(O / E)`
//! (terms with `O = 0` contribute 0), degrees of freedom `groups - 1`. Goodness of fit:
//! `E_g = n p_g`, same statistics, `groups - 1` degrees of freedom (no estimated parameters).
//! p-value `P(χ²_dof > X²)` from the survival function. With a single group left (dof 0) the test
//! has nothing to compare and reports statistic 0, p-value 1.

use std::hash::Hash;

use serde::{Deserialize, Serialize};

use crate::categorical_counts::aligned_counts;
use crate::chi_square_dist::chi_square_sf;
use crate::pooling::pool;
use crate::{CategoricalCounts, ExactLaw, StatsError};

/// Which statistic to compute.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize, Default)]
pub enum ChiSquareMethod {
    /// Pearson's `Σ (O - E)² / E`.
    #[default]
    Pearson,
    /// The likelihood-ratio G statistic `2 Σ O ln(O / E)`.
    GTest,
}

/// Options of the chi-square tests.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ChiSquareOptions {
    /// Pearson or G statistic.
    pub method: ChiSquareMethod,
    /// Pooling threshold on the smallest expected count of a cell (default 5, common practice):
    /// cells below it are merged into one rest cell; a rest cell still below it absorbs the smallest
    /// kept cell, repeatedly. 0 disables pooling.
    pub min_expected: f64,
}

impl Default for ChiSquareOptions {
    fn default() -> Self {
        ChiSquareOptions {
            method: ChiSquareMethod::Pearson,
            min_expected: 5.0,
        }
    }
}

impl ChiSquareOptions {
    fn check(&self) -> Result<(), StatsError> {
        if !self.min_expected.is_finite() || self.min_expected < 0.0 {
            return Err(StatsError::InvalidMinExpected(self.min_expected));
        }
        Ok(())
    }
}

/// Outcome of a chi-square or G test.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ChiSquareResult {
    /// Statistic used.
    pub method: ChiSquareMethod,
    /// Value of the statistic.
    pub statistic: f64,
    /// Degrees of freedom (groups − 1).
    pub dof: u64,
    /// `P(χ²_dof > statistic)`, from the survival function.
    pub p_value: f64,
    /// Distinct cells before pooling (observed or with positive reference probability).
    pub cells: usize,
    /// Cells actually compared after pooling (kept cells plus the rest cell, if any).
    pub tested_cells: usize,
    /// Number of original cells merged into the rest cell.
    pub pooled_cells: usize,
    /// Goodness of fit only: observations in cells of reference probability 0. Any such
    /// observation makes the statistic infinite and the p-value 0. Always 0 for homogeneity.
    pub impossible_observations: u64,
}

fn term(method: ChiSquareMethod, observed: f64, expected: f64) -> f64 {
    match method {
        ChiSquareMethod::Pearson => {
            let d = observed - expected;
            d * d / expected
        }
        ChiSquareMethod::GTest => {
            if observed == 0.0 {
                0.0
            } else {
                2.0 * observed * (observed / expected).ln()
            }
        }
    }
}

fn finish(
    method: ChiSquareMethod,
    statistic: f64,
    groups: usize,
    cells: usize,
    pooled: usize,
    impossible: u64,
) -> ChiSquareResult {
    let dof = groups.saturating_sub(1) as u64;
    let (statistic, p_value) = if impossible > 0 {
        (f64::INFINITY, 0.0)
    } else if dof == 0 {
        (0.0, 1.0)
    } else {
        // G can be a hair below 0 from rounding when the fit is perfect.
        let s = statistic.max(0.0);
        (s, chi_square_sf(s, dof as f64))
    };
    ChiSquareResult {
        method,
        statistic,
        dof,
        p_value,
        cells,
        tested_cells: groups,
        pooled_cells: pooled,
        impossible_observations: impossible,
    }
}

/// Chi-square (or G) test that samples `a` and `b` come from the same categorical law.
///
/// # Errors
/// [`StatsError::EmptySample`] if either sample is empty; [`StatsError::InvalidMinExpected`].
///
/// # Examples
/// ```
/// use motley_stats::{chi_square_homogeneity, CategoricalCounts, ChiSquareOptions};
/// let mut a = CategoricalCounts::new();
/// let mut b = CategoricalCounts::new();
/// for i in 0..300u64 { a.add(i % 3); b.add((i * 7) % 3); }
/// let r = chi_square_homogeneity(&a, &b, &ChiSquareOptions::default()).unwrap();
/// assert_eq!(r.dof, 2);
/// assert!(r.p_value > 0.99);
/// ```
pub fn chi_square_homogeneity<K: Ord + Hash + Clone>(
    a: &CategoricalCounts<K>,
    b: &CategoricalCounts<K>,
    options: &ChiSquareOptions,
) -> Result<ChiSquareResult, StatsError> {
    options.check()?;
    if a.total() == 0 {
        return Err(StatsError::EmptySample { which: "a" });
    }
    if b.total() == 0 {
        return Err(StatsError::EmptySample { which: "b" });
    }
    let cells = aligned_counts(a, b);
    let na = a.total() as f64;
    let nb = b.total() as f64;
    let n = na + nb;
    let nmin = na.min(nb);
    let weights: Vec<f64> = cells
        .iter()
        .map(|&(_, x, y)| nmin * (x + y) as f64 / n)
        .collect();
    let pooling = pool(&weights, options.min_expected);
    let mut oa = vec![0u64; pooling.groups];
    let mut ob = vec![0u64; pooling.groups];
    for (i, &(_, x, y)) in cells.iter().enumerate() {
        oa[pooling.group_of[i]] += x;
        ob[pooling.group_of[i]] += y;
    }
    let mut statistic = 0.0;
    for g in 0..pooling.groups {
        let t = (oa[g] + ob[g]) as f64;
        statistic += term(options.method, oa[g] as f64, na * t / n);
        statistic += term(options.method, ob[g] as f64, nb * t / n);
    }
    Ok(finish(
        options.method,
        statistic,
        pooling.groups,
        cells.len(),
        pooling.pooled_cells,
        0,
    ))
}

/// Chi-square (or G) goodness-of-fit test of `observed` against the exact law `law`.
///
/// # Errors
/// [`StatsError::EmptySample`] if `observed` is empty; [`StatsError::InvalidMinExpected`].
pub fn chi_square_goodness_of_fit<K: Ord + Hash + Clone>(
    observed: &CategoricalCounts<K>,
    law: &ExactLaw<K>,
    options: &ChiSquareOptions,
) -> Result<ChiSquareResult, StatsError> {
    options.check()?;
    if observed.total() == 0 {
        return Err(StatsError::EmptySample { which: "observed" });
    }
    let n = observed.total() as f64;
    // Merge the sorted law cells with the sorted observed cells.
    let obs = observed.sorted_cells();
    let law_cells = law.cells();
    let mut counts: Vec<u64> = Vec::new();
    let mut probs: Vec<f64> = Vec::new();
    let mut impossible = 0u64;
    let (mut i, mut j) = (0usize, 0usize);
    while i < law_cells.len() || j < obs.len() {
        let take_law = j >= obs.len() || (i < law_cells.len() && law_cells[i].0 <= *obs[j].0);
        let take_obs = i >= law_cells.len() || (j < obs.len() && *obs[j].0 <= law_cells[i].0);
        let p = if take_law { law_cells[i].1 } else { 0.0 };
        let c = if take_obs { obs[j].1 } else { 0 };
        if p > 0.0 {
            probs.push(p);
            counts.push(c);
        } else {
            impossible += c;
        }
        if take_law {
            i += 1;
        }
        if take_obs {
            j += 1;
        }
    }
    let weights: Vec<f64> = probs.iter().map(|p| n * p).collect();
    let pooling = pool(&weights, options.min_expected);
    let mut og = vec![0u64; pooling.groups];
    let mut pg = vec![0.0f64; pooling.groups];
    for (idx, (&c, &p)) in counts.iter().zip(&probs).enumerate() {
        og[pooling.group_of[idx]] += c;
        pg[pooling.group_of[idx]] += p;
    }
    let mut statistic = 0.0;
    for g in 0..pooling.groups {
        statistic += term(options.method, og[g] as f64, n * pg[g]);
    }
    Ok(finish(
        options.method,
        statistic,
        pooling.groups,
        counts.len() + usize::from(impossible > 0),
        pooling.pooled_cells,
        impossible,
    ))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn counts(v: &[(u64, u64)]) -> CategoricalCounts<u64> {
        let mut c = CategoricalCounts::new();
        for &(k, n) in v {
            c.add_count(k, n);
        }
        c
    }

    #[test]
    fn homogeneity_matches_reference_contingency_test() {
        // scipy 1.17.1, scipy.stats.chi2_contingency([[20,30,50],[30,30,40]], correction=False):
        // statistic 3.1111111111111107, dof 2, p 0.21107208779109024.
        // lambda_="log-likelihood": statistic 3.1269600683408427, p 0.20940606145871174.
        let a = counts(&[(0, 20), (1, 30), (2, 50)]);
        let b = counts(&[(0, 30), (1, 30), (2, 40)]);
        let r = chi_square_homogeneity(&a, &b, &ChiSquareOptions::default()).unwrap();
        assert_eq!(r.dof, 2);
        assert!((r.statistic - 3.1111111111111107).abs() < 1e-12);
        assert!((r.p_value - 0.21107208779109024).abs() < 1e-12);
        let g = chi_square_homogeneity(
            &a,
            &b,
            &ChiSquareOptions {
                method: ChiSquareMethod::GTest,
                ..Default::default()
            },
        )
        .unwrap();
        assert!((g.statistic - 3.1269600683408427).abs() < 1e-12);
        assert!((g.p_value - 0.20940606145871174).abs() < 1e-12);
        assert!((g.statistic - r.statistic).abs() > 1e-3);
    }

    #[test]
    fn goodness_of_fit_matches_reference_and_pools() {
        // scipy 1.17.1, scipy.stats.chisquare([18, 22, 29, 31], [25, 25, 25, 25]):
        // statistic 4.4, p 0.2213853871894879.
        let law = ExactLaw::new(vec![(0u64, 0.25), (1, 0.25), (2, 0.25), (3, 0.25)]).unwrap();
        let obs = counts(&[(0, 18), (1, 22), (2, 29), (3, 31)]);
        let r = chi_square_goodness_of_fit(&obs, &law, &ChiSquareOptions::default()).unwrap();
        assert!((r.statistic - 4.4).abs() < 1e-12);
        assert!((r.p_value - 0.2213853871894879).abs() < 1e-12);
        assert_eq!(r.pooled_cells, 0);
        // Sparse cells: expected 2 and 2 are pooled into one rest of 4 < 5, which then absorbs the
        // smallest kept cell (expected 16), leaving 2 groups.
        let law = ExactLaw::new(vec![(0u64, 0.02), (1, 0.02), (2, 0.16), (3, 0.8)]).unwrap();
        let obs = counts(&[(0, 3), (1, 1), (2, 20), (3, 76)]);
        let r = chi_square_goodness_of_fit(&obs, &law, &ChiSquareOptions::default()).unwrap();
        assert_eq!(r.pooled_cells, 3);
        assert_eq!(r.tested_cells, 2);
        assert_eq!(r.dof, 1);
        // Rest: observed 24, expected 20; kept: 76 vs 80.
        let want = 16.0 / 20.0 + 16.0 / 80.0;
        assert!((r.statistic - want).abs() < 1e-12);
    }

    #[test]
    fn tiny_p_values_survive() {
        let law = ExactLaw::new(vec![(0u64, 0.5), (1, 0.5)]).unwrap();
        let obs = counts(&[(0, 700), (1, 300)]);
        let r = chi_square_goodness_of_fit(&obs, &law, &ChiSquareOptions::default()).unwrap();
        // X² = 160; scipy 1.17.1, scipy.stats.chi2.sf(160, 1) = 1.1314837902433038e-36
        assert!((r.statistic - 160.0).abs() < 1e-9);
        assert!((r.p_value / 1.1314837902433038e-36 - 1.0).abs() < 1e-8);
    }

    #[test]
    fn impossible_observation_rejects() {
        let law = ExactLaw::new(vec![(0u64, 0.5), (1, 0.5)]).unwrap();
        let obs = counts(&[(0, 10), (1, 10), (7, 1)]);
        let r = chi_square_goodness_of_fit(&obs, &law, &ChiSquareOptions::default()).unwrap();
        assert_eq!(r.impossible_observations, 1);
        assert_eq!(r.p_value, 0.0);
    }

    #[test]
    fn errors() {
        let a = counts(&[(0, 1)]);
        let e = CategoricalCounts::new();
        assert_eq!(
            chi_square_homogeneity(&a, &e, &ChiSquareOptions::default()),
            Err(StatsError::EmptySample { which: "b" })
        );
        let bad = ChiSquareOptions {
            min_expected: -1.0,
            ..Default::default()
        };
        assert_eq!(
            chi_square_homogeneity(&a, &a, &bad),
            Err(StatsError::InvalidMinExpected(-1.0))
        );
    }
}
