//! The model (weights + boundary) and its seeded row-by-row sampler.
//!
//! # Reproducibility
//! The vertex `(x, y)` of sample `i` under seed `s` decides on exactly one 32-bit word: word `x − 1`
//! of [`motley_stream::sample_stream`]`(s, i, y)`. Each row's `W` words are generated in bulk from
//! its own stream, so the word of a vertex does not depend on the order in which vertices are
//! processed; a kernel that processes several rows at once reads the same words.

use motley_colorblind::Projection;
use motley_stream::sample_stream;
use rand_core::Rng;

use crate::strip::{fits, sweep_rows, Kernel, StripRun};
use crate::strip_avx2;
use crate::sweep::{sweep_row_with, Cuts};
use crate::{Boundary, Readout, ReadoutSpec, SixVertexError, VertexRule, VertexWeights};

/// The colored stochastic six-vertex model on a rectangle: weights `b1`, `b2` and a boundary.
#[derive(Debug, Clone, PartialEq)]
pub struct Model {
    weights: VertexWeights,
    boundary: Boundary,
    rule: VertexRule,
    kernel: Kernel,
}

impl Model {
    /// The model with weights `b1`, `b2` on `boundary`'s rectangle.
    ///
    /// # Errors
    /// [`SixVertexError::WeightOutOfRange`] if `b1` or `b2` is NaN or outside [0, 1].
    pub fn new(b1: f64, b2: f64, boundary: Boundary) -> Result<Self, SixVertexError> {
        Ok(Model {
            weights: VertexWeights::new(b1, b2)?,
            boundary,
            rule: VertexRule::Standard,
            kernel: Kernel::Auto,
        })
    }

    /// The same model sampled with another local rule (test-only: the non-standard rules are wrong
    /// on purpose).
    #[doc(hidden)]
    pub fn with_rule(mut self, rule: VertexRule) -> Self {
        self.rule = rule;
        self
    }

    /// The same model sampled with another kernel (for tests and benchmarks: every kernel gives
    /// bit-identical samples).
    #[doc(hidden)]
    pub fn with_kernel(mut self, kernel: Kernel) -> Self {
        self.kernel = kernel;
        self
    }

    /// The weights.
    pub fn weights(&self) -> &VertexWeights {
        &self.weights
    }

    /// The boundary.
    pub fn boundary(&self) -> &Boundary {
        &self.boundary
    }

    /// Number of columns `W`.
    pub fn width(&self) -> usize {
        self.boundary.width()
    }

    /// Number of rows `H`.
    pub fn height(&self) -> usize {
        self.boundary.height()
    }

    /// The model on the projected boundary data: the colorblind (or coarser colored) model. Sampled
    /// on the same seed and index, it gives exactly the projection of the colored sample, edge for
    /// edge (the basic coupling; see the crate docs).
    ///
    /// # Errors
    /// [`SixVertexError::Projection`] if a merge table does not cover a boundary color.
    pub fn project(&self, projection: &Projection) -> Result<Self, SixVertexError> {
        Ok(Model {
            weights: self.weights,
            boundary: self.boundary.project(projection)?,
            rule: self.rule,
            kernel: self.kernel,
        })
    }

    /// A read-out for this model's rectangle.
    ///
    /// # Errors
    /// [`SixVertexError::LineOutOfRange`] or [`SixVertexError::HeightPointOutOfRange`] if the spec
    /// asks for something outside the rectangle.
    pub fn readout(&self, spec: ReadoutSpec) -> Result<Readout, SixVertexError> {
        Readout::new(self.width(), self.height(), spec)
    }

    /// Draws sample `index` under `seed` into `out`.
    ///
    /// # Panics
    /// If `out` was made for a rectangle of another size.
    pub fn sample(&self, seed: u64, index: u64, out: &mut Readout) {
        let (w, h) = (self.width(), self.height());
        assert!(
            out.width == w && out.height == h,
            "read-out made for a {}×{} rectangle used on a {w}×{h} model",
            out.width,
            out.height
        );
        let cuts = Cuts {
            below: self.weights.cut_below(),
            left: self.weights.cut_left(),
        };
        self.boundary
            .draw(seed, index, &mut out.left, &mut out.bottom);
        out.vert.copy_from_slice(&out.bottom);
        let mut next_height = 0;
        out.record_row_line(0);
        out.record_heights(0, &mut next_height);
        let strips = self.kernel != Kernel::Reference
            && self.rule != VertexRule::OccupancyOnly
            && !out.needs_horizontal();
        if !strips {
            for y in 1..=h {
                self.sweep_reference_row(seed, index, y, cuts, out);
                out.record_row_line(y);
                out.record_heights(y, &mut next_height);
            }
            out.top.copy_from_slice(&out.vert);
            return;
        }
        // The strip kernel applies the standard rule; the swapped rule is the standard one with
        // the cuts exchanged, exactly as in `sweep_row_with`.
        let strip_cuts = match self.rule {
            VertexRule::SwappedWeights => Cuts {
                below: cuts.left,
                left: cuts.below,
            },
            _ => cuts,
        };
        let max = self.boundary.max_color();
        let mut scratch = std::mem::take(&mut out.strip);
        let mut y = 1;
        while y <= h {
            let stop = out.next_stop(y);
            if self.kernel == Kernel::Auto && stop - y + 1 < MIN_STRIP_ROWS {
                // Too few rows before the next record for a strip to pay.
                for row in y..=stop {
                    self.sweep_reference_row(seed, index, row, cuts, out);
                }
            } else {
                let mut run = StripRun {
                    seed,
                    index,
                    cuts: strip_cuts,
                    simd: self.kernel != Kernel::Portable,
                    left: &out.left,
                    right: &mut out.right,
                };
                let vert = &mut out.vert;
                let simd = self.kernel != Kernel::Portable;
                if simd
                    && fits::<u16>(max)
                    && strip_avx2::try_sweep_rows(&mut run, &mut scratch, vert, y, stop)
                {
                    // Done by the AVX2 kernel (16 rows of u16 colors per strip).
                } else if fits::<u8>(max) {
                    sweep_rows::<u8, 32>(&mut run, &mut scratch, vert, y, stop);
                } else if fits::<u16>(max) {
                    sweep_rows::<u16, 16>(&mut run, &mut scratch, vert, y, stop);
                } else {
                    sweep_rows::<u32, 8>(&mut run, &mut scratch, vert, y, stop);
                }
            }
            out.record_row_line(stop);
            out.record_heights(stop, &mut next_height);
            y = stop + 1;
        }
        out.strip = scratch;
        out.top.copy_from_slice(&out.vert);
    }

