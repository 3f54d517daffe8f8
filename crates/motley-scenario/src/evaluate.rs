//! Monte Carlo verdicts: from the accumulators of a claim's sides to its tests, effect size and
//! estimates.
//!
//! Each claim runs a small family of tests; their p-values are Holm-adjusted together (Holm 1979), and
//! the claim is rejected when the smallest adjusted p-value is at most `alpha`. The family's size is
//! fixed by the claim's kind, never by the data.
//!
//! | claim | tests |
//! |---|---|
//! | same law, sets | chi-square on the joint law (cells with expected count < 5 pooled, common practice); per-element two-proportion tests, Holm across elements; two-sample KS on size, min, max, sum |
//! | same law, sequences | chi-square on the joint law |
//! | same law, numbers | two-sample KS (conservative on integer data); chi-square on the support for integer data |
//! | same law, events | two-proportion test |
//! | law of, continuous reference | one-sample KS |
//! | law of, tail from a profile | per-site two-proportion tests of `P(X ≥ x)` against the profile, Holm across sites |
//! | probability | exact binomial test against the stated value |

use std::collections::BTreeMap;

use motley_stats::{chi_square_goodness_of_fit, total_variation_to_law, ExactLaw};
use motley_stats::{
    chi_square_homogeneity, compare_inclusion, detectable_probability_gap,
    detectable_total_variation, holm_bonferroni, kolmogorov_quantile, ks_one_sample, ks_two_sample,
    ks_two_sample_counts, normal_upper_quantile, total_variation, two_proportion_p_value,
    CategoricalCounts, ChiSquareOptions, ElementComparison, InclusionCounts, KsMethod,
    ScalarSample,
};

use crate::accumulate::{mask_elements, Accumulator, SetCounts, EMPTY_SUMMARY};
use crate::estimate::*;
use crate::family::{Real, ValueKey};
use crate::reference_law::{reference_cdf, reference_name};
use crate::result::Outcome;
use crate::result::{
    Censoring, ClaimKindName, ClaimResult, DecidedBy, Effect, Estimates, Series, Stated,
    StatedRole, TestResult,
};
use crate::scenario::{ClaimKind, ClaimSpec, ReferenceSpec, Scenario, TableLaw};

struct Family {
    tests: Vec<TestResult>,
}

impl Family {
    fn new() -> Self {
        Family { tests: Vec::new() }
    }
    fn push(&mut self, name: &str, statistic: f64, dof: Option<f64>, p: f64, note: String) {
        self.tests.push(TestResult {
            name: name.to_string(),
            statistic,
            dof,
            p_value: p,
            adjusted_p_value: p,
            rejected: false,
            note,
        });
    }
    /// Applies Holm across the family; returns whether the claim is rejected.
    fn close(&mut self, alpha: f64) -> bool {
        if self.tests.is_empty() {
            return false;
        }
        let p: Vec<f64> = self.tests.iter().map(|t| t.p_value).collect();
        let adj = holm_bonferroni(&p).unwrap_or(p);
        let mut any = false;
        for (t, a) in self.tests.iter_mut().zip(adj) {
            t.adjusted_p_value = a;
            t.rejected = a <= alpha;
            any |= t.rejected;
        }
        any
    }
}

fn set_counts(s: &SetCounts) -> Option<CategoricalCounts<[u64; 2]>> {
    let j = s.joint.as_ref()?;
    let mut c = CategoricalCounts::new();
    for (k, v) in j {
        c.add_count(*k, *v);
    }
    Some(c)
}

fn hist_counts(h: &BTreeMap<u64, u64>) -> CategoricalCounts<u64> {
    let mut c = CategoricalCounts::new();
    for (k, v) in h {
        c.add_count(*k, *v);
    }
    c
}

const SUMMARY_NAMES: [&str; 4] = ["size", "min", "max", "sum"];

