//! Errors of the six-vertex constructors: every parameter is checked once, when a model, boundary or
//! read-out is built, so that sampling itself cannot fail.

use motley_colorblind::ColorblindError;
use thiserror::Error;

/// What can go wrong when building a six-vertex model, its boundary, a read-out or an exact law.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum SixVertexError {
    /// A vertex weight (`b1` or `b2`) outside [0, 1] or not a number.
    #[error("`{name}` must lie in [0, 1], got {value}")]
    WeightOutOfRange {
        /// `"b1"` or `"b2"`.
        name: &'static str,
        /// The value given, as text (it may be a rational).
        value: String,
    },
    /// The rectangle needs at least one column and one row.
    #[error("the rectangle must have at least one column and one row, got {width} × {height}")]
    EmptyRectangle {
        /// Number of columns asked for.
        width: usize,
        /// Number of rows asked for.
        height: usize,
    },
    /// An explicit list of boundary colors of the wrong length.
    #[error("the {side} boundary needs {expected} colors (one per {unit}), got {got}")]
    SideLength {
        /// `"left"` or `"bottom"`.
        side: &'static str,
        /// `"row"` or `"column"`.
        unit: &'static str,
        /// Number of edges on that side.
        expected: usize,
        /// Length of the list given.
        got: usize,
    },
    /// A block boundary whose first block is longer than the side.
    #[error(
        "the first block of the {side} boundary has {first_len} edges, but the side has only {len}"
    )]
    BlockTooLong {
        /// `"left"` or `"bottom"`.
        side: &'static str,
        /// Length of the first block.
        first_len: usize,
        /// Number of edges on that side.
        len: usize,
    },
    /// A Bernoulli boundary density outside [0, 1] or not a number.
    #[error("the density of the random {side} boundary must lie in [0, 1], got {value}")]
    DensityOutOfRange {
        /// `"left"` or `"bottom"`.
        side: &'static str,
        /// The density given.
        value: f64,
    },
    /// A read-out line beyond the rectangle.
    #[error("{kind} line {index} is outside the rectangle: it must lie in 0..={max}")]
    LineOutOfRange {
        /// `"horizontal"` (above row `index`) or `"vertical"` (right of column `index`).
        kind: &'static str,
        /// The line asked for.
        index: usize,
        /// The largest line there is.
        max: usize,
    },
    /// A height-function point beyond the rectangle.
    #[error("height point ({a}, {b}) is outside the rectangle: need 0 ≤ a ≤ {width} and 0 ≤ b ≤ {height}")]
    HeightPointOutOfRange {
        /// Column coordinate asked for.
        a: usize,
        /// Row coordinate asked for.
        b: usize,
        /// Width of the rectangle.
        width: usize,
        /// Height of the rectangle.
        height: usize,
    },
    /// A projection that cannot be applied to the boundary colors.
    #[error("cannot project the boundary: {0}")]
    Projection(#[from] ColorblindError),
    /// The exact dynamic programme met more states than its limit.
    #[error("the exact law needs more than {limit} states (reached {states}); use a smaller rectangle or fewer colors")]
    ExactTooLarge {
        /// Number of states reached.
        states: usize,
        /// The limit.
        limit: usize,
    },
}
