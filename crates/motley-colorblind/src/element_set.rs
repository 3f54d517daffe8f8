//! A subset of `{1, …, n}` stored as a bit set: the value of a set-valued observable.
//!
//! Element `k` lives at bit `k − 1`. Sets are ordered (lexicographically on their bits, then by
//! universe) and hashable, so they serve directly as keys of categorical laws; statistics iterate keys
//! in this order so that floating-point sums never depend on a hash seed.

use bitvec::prelude::*;

use crate::ColorblindError;

/// A subset of `{1, …, universe}`.
#[derive(Debug, Clone, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct ElementSet {
    bits: BitVec<u64, Lsb0>,
}

impl ElementSet {
    /// The empty subset of `{1, …, universe}`.
    pub fn empty(universe: usize) -> Self {
        ElementSet {
            bits: bitvec![u64, Lsb0; 0; universe],
        }
    }

    /// The subset holding `elements`.
    ///
    /// # Errors
    /// [`ColorblindError::ElementOutside`] if an element is 0 or above `universe`.
    pub fn from_elements(
        universe: usize,
        elements: impl IntoIterator<Item = usize>,
    ) -> Result<Self, ColorblindError> {
        let mut set = Self::empty(universe);
        for e in elements {
            set.insert(e)?;
        }
        Ok(set)
    }

    /// Adds element `k`.
    ///
    /// # Errors
    /// [`ColorblindError::ElementOutside`] if `k` is 0 or above the universe.
    pub fn insert(&mut self, k: usize) -> Result<(), ColorblindError> {
        if k == 0 || k > self.bits.len() {
            return Err(ColorblindError::ElementOutside {
                element: k as i64,
                universe: self.bits.len(),
            });
        }
        self.bits.set(k - 1, true);
        Ok(())
    }

    /// Whether `k` belongs to the set (false outside the universe).
    pub fn contains(&self, k: usize) -> bool {
        k >= 1 && k <= self.bits.len() && self.bits[k - 1]
    }

    /// Size `n` of the universe `{1, …, n}`.
    pub fn universe(&self) -> usize {
        self.bits.len()
    }

    /// Number of elements.
    pub fn len(&self) -> usize {
        self.bits.count_ones()
    }

    /// Whether the set has no element.
    pub fn is_empty(&self) -> bool {
        self.bits.not_any()
    }

    /// The elements in increasing order.
    pub fn iter(&self) -> impl Iterator<Item = usize> + '_ {
        self.bits.iter_ones().map(|i| i + 1)
    }

    /// The elements in increasing order, collected.
    pub fn elements(&self) -> Vec<usize> {
        self.iter().collect()
    }
}

impl std::fmt::Display for ElementSet {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("{")?;
        for (i, e) in self.iter().enumerate() {
            if i > 0 {
                f.write_str(", ")?;
            }
            write!(f, "{e}")?;
        }
        f.write_str("}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn insert_contains_and_bounds() {
        let mut s = ElementSet::empty(5);
        assert!(s.is_empty());
        s.insert(1).unwrap();
        s.insert(5).unwrap();
        assert!(
            s.contains(1) && s.contains(5) && !s.contains(3) && !s.contains(0) && !s.contains(6)
        );
        assert_eq!(s.len(), 2);
        assert_eq!(s.to_string(), "{1, 5}");
        assert!(matches!(
            s.insert(6),
            Err(ColorblindError::ElementOutside {
                element: 6,
                universe: 5
            })
        ));
        assert!(s.insert(0).is_err());
    }

    #[test]
    fn order_and_equality_follow_contents() {
        let a = ElementSet::from_elements(4, [1, 2]).unwrap();
        let b = ElementSet::from_elements(4, [2, 1]).unwrap();
        let c = ElementSet::from_elements(4, [3]).unwrap();
        assert_eq!(a, b);
        assert_ne!(a, c);
        assert!(a.cmp(&c) != std::cmp::Ordering::Equal);
    }
}
