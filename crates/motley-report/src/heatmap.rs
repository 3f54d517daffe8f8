//! The joint-law chart: the binned empirical law of two numbers as a grid of shaded cells, beside the
//! reference law's cell masses on the same grid and the same colour scale.
//!
//! # Design
//! Both panels share one scale, from white (no mass) through the path scale to its darkest end at
//! the largest cell mass of either panel, so equal shades mean equal masses. Without a reference the
//! chart has one panel.

use std::path::Path;

use motley_scenario::result::JointLaw;
use plotters::prelude::*;

use crate::error::ReportError;
use crate::palette;

/// Pixel size of the two-panel chart.
const SIZE: (u32, u32) = (1040, 540);

fn shade(t: f64) -> RGBColor {
    // White at 0, then the path scale from its light (amber) end to its dark (indigo) end.
    let t = if t.is_finite() {
        t.clamp(0.0, 1.0)
    } else {
        0.0
    };
    let (r, g, b) = palette::scale(0.75 * (1.0 - t));
    let w = (1.0 - t).powi(3);
    let mix = |c: u8| (c as f64 * (1.0 - w) + 255.0 * w).round() as u8;
    RGBColor(mix(r), mix(g), mix(b))
}

/// Draws `law` (and its reference cells, when present) as SVG text.
pub(crate) fn joint_chart(law: &JointLaw, title: &str, path: &Path) -> Result<String, ReportError> {
    let err = |e: DrawingAreaErrorKind<std::io::Error>| ReportError::Draw {
        path: path.to_path_buf(),
        message: e.to_string(),
    };
    let k = law.bins.max(1);
    let top = law
        .cells
        .iter()
        .chain(law.reference_cells.iter().flatten())
        .fold(0.0f64, |a, &b| a.max(b));
    let top = if top > 0.0 { top } else { 1.0 };
    let mut buf = String::new();
    {
        let root = SVGBackend::with_string(&mut buf, SIZE).into_drawing_area();
        root.fill(&WHITE).map_err(err)?;
        let ink = RGBColor(palette::INK.0, palette::INK.1, palette::INK.2);
        let root = root
            .titled(title, ("sans-serif", 22).into_font().color(&ink))
            .map_err(err)?;
        let mut panels: Vec<(&str, &[f64])> = vec![("measured", &law.cells)];
        if let Some(r) = &law.reference_cells {
            panels.push((law.reference.as_deref().unwrap_or("reference"), r));
        }
        let areas = root.split_evenly((1, panels.len()));
        for (area, (name, cells)) in areas.iter().zip(panels) {
            let [x0, x1] = law.x_range;
            let [y0, y1] = law.y_range;
            let mut chart = ChartBuilder::on(area)
                .caption(name, ("sans-serif", 17).into_font().color(&ink))
                .margin(16)
                .x_label_area_size(48)
                .y_label_area_size(60)
                .build_cartesian_2d(x0..x1, y0..y1)
                .map_err(err)?;
            chart
                .configure_mesh()
                .disable_mesh()
                .x_desc(law.labels[0].as_str())
                .y_desc(law.labels[1].as_str())
                .axis_desc_style(("sans-serif", 15).into_font().color(&ink))
                .label_style(("sans-serif", 12).into_font().color(&ink))
                .draw()
                .map_err(err)?;
            let (dx, dy) = ((x1 - x0) / k as f64, (y1 - y0) / k as f64);
            chart
                .draw_series((0..k * k).filter(|c| cells.get(*c).is_some()).map(|c| {
                    let (i, j) = (c % k, c / k);
                    let (a, b) = (x0 + i as f64 * dx, y0 + j as f64 * dy);
                    Rectangle::new([(a, b), (a + dx, b + dy)], shade(cells[c] / top).filled())
                }))
                .map_err(err)?;
            let diag = RGBColor(
                palette::REFERENCE.0,
                palette::REFERENCE.1,
                palette::REFERENCE.2,
            );
            let (lo, hi) = (x0.max(y0), x1.min(y1));
            if hi > lo {
                chart
                    .draw_series(DashedLineSeries::new(
                        vec![(lo, lo), (hi, hi)],
                        6,
                        4,
                        diag.stroke_width(1),
                    ))
                    .map_err(err)?;
            }
        }
        root.present().map_err(err)?;
    }
    Ok(buf)
}
