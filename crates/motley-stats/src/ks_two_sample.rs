//! Two-sample Kolmogorov–Smirnov test, exact for small samples and asymptotic for large ones.
//!
//! Both samples are reduced to their *support*: the distinct values in increasing order with the
//! count of each sample at each value. The statistic is kept as the exact integer
//! `max_t |A_t n_b − B_t n_a|` (`A_t`, `B_t` cumulative counts), so comparisons in the exact and
//! permutation p-values are exact and `D = that / (n_a n_b)`.
//!
//! # Method
//! **Exact** (`n_a n_b <= EXACT_TWO_SAMPLE_MAX_PRODUCT` under [`KsMethod::Auto`]): under a continuous
//! null the order of the pooled sample is a uniformly random lattice path from `(0, 0)` to
//! `(n_a, n_b)`; `P(D >= d)` is the probability that the path reaches a point with
//! `|i n_b − j n_a| >= d n_a n_b` (the classical lattice-path counting, e.g. Hodges 1957, Ark. Mat. 3).
//! We propagate the path *probabilities* (step `i → i+1` with probability `(n_a − i)/(n_a − i + n_b − j)`)
//! and add up the mass absorbed at the boundary, a sum of positive terms, so small p-values keep
//! their relative precision and nothing overflows. Cost `O(n_a n_b)`.
//! **Asymptotic**: `P(D >= d) ≈ Q_K((sqrt(n_e) + 0.12 + 0.11/sqrt(n_e)) d)`, `n_e = n_a n_b/(n_a + n_b)`,
//! `Q_K` the Kolmogorov survival function (Stephens 1970, JRSS B 32:115–122, as used in Press et al.,
//! *Numerical Recipes*, 3rd ed., 2007, §14.3.3).
//!
//! # Discrete data
//! With ties (integer positions, set sizes) the p-value above, computed for the continuous null, is
//! **conservative**: breaking ties at random gives a statistic at least as large, so
//! `P(D_ties >= d) <= P(D_continuous >= d)`. The result then has `ties = true` and
//! `conservative = true`; use [`crate::ks_permutation_test`] or a chi-square test on the support
//! ([`crate::chi_square_homogeneity`] on `CategoricalCounts<i64>`) for an exact-size test.

use std::hash::Hash;

use serde::{Deserialize, Serialize};

use crate::categorical_counts::aligned_counts;
use crate::kolmogorov::kolmogorov_sf;
use crate::{CategoricalCounts, ScalarSample, StatsError};

/// Largest `n_a n_b` for which [`KsMethod::Auto`] uses the exact two-sample p-value.
pub const EXACT_TWO_SAMPLE_MAX_PRODUCT: u64 = 10_000_000;

/// Which p-value to compute.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize, Default)]
pub enum KsMethod {
    /// Exact for small samples, asymptotic for large ones (thresholds documented per test).
    #[default]
    Auto,
    /// Always the exact method (cost grows quickly with the sample sizes).
    Exact,
    /// Always the asymptotic Kolmogorov approximation.
    Asymptotic,
}

/// Which method produced a KS p-value.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum KsPValueMethod {
    /// Exact distribution under the continuous null.
    Exact,
    /// Kolmogorov limit law with Stephens' finite-sample correction.
    Asymptotic,
}

/// Outcome of a Kolmogorov–Smirnov test.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct KsResult {
    /// `D = sup |F_a − F_b|` (or `sup |F_n − F|` for one sample).
    pub statistic: f64,
    /// `P(D >= statistic)` under the continuous null.
    pub p_value: f64,
    /// How the p-value was obtained.
    pub method: KsPValueMethod,
    /// Size of the (first) sample.
    pub n_a: u64,
    /// Size of the second sample (0 for a one-sample test).
    pub n_b: u64,
    /// Whether the data contain repeated values (discrete data).
    pub ties: bool,
    /// Whether the p-value is conservative (true with ties: the true size is below the nominal one).
    pub conservative: bool,
}

/// Pooled support of two samples: per distinct value (increasing), the counts of a and b.
#[derive(Clone, Debug, PartialEq, Eq)]
pub(crate) struct Support {
    pub cells: Vec<(u64, u64)>,
    pub n_a: u64,
    pub n_b: u64,
}

