//! The error type of this crate: one variant per cause, each message naming the parameter, the
//! value received and what was expected.

use thiserror::Error;

/// Errors from constructing a reference law or profile with invalid parameters.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum ReferenceError {
    /// A probability outside [0, 1].
    #[error("`{name}` must lie in [0, 1], got {value}")]
    ProbabilityOutOfRange {
        /// Parameter name.
        name: &'static str,
        /// Value received.
        value: f64,
    },
    /// A parameter that must be finite and positive.
    #[error("`{name}` must be finite and > 0, got {value}")]
    NotPositive {
        /// Parameter name.
        name: &'static str,
        /// Value received.
        value: f64,
    },
    /// A parameter that must be finite.
    #[error("`{name}` must be finite, got {value}")]
    NotFinite {
        /// Parameter name.
        name: &'static str,
        /// Value received.
        value: f64,
    },
    /// An interval with `lo >= hi`.
    #[error("interval must have lo < hi, got [{lo}, {hi}]")]
    EmptyInterval {
        /// Lower end.
        lo: f64,
        /// Upper end.
        hi: f64,
    },
    /// ASEP asymmetry p must exceed q (p + q = 1), i.e. p ∈ (1/2, 1].
    #[error("`p` must lie in (1/2, 1] (right jumps stronger than left jumps, p + q = 1), got {p}")]
    NotRightBiased {
        /// Value received.
        p: f64,
    },
    /// Six-vertex model with b1 ≥ b2 (κ ≤ 1): the step boundary gives a shock, no curved region.
    #[error(
        "no curved region: κ = (1 − b1)/(1 − b2) = {kappa} ≤ 1 (needs b1 < b2); the step boundary \
         then gives a shock along x = y and no Tracy–Widom fluctuations"
    )]
    NoCurvedRegion {
        /// κ = (1 − b1)/(1 − b2).
        kappa: f64,
    },
    /// The point is not in the curved (fluctuating) region of the limit shape.
    #[error("point ({x}, {y}) is outside the curved region y/κ < x < κy (κ = {kappa})")]
    OutsideCurvedRegion {
        /// Horizontal coordinate.
        x: f64,
        /// Vertical coordinate.
        y: f64,
        /// κ.
        kappa: f64,
    },
    /// A scaled position of TASEP outside the rarefaction fan (−1, 1).
    #[error("scaled position `xi` must lie in (−1, 1) (inside the rarefaction fan), got {xi}")]
    OutsideFan {
        /// Value received.
        xi: f64,
    },
    /// A name not in the registry.
    #[error("unknown reference name `{name}`; known names: {known}")]
    UnknownName {
        /// The name given.
        name: String,
        /// Comma-separated list of the names known.
        known: String,
    },
}
