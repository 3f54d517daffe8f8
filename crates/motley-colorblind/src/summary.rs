//! Scalar summaries of a set: size, minimum, maximum, sum of elements.

use crate::ElementSet;

/// The four scalar summaries of an [`ElementSet`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Summary {
    /// Number of elements.
    pub size: usize,
    /// Smallest element (`None` for the empty set).
    pub min: Option<usize>,
    /// Largest element (`None` for the empty set).
    pub max: Option<usize>,
    /// Sum of the elements.
    pub sum: u64,
}

impl Summary {
    /// Summarises `set`.
    pub fn of(set: &ElementSet) -> Self {
        Self::of_increasing(set.iter())
    }

    /// Summarises a set given by its elements in increasing order (as [`ElementSet::iter`] and
    /// [`crate::IndexMap::map_elements`] give them).
    pub fn of_increasing(elements: impl IntoIterator<Item = usize>) -> Self {
        let mut s = Summary {
            size: 0,
            min: None,
            max: None,
            sum: 0,
        };
        for e in elements {
            s.size += 1;
            s.min.get_or_insert(e);
            s.max = Some(e);
            s.sum += e as u64;
        }
        s
    }
}

/// One of the scalar summaries, chosen by name.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum SummaryKind {
    /// Number of elements.
    Size,
    /// Smallest element.
    Min,
    /// Largest element.
    Max,
    /// Sum of the elements.
    Sum,
}

impl SummaryKind {
    /// All four, in a fixed order.
    pub const ALL: [SummaryKind; 4] = [
        SummaryKind::Size,
        SummaryKind::Min,
        SummaryKind::Max,
        SummaryKind::Sum,
    ];

    /// A short lowercase name: `size`, `min`, `max`, `sum`.
    pub fn name(self) -> &'static str {
        match self {
            SummaryKind::Size => "size",
            SummaryKind::Min => "min",
            SummaryKind::Max => "max",
            SummaryKind::Sum => "sum",
        }
    }

    /// The summary of `set` (`None`: min or max of the empty set).
    pub fn of(self, set: &ElementSet) -> Option<u64> {
        let s = Summary::of(set);
        match self {
            SummaryKind::Size => Some(s.size as u64),
            SummaryKind::Min => s.min.map(|m| m as u64),
            SummaryKind::Max => s.max.map(|m| m as u64),
            SummaryKind::Sum => Some(s.sum),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn summaries() {
        let s = ElementSet::from_elements(9, [7, 2, 4]).unwrap();
        let m = Summary::of(&s);
        assert_eq!((m.size, m.min, m.max, m.sum), (3, Some(2), Some(7), 13));
        assert_eq!(Summary::of_increasing([2, 4, 7]), m);
        let e = ElementSet::empty(3);
        assert_eq!(SummaryKind::Min.of(&e), None);
        assert_eq!(SummaryKind::Size.of(&e), Some(0));
        assert_eq!(SummaryKind::Max.name(), "max");
    }
}
