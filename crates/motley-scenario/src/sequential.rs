//! Sampling until decided: the planned looks of a scenario, the level each look spends, whether a
//! look settles every claim, and false-discovery-rate control across claims.
//!
//! A scenario with `looks: [n_1, …]` is evaluated after `n_1, n_2, …` samples per side (the last look
//! is `samples`). Look `k` decides every claim at its level `α_k` from quadratic α-spending
//! ([`motley_stats::look_levels`]; the levels add up to `α`, so by the union bound the chance that
//! any look wrongly rejects — or wrongly confirms equality within a tolerance — is at most `α`).
//! A claim settled at a look (rejected, equal within its tolerance) keeps that look's verdict; the
//! run stops after the first look at which every tested claim is settled (or decided exactly). A
//! single process records the settled claims in its checkpoints, so `--resume` keeps them; a run
//! of one look on a cluster (`--samples n_k` with shards) reports every claim as look k decides it. Looks fall at
//! fixed sample counts and a look's result depends only on the samples `0..n_k`, so threads, shards
//! and resumption give the same result.

use crate::plan::Plan;
use crate::result::{ClaimResult, DecidedBy, Decision, Sequential, StopReason};
use crate::scenario::Scenario;

/// One planned look: its 0-based index and level.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Look {
    /// 0-based index among the planned looks.
    pub index: usize,
    /// The level its tests use.
    pub level: f64,
}

impl Look {
    /// The planned look at `samples` per side, if `s` plans looks and one falls there.
    pub fn at(s: &Scenario, samples: u64) -> Option<Look> {
        let looks = s.looks.as_ref()?;
        let index = looks.iter().position(|&n| n == samples)?;
        let levels = motley_stats::look_levels(looks, s.alpha).ok()?;
        Some(Look {
            index,
            level: levels[index],
        })
    }

    /// Marks `claims` with this look and summarizes the run's sequence.
    pub fn summary(&self, s: &Scenario, claims: &mut [ClaimResult]) -> Sequential {
        let looks = s.looks.clone().unwrap_or_default();
        let levels = motley_stats::look_levels(&looks, s.alpha).unwrap_or_default();
        for c in claims.iter_mut() {
            if c.decided_by == DecidedBy::MonteCarlo && c.look.is_none() {
                c.look = Some(self.index + 1);
            }
        }
        let stopped = if all_settled(claims) {
            StopReason::AllDecided
        } else if self.index + 1 == looks.len() {
            StopReason::LastLook
        } else {
            StopReason::LookAsked
        };
        Sequential {
            samples_used: looks.get(self.index).copied().unwrap_or(0),
            looks,
            levels,
            looks_taken: self.index + 1,
            stopped,
        }
    }
}

/// The sample count of the next planned look at or after `done` samples per side (`samples` when
/// the scenario plans no looks).
pub fn next_look(s: &Scenario, done: u64) -> u64 {
    match &s.looks {
        Some(looks) => looks
            .iter()
            .copied()
            .find(|&n| n >= done)
            .unwrap_or(s.samples),
        None => s.samples,
    }
}

/// Records in `partial` the claims of `result` (a look's evaluation) that this look settled, so
/// that later looks keep their verdicts; returns whether every claim is now settled.
pub fn freeze_settled(
    partial: &mut crate::run::Partial,
    result: &crate::result::RunResult,
) -> bool {
    for c in &result.claims {
        let known = partial.settled.iter().any(|f| f.id == c.id);
        if !known && c.decided_by == DecidedBy::MonteCarlo && c.decision.settled() {
            partial.settled.push(c.clone());
        }
    }
    all_settled(&result.claims)
}

/// Whether every claim is settled, so that a sequential run may stop.
pub fn all_settled(claims: &[ClaimResult]) -> bool {
    claims.iter().all(|c| c.decision.settled())
}

/// Benjamini–Hochberg across the Monte Carlo claims that have a deciding test (Benjamini &
/// Hochberg 1995): each is rejected when its adjusted p-value is at most `alpha`, which keeps the
/// expected share of false rejections among all rejections at most `alpha` (for independent or
/// positively dependent tests). Exact decisions are not p-values and stay as they are.
pub fn control_false_discoveries(s: &Scenario, plan: &Plan, claims: &mut [ClaimResult]) {
    let tested: Vec<(usize, f64)> = claims
        .iter()
        .enumerate()
        .filter(|(ci, c)| !plan.exact[*ci] && c.decision != Decision::NoClaim)
        .filter_map(|(ci, c)| crate::verdict::deciding_p(c).map(|p| (ci, p)))
        .collect();
    let p: Vec<f64> = tested.iter().map(|&(_, p)| p).collect();
    let Ok(adjusted) = motley_stats::benjamini_hochberg(&p) else {
        return;
    };
    for (&(ci, _), q) in tested.iter().zip(adjusted) {
        crate::verdict::conclude(s, &s.claims[ci], &mut claims[ci], Some(q), s.alpha);
    }
}
