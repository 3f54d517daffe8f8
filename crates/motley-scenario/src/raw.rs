//! The raw scenario: a serde mirror of the YAML file, before any range check.
//!
//! Every struct rejects unknown keys. Names are kebab-case in the file. Nothing here is trusted: the
//! validated form lives in [`crate::scenario`], built by [`crate::validate`].

use indexmap::IndexMap;
use serde::{Deserialize, Serialize};

/// The whole file.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawScenario {
    /// Short name: the report folder's name. Letters, digits and `-`.
    pub name: String,
    /// One-line title for the report.
    #[serde(default)]
    pub title: Option<String>,
    /// Free text: the question in words.
    #[serde(default)]
    pub description: Option<String>,
    /// Scenario seed.
    pub seed: u64,
    /// Monte Carlo samples per side of each claim.
    pub samples: u64,
    /// Significance level of every verdict.
    #[serde(default)]
    pub alpha: Option<f64>,
    /// Power at which the detectable difference is quoted.
    #[serde(default)]
    pub power: Option<f64>,
    /// How the claims' verdicts are controlled together: `per-claim` (default) or
    /// `false-discovery-rate`.
    #[serde(default)]
    pub error_control: Option<RawErrorControl>,
    /// Sample counts per side at which a sequential run looks at its claims, increasing, each at
    /// most `samples` (`samples` itself is always the last look).
    #[serde(default)]
    pub looks: Option<Vec<u64>>,
    /// Exact mode for all claims: `auto`, `on` or `off`.
    #[serde(default)]
    pub exact: Option<RawExactMode>,
    /// Models, by name.
    pub models: IndexMap<String, RawModel>,
    /// Observables, by name.
    pub observables: IndexMap<String, RawObservable>,
    /// Claims, in order.
    #[serde(default)]
    pub claims: Vec<RawClaim>,
}

/// `error-control:` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawErrorControl {
    /// Each claim at `alpha` on its own.
    PerClaim,
    /// Benjamini–Hochberg across the scenario's tested claims.
    FalseDiscoveryRate,
}

/// `exact:` values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawExactMode {
    /// Exact laws when the system is small enough, Monte Carlo otherwise.
    Auto,
    /// Exact laws or an error.
    On,
    /// Monte Carlo always.
    Off,
}

/// A number given as a decimal or as a rational `"p/q"` string.
#[derive(Debug, Clone, PartialEq, Deserialize, Serialize)]
#[serde(untagged)]
pub enum RawNumber {
    /// A decimal.
    Float(f64),
    /// A rational written `"p/q"` (or an integer string).
    Text(String),
}

/// Which order of colors is "stronger" in the file's own numbers.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawStrength {
    /// Larger numbers are stronger (motley's own convention; the default).
    LargerWins,
    /// Smaller positive numbers are stronger (class 1 strongest); 0 is still empty.
    SmallerWins,
}

/// One model.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawModel {
    /// The colored stochastic six-vertex model on a rectangle.
    SixVertex(RawSixVertex),
    /// Multi-species ASEP in continuous time.
    Exclusion(RawExclusion),
}

/// `six-vertex:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawSixVertex {
    /// Columns.
    pub width: i64,
    /// Rows.
    pub height: i64,
    /// Probability that the stronger color coming from below continues up.
    pub b1: RawNumber,
    /// Probability that the stronger color coming from the left continues right.
    pub b2: RawNumber,
    /// Colors entering the rows from the left (row 1 at the bottom).
    pub left: RawBoundary,
    /// Colors entering the columns from below (column 1 at the left).
    pub bottom: RawBoundary,
    /// Color order of the numbers in this block.
    #[serde(default)]
    pub strength: Option<RawStrength>,
}

/// Boundary data along one side.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawBoundary {
    /// Edge `k` carries color `k`.
    Rainbow,
    /// No paths.
    Empty,
    /// Every edge carries this color.
    Step(i64),
    /// Explicit colors, edge 1 first.
    List(Vec<i64>),
    /// Edges `1..=first` carry `color`, the rest `rest`.
    Blocks(RawBlocks),
    /// Each edge occupied independently with probability `density`.
    Bernoulli(RawBernoulli),
}

/// `blocks:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawBlocks {
    /// Number of edges in the first block.
    pub first: i64,
    /// Color of the first block.
    pub color: i64,
    /// Color of the other edges.
    pub rest: i64,
}

