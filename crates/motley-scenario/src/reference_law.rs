//! Reference laws of `law-of`, `describe` and `series` claims: their CDFs and their printed names.

use crate::scenario::ReferenceSpec;

/// The reference CDF of a continuous reference law.
pub fn reference_cdf(r: &ReferenceSpec) -> Option<Box<dyn Fn(f64) -> f64>> {
    match *r {
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
        ReferenceSpec::Uniform(a, b) => format!("Uniform[{a}, {b}]"),
        ReferenceSpec::Normal(m, sd) => format!("Normal(mean {m}, sd {sd})"),
        ReferenceSpec::TailFromProfile(_) => "tail from the profile".into(),
        ReferenceSpec::TracyWidomGue => "Tracy–Widom GUE".into(),
        ReferenceSpec::TracyWidomGoe => "Tracy–Widom GOE".into(),
        ReferenceSpec::SixVertexExitSpeed(k) => format!("six-vertex exit speed (κ = {k:.4})"),
    }
}
