//! The vertex weights `b1`, `b2` and the decision rule at one vertex.
//!
//! At a vertex, color `i` arrives from below and color `j` from the left. If `i = j` both go straight.
//! Otherwise the stronger (larger) color decides alone: from below it continues up with probability
//! `b1` (else it turns right); from the left it continues right with probability `b2` (else it turns
//! up). The weaker color takes the other outgoing edge. The decision is taken on the vertex's 32-bit
//! word `u` with [`Chance::happens`]: "continue straight" iff `u < round(p · 2³²)`.

use motley_stream::Chance;

use crate::SixVertexError;

/// The checked pair `(b1, b2)` and their 32-bit thresholds.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct VertexWeights {
    b1: f64,
    b2: f64,
    below: Chance,
    left: Chance,
}

impl VertexWeights {
    /// The weights `b1` (stronger color from below continues up) and `b2` (stronger color from the
    /// left continues right).
    ///
    /// # Errors
    /// [`SixVertexError::WeightOutOfRange`] if either is NaN or outside [0, 1].
    pub fn new(b1: f64, b2: f64) -> Result<Self, SixVertexError> {
        let below = Chance::new(b1).map_err(|_| SixVertexError::WeightOutOfRange {
            name: "b1",
            value: b1.to_string(),
        })?;
        let left = Chance::new(b2).map_err(|_| SixVertexError::WeightOutOfRange {
            name: "b2",
            value: b2.to_string(),
        })?;
        Ok(VertexWeights {
            b1,
            b2,
            below,
            left,
        })
    }

    /// `b1`.
    pub fn b1(&self) -> f64 {
        self.b1
    }

    /// `b2`.
    pub fn b2(&self) -> f64 {
        self.b2
    }

    /// The threshold deciding `b1`: the stronger color from below goes straight iff `u < cut_below`.
    pub fn cut_below(&self) -> u64 {
        self.below.cut()
    }

    /// The threshold deciding `b2`: the stronger color from the left goes straight iff `u < cut_left`.
    pub fn cut_left(&self) -> u64 {
        self.left.cut()
    }
}

/// Which local rule the sampler applies. Only [`VertexRule::Standard`] is the model; the others are
/// deliberately wrong rules, kept so that tests can show that their statistical checks catch a bug.
#[doc(hidden)]
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum VertexRule {
    /// The model's rule.
    #[default]
    Standard,
    /// Wrong: `b1` and `b2` exchanged (the weaker color decides).
    SwappedWeights,
    /// Wrong: any two paths that meet go straight, whatever their colors (only occupation compared).
    OccupancyOnly,
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rejects_bad_weights() {
        assert!(VertexWeights::new(0.0, 1.0).is_ok());
        let e = VertexWeights::new(1.3, 0.5).unwrap_err();
        assert_eq!(e.to_string(), "`b1` must lie in [0, 1], got 1.3");
        assert!(matches!(
            VertexWeights::new(0.5, f64::NAN),
            Err(SixVertexError::WeightOutOfRange { name: "b2", .. })
        ));
        assert!(VertexWeights::new(-0.1, 0.5).is_err());
    }
}
