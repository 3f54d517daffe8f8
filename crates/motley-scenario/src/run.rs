//! Running the Monte Carlo part of a scenario: sample indices split into chunks over threads, every
//! chunk feeding exactly-merging accumulators.
//!
//! # Reproducibility
//! Sample `i` of a unit depends only on `(unit seed, i)` (see [`crate::unit`]). A shard `K/N` takes
//! the contiguous index range `[⌊(K−1)·S/N⌋, ⌊K·S/N⌋)` of the `S` samples. Chunks, threads and shards
//! only decide who computes which index; the accumulators merge exactly, so the result is the same
//! for every thread count and shard split.

use std::collections::BTreeMap;
use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::sync::Mutex;
use std::time::Instant;

use serde::{Deserialize, Serialize};
use sha2::Digest;

use crate::accumulate::Accumulator;
use crate::combination::Combination;
use crate::family::{read_by_family, UnitSampler, Value};
use crate::plan::Plan;
use crate::scenario::{ObservableSpec, ReadSpec, Scenario};
use crate::unit::Unit;

/// Largest number of samples per work chunk: the grain of parallelism, progress and checkpoints.
pub const CHUNK: u64 = 256;

/// Schema name of partial (shard or checkpoint) files.
pub const PARTIAL_SCHEMA: &str = "motley-partial/2";

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
    /// Accumulators by slot name ([`crate::unit::Slot::name`]), in the order of the plan's slots.
    pub slots: Vec<(String, Accumulator)>,
    /// Seconds spent.
    pub wall_seconds: f64,
    /// Threads used.
    pub threads: usize,
    /// In a sequential run, the claims settled at an earlier look, as that look decided them.
    #[serde(default)]
    pub settled: Vec<crate::result::ClaimResult>,
    /// SHA-256 (hex) of the file's content with this field empty; set by [`Partial::to_json`],
    /// checked when read (`partial_check`).
    #[serde(default)]
    pub digest: String,
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
                .map(|sl| (sl.name(s), sl.accumulator(s)))
                .collect(),
            wall_seconds: 0.0,
            threads: 0,
            settled: Vec::new(),
            digest: String::new(),
        }
    }

    /// The digest of this partial's content: SHA-256 (hex) of its compact JSON with `digest` empty.
    pub fn content_digest(&self) -> String {
        let mut plain = self.clone();
        plain.digest.clear();
        let bytes = serde_json::to_vec(&plain).expect("a partial serializes");
        crate::load::hex(&sha2::Sha256::digest(&bytes))
    }

    /// This partial as the JSON text of a checkpoint or shard file, with its digest.
    pub fn to_json(&self) -> String {
        let mut sealed = self.clone();
        sealed.digest = self.content_digest();
        let mut text = serde_json::to_string_pretty(&sealed).expect("a partial serializes");
        text.push('\n');
        text
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

/// One unit's sampler and the places its values go while a range of samples runs.
struct UnitRun<'a> {
    seed: u64,
    sampler: Box<dyn UnitSampler + 'a>,
    /// Where the unit's observables go among `plan.slots`.
    positions: Vec<usize>,
    /// The unit's accumulators, in the order of its observables.
    local: Vec<Accumulator>,
    /// Where each family read-out's value goes (its place among the unit's observables).
    direct: Vec<Option<usize>>,
    /// The combinations with the places of their components among the read-outs.
    combined: Vec<(usize, &'a ObservableSpec, &'a Combination, Vec<usize>)>,
    numbers: Vec<f64>,
}

impl<'a> UnitRun<'a> {
    fn new(s: &'a Scenario, plan: &Plan, u: &Unit) -> Result<Self, RunError> {
        let base = family_reads(s, u);
        let sampler = sampler(s, u, &base)?;
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
        let local = positions
            .iter()
            .map(|&p| plan.slots[p].accumulator(s))
            .collect();
        let direct = base
            .iter()
            .map(|b| u.observables.iter().position(|o| o == b))
            .collect();
        let combined = u
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
        Ok(UnitRun {
            seed: u.seed,
            sampler,
            positions,
            local,
            direct,
            combined,
            numbers: vec![0.0; base.len()],
        })
    }

