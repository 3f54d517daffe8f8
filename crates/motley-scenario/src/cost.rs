//! Rough cost of a run, before it starts: time from measured engine rates, memory from the state
//! each thread keeps and the accumulators.
//!
//! Rates (single core, this project's 2-core machine, release build): about 1.5e8 six-vertex
//! vertices per second and 5e7 exclusion events per second (`cargo bench`, see the README's
//! Performance section). The estimate is meant to be right within a factor of a few.

use crate::plan::Plan;
use crate::scenario::{LatticeSpec, ModelKind, Scenario, ValueKind};

/// Vertices per second per thread assumed by the estimate.
pub const SIX_VERTEX_RATE: f64 = 1.5e8;
/// Exclusion events per second per thread assumed by the estimate.
pub const EXCLUSION_RATE: f64 = 5e7;

/// Estimated cost.
#[derive(Debug, Clone, PartialEq)]
pub struct Cost {
    /// Samples simulated in all (units × samples).
    pub samples: u64,
    /// Estimated seconds on the given threads.
    pub seconds: f64,
    /// Estimated peak memory in bytes.
    pub bytes: f64,
}

/// Work (in engine steps) and state bytes of one sample of model `m`.
fn per_sample(s: &Scenario, m: usize) -> (f64, f64) {
    match &s.models[m].kind {
        ModelKind::SixVertex(sv) => (
            (sv.width * sv.height) as f64 / SIX_VERTEX_RATE,
            (sv.width * 40 + sv.height * 16) as f64,
        ),
        ModelKind::Exclusion(e) => {
            let t = e.times.last().copied().unwrap_or(0.0);
            let rate = e.p.value + e.q.value;
            let (events, sites) = match e.lattice {
                LatticeSpec::Segment(n) | LatticeSpec::Ring(n) => (n as f64 * rate * t, n as f64),
                // The active region grows at speed at most about 2(p + q) on each side.
                LatticeSpec::Line => {
                    let block = match &e.initial {
                        crate::scenario::InitialSpec::Line { block, .. } => block.len() as f64,
                        _ => 1.0,
                    };
                    let width = block + 4.0 * rate * t;
                    (0.5 * (block + width) * rate * t, width)
                }
            };
            (events / EXCLUSION_RATE, sites * 16.0)
        }
    }
}

/// Estimates the Monte Carlo part of `plan` on `threads` threads.
pub fn estimate(s: &Scenario, plan: &Plan, threads: usize) -> Cost {
    let mut seconds = 0.0;
    let mut state = 0.0f64;
    for u in &plan.units {
        let (t, b) = per_sample(s, u.model);
        seconds += t * s.samples as f64;
        state = state.max(b);
    }
    let mut acc = 0.0;
    for sl in &plan.slots {
        acc += match s.observables[sl.observable].kind {
            ValueKind::Scalar { .. } => 8.0 * s.samples as f64,
            ValueKind::Set { universe } => {
                let joint = if universe <= crate::accumulate::JOINT_LIMIT {
                    48.0 * (s.samples as f64).min(2f64.powi(universe.min(60) as i32))
                } else {
                    0.0
                };
                joint + 8.0 * universe as f64
            }
            ValueKind::Event => 16.0,
            ValueKind::Sequence { len } => (24.0 + 4.0 * len as f64 + 32.0) * (s.samples as f64),
        };
    }
    let threads = threads.max(1);
    Cost {
        samples: plan.units.len() as u64 * s.samples,
        seconds: seconds / threads as f64,
        // Every thread holds an engine state and its chunk's accumulators; the merged copy and
        // the result come on top. 20 MiB covers the program itself.
        bytes: threads as f64 * (state + acc.min(64e6)) + 2.0 * acc + 20.0 * 1024.0 * 1024.0,
    }
}
