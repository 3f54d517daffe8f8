//! `ScalarSample`: a mergeable sample of real observations that keeps every value.
//!
//! Values are stored and sorted with `f64::total_cmp`, so the sorted sequence (and every statistic
//! computed from it) depends only on the multiset of values, not on insertion or merge order: merging
//! is exact. For integer data with few distinct values a [`crate::CategoricalCounts<i64>`] is the
//! compact alternative; the two-sample KS and permutation functions accept both.

use std::borrow::Cow;

use serde::{Deserialize, Serialize};

use crate::StatsError;

/// A sample of finite real values; merging is exact.
///
/// # Examples
/// ```
/// use motley_stats::ScalarSample;
/// let mut a = ScalarSample::new();
/// a.add(2.0).unwrap();
/// let mut b = ScalarSample::from_values(vec![1.0, 3.0]).unwrap();
/// b.merge(&a);
/// assert_eq!(&*b.sorted_values(), &[1.0, 2.0, 3.0]);
/// assert!(a.add(f64::NAN).is_err());
/// ```
#[derive(Clone, Debug, Default, Serialize, Deserialize)]
#[serde(into = "SampleRepr", from = "SampleRepr")]
pub struct ScalarSample {
    values: Vec<f64>,
    sorted: bool,
}

/// Serialised form: the sorted values.
#[derive(Serialize, Deserialize)]
struct SampleRepr {
    values: Vec<f64>,
}

impl From<ScalarSample> for SampleRepr {
    fn from(mut s: ScalarSample) -> Self {
        s.sort();
        SampleRepr { values: s.values }
    }
}

impl From<SampleRepr> for ScalarSample {
    fn from(r: SampleRepr) -> Self {
        let mut s = ScalarSample {
            values: r.values.into_iter().filter(|v| v.is_finite()).collect(),
            sorted: false,
        };
        s.sort();
        s
    }
}

impl PartialEq for ScalarSample {
    fn eq(&self, other: &Self) -> bool {
        let (a, b) = (self.sorted_values(), other.sorted_values());
        a.len() == b.len()
            && a.iter()
                .zip(b.iter())
                .all(|(x, y)| x.to_bits() == y.to_bits())
    }
}

impl ScalarSample {
    /// An empty sample.
    pub fn new() -> Self {
        ScalarSample {
            values: Vec::new(),
            sorted: true,
        }
    }

    /// A sample holding `values`.
    ///
    /// # Errors
    /// [`StatsError::NonFiniteValue`] for NaN or infinite values.
    pub fn from_values(values: Vec<f64>) -> Result<Self, StatsError> {
        if let Some(&v) = values.iter().find(|v| !v.is_finite()) {
            return Err(StatsError::NonFiniteValue(v));
        }
        let mut s = ScalarSample {
            values,
            sorted: false,
        };
        s.sort();
        Ok(s)
    }

    /// Adds one observation.
    ///
    /// # Errors
    /// [`StatsError::NonFiniteValue`] for NaN or infinite values (the sample is unchanged).
    pub fn add(&mut self, x: f64) -> Result<(), StatsError> {
        if !x.is_finite() {
            return Err(StatsError::NonFiniteValue(x));
        }
        if self.sorted && self.values.last().is_some_and(|l| l.total_cmp(&x).is_gt()) {
            self.sorted = false;
        }
        self.values.push(x);
        Ok(())
    }

    /// Appends all values of `other` (exact).
    pub fn merge(&mut self, other: &Self) {
        self.values.extend_from_slice(&other.values);
        self.sorted = false;
    }

    /// Sorts the stored values in place (makes later [`Self::sorted_values`] calls free).
    pub fn sort(&mut self) {
        if !self.sorted {
            self.values.sort_by(f64::total_cmp);
            self.sorted = true;
        }
    }

    /// The values in increasing order (borrowed if already sorted, else a sorted copy).
    pub fn sorted_values(&self) -> Cow<'_, [f64]> {
        if self.sorted {
            Cow::Borrowed(&self.values)
        } else {
            let mut v = self.values.clone();
            v.sort_by(f64::total_cmp);
            Cow::Owned(v)
        }
    }

    /// Number of observations.
    pub fn len(&self) -> usize {
        self.values.len()
    }

    /// Whether the sample is empty.
    pub fn is_empty(&self) -> bool {
        self.values.is_empty()
    }
}

/// Whether a sorted slice repeats a value.
pub(crate) fn has_ties(sorted: &[f64]) -> bool {
    sorted.windows(2).any(|w| w[0] == w[1])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn merge_order_does_not_matter() {
        let vals: Vec<f64> = (0..100).map(|i| ((i * 37) % 101) as f64 / 7.0).collect();
        let one = ScalarSample::from_values(vals.clone()).unwrap();
        let mut parts: Vec<ScalarSample> = (0..3).map(|_| ScalarSample::new()).collect();
        for (i, &v) in vals.iter().enumerate() {
            parts[i % 3].add(v).unwrap();
        }
        let mut m = parts[2].clone();
        m.merge(&parts[0]);
        m.merge(&parts[1]);
        assert_eq!(m, one);
        m.add(0.5).unwrap();
        assert_ne!(m, one);
        assert!(!has_ties(&one.sorted_values()));
        assert!(has_ties(&[1.0, 2.0, 2.0]));
    }
}
