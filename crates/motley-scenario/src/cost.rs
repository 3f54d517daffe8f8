//! Rough cost of a run, before it starts: time from measured engine rates, memory from the state
//! each thread keeps and the accumulators.
//!
//! Rates (single core, this project's 2-core machine, release build): about 1.5e8 six-vertex
//! vertices per second and 5e7 exclusion events per second (`cargo bench`, see the README's
//! Performance section). The estimate is meant to be right within a factor of a few.

use crate::plan::Plan;
use crate::scenario::{Scenario, ValueKind};

pub use crate::exclusion_family::EXCLUSION_RATE;
pub use crate::six_vertex_family::SIX_VERTEX_RATE;

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

/// Estimates the Monte Carlo part of `plan` on `threads` threads.
pub fn estimate(s: &Scenario, plan: &Plan, threads: usize) -> Cost {
    let mut seconds = 0.0;
    let mut state = 0.0f64;
    for u in &plan.units {
        let (t, b) = s.models[u.model].kind.family().cost_per_sample();
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
            ValueKind::Tuple { len } => (24.0 + 8.0 * len as f64 + 32.0) * (s.samples as f64),
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
