//! Chebyshev interpolants on an interval: fit from values at the Chebyshev points of the first
//! kind, evaluate by Clenshaw's recurrence. Used to tabulate the Tracy–Widom functions once so
//! that each later evaluation costs a few dozen flops instead of a Fredholm determinant.

/// A polynomial p(x) = Σ_k c_k T_k(t), t = (2x − a − b)/(b − a), on [a, b].
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Chebyshev {
    lo: f64,
    hi: f64,
    coeffs: Vec<f64>,
}

impl Chebyshev {
    /// Chebyshev points of the first kind on [lo, hi] for an interpolant with `n` coefficients.
    pub(crate) fn points(lo: f64, hi: f64, n: usize) -> Vec<f64> {
        (0..n)
            .map(|j| {
                let t = (std::f64::consts::PI * (j as f64 + 0.5) / n as f64).cos();
                0.5 * (lo + hi) + 0.5 * (hi - lo) * t
            })
            .collect()
    }

    /// The interpolant through `values` taken at [`Chebyshev::points`]`(lo, hi, values.len())`.
    pub(crate) fn from_values(lo: f64, hi: f64, values: &[f64]) -> Self {
        let n = values.len();
        let mut coeffs = vec![0.0; n];
        for (k, c) in coeffs.iter_mut().enumerate() {
            let mut sum = 0.0;
            for (j, v) in values.iter().enumerate() {
                sum += v * (std::f64::consts::PI * k as f64 * (j as f64 + 0.5) / n as f64).cos();
            }
            *c = sum * 2.0 / n as f64;
        }
        coeffs[0] *= 0.5;
        Chebyshev { lo, hi, coeffs }
    }

    /// p(x), by Clenshaw's recurrence.
    pub(crate) fn eval(&self, x: f64) -> f64 {
        let t = (2.0 * x - self.lo - self.hi) / (self.hi - self.lo);
        let (mut b1, mut b2) = (0.0, 0.0);
        for &c in self.coeffs.iter().skip(1).rev() {
            let b0 = 2.0 * t * b1 - b2 + c;
            b2 = b1;
            b1 = b0;
        }
        t * b1 - b2 + self.coeffs[0]
    }

    /// Largest |c_k| among the last three coefficients: a cheap truncation-error indicator.
    #[cfg(test)]
    pub(crate) fn tail(&self) -> f64 {
        self.coeffs
            .iter()
            .rev()
            .take(3)
            .fold(0.0, |m, c| m.max(c.abs()))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reproduces_polynomials_and_smooth_functions() {
        let pts = Chebyshev::points(-1.0, 3.0, 6);
        let vals: Vec<f64> = pts.iter().map(|x| 2.0 - x + 0.5 * x.powi(5)).collect();
        let p = Chebyshev::from_values(-1.0, 3.0, &vals);
        for x in [-1.0, -0.3, 0.0, 1.7, 3.0] {
            assert!((p.eval(x) - (2.0 - x + 0.5 * x.powi(5))).abs() < 1e-12);
        }
        let pts = Chebyshev::points(0.0, 2.0, 30);
        let vals: Vec<f64> = pts.iter().map(|x| x.exp()).collect();
        let p = Chebyshev::from_values(0.0, 2.0, &vals);
        for x in [0.0, 0.11, 1.0, 1.93, 2.0] {
            assert!((p.eval(x) - f64::exp(x)).abs() < 3e-14 * f64::exp(x));
        }
        assert!(p.tail() < 1e-14);
        // Too few points visibly fail.
        let pts = Chebyshev::points(0.0, 2.0, 5);
        let vals: Vec<f64> = pts.iter().map(|x| x.exp()).collect();
        let p = Chebyshev::from_values(0.0, 2.0, &vals);
        assert!((p.eval(1.3) - f64::exp(1.3)).abs() > 1e-8);
    }
}
