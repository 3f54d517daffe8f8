//! Exact decisions: claims on small systems settled by exact laws instead of samples.
//!
//! Six-vertex rectangles use the dynamic-programming law of the top and right exits, in rationals
//! when both `b1` and `b2` were written as fractions (then a total variation of 0 is exactly 0) and
//! in f64 otherwise. Exclusion processes use the uniformized law of the arrangement at each time,
//! whose truncation bound is reported. A claim "holds" when its exact discrepancy is at most the
//! numerical error bound plus [`EXACT_TOLERANCE`].

use std::collections::BTreeMap;

use motley_colorblind::Color;
use motley_sixvertex::{exact_law, ratio, ExactLaw};

use crate::estimate::{show_sequence, show_set};
use crate::exclusion_unit;
use crate::read_set::set_elements;
use crate::result::{ClaimResult, Estimates, ExactResult, Interval, Moments, Outcome, Stated};
use crate::scenario::*;

/// Floating-point slack allowed on exact f64 computations.
pub const EXACT_TOLERANCE: f64 = 1e-12;

/// An observable's value as an ordered key: set elements, a sequence, an event (0/1), or a number
/// encoded so that integer order is numeric order.
type Key = Vec<i64>;

fn encode(v: f64) -> i64 {
    let b = v.to_bits() as i64;
    if b < 0 {
        b ^ i64::MAX
    } else {
        b
    }
}

fn decode(k: i64) -> f64 {
    let b = if k < 0 { k ^ i64::MAX } else { k };
    f64::from_bits(b as u64)
}

/// An exact law of one observable: sorted (key, probability), and the numerical error bound.
struct ObsLaw {
    cells: Vec<(Key, f64)>,
    error: f64,
}

fn six_vertex_key(s: &Scenario, o: &ObservableSpec, top: &[Color], right: &[Color]) -> Key {
    let m = &s.models[o.model];
    let universe = match o.kind {
        ValueKind::Set { universe } => universe,
        _ => 0,
    };
    let mut out = Vec::new();
    match o.read {
        ReadSpec::Top(how) => set_elements(top, how, o.threshold, o.map, universe, m, &mut out),
        ReadSpec::Right(how) => set_elements(right, how, o.threshold, o.map, universe, m, &mut out),
        ReadSpec::ExitColumn(c) => {
            let col = top.iter().position(|&t| t == c).map_or(0, |p| p + 1);
            return vec![encode((col as f64 + o.shift) * o.scale)];
        }
        _ => {}
    }
    out.into_iter().map(|e| e as i64).collect()
}

fn exclusion_key(s: &Scenario, o: &ObservableSpec, initial: &[Color], now: &[Color]) -> Key {
    let m = &s.models[o.model];
    let thr = o.threshold.unwrap_or(1).max(1);
    let above = |c: &[Color], x: i64| {
        c.iter()
            .skip(x.max(0) as usize)
            .filter(|&&v| v >= thr)
            .count() as f64
    };
    match o.read {
        ReadSpec::Window(from, to, _, how) => {
            let universe = match o.kind {
                ValueKind::Set { universe } => universe,
                _ => 0,
            };
            let mut out = Vec::new();
            set_elements(
                &now[(from - 1) as usize..to as usize],
                how,
                o.threshold,
                o.map,
                universe,
                m,
                &mut out,
            );
            out.into_iter().map(|e| e as i64).collect()
        }
        ReadSpec::Position(c, _) => {
            let p = now.iter().position(|&v| v == c).map_or(0, |p| p + 1);
            vec![encode((p as f64 + o.shift) * o.scale)]
        }
        ReadSpec::Arrangement(_) => now.iter().map(|&c| i64::from(m.to_user(c))).collect(),
        ReadSpec::InverseArrangement(_) => {
            let mut v = vec![0i64; now.len()];
            for (site, &c) in now.iter().enumerate() {
                let class = m.to_user(c) as usize;
                if (1..=now.len()).contains(&class) {
                    v[class - 1] = site as i64 + 1;
                }
            }
            v
        }
        ReadSpec::HeightExcl(x, _) => vec![encode((above(now, x) + o.shift) * o.scale)],
        ReadSpec::Current(b, _) => vec![encode(
            (above(now, b) - above(initial, b) + o.shift) * o.scale,
        )],
        ReadSpec::Swapped(a, b, _) => {
            let pos = |c: &[Color], k: Color| c.iter().position(|&v| v == k).unwrap_or(0);
            let before = pos(initial, a) < pos(initial, b);
            let after = pos(now, a) < pos(now, b);
            vec![i64::from(before != after)]
        }
        _ => Vec::new(),
    }
}

