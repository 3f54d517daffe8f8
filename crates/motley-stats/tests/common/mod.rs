//! Seeded samplers shared by the integration tests (ChaCha8, our own uniform and inverse-CDF draws,
//! so the streams do not depend on any distribution code in `rand`).

#![allow(dead_code)]

use rand_chacha::rand_core::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;

/// Generator for trial `trial` of test `test`: seed `test`, stream `trial` (set right after seeding).
pub fn rng(test: u64, trial: u64) -> ChaCha8Rng {
    let mut r = ChaCha8Rng::seed_from_u64(test);
    r.set_stream(trial);
    r
}

/// Uniform in [0, 1) with 53 random bits.
pub fn uniform(r: &mut ChaCha8Rng) -> f64 {
    (r.next_u64() >> 11) as f64 * (1.0 / (1u64 << 53) as f64)
}

/// Exponential with mean 1.
pub fn exponential(r: &mut ChaCha8Rng) -> f64 {
    -(1.0 - uniform(r)).ln()
}

/// A finite law on `0..p.len()` with inverse-CDF sampling.
pub struct Finite {
    cdf: Vec<f64>,
}

impl Finite {
    pub fn new(p: &[f64]) -> Finite {
        let mut acc = 0.0;
        let cdf = p
            .iter()
            .map(|x| {
                acc += x;
                acc
            })
            .collect();
        Finite { cdf }
    }

    pub fn draw(&self, r: &mut ChaCha8Rng) -> usize {
        let u = uniform(r) * self.cdf[self.cdf.len() - 1];
        self.cdf
            .partition_point(|&c| c <= u)
            .min(self.cdf.len() - 1)
    }

    /// Counts of `n` draws per cell.
    pub fn counts(&self, r: &mut ChaCha8Rng, n: usize) -> Vec<u64> {
        let mut c = vec![0u64; self.cdf.len()];
        for _ in 0..n {
            c[self.draw(r)] += 1;
        }
        c
    }
}

/// Law of a random subset of `0..q.len()` with independent inclusions, as probabilities of the
/// bit-set keys `0..2^len`.
pub fn product_set_law(q: &[f64]) -> Vec<f64> {
    let k = q.len();
    (0..1usize << k)
        .map(|s| {
            (0..k)
                .map(|i| if s >> i & 1 == 1 { q[i] } else { 1.0 - q[i] })
                .product()
        })
        .collect()
}
