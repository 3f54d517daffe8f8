//! Per-observable accumulators that merge exactly, so threads and shards add up to one pass.
//!
//! Everything is an integer count or a list of values; a merge is a sum of counts or a
//! concatenation, and every statistic is computed after sorting. Hence the result of a run never
//! depends on how its samples were split between threads or shards.
//!
//! Sets keep their joint law only when their universe has at most [`JOINT_LIMIT`] elements (a key
//! is then a 128-bit mask); larger sets keep per-element inclusion counts and the laws of their
//! scalar summaries. The rule depends on the scenario only, never on the data.

use std::collections::BTreeMap;

use motley_colorblind::Summary;
use serde::{Deserialize, Serialize};

use crate::family::{Real, Value};
use crate::scenario::ValueKind;

/// Largest universe whose joint set law is kept.
pub const JOINT_LIMIT: usize = 128;

/// Marker for "min or max of the empty set" in summary histograms.
pub const EMPTY_SUMMARY: u64 = u64::MAX;

/// A 128-bit set mask as two words (JSON has no 128-bit integers): `[low, high]`.
pub type Mask = [u64; 2];

/// Accumulated values of one observable on one replica.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub enum Accumulator {
    /// Set-valued.
    Set(SetCounts),
    /// Numbers.
    Scalar(ScalarValues),
    /// Events.
    Event(EventCounts),
    /// Sequences.
    Sequence(SequenceCounts),
    /// Pairs of numbers read from one sample (a `joint` claim).
    Pairs(PairValues),
    /// Tuples of numbers.
    Tuple(TupleCounts),
}

/// Counts of a tuple observable.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TupleCounts {
    /// Samples.
    pub n: u64,
    /// Law by tuple.
    #[serde(with = "pairs")]
    pub counts: BTreeMap<Vec<Real>, u64>,
}

/// Pairs of numbers, one per sample, in arrival order until sorted (lexicographically).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct PairValues {
    /// The pairs.
    pub values: Vec<[f64; 2]>,
}

/// Counts of a set observable.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SetCounts {
    /// Samples.
    pub n: u64,
    /// Universe size.
    pub universe: usize,
    /// Joint law by mask, when the universe is small enough.
    #[serde(with = "pairs_opt")]
    pub joint: Option<BTreeMap<Mask, u64>>,
    /// Samples containing element `k + 1`.
    pub inclusion: Vec<u64>,
    /// Law of size, min, max, sum (in that order); empty min/max under [`EMPTY_SUMMARY`].
    #[serde(with = "pairs_four")]
    pub summaries: [BTreeMap<u64, u64>; 4],
}

/// Values of a number observable, in arrival order until sorted.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ScalarValues {
    /// The values.
    pub values: Vec<f64>,
}

/// Counts of an event.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct EventCounts {
    /// Samples.
    pub n: u64,
    /// Samples where it happened.
    pub yes: u64,
}

/// Counts of a sequence observable.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SequenceCounts {
    /// Samples.
    pub n: u64,
    /// Law by sequence.
    #[serde(with = "pairs")]
    pub counts: BTreeMap<Vec<u32>, u64>,
}

/// Maps are written to JSON as lists of `[key, count]` pairs (JSON keys must be strings).
mod pairs {
    use std::collections::BTreeMap;

    use serde::{Deserialize, Deserializer, Serialize, Serializer};

    pub fn serialize<K: Serialize, S: Serializer>(
        m: &BTreeMap<K, u64>,
        s: S,
    ) -> Result<S::Ok, S::Error> {
        s.collect_seq(m.iter())
    }

    pub fn deserialize<'de, K: Deserialize<'de> + Ord, D: Deserializer<'de>>(
        d: D,
    ) -> Result<BTreeMap<K, u64>, D::Error> {
        Ok(Vec::<(K, u64)>::deserialize(d)?.into_iter().collect())
    }
}

mod pairs_opt {
    use std::collections::BTreeMap;

