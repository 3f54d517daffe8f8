//! The name a claim's side goes by in tables and legends.

use motley_scenario::result::ClaimResult;

/// The label of side `i` of `claim`: its own label `own` when not blank, else the claim's `i`-th
/// observable, else `side i+1`.
pub(crate) fn side_label(claim: &ClaimResult, own: &str, i: usize) -> String {
    if !own.trim().is_empty() {
        own.to_string()
    } else if let Some(o) = claim.observables.get(i) {
        o.clone()
    } else {
        format!("side {}", i + 1)
    }
}
