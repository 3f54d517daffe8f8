//! The colored stochastic six-vertex model as a model family: its read-outs, their one reading
//! function (shared by Monte Carlo and exact mode), its exact laws, cost and profile.

use motley_colorblind::Color;
use motley_reference::{SixVertexQMoments, SixVertexStep};
use motley_sixvertex::{exact_law_with_heights, ratio, HeightQuery, Outcome, Readout};

use crate::error::ScenarioError;
use crate::family::{
    JointLaw, ModelFamily, RationalJointLaw, ReadContext, UnitSampler, Value, ValueBuffers,
    ValueKey,
};
use crate::raw::{RawPermutationRead, RawRead, RawSetKind};
use crate::read_set::set_elements;
use crate::scenario::{
    BoundarySpec, ModelSpec, ObservableSpec, Profile, ReadSpec, SetRead, SixVertexSpec, ValueKind,
};
use crate::six_vertex_unit::{build, SixVertexUnit};

/// The read-outs of a six-vertex rectangle.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SixVertexRead {
    /// Edges leaving the top.
    Top(SetRead),
    /// Edges leaving the right side.
    Right(SetRead),
    /// Vertical edges above row `y` (0: the bottom boundary).
    Row(usize, SetRead),
    /// Horizontal edges right of column `x` (0: the left boundary).
    Column(usize, SetRead),
    /// The height function `H(x, y)`.
    Height(usize, usize),
    /// The column where a color leaves the top (0 when it leaves through the right).
    ExitColumn(Color),
    /// The exit permutation of a boundary carrying colors 1 … W + H once each.
    ExitPermutation(PermutationRead),
    /// Where a color leaves, as (side, index): (0, column) through the top, (1, row) through the
    /// right side; (2, 0) if it does not appear.
    ExitPlace(Color),
}

/// Which way an exit permutation is read. Entrances and exits are numbered counterclockwise from
/// the bottom-right corner: entrance k ≤ W is the bottom edge of column W + 1 − k, entrance W + y
/// the left edge of row y; exit y ≤ H is the right edge of row y, exit H + k the top edge of column
/// W + 1 − k.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum PermutationRead {
    /// The color leaving through each exit, exits in order (σ⁻¹ when color k enters at entrance k).
    ColorsByExit,
    /// The exit each color 1 … W + H leaves through, colors in order (σ).
    ExitsByColor,
}

/// Largest six-vertex rectangle (vertices) decided exactly in `auto` mode.
pub const EXACT_SIX_VERTEX_VERTICES: usize = 30;
/// Largest side of a six-vertex rectangle decided exactly in `auto` mode.
pub const EXACT_SIX_VERTEX_SIDE: usize = 6;
/// Vertices per second per thread assumed by the cost estimate (single core, this project's 2-core
/// machine, release build; `cargo bench`, see the README's Performance section).
pub const SIX_VERTEX_RATE: f64 = 1.5e8;

/// What a six-vertex read-out looks at: one sample's read-out, or one outcome of the exact law
/// (which knows the exits only; [`ModelFamily::exact_obstacle`] keeps other read-outs away).
pub(crate) trait SixVertexView {
    /// Colors leaving through the top, column 1 first.
    fn top(&self) -> &[Color];
    /// Colors leaving through the right side, row 1 first.
    fn right(&self) -> &[Color];
    /// Vertical edges just above row `y`.
    fn row(&self, y: usize) -> Option<&[Color]>;
    /// Horizontal edges just right of column `x`.
    fn column(&self, x: usize) -> Option<&[Color]>;
    /// Height query number `slot`.
    fn height(&self, slot: usize) -> Option<u64>;
}

impl SixVertexView for Readout {
    fn top(&self) -> &[Color] {
        Readout::top(self)
    }
    fn right(&self) -> &[Color] {
        Readout::right(self)
    }
    fn row(&self, y: usize) -> Option<&[Color]> {
        self.horizontal_line(y)
    }
    fn column(&self, x: usize) -> Option<&[Color]> {
        self.vertical_line(x)
    }
    fn height(&self, slot: usize) -> Option<u64> {
        self.heights().get(slot).copied()
    }
}