fn tv(a: &[(Key, f64)], b: &[(Key, f64)]) -> f64 {
    let mut m: BTreeMap<&Key, f64> = BTreeMap::new();
    for (k, p) in a {
        *m.entry(k).or_insert(0.0) += p;
    }
    for (k, p) in b {
        *m.entry(k).or_insert(0.0) -= p;
    }
    0.5 * m.values().map(|v| v.abs()).sum::<f64>()
}

fn collect(cells: impl IntoIterator<Item = (Key, f64)>) -> Vec<(Key, f64)> {
    let mut m: BTreeMap<Key, f64> = BTreeMap::new();
    for (k, p) in cells {
        *m.entry(k).or_insert(0.0) += p;
    }
    m.into_iter().collect()
}

/// Rational six-vertex law of an observable, when both weights are fractions.
fn rational_law(s: &Scenario, o: usize) -> Option<ExactLaw<Key, num_rational::BigRational>> {
    let obs = &s.observables[o];
    let ModelKind::SixVertex(sv) = &s.models[obs.model].kind else {
        return None;
    };
    let (Some((n1, d1)), Some((n2, d2))) = (sv.b1.rational, sv.b2.rational) else {
        return None;
    };
    let model = crate::six_vertex_unit::build(sv).ok()?;
    let law = exact_law(ratio(n1, d1), ratio(n2, d2), model.boundary()).ok()?;
    Some(law.map(|out| six_vertex_key(s, obs, &out.top, &out.right)))
}

fn observable_law(s: &Scenario, o: usize) -> Result<ObsLaw, String> {
    let obs = &s.observables[o];
    let m = &s.models[obs.model];
    match &m.kind {
        ModelKind::SixVertex(sv) => {
            let model = crate::six_vertex_unit::build(sv)?;
            let law =
                exact_law(sv.b1.value, sv.b2.value, model.boundary()).map_err(|e| e.to_string())?;
            let cells = collect(
                law.entries()
                    .iter()
                    .map(|(out, p)| (six_vertex_key(s, obs, &out.top, &out.right), *p)),
            );
            Ok(ObsLaw {
                error: 1e-14 * (1 + law.len()) as f64,
                cells,
            })
        }
        ModelKind::Exclusion(e) => {
            let exclusion_unit::Process::Finite(p) = exclusion_unit::build(e)? else {
                return Err("exact laws need a segment or a ring".into());
            };
            let solver = motley_exclusion::ExactSolver::new(&p).map_err(|x| x.to_string())?;
            let t = match obs.read {
                ReadSpec::Window(_, _, t, _)
                | ReadSpec::Position(_, t)
                | ReadSpec::Arrangement(t)
                | ReadSpec::InverseArrangement(t)
                | ReadSpec::Current(_, t)
                | ReadSpec::HeightExcl(_, t)
                | ReadSpec::Swapped(_, _, t) => e.times[t],
                _ => return Err("no exact law for this read-out".into()),
            };
            let law = solver
                .law_at(t, motley_exclusion::DEFAULT_TAIL)
                .map_err(|x| x.to_string())?;
            let initial = match &e.initial {
                InitialSpec::Sites(c) => c.clone(),
                InitialSpec::Line { .. } => Vec::new(),
            };
            let cells = collect(
                law.entries()
                    .iter()
                    .map(|(arr, p)| (exclusion_key(s, obs, &initial, arr), *p)),
            );
            Ok(ObsLaw {
                error: law.error_bound() + 1e-14 * (1 + law.entries().len()) as f64,
                cells,
            })
        }
    }
}

fn describe_key(kind: ValueKind, k: &Key) -> String {
    match kind {
        ValueKind::Set { .. } => show_set(&k.iter().map(|&e| e as usize).collect::<Vec<_>>()),
        ValueKind::Sequence { .. } => {
            show_sequence(&k.iter().map(|&e| e as u32).collect::<Vec<_>>())
        }
        ValueKind::Event => (if k.first() == Some(&1) { "yes" } else { "no" }).into(),
        ValueKind::Scalar { .. } => format!("{}", decode(k[0])),
    }
}

fn top(kind: ValueKind, cells: &[(Key, f64)]) -> Vec<Outcome> {
    let mut v: Vec<&(Key, f64)> = cells.iter().collect();
    v.sort_by(|a, b| b.1.total_cmp(&a.1).then_with(|| a.0.cmp(&b.0)));
    v.into_iter()
        .take(20)
        .map(|(k, p)| Outcome {
            value: describe_key(kind, k),
            probability: *p,
        })
        .collect()
}

