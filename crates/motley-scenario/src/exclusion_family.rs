//! Multi-species exclusion (ASEP, TASEP) as a model family: its read-outs, their one reading
//! function (shared by Monte Carlo and exact mode), its exact laws, cost and profile.
//!
//! Exact mode reads an observable the way Monte Carlo does: the engine read-outs the observable asks
//! for are computed from the exact law's arrangement ([`reading_of_arrangement`]) and go through the
//! same [`read`] function as the engine's own readings.

use motley_colorblind::Color;
use motley_exclusion::{
    multiline_queue_law, multiline_queue_work, FiniteLattice, FiniteSystem, Rates, Reading,
    Readout, SparseSolver, MAX_QUEUE_WORK,
};
use motley_reference::TasepStep;
use num_rational::BigRational;
use num_traits::ToPrimitive;

use crate::checker::MAX_SIDE;
use crate::error::ScenarioError;
use crate::exclusion_classes::Cuts;
use crate::exclusion_unit::ExclusionUnit;
use crate::family::{
    JointLaw, ModelFamily, RationalJointLaw, ReadContext, UnitSampler, Value, ValueBuffers,
    ValueKey,
};
use crate::raw::{RawPairRead, RawRead, RawSetKind, RawTime};
use crate::read_set::set_elements;
use crate::scenario::{
    ExclusionSpec, InitialSpec, LatticeSpec, ModelSpec, ObservableSpec, Profile, ReadSpec, SetRead,
    ValueKind,
};

/// The read-outs of an exclusion process; the last field is the index of the read-out time.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ExclusionRead {
    /// Sites `from..=to`.
    Window(i64, i64, usize, SetRead),
    /// Site of a color.
    Position(Color, usize),
    /// The arrangement (user classes by site).
    Arrangement(usize),
    /// The inverse arrangement.
    InverseArrangement(usize),
    /// The class on each site (holes 0), any initial data on a segment or ring.
    Configuration(usize),
    /// Net current of colors ≥ threshold through bond `(b, b+1)`.
    Current(i64, usize),
    /// Height at site `x` (paths at sites `> x`, colors ≥ threshold).
    Height(i64, usize),
    /// Two colors in the opposite order (segment and line: order of site numbers).
    Swapped(Color, Color, usize),
    /// On a ring: one of two colors has overtaken the other, net. With initial sites `s_a`, `s_b`
    /// and unwrapped displacements `D_a`, `D_b`, `Δ = (s_a + D_a) − (s_b + D_b)` is never a multiple
    /// of `n`; they have swapped when `⌊Δ/n⌋ ≠ ⌊Δ(0)/n⌋`, `start` being `Δ(0) = s_a − s_b`.
    Overtaken {
        /// One color.
        a: Color,
        /// The other.
        b: Color,
        /// Time index.
        time: usize,
        /// `s_a − s_b`.
        start: i64,
        /// Sites of the ring.
        n: usize,
    },
    /// One of two colors attempted a jump onto the other.
    Attempted(Color, Color, usize),
    /// The first time two colors are in the opposite order (ring: overtaking), censored.
    SwapTime(Color, Color, usize),
    /// The first time one of two colors attempts a jump onto the other, censored.
    AttemptTime(Color, Color, usize),
    /// The net number of steps a color has moved (unwrapped on the ring).
    Displacement(Color, usize),
}

/// Most sites of a segment or ring decided exactly (beyond, even one particle among holes is a
/// Monte Carlo job; the arrangement limit below is the one that matters).
pub const EXACT_EXCLUSION_SITES: usize = 4096;
/// Most arrangements of the merged colors an exact law at a time `t` may have (the sparse solver's
/// own limit; its memory limit is checked as well).
pub const EXACT_EXCLUSION_STATES: u64 = motley_exclusion::MAX_SPARSE_STATES;
/// Most arrangements of the merged colors a stationary law solved by iterating the generator may
/// have (ASEP, or TASEP rings whose multiline-queue count is too large).
pub const EXACT_STATIONARY_STATES: u64 = 200_000;
/// Most elementary updates (arrangements × active bonds × uniformization steps) of one exact law:
/// about a minute of one core at the rate measured by `cargo bench -p motley-exclusion --bench
/// exact_reach` (see the README's Performance section).
pub const EXACT_EXCLUSION_WORK: f64 = 9e9;
/// Elementary updates per second of the sparse solver on one core (same benchmark), for messages.
pub const EXACT_EXCLUSION_RATE: f64 = 1.5e8;
/// Steps of the stationary iteration at most, and its target ℓ¹ change per step.
const STATIONARY_STEPS: usize = 1_000_000;
const STATIONARY_TOLERANCE: f64 = 1e-14;
/// Exclusion events per second per thread assumed by the cost estimate (single core, this
/// project's 2-core machine, release build; `cargo bench`, see the README's Performance section).
pub const EXCLUSION_RATE: f64 = 5e7;

