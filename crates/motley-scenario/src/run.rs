//! Running the Monte Carlo part of a scenario: sample indices split into chunks over threads, every
//! chunk feeding exactly-merging accumulators.
//!
//! # Reproducibility
//! Sample `i` of a unit depends only on `(unit seed, i)` (see [`crate::unit`]). A shard `K/N` takes
//! the contiguous index range `[⌊(K−1)·S/N⌋, ⌊K·S/N⌋)` of the `S` samples. Chunks, threads and shards
//! only decide who computes which index; the accumulators merge exactly, so the result is the same
//! for every thread count and shard split.

use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::time::Instant;

use rayon::prelude::*;
use serde::{Deserialize, Serialize};

use crate::accumulate::Accumulator;
use crate::combination::Combination;
use crate::family::{read_by_family, UnitSampler, Value};
use crate::plan::Plan;
use crate::scenario::{ObservableSpec, ReadSpec, Scenario};
use crate::unit::{Slot, Unit};

/// Largest number of samples per work chunk: the grain of parallelism, progress and checkpoints.
pub const CHUNK: u64 = 256;

/// Schema name of partial (shard or checkpoint) files.
pub const PARTIAL_SCHEMA: &str = "motley-partial/1";

/// Which slice of the samples to run.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub struct Shard {
    /// 1-based shard number.
    pub index: u64,
    /// Number of shards.
    pub count: u64,
}

impl Shard {
    /// The whole run as one shard.
    pub const WHOLE: Shard = Shard { index: 1, count: 1 };

    /// Sample index range of this shard among `samples`.
    pub fn range(&self, samples: u64) -> (u64, u64) {
        let cut = |k: u64| ((k as u128 * samples as u128) / self.count as u128) as u64;
        (cut(self.index - 1), cut(self.index))
    }
}

/// Accumulated Monte Carlo results of one shard (or of a checkpoint of it).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Partial {
    /// Always [`PARTIAL_SCHEMA`].
    pub schema: String,
    /// motley version that wrote it.
    pub motley_version: String,
    /// Scenario name.
    pub scenario: String,
    /// Scenario hash.
    pub scenario_hash: String,
    /// Samples per side of the whole run.
    pub samples: u64,
    /// Which shard.
    pub shard: Shard,
    /// Sample indices finished, from the shard's start: `[start, done)`.
    pub done: u64,
    /// Accumulators by slot.
    pub slots: Vec<(Slot, Accumulator)>,
    /// Seconds spent.
    pub wall_seconds: f64,
    /// Threads used.
    pub threads: usize,
    /// In a sequential run, the claims settled at an earlier look, as that look decided them.
    #[serde(default)]
    pub settled: Vec<crate::result::ClaimResult>,
}

impl Partial {
    /// An empty partial for `shard`.
    pub fn empty(s: &Scenario, plan: &Plan, shard: Shard) -> Self {
        let (start, _) = shard.range(s.samples);
        Partial {
            schema: PARTIAL_SCHEMA.into(),
            motley_version: crate::VERSION.into(),
            scenario: s.name.clone(),
            scenario_hash: s.hash.clone(),
            samples: s.samples,
            shard,
            done: start,
            slots: plan
                .slots
                .iter()
                .map(|sl| (*sl, sl.accumulator(s)))
                .collect(),
            wall_seconds: 0.0,
            threads: 0,
            settled: Vec::new(),
        }
    }

    /// Whether every sample of the shard is in.
    pub fn complete(&self) -> bool {
        self.done == self.shard.range(self.samples).1
    }
}

/// Errors while running.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum RunError {
    /// An engine refused its parameters (validation should have caught it).
    #[error("model `{model}`: {message}")]
    Engine {
        /// Model name.
        model: String,
        /// Engine message.
        message: String,
    },
    /// Building the thread pool failed.
    #[error("cannot start {0} worker threads")]
    Threads(usize),
}

/// What the family of a unit reads: the unit's read-outs and the components of its combinations,
/// each once, in first-use order.
fn family_reads(s: &Scenario, u: &Unit) -> Vec<usize> {
    let mut base = Vec::new();
    for &o in &u.observables {
        for c in read_by_family(s, o) {
            if !base.contains(&c) {
                base.push(c);
            }
        }
    }
    base
}

fn sampler<'a>(
    s: &'a Scenario,
    u: &Unit,
    base: &[usize],
) -> Result<Box<dyn UnitSampler + 'a>, RunError> {
    let m = &s.models[u.model];
    let obs = base.iter().map(|&o| &s.observables[o]).collect();
    m.kind
        .family()
        .sampler(m, obs)
        .map_err(|message| RunError::Engine {
            model: m.name.clone(),
            message,
        })
}

