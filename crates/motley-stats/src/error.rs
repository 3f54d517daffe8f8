//! The crate's error type: one variant per cause, each message naming the offending parameter,
//! the value received and what was expected.

use thiserror::Error;

/// Everything that can go wrong when a test, interval or accumulator is given bad input.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum StatsError {
    /// A significance level outside (0, 1).
    #[error("`alpha` must lie strictly between 0 and 1, got {0}")]
    InvalidAlpha(f64),
    /// A confidence level outside (0, 1).
    #[error("`confidence` must lie strictly between 0 and 1, got {0}")]
    InvalidConfidence(f64),
    /// A target power outside (0, 1).
    #[error("`power` must lie strictly between 0 and 1, got {0}")]
    InvalidPower(f64),
    /// A test was asked about a sample with no observations.
    #[error("sample `{which}` is empty; the test needs at least one observation")]
    EmptySample {
        /// Which sample ("a", "b", "observed", ...).
        which: &'static str,
    },
    /// A probability of a reference law outside [0, 1] or not finite.
    #[error("probability of entry {index} of the reference law must lie in [0, 1], got {value}")]
    InvalidProbability {
        /// Position of the entry in the list given to the constructor.
        index: usize,
        /// The offending value.
        value: f64,
    },
    /// Reference probabilities that do not add up to one.
    #[error(
        "reference probabilities must sum to 1 (within 1e-9), got {0}; normalise the law first"
    )]
    ProbabilitiesDoNotSumToOne(f64),
    /// The same cell listed twice in a reference law.
    #[error(
        "entry {index} of the reference law repeats a cell listed earlier; list each cell once"
    )]
    DuplicateCell {
        /// Position of the repeated entry.
        index: usize,
    },
    /// A scalar observation that is NaN or infinite.
    #[error("scalar observations must be finite numbers, got {0}")]
    NonFiniteValue(f64),
    /// A set listed the same element twice.
    #[error(
        "element {element} appears twice in one sample; a set lists each element at most once"
    )]
    DuplicateElement {
        /// The repeated element index.
        element: usize,
    },
    /// More successes than trials.
    #[error("`successes` ({successes}) must not exceed `trials` ({trials})")]
    SuccessesExceedTrials {
        /// Number of successes given.
        successes: u64,
        /// Number of trials given.
        trials: u64,
    },
    /// Zero trials where at least one is needed.
    #[error("`trials` must be at least 1, got 0")]
    NoTrials,
    /// A null probability outside [0, 1].
    #[error("`p0` must lie in [0, 1], got {0}")]
    InvalidNullProbability(f64),
    /// A probability parameter of a power calculation outside [0, 1].
    #[error("`{name}` must lie in [0, 1], got {value}")]
    InvalidProportion {
        /// Parameter name.
        name: &'static str,
        /// The offending value.
        value: f64,
    },
    /// A target difference outside (0, 1].
    #[error("target difference must lie in (0, 1], got {0}")]
    InvalidDifference(f64),
    /// Looks of a sequential run that are empty, zero or not increasing.
    #[error("looks must be a non-empty list of increasing positive sample counts")]
    InvalidLooks,
    /// Two proportions that must differ but are equal.
    #[error("`p1` and `p2` must differ for a sample-size calculation, both are {0}")]
    EqualProportions(f64),
    /// Fewer than two cells where a chi-square test needs at least two.
    #[error("`cells` must be at least 2, got {0}")]
    TooFewCells(usize),
    /// A sample size of zero in a power calculation.
    #[error("sample size `{which}` must be at least 1, got 0")]
    ZeroSampleSize {
        /// Which sample size.
        which: &'static str,
    },
    /// A permutation test asked for zero permutations.
    #[error("`permutations` must be at least 1, got 0")]
    NoPermutations,
    /// A pooling threshold that is negative or not finite.
    #[error("`min_expected` must be a finite number >= 0, got {0}")]
    InvalidMinExpected(f64),
    /// A reference CDF that returned a value outside [0, 1].
    #[error("reference CDF returned {value} at x = {x}; a CDF must return values in [0, 1]")]
    InvalidCdfValue {
        /// The argument.
        x: f64,
        /// The returned value.
        value: f64,
    },
    /// A p-value outside [0, 1] given to a multiple-testing procedure.
    #[error("p-value at position {index} must lie in [0, 1], got {value}")]
    InvalidPValue {
        /// Position in the input slice.
        index: usize,
        /// The offending value.
        value: f64,
    },
}
