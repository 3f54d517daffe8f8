//! The machine-readable result of a run: the content of `result.json`, schema `motley-result/3`.
//!
//! Field meanings are documented in `docs/result-schema.md` and checked against
//! `docs/result.schema.json` by the tests. Only the fields under `timing` may differ between two runs
//! of one scenario and seed; everything else is bit-identical whatever the thread count or shard split.

use serde::{Deserialize, Serialize};

/// The schema identifier written into every result.
pub const SCHEMA: &str = "motley-result/3";

/// A whole result.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RunResult {
    /// Always [`SCHEMA`].
    pub schema: String,
    /// motley's version.
    pub motley_version: String,
    /// The git commit motley was built from (`unknown` outside a checkout).
    pub git_commit: String,
    /// The scenario.
    pub scenario: ScenarioInfo,
    /// Wall time, threads and shards: the only fields (with `git_commit`) allowed to differ between
    /// reruns.
    pub timing: Timing,
    /// One entry per claim, in file order.
    pub claims: Vec<ClaimResult>,
    /// How the run sampled when the scenario planned looks (`null` for a single look at `samples`).
    pub sequential: Option<Sequential>,
}

/// A sequential run: the planned looks, the level each spent, where it stopped and why.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Sequential {
    /// Samples per side at each planned look, increasing; the last is the scenario's `samples`.
    pub looks: Vec<u64>,
    /// The level each look tests at (quadratic α-spending; they add up to `alpha`).
    pub levels: Vec<f64>,
    /// Looks taken (1-based count; the run stopped after this one).
    pub looks_taken: usize,
    /// Samples per side used.
    pub samples_used: u64,
    /// Why the run stopped.
    pub stopped: StopReason,
}

/// Why a sequential run stopped.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum StopReason {
    /// Every tested claim was decided (rejected or equal within its tolerance).
    AllDecided,
    /// The last planned look was reached.
    LastLook,
    /// Only this look was asked for (`--look`); the next look would continue the sequence.
    LookAsked,
}

/// How the verdicts of several claims are controlled together.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ErrorControl {
    /// Each claim at `alpha` on its own (the default).
    PerClaim,
    /// Benjamini–Hochberg across the tested claims: the expected share of false rejections among
    /// the rejections is at most `alpha`.
    FalseDiscoveryRate,
}

/// What was run.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ScenarioInfo {
    /// Scenario name.
    pub name: String,
    /// Title.
    pub title: String,
    /// Description.
    pub description: String,
    /// SHA-256 of the scenario file.
    pub hash: String,
    /// Seed.
    pub seed: u64,
    /// Samples per side.
    pub samples: u64,
    /// Significance level.
    pub alpha: f64,
    /// Power at which detectable differences are quoted.
    pub power: f64,
    /// How the claims' verdicts are controlled together.
    pub error_control: ErrorControl,
}

/// Timing (excluded from reproducibility comparisons).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Timing {
    /// Wall-clock seconds of the run (summed over shards for a merge).
    pub wall_seconds: f64,
    /// Worker threads used (largest over shards).
    pub threads: usize,
    /// Samples per second reached, all sides together.
    pub samples_per_second: f64,
    /// Shards merged into this result (1 for a single run).
    pub shards: u64,
}

/// The result of one claim.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ClaimResult {
    /// Claim id.
    pub id: String,
    /// What the claim says.
    pub kind: ClaimKindName,
    /// The claim in words.
    pub says: String,
    /// Observables involved, by name.
    pub observables: Vec<String>,
    /// How it was decided.
    pub decided_by: DecidedBy,
    /// Whether the claim is rejected at `alpha` (always false for `describe`).
    pub rejected: bool,
    /// The decision in one word (see [`Decision`]).
    pub decision: Decision,
    /// The level the deciding test used: `alpha`, or a look's share of it in a sequential run.
    pub level: f64,
    /// The tolerance `ε` the claim stated, if any.
    pub tolerance: Option<f64>,
    /// In a sequential run: the look (1-based) at which this claim was decided, or the last look.
    pub look: Option<usize>,
    /// One sentence: the verdict and what it means.
    pub verdict: String,
    /// Samples per side (0 when decided exactly).
    pub samples: u64,
    /// The tests run, with the claim-level Holm adjustment applied across them.
    pub tests: Vec<TestResult>,
    /// Effect size and sensitivity, when the claim compares laws.
    pub effect: Option<Effect>,
    /// Exact decision, when exact mode decided the claim.
    pub exact: Option<ExactResult>,
    /// Estimated laws and curves, for the report's tables and figures.
    pub estimates: Estimates,
    /// A value stated in the scenario beside the estimate: the `equals` of a probability claim or
    /// the `limit` quoted with a described number.
    pub stated: Option<Stated>,
}

