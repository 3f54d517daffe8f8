//! Published large-size checks on the whole line Z (TASEP, step data).
//!
//! Colors: first class 2, second class 1, hole 0 (larger is stronger).

use crate::common;

use std::sync::OnceLock;

use motley_exclusion::{LineData, LineProcess, Rates, Reading, Readout};
use rayon::prelude::*;

const T_LONG: f64 = 1000.0;
const T_SHORT: f64 = 100.0;
/// Samples of the second-class run at t = 1000 (about 1e6 attempts each).
const N_LONG: u64 = 800;
/// Samples of each run at t = 100 (about 1e4 attempts each).
const N_SHORT: u64 = 20_000;

/// Sites of the density check at t = 1000, each averaged over ±HALF sites.
const ROST_SITES: [i64; 3] = [-500, 0, 500];
const HALF: i64 = 20;

struct LongRuns {
    /// Per sample: occupation (color ≥ 1) at each of the Rost sites' windows, flattened.
    occupation: Vec<Vec<u8>>,
    /// Per sample: the second-class particle's position.
    second: Vec<i64>,
}

fn second_class_process() -> LineProcess {
    // First class on x < 0, second class at 0, holes on x > 0.
    LineProcess::new(
        LineData::step_with(2, 0, &[(0, 1)]).unwrap(),
        Rates::tasep(1.0).unwrap(),
    )
}

fn long_runs() -> &'static LongRuns {
    static RUNS: OnceLock<LongRuns> = OnceLock::new();
    RUNS.get_or_init(|| {
        let process = second_class_process();
        let mut readouts: Vec<Readout> = ROST_SITES
            .iter()
            .map(|&x| Readout::Window {
                from: x - HALF,
                to: x + HALF,
            })
            .collect();
        readouts.push(Readout::Positions { color: 1 });
        let plan = process.plan(&[T_LONG], readouts).unwrap();
        let start = std::time::Instant::now();
        let per: Vec<(Vec<u8>, i64)> = (0..N_LONG)
            .into_par_iter()
            .map(|i| {
                let r = process.sample(7001, i, &plan);
                let v = &r.values[0];
                let mut occ = Vec::new();
                for w in &v[..ROST_SITES.len()] {
                    let Reading::Colors(w) = w else {
                        unreachable!()
                    };
                    occ.extend(w.iter().map(|&c| u8::from(c >= 1)));
                }
                let Reading::Positions(p) = &v[ROST_SITES.len()] else {
                    unreachable!()
                };
                (occ, p[0])
            })
            .collect();
        println!("long runs: {N_LONG} samples in {:?}", start.elapsed());
        let (occupation, second) = per.into_iter().unzip();
        LongRuns { occupation, second }
    })
}

/// Step data 1{x ≤ 0} (one species): occupations at `IDENTITY_SITES` at t = 100 and, for the
/// near-miss, at t = 80.
fn short_step() -> &'static Vec<[Vec<u8>; 2]> {
    static RUNS: OnceLock<Vec<[Vec<u8>; 2]>> = OnceLock::new();
    RUNS.get_or_init(|| {
        let process = LineProcess::new(LineData::step(1), Rates::tasep(1.0).unwrap());
        let readouts = IDENTITY_SITES
            .iter()
            .map(|&x| Readout::Window { from: x, to: x })
            .collect();
        let plan = process.plan(&[0.8 * T_SHORT, T_SHORT], readouts).unwrap();
        (0..N_SHORT)
            .into_par_iter()
            .map(|i| {
                let r = process.sample(7003, i, &plan);
                let occ = |k: usize| -> Vec<u8> {
                    r.values[k]
                        .iter()
                        .map(|w| match w {
                            Reading::Colors(c) => u8::from(c[0] >= 1),
                            _ => unreachable!(),
                        })
                        .collect()
                };
                [occ(1), occ(0)]
            })
            .collect()
    })
}

const IDENTITY_SITES: [i64; 9] = [-80, -60, -40, -20, 0, 20, 40, 60, 80];