impl Support {
    pub fn from_sorted(a: &[f64], b: &[f64]) -> Support {
        let (mut i, mut j) = (0usize, 0usize);
        let mut cells = Vec::new();
        while i < a.len() || j < b.len() {
            let v = if j >= b.len() || (i < a.len() && a[i].total_cmp(&b[j]).is_le()) {
                a[i]
            } else {
                b[j]
            };
            let (mut ca, mut cb) = (0u64, 0u64);
            while i < a.len() && a[i] == v {
                ca += 1;
                i += 1;
            }
            while j < b.len() && b[j] == v {
                cb += 1;
                j += 1;
            }
            cells.push((ca, cb));
        }
        Support {
            cells,
            n_a: a.len() as u64,
            n_b: b.len() as u64,
        }
    }

    pub fn from_counts<K: Ord + Hash + Clone>(
        a: &CategoricalCounts<K>,
        b: &CategoricalCounts<K>,
    ) -> Support {
        Support {
            cells: aligned_counts(a, b)
                .into_iter()
                .map(|(_, x, y)| (x, y))
                .collect(),
            n_a: a.total(),
            n_b: b.total(),
        }
    }

    /// Whether some value is observed more than once in the pooled sample.
    pub fn ties(&self) -> bool {
        self.cells.iter().any(|&(x, y)| x + y > 1)
    }

    /// `max_t |A_t n_b − B_t n_a|`.
    pub fn statistic_numerator(&self) -> u128 {
        let (mut ca, mut cb) = (0u128, 0u128);
        let (na, nb) = (self.n_a as u128, self.n_b as u128);
        let mut best = 0u128;
        for &(x, y) in &self.cells {
            ca += x as u128;
            cb += y as u128;
            best = best.max((ca * nb).abs_diff(cb * na));
        }
        best
    }
}

/// Exact `P(D_{m,n} >= D_num / (m n))` under the continuous null (see the file header).
pub(crate) fn exact_two_sample_sf(m: u64, n: u64, d_num: u128) -> f64 {
    // The law is symmetric in (m, n); fixing the orientation makes the floating-point sequence, and
    // hence the result, bit-identical when the two samples are swapped.
    let (m, n) = (m.min(n), m.max(n));
    let (mu, nu) = (m as usize, n as usize);
    let (m128, n128) = (m as u128, n as u128);
    let outside = |i: usize, j: usize| (i as u128 * n128).abs_diff(j as u128 * m128) >= d_num;
    let mut q = vec![0.0f64; nu + 1];
    let mut absorbed = 0.0f64;
    let (mf, nf) = (m as f64, n as f64);
    for i in 0..=mu {
        for j in 0..=nu {
            let mut v = if i == 0 && j == 0 { 1.0 } else { 0.0 };
            if i > 0 {
                let ra = mf - (i - 1) as f64;
                v += q[j] * ra / (ra + nf - j as f64);
            }
            if j > 0 {
                let rb = nf - (j - 1) as f64;
                v += q[j - 1] * rb / (mf - i as f64 + rb);
            }
            if v != 0.0 && outside(i, j) {
                absorbed += v;
                v = 0.0;
            }
            q[j] = v;
        }
    }
    absorbed.min(1.0)
}

/// Asymptotic two-sample p-value with Stephens' correction.
pub(crate) fn asymptotic_two_sample_sf(m: u64, n: u64, d: f64) -> f64 {
    let en = (m as f64) * (n as f64) / ((m + n) as f64);
    let s = en.sqrt();
    kolmogorov_sf((s + 0.12 + 0.11 / s) * d)
}

pub(crate) fn ks_on_support(support: &Support, method: KsMethod) -> KsResult {
    let (m, n) = (support.n_a, support.n_b);
    let d_num = support.statistic_numerator();
    let statistic = d_num as f64 / (m as f64 * n as f64);
    let use_exact = match method {
        KsMethod::Exact => true,
        KsMethod::Asymptotic => false,
        KsMethod::Auto => (m as u128) * (n as u128) <= EXACT_TWO_SAMPLE_MAX_PRODUCT as u128,
    };
    let (p_value, used) = if d_num == 0 {
        (1.0, KsPValueMethod::Exact)
    } else if use_exact {
        (exact_two_sample_sf(m, n, d_num), KsPValueMethod::Exact)
    } else {
        (
            asymptotic_two_sample_sf(m, n, statistic),
            KsPValueMethod::Asymptotic,
        )
    };
    let ties = support.ties();
    KsResult {
        statistic,
        p_value,
        method: used,
        n_a: m,
        n_b: n,
        ties,
        conservative: ties,
    }
}

