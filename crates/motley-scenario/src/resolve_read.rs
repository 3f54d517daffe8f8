//! Resolution of one observable: its read-out resolved by its model's family, then the modifiers
//! every family shares (threshold, index map, shift, scale) checked against the value it yields.

use motley_colorblind::IndexMap as SetMap;

use crate::checker::{Checker, MAX_SIDE};
use crate::combination::{Combination, Operand, Relation};
use crate::error::ScenarioError;
use crate::family::ReadContext;
use crate::raw::*;
use crate::scenario::*;

/// Resolves observable `name` (at `path`) of model `m` (index `mi`); `earlier` are the
/// observables defined before it, which a combination may use.
pub(crate) fn observable(
    ck: &Checker,
    path: &str,
    name: &str,
    (mi, m): (usize, &ModelSpec),
    o: &RawObservable,
    earlier: &[ObservableSpec],
) -> Result<ObservableSpec, ScenarioError> {
    let rp = format!("{path}.read");
    let family = m.kind.family();
    let cx = ReadContext {
        checker: ck,
        path: &rp,
        model: m,
    };
    let (read, kind) = match (&o.read, &o.combine) {
        (Some(r), None) => family.resolve_read(&cx, r)?,
        (None, Some(c)) => combine(ck, &format!("{path}.combine"), c, mi, earlier)?,
        (Some(_), Some(_)) | (None, None) => {
            return Err(ck.error(
                path,
                "an observable needs exactly one of `read` (a read-out of its model) and `combine` (numbers of other observables of the same model)",
            ))
        }
    };

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
                kind = kind.no_longer_integer();
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
                kind = kind.no_longer_integer();
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
            kind = kind.no_longer_integer();
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

/// Most components of a tuple.
pub const MAX_TUPLE: usize = 16;

/// Resolves a combination (at `path`) of observables defined before it on model `mi`.
fn combine(
    ck: &Checker,
    path: &str,
    c: &RawCombine,
    mi: usize,
    earlier: &[ObservableSpec],
) -> Result<(ReadSpec, ValueKind), ScenarioError> {
    // A component: a number read by the same model, defined earlier in the file.
    let number = |p: &str, n: &str| -> Result<(usize, (bool, bool)), ScenarioError> {
        let Some(i) = earlier.iter().position(|x| x.name == n) else {
            let known: Vec<&str> = earlier.iter().map(|x| x.name.as_str()).collect();
            return Err(ck.error(
                p,
                format!(
                    "no observable named \"{n}\" is defined before this one (known: {})",
                    if known.is_empty() {
                        "none".to_string()
                    } else {
                        known.join(", ")
                    }
                ),
            ));
        };
        let x = &earlier[i];
        if x.model != mi {
            return Err(ck.error(
                p,
                format!(
                    "\"{n}\" reads another model; a combination reads one model, sample by sample"
                ),
            ));
        }
        let integer = match (&x.read, x.kind) {
            (ReadSpec::Combined(_), _) => {
                return Err(ck.error(p, format!("\"{n}\" is itself combined; combine read-outs")))
            }
            (
                ReadSpec::SixVertex(_) | ReadSpec::Exclusion(_),
                ValueKind::Scalar { integer, discrete },
            ) => (integer, discrete),
            (ReadSpec::SixVertex(_) | ReadSpec::Exclusion(_), k) => {
                return Err(ck.error(
                    p,
                    format!("\"{n}\" is {}; a combination takes numbers", k.describe()),
                ))
            }
        };
        Ok((i, integer))
    };
    Ok(match c {
        RawCombine::Tuple(names) => {
            if names.len() < 2 || names.len() > MAX_TUPLE {
                return Err(ck.error(
                    &format!("{path}.tuple"),
                    format!("a tuple has 2 to {MAX_TUPLE} numbers, got {}", names.len()),
                ));
            }
            let mut idx = Vec::with_capacity(names.len());
            for (k, n) in names.iter().enumerate() {
                idx.push(number(&format!("{path}.tuple[{k}]"), n)?.0);
            }
            let len = idx.len();
            (
                ReadSpec::Combined(Combination::Tuple(idx)),
                ValueKind::Tuple { len },
            )
        }
        RawCombine::Difference([a, b]) | RawCombine::Sum([a, b]) => {
            let key = if matches!(c, RawCombine::Sum(_)) {
                "sum"
            } else {
                "difference"
            };
            let (ia, za) = number(&format!("{path}.{key}[0]"), a)?;
            let (ib, zb) = number(&format!("{path}.{key}[1]"), b)?;
            let comb = if matches!(c, RawCombine::Sum(_)) {
                Combination::Sum(ia, ib)
            } else {
                Combination::Difference(ia, ib)
            };
            (
                ReadSpec::Combined(comb),
                ValueKind::Scalar {
                    integer: za.0 && zb.0,
                    discrete: za.1 && zb.1,
                },
            )
        }
        RawCombine::Compare(cmp) => {
            let (ia, _) = number(&format!("{path}.compare.left"), &cmp.left)?;
            let right = match &cmp.right {
                RawOperand::Number(v) => {
                    Operand::Number(ck.finite(&format!("{path}.compare.right"), *v)?)
                }
                RawOperand::Observable(n) => {
                    Operand::Observable(number(&format!("{path}.compare.right"), n)?.0)
                }
            };
            let relation = match cmp.relation {
                RawRelation::GreaterThan => Relation::GreaterThan,
                RawRelation::LessThan => Relation::LessThan,
                RawRelation::AtLeast => Relation::AtLeast,
                RawRelation::AtMost => Relation::AtMost,
                RawRelation::EqualTo => Relation::EqualTo,
            };
            (
                ReadSpec::Combined(Combination::Compare(ia, relation, right)),
                ValueKind::Event,
            )
        }
    })
}
