//! The model-family boundary: everything the scenario layer needs from a family of models, behind
//! one trait, with one dispatch ([`ModelKind::family`]).
//!
//! A family (the colored six-vertex model, multi-species exclusion, those to come) resolves its own
//! read-outs, builds its own sampler, computes its own exact laws (or says why it has none) and
//! prices its own samples. The rest of the crate — planning, running, exact decisions, cost — talks
//! to [`ModelFamily`] only, so a new family is a new module, a [`ModelKind`] variant and a
//! [`ReadSpec`] variant; the compiler then names the one dispatch that must learn it.
//!
//! Matches over families, read-outs and claim kinds have no catch-all arm, so a match that forgets a
//! variant does not compile (`tests/no_catch_all.rs` keeps the boundary files free of `_ =>`):
//!
//! ```compile_fail
//! use motley_scenario::scenario::SixVertexRead;
//!
//! // Forgets `Row`, `Column`, `Height`, `ExitColumn` and `ExitPermutation`: error E0004.
//! fn exits_only(r: SixVertexRead) -> bool {
//!     match r {
//!         SixVertexRead::Top(_) | SixVertexRead::Right(_) => true,
//!     }
//! }
//! ```
//!
//! Monte Carlo and exact mode read an observable through the same function of each family: it turns
//! what the family sees (one sample's read-out, or one outcome of the exact law) into a [`Value`].
//! Monte Carlo feeds values to accumulators; exact mode turns them into [`ValueKey`]s and adds up
//! probabilities.

use motley_colorblind::Color;

use crate::checker::Checker;
use crate::error::ScenarioError;
use crate::raw::RawRead;
use crate::scenario::{
    ModelKind, ModelSpec, ObservableSpec, Profile, ReadSpec, Scenario, ValueKind,
};

/// One observable's value in one sample, borrowed from the reader's buffers.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Value<'a> {
    /// A set: its elements, increasing.
    Set(&'a [usize]),
    /// A number.
    Number(f64),
    /// An event.
    Event(bool),
    /// A sequence of classes or sites.
    Sequence(&'a [u32]),
    /// Several numbers read from one sample.
    Tuple(&'a [f64]),
}

impl Value<'_> {
    /// The owned, ordered form of the value (for exact laws).
    pub fn key(&self) -> ValueKey {
        match *self {
            Value::Set(e) => ValueKey::Set(e.to_vec()),
            Value::Number(x) => ValueKey::Number(Real(x)),
            Value::Event(b) => ValueKey::Event(b),
            Value::Sequence(s) => ValueKey::Sequence(s.to_vec()),
            Value::Tuple(t) => ValueKey::Tuple(t.iter().map(|&x| Real(x)).collect()),
        }
    }
}

/// Buffers a [`Value`] may borrow, kept by a reader between samples so that reading allocates
/// nothing once warm.
#[derive(Debug, Default)]
pub struct ValueBuffers {
    /// A set's elements.
    pub set: Vec<usize>,
    /// A sequence.
    pub sequence: Vec<u32>,
    /// A tuple.
    pub tuple: Vec<f64>,
}

/// A number ordered by [`f64::total_cmp`], so that values can key a law.
#[derive(Debug, Clone, Copy, serde::Serialize, serde::Deserialize)]
#[serde(transparent)]
pub struct Real(pub f64);

impl PartialEq for Real {
    fn eq(&self, other: &Self) -> bool {
        self.0.total_cmp(&other.0).is_eq()
    }
}
impl Eq for Real {}
impl std::hash::Hash for Real {
    fn hash<H: std::hash::Hasher>(&self, state: &mut H) {
        // Equal under `total_cmp` exactly when the bits are equal.
        self.0.to_bits().hash(state);
    }
}
impl PartialOrd for Real {
    fn partial_cmp(&self, other: &Self) -> Option<std::cmp::Ordering> {
        Some(self.cmp(other))
    }
}
impl Ord for Real {
    fn cmp(&self, other: &Self) -> std::cmp::Ordering {
        self.0.total_cmp(&other.0)
    }
}

/// An owned [`Value`], ordered: an outcome of an exact law.
#[derive(Debug, Clone, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum ValueKey {
    /// A set: its elements, increasing.
    Set(Vec<usize>),
    /// A number.
    Number(Real),
    /// An event.
    Event(bool),
    /// A sequence.
    Sequence(Vec<u32>),
    /// Several numbers.
    Tuple(Vec<Real>),
}

