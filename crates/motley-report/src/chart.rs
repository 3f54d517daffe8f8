//! The two chart shapes of the report, drawn with plotters into SVG text: curves with shaded
//! confidence bands (empirical CDFs against a reference), and points with interval bars (inclusion
//! probabilities, the law of the set size, event probabilities).
//!
//! # Design
//! Charts render into a `String` (plotters' SVG backend needs no file), so the report folder is written
//! by the caller like every other file. Non-finite points are skipped rather than failing the report, a
//! band is drawn only when its bounds have one value per point, and curves longer than
//! [`MAX_POINTS`] are thinned evenly for drawing (the full data stays in `result.json`).

use std::path::Path;

use motley_scenario::result::Series;
use plotters::coord::types::RangedCoordf64;
use plotters::prelude::*;

use crate::error::ReportError;
use crate::palette::{self, Rgb};

/// Pixel size of every chart.
const SIZE: (u32, u32) = (820, 540);
/// Most points drawn per curve.
pub(crate) const MAX_POINTS: usize = 1500;
/// Opacity of confidence bands.
const BAND_OPACITY: f64 = 0.2;

/// Titles and axes of one chart.
#[derive(Debug, Clone)]
pub(crate) struct ChartSpec {
    /// Title above the chart.
    pub title: String,
    /// Label of the horizontal axis.
    pub x_desc: String,
    /// Label of the vertical axis.
    pub y_desc: String,
    /// Fixed vertical range; `None` fits the data from 0.
    pub y_range: Option<(f64, f64)>,
    /// Where the legend goes.
    pub legend: SeriesLabelPosition,
    /// Labels for the integer abscissae 0, 1, …, when the axis is categorical.
    pub categories: Option<Vec<String>>,
    /// Label only integer ticks of the horizontal axis (elements, sizes).
    pub integer_x: bool,
}

/// A plotters colour from ours.
fn rgb(c: Rgb) -> RGBColor {
    RGBColor(c.0, c.1, c.2)
}

/// Converts a plotters error into ours, naming the figure.
fn draw_err<E: std::fmt::Display>(path: &Path) -> impl Fn(E) -> ReportError + '_ {
    move |e| ReportError::Draw {
        path: path.to_path_buf(),
        message: e.to_string(),
    }
}

/// Indices of at most [`MAX_POINTS`] evenly spread points, first and last kept.
fn thin(n: usize) -> Vec<usize> {
    if n <= MAX_POINTS {
        return (0..n).collect();
    }
    let mut idx: Vec<usize> = (0..MAX_POINTS)
        .map(|k| (k as f64 * (n - 1) as f64 / (MAX_POINTS - 1) as f64).round() as usize)
        .collect();
    idx.dedup();
    idx
}

/// A drawable point: abscissa, estimate and, when known, its (lower, upper) bounds.
type Point = (f64, f64, Option<(f64, f64)>);

/// The finite points `(x, y, band)` of a series, thinned; `band` is `Some((lower, upper))` when the
/// series has bounds for every point.
fn points(s: &Series) -> Vec<Point> {
    let n = s.x.len().min(s.y.len());
    let has_band = s.lower.len() == s.y.len() && s.upper.len() == s.y.len();
    thin(n)
        .into_iter()
        .filter(|&i| s.x[i].is_finite() && s.y[i].is_finite())
        .map(|i| {
            let band = (has_band && s.lower[i].is_finite() && s.upper[i].is_finite())
                .then(|| (s.lower[i], s.upper[i]));
            (s.x[i], s.y[i], band)
        })
        .collect()
}

/// Whether a series has at least one drawable point.
pub(crate) fn drawable(s: &Series) -> bool {
    !points(s).is_empty()
}

/// Right-continuous steps through `pts`: (x0, y0), (x1, y0), (x1, y1), …
fn steps(pts: &[(f64, f64)]) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(2 * pts.len());
    for (i, &(x, y)) in pts.iter().enumerate() {
        if i > 0 {
            out.push((x, pts[i - 1].1));
        }
        out.push((x, y));
    }
    out
}

/// Smallest and largest finite value, padded; a single value gets ±`pad_single`.
fn span(values: impl Iterator<Item = f64>, frac: f64, pad_single: f64) -> (f64, f64) {
    let (lo, hi) = values
        .filter(|v| v.is_finite())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
            (a.min(v), b.max(v))
        });
    if !lo.is_finite() {
        return (0.0, 1.0);
    }
    if hi - lo <= 0.0 {
        return (lo - pad_single, hi + pad_single);
    }
    let pad = (hi - lo) * frac;
    (lo - pad, hi + pad)
}

