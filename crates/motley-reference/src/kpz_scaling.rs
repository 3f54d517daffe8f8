//! Fluctuation scalings that map a raw count from a simulation to a variable converging in law to
//! the Tracy–Widom GUE distribution F₂.
//!
//! # Formula
//! * TASEP/ASEP step data, N = number of particles at sites > ξvt (v = p − q, |ξ| < 1):
//!   (vt(1 − ξ)²/4 − N)/(2^{−4/3} (1 − ξ²)^{2/3} (vt)^{1/3}) → F₂. At ξ = 0 this is
//!   (t/4 − N_t)/(2^{−4/3} t^{1/3}) (Johansson 2000, TASEP); ASEP by time rescaling (Tracy and
//!   Widom 2009). The ξ ≠ 0 constants follow from Johansson's theorem for the last-passage time
//!   at a general direction; here they are checked as the κ ↓ 1 limit of the six-vertex scale.
//! * Six-vertex step boundary at (x, y) in the curved region:
//!   (L·h(x, y) − H(Lx, Ly))/(σ(x, y) L^{1/3}) → F₂, with σ from
//!   [`SixVertexStep::fluctuation_scale`] (Borodin, Corwin and Gorin 2016).
//!
//! # Domain of validity
//! Limits in law as t → ∞ (or L → ∞). The approach is slow: means and variances carry biases of
//! relative order t^{−1/3}, so a finite-size sample is not expected to pass a KS test against F₂
//! at large sample sizes; compare the trend over t instead.

use crate::error::ReferenceError;
use crate::six_vertex_step::SixVertexStep;
use crate::tasep_step::TasepStep;

/// Centring and scaling of the TASEP/ASEP step particle count at scaled position ξ.
///
/// # Examples
/// ```
/// use motley_reference::{TasepStep, TasepStepFluctuation};
/// let f = TasepStepFluctuation::new(TasepStep::tasep(), 0.0).unwrap();
/// // t = 1000: centre 250, scale 2^{-4/3} · 10 ≈ 3.97.
/// assert_eq!(f.centre(1000.0), 250.0);
/// assert!((f.scaled(250.0 - 3.968_502_629_920_499, 1000.0) - 1.0).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TasepStepFluctuation {
    model: TasepStep,
    xi: f64,
}

impl TasepStepFluctuation {
    /// Scaling for the count of particles at sites > ξ·(p − q)t.
    ///
    /// # Errors
    /// [`ReferenceError::OutsideFan`] unless −1 < ξ < 1.
    pub fn new(model: TasepStep, xi: f64) -> Result<Self, ReferenceError> {
        if !(xi > -1.0 && xi < 1.0) {
            return Err(ReferenceError::OutsideFan { xi });
        }
        Ok(TasepStepFluctuation { model, xi })
    }

    /// The site x = ξ (p − q) t whose right-hand count is measured (not rounded).
    pub fn position(&self, t: f64) -> f64 {
        self.xi * self.model.speed() * t
    }

    /// The centring vt(1 − ξ)²/4.
    pub fn centre(&self, t: f64) -> f64 {
        self.model.particles_right_of(self.position(t), t)
    }

    /// The scale 2^{−4/3} (1 − ξ²)^{2/3} (vt)^{1/3}.
    pub fn scale(&self, t: f64) -> f64 {
        let vt = self.model.speed() * t;
        2f64.powf(-4.0 / 3.0) * (1.0 - self.xi * self.xi).powf(2.0 / 3.0) * vt.cbrt()
    }

    /// (centre − count)/scale: the variable that tends to F₂.
    pub fn scaled(&self, count: f64, t: f64) -> f64 {
        (self.centre(t) - count) / self.scale(t)
    }
}

/// Centring and scaling of the six-vertex step-boundary height at a point of the curved region.
///
/// # Examples
/// ```
/// use motley_reference::{SixVertexFluctuation, SixVertexStep};
/// let m = SixVertexStep::from_weights(0.25, 0.5).unwrap(); // κ = 1.5
/// let f = SixVertexFluctuation::new(m, 1.0, 1.0).unwrap();
/// let l = 1000.0;
/// assert!((f.scaled(f.centre(l), l)).abs() < 1e-12);
/// assert!(SixVertexFluctuation::new(m, 0.5, 1.0).is_err()); // x < y/κ: flat region
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SixVertexFluctuation {
    h: f64,
    sigma: f64,
}

impl SixVertexFluctuation {
    /// At the macroscopic point (x, y) (the lattice point is (Lx, Ly)).
    ///
    /// # Errors
    /// As [`SixVertexStep::fluctuation_scale`].
    pub fn new(model: SixVertexStep, x: f64, y: f64) -> Result<Self, ReferenceError> {
        let sigma = model.fluctuation_scale(x, y)?;
        Ok(SixVertexFluctuation {
            h: model.height(x, y),
            sigma,
        })
    }

    /// σ(x, y).
    pub fn sigma(&self) -> f64 {
        self.sigma
    }

    /// The centring L·h(x, y).
    pub fn centre(&self, l: f64) -> f64 {
        l * self.h
    }

    /// The scale σ L^{1/3}.
    pub fn scale(&self, l: f64) -> f64 {
        self.sigma * l.cbrt()
    }

    /// (L·h − H)/(σ L^{1/3}).
    pub fn scaled(&self, height: f64, l: f64) -> f64 {
        (self.centre(l) - height) / self.scale(l)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn johansson_constants() {
        let f = TasepStepFluctuation::new(TasepStep::tasep(), 0.0).unwrap();
        for t in [250.0, 1000.0, 4000.0] {
            assert_eq!(f.centre(t), t / 4.0);
            let want = 2f64.powf(-4.0 / 3.0) * f64::cbrt(t);
            assert!((f.scale(t) - want).abs() < 1e-12 * want);
            assert!((f.scaled(t / 4.0 - 2.0 * want, t) - 2.0).abs() < 1e-12);
        }
        // ASEP: the TASEP scaling at time (p − q)t.
        let a = TasepStepFluctuation::new(TasepStep::asep(0.9, 0.4).unwrap(), 0.0).unwrap();
        assert!((a.scale(1000.0) - f.scale(500.0)).abs() < 1e-12);
        assert!((a.centre(1000.0) - f.centre(500.0)).abs() < 1e-12);
        assert!(TasepStepFluctuation::new(TasepStep::tasep(), 1.0).is_err());
        assert!(TasepStepFluctuation::new(TasepStep::tasep(), f64::NAN).is_err());
    }

    #[test]
    fn six_vertex_matches_tasep_off_centre() {
        // κ = 1 + δ: the six-vertex point (y(1 + δξ), y) with y = t/δ is TASEP at (ξt, t).
        let delta = 1e-7;
        let t = 300.0;
        let xi = 0.4;
        let sv = SixVertexFluctuation::new(
            SixVertexStep::from_kappa(1.0 + delta).unwrap(),
            (t / delta) * (1.0 + delta * xi),
            t / delta,
        )
        .unwrap();
        let ta = TasepStepFluctuation::new(TasepStep::tasep(), xi).unwrap();
        assert!((sv.scale(1.0) - ta.scale(t)).abs() < 1e-5 * ta.scale(t));
        assert!((sv.centre(1.0) - ta.centre(t)).abs() < 1e-5 * ta.centre(t));
    }
}