/// The exact law of one observable: outcomes with probabilities, sorted by outcome, and a bound on
/// the numerical error of the probabilities (0 for laws computed in rationals).
#[derive(Debug, Clone, PartialEq)]
pub struct ObservableLaw {
    /// `(outcome, probability)`, sorted by outcome, each outcome once.
    pub cells: Vec<(ValueKey, f64)>,
    /// Bound on the total absolute error of the probabilities.
    pub error: f64,
}

impl ObservableLaw {
    /// Collects `(outcome, probability)` pairs (outcomes may repeat) into a law.
    pub fn collect(cells: impl IntoIterator<Item = (ValueKey, f64)>, error: f64) -> Self {
        let mut m = std::collections::BTreeMap::new();
        for (k, p) in cells {
            *m.entry(k).or_insert(0.0) += p;
        }
        ObservableLaw {
            cells: m.into_iter().collect(),
            error,
        }
    }
}

/// An exact law in rationals (only families whose parameters were all written as fractions).
pub type RationalLaw = motley_sixvertex::ExactLaw<ValueKey, num_rational::BigRational>;

/// The exact joint law of several observables: outcomes are lists of values, sorted, each once.
#[derive(Debug, Clone, PartialEq)]
pub struct JointLaw {
    /// `(values, probability)`.
    pub cells: Vec<(Vec<ValueKey>, f64)>,
    /// Bound on the total absolute error of the probabilities.
    pub error: f64,
}

/// A joint exact law in rationals.
pub type RationalJointLaw = motley_sixvertex::ExactLaw<Vec<ValueKey>, num_rational::BigRational>;

/// A sampler of one unit: draws sample `index` under `seed` and reads each of the unit's
/// observables (in the order they were given) into `out`.
pub trait UnitSampler {
    /// Draws one sample and reports the value of observable `k` (its position in the unit) as
    /// `out(k, value)`.
    fn sample(&mut self, seed: u64, index: u64, out: &mut dyn FnMut(usize, Value<'_>));
}

/// What a read-out's resolution needs to know about its model and the file.
pub struct ReadContext<'a> {
    /// Located checks of the file.
    pub(crate) checker: &'a Checker<'a>,
    /// Key path of the `read` block.
    pub path: &'a str,
    /// The model read.
    pub model: &'a ModelSpec,
}

impl ReadContext<'_> {
    /// Largest class number in the file's own numbers.
    pub fn user_max(&self) -> Color {
        let m = self.model;
        m.relabel.map(|r| r.classes()).unwrap_or(m.max_color)
    }

    /// A class or color number of the file at `path`, as an engine color, checked against the
    /// model's range.
    ///
    /// # Errors
    /// A located message when `c` is not a color of the model.
    pub fn class(&self, path: &str, c: i64) -> Result<Color, ScenarioError> {
        let user_max = self.user_max();
        if c < 1 || c > i64::from(user_max) {
            return Err(self.checker.error(
                path,
                format!("must be a color of this model, in [1, {user_max}], got {c}"),
            ));
        }
        Ok(match self.model.relabel {
            Some(r) => r.map(c as Color).expect("checked range"),
            None => c as Color,
        })
    }

    /// A located error at `path`.
    pub fn error(&self, path: &str, message: impl Into<String>) -> ScenarioError {
        self.checker.error(path, message)
    }

