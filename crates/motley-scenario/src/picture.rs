//! One sample configuration of a six-vertex model on a W × H grid, for the report's picture: the
//! color on every edge, taken from the scenario's first small enough six-vertex model.
//!
//! # Convention
//! Vertex `(x, y)` has column `x` in `0..width` and row `y` in `0..height`, rows counted from the bottom.
//! Per-vertex arrays are row-major: index `y * width + x`. Color 0 means "no path"; path colors are
//! `1..=max_color`. Paths enter through the left boundary (`left[y]`, entering vertex `(0, y)`) and the
//! bottom boundary (`bottom[x]`, entering vertex `(x, 0)`) and move right or up. At every vertex the two
//! incoming colors leave again as the two outgoing ones (possibly swapped): [`Picture::validate`] checks
//! this, which catches a transposed or mis-indexed picture before it is drawn.

use crate::scenario::{ModelKind, Scenario};
use crate::six_vertex_unit::SixVertexUnit;
use crate::unit::unit_seed;

/// Largest side drawn; larger rectangles are not pictured.
pub const PICTURE_MAX_SIDE: usize = 2000;

/// A sample configuration: the color on every edge of the grid.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Picture {
    /// Columns W.
    pub width: usize,
    /// Rows H.
    pub height: usize,
    /// Largest path color; colors run over `1..=max_color`.
    pub max_color: u32,
    /// Length H: color entering vertex `(0, y)` from the left boundary.
    pub left: Vec<u32>,
    /// Length W: color entering vertex `(x, 0)` from the bottom boundary.
    pub bottom: Vec<u32>,
    /// Length H·W, row-major (`y * width + x`): color on the horizontal edge leaving `(x, y)` to the right.
    pub right_out: Vec<u32>,
    /// Length H·W, row-major: color on the vertical edge leaving `(x, y)` upward.
    pub up_out: Vec<u32>,
}

/// Why a [`Picture`] is inconsistent.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum PictureError {
    /// The grid has no vertex.
    #[error("grid must have at least one vertex, got {width} × {height}")]
    Empty {
        /// Columns.
        width: usize,
        /// Rows.
        height: usize,
    },
    /// The number of vertices overflows.
    #[error("grid {width} × {height} is too large")]
    TooLarge {
        /// Columns.
        width: usize,
        /// Rows.
        height: usize,
    },
    /// An array has the wrong length.
    #[error("`{array}` must have length {want}, got {got}")]
    Length {
        /// The array's field name.
        array: &'static str,
        /// The length it must have.
        want: usize,
        /// The length it has.
        got: usize,
    },
    /// A color above `max_color`.
    #[error("`{array}[{index}]` is color {color}, above max_color {max_color}")]
    Color {
        /// The array's field name.
        array: &'static str,
        /// The offending index.
        index: usize,
        /// The color found there.
        color: u32,
        /// The picture's largest color.
        max_color: u32,
    },
    /// A vertex that does not pass on the colors it receives.
    #[error(
        "vertex ({x}, {y}) receives colors {{{}, {}}} but passes on {{{}, {}}}",
        incoming.0, incoming.1, outgoing.0, outgoing.1
    )]
    NotConserved {
        /// Column.
        x: usize,
        /// Row.
        y: usize,
        /// The incoming colors, smaller first.
        incoming: (u32, u32),
        /// The outgoing colors, smaller first.
        outgoing: (u32, u32),
    },
}

impl Picture {
    /// Color entering vertex `(x, y)` from the left.
    pub fn in_left(&self, x: usize, y: usize) -> u32 {
        if x == 0 {
            self.left[y]
        } else {
            self.right_out[y * self.width + x - 1]
        }
    }

    /// Color entering vertex `(x, y)` from below.
    pub fn in_bottom(&self, x: usize, y: usize) -> u32 {
        if y == 0 {
            self.bottom[x]
        } else {
            self.up_out[(y - 1) * self.width + x]
        }
    }