/// The second-class particle's position at t = 100, N_SHORT samples.
fn short_second() -> &'static Vec<i64> {
    static RUNS: OnceLock<Vec<i64>> = OnceLock::new();
    RUNS.get_or_init(|| {
        let process = second_class_process();
        let plan = process
            .plan(&[T_SHORT], vec![Readout::Positions { color: 1 }])
            .unwrap();
        (0..N_SHORT)
            .into_par_iter()
            .map(|i| {
                let Reading::Positions(p) = &process.sample(7002, i, &plan).values[0][0] else {
                    unreachable!()
                };
                p[0]
            })
            .collect()
    })
}

/// Kolmogorov distance between the empirical law of `values / t` and Uniform[−1, 1].
fn ks_uniform(values: &[i64], t: f64) -> f64 {
    let mut v: Vec<f64> = values.iter().map(|&x| x as f64 / t).collect();
    v.sort_by(f64::total_cmp);
    let n = v.len() as f64;
    let cdf = |u: f64| ((u + 1.0) / 2.0).clamp(0.0, 1.0);
    let mut d: f64 = 0.0;
    let mut i = 0;
    while i < v.len() {
        let mut j = i;
        while j < v.len() && v[j] == v[i] {
            j += 1;
        }
        let f = cdf(v[i]);
        d = d
            .max((f - i as f64 / n).abs())
            .max((j as f64 / n - f).abs());
        i = j;
    }
    d
}

/// TASEP step density: E η_t(x) → (1 − x/t)/2 for |x| ≤ t (Rost 1981, "Non-equilibrium behaviour
/// of a many particle process: density profile and local equilibria"). Step data 1{x ≤ 0} is the
/// colorblind view (colors ≥ 1) of the second-class runs. Per sample we average the occupation over
/// the 41 sites x0 ± 20 (the profile is linear there, so the average has no bias); the estimate's
/// standard error is computed from the per-sample averages (correlations included).
/// Tolerance: z · SE with z for two-sided 1e-6/3 per site (Bonferroni over 3 sites; normal
/// approximation of a mean of 800 i.i.d. bounded variables — common practice), plus a finite-size
/// allowance 0.01 ≈ t^{−2/3} at t = 1000 (the mean height's t^{1/3} correction differentiated in x;
/// KPZ scaling, from memory). Near-miss: the profile of time 0.8 t lies outside the tolerance.
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn rost_density_at_t_1000() {
    let long = long_runs();
    let z = common::z_two_sided(1e-6 / 3.0);
    let w = (2 * HALF + 1) as usize;
    for (k, &x) in ROST_SITES.iter().enumerate() {
        let per: Vec<f64> = long
            .occupation
            .iter()
            .map(|o| {
                o[k * w..(k + 1) * w]
                    .iter()
                    .map(|&b| f64::from(b))
                    .sum::<f64>()
                    / w as f64
            })
            .collect();
        let n = per.len() as f64;
        let mean = per.iter().sum::<f64>() / n;
        let var = per.iter().map(|p| (p - mean).powi(2)).sum::<f64>() / (n - 1.0);
        let tol = z * (var / n).sqrt() + 0.01;
        let rost = (1.0 - x as f64 / T_LONG) / 2.0;
        let wrong = (1.0 - x as f64 / (0.8 * T_LONG)) / 2.0;
        println!("x={x}: density {mean:.4}, Rost {rost:.4}, tolerance {tol:.4}, near-miss (t'=0.8t) {wrong:.4}");
        assert!((mean - rost).abs() < tol);
        if x != 0 {
            assert!(
                (mean - wrong).abs() > tol,
                "near-miss not rejected at x={x}"
            );
        }
    }
}