    /// The value kind of a set read as colors (universe: the model's colors) or positions.
    pub fn set_kind(&self, how: crate::scenario::SetRead, positions: usize) -> ValueKind {
        match how {
            crate::scenario::SetRead::Colors => ValueKind::Set {
                universe: self.user_max().max(1) as usize,
            },
            crate::scenario::SetRead::Positions => ValueKind::Set {
                universe: positions,
            },
        }
    }

    /// The refusal of a read-out that belongs to another family.
    pub fn wrong_family(&self, family: &dyn ModelFamily, raw: &RawRead) -> ScenarioError {
        self.checker.error(
            self.path,
            format!(
                "`{}` is not a read-out of a {} model (its read-outs: {})",
                raw.name(),
                family.name(),
                family.read_names()
            ),
        )
    }
}

/// A family of models, as the scenario layer sees it.
pub trait ModelFamily {
    /// The family's key in scenario files (`six-vertex`, `exclusion`).
    fn name(&self) -> &'static str;

    /// Its read-out keys, for messages.
    fn read_names(&self) -> &'static str;

    /// Resolves a read-out of this family: the read-out and the kind of value it yields.
    ///
    /// # Errors
    /// A located message for a read-out of another family or a coordinate out of range.
    fn resolve_read(
        &self,
        cx: &ReadContext,
        raw: &RawRead,
    ) -> Result<(ReadSpec, ValueKind), ScenarioError>;

    /// Whether a `threshold` applies to read-out `read`.
    fn takes_threshold(&self, read: &ReadSpec) -> bool;

