//! Which figures a claim gets, their file names and captions: `figures/<claim>-<kind>.svg` for the
//! empirical CDF (`ecdf`), per-element inclusion probabilities (`inclusion`), the law of the set size
//! (`size-law`) and event probabilities (`probabilities`, when there are several).
//!
//! # Design
//! A figure is drawn only when its data is present, so the report never shows empty axes. Claim ids
//! become file stems by keeping letters, digits, `-` and `_` (anything else becomes `-`); two ids that
//! clash after that get `-2`, `-3`, … in claim order. Event probabilities are plotted against a
//! parameter when every label ends in a distinct number (`t = 4`, `t = 8`, …), else one slot per label.

use std::collections::BTreeSet;
use std::path::Path;

use motley_scenario::result::{ClaimResult, Interval, Series};
use plotters::prelude::SeriesLabelPosition;

use crate::chart::{self, ChartSpec};
use crate::error::ReportError;
use crate::side::side_label;

/// One figure written for a claim.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) struct Figure {
    /// Path relative to the report folder, e.g. `figures/rainbow-ecdf.svg`.
    pub file: String,
    /// Short title, used as alt text.
    pub title: String,
    /// One sentence on what is drawn.
    pub caption: String,
}

/// File stems for the claims, in order: sanitized ids, unique.
pub(crate) fn stems(claims: &[ClaimResult]) -> Vec<String> {
    let mut used = BTreeSet::new();
    claims
        .iter()
        .map(|c| {
            let base: String =
                c.id.chars()
                    .map(|ch| {
                        if ch.is_ascii_alphanumeric() || ch == '-' || ch == '_' {
                            ch
                        } else {
                            '-'
                        }
                    })
                    .collect();
            let base = if base.is_empty() {
                "claim".to_string()
            } else {
                base
            };
            let mut stem = base.clone();
            let mut k = 2;
            while !used.insert(stem.clone()) {
                stem = format!("{base}-{k}");
                k += 1;
            }
            stem
        })
        .collect()
}

/// The drawable series of `list`, with labels filled in.
fn labelled(claim: &ClaimResult, list: &[Series]) -> Vec<Series> {
    list.iter()
        .enumerate()
        .filter(|(_, s)| chart::drawable(s))
        .map(|(i, s)| Series {
            label: side_label(claim, &s.label, i),
            ..s.clone()
        })
        .collect()
}

