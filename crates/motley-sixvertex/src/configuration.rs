//! The whole configuration of one sample: the color on every edge, kept only when a read-out asks for
//! it (pictures, tests). Sampling otherwise keeps O(W) state.

use motley_colorblind::Color;

/// Every edge color of a `W × H` sample, boundary edges included.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Configuration {
    width: usize,
    height: usize,
    /// `(H + 1) × W`: entry `y·W + x − 1` is the vertical edge just above vertex `(x, y)`; `y = 0` is
    /// the bottom boundary.
    vertical: Vec<Color>,
    /// `H × (W + 1)`: entry `(y − 1)·(W + 1) + x` is the horizontal edge just right of vertex
    /// `(x, y)`; `x = 0` is the left boundary.
    horizontal: Vec<Color>,
}

impl Configuration {
    pub(crate) fn new(width: usize, height: usize) -> Self {
        Configuration {
            width,
            height,
            vertical: vec![0; (height + 1) * width],
            horizontal: vec![0; height * (width + 1)],
        }
    }

    pub(crate) fn vertical_row_mut(&mut self, y: usize) -> &mut [Color] {
        &mut self.vertical[y * self.width..(y + 1) * self.width]
    }

    pub(crate) fn horizontal_row_mut(&mut self, y: usize) -> &mut [Color] {
        let w = self.width + 1;
        &mut self.horizontal[(y - 1) * w..y * w]
    }

    /// Number of columns `W`.
    pub fn width(&self) -> usize {
        self.width
    }

    /// Number of rows `H`.
    pub fn height(&self) -> usize {
        self.height
    }

    /// The color on the vertical edge just above vertex `(x, y)`, `1 ≤ x ≤ W`, `0 ≤ y ≤ H`
    /// (`y = 0`: the edge entering column `x` from below).
    ///
    /// # Panics
    /// Outside those ranges.
    pub fn up(&self, x: usize, y: usize) -> Color {
        assert!((1..=self.width).contains(&x) && y <= self.height);
        self.vertical[y * self.width + x - 1]
    }

    /// The color on the horizontal edge just right of vertex `(x, y)`, `0 ≤ x ≤ W`, `1 ≤ y ≤ H`
    /// (`x = 0`: the edge entering row `y` from the left).
    ///
    /// # Panics
    /// Outside those ranges.
    pub fn right(&self, x: usize, y: usize) -> Color {
        assert!(x <= self.width && (1..=self.height).contains(&y));
        self.horizontal[(y - 1) * (self.width + 1) + x]
    }

    /// The vertical edges just above row `y` (`0 ≤ y ≤ H`), column 1 first.
    pub fn vertical_line(&self, y: usize) -> &[Color] {
        &self.vertical[y * self.width..(y + 1) * self.width]
    }
}