/// Runs sample indices `[from, to)` of every unit of `plan` and returns the accumulators, in the
/// order of `plan.slots`. Combined observables are computed from their components' numbers of the
/// same sample ([`Combination::value`], as in exact mode).
fn run_range(s: &Scenario, plan: &Plan, from: u64, to: u64) -> Result<Vec<Accumulator>, RunError> {
    let mut out: Vec<Accumulator> = plan.slots.iter().map(|sl| sl.accumulator(s)).collect();
    for u in &plan.units {
        let base = family_reads(s, u);
        let mut smp = sampler(s, u, &base)?;
        let positions: Vec<usize> = u
            .observables
            .iter()
            .map(|&o| {
                plan.slots
                    .iter()
                    .position(|sl| {
                        sl.observable == o && sl.replica == u.replica && sl.partner.is_none()
                    })
                    .expect("every unit observable has a slot")
            })
            .collect();
        let mut local: Vec<Accumulator> = positions.iter().map(|&p| out[p].clone()).collect();
        // Where each family read-out's value goes (its place among the unit's observables), and
        // the combinations with the places of their components among the read-outs.
        let direct: Vec<Option<usize>> = base
            .iter()
            .map(|b| u.observables.iter().position(|o| o == b))
            .collect();
        let combined: Vec<(usize, &ObservableSpec, &Combination, Vec<usize>)> = u
            .observables
            .iter()
            .enumerate()
            .filter_map(|(k, &o)| {
                let obs = &s.observables[o];
                match &obs.read {
                    ReadSpec::Combined(c) => {
                        let parts = c
                            .components()
                            .iter()
                            .map(|x| base.iter().position(|b| b == x).expect("component read"))
                            .collect();
                        Some((k, obs, c, parts))
                    }
                    ReadSpec::SixVertex(_) | ReadSpec::Exclusion(_) => None,
                }
            })
            .collect();
        let mut numbers = vec![0.0f64; base.len()];
        let (mut x, mut buf) = (Vec::new(), Vec::new());
        for i in from..to {
            smp.sample(u.seed, i, &mut |k, v| {
                if let Value::Number(y) = v {
                    numbers[k] = y;
                }
                if let Some(p) = direct[k] {
                    local[p].add(v);
                }
            });
            for (k, obs, c, parts) in &combined {
                x.clear();
                x.extend(parts.iter().map(|&j| numbers[j]));
                local[*k].add(c.value(&x, |y| obs.number(y), &mut buf));
            }
        }
        for (acc, &p) in local.into_iter().zip(&positions) {
            out[p] = acc;
        }
    }
    // Pair slots: both observables' values of this range are in sample order here (they are
    // sorted only after all merges), so zipping them pairs the readings of each sample.
    for (k, sl) in plan.slots.iter().enumerate() {
        let Some(b) = sl.partner else { continue };
        let find = |o: usize| {
            plan.slots
                .iter()
                .position(|x| x.observable == o && x.replica == sl.replica && x.partner.is_none())
                .expect("a pair slot's observables have slots")
        };
        let pairs: Vec<[f64; 2]> = match (&out[find(sl.observable)], &out[find(b)]) {
            (Accumulator::Scalar(x), Accumulator::Scalar(y)) => x
                .values
                .iter()
                .zip(&y.values)
                .map(|(&a, &b)| [a, b])
                .collect(),
            _ => Vec::new(),
        };
        if let Accumulator::Pairs(p) = &mut out[k] {
            p.values = pairs;
        }
    }
    Ok(out)
}

/// The worker threads of a run, started once and used by every call of [`advance`].
pub struct Workers {
    pool: rayon::ThreadPool,
}

impl Workers {
    /// Starts `threads` worker threads.
    ///
    /// # Errors
    /// [`RunError::Threads`] if the threads cannot be started.
    pub fn new(threads: usize) -> Result<Self, RunError> {
        let pool = rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .map_err(|_| RunError::Threads(threads))?;
        Ok(Workers { pool })
    }

    /// Number of worker threads.
    pub fn threads(&self) -> usize {
        self.pool.current_num_threads()
    }
}

/// Continues `partial` for up to `budget` more samples (all remaining when `None`) on `workers`, adding finished samples to `progress` and stopping early (at a chunk boundary) when
/// `stop` is raised. Returns whether the shard is complete.
///
/// # Errors
/// [`RunError`] if an engine cannot be built.
pub fn advance(
    s: &Scenario,
    plan: &Plan,
    partial: &mut Partial,
    workers: &Workers,
    progress: &AtomicU64,
    stop: &AtomicBool,
    budget: Option<u64>,
) -> Result<bool, RunError> {
    let started = Instant::now();
    let (_, end) = partial.shard.range(s.samples);
    let until = match budget {
        Some(b) => (partial.done + b).min(end),
        None => end,
    };
    let threads = workers.threads();
    // Work proceeds in rounds of a few chunks per thread, so that a stop request is honoured soon
    // and every round ends on a chunk boundary that a checkpoint can record.
    // Chunks shrink when few samples remain, so that every thread gets work even in a run of a
    // few expensive samples; the chunk layout changes no result (merges are exact).
    let chunk = (until - partial.done)
        .div_ceil(8 * threads as u64)
        .clamp(1, CHUNK);
    let round = chunk * 8 * threads as u64;
    while partial.done < until {
        if stop.load(Ordering::Relaxed) {
            break;
        }
        let lo = partial.done;
        let hi = (lo + round).min(until);
        let chunks: Vec<(u64, u64)> = (lo..hi)
            .step_by(chunk as usize)
            .map(|a| (a, (a + chunk).min(hi)))
            .collect();
        let results: Vec<Result<Vec<Accumulator>, RunError>> = workers.pool.install(|| {
            chunks
                .par_iter()
                .map(|&(a, b)| {
                    let r = run_range(s, plan, a, b);
                    progress.fetch_add(b - a, Ordering::Relaxed);
                    r
                })
                .collect()
        });
        for r in results {
            let accs = r?;
            for ((_, acc), add) in partial.slots.iter_mut().zip(&accs) {
                acc.merge(add);
            }
        }
        partial.done = hi;
    }
    for (_, acc) in partial.slots.iter_mut() {
        acc.canonicalize();
    }
    partial.wall_seconds += started.elapsed().as_secs_f64();
    partial.threads = partial.threads.max(threads);
    Ok(partial.complete())
}
