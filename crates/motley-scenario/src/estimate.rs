//! Estimates for tables and figures: inclusion curves, size laws, empirical CDFs with bands,
//! intervals, moments and the most frequent outcomes.
//!
//! Bands: per-point Wilson intervals at level `1 − α` for inclusion and size laws (pointwise, as
//! labelled in the report); for empirical CDFs the Dvoretzky–Kiefer–Wolfowitz band with Massart's
//! constant, `ε = √(ln(2/α) / (2n))` (Massart 1990), which holds simultaneously for all `x`.

use std::collections::BTreeMap;

use motley_stats::{clopper_pearson_interval, wilson_interval};

use crate::family::ValueKey;
use crate::result::{FullLaw, Interval, LawRow, Moments, Outcome, Series, LAW_ROW_CAP};

/// Most points kept on an empirical CDF curve.
pub const ECDF_POINTS: usize = 400;

/// DKW–Massart half-width for `n` samples at level `1 − alpha`.
pub fn dkw(n: u64, alpha: f64) -> f64 {
    ((2.0 / alpha).ln() / (2.0 * n.max(1) as f64)).sqrt()
}

/// An estimated probability with Wilson and Clopper–Pearson intervals at `1 − alpha`.
pub fn interval(label: &str, successes: u64, trials: u64, alpha: f64) -> Interval {
    let w = wilson_interval(successes, trials, 1.0 - alpha).ok();
    let c = clopper_pearson_interval(successes, trials, 1.0 - alpha).ok();
    Interval {
        label: label.to_string(),
        successes,
        trials,
        estimate: if trials == 0 {
            0.0
        } else {
            successes as f64 / trials as f64
        },
        wilson_lower: w.as_ref().map_or(0.0, |i| i.lower),
        wilson_upper: w.as_ref().map_or(1.0, |i| i.upper),
        exact_lower: c.as_ref().map_or(0.0, |i| i.lower),
        exact_upper: c.as_ref().map_or(1.0, |i| i.upper),
    }
}

/// A curve of proportions `counts[k] / n` at abscissae `x[k]` with pointwise Wilson bands.
pub fn proportion_series(label: &str, x: Vec<f64>, counts: &[u64], n: u64, alpha: f64) -> Series {
    let mut s = Series {
        label: label.to_string(),
        x,
        y: Vec::new(),
        lower: Vec::new(),
        upper: Vec::new(),
    };
    for &c in counts {
        let i = interval("", c, n, alpha);
        s.y.push(i.estimate);
        s.lower.push(i.wilson_lower);
        s.upper.push(i.wilson_upper);
    }
    s
}

/// Empirical CDF of sorted `values` with its DKW band, thinned to at most [`ECDF_POINTS`] points.
pub fn ecdf_series(label: &str, sorted: &[f64], alpha: f64) -> Series {
    let n = sorted.len();
    let eps = dkw(n as u64, alpha);
    let mut s = Series {
        label: label.to_string(),
        x: Vec::new(),
        y: Vec::new(),
        lower: Vec::new(),
        upper: Vec::new(),
    };
    if n == 0 {
        return s;
    }
    // Distinct values with the CDF just after them.
    let mut points: Vec<(f64, f64)> = Vec::new();
    let mut i = 0;
    while i < n {
        let v = sorted[i];
        let mut j = i;
        while j < n && sorted[j] == v {
            j += 1;
        }
        points.push((v, j as f64 / n as f64));
        i = j;
    }
    let step = points.len().div_ceil(ECDF_POINTS).max(1);
    let last = points.len() - 1;
    for (k, &(x, f)) in points.iter().enumerate() {
        if k % step == 0 || k == last {
            s.x.push(x);
            s.y.push(f);
            s.lower.push((f - eps).max(0.0));
            s.upper.push((f + eps).min(1.0));
        }
    }
    s
}

