//! Reference laws of `law-of`, `describe` and `series` claims: their CDFs and their printed names.

use crate::family::ValueKey;
use crate::scenario::ReferenceSpec;

/// The reference CDF of a one-dimensional reference law (a step function for a table of numbers).
pub fn reference_cdf(r: &ReferenceSpec) -> Option<Box<dyn Fn(f64) -> f64>> {
    match *r {
        ReferenceSpec::Table(ref t) => {
            // A numeric table's CDF: a step function (cells are sorted by value).
            let steps: Vec<(f64, f64)> = t
                .cells
                .iter()
                .map(|(k, p)| match k {
                    ValueKey::Number(x) => Some((x.0, *p)),
                    ValueKey::Set(_)
                    | ValueKey::Event(_)
                    | ValueKey::Sequence(_)
                    | ValueKey::Tuple(_) => None,
                })
                .collect::<Option<_>>()?;
            Some(Box::new(move |x| {
                steps
                    .iter()
                    .take_while(|(v, _)| *v <= x)
                    .map(|(_, p)| p)
                    .sum()
            }))
        }
        ReferenceSpec::Uniform(a, b) => {
            Some(Box::new(move |x| ((x - a) / (b - a)).clamp(0.0, 1.0)))
        }
        ReferenceSpec::Normal(m, sd) => {
            Some(Box::new(move |x| motley_stats::normal_sf(-(x - m) / sd)))
        }
        ReferenceSpec::TracyWidomGue => {
            let tw = motley_reference::TracyWidom::gue();
            Some(Box::new(move |x| tw.cdf(x)))
        }
        ReferenceSpec::TracyWidomGoe => {
            let tw = motley_reference::TracyWidom::goe();
            Some(Box::new(move |x| tw.cdf(x)))
        }
        ReferenceSpec::SixVertexExitSpeed(kappa) => {
            let law = motley_reference::SixVertexStep::from_kappa(kappa).ok()?;
            Some(Box::new(move |x| {
                1.0 - law.exit_speed_tail(x).unwrap_or(0.0)
            }))
        }
        ReferenceSpec::TailFromProfile(_) => None,
    }
}

/// The reference law's name as reports print it.
pub fn reference_name(r: &ReferenceSpec) -> String {
    match *r {
        ReferenceSpec::Table(ref t) => format!("the stated table ({} values)", t.cells.len()),
        ReferenceSpec::Uniform(a, b) => format!("Uniform[{a}, {b}]"),
        ReferenceSpec::Normal(m, sd) => format!("Normal(mean {m}, sd {sd})"),
        ReferenceSpec::TailFromProfile(_) => "tail from the profile".into(),
        ReferenceSpec::TracyWidomGue => "Tracy–Widom GUE".into(),
        ReferenceSpec::TracyWidomGoe => "Tracy–Widom GOE".into(),
        ReferenceSpec::SixVertexExitSpeed(k) => format!("six-vertex exit speed (κ = {k:.4})"),
    }
}