    use serde::{Deserialize, Deserializer, Serializer};

    pub fn serialize<S: Serializer>(
        m: &Option<BTreeMap<super::Mask, u64>>,
        s: S,
    ) -> Result<S::Ok, S::Error> {
        match m {
            Some(m) => s.serialize_some(&m.iter().collect::<Vec<_>>()),
            None => s.serialize_none(),
        }
    }

    pub fn deserialize<'de, D: Deserializer<'de>>(
        d: D,
    ) -> Result<Option<BTreeMap<super::Mask, u64>>, D::Error> {
        Ok(Option::<Vec<(super::Mask, u64)>>::deserialize(d)?.map(|v| v.into_iter().collect()))
    }
}

mod pairs_four {
    use std::collections::BTreeMap;

    use serde::{Deserialize, Deserializer, Serializer};

    pub fn serialize<S: Serializer>(m: &[BTreeMap<u64, u64>; 4], s: S) -> Result<S::Ok, S::Error> {
        s.collect_seq(m.iter().map(|h| h.iter().collect::<Vec<_>>()))
    }

    pub fn deserialize<'de, D: Deserializer<'de>>(
        d: D,
    ) -> Result<[BTreeMap<u64, u64>; 4], D::Error> {
        let v = <[Vec<(u64, u64)>; 4]>::deserialize(d)?;
        Ok(v.map(|h| h.into_iter().collect()))
    }
}

/// Sets `mask` bit for element `k` (1-based).
#[inline]
pub fn mask_insert(mask: &mut Mask, k: usize) {
    let b = k - 1;
    mask[b / 64] |= 1u64 << (b % 64);
}

/// Elements of a mask, increasing.
pub fn mask_elements(mask: &Mask) -> Vec<usize> {
    let mut v = Vec::new();
    for (w, word) in mask.iter().enumerate() {
        let mut x = *word;
        while x != 0 {
            let b = x.trailing_zeros() as usize;
            v.push(w * 64 + b + 1);
            x &= x - 1;
        }
    }
    v
}

impl Accumulator {
    /// An empty accumulator for values of `kind`.
    pub fn new(kind: ValueKind) -> Self {
        match kind {
            ValueKind::Set { universe } => Accumulator::Set(SetCounts {
                n: 0,
                universe,
                joint: (universe <= JOINT_LIMIT).then(BTreeMap::new),
                inclusion: vec![0; universe],
                summaries: Default::default(),
            }),
            ValueKind::Scalar { .. } => Accumulator::Scalar(ScalarValues { values: Vec::new() }),
            ValueKind::Event => Accumulator::Event(EventCounts { n: 0, yes: 0 }),
            ValueKind::Sequence { .. } => Accumulator::Sequence(SequenceCounts {
                n: 0,
                counts: BTreeMap::new(),
            }),
            ValueKind::Tuple { .. } => Accumulator::Tuple(TupleCounts {
                n: 0,
                counts: BTreeMap::new(),
            }),
        }
    }

    /// Adds one set, given by its increasing elements.
    pub fn add_set(&mut self, elements: &[usize]) {
        let Accumulator::Set(s) = self else { return };
        s.n += 1;
        let mut mask: Mask = [0, 0];
        for &k in elements {
            s.inclusion[k - 1] += 1;
            if k <= JOINT_LIMIT {
                mask_insert(&mut mask, k);
            }
        }
        if let Some(j) = &mut s.joint {
            *j.entry(mask).or_insert(0) += 1;
        }
        let summary = Summary::of_increasing(elements.iter().copied());
        let min = summary.min.map_or(EMPTY_SUMMARY, |m| m as u64);
        let max = summary.max.map_or(EMPTY_SUMMARY, |m| m as u64);
        for (h, v) in s
            .summaries
            .iter_mut()
            .zip([summary.size as u64, min, max, summary.sum])
        {
            *h.entry(v).or_insert(0) += 1;
        }
    }

