//! Boundary data: the color entering each row from the left and each column from below.
//!
//! A [`Side`] is the raw description of one side (it mirrors what a scenario file says); a
//! [`Boundary`] is the checked, resolved pair of sides for a given rectangle. Each boundary edge is
//! either a fixed color or a random one (occupied with probability ρ, by a color given by a
//! [`ColorRule`]).
//!
//! # Reproducibility
//! Random boundary edges of sample `i` under seed `s` are decided on stream 0 of
//! [`motley_stream::sample_stream`]`(s, i, 0)`: the left edge of row `y` uses word `y − 1` and the
//! bottom edge of column `x` uses word `H + x − 1` (`H` = number of rows). The edge is occupied iff
//! [`Chance::happens`] on that word. Streams `1..=H` belong to the vertices (see the crate docs), so
//! the boundary and the bulk never share a word, and a fixed edge leaves its word unused.

use motley_colorblind::{Color, Projection};
use motley_stream::{sample_stream, Chance};
use rand_core::Rng;

use crate::SixVertexError;

/// How a random boundary edge is colored when it is occupied.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ColorRule {
    /// Every occupied edge carries this color.
    Fixed(Color),
    /// The occupied edge number `k` (row `y = k` on the left, column `x = k` at the bottom) carries
    /// color `k + offset`: the rainbow color of its row or column, shifted.
    Index {
        /// Added to the index.
        offset: Color,
    },
}

/// The raw description of one side of the rectangle. Edges are numbered from 1: row `y` on the left
/// side (bottom to top), column `x` on the bottom side (left to right).
#[derive(Debug, Clone, PartialEq)]
pub enum Side {
    /// No path enters.
    Empty,
    /// Edge `k` carries color `k` (on the left: row `y` gets color `y`).
    Rainbow,
    /// Every edge carries the same color (color 1 is the colorblind step boundary).
    Step(Color),
    /// Edge `k` carries `colors[k − 1]`; the list must have one color per edge.
    Explicit(Vec<Color>),
    /// Edges `1..=first_len` carry `first`, the rest carry `rest`.
    Blocks {
        /// Length of the first block.
        first_len: usize,
        /// Color of the first block.
        first: Color,
        /// Color of the other edges.
        rest: Color,
    },
    /// Each edge independently occupied with probability `density`, colored by `color`.
    Bernoulli {
        /// Probability that an edge is occupied.
        density: f64,
        /// Color of an occupied edge.
        color: ColorRule,
    },
}

/// One resolved boundary edge.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Edge {
    /// A fixed color (0: no path).
    Fixed(Color),
    /// Occupied with probability `density` by `color`, decided by `chance` on the edge's word.
    Random {
        /// The probability of occupation.
        density: f64,
        /// The same probability as a 32-bit threshold.
        chance: Chance,
        /// The color if occupied.
        color: Color,
    },
}

impl Edge {
    /// The color of this edge on the word `u`.
    #[inline]
    pub fn draw(&self, u: u32) -> Color {
        match *self {
            Edge::Fixed(c) => c,
            Edge::Random { chance, color, .. } => {
                if chance.happens(u) {
                    color
                } else {
                    0
                }
            }
        }
    }

    /// The largest color this edge can carry.
    pub fn max_color(&self) -> Color {
        match *self {
            Edge::Fixed(c) | Edge::Random { color: c, .. } => c,
        }
    }

    fn project(&self, p: &Projection) -> Result<Edge, SixVertexError> {
        Ok(match *self {
            Edge::Fixed(c) => Edge::Fixed(p.apply(c)?),
            Edge::Random {
                density,
                chance,
                color,
            } => Edge::Random {
                density,
                chance,
                color: p.apply(color)?,
            },
        })
    }
}

/// The checked boundary of a `width × height` rectangle.
#[derive(Debug, Clone, PartialEq)]
pub struct Boundary {
    width: usize,
    height: usize,
    left: Vec<Edge>,
    bottom: Vec<Edge>,
    random: bool,
}