/// Chi-square on the joint law of two categorical samples of sizes `na` and `nb`, with their total
/// variation as the effect: the decision for sets and sequences alike.
fn same_law_categorical<K: Ord + Clone + std::hash::Hash>(
    s: &Scenario,
    (ca, na): (&CategoricalCounts<K>, u64),
    (cb, nb): (&CategoricalCounts<K>, u64),
    fam: &mut Family,
) -> Option<Effect> {
    let r = chi_square_homogeneity(ca, cb, &ChiSquareOptions::default()).ok()?;
    fam.push(
        "chi-square on the joint law",
        r.statistic,
        Some(r.dof as f64),
        r.p_value,
        format!(
            "{} outcomes seen; {} rare ones pooled into one cell (expected count < 5, common practice); {} cells compared",
            r.cells, r.pooled_cells, r.tested_cells
        ),
    );
    let tv = total_variation(ca, cb, s.alpha).ok()?;
    let detect = detectable_total_variation(na, nb, r.tested_cells.max(2), s.alpha, s.power)
        .ok()
        .flatten()
        .unwrap_or(1.0);
    Some(Effect {
        measure: "total variation".into(),
        estimate: tv.estimate,
        upper_bound: tv.upper_bound,
        detectable: detect,
    })
}

fn same_law_sets(
    s: &Scenario,
    names: [&str; 2],
    a: &SetCounts,
    b: &SetCounts,
    fam: &mut Family,
    est: &mut Estimates,
) -> Option<Effect> {
    let alpha = s.alpha;
    let mut effect = None;
    if let (Some(ca), Some(cb)) = (set_counts(a), set_counts(b)) {
        effect = same_law_categorical(s, (&ca, a.n), (&cb, b.n), fam);
        for c in [a, b] {
            if let Some(j) = &c.joint {
                est.top_outcomes
                    .push(top_outcomes(j, c.n, 20, |m| show_set(&mask_elements(m))));
            }
        }
    }
    // Per-element inclusion, Holm across the elements whose inclusion varies.
    let universe = a.universe.max(b.universe);
    let inclusion = |c: &SetCounts| InclusionCounts::from_counts(c.n, c.inclusion.clone());
    let cmp = match (inclusion(a), inclusion(b)) {
        (Ok(ia), Ok(ib)) => compare_inclusion(&ia, &ib).ok(),
        _ => None,
    };
    if let Some(cmp) = cmp {
        let largest = |key: fn(&ElementComparison) -> f64| {
            cmp.elements
                .iter()
                .fold(None, |best: Option<&ElementComparison>, e| match best {
                    Some(b) if key(b) >= key(e) => Some(b),
                    _ => Some(e),
                })
        };
        let (gap, gap_at) =
            largest(|e| e.difference.abs()).map_or((0.0, 0), |e| (e.difference.abs(), e.element));
        let min_at = largest(|e| -e.adjusted_p_value).map_or(0, |e| e.element);
        if universe > 0 {
            fam.push(
                "per-element inclusion (two-proportion, Holm across elements)",
                gap,
                None,
                cmp.min_adjusted_p_value,
                format!(
                    "statistic: largest gap in inclusion frequency (element {}); p-value: smallest Holm-adjusted over the {} of {} elements whose inclusion varies (element {})",
                    gap_at + 1,
                    cmp.tested,
                    universe,
                    min_at + 1
                ),
            );
        }
        if effect.is_none() && universe > 0 {
            let pbar = 0.5;
            let detect =
                detectable_probability_gap(a.n, b.n, pbar, alpha / universe as f64, s.power)
                    .ok()
                    .flatten()
                    .unwrap_or(1.0);
            let z = normal_upper_quantile(alpha / (2.0 * universe as f64));
            let se = (0.25 / a.n as f64 + 0.25 / b.n as f64).sqrt();
            effect = Some(Effect {
                measure: "largest per-element inclusion gap".into(),
                estimate: gap,
                upper_bound: (gap + z * se).min(1.0),
                detectable: detect,
            });
        }
    }
    // Scalar summaries.
    for (k, name) in SUMMARY_NAMES.iter().enumerate() {
        let (ha, hb) = (&a.summaries[k], &b.summaries[k]);
        let drop_empty = |h: &BTreeMap<u64, u64>| {
            let mut h = h.clone();
            h.remove(&EMPTY_SUMMARY);
            h
        };
        let (ha, hb) = if k == 1 || k == 2 {
            (drop_empty(ha), drop_empty(hb))
        } else {
            (ha.clone(), hb.clone())
        };
        if ha.is_empty() || hb.is_empty() {
            continue;
        }
        if let Ok(r) = ks_two_sample_counts(&hist_counts(&ha), &hist_counts(&hb), KsMethod::Auto) {
            let note = if k == 1 || k == 2 {
                "integer data: KS is conservative here; empty sets left out"
            } else {
                "integer data: KS is conservative here"
            };
            fam.push(
                &format!("two-sample KS on the {name}"),
                r.statistic,
                None,
                r.p_value,
                note.into(),
            );
        }
    }
    for (side, c) in [a, b].into_iter().enumerate() {
        let x: Vec<f64> = (1..=c.universe).map(|k| k as f64).collect();
        est.inclusion
            .push(proportion_series(names[side], x, &c.inclusion, c.n, alpha));
        let sizes: Vec<f64> = c.summaries[0].keys().map(|&k| k as f64).collect();
        let counts: Vec<u64> = c.summaries[0].values().copied().collect();
        est.size_law
            .push(proportion_series(names[side], sizes, &counts, c.n, alpha));
    }
    effect
}

