//! The exits of a sample: the key of the exact law and of Monte Carlo tallies.

use motley_colorblind::Color;

/// The colors leaving a rectangle: through the top (column 1 first) and through the right side
/// (row 1 first). Ordered lexicographically, top first.
#[derive(Debug, Clone, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Outcome {
    /// Colors leaving through the top, column 1 first.
    pub top: Vec<Color>,
    /// Colors leaving through the right side, row 1 first.
    pub right: Vec<Color>,
}
