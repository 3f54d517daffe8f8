//! What the event loops report to, when a read-out needs more than the configuration.
//!
//! Currents (and heights, which are built on them), attempted jumps, hitting times and unwrapped
//! displacements cannot be read off the configuration at the read-out time, so the loops call an
//! [`Observer`] after every attempt. The observer is a type parameter: with [`Silent`]
//! (`ACTIVE = false`) the call compiles away and the loop stays the plain kernel.
//!
//! Hitting times need the time of the attempt at which the event happens. On `Z` the loop knows it
//! (the exponential gaps are drawn anyway) and passes it by [`Observer::set_time`]. On the segment
//! and ring only the number of attempts per read-out interval is drawn, so [`Clocked`] draws the
//! attempt times as the order statistics of uniforms on the interval from a stream of its own
//! ([`OrderClock`]), one attempt at a time and only while some hitting time is still unknown.

use motley_colorblind::Color;
use rand_core::Rng;

use crate::words::Words;

/// Receives every attempted exchange.
pub(crate) trait Observer {
    /// Whether the loop should call [`Observer::attempt`] at all.
    const ACTIVE: bool;

    /// The time of the attempt about to be reported (called before [`Observer::attempt`] by loops
    /// that know it).
    #[inline(always)]
    fn set_time(&mut self, _time: f64) {}

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

/// An event whose first time is recorded.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum HitKind {
    /// The particles `a` and `b` exchange with each other (successful attempt on a bond holding
    /// both): the first time their order flips, or on the ring one overtakes the other.
    Swap(Color, Color),
    /// The particle `from` attempts a jump onto the site of `onto`.
    Attempt(Color, Color),
}

/// Follows read-out state along the path: currents, attempts, hitting times, displacements.
#[derive(Debug, Clone, Default, PartialEq)]
pub(crate) struct Tracker {
    /// `(left end of bond, threshold c, net number of colors ≥ c that crossed left → right)`.
    pub(crate) currents: Vec<(i64, Color, i64)>,
    /// `(from, onto, whether from ever attempted a jump onto the site of onto)`.
    pub(crate) attempts: Vec<(Color, Color, bool)>,
    /// Events and the time they first happened (`None`: not yet).
    pub(crate) hits: Vec<(HitKind, Option<f64>)>,
    /// `(color, net number of steps moved, right = +1)`: the unwrapped displacement.
    pub(crate) displacements: Vec<(Color, i64)>,
    /// How many entries of `hits` have no time yet.
    pub(crate) pending: usize,
    /// The time of the attempt being reported (hitting times only).
    pub(crate) now: f64,
}

impl Tracker {
    /// Whether anything is tracked.
    pub(crate) fn is_needed(&self) -> bool {
        !self.currents.is_empty()
            || !self.attempts.is_empty()
            || !self.hits.is_empty()
            || !self.displacements.is_empty()
    }

    /// Adds an event to time; returns its slot.
    pub(crate) fn add_hit(&mut self, kind: HitKind) -> usize {
        self.hits.push((kind, None));
        self.pending += 1;
        self.hits.len() - 1
    }
}

impl Observer for Tracker {
    const ACTIVE: bool = true;

    #[inline(always)]
    fn set_time(&mut self, time: f64) {
        self.now = time;
    }

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
        // The two colors exchanged: the left one moved one step right, the right one one step left.
        let exchanged = after_right != before.1;
        if exchanged {
            for d in &mut self.displacements {
                if d.0 == before.0 {
                    d.1 += 1;
                } else if d.0 == before.1 {
                    d.1 -= 1;
                }
            }
        }
        if self.pending > 0 {
            for hit in &mut self.hits {
                if hit.1.is_some() {
                    continue;
                }
                let happens = match hit.0 {
                    HitKind::Swap(a, b) => {
                        exchanged
                            && ((before.0 == a && before.1 == b)
                                || (before.0 == b && before.1 == a))
                    }
                    HitKind::Attempt(from, onto) => mover == from && target == onto,
                };
                if happens {
                    hit.1 = Some(self.now);
                    self.pending -= 1;
                }
            }
        }
    }
}

/// Times of the attempts of one read-out interval `(start, end]` holding `n` attempts: the order
/// statistics of `n` independent uniforms on the interval, drawn in increasing order.
///
/// If `k` uniforms on `(u, 1)` remain, their minimum is `1 − (1 − u) V^{1/k}` with `V` uniform on
/// `(0, 1]` (the maximum of `k` uniforms on `(0, 1)` has the law of `V^{1/k}`), and given the minimum
/// the other `k − 1` are uniform above it. So the remaining fraction `R = 1 − u` is multiplied by
/// `V^{1/k}` at each attempt and the attempt's time is `start + (end − start)(1 − R)`, capped at `end`.
/// One `V` per attempt: `(⌊w / 2¹¹⌋ + 1) · 2⁻⁵³` from the 64-bit value `w` of two consecutive words
/// (low word first).
pub(crate) struct OrderClock {
    words: Words,
    start: f64,
    end: f64,
    left: u64,
    rest: f64,
}

