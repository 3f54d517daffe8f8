//! Fredholm determinants det(I − K) on L²(s, ∞) by the Nyström method with Gauss–Legendre
//! quadrature (Bornemann 2010, Math. Comp. 79, "On the numerical evaluation of Fredholm
//! determinants"), together with d/ds log det, which is the resolvent kernel at (s, s).
//!
//! # Design
//! * (s, ∞) is truncated to (s, b). The Airy kernel decays in each argument separately, so
//!   b = max(s, 0) + 10 leaves out less than 1e-20 (and a negligible fraction of 1 − F in the
//!   right tail). The GOE kernel ½ Ai((x + y)/2) couples x = s to large y only through
//!   Ai((s + y)/2), so its cut must satisfy (s + b)/2 ≥ 12 as well: b = max(24 − s, s + 16).
//!   (With b = 16 the F₁ values were off by 1e-13 at s = −3, against Painlevé II.)
//! * The matrix I − A, A_ij = √w_i K(x_i, x_j) √w_j, is symmetric positive definite for both
//!   kernels (their spectra lie in (−1, 1)), so Gaussian elimination needs no pivoting. It runs on
//!   D = −A, i.e. on the deviation from the identity, so that each pivot 1 + D_kk keeps its
//!   deviation from 1 to full relative precision: log det = Σ ln_1p(D_kk), and 1 − det =
//!   −expm1(log det) keeps relative precision far into the right tail where det → 1.
//! * d/ds log det(I − K)|_{(s,∞)} = R(s, s), with R = (I − K)^{-1} K; in Nyström form
//!   R(s, s) = K(s, s) + kᵀ (I − A)^{-1} k, k_i = √w_i K(x_i, s). This gives the density without
//!   numerical differentiation.

use crate::airy::airy;
use crate::gauss_legendre::GaussLegendre;

/// Which kernel: the Airy kernel (GUE, F₂) or the kernel ½ Ai((x + y)/2) (GOE, F₁).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Ensemble {
    /// K(x, y) = (Ai(x) Ai'(y) − Ai'(x) Ai(y))/(x − y); F₂ = det(I − K) on L²(s, ∞).
    Gue,
    /// K(x, y) = ½ Ai((x + y)/2); F₁ = det(I − K) on L²(s, ∞) (Ferrari and Spohn 2005, in the
    /// form of Bornemann 2010).
    Goe,
}

impl Ensemble {
    /// Upper end of the truncated interval (see the module documentation).
    fn cut(self, s: f64) -> f64 {
        match self {
            Ensemble::Gue => s.max(0.0) + 10.0,
            Ensemble::Goe => (24.0 - s).max(s + 16.0),
        }
    }
}

/// log det(I − K) on L²(s, ∞) and its derivative in s.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct LogDet {
    /// log F(s).
    pub(crate) value: f64,
    /// d/ds log F(s) = R(s, s) ≥ 0.
    pub(crate) slope: f64,
}

fn gue_kernel(x: f64, ax: (f64, f64), y: f64, ay: (f64, f64)) -> f64 {
    if x == y {
        ax.1 * ax.1 - x * ax.0 * ax.0
    } else {
        (ax.0 * ay.1 - ax.1 * ay.0) / (x - y)
    }
}

/// Evaluates log det(I − K) on the truncated interval with the given rule, and its
/// s-derivative.
pub(crate) fn log_det(ensemble: Ensemble, s: f64, rule: &GaussLegendre) -> LogDet {
    let b = ensemble.cut(s);
    let (x, w) = rule.on(s, b);
    let m = x.len();
    let sw: Vec<f64> = w.iter().map(|w| w.sqrt()).collect();
    // d = −A (row-major, m × m) and k = √w K(x_i, s).
    let mut d = vec![0.0; m * m];
    let mut k = vec![0.0; m];
    let k_ss;
    match ensemble {
        Ensemble::Gue => {
            let a: Vec<(f64, f64)> = x.iter().map(|&xi| airy(xi)).collect();
            let a_s = airy(s);
            for i in 0..m {
                for j in 0..=i {
                    let v = -sw[i] * gue_kernel(x[i], a[i], x[j], a[j]) * sw[j];
                    d[i * m + j] = v;
                    d[j * m + i] = v;
                }
                k[i] = sw[i] * gue_kernel(x[i], a[i], s, a_s);
            }
            k_ss = gue_kernel(s, a_s, s, a_s);
        }
        Ensemble::Goe => {
            for i in 0..m {
                for j in 0..=i {
                    let v = -sw[i] * 0.5 * airy(0.5 * (x[i] + x[j])).0 * sw[j];
                    d[i * m + j] = v;
                    d[j * m + i] = v;
                }
                k[i] = sw[i] * 0.5 * airy(0.5 * (x[i] + s)).0;
            }
            k_ss = 0.5 * airy(s).0;
        }
    }
    // Elimination without pivoting on I + D; multipliers are stored below the diagonal.
    let mut value = 0.0;
    for p in 0..m {
        let dpp = d[p * m + p];
        value += dpp.ln_1p();
        let piv = 1.0 + dpp;
        for i in (p + 1)..m {
            let l = d[i * m + p] / piv;
            d[i * m + p] = l;
            if l != 0.0 {
                for j in (p + 1)..m {
                    d[i * m + j] -= l * d[p * m + j];
                }
            }
        }
    }
    // Solve (I + D) u = k: forward with unit lower L, backward with U.
    let mut u = k.clone();
    for i in 0..m {
        let mut acc = u[i];
        for j in 0..i {
            acc -= d[i * m + j] * u[j];
        }
        u[i] = acc;
    }
    for i in (0..m).rev() {
        let mut acc = u[i];
        for j in (i + 1)..m {
            acc -= d[i * m + j] * u[j];
        }
        u[i] = acc / (1.0 + d[i * m + i]);
    }
    let slope = k_ss + k.iter().zip(&u).map(|(a, b)| a * b).sum::<f64>();
    LogDet { value, slope }
}
