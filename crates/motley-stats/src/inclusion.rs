//! Per-element inclusion frequencies of random sets, and their element-by-element comparison
//! between two samples with Holm–Bonferroni adjustment across elements.
//!
//! Design: a sample is a set of element indices `0..`; [`InclusionCounts::add`] takes the indices
//! contained in one sampled set. Duplicate indices inside one set are rejected (checked in O(1) per
//! element with a generation stamp, so `add` does not allocate once warmed up). Counts are integers,
//! so merging is exact. Elements whose pooled counts are 0 or equal to the pooled number of samples
//! carry no information; they are reported with p-value 1 and left out of the Holm family.

use serde::{Deserialize, Serialize};

use crate::two_proportion::{two_proportion_p_value, ProportionTest};
use crate::{holm_bonferroni, StatsError};

/// Mergeable counts of how often each element belongs to a sampled set.
///
/// # Examples
/// ```
/// use motley_stats::InclusionCounts;
/// let mut c = InclusionCounts::new();
/// c.add([0usize, 2]).unwrap();
/// c.add([2usize]).unwrap();
/// assert_eq!(c.samples(), 2);
/// assert_eq!(c.count(2), 2);
/// assert_eq!(c.frequency(0), 0.5);
/// assert!(c.add([1usize, 1]).is_err());
/// ```
#[derive(Clone, Debug, Default, Serialize, Deserialize)]
pub struct InclusionCounts {
    samples: u64,
    counts: Vec<u64>,
    #[serde(skip)]
    stamp: Vec<u64>,
    #[serde(skip)]
    buffer: Vec<usize>,
}

impl PartialEq for InclusionCounts {
    fn eq(&self, other: &Self) -> bool {
        let len = self.counts.len().max(other.counts.len());
        self.samples == other.samples && (0..len).all(|e| self.count(e) == other.count(e))
    }
}

impl Eq for InclusionCounts {}

impl InclusionCounts {
    /// An empty accumulator.
    pub fn new() -> Self {
        Self::default()
    }

    /// Counts kept elsewhere: `counts[e]` of `samples` sets contained element `e`.
    ///
    /// # Errors
    /// [`StatsError::SuccessesExceedTrials`] if a count exceeds `samples`.
    pub fn from_counts(samples: u64, counts: Vec<u64>) -> Result<Self, StatsError> {
        if let Some(&count) = counts.iter().find(|&&c| c > samples) {
            return Err(StatsError::SuccessesExceedTrials {
                successes: count,
                trials: samples,
            });
        }
        Ok(InclusionCounts {
            samples,
            counts,
            ..Self::default()
        })
    }

    /// Records one sampled set given by the indices of its elements.
    ///
    /// # Errors
    /// [`StatsError::DuplicateElement`] if an index repeats; the accumulator is then unchanged.
    pub fn add<I: IntoIterator<Item = usize>>(&mut self, elements: I) -> Result<(), StatsError> {
        let mark = self.samples + 1;
        self.buffer.clear();
        self.buffer.extend(elements);
        let max = self.buffer.iter().copied().max().map_or(0, |m| m + 1);
        if max > self.counts.len() {
            self.counts.resize(max, 0);
        }
        if self.stamp.len() < self.counts.len() {
            self.stamp.resize(self.counts.len(), 0);
        }
        for idx in 0..self.buffer.len() {
            let e = self.buffer[idx];
            if self.stamp[e] == mark {
                // Roll back the marks set so far so the next call is unaffected.
                for &f in &self.buffer[..idx] {
                    self.stamp[f] = 0;
                }
                return Err(StatsError::DuplicateElement { element: e });
            }
            self.stamp[e] = mark;
        }
        for &e in &self.buffer {
            self.counts[e] += 1;
        }
        self.samples += 1;
        Ok(())
    }

    /// Adds the counts of `other` (exact).
    pub fn merge(&mut self, other: &Self) {
        if other.counts.len() > self.counts.len() {
            self.counts.resize(other.counts.len(), 0);
        }
        for (c, o) in self.counts.iter_mut().zip(&other.counts) {
            *c += o;
        }
        self.samples += other.samples;
        // Stamps from before the merge must not match future sample numbers.
        self.stamp.clear();
    }

    /// Number of sampled sets.
    pub fn samples(&self) -> u64 {
        self.samples
    }

    /// One more than the largest element index seen (0 if none).
    pub fn elements(&self) -> usize {
        self.counts.len()
    }

    /// Number of sets containing `element`.
    pub fn count(&self, element: usize) -> u64 {
        self.counts.get(element).copied().unwrap_or(0)
    }

    /// Fraction of sets containing `element` (NaN if no set was recorded).
    pub fn frequency(&self, element: usize) -> f64 {
        self.count(element) as f64 / self.samples as f64
    }
}

