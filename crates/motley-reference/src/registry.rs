//! Named reference laws and profiles, as scenarios refer to them.
//!
//! # Names
//! Laws (one-dimensional, with a CDF):
//! * `tracy-widom-gue` — F₂; see [`TracyWidom`] (Tracy and Widom 1994; Bornemann 2010 method).
//!   Valid on all of ℝ; the limit law of [`crate::TasepStepFluctuation`] and
//!   [`crate::SixVertexFluctuation`] variables.
//! * `tracy-widom-goe` — F₁ (Ferrari and Spohn 2005 form, Bornemann 2010 method).
//! * `uniform` — Uniform[lo, hi]; default [−1, 1].
//! * `second-class-speed` — Uniform[−(p − q), p − q], the speed of a second-class particle from
//!   step data (Ferrari and Kipnis 1995); default TASEP, [−1, 1]. Valid as t → ∞.
//! * `six-vertex-exit-speed` — the exit speed v = X/y of the second-class path entering row 1
//!   under the step boundary: P(v > s) = (κ − √(κs))/(κ − 1) on [1/κ, κ] (from the limit shape
//!   of Borodin, Corwin and Gorin 2016; see [`crate::SixVertexStep`]). Needs b1 < b2; no default.
//!
//! Profiles (functions of a position and a time or row):
//! * `tasep-step-density` — ρ(x, t) (Rost 1981), ASEP by t → (p − q)t.
//! * `tasep-step-count` — particles at sites > x at time t.
//! * `six-vertex-step-height` — L·h(x/L, y/L) at lattice point (x, y) (Borodin, Corwin and
//!   Gorin 2016).
//! * `six-vertex-step-density` — −∂h/∂x.

use crate::error::ReferenceError;
use crate::six_vertex_step::SixVertexStep;
use crate::tasep_step::TasepStep;
use crate::tracy_widom::TracyWidom;

/// Every law name [`law_by_name`] knows, including those that need parameters.
pub const LAW_NAMES: [&str; 5] = [
    "tracy-widom-gue",
    "tracy-widom-goe",
    "uniform",
    "second-class-speed",
    "six-vertex-exit-speed",
];

/// Every profile name [`profile_by_name`] knows.
pub const PROFILE_NAMES: [&str; 4] = [
    "tasep-step-density",
    "tasep-step-count",
    "six-vertex-step-height",
    "six-vertex-step-density",
];

/// A one-dimensional reference law with a CDF.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum ReferenceLaw {
    /// Tracy–Widom GUE, F₂.
    TracyWidomGue,
    /// Tracy–Widom GOE, F₁.
    TracyWidomGoe,
    /// Uniform[lo, hi] (also the second-class speed law with lo = −(p − q), hi = p − q).
    Uniform {
        /// Lower end.
        lo: f64,
        /// Upper end.
        hi: f64,
    },
    /// Exit speed of the six-vertex second-class path, κ > 1 (built by
    /// [`ReferenceLaw::six_vertex_exit_speed`]; a hand-built κ ≤ 1 gives the point mass at 1).
    SixVertexExitSpeed {
        /// κ = (1 − b1)/(1 − b2) > 1.
        kappa: f64,
    },
}

impl ReferenceLaw {
    /// Uniform[lo, hi].
    ///
    /// # Errors
    /// [`ReferenceError::NotFinite`] or [`ReferenceError::EmptyInterval`].
    pub fn uniform(lo: f64, hi: f64) -> Result<Self, ReferenceError> {
        for (name, v) in [("lo", lo), ("hi", hi)] {
            if !v.is_finite() {
                return Err(ReferenceError::NotFinite { name, value: v });
            }
        }
        if lo >= hi {
            return Err(ReferenceError::EmptyInterval { lo, hi });
        }
        Ok(ReferenceLaw::Uniform { lo, hi })
    }