/// One outcome of the exact law: the exits, and the values of the height queries asked for.
impl SixVertexView for (Outcome, Vec<u64>) {
    fn top(&self) -> &[Color] {
        &self.0.top
    }
    fn right(&self) -> &[Color] {
        &self.0.right
    }
    fn row(&self, _: usize) -> Option<&[Color]> {
        None
    }
    fn column(&self, _: usize) -> Option<&[Color]> {
        None
    }
    fn height(&self, slot: usize) -> Option<u64> {
        self.1.get(slot).copied()
    }
}

/// The height queries of `observables` (their order is the slot order) and each observable's slot.
pub(crate) fn height_queries(
    observables: &[&ObservableSpec],
) -> (Vec<HeightQuery>, Vec<Option<usize>>) {
    let mut queries = Vec::new();
    let slots = observables
        .iter()
        .map(|o| match *read_of(o) {
            SixVertexRead::Height(a, b) => {
                queries.push(HeightQuery {
                    a,
                    b,
                    threshold: o.threshold.unwrap_or(1).max(1),
                });
                Some(queries.len() - 1)
            }
            SixVertexRead::Top(_)
            | SixVertexRead::Right(_)
            | SixVertexRead::Row(..)
            | SixVertexRead::Column(..)
            | SixVertexRead::ExitColumn(_)
            | SixVertexRead::ExitPermutation(_)
            | SixVertexRead::ExitPlace(_) => None,
        })
        .collect();
    (queries, slots)
}

/// The six-vertex read-out of an observable (validation resolved it into this family's own).
pub(crate) fn read_of(o: &ObservableSpec) -> &SixVertexRead {
    match &o.read {
        ReadSpec::SixVertex(r) => r,
        ReadSpec::Exclusion(_) | ReadSpec::Combined(_) => panic!(
            "observable `{}` is no six-vertex read-out (a family reads only its own)",
            o.name
        ),
    }
}

/// Reads observable `o` of model `model` from `view`: the one reading function of the family.
/// `height_slot` is the observable's height query, `scratch` the buffers the value may borrow.
pub(crate) fn read<'s>(
    model: &ModelSpec,
    o: &ObservableSpec,
    view: &impl SixVertexView,
    height_slot: Option<usize>,
    scratch: &'s mut ValueBuffers,
) -> Value<'s> {
    let universe = match o.kind {
        ValueKind::Set { universe } => universe,
        ValueKind::Scalar { .. }
        | ValueKind::Event
        | ValueKind::Sequence { .. }
        | ValueKind::Tuple { .. } => 0,
    };
    let number = |v: f64| Value::Number(o.number(v));
    let (colors, how) = match *read_of(o) {
        SixVertexRead::Top(how) => (view.top(), how),
        SixVertexRead::Right(how) => (view.right(), how),
        SixVertexRead::Row(y, how) => (view.row(y).unwrap_or(&[]), how),
        SixVertexRead::Column(x, how) => (view.column(x).unwrap_or(&[]), how),
        SixVertexRead::Height(..) => {
            return number(height_slot.and_then(|s| view.height(s)).unwrap_or(0) as f64)
        }
        SixVertexRead::ExitColumn(c) => {
            return number(view.top().iter().position(|&t| t == c).map_or(0, |p| p + 1) as f64)
        }
        SixVertexRead::ExitPermutation(how) => {
            exit_permutation(model, view, how, &mut scratch.sequence);
            return Value::Sequence(&scratch.sequence);
        }
        SixVertexRead::ExitPlace(c) => {
            let at = |side: &[Color]| side.iter().position(|&t| t == c).map(|p| p as f64 + 1.0);
            let place = match (at(view.top()), at(view.right())) {
                (Some(col), _) => [0.0, col],
                (None, Some(row)) => [1.0, row],
                (None, None) => [2.0, 0.0],
            };
            scratch.tuple.clear();
            scratch.tuple.extend_from_slice(&place);
            return Value::Tuple(&scratch.tuple);
        }
    };
    set_elements(
        colors,
        how,
        o.threshold,
        o.map,
        universe,
        model,
        &mut scratch.set,
    );
    Value::Set(&scratch.set)
}

