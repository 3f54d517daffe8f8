//! Jump rates `(p, q)` of the multi-species ASEP, checked once.
//!
//! On a bond `(x, x+1)` the two colors swap at rate `p` when the left one is stronger and at rate
//! `q` when the right one is stronger; equal colors never swap. Equivalently a stronger particle jumps
//! right over a weaker one at rate `p` and left at rate `q`. TASEP is `q = 0`.

use motley_stream::Chance;

use crate::ExclusionError;

/// The validated rates `p` (rightward) and `q` (leftward).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rates {
    p: f64,
    q: f64,
}

/// How the direction of an attempted exchange is chosen, fixed by the rates.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Direction {
    /// `q = 0`: every attempt pushes the stronger color right; no direction word is drawn.
    Right,
    /// `p = 0`: every attempt pushes the stronger color left; no direction word is drawn.
    Left,
    /// Both positive: one word per attempt, rightward when `Chance(p / (p + q))` happens.
    Mixed(Chance),
}

impl Rates {
    /// ASEP rates.
    ///
    /// # Errors
    /// [`ExclusionError::RateNotFinite`], [`ExclusionError::RateNegative`] for a bad rate,
    /// [`ExclusionError::RatesBothZero`] if `p + q = 0`.
    pub fn new(p: f64, q: f64) -> Result<Self, ExclusionError> {
        for (name, value) in [("p", p), ("q", q)] {
            if !value.is_finite() {
                return Err(ExclusionError::RateNotFinite { name, value });
            }
            if value < 0.0 {
                return Err(ExclusionError::RateNegative { name, value });
            }
        }
        if p + q <= 0.0 {
            return Err(ExclusionError::RatesBothZero);
        }
        Ok(Rates { p, q })
    }

    /// TASEP: rate `p` to the right, none to the left.
    ///
    /// # Errors
    /// As [`Rates::new`] with `q = 0`.
    pub fn tasep(p: f64) -> Result<Self, ExclusionError> {
        Rates::new(p, 0.0)
    }

    /// The rightward rate `p`.
    pub fn p(&self) -> f64 {
        self.p
    }

    /// The leftward rate `q`.
    pub fn q(&self) -> f64 {
        self.q
    }

    /// The attempt rate of one bond, `p + q`.
    pub fn total(&self) -> f64 {
        self.p + self.q
    }

    pub(crate) fn direction(&self) -> Direction {
        if self.q == 0.0 {
            Direction::Right
        } else if self.p == 0.0 {
            Direction::Left
        } else {
            // p / (p + q) lies in (0, 1): the constructor cannot fail.
            Direction::Mixed(Chance::new(self.p / (self.p + self.q)).unwrap_or_else(|_| {
                unreachable!("p / (p + q) lies in [0, 1] for p, q ≥ 0 with p + q > 0")
            }))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn validation() {
        assert!(Rates::new(1.0, 0.5).is_ok());
        assert_eq!(Rates::new(0.0, 0.0), Err(ExclusionError::RatesBothZero));
        assert!(matches!(
            Rates::new(-1.0, 1.0),
            Err(ExclusionError::RateNegative { name: "p", .. })
        ));
        assert!(matches!(
            Rates::new(1.0, f64::NAN),
            Err(ExclusionError::RateNotFinite { name: "q", .. })
        ));
        assert_eq!(Rates::tasep(2.0).unwrap().direction(), Direction::Right);
        assert_eq!(Rates::new(0.0, 1.0).unwrap().direction(), Direction::Left);
        assert!(matches!(
            Rates::new(1.0, 1.0).unwrap().direction(),
            Direction::Mixed(_)
        ));
    }
}
