//! Confirming equality within a tolerance: how many samples make the upper confidence bound of a
//! distance fall below `ε` with a given probability when the two laws are in fact equal.
//!
//! A claim with a tolerance `ε` is confirmed ("equal within ε") when the `1 − α` upper bound `U`
//! of its distance lies below `ε`. `U` is valid whatever the laws are, so a pair at distance
//! `> ε` is confirmed with probability at most `α`. The functions here give the sample size at
//! which a pair of *equal* laws is confirmed with probability at least `power`. Each is a
//! worst case over the laws allowed, so the real share of confirmations is at least `power`.
//!
//! # Formulas (per side, equal sizes `n`; `β` = power)
//! **Total variation between two samples on `K` outcomes.** `U = TV̂ + sqrt(ln(1/α)/n)` (McDiarmid,
//! see `total_variation.rs`). With equal laws, `E TV̂ = ½ Σ_k E|p̂_{a,k} − p̂_{b,k}| ≤
//! ½ Σ_k sqrt(2 p_k / n) ≤ sqrt(K / (2n))` (Jensen, then Cauchy–Schwarz), and McDiarmid gives
//! `P(TV̂ > E TV̂ + s) ≤ e^{−n s²}`, so `s = sqrt(ln(1/(1−β)) / n)`. Hence
//! `n = ⌈((sqrt(K/2) + sqrt(ln(1/(1−β))) + sqrt(ln(1/α))) / ε)²⌉`. Against an exact law:
//! `E TV̂ ≤ ½ sqrt(K/n)`, margins `sqrt(ln(1/α)/(2n))` and `sqrt(ln(1/(1−β))/(2n))`.
//!
//! **Kolmogorov distance between two samples.** `U = D̂ + 2 sqrt(ln(4/α) / (2n))` (DKW with
//! Massart's constant at `α/2` on each side; Massart 1990, Ann. Probab. 18:1269–1283). With equal
//! continuous laws `sqrt(n/2) D̂` is asymptotically Kolmogorov-distributed (Smirnov 1939); on
//! discrete data it is stochastically smaller, so `n = ⌈((sqrt 2 · k_β + 2 sqrt(ln(4/α)/2)) / ε)²⌉`
//! with `k_β` the `β`-quantile of the Kolmogorov law. One sample against a law:
//! `n = ⌈((k_β + sqrt(ln(2/α)/2)) / ε)²⌉`.
//!
//! **A probability gap.** `U = |Δ̂| + z_{α/2} · se`; with equal probabilities `|Δ̂| ≤ z_{(1−β)/2} · se`
//! with probability `β` (normal approximation), so `n = ⌈((z_{α/2} + z_{(1−β)/2}) · σ / ε)²⌉`, with
//! `σ² = 2 p(1 − p) ≤ ½` for two samples (worst case `p = ½`) and `σ² = p₀(1 − p₀)` against a stated
//! `p₀`. The same with `σ` the standard deviation of one draw for a mean.

use crate::chi_square_dist::normal_upper_quantile;
use crate::kolmogorov::kolmogorov_quantile;
use crate::StatsError;

fn check(
    measure: ToleranceMeasure,
    epsilon: f64,
    alpha: f64,
    power: f64,
) -> Result<(), StatsError> {
    let bounded = !matches!(measure, ToleranceMeasure::Mean { .. });
    if !(epsilon > 0.0 && epsilon.is_finite()) || (bounded && epsilon > 1.0) {
        return Err(StatsError::InvalidDifference(epsilon));
    }
    if !(alpha > 0.0 && alpha < 1.0) {
        return Err(StatsError::InvalidAlpha(alpha));
    }
    if !(power > 0.0 && power < 1.0) {
        return Err(StatsError::InvalidPower(power));
    }
    Ok(())
}

fn ceil_square(x: f64) -> u64 {
    (x * x).ceil().clamp(1.0, u64::MAX as f64) as u64
}

/// Which distance a tolerance is stated in, and against what.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ToleranceMeasure {
    /// Total variation between two samples on at most `outcomes` outcomes.
    TotalVariation {
        /// Number of possible outcomes (an upper bound will do).
        outcomes: f64,
    },
    /// Total variation of one sample to an exact law on at most `outcomes` outcomes.
    TotalVariationToLaw {
        /// Number of possible outcomes (an upper bound will do).
        outcomes: f64,
    },
    /// Kolmogorov distance between two samples.
    Kolmogorov,
    /// Kolmogorov distance of one sample to a law.
    KolmogorovToLaw,
    /// `|p_a − p_b|` between two samples (worst case `p = ½`).
    ProbabilityGap,
    /// `|p − p₀|` against a stated `p₀`.
    ProbabilityToValue {
        /// The stated probability.
        p0: f64,
    },
    /// `|mean − m₀|` for draws with standard deviation `sd`.
    Mean {
        /// Standard deviation of one draw.
        sd: f64,
    },
}