/// Draws every figure `claim` has data for into `report_dir/figures/`, returning them in order.
pub(crate) fn draw_claim(
    claim: &ClaimResult,
    stem: &str,
    alpha: f64,
    report_dir: &Path,
) -> Result<Vec<Figure>, ReportError> {
    let est = &claim.estimates;
    let level = crate::format::num(100.0 * (1.0 - alpha));
    let mut out = Vec::new();
    let mut emit = |kind: &str,
                    title: String,
                    caption: String,
                    svg: &dyn Fn(&Path) -> Result<String, ReportError>|
     -> Result<(), ReportError> {
        let file = format!("figures/{stem}-{kind}.svg");
        let path = report_dir.join(&file);
        let text = svg(&path)?;
        crate::atomic::write_synced(&path, text.as_bytes())?;
        out.push(Figure {
            file,
            title,
            caption,
        });
        Ok(())
    };

    let ecdf = labelled(claim, &est.ecdf);
    if !ecdf.is_empty() {
        let reference = est
            .reference
            .as_ref()
            .filter(|r| chart::drawable(r))
            .map(|r| Series {
                label: if r.label.trim().is_empty() {
                    "reference".into()
                } else {
                    r.label.clone()
                },
                ..r.clone()
            });
        // A tail-from-profile claim draws P(X ≥ x) (its label says so), not a CDF.
        let tail = ecdf.iter().any(|e| e.label.ends_with(" ≥ x)"));
        let what = if tail {
            "tail P(X ≥ x)"
        } else {
            "empirical CDF"
        };
        let title = match &reference {
            Some(_) => format!("{}: {what} against the reference", claim.id),
            None => format!("{}: {what}", claim.id),
        };
        let caption = format!(
            "{} of each side (steps) with its {level}% confidence band (shaded){}.",
            if tail {
                "Tail probability P(X ≥ x)"
            } else {
                "Empirical distribution function"
            },
            if reference.is_some() {
                "; dashed grey: the reference curve"
            } else {
                ""
            }
        );
        let spec = ChartSpec {
            title: title.clone(),
            x_desc: "value x".into(),
            y_desc: if tail { "P(X ≥ x)" } else { "P(X ≤ x)" }.into(),
            y_range: Some((-0.02, 1.02)),
            legend: SeriesLabelPosition::LowerRight,
            categories: None,
            integer_x: false,
        };
        let sides: Vec<&Series> = ecdf.iter().collect();
        emit("ecdf", title, caption, &|p| {
            chart::curves(&spec, &sides, reference.as_ref(), true, p)
        })?;
    }

    // Per-side bar charts of element-indexed laws: (kind, data, title, x axis, y axis, caption start).
    let side_laws = [
        (
            "inclusion",
            &est.inclusion,
            "per-element inclusion probability",
            "element",
            "P(element in the set)",
            "Probability that each element belongs to the set",
        ),
        (
            "size-law",
            &est.size_law,
            "law of the set size",
            "set size k",
            "P(size = k)",
            "Law of the number of elements in the set",
        ),
    ];
    for (kind, list, what, x_desc, y_desc, says) in side_laws {
        let list = labelled(claim, list);
        if list.is_empty() {
            continue;
        }
        let title = format!("{}: {what}", claim.id);
        let spec = ChartSpec {
            title: title.clone(),
            x_desc: x_desc.into(),
            y_desc: y_desc.into(),
            y_range: None,
            legend: SeriesLabelPosition::UpperRight,
            categories: None,
            integer_x: integral(&list),
        };
        let caption = format!("{says}, per side, with {level}% intervals (bars).");
        let sides: Vec<&Series> = list.iter().collect();
        emit(kind, title, caption, &|p| {
            chart::bars(&spec, &sides, None, p)
        })?;
    }

    if !est.series.is_empty() {
        let pts = &est.series;
        let axis = est
            .series_axis
            .clone()
            .unwrap_or_else(|| "parameter".into());
        let events = pts.iter().all(|p| p.sd.is_none());
        let measured = Series {
            label: if events {
                "estimated probability".into()
            } else {
                "measured mean".into()
            },
            x: pts.iter().map(|p| p.at).collect(),
            y: pts.iter().map(|p| p.estimate).collect(),
            lower: pts.iter().map(|p| p.lower).collect(),
            upper: pts.iter().map(|p| p.upper).collect(),
        };
        let predicted: Vec<(f64, f64)> = pts
            .iter()
            .filter_map(|p| p.predicted.map(|v| (p.at, v)))
            .collect();
        let theory = (predicted.len() == pts.len()).then(|| Series {
            label: est.series_theory.clone().unwrap_or_else(|| "theory".into()),
            x: predicted.iter().map(|p| p.0).collect(),
            y: predicted.iter().map(|p| p.1).collect(),
            lower: predicted.iter().map(|p| p.1).collect(),
            upper: predicted.iter().map(|p| p.1).collect(),
        });
        let title = format!(
            "{}: {} against {axis}",
            claim.id,
            if events { "probability" } else { "mean" }
        );
        let spec = ChartSpec {
            title: title.clone(),
            x_desc: axis.clone(),
            y_desc: if events {
                "probability".into()
            } else {
                "mean".into()
            },
            y_range: None,
            legend: SeriesLabelPosition::UpperRight,
            categories: None,
            integer_x: false,
        };
        let caption = format!(
            "{} at each {axis} with {level}% intervals (bars){}.",
            if events {
                "Estimated probability"
            } else {
                "Measured mean"
            },
            if theory.is_some() {
                "; dashed grey: the theory's value"
            } else {
                ""
            }
        );
        emit("series", title, caption, &|p| {
            chart::bars(&spec, &[&measured], theory.as_ref(), p)
        })?;
        if pts.iter().all(|p| p.distance.is_some()) {
            let distance = Series {
                label: "Kolmogorov distance".into(),
                x: pts.iter().map(|p| p.at).collect(),
                y: pts.iter().map(|p| p.distance.unwrap_or(0.0)).collect(),
                lower: pts.iter().map(|p| p.distance.unwrap_or(0.0)).collect(),
                upper: pts
                    .iter()
                    .map(|p| p.distance_upper.unwrap_or(1.0))
                    .collect(),
            };
            let title = format!("{}: distance to the reference against {axis}", claim.id);
            let spec = ChartSpec {
                title: title.clone(),
                x_desc: axis.clone(),
                y_desc: "sup |F_n − F|".into(),
                y_range: None,
                legend: SeriesLabelPosition::UpperRight,
                categories: None,
                integer_x: false,
            };
            let caption = format!(
                "Kolmogorov distance of each empirical CDF to the reference (dots) with its {level}% upper bound (bar top); on integer-valued data it includes the lattice's own steps."
            );
            emit("distance", title, caption, &|p| {
                chart::bars(&spec, &[&distance], None, p)
            })?;
        }
    }

    if let Some(law) = &est.joint {
        let title = format!(
            "{}: joint law of {} and {}",
            claim.id, law.labels[0], law.labels[1]
        );
        let caption = format!(
            "Fraction of samples in each of {b}×{b} cells (darker: more){}; dashed: the diagonal.",
            if law.reference_cells.is_some() {
                ", beside the reference law's mass of the same cells on the same scale (its mass on the diagonal falls in the diagonal cells)"
            } else {
                ""
            },
            b = law.bins
        );
        emit("joint", title.clone(), caption, &|p| {
            crate::heatmap::joint_chart(law, &title, p)
        })?;
    }

    if est.probabilities.len() >= 2 && est.series.is_empty() {
        let (series, x_desc, categories) = probability_series(&est.probabilities);
        let reference = est
            .reference
            .as_ref()
            .filter(|r| categories.is_none() && est.ecdf.is_empty() && chart::drawable(r));
        let title = format!("{}: event probabilities", claim.id);
        let spec = ChartSpec {
            title: title.clone(),
            x_desc,
            y_desc: "probability".into(),
            y_range: None,
            legend: SeriesLabelPosition::LowerRight,
            categories,
            integer_x: false,
        };
        let caption = format!(
            "Estimated probabilities with {level}% Wilson intervals (bars){}.",
            if reference.is_some() {
                "; dashed grey: the reference curve"
            } else {
                ""
            }
        );
        emit("probabilities", title, caption, &|p| {
            chart::bars(&spec, &[&series], reference, p)
        })?;
    }
    Ok(out)
}

