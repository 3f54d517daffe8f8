//! The arithmetic of exact laws: probabilities as `f64` or as exact rationals.
//!
//! The dynamic programme of [`crate::exact_law`] only adds and multiplies probabilities and forms
//! `1 − p`, so it is generic over [`Weight`]. With [`BigRational`] every probability is exact (for
//! rational `b1`, `b2` and densities); with `f64` it is rounded at each step.

use num_rational::BigRational;
use num_traits::{One, Signed, ToPrimitive, Zero};

/// A probability type: `f64` or [`BigRational`].
pub trait Weight: Clone + PartialOrd + std::fmt::Debug + std::fmt::Display {
    /// 0.
    fn zero() -> Self;
    /// 1.
    fn one() -> Self;
    /// Whether this is exactly 0.
    fn is_zero(&self) -> bool;
    /// `self += other`.
    fn add_assign(&mut self, other: &Self);
    /// `self · other`.
    fn times(&self, other: &Self) -> Self;
    /// `1 − self`.
    fn one_minus(&self) -> Self;
    /// `|self − other|`.
    fn abs_diff(&self, other: &Self) -> Self;
    /// `self / 2`.
    fn half(&self) -> Self;
    /// An `f64` probability in this type (for a rational: the exact value of the binary float, e.g.
    /// 0.5 ↦ 1/2, 0.3 ↦ 5404319552844595/18014398509481984).
    fn from_f64(p: f64) -> Self;
    /// The nearest `f64`.
    fn to_f64(&self) -> f64;
    /// Whether `0 ≤ self ≤ 1` (false for NaN).
    fn is_probability(&self) -> bool {
        *self >= Self::zero() && *self <= Self::one()
    }
}

impl Weight for f64 {
    fn zero() -> Self {
        0.0
    }
    fn one() -> Self {
        1.0
    }
    fn is_zero(&self) -> bool {
        *self == 0.0
    }
    fn add_assign(&mut self, other: &Self) {
        *self += *other;
    }
    fn times(&self, other: &Self) -> Self {
        self * other
    }
    fn one_minus(&self) -> Self {
        1.0 - self
    }
    fn abs_diff(&self, other: &Self) -> Self {
        (self - other).abs()
    }
    fn half(&self) -> Self {
        self * 0.5
    }
    fn from_f64(p: f64) -> Self {
        p
    }
    fn to_f64(&self) -> f64 {
        *self
    }
}

impl Weight for BigRational {
    fn zero() -> Self {
        Zero::zero()
    }
    fn one() -> Self {
        One::one()
    }
    fn is_zero(&self) -> bool {
        Zero::is_zero(self)
    }
    fn add_assign(&mut self, other: &Self) {
        *self += other;
    }
    fn times(&self, other: &Self) -> Self {
        self * other
    }
    fn one_minus(&self) -> Self {
        <BigRational as One>::one() - self
    }
    fn abs_diff(&self, other: &Self) -> Self {
        (self - other).abs()
    }
    fn half(&self) -> Self {
        self / BigRational::from_integer(2.into())
    }
    fn from_f64(p: f64) -> Self {
        BigRational::from_float(p).unwrap_or_else(Zero::zero)
    }
    fn to_f64(&self) -> f64 {
        ToPrimitive::to_f64(self).unwrap_or(f64::NAN)
    }
}

/// The rational `numer / denom` (a convenience for exact weights).
///
/// # Panics
/// If `denom` is 0.
pub fn ratio(numer: i64, denom: i64) -> BigRational {
    BigRational::new(numer.into(), denom.into())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rational_arithmetic() {
        let p = ratio(1, 3);
        assert_eq!(p.one_minus(), ratio(2, 3));
        assert_eq!(p.times(&ratio(3, 4)), ratio(1, 4));
        assert_eq!(p.abs_diff(&ratio(1, 2)), ratio(1, 6));
        assert_eq!(<BigRational as Weight>::from_f64(0.25), ratio(1, 4));
        assert!(!ratio(4, 3).is_probability() && p.is_probability());
        assert!(!f64::NAN.is_probability());
    }
}
