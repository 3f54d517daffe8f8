//! The exclusion process behind a sampling unit: building the engine from the validated spec and
//! reading every observable of the unit from one sample.

use motley_exclusion::{
    FiniteLattice, FiniteProcess, FiniteSystem, LineData, LineProcess, Rates, Reading, Readout,
    ReadoutPlan,
};

use crate::accumulate::Accumulator;
use crate::read_set::set_elements;
use crate::scenario::{
    ExclusionSpec, InitialSpec, LatticeSpec, ModelSpec, ObservableSpec, ReadSpec, ValueKind,
};

/// The engine of an exclusion spec.
pub(crate) enum Process {
    /// Segment or ring.
    Finite(FiniteProcess),
    /// ℤ.
    Line(LineProcess),
}

/// Builds the engine for `e`.
pub(crate) fn build(e: &ExclusionSpec) -> Result<Process, String> {
    let rates = Rates::new(e.p.value, e.q.value).map_err(|x| x.to_string())?;
    Ok(match (&e.initial, e.lattice) {
        (InitialSpec::Sites(c), LatticeSpec::Segment(_) | LatticeSpec::Ring(_)) => {
            let lattice = if matches!(e.lattice, LatticeSpec::Ring(_)) {
                FiniteLattice::Ring
            } else {
                FiniteLattice::Segment
            };
            let system = FiniteSystem::new(lattice, c.clone()).map_err(|x| x.to_string())?;
            Process::Finite(FiniteProcess::new(system, rates))
        }
        (
            InitialSpec::Line {
                left,
                right,
                at,
                block,
            },
            LatticeSpec::Line,
        ) => {
            let block = if block.is_empty() {
                vec![*right]
            } else {
                block.clone()
            };
            let data = LineData::new(*left, *right, *at, block).map_err(|x| x.to_string())?;
            Process::Line(LineProcess::new(data, rates))
        }
        _ => return Err("initial data do not match the lattice".into()),
    })
}

/// The engine read-outs of one observable (one, or two for `attempted`, whose either direction
/// counts).
fn readouts(o: &ObservableSpec, n: Option<usize>) -> Vec<Readout> {
    let threshold = o.threshold.unwrap_or(1).max(1);
    match o.read {
        ReadSpec::Window(from, to, ..) => vec![Readout::Window { from, to }],
        ReadSpec::Position(color, _) => vec![Readout::Positions { color }],
        ReadSpec::Arrangement(_) | ReadSpec::InverseArrangement(_) => vec![Readout::Window {
            from: 1,
            to: n.unwrap_or(1) as i64,
        }],
        ReadSpec::Current(bond, _) => vec![Readout::Current { bond, threshold }],
        ReadSpec::HeightExcl(site, _) => vec![Readout::Height { site, threshold }],
        ReadSpec::Swapped(a, b, _) => vec![Readout::Swapped { a, b }],
        ReadSpec::Attempted(a, b, _) => vec![
            Readout::Attempted { from: a, onto: b },
            Readout::Attempted { from: b, onto: a },
        ],
        _ => Vec::new(),
    }
}

fn time_index(r: &ReadSpec) -> usize {
    match *r {
        ReadSpec::Window(_, _, t, _)
        | ReadSpec::Position(_, t)
        | ReadSpec::Arrangement(t)
        | ReadSpec::InverseArrangement(t)
        | ReadSpec::Current(_, t)
        | ReadSpec::HeightExcl(_, t)
        | ReadSpec::Swapped(_, _, t)
        | ReadSpec::Attempted(_, _, t) => t,
        _ => 0,
    }
}

/// One exclusion unit, ready to sample.
pub(crate) struct ExclusionUnit<'a> {
    process: Process,
    plan: ReadoutPlan,
    spec: &'a ModelSpec,
    observables: Vec<&'a ObservableSpec>,
    /// First engine read-out of each observable.
    first: Vec<usize>,
    scratch: Vec<usize>,
    seq: Vec<u32>,
}

impl<'a> ExclusionUnit<'a> {
    /// Builds the engine and the read-out plan covering `observables`.
    pub(crate) fn new(
        spec: &'a ModelSpec,
        e: &ExclusionSpec,
        observables: Vec<&'a ObservableSpec>,
    ) -> Result<Self, String> {
        let process = build(e)?;
        let n = match e.lattice {
            LatticeSpec::Segment(n) | LatticeSpec::Ring(n) => Some(n),
            LatticeSpec::Line => None,
        };
        let mut all = Vec::new();
        let mut first = Vec::new();
        for o in &observables {
            first.push(all.len());
            all.extend(readouts(o, n));
        }
        let plan = match &process {
            Process::Finite(p) => p.plan(&e.times, all),
            Process::Line(p) => p.plan(&e.times, all),
        }
        .map_err(|x| x.to_string())?;
        Ok(ExclusionUnit {
            process,
            plan,
            spec,
            observables,
            first,
            scratch: Vec::new(),
            seq: Vec::new(),
        })
    }

    /// Draws sample `index` under `seed` and feeds `accs` (one per observable, same order).
    pub(crate) fn sample(&mut self, seed: u64, index: u64, accs: &mut [Accumulator]) {
        let readings = match &self.process {
            Process::Finite(p) => p.sample(seed, index, &self.plan),
            Process::Line(p) => p.sample(seed, index, &self.plan),
        };
        for (k, o) in self.observables.iter().enumerate() {
            let at = &readings.values[time_index(&o.read)];
            let r = &at[self.first[k]];
            let acc = &mut accs[k];
            match (&o.read, r) {
                (ReadSpec::Window(_, _, _, how), Reading::Colors(c)) => {
                    let universe = match o.kind {
                        ValueKind::Set { universe } => universe,
                        _ => 0,
                    };
                    set_elements(
                        c,
                        *how,
                        o.threshold,
                        o.map,
                        universe,
                        self.spec,
                        &mut self.scratch,
                    );
                    acc.add_set(&self.scratch);
                }
                (ReadSpec::Position(..), Reading::Positions(p)) => {
                    acc.add_scalar((p.first().copied().unwrap_or(0) as f64 + o.shift) * o.scale)
                }
                (ReadSpec::Arrangement(_), Reading::Colors(c)) => {
                    self.seq.clear();
                    self.seq.extend(c.iter().map(|&x| self.spec.to_user(x)));
                    acc.add_sequence(&self.seq);
                }
                (ReadSpec::InverseArrangement(_), Reading::Colors(c)) => {
                    self.seq.clear();
                    self.seq.resize(c.len(), 0);
                    for (site, &x) in c.iter().enumerate() {
                        let class = self.spec.to_user(x) as usize;
                        if (1..=c.len()).contains(&class) {
                            self.seq[class - 1] = site as u32 + 1;
                        }
                    }
                    acc.add_sequence(&self.seq);
                }
                (ReadSpec::Current(..) | ReadSpec::HeightExcl(..), Reading::Count(v)) => {
                    acc.add_scalar((*v as f64 + o.shift) * o.scale)
                }
                (ReadSpec::Swapped(..), Reading::Flag(f)) => acc.add_event(*f),
                (ReadSpec::Attempted(..), Reading::Flag(f)) => {
                    let other = matches!(at.get(self.first[k] + 1), Some(Reading::Flag(true)));
                    acc.add_event(*f || other)
                }
                _ => {}
            }
        }
    }
}
