//! The exact joint law of heights ([`exact_law_with_heights`], [`exact_height_law`]) checked two
//! independent ways.
//!
//! 1. **Brute force** (exact, in rationals): on every rectangle with `W, H ≤ 4`, two boundaries
//!    (rainbow; an explicit one with repeated colors and paths from below) and three weight pairs,
//!    every vertex's choice (straight or turn) is enumerated, each complete configuration gets its
//!    weight as a monomial `b1^i (1 − b1)^j b2^k (1 − b2)^l` (a turn where the two incoming colors are
//!    equal has weight 0 and is skipped), and the heights are read off the configuration by their
//!    definition. The law of every single height `H_t(a, b)` (all points, all thresholds) and the
//!    joint law of (exits, three heights) must equal the programme's exactly (difference 0 in
//!    rationals). The same comparison against a brute force with `b1` and `b2` exchanged, or with
//!    the right exits counted one row short, must show a positive difference.
//! 2. **Monte Carlo**: 10⁵ samples of the engine's height read-out against the exact joint law of
//!    several heights, chi-square with pooling (see `common`), rejecting only if p < 1e-6 (the
//!    false-alarm rate of each test; seeds are fixed, so a build passes or fails for good). The
//!    deliberately wrong vertex rules must be rejected at the same level.

use std::collections::BTreeMap;

use crate::common::{chi_square, tally, FALSE_ALARM};
use motley_sixvertex::{
    exact_height_law, exact_law_with_heights, ratio, Boundary, Color, ExactLaw, HeightQuery, Model,
    Outcome, ReadoutSpec, Side, VertexRule,
};
use num_rational::BigRational;
use num_traits::{One, Zero};

/// Exponents of `b1, 1 − b1, b2, 1 − b2` in a configuration's weight.
type Monomial = [u8; 4];

/// What the brute force reads off one complete configuration.
struct Config {
    outcome: Outcome,
    /// `vert[y][x]`: color on the vertical edge above vertex `(x + 1, y)`; `y = 0` is the bottom.
    vert: Vec<Vec<Color>>,
}

/// Every complete configuration of the rectangle with its weight monomial. `swap` exchanges the
/// roles of `b1` and `b2` (a deliberately wrong rule).
fn configurations(left: &[Color], bottom: &[Color], swap: bool) -> Vec<(Config, Monomial)> {
    let (w, h) = (bottom.len(), left.len());
    let n = w * h;
    let mut out = Vec::new();
    'choice: for mask in 0u32..(1u32 << n) {
        let mut mono = [0u8; 4];
        let mut vert = vec![bottom.to_vec()];
        let mut right = Vec::with_capacity(h);
        let mut cur = bottom.to_vec();
        for (y, &l) in left.iter().enumerate() {
            let mut carry = l;
            for (x, slot) in cur.iter_mut().enumerate() {
                let straight = mask >> (y * w + x) & 1 == 1;
                let (i, j) = (*slot, carry);
                if i == j {
                    if !straight {
                        continue 'choice;
                    }
                    continue;
                }
                let from_below = (i > j) != swap;
                let factor = match (from_below, straight) {
                    (true, true) => 0,
                    (true, false) => 1,
                    (false, true) => 2,
                    (false, false) => 3,
                };
                mono[factor] += 1;
                if !straight {
                    std::mem::swap(slot, &mut carry);
                }
            }
            right.push(carry);
            vert.push(cur.clone());
        }
        out.push((
            Config {
                outcome: Outcome { top: cur, right },
                vert,
            },
            mono,
        ));
    }
    out
}

/// `H_t(a, b)` read off a configuration by the definition; `short` counts the right exits of rows
/// `1..b` only (a deliberately wrong definition).
fn height(c: &Config, q: HeightQuery, short: bool) -> u64 {
    let t = q.threshold.max(1);
    let rows = if short { q.b.saturating_sub(1) } else { q.b };
    let above = c.vert[q.b][q.a..].iter().filter(|&&k| k >= t).count();
    let right = c.outcome.right[..rows].iter().filter(|&&k| k >= t).count();
    (above + right) as u64
}

fn pow(x: &BigRational, e: u8) -> BigRational {
    (0..e).fold(BigRational::one(), |acc, _| acc * x)
}

