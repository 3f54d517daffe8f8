//! Limit shape of the stochastic six-vertex model in the quadrant with step boundary data, and
//! the derived laws: horizontal density, vertical flux, and the exit speed of a second-class
//! path.
//!
//! # Conventions
//! Paths enter the quadrant {x ≥ 0, y ≥ 1} from the left boundary, one in every row; none from
//! the bottom. H(x, y) is the number of paths crossing the horizontal line at height y strictly
//! to the right of x. The weights b1, b2 enter only through κ = (1 − b1)/(1 − b2).
//!
//! # Formula
//! Borodin, Corwin and Gorin (2016), for κ > 1: H(Lx, Ly)/L → h(x, y) with
//! * h = y − x for 0 ≤ x ≤ y/κ (the full region),
//! * h = (√(κy) − √x)²/(κ − 1) for y/κ ≤ x ≤ κy (the curved region),
//! * h = 0 for x ≥ κy (the empty region).
//!
//! Re-derived here as the entropy solution of ∂_y ρ + ∂_x j(ρ) = 0 with the stationary flux
//! j(ρ) = κρ/(1 + (κ − 1)ρ), density 1 entering at x = 0 and density 0 at y = 0: for κ > 1, j is
//! concave and the solution is the rarefaction fan j'(ρ) = x/y, i.e.
//! ρ = −∂h/∂x = (√(κy/x) − 1)/(κ − 1), and ∂h/∂y = j(ρ) = (κ − √(κx/y))/(κ − 1).
//!
//! **κ ≤ 1 (b1 ≥ b2).** Then j is convex (κ < 1) or linear (κ = 1): the characteristics from the
//! two sides collide and the solution is a shock with the Rankine–Hugoniot speed
//! (j(1) − j(0))/(1 − 0) = 1: h = (y − x)₊, density 1{x < y}. There is no curved region, no
//! Tracy–Widom fluctuation scale and no exit-speed law (the second-class path follows the shock,
//! v → 1); those functions return [`ReferenceError::NoCurvedRegion`]. This case is our own
//! derivation, not taken from the paper.
//!
//! # Exit speed of a second-class path
//! Colour the path entering in row 1 second class. Removing it leaves the step boundary shifted
//! up by one row, so, by the usual coupling, P(X_y > x) = E H(x, y) − E H(x, y − 1) → ∂h/∂y.
//! Hence v = X/y has the limiting tail P(v > s) = (κ − √(κs))/(κ − 1) on [1/κ, κ] (1 below, 0
//! above): the vertical flux at (s, 1).

use crate::error::ReferenceError;

/// The six-vertex step-boundary limit shape for a given κ.
///
/// # Examples
/// ```
/// use motley_reference::SixVertexStep;
/// let m = SixVertexStep::from_weights(0.3, 0.6).unwrap(); // κ = 0.7/0.4 = 1.75
/// assert!((m.kappa() - 1.75).abs() < 1e-15);
/// assert_eq!(m.height(0.2, 1.0), 0.8); // full region x ≤ y/κ
/// assert_eq!(m.height(2.0, 1.0), 0.0); // empty region x ≥ κy
/// assert!(m.is_curved(1.0, 1.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SixVertexStep {
    pub(crate) kappa: f64,
}

impl SixVertexStep {
    /// From the vertex weights: κ = (1 − b1)/(1 − b2).
    ///
    /// # Errors
    /// [`ReferenceError::ProbabilityOutOfRange`] if b1 or b2 ∉ [0, 1];
    /// [`ReferenceError::NotPositive`] (for `1 - b2`) if b2 = 1, where κ is undefined.
    pub fn from_weights(b1: f64, b2: f64) -> Result<Self, ReferenceError> {
        for (name, v) in [("b1", b1), ("b2", b2)] {
            if !(0.0..=1.0).contains(&v) {
                return Err(ReferenceError::ProbabilityOutOfRange { name, value: v });
            }
        }
        if b2 == 1.0 {
            return Err(ReferenceError::NotPositive {
                name: "1 - b2",
                value: 0.0,
            });
        }
        Ok(SixVertexStep {
            kappa: (1.0 - b1) / (1.0 - b2),
        })
    }

    /// Directly from κ ≥ 0.
    ///
    /// # Errors
    /// [`ReferenceError::NotFinite`] or [`ReferenceError::NotPositive`] for κ not finite or ≤ 0
    /// (κ = 0 means b1 = 1: paths never turn, a degenerate model).
    pub fn from_kappa(kappa: f64) -> Result<Self, ReferenceError> {
        if !kappa.is_finite() {
            return Err(ReferenceError::NotFinite {
                name: "kappa",
                value: kappa,
            });
        }
        if kappa <= 0.0 {
            return Err(ReferenceError::NotPositive {
                name: "kappa",
                value: kappa,
            });
        }
        Ok(SixVertexStep { kappa })
    }

    /// κ = (1 − b1)/(1 − b2).
    pub fn kappa(&self) -> f64 {
        self.kappa
    }

