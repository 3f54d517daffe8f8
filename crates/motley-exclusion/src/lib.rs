//! Multi-species ASEP and TASEP in continuous time on a segment, a ring and the whole line, with
//! read-outs at chosen times and exact laws of small systems.
//!
//! # Color convention
//! Colors are `u32` as everywhere in motley ([`motley_colorblind::Color`]): `0` is a hole and a
//! **larger color is stronger**. The usual class convention (class 1 strongest, holes weakest) is
//! offered by the `from_classes` constructors and [`FiniteSystem::packed`], which go through
//! [`motley_colorblind::Relabel::reverse`]: with `K` classes, class `k` is color `K + 1 − k`. There is no
//! second code path; the permutation read-out reports classes the same way.
//!
//! # Dynamics
//! On each bond `(x, x+1)` the two colors swap at rate `p` if the left one is stronger and at rate
//! `q` if the right one is stronger; equal colors never swap ([`Rates`]; TASEP is `q = 0`). Lattices:
//! the segment `{1, …, n}` (bonds `1..n−1`), the ring `Z/nZ` (sites `1..=n`, `n` bonds, bond `n` is
//! `(n, 1)`) — see [`FiniteSystem`] and [`FiniteProcess`] — and the whole line `Z` with constant
//! colors far left and far right around an explicit block ([`LineData`], [`LineProcess`]), simulated
//! exactly on a lazily grown active region (no window, no truncation error).
//!
//! # Reproducibility
//! Sample `i` under seed `s` draws only from [`motley_stream::sample_stream`]`(s, i, ·)`; the stream
//! layouts are documented on [`FiniteProcess`] (module `finite_process`: stream 0 Poisson counts per
//! read-out interval, stream 1 attempt words, stream 2 attempt times — opened only for hitting-time
//! read-outs) and [`LineProcess`] (stream 0: gaps and attempts). On the segment and ring no random
//! choice looks at the state, so one seed drives the colored and every colorblind run and projections
//! commute with the dynamics pathwise. Results never depend on thread count: parallelise over sample
//! indices. Value-stability tests freeze the layout.
//!
//! # Hitting times, displacements, overtaking
//! [`Readout::SwapTime`] `{ a, b }` and [`Readout::FirstAttemptTime`] `{ from, onto }` report first
//! times as [`Reading::Time`] `{ time, censored }`: read at time `t`, the first time if it is `≤ t`,
//! else `time = t`, `censored = true`. [`Readout::Displacement`] `{ color }` is the particle's
//! unwrapped displacement `D` (steps right minus steps left; on the ring a step `n → 1` counts `+1`,
//! nothing is reduced mod `n`); on the segment and on `Z` it is the current minus the initial site.
//!
//! *Swapped, on each lattice.* With initial sites `s_a`, `s_b`, unwrapped positions
//! `X_a = s_a + D_a`, `X_b = s_b + D_b` and `Δ = X_a − X_b`: on the segment and on `Z`, `a` and `b`
//! have swapped when the sign of `Δ` differs from that of `Δ(0)` (their site order flipped). On the
//! ring of `n` sites `Δ` is never a multiple of `n` (two particles never share a site), and `a` and
//! `b` have swapped — one has *overtaken* the other — when `⌊Δ/n⌋ ≠ ⌊Δ(0)/n⌋`, i.e. when `a`'s
//! unwrapped position has passed `b`'s shifted by the multiple `k n` of `n` that lay between them at
//! time 0 (`k n < Δ(0) < (k+1) n`). `SwapTime` is the first such time. On every lattice it is the time
//! of the first exchange of `a` and `b` with each other: a move against any other color changes `Δ`
//! by `±1`, which cannot cross a multiple of `n` (nor, on the segment and `Z`, change its sign), and
//! an exchange of `a` with `b` changes `Δ` by `±2` across exactly one. [`Readout::Swapped`] is
//! unchanged and compares site numbers, also on the ring (where it differs from overtaking).
//!
//! *How the times are drawn.* On `Z` the attempt times are the sums of the exponential gaps already
//! drawn, so hitting times are exact and no draw is added. On the segment and ring the sampler draws
//! only the number of attempts `N_k` of each read-out interval; when (and only when) a plan holds a
//! hitting-time read-out, the attempts of the interval get times from stream 2 ([`TIME_STREAM`]),
//! the `N_k` order statistics of uniforms on the interval in increasing order (exact in law: given
//! `N_k`, a Poisson process's points are such order statistics, independent of the marks — bonds and
//! directions — drawn from stream 1). Streams 0 and 1 are read exactly as before, so **a plan without
//! these read-outs gives exactly the samples it gave before, and adding them to a plan changes none
//! of its other readings** (tested). Displacements draw nothing on any lattice. Time values use the
//! platform's `ln` and `exp`, so their last bits may differ between platforms; which attempt is the
//! hitting one does not.
//!
//! # Exact laws
//! [`ExactSolver`] enumerates arrangements of a segment or ring (≤ [`MAX_EXACT_SITES`] sites) and
//! computes the law at time `t` by uniformization, reporting the bound on the neglected Poisson tail;
//! [`Law::pushforward`] maps it to any read-out. That enumerator is the independent reference of the
//! tests; the scenario layer uses [`SparseSolver`]: all arrangements of a multiset of colors, ranked
//! without a hash table (two classes on 20 sites, three on 15, nine distinct colors), after merging
//! the contiguous colors a claim does not tell apart, with a proven ℓ¹ error bound. Stationary laws of
//! TASEP rings: [`multiline_queue_law`] (exact integer counts, Ferrari and Martin 2007) and
//! [`StationarySampler`] (independent samples from stream [`STATIONARY_STREAM`] = 3 only).
//!
//! # Examples
//! ```
//! use motley_exclusion::{
//!     ExactSolver, FiniteLattice, FiniteProcess, FiniteSystem, Rates, Reading, Readout, DEFAULT_TAIL,
//! };
//!
//! // Packed start on {1, 2, 3}: class x at site x, class 1 strongest.
//! let system = FiniteSystem::packed(FiniteLattice::Segment, 3)?;
//! let process = FiniteProcess::new(system, Rates::new(1.0, 0.5)?);
//! let plan = process.plan(&[0.5, 2.0], vec![Readout::Permutation])?;
//! let readings = process.sample(42, 0, &plan);
//! let Reading::Classes(classes) = &readings.values[1][0] else { unreachable!() };
//! let mut sorted = classes.clone();
//! sorted.sort();
//! assert_eq!(sorted, vec![1, 2, 3]);
//!
//! // The exact law at t = 2: probabilities sum to 1 within the reported bound.
//! let law = ExactSolver::new(&process)?.law_at(2.0, DEFAULT_TAIL)?;
//! let total: f64 = law.entries().iter().map(|e| e.1).sum();
//! assert!((total - 1.0).abs() < 1e-12 && law.error_bound() < 1e-15);
//! # Ok::<(), motley_exclusion::ExclusionError>(())
//! ```
//!
//! # Errors
//! Every constructor and plan check returns [`ExclusionError`]; samplers do not fail.
#![deny(missing_docs)]