    /// The second-class speed law Uniform[−(p − q), p − q] (Ferrari and Kipnis 1995).
    ///
    /// # Errors
    /// As [`TasepStep::asep`].
    pub fn second_class_speed(p: f64, q: f64) -> Result<Self, ReferenceError> {
        let v = TasepStep::asep(p, q)?.speed();
        Ok(ReferenceLaw::Uniform { lo: -v, hi: v })
    }

    /// The six-vertex exit-speed law for weights (b1, b2).
    ///
    /// # Errors
    /// As [`SixVertexStep::from_weights`], and [`ReferenceError::NoCurvedRegion`] if b1 ≥ b2.
    pub fn six_vertex_exit_speed(b1: f64, b2: f64) -> Result<Self, ReferenceError> {
        let m = SixVertexStep::from_weights(b1, b2)?;
        if !m.has_curved_region() {
            return Err(ReferenceError::NoCurvedRegion { kappa: m.kappa() });
        }
        Ok(ReferenceLaw::SixVertexExitSpeed { kappa: m.kappa() })
    }

    /// The registry name.
    pub fn name(&self) -> &'static str {
        match self {
            ReferenceLaw::TracyWidomGue => "tracy-widom-gue",
            ReferenceLaw::TracyWidomGoe => "tracy-widom-goe",
            ReferenceLaw::Uniform { .. } => "uniform",
            ReferenceLaw::SixVertexExitSpeed { .. } => "six-vertex-exit-speed",
        }
    }

    /// P(X ≤ x).
    pub fn cdf(&self, x: f64) -> f64 {
        match *self {
            ReferenceLaw::TracyWidomGue => TracyWidom::gue().cdf(x),
            ReferenceLaw::TracyWidomGoe => TracyWidom::goe().cdf(x),
            ReferenceLaw::Uniform { lo, hi } => ((x - lo) / (hi - lo)).clamp(0.0, 1.0),
            ReferenceLaw::SixVertexExitSpeed { kappa } => {
                1.0 - SixVertexStep { kappa }.flux(x, 1.0)
            }
        }
    }

    /// P(X > x), with relative precision in the right tail for the Tracy–Widom laws.
    pub fn sf(&self, x: f64) -> f64 {
        match *self {
            ReferenceLaw::TracyWidomGue => TracyWidom::gue().sf(x),
            ReferenceLaw::TracyWidomGoe => TracyWidom::goe().sf(x),
            ReferenceLaw::Uniform { lo, hi } => ((hi - x) / (hi - lo)).clamp(0.0, 1.0),
            ReferenceLaw::SixVertexExitSpeed { kappa } => SixVertexStep { kappa }.flux(x, 1.0),
        }
    }

    /// The density.
    pub fn pdf(&self, x: f64) -> f64 {
        match *self {
            ReferenceLaw::TracyWidomGue => TracyWidom::gue().pdf(x),
            ReferenceLaw::TracyWidomGoe => TracyWidom::goe().pdf(x),
            ReferenceLaw::Uniform { lo, hi } => {
                if (lo..=hi).contains(&x) {
                    1.0 / (hi - lo)
                } else {
                    0.0
                }
            }
            ReferenceLaw::SixVertexExitSpeed { kappa } => {
                // d/ds (√(κs) − κ)/(κ − 1)... = √κ / (2√s (κ − 1)) on [1/κ, κ]
                if x > 1.0 / kappa && x < kappa {
                    kappa.sqrt() / (2.0 * x.sqrt() * (kappa - 1.0))
                } else {
                    0.0
                }
            }
        }
    }
}