/// Two-sample KS test on real-valued samples.
///
/// # Errors
/// [`StatsError::EmptySample`] if either sample is empty.
///
/// # Examples
/// ```
/// use motley_stats::{ks_two_sample, KsMethod, ScalarSample};
/// let a = ScalarSample::from_values(vec![0.1, 0.4, 0.7, 0.9]).unwrap();
/// let b = ScalarSample::from_values(vec![1.2, 1.5, 1.9]).unwrap();
/// let r = ks_two_sample(&a, &b, KsMethod::Auto).unwrap();
/// assert_eq!(r.statistic, 1.0);
/// // Exact: 2 of the C(7, 3) = 35 orderings separate the samples completely.
/// assert!((r.p_value - 2.0 / 35.0).abs() < 1e-15);
/// ```
pub fn ks_two_sample(
    a: &ScalarSample,
    b: &ScalarSample,
    method: KsMethod,
) -> Result<KsResult, StatsError> {
    if a.is_empty() {
        return Err(StatsError::EmptySample { which: "a" });
    }
    if b.is_empty() {
        return Err(StatsError::EmptySample { which: "b" });
    }
    let support = Support::from_sorted(&a.sorted_values(), &b.sorted_values());
    Ok(ks_on_support(&support, method))
}

/// Two-sample KS test on histograms of ordered keys (for instance integer positions as `i64`).
/// Such data are discrete whenever a key is seen twice, and the result is then flagged conservative.
///
/// # Errors
/// [`StatsError::EmptySample`] if either sample is empty.
pub fn ks_two_sample_counts<K: Ord + Hash + Clone>(
    a: &CategoricalCounts<K>,
    b: &CategoricalCounts<K>,
    method: KsMethod,
) -> Result<KsResult, StatsError> {
    if a.total() == 0 {
        return Err(StatsError::EmptySample { which: "a" });
    }
    if b.total() == 0 {
        return Err(StatsError::EmptySample { which: "b" });
    }
    Ok(ks_on_support(&Support::from_counts(a, b), method))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_matches_brute_force_enumeration() {
        // Enumerate all C(9, 4) = 126 orderings of m = 4, n = 5 and count D >= d directly.
        let (m, n) = (4u64, 5u64);
        let mut stats = Vec::new();
        for mask in 0u32..(1 << 9) {
            if mask.count_ones() != 4 {
                continue;
            }
            let (mut i, mut j, mut best) = (0u128, 0u128, 0u128);
            for pos in 0..9 {
                if mask >> pos & 1 == 1 {
                    i += 1;
                } else {
                    j += 1;
                }
                best = best.max((i * 5).abs_diff(j * 4));
            }
            stats.push(best);
        }
        assert_eq!(stats.len(), 126);
        for d in 1..=20u128 {
            let count = stats.iter().filter(|&&s| s >= d).count();
            let want = count as f64 / 126.0;
            let got = exact_two_sample_sf(m, n, d);
            assert!((got - want).abs() < 1e-14, "d = {d}: {got} vs {want}");
        }
    }

    #[test]
    fn ties_are_flagged() {
        let a = ScalarSample::from_values(vec![1.0, 2.0, 2.0, 3.0]).unwrap();
        let b = ScalarSample::from_values(vec![2.0, 3.0, 4.0]).unwrap();
        let r = ks_two_sample(&a, &b, KsMethod::Auto).unwrap();
        assert!(r.ties && r.conservative);
        // F_a: 1/4, 3/4, 1, 1 ; F_b: 0, 1/3, 2/3, 1 at 1, 2, 3, 4 -> D = 5/12.
        assert!((r.statistic - 5.0 / 12.0).abs() < 1e-15);
    }
}