/// Samples per side at which two equal laws are confirmed equal within `epsilon` with probability
/// at least `power`, the bound being at level `1 − alpha` (see the file header).
///
/// # Errors
/// [`StatsError::InvalidDifference`] for `ε ∉ (0, 1]` (`ε ≤ 0` for a mean), [`StatsError::InvalidAlpha`],
/// [`StatsError::InvalidPower`].
///
/// # Examples
/// ```
/// use motley_stats::{samples_to_confirm, ToleranceMeasure};
/// // Two samples of a law on 24 outcomes, equal within 0.05 at α = 0.05 with power 0.8.
/// let n = samples_to_confirm(ToleranceMeasure::TotalVariation { outcomes: 24.0 }, 0.05, 0.05, 0.8)
///     .unwrap();
/// assert_eq!(n, 16_712);
/// ```
pub fn samples_to_confirm(
    measure: ToleranceMeasure,
    epsilon: f64,
    alpha: f64,
    power: f64,
) -> Result<u64, StatsError> {
    check(measure, epsilon, alpha, power)?;
    let miss = (1.0 / (1.0 - power)).ln();
    let level = (1.0 / alpha).ln();
    let z = normal_upper_quantile(alpha / 2.0) + normal_upper_quantile((1.0 - power) / 2.0);
    let root = match measure {
        ToleranceMeasure::TotalVariation { outcomes } => {
            ((outcomes / 2.0).sqrt() + miss.sqrt() + level.sqrt()) / epsilon
        }
        ToleranceMeasure::TotalVariationToLaw { outcomes } => {
            (0.5 * outcomes.sqrt() + (miss / 2.0).sqrt() + (level / 2.0).sqrt()) / epsilon
        }
        ToleranceMeasure::Kolmogorov => {
            let k = kolmogorov_quantile(1.0 - power);
            (std::f64::consts::SQRT_2 * k + 2.0 * ((4.0 / alpha).ln() / 2.0).sqrt()) / epsilon
        }
        ToleranceMeasure::KolmogorovToLaw => {
            let k = kolmogorov_quantile(1.0 - power);
            (k + ((2.0 / alpha).ln() / 2.0).sqrt()) / epsilon
        }
        ToleranceMeasure::ProbabilityGap => z * 0.5f64.sqrt() / epsilon,
        ToleranceMeasure::ProbabilityToValue { p0 } => z * (p0 * (1.0 - p0)).sqrt() / epsilon,
        ToleranceMeasure::Mean { sd } => z * sd / epsilon,
    };
    Ok(ceil_square(root))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn worked_values() {
        // By hand from the header: sqrt(12) + sqrt(ln 5) + sqrt(ln 20) = 3.4641 + 1.2686 + 1.7308
        // = 6.4636; / 0.05 → 129.27; squared → 16 711… (rounded up; the doc example pins it).
        let n = samples_to_confirm(
            ToleranceMeasure::TotalVariation { outcomes: 24.0 },
            0.05,
            0.05,
            0.8,
        )
        .unwrap();
        let root = (12f64.sqrt() + 5f64.ln().sqrt() + 20f64.ln().sqrt()) / 0.05;
        assert_eq!(n, (root * root).ceil() as u64);
        // A smaller tolerance needs more samples, quadratically.
        let m = samples_to_confirm(
            ToleranceMeasure::TotalVariation { outcomes: 24.0 },
            0.025,
            0.05,
            0.8,
        )
        .unwrap();
        assert!((m as f64 / n as f64 - 4.0).abs() < 1e-3);
        // Gap at p = ½: (1.95996 + 1.28155) · sqrt(½) / 0.01 → 229.2 → 52 543.
        let g = samples_to_confirm(ToleranceMeasure::ProbabilityGap, 0.01, 0.05, 0.8).unwrap();
        let root = (1.959963984540054 + 1.2815515655446004) * 0.5f64.sqrt() / 0.01;
        assert_eq!(g, (root * root).ceil() as u64);
        assert!(samples_to_confirm(ToleranceMeasure::Kolmogorov, 0.0, 0.05, 0.8).is_err());
        assert!(samples_to_confirm(ToleranceMeasure::Kolmogorov, 0.1, 0.05, 1.0).is_err());
    }
}