/// The exit permutation of `view` read `how` (file numbers), into `out`: exits numbered
/// counterclockwise from the bottom-right corner (right side bottom to top, then the top right to
/// left); see [`PermutationRead`].
fn exit_permutation(
    model: &ModelSpec,
    view: &impl SixVertexView,
    how: PermutationRead,
    out: &mut Vec<u32>,
) {
    out.clear();
    out.extend(view.right().iter().map(|&c| model.to_user(c)));
    out.extend(view.top().iter().rev().map(|&c| model.to_user(c)));
    if how == PermutationRead::ExitsByColor {
        let by_exit = std::mem::take(out);
        out.resize(by_exit.len(), 0);
        for (exit, &c) in by_exit.iter().enumerate() {
            // Validation made the boundary carry each of 1 … W + H once, so every color fits.
            if let Some(slot) = (c as usize).checked_sub(1).and_then(|i| out.get_mut(i)) {
                *slot = exit as u32 + 1;
            }
        }
    }
}

/// The values of `observables` (height query `slots[k]` for observable `k`) in one outcome of the
/// exact law.
fn read_all(
    model: &ModelSpec,
    observables: &[&ObservableSpec],
    slots: &[Option<usize>],
    out: &(Outcome, Vec<u64>),
    scratch: &mut ValueBuffers,
) -> Vec<ValueKey> {
    observables
        .iter()
        .zip(slots)
        .map(|(o, &slot)| read(model, o, out, slot, scratch).key())
        .collect()
}

fn set_read(k: RawSetKind) -> SetRead {
    match k {
        RawSetKind::Colors => SetRead::Colors,
        RawSetKind::Positions => SetRead::Positions,
    }
}

