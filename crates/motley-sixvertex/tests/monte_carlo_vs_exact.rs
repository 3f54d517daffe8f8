//! Monte Carlo agrees with the exact law: chi-square of 10⁵ samples per case against the exact joint
//! law of the exits (from our own dynamic programme, which is checked independently by hand cases and
//! by the color–position symmetry of Borodin and Bufetov 2021). Each test rejects only if p < 1e-6,
//! so its false-alarm rate is 1e-6 (seeds are fixed, so a given build either passes or fails for good).
//! The same test run on deliberately wrong vertex rules must give p < 1e-6.

use crate::common::{chi_square, tally, FALSE_ALARM};
use motley_sixvertex::{exact_law, Boundary, ColorRule, Model, Outcome, Side, VertexRule};

const SAMPLES: u64 = 100_000;

struct Case {
    name: &'static str,
    b1: f64,
    b2: f64,
    boundary: Boundary,
}

fn cases() -> Vec<Case> {
    vec![
        Case {
            name: "rainbow 3x3",
            b1: 0.3,
            b2: 0.6,
            boundary: Boundary::rainbow(3, 3).unwrap(),
        },
        Case {
            name: "2x3, five distinct boundary colors",
            b1: 0.55,
            b2: 0.25,
            boundary: Boundary::new(
                2,
                3,
                Side::Explicit(vec![2, 5, 3]),
                Side::Explicit(vec![4, 1]),
            )
            .unwrap(),
        },
        Case {
            name: "3x3, random Bernoulli boundaries",
            b1: 0.7,
            b2: 0.2,
            boundary: Boundary::new(
                3,
                3,
                Side::Bernoulli {
                    density: 0.5,
                    color: ColorRule::Index { offset: 0 },
                },
                Side::Bernoulli {
                    density: 0.375,
                    color: ColorRule::Index { offset: 3 },
                },
            )
            .unwrap(),
        },
        Case {
            name: "colorblind step 4x4",
            b1: 0.3,
            b2: 0.6,
            boundary: Boundary::step(4, 4).unwrap(),
        },
    ]
}

fn p_value(case: &Case, rule: VertexRule, seed: u64) -> f64 {
    let model = Model::new(case.b1, case.b2, case.boundary.clone())
        .unwrap()
        .with_rule(rule);
    let law = exact_law(case.b1, case.b2, &case.boundary).unwrap();
    let mut out = model.readout(Default::default()).unwrap();
    let counts = tally((0..SAMPLES).map(|i| -> Outcome {
        model.sample(seed, i, &mut out);
        out.outcome()
    }));
    let r = chi_square(&law, &counts);
    println!(
        "{} ({rule:?}): chi2 = {:.2}, df = {}, p = {:.3e}, impossible = {}",
        case.name, r.statistic, r.df, r.p, r.impossible
    );
    r.p
}

#[test]
fn standard_rule_passes() {
    for (k, case) in cases().iter().enumerate() {
        let p = p_value(case, VertexRule::Standard, 1000 + k as u64);
        assert!(p >= FALSE_ALARM, "{}: p = {p:e}", case.name);
    }
}

/// Power check: the wrong rules are rejected at the same level (they change the law by a TV far
/// above what 10⁵ samples resolve).
#[test]
fn wrong_rules_fail() {
    let cs = cases();
    let wrong = [
        (0, VertexRule::SwappedWeights),
        (3, VertexRule::SwappedWeights),
        (0, VertexRule::OccupancyOnly),
        (1, VertexRule::OccupancyOnly),
        (2, VertexRule::OccupancyOnly),
    ];
    for (k, rule) in wrong {
        let p = p_value(&cs[k], rule, 2000 + k as u64);
        assert!(
            p < FALSE_ALARM,
            "{} with {rule:?} not rejected: p = {p:e}",
            cs[k].name
        );
    }
}
