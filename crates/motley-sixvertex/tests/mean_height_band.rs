//! Mean height of the step-boundary six-vertex model at L = 1000 within its band around the limit
//! shape, for three weight pairs: two against the KPZ shift, one (b1 close to b2) against our own
//! measured shift.
//!
//! # What is checked
//! Step boundary (a path enters every row from the left, none from below), rectangle of
//! `W = x_max·L` columns and `L = 1000` rows. One sweep reads `H(Lx, L)` at several `x` of the top
//! row `y = 1`: in the full region `x < 1/κ`, in the curved region `1/κ < x < κ`, and beyond `κ`
//! (empty region), `κ = (1 − b1)/(1 − b2)`. `H(a, b)` does not depend on `W ≥ a` (see the
//! read-out docs), so every point is read from the same sample.
//!
//! # Limit shape and fluctuation scale
//! `L·h(x, 1)` and `σ(x, 1)` come from `motley_reference::SixVertexStep` (motley-reference 0.1.0,
//! `height` and `fluctuation_scale`), which implements Borodin, Corwin and Gorin, "Stochastic
//! six-vertex model", Duke Math. J. 165 (2016): `(L·h − H(Lx, L))/(σ L^{1/3}) → F₂` (Tracy–Widom
//! GUE) in the curved region. Taking means, `E H ≈ L·h − E[F₂]·σ L^{1/3}`: the mean height sits
//! above the limit by about `1.7711·σ L^{1/3}` once L is large enough. We write
//! `c = (mean − L·h)/(σ L^{1/3})`; the limit theorem says c → 1.7711 as L → ∞, and says nothing
//! about how large L must be.
//!
//! # The bands
//! * Curved region, (0.3, 0.6) and (0.1, 0.19): `c ∈ [(1 − τ)·μ, (1 + τ)·μ]`, `μ = −E[F₂]`, i.e.
//!   `[L·h + 0.89·σL^{1/3}, L·h + 2.66·σL^{1/3}]`, widened by `Z` standard errors on each side.
//! * Curved region, (0.5, 0.55): `c ∈ [4, 10]`, widened by `Z` standard errors. This band is our
//!   own measurement (below), not a published value and not a consequence of the limit theorem.
//!   For b1 close to b2 the KPZ constant is not yet reached at L = 1000: c is about 7, four times
//!   the KPZ value, and the KPZ band is asserted to miss. What we can say is that the excess is
//!   still of lower order than L: `(mean − L·h)/L` is asserted to shrink from L = 250 to 1000.
//! * Full and empty regions, all pairs: `L·h ± FROZEN_SLACK`, widened by `Z` standard errors.
//!
//! # Measured excess (our own runs, not in this file)
//! (0.3, 0.6), κ = 1.75, at x = 0.7 / 1.0 / 1.3 / 1.6, 4000 samples per size (seed 1):
//! L = 250: 2.28 / 2.14 / 2.19 / 2.53; L = 500: 2.23 / 2.09 / 2.16 / 2.42;
//! L = 1000: 2.19 / 2.05 / 2.13 / 2.34; L = 2000: 2.11 / 2.00 / 2.07 / 2.26 (standard errors
//! ≈ 0.02).
//! (0.1, 0.19), κ = 10/9, at x = 0.97 / 1.0 / 1.03, 4000 samples (1000 at L = 4000):
//! L = 250: 2.28 / 2.25 / 2.27; L = 1000: 2.29 / 2.23 / 2.24; L = 4000: 2.20 / 2.15 / 2.16.
//! So the correction to the KPZ mean 1.771 is positive, shrinks slowly with L, and is at most 43 %
//! of it at L = 250 and 32 % at L = 1000 (x = 1.6 for the first pair; x = 0.95 for the second gives
//! c = 2.32 from 20000 samples). `TAU = 0.5` leaves room above that.
//!
//! (0.5, 0.55) has the same κ = 10/9 as (0.1, 0.19), hence the same `h` and `σ`, but b1/b2 = 0.91
//! (weak asymmetry). At x = 0.95 / 1.0 / 1.05, 4000 samples per size (seed 1), standard errors
//! ≈ 0.03:
//! L = 250: 6.94 / 6.40 / 6.99; L = 500: 7.12 / 6.67 / 7.08; L = 1000: 7.16 / 6.77 / 7.13;
//! L = 2000: 7.11 / 6.72 / 7.06.
//! So c is 6.4–7.2 from L = 250 to 2000 and varies by at most 0.38 across sizes (by < 0.1 from
//! L = 1000 to 2000, within noise), with no sign yet of the approach to 1.771. Nearer the edges
//! of the curved region it is larger (x = 0.92 / 1.08: 7.9–9.3), which is why the test points
//! stay at 0.95–1.05. `[4, 10]` leaves at least 2.4 on either side of every value above (over
//! six times its whole variation across sizes) and stays clear of the KPZ band. Since c hardly
//! moves, the excess grows like L^{1/3} and the excess in units of L shrinks like L^{−2/3}: at
//! x = 1, `(mean − L·h)/L` = 0.0302 at L = 250 and 0.0127 at L = 1000 (ratio 0.42;
//! 4^{−2/3} = 0.40). In our runs the correction grows as b1/b2 approaches 1 at fixed κ.
//! Fluctuations also reach further into the frozen regions at L = 1000: at x = 0.8 and 1.2 (the
//! frozen points of the second pair) 5.9 % and 29 % of 20000 samples (seed 2) differ from `L·h`,
//! so this pair uses x = 0.75 and 1.3, where 14 and 25 of those 20000 samples differ (each by 1).
//!
//! # False-alarm rate
//! Seeds are fixed. Curved points (4 + 3 + 3 = 10): if the true mean lies in the band, the mean of
//! 2000 samples leaves the band widened by 5 SE with probability at most
//! P(|N(0, 1)| > 5) = 5.7e-7 (normal approximation). Frozen points (2 + 2 + 2 = 6): for a mean of
//! n samples of which k deviate from `L·h` (by any amounts), mean/SE ≤ √(k(n − 1)/(n − k))
//! (Cauchy–Schwarz), so leaving `L·h ± (FROZEN_SLACK + 5 SE)` needs k ≥ 25. In 20000 samples per
//! point at L = 1000 (our own runs, other seeds) at most 25 deviated (x = 1.3 of the third pair;
//! 14 at x = 0.75 of it, 3 at x = 2.0 of the first, none at the three others), so
//! P(deviation) ≤ 1.75e-3 (one-sided 95 % Poisson bound) and
//! P(k ≥ 25 of 2000) ≤ (2000·p)^25/25! ≤ 3.5^25/25! < 2.5e-12. Shrink check: the drop in
//! `(mean − L·h)/L` from L = 250 to 1000 is about 100 SE of the difference (printed), so it comes
//! within 5 SE with probability below P(N(0, 1) > 90) < 1e-100. Union bound over all: below
//! 5.8e-6.
//!
//! # Near misses
//! Bands built the same way on κ × 1.1 and on κ / 1.1 must miss (by more than 5 SE) at least one
//! curved point, and the band with the shift of the wrong sign (reflected about `L·h`) must miss
//! every one; for (0.5, 0.55) the KPZ band must also miss every curved point. In our runs they
//! miss every curved point by 120–590 SE (printed), so these assertions hold except with
//! negligible probability.

