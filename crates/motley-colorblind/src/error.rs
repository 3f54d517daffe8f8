//! Errors of the projection and observable constructors.

use thiserror::Error;

/// What can go wrong when building a projection, a set or an index map.
#[derive(Debug, Clone, PartialEq, Eq, Error)]
pub enum ColorblindError {
    /// A merge table must send color 0 to 0 and never decrease.
    #[error("merge table must start at 0 and never decrease: entry {index} is {value}, after {previous}")]
    MergeNotMonotone {
        /// Position in the table where the order breaks.
        index: usize,
        /// Value found there.
        value: u32,
        /// Value just before it.
        previous: u32,
    },
    /// A merge table whose first entry is not 0 would turn empty edges into paths.
    #[error("merge table must send color 0 to 0, got {0}")]
    MergeMovesEmpty(u32),
    /// A color met by a merge table that does not cover it.
    #[error("color {color} is beyond the merge table, which covers colors 0..={max}")]
    ColorBeyondTable {
        /// The color met.
        color: u32,
        /// The largest color the table covers.
        max: u32,
    },
    /// An element outside the universe of a set.
    #[error("element {element} is outside {{1, …, {universe}}}")]
    ElementOutside {
        /// The element.
        element: i64,
        /// Size of the universe.
        universe: usize,
    },
    /// A reversal needs a positive number of classes.
    #[error("a relabeling needs at least one class, got 0")]
    EmptyRelabel,
}
