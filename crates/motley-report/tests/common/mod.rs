//! Hand-built results shared by the integration tests: every field set from the types, with invented
//! numbers, so the tests check rendering and file handling, not any computation.

#![allow(dead_code)]

use motley_report::Picture;
use motley_scenario::result::{
    ClaimKindName, ClaimResult, DecidedBy, Decision, Discrepancy, Effect, ErrorControl, Estimates,
    ExactResult, Interval, Moments, Outcome, RunResult, ScenarioInfo, Series, TestResult, TestRole,
    Timing, SCHEMA,
};

/// A curve with a band of half-width `half` around `y`.
pub fn series(label: &str, x: Vec<f64>, y: Vec<f64>, half: f64) -> Series {
    Series {
        label: label.into(),
        lower: y.iter().map(|v| (v - half).max(0.0)).collect(),
        upper: y.iter().map(|v| (v + half).min(1.0)).collect(),
        x,
        y,
    }
}

/// An interval around `k / n` with invented bounds.
pub fn interval(label: &str, k: u64, n: u64) -> Interval {
    let p = k as f64 / n as f64;
    Interval {
        label: label.into(),
        successes: k,
        trials: n,
        estimate: p,
        wilson_lower: (p - 0.02).max(0.0),
        wilson_upper: (p + 0.02).min(1.0),
        exact_lower: (p - 0.025).max(0.0),
        exact_upper: (p + 0.025).min(1.0),
    }
}

/// A test row.
pub fn test(
    name: &str,
    statistic: f64,
    dof: Option<f64>,
    p: f64,
    adj: f64,
    alpha: f64,
) -> TestResult {
    TestResult {
        name: name.into(),
        statistic,
        dof,
        role: if name.starts_with("chi-square") {
            TestRole::Deciding
        } else {
            TestRole::Diagnostic
        },
        p_value: p,
        adjusted_p_value: adj,
        rejected: name.starts_with("chi-square") && adj < alpha,
        note: "pooled cells with expected count below 5".into(),
    }
}

/// A same-law claim decided by Monte Carlo, with sets (inclusion, size law, top outcomes) and
/// numbers (ECDF, moments); `rejected` picks the p-values.
pub fn same_law(id: &str, rejected: bool, alpha: f64) -> ClaimResult {
    let (p1, p2) = if rejected {
        (0.0, 3.1e-9)
    } else {
        (0.4123, 0.7311)
    };
    let tests = vec![
        test(
            "chi-square on the joint law",
            18.2,
            Some(14.0),
            p1,
            p1,
            alpha,
        ),
        test(
            "Kolmogorov–Smirnov on the set size",
            0.0121,
            None,
            p2,
            p2,
            alpha,
        ),
    ];
    let k: Vec<f64> = (0..6).map(f64::from).collect();
    let law_a = vec![0.05, 0.2, 0.3, 0.25, 0.15, 0.05];
    let law_b = vec![0.06, 0.19, 0.31, 0.24, 0.15, 0.05];
    let cdf = |law: &[f64]| {
        law.iter()
            .scan(0.0, |acc, p| {
                *acc += p;
                Some(*acc)
            })
            .collect::<Vec<f64>>()
    };
    ClaimResult {
        id: id.into(),
        kind: ClaimKindName::SameLaw,
        says: "Colors leaving through the top have the law of the colorblind occupation of the transposed rectangle.".into(),
        observables: vec!["top-exits".into(), "transposed-occupation".into()],
        decided_by: DecidedBy::MonteCarlo,
        rejected,
        decision: if rejected {
            Decision::Rejected
        } else {
            Decision::NotRejected
        },
        level: alpha,
        tolerance: None,
        look: None,
        verdict: if rejected {
            "The two laws differ.".into()
        } else {
            "No difference found between the two laws.".into()
        },
        samples: 20000,
        tests,
        effect: Some(Effect {
            measure: "total variation".into(),
            estimate: 0.0061,
            plug_in: Some(0.0103),
            same_law_level: Some(0.0042),
            upper_bound: 0.0143,
            detectable: 0.0187,
            detectable_measure: "total variation on the 14 compared cells".into(),
            covers: "differences between the 14 compared cells".into(),
        }),
        exact: None,
        stated: None,
        estimates: Estimates {
            inclusion: vec![
                series("top-exits", (1..=5).map(f64::from).collect(), vec![0.5, 0.42, 0.61, 0.33, 0.2], 0.01),
                series("", (1..=5).map(f64::from).collect(), vec![0.51, 0.41, 0.6, 0.34, 0.21], 0.01),
            ],
            size_law: vec![
                series("top-exits", k.clone(), law_a.clone(), 0.008),
                series("transposed-occupation", k.clone(), law_b.clone(), 0.008),
            ],
            ecdf: vec![
                series("top-exits", k.clone(), cdf(&law_a), 0.012),
                series("transposed-occupation", k.clone(), cdf(&law_b), 0.012),
            ],
            reference: None,
            probabilities: vec![],
            top_outcomes: vec![
                vec![
                    Outcome { value: "{1, 3}".into(), probability: 0.12 },
                    Outcome { value: "{3}".into(), probability: 0.09 },
                ],
                vec![Outcome { value: "{1, 3}".into(), probability: 0.118 }],
            ],
            moments: vec![
                Moments { label: "".into(), count: 20000, mean: 2.4, sd: 1.21 },
                Moments { label: "transposed-occupation".into(), count: 20000, mean: 2.39, sd: 1.22 },
            ],
            ..Estimates::default()
        },
    }
}