use motley_reference::SixVertexStep;
use motley_sixvertex::{Boundary, HeightQuery, Model, ReadoutSpec};
use rayon::prelude::*;

/// Size: the row read is `y = L`, and `x` is in units of `L`.
const L: usize = 1000;

/// Samples per pair (every point of a pair is read from the same samples).
const SAMPLES: u64 = 2000;

/// Standard errors of noise allowed on each side of a band (false-alarm rate in the module docs).
const Z: f64 = 5.0;

/// μ = −E[F₂], the negated mean of the Tracy–Widom GUE law: E[F₂] = −1.7710868074 (Tracy and
/// Widom 1994; tabulated by Bornemann 2010, Markov Processes Relat. Fields 16; value from memory,
/// and the same value is checked by motley-reference 0.1.0's crate-level doc example).
const MU: f64 = 1.771_086_807_4;

/// Relative tolerance on the KPZ shift `μ σ L^{1/3}` for lower-order corrections (expected of
/// relative order L^{−1/3}, common practice). Our choice: about 1.5 times the largest correction we
/// measured at L = 1000 (32 %, module docs).
const TAU: f64 = 0.5;

/// Curved-region band `[c_lo, c_hi]` for `c = (mean − L·h)/(σ L^{1/3})`, before widening by noise.
type Shift = (f64, f64);

/// The KPZ band used for the first two pairs: `c ∈ [(1 − τ)μ, (1 + τ)μ]`.
const KPZ_SHIFT: Shift = ((1.0 - TAU) * MU, (1.0 + TAU) * MU);

/// The band for (0.5, 0.55), from our own measurements only (no published value; module docs):
/// measured c at the three curved points is 6.40–7.16 over L = 250…2000 and varies by at most
/// 0.38 across sizes, so `[4, 10]` leaves at least 2.4 (over 6 times that drift) on either side.
/// `c_lo = 4` also lies above the top of the KPZ band, 2.66.
const WEAK_SHIFT: Shift = (4.0, 10.0);