/// The vertical range: the spec's, else from 0 to just above the largest value or bound of the sides
/// and the reference (at least a little above 0).
fn y_range(spec: &ChartSpec, sides: &[&Series], reference: Option<&Series>) -> (f64, f64) {
    if let Some(range) = spec.y_range {
        return range;
    }
    let top = sides
        .iter()
        .copied()
        .chain(reference)
        .flat_map(points)
        .map(|(_, y, b)| b.map_or(y, |(_, u)| u.max(y)))
        .fold(0.0f64, f64::max);
    let top = if top > 0.0 { top * 1.08 } else { 1.0 };
    (0.0, top)
}

/// Curves with shaded bands, one per side, drawn as steps when `step`; `reference` dashed in grey.
pub(crate) fn curves(
    spec: &ChartSpec,
    sides: &[&Series],
    reference: Option<&Series>,
    step: bool,
    path: &Path,
) -> Result<String, ReportError> {
    let err = draw_err(path);
    let all_x = sides
        .iter()
        .copied()
        .chain(reference)
        .flat_map(|s| points(s).into_iter().map(|p| p.0));
    let (x0, x1) = span(all_x, 0.03, 0.5);
    let y = y_range(spec, sides, reference);
    frame(spec, (x0, x1), y, path, |chart| {
        for (i, s) in sides.iter().enumerate() {
            let c = rgb(palette::side(i));
            let pts = points(s);
            let line: Vec<(f64, f64)> = pts.iter().map(|p| (p.0, p.1)).collect();
            if pts.iter().all(|p| p.2.is_some()) {
                let lower: Vec<(f64, f64)> = pts.iter().map(|p| (p.0, p.2.unwrap().0)).collect();
                let upper: Vec<(f64, f64)> = pts.iter().map(|p| (p.0, p.2.unwrap().1)).collect();
                let (mut lower, mut upper) = if step {
                    (steps(&lower), steps(&upper))
                } else {
                    (lower, upper)
                };
                upper.reverse();
                lower.extend(upper);
                chart
                    .draw_series(std::iter::once(Polygon::new(
                        lower,
                        c.mix(BAND_OPACITY).filled(),
                    )))
                    .map_err(&err)?;
            }
            let line = if step { steps(&line) } else { line };
            chart
                .draw_series(LineSeries::new(line, c.stroke_width(2)))
                .map_err(&err)?
                .label(s.label.clone())
                .legend(move |(x, y)| {
                    PathElement::new(vec![(x, y), (x + 22, y)], c.stroke_width(3))
                });
        }
        if let Some(r) = reference {
            draw_reference(chart, r).map_err(&err)?;
        }
        Ok(())
    })
}

/// Points with interval bars, one colour per side, sides set slightly apart; `reference` dashed.
pub(crate) fn bars(
    spec: &ChartSpec,
    sides: &[&Series],
    reference: Option<&Series>,
    path: &Path,
) -> Result<String, ReportError> {
    let err = draw_err(path);
    let mut xs: Vec<f64> = sides
        .iter()
        .flat_map(|s| points(s).into_iter().map(|p| p.0))
        .collect();
    xs.sort_by(f64::total_cmp);
    xs.dedup();
    let gap = xs
        .windows(2)
        .map(|w| w[1] - w[0])
        .fold(f64::INFINITY, f64::min);
    let gap = if gap.is_finite() && gap > 0.0 {
        gap
    } else {
        1.0
    };
    let ref_x = reference
        .into_iter()
        .flat_map(|s| points(s).into_iter().map(|p| p.0));
    let (mut x0, mut x1) = span(xs.iter().copied().chain(ref_x), 0.0, 0.0);
    x0 -= 0.6 * gap;
    x1 += 0.6 * gap;
    let m = sides.len().max(1);
    let width = 0.5 * gap; // room shared by the sides around each abscissa
    let offset = |j: usize| {
        if m == 1 {
            0.0
        } else {
            width * (j as f64 / (m - 1) as f64 - 0.5)
        }
    };
    let cap = 0.12 * width.min(gap / m as f64).max(gap * 0.05);
    let y = y_range(spec, sides, reference);
    frame(spec, (x0, x1), y, path, |chart| {
        if let Some(r) = reference {
            draw_reference(chart, r).map_err(&err)?;
        }
        for (j, s) in sides.iter().enumerate() {
            let c = rgb(palette::side(j));
            let dx = offset(j);
            let pts = points(s);
            let mut segments = Vec::new();
            for &(x, _, band) in &pts {
                if let Some((lo, hi)) = band {
                    let x = x + dx;
                    segments.push(vec![(x, lo), (x, hi)]);
                    segments.push(vec![(x - cap, lo), (x + cap, lo)]);
                    segments.push(vec![(x - cap, hi), (x + cap, hi)]);
                }
            }
            chart
                .draw_series(
                    segments
                        .into_iter()
                        .map(|seg| PathElement::new(seg, c.stroke_width(2))),
                )
                .map_err(&err)?;
            chart
                .draw_series(
                    pts.iter()
                        .map(|&(x, y, _)| Circle::new((x + dx, y), 4, c.filled())),
                )
                .map_err(&err)?
                .label(s.label.clone())
                .legend(move |(x, y)| Circle::new((x + 11, y), 4, c.filled()));
        }
        Ok(())
    })
}

