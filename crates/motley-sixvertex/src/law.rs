//! Exact categorical laws: a list of (outcome, probability) sorted by outcome, and their push-forwards.
//!
//! Push-forwards and distances walk the entries in sorted key order (through a `BTreeMap`), so `f64`
//! sums never depend on a hash seed.

use std::collections::BTreeMap;

use crate::Weight;

/// A law on a finite set of keys `K`: entries sorted by key, distinct keys, zero-probability keys left
/// out.
#[derive(Debug, Clone, PartialEq)]
pub struct ExactLaw<K, W> {
    entries: Vec<(K, W)>,
}

impl<K: Ord + Clone, W: Weight> ExactLaw<K, W> {
    /// The law with these entries; equal keys are merged, zero probabilities dropped.
    pub fn from_entries(entries: impl IntoIterator<Item = (K, W)>) -> Self {
        let mut map: BTreeMap<K, W> = BTreeMap::new();
        for (k, w) in entries {
            map.entry(k)
                .and_modify(|acc| acc.add_assign(&w))
                .or_insert(w);
        }
        ExactLaw {
            entries: map.into_iter().filter(|(_, w)| !w.is_zero()).collect(),
        }
    }

    /// The entries, sorted by key.
    pub fn entries(&self) -> &[(K, W)] {
        &self.entries
    }

    /// Number of keys of positive probability.
    pub fn len(&self) -> usize {
        self.entries.len()
    }

    /// Whether the law has no entry.
    pub fn is_empty(&self) -> bool {
        self.entries.is_empty()
    }

    /// Sum of all probabilities (1 up to rounding in `f64`; exactly 1 in rationals).
    pub fn total(&self) -> W {
        let mut t = W::zero();
        for (_, w) in &self.entries {
            t.add_assign(w);
        }
        t
    }

    /// The probability of `key` (0 if absent).
    pub fn probability(&self, key: &K) -> W {
        match self.entries.binary_search_by(|(k, _)| k.cmp(key)) {
            Ok(i) => self.entries[i].1.clone(),
            Err(_) => W::zero(),
        }
    }

    /// The law of `f(outcome)`: the push-forward through any read-out, projection or set observable.
    pub fn map<K2: Ord + Clone>(&self, mut f: impl FnMut(&K) -> K2) -> ExactLaw<K2, W> {
        ExactLaw::from_entries(self.entries.iter().map(|(k, w)| (f(k), w.clone())))
    }

    /// The expectation of a real function of the outcome, in `f64`.
    pub fn mean(&self, mut f: impl FnMut(&K) -> f64) -> f64 {
        self.entries.iter().map(|(k, w)| f(k) * w.to_f64()).sum()
    }

    /// Total variation distance `½ Σ |p(k) − q(k)|`.
    pub fn total_variation(&self, other: &Self) -> W {
        let mut sum = W::zero();
        let (a, b) = (&self.entries, &other.entries);
        let (mut i, mut j) = (0, 0);
        while i < a.len() || j < b.len() {
            let order = match (a.get(i), b.get(j)) {
                (Some(x), Some(y)) => x.0.cmp(&y.0),
                (Some(_), None) => std::cmp::Ordering::Less,
                _ => std::cmp::Ordering::Greater,
            };
            match order {
                std::cmp::Ordering::Less => {
                    sum.add_assign(&a[i].1);
                    i += 1;
                }
                std::cmp::Ordering::Greater => {
                    sum.add_assign(&b[j].1);
                    j += 1;
                }
                std::cmp::Ordering::Equal => {
                    sum.add_assign(&a[i].1.abs_diff(&b[j].1));
                    i += 1;
                    j += 1;
                }
            }
        }
        sum.half()
    }

    /// The same law with `f64` probabilities.
    pub fn to_f64(&self) -> ExactLaw<K, f64> {
        ExactLaw {
            entries: self
                .entries
                .iter()
                .map(|(k, w)| (k.clone(), w.to_f64()))
                .collect(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::ratio;

    #[test]
    fn push_forward_and_distance() {
        let law = ExactLaw::from_entries([(3u32, ratio(1, 2)), (1, ratio(1, 4)), (2, ratio(1, 4))]);
        assert_eq!(law.entries()[0].0, 1);
        let parity = law.map(|k| k % 2);
        assert_eq!(parity.probability(&1), ratio(3, 4));
        assert_eq!(parity.total(), ratio(1, 1));
        let other = ExactLaw::from_entries([(0u32, ratio(1, 1))]);
        assert_eq!(parity.total_variation(&other), ratio(3, 4));
        assert_eq!(parity.total_variation(&parity), ratio(0, 1));
        assert!((law.mean(|&k| k as f64) - 2.25).abs() < 1e-15);
    }
}
