//! Monte Carlo verdicts: from the accumulators of a claim's sides to its tests, effect size and
//! estimates.
//!
//! Each claim is decided by **one** test at the claim's level (`alpha`, or a look's share of it);
//! every other test is a diagnostic, reported with its own p-value, that does not move the verdict.
//! So the false-alarm rate of a claim is the size of its deciding test (measured in
//! `tests/calibration.rs`, slow tier). The verdict itself is drawn in [`crate::verdict`].
//!
//! | claim | deciding test | diagnostics |
//! |---|---|---|
//! | same law, sets | chi-square on the joint law (cells with expected count < 5 pooled, common practice); per-element two-proportion tests combined by Simes when the joint law is not kept | per-element tests (Simes), two-sample KS on size, min, max, sum |
//! | same law, sequences, tuples | chi-square on the joint law | — |
//! | same law, numbers read from integers (also after `scale`, `shift`, `base`) | chi-square on the support | two-sample KS |
//! | same law, real numbers (times) | two-sample KS | — |
//! | same law, events | two-proportion z test | — |
//! | law of, continuous reference | one-sample KS | — |
//! | law of, table | chi-square goodness of fit | — |
//! | law of, tail from a profile | per-site two-proportion tests of `P(X ≥ x)` against the profile, combined by Simes (Simes 1986) | — |
//! | probability | exact binomial test against the stated value | — |
//! | mean | z test of the mean against the stated value | — |

use std::collections::BTreeMap;

use motley_stats::{chi_square_goodness_of_fit, total_variation_to_law, ExactLaw};
use motley_stats::{
    chi_square_homogeneity, compare_inclusion, detectable_probability_gap,
    detectable_total_variation, kolmogorov_quantile, ks_one_sample, ks_two_sample,
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
    Censoring, ClaimKindName, ClaimResult, DecidedBy, Decision, Effect, Estimates, Series, Stated,
    StatedRole, TestResult, TestRole,
};
use crate::scenario::{ClaimKind, ClaimSpec, ReferenceSpec, Scenario, TableLaw};

/// The tests of one claim: exactly one deciding test, any number of diagnostics.
pub(crate) struct Tests {
    tests: Vec<TestResult>,
}