    /// Adds one value of the accumulator's kind (validation matched the observable's value kind
    /// to its accumulator; a value of another kind is a bug, ignored in release builds).
    pub fn add(&mut self, v: Value<'_>) {
        match v {
            Value::Set(e) => self.add_set(e),
            Value::Number(x) => self.add_scalar(x),
            Value::Event(b) => self.add_event(b),
            Value::Sequence(q) => self.add_sequence(q),
            Value::Tuple(t) => {
                if let Accumulator::Tuple(c) = self {
                    c.n += 1;
                    *c.counts
                        .entry(t.iter().map(|&x| Real(x)).collect())
                        .or_insert(0) += 1;
                }
            }
        }
    }

    /// An empty accumulator of pairs.
    pub fn pairs() -> Self {
        Accumulator::Pairs(PairValues { values: Vec::new() })
    }

    /// Adds one number.
    pub fn add_scalar(&mut self, v: f64) {
        if let Accumulator::Scalar(s) = self {
            s.values.push(v);
        }
    }

    /// Adds one event outcome.
    pub fn add_event(&mut self, happened: bool) {
        if let Accumulator::Event(e) = self {
            e.n += 1;
            e.yes += u64::from(happened);
        }
    }

    /// Adds one sequence.
    pub fn add_sequence(&mut self, seq: &[u32]) {
        if let Accumulator::Sequence(s) = self {
            s.n += 1;
            *s.counts.entry(seq.to_vec()).or_insert(0) += 1;
        }
    }

    /// Merges `other` into `self` exactly (counts add, values concatenate).
    pub fn merge(&mut self, other: &Accumulator) {
        match (self, other) {
            (Accumulator::Set(a), Accumulator::Set(b)) => {
                a.n += b.n;
                if let (Some(ja), Some(jb)) = (&mut a.joint, &b.joint) {
                    add_counts(ja, jb);
                }
                for (x, y) in a.inclusion.iter_mut().zip(&b.inclusion) {
                    *x += y;
                }
                for (ha, hb) in a.summaries.iter_mut().zip(&b.summaries) {
                    add_counts(ha, hb);
                }
            }
            (Accumulator::Scalar(a), Accumulator::Scalar(b)) => {
                a.values.extend_from_slice(&b.values)
            }
            (Accumulator::Event(a), Accumulator::Event(b)) => {
                a.n += b.n;
                a.yes += b.yes;
            }
            (Accumulator::Sequence(a), Accumulator::Sequence(b)) => {
                a.n += b.n;
                add_counts(&mut a.counts, &b.counts);
            }
            (Accumulator::Pairs(a), Accumulator::Pairs(b)) => a.values.extend_from_slice(&b.values),
            (Accumulator::Tuple(a), Accumulator::Tuple(b)) => {
                a.n += b.n;
                add_counts(&mut a.counts, &b.counts);
            }
            _ => {}
        }
    }

    /// Puts the values in a canonical order (scalars sorted), after all merges.
    pub fn canonicalize(&mut self) {
        match self {
            Accumulator::Scalar(s) => s.values.sort_by(f64::total_cmp),
            Accumulator::Pairs(p) => p
                .values
                .sort_by(|a, b| a[0].total_cmp(&b[0]).then(a[1].total_cmp(&b[1]))),
            _ => {}
        }
    }

