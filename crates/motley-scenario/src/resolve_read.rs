//! Resolution of one observable: its read-out checked against its model's domain, its kind found.

use motley_colorblind::{Color, IndexMap as SetMap};

use crate::checker::{Checker, MAX_SIDE};
use crate::error::ScenarioError;
use crate::raw::*;
use crate::scenario::*;

fn set_read(k: RawSetKind) -> SetRead {
    match k {
        RawSetKind::Colors => SetRead::Colors,
        RawSetKind::Positions => SetRead::Positions,
    }
}

/// Resolves observable `name` (at `path`) of model `m` (index `mi`).
pub(crate) fn observable(
    ck: &Checker,
    path: &str,
    name: &str,
    mi: usize,
    m: &ModelSpec,
    o: &RawObservable,
) -> Result<ObservableSpec, ScenarioError> {
    let rp = format!("{path}.read");
    let user_max = m.relabel.map(|r| r.classes()).unwrap_or(m.max_color);
    let colors_universe = user_max.max(1) as usize;
    // A class or color number of the file → engine color, checked against the model's range.
    let class = |p: &str, c: i64| -> Result<Color, ScenarioError> {
        if c < 1 || c > i64::from(user_max) {
            return Err(ck.error(
                p,
                format!("must be a color of this model, in [1, {user_max}], got {c}"),
            ));
        }
        Ok(match m.relabel {
            Some(r) => r.map(c as Color).expect("checked range"),
            None => c as Color,
        })
    };
    let wrong_model = |what: &str| {
        let allowed = match m.kind {
            ModelKind::SixVertex(_) => "top, right, row, column, height, exit-column",
            ModelKind::Exclusion(_) => "window, position, arrangement, inverse-arrangement, current, height, swapped, attempted",
        };
        ck.error(
            &rp,
            format!(
                "`{what}` is not a read-out of a {} model (its read-outs: {allowed})",
                m.kind.name()
            ),
        )
    };
    let set_kind = |k: SetRead, positions: usize| match k {
        SetRead::Colors => ValueKind::Set {
            universe: colors_universe,
        },
        SetRead::Positions => ValueKind::Set {
            universe: positions,
        },
    };
    let int = ValueKind::Scalar { integer: true };
    let time_index = |t: f64| -> usize {
        match &m.kind {
            ModelKind::Exclusion(e) => e
                .times
                .iter()
                .position(|&x| x == t)
                .expect("times were collected from the observables"),
            ModelKind::SixVertex(_) => 0,
        }
    };

    let (read, kind) = match (&m.kind, &o.read) {
        (ModelKind::SixVertex(s), RawRead::Top(k)) => {
            (ReadSpec::Top(set_read(*k)), set_kind(set_read(*k), s.width))
        }
        (ModelKind::SixVertex(s), RawRead::Right(k)) => (
            ReadSpec::Right(set_read(*k)),
            set_kind(set_read(*k), s.height),
        ),
        (ModelKind::SixVertex(s), RawRead::Row(r)) => {
            let y = ck.int_in(&format!("{rp}.row.y"), r.y, 0, s.height as i64)? as usize;
            (
                ReadSpec::Row(y, set_read(r.kind)),
                set_kind(set_read(r.kind), s.width),
            )
        }
        (ModelKind::SixVertex(s), RawRead::Column(c)) => {
            let x = ck.int_in(&format!("{rp}.column.x"), c.x, 0, s.width as i64)? as usize;
            (
                ReadSpec::Column(x, set_read(c.kind)),
                set_kind(set_read(c.kind), s.height),
            )
        }
        (ModelKind::SixVertex(s), RawRead::Height(h)) => {
            let x = ck.int_in(&format!("{rp}.height.x"), h.x, 0, s.width as i64)? as usize;
            let Some(y) = h.y else {
                return Err(ck.error(&format!("{rp}.height"), "a six-vertex height needs `y`"));
            };
            let y = ck.int_in(&format!("{rp}.height.y"), y, 0, s.height as i64)? as usize;
            if h.time.is_some() {
                return Err(ck.error(
                    &format!("{rp}.height.time"),
                    "a six-vertex height has no `time` (rows play its part)",
                ));
            }
            (ReadSpec::Height6v(x, y), int)
        }
        (ModelKind::SixVertex(_), RawRead::ExitColumn(c)) => (
            ReadSpec::ExitColumn(class(&format!("{rp}.exit-column"), *c)?),
            int,
        ),
        (ModelKind::SixVertex(_), r) => return Err(wrong_model(read_name(r))),
        (ModelKind::Exclusion(e), r) => {
            let n = match e.lattice {
                LatticeSpec::Segment(n) | LatticeSpec::Ring(n) => Some(n as i64),
                LatticeSpec::Line => None,
            };
            let single = |p: &str, c: i64| -> Result<Color, ScenarioError> {
                let col = class(p, c)?;
                let count = match &e.initial {
                    InitialSpec::Sites(s) => s.iter().filter(|&&x| x == col).count(),
                    InitialSpec::Line {
                        left, right, block, ..
                    } => {
                        if *left == col || *right == col {
                            2
                        } else {
                            block.iter().filter(|&&x| x == col).count()
                        }
                    }
                };
                if count != 1 {
                    return Err(ck.error(
                        p,
                        format!("class {c} must sit on exactly one site of the initial data to be followed; it sits on {}", if count > 1 { "several".to_string() } else { "none".to_string() }),
                    ));
                }
                Ok(col)
            };
            match r {
                RawRead::Window(w) => {
                    let p = format!("{rp}.window");
                    if w.from > w.to {
                        return Err(ck.error(
                            &format!("{p}.to"),
                            format!("must be ≥ `from` ({}), got {}", w.from, w.to),
                        ));
                    }
                    match n {
                        Some(n) => {
                            ck.int_in(&format!("{p}.from"), w.from, 1, n)?;
                            ck.int_in(&format!("{p}.to"), w.to, 1, n)?;
                        }
                        None => {
                            ck.int_in(&format!("{p}.from"), w.from, -MAX_SIDE, MAX_SIDE)?;
                            ck.int_in(&format!("{p}.to"), w.to, -MAX_SIDE, MAX_SIDE)?;
                            if w.to - w.from >= 1 << 16 {
                                return Err(ck.error(
                                    &format!("{p}.to"),
                                    "a window holds at most 65536 sites",
                                ));
                            }
                        }
                    }
                    let len = (w.to - w.from + 1) as usize;
                    (
                        ReadSpec::Window(w.from, w.to, time_index(w.time), set_read(w.kind)),
                        set_kind(set_read(w.kind), len),
                    )
                }
                RawRead::Position(pr) => {
                    let c = single(&format!("{rp}.position.class"), pr.class)?;
                    (ReadSpec::Position(c, time_index(pr.time)), int)
                }
                RawRead::Arrangement(t) | RawRead::InverseArrangement(t) => {
                    let inverse = matches!(r, RawRead::InverseArrangement(_));
                    let Some(n) = n else {
                        return Err(ck.error(&rp, "an arrangement needs a segment or a ring"));
                    };
                    if !e.packed || i64::from(user_max) != n {
                        return Err(ck.error(&rp, "an arrangement needs initial data with distinct classes 1..n on the n sites (e.g. `packed`)"));
                    }
                    let ti = time_index(t.time);
                    let read = if inverse {
                        ReadSpec::InverseArrangement(ti)
                    } else {
                        ReadSpec::Arrangement(ti)
                    };
                    (read, ValueKind::Sequence { len: n as usize })
                }
                RawRead::Current(c) => {
                    let p = format!("{rp}.current.bond");
                    match (e.lattice, n) {
                        (LatticeSpec::Segment(_), Some(n)) => {
                            ck.int_in(&p, c.bond, 1, n - 1)?;
                        }
                        (_, Some(n)) => {
                            ck.int_in(&p, c.bond, 1, n)?;
                        }
                        _ => {
                            ck.int_in(&p, c.bond, -MAX_SIDE, MAX_SIDE)?;
                        }
                    }
                    (ReadSpec::Current(c.bond, time_index(c.time)), int)
                }
                RawRead::Height(h) => {
                    let p = format!("{rp}.height");
                    if h.y.is_some() {
                        return Err(ck.error(
                            &format!("{p}.y"),
                            "an exclusion height has no `y`; give `time`",
                        ));
                    }
                    let Some(t) = h.time else {
                        return Err(ck.error(&p, "an exclusion height needs `time`"));
                    };
                    match n {
                        Some(n) => ck.int_in(&format!("{p}.x"), h.x, 0, n)?,
                        None => ck.int_in(&format!("{p}.x"), h.x, -MAX_SIDE, MAX_SIDE)?,
                    };
                    (ReadSpec::HeightExcl(h.x, time_index(t)), int)
                }
                RawRead::Swapped(pr) | RawRead::Attempted(pr) => {
                    let p = format!("{rp}.{}.classes", read_name(r));
                    let a = single(&format!("{p}[0]"), pr.classes[0])?;
                    let b = single(&format!("{p}[1]"), pr.classes[1])?;
                    if a == b {
                        return Err(ck.error(&p, "needs two different classes"));
                    }
                    let ti = time_index(pr.time);
                    let read = if matches!(r, RawRead::Swapped(_)) {
                        ReadSpec::Swapped(a, b, ti)
                    } else {
                        ReadSpec::Attempted(a, b, ti)
                    };
                    (read, ValueKind::Event)
                }
                other => return Err(wrong_model(read_name(other))),
            }
        }
    };

    // Modifiers.
    let takes_threshold = matches!(
        read,
        ReadSpec::Top(SetRead::Positions)
            | ReadSpec::Right(SetRead::Positions)
            | ReadSpec::Row(_, SetRead::Positions)
            | ReadSpec::Column(_, SetRead::Positions)
            | ReadSpec::Window(_, _, _, SetRead::Positions)
            | ReadSpec::Height6v(..)
            | ReadSpec::HeightExcl(..)
            | ReadSpec::Current(..)
    );
    let threshold = match o.threshold {
        None => None,
        Some(_) if !takes_threshold => {
            return Err(ck.error(
                &format!("{path}.threshold"),
                "a threshold applies to position reads, heights and currents only",
            ))
        }
        Some(t) => Some(class(&format!("{path}.threshold"), t)?),
    };
    let map = match &o.map {
        None | Some(RawIndexMap::Identity) => SetMap::Identity,
        Some(RawIndexMap::Reflection) => SetMap::Reflection,
        Some(RawIndexMap::Shift(s)) => SetMap::Shift(*s),
    };
    if o.map.is_some() {
        let ValueKind::Set { universe } = kind else {
            return Err(ck.error(
                &format!("{path}.map"),
                format!(
                    "an index map applies to sets, but this observable is {}",
                    kind.describe()
                ),
            ));
        };
        if let SetMap::Shift(s) = map {
            // Checked here, with the shifted range in the message, and before `IndexMap::fits`, whose
            // arithmetic would overflow for shifts near the ends of i64.
            let fits = s.unsigned_abs() <= MAX_SIDE as u64 && map.fits(universe, universe);
            if !fits {
                let (lo, hi) = (1 + i128::from(s), universe as i128 + i128::from(s));
                return Err(ck.error(
                    &format!("{path}.map.shift"),
                    format!("the shift does not fit: `shift: {s}` moves {{1, …, {universe}}} to {{{lo}, …, {hi}}}, outside {{1, …, {universe}}}"),
                ));
            }
        }
        if !map.fits(universe, universe) {
            return Err(ck.error(
                &format!("{path}.map"),
                format!("the map does not fit the window: it sends some of {{1, …, {universe}}} outside it"),
            ));
        }
    }
    let mut kind = kind;
    let shift = match o.shift {
        None => 0.0,
        Some(v) => {
            if !matches!(kind, ValueKind::Scalar { .. }) {
                return Err(ck.error(
                    &format!("{path}.shift"),
                    format!(
                        "a shift applies to numbers, but this observable is {}",
                        kind.describe()
                    ),
                ));
            }
            if !v.is_finite() {
                return Err(ck.error(
                    &format!("{path}.shift"),
                    format!("must be a finite number, got {v}"),
                ));
            }
            if v.fract() != 0.0 {
                kind = ValueKind::Scalar { integer: false };
            }
            v
        }
    };
    let scale = match o.scale {
        None => 1.0,
        Some(s) => {
            if !matches!(kind, ValueKind::Scalar { .. }) {
                return Err(ck.error(
                    &format!("{path}.scale"),
                    format!(
                        "a scale applies to numbers, but this observable is {}",
                        kind.describe()
                    ),
                ));
            }
            if !s.is_finite() || s == 0.0 {
                return Err(ck.error(
                    &format!("{path}.scale"),
                    format!("must be a finite nonzero number, got {s}"),
                ));
            }
            if s != 1.0 {
                kind = ValueKind::Scalar { integer: false };
            }
            s
        }
    };
    Ok(ObservableSpec {
        name: name.to_string(),
        model: mi,
        read,
        threshold,
        map,
        scale,
        shift,
        kind,
    })
}

fn read_name(r: &RawRead) -> &'static str {
    match r {
        RawRead::Top(_) => "top",
        RawRead::Right(_) => "right",
        RawRead::Row(_) => "row",
        RawRead::Column(_) => "column",
        RawRead::Height(_) => "height",
        RawRead::ExitColumn(_) => "exit-column",
        RawRead::Window(_) => "window",
        RawRead::Position(_) => "position",
        RawRead::Arrangement(_) => "arrangement",
        RawRead::InverseArrangement(_) => "inverse-arrangement",
        RawRead::Current(_) => "current",
        RawRead::Swapped(_) => "swapped",
        RawRead::Attempted(_) => "attempted",
    }
}
