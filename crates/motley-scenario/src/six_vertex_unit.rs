//! The six-vertex model behind a sampling unit: building the engine from the validated spec and
//! reading every observable of the unit from one sample.

use motley_colorblind::Color;
use motley_sixvertex::{
    Boundary, ColorRule, HeightQuery, Model, Readout, ReadoutSpec, Side, SixVertexError,
};

use crate::accumulate::Accumulator;
use crate::read_set::set_elements;
use crate::scenario::{BoundarySpec, ModelSpec, ObservableSpec, ReadSpec, SixVertexSpec};

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
    scratch: Vec<usize>,
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
        let mut height_slot = Vec::new();
        for o in &observables {
            let mut slot = None;
            match o.read {
                ReadSpec::Row(y, _) => rs.horizontal_lines.push(y),
                ReadSpec::Column(x, _) => rs.vertical_lines.push(x),
                ReadSpec::Height6v(a, b) => {
                    slot = Some(rs.heights.len());
                    rs.heights.push(HeightQuery {
                        a,
                        b,
                        threshold: o.threshold.unwrap_or(1).max(1),
                    });
                }
                _ => {}
            }
            height_slot.push(slot);
        }
        let readout = model.readout(rs).map_err(|e| e.to_string())?;
        Ok(SixVertexUnit {
            model,
            readout,
            spec,
            observables,
            height_slot,
            scratch: Vec::new(),
        })
    }

    /// Draws sample `index` under `seed` and feeds `accs` (one per observable, same order).
    pub(crate) fn sample(&mut self, seed: u64, index: u64, accs: &mut [Accumulator]) {
        self.model.sample(seed, index, &mut self.readout);
        for (k, o) in self.observables.iter().enumerate() {
            let acc = &mut accs[k];
            let universe = match o.kind {
                crate::scenario::ValueKind::Set { universe } => universe,
                _ => 0,
            };
            let mut set = |colors: &[Color], how, scratch: &mut Vec<usize>| {
                set_elements(
                    colors,
                    how,
                    o.threshold,
                    o.map,
                    universe,
                    self.spec,
                    scratch,
                );
                acc.add_set(scratch);
            };
            match o.read {
                ReadSpec::Top(how) => set(self.readout.top(), how, &mut self.scratch),
                ReadSpec::Right(how) => set(self.readout.right(), how, &mut self.scratch),
                ReadSpec::Row(y, how) => {
                    let line = self.readout.horizontal_line(y).unwrap_or(&[]);
                    set(line, how, &mut self.scratch)
                }
                ReadSpec::Column(x, how) => {
                    let line = self.readout.vertical_line(x).unwrap_or(&[]);
                    set(line, how, &mut self.scratch)
                }
                ReadSpec::Height6v(..) => {
                    let h = self.height_slot[k].map_or(0, |s| self.readout.heights()[s]);
                    acc.add_scalar((h as f64 + o.shift) * o.scale);
                }
                ReadSpec::ExitColumn(c) => {
                    let col = self
                        .readout
                        .top()
                        .iter()
                        .position(|&t| t == c)
                        .map_or(0, |p| p + 1);
                    acc.add_scalar((col as f64 + o.shift) * o.scale);
                }
                _ => {}
            }
        }
    }

    /// The configuration of the last sample (when built with `picture`).
    pub(crate) fn readout(&self) -> &Readout {
        &self.readout
    }
}