    /// Row `y` by the reference kernel (the read-out's own scratch holds the words).
    fn sweep_reference_row(&self, seed: u64, index: u64, y: usize, cuts: Cuts, out: &mut Readout) {
        fill_words(seed, index, y as u64, &mut out.bytes, &mut out.words);
        let carry_in = out.left[y - 1];
        let record = out.needs_horizontal();
        let horiz = if record {
            Some(out.horiz.as_mut_slice())
        } else {
            None
        };
        let carry = sweep_row_with(self.rule, &mut out.vert, &out.words, carry_in, cuts, horiz);
        out.right[y - 1] = carry;
        if record {
            out.record_columns(y, carry_in);
        }
    }

    /// The colors leaving through the top and the right side of sample `index` (a convenience that
    /// allocates a read-out).
    pub fn sample_exits(&self, seed: u64, index: u64) -> crate::Outcome {
        let mut r = Readout::new(self.width(), self.height(), ReadoutSpec::default())
            .expect("the empty spec always fits");
        self.sample(seed, index, &mut r);
        r.outcome()
    }
}

/// Below this many rows between two records the row kernel is used (a strip's start-up and
/// drain cost `L − 1` steps whatever its height).
const MIN_STRIP_ROWS: usize = 4;

/// Fills `words` with words `0..W` of stream `stream`, in bulk.
#[inline]
pub(crate) fn fill_words(seed: u64, index: u64, stream: u64, bytes: &mut [u8], words: &mut [u32]) {
    let mut rng = sample_stream(seed, index, stream);
    rng.fill_bytes(bytes);
    for (w, b) in words.iter_mut().zip(bytes.chunks_exact(4)) {
        *w = u32::from_le_bytes([b[0], b[1], b[2], b[3]]);
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::Side;
    use motley_colorblind::Color;

    /// Bulk generation gives the same words as drawing them one by one: word x − 1 of stream y.
    #[test]
    fn bulk_words_are_the_stream_words() {
        let mut bytes = vec![0u8; 4 * 37];
        let mut words = vec![0u32; 37];
        fill_words(5, 6, 7, &mut bytes, &mut words);
        let mut r = sample_stream(5, 6, 7);
        let seq: Vec<u32> = (0..37).map(|_| r.next_u32()).collect();
        assert_eq!(words, seq);
    }

    #[test]
    fn readout_lines_and_configuration_agree() {
        let b = Boundary::new(5, 4, Side::Rainbow, Side::Explicit(vec![0, 9, 0, 7, 0])).unwrap();
        let m = Model::new(0.4, 0.7, b).unwrap();
        let spec = ReadoutSpec {
            horizontal_lines: vec![0, 2, 4],
            vertical_lines: vec![0, 3, 5],
            heights: vec![],
            configuration: true,
        };
        let mut r = m.readout(spec).unwrap();
        m.sample(1, 2, &mut r);
        let c = r.configuration().unwrap().clone();
        for y in [0, 2, 4] {
            assert_eq!(r.horizontal_line(y).unwrap(), c.vertical_line(y));
        }
        for x in [0, 3, 5] {
            let col: Vec<Color> = (1..=4).map(|y| c.right(x, y)).collect();
            assert_eq!(r.vertical_line(x).unwrap(), col.as_slice());
        }
        assert_eq!(r.top(), c.vertical_line(4));
        assert_eq!(
            r.right(),
            (1..=4).map(|y| c.right(5, y)).collect::<Vec<_>>()
        );
        assert!(r.horizontal_line(1).is_none());
        // Same sample without the configuration: same exits.
        let mut plain = m.readout(ReadoutSpec::default()).unwrap();
        m.sample(1, 2, &mut plain);
        assert_eq!(plain.outcome(), r.outcome());
    }
}