    /// Checks sizes, the color range and that each vertex passes on the colors it receives.
    ///
    /// # Errors
    /// [`PictureError`] naming the first offending array, index or vertex.
    pub fn validate(&self) -> Result<(), PictureError> {
        let (width, height) = (self.width, self.height);
        if width == 0 || height == 0 {
            return Err(PictureError::Empty { width, height });
        }
        let cells = width
            .checked_mul(height)
            .ok_or(PictureError::TooLarge { width, height })?;
        for (array, got, want) in [
            ("left", self.left.len(), height),
            ("bottom", self.bottom.len(), width),
            ("right_out", self.right_out.len(), cells),
            ("up_out", self.up_out.len(), cells),
        ] {
            if got != want {
                return Err(PictureError::Length { array, want, got });
            }
        }
        for (array, v) in [
            ("left", &self.left),
            ("bottom", &self.bottom),
            ("right_out", &self.right_out),
            ("up_out", &self.up_out),
        ] {
            if let Some((index, &color)) = v.iter().enumerate().find(|(_, &c)| c > self.max_color) {
                return Err(PictureError::Color {
                    array,
                    index,
                    color,
                    max_color: self.max_color,
                });
            }
        }
        for y in 0..height {
            for x in 0..width {
                let i = y * width + x;
                let incoming = sorted(self.in_left(x, y), self.in_bottom(x, y));
                let outgoing = sorted(self.right_out[i], self.up_out[i]);
                if incoming != outgoing {
                    return Err(PictureError::NotConserved {
                        x,
                        y,
                        incoming,
                        outgoing,
                    });
                }
            }
        }
        Ok(())
    }
}

/// The pair in increasing order.
fn sorted(a: u32, b: u32) -> (u32, u32) {
    if a <= b {
        (a, b)
    } else {
        (b, a)
    }
}

/// Sample 0 of replica 0 of the first six-vertex model of `s` that is small enough to draw, with the
/// model's name.
pub fn sample_picture(s: &Scenario) -> Option<(&str, Picture)> {
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
    let picture = Picture {
        width: w,
        height: h,
        max_color: m.max_color,
        left: r.left().to_vec(),
        bottom: r.bottom().to_vec(),
        right_out,
        up_out,
    };
    Some((m.name.as_str(), picture))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A 2 × 1 grid: color 1 enters from the left, color 2 from below column 0; they swap at
    /// vertex (0, 0), so color 2 runs on right and turns up at vertex (1, 0).
    fn swap() -> Picture {
        Picture {
            width: 2,
            height: 1,
            max_color: 2,
            left: vec![1],
            bottom: vec![2, 0],
            right_out: vec![2, 0],
            up_out: vec![1, 2],
        }
    }

    #[test]
    fn hand_routed_picture_is_valid() {
        swap().validate().unwrap();
        assert_eq!(swap().in_left(1, 0), 2);
        assert_eq!(swap().in_bottom(1, 0), 0);
        assert_eq!(swap().in_bottom(0, 0), 2);
    }

    #[test]
    fn lost_color_is_caught_at_its_vertex() {
        let mut p = swap();
        p.up_out[1] = 0; // vertex (1, 0) drops color 2
        let e = p.validate().unwrap_err();
        assert_eq!(
            e,
            PictureError::NotConserved {
                x: 1,
                y: 0,
                incoming: (0, 2),
                outgoing: (0, 0)
            }
        );
        assert_eq!(
            e.to_string(),
            "vertex (1, 0) receives colors {0, 2} but passes on {0, 0}"
        );
    }

    #[test]
    fn transposed_arrays_are_rejected() {
        let mut p = swap();
        std::mem::swap(&mut p.width, &mut p.height);
        let e = p.validate().unwrap_err().to_string();
        assert_eq!(e, "`left` must have length 2, got 1");
    }

    #[test]
    fn colors_above_the_maximum_are_rejected() {
        let mut p = swap();
        p.max_color = 1;
        let e = p.validate().unwrap_err().to_string();
        assert_eq!(e, "`bottom[0]` is color 2, above max_color 1");
    }

    #[test]
    fn empty_grid_is_rejected() {
        let p = Picture {
            width: 0,
            height: 0,
            max_color: 0,
            left: vec![],
            bottom: vec![],
            right_out: vec![],
            up_out: vec![],
        };
        assert!(matches!(p.validate(), Err(PictureError::Empty { .. })));
    }

    #[test]
    fn sampled_picture_passes_on_every_color() {
        let s = crate::fixtures::tiny();
        let (model, p) = sample_picture(&s).unwrap();
        assert_eq!(model, "rect");
        assert_eq!((p.width, p.height), (5, 4));
        p.validate().unwrap();
        // Every color entering on the left leaves through the top or the right boundary.
        let mut entering: Vec<u32> = p
            .left
            .iter()
            .chain(&p.bottom)
            .copied()
            .filter(|&c| c > 0)
            .collect();
        let mut leaving: Vec<u32> = (0..p.height)
            .map(|y| p.right_out[y * p.width + p.width - 1])
            .chain((0..p.width).map(|x| p.up_out[(p.height - 1) * p.width + x]))
            .filter(|&c| c > 0)
            .collect();
        entering.sort_unstable();
        leaving.sort_unstable();
        assert_eq!(entering, leaving);
        assert_eq!(entering, (1..=4).collect::<Vec<u32>>());
    }
}
