//! Estimates of the `series` and `joint` claims: nothing is tested, the theory is drawn beside.

use motley_reference::SpeedProcessPair;
use motley_stats::{ks_one_sample, normal_upper_quantile, KsMethod, ScalarSample};

use crate::accumulate::{Accumulator, PairValues};
use crate::estimate::{dkw, ecdf_series, interval, moments};
use crate::reference_law::{reference_cdf, reference_name};
use crate::result::{Estimates, JointLaw, Region, SeriesPoint};
use crate::scenario::{JointReference, ReferenceSpec, Scenario, SeriesSpec};

/// Cells per axis of a joint law's grid.
pub const JOINT_BINS: usize = 20;

/// The mean and standard deviation of a continuous reference law, from its CDF `F` by
/// `E X = b − ∫ F` and `E X² = b² − ∫ 2xF` over a range `[a, b]` holding all but a negligible
/// part of the mass (composite Simpson rule, 4000 intervals).
pub fn reference_moments(r: &ReferenceSpec) -> Option<(f64, f64)> {
    let f = reference_cdf(r)?;
    let (a, b) = match *r {
        ReferenceSpec::Uniform(lo, hi) => (lo, hi),
        ReferenceSpec::Normal(m, sd) => (m - 12.0 * sd, m + 12.0 * sd),
        // F₂ and F₁ below −12 are under 1e-100 and above 10 within 1e-20 of 1 (both tails
        // decay like exp(−c|s|^(3/2)) or faster; Tracy and Widom 1994, 1996).
        ReferenceSpec::TracyWidomGue | ReferenceSpec::TracyWidomGoe => (-12.0, 10.0),
        ReferenceSpec::SixVertexExitSpeed(k) => (1.0 / k, k),
        ReferenceSpec::TailFromProfile(_) | ReferenceSpec::Table(_) => return None,
    };
    let n = 4000;
    let h = (b - a) / n as f64;
    let (mut i1, mut i2) = (0.0, 0.0);
    for k in 0..=n {
        let x = a + k as f64 * h;
        let w = if k == 0 || k == n {
            1.0
        } else if k % 2 == 1 {
            4.0
        } else {
            2.0
        };
        let fx = f(x);
        i1 += w * fx;
        i2 += w * 2.0 * x * fx;
    }
    let (i1, i2) = (i1 * h / 3.0, i2 * h / 3.0);
    let mean = b - i1;
    let second = b * b - i2;
    Some((mean, (second - mean * mean).max(0.0).sqrt()))
}

/// Fills `est.series` (and, for numbers with a reference, the ECDFs and the reference curve).
pub fn series(s: &Scenario, sr: &SeriesSpec, accs: &[&Accumulator], est: &mut Estimates) {
    let z = normal_upper_quantile(s.alpha / 2.0);
    est.series_axis = Some(sr.axis.clone());
    est.series_theory = match (&sr.profile, sr.limit, &sr.reference) {
        (Some(p), _, _) => Some(format!("profile {}", p.name)),
        (None, Some(l), _) => Some(format!("limit {l}")),
        (None, None, Some(r)) => Some(format!("mean of {}", reference_name(r))),
        _ => None,
    };
    let ref_moments = sr.reference.as_ref().and_then(reference_moments);
    let cdf = sr.reference.as_ref().and_then(reference_cdf);
    for (k, acc) in accs.iter().enumerate() {
        let label = s.observables[sr.observables[k]].name.clone();
        let predicted = sr
            .profile
            .as_ref()
            .map(|p| p.values[k])
            .or(sr.limit)
            .or(ref_moments.map(|m| m.0));
        let point = match acc {
            Accumulator::Scalar(x) => {
                let m = moments(&label, &x.values);
                let half = if m.count > 1 {
                    z * m.sd / (m.count as f64).sqrt()
                } else {
                    f64::INFINITY
                };
                let distance = cdf.as_ref().and_then(|f| kolmogorov(&x.values, f));
                if sr.reference.is_some() && !x.values.is_empty() {
                    est.ecdf.push(ecdf_series(&label, &x.values, s.alpha));
                }
                est.moments.push(m.clone());
                SeriesPoint {
                    label,
                    at: sr.at[k],
                    estimate: m.mean,
                    lower: m.mean - half,
                    upper: m.mean + half,
                    sd: Some(m.sd),
                    predicted,
                    predicted_sd: ref_moments.map(|m| m.1),
                    distance,
                    distance_upper: distance.map(|d| (d + dkw(m.count, s.alpha)).min(1.0)),
                    count: m.count,
                }
            }
            Accumulator::Event(e) => {
                let i = interval(&label, e.yes, e.n, s.alpha);
                let p = SeriesPoint {
                    label,
                    at: sr.at[k],
                    estimate: i.estimate,
                    lower: i.wilson_lower,
                    upper: i.wilson_upper,
                    sd: None,
                    predicted,
                    predicted_sd: None,
                    distance: None,
                    distance_upper: None,
                    count: e.n,
                };
                est.probabilities.push(i);
                p
            }
            _ => continue,
        };
        est.series.push(point);
    }
    if let Some(r) = &sr.reference {
        let lo = est
            .ecdf
            .iter()
            .filter_map(|e| e.x.first())
            .fold(f64::INFINITY, |a, &b| a.min(b));
        let hi = est
            .ecdf
            .iter()
            .filter_map(|e| e.x.last())
            .fold(f64::NEG_INFINITY, |a, &b| a.max(b));
        if lo.is_finite() && hi.is_finite() {
            est.reference = reference_curve(r, lo, hi);
        }
    }
}

