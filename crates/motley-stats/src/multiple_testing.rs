//! Adjusted p-values for families of tests: Holm–Bonferroni (family-wise error rate) and
//! Benjamini–Hochberg (false discovery rate).
//!
//! # Formula
//! With the p-values sorted increasingly, `p_(1) <= … <= p_(m)` (ties kept in input order):
//! Holm (Holm 1979, Scand. J. Statist. 6:65–70): `p̃_(i) = max_{j <= i} min(1, (m - j + 1) p_(j))`.
//! Benjamini–Hochberg (Benjamini & Hochberg 1995, JRSS B 57:289–300):
//! `p̃_(i) = min_{j >= i} min(1, m p_(j) / j)`.
//! Rejecting every hypothesis with `p̃ <= α` controls the respective error rate at `α`.
//! Simes (Simes 1986, Biometrika 73:751–754): the global p-value `min_i m p_(i) / i` of "every
//! hypothesis holds". It has size exactly `α` for independent tests and for identical ones, and at
//! most `α` for positively dependent ones (Sarkar 1998, Ann. Statist. 26:494–504), where Holm's
//! smallest adjusted p-value is conservative: neighbouring sites or elements of one system are
//! strongly positively correlated.

use crate::StatsError;

fn check(p: &[f64]) -> Result<Vec<usize>, StatsError> {
    for (index, &value) in p.iter().enumerate() {
        if !(0.0..=1.0).contains(&value) {
            return Err(StatsError::InvalidPValue { index, value });
        }
    }
    let mut order: Vec<usize> = (0..p.len()).collect();
    order.sort_by(|&a, &b| p[a].total_cmp(&p[b]).then(a.cmp(&b)));
    Ok(order)
}

/// Holm–Bonferroni adjusted p-values, in the input order.
///
/// # Errors
/// [`StatsError::InvalidPValue`] for a value outside [0, 1] or NaN.
///
/// # Examples
/// ```
/// let adj = motley_stats::holm_bonferroni(&[0.01, 0.04, 0.03]).unwrap();
/// assert_eq!(adj, vec![0.03, 0.06, 0.06]);
/// ```
pub fn holm_bonferroni(p: &[f64]) -> Result<Vec<f64>, StatsError> {
    let order = check(p)?;
    let m = p.len();
    let mut out = vec![0.0; m];
    let mut running = 0.0f64;
    for (rank, &i) in order.iter().enumerate() {
        let v = ((m - rank) as f64 * p[i]).min(1.0);
        running = running.max(v);
        out[i] = running;
    }
    Ok(out)
}

/// Benjamini–Hochberg adjusted p-values (q-values), in the input order.
///
/// # Errors
/// [`StatsError::InvalidPValue`] for a value outside [0, 1] or NaN.
pub fn benjamini_hochberg(p: &[f64]) -> Result<Vec<f64>, StatsError> {
    let order = check(p)?;
    let m = p.len();
    let mut out = vec![0.0; m];
    let mut running = 1.0f64;
    for (rank, &i) in order.iter().enumerate().rev() {
        let v = (m as f64 * p[i] / (rank + 1) as f64).min(1.0);
        running = running.min(v);
        out[i] = running;
    }
    Ok(out)
}

/// Simes' global p-value `min_i m p_(i) / i` (1 for an empty family).
///
/// # Errors
/// [`StatsError::InvalidPValue`] for a value outside [0, 1] or NaN.
///
/// # Examples
/// ```
/// // Holm would give 3 · 0.02 = 0.06; Simes uses all three small values.
/// let p = motley_stats::simes(&[0.02, 0.03, 0.04]).unwrap();
/// assert!((p - 0.04).abs() < 1e-15);
/// ```
pub fn simes(p: &[f64]) -> Result<f64, StatsError> {
    let order = check(p)?;
    let m = p.len() as f64;
    Ok(order
        .iter()
        .enumerate()
        .map(|(rank, &i)| m * p[i] / (rank + 1) as f64)
        .fold(1.0f64, f64::min))
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn simes_is_the_smallest_bh_adjusted_value() {
        // Simes' global p-value equals the smallest Benjamini–Hochberg adjusted p-value (both are
        // min_i m p_(i) / i); Holm's smallest adjusted value is never below it.
        let p = [0.01, 0.04, 0.03, 0.005, 0.05];
        let s = simes(&p).unwrap();
        let bh = benjamini_hochberg(&p).unwrap();
        assert_eq!(s, bh.iter().copied().fold(1.0, f64::min));
        assert!((s - 0.025).abs() < 1e-15);
        let holm = holm_bonferroni(&p).unwrap();
        assert!(holm.iter().copied().fold(1.0, f64::min) >= s);
        assert_eq!(simes(&[]).unwrap(), 1.0);
        assert!(simes(&[0.5, f64::NAN]).is_err());
    }

    #[test]
    fn matches_reference_library() {
        // Holm values computed by hand from the formula above (statsmodels not installed); BH values
        // from scipy 1.17.1, scipy.stats.false_discovery_control(p, method="bh")
        // = [0.025, 0.05, 0.05, 0.025, 0.05].
        let p = [0.01, 0.04, 0.03, 0.005, 0.05];
        let holm = holm_bonferroni(&p).unwrap();
        let want = [0.04, 0.09, 0.09, 0.025, 0.09];
        for (h, w) in holm.iter().zip(want) {
            assert!((h - w).abs() < 1e-12, "{holm:?}");
        }
        let bh = benjamini_hochberg(&p).unwrap();
        let want = [0.025, 0.05, 0.05, 0.025, 0.05];
        for (h, w) in bh.iter().zip(want) {
            assert!((h - w).abs() < 1e-12, "{bh:?}");
        }
        assert!(holm_bonferroni(&[0.5, 1.5]).is_err());
    }

    proptest! {
        #[test]
        fn holm_dominates_raw_and_bh(p in proptest::collection::vec(0.0f64..=1.0, 1..40)) {
            let h = holm_bonferroni(&p).unwrap();
            let b = benjamini_hochberg(&p).unwrap();
            for i in 0..p.len() {
                prop_assert!(h[i] >= p[i]);
                prop_assert!(h[i] >= b[i] - 1e-15);
                prop_assert!(b[i] >= p[i] - 1e-15);
                prop_assert!(h[i] <= 1.0 && b[i] <= 1.0);
                prop_assert!(h[i] <= (p.len() as f64 * p[i]).min(1.0) + 1e-15);
            }
        }
    }
}