/// `bernoulli:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawBernoulli {
    /// Occupation probability.
    pub density: f64,
    /// Color of an occupied edge: a number, or `rainbow` (edge `k` gets `k`).
    pub color: RawColorRule,
}

/// Color of an occupied random edge.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case", untagged)]
pub enum RawColorRule {
    /// One color for all.
    Fixed(i64),
    /// `rainbow`: edge `k` gets color `k`.
    Named(String),
}

/// `exclusion:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawExclusion {
    /// `{segment: n}`, `{ring: n}` or `line`.
    pub lattice: RawLattice,
    /// Rate at which a stronger particle swaps with the weaker one on its right.
    pub p: RawNumber,
    /// Rate at which a stronger particle swaps with the weaker one on its left.
    pub q: RawNumber,
    /// Initial arrangement.
    pub initial: RawInitial,
    /// Color order of the numbers in this block.
    #[serde(default)]
    pub strength: Option<RawStrength>,
}

/// `lattice:` values.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawLattice {
    /// Sites `1..=n`, closed ends.
    Segment(i64),
    /// Sites `1..=n`, site `n` next to site 1.
    Ring(i64),
    /// The whole line ℤ.
    Line,
}

/// `initial:` values.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawInitial {
    /// Site `k` holds class `k` (segment and ring).
    Packed,
    /// Explicit colors, site 1 first (segment and ring).
    List(Vec<i64>),
    /// On the line: constant far left and far right, with an explicit block.
    Step(RawLineStep),
}

/// `step:` keys of a line's initial data.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawLineStep {
    /// Color of every site left of the block.
    pub left: i64,
    /// Color of every site right of the block.
    pub right: i64,
    /// Site of the block's first entry.
    #[serde(default)]
    pub at: Option<i64>,
    /// Colors of the block, in site order.
    #[serde(default)]
    pub block: Vec<i64>,
}

/// One observable.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawObservable {
    /// The model it reads.
    pub of: String,
    /// What it reads (or `combine`).
    #[serde(default)]
    pub read: Option<RawRead>,
    /// Numbers of other observables of the same model, combined per sample (or `read`).
    #[serde(default)]
    pub combine: Option<RawCombine>,
    /// Threshold projection before reading positions: colors ≥ this become paths.
    #[serde(default)]
    pub threshold: Option<i64>,
    /// Index map applied to a set: `identity`, `reflection` or `{shift: s}`.
    #[serde(default)]
    pub map: Option<RawIndexMap>,
    /// Multiply a scalar by this factor (after adding `shift`).
    #[serde(default)]
    pub scale: Option<f64>,
    /// Add this to a scalar before scaling: the value becomes `(value + shift) × scale`.
    #[serde(default)]
    pub shift: Option<f64>,
    /// Raise this base to the number (after `shift` and `scale`): the value becomes
    /// `base^((value + shift) × scale)`, e.g. `q^H` for a q-moment.
    #[serde(default)]
    pub base: Option<RawNumber>,
}

/// `combine:` values: observables of one model combined sample by sample.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawCombine {
    /// The numbers of several observables together (a joint value).
    Tuple(Vec<String>),
    /// The first number minus the second.
    Difference([String; 2]),
    /// The sum of two numbers.
    Sum([String; 2]),
    /// An event: a number compared with a constant or with another number.
    Compare(RawCompare),
}

/// `compare:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawCompare {
    /// The number on the left.
    pub left: String,
    /// The relation.
    pub relation: RawRelation,
    /// A number or the name of another number observable.
    pub right: RawOperand,
}

/// Relations of `compare`.
#[derive(Debug, Clone, Copy, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawRelation {
    /// `>`.
    GreaterThan,
    /// `<`.
    LessThan,
    /// `≥`.
    AtLeast,
    /// `≤`.
    AtMost,
    /// `=`.
    EqualTo,
}

/// The right side of `compare`.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(untagged)]
pub enum RawOperand {
    /// A constant.
    Number(f64),
    /// Another observable.
    Observable(String),
}

/// `map:` values.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawIndexMap {
    /// `k ↦ k`.
    Identity,
    /// `k ↦ n + 1 − k`.
    Reflection,
    /// `k ↦ k + s`.
    Shift(i64),
}

