//! The joint law of the speeds (U₀, U₁) of the particles started at sites 0 and 1 in the TASEP
//! speed process (packed start: the particle at site i has class i, lower class = stronger).
//!
//! # Formula
//! Amir, Angel and Valkó (2011), on [−1, 1]² (recalled from memory, checked here by our own
//! computation of total mass and marginals):
//! * density 1/4 on {u₀ > u₁} (the pair has swapped; mass 1/2),
//! * density (u₁ − u₀)/4 on {u₀ < u₁} (never swapped; mass 1/3),
//! * a singular part on the diagonal u₀ = u₁ = u with density (1 − u²)/8 in u (mass 1/6; the
//!   two particles swap and then travel together).
//!
//! Each marginal is Uniform[−1, 1], as it must be: the density of U₀ is
//! (a + 1)/4 + (1 − a)²/8 + (1 − a²)/8 = 1/2 (and the same for U₁).
//! The swap probability P(U₀ ≥ U₁) = 1/2 + 1/6 = 2/3 agrees with Ferrari, Gonçalves and Martin.
//!
//! # Joint CDF
//! F(a, b) = P(U₀ ≤ a, U₁ ≤ b), a, b clamped to [−1, 1], m = min(a, b):
//! * swapped part: ((a + 1)²/2 if b ≥ a, else (b + 1)²/2 + (a − b)(b + 1)) / 4,
//! * unswapped part: ((m + 1)³/6 + 1{b > a} (a + 1)(b − a)(b + 1)/2) / 4,
//! * diagonal part: ((m + 1) − (m³ + 1)/3) / 8.

/// The limiting joint law of (U₀, U₁); see the module documentation.
///
/// # Examples
/// ```
/// use motley_reference::SpeedProcessPair;
/// let law = SpeedProcessPair;
/// assert!((law.cdf(1.0, 1.0) - 1.0).abs() < 1e-15);
/// assert!((law.cdf(0.0, 1.0) - 0.5).abs() < 1e-15); // U₀ is uniform on [−1, 1]
/// assert!((SpeedProcessPair::P_SWAPPED_OR_TIED - 2.0 / 3.0).abs() < 1e-15);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct SpeedProcessPair;

impl SpeedProcessPair {
    /// P(U₀ > U₁) = 1/2: swapped, different speeds.
    pub const P_SWAPPED: f64 = 0.5;
    /// P(U₀ = U₁) = 1/6: swapped, then equal speeds.
    pub const P_TIED: f64 = 1.0 / 6.0;
    /// P(U₀ < U₁) = 1/3: never swapped (still in the initial order).
    pub const P_INITIAL_ORDER: f64 = 1.0 / 3.0;
    /// P(U₀ ≥ U₁) = 2/3: the pair has swapped eventually.
    pub const P_SWAPPED_OR_TIED: f64 = 2.0 / 3.0;

    /// Density of the absolutely continuous part at (u₀, u₁) (0 on the diagonal and outside
    /// the square).
    pub fn density(&self, u0: f64, u1: f64) -> f64 {
        if !((-1.0..=1.0).contains(&u0) && (-1.0..=1.0).contains(&u1)) {
            return 0.0;
        }
        if u0 > u1 {
            0.25
        } else if u0 < u1 {
            0.25 * (u1 - u0)
        } else {
            0.0
        }
    }

    /// Density in u of the singular part on the diagonal: (1 − u²)/8 on [−1, 1].
    pub fn diagonal_density(&self, u: f64) -> f64 {
        if (-1.0..=1.0).contains(&u) {
            (1.0 - u * u) / 8.0
        } else {
            0.0
        }
    }

    /// F(a, b) = P(U₀ ≤ a, U₁ ≤ b).
    pub fn cdf(&self, a: f64, b: f64) -> f64 {
        let a = a.clamp(-1.0, 1.0);
        let b = b.clamp(-1.0, 1.0);
        let m = a.min(b);
        let swapped = if b >= a {
            (a + 1.0) * (a + 1.0) / 2.0
        } else {
            (b + 1.0) * (b + 1.0) / 2.0 + (a - b) * (b + 1.0)
        } / 4.0;
        let mut unswapped = (m + 1.0).powi(3) / 6.0;
        if b > a {
            unswapped += (a + 1.0) * (b - a) * (b + 1.0) / 2.0;
        }
        let diagonal = ((m + 1.0) - (m * m * m + 1.0) / 3.0) / 8.0;
        swapped + unswapped / 4.0 + diagonal
    }