/// The law of `key(config)` summed over complete configurations: monomials are tallied first, then
/// evaluated at `(b1, b2)`.
fn brute_law<K: Ord + Clone>(
    configs: &[(Config, Monomial)],
    b1: &BigRational,
    b2: &BigRational,
    key: impl Fn(&Config) -> K,
) -> ExactLaw<K, BigRational> {
    let mut tallies: BTreeMap<K, BTreeMap<Monomial, u64>> = BTreeMap::new();
    for (c, m) in configs {
        *tallies.entry(key(c)).or_default().entry(*m).or_insert(0) += 1;
    }
    let one = BigRational::one();
    let factors = [b1.clone(), &one - b1, b2.clone(), &one - b2];
    ExactLaw::from_entries(tallies.into_iter().map(|(k, monos)| {
        let mut p = BigRational::zero();
        for (m, count) in monos {
            let mut term = BigRational::from_integer(count.into());
            for (f, e) in factors.iter().zip(m) {
                term *= pow(f, e);
            }
            p += term;
        }
        (k, p)
    }))
}

fn weights() -> Vec<(BigRational, BigRational)> {
    vec![
        (ratio(1, 3), ratio(3, 5)),
        (ratio(7, 10), ratio(1, 4)),
        (ratio(1, 1), ratio(1, 2)),
    ]
}

/// The two boundaries of the brute-force check on a `w × h` rectangle.
fn boundaries(w: usize, h: usize) -> Vec<(&'static str, Vec<Color>, Vec<Color>)> {
    vec![
        ("rainbow", (1..=h as Color).collect(), vec![0; w]),
        (
            "explicit with repeats",
            [2, 1, 2, 3][..h].to_vec(),
            [0, 3, 1, 2][..w].to_vec(),
        ),
    ]
}

fn all_queries(w: usize, h: usize, max_color: Color) -> Vec<HeightQuery> {
    let mut qs = Vec::new();
    for a in 0..=w {
        for b in 0..=h {
            for threshold in 1..=max_color {
                qs.push(HeightQuery { a, b, threshold });
            }
        }
    }
    qs
}

/// Three heights at different points and thresholds, for the joint check.
fn joint_queries(w: usize, h: usize) -> Vec<HeightQuery> {
    vec![
        HeightQuery {
            a: w / 2,
            b: h / 2,
            threshold: 2,
        },
        HeightQuery {
            a: 1,
            b: h,
            threshold: 1,
        },
        HeightQuery {
            a: w,
            b: h - 1,
            threshold: h as Color,
        },
    ]
}

#[test]
fn every_height_law_equals_the_brute_force_sum() {
    let mut compared = 0usize;
    for w in 1..=4 {
        for h in 1..=4 {
            for (name, left, bottom) in boundaries(w, h) {
                let boundary = Boundary::new(
                    w,
                    h,
                    Side::Explicit(left.clone()),
                    Side::Explicit(bottom.clone()),
                )
                .unwrap();
                let configs = configurations(&left, &bottom, false);
                let max_color = boundary.max_color();
                for (b1, b2) in weights() {
                    for q in all_queries(w, h, max_color) {
                        let exact = exact_law_with_heights(b1.clone(), b2.clone(), &boundary, &[q])
                            .unwrap();
                        let exact = exact.map(|(_, v)| v[0]);
                        let brute = brute_law(&configs, &b1, &b2, |c| height(c, q, false));
                        assert_eq!(exact, brute, "{w}x{h} {name} b1={b1} b2={b2} {q:?}");
                        let coarse = exact_height_law(b1.clone(), b2.clone(), &boundary, &[q])
                            .unwrap()
                            .map(|v| v[0]);
                        assert_eq!(coarse, brute, "coarse: {w}x{h} {name} {q:?}");
                        compared += 1;
                    }
                    let qs = joint_queries(w, h);
                    let exact =
                        exact_law_with_heights(b1.clone(), b2.clone(), &boundary, &qs).unwrap();
                    let brute = brute_law(&configs, &b1, &b2, |c| {
                        (
                            c.outcome.clone(),
                            qs.iter()
                                .map(|&q| height(c, q, false))
                                .collect::<Vec<u64>>(),
                        )
                    });
                    assert_eq!(exact.total(), BigRational::one());
                    assert_eq!(exact, brute, "joint: {w}x{h} {name} b1={b1} b2={b2}");
                }
            }
        }
    }
    println!("{compared} single-height laws equal to the brute force");
    assert!(compared > 1000);
}

