//! Read-outs: what a sample reports, requested up front and filled in during the sweep.
//!
//! A [`ReadoutSpec`] lists what to keep; [`crate::Model::readout`] checks it against the rectangle and
//! returns a [`Readout`], which also owns the sweep's scratch buffers, so that sampling many times into
//! the same read-out allocates nothing. The boundary drawn, the top exits and the right exits are
//! always kept (they cost `W + H` colors).
//!
//! # Height function
//! For `0 ≤ a ≤ W`, `0 ≤ b ≤ H` and a threshold `t ≥ 1`, `H_t(a, b)` is the number of paths of
//! color `≥ t` that cross the horizontal line at height `b + ½` strictly right of `a + ½` (vertical
//! edges above row `b` in columns `a + 1..=W`) plus the number leaving through the right side in rows
//! `1..=b`. Because paths only go up and right, this equals the number of such paths entering the
//! region `{a + 1..=W} × {1..=b}`: through the vertical line `a + ½` in rows `1..=b`, or from below in
//! columns `a + 1..=W`. Under the step boundary `H(0, b) = b` and `H(a, 0) = 0`, and `H(a, b)` counts
//! the paths crossing the vertical line `a + ½` below height `b + ½`. `t = 1` (or 0) counts every path
//! (the colorblind height); a larger `t` is the height of the colorblind projection at threshold `t`.

use motley_colorblind::Color;

use crate::strip::StripScratch;
use crate::{Configuration, Outcome, SixVertexError};

/// A point of the height function and the threshold of colors it counts.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct HeightQuery {
    /// Column coordinate `a`, `0 ≤ a ≤ W`.
    pub a: usize,
    /// Row coordinate `b`, `0 ≤ b ≤ H`.
    pub b: usize,
    /// Count paths of color `≥ threshold` (0 and 1 both mean every path).
    pub threshold: Color,
}

impl HeightQuery {
    /// The colorblind height `H(a, b)` counting every path.
    pub fn all(a: usize, b: usize) -> Self {
        HeightQuery { a, b, threshold: 1 }
    }
}

/// What a sample should report besides the boundary, top and right exits.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct ReadoutSpec {
    /// Rows `y` (`0..=H`) whose horizontal line `y + ½` to keep: the colors on the vertical edges just
    /// above row `y`, one per column (`y = 0`: bottom boundary; `y = H`: top exits). Row `y` read as a
    /// particle configuration is the discrete-time exclusion process at time `y`.
    pub horizontal_lines: Vec<usize>,
    /// Columns `x` (`0..=W`) whose vertical line `x + ½` to keep: the colors on the horizontal edges
    /// just right of column `x`, one per row (`x = 0`: left boundary; `x = W`: right exits).
    pub vertical_lines: Vec<usize>,
    /// Points of the height function.
    pub heights: Vec<HeightQuery>,
    /// Keep every edge (a `W × H` array; for pictures and tests).
    pub configuration: bool,
}

/// The report of one sample plus the sweep's scratch space. Made by [`crate::Model::readout`], filled
/// by [`crate::Model::sample`].
#[derive(Debug, Clone)]
pub struct Readout {
    pub(crate) width: usize,
    pub(crate) height: usize,
    pub(crate) left: Vec<Color>,
    pub(crate) bottom: Vec<Color>,
    pub(crate) top: Vec<Color>,
    pub(crate) right: Vec<Color>,
    /// Sorted, distinct rows of the horizontal lines kept, and their colors.
    pub(crate) row_lines: Vec<usize>,
    pub(crate) row_values: Vec<Vec<Color>>,
    /// Sorted, distinct columns of the vertical lines kept, and their colors.
    pub(crate) column_lines: Vec<usize>,
    pub(crate) column_values: Vec<Vec<Color>>,
    /// Height queries in the order asked, their values, and the query indices sorted by `b`.
    pub(crate) heights: Vec<HeightQuery>,
    pub(crate) height_values: Vec<u64>,
    pub(crate) height_order: Vec<usize>,
    pub(crate) configuration: Option<Configuration>,
    // Scratch.
    pub(crate) vert: Vec<Color>,
    pub(crate) horiz: Vec<Color>,
    pub(crate) bytes: Vec<u8>,
    pub(crate) words: Vec<u32>,
    pub(crate) strip: StripScratch,
}

fn sorted_lines(
    lines: &[usize],
    max: usize,
    kind: &'static str,
) -> Result<Vec<usize>, SixVertexError> {
    let mut v = lines.to_vec();
    if let Some(&index) = v.iter().find(|&&k| k > max) {
        return Err(SixVertexError::LineOutOfRange { kind, index, max });
    }
    v.sort_unstable();
    v.dedup();
    Ok(v)
}