/// The kind of a claim, as results name it.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum ClaimKindName {
    /// Two observables have the same law.
    SameLaw,
    /// An observable follows a reference law.
    LawOf,
    /// An event's probability.
    Probability,
    /// The law described, nothing tested.
    Describe,
    /// Observables along a parameter, nothing tested.
    Series,
    /// A joint law of two numbers, nothing tested.
    Joint,
    /// The mean of a number.
    Mean,
    /// An exact law could not be computed.
    Error,
}

impl ClaimKindName {
    /// The name results and reports use (`same-law`, …).
    pub fn as_str(self) -> &'static str {
        match self {
            ClaimKindName::SameLaw => "same-law",
            ClaimKindName::LawOf => "law-of",
            ClaimKindName::Probability => "probability",
            ClaimKindName::Describe => "describe",
            ClaimKindName::Series => "series",
            ClaimKindName::Joint => "joint",
            ClaimKindName::Mean => "mean",
            ClaimKindName::Error => "error",
        }
    }

    /// Whether the claim only describes (tests nothing by its kind).
    pub fn describes_only(self) -> bool {
        match self {
            ClaimKindName::Describe | ClaimKindName::Series | ClaimKindName::Joint => true,
            ClaimKindName::SameLaw
            | ClaimKindName::LawOf
            | ClaimKindName::Probability
            | ClaimKindName::Mean
            | ClaimKindName::Error => false,
        }
    }
}

/// A claim's decision.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Decision {
    /// The deciding test rejected the claim (or the exact law contradicts it).
    Rejected,
    /// Not rejected, and the upper confidence bound of the distance lies below the tolerance.
    EqualWithin,
    /// Not rejected; no tolerance was stated.
    NotRejected,
    /// Not rejected, but the upper confidence bound is not below the stated tolerance.
    Undecided,
    /// The exact law confirms the claim.
    HoldsExactly,
    /// Nothing was tested (`describe`, `series`, `joint`, a probability or mean without a value).
    NoClaim,
}

impl Decision {
    /// Whether a sequential run may stop for this claim.
    pub fn settled(self) -> bool {
        match self {
            Decision::Rejected
            | Decision::EqualWithin
            | Decision::HoldsExactly
            | Decision::NoClaim => true,
            Decision::NotRejected | Decision::Undecided => false,
        }
    }
}

/// A test's part in the decision.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum TestRole {
    /// The one test that decides the claim at the claim's level.
    Deciding,
    /// Reported beside it; does not move the verdict.
    Diagnostic,
}

/// How a claim was decided.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum DecidedBy {
    /// By exact laws.
    Exact,
    /// By samples.
    MonteCarlo,
}

/// Whether a stated value is tested or only quoted.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum StatedRole {
    /// Tested: `equals` of a probability or a mean (or a mean's profile).
    Equals,
    /// Quoted beside a described number, not tested.
    Limit,
}

/// What an exact discrepancy measures.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Discrepancy {
    /// Total variation between two laws, or between a law and a table.
    TotalVariation,
    /// Kolmogorov distance between a law and a reference CDF.
    KolmogorovDistance,
    /// Largest gap between P(X ≥ x) and a profile's occupation, over the sites.
    TailGap,
    /// |P − p₀| for a stated probability p₀.
    ProbabilityGap,
    /// |mean − m₀| for a stated mean m₀.
    MeanGap,
}

impl Discrepancy {
    /// The measure in words, for reports.
    pub fn words(self) -> &'static str {
        match self {
            Discrepancy::TotalVariation => "total variation",
            Discrepancy::KolmogorovDistance => "Kolmogorov distance",
            Discrepancy::TailGap => "largest tail gap",
            Discrepancy::ProbabilityGap => "|P − p₀|",
            Discrepancy::MeanGap => "|mean − m₀|",
        }
    }
}

/// A value the scenario states beside an estimate.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Stated {
    /// Tested or only quoted.
    pub role: StatedRole,
    /// The value.
    pub value: f64,
    /// The estimate it is compared with (probability or mean).
    pub estimate: f64,
    /// Estimate minus value.
    pub difference: f64,
    /// Half-width of a `1 − alpha` normal interval for the difference (0 when exact).
    pub half_width: f64,
}