/// The exclusion read-out of an observable (validation resolved it into this family's own).
pub(crate) fn read_of(o: &ObservableSpec) -> &ExclusionRead {
    match &o.read {
        ReadSpec::Exclusion(r) => r,
        ReadSpec::SixVertex(_) | ReadSpec::Combined(_) => panic!(
            "observable `{}` is no exclusion read-out (a family reads only its own)",
            o.name
        ),
    }
}

/// The index of the read-out time among the model's times.
pub(crate) fn time_index(r: &ExclusionRead) -> usize {
    match *r {
        ExclusionRead::Window(_, _, t, _)
        | ExclusionRead::Position(_, t)
        | ExclusionRead::Arrangement(t)
        | ExclusionRead::InverseArrangement(t)
        | ExclusionRead::Configuration(t)
        | ExclusionRead::Current(_, t)
        | ExclusionRead::Height(_, t)
        | ExclusionRead::Swapped(_, _, t)
        | ExclusionRead::Overtaken { time: t, .. }
        | ExclusionRead::Attempted(_, _, t)
        | ExclusionRead::SwapTime(_, _, t)
        | ExclusionRead::AttemptTime(_, _, t)
        | ExclusionRead::Displacement(_, t) => t,
    }
}

/// The engine read-outs of one observable (one, or two for `attempted`, whose either direction
/// counts); `n` is the number of sites of a segment or ring.
pub(crate) fn readouts(o: &ObservableSpec, n: Option<usize>) -> Vec<Readout> {
    let threshold = o.threshold.unwrap_or(1).max(1);
    match *read_of(o) {
        ExclusionRead::Window(from, to, ..) => vec![Readout::Window { from, to }],
        ExclusionRead::Position(color, _) => vec![Readout::Positions { color }],
        ExclusionRead::Arrangement(_)
        | ExclusionRead::InverseArrangement(_)
        | ExclusionRead::Configuration(_) => {
            vec![Readout::Window {
                from: 1,
                to: n.unwrap_or(1) as i64,
            }]
        }
        ExclusionRead::Current(bond, _) => vec![Readout::Current { bond, threshold }],
        ExclusionRead::Height(site, _) => vec![Readout::Height { site, threshold }],
        ExclusionRead::Swapped(a, b, _) => vec![Readout::Swapped { a, b }],
        ExclusionRead::Overtaken { a, b, .. } => vec![
            Readout::Displacement { color: a },
            Readout::Displacement { color: b },
        ],
        ExclusionRead::SwapTime(a, b, _) => vec![Readout::SwapTime { a, b }],
        ExclusionRead::AttemptTime(a, b, _) => vec![
            Readout::FirstAttemptTime { from: a, onto: b },
            Readout::FirstAttemptTime { from: b, onto: a },
        ],
        ExclusionRead::Displacement(color, _) => vec![Readout::Displacement { color }],
        ExclusionRead::Attempted(a, b, _) => vec![
            Readout::Attempted { from: a, onto: b },
            Readout::Attempted { from: b, onto: a },
        ],
    }
}