/// A law-of claim decided exactly, with total variation 0 up to `1e-13`, and a reference curve.
pub fn exact_law(id: &str) -> ClaimResult {
    let x: Vec<f64> = (-5..=5).map(f64::from).collect();
    let y: Vec<f64> = x.iter().map(|v| (v + 5.0 + 1.0) / 11.0).collect();
    ClaimResult {
        id: id.into(),
        kind: ClaimKindName::LawOf,
        says: "The second-class particle's position at time 3 has the law given by the density profile.".into(),
        observables: vec!["second-class-position".into()],
        decided_by: DecidedBy::Exact,
        rejected: false,
        decision: Decision::HoldsExactly,
        level: 0.01,
        tolerance: None,
        look: None,
        verdict: "Equal laws at this size.".into(),
        samples: 0,
        tests: vec![],
        effect: None,
        exact: Some(ExactResult {
            measure: Some(Discrepancy::KolmogorovDistance),
            discrepancy: 0.0,
            probability: None,
            outcomes: 11,
            error_bound: 1e-13,
        }),
        stated: None,
        estimates: Estimates {
            ecdf: vec![Series { label: "exact law".into(), lower: y.clone(), upper: y.clone(), x: x.clone(), y: y.clone() }],
            reference: Some(series("density profile tail", x, y, 0.0)),
            ..Estimates::default()
        },
    }
}

/// A probability claim over several times, no stated value.
pub fn swap_probability(id: &str) -> ClaimResult {
    ClaimResult {
        id: id.into(),
        kind: ClaimKindName::Probability,
        says: "Probability that the second- and third-class particles have swapped by time t."
            .into(),
        observables: vec!["swapped".into()],
        decided_by: DecidedBy::MonteCarlo,
        rejected: false,
        decision: Decision::NoClaim,
        level: 0.01,
        tolerance: None,
        look: None,
        verdict: "Estimated with intervals.".into(),
        samples: 4000,
        tests: vec![],
        effect: None,
        exact: None,
        stated: None,
        estimates: Estimates {
            probabilities: vec![
                interval("t = 5", 1800, 4000),
                interval("t = 10", 2200, 4000),
                interval("t = 20", 2480, 4000),
            ],
            reference: Some(series(
                "limit 2/3",
                vec![5.0, 20.0],
                vec![2.0 / 3.0, 2.0 / 3.0],
                0.0,
            )),
            ..Estimates::default()
        },
    }
}

