//! The exclusion process behind a sampling unit: building the engine from the validated spec and
//! reading every observable of the unit from one sample.

use motley_exclusion::{
    FiniteLattice, FiniteProcess, FiniteSystem, LineData, LineProcess, Rates, Reading, Readout,
    ReadoutPlan, StationarySampler,
};

use crate::exclusion_family::{read, read_of, reading_of_arrangement, readouts, time_index};
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
    /// The plan of the read-outs at finite times (`None`: every observable is stationary).
    plan: Option<ReadoutPlan>,
    /// Multiline queues and the engine read-outs of the stationary observables, when any.
    stationary: Option<(StationarySampler, Vec<Readout>)>,
    /// Whether each observable reads the stationary law.
    at_stationary: Vec<bool>,
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
        // Finite times keep their indices: `stationary` (infinite) sorts last.
        let finite: Vec<f64> = e.times.iter().copied().filter(|t| t.is_finite()).collect();
        let (mut all, mut still) = (Vec::new(), Vec::new());
        let mut first = Vec::new();
        let mut at_stationary = Vec::new();
        for o in &observables {
            let s = e.times[time_index(read_of(o))].is_infinite();
            let list = if s { &mut still } else { &mut all };
            first.push(list.len());
            list.extend(readouts(o, n));
            at_stationary.push(s);
        }
        let plan = if all.is_empty() {
            None
        } else {
            Some(
                match &process {
                    Process::Finite(p) => p.plan(&finite, all),
                    Process::Line(p) => p.plan(&finite, all),
                }
                .map_err(|x| x.to_string())?,
            )
        };
        let stationary = match (&process, still.is_empty()) {
            (_, true) => None,
            (Process::Finite(p), false) => Some((
                StationarySampler::new(p.system(), &p.rates()).map_err(|x| {
                    format!("{x}: stationary samples are drawn by multiline queues (TASEP on a ring); for ASEP decide the claim exactly (`exact: on`) on a ring small enough")
                })?,
                still,
            )),
            (Process::Line(_), false) => return Err("`stationary` needs a ring".into()),
        };
        Ok(ExclusionUnit {
            process,
            plan,
            stationary,
            at_stationary,
            spec,
            observables,
            first,
            scratch: ValueBuffers::default(),
        })
    }
}

impl UnitSampler for ExclusionUnit<'_> {
    fn sample(&mut self, seed: u64, index: u64, out: &mut dyn FnMut(usize, Value<'_>)) {
        let readings = self.plan.as_ref().map(|plan| match &self.process {
            Process::Finite(p) => p.sample(seed, index, plan),
            Process::Line(p) => p.sample(seed, index, plan),
        });
        // A stationary arrangement read like an exact law's outcome (window, position,
        // arrangement, configuration and height do not look at the initial data).
        let still: Vec<Reading> = match &self.stationary {
            Some((sampler, list)) => {
                let now = sampler.sample(seed, index);
                list.iter()
                    .map(|r| reading_of_arrangement(r, &now, &now).unwrap_or(Reading::Count(0)))
                    .collect()
            }
            None => Vec::new(),
        };
        for (k, o) in self.observables.iter().enumerate() {
            let at: &[Reading] = if self.at_stationary[k] {
                &still
            } else {
                match &readings {
                    Some(r) => &r.values[time_index(read_of(o))],
                    None => &[],
                }
            };
            out(k, read(self.spec, o, at, self.first[k], &mut self.scratch));
        }
    }
}
