//! The q-moment E[q^H] of the colorblind step-boundary height function against the four-point
//! recursion of `motley_reference::SixVertexQMoments`.
//!
//! Source of the relation: A. Borodin and V. Gorin, "A stochastic telegraph equation from the
//! six-vertex model", Ann. Probab. 47 (2019) (attribution and general shape from memory). In our
//! conventions (derived in `motley-reference/src/six_vertex_q_moment.rs` and checked here): with
//! q = b1/b2,
//! ξ = q^H(x+1, y+1) − b2·q^H(x, y+1) − b1·q^H(x+1, y) + (b1 + b2 − 1)·q^H(x, y)
//! has conditional mean 0 given everything below and to the left of the vertex (x + 1, y + 1).
//!
//! Heights are computed here from the README definition (paths crossing the horizontal line
//! b + ½ right of a + ½, plus right exits in rows ≤ b), read off the exact law of the exits of
//! `exact_law` in rationals, so the check is independent of the derivation.

use motley_reference::SixVertexQMoments;
use motley_sixvertex::{
    exact_law, ratio, Boundary, HeightQuery, Model, Outcome, ReadoutSpec, Side,
};
use num_rational::BigRational;
use num_traits::{One, Signed, ToPrimitive, Zero};

/// Weights as (numerator, denominator) pairs: q < 1 and q > 1, b1 + b2 below and above 1.
const WEIGHTS: [((i64, i64), (i64, i64)); 5] = [
    ((3, 10), (3, 5)), // q = 1/2
    ((1, 3), (3, 4)),  // q = 4/9
    ((7, 10), (1, 5)), // q = 7/2
    ((4, 5), (9, 10)), // q = 8/9, b1 + b2 > 1
    ((1, 2), (1, 4)),  // q = 2
];

fn rational(w: (i64, i64)) -> BigRational {
    ratio(w.0, w.1)
}

fn float(w: (i64, i64)) -> f64 {
    w.0 as f64 / w.1 as f64
}

fn power(q: &BigRational, n: usize) -> BigRational {
    (0..n).fold(BigRational::one(), |acc, _| acc * q)
}

fn occupied(colors: &[u32]) -> usize {
    colors.iter().filter(|&&c| c > 0).count()
}

/// H(a, b) of an outcome, when b is the top row (b = H): top exits right of a + ½ plus all right
/// exits.
fn height_top(o: &Outcome, a: usize) -> usize {
    occupied(&o.top[a..]) + occupied(&o.right)
}

/// H(a, b) of an outcome, when a is the right side (a = W): right exits in rows 1..=b.
fn height_right(o: &Outcome, b: usize) -> usize {
    occupied(&o.right[..b])
}

/// E[q^h(outcome)] under the exact law, in rationals.
fn mean_q_power(
    law: &motley_sixvertex::ExactLaw<Outcome, BigRational>,
    q: &BigRational,
    h: impl Fn(&Outcome) -> usize,
) -> BigRational {
    law.entries()
        .iter()
        .fold(BigRational::zero(), |acc, (o, p)| acc + p * power(q, h(o)))
}

/// The expected four-point combination at one vertex with inputs `i` (from below) and `j` (from
/// the left), for the relation with base `q`, weight `c_left` on q^H(x, y+1), `c_below` on
/// q^H(x+1, y) and `c_diag` on q^H(x, y) (the true relation: b2, b1, −(b1 + b2 − 1)).
///
/// On a 1 × 1 rectangle (x = 0, y = 0) by the definition of H: H(0, 0) = i (the bottom edge crosses
/// the line ½ right of ½), H(1, 0) = 0, H(0, 1) = top + right exits, H(1, 1) = right exit.
fn vertex_gap(
    b1: &BigRational,
    b2: &BigRational,
    q: &BigRational,
    (c_left, c_below, c_diag): (&BigRational, &BigRational, &BigRational),
    i: u32,
    j: u32,
) -> BigRational {
    let boundary = Boundary::new(1, 1, Side::Explicit(vec![j]), Side::Explicit(vec![i])).unwrap();
    let law = exact_law(b1.clone(), b2.clone(), &boundary).unwrap();
    assert_eq!(law.total(), BigRational::one());
    let h00 = i as usize;
    let h10 = 0;
    let upper_right = mean_q_power(&law, q, |o| occupied(&o.right));
    let upper_left = mean_q_power(&law, q, |o| occupied(&o.top) + occupied(&o.right));
    upper_right - c_left * upper_left - c_below * power(q, h10) - c_diag * power(q, h00)
}