/// The comparison above can fail: a brute force with the weights exchanged, or with the right exits
/// counted one row short, differs from the programme by a positive total variation.
#[test]
fn a_wrong_brute_force_differs() {
    let (left, bottom) = (vec![1, 2, 3], vec![0, 0, 0]);
    let boundary = Boundary::rainbow(3, 3).unwrap();
    let (b1, b2) = (ratio(1, 3), ratio(3, 5));
    let q = HeightQuery {
        a: 1,
        b: 2,
        threshold: 2,
    };
    let exact = exact_law_with_heights(b1.clone(), b2.clone(), &boundary, &[q])
        .unwrap()
        .map(|(_, v)| v[0]);
    let swapped = brute_law(&configurations(&left, &bottom, true), &b1, &b2, |c| {
        height(c, q, false)
    });
    let short = brute_law(&configurations(&left, &bottom, false), &b1, &b2, |c| {
        height(c, q, true)
    });
    let (tv_swapped, tv_short) = (
        exact.total_variation(&swapped),
        exact.total_variation(&short),
    );
    println!("TV to swapped weights {tv_swapped}, to short right exits {tv_short}");
    assert!(tv_swapped > BigRational::zero());
    assert!(tv_short > BigRational::zero());
}

const SAMPLES: u64 = 100_000;

struct Case {
    name: &'static str,
    b1: f64,
    b2: f64,
    boundary: Boundary,
    queries: Vec<HeightQuery>,
}

fn q(a: usize, b: usize, threshold: Color) -> HeightQuery {
    HeightQuery { a, b, threshold }
}

fn cases() -> Vec<Case> {
    vec![
        Case {
            name: "rainbow 3x3, four heights",
            b1: 0.3,
            b2: 0.6,
            boundary: Boundary::rainbow(3, 3).unwrap(),
            queries: vec![q(1, 1, 1), q(2, 2, 2), q(1, 3, 3), q(3, 2, 1)],
        },
        Case {
            name: "4x4 explicit, three heights",
            b1: 0.55,
            b2: 0.25,
            boundary: Boundary::new(
                4,
                4,
                Side::Explicit(vec![2, 1, 2, 3]),
                Side::Explicit(vec![0, 3, 1, 2]),
            )
            .unwrap(),
            queries: vec![q(2, 2, 2), q(1, 4, 1), q(4, 3, 3)],
        },
        Case {
            name: "rainbow 5x4, three heights",
            b1: 0.7,
            b2: 0.2,
            boundary: Boundary::rainbow(5, 4).unwrap(),
            queries: vec![q(2, 3, 1), q(3, 2, 2), q(5, 4, 3)],
        },
    ]
}

fn p_value(case: &Case, rule: VertexRule, seed: u64) -> f64 {
    let model = Model::new(case.b1, case.b2, case.boundary.clone())
        .unwrap()
        .with_rule(rule);
    let law = exact_height_law(case.b1, case.b2, &case.boundary, &case.queries).unwrap();
    let mut out = model
        .readout(ReadoutSpec {
            heights: case.queries.clone(),
            ..ReadoutSpec::default()
        })
        .unwrap();
    let counts = tally((0..SAMPLES).map(|i| {
        model.sample(seed, i, &mut out);
        out.heights().to_vec()
    }));
    let r = chi_square(&law, &counts);
    println!(
        "{} ({rule:?}): chi2 = {:.2}, df = {}, p = {:.3e}, impossible = {}",
        case.name, r.statistic, r.df, r.p, r.impossible
    );
    r.p
}

#[test]
fn sampled_heights_follow_the_exact_law() {
    for (k, case) in cases().iter().enumerate() {
        let p = p_value(case, VertexRule::Standard, 3000 + k as u64);
        assert!(p >= FALSE_ALARM, "{}: p = {p:e}", case.name);
    }
}

/// Power check: the deliberately wrong rules are rejected at the same level.
#[test]
fn sampled_heights_of_wrong_rules_are_rejected() {
    let cs = cases();
    let wrong = [
        (0, VertexRule::SwappedWeights),
        (2, VertexRule::SwappedWeights),
        (0, VertexRule::OccupancyOnly),
        (1, VertexRule::OccupancyOnly),
    ];
    for (k, rule) in wrong {
        let p = p_value(&cs[k], rule, 4000 + k as u64);
        assert!(
            p < FALSE_ALARM,
            "{} with {rule:?} not rejected: p = {p:e}",
            cs[k].name
        );
    }
}