fn resolve(
    side: &Side,
    len: usize,
    name: &'static str,
    unit: &'static str,
) -> Result<Vec<Edge>, SixVertexError> {
    Ok(match side {
        Side::Empty => vec![Edge::Fixed(0); len],
        Side::Rainbow => (1..=len).map(|k| Edge::Fixed(k as Color)).collect(),
        Side::Step(c) => vec![Edge::Fixed(*c); len],
        Side::Explicit(colors) => {
            if colors.len() != len {
                return Err(SixVertexError::SideLength {
                    side: name,
                    unit,
                    expected: len,
                    got: colors.len(),
                });
            }
            colors.iter().map(|&c| Edge::Fixed(c)).collect()
        }
        Side::Blocks {
            first_len,
            first,
            rest,
        } => {
            if *first_len > len {
                return Err(SixVertexError::BlockTooLong {
                    side: name,
                    first_len: *first_len,
                    len,
                });
            }
            (1..=len)
                .map(|k| Edge::Fixed(if k <= *first_len { *first } else { *rest }))
                .collect()
        }
        Side::Bernoulli { density, color } => {
            let chance = Chance::new(*density).map_err(|_| SixVertexError::DensityOutOfRange {
                side: name,
                value: *density,
            })?;
            (1..=len)
                .map(|k| Edge::Random {
                    density: *density,
                    chance,
                    color: match *color {
                        ColorRule::Fixed(c) => c,
                        ColorRule::Index { offset } => k as Color + offset,
                    },
                })
                .collect()
        }
    })
}

impl Boundary {
    /// The boundary of a rectangle of `width` columns and `height` rows.
    ///
    /// # Errors
    /// [`SixVertexError::EmptyRectangle`] if a dimension is 0; [`SixVertexError::SideLength`] for an
    /// explicit list of the wrong length; [`SixVertexError::BlockTooLong`] for a first block longer
    /// than its side; [`SixVertexError::DensityOutOfRange`] for a Bernoulli density outside [0, 1].
    pub fn new(
        width: usize,
        height: usize,
        left: Side,
        bottom: Side,
    ) -> Result<Self, SixVertexError> {
        if width == 0 || height == 0 {
            return Err(SixVertexError::EmptyRectangle { width, height });
        }
        let left = resolve(&left, height, "left", "row")?;
        let bottom = resolve(&bottom, width, "bottom", "column")?;
        let random = left
            .iter()
            .chain(&bottom)
            .any(|e| matches!(e, Edge::Random { .. }));
        Ok(Boundary {
            width,
            height,
            left,
            bottom,
            random,
        })
    }

    /// Rainbow from the left (row `y` gets color `y`), empty bottom.
    ///
    /// # Errors
    /// As [`Boundary::new`].
    pub fn rainbow(width: usize, height: usize) -> Result<Self, SixVertexError> {
        Self::new(width, height, Side::Rainbow, Side::Empty)
    }

    /// The colorblind step boundary: a path (color 1) enters every row from the left, none from below.
    ///
    /// # Errors
    /// As [`Boundary::new`].
    pub fn step(width: usize, height: usize) -> Result<Self, SixVertexError> {
        Self::new(width, height, Side::Step(1), Side::Empty)
    }

    /// Number of columns `W`.
    pub fn width(&self) -> usize {
        self.width
    }

    /// Number of rows `H`.
    pub fn height(&self) -> usize {
        self.height
    }

    /// The left edges, row 1 first.
    pub fn left(&self) -> &[Edge] {
        &self.left
    }

    /// The bottom edges, column 1 first.
    pub fn bottom(&self) -> &[Edge] {
        &self.bottom
    }

    /// Whether any edge is random.
    pub fn is_random(&self) -> bool {
        self.random
    }

    /// The largest color any boundary edge can carry (so no edge of the rectangle carries more).
    pub fn max_color(&self) -> Color {
        self.left
            .iter()
            .chain(&self.bottom)
            .map(Edge::max_color)
            .max()
            .unwrap_or(0)
    }

    /// The same boundary with every color passed through `projection` (a random edge keeps its
    /// density and its word, so projected draws are the projections of the colored draws).
    ///
    /// # Errors
    /// [`SixVertexError::Projection`] if a merge table does not cover a boundary color.
    pub fn project(&self, projection: &Projection) -> Result<Self, SixVertexError> {
        let map = |edges: &[Edge]| -> Result<Vec<Edge>, SixVertexError> {
            edges.iter().map(|e| e.project(projection)).collect()
        };
        Ok(Boundary {
            width: self.width,
            height: self.height,
            left: map(&self.left)?,
            bottom: map(&self.bottom)?,
            random: self.random,
        })
    }