/// Whether every abscissa of every series is an integer.
fn integral(list: &[Series]) -> bool {
    list.iter()
        .flat_map(|s| &s.x)
        .all(|x| !x.is_finite() || x.fract() == 0.0)
}

/// The probabilities as one series, against a parameter read off the labels when possible; returns
/// the series, the axis label and the category labels (when categorical).
fn probability_series(list: &[Interval]) -> (Series, String, Option<Vec<String>>) {
    let parsed: Vec<Option<(String, f64)>> =
        list.iter().map(|i| trailing_number(&i.label)).collect();
    let numeric = parsed.iter().all(Option::is_some) && {
        let mut xs: Vec<f64> = parsed.iter().map(|p| p.as_ref().unwrap().1).collect();
        xs.sort_by(f64::total_cmp);
        xs.windows(2).all(|w| w[0] < w[1])
    };
    let (x, x_desc, categories) = if numeric {
        let prefixes: BTreeSet<&str> = parsed
            .iter()
            .map(|p| p.as_ref().unwrap().0.as_str())
            .collect();
        let name = if prefixes.len() == 1 {
            prefixes.into_iter().next().unwrap().to_string()
        } else {
            String::new()
        };
        let name = if name.is_empty() {
            "parameter".to_string()
        } else {
            name
        };
        (
            parsed.iter().map(|p| p.as_ref().unwrap().1).collect(),
            name,
            None,
        )
    } else {
        (
            (0..list.len()).map(|i| i as f64).collect(),
            "event".to_string(),
            Some(list.iter().map(|i| i.label.clone()).collect()),
        )
    };
    let series = Series {
        label: "estimate".into(),
        x,
        y: list.iter().map(|i| i.estimate).collect(),
        lower: list.iter().map(|i| i.wilson_lower).collect(),
        upper: list.iter().map(|i| i.wilson_upper).collect(),
    };
    (series, x_desc, categories)
}

/// Splits `t = 4.5` into (`t`, 4.5): the label's last whitespace- or `=`-separated token as a number
/// and the text before it, trimmed of spaces and `=`.
fn trailing_number(label: &str) -> Option<(String, f64)> {
    let label = label.trim();
    let cut = label
        .rfind(|c: char| c.is_whitespace() || c == '=')
        .map_or(0, |i| i + 1);
    let value: f64 = label[cut..].parse().ok()?;
    if !value.is_finite() {
        return None;
    }
    let name = label[..cut].trim_end_matches(|c: char| c.is_whitespace() || c == '=');
    Some((name.to_string(), value))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn interval(label: &str, k: u64, n: u64) -> Interval {
        let p = k as f64 / n as f64;
        Interval {
            label: label.into(),
            successes: k,
            trials: n,
            estimate: p,
            wilson_lower: p - 0.01,
            wilson_upper: p + 0.01,
            exact_lower: p - 0.012,
            exact_upper: p + 0.012,
        }
    }

    #[test]
    fn trailing_numbers_are_read_off_labels() {
        assert_eq!(trailing_number("t = 4.5"), Some(("t".into(), 4.5)));
        assert_eq!(trailing_number("time 8"), Some(("time".into(), 8.0)));
        assert_eq!(trailing_number("12"), Some(("".into(), 12.0)));
        assert_eq!(trailing_number("swapped"), None);
        assert_eq!(trailing_number("x = inf"), None);
    }

    #[test]
    fn probabilities_use_a_numeric_axis_when_labels_allow() {
        let list = [interval("t = 2", 30, 100), interval("t = 4", 50, 100)];
        let (s, desc, cats) = probability_series(&list);
        assert_eq!(s.x, vec![2.0, 4.0]);
        assert_eq!(desc, "t");
        assert!(cats.is_none());
        let list = [interval("A swaps", 30, 100), interval("B swaps", 50, 100)];
        let (s, desc, cats) = probability_series(&list);
        assert_eq!(s.x, vec![0.0, 1.0]);
        assert_eq!(desc, "event");
        assert_eq!(cats.unwrap(), vec!["A swaps", "B swaps"]);
        // Repeated numbers cannot be an axis.
        let list = [interval("side 1", 3, 10), interval("side 1", 5, 10)];
        assert!(probability_series(&list).2.is_some());
    }
}