impl OrderClock {
    /// A clock reading its uniforms from `words`.
    pub(crate) fn new(words: Words) -> Self {
        OrderClock {
            words,
            start: 0.0,
            end: 0.0,
            left: 0,
            rest: 1.0,
        }
    }

    /// Starts the interval `(start, end]` holding `n` attempts.
    pub(crate) fn interval(&mut self, start: f64, end: f64, n: u64) {
        self.start = start;
        self.end = end;
        self.left = n;
        self.rest = 1.0;
    }

    /// The time of the next attempt of the interval.
    pub(crate) fn next_time(&mut self) -> f64 {
        debug_assert!(self.left > 0, "more attempts than the interval holds");
        let v = ((self.words.next_u64() >> 11) + 1) as f64 * (1.0 / (1u64 << 53) as f64);
        let k = self.left.max(1) as f64;
        self.rest *= (v.ln() / k).exp();
        self.left = self.left.saturating_sub(1);
        (self.start + (self.end - self.start) * (1.0 - self.rest)).min(self.end)
    }
}

/// A [`Tracker`] whose attempt times come from an [`OrderClock`] (segment and ring). The clock is
/// read only while some hitting time is still unknown, one draw per attempt from the interval's first
/// attempt on (the pending count only decreases), so an attempt's time, when drawn, is the same
/// whichever hitting times the plan asks for.
pub(crate) struct Clocked<'a> {
    pub(crate) tracker: &'a mut Tracker,
    pub(crate) clock: &'a mut OrderClock,
}

impl Observer for Clocked<'_> {
    const ACTIVE: bool = true;

    #[inline]
    fn attempt(
        &mut self,
        left_site: i64,
        rightward: bool,
        before: (Color, Color),
        after_right: Color,
    ) {
        if self.tracker.pending > 0 {
            self.tracker.now = self.clock.next_time();
        }
        self.tracker
            .attempt(left_site, rightward, before, after_right);
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
            ..Tracker::default()
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

    #[test]
    fn records_first_times_and_displacements() {
        let mut t = Tracker {
            displacements: vec![(2, 0), (1, 0)],
            ..Tracker::default()
        };
        let swap = t.add_hit(HitKind::Swap(2, 1));
        let tries = t.add_hit(HitKind::Attempt(1, 2));
        assert_eq!(t.pending, 2);
        assert!(t.is_needed());
        // 1 tries to jump right onto 2 and fails: an attempt, no exchange, nobody moves.
        t.set_time(0.5);
        t.attempt(3, true, (1, 2), 2);
        assert_eq!(t.hits[tries].1, Some(0.5));
        assert_eq!((t.hits[swap].1, t.pending), (None, 1));
        assert_eq!(t.displacements, vec![(2, 0), (1, 0)]);
        // 2 jumps right over a hole, then over 1: both exchanges move it +1, the second moves 1 −1.
        t.set_time(0.75);
        t.attempt(4, true, (2, 0), 2);
        t.set_time(1.25);
        t.attempt(5, true, (2, 1), 2);
        assert_eq!(t.hits[swap].1, Some(1.25));
        assert_eq!(t.pending, 0);
        assert_eq!(t.displacements, vec![(2, 2), (1, -1)]);
        // Later events do not overwrite first times.
        t.set_time(2.0);
        t.attempt(5, false, (1, 2), 1);
        assert_eq!(t.hits[swap].1, Some(1.25));
        assert_eq!(t.displacements, vec![(2, 1), (1, 0)]);
    }

    /// The `j`-th of `n` order statistics of uniforms on `(0, 1)` has mean `j/(n+1)` and variance
    /// `j(n−j+1)/((n+1)²(n+2))` (Beta(j, n−j+1), from memory). With 20 000 intervals of `n = 3`
    /// attempts each mean is checked at `|z| < 5.3` (two-sided normal tail 1.2e-7 each, three
    /// checks: false alarm < 4e-7 by the CLT). A clock that used `V^{1/(k+1)}` would put the
    /// first mean at 1/5 instead of 1/4, 36 standard errors away.
    #[test]
    fn clock_gives_order_statistics() {
        use motley_stream::sample_stream;
        let mut clock = OrderClock::new(Words::new(sample_stream(3, 0, 2)));
        let (n, reps) = (3u64, 20_000);
        let mut sums = [0.0; 3];
        for _ in 0..reps {
            clock.interval(2.0, 3.0, n);
            let mut last = 2.0;
            for s in &mut sums {
                let t = clock.next_time();
                assert!(t >= last && t <= 3.0);
                last = t;
                *s += t - 2.0;
            }
        }
        for (j, s) in sums.iter().enumerate() {
            let j = (j + 1) as f64;
            let nf = n as f64;
            let mean = j / (nf + 1.0);
            let var = j * (nf - j + 1.0) / ((nf + 1.0).powi(2) * (nf + 2.0));
            let z = (s / reps as f64 - mean) / (var / reps as f64).sqrt();
            assert!(z.abs() < 5.3, "order statistic {j}: z = {z}");
        }
        // The last time of an interval never passes its end, even for a huge count.
        clock.interval(0.1, 0.3, 1);
        assert!(clock.next_time() <= 0.3);
    }
}
