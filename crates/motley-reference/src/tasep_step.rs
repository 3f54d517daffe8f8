//! Hydrodynamic limit of TASEP (and ASEP) from step initial data: density and particle-count
//! profiles.
//!
//! # Conventions
//! Step initial data: every site x ≤ 0 occupied, every site x ≥ 1 empty. Particles jump right at
//! rate p and left at rate q (TASEP: p = 1, q = 0), so the macroscopic speed is v = p − q.
//!
//! # Formula
//! Rost (1981) for TASEP; for ASEP the same profile with t replaced by (p − q) t (the Euler-scale
//! hydrodynamic limit depends only on the flux v ρ(1 − ρ)):
//! * density ρ(x, t) = 1 for x ≤ −vt, (1 − x/(vt))/2 for |x| ≤ vt, 0 for x ≥ vt;
//! * particles strictly to the right of x: N(x, t) ≈ vt · n(x/(vt)), n(ξ) = −ξ for ξ ≤ −1,
//!   (1 − ξ)²/4 for |ξ| ≤ 1, 0 for ξ ≥ 1. In particular N(0, t) ≈ vt/4.
//!
//! # Domain of validity
//! Law of large numbers: N(x t, t)/t → v n(x/v) almost surely as t → ∞, for fixed x/t. The
//! fluctuations are of order t^{1/3} (see [`crate::TasepStepFluctuation`]).

use crate::error::ReferenceError;

/// The TASEP/ASEP step-initial-data limit profile with speed v = p − q > 0.
///
/// # Examples
/// ```
/// use motley_reference::TasepStep;
/// let tasep = TasepStep::tasep();
/// assert_eq!(tasep.density(0.0, 100.0), 0.5);
/// assert_eq!(tasep.particles_right_of(0.0, 100.0), 25.0);
/// let asep = TasepStep::asep(0.75, 0.25).unwrap();
/// assert_eq!(asep.particles_right_of(0.0, 100.0), 12.5);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TasepStep {
    speed: f64,
}

impl TasepStep {
    /// TASEP: p = 1, q = 0.
    pub fn tasep() -> Self {
        TasepStep { speed: 1.0 }
    }

    /// ASEP with right rate p and left rate q; time is rescaled by p − q.
    ///
    /// # Errors
    /// [`ReferenceError::NotFinite`] for non-finite rates, [`ReferenceError::NotPositive`] if
    /// p − q ≤ 0 (for p ≤ q the step does not spread on the scale x ∝ t: it is frozen for
    /// p < q and spreads diffusively for p = q; no profile of this form applies). Negative rates
    /// give [`ReferenceError::NotPositive`] too.
    pub fn asep(p: f64, q: f64) -> Result<Self, ReferenceError> {
        for (name, v) in [("p", p), ("q", q)] {
            if !v.is_finite() {
                return Err(ReferenceError::NotFinite { name, value: v });
            }
        }
        if q < 0.0 {
            return Err(ReferenceError::NotPositive {
                name: "q",
                value: q,
            });
        }
        let speed = p - q;
        if speed <= 0.0 {
            return Err(ReferenceError::NotPositive {
                name: "p - q",
                value: speed,
            });
        }
        Ok(TasepStep { speed })
    }

    /// The speed v = p − q.
    pub fn speed(&self) -> f64 {
        self.speed
    }

    /// Limit density at position `x` (in sites) and time `t` > 0; for t ≤ 0 the initial step
    /// (1 for x ≤ 0, 0 for x > 0).
    pub fn density(&self, x: f64, t: f64) -> f64 {
        let vt = self.speed * t;
        if vt <= 0.0 {
            return if x <= 0.0 { 1.0 } else { 0.0 };
        }
        let xi = x / vt;
        if xi <= -1.0 {
            1.0
        } else if xi >= 1.0 {
            0.0
        } else {
            0.5 * (1.0 - xi)
        }
    }

    /// Limit of the number of particles at sites > x at time t: vt · n(x/(vt)) (the integral of
    /// [`TasepStep::density`] over (x, ∞)). For t ≤ 0: max(−x, 0).
    pub fn particles_right_of(&self, x: f64, t: f64) -> f64 {
        let vt = self.speed * t;
        if vt <= 0.0 {
            return (-x).max(0.0);
        }
        vt * scaled_count(x / vt)
    }
}

/// n(ξ) = −ξ (ξ ≤ −1), (1 − ξ)²/4 (|ξ| ≤ 1), 0 (ξ ≥ 1).
fn scaled_count(xi: f64) -> f64 {
    if xi <= -1.0 {
        -xi
    } else if xi >= 1.0 {
        0.0
    } else {
        0.25 * (1.0 - xi) * (1.0 - xi)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn count_is_the_integral_of_the_density() {
        let m = TasepStep::asep(0.8, 0.3).unwrap();
        let t = 40.0;
        for x in [-30.0, -20.0, -7.5, 0.0, 3.0, 19.0, 25.0] {
            // ∫_x^∞ ρ by the midpoint rule on a fine grid up to vt.
            let n = 200_000;
            let hi = 25.0f64;
            let h = (hi - x) / n as f64;
            let integral: f64 = (0..n)
                .map(|i| m.density(x + (i as f64 + 0.5) * h, t) * h)
                .sum();
            let want = if x < hi { integral } else { 0.0 };
            assert!((m.particles_right_of(x, t) - want).abs() < 1e-6, "{x}");
        }
    }

    #[test]
    fn values_and_edges() {
        let m = TasepStep::tasep();
        assert_eq!(m.density(-10.0, 10.0), 1.0);
        assert_eq!(m.density(10.0, 10.0), 0.0);
        assert_eq!(m.density(5.0, 10.0), 0.25);
        assert_eq!(m.particles_right_of(-10.0, 10.0), 10.0);
        assert_eq!(m.particles_right_of(-15.0, 10.0), 15.0);
        assert_eq!(m.particles_right_of(0.0, 8.0), 2.0);
        assert_eq!(m.density(0.0, 0.0), 1.0);
        assert_eq!(m.density(0.5, 0.0), 0.0);
        // Near miss: the ASEP profile is the TASEP one at time (p − q)t, not at time t.
        let a = TasepStep::asep(0.7, 0.3).unwrap();
        assert!((a.particles_right_of(0.0, 10.0) - m.particles_right_of(0.0, 4.0)).abs() < 1e-14);
        assert!((a.particles_right_of(0.0, 10.0) - m.particles_right_of(0.0, 10.0)).abs() > 1.0);
        assert!(TasepStep::asep(0.3, 0.3).is_err());
        assert!(TasepStep::asep(0.2, 0.3).is_err());
        assert!(TasepStep::asep(f64::NAN, 0.3).is_err());
        assert!(TasepStep::asep(1.0, -0.1).is_err());
    }
}
