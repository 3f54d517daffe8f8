//! Validation of the `series` and `joint` claims and of the named profiles a series draws.
//!
//! A profile is resolved here, once, into the predicted value at each observable of the series:
//! the observable's read-out fixes the coordinates and its model the parameters; the value comes from
//! the model's family ([`crate::family::ModelFamily::profile_value`]).

use crate::checker::Checker;
use crate::error::ScenarioError;
use crate::raw::{RawClaim, RawReference, RawSeries};
use crate::scenario::*;

/// Largest number of observables in one series (a figure stays readable).
pub const MAX_SERIES: usize = 200;

type Find<'a> = &'a dyn Fn(&str, &str) -> Result<usize, ScenarioError>;
type Reference<'a> = &'a dyn Fn(&str, &RawReference, usize) -> Result<ReferenceSpec, ScenarioError>;

/// Validates `series:` (with the claim-level `reference`, `limit` and `profile`).
pub(crate) fn series(
    ck: &Checker,
    path: &str,
    raw: &RawSeries,
    c: &RawClaim,
    (obs, models): (&[ObservableSpec], &[ModelSpec]),
    find: Find,
    reference: Reference,
) -> Result<ClaimKind, ScenarioError> {
    let p = format!("{path}.series");
    let n = raw.observables.len();
    if !(2..=MAX_SERIES).contains(&n) {
        return Err(ck.error(
            &format!("{p}.observables"),
            format!("a series needs 2 … {MAX_SERIES} observables, got {n}"),
        ));
    }
    if raw.at.len() != n {
        return Err(ck.error(
            &format!("{p}.at"),
            format!(
                "needs one value per observable: {n} observables, {} values",
                raw.at.len()
            ),
        ));
    }
    let mut idx: Vec<usize> = Vec::with_capacity(n);
    for (k, name) in raw.observables.iter().enumerate() {
        let i = find(&format!("{p}.observables[{k}]"), name)?;
        let kind = obs[i].kind;
        let ok = matches!(kind, ValueKind::Scalar { .. } | ValueKind::Event);
        if !ok {
            return Err(ck.error(
                &format!("{p}.observables[{k}]"),
                format!(
                    "a series takes numbers or events, but \"{name}\" is {}",
                    kind.describe()
                ),
            ));
        }
        if let Some(&first) = idx.first() {
            let same = matches!(
                (obs[first].kind, kind),
                (ValueKind::Scalar { .. }, ValueKind::Scalar { .. })
                    | (ValueKind::Event, ValueKind::Event)
            );
            if !same {
                return Err(ck.error(
                    &format!("{p}.observables[{k}]"),
                    format!(
                        "a series is all numbers or all events: \"{}\" is {}, \"{name}\" is {}",
                        obs[first].name,
                        obs[first].kind.describe(),
                        kind.describe()
                    ),
                ));
            }
        }
        if idx.contains(&i) {
            return Err(ck.error(
                &format!("{p}.observables[{k}]"),
                format!("\"{name}\" appears twice"),
            ));
        }
        idx.push(i);
    }
    for (k, &a) in raw.at.iter().enumerate() {
        ck.finite(&format!("{p}.at[{k}]"), a)?;
        if k > 0 && a <= raw.at[k - 1] {
            return Err(ck.error(
                &format!("{p}.at[{k}]"),
                format!("values must increase: {a} comes after {}", raw.at[k - 1]),
            ));
        }
    }
    let axis = raw.axis.clone().unwrap_or_else(|| "t".into());
    if axis.is_empty() || axis.chars().count() > 40 {
        return Err(ck.error(&format!("{p}.axis"), "must be a name of 1 … 40 characters"));
    }
    let events = obs[idx[0]].kind == ValueKind::Event;
    if events && (c.reference.is_some() || c.profile.is_some()) {
        let key = if c.reference.is_some() {
            "reference"
        } else {
            "profile"
        };
        return Err(ck.error(
            &format!("{path}.{key}"),
            format!("`{key}` goes with a series of numbers; this one is of events"),
        ));
    }
    let reference = match &c.reference {
        None => None,
        Some(RawReference::TailFromProfile(_)) => {
            return Err(ck.error(
                &format!("{path}.reference.tail-from-profile"),
                "`tail-from-profile` goes with `law-of` only",
            ))
        }
        Some(RawReference::SpeedProcessPair) => {
            return Err(ck.error(
                &format!("{path}.reference.speed-process-pair"),
                "`speed-process-pair` is a joint law: it goes with `joint`",
            ))
        }
        Some(r) => Some(reference(&format!("{path}.reference"), r, idx[0])?),
    };
    let limit = match c.limit {
        None => None,
        Some(l) => {
            let l = ck.finite(&format!("{path}.limit"), l)?;
            if events && !(0.0..=1.0).contains(&l) {
                return Err(ck.error(
                    &format!("{path}.limit"),
                    format!("the limit of a probability must be in [0, 1], got {l}"),
                ));
            }
            Some(l)
        }
    };
    if c.limit.is_some() && c.profile.is_some() {
        // The figure draws one theory line; a second one would be dropped silently.
        return Err(ck.error(
            &format!("{path}.limit"),
            "`limit` and `profile` both give the theory line of a series; give one of them",
        ));
    }
    let profile = match &c.profile {
        None => None,
        Some(name) => Some(profile(
            ck,
            &format!("{path}.profile"),
            name,
            &idx,
            obs,
            models,
        )?),
    };
    Ok(ClaimKind::Series(SeriesSpec {
        observables: idx,
        at: raw.at.clone(),
        axis,
        reference,
        limit,
        profile,
    }))
}

