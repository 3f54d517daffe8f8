//! The validated scenario: every number checked, every name resolved, colors in motley's own order.
//!
//! Colors here always follow the engines' convention (0 empty, larger stronger). A model written with
//! `strength: smaller-wins` has had its numbers reversed by [`motley_colorblind::Relabel`] during
//! validation; [`ModelSpec::to_user`] turns engine colors back into the file's numbers for reports.

use motley_colorblind::{Color, IndexMap, Relabel};

/// Exact mode of a claim.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ExactMode {
    /// Exact laws when the system is small enough.
    Auto,
    /// Exact laws, or refuse the scenario.
    On,
    /// Monte Carlo only.
    Off,
}

/// A probability or rate, with its rational form when the file gave one.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Number {
    /// The value.
    pub value: f64,
    /// `(numerator, denominator)` when written as `"p/q"` or as an integer.
    pub rational: Option<(i64, i64)>,
}

/// The whole validated scenario.
#[derive(Debug, Clone)]
pub struct Scenario {
    /// Report folder name.
    pub name: String,
    /// Title.
    pub title: String,
    /// Free text.
    pub description: String,
    /// Scenario seed.
    pub seed: u64,
    /// Samples per side.
    pub samples: u64,
    /// Significance level.
    pub alpha: f64,
    /// Power used to quote the detectable difference.
    pub power: f64,
    /// How the claims' verdicts are controlled together.
    pub error_control: crate::result::ErrorControl,
    /// Planned looks of a sequential run (samples per side, increasing, the last = `samples`);
    /// `None` for one look at `samples`.
    pub looks: Option<Vec<u64>>,
    /// Models in file order.
    pub models: Vec<ModelSpec>,
    /// Observables in file order.
    pub observables: Vec<ObservableSpec>,
    /// Claims in file order.
    pub claims: Vec<ClaimSpec>,
    /// SHA-256 of the file's bytes, hex.
    pub hash: String,
}

/// A named model.
#[derive(Debug, Clone)]
pub struct ModelSpec {
    /// Name in the file.
    pub name: String,
    /// The model.
    pub kind: ModelKind,
    /// The reversal applied to the file's numbers, if `strength: smaller-wins`.
    pub relabel: Option<Relabel>,
    /// Largest color present (engine order).
    pub max_color: Color,
}

impl ModelSpec {
    /// An engine color in the file's own numbers.
    pub fn to_user(&self, c: Color) -> Color {
        match self.relabel {
            Some(r) => r.map(c).unwrap_or(c),
            None => c,
        }
    }
}

/// The models motley knows.
#[derive(Debug, Clone)]
pub enum ModelKind {
    /// Colored stochastic six-vertex model on a rectangle.
    SixVertex(SixVertexSpec),
    /// Multi-species ASEP.
    Exclusion(ExclusionSpec),
}

impl ModelKind {
    /// `six-vertex` or `exclusion`.
    pub fn name(&self) -> &'static str {
        match self {
            ModelKind::SixVertex(_) => "six-vertex",
            ModelKind::Exclusion(_) => "exclusion",
        }
    }
}

/// A six-vertex rectangle.
#[derive(Debug, Clone)]
pub struct SixVertexSpec {
    /// Columns.
    pub width: usize,
    /// Rows.
    pub height: usize,
    /// Straight-on probability of the stronger color from below.
    pub b1: Number,
    /// Straight-on probability of the stronger color from the left.
    pub b2: Number,
    /// Left boundary, row 1 first.
    pub left: BoundarySpec,
    /// Bottom boundary, column 1 first.
    pub bottom: BoundarySpec,
}

/// Boundary data along one side.
#[derive(Debug, Clone, PartialEq)]
pub enum BoundarySpec {
    /// Given colors (engine order).
    Fixed(Vec<Color>),
    /// Independent occupation with probability `density`; occupied edge `k` gets `colors[k]`.
    Bernoulli {
        /// Occupation probability.
        density: f64,
        /// Color edge `k` gets when occupied (engine order).
        colors: Vec<Color>,
    },
}

impl BoundarySpec {
    /// Colors an edge may carry (for ranges).
    pub fn colors(&self) -> &[Color] {
        match self {
            BoundarySpec::Fixed(c) => c,
            BoundarySpec::Bernoulli { colors, .. } => colors,
        }
    }
}

/// The lattice of an exclusion process.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LatticeSpec {
    /// Sites `1..=n`.
    Segment(usize),
    /// Sites `1..=n` in a circle.
    Ring(usize),
    /// ℤ.
    Line,
}

/// Initial data of an exclusion process (engine colors).
#[derive(Debug, Clone, PartialEq)]
pub enum InitialSpec {
    /// Site `k` of `1..=n` holds `colors[k − 1]`.
    Sites(Vec<Color>),
    /// ℤ: `left` on sites `< at`, `block` on `at..at+len`, `right` beyond.
    Line {
        /// Far-left color.
        left: Color,
        /// Far-right color.
        right: Color,
        /// Site of the block's first entry.
        at: i64,
        /// Block colors.
        block: Vec<Color>,
    },
}