/// Draws one chart into SVG text: white ground, title, axes and grid from `spec` over the ranges
/// `x` and `y`, then `body`, then the legend.
fn frame(
    spec: &ChartSpec,
    x: (f64, f64),
    y: (f64, f64),
    path: &Path,
    body: impl FnOnce(&mut Chart<'_, '_>) -> Result<(), ReportError>,
) -> Result<String, ReportError> {
    let err = draw_err(path);
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, SIZE).into_drawing_area();
        root.fill(&WHITE).map_err(&err)?;
        let mut chart = ChartBuilder::on(&root)
            .caption(
                &spec.title,
                ("sans-serif", 22).into_font().color(&rgb(palette::INK)),
            )
            .margin(18)
            .x_label_area_size(54)
            .y_label_area_size(72)
            .build_cartesian_2d(x.0..x.1, y.0..y.1)
            .map_err(&err)?;
        mesh(&mut chart, spec).map_err(&err)?;
        body(&mut chart)?;
        legend(&mut chart, spec).map_err(&err)?;
        root.present().map_err(&err)?;
    }
    Ok(buf)
}

/// The reference curve: dashed grey, with its legend entry.
fn draw_reference(
    chart: &mut Chart<'_, '_>,
    r: &Series,
) -> Result<(), DrawingAreaErrorKind<std::io::Error>> {
    let c = rgb(palette::REFERENCE);
    let line: Vec<(f64, f64)> = points(r).iter().map(|p| (p.0, p.1)).collect();
    chart
        .draw_series(DashedLineSeries::new(line, 8, 5, c.stroke_width(2)))?
        .label(r.label.clone())
        .legend(move |(x, y)| PathElement::new(vec![(x, y), (x + 22, y)], c.stroke_width(2)));
    Ok(())
}

/// Chart type used by both shapes.
type Chart<'a, 'b> = ChartContext<'a, SVGBackend<'b>, Cartesian2d<RangedCoordf64, RangedCoordf64>>;

/// Grid, ticks and axis labels.
fn mesh(
    chart: &mut Chart<'_, '_>,
    spec: &ChartSpec,
) -> Result<(), DrawingAreaErrorKind<std::io::Error>> {
    let categories = spec.categories.clone();
    let integer_x = spec.integer_x;
    let fmt = move |x: &f64| -> String {
        match &categories {
            Some(labels) => {
                let k = x.round();
                if (x - k).abs() < 1e-6 && k >= 0.0 && (k as usize) < labels.len() {
                    labels[k as usize].clone()
                } else {
                    String::new()
                }
            }
            None if integer_x => {
                if (x - x.round()).abs() < 1e-9 {
                    plain(*x)
                } else {
                    String::new()
                }
            }
            None => plain(*x),
        }
    };
    let mut m = chart.configure_mesh();
    m.x_desc(spec.x_desc.as_str())
        .y_desc(spec.y_desc.as_str())
        .axis_desc_style(("sans-serif", 16).into_font().color(&rgb(palette::INK)))
        .label_style(("sans-serif", 13).into_font().color(&rgb(palette::INK)))
        .light_line_style(RGBColor(243, 245, 246))
        .bold_line_style(RGBColor(224, 228, 231))
        .x_label_formatter(&fmt)
        .y_label_formatter(&|y: &f64| plain(*y));
    if let Some(labels) = &spec.categories {
        m.x_labels(labels.len() + 1);
    }
    m.draw()
}

