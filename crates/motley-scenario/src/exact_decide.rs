//! Exact decisions: claims on small systems settled by exact laws instead of samples.
//!
//! Six-vertex rectangles use the dynamic-programming law of the top and right exits, in rationals
//! when both `b1` and `b2` were written as fractions (then a total variation of 0 is exactly 0) and
//! in f64 otherwise. Exclusion processes use the uniformized law of the arrangement at each time,
//! whose truncation bound is reported. A claim "holds" when its exact discrepancy is at most the
//! numerical error bound plus [`EXACT_TOLERANCE`].

use std::collections::BTreeMap;

use crate::estimate::{full_law_exact, show_value};
use crate::family::{ObservableLaw, ValueKey};
use crate::result::{
    ClaimKindName, ClaimResult, DecidedBy, Decision, Discrepancy, Estimates, ExactResult, FullLaw,
    Interval, Moments, Outcome, Stated, StatedRole,
};
use crate::scenario::*;

/// Floating-point slack allowed on exact f64 computations.
pub const EXACT_TOLERANCE: f64 = 1e-12;

fn tv(a: &[(ValueKey, f64)], b: &[(ValueKey, f64)]) -> f64 {
    let mut m: BTreeMap<&ValueKey, f64> = BTreeMap::new();
    for (k, p) in a {
        *m.entry(k).or_insert(0.0) += p;
    }
    for (k, p) in b {
        *m.entry(k).or_insert(0.0) -= p;
    }
    0.5 * m.values().map(|v| v.abs()).sum::<f64>()
}

use crate::family::{exact_law as observable_law, rational_law};

/// The full exact laws of the claim's observables whose values have one (see
/// `ValueKind::has_full_law`), with fractions where the family computes in rationals.
fn full_laws(s: &Scenario, laws: &[(usize, &ObservableLaw)]) -> Vec<FullLaw> {
    laws.iter()
        .filter(|(o, _)| s.observables[*o].kind.has_full_law())
        .map(|(o, l)| {
            let rational = rational_law(s, *o);
            full_law_exact(
                &s.observables[*o].name,
                &l.cells,
                rational.as_ref().map(|r| r.entries()),
            )
        })
        .collect()
}

fn top(cells: &[(ValueKey, f64)]) -> Vec<Outcome> {
    let mut v: Vec<&(ValueKey, f64)> = cells.iter().collect();
    v.sort_by(|a, b| b.1.total_cmp(&a.1).then_with(|| a.0.cmp(&b.0)));
    v.into_iter()
        .take(20)
        .map(|(k, p)| Outcome {
            value: show_value(k),
            probability: *p,
        })
        .collect()
}

fn scalar_cells(cells: &[(ValueKey, f64)]) -> Vec<(f64, f64)> {
    cells
        .iter()
        .filter_map(|(k, p)| match k {
            ValueKey::Number(x) => Some((x.0, *p)),
            ValueKey::Set(_) | ValueKey::Event(_) | ValueKey::Sequence(_) | ValueKey::Tuple(_) => {
                None
            }
        })
        .collect()
}

/// The exact mean and standard deviation of a number observable's law.
fn exact_moments(label: String, l: &ObservableLaw) -> Moments {
    let xs = scalar_cells(&l.cells);
    let mean: f64 = xs.iter().map(|(x, p)| x * p).sum();
    let var: f64 = xs.iter().map(|(x, p)| (x - mean) * (x - mean) * p).sum();
    Moments {
        label,
        count: 0,
        mean,
        sd: var.sqrt(),
    }
}

/// The exact probability of an event observable (outcome `[1]`), recorded in `est` as a
/// degenerate interval; returns it.
fn exact_event(l: &ObservableLaw, label: String, est: &mut Estimates) -> f64 {
    let p: f64 = l
        .cells
        .iter()
        .filter(|(k, _)| *k == ValueKey::Event(true))
        .map(|(_, p)| p)
        .sum();
    est.probabilities.push(Interval {
        label,
        successes: 0,
        trials: 0,
        estimate: p,
        wilson_lower: p,
        wilson_upper: p,
        exact_lower: p,
        exact_upper: p,
    });
    p
}

