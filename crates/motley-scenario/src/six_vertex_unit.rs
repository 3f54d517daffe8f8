//! The six-vertex model behind a sampling unit: building the engine from the validated spec and
//! reading every observable of the unit from one sample.

use motley_sixvertex::{Boundary, ColorRule, Model, Readout, ReadoutSpec, Side, SixVertexError};

use crate::family::{UnitSampler, Value, ValueBuffers};
use crate::scenario::{BoundarySpec, ModelSpec, ObservableSpec, SixVertexRead, SixVertexSpec};
use crate::six_vertex_family::{height_queries, read, read_of};

/// Engine side of a [`BoundarySpec`].
pub(crate) fn side(b: &BoundarySpec) -> Result<Side, String> {
    Ok(match b {
        BoundarySpec::Fixed(c) => Side::Explicit(c.clone()),
        BoundarySpec::Bernoulli { density, colors } => {
            let first = colors.first().copied().unwrap_or(1);
            let color = if colors.iter().all(|&c| c == first) {
                ColorRule::Fixed(first)
            } else if colors.iter().enumerate().all(|(k, &c)| c as usize == k + 1) {
                ColorRule::Index { offset: 0 }
            } else {
                return Err(
                    "a random rainbow boundary is only available with `strength: larger-wins`"
                        .into(),
                );
            };
            Side::Bernoulli {
                density: *density,
                color,
            }
        }
    })
}

/// The engine for `spec`.
pub(crate) fn build(spec: &SixVertexSpec) -> Result<Model, String> {
    let boundary = Boundary::new(
        spec.width,
        spec.height,
        side(&spec.left)?,
        side(&spec.bottom)?,
    )
    .map_err(|e: SixVertexError| e.to_string())?;
    Model::new(spec.b1.value, spec.b2.value, boundary).map_err(|e| e.to_string())
}

/// One six-vertex unit, ready to sample.
pub(crate) struct SixVertexUnit<'a> {
    model: Model,
    readout: Readout,
    spec: &'a ModelSpec,
    observables: Vec<&'a ObservableSpec>,
    /// For each observable, its index among the height queries (if it reads a height).
    height_slot: Vec<Option<usize>>,
    scratch: ValueBuffers,
}

impl<'a> SixVertexUnit<'a> {
    /// Builds the engine and a read-out covering `observables`.
    pub(crate) fn new(
        spec: &'a ModelSpec,
        sv: &SixVertexSpec,
        observables: Vec<&'a ObservableSpec>,
        picture: bool,
    ) -> Result<Self, String> {
        let model = build(sv)?;
        let mut rs = ReadoutSpec {
            configuration: picture,
            ..ReadoutSpec::default()
        };
        let (heights, height_slot) = height_queries(&observables);
        rs.heights = heights;
        for o in &observables {
            match *read_of(o) {
                SixVertexRead::Row(y, _) => rs.horizontal_lines.push(y),
                SixVertexRead::Column(x, _) => rs.vertical_lines.push(x),
                SixVertexRead::Height(..)
                | SixVertexRead::Top(_)
                | SixVertexRead::Right(_)
                | SixVertexRead::ExitColumn(_)
                | SixVertexRead::ExitPermutation(_)
                | SixVertexRead::ExitPlace(_) => {}
            }
        }
        let readout = model.readout(rs).map_err(|e| e.to_string())?;
        Ok(SixVertexUnit {
            model,
            readout,
            spec,
            observables,
            height_slot,
            scratch: ValueBuffers::default(),
        })
    }

    /// Draws sample `index` under `seed` (for the picture, which reads no observable).
    pub(crate) fn draw(&mut self, seed: u64, index: u64) {
        self.model.sample(seed, index, &mut self.readout);
    }

    /// The configuration of the last sample (when built with `picture`).
    pub(crate) fn readout(&self) -> &Readout {
        &self.readout
    }
}

impl UnitSampler for SixVertexUnit<'_> {
    fn sample(&mut self, seed: u64, index: u64, out: &mut dyn FnMut(usize, Value<'_>)) {
        self.draw(seed, index);
        for (k, o) in self.observables.iter().enumerate() {
            out(
                k,
                read(
                    self.spec,
                    o,
                    &self.readout,
                    self.height_slot[k],
                    &mut self.scratch,
                ),
            );
        }
    }
}