/// One hypothesis test.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TestResult {
    /// Name, e.g. `chi-square on the joint law`.
    pub name: String,
    /// Test statistic.
    pub statistic: f64,
    /// Degrees of freedom, where the test has them.
    pub dof: Option<f64>,
    /// Deciding or diagnostic.
    pub role: TestRole,
    /// p-value of this test alone.
    pub p_value: f64,
    /// For the deciding test: the p-value compared with the claim's level (Benjamini–Hochberg
    /// adjusted across claims under false-discovery-rate control); for a diagnostic, its p-value.
    pub adjusted_p_value: f64,
    /// Whether the deciding test rejects (always false for a diagnostic).
    pub rejected: bool,
    /// Caveats: pooling done, conservativeness for discrete data, and the like.
    pub note: String,
}

/// Effect size and what the run could have seen.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Effect {
    /// What the numbers measure, e.g. `total variation` or `probability gap`.
    pub measure: String,
    /// Point estimate; for total variation the plug-in value minus its bias (`plug_in` −
    /// `same_law_level`, at least 0).
    pub estimate: f64,
    /// The plain plug-in estimate, where `estimate` corrects it.
    pub plug_in: Option<f64>,
    /// The plug-in value expected if the two laws were equal (its bias), where it matters.
    pub same_law_level: Option<f64>,
    /// Upper confidence bound at level `1 − level` for the distance between the full laws.
    pub upper_bound: f64,
    /// Smallest difference the deciding test detects at its level with the scenario's power,
    /// for the worst alternative of that size.
    pub detectable: f64,
    /// What `detectable` measures (it can differ from `measure`: a chi-square on a number's
    /// support detects total variation on the compared cells).
    pub detectable_measure: String,
    /// What the power statement covers and what not.
    pub covers: String,
}

/// An exact decision.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ExactResult {
    /// What `discrepancy` measures (`null` when nothing was compared, as for `describe`).
    pub measure: Option<Discrepancy>,
    /// The exact discrepancy between what the claim says and the exact law (0 when nothing was
    /// compared).
    pub discrepancy: f64,
    /// Exact probability (probability claims).
    pub probability: Option<f64>,
    /// Outcomes in the larger of the laws.
    pub outcomes: usize,
    /// Bound on the numerical error of the exact computation.
    pub error_bound: f64,
}

/// Estimates for tables and figures.
#[derive(Debug, Clone, PartialEq, Default, Serialize, Deserialize)]
pub struct Estimates {
    /// Per-element inclusion probabilities (sets), one series per side.
    pub inclusion: Vec<Series>,
    /// Law of the set size, one series per side.
    pub size_law: Vec<Series>,
    /// Empirical CDFs (numbers), one series per side.
    pub ecdf: Vec<Series>,
    /// Reference curve (CDF or tail) for `law-of`.
    pub reference: Option<Series>,
    /// Event probabilities, one per side.
    pub probabilities: Vec<Interval>,
    /// The most frequent outcomes and their frequencies, per side (at most 20).
    pub top_outcomes: Vec<Vec<Outcome>>,
    /// Mean and standard deviation of numbers, per side.
    pub moments: Vec<Moments>,
    /// `series` claims: one point per observable, in the order of the parameter.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub series: Vec<SeriesPoint>,
    /// `series` claims: the parameter's name.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub series_axis: Option<String>,
    /// `series` claims: what the predicted values are (a profile, a limit, a reference's mean).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub series_theory: Option<String>,
    /// `joint` claims: the binned joint law, beside its reference when one is named.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub joint: Option<JointLaw>,
    /// The full law of each observable of the claim whose values are sets, sequences, events or
    /// integers (every outcome, up to [`LAW_ROW_CAP`] rows).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub laws: Vec<FullLaw>,
    /// Hitting times read by the claim: how many samples were censored at the horizon.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub censoring: Vec<Censoring>,
}

/// Censoring of a first time: samples in which the event had not come by the read-out time, whose
/// value is that time (after the observable's shift, scale and base).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Censoring {
    /// The observable's name.
    pub observable: String,
    /// The horizon as the observable's value.
    pub at: f64,
    /// Samples censored.
    pub censored: u64,
    /// Samples in all.
    pub samples: u64,
}

/// Most rows kept of one full law; a larger law is cut (the first rows in value order) and says so.
pub const LAW_ROW_CAP: usize = 10_000;