/// Reads observable `o` of model `model` from `readings` (the engine read-outs of one time, the
/// observable's own starting at `first`): the one reading function of the family.
pub(crate) fn read<'s>(
    model: &ModelSpec,
    o: &ObservableSpec,
    readings: &[Reading],
    first: usize,
    scratch: &'s mut ValueBuffers,
) -> Value<'s> {
    let number = |v: f64| Value::Number(o.number(v));
    // The engine answers each read-out with the reading it asked for; another one reads as empty.
    let at = |k: usize| readings.get(first + k);
    let colors = || at(0).and_then(Reading::colors).unwrap_or(&[]);
    let count = |k: usize| at(k).and_then(Reading::count).unwrap_or(0);
    let flag = |k: usize| at(k).and_then(Reading::flag).unwrap_or(false);
    // A first time, censored at the read-out time when the event had not come yet.
    let time = |k: usize| at(k).and_then(Reading::time).unwrap_or(0.0);
    match *read_of(o) {
        ExclusionRead::Window(_, _, _, how) => {
            let universe = match o.kind {
                ValueKind::Set { universe } => universe,
                ValueKind::Scalar { .. }
                | ValueKind::Event
                | ValueKind::Sequence { .. }
                | ValueKind::Tuple { .. } => 0,
            };
            let s = &mut scratch.set;
            set_elements(colors(), how, o.threshold, o.map, universe, model, s);
            Value::Set(s)
        }
        ExclusionRead::Position(..) => number(
            at(0)
                .and_then(Reading::positions)
                .and_then(|p| p.first().copied())
                .unwrap_or(0) as f64,
        ),
        ExclusionRead::Arrangement(_) | ExclusionRead::Configuration(_) => {
            let seq = &mut scratch.sequence;
            seq.clear();
            seq.extend(colors().iter().map(|&x| model.to_user(x)));
            Value::Sequence(seq)
        }
        ExclusionRead::InverseArrangement(_) => {
            let c = colors();
            let seq = &mut scratch.sequence;
            seq.clear();
            seq.resize(c.len(), 0);
            for (site, &x) in c.iter().enumerate() {
                let class = model.to_user(x) as usize;
                if (1..=c.len()).contains(&class) {
                    seq[class - 1] = site as u32 + 1;
                }
            }
            Value::Sequence(seq)
        }
        ExclusionRead::Current(..) | ExclusionRead::Height(..) => number(count(0) as f64),
        ExclusionRead::Swapped(..) => Value::Event(flag(0)),
        ExclusionRead::Overtaken { start, n, .. } => {
            let n = n as i64;
            let now = start + count(0) - count(1);
            Value::Event(now.div_euclid(n) != start.div_euclid(n))
        }
        ExclusionRead::SwapTime(..) => number(time(0)),
        ExclusionRead::AttemptTime(..) => number(time(0).min(time(1))),
        ExclusionRead::Displacement(..) => number(count(0) as f64),
        ExclusionRead::Attempted(..) => Value::Event(flag(0) || flag(1)),
    }
}

/// What the engine read-out `r` would report on a segment that went from `initial` to `now`, or
/// `None` when it depends on the path (attempts) rather than the two arrangements.
pub(crate) fn reading_of_arrangement(
    r: &Readout,
    initial: &[Color],
    now: &[Color],
) -> Option<Reading> {
    let above = |c: &[Color], x: i64, t: Color| {
        c.iter()
            .skip(x.max(0) as usize)
            .filter(|&&v| v >= t)
            .count() as i64
    };
    let site = |c: &[Color], k: Color| c.iter().position(|&v| v == k);
    Some(match *r {
        Readout::Window { from, to } => {
            Reading::Colors(now[(from - 1) as usize..to as usize].to_vec())
        }
        Readout::Positions { color } => Reading::Positions(
            now.iter()
                .enumerate()
                .filter(|&(_, &v)| v == color)
                .map(|(i, _)| i as i64 + 1)
                .collect(),
        ),
        Readout::Permutation => return None,
        Readout::Current { bond, threshold } => {
            Reading::Count(above(now, bond, threshold) - above(initial, bond, threshold))
        }
        Readout::Height { site: x, threshold } => Reading::Count(above(now, x, threshold)),
        Readout::Swapped { a, b } => {
            let before = site(initial, a).unwrap_or(0) < site(initial, b).unwrap_or(0);
            let after = site(now, a).unwrap_or(0) < site(now, b).unwrap_or(0);
            Reading::Flag(before != after)
        }
        // On a segment the displacement is the site change; hitting times depend on the path.
        Readout::Displacement { color } => Reading::Count(
            site(now, color).map_or(0, |x| x as i64) - site(initial, color).map_or(0, |x| x as i64),
        ),
        Readout::Attempted { .. } | Readout::SwapTime { .. } | Readout::FirstAttemptTime { .. } => {
            return None
        }
    })
}

/// Reads the values of several observables from one arrangement of an exact law (merged colors,
/// whose representatives read as the colors they stand for: see `exclusion_classes`).
struct JointReader<'a> {
    model: &'a ModelSpec,
    observables: &'a [&'a ObservableSpec],
    readouts: Vec<Vec<Readout>>,
    initial: &'a [Color],
    scratch: std::cell::RefCell<ValueBuffers>,
}

impl<'a> JointReader<'a> {
    fn new(
        spec: &ExclusionSpec,
        model: &'a ModelSpec,
        observables: &'a [&'a ObservableSpec],
        initial: &'a [Color],
    ) -> Self {
        JointReader {
            model,
            observables,
            readouts: observables
                .iter()
                .map(|o| readouts(o, spec.sites()))
                .collect(),
            initial,
            scratch: std::cell::RefCell::new(ValueBuffers::default()),
        }
    }

    /// The values of the observables on `arrangement`.
    fn key(&self, arrangement: &[Color]) -> Result<Vec<ValueKey>, String> {
        let mut scratch = self.scratch.borrow_mut();
        let mut key = Vec::with_capacity(self.observables.len());
        for (o, rs) in self.observables.iter().zip(&self.readouts) {
            let readings = rs
                .iter()
                .map(|r| reading_of_arrangement(r, self.initial, arrangement))
                .collect::<Option<Vec<Reading>>>()
                .ok_or_else(|| format!("observable `{}` has no exact law", o.name))?;
            key.push(read(self.model, o, &readings, 0, &mut scratch).key());
        }
        Ok(key)
    }
}

