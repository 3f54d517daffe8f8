//! `CategoricalCounts<K>`: a mergeable histogram of observations of a categorical law (for instance
//! random sets encoded as bit-set keys).
//!
//! Counting happens in a `hashbrown` map, whose default hasher is seeded differently in every process.
//! Integer counts do not care about order, but every floating-point reduction in this crate walks the
//! cells in *sorted key order* (see [`CategoricalCounts::sorted_cells`]), so statistics are bit-identical
//! across runs, shards and merge orders. Serialisation also writes the cells sorted by key.

use std::hash::Hash;

use hashbrown::HashMap;
use serde::{Deserialize, Serialize};

/// Counts of observations per category `K`; merging two accumulators is exact.
///
/// # Examples
/// ```
/// use motley_stats::CategoricalCounts;
/// let mut a = CategoricalCounts::new();
/// a.add(3u64);
/// a.add(3u64);
/// let mut b = CategoricalCounts::new();
/// b.add(5u64);
/// a.merge(&b);
/// assert_eq!(a.total(), 3);
/// assert_eq!(a.count(&3), 2);
/// assert_eq!(a.sorted_cells(), vec![(&3, 2), (&5, 1)]);
/// ```
#[derive(Clone, Debug, Serialize, Deserialize)]
#[serde(into = "CountsRepr<K>", from = "CountsRepr<K>")]
#[serde(bound(
    serialize = "K: Serialize + Ord + Hash + Clone",
    deserialize = "K: Deserialize<'de> + Ord + Hash + Clone"
))]
pub struct CategoricalCounts<K> {
    counts: HashMap<K, u64>,
    total: u64,
}

/// Serialised form: total and cells sorted by key.
#[derive(Serialize, Deserialize)]
struct CountsRepr<K> {
    total: u64,
    cells: Vec<(K, u64)>,
}

impl<K: Ord + Hash + Clone> From<CategoricalCounts<K>> for CountsRepr<K> {
    fn from(c: CategoricalCounts<K>) -> Self {
        let mut cells: Vec<(K, u64)> = c.counts.into_iter().collect();
        cells.sort_by(|x, y| x.0.cmp(&y.0));
        CountsRepr {
            total: c.total,
            cells,
        }
    }
}

impl<K: Ord + Hash + Clone> From<CountsRepr<K>> for CategoricalCounts<K> {
    fn from(r: CountsRepr<K>) -> Self {
        // The total is recomputed from the cells so a hand-edited file cannot make them disagree.
        let mut c = CategoricalCounts::new();
        for (k, n) in r.cells {
            c.add_count(k, n);
        }
        c
    }
}

impl<K> Default for CategoricalCounts<K> {
    fn default() -> Self {
        CategoricalCounts {
            counts: HashMap::new(),
            total: 0,
        }
    }
}

impl<K: Ord + Hash + Clone> PartialEq for CategoricalCounts<K> {
    fn eq(&self, other: &Self) -> bool {
        self.total == other.total && self.counts == other.counts
    }
}

impl<K: Ord + Hash + Clone> Eq for CategoricalCounts<K> {}

impl<K: Ord + Hash + Clone> CategoricalCounts<K> {
    /// An empty accumulator.
    pub fn new() -> Self {
        Self::default()
    }

    /// Records one observation of `key`.
    pub fn add(&mut self, key: K) {
        self.add_count(key, 1);
    }

    /// Records `count` observations of `key` (a count of 0 changes nothing).
    pub fn add_count(&mut self, key: K, count: u64) {
        if count == 0 {
            return;
        }
        *self.counts.entry(key).or_insert(0) += count;
        self.total += count;
    }

    /// Adds all counts of `other` into `self`. Exact: merging shards in any grouping or order gives
    /// an accumulator equal to the one-pass accumulator.
    pub fn merge(&mut self, other: &Self) {
        for (k, &n) in &other.counts {
            *self.counts.entry(k.clone()).or_insert(0) += n;
        }
        self.total += other.total;
    }

    /// Number of observations.
    pub fn total(&self) -> u64 {
        self.total
    }

    /// Number of distinct categories observed.
    pub fn distinct(&self) -> usize {
        self.counts.len()
    }

    /// Count of `key` (0 if never seen).
    pub fn count(&self, key: &K) -> u64 {
        self.counts.get(key).copied().unwrap_or(0)
    }

    /// All observed cells with their counts, sorted by key. Use this (never the map's own order) for
    /// any floating-point reduction.
    pub fn sorted_cells(&self) -> Vec<(&K, u64)> {
        let mut v: Vec<(&K, u64)> = self.counts.iter().map(|(k, &n)| (k, n)).collect();
        v.sort_by(|x, y| x.0.cmp(y.0));
        v
    }
}

/// Sorted union of the keys of two accumulators with the count of each side.
pub(crate) fn aligned_counts<'a, K: Ord + Hash + Clone>(
    a: &'a CategoricalCounts<K>,
    b: &'a CategoricalCounts<K>,
) -> Vec<(&'a K, u64, u64)> {
    let mut keys: Vec<&K> = a.counts.keys().chain(b.counts.keys()).collect();
    keys.sort();
    keys.dedup();
    keys.into_iter()
        .map(|k| (k, a.count(k), b.count(k)))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn merge_equals_one_pass_and_serde_round_trips_sorted() {
        let data: Vec<u64> = (0..500u64).map(|i| (i * 7919) % 37).collect();
        let mut one = CategoricalCounts::new();
        for &x in &data {
            one.add(x);
        }
        let mut left = CategoricalCounts::new();
        let mut right = CategoricalCounts::new();
        for (i, &x) in data.iter().enumerate() {
            if i % 3 == 0 {
                left.add(x);
            } else {
                right.add(x);
            }
        }
        right.merge(&left);
        assert_eq!(one, right);
        assert_eq!(one.total(), 500);
        let repr: CountsRepr<u64> = one.clone().into();
        assert!(repr.cells.windows(2).all(|w| w[0].0 < w[1].0));
        let back: CategoricalCounts<u64> = repr.into();
        assert_eq!(back, one);
        // A near miss must differ.
        let mut other = one.clone();
        other.add(0);
        assert_ne!(other, one);
    }

    proptest::proptest! {
        #[test]
        fn any_split_merges_to_the_one_pass_counts(
            data in proptest::collection::vec(0u64..20, 0..200),
            cut in 0usize..200,
        ) {
            let cut = cut.min(data.len());
            let mut one = CategoricalCounts::new();
            data.iter().for_each(|&x| one.add(x));
            let (mut left, mut right) = (CategoricalCounts::new(), CategoricalCounts::new());
            data[..cut].iter().for_each(|&x| left.add(x));
            data[cut..].iter().for_each(|&x| right.add(x));
            right.merge(&left);
            proptest::prop_assert_eq!(&right, &one);
            proptest::prop_assert_eq!(right.sorted_cells(), one.sorted_cells());
        }
    }

    #[test]
    fn aligned_counts_is_sorted_union() {
        let mut a = CategoricalCounts::new();
        a.add(vec![2u32]);
        a.add(vec![0u32, 1]);
        let mut b = CategoricalCounts::new();
        b.add(vec![1u32]);
        b.add(vec![2u32]);
        let al = aligned_counts(&a, &b);
        let keys: Vec<&Vec<u32>> = al.iter().map(|x| x.0).collect();
        assert_eq!(keys, vec![&vec![0u32, 1], &vec![1u32], &vec![2u32]]);
        assert_eq!(al[2].1, 1);
        assert_eq!(al[2].2, 1);
        assert_eq!(al[0].2, 0);
    }
}
