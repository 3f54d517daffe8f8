//! Error spending over planned looks: the level each look of a sequential run may use so that the
//! error over all looks together stays at most `α`.
//!
//! # Formula
//! Looks at sample counts `n_1 < … < n_K`, information fractions `t_k = n_k / n_K`. Look `k` tests at
//! `α_k = α (t_k² − t_{k−1}²)` (`t_0 = 0`): the quadratic spending function `α t²` of the
//! Lan–DeMets family (Lan & DeMets 1983, Biometrika 70:659–663), which keeps most of `α` for the
//! last look. We do not use the joint law of the statistics across looks (it is not available for
//! chi-square and KS statistics on pooled cells); the levels are simply added up, so by the union
//! bound `P(any look errs) ≤ Σ_k α_k = α` for every dependence between looks. This holds for a
//! rejection and, separately, for a confirmation "equal within ε" (each look's bound at `1 − α_k`).

use crate::StatsError;

/// The level of each look (see the file header). `looks` must be increasing and positive.
///
/// # Errors
/// [`StatsError::InvalidAlpha`] for `α ∉ (0, 1)`; [`StatsError::InvalidLooks`] for an empty,
/// non-increasing or zero list.
///
/// # Examples
/// ```
/// let a = motley_stats::look_levels(&[1000, 2000, 4000], 0.05).unwrap();
/// // t = 1/4, 1/2, 1: α · (1/16, 3/16, 12/16).
/// assert!((a[0] - 0.05 / 16.0).abs() < 1e-15 && (a[2] - 0.0375).abs() < 1e-15);
/// assert!((a.iter().sum::<f64>() - 0.05).abs() < 1e-15);
/// ```
pub fn look_levels(looks: &[u64], alpha: f64) -> Result<Vec<f64>, StatsError> {
    if !(alpha > 0.0 && alpha < 1.0) {
        return Err(StatsError::InvalidAlpha(alpha));
    }
    if looks.is_empty() || looks[0] == 0 || looks.windows(2).any(|w| w[0] >= w[1]) {
        return Err(StatsError::InvalidLooks);
    }
    let last = *looks.last().expect("non-empty") as f64;
    let mut spent = 0.0;
    Ok(looks
        .iter()
        .map(|&n| {
            let t = n as f64 / last;
            let total = alpha * t * t;
            let level = total - spent;
            spent = total;
            level
        })
        .collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn levels_add_up_and_refuse_bad_lists() {
        let a = look_levels(&[500, 1000, 2000, 4000, 8000], 0.05).unwrap();
        assert!((a.iter().sum::<f64>() - 0.05).abs() < 1e-15);
        assert!(a.windows(2).all(|w| w[0] < w[1]));
        assert_eq!(look_levels(&[7], 0.01).unwrap(), vec![0.01]);
        assert!(look_levels(&[], 0.05).is_err());
        assert!(look_levels(&[0, 5], 0.05).is_err());
        assert!(look_levels(&[5, 5], 0.05).is_err());
        assert!(look_levels(&[5, 6], 1.0).is_err());
    }
}
