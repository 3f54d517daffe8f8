//! How many samples a claim with a `tolerance` needs to be confirmed EQUAL WITHIN ε with the
//! scenario's power when the identity holds (formulas in `motley_stats::samples_to_confirm`).

use motley_stats::{samples_to_confirm, ToleranceMeasure};

use crate::scenario::{ClaimKind, ReferenceSpec, Scenario, ValueKind};

/// Largest outcome count used in the bound (beyond it the sample size is astronomical anyway).
const MAX_OUTCOMES: f64 = 1e15;

/// The number of values an observable of kind `k` can take, where that is known and finite.
fn outcomes(k: ValueKind) -> Option<f64> {
    match k {
        ValueKind::Set { universe } => Some(2f64.powi(universe.min(60) as i32)),
        ValueKind::Sequence { len } => Some((1..=len.min(30)).map(|i| i as f64).product()),
        ValueKind::Event => Some(2.0),
        ValueKind::Scalar { .. } | ValueKind::Tuple { .. } => None,
    }
    .map(|x| x.min(MAX_OUTCOMES))
}

/// The distance a tolerance on claim `ci` is stated in, when a sample size can be given for it:
/// total variation on at most K outcomes (sets: K = 2^u; sequences: K = len!), the Kolmogorov
/// distance (numbers), the probability gap (events, probabilities). `None` for tuples, tails from
/// profiles and means (their sample size depends on unknown spreads or supports).
pub fn tolerance_measure(s: &Scenario, ci: usize) -> Option<ToleranceMeasure> {
    let kind = |o: usize| s.observables[o].kind;
    match &s.claims[ci].kind {
        ClaimKind::SameLaw(a, _) => match kind(*a) {
            ValueKind::Scalar { .. } => Some(ToleranceMeasure::Kolmogorov),
            ValueKind::Event => Some(ToleranceMeasure::ProbabilityGap),
            k @ (ValueKind::Set { .. } | ValueKind::Sequence { .. }) => {
                Some(ToleranceMeasure::TotalVariation {
                    outcomes: outcomes(k)?,
                })
            }
            ValueKind::Tuple { .. } => None,
        },
        ClaimKind::LawOf(_, ReferenceSpec::Table(t)) => {
            Some(ToleranceMeasure::TotalVariationToLaw {
                outcomes: t.cells.len() as f64 + 1.0,
            })
        }
        ClaimKind::LawOf(_, ReferenceSpec::TailFromProfile(_)) => None,
        ClaimKind::LawOf(..) => Some(ToleranceMeasure::KolmogorovToLaw),
        ClaimKind::Probability(_, Some(p0)) => {
            Some(ToleranceMeasure::ProbabilityToValue { p0: *p0 })
        }
        ClaimKind::Probability(_, None)
        | ClaimKind::Mean(..)
        | ClaimKind::Describe(..)
        | ClaimKind::Series(_)
        | ClaimKind::Joint(..) => None,
    }
}

/// Samples per side at which claim `ci`, if the identity holds, comes out EQUAL WITHIN its
/// tolerance with probability at least the scenario's power (at the level of the last look in a
/// sequential run). `None` without a tolerance or where [`tolerance_measure`] has none.
pub fn samples_to_confirm_claim(s: &Scenario, ci: usize) -> Option<u64> {
    let eps = s.claims[ci].tolerance?;
    let measure = tolerance_measure(s, ci)?;
    let level = match &s.looks {
        Some(looks) => *motley_stats::look_levels(looks, s.alpha).ok()?.last()?,
        None => s.alpha,
    };
    samples_to_confirm(measure, eps, level, s.power).ok()
}