impl Tests {
    fn new() -> Self {
        Tests { tests: Vec::new() }
    }
    fn push(
        &mut self,
        role: TestRole,
        name: &str,
        statistic: f64,
        dof: Option<f64>,
        p: f64,
        note: String,
    ) {
        self.tests.push(TestResult {
            name: name.to_string(),
            statistic,
            dof,
            role,
            p_value: p,
            adjusted_p_value: p,
            rejected: false,
            note,
        });
    }
    /// The deciding test (the first one pushed takes the role; a claim has at most one).
    fn decide(&mut self, name: &str, statistic: f64, dof: Option<f64>, p: f64, note: String) {
        debug_assert!(self.tests.iter().all(|t| t.role != TestRole::Deciding));
        self.push(TestRole::Deciding, name, statistic, dof, p, note);
    }
    /// A diagnostic test, shown beside the deciding one.
    fn diagnose(&mut self, name: &str, statistic: f64, dof: Option<f64>, p: f64, note: String) {
        self.push(TestRole::Diagnostic, name, statistic, dof, p, note);
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

/// What the chi-square power statement covers.
fn pooled_cells_cover(tested: usize, pooled: usize) -> String {
    if pooled == 0 {
        format!("every alternative: all {tested} outcomes seen are compared cell by cell")
    } else {
        format!(
            "differences between the {tested} compared cells, the rare outcomes pooled into one of them; \
             differences only inside the pooled cell are not covered"
        )
    }
}

/// A total variation effect between two samples (or a sample and a law): the bias-corrected
/// estimate as headline, the plug-in value and its same-law level beside it, the McDiarmid upper
/// bound at `1 − level`.
fn tv_effect(
    tv: &motley_stats::TvEstimate,
    measure: &str,
    detectable: f64,
    detectable_measure: String,
    covers: String,
) -> Effect {
    Effect {
        measure: measure.into(),
        estimate: tv.corrected,
        plug_in: Some(tv.estimate),
        same_law_level: Some(tv.same_law_level),
        upper_bound: tv.upper_bound,
        detectable: detectable.min(1.0),
        detectable_measure,
        covers,
    }
}

/// Chi-square on the joint law of two categorical samples of sizes `na` and `nb`, with their total
/// variation as the effect: the decision for sets, sequences and tuples alike.
fn same_law_categorical<K: Ord + Clone + std::hash::Hash>(
    s: &Scenario,
    level: f64,
    (ca, na): (&CategoricalCounts<K>, u64),
    (cb, nb): (&CategoricalCounts<K>, u64),
    fam: &mut Tests,
) -> Option<Effect> {
    let r = chi_square_homogeneity(ca, cb, &ChiSquareOptions::default()).ok()?;
    fam.decide(
        "chi-square on the joint law",
        r.statistic,
        Some(r.dof as f64),
        r.p_value,
        format!(
            "{} outcomes seen; {} rare ones pooled into one cell (expected count < 5, common practice); {} cells compared",
            r.cells, r.pooled_cells, r.tested_cells
        ),
    );
    let tv = total_variation(ca, cb, level).ok()?;
    let detect = detectable_total_variation(na, nb, r.tested_cells.max(2), level, s.power)
        .ok()
        .flatten()
        .unwrap_or(1.0);
    Some(tv_effect(
        &tv,
        "total variation",
        detect,
        format!("total variation on the {} compared cells", r.tested_cells),
        pooled_cells_cover(r.tested_cells, r.pooled_cells),
    ))
}

/// The per-element inclusion comparison of two set samples, combined by Simes across the elements
/// whose inclusion varies; `deciding` when the joint law is not kept.
fn inclusion_test(
    s: &Scenario,
    level: f64,
    a: &SetCounts,
    b: &SetCounts,
    deciding: bool,
    fam: &mut Tests,
) -> Option<Effect> {
    let universe = a.universe.max(b.universe);
    let inclusion = |c: &SetCounts| InclusionCounts::from_counts(c.n, c.inclusion.clone());
    let cmp = compare_inclusion(&inclusion(a).ok()?, &inclusion(b).ok()?).ok()?;
    if universe == 0 {
        return None;
    }
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
    let min_at = largest(|e| -e.p_value).map_or(0, |e| e.element);
    let note = format!(
        "statistic: largest gap in inclusion frequency (element {}); p-value: Simes over the {} of {} elements whose inclusion varies (smallest single p at element {})",
        gap_at + 1,
        cmp.tested,
        universe,
        min_at + 1
    );
    let name = "per-element inclusion (two-proportion, Simes across elements)";
    if !deciding {
        fam.diagnose(name, gap, None, cmp.simes_p_value, note);
        return None;
    }
    fam.decide(name, gap, None, cmp.simes_p_value, note);
    // A difference at one element alone is seen by Simes at level/m.
    let m = cmp.tested.max(1) as f64;
    let detect = detectable_probability_gap(a.n, b.n, 0.5, level / m, s.power)
        .ok()
        .flatten()
        .unwrap_or(1.0);
    let z = normal_upper_quantile(level / (2.0 * universe as f64));
    let se = (0.25 / a.n as f64 + 0.25 / b.n as f64).sqrt();
    Some(Effect {
        measure: "largest per-element inclusion gap".into(),
        estimate: gap,
        plug_in: None,
        same_law_level: None,
        upper_bound: (gap + z * se).min(1.0),
        detectable: detect,
        detectable_measure: "inclusion gap at one element".into(),
        covers: "differences in how often each element belongs to the set; laws with equal inclusion frequencies are not told apart".into(),
    })
}

fn same_law_sets(
    s: &Scenario,
    level: f64,
    names: [&str; 2],
    a: &SetCounts,
    b: &SetCounts,
    fam: &mut Tests,
    est: &mut Estimates,
) -> Option<Effect> {
    let alpha = s.alpha;
    let mut effect = None;
    let joint = set_counts(a).zip(set_counts(b));
    if let Some((ca, cb)) = &joint {
        effect = same_law_categorical(s, level, (ca, a.n), (cb, b.n), fam);
        for c in [a, b] {
            if let Some(j) = &c.joint {
                est.top_outcomes
                    .push(top_outcomes(j, c.n, 20, |m| show_set(&mask_elements(m))));
            }
        }
    }
    let by_element = inclusion_test(s, level, a, b, joint.is_none(), fam);
    effect = effect.or(by_element);
    // Scalar summaries: diagnostics.
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
        // A diagnostic: the asymptotic p-value is enough (the exact one costs O(n_a n_b)).
        if let Ok(r) =
            ks_two_sample_counts(&hist_counts(&ha), &hist_counts(&hb), KsMethod::Asymptotic)
        {
            let note = if k == 1 || k == 2 {
                "integer data: KS is conservative here; asymptotic p-value; empty sets left out"
            } else {
                "integer data: KS is conservative here; asymptotic p-value"
            };
            fam.diagnose(
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

/// The smallest Kolmogorov distance that a KS test at `level` detects with probability `power`
/// against every alternative: the critical distance plus the DKW bound on how far the empirical
/// CDFs can fall short of the true distance (DKW at `1 − power`; Massart 1990).
fn detectable_kolmogorov(n_a: u64, n_b: Option<u64>, level: f64, power: f64) -> f64 {
    let miss = 1.0 - power;
    match n_b {
        Some(n_b) => {
            let scale = (1.0 / n_a as f64 + 1.0 / n_b as f64).sqrt();
            kolmogorov_quantile(level) * scale + dkw_pair(n_a, n_b, miss)
        }
        None => kolmogorov_quantile(level) / (n_a.max(1) as f64).sqrt() + dkw(n_a, miss),
    }
    .min(1.0)
}

#[allow(clippy::too_many_arguments)]
fn same_law_scalars(
    s: &Scenario,
    level: f64,
    names: [&str; 2],
    a: &[f64],
    b: &[f64],
    discrete: bool,
    fam: &mut Tests,
    est: &mut Estimates,
) -> Option<Effect> {
    let alpha = s.alpha;
    let sa = ScalarSample::from_values(a.to_vec()).ok()?;
    let sb = ScalarSample::from_values(b.to_vec()).ok()?;
    let (na, nb) = (a.len() as u64, b.len() as u64);
    // On a lattice the KS is a diagnostic beside the chi-square: its asymptotic p-value is enough.
    let method = if discrete {
        KsMethod::Asymptotic
    } else {
        KsMethod::Auto
    };
    let ks = ks_two_sample(&sa, &sb, method).ok()?;
    let ks_note = match (ks.conservative, discrete) {
        (true, true) => "ties in the data: KS is conservative here; asymptotic p-value".to_string(),
        (true, false) => "ties in the data: KS is conservative here".to_string(),
        (false, _) => String::new(),
    };
    let ks_name = "two-sample Kolmogorov–Smirnov";
    let mut detect = None;
    if discrete {
        let hist = |v: &[f64]| {
            let mut h = CategoricalCounts::new();
            for &x in v {
                h.add(Real(x));
            }
            h
        };
        let (ha, hb) = (hist(a), hist(b));
        if let Ok(r) = chi_square_homogeneity(&ha, &hb, &ChiSquareOptions::default()) {
            fam.decide(
                "chi-square on the support",
                r.statistic,
                Some(r.dof as f64),
                r.p_value,
                format!(
                    "the values lie on a lattice (read from integers): {} values seen, {} rare ones pooled (expected count < 5, common practice)",
                    r.cells, r.pooled_cells
                ),
            );
            fam.diagnose(ks_name, ks.statistic, None, ks.p_value, ks_note.clone());
            detect = detectable_total_variation(na, nb, r.tested_cells.max(2), level, s.power)
                .ok()
                .flatten()
                .map(|d| {
                    (
                        d,
                        format!("total variation on the {} compared values", r.tested_cells),
                        pooled_cells_cover(r.tested_cells, r.pooled_cells),
                    )
                });
        }
    }
    if fam.tests.iter().all(|t| t.role != TestRole::Deciding) {
        fam.decide(ks_name, ks.statistic, None, ks.p_value, ks_note);
    }
    let (detectable, detectable_measure, covers) = detect.unwrap_or_else(|| {
        (
            detectable_kolmogorov(na, Some(nb), level, s.power),
            "Kolmogorov distance".into(),
            "every alternative, measured by the largest gap between the two CDFs".into(),
        )
    });
    let d = ks.statistic;
    for (name, v) in names.iter().zip([a, b]) {
        est.ecdf.push(ecdf_series(name, v, alpha));
        est.moments.push(moments(name, v));
    }
    Some(Effect {
        measure: "Kolmogorov distance".into(),
        estimate: d,
        plug_in: None,
        same_law_level: None,
        upper_bound: (d + dkw_pair(na, nb, level)).min(1.0),
        detectable: detectable.min(1.0),
        detectable_measure,
        covers,
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

#[allow(clippy::too_many_arguments)]
fn law_of_continuous(
    s: &Scenario,
    level: f64,
    name: &str,
    v: &[f64],
    r: &ReferenceSpec,
    tested: bool,
    fam: &mut Tests,
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
        fam.decide(
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
    Some(Effect {
        measure: if tested {
            "Kolmogorov distance to the reference".into()
        } else {
            "Kolmogorov distance to the reference (shown, not tested)".into()
        },
        estimate: res.statistic,
        plug_in: None,
        same_law_level: None,
        upper_bound: (res.statistic + dkw(n, level)).min(1.0),
        detectable: detectable_kolmogorov(n, None, level, s.power),
        detectable_measure: "Kolmogorov distance to the reference".into(),
        covers: "every alternative, measured by the largest gap between the CDFs".into(),
    })
}

#[allow(clippy::too_many_arguments)]
fn tail_from_profile(
    s: &Scenario,
    level: f64,
    names: [&str; 2],
    x: &[f64],
    profile: &SetCounts,
    from: i64,
    fam: &mut Tests,
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
        let (pv, test) = two_proportion_p_value(t, n_a, profile.inclusion[k], n_b);
        if test != motley_stats::ProportionTest::Degenerate {
            p.push(pv);
        }
        worst = worst.max((t as f64 / n_a as f64 - profile.inclusion[k] as f64 / n_b as f64).abs());
    }
    let m = p.len().max(1);
    let global = motley_stats::simes(&p).unwrap_or(1.0);
    fam.decide(
        "per-site P(X ≥ x) against the profile (two-proportion, Simes across sites)",
        worst,
        None,
        global,
        format!(
            "statistic: largest gap over {} sites; p-value: Simes over the {m} sites where either side varies",
            sites.len()
        ),
    );
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
    let z = normal_upper_quantile(level / (2.0 * sites.len().max(1) as f64));
    let se = (0.25 / n_a as f64 + 0.25 / n_b as f64).sqrt();
    Some(Effect {
        measure: "largest gap between P(X ≥ x) and the profile".into(),
        estimate: worst,
        plug_in: None,
        same_law_level: None,
        upper_bound: (worst + z * se).min(1.0),
        detectable: detectable_probability_gap(n_a, n_b, 0.5, level / m as f64, s.power)
            .ok()
            .flatten()
            .unwrap_or(1.0),
        detectable_measure: "gap at one site".into(),
        covers: "every alternative with a gap at some site of the window".into(),
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
    level: f64,
    acc: &Accumulator,
    t: &TableLaw,
    fam: &mut Tests,
    est: &mut Estimates,
) -> Option<Effect> {
    let observed = value_counts(acc)?;
    let n = observed.total();
    let law = ExactLaw::new(t.cells.clone()).ok()?;
    let r = chi_square_goodness_of_fit(&observed, &law, &ChiSquareOptions::default()).ok()?;
    fam.decide(
        "chi-square goodness of fit to the table",
        r.statistic,
        Some(r.dof as f64),
        r.p_value,
        format!(
            "{} outcomes; {} rare ones pooled into one cell (expected count < 5, common practice); {} cells compared",
            r.cells, r.pooled_cells, r.tested_cells
        ),
    );
    let tv = total_variation_to_law(&observed, &law, level).ok()?;
    // One sample against a known law: the variance of a cell's frequency is half that of a
    // difference of two samples of the same size, so the two-sample figure shrinks by √2.
    let detect = detectable_total_variation(n, n, r.tested_cells.max(2), level, s.power)
        .ok()
        .flatten()
        .map_or(1.0, |d| d / std::f64::consts::SQRT_2);
    est.top_outcomes.push(top_values(&observed, n));
    Some(tv_effect(
        &tv,
        "total variation to the table",
        detect,
        format!(
            "total variation to the table on the {} compared cells",
            r.tested_cells
        ),
        pooled_cells_cover(r.tested_cells, r.pooled_cells),
    ))
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
    level: f64,
    label: &str,
    v: &[f64],
    equals: Option<f64>,
    fam: &mut Tests,
    est: &mut Estimates,
) -> Option<Effect> {
    let m = moments(label, v);
    est.ecdf.push(ecdf_series(label, v, s.alpha));
    est.moments.push(m.clone());
    let m0 = equals?;
    let n = m.count.max(1) as f64;
    let se = m.sd / n.sqrt();
    let gap = (m.mean - m0).abs();
    // A constant sample whose mean equals the stated value up to rounding is no evidence against it.
    let rounding = 1e-12 * m0.abs().max(1.0);
    let (stat, p) = if se > 0.0 {
        (gap / se, 2.0 * motley_stats::normal_sf(gap / se))
    } else if gap <= rounding {
        (0.0, 1.0)
    } else {
        (f64::INFINITY, 0.0)
    };
    fam.decide(
        &format!("z-test of the mean against {m0}"),
        stat,
        None,
        p.min(1.0),
        "large-sample normal approximation; statistic: |mean − stated| / standard error".into(),
    );
    let z = normal_upper_quantile(level / 2.0);
    Some(Effect {
        measure: "|mean − stated value|".into(),
        estimate: gap,
        plug_in: None,
        same_law_level: None,
        upper_bound: gap + z * se,
        detectable: (z + normal_upper_quantile(1.0 - s.power)) * se,
        detectable_measure: "|mean − stated value|".into(),
        covers: "a shifted mean (large-sample normal approximation; the sample standard deviation stands in for the true one)".into(),
    })
}

fn accs<'a>(
    slots: &'a [(crate::unit::Slot, Accumulator)],
    sl: &crate::unit::Slot,
) -> &'a Accumulator {
    &slots.iter().find(|(k, _)| k == sl).expect("planned slot").1
}

/// Evaluates Monte Carlo claim `ci` from the merged accumulators, its deciding test at `level`
/// (the scenario's `alpha`, or a look's share of it), and draws its verdict
/// ([`crate::verdict::conclude`]).
pub fn evaluate(
    s: &Scenario,
    ci: usize,
    slots: &[(crate::unit::Slot, Accumulator)],
    level: f64,
) -> ClaimResult {
    let c: &ClaimSpec = &s.claims[ci];
    let sl = crate::unit::claim_slots(s, ci);
    let mut fam = Tests::new();
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
                effect = same_law_sets(s, level, labels, a, b, &mut fam, &mut est)
            }
            (Accumulator::Scalar(a), Accumulator::Scalar(b)) => {
                let discrete = [&sl[0], &sl[1]].iter().all(|x| {
                    matches!(
                        s.observables[x.observable].kind,
                        crate::scenario::ValueKind::Scalar { discrete: true, .. }
                    )
                });
                effect = same_law_scalars(
                    s, level, labels, &a.values, &b.values, discrete, &mut fam, &mut est,
                )
            }
            (Accumulator::Event(a), Accumulator::Event(b)) => {
                let (p, _) = two_proportion_p_value(a.yes, a.n, b.yes, b.n);
                let (pa, pb) = (a.yes as f64 / a.n as f64, b.yes as f64 / b.n as f64);
                fam.decide(
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
                let z = normal_upper_quantile(level / 2.0);
                let se = (pa * (1.0 - pa) / a.n as f64 + pb * (1.0 - pb) / b.n as f64).sqrt();
                effect = Some(Effect {
                    measure: "probability gap".into(),
                    estimate: (pa - pb).abs(),
                    plug_in: None,
                    same_law_level: None,
                    upper_bound: ((pa - pb).abs() + z * se).min(1.0),
                    detectable: detectable_probability_gap(
                        a.n,
                        b.n,
                        0.5 * (pa + pb),
                        level,
                        s.power,
                    )
                    .ok()
                    .flatten()
                    .unwrap_or(1.0),
                    detectable_measure: "probability gap".into(),
                    covers: "every alternative (normal approximation)".into(),
                });
            }
            (a @ Accumulator::Sequence(_), b @ Accumulator::Sequence(_))
            | (a @ Accumulator::Tuple(_), b @ Accumulator::Tuple(_)) => {
                if let (Some(ca), Some(cb)) = (value_counts(a), value_counts(b)) {
                    let (na, nb) = (ca.total(), cb.total());
                    effect = same_law_categorical(s, level, (&ca, na), (&cb, nb), &mut fam);
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
                effect =
                    tail_from_profile(s, level, labels, &x.values, p, from, &mut fam, &mut est);
            }
        }
        ClaimKind::LawOf(_, ReferenceSpec::Table(t)) => {
            effect = law_of_table(s, level, accs(slots, &sl[0]), t, &mut fam, &mut est);
        }
        ClaimKind::Mean(_, equals) => {
            if let Accumulator::Scalar(x) = accs(slots, &sl[0]) {
                effect = mean_of(s, level, labels[0], &x.values, *equals, &mut fam, &mut est);
            }
        }
        ClaimKind::LawOf(_, r) => {
            if let Accumulator::Scalar(x) = accs(slots, &sl[0]) {
                effect =
                    law_of_continuous(s, level, labels[0], &x.values, r, true, &mut fam, &mut est);
            }
        }
        ClaimKind::Probability(_, equals) => {
            if let Accumulator::Event(e) = accs(slots, &sl[0]) {
                est.probabilities
                    .push(interval(labels[0], e.yes, e.n, s.alpha));
                if let Some(p0) = equals {
                    if let Ok(t) = motley_stats::binomial_test(e.yes, e.n, *p0) {
                        fam.decide(
                            &format!("exact binomial test against {p0}"),
                            t.estimate,
                            None,
                            t.p_value,
                            "statistic: the estimated probability".into(),
                        );
                    }
                    let ph = e.yes as f64 / e.n as f64;
                    let i = interval("", e.yes, e.n, level);
                    let z =
                        normal_upper_quantile(level / 2.0) + normal_upper_quantile(1.0 - s.power);
                    effect = Some(Effect {
                        measure: "probability gap to the stated value".into(),
                        estimate: (ph - p0).abs(),
                        plug_in: None,
                        same_law_level: None,
                        upper_bound: (i.exact_upper - p0).abs().max((p0 - i.exact_lower).abs()),
                        detectable: (z * (p0 * (1.0 - p0) / e.n as f64).sqrt()).min(1.0),
                        detectable_measure: "probability gap to the stated value".into(),
                        covers: "every alternative (Clopper–Pearson bound; normal approximation for the power)".into(),
                    });
                }
            }
        }
        ClaimKind::Describe(_, reference, _) => match accs(slots, &sl[0]) {
            Accumulator::Scalar(x) => {
                if let Some(r) = reference {
                    effect = law_of_continuous(
                        s, level, labels[0], &x.values, r, false, &mut fam, &mut est,
                    );
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
    let mut result = ClaimResult {
        id: c.id.clone(),
        kind,
        says: c.says.clone(),
        observables,
        decided_by: DecidedBy::MonteCarlo,
        rejected: false,
        decision: Decision::NoClaim,
        level,
        tolerance: c.tolerance,
        look: None,
        verdict: String::new(),
        samples,
        tests: fam.tests,
        effect,
        exact: None,
        estimates: est,
        stated,
    };
    let p = crate::verdict::deciding_p(&result);
    crate::verdict::conclude(s, c, &mut result, p, level);
    result
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
