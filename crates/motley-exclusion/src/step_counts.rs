//! One-species TASEP from step data, sampled through exponential last-passage times.
//!
//! Particles start on every site `x ≤ 0` and jump right at rate 1. Number them from the right:
//! particle `j ≥ 1` starts at `1 − j`. Its `k`-th jump happens at
//! `G(j, k) = w(j, k) + max(G(j − 1, k), G(j, k − 1))` with independent `Exp(1)` weights `w` and
//! `G(0, ·) = G(·, 0) = 0` (Rost 1981; the last-passage form used by Johansson 2000). Particle
//! `j` stands right of the origin after its `j`-th jump, and `G(j, j)` increases with `j`, so the
//! number of particles at sites `> 0` at time `t` is `N_t = max{j : G(j, j) ≤ t}`.
//!
//! This is an independent algorithm for the same law as [`crate::LineProcess`]'s particle count
//! (`Readout::Height` at site 0 of the step data): it draws about `N_t²` exponentials instead of
//! about `t²` attempts, so it serves as a cross-check of the engine and for the many samples the
//! Tracy–Widom trend needs. It is not used by scenarios.
//!
//! Stream layout: sample `i` under seed `s` draws the weights from
//! [`motley_stream::sample_stream`]`(s, i, `[`STEP_COUNT_STREAM`]`)` with `rand_distr` 0.6's
//! `Exp1`, in the order the square `{1 … m}²` is grown: for `m = 1, 2, …`, first column `m`
//! (rows `1 … m − 1`), then row `m` (columns `1 … m`).

use rand_distr::{Distribution, Exp1};

use crate::error::ExclusionError;

/// The stream of [`step_counts`] (distinct from the engines' streams).
pub const STEP_COUNT_STREAM: u64 = 7;

/// `N_t` at each of `times` (finite, ≥ 0, increasing) for sample `index` under `seed`.
///
/// # Errors
/// [`ExclusionError::NoTimes`], [`ExclusionError::BadTime`] (negative or not finite) or
/// [`ExclusionError::TimesNotIncreasing`].
pub fn step_counts(seed: u64, index: u64, times: &[f64]) -> Result<Vec<u64>, ExclusionError> {
    if times.is_empty() {
        return Err(ExclusionError::NoTimes);
    }
    if let Some(&t) = times.iter().find(|t| !t.is_finite() || **t < 0.0) {
        return Err(ExclusionError::BadTime(t));
    }
    if let Some(i) = (1..times.len()).find(|&i| times[i] <= times[i - 1]) {
        return Err(ExclusionError::TimesNotIncreasing {
            index: i,
            value: times[i],
            previous: times[i - 1],
        });
    }
    let mut rng = motley_stream::sample_stream(seed, index, STEP_COUNT_STREAM);
    // column[i] = G(i + 1, m) and row[k] = G(m, k + 1) for the current m.
    let mut column: Vec<f64> = Vec::new();
    let mut row: Vec<f64> = Vec::new();
    let mut counts = Vec::with_capacity(times.len());
    let mut next = 0;
    let mut m = 0usize;
    loop {
        m += 1;
        // Column m, rows 1 … m − 1: G(i, m) = w + max(G(i − 1, m), G(i, m − 1)).
        let mut above = 0.0f64;
        for g in column.iter_mut() {
            let w: f64 = Exp1.sample(&mut rng);
            above = w + above.max(*g);
            *g = above;
        }
        // Row m, columns 1 … m: G(m, k) = w + max(G(m − 1, k), G(m, k − 1)); G(m − 1, m) is the
        // last entry of the new column, pushed onto the row first.
        let mut left = 0.0f64;
        row.push(above);
        for g in row.iter_mut() {
            let w: f64 = Exp1.sample(&mut rng);
            left = w + left.max(*g);
            *g = left;
        }
        let diagonal = left;
        column.push(diagonal);
        while next < times.len() && diagonal > times[next] {
            counts.push((m - 1) as u64);
            next += 1;
        }
        if next == times.len() {
            return Ok(counts);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// G(1, 1) = w(1, 1): one particle jumps once, so P(N_t ≥ 1) = 1 − e^(−t); at t = 0.5 over
    /// 20 000 samples the count of N_t ≥ 1 is Binomial(20 000, 0.3935); 5 standard deviations
    /// (two-sided 5.7e-7) is ±0.0173.
    #[test]
    fn first_particle_leaves_at_rate_one() {
        let n = 20_000u64;
        let hits = (0..n)
            .filter(|&i| step_counts(5, i, &[0.5]).unwrap()[0] >= 1)
            .count() as f64;
        let p = 1.0 - (-0.5f64).exp();
        assert!((hits / n as f64 - p).abs() < 5.0 * (p * (1.0 - p) / n as f64).sqrt());
    }

    /// Counts are nondecreasing in time and the same seed gives the same counts.
    #[test]
    fn monotone_and_reproducible() {
        let times = [1.0, 10.0, 100.0];
        for i in 0..50 {
            let a = step_counts(9, i, &times).unwrap();
            assert_eq!(a, step_counts(9, i, &times).unwrap());
            assert!(a.windows(2).all(|w| w[0] <= w[1]));
        }
    }

    #[test]
    fn bad_times_are_refused() {
        assert!(step_counts(1, 0, &[]).is_err());
        assert!(step_counts(1, 0, &[2.0, 1.0]).is_err());
        assert!(step_counts(1, 0, &[-1.0]).is_err());
        assert_eq!(step_counts(1, 0, &[0.0]).unwrap(), vec![0]);
        assert!(step_counts(1, 0, &[f64::NAN]).is_err());
    }
}