fn same_law_scalars(
    s: &Scenario,
    names: [&str; 2],
    a: &[f64],
    b: &[f64],
    integer: bool,
    fam: &mut Family,
    est: &mut Estimates,
) -> Option<Effect> {
    let alpha = s.alpha;
    let sa = ScalarSample::from_values(a.to_vec()).ok()?;
    let sb = ScalarSample::from_values(b.to_vec()).ok()?;
    let (na, nb) = (a.len() as u64, b.len() as u64);
    let ks = ks_two_sample(&sa, &sb, KsMethod::Auto).ok()?;
    let note = if ks.conservative {
        "ties in the data: KS is conservative here".to_string()
    } else {
        String::new()
    };
    fam.push(
        "two-sample Kolmogorov–Smirnov",
        ks.statistic,
        None,
        ks.p_value,
        note,
    );
    if integer {
        let hist = |v: &[f64]| {
            let mut h = CategoricalCounts::new();
            for &x in v {
                h.add(x as i64);
            }
            h
        };
        if let Ok(r) = chi_square_homogeneity(&hist(a), &hist(b), &ChiSquareOptions::default()) {
            fam.push(
                "chi-square on the support",
                r.statistic,
                Some(r.dof as f64),
                r.p_value,
                format!(
                    "exact alternative to KS for integer data; {} rare values pooled",
                    r.pooled_cells
                ),
            );
        }
    }
    let d = ks.statistic;
    let margin = dkw_pair(na, nb, alpha);
    let scale = (1.0 / na as f64 + 1.0 / nb as f64).sqrt();
    let detect = (kolmogorov_quantile(alpha) + 0.5 * normal_upper_quantile(1.0 - s.power)) * scale;
    for (name, v) in names.iter().zip([a, b]) {
        est.ecdf.push(ecdf_series(name, v, alpha));
        est.moments.push(moments(name, v));
    }
    Some(Effect {
        measure: "Kolmogorov distance".into(),
        estimate: d,
        upper_bound: (d + margin).min(1.0),
        detectable: detect.min(1.0),
    })
}

/// Simultaneous margin for the distance of two empirical CDFs to their laws: DKW–Massart at
/// `alpha / 2` on each side.
fn dkw_pair(na: u64, nb: u64, alpha: f64) -> f64 {
    dkw(na, alpha / 2.0) + dkw(nb, alpha / 2.0)
}

/// Reference curve sampled on the ECDF's abscissae.
fn reference_series(r: &ReferenceSpec, x: &[f64]) -> Option<Series> {
    let f = reference_cdf(r)?;
    let y: Vec<f64> = x.iter().map(|&v| f(v)).collect();
    Some(Series {
        label: reference_name(r),
        x: x.to_vec(),
        lower: y.clone(),
        upper: y.clone(),
        y,
    })
}