/// How a set is read from a row of edges or sites.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawSetKind {
    /// The set of colors found.
    Colors,
    /// The set of occupied positions (after `threshold`, if given).
    Positions,
}

/// `read:` values.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawRead {
    /// Six-vertex: the edges leaving through the top.
    Top(RawSetKind),
    /// Six-vertex: the edges leaving through the right side.
    Right(RawSetKind),
    /// Six-vertex: the vertical edges just above row `y`.
    Row(RawRowRead),
    /// Six-vertex: the horizontal edges just right of column `x`.
    Column(RawColumnRead),
    /// Six-vertex: the height function at `(x, y)`; exclusion: at site `x` and `time`.
    Height(RawHeightRead),
    /// Six-vertex: the column where a color leaves the top (0 if it leaves through the right).
    ExitColumn(i64),
    /// Six-vertex: the exit permutation (every boundary edge a distinct color 1 … W + H).
    ExitPermutation(RawPermutationRead),
    /// Six-vertex: where a color leaves, as (side, index): (0, column) through the top, (1, row)
    /// through the right side.
    ExitPlace(i64),
    /// Exclusion: the class on each site at `time`, holes 0 (any initial data on a segment or ring).
    Configuration(RawTimeRead),
    /// Exclusion: the first time two classes are in the opposite order (on a ring: one has
    /// overtaken the other), censored at `time`.
    SwapTime(RawPairRead),
    /// Exclusion: the first time one of two classes attempts a jump onto the other, censored at
    /// `time`.
    AttemptTime(RawPairRead),
    /// Exclusion: the net number of steps a class has moved by `time` (right +1; on a ring not
    /// reduced mod n).
    Displacement(RawPositionRead),
    /// Exclusion: sites `from..=to` at `time`.
    Window(RawWindowRead),
    /// Exclusion: the site of a class at `time`.
    Position(RawPositionRead),
    /// Exclusion: the arrangement position → class at `time`.
    Arrangement(RawTimeRead),
    /// Exclusion: the inverse arrangement class → position at `time`.
    InverseArrangement(RawTimeRead),
    /// Exclusion: net flux of colors ≥ `threshold` through the bond `(bond, bond + 1)` by `time`.
    Current(RawCurrentRead),
    /// Exclusion: whether two classes are in the opposite order at `time` than at 0.
    Swapped(RawPairRead),
    /// Exclusion: whether one of two classes ever attempted a jump onto the other by `time`.
    Attempted(RawPairRead),
}

impl RawRead {
    /// The read-out's time, for the read-outs that take one.
    pub fn time(&self) -> Option<RawTime> {
        match self {
            RawRead::Height(h) => h.time,
            RawRead::Window(w) => Some(w.time),
            RawRead::Position(p) => Some(p.time),
            RawRead::Arrangement(t)
            | RawRead::InverseArrangement(t)
            | RawRead::Configuration(t) => Some(t.time),
            RawRead::Current(c) => Some(c.time),
            RawRead::Swapped(p)
            | RawRead::Attempted(p)
            | RawRead::SwapTime(p)
            | RawRead::AttemptTime(p) => Some(p.time),
            RawRead::Displacement(p) => Some(p.time),
            RawRead::Top(_)
            | RawRead::Right(_)
            | RawRead::Row(_)
            | RawRead::Column(_)
            | RawRead::ExitColumn(_)
            | RawRead::ExitPermutation(_)
            | RawRead::ExitPlace(_) => None,
        }
    }

    /// The read-out's key in files.
    pub fn name(&self) -> &'static str {
        match self {
            RawRead::Top(_) => "top",
            RawRead::Right(_) => "right",
            RawRead::Row(_) => "row",
            RawRead::Column(_) => "column",
            RawRead::Height(_) => "height",
            RawRead::ExitColumn(_) => "exit-column",
            RawRead::ExitPermutation(_) => "exit-permutation",
            RawRead::ExitPlace(_) => "exit-place",
            RawRead::Configuration(_) => "configuration",
            RawRead::SwapTime(_) => "swap-time",
            RawRead::AttemptTime(_) => "attempt-time",
            RawRead::Displacement(_) => "displacement",
            RawRead::Window(_) => "window",
            RawRead::Position(_) => "position",
            RawRead::Arrangement(_) => "arrangement",
            RawRead::InverseArrangement(_) => "inverse-arrangement",
            RawRead::Current(_) => "current",
            RawRead::Swapped(_) => "swapped",
            RawRead::Attempted(_) => "attempted",
        }
    }
}

