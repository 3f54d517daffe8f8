//! One-sample Kolmogorov–Smirnov test against a continuous reference CDF, with the exact
//! finite-n distribution for small samples.
//!
//! # Method
//! Statistic `D_n = max_i max(i/n − F(x_(i)), F(x_(i)) − (i−1)/n)`. p-value `P(D_n >= d)`:
//! - `d >= 1/2`: exactly `2 P(D_n⁺ >= d)` (the events `D⁺ >= d`, `D⁻ >= d` are disjoint then), with the
//!   one-sided tail from the Birnbaum–Tingey formula (Birnbaum & Tingey 1951, Ann. Math. Statist.
//!   22:592–596) `P(D⁺ >= d) = d Σ_{j=0}^{⌊n(1−d)⌋} C(n, j) (1 − d − j/n)^{n−j} (d + j/n)^{j−1}`,
//!   summed in logarithms (all terms positive).
//! - far tail, `2 P(D⁺ >= d) < 1e-10`: the same `2 P(D⁺ >= d)` — an upper bound (union bound, so
//!   conservative) whose relative excess `P(D⁺ >= d, D⁻ >= d) / P(D >= d)` is itself of the order of
//!   the tail probability; this keeps relative precision where `1 − cdf` would lose it.
//! - otherwise, exact for `n <= EXACT_ONE_SAMPLE_MAX_N` under [`KsMethod::Auto`]: `1 − P(D_n < d)`
//!   with `P(D_n < d)` from the matrix method of Durbin (1973) as implemented by Marsaglia, Tsang &
//!   Wang 2003 ("Evaluating Kolmogorov's distribution", J. Stat. Softw. 8(18)), with their base-10
//!   exponent bookkeeping against overflow (about 13 correct digits);
//! - otherwise asymptotic: `Q_K((sqrt(n) + 0.12 + 0.11/sqrt(n)) d)` (Stephens 1970, JRSS B 32:115–122).
//!
//! # Discrete data
//! If the reference law has atoms (integer data), KS is conservative (Noether 1963, JASA 58:
//! 1042–1046). The crate cannot see atoms of a closure; repeated sample values are reported as
//! `ties = true`, `conservative = true`. For discrete laws prefer a chi-square goodness-of-fit test on
//! the support ([`crate::chi_square_goodness_of_fit`]).

use statrs::function::gamma::ln_gamma;

use crate::kolmogorov::kolmogorov_sf;
use crate::ks_two_sample::{KsMethod, KsPValueMethod, KsResult};
use crate::scalar_sample::has_ties;
use crate::{ScalarSample, StatsError};

/// Largest `n` for which [`KsMethod::Auto`] uses the exact one-sample distribution.
pub const EXACT_ONE_SAMPLE_MAX_N: usize = 1000;

/// Far-tail threshold below which `2 P(D⁺ >= d)` is used.
const FAR_TAIL: f64 = 1e-10;

/// One-sided tail `P(D_n⁺ >= d)` (Birnbaum–Tingey, see the file header).
pub fn smirnov_sf(n: u64, d: f64) -> f64 {
    if d <= 0.0 {
        return 1.0;
    }
    if d >= 1.0 {
        return 0.0;
    }
    let nf = n as f64;
    let jmax = (nf * (1.0 - d)).floor() as u64;
    let ln_n1 = ln_gamma(nf + 1.0);
    let mut logs = Vec::with_capacity(jmax as usize + 1);
    for j in 0..=jmax.min(n) {
        let jf = j as f64;
        let a = 1.0 - d - jf / nf;
        if a <= 0.0 {
            continue;
        }
        let ln_c = ln_n1 - ln_gamma(jf + 1.0) - ln_gamma(nf - jf + 1.0);
        logs.push(ln_c + (nf - jf) * a.ln() + (jf - 1.0) * (d + jf / nf).ln());
    }
    let max = logs.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    if max == f64::NEG_INFINITY {
        return 0.0;
    }
    let s: f64 = logs.iter().map(|l| (l - max).exp()).sum();
    (d * s * max.exp()).min(1.0)
}