fn law_of_continuous(
    s: &Scenario,
    name: &str,
    v: &[f64],
    r: &ReferenceSpec,
    tested: bool,
    fam: &mut Family,
    est: &mut Estimates,
) -> Option<Effect> {
    let f = reference_cdf(r)?;
    let n = v.len() as u64;
    let sample = ScalarSample::from_values(v.to_vec()).ok()?;
    let res = ks_one_sample(&sample, &f, KsMethod::Auto).ok()?;
    if tested {
        let note = if res.conservative {
            "ties in the data: KS is conservative here".to_string()
        } else {
            String::new()
        };
        fam.push(
            &format!(
                "one-sample Kolmogorov–Smirnov against {}",
                reference_name(r)
            ),
            res.statistic,
            None,
            res.p_value,
            note,
        );
    }
    let e = ecdf_series(name, v, s.alpha);
    est.reference = reference_series(r, &e.x);
    est.ecdf.push(e);
    est.moments.push(moments(name, v));
    let scale = 1.0 / (n.max(1) as f64).sqrt();
    Some(Effect {
        measure: if tested {
            "Kolmogorov distance to the reference".into()
        } else {
            "Kolmogorov distance to the reference (shown, not tested)".into()
        },
        estimate: res.statistic,
        upper_bound: (res.statistic + dkw(n, s.alpha)).min(1.0),
        detectable: ((kolmogorov_quantile(s.alpha) + 0.5 * normal_upper_quantile(1.0 - s.power))
            * scale)
            .min(1.0),
    })
}

fn tail_from_profile(
    s: &Scenario,
    names: [&str; 2],
    x: &[f64],
    profile: &SetCounts,
    from: i64,
    fam: &mut Family,
    est: &mut Estimates,
) -> Option<Effect> {
    let n_a = x.len() as u64;
    let n_b = profile.n;
    let sites: Vec<i64> = (0..profile.universe as i64).map(|k| from + k).collect();
    // Sorted x: count of X ≥ site by binary search.
    let tail: Vec<u64> = sites
        .iter()
        .map(|&site| (x.len() - x.partition_point(|&v| v < site as f64)) as u64)
        .collect();
    let mut p = Vec::new();
    let mut worst = 0.0f64;
    for (k, &t) in tail.iter().enumerate() {
        let (pv, _) = two_proportion_p_value(t, n_a, profile.inclusion[k], n_b);
        p.push(pv);
        worst = worst.max((t as f64 / n_a as f64 - profile.inclusion[k] as f64 / n_b as f64).abs());
    }
    let m = sites.len().max(1);
    if !p.is_empty() {
        let adj = holm_bonferroni(&p).unwrap_or_else(|_| p.clone());
        let min = adj.iter().copied().fold(1.0, f64::min);
        fam.push(
            "per-site P(X ≥ x) against the profile (two-proportion, Holm across sites)",
            worst,
            None,
            min,
            format!("statistic: largest gap over {m} sites"),
        );
    }
    let xs: Vec<f64> = sites.iter().map(|&v| v as f64).collect();
    est.ecdf.push(proportion_series(
        &format!("P({} ≥ x)", names[0]),
        xs.clone(),
        &tail,
        n_a,
        s.alpha,
    ));
    est.reference = Some(proportion_series(
        &format!("occupation of x in {}", names[1]),
        xs,
        &profile.inclusion,
        n_b,
        s.alpha,
    ));
    est.moments.push(moments(names[0], x));
    let z = normal_upper_quantile(s.alpha / (2.0 * m as f64));
    let se = (0.25 / n_a as f64 + 0.25 / n_b as f64).sqrt();
    Some(Effect {
        measure: "largest gap between P(X ≥ x) and the profile".into(),
        estimate: worst,
        upper_bound: (worst + z * se).min(1.0),
        detectable: detectable_probability_gap(n_a, n_b, 0.5, s.alpha / m as f64, s.power)
            .ok()
            .flatten()
            .unwrap_or(1.0),
    })
}

/// The observed law of an accumulator as counts of values (`None` for pairs, and for sets whose
/// joint law is not kept).
fn value_counts(acc: &Accumulator) -> Option<CategoricalCounts<ValueKey>> {
    let mut c = CategoricalCounts::new();
    match acc {
        Accumulator::Set(x) => {
            for (m, n) in x.joint.as_ref()? {
                c.add_count(ValueKey::Set(mask_elements(m)), *n);
            }
        }
        Accumulator::Scalar(x) => {
            for &v in &x.values {
                c.add(ValueKey::Number(Real(v)));
            }
        }
        Accumulator::Event(e) => {
            c.add_count(ValueKey::Event(true), e.yes);
            c.add_count(ValueKey::Event(false), e.n - e.yes);
        }
        Accumulator::Sequence(q) => {
            for (k, n) in &q.counts {
                c.add_count(ValueKey::Sequence(k.clone()), *n);
            }
        }
        Accumulator::Tuple(t) => {
            for (k, n) in &t.counts {
                c.add_count(ValueKey::Tuple(k.clone()), *n);
            }
        }
        Accumulator::Pairs(_) => return None,
    }
    Some(c)
}