/// A read-out time: a number, or a named time (`stationary`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum RawTime {
    /// A time `t > 0`.
    At(f64),
    /// A named time.
    Named(RawNamedTime),
}

/// Named read-out times.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawNamedTime {
    /// The stationary law (exclusion on a ring): the limit `t → ∞`.
    Stationary,
}

impl RawTime {
    /// The time as a number: `f64::INFINITY` stands for `stationary`.
    pub fn value(self) -> f64 {
        match self {
            RawTime::At(t) => t,
            RawTime::Named(RawNamedTime::Stationary) => f64::INFINITY,
        }
    }
}

impl Serialize for RawTime {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        match self {
            RawTime::At(t) => s.serialize_f64(*t),
            RawTime::Named(n) => n.serialize(s),
        }
    }
}

impl<'de> Deserialize<'de> for RawTime {
    fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct Visitor;
        impl serde::de::Visitor<'_> for Visitor {
            type Value = RawTime;
            fn expecting(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
                f.write_str("a time: a number > 0 or `stationary`")
            }
            fn visit_f64<E: serde::de::Error>(self, v: f64) -> Result<RawTime, E> {
                Ok(RawTime::At(v))
            }
            fn visit_i64<E: serde::de::Error>(self, v: i64) -> Result<RawTime, E> {
                Ok(RawTime::At(v as f64))
            }
            fn visit_u64<E: serde::de::Error>(self, v: u64) -> Result<RawTime, E> {
                Ok(RawTime::At(v as f64))
            }
            fn visit_str<E: serde::de::Error>(self, v: &str) -> Result<RawTime, E> {
                match v {
                    "stationary" => Ok(RawTime::Named(RawNamedTime::Stationary)),
                    other => Err(E::custom(format!(
                        "a time is a number > 0 or `stationary`, got `{other}`"
                    ))),
                }
            }
        }
        d.deserialize_any(Visitor)
    }
}

/// `exit-permutation:` values.
#[derive(Debug, Clone, Copy, Deserialize, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawPermutationRead {
    /// The color leaving through each exit, exits in order.
    Colors,
    /// The exit of each color, colors in order.
    Exits,
}

/// `row:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawRowRead {
    /// The row below the edges read.
    pub y: i64,
    /// Colors or positions.
    #[serde(rename = "as")]
    pub kind: RawSetKind,
}

/// `column:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawColumnRead {
    /// The column left of the edges read.
    pub x: i64,
    /// Colors or positions.
    #[serde(rename = "as")]
    pub kind: RawSetKind,
}

/// `height:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawHeightRead {
    /// Column (six-vertex) or site (exclusion).
    pub x: i64,
    /// Row (six-vertex only).
    #[serde(default)]
    pub y: Option<i64>,
    /// Time (exclusion only).
    #[serde(default)]
    pub time: Option<RawTime>,
}

/// `window:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawWindowRead {
    /// First site.
    pub from: i64,
    /// Last site.
    pub to: i64,
    /// Time.
    pub time: RawTime,
    /// Colors or positions.
    #[serde(rename = "as")]
    pub kind: RawSetKind,
}

/// `position:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawPositionRead {
    /// The class followed (in the model's own numbers).
    pub class: i64,
    /// Time.
    pub time: RawTime,
}

/// Keys of reads that only need a time.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawTimeRead {
    /// Time.
    pub time: RawTime,
}

/// `current:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawCurrentRead {
    /// Left site of the bond.
    pub bond: i64,
    /// Time.
    pub time: RawTime,
}

/// `swapped:` and `attempted:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawPairRead {
    /// The two classes (in the model's own numbers).
    pub classes: [i64; 2],
    /// Time.
    pub time: RawTime,
}