/// Kolmogorov distance of the values to a continuous CDF (`motley-stats`' one-sample statistic).
fn kolmogorov(values: &[f64], f: &dyn Fn(f64) -> f64) -> Option<f64> {
    let sample = ScalarSample::from_values(values.to_vec()).ok()?;
    ks_one_sample(&sample, f, KsMethod::Auto)
        .ok()
        .map(|r| r.statistic)
}

/// The reference CDF on 200 points over `[lo, hi]`.
fn reference_curve(r: &ReferenceSpec, lo: f64, hi: f64) -> Option<crate::result::Series> {
    let f = reference_cdf(r)?;
    let (lo, hi) = if hi > lo {
        (lo, hi)
    } else {
        (lo - 1.0, lo + 1.0)
    };
    let x: Vec<f64> = (0..200)
        .map(|k| lo + (hi - lo) * k as f64 / 199.0)
        .collect();
    let y: Vec<f64> = x.iter().map(|&v| f(v)).collect();
    Some(crate::result::Series {
        label: reference_name(r),
        x,
        lower: y.clone(),
        upper: y.clone(),
        y,
    })
}

/// Fills `est.joint` from the pairs of a `joint` claim.
pub fn joint(
    s: &Scenario,
    labels: [&str; 2],
    pairs: &PairValues,
    reference: Option<JointReference>,
    est: &mut Estimates,
) {
    let v = &pairs.values;
    let n = v.len() as u64;
    let (mut x_range, mut y_range) = (range(v.iter().map(|p| p[0])), range(v.iter().map(|p| p[1])));
    if let Some(JointReference::SpeedProcessPair) = reference {
        // The limit lives on [−1, 1]²; at finite t some samples lie beyond (X(t)/t fluctuates by
        // about t^(−1/2) at the edges), so the grid covers both.
        for r in [&mut x_range, &mut y_range] {
            *r = [r[0].min(-1.0), r[1].max(1.0)];
        }
    }
    let bins = JOINT_BINS;
    let mut cells = vec![0.0; bins * bins];
    let bin = |x: f64, r: [f64; 2]| -> Option<usize> {
        let u = (x - r[0]) / (r[1] - r[0]);
        if !(0.0..=1.0).contains(&u) {
            return None;
        }
        Some(((u * bins as f64) as usize).min(bins - 1))
    };
    for p in v {
        if let (Some(i), Some(j)) = (bin(p[0], x_range), bin(p[1], y_range)) {
            cells[j * bins + i] += 1.0 / n as f64;
        }
    }
    let reference_cells = reference.map(|JointReference::SpeedProcessPair| {
        let law = SpeedProcessPair;
        let edge = |k: usize, r: [f64; 2]| r[0] + (r[1] - r[0]) * k as f64 / bins as f64;
        let mut c = vec![0.0; bins * bins];
        for j in 0..bins {
            for i in 0..bins {
                let (a0, a1) = (edge(i, x_range), edge(i + 1, x_range));
                let (b0, b1) = (edge(j, y_range), edge(j + 1, y_range));
                c[j * bins + i] = (law.cdf(a1, b1) - law.cdf(a0, b1) - law.cdf(a1, b0)
                    + law.cdf(a0, b0))
                .max(0.0);
            }
        }
        c
    });
    let count = |f: &dyn Fn(&[f64; 2]) -> bool| v.iter().filter(|p| f(p)).count() as u64;
    let (a, b) = (labels[0], labels[1]);
    let speed = reference.is_some();
    let regions = vec![
        Region {
            estimate: interval(&format!("{a} < {b}"), count(&|p| p[0] < p[1]), n, s.alpha),
            reference: speed.then_some(SpeedProcessPair::P_INITIAL_ORDER),
        },
        // The limit's diagonal mass (1/6: swapped, then equal speeds) belongs with the swapped
        // pairs at finite t, where the two particles never share a site: the reference of
        // `a > b` is P(U₀ ≥ U₁) = 1/2 + 1/6, and `a = b` has none.
        Region {
            estimate: interval(&format!("{a} > {b}"), count(&|p| p[0] > p[1]), n, s.alpha),
            reference: speed.then_some(SpeedProcessPair::P_SWAPPED_OR_TIED),
        },
        Region {
            estimate: interval(&format!("{a} = {b}"), count(&|p| p[0] == p[1]), n, s.alpha),
            reference: None,
        },
    ];
    est.joint = Some(JointLaw {
        labels: [a.to_string(), b.to_string()],
        x_range,
        y_range,
        bins,
        cells,
        reference_cells,
        reference: reference.map(|_| "speed-process-pair".to_string()),
        regions,
        correlation: correlation(v),
        count: n,
    });
}