/// `law-of` against an explicit table: chi-square goodness of fit (cells with expected count < 5
/// pooled, common practice; an outcome the table excludes rejects outright), total variation to
/// the table as the effect (McDiarmid bound, as for two samples).
fn law_of_table(
    s: &Scenario,
    acc: &Accumulator,
    t: &TableLaw,
    fam: &mut Family,
    est: &mut Estimates,
) -> Option<Effect> {
    let observed = value_counts(acc)?;
    let n = observed.total();
    let law = ExactLaw::new(t.cells.clone()).ok()?;
    let r = chi_square_goodness_of_fit(&observed, &law, &ChiSquareOptions::default()).ok()?;
    fam.push(
        "chi-square goodness of fit to the table",
        r.statistic,
        Some(r.dof as f64),
        r.p_value,
        format!(
            "{} outcomes; {} rare ones pooled into one cell (expected count < 5, common practice); {} cells compared",
            r.cells, r.pooled_cells, r.tested_cells
        ),
    );
    let tv = total_variation_to_law(&observed, &law, s.alpha).ok()?;
    // One sample against a known law: the variance of a cell's frequency is half that of a
    // difference of two samples of the same size, so the two-sample figure shrinks by √2.
    let detect = detectable_total_variation(n, n, r.tested_cells.max(2), s.alpha, s.power)
        .ok()
        .flatten()
        .map_or(1.0, |d| d / std::f64::consts::SQRT_2);
    est.top_outcomes.push(top_values(&observed, n));
    Some(Effect {
        measure: "total variation to the table".into(),
        estimate: tv.estimate,
        upper_bound: tv.upper_bound,
        detectable: detect.min(1.0),
    })
}

/// The likeliest outcomes of observed counts, for the report.
fn top_values(c: &CategoricalCounts<ValueKey>, n: u64) -> Vec<Outcome> {
    let mut m = BTreeMap::new();
    for (k, v) in c.sorted_cells() {
        m.insert(k.clone(), v);
    }
    top_outcomes(&m, n, 20, show_value)
}

/// `mean`: the sample mean with a normal (large-sample) interval; against a stated value, the
/// z-test of the mean (two-sided; the sample standard deviation stands in for the true one).
fn mean_of(
    s: &Scenario,
    label: &str,
    v: &[f64],
    equals: Option<f64>,
    fam: &mut Family,
    est: &mut Estimates,
) -> Option<Effect> {
    let m = moments(label, v);
    est.ecdf.push(ecdf_series(label, v, s.alpha));
    est.moments.push(m.clone());
    let m0 = equals?;
    let n = m.count.max(1) as f64;
    let se = m.sd / n.sqrt();
    let gap = (m.mean - m0).abs();
    let (stat, p) = if se > 0.0 {
        (gap / se, 2.0 * motley_stats::normal_sf(gap / se))
    } else if gap == 0.0 {
        (0.0, 1.0)
    } else {
        (f64::INFINITY, 0.0)
    };
    fam.push(
        &format!("z-test of the mean against {m0}"),
        stat,
        None,
        p.min(1.0),
        "large-sample normal approximation; statistic: |mean − stated| / standard error".into(),
    );
    let z = normal_upper_quantile(s.alpha / 2.0);
    Some(Effect {
        measure: "|mean − stated value|".into(),
        estimate: gap,
        upper_bound: gap + z * se,
        detectable: (z + normal_upper_quantile(1.0 - s.power)) * se,
    })
}

fn accs<'a>(
    slots: &'a [(crate::unit::Slot, Accumulator)],
    sl: &crate::unit::Slot,
) -> &'a Accumulator {
    &slots.iter().find(|(k, _)| k == sl).expect("planned slot").1
}