/// A describe claim with one probability (no figure expected).
pub fn describe(id: &str) -> ClaimResult {
    ClaimResult {
        id: id.into(),
        kind: ClaimKindName::Describe,
        says: "".into(),
        observables: vec!["corner-occupied".into()],
        decided_by: DecidedBy::MonteCarlo,
        rejected: false,
        decision: Decision::NoClaim,
        level: 0.01,
        tolerance: None,
        look: None,
        verdict: "".into(),
        samples: 4000,
        tests: vec![],
        effect: None,
        exact: None,
        stated: None,
        estimates: Estimates {
            probabilities: vec![interval("corner occupied", 1000, 4000)],
            ..Estimates::default()
        },
    }
}

/// A whole result with the given claims.
pub fn run(claims: Vec<ClaimResult>) -> RunResult {
    RunResult {
        schema: SCHEMA.into(),
        motley_version: "0.1.0".into(),
        git_commit: "0123456789abcdef0123456789abcdef01234567".into(),
        scenario: ScenarioInfo {
            name: "demo-rainbow".into(),
            title: "Rainbow exits against the transposed occupation".into(),
            description: "An invented scenario for the report tests.".into(),
            hash: "ab".repeat(32),
            seed: 20240611,
            samples: 20000,
            alpha: 0.01,
            power: 0.8,
            error_control: ErrorControl::PerClaim,
        },
        timing: Timing {
            wall_seconds: 12.34,
            threads: 2,
            samples_per_second: 3241.0,
            shards: 1,
        },
        claims,
        sequential: None,
    }
}

/// The full fixture: one claim of each shape.
pub fn full() -> RunResult {
    run(vec![
        same_law("rainbow-top", false, 0.01),
        same_law("near miss", true, 0.01),
        exact_law("second-class"),
        swap_probability("swap"),
        describe("corner"),
    ])
}

/// A 2 × 2 picture: color 1 enters row 0 from the left and turns up at column 1; color 2 enters
/// column 0 from below and runs up.
pub fn picture() -> Picture {
    // (0,0): in left 1, bottom 2 -> right 1, up 2.   (1,0): in left 1, bottom 0 -> right 0, up 1.
    // (0,1): in left 0, below 2 -> right 0, up 2.    (1,1): in left 0, below 1 -> right 0, up 1.
    Picture {
        width: 2,
        height: 2,
        max_color: 2,
        left: vec![1, 0],
        bottom: vec![2, 0],
        right_out: vec![1, 0, 0, 0],
        up_out: vec![2, 1, 2, 1],
    }
}

/// Minimal XML well-formedness: every tag closes in order, attributes are quoted, one root `<svg>`.
pub fn check_xml(text: &str) -> Result<(), String> {
    let mut stack: Vec<String> = Vec::new();
    let mut rest = text.trim();
    if !rest.starts_with("<svg") {
        return Err("does not start with <svg".into());
    }
    if !rest.ends_with("</svg>") {
        return Err("does not end with </svg>".into());
    }
    let mut roots = 0;
    while let Some(open) = rest.find('<') {
        let after = &rest[open + 1..];
        let close = after.find('>').ok_or("unterminated tag")?;
        let tag = &after[..close];
        if !tag.matches('"').count().is_multiple_of(2) {
            return Err(format!("unbalanced quotes in <{tag}>"));
        }
        if let Some(name) = tag.strip_prefix('/') {
            let top = stack
                .pop()
                .ok_or_else(|| format!("</{name}> closes nothing"))?;
            if top != name.trim() {
                return Err(format!("</{name}> closes <{top}>"));
            }
        } else if !tag.starts_with('?') && !tag.starts_with('!') {
            let name = tag
                .split(|c: char| c.is_whitespace() || c == '/')
                .next()
                .unwrap_or("");
            if stack.is_empty() {
                roots += 1;
            }
            if !tag.ends_with('/') {
                stack.push(name.to_string());
            }
        }
        rest = &after[close + 1..];
    }
    if !stack.is_empty() {
        return Err(format!("unclosed tags {stack:?}"));
    }
    if roots != 1 {
        return Err(format!("{roots} root elements"));
    }
    Ok(())
}
