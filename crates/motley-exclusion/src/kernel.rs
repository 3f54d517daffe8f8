//! The segment/ring event loop: the hot kernel.
//!
//! One attempt = one uniform bond (Lemire bounded integer on a word) and, only when `p > 0` and
//! `q > 0`, one direction word decided by `Chance(p / (p + q))`. Neither choice looks at the
//! configuration, so the same words drive every coloring of the same lattice (the pathwise
//! projection coupling). The exchange itself is branch-free: with larger colors stronger (hole = 0 the
//! weakest) a rightward attempt leaves `(min, max)` on the bond and a leftward one `(max, min)`;
//! equal colors are left as they are automatically. The direction is a compile-time constant for
//! TASEP (`q = 0`) and for `p = 0`, so those loops draw one word per attempt.

use motley_colorblind::Color;
use motley_stream::Chance;

use crate::observer::Observer;
use crate::rates::Direction;
use crate::words::Words;

const RIGHT: u8 = 0;
const LEFT: u8 = 1;
const MIXED: u8 = 2;

/// Performs `attempts` attempted exchanges on `sites` (a ring if `ring`, else a segment).
pub(crate) fn run<O: Observer>(
    sites: &mut [Color],
    ring: bool,
    attempts: u64,
    words: &mut Words,
    direction: Direction,
    observer: &mut O,
) {
    match (direction, ring) {
        (Direction::Right, true) => {
            run_mode::<RIGHT, true, O>(sites, attempts, words, None, observer)
        }
        (Direction::Right, false) => {
            run_mode::<RIGHT, false, O>(sites, attempts, words, None, observer)
        }
        (Direction::Left, true) => {
            run_mode::<LEFT, true, O>(sites, attempts, words, None, observer)
        }
        (Direction::Left, false) => {
            run_mode::<LEFT, false, O>(sites, attempts, words, None, observer)
        }
        (Direction::Mixed(c), true) => {
            run_mode::<MIXED, true, O>(sites, attempts, words, Some(c), observer)
        }
        (Direction::Mixed(c), false) => {
            run_mode::<MIXED, false, O>(sites, attempts, words, Some(c), observer)
        }
    }
}

#[inline(always)]
fn run_mode<const MODE: u8, const RING: bool, O: Observer>(
    sites: &mut [Color],
    attempts: u64,
    words: &mut Words,
    chance: Option<Chance>,
    observer: &mut O,
) {
    let n = sites.len();
    let bonds = if RING { n } else { n - 1 } as u32;
    let cut = chance.map_or(0, Chance::cut);
    for _ in 0..attempts {
        let x = words.below(bonds) as usize;
        let right = match MODE {
            RIGHT => true,
            LEFT => false,
            _ => u64::from(words.word()) < cut,
        };
        let y = if RING {
            let y = x + 1;
            if y == n {
                0
            } else {
                y
            }
        } else {
            x + 1
        };
        debug_assert!(x < n && y < n);
        // SAFETY: `below(bonds)` is < bonds ≤ n, so x < n; y is x + 1 < n on the segment
        // (x < n − 1) and wraps to 0 on the ring.
        let (a, b) = unsafe { (*sites.get_unchecked(x), *sites.get_unchecked(y)) };
        let lo = a.min(b);
        let hi = a.max(b);
        let (new_left, new_right) = match MODE {
            RIGHT => (lo, hi),
            LEFT => (hi, lo),
            _ => {
                // Arithmetic mask: the compiler keeps this branch-free.
                let m = (right as u32).wrapping_neg();
                ((lo & m) | (hi & !m), (hi & m) | (lo & !m))
            }
        };
        // SAFETY: as above.
        unsafe {
            *sites.get_unchecked_mut(x) = new_left;
            *sites.get_unchecked_mut(y) = new_right;
        }
        if O::ACTIVE {
            observer.attempt(x as i64 + 1, right, (a, b), new_right);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::observer::Silent;
    use crate::Rates;
    use motley_stream::sample_stream;

    #[test]
    fn tasep_sorts_a_segment_eventually() {
        let mut s = vec![3, 0, 2, 1, 0];
        let mut w = Words::new(sample_stream(0, 0, 1));
        run(
            &mut s,
            false,
            10_000,
            &mut w,
            Rates::tasep(1.0).unwrap().direction(),
            &mut Silent,
        );
        assert_eq!(s, vec![0, 0, 1, 2, 3]);
        let mut s = vec![3, 0, 2, 1, 0];
        run(
            &mut s,
            false,
            10_000,
            &mut w,
            Rates::new(0.0, 1.0).unwrap().direction(),
            &mut Silent,
        );
        assert_eq!(s, vec![3, 2, 1, 0, 0]);
    }
}