impl ModelFamily for SixVertexSpec {
    fn name(&self) -> &'static str {
        "six-vertex"
    }

    fn read_names(&self) -> &'static str {
        "top, right, row, column, height, exit-column, exit-place, exit-permutation"
    }

    fn resolve_read(
        &self,
        cx: &ReadContext,
        raw: &RawRead,
    ) -> Result<(ReadSpec, ValueKind), ScenarioError> {
        let rp = cx.path;
        let int = ValueKind::Scalar {
            integer: true,
            discrete: true,
        };
        let (read, kind) = match raw {
            RawRead::Top(k) => (
                SixVertexRead::Top(set_read(*k)),
                cx.set_kind(set_read(*k), self.width),
            ),
            RawRead::Right(k) => (
                SixVertexRead::Right(set_read(*k)),
                cx.set_kind(set_read(*k), self.height),
            ),
            RawRead::Row(r) => {
                let y = cx
                    .checker
                    .int_in(&format!("{rp}.row.y"), r.y, 0, self.height as i64)?;
                (
                    SixVertexRead::Row(y as usize, set_read(r.kind)),
                    cx.set_kind(set_read(r.kind), self.width),
                )
            }
            RawRead::Column(c) => {
                let x = cx
                    .checker
                    .int_in(&format!("{rp}.column.x"), c.x, 0, self.width as i64)?;
                (
                    SixVertexRead::Column(x as usize, set_read(c.kind)),
                    cx.set_kind(set_read(c.kind), self.height),
                )
            }
            RawRead::Height(h) => {
                let x = cx
                    .checker
                    .int_in(&format!("{rp}.height.x"), h.x, 0, self.width as i64)?;
                let Some(y) = h.y else {
                    return Err(cx.error(&format!("{rp}.height"), "a six-vertex height needs `y`"));
                };
                let y = cx
                    .checker
                    .int_in(&format!("{rp}.height.y"), y, 0, self.height as i64)?;
                if h.time.is_some() {
                    return Err(cx.error(
                        &format!("{rp}.height.time"),
                        "a six-vertex height has no `time` (rows play its part)",
                    ));
                }
                (SixVertexRead::Height(x as usize, y as usize), int)
            }
            RawRead::ExitColumn(c) => (
                SixVertexRead::ExitColumn(cx.class(&format!("{rp}.exit-column"), *c)?),
                int,
            ),
            RawRead::ExitPlace(c) => (
                SixVertexRead::ExitPlace(cx.class(&format!("{rp}.exit-place"), *c)?),
                ValueKind::Tuple { len: 2 },
            ),
            RawRead::ExitPermutation(how) => {
                let n = self.width + self.height;
                let mut colors: Vec<Color> = match (&self.left, &self.bottom) {
                    (BoundarySpec::Fixed(l), BoundarySpec::Fixed(b)) => {
                        l.iter().chain(b).map(|&c| cx.model.to_user(c)).collect()
                    }
                    (BoundarySpec::Bernoulli { .. }, _) | (_, BoundarySpec::Bernoulli { .. }) => {
                        Vec::new()
                    }
                };
                colors.sort_unstable();
                if !colors.iter().copied().eq(1..=n as Color) {
                    return Err(cx.error(
                        &format!("{rp}.exit-permutation"),
                        format!("an exit permutation needs every boundary edge to carry a different color, the colors 1 … {n} (W + H) once each"),
                    ));
                }
                let how = match how {
                    RawPermutationRead::Colors => PermutationRead::ColorsByExit,
                    RawPermutationRead::Exits => PermutationRead::ExitsByColor,
                };
                (
                    SixVertexRead::ExitPermutation(how),
                    ValueKind::Sequence { len: n },
                )
            }
            RawRead::Window(_)
            | RawRead::Position(_)
            | RawRead::Arrangement(_)
            | RawRead::InverseArrangement(_)
            | RawRead::Current(_)
            | RawRead::Swapped(_)
            | RawRead::Attempted(_)
            | RawRead::Configuration(_)
            | RawRead::SwapTime(_)
            | RawRead::AttemptTime(_)
            | RawRead::Displacement(_) => return Err(cx.wrong_family(self, raw)),
        };
        Ok((ReadSpec::SixVertex(read), kind))
    }

    fn takes_threshold(&self, read: &ReadSpec) -> bool {
        match read {
            ReadSpec::SixVertex(r) => match r {
                SixVertexRead::Top(how)
                | SixVertexRead::Right(how)
                | SixVertexRead::Row(_, how)
                | SixVertexRead::Column(_, how) => *how == SetRead::Positions,
                SixVertexRead::Height(..) => true,
                SixVertexRead::ExitColumn(_)
                | SixVertexRead::ExitPermutation(_)
                | SixVertexRead::ExitPlace(_) => false,
            },
            ReadSpec::Exclusion(_) | ReadSpec::Combined(_) => false,
        }
    }

    fn sampler<'a>(
        &'a self,
        model: &'a ModelSpec,
        observables: Vec<&'a ObservableSpec>,
    ) -> Result<Box<dyn UnitSampler + 'a>, String> {
        Ok(Box::new(SixVertexUnit::new(
            model,
            self,
            observables,
            false,
        )?))
    }

    fn exact_obstacle(&self, model: &ModelSpec, o: &ObservableSpec) -> Option<String> {
        if self.width * self.height > EXACT_SIX_VERTEX_VERTICES
            || self.width.max(self.height) > EXACT_SIX_VERTEX_SIDE
        {
            return Some(format!(
                "model `{}` is {}×{}; exact laws are computed up to {} vertices with sides ≤ {}",
                model.name,
                self.width,
                self.height,
                EXACT_SIX_VERTEX_VERTICES,
                EXACT_SIX_VERTEX_SIDE
            ));
        }
        let fixed = |b: &BoundarySpec| match b {
            BoundarySpec::Fixed(_) => true,
            BoundarySpec::Bernoulli { .. } => false,
        };
        if !fixed(&self.left) || !fixed(&self.bottom) {
            return Some(format!("model `{}` has a random boundary", model.name));
        }
        match read_of(o) {
            SixVertexRead::Top(_)
            | SixVertexRead::Right(_)
            | SixVertexRead::ExitColumn(_)
            | SixVertexRead::ExitPermutation(_)
            | SixVertexRead::ExitPlace(_)
            | SixVertexRead::Height(..) => None,
            SixVertexRead::Row(..) | SixVertexRead::Column(..) => Some(format!(
                "observable `{}` reads a row or column of edges inside the rectangle; exact laws cover the exits and heights",
                o.name
            )),
        }
    }

    fn censored_at(&self, _: &ReadSpec) -> Option<f64> {
        None
    }

    fn joint_obstacle(&self, _: &ModelSpec, _: &[&ObservableSpec]) -> Option<String> {
        None
    }

    fn exact_joint_law(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Result<JointLaw, String> {
        let engine = build(self)?;
        let (queries, slots) = height_queries(observables);
        let law = exact_law_with_heights(self.b1.value, self.b2.value, engine.boundary(), &queries)
            .map_err(|e| e.to_string())?;
        let mut scratch = ValueBuffers::default();
        let mut cells = std::collections::BTreeMap::new();
        for (out, p) in law.entries() {
            let key = read_all(model, observables, &slots, out, &mut scratch);
            *cells.entry(key).or_insert(0.0) += *p;
        }
        Ok(JointLaw {
            cells: cells.into_iter().collect(),
            error: 1e-14 * (1 + law.len()) as f64,
        })
    }

    fn rational_joint_law(
        &self,
        model: &ModelSpec,
        observables: &[&ObservableSpec],
    ) -> Option<RationalJointLaw> {
        let (Some((n1, d1)), Some((n2, d2))) = (self.b1.rational, self.b2.rational) else {
            return None;
        };
        let engine = build(self).ok()?;
        let (queries, slots) = height_queries(observables);
        let law = exact_law_with_heights(ratio(n1, d1), ratio(n2, d2), engine.boundary(), &queries)
            .ok()?;
        let mut scratch = ValueBuffers::default();
        Some(law.map(|out| read_all(model, observables, &slots, out, &mut scratch)))
    }

    fn cost_per_sample(&self) -> (f64, f64) {
        (
            (self.width * self.height) as f64 / SIX_VERTEX_RATE,
            (self.width * 40 + self.height * 16) as f64,
        )
    }

    fn window_origin(&self, _: &ReadSpec) -> Option<i64> {
        None
    }

    fn profile_value(
        &self,
        profile: Profile,
        model: &ModelSpec,
        o: &ObservableSpec,
    ) -> Result<Option<f64>, String> {
        let SixVertexRead::Height(x, y) = *read_of(o) else {
            return Ok(None);
        };
        let linear = o.base.is_none();
        let q = self.b1.value / self.b2.value;
        let q_power = o.base.is_some_and(|b| (b - q).abs() <= 1e-12 * q.max(1.0))
            && o.shift == 0.0
            && o.scale == 1.0;
        let wanted = match profile {
            Profile::SixVertexStepHeight => linear,
            Profile::SixVertexQMoment => q_power,
            Profile::TasepStepCount => false,
        };
        if !wanted {
            return Ok(None);
        }
        let step = matches!(&self.left, BoundarySpec::Fixed(c) if c.iter().all(|&c| c >= 1 && o.threshold.is_none_or(|t| c >= t)))
            && matches!(&self.bottom, BoundarySpec::Fixed(c) if c.iter().all(|&c| c == 0 || o.threshold.is_some_and(|t| c < t)));
        if !step {
            return Err(format!("`{}` needs the step boundary (a path on every left edge, none from below), but model \"{}\" of \"{}\" has other boundary data", profile.name(), model.name, o.name));
        }
        if profile == Profile::SixVertexQMoment {
            let table =
                SixVertexQMoments::new(self.b1.value, self.b2.value, self.width, self.height)
                    .map_err(|e| format!("model \"{}\": {e}", model.name))?;
            return Ok(Some(table.mean_q_power(x, y)));
        }
        let shape = SixVertexStep::from_weights(self.b1.value, self.b2.value)
            .map_err(|e| format!("model \"{}\": {e}", model.name))?;
        Ok(Some(o.number(shape.height(x as f64, y as f64))))
    }
}