    /// Checks that this accumulator (read from a file) has the kind and shape of `empty` (the slot's
    /// fresh accumulator) and holds exactly `samples` samples, with internally consistent counts.
    ///
    /// # Errors
    /// What is wrong, in words.
    pub fn check_shape(&self, empty: &Accumulator, samples: u64) -> Result<(), String> {
        fn sum<'a>(mut m: impl Iterator<Item = &'a u64>) -> Option<u64> {
            m.try_fold(0u64, |a, &b| a.checked_add(b))
        }
        let count = self.count();
        if count != samples {
            return Err(format!("holds {count} samples where {samples} were done"));
        }
        match (self, empty) {
            (Accumulator::Set(a), Accumulator::Set(e)) => {
                if a.universe != e.universe
                    || a.inclusion.len() != e.universe
                    || a.joint.is_some() != e.joint.is_some()
                {
                    return Err(format!(
                        "is a set law of another universe ({}, expected {})",
                        a.universe, e.universe
                    ));
                }
                if a.inclusion.iter().any(|&k| k > a.n) {
                    return Err("counts an element more often than there are samples".into());
                }
                if let Some(j) = &a.joint {
                    let outside = j
                        .keys()
                        .any(|m| mask_elements(m).last().is_some_and(|&k| k > a.universe));
                    if outside || sum(j.values()) != Some(a.n) {
                        return Err("has a joint law that does not add up to its samples".into());
                    }
                }
                if a.summaries.iter().any(|h| sum(h.values()) != Some(a.n)) {
                    return Err("has summary laws that do not add up to its samples".into());
                }
                Ok(())
            }
            (Accumulator::Scalar(_), Accumulator::Scalar(_))
            | (Accumulator::Pairs(_), Accumulator::Pairs(_)) => Ok(()),
            (Accumulator::Event(a), Accumulator::Event(_)) => {
                if a.yes > a.n {
                    return Err("counts an event more often than there are samples".into());
                }
                Ok(())
            }
            (Accumulator::Sequence(a), Accumulator::Sequence(_)) => {
                if sum(a.counts.values()) != Some(a.n) {
                    return Err("has a law that does not add up to its samples".into());
                }
                Ok(())
            }
            (Accumulator::Tuple(a), Accumulator::Tuple(_)) => {
                if sum(a.counts.values()) != Some(a.n) {
                    return Err("has a law that does not add up to its samples".into());
                }
                Ok(())
            }
            (
                Accumulator::Set(_)
                | Accumulator::Scalar(_)
                | Accumulator::Event(_)
                | Accumulator::Sequence(_)
                | Accumulator::Pairs(_)
                | Accumulator::Tuple(_),
                _,
            ) => Err("holds values of another kind than its observable's".into()),
        }
    }

    /// Number of samples accumulated.
    pub fn count(&self) -> u64 {
        match self {
            Accumulator::Set(s) => s.n,
            Accumulator::Scalar(s) => s.values.len() as u64,
            Accumulator::Event(e) => e.n,
            Accumulator::Sequence(s) => s.n,
            Accumulator::Pairs(p) => p.values.len() as u64,
            Accumulator::Tuple(t) => t.n,
        }
    }
}

fn add_counts<K: Ord + Clone>(a: &mut BTreeMap<K, u64>, b: &BTreeMap<K, u64>) {
    for (k, v) in b {
        *a.entry(k.clone()).or_insert(0) += v;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn merging_parts_equals_one_pass() {
        let kind = ValueKind::Set { universe: 5 };
        let data: Vec<Vec<usize>> = (0..50)
            .map(|i| (1..=5).filter(|k| (i * 7 + k * 3) % 4 == 0).collect())
            .collect();
        let mut whole = Accumulator::new(kind);
        for d in &data {
            whole.add_set(d);
        }
        for parts in [2, 7] {
            let mut merged = Accumulator::new(kind);
            for chunk in data.chunks(data.len().div_ceil(parts)) {
                let mut a = Accumulator::new(kind);
                for d in chunk {
                    a.add_set(d);
                }
                merged.merge(&a);
            }
            assert_eq!(merged, whole);
        }
        let json = serde_json::to_string(&whole).unwrap();
        assert_eq!(serde_json::from_str::<Accumulator>(&json).unwrap(), whole);
        let Accumulator::Set(s) = &whole else {
            unreachable!()
        };
        assert_eq!(
            s.inclusion.iter().sum::<u64>(),
            data.iter().map(|d| d.len() as u64).sum::<u64>()
        );
        assert_eq!(mask_elements(&[0b101, 1]), vec![1, 3, 65]);
    }
}
