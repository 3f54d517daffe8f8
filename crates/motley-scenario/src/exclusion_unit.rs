//! The exclusion process behind a sampling unit: building the engine from the validated spec and
//! reading every observable of the unit from one sample.

use motley_exclusion::{
    FiniteLattice, FiniteProcess, FiniteSystem, LineData, LineProcess, Rates, ReadoutPlan,
};

use crate::exclusion_family::{read, read_of, readouts, time_index};
use crate::family::{UnitSampler, Value, ValueBuffers};
use crate::scenario::{ExclusionSpec, InitialSpec, LatticeSpec, ModelSpec, ObservableSpec};

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

/// One exclusion unit, ready to sample.
pub(crate) struct ExclusionUnit<'a> {
    process: Process,
    plan: ReadoutPlan,
    spec: &'a ModelSpec,
    observables: Vec<&'a ObservableSpec>,
    /// First engine read-out of each observable.
    first: Vec<usize>,
    scratch: ValueBuffers,
}

impl<'a> ExclusionUnit<'a> {
    /// Builds the engine and the read-out plan covering `observables`.
    pub(crate) fn new(
        spec: &'a ModelSpec,
        e: &ExclusionSpec,
        observables: Vec<&'a ObservableSpec>,
    ) -> Result<Self, String> {
        let process = build(e)?;
        let n = e.sites();
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
            scratch: ValueBuffers::default(),
        })
    }
}

impl UnitSampler for ExclusionUnit<'_> {
    fn sample(&mut self, seed: u64, index: u64, out: &mut dyn FnMut(usize, Value<'_>)) {
        let readings = match &self.process {
            Process::Finite(p) => p.sample(seed, index, &self.plan),
            Process::Line(p) => p.sample(seed, index, &self.plan),
        };
        for (k, o) in self.observables.iter().enumerate() {
            let at = &readings.values[time_index(read_of(o))];
            out(k, read(self.spec, o, at, self.first[k], &mut self.scratch));
        }
    }
}
