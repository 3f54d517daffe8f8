//! Explicit laws written in a scenario (`reference: {table: [[value, probability], …]}`): each
//! value read as the observable's kind of value, probabilities as decimals or fractions.
//!
//! When every probability is a fraction (or an integer), the law is also kept in rationals, so that
//! an exact decision against a law computed in rationals is exact: total variation exactly 0.

use num_rational::BigRational;
use num_traits::One;

use crate::checker::Checker;
use crate::error::ScenarioError;
use crate::family::{Real, ValueKey};
use crate::raw::{RawNumber, RawTableValue};
use crate::scenario::{ObservableSpec, TableLaw, ValueKind};

/// Largest number of rows of a table.
pub const MAX_TABLE_ROWS: usize = 100_000;

/// Reads the rows of a table (at key path `path`) as a law of observable `o`.
///
/// # Errors
/// A located message for a value that is not one of `o`'s values, a repeated value, a probability
/// outside [0, 1], or probabilities that do not add up to 1 (exactly, when all are fractions;
/// within 1e-9 otherwise).
pub(crate) fn table(
    ck: &Checker,
    path: &str,
    rows: &[(RawTableValue, RawNumber)],
    o: &ObservableSpec,
) -> Result<TableLaw, ScenarioError> {
    if rows.is_empty() || rows.len() > MAX_TABLE_ROWS {
        return Err(ck.error(
            path,
            format!(
                "a table needs 1 to {MAX_TABLE_ROWS} rows `[value, probability]`, got {}",
                rows.len()
            ),
        ));
    }
    let mut cells: Vec<(ValueKey, f64)> = Vec::with_capacity(rows.len());
    let mut rational: Option<Vec<(ValueKey, BigRational)>> = Some(Vec::new());
    for (k, (value, prob)) in rows.iter().enumerate() {
        let vp = format!("{path}[{k}][0]");
        let pp = format!("{path}[{k}][1]");
        let key = value_key(ck, &vp, value, o)?;
        let p = ck.number(&pp, prob)?;
        if !(0.0..=1.0).contains(&p.value) {
            return Err(ck.error(
                &pp,
                format!("must be a probability in [0, 1], got {}", p.value),
            ));
        }
        rational = match (rational, p.rational) {
            (Some(mut r), Some((n, d))) => {
                r.push((key.clone(), BigRational::new(n.into(), d.into())));
                Some(r)
            }
            _ => None,
        };
        cells.push((key, p.value));
    }
    let mut order: Vec<usize> = (0..cells.len()).collect();
    order.sort_by(|&a, &b| cells[a].0.cmp(&cells[b].0));
    for w in order.windows(2) {
        if cells[w[0]].0 == cells[w[1]].0 {
            return Err(ck.error(
                &format!("{path}[{}][0]", w[1].max(w[0])),
                format!(
                    "repeats the value of row {}; list each value once",
                    w[1].min(w[0])
                ),
            ));
        }
    }
    match &rational {
        Some(r) => {
            let total: BigRational = r.iter().map(|(_, p)| p.clone()).sum();
            if total != BigRational::one() {
                return Err(ck.error(path, format!("the probabilities add up to {total}, not 1")));
            }
        }
        None => {
            let total: f64 = cells.iter().map(|(_, p)| p).sum();
            if (total - 1.0).abs() > 1e-9 {
                return Err(ck.error(
                    path,
                    format!("the probabilities add up to {total}, not 1 (within 1e-9)"),
                ));
            }
        }
    }
    let sorted = |v: &[(ValueKey, f64)]| order.iter().map(|&i| v[i].clone()).collect::<Vec<_>>();
    Ok(TableLaw {
        cells: sorted(&cells),
        rational: rational.map(|r| order.iter().map(|&i| r[i].1.clone()).collect()),
    })
}

/// One table value as a value of observable `o`.
fn value_key(
    ck: &Checker,
    path: &str,
    value: &RawTableValue,
    o: &ObservableSpec,
) -> Result<ValueKey, ScenarioError> {
    let wrong = || {
        ck.error(
            path,
            format!(
                "\"{}\" is {}, and this value is not one of its values",
                o.name,
                o.kind.describe()
            ),
        )
    };
    match (o.kind, value) {
        (ValueKind::Scalar { .. }, RawTableValue::Number(x)) => {
            Ok(ValueKey::Number(Real(ck.finite(path, *x)?)))
        }
        (ValueKind::Event, RawTableValue::Flag(b)) => Ok(ValueKey::Event(*b)),
        (ValueKind::Sequence { len }, RawTableValue::List(v)) => {
            if v.len() != len || v.iter().any(|&x| x < 0 || x > u32::MAX as i64) {
                return Err(ck.error(
                    path,
                    format!(
                        "must list {len} nonnegative integers (a value of \"{}\"), got {v:?}",
                        o.name
                    ),
                ));
            }
            Ok(ValueKey::Sequence(v.iter().map(|&x| x as u32).collect()))
        }
        (ValueKind::Tuple { len }, RawTableValue::List(v)) => {
            if v.len() != len {
                return Err(ck.error(
                    path,
                    format!(
                        "must list {len} numbers (a value of \"{}\"), got {v:?}",
                        o.name
                    ),
                ));
            }
            Ok(ValueKey::Tuple(v.iter().map(|&x| Real(x as f64)).collect()))
        }
        (ValueKind::Set { universe }, RawTableValue::List(v)) => {
            let mut e: Vec<usize> = Vec::with_capacity(v.len());
            for &x in v {
                if x < 1 || x > universe as i64 {
                    return Err(ck.error(
                        path,
                        format!("set elements lie in {{1, …, {universe}}}, got {x}"),
                    ));
                }
                e.push(x as usize);
            }
            e.sort_unstable();
            if e.windows(2).any(|w| w[0] == w[1]) {
                return Err(ck.error(path, "a set lists each element once"));
            }
            Ok(ValueKey::Set(e))
        }
        (ValueKind::Scalar { .. }, RawTableValue::Flag(_) | RawTableValue::List(_))
        | (ValueKind::Event, RawTableValue::Number(_) | RawTableValue::List(_))
        | (ValueKind::Sequence { .. }, RawTableValue::Number(_) | RawTableValue::Flag(_))
        | (ValueKind::Set { .. }, RawTableValue::Number(_) | RawTableValue::Flag(_))
        | (ValueKind::Tuple { .. }, RawTableValue::Number(_) | RawTableValue::Flag(_)) => {
            Err(wrong())
        }
    }
}
