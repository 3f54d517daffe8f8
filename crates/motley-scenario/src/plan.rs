//! The plan of a run: which claims exact laws decide, and which sampling units Monte Carlo needs.

use crate::error::ScenarioError;
use crate::scenario::{ClaimKind, ExactMode, ReferenceSpec, Scenario};
use crate::unit::{claim_slots, units_for, Slot, Unit};

pub use crate::exclusion_family::{
    EXACT_EXCLUSION_SITES, EXACT_EXCLUSION_STATES, EXACT_STATIONARY_STATES,
};
pub use crate::six_vertex_family::{EXACT_SIX_VERTEX_SIDE, EXACT_SIX_VERTEX_VERTICES};

/// What a run does.
#[derive(Debug, Clone)]
pub struct Plan {
    /// Per claim: decided by exact laws.
    pub exact: Vec<bool>,
    /// Accumulator slots of the Monte Carlo claims, sorted.
    pub slots: Vec<Slot>,
    /// Sampling units of the Monte Carlo claims.
    pub units: Vec<Unit>,
}

/// Why observable `o` has no exact law here, if it has none.
pub fn exact_obstacle(s: &Scenario, o: usize) -> Option<String> {
    crate::family::exact_obstacle(s, o)
}

fn claim_observables(kind: &ClaimKind) -> Vec<usize> {
    match kind {
        ClaimKind::SameLaw(a, b) => vec![*a, *b],
        ClaimKind::LawOf(a, ReferenceSpec::TailFromProfile(b)) => vec![*a, *b],
        ClaimKind::LawOf(a, _)
        | ClaimKind::Probability(a, _)
        | ClaimKind::Describe(a, ..)
        | ClaimKind::Mean(a, _) => {
            vec![*a]
        }
        ClaimKind::Series(sr) => sr.observables.clone(),
        ClaimKind::Joint(a, b, _) => vec![*a, *b],
    }
}

/// Plans `s`; `file` names it in errors.
///
/// # Errors
/// A claim with `exact: on` whose observables have no exact law.
pub fn plan(s: &Scenario, file: &str) -> Result<Plan, ScenarioError> {
    let mut exact = Vec::new();
    for (i, c) in s.claims.iter().enumerate() {
        let obstacle = if matches!(c.kind, ClaimKind::Series(_) | ClaimKind::Joint(..)) {
            Some("`series` and `joint` claims are estimated by Monte Carlo only".to_string())
        } else {
            claim_observables(&c.kind)
                .into_iter()
                .find_map(|o| exact_obstacle(s, o))
        };
        let e = match (c.exact, obstacle) {
            (ExactMode::Off, _) => false,
            (ExactMode::Auto, o) => o.is_none(),
            (ExactMode::On, None) => true,
            (ExactMode::On, Some(why)) => {
                return Err(ScenarioError {
                    file: file.to_string(),
                    line: None,
                    column: None,
                    path: format!("claims[{i}].exact"),
                    message: format!("`exact: on` is impossible here: {why}"),
                    hint: Some("use `exact: auto` to fall back to Monte Carlo".into()),
                })
            }
        };
        if !e {
            let no_sample = claim_observables(&c.kind)
                .into_iter()
                .find_map(|o| crate::family::sampling_obstacle(s, o));
            if let Some(why) = no_sample {
                return Err(ScenarioError {
                    file: file.to_string(),
                    line: None,
                    column: None,
                    path: format!("claims[{i}]"),
                    message: format!("this claim would be decided by Monte Carlo, which is impossible here: {why}"),
                    hint: Some(match c.exact {
                        ExactMode::Off => "use `exact: auto` or `exact: on`".into(),
                        ExactMode::Auto | ExactMode::On => {
                            "exact mode is impossible too (see `motley check`): read fewer classes or a smaller ring".into()
                        }
                    }),
                });
            }
        }
        exact.push(e);
    }
    let mc: Vec<usize> = (0..s.claims.len()).filter(|&i| !exact[i]).collect();
    let mut slots: Vec<Slot> = mc.iter().flat_map(|&c| claim_slots(s, c)).collect();
    slots.sort();
    slots.dedup();
    let units = units_for(s, &mc);
    Ok(Plan {
        exact,
        slots,
        units,
    })
}
