//! Located checks: the file name and key positions of one validation, and the range checks and
//! messages that every part of validation shares (so each message reads the same wherever it comes
//! from).

use crate::error::ScenarioError;
use crate::locate::Locations;
use crate::raw::RawNumber;
use crate::scenario::Number;
use crate::suggest::closest;

/// Largest width, height, lattice size or window accepted (memory is checked separately).
pub const MAX_SIDE: i64 = 1 << 20;
/// Largest color number accepted.
pub const MAX_COLOR: i64 = 1 << 20;

/// Context of one validation: the file name and the key positions.
pub(crate) struct Checker<'a> {
    /// The file name, as messages print it.
    pub file: &'a str,
    /// Where each key path stands in the file.
    pub locations: &'a Locations,
}

impl Checker<'_> {
    pub(crate) fn error(&self, path: &str, message: impl Into<String>) -> ScenarioError {
        let pos = self.locations.find(path);
        ScenarioError {
            file: self.file.to_string(),
            line: pos.map(|p| p.line),
            column: pos.map(|p| p.column),
            path: path.to_string(),
            message: message.into(),
            hint: None,
        }
    }

    pub(crate) fn error_hint(
        &self,
        path: &str,
        message: impl Into<String>,
        hint: Option<String>,
    ) -> ScenarioError {
        let mut e = self.error(path, message);
        e.hint = hint;
        e
    }

    pub(crate) fn int_in(
        &self,
        path: &str,
        v: i64,
        lo: i64,
        hi: i64,
    ) -> Result<i64, ScenarioError> {
        if v < lo || v > hi {
            return Err(self.error(path, format!("must be an integer in [{lo}, {hi}], got {v}")));
        }
        Ok(v)
    }

    pub(crate) fn finite(&self, path: &str, v: f64) -> Result<f64, ScenarioError> {
        if !v.is_finite() {
            return Err(self.error(path, format!("must be a finite number, got {v}")));
        }
        Ok(v)
    }

    pub(crate) fn probability(&self, path: &str, n: &RawNumber) -> Result<Number, ScenarioError> {
        let n = self.number(path, n)?;
        if !(0.0..=1.0).contains(&n.value) {
            return Err(self.error(
                path,
                format!("must be a probability in [0, 1], got {}", n.value),
            ));
        }
        Ok(n)
    }

    pub(crate) fn rate(&self, path: &str, n: &RawNumber) -> Result<Number, ScenarioError> {
        let n = self.number(path, n)?;
        if n.value < 0.0 || n.value > 1e6 {
            return Err(self.error(path, format!("must be a rate in [0, 1e6], got {}", n.value)));
        }
        Ok(n)
    }

    pub(crate) fn number(&self, path: &str, n: &RawNumber) -> Result<Number, ScenarioError> {
        match n {
            RawNumber::Float(v) => Ok(Number {
                value: self.finite(path, *v)?,
                rational: None,
            }),
            RawNumber::Text(t) => {
                let bad = || {
                    self.error(
                        path,
                        format!("must be a number or a fraction like \"1/3\", got \"{t}\""),
                    )
                };
                let (num, den) = match t.split_once('/') {
                    Some((a, b)) => (a.trim().parse::<i64>(), b.trim().parse::<i64>()),
                    None => (t.trim().parse::<i64>(), Ok(1)),
                };
                let (num, den) = (num.map_err(|_| bad())?, den.map_err(|_| bad())?);
                if den <= 0 {
                    return Err(self.error(
                        path,
                        format!("fraction \"{t}\" must have a positive denominator"),
                    ));
                }
                Ok(Number {
                    value: num as f64 / den as f64,
                    rational: Some((num, den)),
                })
            }
        }
    }

    /// A read-out time: a number in (0, 1e9], or `stationary` as `f64::INFINITY`.
    pub(crate) fn time(&self, path: &str, t: crate::raw::RawTime) -> Result<f64, ScenarioError> {
        let t = match t {
            crate::raw::RawTime::Named(_) => return Ok(t.value()),
            crate::raw::RawTime::At(t) => t,
        };
        if !t.is_finite() || t <= 0.0 || t > 1e9 {
            return Err(self.error(path, format!("time must be a number in (0, 1e9], got {t}")));
        }
        Ok(t)
    }

    pub(crate) fn name(&self, path: &str, n: &str) -> Result<(), ScenarioError> {
        let ok = !n.is_empty()
            && n.len() <= 64
            && n.chars()
                .all(|c| c.is_ascii_alphanumeric() || c == '-' || c == '_');
        if !ok {
            return Err(self.error(
                path,
                format!("names use letters, digits, `-` and `_` (1 to 64 of them), got \"{n}\""),
            ));
        }
        Ok(())
    }

    pub(crate) fn unknown_name(
        &self,
        path: &str,
        what: &str,
        name: &str,
        known: &[&str],
    ) -> ScenarioError {
        // Names are at most 64 characters; a longer one is no typo (and the edit distance would
        // cost memory proportional to its length).
        let hint = if name.len() > 64 {
            None
        } else {
            closest(name, known.iter().copied()).map(|c| format!("did you mean `{c}`?"))
        };
        let list = if known.is_empty() {
            "none is defined".to_string()
        } else {
            format!("known: {}", known.join(", "))
        };
        self.error_hint(path, format!("no {what} named \"{name}\" ({list})"), hint)
    }
}