/// The law with this name and its default parameters, or `None` for an unknown name or one
/// without defaults (`six-vertex-exit-speed`, which needs b1 and b2).
///
/// # Examples
/// ```
/// use motley_reference::{law_by_name, ReferenceLaw};
/// let f2 = law_by_name("tracy-widom-gue").unwrap();
/// assert!((f2.cdf(-1.7711) - 0.5).abs() < 0.06);
/// assert_eq!(law_by_name("second-class-speed"), Some(ReferenceLaw::Uniform { lo: -1.0, hi: 1.0 }));
/// assert_eq!(law_by_name("tracy-widom"), None);
/// ```
pub fn law_by_name(name: &str) -> Option<ReferenceLaw> {
    match name {
        "tracy-widom-gue" => Some(ReferenceLaw::TracyWidomGue),
        "tracy-widom-goe" => Some(ReferenceLaw::TracyWidomGoe),
        "uniform" | "second-class-speed" => Some(ReferenceLaw::Uniform { lo: -1.0, hi: 1.0 }),
        _ => None,
    }
}

/// Which profile a name refers to.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum ProfileKind {
    /// `tasep-step-density`.
    TasepStepDensity,
    /// `tasep-step-count`.
    TasepStepCount,
    /// `six-vertex-step-height`.
    SixVertexStepHeight,
    /// `six-vertex-step-density`.
    SixVertexStepDensity,
}

/// The profile kind with this name, if any.
///
/// # Errors
/// [`ReferenceError::UnknownName`] listing the known names.
pub fn profile_by_name(name: &str) -> Result<ProfileKind, ReferenceError> {
    match name {
        "tasep-step-density" => Ok(ProfileKind::TasepStepDensity),
        "tasep-step-count" => Ok(ProfileKind::TasepStepCount),
        "six-vertex-step-height" => Ok(ProfileKind::SixVertexStepHeight),
        "six-vertex-step-density" => Ok(ProfileKind::SixVertexStepDensity),
        _ => Err(ReferenceError::UnknownName {
            name: name.to_string(),
            known: PROFILE_NAMES.join(", "),
        }),
    }
}

/// A profile bound to its model, evaluated at lattice coordinates.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum ReferenceProfile {
    /// ρ(x, t).
    TasepStepDensity(TasepStep),
    /// Particles at sites > x at time t.
    TasepStepCount(TasepStep),
    /// Height H(x, y) ≈ h(x, y) (homogeneous of degree 1, so lattice coordinates may be used
    /// directly).
    SixVertexStepHeight(SixVertexStep),
    /// −∂h/∂x at (x, y).
    SixVertexStepDensity(SixVertexStep),
}

impl ReferenceProfile {
    /// Binds a TASEP/ASEP profile kind to its model.
    ///
    /// # Errors
    /// [`ReferenceError::UnknownName`] if `kind` is a six-vertex profile.
    pub fn exclusion(kind: ProfileKind, model: TasepStep) -> Result<Self, ReferenceError> {
        match kind {
            ProfileKind::TasepStepDensity => Ok(ReferenceProfile::TasepStepDensity(model)),
            ProfileKind::TasepStepCount => Ok(ReferenceProfile::TasepStepCount(model)),
            _ => Err(mismatch(kind, "tasep-step-density, tasep-step-count")),
        }
    }

    /// Binds a six-vertex profile kind to its model.
    ///
    /// # Errors
    /// [`ReferenceError::UnknownName`] if `kind` is a TASEP profile.
    pub fn six_vertex(kind: ProfileKind, model: SixVertexStep) -> Result<Self, ReferenceError> {
        match kind {
            ProfileKind::SixVertexStepHeight => Ok(ReferenceProfile::SixVertexStepHeight(model)),
            ProfileKind::SixVertexStepDensity => Ok(ReferenceProfile::SixVertexStepDensity(model)),
            _ => Err(mismatch(
                kind,
                "six-vertex-step-height, six-vertex-step-density",
            )),
        }
    }

    /// The value at (position, time) for exclusion profiles, or (x, y) for six-vertex ones.
    pub fn value(&self, a: f64, b: f64) -> f64 {
        match self {
            ReferenceProfile::TasepStepDensity(m) => m.density(a, b),
            ReferenceProfile::TasepStepCount(m) => m.particles_right_of(a, b),
            ReferenceProfile::SixVertexStepHeight(m) => m.height(a, b),
            ReferenceProfile::SixVertexStepDensity(m) => m.density(a, b),
        }
    }