    /// P(U₀ ≤ a) = (a + 1)/2 on [−1, 1].
    pub fn marginal_cdf_first(&self, a: f64) -> f64 {
        self.cdf(a, 1.0)
    }

    /// P(U₁ ≤ b) = (b + 1)/2 on [−1, 1].
    pub fn marginal_cdf_second(&self, b: f64) -> f64 {
        self.cdf(1.0, b)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::GaussLegendre;

    #[test]
    fn total_mass_parts_and_uniform_marginals() {
        let law = SpeedProcessPair;
        assert!((law.cdf(1.0, 1.0) - 1.0).abs() < 1e-15);
        assert_eq!(law.cdf(-1.0, 0.3), 0.0);
        assert_eq!(law.cdf(5.0, 9.0), law.cdf(1.0, 1.0));
        let sum = SpeedProcessPair::P_SWAPPED
            + SpeedProcessPair::P_TIED
            + SpeedProcessPair::P_INITIAL_ORDER;
        assert!((sum - 1.0).abs() < 1e-15);
        for i in 0..=40 {
            let a = -1.0 + 0.05 * i as f64;
            assert!(
                (law.marginal_cdf_first(a) - (a + 1.0) / 2.0).abs() < 1e-12,
                "{a}"
            );
            assert!(
                (law.marginal_cdf_second(a) - (a + 1.0) / 2.0).abs() < 1e-12,
                "{a}"
            );
        }
    }

    #[test]
    fn cdf_equals_numerical_integral_of_the_law() {
        // Our own check: integrate the density over [−1, a] × [−1, b] piecewise (split at the
        // diagonal so each piece is polynomial, hence exact under Gauss–Legendre), plus the
        // diagonal mass.
        let law = SpeedProcessPair;
        let gl = GaussLegendre::new(8);
        for (a, b) in [
            (0.3f64, -0.2f64),
            (-0.5, 0.7),
            (0.9, 0.9),
            (0.0, 0.0),
            (-0.99, 1.0),
            (0.4, 0.45),
        ] {
            // Outer integral over u₀ split at u₀ = b, where the inner integrand has a kink.
            let inner = |u0: f64| {
                let cut = u0.clamp(-1.0, b);
                let below = gl.integrate(-1.0, cut, |_| 0.25);
                let above = if b > u0 {
                    gl.integrate(u0, b, |u1| 0.25 * (u1 - u0))
                } else {
                    0.0
                };
                below + above
            };
            let m = a.min(b);
            let mut total = gl.integrate(-1.0, m, inner);
            if a > m {
                total += gl.integrate(m, a, inner);
            }
            total += gl.integrate(-1.0, a.min(b), |u| law.diagonal_density(u));
            assert!(
                (law.cdf(a, b) - total).abs() < 1e-12,
                "({a}, {b}): {} vs {total}",
                law.cdf(a, b)
            );
        }
        // The pieces: P(U₀ > U₁) = 1/2, P(U₀ < U₁) = 1/3, diagonal 1/6.
        let swapped = gl.integrate(-1.0, 1.0, |u0| gl.integrate(-1.0, u0, |_| 0.25));
        let unswapped = gl.integrate(-1.0, 1.0, |u0| gl.integrate(u0, 1.0, |u1| 0.25 * (u1 - u0)));
        let diag = gl.integrate(-1.0, 1.0, |u| law.diagonal_density(u));
        assert!((swapped - SpeedProcessPair::P_SWAPPED).abs() < 1e-14);
        assert!((unswapped - SpeedProcessPair::P_INITIAL_ORDER).abs() < 1e-14);
        assert!((diag - SpeedProcessPair::P_TIED).abs() < 1e-14);
    }

    #[test]
    fn near_miss_law_fails_the_marginal_check() {
        // A diagonal with constant density 1/12 (same mass 1/6) breaks uniformity of U₀.
        let law = SpeedProcessPair;
        let a: f64 = 0.5;
        let wrong =
            law.cdf(a, 1.0) - ((a + 1.0) - (a * a * a + 1.0) / 3.0) / 8.0 + (a + 1.0) / 12.0;
        assert!((wrong - (a + 1.0) / 2.0).abs() > 1e-3);
    }
}
