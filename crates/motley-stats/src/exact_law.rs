//! `ExactLaw<K>`: a validated reference law over categories (for instance the output of an exact
//! enumerator), stored sorted by key so every reduction over it is deterministic.

use std::hash::Hash;

use serde::{Deserialize, Serialize};

use crate::StatsError;

/// Tolerance on the total mass of a reference law.
pub const LAW_MASS_TOLERANCE: f64 = 1e-9;

/// A probability law on finitely many categories, validated once at construction.
///
/// Serialised as the list of `(category, probability)` pairs in key order; deserialising runs the
/// same validation as [`ExactLaw::new`].
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(try_from = "Vec<(K, f64)>", into = "Vec<(K, f64)>")]
#[serde(bound(
    serialize = "K: Serialize + Clone",
    deserialize = "K: Deserialize<'de> + Ord + Hash + Clone"
))]
pub struct ExactLaw<K> {
    cells: Vec<(K, f64)>,
}

impl<K: Ord + Hash + Clone> TryFrom<Vec<(K, f64)>> for ExactLaw<K> {
    type Error = StatsError;
    fn try_from(entries: Vec<(K, f64)>) -> Result<Self, StatsError> {
        ExactLaw::new(entries)
    }
}

impl<K> From<ExactLaw<K>> for Vec<(K, f64)> {
    fn from(law: ExactLaw<K>) -> Self {
        law.cells
    }
}

impl<K: Ord + Hash + Clone> ExactLaw<K> {
    /// Builds a law from `(category, probability)` pairs.
    ///
    /// # Errors
    /// [`StatsError::InvalidProbability`] for a probability outside [0, 1] or NaN,
    /// [`StatsError::DuplicateCell`] if a category repeats, and
    /// [`StatsError::ProbabilitiesDoNotSumToOne`] if the mass differs from 1 by more than
    /// [`LAW_MASS_TOLERANCE`].
    pub fn new(entries: Vec<(K, f64)>) -> Result<Self, StatsError> {
        for (index, (_, p)) in entries.iter().enumerate() {
            if !(0.0..=1.0).contains(p) {
                return Err(StatsError::InvalidProbability { index, value: *p });
            }
        }
        let mut indexed: Vec<(usize, (K, f64))> = entries.into_iter().enumerate().collect();
        indexed.sort_by(|x, y| x.1 .0.cmp(&y.1 .0).then(x.0.cmp(&y.0)));
        for w in indexed.windows(2) {
            if w[0].1 .0 == w[1].1 .0 {
                return Err(StatsError::DuplicateCell { index: w[1].0 });
            }
        }
        let cells: Vec<(K, f64)> = indexed.into_iter().map(|(_, c)| c).collect();
        let mass: f64 = cells.iter().map(|c| c.1).sum();
        if (mass - 1.0).abs() > LAW_MASS_TOLERANCE {
            return Err(StatsError::ProbabilitiesDoNotSumToOne(mass));
        }
        Ok(ExactLaw { cells })
    }

    /// The cells sorted by key.
    pub fn cells(&self) -> &[(K, f64)] {
        &self.cells
    }

    /// Probability of `key` (0 outside the listed cells).
    pub fn probability(&self, key: &K) -> f64 {
        match self.cells.binary_search_by(|c| c.0.cmp(key)) {
            Ok(i) => self.cells[i].1,
            Err(_) => 0.0,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn validates_and_sorts() {
        let law = ExactLaw::new(vec![(3u64, 0.5), (1, 0.25), (2, 0.25)]).unwrap();
        assert_eq!(law.cells()[0].0, 1);
        assert_eq!(law.probability(&3), 0.5);
        assert_eq!(law.probability(&9), 0.0);
        assert_eq!(
            ExactLaw::new(vec![(1u64, 0.5), (1, 0.5)]),
            Err(StatsError::DuplicateCell { index: 1 })
        );
        assert!(matches!(
            ExactLaw::new(vec![(1u64, 0.5), (2, 0.6)]),
            Err(StatsError::ProbabilitiesDoNotSumToOne(_))
        ));
        assert!(matches!(
            ExactLaw::new(vec![(1u64, 1.5), (2, -0.5)]),
            Err(StatsError::InvalidProbability { index: 0, .. })
        ));
    }
}
