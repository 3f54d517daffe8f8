//! Resolution of one observable: its read-out resolved by its model's family, then the modifiers
//! every family shares (threshold, index map, shift, scale) checked against the value it yields.

use motley_colorblind::IndexMap as SetMap;

use crate::checker::{Checker, MAX_SIDE};
use crate::error::ScenarioError;
use crate::family::ReadContext;
use crate::raw::*;
use crate::scenario::*;

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
    let family = m.kind.family();
    let cx = ReadContext {
        checker: ck,
        path: &rp,
        model: m,
    };
    let (read, kind) = family.resolve_read(&cx, &o.read)?;

    // Modifiers.
    let takes_threshold = family.takes_threshold(&read);
    let threshold = match o.threshold {
        None => None,
        Some(_) if !takes_threshold => {
            return Err(ck.error(
                &format!("{path}.threshold"),
                "a threshold applies to position reads, heights and currents only",
            ))
        }
        Some(t) => Some(cx.class(&format!("{path}.threshold"), t)?),
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
    let base = match &o.base {
        None => None,
        Some(b) => {
            let b = ck.number(&format!("{path}.base"), b)?.value;
            if !matches!(kind, ValueKind::Scalar { .. }) {
                return Err(ck.error(
                    &format!("{path}.base"),
                    format!(
                        "a base applies to numbers, but this observable is {}",
                        kind.describe()
                    ),
                ));
            }
            if !b.is_finite() || b <= 0.0 {
                return Err(ck.error(
                    &format!("{path}.base"),
                    format!("must be a finite positive number, got {b}"),
                ));
            }
            kind = ValueKind::Scalar { integer: false };
            Some(b)
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
        base,
        kind,
    })
}