    /// Draws sample `i` into the unit's accumulators. Combined observables are computed from their
    /// components' numbers of the same sample ([`Combination::value`], as in exact mode).
    fn sample(&mut self, i: u64, x: &mut Vec<f64>, buf: &mut Vec<f64>) {
        let (numbers, direct, local) = (&mut self.numbers, &self.direct, &mut self.local);
        self.sampler.sample(self.seed, i, &mut |k, v| {
            if let Value::Number(y) = v {
                numbers[k] = y;
            }
            if let Some(p) = direct[k] {
                local[p].add(v);
            }
        });
        for (k, obs, c, parts) in &self.combined {
            x.clear();
            x.extend(parts.iter().map(|&j| self.numbers[j]));
            self.local[*k].add(c.value(x, |y| obs.number(y), buf));
        }
    }
}

/// Runs sample indices `[from, to)` of every unit of `plan`, sample by sample (every unit draws
/// sample `i` before any draws `i + 1`), and returns the index reached and the accumulators, in
/// the order of `plan.slots`. Before each sample it looks at `stop`: when raised, it returns
/// early, and the accumulators hold exactly the samples `[from, reached)`. Finished samples are
/// added to `progress` in small batches.
fn run_range(
    s: &Scenario,
    plan: &Plan,
    (from, to): (u64, u64),
    stop: &AtomicBool,
    progress: &AtomicU64,
) -> Result<(u64, Vec<Accumulator>), RunError> {
    let mut out: Vec<Accumulator> = plan.slots.iter().map(|sl| sl.accumulator(s)).collect();
    let mut units = plan
        .units
        .iter()
        .map(|u| UnitRun::new(s, plan, u))
        .collect::<Result<Vec<_>, _>>()?;
    let (mut x, mut buf) = (Vec::new(), Vec::new());
    // A chunk is a fraction of a second of work (see `advance`); a sixteenth of it per progress
    // update keeps the counter current without contention on cheap samples.
    let batch = ((to - from) / 16).max(1);
    let (mut reached, mut unreported) = (from, 0u64);
    while reached < to && !stop.load(Ordering::Relaxed) {
        for u in &mut units {
            u.sample(reached, &mut x, &mut buf);
        }
        reached += 1;
        unreported += 1;
        if unreported >= batch {
            progress.fetch_add(unreported, Ordering::Relaxed);
            unreported = 0;
        }
    }
    progress.fetch_add(unreported, Ordering::Relaxed);
    for u in units {
        for (acc, &p) in u.local.into_iter().zip(&u.positions) {
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
    Ok((reached, out))
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

/// Work per chunk that [`advance`] aims at, in seconds: short enough that the finished prefix stays
/// close behind the work in flight (an interruption loses at most about this much per thread).
const CHUNK_SECONDS: f64 = 0.2;

/// The chunks of one [`advance`] call: handed out in index order, merged in index order.
struct Dispatch<'a> {
    /// Next index to hand out, and the current chunk length.
    cursor: Mutex<(u64, u64)>,
    /// Merged accumulators of the finished prefix `[start, frontier)`, the chunks finished beyond
    /// it (by first index: reached index, planned end, accumulators), and whether the prefix is
    /// closed (a chunk stopped short, so nothing after it may join).
    merged: Mutex<Merged<'a>>,
    until: u64,
    threads: u64,
}

struct Merged<'a> {
    slots: &'a mut [(String, Accumulator)],
    frontier: u64,
    waiting: BTreeMap<u64, (u64, u64, Vec<Accumulator>)>,
    closed: bool,
    error: Option<RunError>,
}

impl Dispatch<'_> {
    /// The next chunk, or `None` when all are handed out or the run stops.
    fn take(&self, stop: &AtomicBool, failed: &AtomicBool) -> Option<(u64, u64)> {
        if stop.load(Ordering::Relaxed) || failed.load(Ordering::Relaxed) {
            return None;
        }
        let mut c = self.cursor.lock().unwrap_or_else(|e| e.into_inner());
        let (next, grain) = *c;
        if next >= self.until {
            return None;
        }
        // Near the end, chunks shrink so that every thread gets a share.
        let len = grain.min((self.until - next).div_ceil(self.threads)).max(1);
        c.0 = next + len;
        Some((next, next + len))
    }

    /// Adapts the chunk length to the time a chunk of `len` samples took: the layout of chunks
    /// changes no result (merges are exact), only how soon a stop and a checkpoint take effect.
    fn tune(&self, len: u64, seconds: f64) {
        let mut c = self.cursor.lock().unwrap_or_else(|e| e.into_inner());
        if len >= c.1 && seconds < CHUNK_SECONDS / 2.0 {
            c.1 = (c.1 * 2).min(CHUNK);
        } else if seconds > CHUNK_SECONDS * 2.0 {
            c.1 = (c.1 / 2).max(1);
        }
    }

    /// Records a finished (or stopped) chunk and merges every chunk that now continues the prefix.
    fn finish(&self, a: u64, b: u64, outcome: Result<(u64, Vec<Accumulator>), RunError>) {
        let mut m = self.merged.lock().unwrap_or_else(|e| e.into_inner());
        match outcome {
            Err(e) => {
                m.closed = true;
                m.error.get_or_insert(e);
            }
            Ok((reached, accs)) => {
                m.waiting.insert(a, (reached, b, accs));
            }
        }
        while !m.closed {
            let f = m.frontier;
            let Some((reached, end, accs)) = m.waiting.remove(&f) else {
                break;
            };
            for ((_, acc), add) in m.slots.iter_mut().zip(&accs) {
                acc.merge(add);
            }
            m.frontier = reached;
            m.closed = reached < end;
        }
    }
}

