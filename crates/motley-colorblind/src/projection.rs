//! Colored → colorblind (or coarser colored) projections.
//!
//! A projection is an order-preserving map of colors that sends 0 to 0: a threshold (colors at least as
//! strong as `c` become a single path color 1, the rest become empty) or a general non-decreasing merge
//! table. Because such a map preserves which of two colors is stronger whenever it keeps them apart,
//! and sends equal colors to equal colors, the projected configuration of a colored sample is a sample
//! of the projected model driven by the same random numbers (the basic coupling).

use crate::{Color, ColorblindError};

/// An order-preserving map of colors with `0 ↦ 0`.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Projection {
    /// Colors `≥ c` become 1, all others 0. `c = 0` is treated as `c = 1` would be for nonzero
    /// colors: empty stays empty.
    Threshold(Color),
    /// Color `k` becomes `table[k]`; the table starts at 0 and never decreases.
    Merge(Vec<Color>),
}

impl Projection {
    /// The threshold projection: colors at least as strong as `c` become paths.
    pub fn threshold(c: Color) -> Self {
        Projection::Threshold(c)
    }

    /// A merge by table: color `k` becomes `table[k]`.
    ///
    /// # Errors
    /// [`ColorblindError::MergeMovesEmpty`] if `table[0] ≠ 0`, [`ColorblindError::MergeNotMonotone`] if
    /// the table ever decreases.
    pub fn merge(table: Vec<Color>) -> Result<Self, ColorblindError> {
        if let Some(&first) = table.first() {
            if first != 0 {
                return Err(ColorblindError::MergeMovesEmpty(first));
            }
        }
        for (index, w) in table.windows(2).enumerate() {
            if w[1] < w[0] {
                return Err(ColorblindError::MergeNotMonotone {
                    index: index + 1,
                    value: w[1],
                    previous: w[0],
                });
            }
        }
        Ok(Projection::Merge(table))
    }

    /// The largest color this projection accepts (`None`: any color).
    pub fn max_color(&self) -> Option<Color> {
        match self {
            Projection::Threshold(_) => None,
            Projection::Merge(t) => Some(t.len().saturating_sub(1) as Color),
        }
    }

    /// The image of one color.
    ///
    /// # Errors
    /// [`ColorblindError::ColorBeyondTable`] if a merge table does not cover `color`.
    #[inline]
    pub fn apply(&self, color: Color) -> Result<Color, ColorblindError> {
        match self {
            Projection::Threshold(c) => Ok(Color::from(color != 0 && color >= *c)),
            Projection::Merge(t) => {
                t.get(color as usize)
                    .copied()
                    .ok_or(ColorblindError::ColorBeyondTable {
                        color,
                        max: t.len().saturating_sub(1) as Color,
                    })
            }
        }
    }

    /// The image of a whole configuration.
    ///
    /// # Errors
    /// As [`Projection::apply`].
    pub fn apply_slice(&self, colors: &[Color]) -> Result<Vec<Color>, ColorblindError> {
        colors.iter().map(|&c| self.apply(c)).collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn threshold_keeps_empty_empty() {
        let p = Projection::threshold(2);
        assert_eq!(p.apply_slice(&[0, 1, 2, 3]).unwrap(), vec![0, 0, 1, 1]);
        assert_eq!(
            Projection::threshold(0).apply_slice(&[0, 1]).unwrap(),
            vec![0, 1]
        );
    }

    #[test]
    fn merge_rejects_bad_tables() {
        assert_eq!(
            Projection::merge(vec![1, 1]),
            Err(ColorblindError::MergeMovesEmpty(1))
        );
        assert_eq!(
            Projection::merge(vec![0, 2, 1]),
            Err(ColorblindError::MergeNotMonotone {
                index: 2,
                value: 1,
                previous: 2
            })
        );
        let m = Projection::merge(vec![0, 1, 1, 2]).unwrap();
        assert_eq!(m.apply_slice(&[3, 2, 1, 0]).unwrap(), vec![2, 1, 1, 0]);
        assert_eq!(
            m.apply(4),
            Err(ColorblindError::ColorBeyondTable { color: 4, max: 3 })
        );
    }

    proptest! {
        /// A threshold is the merge table `[0, …, 0, 1, …, 1]`, and both preserve the weak order.
        #[test]
        fn threshold_is_a_monotone_merge(c in 1u32..8, a in 0u32..8, b in 0u32..8) {
            let table: Vec<u32> = (0..8).map(|k| u32::from(k >= c)).collect();
            let m = Projection::merge(table).unwrap();
            let t = Projection::threshold(c);
            prop_assert_eq!(m.apply(a).unwrap(), t.apply(a).unwrap());
            if a <= b {
                prop_assert!(t.apply(a).unwrap() <= t.apply(b).unwrap());
            }
        }
    }
}