/// (a) The local identity, exactly: for every input pair the conditional mean of ξ is 0.
#[test]
fn four_point_identity_is_exact_at_one_vertex() {
    for (w1, w2) in WEIGHTS {
        let (b1, b2) = (rational(w1), rational(w2));
        let q = &b1 / &b2;
        let c_diag = -(&b1 + &b2 - BigRational::one());
        for i in 0..=1 {
            for j in 0..=1 {
                let gap = vertex_gap(&b1, &b2, &q, (&b2, &b1, &c_diag), i, j);
                assert!(
                    gap.is_zero(),
                    "b1 = {b1}, b2 = {b2}, i = {i}, j = {j}: {gap}"
                );
            }
        }
    }
}

/// (c) Near misses at one vertex: q = b2/b1 instead of b1/b2, or b1 and b2 exchanged in the
/// weights, leave a nonzero exact gap. By the derivation the gaps are, for q' = b2/b1 and input
/// (1, 1), −(q' − 1)(b2·q' − b1); for exchanged weights and input (0, 1), (q − 1)(b2 − b1) =
/// −(b1 − b2)²/b2. Both vanish only when b1 = b2.
#[test]
fn wrong_relations_fail_at_one_vertex() {
    for (w1, w2) in WEIGHTS {
        let (b1, b2) = (rational(w1), rational(w2));
        let one = BigRational::one();
        let q = &b1 / &b2;
        let q_wrong = &b2 / &b1;
        let c_diag = -(&b1 + &b2 - &one);
        let mut worst_q = BigRational::zero();
        let mut worst_swap = BigRational::zero();
        for i in 0..=1 {
            for j in 0..=1 {
                let g = vertex_gap(&b1, &b2, &q_wrong, (&b2, &b1, &c_diag), i, j);
                if i == 1 && j == 1 {
                    let want = -(&q_wrong - &one) * (&b2 * &q_wrong - &b1);
                    assert_eq!(g, want);
                }
                worst_q = worst_q.max(g.abs());
                let g = vertex_gap(&b1, &b2, &q, (&b1, &b2, &c_diag), i, j);
                if i == 0 && j == 1 {
                    let want = -(&b1 - &b2) * (&b1 - &b2) / &b2;
                    assert_eq!(g, want);
                }
                worst_swap = worst_swap.max(g.abs());
            }
        }
        println!(
            "b1 = {b1}, b2 = {b2}: largest gap with q = b2/b1: {worst_q} ≈ {:.4}; with b1, b2 \
             exchanged: {worst_swap} ≈ {:.4}",
            worst_q.to_f64().unwrap(),
            worst_swap.to_f64().unwrap()
        );
        assert!(worst_q.to_f64().unwrap() > 0.01);
        assert!(worst_swap.to_f64().unwrap() > 0.01);
    }
}

/// A four-point recursion in rationals on the (W + 1) × (H + 1) grid (row-major, index
/// y·(W + 1) + x) with base `q`, weight `c_left` on the left neighbour, `c_below` on the one below
/// and `−(c_left + c_below − 1)` on the diagonal one, from the step-boundary values 1 and q^y.
fn recursion(
    q: &BigRational,
    c_left: &BigRational,
    c_below: &BigRational,
    width: usize,
    height: usize,
) -> Vec<BigRational> {
    let c = c_left + c_below - BigRational::one();
    let row = width + 1;
    let mut t = vec![BigRational::one(); row * (height + 1)];
    for y in 1..=height {
        t[y * row] = power(q, y);
        for x in 1..=width {
            t[y * row + x] = c_left * &t[y * row + x - 1] + c_below * &t[(y - 1) * row + x]
                - &c * &t[(y - 1) * row + x - 1];
        }
    }
    t
}

/// The true recursion in rationals: q = b1/b2, b2 on the left neighbour, b1 on the one below.
fn rational_table(
    b1: &BigRational,
    b2: &BigRational,
    width: usize,
    height: usize,
) -> Vec<BigRational> {
    recursion(&(b1 / b2), b2, b1, width, height)
}

/// Largest |E[q^H] − recursion| over the top row and the right column of a `width` × `height`
/// rectangle, E taken under the exact law.
fn boundary_gap(
    law: &motley_sixvertex::ExactLaw<Outcome, BigRational>,
    q: &BigRational,
    table: &[BigRational],
    width: usize,
    height: usize,
) -> BigRational {
    let row = width + 1;
    let top = (0..=width)
        .map(|a| (mean_q_power(law, q, |o| height_top(o, a)) - &table[height * row + a]).abs());
    let right = (0..=height)
        .map(|b| (mean_q_power(law, q, |o| height_right(o, b)) - &table[b * row + width]).abs());
    top.chain(right).fold(BigRational::zero(), |m, g| m.max(g))
}