    /// Draws the boundary colors of sample `index` under `seed` into `left` (length `H`) and `bottom`
    /// (length `W`), using the words described in the module docs.
    ///
    /// # Panics
    /// If the slices do not have lengths `H` and `W`.
    pub fn draw(&self, seed: u64, index: u64, left: &mut [Color], bottom: &mut [Color]) {
        assert_eq!(left.len(), self.height, "left buffer length");
        assert_eq!(bottom.len(), self.width, "bottom buffer length");
        if !self.random {
            for (out, e) in left.iter_mut().zip(&self.left) {
                *out = e.draw(0);
            }
            for (out, e) in bottom.iter_mut().zip(&self.bottom) {
                *out = e.draw(0);
            }
            return;
        }
        let mut rng = sample_stream(seed, index, 0);
        for (out, e) in left.iter_mut().zip(&self.left) {
            *out = e.draw(rng.next_u32());
        }
        for (out, e) in bottom.iter_mut().zip(&self.bottom) {
            *out = e.draw(rng.next_u32());
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn kinds_resolve() {
        let b = Boundary::new(
            3,
            4,
            Side::Blocks {
                first_len: 2,
                first: 5,
                rest: 1,
            },
            Side::Explicit(vec![0, 7, 0]),
        )
        .unwrap();
        let mut l = vec![0; 4];
        let mut d = vec![0; 3];
        b.draw(0, 0, &mut l, &mut d);
        assert_eq!(l, vec![5, 5, 1, 1]);
        assert_eq!(d, vec![0, 7, 0]);
        assert_eq!(b.max_color(), 7);
        let r = Boundary::rainbow(2, 3).unwrap();
        let mut l = vec![0; 3];
        let mut d = vec![0; 2];
        r.draw(0, 0, &mut l, &mut d);
        assert_eq!((l, d), (vec![1, 2, 3], vec![0, 0]));
    }

    #[test]
    fn errors() {
        assert_eq!(
            Boundary::new(2, 2, Side::Explicit(vec![1]), Side::Empty).unwrap_err(),
            SixVertexError::SideLength {
                side: "left",
                unit: "row",
                expected: 2,
                got: 1
            }
        );
        assert!(matches!(
            Boundary::new(
                2,
                2,
                Side::Empty,
                Side::Blocks {
                    first_len: 3,
                    first: 1,
                    rest: 0
                }
            ),
            Err(SixVertexError::BlockTooLong { side: "bottom", .. })
        ));
        assert!(matches!(
            Boundary::new(
                2,
                2,
                Side::Bernoulli {
                    density: 1.5,
                    color: ColorRule::Fixed(1)
                },
                Side::Empty
            ),
            Err(SixVertexError::DensityOutOfRange { side: "left", .. })
        ));
        assert!(Boundary::new(0, 2, Side::Empty, Side::Empty).is_err());
    }

    /// The documented layout: left row y is word y − 1, bottom column x is word H + x − 1 of stream 0.
    #[test]
    fn random_layout() {
        let b = Boundary::new(
            3,
            2,
            Side::Bernoulli {
                density: 0.5,
                color: ColorRule::Index { offset: 0 },
            },
            Side::Bernoulli {
                density: 0.5,
                color: ColorRule::Index { offset: 10 },
            },
        )
        .unwrap();
        let half = Chance::new(0.5).unwrap();
        for index in 0..20 {
            let mut l = vec![0; 2];
            let mut d = vec![0; 3];
            b.draw(9, index, &mut l, &mut d);
            for y in 1..=2 {
                let mut r = sample_stream(9, index, 0);
                r.set_word_pos(y as u128 - 1);
                let want = if half.happens(r.next_u32()) {
                    y as Color
                } else {
                    0
                };
                assert_eq!(l[y - 1], want);
            }
            for x in 1..=3 {
                let mut r = sample_stream(9, index, 0);
                r.set_word_pos((2 + x - 1) as u128);
                let want = if half.happens(r.next_u32()) {
                    10 + x as Color
                } else {
                    0
                };
                assert_eq!(d[x - 1], want);
            }
        }
    }
}
