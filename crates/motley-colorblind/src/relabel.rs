//! The order-reversing relabeling between "classes" and "colors".
//!
//! Engines compare colors with "larger is stronger, 0 is empty". Multi-species exclusion is usually
//! written with class 1 strongest and holes weakest. With `K` classes, class `k ∈ {1, …, K}` is color
//! `K + 1 − k` and a hole (class 0 here) is color 0. The map is its own inverse.

use crate::{Color, ColorblindError};

/// Class ↔ color reversal for `K` classes.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Relabel {
    classes: u32,
}

impl Relabel {
    /// The reversal for `classes` classes.
    ///
    /// # Errors
    /// [`ColorblindError::EmptyRelabel`] if `classes` is 0.
    pub fn reverse(classes: u32) -> Result<Self, ColorblindError> {
        if classes == 0 {
            return Err(ColorblindError::EmptyRelabel);
        }
        Ok(Relabel { classes })
    }

    /// Number of classes `K`.
    pub fn classes(&self) -> u32 {
        self.classes
    }

    /// Class → color (and color → class: the map is an involution). 0 stays 0.
    ///
    /// # Errors
    /// [`ColorblindError::ElementOutside`] for a value above `K`.
    pub fn map(&self, value: Color) -> Result<Color, ColorblindError> {
        match value {
            0 => Ok(0),
            v if v <= self.classes => Ok(self.classes + 1 - v),
            v => Err(ColorblindError::ElementOutside {
                element: i64::from(v),
                universe: self.classes as usize,
            }),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reversal_is_an_involution_and_reverses_order() {
        let r = Relabel::reverse(4).unwrap();
        for v in 0..=4 {
            assert_eq!(r.map(r.map(v).unwrap()).unwrap(), v);
        }
        assert_eq!(r.map(1).unwrap(), 4);
        assert!(r.map(1).unwrap() > r.map(2).unwrap());
        assert!(r.map(5).is_err());
        assert_eq!(Relabel::reverse(0), Err(ColorblindError::EmptyRelabel));
    }
}