/// (b) E[q^H] from the exact law along the top row and the right column equals the recursion:
/// exactly in rationals, and to 1e-12 for the `f64` table of motley-reference (whose weights are
/// the nearest doubles to the rationals, off by about 1e-17), on every rectangle from 1 × 1 to
/// 4 × 4 for each of the five weight pairs.
#[test]
fn recursion_matches_exact_law_up_to_4x4() {
    let mut checked = 0;
    let mut worst = 0.0f64;
    for (w1, w2) in WEIGHTS {
        let (b1, b2) = (rational(w1), rational(w2));
        let q = &b1 / &b2;
        for width in 1..=4 {
            for height in 1..=4 {
                let law = exact_law(
                    b1.clone(),
                    b2.clone(),
                    &Boundary::step(width, height).unwrap(),
                )
                .unwrap();
                let exact = rational_table(&b1, &b2, width, height);
                let table = SixVertexQMoments::new(float(w1), float(w2), width, height).unwrap();
                let row = width + 1;
                let top = (0..=width).map(|a| {
                    let m = mean_q_power(&law, &q, |o| height_top(o, a));
                    ((a, height), m)
                });
                let right = (0..=height).map(|b| {
                    let m = mean_q_power(&law, &q, |o| height_right(o, b));
                    ((width, b), m)
                });
                for ((x, y), m) in top.chain(right) {
                    assert_eq!(
                        m,
                        exact[y * row + x],
                        "rational recursion, b1 = {b1}, b2 = {b2}, {width}x{height}, ({x}, {y})"
                    );
                    let gap = (m.to_f64().unwrap() - table.mean_q_power(x, y)).abs();
                    worst = worst.max(gap);
                    assert!(
                        gap < 1e-12,
                        "f64 table, b1 = {b1}, b2 = {b2}, {width}x{height}, ({x}, {y}): gap {gap:e}"
                    );
                    checked += 1;
                }
            }
        }
    }
    println!(
        "{checked} points on 80 rectangles: rational recursion exact, f64 table within {worst:.2e}"
    );
}

/// The `f64` table's rounding-error bound holds: against the rational recursion run on the exact
/// binary values of the same `f64` weights (so the only difference is rounding), on 20 × 20.
#[test]
fn error_bound_holds_on_20x20() {
    let size = 20;
    for (b1, b2) in [(0.3, 0.6), (0.8, 0.9), (0.7, 0.2)] {
        let table = SixVertexQMoments::new(b1, b2, size, size).unwrap();
        let exact = rational_table(
            &<BigRational as motley_sixvertex::Weight>::from_f64(b1),
            &<BigRational as motley_sixvertex::Weight>::from_f64(b2),
            size,
            size,
        );
        let exact_f64 = |v: f64| <BigRational as motley_sixvertex::Weight>::from_f64(v);
        let (mut worst_ratio, mut worst_relative) = (0.0f64, 0.0f64);
        for y in 0..=size {
            for x in 0..=size {
                // The comparison itself in rationals: no rounding besides the table's own.
                let exact_value = &exact[y * (size + 1) + x];
                let gap = (exact_value - exact_f64(table.mean_q_power(x, y))).abs();
                let bound = table.error_bound(x, y);
                assert!(
                    gap <= exact_f64(bound),
                    "b1 = {b1}, b2 = {b2}, ({x}, {y}): {gap} > {bound:e}"
                );
                let (gap, value) = (gap.to_f64().unwrap(), exact_value.to_f64().unwrap());
                worst_relative = worst_relative.max(gap / value.abs());
                if bound > 0.0 {
                    worst_ratio = worst_ratio.max(gap / bound);
                }
            }
        }
        println!(
            "b1 = {b1}, b2 = {b2}: relative error at most {worst_relative:.2e}, absolute error at \
             most {worst_ratio:.3} of its bound"
        );
    }
}