    /// Whether the limit shape has a curved region (κ > 1).
    pub fn has_curved_region(&self) -> bool {
        self.kappa > 1.0
    }

    /// Whether (x, y) lies strictly inside the curved region y/κ < x < κy (x, y > 0).
    pub fn is_curved(&self, x: f64, y: f64) -> bool {
        self.has_curved_region() && x > 0.0 && y > 0.0 && x > y / self.kappa && x < self.kappa * y
    }

    /// h(x, y), the limit of H(Lx, Ly)/L, for x, y ≥ 0 (see the module documentation).
    pub fn height(&self, x: f64, y: f64) -> f64 {
        let k = self.kappa;
        if !self.has_curved_region() {
            return (y - x).max(0.0);
        }
        if x <= y / k {
            y - x
        } else if x >= k * y {
            0.0
        } else {
            let d = (k * y).sqrt() - x.sqrt();
            d * d / (k - 1.0)
        }
    }

    /// The density of path crossings along the row at height y: ρ = −∂h/∂x, in [0, 1].
    pub fn density(&self, x: f64, y: f64) -> f64 {
        let k = self.kappa;
        if !self.has_curved_region() {
            return if x < y { 1.0 } else { 0.0 };
        }
        if x <= y / k {
            1.0
        } else if x >= k * y {
            0.0
        } else {
            ((k * y / x).sqrt() - 1.0) / (k - 1.0)
        }
    }

    /// The vertical flux ∂h/∂y = j(ρ), j(ρ) = κρ/(1 + (κ − 1)ρ).
    pub fn flux(&self, x: f64, y: f64) -> f64 {
        let k = self.kappa;
        if !self.has_curved_region() {
            return if x < y { 1.0 } else { 0.0 };
        }
        if x <= y / k {
            1.0
        } else if x >= k * y {
            0.0
        } else {
            (k - (k * x / y).sqrt()) / (k - 1.0)
        }
    }

    /// The Tracy–Widom fluctuation scale σ(x, y) at a point of the curved region:
    /// (L·h(x, y) − H(Lx, Ly))/(σ L^{1/3}) → F₂, with
    /// σ = κ^{1/6} (√(κy) − √x)^{2/3} (√(κx) − √y)^{2/3} / ((κ − 1) x^{1/6} y^{1/6}).
    ///
    /// Source: the scaling of Borodin, Corwin and Gorin (2016), in the form derived from KPZ
    /// scaling theory with the flux j above; it reduces to Johansson's TASEP constants in the
    /// limit κ ↓ 1 (checked in the tests). Convergence in L is slow.
    ///
    /// # Errors
    /// [`ReferenceError::NoCurvedRegion`] if κ ≤ 1; [`ReferenceError::OutsideCurvedRegion`]
    /// if (x, y) is not strictly inside the curved region.
    pub fn fluctuation_scale(&self, x: f64, y: f64) -> Result<f64, ReferenceError> {
        let k = self.kappa;
        if !self.has_curved_region() {
            return Err(ReferenceError::NoCurvedRegion { kappa: k });
        }
        if !self.is_curved(x, y) {
            return Err(ReferenceError::OutsideCurvedRegion { x, y, kappa: k });
        }
        let a = ((k * y).sqrt() - x.sqrt()).powf(2.0 / 3.0);
        let b = ((k * x).sqrt() - y.sqrt()).powf(2.0 / 3.0);
        Ok(k.powf(1.0 / 6.0) * a * b / ((k - 1.0) * (x * y).powf(1.0 / 6.0)))
    }

