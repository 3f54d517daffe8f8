//! A buffered source of 32-bit words from one ChaCha8 stream, and exact bounded integers.
//!
//! Words are produced in bulk by `fill_bytes` into a 1 KiB buffer (the keystream's fast path) and
//! handed out in order; the sequence is exactly the stream's `next_u32` sequence (little-endian words),
//! so the layout is "word `w` of the stream" whatever the buffer size. A bounded integer in `[0, m)` is
//! drawn by Lemire's multiply-shift with rejection (Lemire 2019, "Fast random integer generation in an
//! interval"): exactly uniform, one word almost always, another word per rejection.

use core::convert::Infallible;

use motley_stream::ChaCha8Rng;
use rand_core::{Rng, TryRng};

const BUF_WORDS: usize = 256;

/// Words of one stream, buffered.
pub(crate) struct Words {
    rng: ChaCha8Rng,
    buf: [u32; BUF_WORDS],
    pos: usize,
}

impl Words {
    /// Wraps a stream positioned where the words should start.
    pub(crate) fn new(rng: ChaCha8Rng) -> Self {
        Words {
            rng,
            buf: [0; BUF_WORDS],
            pos: BUF_WORDS,
        }
    }

    #[cold]
    fn refill(&mut self) {
        // SAFETY: `buf` is `BUF_WORDS` initialised `u32`s, i.e. `4 · BUF_WORDS` bytes with no
        // padding, and any byte pattern is a valid `u32`; the view lives only for this call.
        let bytes = unsafe {
            core::slice::from_raw_parts_mut(self.buf.as_mut_ptr().cast::<u8>(), BUF_WORDS * 4)
        };
        self.rng.fill_bytes(bytes);
        // The stream's words are little-endian; on a big-endian target swap them into place.
        if cfg!(target_endian = "big") {
            for w in self.buf.iter_mut() {
                *w = u32::from_le(*w);
            }
        }
        self.pos = 0;
    }

    /// The next word of the stream.
    #[inline(always)]
    pub(crate) fn word(&mut self) -> u32 {
        if self.pos == BUF_WORDS {
            self.refill();
        }
        let w = self.buf[self.pos];
        self.pos += 1;
        w
    }

    /// A uniform integer in `[0, m)`, `m ≥ 1` (Lemire's method with rejection).
    #[inline(always)]
    pub(crate) fn below(&mut self, m: u32) -> u32 {
        let mut prod = u64::from(self.word()) * u64::from(m);
        if (prod as u32) < m {
            let threshold = m.wrapping_neg() % m;
            while (prod as u32) < threshold {
                prod = u64::from(self.word()) * u64::from(m);
            }
        }
        (prod >> 32) as u32
    }
}

/// Lets distributions from `rand_distr` draw from the same word sequence (`u64` = low word first).
impl TryRng for Words {
    type Error = Infallible;

    fn try_next_u32(&mut self) -> Result<u32, Infallible> {
        Ok(self.word())
    }

    fn try_next_u64(&mut self) -> Result<u64, Infallible> {
        let lo = u64::from(self.word());
        let hi = u64::from(self.word());
        Ok(lo | (hi << 32))
    }

    fn try_fill_bytes(&mut self, dst: &mut [u8]) -> Result<(), Infallible> {
        for chunk in dst.chunks_mut(4) {
            let w = self.word().to_le_bytes();
            chunk.copy_from_slice(&w[..chunk.len()]);
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use motley_stream::sample_stream;

    #[test]
    fn buffered_words_are_the_stream_words() {
        let mut direct = sample_stream(9, 4, 1);
        let mut words = Words::new(sample_stream(9, 4, 1));
        for _ in 0..3 * BUF_WORDS + 7 {
            assert_eq!(words.word(), direct.next_u32());
        }
        let lo = u64::from(direct.next_u32());
        let hi = u64::from(direct.next_u32());
        assert_eq!(words.next_u64(), lo | (hi << 32));
    }

    #[test]
    fn bounded_integers_stay_in_range_and_cover_it() {
        let mut words = Words::new(sample_stream(1, 1, 1));
        let mut seen = [0u32; 7];
        for _ in 0..7000 {
            let k = words.below(7);
            seen[k as usize] += 1;
        }
        assert!(seen.iter().all(|&c| c > 800 && c < 1200), "{seen:?}");
        assert_eq!(words.below(1), 0);
        // m = 2³¹ + 1 rejects almost half of all words; still in range.
        for _ in 0..100 {
            assert!(words.below((1 << 31) + 1) <= 1 << 31);
        }
    }
}