/// (c) Near misses on the whole grid, exactly in rationals on 4 × 4: the recursion with the wrong
/// base q' = b2/b1 (against the exact E[q'^H]) and the recursion with b1 and b2 exchanged in its
/// weights (against the exact E[q^H], q = b1/b2) both leave a nonzero gap on the top row or the
/// right column, while the true recursion leaves exactly 0.
#[test]
fn wrong_recursions_miss_exact_law() {
    let (width, height) = (4, 4);
    for (w1, w2) in WEIGHTS {
        let (b1, b2) = (rational(w1), rational(w2));
        let law = exact_law(
            b1.clone(),
            b2.clone(),
            &Boundary::step(width, height).unwrap(),
        )
        .unwrap();
        let q = &b1 / &b2;
        let q_wrong = &b2 / &b1;
        let right = boundary_gap(
            &law,
            &q,
            &recursion(&q, &b2, &b1, width, height),
            width,
            height,
        );
        assert!(right.is_zero());
        let wrong_q = boundary_gap(
            &law,
            &q_wrong,
            &recursion(&q_wrong, &b2, &b1, width, height),
            width,
            height,
        );
        let swapped = boundary_gap(
            &law,
            &q,
            &recursion(&q, &b1, &b2, width, height),
            width,
            height,
        );
        let (wrong_q, swapped) = (wrong_q.to_f64().unwrap(), swapped.to_f64().unwrap());
        println!(
            "b1 = {b1}, b2 = {b2}, 4x4: gap 0 for the true recursion, {wrong_q:.4} with q = b2/b1, \
             {swapped:.4} with b1 and b2 exchanged"
        );
        assert!(wrong_q > 1e-3 && swapped > 1e-3);
    }
}

const MC_B1: f64 = 0.5;
const MC_B2: f64 = 0.7;
const MC_SIZE: usize = 60;
const MC_POINTS: [(usize, usize); 3] = [(30, 45), (45, 40), (55, 60)];
const MC_SAMPLES: u64 = 5000;
const MC_SEED: u64 = 20_190_047;

/// Two-sided normal tail at 5.3 standard errors: P(|Z| > 5.3) = 1.16e-7, so over the 3 points the
/// false-alarm rate is at most 3 × 1.16e-7 ≈ 3.5e-7 (normal approximation of the sample mean of a
/// variable bounded in [0, 1], with 5000 samples; the seed is fixed, so a build passes or fails for
/// good).
const MC_SIGMAS: f64 = 5.3;

/// Sample mean and standard error of q^H at `MC_POINTS` under weights (b1, b2) of the sampler,
/// with q = MC_B1/MC_B2 always.
fn monte_carlo(b1: f64, b2: f64) -> Vec<(f64, f64)> {
    let q = MC_B1 / MC_B2;
    let model = Model::new(b1, b2, Boundary::step(MC_SIZE, MC_SIZE).unwrap()).unwrap();
    let spec = ReadoutSpec {
        heights: MC_POINTS
            .iter()
            .map(|&(a, b)| HeightQuery { a, b, threshold: 1 })
            .collect(),
        ..ReadoutSpec::default()
    };
    let mut out = model.readout(spec).unwrap();
    let mut sum = [0.0f64; 3];
    let mut sum_sq = [0.0f64; 3];
    for i in 0..MC_SAMPLES {
        model.sample(MC_SEED, i, &mut out);
        for (k, &h) in out.heights().iter().enumerate() {
            let v = q.powi(h as i32);
            sum[k] += v;
            sum_sq[k] += v * v;
        }
    }
    let n = MC_SAMPLES as f64;
    (0..3)
        .map(|k| {
            let mean = sum[k] / n;
            let var = (sum_sq[k] - n * mean * mean) / (n - 1.0);
            (mean, (var / n).sqrt())
        })
        .collect()
}

/// (d) Monte Carlo on 60 × 60 at three interior points (in the curved region of the limit shape,
/// κ = (1 − b1)/(1 − b2) = 5/3), b1 = 0.5, b2 = 0.7, q = 5/7: the sample mean of q^H is within
/// 5.3 standard errors of the recursion at each point. Power check: the sampler with b1 and b2
/// exchanged is many standard errors off.
#[test]
fn monte_carlo_matches_recursion_on_60x60() {
    let table = SixVertexQMoments::new(MC_B1, MC_B2, MC_SIZE, MC_SIZE).unwrap();
    for (&(a, b), (mean, se)) in MC_POINTS.iter().zip(monte_carlo(MC_B1, MC_B2)) {
        let want = table.mean_q_power(a, b);
        let z = (mean - want) / se;
        println!(
            "H({a}, {b}): E q^H = {want:.6} (bound {:.1e}), sample mean {mean:.6} ± {se:.6}, z = {z:+.2}",
            table.error_bound(a, b)
        );
        assert!(z.abs() < MC_SIGMAS, "H({a}, {b}): z = {z}");
    }
    let mut smallest = f64::INFINITY;
    for (&(a, b), (mean, se)) in MC_POINTS.iter().zip(monte_carlo(MC_B2, MC_B1)) {
        let z = (mean - table.mean_q_power(a, b)) / se;
        println!("exchanged sampler, H({a}, {b}): z = {z:+.1}");
        smallest = smallest.min(z.abs());
    }
    assert!(
        smallest > 2.0 * MC_SIGMAS,
        "exchanged sampler not rejected: |z| ≥ {smallest}"
    );
}