/// The legend box.
fn legend<'a, 'b: 'a>(
    chart: &mut Chart<'a, 'b>,
    spec: &ChartSpec,
) -> Result<(), DrawingAreaErrorKind<std::io::Error>> {
    chart
        .configure_series_labels()
        .position(spec.legend.clone())
        .margin(12)
        .label_font(("sans-serif", 14).into_font().color(&rgb(palette::INK)))
        .background_style(WHITE.mix(0.9))
        .border_style(RGBColor(190, 196, 200))
        .draw()
}

/// Tick label: short and without trailing zeros.
fn plain(x: f64) -> String {
    let s = format!("{:.4}", x);
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" {
        "0".into()
    } else {
        s.to_string()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn series(label: &str, x: Vec<f64>, y: Vec<f64>, half: f64) -> Series {
        Series {
            label: label.into(),
            lower: y.iter().map(|v| v - half).collect(),
            upper: y.iter().map(|v| v + half).collect(),
            x,
            y,
        }
    }

    fn spec() -> ChartSpec {
        ChartSpec {
            title: "T <1>".into(),
            x_desc: "value x".into(),
            y_desc: "P(X ≤ x)".into(),
            y_range: Some((0.0, 1.0)),
            legend: SeriesLabelPosition::LowerRight,
            categories: None,
            integer_x: false,
        }
    }

    #[test]
    fn thinning_keeps_ends_and_bounds_count() {
        let idx = thin(10_000);
        assert!(idx.len() <= MAX_POINTS);
        assert_eq!(idx[0], 0);
        assert_eq!(*idx.last().unwrap(), 9_999);
        assert_eq!(thin(5), vec![0, 1, 2, 3, 4]);
    }

    #[test]
    fn steps_are_right_continuous() {
        assert_eq!(
            steps(&[(0.0, 0.1), (1.0, 0.5), (2.0, 1.0)]),
            vec![(0.0, 0.1), (1.0, 0.1), (1.0, 0.5), (2.0, 0.5), (2.0, 1.0)]
        );
    }

    #[test]
    fn non_finite_points_and_ragged_bands_are_skipped() {
        let mut s = series("a", vec![0.0, 1.0, f64::NAN], vec![0.2, 0.4, 0.6], 0.1);
        assert_eq!(points(&s).len(), 2);
        assert!(points(&s).iter().all(|p| p.2.is_some()));
        s.lower.pop();
        assert!(points(&s).iter().all(|p| p.2.is_none()));
        let empty = series("e", vec![], vec![], 0.0);
        assert!(!drawable(&empty));
    }

    #[test]
    fn curve_chart_is_svg_with_labels_and_legend() {
        let a = series("side A", vec![0.0, 1.0, 2.0], vec![0.3, 0.6, 1.0], 0.05);
        let b = series("side B", vec![0.0, 1.0, 2.0], vec![0.25, 0.65, 1.0], 0.05);
        let r = series("reference", vec![0.0, 2.0], vec![0.0, 1.0], 0.0);
        let svg = curves(&spec(), &[&a, &b], Some(&r), true, Path::new("x.svg")).unwrap();
        assert!(svg.starts_with("<svg"), "{}", &svg[..40]);
        assert!(svg.trim_end().ends_with("</svg>"));
        for text in [
            "value x",
            "P(X ≤ x)",
            "side A",
            "side B",
            "reference",
            "T &lt;1&gt;",
        ] {
            assert!(svg.contains(text), "missing {text}");
        }
        // Both side colours and the reference grey are used.
        for c in [palette::side(0), palette::side(1), palette::REFERENCE] {
            // plotters writes colours as upper-case #RRGGBB.
            let hex = palette::hex(c).to_uppercase();
            assert!(svg.contains(&hex), "colour {hex} missing");
        }
        // Two bands.
        assert_eq!(svg.matches("<polygon").count(), 2);
    }

    #[test]
    fn bar_chart_draws_a_bar_and_two_caps_per_point() {
        let a = series("side A", vec![1.0, 2.0, 3.0], vec![0.2, 0.5, 0.3], 0.05);
        let mut sp = spec();
        sp.y_range = None;
        sp.categories = Some(vec![
            "t = 0".into(),
            "t = 1".into(),
            "t = 2".into(),
            "t = 3".into(),
        ]);
        let svg = bars(&sp, &[&a], None, Path::new("x.svg")).unwrap();
        assert!(svg.contains("t = 2"));
        assert_eq!(svg.matches("<circle").count(), 3 + 1); // three points and the legend mark
    }
}