/// The full law of one observable: observed counts (Monte Carlo) or exact probabilities.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FullLaw {
    /// The observable's name.
    pub observable: String,
    /// Samples behind the counts (0 for an exact law).
    pub samples: u64,
    /// Distinct outcomes of the whole law.
    pub distinct: usize,
    /// Whether the rows stop at [`LAW_ROW_CAP`].
    pub truncated: bool,
    /// The outcomes in the order of their values.
    pub rows: Vec<LawRow>,
}

/// One outcome of a full law.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LawRow {
    /// The outcome as reports print it (`{1, 3}`, `(3 1 2)`, `yes`, `4`).
    pub value: String,
    /// Samples with this outcome (Monte Carlo).
    pub count: Option<u64>,
    /// Observed frequency or exact probability.
    pub probability: f64,
    /// The exact probability as a fraction `p/q`, when the law was computed in rationals.
    pub fraction: Option<String>,
}

/// One point of a `series` claim.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SeriesPoint {
    /// The observable's name.
    pub label: String,
    /// The parameter value.
    pub at: f64,
    /// Mean (numbers) or probability (events).
    pub estimate: f64,
    /// Lower end of the `1 − alpha` interval (normal for a mean, Wilson for a probability).
    pub lower: f64,
    /// Upper end.
    pub upper: f64,
    /// Standard deviation (numbers).
    pub sd: Option<f64>,
    /// The theory's value here: the profile's, the limit, or the reference law's mean.
    pub predicted: Option<f64>,
    /// The reference law's standard deviation (numbers with a reference).
    pub predicted_sd: Option<f64>,
    /// Kolmogorov distance to the reference law (numbers with a reference).
    pub distance: Option<f64>,
    /// Its upper `1 − alpha` bound (DKW).
    pub distance_upper: Option<f64>,
    /// Samples.
    pub count: u64,
}

/// The joint law of two numbers on a grid of equal cells.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct JointLaw {
    /// The two observables' names (first: horizontal axis).
    pub labels: [String; 2],
    /// Lower and upper end of the grid on the first axis.
    pub x_range: [f64; 2],
    /// Lower and upper end of the grid on the second axis.
    pub y_range: [f64; 2],
    /// Cells per axis.
    pub bins: usize,
    /// Fraction of samples in each cell, row by row from the lowest second value
    /// (`cells[j * bins + i]`: first value in bin i, second in bin j).
    pub cells: Vec<f64>,
    /// The reference law's mass in each cell, when a reference is named.
    pub reference_cells: Option<Vec<f64>>,
    /// The reference's name.
    pub reference: Option<String>,
    /// Regions of the plane: `first < second`, `first > second`, `first = second`, with the
    /// reference's mass of each (where it has one).
    pub regions: Vec<Region>,
    /// Sample correlation of the two numbers.
    pub correlation: f64,
    /// Samples.
    pub count: u64,
}

/// An estimated probability of a region beside the reference's.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Region {
    /// The estimate with its intervals.
    pub estimate: Interval,
    /// The reference law's mass of the region.
    pub reference: Option<f64>,
}

/// A curve with a confidence band: `x`, estimate, lower and upper bound.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Series {
    /// Legend label.
    pub label: String,
    /// Abscissae.
    pub x: Vec<f64>,
    /// Estimates.
    pub y: Vec<f64>,
    /// Lower band.
    pub lower: Vec<f64>,
    /// Upper band.
    pub upper: Vec<f64>,
}

/// An estimated probability with its interval.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Interval {
    /// Label.
    pub label: String,
    /// Successes.
    pub successes: u64,
    /// Trials.
    pub trials: u64,
    /// Point estimate (exact value when decided exactly).
    pub estimate: f64,
    /// Wilson interval, lower.
    pub wilson_lower: f64,
    /// Wilson interval, upper.
    pub wilson_upper: f64,
    /// Clopper–Pearson interval, lower.
    pub exact_lower: f64,
    /// Clopper–Pearson interval, upper.
    pub exact_upper: f64,
}

/// One outcome of a categorical law.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Outcome {
    /// The outcome, written as in the report (e.g. `{1, 3}`).
    pub value: String,
    /// Its estimated (or exact) probability.
    pub probability: f64,
}

/// Sample moments.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Moments {
    /// Label.
    pub label: String,
    /// Count.
    pub count: u64,
    /// Mean.
    pub mean: f64,
    /// Standard deviation.
    pub sd: f64,
}
