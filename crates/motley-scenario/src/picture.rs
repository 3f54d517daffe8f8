//! One sample configuration of a six-vertex model, for the report's picture.

use crate::scenario::{ModelKind, Scenario};
use crate::six_vertex_unit::SixVertexUnit;
use crate::unit::unit_seed;

/// Largest side drawn; larger rectangles are not pictured.
pub const PICTURE_MAX_SIDE: usize = 2000;

/// Every edge color of one sample (coordinates from 0, rows from the bottom).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct PictureData {
    /// Model name.
    pub model: String,
    /// Columns.
    pub width: usize,
    /// Rows.
    pub height: usize,
    /// Largest color.
    pub max_color: u32,
    /// Left boundary colors, row 0 first.
    pub left: Vec<u32>,
    /// Bottom boundary colors, column 0 first.
    pub bottom: Vec<u32>,
    /// `y·W + x`: color leaving vertex `(x, y)` to the right.
    pub right_out: Vec<u32>,
    /// `y·W + x`: color leaving vertex `(x, y)` upward.
    pub up_out: Vec<u32>,
}

/// Sample 0 of replica 0 of the first six-vertex model of `s` that is small enough to draw.
pub fn sample_picture(s: &Scenario) -> Option<PictureData> {
    let (m, sv) = s.models.iter().find_map(|m| match &m.kind {
        ModelKind::SixVertex(sv) if sv.width.max(sv.height) <= PICTURE_MAX_SIDE => Some((m, sv)),
        _ => None,
    })?;
    let mut unit = SixVertexUnit::new(m, sv, Vec::new(), true).ok()?;
    unit.draw(unit_seed(s.seed, &m.name, 0), 0);
    let r = unit.readout();
    let c = r.configuration()?;
    let (w, h) = (sv.width, sv.height);
    let mut right_out = Vec::with_capacity(w * h);
    let mut up_out = Vec::with_capacity(w * h);
    for y in 1..=h {
        for x in 1..=w {
            right_out.push(c.right(x, y));
            up_out.push(c.up(x, y));
        }
    }
    Some(PictureData {
        model: m.name.clone(),
        width: w,
        height: h,
        max_color: m.max_color,
        left: r.left().to_vec(),
        bottom: r.bottom().to_vec(),
        right_out,
        up_out,
    })
}
