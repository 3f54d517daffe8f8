//! One sample configuration of the colored six-vertex model on a W × H grid, as the report draws it.
//!
//! # Convention
//! Vertex `(x, y)` has column `x` in `0..width` and row `y` in `0..height`, rows counted from the bottom.
//! Per-vertex arrays are row-major: index `y * width + x`. Color 0 means "no path"; path colors are
//! `1..=max_color`. Paths enter through the left boundary (`left[y]`, entering vertex `(0, y)`) and the
//! bottom boundary (`bottom[x]`, entering vertex `(x, 0)`) and move right or up. At every vertex the two
//! incoming colors leave again as the two outgoing ones (possibly swapped): [`Picture::validate`] checks
//! this, which catches a transposed or mis-indexed picture before it is drawn.

use crate::error::ReportError;

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
    /// [`ReportError::BadPicture`] naming the first offending array, index or vertex.
    pub fn validate(&self) -> Result<(), ReportError> {
        let bad = |reason: String| Err(ReportError::BadPicture { reason });
        if self.width == 0 || self.height == 0 {
            return bad(format!(
                "grid must have at least one vertex, got {} × {}",
                self.width, self.height
            ));
        }
        let cells = match self.width.checked_mul(self.height) {
            Some(c) => c,
            None => {
                return bad(format!(
                    "grid {} × {} is too large",
                    self.width, self.height
                ))
            }
        };
        for (name, len, want) in [
            ("left", self.left.len(), self.height),
            ("bottom", self.bottom.len(), self.width),
            ("right_out", self.right_out.len(), cells),
            ("up_out", self.up_out.len(), cells),
        ] {
            if len != want {
                return bad(format!("`{name}` must have length {want}, got {len}"));
            }
        }
        for (name, v) in [
            ("left", &self.left),
            ("bottom", &self.bottom),
            ("right_out", &self.right_out),
            ("up_out", &self.up_out),
        ] {
            if let Some((i, c)) = v.iter().enumerate().find(|(_, &c)| c > self.max_color) {
                return bad(format!(
                    "`{name}[{i}]` is color {c}, above max_color {}",
                    self.max_color
                ));
            }
        }
        for y in 0..self.height {
            for x in 0..self.width {
                let i = y * self.width + x;
                let incoming = sorted(self.in_left(x, y), self.in_bottom(x, y));
                let outgoing = sorted(self.right_out[i], self.up_out[i]);
                if incoming != outgoing {
                    return bad(format!(
                        "vertex ({x}, {y}) receives colors {{{}, {}}} but passes on {{{}, {}}}",
                        incoming.0, incoming.1, outgoing.0, outgoing.1
                    ));
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

#[cfg(test)]
pub(crate) mod tests {
    use super::*;

    /// A 3 × 2 grid with colors entering left (rows 0, 1 → colors 1, 2) and bottom (columns → 3, 0, 4),
    /// routed by hand: every vertex passes on what it receives.
    pub(crate) fn small() -> Picture {
        // Row 0: (0,0) gets left 1, bottom 3 -> right 1, up 3.
        //        (1,0) gets left 1, bottom 0 -> right 0, up 1.
        //        (2,0) gets left 0, bottom 4 -> right 4, up 0.
        // Row 1: (0,1) gets left 2, below 3 -> right 3, up 2.
        //        (1,1) gets left 3, below 1 -> right 1, up 3.
        //        (2,1) gets left 1, below 0 -> right 0, up 1.
        Picture {
            width: 3,
            height: 2,
            max_color: 4,
            left: vec![1, 2],
            bottom: vec![3, 0, 4],
            right_out: vec![1, 0, 4, 3, 1, 0],
            up_out: vec![3, 1, 0, 2, 3, 1],
        }
    }

    #[test]
    fn hand_routed_picture_is_valid() {
        small().validate().unwrap();
        assert_eq!(small().in_left(1, 1), 3);
        assert_eq!(small().in_bottom(1, 1), 1);
    }

    #[test]
    fn lost_color_is_caught_at_its_vertex() {
        let mut p = small();
        p.up_out[4] = 0; // vertex (1, 1) drops color 3
        let e = p.validate().unwrap_err().to_string();
        assert!(e.contains("vertex (1, 1)"), "{e}");
    }

    #[test]
    fn transposed_arrays_are_rejected() {
        let mut p = small();
        std::mem::swap(&mut p.width, &mut p.height);
        let e = p.validate().unwrap_err().to_string();
        assert!(e.contains("`left` must have length 3, got 2"), "{e}");
    }

    #[test]
    fn colors_above_the_maximum_are_rejected() {
        let mut p = small();
        p.max_color = 3;
        let e = p.validate().unwrap_err().to_string();
        assert!(
            e.contains("`bottom[2]` is color 4, above max_color 3"),
            "{e}"
        );
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
        assert!(p.validate().is_err());
    }
}