/// Mean and standard deviation of sorted values (summed in sorted order).
pub fn moments(label: &str, sorted: &[f64]) -> Moments {
    let n = sorted.len();
    let mean = if n == 0 {
        0.0
    } else {
        sorted.iter().sum::<f64>() / n as f64
    };
    let var = if n < 2 {
        0.0
    } else {
        sorted.iter().map(|v| (v - mean) * (v - mean)).sum::<f64>() / (n - 1) as f64
    };
    Moments {
        label: label.to_string(),
        count: n as u64,
        mean,
        sd: var.sqrt(),
    }
}

/// The `k` most frequent outcomes (ties broken by key order), as report strings.
pub fn top_outcomes<K: Ord>(
    counts: &BTreeMap<K, u64>,
    n: u64,
    k: usize,
    show: impl Fn(&K) -> String,
) -> Vec<Outcome> {
    let mut v: Vec<(&K, u64)> = counts.iter().map(|(k, c)| (k, *c)).collect();
    v.sort_by(|a, b| b.1.cmp(&a.1).then_with(|| a.0.cmp(b.0)));
    v.into_iter()
        .take(k)
        .map(|(key, c)| Outcome {
            value: show(key),
            probability: c as f64 / n.max(1) as f64,
        })
        .collect()
}

/// `{1, 3, 4}`.
pub fn show_set(elements: &[usize]) -> String {
    let inner: Vec<String> = elements.iter().map(|e| e.to_string()).collect();
    format!("{{{}}}", inner.join(", "))
}

/// A value as the report prints it: `{1, 3}`, `(3 1 2)`, `yes`, or the number.
pub fn show_value(k: &ValueKey) -> String {
    match k {
        ValueKey::Set(e) => show_set(e),
        ValueKey::Sequence(q) => show_sequence(q),
        ValueKey::Event(b) => (if *b { "yes" } else { "no" }).into(),
        ValueKey::Number(x) => format!("{}", x.0),
        ValueKey::Tuple(t) => {
            let inner: Vec<String> = t.iter().map(|x| format!("{}", x.0)).collect();
            format!("({})", inner.join(", "))
        }
    }
}

/// The full observed law of one observable from its counts by value (in value order).
pub fn full_law_observed(label: &str, counts: &[(&ValueKey, u64)]) -> FullLaw {
    let n: u64 = counts.iter().map(|(_, c)| c).sum();
    FullLaw {
        observable: label.to_string(),
        samples: n,
        distinct: counts.len(),
        truncated: counts.len() > LAW_ROW_CAP,
        rows: counts
            .iter()
            .take(LAW_ROW_CAP)
            .map(|(k, c)| LawRow {
                value: show_value(k),
                count: Some(*c),
                probability: *c as f64 / n.max(1) as f64,
                fraction: None,
            })
            .collect(),
    }
}

/// The full exact law of one observable (cells in value order), with fractions when `rational`
/// holds the same law in rationals.
pub fn full_law_exact(
    label: &str,
    cells: &[(ValueKey, f64)],
    rational: Option<&[(ValueKey, num_rational::BigRational)]>,
) -> FullLaw {
    let fraction = |k: &ValueKey| {
        let r = rational?;
        let i = r.binary_search_by(|(x, _)| x.cmp(k)).ok()?;
        Some(r[i].1.to_string())
    };
    FullLaw {
        observable: label.to_string(),
        samples: 0,
        distinct: cells.len(),
        truncated: cells.len() > LAW_ROW_CAP,
        rows: cells
            .iter()
            .take(LAW_ROW_CAP)
            .map(|(k, p)| LawRow {
                value: show_value(k),
                count: None,
                probability: *p,
                fraction: fraction(k),
            })
            .collect(),
    }
}

/// `(3 1 2)`.
pub fn show_sequence(seq: &[u32]) -> String {
    let inner: Vec<String> = seq.iter().map(|e| e.to_string()).collect();
    format!("({})", inner.join(" "))
}