    /// The sampler of a unit reading `observables` from model `model` (which is of this family).
    ///
    /// # Errors
    /// The engine's message if it refuses the parameters (validation should have caught it).
    fn sampler<'a>(
        &'a self,
        model: &'a ModelSpec,
        observables: Vec<&'a ObservableSpec>,
    ) -> Result<Box<dyn UnitSampler + 'a>, String>;

    /// The time at which read-out `read` is censored (a first time that had not come yet reads as
    /// this time), if it is a censored hitting time.
    fn censored_at(&self, read: &ReadSpec) -> Option<f64>;

    /// Why observable `o` has no exact law here (`None`: it has one).
    fn exact_obstacle(&self, model: &ModelSpec, o: &ObservableSpec) -> Option<String>;

    /// Why observable `o` cannot be sampled by Monte Carlo here (`None`: it can). Most read-outs
    /// can; an exclusion read at `stationary` needs TASEP (multiline queues).
    fn sampling_obstacle(&self, _model: &ModelSpec, _o: &ObservableSpec) -> Option<String> {
        None
    }

    /// Why the observables `parts` (each with an exact law) have no exact joint law here.
    fn joint_obstacle(&self, model: &ModelSpec, parts: &[&ObservableSpec]) -> Option<String>;

    /// The exact joint law of the values of `observables` (all of model `model`, all read-outs of
    /// this family) in floating point: each outcome is the list of their values.
    ///
    /// # Errors
    /// A message when the engine cannot compute it (size limits).
    fn exact_joint_law(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Result<JointLaw, String>;

    /// The same joint law in rationals, when every parameter is a fraction and the family computes
    /// in rationals.
    fn rational_joint_law(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Option<RationalJointLaw>;

    /// Seconds of one core per sample, and the bytes of state one sampler keeps.
    fn cost_per_sample(&self) -> (f64, f64);

    /// The first site of a `positions` window read (the site of element 1), for tails read from a
    /// profile; `None` when `read` is no such window.
    fn window_origin(&self, read: &ReadSpec) -> Option<i64>;

    /// The value the named `profile` predicts for the mean of observable `o` (its shift, scale and
    /// base applied as the profile allows); `None` when the profile does not apply to this
    /// family's read-out of `o`.
    ///
    /// # Errors
    /// Why the profile does not apply to this model (its boundary or initial data).
    fn profile_value(
        &self,
        profile: Profile,
        model: &ModelSpec,
        o: &ObservableSpec,
    ) -> Result<Option<f64>, String>;
}

/// The number a component value of a combination stands for (components are numbers; validation
/// refuses anything else).
fn number_of(v: &ValueKey) -> f64 {
    match v {
        ValueKey::Number(x) => x.0,
        ValueKey::Event(b) => f64::from(u8::from(*b)),
        ValueKey::Set(_) | ValueKey::Sequence(_) | ValueKey::Tuple(_) => f64::NAN,
    }
}

/// The observables the family reads for observable `o`: itself, or a combination's components.
pub fn read_by_family(s: &Scenario, o: usize) -> Vec<usize> {
    match &s.observables[o].read {
        ReadSpec::Combined(c) => c.components(),
        ReadSpec::SixVertex(_) | ReadSpec::Exclusion(_) => vec![o],
    }
}

/// The model of observable `o` and the observables its family reads for it.
fn family_parts(s: &Scenario, o: usize) -> (&ModelSpec, Vec<&ObservableSpec>) {
    let parts = read_by_family(s, o)
        .into_iter()
        .map(|c| &s.observables[c])
        .collect();
    (&s.models[s.observables[o].model], parts)
}

/// Why observable `o` of `s` has no exact law here (`None`: it has one); a combination has one
/// when all its components have.
pub fn exact_obstacle(s: &Scenario, o: usize) -> Option<String> {
    let (m, parts) = family_parts(s, o);
    let family = m.kind.family();
    parts
        .iter()
        .find_map(|obs| family.exact_obstacle(m, obs))
        .or_else(|| family.joint_obstacle(m, &parts))
}

/// Why observable `o` of `s` cannot be sampled by Monte Carlo (`None`: it can); a combination
/// cannot when one of its components cannot.
pub fn sampling_obstacle(s: &Scenario, o: usize) -> Option<String> {
    let (m, parts) = family_parts(s, o);
    let family = m.kind.family();
    parts
        .iter()
        .find_map(|obs| family.sampling_obstacle(m, obs))
}

/// The exact law of observable `o` of `s` in floating point: a read-out's, or a combination's from
/// the joint law of its components, through the same [`Combination::value`] as Monte Carlo.
///
/// # Errors
/// The family's message when the engine cannot compute it.
pub fn exact_law(s: &Scenario, o: usize) -> Result<ObservableLaw, String> {
    let obs = &s.observables[o];
    let (m, parts) = family_parts(s, o);
    let joint = m.kind.family().exact_joint_law(m, &parts)?;
    let mut buf = Vec::new();
    Ok(ObservableLaw::collect(
        joint
            .cells
            .into_iter()
            .map(|(v, p)| (combined_key(obs, v, &mut buf), p)),
        joint.error,
    ))
}

/// The exact law of observable `o` of `s` in rationals, when its family computes one.
pub fn rational_law(s: &Scenario, o: usize) -> Option<RationalLaw> {
    let obs = &s.observables[o];
    let (m, parts) = family_parts(s, o);
    let joint = m.kind.family().rational_joint_law(m, &parts)?;
    let mut buf = Vec::new();
    Some(joint.map(|v| combined_key(obs, v.clone(), &mut buf)))
}

/// The value of observable `obs` from the values `v` of what its family read for it.
fn combined_key(obs: &ObservableSpec, mut v: Vec<ValueKey>, buf: &mut Vec<f64>) -> ValueKey {
    match &obs.read {
        ReadSpec::Combined(c) => {
            let x: Vec<f64> = v.iter().map(number_of).collect();
            c.value(&x, |y| obs.number(y), buf).key()
        }
        ReadSpec::SixVertex(_) | ReadSpec::Exclusion(_) => v.swap_remove(0),
    }
}

impl ModelKind {
    /// The family behind this model: the one dispatch over families.
    pub fn family(&self) -> &dyn ModelFamily {
        match self {
            ModelKind::SixVertex(sv) => sv,
            ModelKind::Exclusion(e) => e,
        }
    }
}