/// Decides claim `ci` exactly.
///
/// # Errors
/// A message if an exact law cannot be computed (size limits of the engines).
pub fn decide(s: &Scenario, ci: usize) -> Result<ClaimResult, String> {
    let c = &s.claims[ci];
    let name = |i: usize| s.observables[i].name.clone();
    let mut est = Estimates::default();
    let (kind, observables, discrepancy, probability, error, outcomes, rational) = match &c.kind {
        ClaimKind::Series(_) | ClaimKind::Joint(..) => {
            return Err("`series` and `joint` claims are estimated by Monte Carlo only".into())
        }
        ClaimKind::SameLaw(a, b) => {
            let (la, lb) = (observable_law(s, *a)?, observable_law(s, *b)?);
            let rational = match (rational_law(s, *a), rational_law(s, *b)) {
                (Some(ra), Some(rb)) => Some(num_traits_to_f64(&ra.total_variation(&rb))),
                _ => None,
            };
            let d = rational.unwrap_or_else(|| tv(&la.cells, &lb.cells));
            est.top_outcomes.push(top(&la.cells));
            est.top_outcomes.push(top(&lb.cells));
            est.laws = full_laws(s, &[(*a, &la), (*b, &lb)]);
            let n = la.cells.len().max(lb.cells.len());
            (
                ClaimKindName::SameLaw,
                vec![name(*a), name(*b)],
                Some((Discrepancy::TotalVariation, d)),
                None,
                la.error + lb.error,
                n,
                rational.is_some(),
            )
        }
        ClaimKind::Probability(a, eq) => {
            let l = observable_law(s, *a)?;
            est.laws = full_laws(s, &[(*a, &l)]);
            let p = exact_event(&l, name(*a), &mut est);
            let d = eq.map(|v| (Discrepancy::ProbabilityGap, (p - v).abs()));
            (
                ClaimKindName::Probability,
                vec![name(*a)],
                d,
                Some(p),
                l.error,
                l.cells.len(),
                false,
            )
        }
        ClaimKind::LawOf(a, ReferenceSpec::TailFromProfile(b)) => {
            let (lx, lp) = (observable_law(s, *a)?, observable_law(s, *b)?);
            est.laws = full_laws(s, &[(*a, &lx), (*b, &lp)]);
            let pb = &s.observables[*b];
            let from = s.models[pb.model]
                .kind
                .family()
                .window_origin(&pb.read)
                .unwrap_or(1);
            let universe = match s.observables[*b].kind {
                ValueKind::Set { universe } => universe,
                _ => 0,
            };
            let xs = scalar_cells(&lx.cells);
            let mut worst = 0.0f64;
            for k in 0..universe {
                let site = from + k as i64;
                let tail: f64 = xs
                    .iter()
                    .filter(|(x, _)| *x >= site as f64)
                    .map(|(_, p)| p)
                    .sum();
                let occ: f64 = lp
                    .cells
                    .iter()
                    .filter(|(key, _)| matches!(key, ValueKey::Set(e) if e.contains(&(k + 1))))
                    .map(|(_, p)| p)
                    .sum();
                worst = worst.max((tail - occ).abs());
            }
            (
                ClaimKindName::LawOf,
                vec![name(*a), name(*b)],
                Some((Discrepancy::TailGap, worst)),
                None,
                lx.error + lp.error,
                lx.cells.len(),
                false,
            )
        }
        ClaimKind::LawOf(a, ReferenceSpec::Table(t)) => {
            let l = observable_law(s, *a)?;
            let rational = match (rational_law(s, *a), &t.rational) {
                (Some(ra), Some(rt)) => {
                    let mut m: BTreeMap<&ValueKey, num_rational::BigRational> = BTreeMap::new();
                    for (k, p) in ra.entries() {
                        *m.entry(k).or_default() += p;
                    }
                    for ((k, _), p) in t.cells.iter().zip(rt) {
                        *m.entry(k).or_default() -= p;
                    }
                    let sum: num_rational::BigRational =
                        m.into_values().map(|d| num_traits::Signed::abs(&d)).sum();
                    Some(num_traits_to_f64(
                        &(sum / num_rational::BigRational::from_integer(2.into())),
                    ))
                }
                _ => None,
            };
            let d = rational.unwrap_or_else(|| tv(&l.cells, &t.cells));
            est.top_outcomes.push(top(&l.cells));
            est.laws = full_laws(s, &[(*a, &l)]);
            (
                ClaimKindName::LawOf,
                vec![name(*a)],
                Some((Discrepancy::TotalVariation, d)),
                None,
                l.error,
                l.cells.len(),
                rational.is_some(),
            )
        }
        ClaimKind::Mean(a, equals) => {
            let l = observable_law(s, *a)?;
            est.laws = full_laws(s, &[(*a, &l)]);
            let m = exact_moments(name(*a), &l);
            let mean = m.mean;
            est.moments.push(m);
            let scale = scalar_cells(&l.cells)
                .iter()
                .map(|(x, _)| x.abs())
                .fold(0.0, f64::max);
            (
                ClaimKindName::Mean,
                vec![name(*a)],
                equals.map(|m0| (Discrepancy::MeanGap, (mean - m0).abs())),
                None,
                l.error * scale.max(1.0),
                l.cells.len(),
                false,
            )
        }
        ClaimKind::LawOf(a, r) => {
            let l = observable_law(s, *a)?;
            est.laws = full_laws(s, &[(*a, &l)]);
            let f = crate::reference_law::reference_cdf(r).ok_or("no reference CDF")?;
            let mut acc = 0.0;
            let mut worst = 0.0f64;
            for (x, p) in scalar_cells(&l.cells) {
                worst = worst.max((acc - f(x)).abs());
                acc += p;
                worst = worst.max((acc - f(x)).abs());
            }
            (
                ClaimKindName::LawOf,
                vec![name(*a)],
                Some((Discrepancy::KolmogorovDistance, worst)),
                None,
                l.error,
                l.cells.len(),
                false,
            )
        }
        ClaimKind::Describe(a, _, _) => {
            let l = observable_law(s, *a)?;
            est.laws = full_laws(s, &[(*a, &l)]);
            let kind = s.observables[*a].kind;
            est.top_outcomes.push(top(&l.cells));
            if matches!(kind, ValueKind::Scalar { .. }) {
                est.moments.push(exact_moments(name(*a), &l));
            }
            if kind == ValueKind::Event {
                exact_event(&l, name(*a), &mut est);
            }
            (
                ClaimKindName::Describe,
                vec![name(*a)],
                None,
                None,
                l.error,
                l.cells.len(),
                false,
            )
        }
    };
    let stated = match &c.kind {
        ClaimKind::Probability(_, Some(v)) => probability.map(|p| Stated {
            role: StatedRole::Equals,
            value: *v,
            estimate: p,
            difference: p - v,
            half_width: 0.0,
        }),
        ClaimKind::Mean(_, Some(v)) => est.moments.first().map(|m| Stated {
            role: StatedRole::Equals,
            value: *v,
            estimate: m.mean,
            difference: m.mean - v,
            half_width: 0.0,
        }),
        ClaimKind::Describe(_, _, Some(v)) => est.moments.first().map(|m| Stated {
            role: StatedRole::Limit,
            value: *v,
            estimate: m.mean,
            difference: m.mean - v,
            half_width: 0.0,
        }),
        ClaimKind::Probability(_, None)
        | ClaimKind::Mean(_, None)
        | ClaimKind::Describe(_, _, None)
        | ClaimKind::SameLaw(..)
        | ClaimKind::LawOf(..)
        | ClaimKind::Series(_)
        | ClaimKind::Joint(..) => None,
    };
    let tolerance = if rational {
        0.0
    } else {
        error + EXACT_TOLERANCE
    };
    let rejected = discrepancy.is_some_and(|(_, d)| d > tolerance);
    let verdict = match discrepancy {
        None => match kind {
            ClaimKindName::Mean => "no stated value: exact mean shown".to_string(),
            ClaimKindName::Probability => "no stated value: exact probability shown".to_string(),
            ClaimKindName::SameLaw
            | ClaimKindName::LawOf
            | ClaimKindName::Describe
            | ClaimKindName::Series
            | ClaimKindName::Joint
            | ClaimKindName::Error => "no claim: exact law shown".to_string(),
        },
        Some((m, d)) if rejected => format!(
            "REJECTED exactly: the exact {} is {d:.6e} (numerical tolerance {tolerance:.1e}){}",
            m.words(),
            match c.tolerance {
                Some(eps) if d + error <= eps => format!(
                    "; the laws differ, but by less than the claim's tolerance {}",
                    crate::number_text::short(eps)
                ),
                _ => String::new(),
            }
        ),
        Some((m, d)) => {
            if rational {
                format!(
                    "holds exactly at this size (computed in rationals: {} 0)",
                    m.words()
                )
            } else {
                format!(
                    "holds exactly at this size ({} {d:.1e}, within the numerical bound {tolerance:.1e})",
                    m.words()
                )
            }
        }
    };
    Ok(ClaimResult {
        id: c.id.clone(),
        kind,
        says: c.says.clone(),
        observables,
        decided_by: DecidedBy::Exact,
        rejected,
        decision: match (discrepancy, rejected) {
            (None, _) => Decision::NoClaim,
            (Some(_), true) => Decision::Rejected,
            (Some(_), false) => Decision::HoldsExactly,
        },
        level: s.alpha,
        tolerance: c.tolerance,
        look: None,
        verdict,
        samples: 0,
        tests: Vec::new(),
        effect: None,
        exact: Some(ExactResult {
            measure: discrepancy.map(|(m, _)| m),
            discrepancy: discrepancy.map_or(0.0, |(_, d)| d),
            probability,
            outcomes,
            error_bound: if rational { 0.0 } else { error },
        }),
        estimates: est,
        stated,
    })
}

fn num_traits_to_f64(r: &num_rational::BigRational) -> f64 {
    use num_traits::ToPrimitive;
    r.to_f64().unwrap_or(f64::NAN)
}