fn set_read(k: RawSetKind) -> SetRead {
    match k {
        RawSetKind::Colors => SetRead::Colors,
        RawSetKind::Positions => SetRead::Positions,
    }
}

impl ExclusionSpec {
    /// Number of sites of a segment or ring.
    pub(crate) fn sites(&self) -> Option<usize> {
        match self.lattice {
            LatticeSpec::Segment(n) | LatticeSpec::Ring(n) => Some(n),
            LatticeSpec::Line => None,
        }
    }

    /// How many sites of the initial data hold engine color `col` (2 for a far-field color).
    fn sites_holding(&self, col: Color) -> usize {
        match &self.initial {
            InitialSpec::Sites(s) => s.iter().filter(|&&x| x == col).count(),
            InitialSpec::Line {
                left, right, block, ..
            } => {
                if *left == col || *right == col {
                    2
                } else {
                    block.iter().filter(|&&x| x == col).count()
                }
            }
        }
    }
}

impl ExclusionSpec {
    /// Refuses a read-out at `time: stationary` that is not a function of one arrangement, or on a
    /// lattice other than a ring.
    fn check_stationary(
        &self,
        cx: &ReadContext,
        raw: &RawRead,
        read: &ExclusionRead,
    ) -> Result<(), ScenarioError> {
        let p = format!("{}.{}.time", cx.path, raw.name());
        if !matches!(self.lattice, LatticeSpec::Ring(_)) {
            return Err(cx.error(
                &p,
                "`stationary` is offered on a ring (`lattice: {ring: n}`); on a segment or the line give a time",
            ));
        }
        match read {
            ExclusionRead::Window(..)
            | ExclusionRead::Position(..)
            | ExclusionRead::Arrangement(_)
            | ExclusionRead::InverseArrangement(_)
            | ExclusionRead::Configuration(_)
            | ExclusionRead::Height(..) => Ok(()),
            ExclusionRead::Current(..)
            | ExclusionRead::Swapped(..)
            | ExclusionRead::Overtaken { .. }
            | ExclusionRead::Attempted(..)
            | ExclusionRead::SwapTime(..)
            | ExclusionRead::AttemptTime(..)
            | ExclusionRead::Displacement(..) => Err(cx.error(
                &p,
                format!("`{}` depends on the path from time 0; at `stationary` read one arrangement (window, position, arrangement, inverse-arrangement, configuration, height)", raw.name()),
            )),
        }
    }

    /// The rates as the engine takes them.
    fn rates(&self) -> Result<Rates, String> {
        Rates::new(self.p.value, self.q.value).map_err(|x| x.to_string())
    }

    /// The segment or ring with the colors merged into the classes `observables` read, and the time
    /// they are read at (`f64::INFINITY`: stationary).
    fn merged_system(
        &self,
        observables: &[&ObservableSpec],
    ) -> Result<(FiniteSystem, f64), String> {
        let (InitialSpec::Sites(colors), LatticeSpec::Segment(_) | LatticeSpec::Ring(_)) =
            (&self.initial, self.lattice)
        else {
            return Err("exact laws need a segment or a ring".into());
        };
        let lattice = match self.lattice {
            LatticeSpec::Ring(_) => FiniteLattice::Ring,
            LatticeSpec::Segment(_) | LatticeSpec::Line => FiniteLattice::Segment,
        };
        let merged = Cuts::union(observables).merge(colors);
        let system = FiniteSystem::new(lattice, merged).map_err(|x| x.to_string())?;
        let t = observables
            .first()
            .map_or(0.0, |o| self.times[time_index(read_of(o))]);
        Ok((system, t))
    }

    /// Whether the stationary law is a TASEP's (multiline queues apply).
    fn tasep(&self) -> bool {
        self.p.value == 0.0 || self.q.value == 0.0
    }