/// Evaluates Monte Carlo claim `ci` from the merged accumulators.
pub fn evaluate(
    s: &Scenario,
    ci: usize,
    slots: &[(crate::unit::Slot, Accumulator)],
) -> ClaimResult {
    let c: &ClaimSpec = &s.claims[ci];
    let sl = crate::unit::claim_slots(s, ci);
    let mut fam = Family::new();
    let mut est = Estimates::default();
    let name = |i: usize| s.observables[i].name.as_str();
    let mut effect = None;
    let (kind, observables): (ClaimKindName, Vec<String>) = match &c.kind {
        ClaimKind::SameLaw(a, b) => (
            ClaimKindName::SameLaw,
            vec![name(*a).into(), name(*b).into()],
        ),
        ClaimKind::LawOf(a, ReferenceSpec::TailFromProfile(b)) => {
            (ClaimKindName::LawOf, vec![name(*a).into(), name(*b).into()])
        }
        ClaimKind::LawOf(a, _) => (ClaimKindName::LawOf, vec![name(*a).into()]),
        ClaimKind::Probability(a, _) => (ClaimKindName::Probability, vec![name(*a).into()]),
        ClaimKind::Describe(a, ..) => (ClaimKindName::Describe, vec![name(*a).into()]),
        ClaimKind::Series(sr) => (
            ClaimKindName::Series,
            sr.observables
                .iter()
                .map(|&o| name(o).to_string())
                .collect(),
        ),
        ClaimKind::Joint(a, b, _) => (ClaimKindName::Joint, vec![name(*a).into(), name(*b).into()]),
        ClaimKind::Mean(a, _) => (ClaimKindName::Mean, vec![name(*a).into()]),
    };
    let labels: [&str; 2] = [
        observables.first().map(|s| s.as_str()).unwrap_or(""),
        observables.get(1).map(|s| s.as_str()).unwrap_or(""),
    ];
    match &c.kind {
        ClaimKind::SameLaw(..) => match (accs(slots, &sl[0]), accs(slots, &sl[1])) {
            (Accumulator::Set(a), Accumulator::Set(b)) => {
                effect = same_law_sets(s, labels, a, b, &mut fam, &mut est)
            }
            (Accumulator::Scalar(a), Accumulator::Scalar(b)) => {
                let integer = matches!(
                    s.observables[sl[0].observable].kind,
                    crate::scenario::ValueKind::Scalar { integer: true }
                ) && matches!(
                    s.observables[sl[1].observable].kind,
                    crate::scenario::ValueKind::Scalar { integer: true }
                );
                effect =
                    same_law_scalars(s, labels, &a.values, &b.values, integer, &mut fam, &mut est)
            }
            (Accumulator::Event(a), Accumulator::Event(b)) => {
                let (p, _) = two_proportion_p_value(a.yes, a.n, b.yes, b.n);
                let (pa, pb) = (a.yes as f64 / a.n as f64, b.yes as f64 / b.n as f64);
                fam.push(
                    "two-proportion test",
                    (pa - pb).abs(),
                    None,
                    p,
                    String::new(),
                );
                est.probabilities
                    .push(interval(labels[0], a.yes, a.n, s.alpha));
                est.probabilities
                    .push(interval(labels[1], b.yes, b.n, s.alpha));
                let z = normal_upper_quantile(s.alpha / 2.0);
                let se = (pa * (1.0 - pa) / a.n as f64 + pb * (1.0 - pb) / b.n as f64).sqrt();
                effect = Some(Effect {
                    measure: "probability gap".into(),
                    estimate: (pa - pb).abs(),
                    upper_bound: ((pa - pb).abs() + z * se).min(1.0),
                    detectable: detectable_probability_gap(
                        a.n,
                        b.n,
                        0.5 * (pa + pb),
                        s.alpha,
                        s.power,
                    )
                    .ok()
                    .flatten()
                    .unwrap_or(1.0),
                });
            }
            (a @ Accumulator::Sequence(_), b @ Accumulator::Sequence(_))
            | (a @ Accumulator::Tuple(_), b @ Accumulator::Tuple(_)) => {
                if let (Some(ca), Some(cb)) = (value_counts(a), value_counts(b)) {
                    let (na, nb) = (ca.total(), cb.total());
                    effect = same_law_categorical(s, (&ca, na), (&cb, nb), &mut fam);
                    est.top_outcomes.push(top_values(&ca, na));
                    est.top_outcomes.push(top_values(&cb, nb));
                }
            }
            _ => {}
        },
        ClaimKind::LawOf(_, ReferenceSpec::TailFromProfile(_)) => {
            if let (Accumulator::Scalar(x), Accumulator::Set(p)) =
                (accs(slots, &sl[0]), accs(slots, &sl[1]))
            {
                let pb = &s.observables[sl[1].observable];
                let from = s.models[pb.model]
                    .kind
                    .family()
                    .window_origin(&pb.read)
                    .unwrap_or(1);
                effect = tail_from_profile(s, labels, &x.values, p, from, &mut fam, &mut est);
            }
        }
        ClaimKind::LawOf(_, ReferenceSpec::Table(t)) => {
            effect = law_of_table(s, accs(slots, &sl[0]), t, &mut fam, &mut est);
        }
        ClaimKind::Mean(_, equals) => {
            if let Accumulator::Scalar(x) = accs(slots, &sl[0]) {
                effect = mean_of(s, labels[0], &x.values, *equals, &mut fam, &mut est);
            }
        }
        ClaimKind::LawOf(_, r) => {
            if let Accumulator::Scalar(x) = accs(slots, &sl[0]) {
                effect = law_of_continuous(s, labels[0], &x.values, r, true, &mut fam, &mut est);
            }
        }
        ClaimKind::Probability(_, equals) => {
            if let Accumulator::Event(e) = accs(slots, &sl[0]) {
                est.probabilities
                    .push(interval(labels[0], e.yes, e.n, s.alpha));
                if let Some(p0) = equals {
                    if let Ok(t) = motley_stats::binomial_test(e.yes, e.n, *p0) {
                        fam.push(
                            &format!("exact binomial test against {p0}"),
                            t.estimate,
                            None,
                            t.p_value,
                            "statistic: the estimated probability".into(),
                        );
                    }
                    let ph = e.yes as f64 / e.n as f64;
                    let i = interval("", e.yes, e.n, s.alpha);
                    let z =
                        normal_upper_quantile(s.alpha / 2.0) + normal_upper_quantile(1.0 - s.power);
                    effect = Some(Effect {
                        measure: "probability gap to the stated value".into(),
                        estimate: (ph - p0).abs(),
                        upper_bound: (i.exact_upper - p0).abs().max((p0 - i.exact_lower).abs()),
                        detectable: (z * (p0 * (1.0 - p0) / e.n as f64).sqrt()).min(1.0),
                    });
                }
            }
        }
        ClaimKind::Describe(_, reference, _) => match accs(slots, &sl[0]) {
            Accumulator::Scalar(x) => {
                if let Some(r) = reference {
                    effect =
                        law_of_continuous(s, labels[0], &x.values, r, false, &mut fam, &mut est);
                } else {
                    est.ecdf.push(ecdf_series(labels[0], &x.values, s.alpha));
                    est.moments.push(moments(labels[0], &x.values));
                }
            }
            Accumulator::Event(e) => est
                .probabilities
                .push(interval(labels[0], e.yes, e.n, s.alpha)),
            Accumulator::Set(a) => {
                let x: Vec<f64> = (1..=a.universe).map(|k| k as f64).collect();
                est.inclusion
                    .push(proportion_series(labels[0], x, &a.inclusion, a.n, s.alpha));
                let sizes: Vec<f64> = a.summaries[0].keys().map(|&k| k as f64).collect();
                let counts: Vec<u64> = a.summaries[0].values().copied().collect();
                est.size_law
                    .push(proportion_series(labels[0], sizes, &counts, a.n, s.alpha));
                if let Some(j) = &a.joint {
                    est.top_outcomes
                        .push(top_outcomes(j, a.n, 20, |m| show_set(&mask_elements(m))));
                }
            }
            acc @ (Accumulator::Sequence(_) | Accumulator::Tuple(_)) => {
                if let Some(c) = value_counts(acc) {
                    est.top_outcomes.push(top_values(&c, c.total()));
                }
            }
            Accumulator::Pairs(_) => {}
        },
        ClaimKind::Series(sr) => {
            let a: Vec<&Accumulator> = sl.iter().map(|x| accs(slots, x)).collect();
            crate::evaluate_series::series(s, sr, &a, &mut est);
        }
        ClaimKind::Joint(_, _, reference) => {
            if let Accumulator::Pairs(p) = accs(slots, &sl[2]) {
                crate::evaluate_series::joint(s, labels, p, *reference, &mut est);
            }
        }
    }
    for x in sl.iter().filter(|x| x.partner.is_none()) {
        let o = &s.observables[x.observable];
        let family = s.models[o.model].kind.family();
        if let (Some(h), Accumulator::Scalar(v)) = (family.censored_at(&o.read), accs(slots, x)) {
            let at = o.number(h);
            est.censoring.push(Censoring {
                observable: o.name.clone(),
                at,
                censored: v.values.iter().filter(|&&y| y == at).count() as u64,
                samples: v.values.len() as u64,
            });
        }
        if !o.kind.has_full_law() {
            continue;
        }
        if let Some(c) = value_counts(accs(slots, x)) {
            est.laws.push(full_law_observed(&o.name, &c.sorted_cells()));
        }
    }
    let rejected = fam.close(s.alpha);
    let samples = sl.first().map(|x| accs(slots, x).count()).unwrap_or(0);
    let z = normal_upper_quantile(s.alpha / 2.0);
    let first = accs(slots, &sl[0]);
    let stated = match &c.kind {
        ClaimKind::Probability(_, Some(p0)) => match first {
            Accumulator::Event(e) if e.n > 0 => {
                let ph = e.yes as f64 / e.n as f64;
                Some(Stated {
                    role: StatedRole::Equals,
                    value: *p0,
                    estimate: ph,
                    difference: ph - p0,
                    half_width: z * (ph * (1.0 - ph) / e.n as f64).sqrt(),
                })
            }
            _ => None,
        },
        ClaimKind::Describe(_, _, Some(limit)) => stated_mean(StatedRole::Limit, *limit, first, z),
        ClaimKind::Mean(_, Some(m0)) => stated_mean(StatedRole::Equals, *m0, first, z),
        ClaimKind::Probability(_, None)
        | ClaimKind::Describe(_, _, None)
        | ClaimKind::Mean(_, None)
        | ClaimKind::SameLaw(..)
        | ClaimKind::LawOf(..)
        | ClaimKind::Series(_)
        | ClaimKind::Joint(..) => None,
    };
    let verdict = verdict(s, c, rejected, &effect);
    ClaimResult {
        id: c.id.clone(),
        kind,
        says: c.says.clone(),
        observables,
        decided_by: DecidedBy::MonteCarlo,
        rejected,
        verdict,
        samples,
        tests: fam.tests,
        effect,
        exact: None,
        estimates: est,
        stated,
    }
}