    /// P(v > s) for the exit speed v = X/y of the second-class path entering in row 1:
    /// 1 for s ≤ 1/κ, (κ − √(κs))/(κ − 1) on [1/κ, κ], 0 for s ≥ κ.
    ///
    /// # Errors
    /// [`ReferenceError::NoCurvedRegion`] if κ ≤ 1 (the limit is then the point mass at 1).
    pub fn exit_speed_tail(&self, s: f64) -> Result<f64, ReferenceError> {
        if !self.has_curved_region() {
            return Err(ReferenceError::NoCurvedRegion { kappa: self.kappa });
        }
        Ok(self.flux(s, 1.0))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn continuous_and_consistent_derivatives() {
        for k in [1.05, 1.75, 4.0] {
            let m = SixVertexStep::from_kappa(k).unwrap();
            let y = 1.3;
            // continuity at both edges
            for e in [y / k, k * y] {
                assert!((m.height(e - 1e-12, y) - m.height(e + 1e-12, y)).abs() < 1e-10);
                assert!((m.density(e - 1e-9, y) - m.density(e + 1e-9, y)).abs() < 1e-6);
            }
            // ρ = −∂h/∂x and ∂h/∂y = j(ρ), by central differences
            for i in 1..40 {
                let x = 0.05 * i as f64;
                let h = 1e-6;
                let rho = -(m.height(x + h, y) - m.height(x - h, y)) / (2.0 * h);
                let dy = (m.height(x, y + h) - m.height(x, y - h)) / (2.0 * h);
                assert!((rho - m.density(x, y)).abs() < 1e-6, "{k} {x}");
                assert!((dy - m.flux(x, y)).abs() < 1e-6, "{k} {x}");
                let r = m.density(x, y);
                let j = k * r / (1.0 + (k - 1.0) * r);
                assert!((j - m.flux(x, y)).abs() < 1e-12, "{k} {x}");
            }
        }
    }

    #[test]
    fn hamilton_jacobi_and_homogeneity() {
        let m = SixVertexStep::from_weights(0.2, 0.5).unwrap();
        assert!((m.kappa() - 1.6).abs() < 1e-15);
        for (x, y) in [(0.8, 1.0), (1.2, 1.0), (3.0, 2.5)] {
            assert!((m.height(7.0 * x, 7.0 * y) - 7.0 * m.height(x, y)).abs() < 1e-12);
            let s = m.fluctuation_scale(x, y).unwrap();
            let s7 = m.fluctuation_scale(8.0 * x, 8.0 * y).unwrap();
            assert!((s7 - 2.0 * s).abs() < 1e-12 && s > 0.0);
        }
    }

    #[test]
    fn reduces_to_tasep_as_kappa_tends_to_one() {
        // κ = 1 + δ, y = t/δ, x = y(1 + δa): h → t(1 − a)²/4 and σ → 2^{-4/3}(1 − a²)^{2/3} t^{1/3}
        // (TASEP at time t and position at, Rost 1981 / Johansson 2000). Errors are O(δ).
        let delta = 1e-6;
        let m = SixVertexStep::from_kappa(1.0 + delta).unwrap();
        let t = 50.0;
        for a in [-0.6, 0.0, 0.3, 0.8] {
            let y = t / delta;
            let x = y * (1.0 + delta * a);
            let h = m.height(x, y);
            let want = t * (1.0 - a) * (1.0 - a) / 4.0;
            assert!((h - want).abs() < 1e-4 * want, "{a}: {h} {want}");
            let s = m.fluctuation_scale(x, y).unwrap();
            let want = 2f64.powf(-4.0 / 3.0) * (1.0 - a * a).powf(2.0 / 3.0) * t.powf(1.0 / 3.0);
            assert!((s - want).abs() < 1e-4 * want, "{a}: {s} {want}");
            // near miss: without the (1 − a²)^{2/3} factor the match fails away from a = 0
            if a != 0.0 {
                assert!((s - 2f64.powf(-4.0 / 3.0) * t.powf(1.0 / 3.0)).abs() > 1e-2 * want);
            }
        }
    }

    #[test]
    fn exit_speed_tail_is_a_survival_function() {
        let k = 2.5;
        let m = SixVertexStep::from_kappa(k).unwrap();
        assert_eq!(m.exit_speed_tail(1.0 / k - 1e-9).unwrap(), 1.0);
        assert!((m.exit_speed_tail(1.0 / k).unwrap() - 1.0).abs() < 1e-15);
        assert!(m.exit_speed_tail(k).unwrap().abs() < 1e-15);
        let mut last = 1.0;
        for i in 0..=100 {
            let s = 1.0 / k + (k - 1.0 / k) * i as f64 / 100.0;
            let v = m.exit_speed_tail(s).unwrap();
            assert!(v <= last + 1e-15);
            last = v;
        }
        // It is ∂h/∂y, not the horizontal density (near miss: they differ inside).
        assert!((m.exit_speed_tail(1.0).unwrap() - m.density(1.0, 1.0)).abs() > 0.05);
    }

    #[test]
    fn shock_case_and_errors() {
        for (b1, b2) in [(0.5, 0.5), (0.6, 0.2)] {
            let m = SixVertexStep::from_weights(b1, b2).unwrap();
            assert!(!m.has_curved_region());
            assert_eq!(m.height(0.3, 1.0), 0.7);
            assert_eq!(m.height(1.3, 1.0), 0.0);
            assert_eq!(m.density(0.99, 1.0), 1.0);
            assert!(matches!(
                m.fluctuation_scale(1.0, 1.0),
                Err(ReferenceError::NoCurvedRegion { .. })
            ));
            assert!(m.exit_speed_tail(1.0).is_err());
        }
        let m = SixVertexStep::from_kappa(2.0).unwrap();
        assert!(matches!(
            m.fluctuation_scale(0.4, 1.0),
            Err(ReferenceError::OutsideCurvedRegion { .. })
        ));
        assert!(m.fluctuation_scale(2.0, 1.0).is_err());
        assert!(SixVertexStep::from_weights(1.2, 0.5).is_err());
        assert!(SixVertexStep::from_weights(0.2, 1.0).is_err());
        assert!(SixVertexStep::from_kappa(0.0).is_err());
        assert!(SixVertexStep::from_kappa(f64::INFINITY).is_err());
        assert_eq!(
            SixVertexStep::from_weights(1.2, 0.5)
                .unwrap_err()
                .to_string(),
            "`b1` must lie in [0, 1], got 1.2"
        );
    }
}