impl Readout {
    pub(crate) fn new(
        width: usize,
        height: usize,
        spec: ReadoutSpec,
    ) -> Result<Self, SixVertexError> {
        let row_lines = sorted_lines(&spec.horizontal_lines, height, "horizontal")?;
        let column_lines = sorted_lines(&spec.vertical_lines, width, "vertical")?;
        for q in &spec.heights {
            if q.a > width || q.b > height {
                return Err(SixVertexError::HeightPointOutOfRange {
                    a: q.a,
                    b: q.b,
                    width,
                    height,
                });
            }
        }
        let mut height_order: Vec<usize> = (0..spec.heights.len()).collect();
        height_order.sort_by_key(|&k| spec.heights[k].b);
        Ok(Readout {
            width,
            height,
            left: vec![0; height],
            bottom: vec![0; width],
            top: vec![0; width],
            right: vec![0; height],
            row_values: vec![vec![0; width]; row_lines.len()],
            row_lines,
            column_values: vec![vec![0; height]; column_lines.len()],
            column_lines,
            height_values: vec![0; spec.heights.len()],
            heights: spec.heights,
            height_order,
            configuration: spec
                .configuration
                .then(|| Configuration::new(width, height)),
            vert: vec![0; width],
            horiz: vec![0; width],
            bytes: vec![0; 4 * width],
            words: vec![0; width],
            strip: StripScratch::default(),
        })
    }

    /// The first row `≥ y` after which something must be recorded (a horizontal line or a height
    /// query), or `H` if none: a strip of rows may not run past it.
    pub(crate) fn next_stop(&self, y: usize) -> usize {
        let line = self.row_lines.partition_point(|&r| r < y);
        let line = self.row_lines.get(line).copied().unwrap_or(self.height);
        let q = self
            .height_order
            .partition_point(|&k| self.heights[k].b < y);
        let q = self
            .height_order
            .get(q)
            .map_or(self.height, |&k| self.heights[k].b);
        line.min(q).min(self.height)
    }

    /// Whether the sweep must record the horizontal edges of each row.
    pub(crate) fn needs_horizontal(&self) -> bool {
        !self.column_lines.is_empty() || self.configuration.is_some()
    }

    /// Number of columns `W`.
    pub fn width(&self) -> usize {
        self.width
    }

    /// Number of rows `H`.
    pub fn height(&self) -> usize {
        self.height
    }

    /// Colors that entered from the left, row 1 first (the boundary drawn for this sample).
    pub fn left(&self) -> &[Color] {
        &self.left
    }

    /// Colors that entered from below, column 1 first.
    pub fn bottom(&self) -> &[Color] {
        &self.bottom
    }

    /// Colors leaving through the top, column 1 first.
    pub fn top(&self) -> &[Color] {
        &self.top
    }

    /// Colors leaving through the right side, row 1 first.
    pub fn right(&self) -> &[Color] {
        &self.right
    }

    /// The exits as an [`Outcome`] (the key of the exact law).
    pub fn outcome(&self) -> Outcome {
        Outcome {
            top: self.top.clone(),
            right: self.right.clone(),
        }
    }

    /// The colors on the vertical edges just above row `y`, if that line was asked for.
    pub fn horizontal_line(&self, y: usize) -> Option<&[Color]> {
        self.row_lines
            .binary_search(&y)
            .ok()
            .map(|k| self.row_values[k].as_slice())
    }

    /// The colors on the horizontal edges just right of column `x`, row 1 first, if asked for.
    pub fn vertical_line(&self, x: usize) -> Option<&[Color]> {
        self.column_lines
            .binary_search(&x)
            .ok()
            .map(|k| self.column_values[k].as_slice())
    }

    /// The height queries, in the order asked.
    pub fn height_queries(&self) -> &[HeightQuery] {
        &self.heights
    }

    /// The heights, in the order of [`Readout::height_queries`].
    pub fn heights(&self) -> &[u64] {
        &self.height_values
    }

    /// The whole configuration, if asked for.
    pub fn configuration(&self) -> Option<&Configuration> {
        self.configuration.as_ref()
    }

    /// Fills the height queries with `b = y`, given the vertical colors above row `y` and the right
    /// exits of rows `1..=y` already in place.
    pub(crate) fn record_heights(&mut self, y: usize, next: &mut usize) {
        while *next < self.height_order.len() {
            let k = self.height_order[*next];
            let q = self.heights[k];
            if q.b != y {
                break;
            }
            let t = q.threshold.max(1);
            let above = self.vert[q.a..].iter().filter(|&&c| c >= t).count();
            let right = self.right[..y].iter().filter(|&&c| c >= t).count();
            self.height_values[k] = (above + right) as u64;
            *next += 1;
        }
    }

    /// Copies the vertical colors above row `y` into the kept horizontal line, if any.
    pub(crate) fn record_row_line(&mut self, y: usize) {
        if let Ok(k) = self.row_lines.binary_search(&y) {
            self.row_values[k].copy_from_slice(&self.vert);
        }
        if let Some(c) = self.configuration.as_mut() {
            c.vertical_row_mut(y).copy_from_slice(&self.vert);
        }
    }

    /// Copies the horizontal colors of row `y` (left boundary `carry_in`, then `horiz`).
    pub(crate) fn record_columns(&mut self, y: usize, carry_in: Color) {
        for (k, &x) in self.column_lines.iter().enumerate() {
            self.column_values[k][y - 1] = if x == 0 { carry_in } else { self.horiz[x - 1] };
        }
        if let Some(c) = self.configuration.as_mut() {
            let row = c.horizontal_row_mut(y);
            row[0] = carry_in;
            row[1..].copy_from_slice(&self.horiz);
        }
    }
}