/// An exclusion process.
#[derive(Debug, Clone)]
pub struct ExclusionSpec {
    /// Lattice.
    pub lattice: LatticeSpec,
    /// Right-swap rate of a stronger particle.
    pub p: Number,
    /// Left-swap rate of a stronger particle.
    pub q: Number,
    /// Initial data.
    pub initial: InitialSpec,
    /// Whether the initial colors on a segment or ring are all distinct and nonzero.
    pub packed: bool,
    /// The read-out times, increasing, without repeats.
    pub times: Vec<f64>,
}

/// What kind of value an observable yields per sample.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ValueKind {
    /// A subset of `{1, …, universe}`.
    Set {
        /// Universe size.
        universe: usize,
    },
    /// A number (`integer`: its values are integers; `discrete`: its values are read from
    /// integers, possibly scaled, shifted or raised — a countable support, so the chi-square on the
    /// support decides same-law claims on it).
    Scalar {
        /// Integer-valued.
        integer: bool,
        /// Read from integers (also after `scale`, `shift`, `base`).
        discrete: bool,
    },
    /// True or false.
    Event,
    /// A sequence of `len` colors (an arrangement).
    Sequence {
        /// Length.
        len: usize,
    },
    /// `len` numbers read from one sample.
    Tuple {
        /// Number of components.
        len: usize,
    },
}

impl ValueKind {
    /// Whether results list the full law of values of this kind (sets, sequences, events and
    /// integers; real numbers are described by their empirical CDF instead).
    pub fn has_full_law(&self) -> bool {
        match self {
            ValueKind::Set { .. }
            | ValueKind::Event
            | ValueKind::Sequence { .. }
            | ValueKind::Tuple { .. } => true,
            ValueKind::Scalar { integer, .. } => *integer,
        }
    }

    /// The same kind after a modifier that keeps the values countable but not integer (`scale`,
    /// a fractional `shift`, `base`).
    pub fn no_longer_integer(self) -> Self {
        match self {
            ValueKind::Scalar { discrete, .. } => ValueKind::Scalar {
                integer: false,
                discrete,
            },
            ValueKind::Set { .. }
            | ValueKind::Event
            | ValueKind::Sequence { .. }
            | ValueKind::Tuple { .. } => self,
        }
    }

    /// Short name for messages.
    pub fn describe(&self) -> String {
        match self {
            ValueKind::Set { universe } => format!("a set in {{1, …, {universe}}}"),
            ValueKind::Scalar { .. } => "a number".into(),
            ValueKind::Event => "an event".into(),
            ValueKind::Sequence { len } => format!("a sequence of {len} classes"),
            ValueKind::Tuple { len } => format!("a tuple of {len} numbers"),
        }
    }
}

/// Whether a set is read as colors or positions.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SetRead {
    /// Colors present (universe: colors `1..=max_color`, in the file's numbers).
    Colors,
    /// Occupied positions (universe: the edges or sites read).
    Positions,
}

/// A read-out, resolved (engine colors, 1-based coordinates): one variant per model family, each
/// family's own read-outs inside.
#[derive(Debug, Clone, PartialEq)]
pub enum ReadSpec {
    /// A read-out of a six-vertex model.
    SixVertex(SixVertexRead),
    /// A read-out of an exclusion process.
    Exclusion(ExclusionRead),
    /// Numbers of other observables of the same model, combined sample by sample.
    Combined(Combination),
}

pub use crate::combination::{Combination, Operand, Relation};

pub use crate::exclusion_family::ExclusionRead;
pub use crate::six_vertex_family::SixVertexRead;

/// An observable.
#[derive(Debug, Clone)]
pub struct ObservableSpec {
    /// Name.
    pub name: String,
    /// Index of its model.
    pub model: usize,
    /// The read-out.
    pub read: ReadSpec,
    /// Threshold projection (engine color), for position reads, heights and currents.
    pub threshold: Option<Color>,
    /// Index map applied to sets.
    pub map: IndexMap,
    /// Factor applied to scalars (after the shift).
    pub scale: f64,
    /// Added to scalars before the factor.
    pub shift: f64,
    /// Raised to the shifted and scaled number, when given.
    pub base: Option<f64>,
    /// Kind of value.
    pub kind: ValueKind,
}

impl ObservableSpec {
    /// A raw number of a read-out turned into this observable's value: `(x + shift) × scale`,
    /// then `base` raised to it when a base is given.
    pub fn number(&self, x: f64) -> f64 {
        let v = (x + self.shift) * self.scale;
        match self.base {
            Some(b) => b.powf(v),
            None => v,
        }
    }
}

/// An explicit law of an observable: outcomes with probabilities (sorted by outcome, each once).
#[derive(Debug, Clone, PartialEq)]
pub struct TableLaw {
    /// `(outcome, probability)`.
    pub cells: Vec<(crate::family::ValueKey, f64)>,
    /// The same probabilities in rationals, when every one was written as a fraction or integer.
    pub rational: Option<Vec<num_rational::BigRational>>,
}