/// A value stated beside the mean of a number, with the normal half-width `z·sd/√n`.
fn stated_mean(role: StatedRole, value: f64, acc: &Accumulator, z: f64) -> Option<Stated> {
    let Accumulator::Scalar(x) = acc else {
        return None;
    };
    if x.values.is_empty() {
        return None;
    }
    let m = moments("", &x.values);
    Some(Stated {
        role,
        value,
        estimate: m.mean,
        difference: m.mean - value,
        half_width: z * m.sd / (m.count as f64).sqrt(),
    })
}

fn verdict(s: &Scenario, c: &ClaimSpec, rejected: bool, effect: &Option<Effect>) -> String {
    if matches!(c.kind, ClaimKind::Describe(..)) {
        return "no claim: estimates only".into();
    }
    if matches!(c.kind, ClaimKind::Series(_) | ClaimKind::Joint(..)) {
        return "no claim: estimates beside the theory, shown, not tested".into();
    }
    if matches!(c.kind, ClaimKind::Probability(_, None)) {
        return "no stated value: estimate with intervals only".into();
    }
    if matches!(c.kind, ClaimKind::Mean(_, None)) {
        return "no stated value: the mean with its interval only".into();
    }
    if rejected {
        return format!("REJECTED at α = {}", s.alpha);
    }
    match effect {
        Some(e) => format!(
            "not rejected at α = {}; with power {} the run would have detected a {} of {:.3e} or more",
            s.alpha, s.power, e.measure, e.detectable
        ),
        None => format!("not rejected at α = {}", s.alpha),
    }
}
