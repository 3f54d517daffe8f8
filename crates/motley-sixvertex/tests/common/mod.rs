//! Shared helpers of the statistical tests: tallies and a pooled chi-square goodness-of-fit test.
//!
//! Pooling rule (common practice, Cochran's rule of thumb that expected counts be at least 5): cells
//! are taken in increasing order of expected count (ties in key order) and merged into a running pool
//! until the pool's expected count reaches 5; a last pool still below 5 joins the previous cell.
//! A sample outcome of exact probability 0 makes the test fail outright (p = 0).

#![allow(dead_code)]

use std::collections::BTreeMap;

use motley_sixvertex::ExactLaw;
use statrs::distribution::{ChiSquared, ContinuousCDF};

/// The false-alarm level of every goodness-of-fit test here: reject only if p < 1e-6.
pub const FALSE_ALARM: f64 = 1e-6;

/// Smallest expected count of a pooled cell.
pub const MIN_EXPECTED: f64 = 5.0;

/// Result of a chi-square test.
#[derive(Debug, Clone, Copy)]
pub struct ChiSquare {
    pub statistic: f64,
    pub df: usize,
    pub p: f64,
    pub impossible: u64,
}

/// Chi-square of `counts` (outcome ↦ number of samples) against `law`.
pub fn chi_square<K: Ord + Clone>(law: &ExactLaw<K, f64>, counts: &BTreeMap<K, u64>) -> ChiSquare {
    let n: u64 = counts.values().sum();
    let impossible: u64 = counts
        .iter()
        .filter(|(k, _)| law.probability(k) == 0.0)
        .map(|(_, c)| *c)
        .sum();
    let mut cells: Vec<(f64, f64)> = law
        .entries()
        .iter()
        .map(|(k, p)| (p * n as f64, *counts.get(k).unwrap_or(&0) as f64))
        .collect();
    // Stable sort: ties stay in key order.
    cells.sort_by(|a, b| a.0.partial_cmp(&b.0).unwrap());
    let mut pooled: Vec<(f64, f64)> = Vec::new();
    let (mut e, mut o) = (0.0, 0.0);
    for (ce, co) in cells {
        e += ce;
        o += co;
        if e >= MIN_EXPECTED {
            pooled.push((e, o));
            e = 0.0;
            o = 0.0;
        }
    }
    if e > 0.0 || o > 0.0 {
        match pooled.last_mut() {
            Some(last) => {
                last.0 += e;
                last.1 += o;
            }
            None => pooled.push((e, o)),
        }
    }
    let statistic: f64 = pooled.iter().map(|(e, o)| (o - e) * (o - e) / e).sum();
    let df = pooled.len().saturating_sub(1);
    let p = if impossible > 0 {
        0.0
    } else if df == 0 {
        1.0
    } else {
        ChiSquared::new(df as f64).unwrap().sf(statistic)
    };
    ChiSquare {
        statistic,
        df,
        p,
        impossible,
    }
}

/// Tally of keys.
pub fn tally<K: Ord>(keys: impl IntoIterator<Item = K>) -> BTreeMap<K, u64> {
    let mut m = BTreeMap::new();
    for k in keys {
        *m.entry(k).or_insert(0) += 1;
    }
    m
}