/// A reference law.
#[derive(Debug, Clone, PartialEq)]
pub enum ReferenceSpec {
    /// Uniform on `[a, b]`.
    Uniform(f64, f64),
    /// Normal.
    Normal(f64, f64),
    /// Tail read from a profile observable: `P(X ≥ x) = E[1{x occupied}]`.
    TailFromProfile(usize),
    /// Tracy–Widom GUE (F₂).
    TracyWidomGue,
    /// Tracy–Widom GOE (F₁).
    TracyWidomGoe,
    /// Exit speed of the six-vertex second-class path: P(v > s) = (κ − √(κs))/(κ − 1) on
    /// [1/κ, κ], κ > 1.
    SixVertexExitSpeed(f64),
    /// An explicit law given in the file.
    Table(TableLaw),
}

/// What a claim says.
#[derive(Debug, Clone, PartialEq)]
pub enum ClaimKind {
    /// Two observables have the same law.
    SameLaw(usize, usize),
    /// A scalar observable follows a reference law.
    LawOf(usize, ReferenceSpec),
    /// An event's probability, optionally equal to a value.
    Probability(usize, Option<f64>),
    /// No claim: describe the law, optionally beside a reference law or a limiting value.
    Describe(usize, Option<ReferenceSpec>, Option<f64>),
    /// No claim: how a run of observables changes along a parameter, beside a theory.
    Series(SeriesSpec),
    /// No claim: the joint law of two numbers of one model, optionally beside a limit law.
    Joint(usize, usize, Option<JointReference>),
    /// The mean of a number, optionally equal to a value.
    Mean(usize, Option<f64>),
}

/// A `series` claim: observables indexed by a parameter (a time, a size, a position).
#[derive(Debug, Clone, PartialEq)]
pub struct SeriesSpec {
    /// The observables, all numbers or all events, in the order of `at`.
    pub observables: Vec<usize>,
    /// The parameter value of each observable, increasing.
    pub at: Vec<f64>,
    /// The parameter's name for axes and tables.
    pub axis: String,
    /// Numbers: a law each one is drawn against (Kolmogorov distance per point).
    pub reference: Option<ReferenceSpec>,
    /// A limiting value: of the mean (numbers) or of the probability (events).
    pub limit: Option<f64>,
    /// Numbers: a named profile giving the predicted value at each observable's coordinates.
    pub profile: Option<ProfileSpec>,
}

/// The named profiles: functions of a model's parameters and a read-out's coordinates that predict
/// the mean of an observable.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Profile {
    /// The six-vertex step-boundary limit shape, L·h(x/L, y/L).
    SixVertexStepHeight,
    /// Particles right of x at time t from TASEP/ASEP step data.
    TasepStepCount,
    /// E q^H(x, y) under the step boundary, q = b1/b2, by the four-point recursion.
    SixVertexQMoment,
}

impl Profile {
    /// Every profile, in the order messages list them.
    pub const ALL: [Profile; 3] = [
        Profile::SixVertexStepHeight,
        Profile::TasepStepCount,
        Profile::SixVertexQMoment,
    ];

    /// The profile's name in files.
    pub fn name(self) -> &'static str {
        match self {
            Profile::SixVertexStepHeight => "six-vertex-step-height",
            Profile::TasepStepCount => "tasep-step-count",
            Profile::SixVertexQMoment => "six-vertex-q-moment",
        }
    }

    /// The read-out the profile needs, in words, for messages.
    pub fn needs(self) -> &'static str {
        match self {
            Profile::SixVertexStepHeight => "a six-vertex `height` read without `base`",
            Profile::TasepStepCount => "an exclusion `height` read without `base`",
            Profile::SixVertexQMoment => {
                "a six-vertex `height` read with `base` equal to q = b1/b2 and no `shift` or `scale`"
            }
        }
    }
}

/// A named profile, resolved per observable into predicted values.
#[derive(Debug, Clone, PartialEq)]
pub struct ProfileSpec {
    /// The registry name (`six-vertex-step-height`, `tasep-step-count`).
    pub name: String,
    /// The predicted value at each observable of the series, after `shift` and `scale`.
    pub values: Vec<f64>,
}

/// A limit law for a `joint` claim.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum JointReference {
    /// The TASEP speed process: the joint law of the speeds of the particles started at 0 and 1
    /// from the packed start (Amir, Angel and Valkó 2011).
    SpeedProcessPair,
}

/// A claim.
#[derive(Debug, Clone)]
pub struct ClaimSpec {
    /// Identifier.
    pub id: String,
    /// The claim in words.
    pub says: String,
    /// What it says.
    pub kind: ClaimKind,
    /// Exact mode.
    pub exact: ExactMode,
    /// The tolerance `ε` within which equality is confirmed, if stated.
    pub tolerance: Option<f64>,
}