/// Resolves a named profile at each observable of a series (or of a `mean` claim).
pub(crate) fn profile(
    ck: &Checker,
    path: &str,
    name: &str,
    idx: &[usize],
    obs: &[ObservableSpec],
    models: &[ModelSpec],
) -> Result<ProfileSpec, ScenarioError> {
    let mut values = Vec::with_capacity(idx.len());
    for &i in idx {
        let o = &obs[i];
        let m = &models[o.model];
        let Some(profile) = Profile::ALL.into_iter().find(|p| p.name() == name) else {
            let known: Vec<&str> = Profile::ALL.iter().map(|p| p.name()).collect();
            return Err(ck.error(
                path,
                format!("unknown profile \"{name}\"; known: {}", known.join(", ")),
            ));
        };
        let needs = profile.needs();
        let v = match m.kind.family().profile_value(profile, m, o) {
            Ok(Some(v)) => v,
            Ok(None) => {
                return Err(ck.error(
                    path,
                    format!(
                        "`{name}` needs {needs}, but \"{}\" reads something else",
                        o.name
                    ),
                ))
            }
            Err(why) => return Err(ck.error(path, why)),
        };
        values.push(v);
    }
    Ok(ProfileSpec {
        name: name.to_string(),
        values,
    })
}

/// Validates `joint: [a, b]` (with the claim-level `reference`).
pub(crate) fn joint(
    ck: &Checker,
    path: &str,
    pair: &[String; 2],
    c: &RawClaim,
    obs: &[ObservableSpec],
    models: &[ModelSpec],
    find: Find,
) -> Result<ClaimKind, ScenarioError> {
    let mut idx = [0usize; 2];
    for (k, name) in pair.iter().enumerate() {
        let i = find(&format!("{path}.joint[{k}]"), name)?;
        if !matches!(obs[i].kind, ValueKind::Scalar { .. }) {
            return Err(ck.error(
                &format!("{path}.joint[{k}]"),
                format!(
                    "`joint` takes two numbers, but \"{name}\" is {}",
                    obs[i].kind.describe()
                ),
            ));
        }
        idx[k] = i;
    }
    if idx[0] == idx[1] {
        return Err(ck.error(
            &format!("{path}.joint"),
            format!("pairs \"{}\" with itself", pair[0]),
        ));
    }
    if obs[idx[0]].model != obs[idx[1]].model {
        return Err(ck.error(
            &format!("{path}.joint"),
            format!(
                "a joint law needs two read-outs of one model: \"{}\" is of \"{}\", \"{}\" of \"{}\"",
                pair[0], models[obs[idx[0]].model].name, pair[1], models[obs[idx[1]].model].name
            ),
        ));
    }
    let reference = match &c.reference {
        None => None,
        Some(RawReference::SpeedProcessPair) => Some(JointReference::SpeedProcessPair),
        Some(_) => {
            return Err(ck.error(
                &format!("{path}.reference"),
                "a `joint` claim takes the joint law `speed-process-pair` as its reference",
            ))
        }
    };
    if c.limit.is_some() || c.profile.is_some() {
        let key = if c.limit.is_some() {
            "limit"
        } else {
            "profile"
        };
        return Err(ck.error(
            &format!("{path}.{key}"),
            format!("`{key}` does not go with `joint`"),
        ));
    }
    Ok(ClaimKind::Joint(idx[0], idx[1], reference))
}
