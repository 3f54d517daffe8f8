//! Power and sample size: how large a difference a run can see, and how many samples a target
//! difference needs.
//!
//! # Formula
//! **Total variation (chi-square homogeneity test on `cells` cells).** Under an alternative the
//! Pearson statistic is approximately noncentral chi-square with `cells − 1` degrees of freedom and
//! noncentrality `λ = n_eff Σ_k (p_{a,k} − p_{b,k})² / p̄_k`, `n_eff = n_a n_b / (n_a + n_b)`
//! (Cohen 1988, *Statistical Power Analysis for the Behavioral Sciences*, ch. 7, effect size `w`).
//! By Cauchy–Schwarz `Σ δ_k² / p̄_k ≥ (Σ |δ_k|)² / Σ p̄_k = 4 TV²`, with equality when `|δ_k| ∝ p̄_k`:
//! the hardest alternatives at a given TV have `λ = 4 n_eff TV²`. With `λ*` the noncentrality at which
//! the level-α test has the target power, every alternative with
//! `TV ≥ sqrt(λ* / (4 n_eff))` is detected with at least that power (up to the noncentral
//! approximation); this is the reported detectable TV, and `n = λ* / (2 TV²)` per side is the sample
//! size for a target TV with equal sizes. Use the number of cells *after pooling*.
//!
//! **Probability gap (two-sided pooled z test, one tail neglected).** The test detects `p₁` vs `p₂`
//! with power `1 − β` when `|p₁ − p₂| = z_{α/2} sqrt(p̄ q̄ (1/n_a + 1/n_b)) + z_β sqrt(p₁q₁/n_a + p₂q₂/n_b)`,
//! `p̄ = (n_a p₁ + n_b p₂)/(n_a + n_b)`; with equal sizes
//! `n = (z_{α/2} sqrt(2 p̄ q̄) + z_β sqrt(p₁q₁ + p₂q₂))² / (p₁ − p₂)²` (Fleiss, Levin & Paik 2003,
//! *Statistical Methods for Rates and Proportions*, 3rd ed., eq. 4.14, without continuity correction).
//! For many elements tested together, pass the per-element level (e.g. `α / m` for Bonferroni).

use crate::chi_square_dist::{
    chi_square_upper_quantile, noncentral_chi_square_sf, normal_upper_quantile,
};
use crate::StatsError;

fn check(alpha: f64, power: f64) -> Result<(), StatsError> {
    if !(alpha > 0.0 && alpha < 1.0) {
        return Err(StatsError::InvalidAlpha(alpha));
    }
    if !(power > 0.0 && power < 1.0) {
        return Err(StatsError::InvalidPower(power));
    }
    Ok(())
}