/// Absolute allowance on `H` in the full and empty regions, where `H = L·h` exactly in all but rare
/// samples at these points. Our choice (one part in 50000 of `L`).
const FROZEN_SLACK: f64 = 0.02;

/// Mean and standard error of `H(Lx, L)` at one point.
#[derive(Debug, Clone, Copy)]
struct Point {
    x: f64,
    mean: f64,
    se: f64,
}

/// Samples `H(xl, l)` at every `x` of `xs` from one sweep of an `x_max·l × l` rectangle per sample.
fn measure(b1: f64, b2: f64, l: usize, xs: &[f64], seed: u64) -> Vec<Point> {
    let columns: Vec<usize> = xs.iter().map(|x| (x * l as f64).round() as usize).collect();
    let width = *columns.iter().max().unwrap();
    let model = Model::new(b1, b2, Boundary::step(width, l).unwrap()).unwrap();
    let spec = ReadoutSpec {
        heights: columns.iter().map(|&a| HeightQuery::all(a, l)).collect(),
        ..ReadoutSpec::default()
    };
    let samples: Vec<Vec<u64>> = (0..SAMPLES)
        .into_par_iter()
        .map_init(
            || model.readout(spec.clone()).unwrap(),
            |out, i| {
                model.sample(seed, i, out);
                out.heights().to_vec()
            },
        )
        .collect();
    let n = SAMPLES as f64;
    columns
        .iter()
        .enumerate()
        .map(|(k, &a)| {
            let mean = samples.iter().map(|s| s[k] as f64).sum::<f64>() / n;
            let var = samples
                .iter()
                .map(|s| (s[k] as f64 - mean).powi(2))
                .sum::<f64>()
                / (n - 1.0);
            Point {
                x: a as f64 / l as f64,
                mean,
                se: (var / n).sqrt(),
            }
        })
        .collect()
}

/// The band for `H(Lx, L)` under the limit shape `m`, before widening by the noise; `shift` is
/// the curved-region band in units of `σ L^{1/3}`.
fn band(m: &SixVertexStep, x: f64, (c_lo, c_hi): Shift) -> (f64, f64) {
    let centre = L as f64 * m.height(x, 1.0);
    if m.is_curved(x, 1.0) {
        let scale = m.fluctuation_scale(x, 1.0).unwrap() * (L as f64).cbrt();
        (centre + c_lo * scale, centre + c_hi * scale)
    } else {
        (centre - FROZEN_SLACK, centre + FROZEN_SLACK)
    }
}

/// How many standard errors `p.mean` lies outside `band` (0 if inside).
fn outside_by(p: &Point, (lo, hi): (f64, f64)) -> f64 {
    let miss = (lo - p.mean).max(p.mean - hi).max(0.0);
    if miss == 0.0 {
        0.0
    } else if p.se == 0.0 {
        f64::INFINITY
    } else {
        miss / p.se
    }
}

fn check_pair(b1: f64, b2: f64, xs: &[f64], seed: u64) {
    check_pair_with(b1, b2, xs, seed, KPZ_SHIFT);
}