fn mat_mul(a: &[f64], b: &[f64], m: usize) -> Vec<f64> {
    let mut c = vec![0.0; m * m];
    for i in 0..m {
        for k in 0..m {
            let aik = a[i * m + k];
            if aik == 0.0 {
                continue;
            }
            let row_b = &b[k * m..(k + 1) * m];
            let row_c = &mut c[i * m..(i + 1) * m];
            for (cj, bj) in row_c.iter_mut().zip(row_b) {
                *cj += aik * bj;
            }
        }
    }
    c
}

/// `A^n` with a base-10 exponent kept separately (Marsaglia, Tsang & Wang 2003, `mPower`).
fn mat_pow(a: &[f64], m: usize, n: u64) -> (Vec<f64>, i64) {
    if n == 1 {
        return (a.to_vec(), 0);
    }
    let (v, ev) = mat_pow(a, m, n / 2);
    let b = mat_mul(&v, &v, m);
    let eb = 2 * ev;
    let (mut v, mut ev) = if n.is_multiple_of(2) {
        (b, eb)
    } else {
        (mat_mul(a, &b, m), eb)
    };
    if v[(m / 2) * m + m / 2] > 1e140 {
        for x in v.iter_mut() {
            *x *= 1e-140;
        }
        ev += 140;
    }
    (v, ev)
}

/// `P(D_n < d)` by the Durbin matrix method (Marsaglia, Tsang & Wang 2003).
pub(crate) fn mtw_cdf(n: u64, d: f64) -> f64 {
    let nf = n as f64;
    let k = (nf * d).floor() as usize + 1;
    let m = 2 * k - 1;
    let h = k as f64 - nf * d;
    let mut hm = vec![0.0f64; m * m];
    for i in 0..m {
        for j in 0..m {
            if i + 1 >= j {
                hm[i * m + j] = 1.0;
            }
        }
    }
    for i in 0..m {
        hm[i * m] -= h.powi(i as i32 + 1);
        hm[(m - 1) * m + i] -= h.powi((m - i) as i32);
    }
    if 2.0 * h - 1.0 > 0.0 {
        hm[(m - 1) * m] += (2.0 * h - 1.0).powi(m as i32);
    }
    for i in 0..m {
        for j in 0..m {
            if i + 1 > j {
                for g in 1..=(i + 1 - j) {
                    hm[i * m + j] /= g as f64;
                }
            }
        }
    }
    let (q, mut eq) = mat_pow(&hm, m, n);
    let mut s = q[(k - 1) * m + k - 1];
    for i in 1..=n {
        s = s * i as f64 / nf;
        if s < 1e-140 {
            s *= 1e140;
            eq -= 140;
        }
    }
    (s * 10f64.powi(eq as i32)).clamp(0.0, 1.0)
}

/// `P(D_n >= d)` for the one-sample statistic under a continuous null (see the file header).
pub fn ks_one_sample_sf(n: u64, d: f64, method: KsMethod) -> (f64, KsPValueMethod) {
    if d <= 0.5 / n as f64 {
        // D_n >= 1/(2n) always.
        return (1.0, KsPValueMethod::Exact);
    }
    if d >= 1.0 {
        return (0.0, KsPValueMethod::Exact);
    }
    let use_exact = match method {
        KsMethod::Exact => true,
        KsMethod::Asymptotic => false,
        KsMethod::Auto => n as usize <= EXACT_ONE_SAMPLE_MAX_N,
    };
    if !use_exact {
        let s = n as f64;
        let s = s.sqrt();
        let p = kolmogorov_sf((s + 0.12 + 0.11 / s) * d);
        if p >= FAR_TAIL {
            return (p, KsPValueMethod::Asymptotic);
        }
        return ((2.0 * smirnov_sf(n, d)).min(1.0), KsPValueMethod::Exact);
    }
    let two_sided_union = 2.0 * smirnov_sf(n, d);
    if d >= 0.5 || two_sided_union < FAR_TAIL {
        return (two_sided_union.min(1.0), KsPValueMethod::Exact);
    }
    ((1.0 - mtw_cdf(n, d)).max(0.0), KsPValueMethod::Exact)
}