fn scalar_cells(cells: &[(Key, f64)]) -> Vec<(f64, f64)> {
    cells.iter().map(|(k, p)| (decode(k[0]), *p)).collect()
}

/// The exact probability of an event observable (outcome `[1]`), recorded in `est` as a
/// degenerate interval; returns it.
fn exact_event(l: &ObsLaw, label: String, est: &mut Estimates) -> f64 {
    let p: f64 = l
        .cells
        .iter()
        .filter(|(k, _)| k.first() == Some(&1))
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
            let ka = s.observables[*a].kind;
            est.top_outcomes.push(top(ka, &la.cells));
            est.top_outcomes
                .push(top(s.observables[*b].kind, &lb.cells));
            let n = la.cells.len().max(lb.cells.len());
            (
                "same-law",
                vec![name(*a), name(*b)],
                Some(d),
                None,
                la.error + lb.error,
                n,
                rational.is_some(),
            )
        }
        ClaimKind::Probability(a, eq) => {
            let l = observable_law(s, *a)?;
            let p = exact_event(&l, name(*a), &mut est);
            let d = eq.map(|v| (p - v).abs());
            (
                "probability",
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
            let from = match s.observables[*b].read {
                ReadSpec::Window(from, ..) => from,
                _ => 1,
            };
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
                    .filter(|(key, _)| key.contains(&(k as i64 + 1)))
                    .map(|(_, p)| p)
                    .sum();
                worst = worst.max((tail - occ).abs());
            }
            (
                "law-of",
                vec![name(*a), name(*b)],
                Some(worst),
                None,
                lx.error + lp.error,
                lx.cells.len(),
                false,
            )
        }
        ClaimKind::LawOf(a, r) => {
            let l = observable_law(s, *a)?;
            let f = crate::reference_law::reference_cdf(r).ok_or("no reference CDF")?;
            let mut acc = 0.0;
            let mut worst = 0.0f64;
            for (x, p) in scalar_cells(&l.cells) {
                worst = worst.max((acc - f(x)).abs());
                acc += p;
                worst = worst.max((acc - f(x)).abs());
            }
            (
                "law-of",
                vec![name(*a)],
                Some(worst),
                None,
                l.error,
                l.cells.len(),
                false,
            )
        }
        ClaimKind::Describe(a, _, _) => {
            let l = observable_law(s, *a)?;
            let kind = s.observables[*a].kind;
            est.top_outcomes.push(top(kind, &l.cells));
            if matches!(kind, ValueKind::Scalar { .. }) {
                let xs = scalar_cells(&l.cells);
                let mean: f64 = xs.iter().map(|(x, p)| x * p).sum();
                let var: f64 = xs.iter().map(|(x, p)| (x - mean) * (x - mean) * p).sum();
                est.moments.push(Moments {
                    label: name(*a),
                    count: 0,
                    mean,
                    sd: var.sqrt(),
                });
            }
            if kind == ValueKind::Event {
                exact_event(&l, name(*a), &mut est);
            }
            (
                "describe",
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
            role: "equals".into(),
            value: *v,
            estimate: p,
            difference: p - v,
            half_width: 0.0,
        }),
        ClaimKind::Describe(_, _, Some(v)) => est.moments.first().map(|m| Stated {
            role: "limit".into(),
            value: *v,
            estimate: m.mean,
            difference: m.mean - v,
            half_width: 0.0,
        }),
        _ => None,
    };
    let tolerance = if rational {
        0.0
    } else {
        error + EXACT_TOLERANCE
    };
    let rejected = discrepancy.is_some_and(|d| d > tolerance);
    let verdict = match (kind, discrepancy) {
        ("describe", _) => "no claim: exact law shown".to_string(),
        (_, None) => "no stated value: exact probability shown".to_string(),
        (_, Some(d)) if rejected => format!(
            "REJECTED exactly: the exact discrepancy is {d:.6e} (tolerance {tolerance:.1e})"
        ),
        (_, Some(d)) => {
            if rational {
                "holds exactly at this size (computed in rationals: discrepancy 0)".to_string()
            } else {
                format!("holds exactly at this size (discrepancy {d:.1e}, within the numerical bound {tolerance:.1e})")
            }
        }
    };
    Ok(ClaimResult {
        id: c.id.clone(),
        kind: kind.into(),
        says: c.says.clone(),
        observables,
        decided_by: "exact".into(),
        rejected,
        verdict,
        samples: 0,
        tests: Vec::new(),
        effect: None,
        exact: Some(ExactResult {
            total_variation: discrepancy.unwrap_or(0.0),
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
