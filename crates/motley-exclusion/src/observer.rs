//! What the event loops report to, when a read-out needs more than the configuration.
//!
//! Currents (and heights, which are built on them) and attempted jumps cannot be read off the
//! configuration at the read-out time, so the loops call an [`Observer`] after every attempt. The
//! observer is a type parameter: with [`Silent`] (`ACTIVE = false`) the call compiles away and the
//! loop stays the plain kernel.

use motley_colorblind::Color;

/// Receives every attempted exchange.
pub(crate) trait Observer {
    /// Whether the loop should call [`Observer::attempt`] at all.
    const ACTIVE: bool;

    /// One attempt on bond `(left_site, left_site + 1)`: `rightward` when the stronger color is
    /// pushed right (rate-`p` attempt), with the two colors before the attempt and the color on the
    /// right end after it.
    fn attempt(
        &mut self,
        left_site: i64,
        rightward: bool,
        before: (Color, Color),
        after_right: Color,
    );
}

/// Observes nothing.
pub(crate) struct Silent;

impl Observer for Silent {
    const ACTIVE: bool = false;

    #[inline(always)]
    fn attempt(&mut self, _: i64, _: bool, _: (Color, Color), _: Color) {}
}

/// Counts currents through chosen bonds and flags attempted jumps of one color onto another.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub(crate) struct Tracker {
    /// `(left end of bond, threshold c, net number of colors ≥ c that crossed left → right)`.
    pub(crate) currents: Vec<(i64, Color, i64)>,
    /// `(from, onto, whether from ever attempted a jump onto the site of onto)`.
    pub(crate) attempts: Vec<(Color, Color, bool)>,
}

impl Tracker {
    /// Whether anything is tracked.
    pub(crate) fn is_needed(&self) -> bool {
        !self.currents.is_empty() || !self.attempts.is_empty()
    }
}

impl Observer for Tracker {
    const ACTIVE: bool = true;

    #[inline]
    fn attempt(
        &mut self,
        left_site: i64,
        rightward: bool,
        before: (Color, Color),
        after_right: Color,
    ) {
        for cur in &mut self.currents {
            if cur.0 == left_site {
                cur.2 += i64::from(after_right >= cur.1) - i64::from(before.1 >= cur.1);
            }
        }
        // A rate-p attempt is the occupant of the left end trying to jump right; a rate-q attempt
        // is the occupant of the right end trying to jump left.
        let (mover, target) = if rightward {
            (before.0, before.1)
        } else {
            (before.1, before.0)
        };
        for at in &mut self.attempts {
            if at.0 == mover && at.1 == target {
                at.2 = true;
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn counts_currents_and_attempts() {
        let mut t = Tracker {
            currents: vec![(3, 2, 0)],
            attempts: vec![(1, 2, false), (2, 1, false)],
        };
        // Color 2 crosses bond 3 rightwards.
        t.attempt(3, true, (2, 0), 2);
        assert_eq!(t.currents[0].2, 1);
        // Color 1 tries to jump right onto 2 and fails: no current, attempt flagged.
        t.attempt(3, true, (1, 2), 2);
        assert_eq!(t.currents[0].2, 1);
        assert_eq!((t.attempts[0].2, t.attempts[1].2), (true, false));
        // Color 2 at the right end jumps left over 0: current back to 0.
        t.attempt(3, false, (0, 2), 0);
        assert_eq!(t.currents[0].2, 0);
        // Elsewhere: nothing counted.
        t.attempt(4, true, (2, 0), 2);
        assert_eq!(t.currents[0].2, 0);
    }
}
