//! Limit shape of the height function under the step boundary.
//!
//! Source: A. Borodin, I. Corwin and V. Gorin, "Stochastic six-vertex model", Duke Math. J. 165
//! (2016), Theorem 1.1, restated in our conventions (path from below continues up with probability
//! `b1`, path from the left continues right with probability `b2`; step boundary = a path enters every
//! row from the left) and re-derived from the stationary flux `κρ/(1 + (κ − 1)ρ)`: with
//! `κ = (1 − b1)/(1 − b2) > 1`,
//! `H(Lx, Ly)/L → y − x` for `x ≤ y/κ`, `(√(κy) − √x)²/(κ − 1)` for `y/κ ≤ x ≤ κy`, `0` beyond.

use motley_sixvertex::{Boundary, HeightQuery, Model, ReadoutSpec};
use rayon::prelude::*;

const B1: f64 = 0.3;
const B2: f64 = 0.6;

fn limit(x: f64, y: f64) -> f64 {
    let kappa = (1.0 - B1) / (1.0 - B2);
    if x <= y / kappa {
        y - x
    } else if x <= kappa * y {
        ((kappa * y).sqrt() - x.sqrt()).powi(2) / (kappa - 1.0)
    } else {
        0.0
    }
}

/// Mean and standard error of H(Lx, Ly)/L over `n` samples.
fn mean_height(l: usize, x: f64, y: f64, n: u64, seed: u64) -> (f64, f64) {
    let (a, b) = (
        (x * l as f64).round() as usize,
        (y * l as f64).round() as usize,
    );
    // H(a, b) only depends on the vertices in columns 1..=a and rows 1..=b.
    let model = Model::new(B1, B2, Boundary::step(a, b).unwrap()).unwrap();
    let spec = ReadoutSpec {
        heights: vec![HeightQuery::all(a, b)],
        ..ReadoutSpec::default()
    };
    let values: Vec<f64> = (0..n)
        .into_par_iter()
        .map_init(
            || model.readout(spec.clone()).unwrap(),
            |out, i| {
                model.sample(seed, i, out);
                out.heights()[0] as f64 / l as f64
            },
        )
        .collect();
    let mean = values.iter().sum::<f64>() / n as f64;
    let var = values.iter().map(|v| (v - mean).powi(2)).sum::<f64>() / (n - 1) as f64;
    (mean, (var / n as f64).sqrt())
}

/// Finite-size excess of the mean of H(Lx, Ly)/L over the limit at L = 600, b1 = 0.3, b2 = 0.6,
/// x/y = 0.8: about +0.008 (from the lead's check computation; our own run gives 0.0084). It decays
/// like L^(−2/3) (KPZ scaling of the mean correction, L^(1/3) in H), so at L = 1000 we expect about
/// 0.008 · (600/1000)^(2/3) ≈ 0.0057; we allow twice that (the prefactor is known only roughly).
const EXCESS_AT_600: f64 = 0.008;

/// Number of standard errors of every check below. A two-sided normal tail at 5 SE is 5.7e-7, so
/// the four noise-limited checks together raise a false alarm with probability below 2.3e-6
/// (union bound; normal approximation of a mean of ≥ 1000 samples). Seeds are fixed.
const Z: f64 = 5.0;

#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn height_approaches_the_limit_shape() {
    let (x, y) = (0.8, 1.0);
    let target = limit(x, y);
    let (m1000, se1000) = mean_height(1000, x, y, 1000, 11);
    let (m250, se250) = mean_height(250, x, y, 4000, 12);
    let (e1000, e250) = (m1000 - target, m250 - target);
    println!("limit {target:.5}; L=250: mean {m250:.5} (se {se250:.5}), excess {e250:.5}");
    println!("L=1000: mean {m1000:.5} (se {se1000:.5}), excess {e1000:.5}");
    let allowance = 2.0 * EXCESS_AT_600 * (600.0f64 / 1000.0).powf(2.0 / 3.0);
    // The mean at L = 1000 lies within [limit, limit + allowance], up to noise.
    assert!(
        e1000 > -Z * se1000,
        "mean below the limit shape: excess {e1000}"
    );
    assert!(
        e1000 < allowance + Z * se1000,
        "excess {e1000} above allowance {allowance}"
    );
    // The excess shrinks from L = 250 to L = 1000 ...
    let se_diff = (se250 * se250 + se1000 * se1000).sqrt();
    assert!(
        e250 - e1000 > Z * se_diff,
        "excess did not shrink: {e250} → {e1000}"
    );
    // ... roughly as L^(−2/3): the ratio should be near 4^(2/3) ≈ 2.52; accept [1.5, 4].
    let ratio = e250 / e1000;
    println!("excess ratio L=250 / L=1000: {ratio:.3} (L^(-2/3) predicts 2.52)");
    assert!((1.5..4.0).contains(&ratio), "excess ratio {ratio}");
}

/// The frozen regions: for x well below y/κ the height is y − x, for x well beyond κy it is 0
/// (checked at L = 1000). The slack 1e-3 is our own choice (the heights there are deterministic in
/// practice: the fluctuations in a frozen region are exponentially small).
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn frozen_regions() {
    let (m, se) = mean_height(1000, 0.3, 1.0, 100, 13);
    println!(
        "x=0.3: mean {m:.5} se {se:.5}, limit {:.5}",
        limit(0.3, 1.0)
    );
    // Every one of the first 300 columns is filled, so H = 1000 − 300 exactly in most samples.
    assert!((m - limit(0.3, 1.0)).abs() < 1e-3 + Z * se);
    let (m, se) = mean_height(1000, 1.0, 0.4, 100, 14);
    println!(
        "x/y=2.5: mean {m:.5} se {se:.5}, limit {:.5}",
        limit(1.0, 0.4)
    );
    assert!(m < 1e-3 + Z * se);
}