    /// Why the exact law of `observables` (one time) cannot be computed here, with its size.
    fn exact_size_obstacle(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Option<String> {
        if let Some(n) = self.sites().filter(|&n| n > EXACT_EXCLUSION_SITES) {
            return Some(format!(
                "model `{}` has {n} sites; exact laws are computed up to {EXACT_EXCLUSION_SITES} sites (and {EXACT_EXCLUSION_STATES} arrangements of the classes read)",
                model.name
            ));
        }
        let (system, t) = match self.merged_system(observables) {
            Ok(x) => x,
            Err(e) => return Some(e),
        };
        let rates = match self.rates() {
            Ok(r) => r,
            Err(e) => return Some(e),
        };
        let size = SparseSolver::estimate(&system);
        let states = size
            .states
            .map_or("more than 2^64".to_string(), |s| s.to_string());
        if t.is_infinite() {
            if self.tasep() && multiline_queue_work(&system) <= MAX_QUEUE_WORK {
                return None;
            }
            if size.states.is_some_and(|s| s <= EXACT_STATIONARY_STATES) {
                return None;
            }
            return Some(format!(
                "model `{}`: the stationary law of the classes read has {states} arrangements; it is solved exactly up to {EXACT_STATIONARY_STATES} (and, for TASEP, by multiline queues up to {MAX_QUEUE_WORK:.0e} queue services)",
                model.name
            ));
        }
        if let Err(e) = size.check() {
            return Some(format!("model `{}`: {e}", model.name));
        }
        let work = size.work(&rates, t);
        if work > EXACT_EXCLUSION_WORK {
            return Some(format!(
                "model `{}`: the exact law at t = {t} ({states} arrangements of the classes read) would take about {:.0} s of one core, above the limit of {:.0} s",
                model.name,
                work / EXACT_EXCLUSION_RATE,
                EXACT_EXCLUSION_WORK / EXACT_EXCLUSION_RATE
            ));
        }
        None
    }
}

impl ModelFamily for ExclusionSpec {
    fn name(&self) -> &'static str {
        "exclusion"
    }