/// One-sample KS test of `sample` against the continuous CDF `cdf`.
///
/// # Errors
/// [`StatsError::EmptySample`]; [`StatsError::InvalidCdfValue`] if `cdf` leaves [0, 1].
///
/// # Examples
/// ```
/// use motley_stats::{ks_one_sample, KsMethod, ScalarSample};
/// let s = ScalarSample::from_values(vec![0.12, 0.35, 0.51, 0.77, 0.93]).unwrap();
/// let r = ks_one_sample(&s, |x: f64| x.clamp(0.0, 1.0), KsMethod::Auto).unwrap();
/// assert!(r.p_value > 0.5);
/// ```
pub fn ks_one_sample<F: Fn(f64) -> f64>(
    sample: &ScalarSample,
    cdf: F,
    method: KsMethod,
) -> Result<KsResult, StatsError> {
    if sample.is_empty() {
        return Err(StatsError::EmptySample { which: "sample" });
    }
    let v = sample.sorted_values();
    let n = v.len();
    let nf = n as f64;
    let mut d = 0.0f64;
    for (i, &x) in v.iter().enumerate() {
        let f = cdf(x);
        if !(0.0..=1.0).contains(&f) {
            return Err(StatsError::InvalidCdfValue { x, value: f });
        }
        d = d.max((i + 1) as f64 / nf - f).max(f - i as f64 / nf);
    }
    let (p_value, used) = ks_one_sample_sf(n as u64, d, method);
    let ties = has_ties(&v);
    Ok(KsResult {
        statistic: d,
        p_value,
        method: used,
        n_a: n as u64,
        n_b: 0,
        ties,
        conservative: ties,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_distribution_matches_reference() {
        // n <= 140 and the far tail: scipy 1.17.1, scipy.stats.kstwo.sf(d, n) (exact there);
        // n = 144, 500, 1000 (d = 0.03): scipy 1.17.1, 1 - scipy.stats._ksstats._kolmogn_DMTW(n, d,
        // cdf=True) in long double, because kstwo.sf switches to the Pelz–Good approximation there
        // (it gives 0.1047924363083228 at n = 144, d = 0.1, 2e-7 off the matrix value).
        let refs: [(u64, f64, f64); 10] = [
            (5, 0.3, 0.664),
            (10, 0.274, 0.3715203845434957),
            (20, 0.1, 0.976255094592155),
            (50, 0.19, 0.046989328202061253),
            (100, 0.05, 0.9532159710635725),
            (144, 0.1, 0.10479241654420119),
            (500, 0.06, 0.05243459577151481),
            (1000, 0.03, 0.3226902464133094),
            (1000, 0.2, 1.5528629204250538e-35),
            (30, 0.6, 7.392006292214292e-11),
        ];
        for (n, d, want) in refs {
            let (got, m) = ks_one_sample_sf(n, d, KsMethod::Auto);
            assert_eq!(m, KsPValueMethod::Exact);
            assert!(
                (got / want - 1.0).abs() < 1e-9,
                "n {n} d {d}: {got} vs {want}"
            );
        }
        // Beyond the exact range: Stephens-corrected asymptotics (loose) and the far tail (tight).
        // scipy 1.17.1, scipy.stats.kstwo.sf(0.03, 2000) = 0.05354694793932557,
        // scipy.stats.kstwo.sf(0.15, 2000) = 9.492370458787865e-40
        let (got, m) = ks_one_sample_sf(2000, 0.03, KsMethod::Auto);
        assert_eq!(m, KsPValueMethod::Asymptotic);
        assert!((got / 0.05354694793932557 - 1.0).abs() < 0.01, "{got}");
        let (got, _) = ks_one_sample_sf(2000, 0.15, KsMethod::Auto);
        assert!((got / 9.492370458787865e-40 - 1.0).abs() < 1e-8, "{got}");
    }

    #[test]
    fn small_n_closed_forms() {
        // n = 1: D = max(x, 1 − x) for a uniform x, so P(D >= d) = 2(1 − d) for d in [1/2, 1].
        let (p, _) = ks_one_sample_sf(1, 0.7, KsMethod::Exact);
        assert!((p - 0.6).abs() < 1e-14);
        // The matrix method and the Birnbaum–Tingey sum agree where both are exact (d = 0.5).
        let n = 12;
        let via_matrix = 1.0 - mtw_cdf(n, 0.5);
        let via_sum = 2.0 * smirnov_sf(n, 0.5);
        assert!(
            (via_matrix - via_sum).abs() < 1e-12,
            "{via_matrix} {via_sum}"
        );
    }
}