mod error;
mod exact;
mod finite_process;
mod finite_system;
mod kernel;
mod law;
mod line_data;
mod line_process;
mod multiline_queue;
mod multiset;
mod observer;
mod rates;
mod readout;
mod sparse_exact;
mod step_counts;
mod words;

pub use error::ExclusionError;
pub use exact::{ExactSolver, DEFAULT_TAIL, MAX_EXACT_SITES, MAX_EXACT_STATES};
pub use finite_process::{FiniteProcess, ATTEMPT_STREAM, COUNT_STREAM, TIME_STREAM};
pub use finite_system::{FiniteLattice, FiniteSystem};
pub use law::{total_variation, Law};
pub use line_data::LineData;
pub use line_process::{LineProcess, LINE_STREAM};
pub use motley_colorblind::Color;
pub use multiline_queue::{
    multiline_queue_law, multiline_queue_work, QueueCounts, StationarySampler, MAX_QUEUE_WORK,
    STATIONARY_STREAM,
};
pub use rates::Rates;
pub use readout::{Reading, Readings, Readout, ReadoutPlan, MAX_WINDOW};
pub use sparse_exact::{SparseLaw, SparseSize, SparseSolver, MAX_EXACT_BYTES, MAX_SPARSE_STATES};
pub use step_counts::{step_counts, STEP_COUNT_STREAM};
