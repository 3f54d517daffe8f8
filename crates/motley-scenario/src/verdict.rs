//! The verdict of a Monte Carlo claim from its deciding test and its effect: REJECTED, EQUAL WITHIN
//! ε, UNDECIDED or not rejected, in one sentence that says what it means.
//!
//! A claim is rejected when its deciding test's p-value is at most the claim's level. With a
//! tolerance `ε`, a claim that is not rejected is EQUAL WITHIN ε when the `1 − level` upper bound of
//! its distance lies below `ε`, and UNDECIDED otherwise. The bound is valid for every pair of laws,
//! so a pair at distance more than `ε` comes out EQUAL WITHIN ε with probability at most the level.

use crate::result::{ClaimResult, Decision, TestRole};
use crate::scenario::{ClaimKind, ClaimSpec, Scenario};

/// The p-value of a claim's deciding test, if it has one.
pub fn deciding_p(r: &ClaimResult) -> Option<f64> {
    r.tests
        .iter()
        .find(|t| t.role == TestRole::Deciding)
        .map(|t| t.p_value)
}

/// A level as a percentage of confidence, e.g. `95%` for 0.05.
fn confidence(level: f64) -> String {
    let c = 100.0 * (1.0 - level);
    if (c - c.round()).abs() < 1e-9 {
        format!("{c:.0}%")
    } else {
        format!("{}%", crate::number_text::num(c))
    }
}

/// Sets `rejected`, `decision`, `level`, `verdict` and the deciding test's flags of `r` from the
/// deciding p-value `p` (adjusted across claims under false-discovery-rate control) at `level`.
pub fn conclude(s: &Scenario, c: &ClaimSpec, r: &mut ClaimResult, p: Option<f64>, level: f64) {
    r.level = level;
    r.tolerance = c.tolerance;
    let untested = match &c.kind {
        ClaimKind::Describe(..) => Some("no claim: estimates only"),
        ClaimKind::Series(_) | ClaimKind::Joint(..) => {
            Some("no claim: estimates beside the theory, shown, not tested")
        }
        ClaimKind::Probability(_, None) => Some("no stated value: estimate with intervals only"),
        ClaimKind::Mean(_, None) => Some("no stated value: the mean with its interval only"),
        ClaimKind::Probability(_, Some(_))
        | ClaimKind::Mean(_, Some(_))
        | ClaimKind::SameLaw(..)
        | ClaimKind::LawOf(..) => None,
    };
    if let Some(text) = untested {
        r.rejected = false;
        r.decision = Decision::NoClaim;
        r.verdict = text.into();
        return;
    }
    let Some(p) = p else {
        r.rejected = false;
        r.decision = Decision::NotRejected;
        r.verdict = "not decided: no test could be run on these samples".into();
        return;
    };
    let rejected = p <= level;
    for t in r.tests.iter_mut() {
        let deciding = t.role == TestRole::Deciding;
        t.adjusted_p_value = if deciding { p } else { t.p_value };
        t.rejected = deciding && rejected;
    }
    r.rejected = rejected;
    let at = format!("α = {}", crate::number_text::short(level));
    let conf = confidence(level);
    let test_name = r
        .tests
        .iter()
        .find(|t| t.role == TestRole::Deciding)
        .map_or(String::new(), |t| t.name.clone());
    let e = r.effect.as_ref();
    let bound = e.map(|e| (e.measure.clone(), e.upper_bound));
    match (rejected, c.tolerance, &bound) {
        (true, tol, _) => {
            r.decision = Decision::Rejected;
            let within = match (tol, &bound) {
                (Some(eps), Some((m, u))) if *u < eps => format!(
                    "; the laws differ, but by little: the {m} is at most {} ({conf} confidence), below the tolerance {}",
                    crate::number_text::num(*u),
                    crate::number_text::num(eps)
                ),
                _ => String::new(),
            };
            r.verdict = format!(
                "REJECTED at {at} by the {test_name} (p = {}){within}",
                crate::number_text::p_value(p)
            );
        }
        (false, Some(eps), Some((m, u))) if *u < eps => {
            r.decision = Decision::EqualWithin;
            r.verdict = format!(
                "EQUAL WITHIN {}: the {m} is at most {} at {conf} confidence (not rejected at {at})",
                crate::number_text::num(eps),
                crate::number_text::num(*u)
            );
        }
        (false, Some(eps), _) => {
            r.decision = Decision::Undecided;
            let why = match &bound {
                Some((m, u)) => format!(
                    "the {m}'s upper bound {} ({conf} confidence) is not below the tolerance {}",
                    crate::number_text::num(*u),
                    crate::number_text::num(eps)
                ),
                None => "no upper bound could be computed".into(),
            };
            r.verdict = format!("UNDECIDED: not rejected at {at}, and {why}");
        }
        (false, None, _) => {
            r.decision = Decision::NotRejected;
            r.verdict = match e {
                Some(e) => format!(
                    "not rejected at {at}; with power {} the deciding test would have detected a {} of {} or more",
                    crate::number_text::short(s.power),
                    e.detectable_measure,
                    crate::number_text::num(e.detectable)
                ),
                None => format!("not rejected at {at}"),
            };
        }
    }
}