/// Checks every point of `xs` against its band (curved band `shift`) and the near misses; returns
/// the measured points.
fn check_pair_with(b1: f64, b2: f64, xs: &[f64], seed: u64, shift: Shift) -> Vec<Point> {
    let m = SixVertexStep::from_weights(b1, b2).unwrap();
    let k = m.kappa();
    // The points cover all three regions.
    assert!(xs.iter().any(|&x| x < 1.0 / k));
    assert!(xs.iter().any(|&x| m.is_curved(x, 1.0)));
    assert!(xs.iter().any(|&x| x > k));

    let points = measure(b1, b2, L, xs, seed);
    println!("b1 = {b1}, b2 = {b2}, κ = {k:.4}, L = {L}, {SAMPLES} samples");
    for p in &points {
        let (lo, hi) = band(&m, p.x, shift);
        let lh = L as f64 * m.height(p.x, 1.0);
        let c = m
            .fluctuation_scale(p.x, 1.0)
            .map(|s| (p.mean - lh) / (s * (L as f64).cbrt()));
        println!(
            "  x = {:.3}: mean {:.3} (se {:.3}), L·h {lh:.3}, band [{lo:.3}, {hi:.3}], c = {}",
            p.x,
            p.mean,
            p.se,
            c.map_or("-".to_string(), |c| format!("{c:.3}"))
        );
        assert!(
            p.mean >= lo - Z * p.se && p.mean <= hi + Z * p.se,
            "b1 = {b1}, b2 = {b2}, x = {}: mean {} (se {}) outside [{lo}, {hi}]",
            p.x,
            p.mean,
            p.se
        );
    }

    // Near miss: the same band built on κ perturbed by ±10 % misses the measured means.
    for factor in [1.1, 1.0 / 1.1] {
        let wrong = SixVertexStep::from_kappa(k * factor).unwrap();
        let misses: Vec<f64> = points
            .iter()
            .filter(|p| m.is_curved(p.x, 1.0))
            .map(|p| outside_by(p, band(&wrong, p.x, shift)))
            .collect();
        println!("  κ × {factor:.4}: curved points outside by {misses:.1?} SE");
        assert!(
            misses.iter().any(|&z| z > Z),
            "band of κ × {factor} still holds every curved point: {misses:?}"
        );
    }

    // Near miss: the KPZ shift with the wrong sign (the band reflected about L·h, i.e. the mean
    // below the limit) misses every curved point.
    let misses: Vec<f64> = points
        .iter()
        .filter(|p| m.is_curved(p.x, 1.0))
        .map(|p| {
            let lh = L as f64 * m.height(p.x, 1.0);
            let (lo, hi) = band(&m, p.x, shift);
            outside_by(p, (2.0 * lh - hi, 2.0 * lh - lo))
        })
        .collect();
    println!("  shift of the wrong sign: curved points outside by {misses:.1?} SE");
    assert!(
        misses.iter().all(|&z| z > Z),
        "band with the wrong sign holds a curved point: {misses:?}"
    );
    points
}

/// b1 = 0.3, b2 = 0.6: κ = 1.75, curved region 0.571 < x < 1.75.
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn mean_height_in_band_kappa_1_75() {
    check_pair(0.3, 0.6, &[0.45, 0.7, 1.0, 1.3, 1.6, 2.0], 71);
}

/// b1 = 0.1, b2 = 0.19: κ = 10/9, curved region 0.9 < x < 1.111.
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn mean_height_in_band_kappa_near_one() {
    check_pair(0.1, 0.19, &[0.8, 0.95, 1.0, 1.05, 1.2], 72);
}

/// b1 = 0.5, b2 = 0.55: the same κ = 10/9 (same `h` and `σ`) as the previous pair, b1/b2 = 0.91.
/// At L = 1000 the mean sits far above the KPZ band; the band checked is our measured one
/// (`WEAK_SHIFT`), and the excess over `L·h` in units of `L` must shrink from L = 250 to 1000.
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn mean_height_in_band_b1_close_to_b2() {
    let (b1, b2) = (0.5, 0.55);
    let points = check_pair_with(b1, b2, &[0.75, 0.95, 1.0, 1.05, 1.3], 73, WEAK_SHIFT);
    let m = SixVertexStep::from_weights(b1, b2).unwrap();

    // Near miss: the KPZ band of the first two pairs misses every curved point (at L = 1000 the
    // KPZ mean is not reached for this pair).
    let misses: Vec<f64> = points
        .iter()
        .filter(|p| m.is_curved(p.x, 1.0))
        .map(|p| outside_by(p, band(&m, p.x, KPZ_SHIFT)))
        .collect();
    println!("  KPZ band: curved points outside by {misses:.1?} SE");
    assert!(
        misses.iter().all(|&z| z > Z),
        "the KPZ band holds a curved point: {misses:?}"
    );

    // The excess over the limit shape in units of L, (mean − L·h)/L, shrinks from L = 250 to
    // L = 1000 at x = 1 by more than Z standard errors of the difference.
    let x = 1.0;
    let excess = |l: usize, p: &Point| {
        let lh = l as f64 * m.height(p.x, 1.0);
        ((p.mean - lh) / l as f64, p.se / l as f64)
    };
    let small = measure(b1, b2, 250, &[x], 74)[0];
    let large = *points.iter().find(|p| p.x == x).unwrap();
    let (e_small, se_small) = excess(250, &small);
    let (e_large, se_large) = excess(L, &large);
    let se = se_small.hypot(se_large);
    println!(
        "  (mean − L·h)/L at x = {x}: L = 250 {e_small:.5} (se {se_small:.5}), \
         L = {L} {e_large:.5} (se {se_large:.5}), drop {:.1} SE, ratio {:.3}",
        (e_small - e_large) / se,
        e_large / e_small
    );
    assert!(
        e_small - e_large > Z * se,
        "(mean − L·h)/L does not shrink from L = 250 ({e_small} ± {se_small}) \
         to L = {L} ({e_large} ± {se_large})"
    );
}
