//! A law on arrangements (the exact solver's output) and its pushforwards to read-outs.
//!
//! Entries are sorted by arrangement, and every sum over them runs in that order, so results do not
//! depend on hash seeds.

use std::collections::BTreeMap;

use motley_colorblind::Color;

/// A probability law on arrangements, with a bound on its distance to the true law.
#[derive(Debug, Clone, PartialEq)]
pub struct Law {
    entries: Vec<(Vec<Color>, f64)>,
    error_bound: f64,
}

impl Law {
    /// `entries` must be sorted by arrangement, without repeats.
    pub(crate) fn new(entries: Vec<(Vec<Color>, f64)>, error_bound: f64) -> Self {
        debug_assert!(entries.windows(2).all(|w| w[0].0 < w[1].0));
        Law {
            entries,
            error_bound,
        }
    }

    /// `(arrangement, probability)`, sorted by arrangement (site 1 first).
    pub fn entries(&self) -> &[(Vec<Color>, f64)] {
        &self.entries
    }

    /// A bound on the ℓ¹ distance `Σ |computed − true|` (the Poisson tail of the uniformization at
    /// time `t`, or the last residual of the stationary iteration), before floating-point rounding.
    pub fn error_bound(&self) -> f64 {
        self.error_bound
    }

    /// The probability of one arrangement (0 if unreachable).
    pub fn probability(&self, arrangement: &[Color]) -> f64 {
        self.entries
            .binary_search_by(|(a, _)| a.as_slice().cmp(arrangement))
            .map_or(0.0, |i| self.entries[i].1)
    }

    /// The law of `f(arrangement)`, sorted by value.
    pub fn pushforward<K: Ord>(&self, f: impl Fn(&[Color]) -> K) -> Vec<(K, f64)> {
        let mut out: BTreeMap<K, f64> = BTreeMap::new();
        for (a, p) in &self.entries {
            *out.entry(f(a)).or_insert(0.0) += p;
        }
        out.into_iter().collect()
    }
}

/// Total variation distance `½ Σ |a(k) − b(k)|` between two laws given as sorted `(value, mass)`
/// lists (as [`Law::pushforward`] returns them).
pub fn total_variation<K: Ord>(a: &[(K, f64)], b: &[(K, f64)]) -> f64 {
    let (mut i, mut j, mut sum) = (0, 0, 0.0);
    while i < a.len() || j < b.len() {
        let take = match (a.get(i), b.get(j)) {
            (Some(x), Some(y)) => x.0.cmp(&y.0),
            (Some(_), None) => std::cmp::Ordering::Less,
            _ => std::cmp::Ordering::Greater,
        };
        match take {
            std::cmp::Ordering::Less => {
                sum += a[i].1.abs();
                i += 1;
            }
            std::cmp::Ordering::Greater => {
                sum += b[j].1.abs();
                j += 1;
            }
            std::cmp::Ordering::Equal => {
                sum += (a[i].1 - b[j].1).abs();
                i += 1;
                j += 1;
            }
        }
    }
    sum / 2.0
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pushforward_and_distance() {
        let law = Law::new(vec![(vec![0, 1], 0.25), (vec![1, 0], 0.75)], 0.0);
        assert_eq!(law.probability(&[1, 0]), 0.75);
        assert_eq!(law.probability(&[1, 1]), 0.0);
        let first = law.pushforward(|a| a[0]);
        assert_eq!(first, vec![(0, 0.25), (1, 0.75)]);
        let constant = law.pushforward(|_| 7u8);
        assert_eq!(constant, vec![(7, 1.0)]);
        assert!((total_variation(&first, &[(0, 0.75), (1, 0.25)]) - 0.5).abs() < 1e-15);
        assert!((total_variation(&first, &[(2, 1.0)]) - 1.0).abs() < 1e-15);
    }
}