    fn read_names(&self) -> &'static str {
        "window, position, arrangement, inverse-arrangement, configuration, current, height, swapped, attempted, swap-time, attempt-time, displacement"
    }

    fn resolve_read(
        &self,
        cx: &ReadContext,
        raw: &RawRead,
    ) -> Result<(ReadSpec, ValueKind), ScenarioError> {
        let rp = cx.path;
        let ck = cx.checker;
        let int = ValueKind::Scalar {
            integer: true,
            discrete: true,
        };
        let n = self.sites().map(|n| n as i64);
        let time_index = |t: RawTime| -> usize {
            let t = t.value();
            self.times
                .iter()
                .position(|&x| x == t)
                .expect("times were collected from the observables")
        };
        let single = |p: &str, c: i64| -> Result<Color, ScenarioError> {
            let col = cx.class(p, c)?;
            let count = self.sites_holding(col);
            if count != 1 {
                return Err(cx.error(
                    p,
                    format!("class {c} must sit on exactly one site of the initial data to be followed; it sits on {}", if count > 1 { "several" } else { "none" }),
                ));
            }
            Ok(col)
        };
        // Two different followed classes and a time.
        let pair = |pr: &RawPairRead| -> Result<(Color, Color, usize), ScenarioError> {
            let p = format!("{rp}.{}.classes", raw.name());
            let a = single(&format!("{p}[0]"), pr.classes[0])?;
            let b = single(&format!("{p}[1]"), pr.classes[1])?;
            if a == b {
                return Err(cx.error(&p, "needs two different classes"));
            }
            Ok((a, b, time_index(pr.time)))
        };
        let time_kind = ValueKind::Scalar {
            integer: false,
            discrete: false,
        };
        let (read, kind) = match raw {
            RawRead::Window(w) => {
                let p = format!("{rp}.window");
                if w.from > w.to {
                    return Err(cx.error(
                        &format!("{p}.to"),
                        format!("must be ≥ `from` ({}), got {}", w.from, w.to),
                    ));
                }
                match n {
                    Some(n) => {
                        ck.int_in(&format!("{p}.from"), w.from, 1, n)?;
                        ck.int_in(&format!("{p}.to"), w.to, 1, n)?;
                    }
                    None => {
                        ck.int_in(&format!("{p}.from"), w.from, -MAX_SIDE, MAX_SIDE)?;
                        ck.int_in(&format!("{p}.to"), w.to, -MAX_SIDE, MAX_SIDE)?;
                        if w.to - w.from >= 1 << 16 {
                            return Err(
                                cx.error(&format!("{p}.to"), "a window holds at most 65536 sites")
                            );
                        }
                    }
                }
                let len = (w.to - w.from + 1) as usize;
                (
                    ExclusionRead::Window(w.from, w.to, time_index(w.time), set_read(w.kind)),
                    cx.set_kind(set_read(w.kind), len),
                )
            }
            RawRead::Position(pr) => {
                let c = single(&format!("{rp}.position.class"), pr.class)?;
                (ExclusionRead::Position(c, time_index(pr.time)), int)
            }
            RawRead::Arrangement(t) | RawRead::InverseArrangement(t) => {
                let inverse = matches!(raw, RawRead::InverseArrangement(_));
                let Some(n) = n else {
                    return Err(cx.error(rp, "an arrangement needs a segment or a ring"));
                };
                if !self.packed || i64::from(cx.user_max()) != n {
                    return Err(cx.error(rp, "an arrangement needs initial data with distinct classes 1..n on the n sites (e.g. `packed`)"));
                }
                let ti = time_index(t.time);
                let read = if inverse {
                    ExclusionRead::InverseArrangement(ti)
                } else {
                    ExclusionRead::Arrangement(ti)
                };
                (read, ValueKind::Sequence { len: n as usize })
            }
            RawRead::Configuration(t) => {
                let Some(n) = n else {
                    return Err(cx.error(rp, "a configuration needs a segment or a ring"));
                };
                (
                    ExclusionRead::Configuration(time_index(t.time)),
                    ValueKind::Sequence { len: n as usize },
                )
            }
            RawRead::Current(c) => {
                let p = format!("{rp}.current.bond");
                match (self.lattice, n) {
                    (LatticeSpec::Segment(_), Some(n)) => ck.int_in(&p, c.bond, 1, n - 1)?,
                    (_, Some(n)) => ck.int_in(&p, c.bond, 1, n)?,
                    (_, None) => ck.int_in(&p, c.bond, -MAX_SIDE, MAX_SIDE)?,
                };
                (ExclusionRead::Current(c.bond, time_index(c.time)), int)
            }
            RawRead::Height(h) => {
                let p = format!("{rp}.height");
                if h.y.is_some() {
                    return Err(cx.error(
                        &format!("{p}.y"),
                        "an exclusion height has no `y`; give `time`",
                    ));
                }
                let Some(t) = h.time else {
                    return Err(cx.error(&p, "an exclusion height needs `time`"));
                };
                match n {
                    Some(n) => ck.int_in(&format!("{p}.x"), h.x, 0, n)?,
                    None => ck.int_in(&format!("{p}.x"), h.x, -MAX_SIDE, MAX_SIDE)?,
                };
                (ExclusionRead::Height(h.x, time_index(t)), int)
            }
            RawRead::Swapped(pr) => {
                let (a, b, ti) = pair(pr)?;
                match self.lattice {
                    LatticeSpec::Ring(n) => {
                        let site = |c: Color| match &self.initial {
                            InitialSpec::Sites(s) => s.iter().position(|&x| x == c).unwrap_or(0),
                            InitialSpec::Line { .. } => 0,
                        } as i64;
                        let start = site(a) - site(b);
                        (
                            ExclusionRead::Overtaken {
                                a,
                                b,
                                time: ti,
                                start,
                                n,
                            },
                            ValueKind::Event,
                        )
                    }
                    LatticeSpec::Segment(_) | LatticeSpec::Line => {
                        (ExclusionRead::Swapped(a, b, ti), ValueKind::Event)
                    }
                }
            }
            RawRead::Attempted(pr) => {
                let (a, b, ti) = pair(pr)?;
                (ExclusionRead::Attempted(a, b, ti), ValueKind::Event)
            }
            RawRead::SwapTime(pr) => {
                let (a, b, ti) = pair(pr)?;
                (ExclusionRead::SwapTime(a, b, ti), time_kind)
            }
            RawRead::AttemptTime(pr) => {
                let (a, b, ti) = pair(pr)?;
                (ExclusionRead::AttemptTime(a, b, ti), time_kind)
            }
            RawRead::Displacement(pr) => {
                let c = single(&format!("{rp}.displacement.class"), pr.class)?;
                (ExclusionRead::Displacement(c, time_index(pr.time)), int)
            }
            RawRead::Top(_)
            | RawRead::Right(_)
            | RawRead::Row(_)
            | RawRead::Column(_)
            | RawRead::ExitColumn(_)
            | RawRead::ExitPermutation(_)
            | RawRead::ExitPlace(_) => return Err(cx.wrong_family(self, raw)),
        };
        if self.times[crate::exclusion_family::time_index(&read)].is_infinite() {
            self.check_stationary(cx, raw, &read)?;
        }
        Ok((ReadSpec::Exclusion(read), kind))
    }

    fn takes_threshold(&self, read: &ReadSpec) -> bool {
        match read {
            ReadSpec::Exclusion(r) => match r {
                ExclusionRead::Window(_, _, _, how) => *how == SetRead::Positions,
                ExclusionRead::Current(..) | ExclusionRead::Height(..) => true,
                ExclusionRead::Position(..)
                | ExclusionRead::Arrangement(_)
                | ExclusionRead::InverseArrangement(_)
                | ExclusionRead::Configuration(_)
                | ExclusionRead::Overtaken { .. }
                | ExclusionRead::SwapTime(..)
                | ExclusionRead::AttemptTime(..)
                | ExclusionRead::Displacement(..)
                | ExclusionRead::Swapped(..)
                | ExclusionRead::Attempted(..) => false,
            },
            ReadSpec::SixVertex(_) | ReadSpec::Combined(_) => false,
        }
    }

    fn sampler<'a>(
        &'a self,
        model: &'a ModelSpec,
        observables: Vec<&'a ObservableSpec>,
    ) -> Result<Box<dyn UnitSampler + 'a>, String> {
        Ok(Box::new(ExclusionUnit::new(model, self, observables)?))
    }

    fn exact_obstacle(&self, model: &ModelSpec, o: &ObservableSpec) -> Option<String> {
        if self.sites().is_none() {
            return Some(format!(
                "model `{}` lives on the line; exact laws need a segment or a ring",
                model.name
            ));
        }
        let ring = matches!(self.lattice, LatticeSpec::Ring(_));
        match read_of(o) {
            ExclusionRead::Attempted(..) => Some(format!(
                "observable `{}` depends on the path, not only on the arrangement at one time",
                o.name
            )),
            ExclusionRead::SwapTime(..) | ExclusionRead::AttemptTime(..) => Some(format!(
                "observable `{}` is a first time along the path; exact laws cover read-outs at one time",
                o.name
            )),
            ExclusionRead::Current(..)
            | ExclusionRead::Swapped(..)
            | ExclusionRead::Overtaken { .. }
            | ExclusionRead::Displacement(..)
                if ring =>
            {
                Some(format!(
                    "observable `{}` on a ring depends on the path, not only on the arrangement",
                    o.name
                ))
            }
            ExclusionRead::Window(..)
            | ExclusionRead::Position(..)
            | ExclusionRead::Arrangement(_)
            | ExclusionRead::InverseArrangement(_)
            | ExclusionRead::Configuration(_)
            | ExclusionRead::Current(..)
            | ExclusionRead::Height(..)
            | ExclusionRead::Swapped(..)
            | ExclusionRead::Overtaken { .. }
            | ExclusionRead::Displacement(..) => self.exact_size_obstacle(model, &[o]),
        }
    }

    fn sampling_obstacle(&self, model: &ModelSpec, o: &ObservableSpec) -> Option<String> {
        let stationary = self.times[time_index(read_of(o))].is_infinite();
        (stationary && !self.tasep()).then(|| {
            format!(
                "observable `{}` reads the stationary law of model `{}`, an ASEP (p, q > 0); stationary samples are drawn by multiline queues, which cover TASEP only",
                o.name, model.name
            )
        })
    }

    fn censored_at(&self, read: &ReadSpec) -> Option<f64> {
        match read {
            ReadSpec::Exclusion(
                ExclusionRead::SwapTime(_, _, t) | ExclusionRead::AttemptTime(_, _, t),
            ) => Some(self.times[*t]),
            ReadSpec::Exclusion(_) | ReadSpec::SixVertex(_) | ReadSpec::Combined(_) => None,
        }
    }

    fn joint_obstacle(&self, model: &ModelSpec, parts: &[&ObservableSpec]) -> Option<String> {
        let t = parts.first().map(|o| time_index(read_of(o)))?;
        if parts.iter().any(|o| time_index(read_of(o)) != t) {
            return Some(
                "its observables read different times; exact joint laws are computed at one time"
                    .to_string(),
            );
        }
        if parts.len() > 1 {
            return self.exact_size_obstacle(model, parts);
        }
        None
    }

    fn exact_joint_law(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Result<JointLaw, String> {
        let t = observables
            .first()
            .map(|o| time_index(read_of(o)))
            .unwrap_or(0);
        if observables.iter().any(|o| time_index(read_of(o)) != t) {
            return Err("an exact joint law reads all its observables at one time".into());
        }
        let (system, time) = self.merged_system(observables)?;
        let rates = self.rates()?;
        let initial = system.colors().to_vec();
        let reader = JointReader::new(self, model, observables, &initial);
        if time.is_infinite() && self.tasep() {
            if let Ok((law, total)) = multiline_queue_law(&system, &rates) {
                let total = BigRational::from_integer(total.into());
                let mut cells = std::collections::BTreeMap::new();
                let count = law.len();
                for (arrangement, c) in law {
                    let p = (BigRational::from_integer(c.into()) / &total)
                        .to_f64()
                        .unwrap_or(f64::NAN);
                    *cells.entry(reader.key(&arrangement)?).or_insert(0.0) += p;
                }
                // Each probability rounded once (u), then summed (≤ count − 1 roundings of u).
                return Ok(JointLaw {
                    cells: cells.into_iter().collect(),
                    error: 2.02 * f64::EPSILON / 2.0 * count as f64,
                });
            }
        }
        let solver = SparseSolver::new(&system, rates).map_err(|x| x.to_string())?;
        let law = if time.is_infinite() {
            solver.stationary(STATIONARY_TOLERANCE, STATIONARY_STEPS)
        } else {
            solver
                .law_at(time, motley_exclusion::DEFAULT_TAIL)
                .map_err(|x| x.to_string())?
        };
        let mut cells = std::collections::BTreeMap::new();
        let mut failure = None;
        law.visit(|arrangement, p| match reader.key(arrangement) {
            Ok(key) => *cells.entry(key).or_insert(0.0) += p,
            Err(e) => failure = Some(e),
        });
        if let Some(e) = failure {
            return Err(e);
        }
        // Summing the arrangements' probabilities into cells: at most one rounding (u) per
        // arrangement in ℓ¹, all terms nonnegative.
        Ok(JointLaw {
            cells: cells.into_iter().collect(),
            error: law.error_bound() + 1.01 * f64::EPSILON / 2.0 * law.state_count() as f64,
        })
    }

    fn rational_joint_law(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Option<RationalJointLaw> {
        let (system, time) = self.merged_system(observables).ok()?;
        if !(time.is_infinite() && self.tasep()) {
            return None;
        }
        let (law, total) = multiline_queue_law(&system, &self.rates().ok()?).ok()?;
        let initial = system.colors().to_vec();
        let reader = JointReader::new(self, model, observables, &initial);
        let total = BigRational::from_integer(total.into());
        let mut entries = Vec::with_capacity(law.len());
        for (arrangement, c) in law {
            entries.push((
                reader.key(&arrangement).ok()?,
                BigRational::from_integer(c.into()) / &total,
            ));
        }
        Some(RationalJointLaw::from_entries(entries))
    }

    fn cost_per_sample(&self) -> (f64, f64) {
        // The last finite time; a stationary read draws one multiline queue (about one event per
        // class and site).
        let t = self
            .times
            .iter()
            .copied()
            .filter(|t| t.is_finite())
            .fold(0.0, f64::max);
        let stationary = match (self.times.iter().any(|t| t.is_infinite()), &self.initial) {
            (true, InitialSpec::Sites(c)) => {
                let mut v = c.clone();
                v.sort_unstable();
                v.dedup();
                (c.len() * v.len()) as f64
            }
            (true, InitialSpec::Line { .. }) | (false, _) => 0.0,
        };
        let rate = self.p.value + self.q.value;
        let (events, sites) = match self.lattice {
            LatticeSpec::Segment(n) | LatticeSpec::Ring(n) => (n as f64 * rate * t, n as f64),
            // The active region grows at speed at most about 2(p + q) on each side.
            LatticeSpec::Line => {
                let block = match &self.initial {
                    InitialSpec::Line { block, .. } => block.len() as f64,
                    InitialSpec::Sites(_) => 1.0,
                };
                let width = block + 4.0 * rate * t;
                (0.5 * (block + width) * rate * t, width)
            }
        };
        ((events + stationary) / EXCLUSION_RATE, sites * 16.0)
    }

    fn window_origin(&self, read: &ReadSpec) -> Option<i64> {
        match read {
            ReadSpec::Exclusion(ExclusionRead::Window(from, _, _, SetRead::Positions)) => {
                Some(*from)
            }
            ReadSpec::Exclusion(_) | ReadSpec::SixVertex(_) | ReadSpec::Combined(_) => None,
        }
    }

    fn profile_value(
        &self,
        profile: Profile,
        model: &ModelSpec,
        o: &ObservableSpec,
    ) -> Result<Option<f64>, String> {
        let wanted = match profile {
            Profile::TasepStepCount => o.base.is_none(),
            Profile::SixVertexStepHeight | Profile::SixVertexQMoment => false,
        };
        let (ExclusionRead::Height(x, t), true) = (read_of(o), wanted) else {
            return Ok(None);
        };
        let at = match &self.initial {
            InitialSpec::Line {
                left,
                right,
                block,
                at,
            } => {
                let t = o.threshold.unwrap_or(1);
                (*left >= t && *right < t && block.iter().all(|&c| c < t)).then_some(*at)
            }
            InitialSpec::Sites(_) => None,
        };
        let Some(at) = at else {
            return Err(format!("`tasep-step-count` needs step data on the line (particles left of `at`, none from `at` on), but model \"{}\" of \"{}\" has other initial data", model.name, o.name));
        };
        let shape = TasepStep::asep(self.p.value, self.q.value)
            .map_err(|e| format!("model \"{}\": {e}", model.name))?;
        // Particles on sites < at: the count right of x is that of step data at 1 for the site
        // x − (at − 1).
        Ok(Some(o.number(shape.particles_right_of(
            (x - (at - 1)) as f64,
            self.times[*t],
        ))))
    }
}
