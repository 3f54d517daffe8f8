//! Sampling units: one (model, replica) pair, simulated once per sample index, feeding every
//! observable that reads it.
//!
//! # Reproducibility
//! Two observables compared by a claim must come from independent samples. When both read the same
//! model, the second side reads replica 1 of it. Each unit has its own seed,
//! `unit_seed = first 8 bytes (LE) of SHA-256("motley unit" ‖ 0 ‖ seed LE ‖ model name ‖ 0 ‖ replica LE)`,
//! and sample `i` of the unit uses the engine's stream layout under `(unit_seed, i)`. Different
//! models therefore never share random words, and the same scenario, seed and sample index always
//! give the same sample. Changing this derivation is a results-changing change.

use sha2::{Digest, Sha256};

use crate::scenario::{ClaimKind, ReferenceSpec, Scenario};

/// One (model, replica) pair and the observables read from it.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Unit {
    /// Model index.
    pub model: usize,
    /// Replica number.
    pub replica: u32,
    /// Seed of the unit (see the module docs).
    pub seed: u64,
    /// Observables (indices) read from it.
    pub observables: Vec<usize>,
}

/// The seed of replica `replica` of model `name` under scenario seed `seed`.
pub fn unit_seed(seed: u64, name: &str, replica: u32) -> u64 {
    let mut h = Sha256::new();
    h.update(b"motley unit\0");
    h.update(seed.to_le_bytes());
    h.update(name.as_bytes());
    h.update([0u8]);
    h.update(replica.to_le_bytes());
    let d = h.finalize();
    u64::from_le_bytes(d[..8].try_into().expect("8 bytes"))
}

/// Observable `o` on replica `r`: an accumulator slot. With a `partner`, the slot holds the pairs
/// (value of `observable`, value of `partner`) read from the same samples of the replica.
#[derive(
    Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, serde::Serialize, serde::Deserialize,
)]
pub struct Slot {
    /// Observable index.
    pub observable: usize,
    /// Replica.
    pub replica: u32,
    /// The second observable of a pair slot.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub partner: Option<usize>,
}

impl Slot {
    /// The slot's name in partial results: the observable's name, `+partner` for a pair slot, and
    /// `#replica` for a replica other than 0 (`top`, `a+b`, `h#1`). Partial results match slots by
    /// this name, never by position.
    pub fn name(&self, s: &Scenario) -> String {
        let mut n = s.observables[self.observable].name.clone();
        if let Some(b) = self.partner {
            n.push('+');
            n.push_str(&s.observables[b].name);
        }
        if self.replica != 0 {
            n.push_str(&format!("#{}", self.replica));
        }
        n
    }

    /// The empty accumulator this slot holds.
    pub fn accumulator(&self, s: &Scenario) -> crate::accumulate::Accumulator {
        match self.partner {
            Some(_) => crate::accumulate::Accumulator::pairs(),
            None => crate::accumulate::Accumulator::new(s.observables[self.observable].kind),
        }
    }
}

/// The slots each claim reads, side by side.
pub fn claim_slots(s: &Scenario, claim: usize) -> Vec<Slot> {
    let obs = |o: usize, r: u32| Slot {
        observable: o,
        replica: r,
        partner: None,
    };
    match &s.claims[claim].kind {
        ClaimKind::SameLaw(a, b) => {
            let rb = u32::from(s.observables[*a].model == s.observables[*b].model);
            vec![obs(*a, 0), obs(*b, rb)]
        }
        ClaimKind::LawOf(a, ReferenceSpec::TailFromProfile(b)) => {
            let rb = u32::from(s.observables[*a].model == s.observables[*b].model);
            vec![obs(*a, 0), obs(*b, rb)]
        }
        ClaimKind::LawOf(a, _)
        | ClaimKind::Probability(a, _)
        | ClaimKind::Describe(a, ..)
        | ClaimKind::Mean(a, _) => {
            vec![obs(*a, 0)]
        }
        ClaimKind::Series(sr) => sr.observables.iter().map(|&o| obs(o, 0)).collect(),
        ClaimKind::Joint(a, b, _) => vec![
            obs(*a, 0),
            obs(*b, 0),
            Slot {
                observable: *a,
                replica: 0,
                partner: Some(*b),
            },
        ],
    }
}

/// The units needed by the claims in `claims` (indices), in a canonical order.
pub fn units_for(s: &Scenario, claims: &[usize]) -> Vec<Unit> {
    let mut slots: Vec<Slot> = claims.iter().flat_map(|&c| claim_slots(s, c)).collect();
    slots.sort();
    slots.dedup();
    let mut units: Vec<Unit> = Vec::new();
    let mut keys: Vec<(usize, u32)> = slots
        .iter()
        .map(|sl| (s.observables[sl.observable].model, sl.replica))
        .collect();
    keys.sort();
    keys.dedup();
    for (model, replica) in keys {
        let observables = slots
            .iter()
            .filter(|sl| {
                sl.partner.is_none()
                    && sl.replica == replica
                    && s.observables[sl.observable].model == model
            })
            .map(|sl| sl.observable)
            .collect();
        units.push(Unit {
            model,
            replica,
            seed: unit_seed(s.seed, &s.models[model].name, replica),
            observables,
        });
    }
    units
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn seeds_differ_by_model_and_replica() {
        let a = unit_seed(7, "m", 0);
        assert_ne!(a, unit_seed(7, "m", 1));
        assert_ne!(a, unit_seed(7, "n", 0));
        assert_ne!(a, unit_seed(8, "m", 0));
        assert_eq!(a, unit_seed(7, "m", 0));
    }
}