/// `[min, max]` of the values, widened to a unit interval when they are all equal (or absent).
fn range(x: impl Iterator<Item = f64>) -> [f64; 2] {
    let (lo, hi) = x.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
        (a.min(v), b.max(v))
    });
    if !(lo.is_finite() && hi.is_finite()) {
        return [0.0, 1.0];
    }
    if hi > lo {
        [lo, hi]
    } else {
        [lo - 0.5, lo + 0.5]
    }
}

fn correlation(v: &[[f64; 2]]) -> f64 {
    let n = v.len() as f64;
    if v.len() < 2 {
        return 0.0;
    }
    let mx = v.iter().map(|p| p[0]).sum::<f64>() / n;
    let my = v.iter().map(|p| p[1]).sum::<f64>() / n;
    let (mut sxy, mut sxx, mut syy) = (0.0, 0.0, 0.0);
    for p in v {
        sxy += (p[0] - mx) * (p[1] - my);
        sxx += (p[0] - mx) * (p[0] - mx);
        syy += (p[1] - my) * (p[1] - my);
    }
    if sxx == 0.0 || syy == 0.0 {
        0.0
    } else {
        sxy / (sxx * syy).sqrt()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// F₂'s mean and standard deviation from its CDF against the published values
    /// (−1.7710868074 and √0.8131947928 = 0.9017731; Bornemann 2010, from memory; 1e-6 allows for
    /// the quadrature of this helper, which only labels figures).
    #[test]
    fn tracy_widom_moments_from_the_cdf() {
        let (m, sd) = reference_moments(&ReferenceSpec::TracyWidomGue).unwrap();
        assert!((m + 1.771_086_807_4).abs() < 1e-6, "{m}");
        assert!((sd - 0.813_194_792_8f64.sqrt()).abs() < 1e-6, "{sd}");
        let (m, sd) = reference_moments(&ReferenceSpec::Uniform(-1.0, 3.0)).unwrap();
        assert!((m - 1.0).abs() < 1e-9 && (sd - 4.0 / 12f64.sqrt()).abs() < 1e-9);
    }
}