/// Exact finite-t identity from the basic coupling (our own derivation; the coupling is Liggett
/// 1985, Ch. VIII): with the second-class particle at 0 between first-class particles on x < 0 and
/// holes on x > 0, the colorblind views {≥ second} and {≥ first} are step TASEPs from 1{x ≤ 0} and
/// 1{x < 0}, differing exactly at X(t); hence P(X(t) = y) = ρ(y) − ρ(y+1) and
/// P(X(t) ≥ x) = ρ_t(x), the one-species density from 1{x ≤ 0}.
/// Compared at 9 sites from independent runs of the two processes (N = 20000 each). Band: Hoeffding
/// (1963) for a difference of two independent means of N terms in [0, 1]:
/// P(|D − E D| ≥ ε) ≤ 2 exp(−N ε²); ε = sqrt(ln(2 · 9 / 1e-6) / N) gives simultaneous false alarm
/// 1e-6 (Bonferroni over the 9 sites). Near-miss: the density at time 0.8 t leaves the band.
#[test]
fn second_class_tail_equals_step_density() {
    let second = short_second();
    let step = short_step();
    let n = N_SHORT as f64;
    let eps = ((2.0 * IDENTITY_SITES.len() as f64 / 1e-6).ln() / n).sqrt();
    let mut worst_near_miss: f64 = 0.0;
    for (k, &x) in IDENTITY_SITES.iter().enumerate() {
        let tail = second.iter().filter(|&&p| p >= x).count() as f64 / n;
        let rho = step.iter().map(|s| f64::from(s[0][k])).sum::<f64>() / n;
        let rho_early = step.iter().map(|s| f64::from(s[1][k])).sum::<f64>() / n;
        println!("x={x}: P(X ≥ x) = {tail:.4}, ρ_t(x) = {rho:.4}, ρ_0.8t(x) = {rho_early:.4}, band ±{eps:.4}");
        assert!((tail - rho).abs() < eps, "identity fails at x={x}");
        worst_near_miss = worst_near_miss.max((tail - rho_early).abs());
    }
    assert!(
        worst_near_miss > eps,
        "near-miss not rejected: {worst_near_miss}"
    );
}

/// X(t)/t → Uniform[−1, 1] in law (Ferrari and Kipnis 1995, "Second class particles in the
/// rarefaction fan"). At finite t most of the Kolmogorov distance sits at the edges: the mass
/// P(|X(t)| > t) outside [−t, t] (0.12 at t = 100). Calibrated part: Wilson intervals for that mass
/// at t = 100 and t = 1000 (simultaneous false alarm 1e-6, Bonferroni 5e-7 each) must be disjoint,
/// the t = 1000 one below. Kolmogorov distances: D_N(1000) ≤ 0.13 fails with probability ≤ 1e-6
/// whenever the true distance is ≤ 0.13 − ε_DKW = 0.035, ε_DKW = sqrt(ln(2/1e-6) / (2N)) = 0.095 for
/// N = 800 (Dvoretzky–Kiefer–Wolfowitz with Massart's 1990 constant; 0.035 is above the t^{−1/3}
/// extrapolation 0.027 of the t = 100 value — an assumption, not a theorem); D_N(1000) < D_N(100)
/// is asserted on the fixed seeds as the visible shrinking, calibrated only through the edge-mass
/// intervals above.
#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn second_class_speed_is_uniform() {
    let short = short_second();
    let long = &long_runs().second;
    let d_short = ks_uniform(short, T_SHORT);
    let d_long = ks_uniform(long, T_LONG);
    let z = common::z_two_sided(1e-6 / 2.0);
    let outside = |v: &[i64], t: f64| v.iter().filter(|&&x| (x as f64).abs() > t).count() as u64;
    let (lo_s, hi_s) = common::wilson(outside(short, T_SHORT), short.len() as u64, z);
    let (lo_l, hi_l) = common::wilson(outside(long, T_LONG), long.len() as u64, z);
    println!(
        "Kolmogorov distance to U[−1,1]: t=100: {d_short:.4} (N={}), t=1000: {d_long:.4} (N={})",
        short.len(),
        long.len()
    );
    println!("P(|X(t)| > t): t=100 in [{lo_s:.4}, {hi_s:.4}], t=1000 in [{lo_l:.4}, {hi_l:.4}]");
    assert!(hi_l < lo_s, "edge mass did not shrink");
    assert!(d_long <= 0.13);
    assert!(d_long < d_short);
    // Near-miss: X(t)/t is not uniform on [−1/2, 1/2] (a speed law of half the width).
    let half: Vec<i64> = long.iter().map(|&x| 2 * x).collect();
    let d_half = ks_uniform(&half, T_LONG);
    println!("near-miss U[−1/2,1/2]: {d_half:.4}");
    assert!(d_half > 0.2);
}
