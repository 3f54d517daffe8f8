//! Deciding an event of probability `p` on one 32-bit random word.

use thiserror::Error;

/// A probability outside [0, 1] or not a number.
#[derive(Debug, Clone, Copy, PartialEq, Error)]
#[error("probability must lie in [0, 1], got {0}")]
pub struct ChanceError(pub f64);

/// An event of probability `p`, decided as `u < round(p · 2³²)` for a uniform 32-bit word `u`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub struct Chance {
    cut: u64,
}

impl Chance {
    /// The event of probability `p`.
    ///
    /// # Errors
    /// [`ChanceError`] if `p` is NaN or outside [0, 1].
    pub fn new(p: f64) -> Result<Self, ChanceError> {
        if !(0.0..=1.0).contains(&p) {
            return Err(ChanceError(p));
        }
        Ok(Chance {
            cut: (p * 4_294_967_296.0).round() as u64,
        })
    }

    /// The threshold `round(p · 2³²)`, in `[0, 2³²]`.
    #[inline]
    pub fn cut(self) -> u64 {
        self.cut
    }

    /// The probability actually realised, `cut / 2³²`.
    pub fn realised(self) -> f64 {
        self.cut as f64 / 4_294_967_296.0
    }

    /// Whether the event happens on word `u`.
    #[inline(always)]
    pub fn happens(self, u: u32) -> bool {
        (u as u64) < self.cut
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn extremes_are_exact() {
        let never = Chance::new(0.0).unwrap();
        let always = Chance::new(1.0).unwrap();
        assert!(!never.happens(0));
        assert!(always.happens(u32::MAX));
        assert!(Chance::new(1.0 + 1e-12).is_err());
        assert!(Chance::new(f64::NAN).is_err());
        assert!(Chance::new(-0.0).is_ok());
        assert!((Chance::new(0.3).unwrap().realised() - 0.3).abs() < 2.0f64.powi(-32));
    }
}