    /// The registry name.
    pub fn name(&self) -> &'static str {
        match self {
            ReferenceProfile::TasepStepDensity(_) => "tasep-step-density",
            ReferenceProfile::TasepStepCount(_) => "tasep-step-count",
            ReferenceProfile::SixVertexStepHeight(_) => "six-vertex-step-height",
            ReferenceProfile::SixVertexStepDensity(_) => "six-vertex-step-density",
        }
    }
}

fn mismatch(kind: ProfileKind, known: &str) -> ReferenceError {
    let name = PROFILE_NAMES[kind as usize];
    ReferenceError::UnknownName {
        name: name.to_string(),
        known: known.to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_name_round_trips() {
        for name in PROFILE_NAMES {
            let kind = profile_by_name(name).unwrap();
            let p = ReferenceProfile::exclusion(kind, TasepStep::tasep())
                .or_else(|_| {
                    ReferenceProfile::six_vertex(kind, SixVertexStep::from_kappa(2.0).unwrap())
                })
                .unwrap();
            assert_eq!(p.name(), name);
        }
        for name in LAW_NAMES {
            match law_by_name(name) {
                Some(law) if name != "second-class-speed" => assert_eq!(law.name(), name),
                Some(law) => assert_eq!(law.name(), "uniform"),
                None => assert_eq!(name, "six-vertex-exit-speed"),
            }
        }
        let err = profile_by_name("six-vertex-step").unwrap_err().to_string();
        assert!(err.contains("six-vertex-step-height"), "{err}");
        assert!(
            ReferenceProfile::exclusion(ProfileKind::SixVertexStepHeight, TasepStep::tasep())
                .is_err()
        );
    }

    #[test]
    fn laws_are_distributions() {
        let laws = [
            ReferenceLaw::TracyWidomGue,
            ReferenceLaw::TracyWidomGoe,
            ReferenceLaw::uniform(-0.5, 2.0).unwrap(),
            ReferenceLaw::second_class_speed(0.7, 0.2).unwrap(),
            ReferenceLaw::six_vertex_exit_speed(0.2, 0.6).unwrap(),
        ];
        let gl = crate::GaussLegendre::new(60);
        for law in laws {
            assert!(law.cdf(-20.0) == 0.0 && law.cdf(20.0) == 1.0, "{law:?}");
            for x in [-3.0, -1.0, -0.2, 0.4, 1.1, 2.5] {
                assert!((law.cdf(x) + law.sf(x) - 1.0).abs() < 1e-14, "{law:?}");
                // cdf(x) = ∫_{-10}^x pdf, in pieces of length ≤ 1/2 split at the kinks.
                let kinks: Vec<f64> = match law {
                    ReferenceLaw::Uniform { lo, hi } => vec![lo, hi],
                    ReferenceLaw::SixVertexExitSpeed { kappa } => vec![1.0 / kappa, kappa],
                    _ => vec![],
                };
                let mut cuts: Vec<f64> = (0..100).map(|i| -10.0 + 0.5 * i as f64).collect();
                cuts.extend(kinks);
                cuts.retain(|&c| c < x);
                cuts.push(x);
                cuts.sort_by(f64::total_cmp);
                let integral: f64 = cuts
                    .windows(2)
                    .map(|w| gl.integrate(w[0], w[1], |u| law.pdf(u)))
                    .sum();
                assert!(
                    (integral - law.cdf(x)).abs() < 1e-12,
                    "{law:?} {x}: {integral} {}",
                    law.cdf(x)
                );
            }
        }
        assert!(ReferenceLaw::six_vertex_exit_speed(0.6, 0.2).is_err());
        assert!(ReferenceLaw::uniform(1.0, 1.0).is_err());
    }
}
