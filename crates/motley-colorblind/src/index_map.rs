//! Index maps that line two sets up before they are compared: identity, reflection, shift.

use crate::{ColorblindError, ElementSet};

/// A map `k ↦ f(k)` applied elementwise to a set.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum IndexMap {
    /// `k ↦ k`.
    Identity,
    /// `k ↦ n + 1 − k`, where `n` is the universe of the set being mapped.
    Reflection,
    /// `k ↦ k + s`.
    Shift(i64),
}

impl IndexMap {
    /// The image of `set` as a subset of `{1, …, universe}`.
    ///
    /// # Errors
    /// [`ColorblindError::ElementOutside`] if an image falls outside `{1, …, universe}`.
    pub fn apply(&self, set: &ElementSet, universe: usize) -> Result<ElementSet, ColorblindError> {
        let mut out = ElementSet::empty(universe);
        for k in set.iter() {
            let image = self.image(k, set.universe());
            if image < 1 || image > universe as i64 {
                return Err(ColorblindError::ElementOutside {
                    element: image,
                    universe,
                });
            }
            out.insert(image as usize)?;
        }
        Ok(out)
    }

    /// The image of element `k` of a subset of `{1, …, n}` (it may fall outside any universe).
    pub fn image(&self, k: usize, n: usize) -> i64 {
        let k = k as i64;
        match *self {
            IndexMap::Identity => k,
            IndexMap::Reflection => n as i64 + 1 - k,
            IndexMap::Shift(s) => k + s,
        }
    }

    /// Maps the elements of a subset of `{1, …, n}` in place, then sorts them and drops repeats:
    /// the allocation-free form of [`IndexMap::apply`] for hot loops, on elements that may come
    /// unsorted and repeated (as [`crate::push_colors`] gives them).
    ///
    /// # Panics
    /// In debug builds, if an image falls below 1; callers check [`IndexMap::fits`] once, before
    /// the loop.
    pub fn map_elements(&self, elements: &mut Vec<usize>, n: usize) {
        if *self != IndexMap::Identity {
            for e in elements.iter_mut() {
                let image = self.image(*e, n);
                debug_assert!(image >= 1, "index map sends {e} to {image}");
                *e = image as usize;
            }
        }
        elements.sort_unstable();
        elements.dedup();
    }

    /// Whether every subset of `{1, …, from}` maps into `{1, …, to}`.
    pub fn fits(&self, from: usize, to: usize) -> bool {
        if from == 0 {
            return true;
        }
        match *self {
            IndexMap::Identity | IndexMap::Reflection => from <= to,
            IndexMap::Shift(s) => 1 + s >= 1 && from as i64 + s <= to as i64,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn maps() {
        let s = ElementSet::from_elements(5, [1, 2]).unwrap();
        assert_eq!(
            IndexMap::Reflection.apply(&s, 5).unwrap().elements(),
            vec![4, 5]
        );
        assert_eq!(
            IndexMap::Shift(2).apply(&s, 5).unwrap().elements(),
            vec![3, 4]
        );
        assert!(IndexMap::Shift(-1).apply(&s, 5).is_err());
        assert!(IndexMap::Shift(4).apply(&s, 5).is_err());
        assert!(IndexMap::Shift(3).fits(2, 5) && !IndexMap::Shift(4).fits(2, 5));
        let mut v = vec![2, 1, 2];
        IndexMap::Reflection.map_elements(&mut v, 5);
        assert_eq!(v, vec![4, 5]);
        IndexMap::Shift(-3).map_elements(&mut v, 5);
        assert_eq!(v, vec![1, 2]);
    }

    proptest! {
        #[test]
        fn reflection_is_an_involution(bits in proptest::collection::vec(any::<bool>(), 1..40)) {
            let n = bits.len();
            let s = ElementSet::from_elements(n, bits.iter().enumerate().filter(|(_, b)| **b).map(|(i, _)| i + 1)).unwrap();
            let r = IndexMap::Reflection.apply(&s, n).unwrap();
            prop_assert_eq!(r.len(), s.len());
            prop_assert_eq!(IndexMap::Reflection.apply(&r, n).unwrap(), s);
        }
    }
}