/// Noncentrality `λ*` at which the level-`alpha` chi-square test with `dof` degrees of freedom has
/// power `power` (bisection to relative precision 1e-12). Returns 0 if `power <= alpha`.
///
/// # Errors
/// [`StatsError::InvalidAlpha`], [`StatsError::InvalidPower`], [`StatsError::TooFewCells`] for `dof = 0`.
pub fn chi_square_noncentrality_for_power(
    dof: u64,
    alpha: f64,
    power: f64,
) -> Result<f64, StatsError> {
    check(alpha, power)?;
    if dof == 0 {
        return Err(StatsError::TooFewCells(1));
    }
    let k = dof as f64;
    let crit = chi_square_upper_quantile(alpha, k);
    if power <= alpha {
        return Ok(0.0);
    }
    if !crit.is_finite() {
        return Err(StatsError::InvalidAlpha(alpha));
    }
    // The noncentral tail at a finite critical value reaches any power below 1 for a finite λ;
    // the doubling is bounded all the same, so no input can make it loop.
    let mut hi = 1.0f64;
    while noncentral_chi_square_sf(crit, k, hi) < power {
        hi *= 2.0;
        if hi > 1e300 {
            return Err(StatsError::InvalidPower(power));
        }
    }
    let mut lo = 0.0f64;
    while hi - lo > 1e-12 * hi {
        let mid = 0.5 * (lo + hi);
        if noncentral_chi_square_sf(crit, k, mid) < power {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Ok(0.5 * (lo + hi))
}

/// Smallest total variation that a chi-square homogeneity test on `cells` cells with `n_a` and
/// `n_b` samples detects with probability `power` at level `alpha`, for every alternative (see the
/// file header). `None` if no TV ≤ 1 qualifies.
///
/// # Errors
/// [`StatsError::InvalidAlpha`], [`StatsError::InvalidPower`], [`StatsError::TooFewCells`],
/// [`StatsError::ZeroSampleSize`].
///
/// # Examples
/// ```
/// let tv = motley_stats::detectable_total_variation(100_000, 100_000, 16, 0.05, 0.99).unwrap();
/// assert!((tv.unwrap() - 0.01352).abs() < 1e-4);
/// ```
pub fn detectable_total_variation(
    n_a: u64,
    n_b: u64,
    cells: usize,
    alpha: f64,
    power: f64,
) -> Result<Option<f64>, StatsError> {
    if cells < 2 {
        return Err(StatsError::TooFewCells(cells));
    }
    if n_a == 0 {
        return Err(StatsError::ZeroSampleSize { which: "n_a" });
    }
    if n_b == 0 {
        return Err(StatsError::ZeroSampleSize { which: "n_b" });
    }
    let lambda = chi_square_noncentrality_for_power(cells as u64 - 1, alpha, power)?;
    let n_eff = (n_a as f64) * (n_b as f64) / (n_a as f64 + n_b as f64);
    let tv = (lambda / (4.0 * n_eff)).sqrt();
    Ok((tv <= 1.0).then_some(tv))
}

/// Samples per side (equal sizes) for the chi-square homogeneity test on `cells` cells to detect
/// every alternative with total variation `tv` with probability `power` at level `alpha`.
///
/// # Errors
/// [`StatsError::InvalidDifference`], [`StatsError::InvalidAlpha`], [`StatsError::InvalidPower`],
/// [`StatsError::TooFewCells`].
pub fn sample_size_for_total_variation(
    tv: f64,
    cells: usize,
    alpha: f64,
    power: f64,
) -> Result<u64, StatsError> {
    if !(tv > 0.0 && tv <= 1.0) {
        return Err(StatsError::InvalidDifference(tv));
    }
    if cells < 2 {
        return Err(StatsError::TooFewCells(cells));
    }
    let lambda = chi_square_noncentrality_for_power(cells as u64 - 1, alpha, power)?;
    Ok((lambda / (2.0 * tv * tv)).ceil().max(1.0) as u64)
}

fn check_proportion(name: &'static str, value: f64) -> Result<(), StatsError> {
    if !(0.0..=1.0).contains(&value) {
        return Err(StatsError::InvalidProportion { name, value });
    }
    Ok(())
}

/// Approximate power of the two-sided pooled z test for `p1` (n_a) against `p2` (n_b).
pub fn two_proportion_power(p1: f64, p2: f64, n_a: u64, n_b: u64, alpha: f64) -> f64 {
    let (na, nb) = (n_a as f64, n_b as f64);
    let pbar = (na * p1 + nb * p2) / (na + nb);
    let s0 = (pbar * (1.0 - pbar) * (1.0 / na + 1.0 / nb)).sqrt();
    let s1 = (p1 * (1.0 - p1) / na + p2 * (1.0 - p2) / nb).sqrt();
    let za = normal_upper_quantile(alpha / 2.0);
    let d = (p1 - p2).abs();
    if s1 == 0.0 {
        return if d > za * s0 { 1.0 } else { 0.0 };
    }
    crate::chi_square_dist::normal_sf((za * s0 - d) / s1)
}

/// Smallest gap `δ` such that the two-sided z test at level `alpha` detects both `p → p + δ` and
/// `p → p − δ` (each where it stays inside [0, 1]) with probability `power`, with `n_a` samples at
/// the base probability `p` and `n_b` at the shifted one. `None` if no gap qualifies.
///
/// # Errors
/// [`StatsError::InvalidProportion`], [`StatsError::InvalidAlpha`], [`StatsError::InvalidPower`],
/// [`StatsError::ZeroSampleSize`].
pub fn detectable_probability_gap(
    n_a: u64,
    n_b: u64,
    p: f64,
    alpha: f64,
    power: f64,
) -> Result<Option<f64>, StatsError> {
    check(alpha, power)?;
    check_proportion("p", p)?;
    if n_a == 0 {
        return Err(StatsError::ZeroSampleSize { which: "n_a" });
    }
    if n_b == 0 {
        return Err(StatsError::ZeroSampleSize { which: "n_b" });
    }
    let ok = |d: f64| {
        let up = p + d > 1.0 || two_proportion_power(p, p + d, n_a, n_b, alpha) >= power;
        let down = p - d < 0.0 || two_proportion_power(p, p - d, n_a, n_b, alpha) >= power;
        up && down
    };
    let max = p.max(1.0 - p);
    if !ok(max) {
        return Ok(None);
    }
    let (mut lo, mut hi) = (0.0f64, max);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if ok(mid) {
            hi = mid;
        } else {
            lo = mid;
        }
        if hi - lo <= 1e-14 * hi {
            break;
        }
    }
    Ok(Some(hi))
}

/// Samples per group (equal sizes) for the two-sided z test at level `alpha` to detect `p1` vs `p2`
/// with probability `power` (Fleiss, Levin & Paik 2003, eq. 4.14; see the file header).
///
/// # Errors
/// [`StatsError::InvalidProportion`], [`StatsError::EqualProportions`], [`StatsError::InvalidAlpha`],
/// [`StatsError::InvalidPower`].
pub fn sample_size_for_probability_gap(
    p1: f64,
    p2: f64,
    alpha: f64,
    power: f64,
) -> Result<u64, StatsError> {
    check(alpha, power)?;
    check_proportion("p1", p1)?;
    check_proportion("p2", p2)?;
    if p1 == p2 {
        return Err(StatsError::EqualProportions(p1));
    }
    let pbar = 0.5 * (p1 + p2);
    let za = normal_upper_quantile(alpha / 2.0);
    let zb = normal_upper_quantile(1.0 - power);
    let num =
        za * (2.0 * pbar * (1.0 - pbar)).sqrt() + zb * (p1 * (1.0 - p1) + p2 * (1.0 - p2)).sqrt();
    Ok((num * num / ((p1 - p2) * (p1 - p2))).ceil().max(1.0) as u64)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn tiny_levels_finish() {
        // An alpha below f64::EPSILON used to make the critical value infinite and the doubling
        // loop spin forever; now it gives a finite, larger noncentrality.
        let at_1e20 = chi_square_noncentrality_for_power(10, 1e-20, 0.8).unwrap();
        let at_05 = chi_square_noncentrality_for_power(10, 0.05, 0.8).unwrap();
        assert!(at_1e20.is_finite() && at_1e20 > at_05, "{at_1e20} {at_05}");
        assert!(detectable_total_variation(1000, 1000, 10, 1e-300, 0.99)
            .unwrap()
            .is_some_and(|d| d.is_finite()));
    }

    #[test]
    fn noncentrality_matches_reference() {
        // scipy 1.17.1: brentq(lambda l: ncx2.sf(chi2.isf(0.05, k), k, l) - power, ...)
        let cases = [
            (1u64, 0.8, 7.848860509326203),
            (15, 0.9, 23.58337138861986),
            (63, 0.99, 60.07816192780589),
            (15, 0.99, 36.58278974355215),
        ];
        for (k, pw, want) in cases {
            let l = chi_square_noncentrality_for_power(k, 0.05, pw).unwrap();
            assert!((l - want).abs() < 1e-8 * want, "{k} {pw}: {l} vs {want}");
        }
    }

    #[test]
    fn tv_size_and_detectable_are_inverse() {
        let n = sample_size_for_total_variation(0.01, 16, 0.05, 0.9).unwrap();
        let tv = detectable_total_variation(n, n, 16, 0.05, 0.9)
            .unwrap()
            .unwrap();
        assert!(tv <= 0.01 && tv > 0.01 * 0.9999, "{tv}");
        assert_eq!(detectable_total_variation(1, 1, 1000, 0.05, 0.9), Ok(None));
    }

    #[test]
    fn proportion_sample_size_textbook() {
        // 0.5 vs 0.6, α = 0.05 two-sided, power 0.8: 388 per group without continuity
        // correction (from memory; also recomputed by hand from eq. 4.14 of Fleiss et al. 2003).
        assert_eq!(
            sample_size_for_probability_gap(0.5, 0.6, 0.05, 0.8),
            Ok(388)
        );
        let gap = detectable_probability_gap(388, 388, 0.5, 0.05, 0.8)
            .unwrap()
            .unwrap();
        assert!(gap < 0.1 && gap > 0.099, "{gap}");
        assert!(matches!(
            sample_size_for_probability_gap(0.5, 0.5, 0.05, 0.8),
            Err(StatsError::EqualProportions(_))
        ));
    }
}