/// Comparison of one element between the two samples.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct ElementComparison {
    /// Element index.
    pub element: usize,
    /// Sets of sample a containing the element.
    pub count_a: u64,
    /// Sets of sample b containing the element.
    pub count_b: u64,
    /// Inclusion frequency in a.
    pub frequency_a: f64,
    /// Inclusion frequency in b.
    pub frequency_b: f64,
    /// `frequency_a - frequency_b`.
    pub difference: f64,
    /// Test used.
    pub test: ProportionTest,
    /// Unadjusted two-sided p-value.
    pub p_value: f64,
    /// Holm–Bonferroni adjusted p-value over the tested elements (1 for untested ones).
    pub adjusted_p_value: f64,
}

/// Element-by-element comparison of two inclusion samples.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct InclusionComparison {
    /// One entry per element `0..max(a.elements(), b.elements())`.
    pub elements: Vec<ElementComparison>,
    /// Number of elements in the Holm family (non-degenerate ones).
    pub tested: usize,
    /// Smallest adjusted p-value (1 if nothing was tested): reject "same inclusion frequencies for
    /// every element" at level α when this is `<= α`.
    pub min_adjusted_p_value: f64,
    /// Simes' global p-value over the tested elements (1 if nothing was tested): the same global
    /// hypothesis, less conservative than Holm when the elements are positively correlated.
    pub simes_p_value: f64,
}

/// Compares inclusion frequencies element by element (see the file header for the method).
///
/// # Errors
/// [`StatsError::EmptySample`] if either accumulator holds no sets.
pub fn compare_inclusion(
    a: &InclusionCounts,
    b: &InclusionCounts,
) -> Result<InclusionComparison, StatsError> {
    if a.samples() == 0 {
        return Err(StatsError::EmptySample { which: "a" });
    }
    if b.samples() == 0 {
        return Err(StatsError::EmptySample { which: "b" });
    }
    let m = a.elements().max(b.elements());
    let mut elements = Vec::with_capacity(m);
    let mut tested_idx = Vec::new();
    let mut tested_p = Vec::new();
    for e in 0..m {
        let (xa, xb) = (a.count(e), b.count(e));
        let (p, test) = two_proportion_p_value(xa, a.samples(), xb, b.samples());
        if test != ProportionTest::Degenerate {
            tested_idx.push(e);
            tested_p.push(p);
        }
        elements.push(ElementComparison {
            element: e,
            count_a: xa,
            count_b: xb,
            frequency_a: a.frequency(e),
            frequency_b: b.frequency(e),
            difference: a.frequency(e) - b.frequency(e),
            test,
            p_value: p,
            adjusted_p_value: 1.0,
        });
    }
    let adjusted = holm_bonferroni(&tested_p)?;
    let mut min_adj = 1.0f64;
    for (&e, &q) in tested_idx.iter().zip(&adjusted) {
        elements[e].adjusted_p_value = q;
        min_adj = min_adj.min(q);
    }
    Ok(InclusionComparison {
        elements,
        tested: tested_idx.len(),
        min_adjusted_p_value: min_adj,
        simes_p_value: crate::simes(&tested_p)?,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn duplicate_rolls_back_and_merge_is_exact() {
        let mut c = InclusionCounts::new();
        c.add([0usize, 3]).unwrap();
        assert_eq!(
            c.add([1usize, 2, 1]),
            Err(StatsError::DuplicateElement { element: 1 })
        );
        assert_eq!(c.samples(), 1);
        assert_eq!(c.count(1), 0);
        c.add([1usize, 2]).unwrap();
        let mut d = InclusionCounts::new();
        d.add([5usize]).unwrap();
        let mut one = InclusionCounts::new();
        for s in [vec![0usize, 3], vec![1, 2], vec![5]] {
            one.add(s).unwrap();
        }
        c.merge(&d);
        assert_eq!(c, one);
        c.add([5usize]).unwrap();
        assert_ne!(c, one);
    }

    #[test]
    fn comparison_flags_the_changed_element() {
        let mut a = InclusionCounts::new();
        let mut b = InclusionCounts::new();
        for i in 0..1000usize {
            let mut s = vec![];
            if i % 2 == 0 {
                s.push(0);
            }
            if i % 10 < 3 {
                s.push(1);
            }
            a.add(s.clone()).unwrap();
            if i % 10 < 5 {
                s.retain(|&e| e != 1);
                s.push(1);
            } else {
                s.retain(|&e| e != 1);
            }
            b.add(s).unwrap();
        }
        let r = compare_inclusion(&a, &b).unwrap();
        assert_eq!(r.tested, 2);
        let counted = InclusionCounts::from_counts(1000, vec![a.count(0), a.count(1)]).unwrap();
        assert_eq!(counted, a);
        assert!(InclusionCounts::from_counts(3, vec![4]).is_err());
        assert_eq!(r.elements[0].p_value, 1.0);
        assert!(r.elements[1].adjusted_p_value < 1e-10);
        assert_eq!(r.elements[1].adjusted_p_value, 2.0 * r.elements[1].p_value);
    }
}
