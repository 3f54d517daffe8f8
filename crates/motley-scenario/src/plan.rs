//! The plan of a run: which claims exact laws decide, and which sampling units Monte Carlo needs.

use crate::error::ScenarioError;
use crate::scenario::{
    ClaimKind, ExactMode, LatticeSpec, ModelKind, ReadSpec, ReferenceSpec, Scenario,
};
use crate::unit::{claim_slots, units_for, Slot, Unit};

/// Largest six-vertex rectangle (vertices) decided exactly in `auto` mode.
pub const EXACT_SIX_VERTEX_VERTICES: usize = 30;
/// Largest side of a six-vertex rectangle decided exactly in `auto` mode.
pub const EXACT_SIX_VERTEX_SIDE: usize = 6;
/// Largest segment or ring decided exactly.
pub const EXACT_EXCLUSION_SITES: usize = 7;

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
    let obs = &s.observables[o];
    let m = &s.models[obs.model];
    match &m.kind {
        ModelKind::SixVertex(sv) => {
            if sv.width * sv.height > EXACT_SIX_VERTEX_VERTICES
                || sv.width.max(sv.height) > EXACT_SIX_VERTEX_SIDE
            {
                return Some(format!(
                    "model `{}` is {}×{}; exact laws are computed up to {} vertices with sides ≤ {}",
                    m.name, sv.width, sv.height, EXACT_SIX_VERTEX_VERTICES, EXACT_SIX_VERTEX_SIDE
                ));
            }
            if !matches!(sv.left, crate::scenario::BoundarySpec::Fixed(_))
                || !matches!(sv.bottom, crate::scenario::BoundarySpec::Fixed(_))
            {
                return Some(format!("model `{}` has a random boundary", m.name));
            }
            match obs.read {
                ReadSpec::Top(_) | ReadSpec::Right(_) | ReadSpec::ExitColumn(_) => None,
                _ => Some(format!(
                    "observable `{}` reads inside the rectangle; exact laws cover the top and right exits",
                    obs.name
                )),
            }
        }
        ModelKind::Exclusion(e) => {
            let n = match e.lattice {
                LatticeSpec::Segment(n) | LatticeSpec::Ring(n) => n,
                LatticeSpec::Line => {
                    return Some(format!(
                        "model `{}` lives on the line; exact laws need a segment or a ring",
                        m.name
                    ))
                }
            };
            if n > EXACT_EXCLUSION_SITES {
                return Some(format!(
                    "model `{}` has {n} sites; exact laws are computed up to {EXACT_EXCLUSION_SITES}",
                    m.name
                ));
            }
            let ring = matches!(e.lattice, LatticeSpec::Ring(_));
            match obs.read {
                ReadSpec::Attempted(..) => Some(format!(
                    "observable `{}` depends on the path, not only on the arrangement at one time",
                    obs.name
                )),
                ReadSpec::Current(..) | ReadSpec::Swapped(..) if ring => Some(format!(
                    "observable `{}` on a ring depends on the path, not only on the arrangement",
                    obs.name
                )),
                _ => None,
            }
        }
    }
}

fn claim_observables(kind: &ClaimKind) -> Vec<usize> {
    match kind {
        ClaimKind::SameLaw(a, b) => vec![*a, *b],
        ClaimKind::LawOf(a, ReferenceSpec::TailFromProfile(b)) => vec![*a, *b],
        ClaimKind::LawOf(a, _) | ClaimKind::Probability(a, _) | ClaimKind::Describe(a, ..) => {
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