/// Continues `partial` for up to `budget` more samples (all remaining when `None`) on `workers`,
/// adding finished samples to `progress`. Returns whether the shard is complete.
///
/// Chunks of consecutive indices are handed out in order and merged in order; their length adapts
/// so that each takes about [`CHUNK_SECONDS`]. `stop` is looked at before every sample: once it is
/// raised, the call returns within one sample per thread, and `partial` holds exactly the finished
/// prefix of indices `[start, done)` (samples finished beyond the first unfinished one are
/// dropped), so a checkpoint of it continues to the same result.
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
    // A partial that claims more than its shard is refused when read (`partial_check`); here it
    // simply has nothing left to do.
    let from = partial.done.min(end);
    let until = match budget {
        Some(b) => from.saturating_add(b).min(end),
        None => end,
    };
    let threads = workers.threads();
    let dispatch = Dispatch {
        cursor: Mutex::new((from, 1)),
        merged: Mutex::new(Merged {
            slots: &mut partial.slots,
            frontier: from,
            waiting: BTreeMap::new(),
            closed: false,
            error: None,
        }),
        until,
        threads: threads as u64,
    };
    // A failed chunk stops the handing out of others.
    let failed = AtomicBool::new(false);
    if from < until {
        workers.pool.broadcast(|_| {
            while let Some((a, b)) = dispatch.take(stop, &failed) {
                let t = Instant::now();
                let outcome = run_range(s, plan, (a, b), stop, progress);
                if outcome.is_err() {
                    failed.store(true, Ordering::Relaxed);
                } else {
                    dispatch.tune(b - a, t.elapsed().as_secs_f64());
                }
                dispatch.finish(a, b, outcome);
            }
        });
    }
    let merged = dispatch
        .merged
        .into_inner()
        .unwrap_or_else(|e| e.into_inner());
    let (frontier, error) = (merged.frontier, merged.error);
    if let Some(e) = error {
        return Err(e);
    }
    partial.done = partial.done.max(frontier);
    for (_, acc) in partial.slots.iter_mut() {
        acc.canonicalize();
    }
    partial.wall_seconds += started.elapsed().as_secs_f64();
    partial.threads = partial.threads.max(threads);
    Ok(partial.complete())
}