/// One claim.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawClaim {
    /// Identifier, unique in the file.
    pub id: String,
    /// The claim in words, for the report.
    #[serde(default)]
    pub says: Option<String>,
    /// Exact mode for this claim (overrides the scenario's).
    #[serde(default)]
    pub exact: Option<RawExactMode>,
    /// Confirm equality within this distance (total variation, Kolmogorov distance, probability
    /// gap or mean gap, by the claim's kind).
    #[serde(default)]
    pub tolerance: Option<f64>,
    /// Two observables have the same law.
    #[serde(default)]
    pub same_law: Option<[String; 2]>,
    /// A scalar observable follows a reference law.
    #[serde(default)]
    pub law_of: Option<RawLawOf>,
    /// An event's probability.
    #[serde(default)]
    pub probability: Option<RawProbability>,
    /// No claim: the estimated law with intervals.
    #[serde(default)]
    pub describe: Option<String>,
    /// No claim: observables along a parameter, beside a reference, a limit or a profile.
    #[serde(default)]
    pub series: Option<RawSeries>,
    /// No claim: the joint law of two numbers of one model.
    #[serde(default)]
    pub joint: Option<[String; 2]>,
    /// The mean of a number, optionally against a stated value.
    #[serde(default)]
    pub mean: Option<RawMean>,
    /// With `describe` of a number or a `series` of numbers: a reference law drawn beside it
    /// (shown, not tested); with `joint`: a joint limit law.
    #[serde(default)]
    pub reference: Option<RawReference>,
    /// With `describe` of a number or a `series`: a limiting value quoted beside the estimates.
    #[serde(default)]
    pub limit: Option<f64>,
    /// With a `series` of numbers: a named profile drawn beside the means.
    #[serde(default)]
    pub profile: Option<String>,
}

/// `series:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawSeries {
    /// The observables, in order.
    pub observables: Vec<String>,
    /// The parameter value of each, increasing.
    pub at: Vec<f64>,
    /// The parameter's name (default `t`).
    #[serde(default)]
    pub axis: Option<String>,
}

/// `mean:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawMean {
    /// The number.
    pub observable: String,
    /// A stated value to test against.
    #[serde(default)]
    pub equals: Option<f64>,
    /// A named profile giving the stated value at the observable's coordinates (instead of
    /// `equals`).
    #[serde(default)]
    pub profile: Option<String>,
}

/// A value in an explicit law: a number, a yes/no, or a list of integers (a set or a sequence).
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(untagged)]
pub enum RawTableValue {
    /// A yes/no, for an event.
    Flag(bool),
    /// A number.
    Number(f64),
    /// A set's elements or a sequence.
    List(Vec<i64>),
}

/// `law-of:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawLawOf {
    /// The scalar observable.
    pub observable: String,
    /// The reference law.
    pub reference: RawReference,
}

/// Reference laws.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub enum RawReference {
    /// Uniform on `[a, b]`.
    Uniform([f64; 2]),
    /// Normal with mean and standard deviation.
    Normal(RawNormal),
    /// The integer law with tail `P(X ≥ x) = E[occupation of site x]` read from another observable
    /// (an exclusion `window` read as positions).
    TailFromProfile(String),
    /// The Tracy–Widom GUE law F₂.
    TracyWidomGue,
    /// The Tracy–Widom GOE law F₁.
    TracyWidomGoe,
    /// Uniform on `[−(p − q), p − q]`: the limiting speed of a second-class particle from step data.
    SecondClassSpeed(RawRates),
    /// The joint law of the TASEP speed process at the particles started at 0 and 1 (`joint` only).
    SpeedProcessPair,
    /// The limiting exit speed X/y of the six-vertex second-class path under the step boundary.
    SixVertexExitSpeed(RawWeights),
    /// An explicit law: `[value, probability]` pairs, probabilities as decimals or fractions.
    Table(Vec<(RawTableValue, RawNumber)>),
}

/// `six-vertex-exit-speed:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawWeights {
    /// Straight-on probability of the stronger path from below.
    pub b1: f64,
    /// Straight-on probability of the stronger path from the left.
    pub b2: f64,
}

/// `second-class-speed:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawRates {
    /// Right rate.
    pub p: f64,
    /// Left rate.
    pub q: f64,
}

/// `normal:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawNormal {
    /// Mean.
    pub mean: f64,
    /// Standard deviation.
    pub sd: f64,
}

/// `probability:` keys.
#[derive(Debug, Clone, Deserialize, Serialize)]
#[serde(deny_unknown_fields, rename_all = "kebab-case")]
pub struct RawProbability {
    /// The event observable.
    pub event: String,
    /// A stated value to test against.
    #[serde(default)]
    pub equals: Option<f64>,
}
