//! The strip kernel: up to `L` consecutive rows swept together as a wavefront, bit-identical to the
//! row kernel of `sweep.rs` on the same words.
//!
//! # Wavefront
//! The model has no dependency along anti-diagonals: vertex `(x, y)` needs only the outputs of
//! `(x − 1, y)` and `(x, y − 1)`. A strip of `L` rows is swept in `W + L − 1` steps; at step `t`,
//! lane `k` (row `y₀ + k`) processes column `t − k`, so the `L` vertices of one step lie on an
//! anti-diagonal and are independent. Lane `k` keeps its row's horizontal color in a register; the
//! color leaving lane `k` upward is the color entering lane `k + 1` from below at the next step (a
//! shift by one lane), lane 0 reads the vertical colors below the strip and lane `L − 1` writes the
//! colors above it, in place. Slots outside the rectangle (the two triangles at the ends of the strip
//! and the rows past the top in a short strip) carry a zero turn mask, so they change nothing.
//!
//! # Words
//! Each row's words are generated in bulk from its own stream (word `x − 1` of stream `y`, the
//! layout of the crate docs, unchanged), one chunk of columns at a time, and turned before the
//! wavefront into two turn bits per vertex: bit 0 "the stronger color turns if it came from below"
//! (`u ≥ cut_below`), bit 1 "… if it came from the left" (`u ≥ cut_left`). They are stored skewed
//! (entry `s · L + k` for lane `k` at step `t₀ + s`), so a step reads one contiguous vector. The
//! vertex update is then pure lane arithmetic: a comparison mask picks the bit, an XOR with the
//! resulting mask exchanges the two colors (the rule of [`crate::sweep`]).
//!
//! # Lanes
//! The color type is the narrowest of `u8`, `u16`, `u32` that holds the boundary's largest color
//! (no edge carries more), and `L` fills one 256-bit vector: 32, 16 or 8 rows. This code is
//! written on plain arrays and compiled twice: with AVX2 enabled and for the baseline target.
//! With AVX2 and colors up to `u16::MAX`, [`crate::Model::sample`] prefers the hand-written
//! kernel of `strip_avx2.rs` (16 rows of `u16`), which measured faster (its per-step gather
//! replaces the skewed stores of the transposition here).

use motley_colorblind::Color;
use motley_stream::sample_stream;
use rand_core::Rng;

use crate::sweep::Cuts;

/// Which kernel [`crate::Model::sample`] uses. All kernels give bit-identical samples; the choice
/// exists so that tests and benchmarks can compare them.
#[doc(hidden)]
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Kernel {
    /// The strip kernel where it applies (AVX2 when the processor has it), else the row kernel.
    #[default]
    Auto,
    /// The plain row-by-row kernel.
    Reference,
    /// The strip kernel wherever a read-out allows it, even for strips of one row (AVX2 when the
    /// processor has it).
    Strips,
    /// As [`Kernel::Strips`], without AVX2 (the portable build of the same code).
    Portable,
}

/// A lane color type: an unsigned integer no wider than [`Color`].
pub(crate) trait Lane:
    Copy
    + Default
    + Ord
    + core::fmt::Debug
    + core::ops::BitAnd<Output = Self>
    + core::ops::BitOr<Output = Self>
    + core::ops::BitXor<Output = Self>
    + core::ops::Not<Output = Self>
{
    /// The largest color this type holds.
    const MAX_COLOR: Color;
    /// The color `c ≤ MAX_COLOR` in this type.
    fn from_color(c: Color) -> Self;
    /// Back to a [`Color`].
    fn to_color(self) -> Color;
    /// All ones if `b`, else zero.
    fn mask(b: bool) -> Self;
    /// The small integer `b` (< 256) in this type.
    fn small(b: u32) -> Self;
    /// This type's scratch in `s`, replacing scratch of another type.
    fn scratch(s: &mut StripScratch) -> &mut StripState<Self>;
}

macro_rules! lane {
    ($t:ty, $variant:ident) => {
        impl Lane for $t {
            const MAX_COLOR: Color = <$t>::MAX as Color;
            #[inline(always)]
            fn from_color(c: Color) -> Self {
                c as $t
            }
            #[inline(always)]
            fn to_color(self) -> Color {
                Color::from(self)
            }
            #[inline(always)]
            fn mask(b: bool) -> Self {
                (b as $t).wrapping_neg()
            }
            #[inline(always)]
            fn small(b: u32) -> Self {
                b as $t
            }
            fn scratch(s: &mut StripScratch) -> &mut StripState<Self> {
                if !matches!(s, StripScratch::$variant(_)) {
                    *s = StripScratch::$variant(StripState::default());
                }
                match s {
                    StripScratch::$variant(state) => state,
                    _ => unreachable!("just set"),
                }
            }
        }
    };
}
lane!(u8, U8);
lane!(u16, U16);
lane!(u32, U32);

/// The strip kernel's buffers, kept in the [`crate::Readout`] so that repeated sampling allocates
/// nothing.
#[derive(Debug, Clone, Default)]
pub(crate) enum StripScratch {
    /// Not used yet.
    #[default]
    Empty,
    U8(StripState<u8>),
    U16(StripState<u16>),
    U32(StripState<u32>),
    Avx2(crate::strip_avx2::Avx2State),
}

/// Steps of the wavefront per chunk: the turn bits of a chunk are `CHUNK · L` lane values, 8 KiB
/// for every lane type (`L · size_of::<T>()` is always 32 bytes), so they stay in L1 between being
/// written and being read.
const CHUNK: usize = 256;

/// The state and buffers of the strip kernel for lane type `T`.
#[derive(Debug, Clone, Default)]
pub(crate) struct StripState<T> {
    width: usize,
    lanes: usize,
    /// `L − 1` leading slots, then the vertical colors of columns `1..=W`, then `L − 1` trailing
    /// slots (the leading ones receive lane `L − 1`'s idle outputs, the trailing ones feed lane 0's
    /// idle inputs; neither reaches the rectangle).
    vert: Vec<T>,
    /// Skewed turn bits of one chunk: entry `s · L + k` is lane `k` at step `t₀ + s`; bit 0 is
    /// set if a stronger color from below turns, bit 1 if a stronger color from the left turns.
    turns: Vec<T>,
    /// One chunk of one row's keystream bytes.
    bytes: Vec<u8>,
}

impl<T: Lane> StripState<T> {
    /// Sizes the buffers for `width` columns and `lanes` lanes.
    fn prepare(&mut self, width: usize, lanes: usize) {
        if self.width != width || self.lanes != lanes {
            self.width = width;
            self.lanes = lanes;
            self.vert = vec![T::default(); width + 2 * (lanes - 1)];
            self.turns = vec![T::default(); CHUNK * lanes];
            self.bytes = vec![0; 4 * CHUNK];
        }
    }

    /// Copies the vertical colors `vert` (length `W`, every color ≤ `T::MAX_COLOR`) in.
    fn load(&mut self, vert: &[Color]) {
        let off = self.lanes - 1;
        for (d, &c) in self.vert[off..off + self.width].iter_mut().zip(vert) {
            *d = T::from_color(c);
        }
    }

    /// Copies the vertical colors out into `vert` (length `W`).
    fn store(&self, vert: &mut [Color]) {
        let off = self.lanes - 1;
        for (d, &c) in vert.iter_mut().zip(&self.vert[off..off + self.width]) {
            *d = c.to_color();
        }
    }
}

/// Writes the turn bits of steps `t0..t0 + steps` for the `rngs.len()` active lanes (lane `k`
/// draws the next words of its row's stream, one per column it reaches in these steps); every
/// other slot gets no bit (nothing turns).
fn fill_turns<T: Lane, const L: usize>(
    state: &mut StripState<T>,
    rngs: &mut [motley_stream::ChaCha8Rng],
    t0: usize,
    steps: usize,
    cuts: Cuts,
) {
    let w = state.width;
    let turns = &mut state.turns[..steps * L];
    turns.fill(T::default());
    let (below, left) = (cuts.below, cuts.left);
    for (k, rng) in rngs.iter_mut().enumerate().take(L) {
        // Lane k processes column t − k (0-based) at step t.
        let first = t0.max(k).min(w + k);
        let last = (t0 + steps).max(k).min(w + k);
        let n = last - first;
        if n == 0 {
            continue;
        }
        let bytes = &mut state.bytes[..4 * n];
        rng.fill_bytes(bytes);
        let slots = turns.chunks_exact_mut(L).skip(first - t0);
        for (slot, u) in slots.zip(bytes.chunks_exact(4)) {
            let u = u64::from(u32::from_le_bytes([u[0], u[1], u[2], u[3]]));
            slot[k] = T::small(u32::from(u >= below) | (u32::from(u >= left) << 1));
        }
    }
}

/// The wavefront over steps `t0..t0 + steps` of a strip (`turns.len() = steps · L`): `v` is the
/// color entering each lane from below at step `t0`, `carry` the horizontal color of each lane;
/// both are carried over to the next chunk.
#[inline(always)]
fn wavefront<T: Lane, const L: usize>(
    vert: &mut [T],
    t0: usize,
    turns: &[T],
    v: &mut [T; L],
    carry: &mut [T; L],
) {
    let steps = turns.len() / L;
    assert!(vert.len() >= t0 + steps + L - 1);
    let vert = &mut vert[t0..t0 + steps + L - 1];
    let (one, two, zero) = (T::small(1), T::small(2), T::default());
    let mut vv = *v;
    let mut c = *carry;
    for (t, bits) in turns.chunks_exact(L).enumerate() {
        vv[0] = vert[t + L - 1];
        let mut up = [T::default(); L];
        for k in 0..L {
            let below_wins = T::mask(vv[k] > c[k]);
            // Bit 0 counts when the color from below is the stronger one, bit 1 otherwise.
            let which = (one & below_wins) | (two & !below_wins);
            let turn = !T::mask(bits[k] & which == zero);
            let d = (vv[k] ^ c[k]) & turn;
            up[k] = vv[k] ^ d;
            c[k] = c[k] ^ d;
        }
        vert[t] = up[L - 1];
        vv[1..].copy_from_slice(&up[..L - 1]);
    }
    *v = vv;
    *carry = c;
}

#[cfg(target_arch = "x86_64")]
#[target_feature(enable = "avx2")]
fn wavefront_avx2<T: Lane, const L: usize>(
    vert: &mut [T],
    t0: usize,
    turns: &[T],
    v: &mut [T; L],
    carry: &mut [T; L],
) {
    wavefront::<T, L>(vert, t0, turns, v, carry)
}

/// Whether the AVX2 build may run here.
fn avx2_available() -> bool {
    #[cfg(target_arch = "x86_64")]
    {
        std::is_x86_feature_detected!("avx2")
    }
    #[cfg(not(target_arch = "x86_64"))]
    {
        false
    }
}

/// Everything the strip sweeps of one sample need besides the scratch.
pub(crate) struct StripRun<'a> {
    pub seed: u64,
    pub index: u64,
    pub cuts: Cuts,
    /// Use the AVX2 build if available.
    pub simd: bool,
    /// Colors entering each row from the left (row 1 first).
    pub left: &'a [Color],
    /// Colors leaving each row through the right (row 1 first), filled in.
    pub right: &'a mut [Color],
}

impl StripRun<'_> {
    /// Sweeps rows `y0..y0 + rows` (`rows ≤ L`) over the state in `state`.
    fn strip<T: Lane, const L: usize>(
        &mut self,
        state: &mut StripState<T>,
        y0: usize,
        rows: usize,
    ) {
        debug_assert!(rows >= 1 && rows <= L && state.lanes == L);
        let mut streams: Vec<motley_stream::ChaCha8Rng> = (0..rows)
            .map(|k| sample_stream(self.seed, self.index, (y0 + k) as u64))
            .collect();
        let mut carry = [T::default(); L];
        for (c, &l) in carry.iter_mut().zip(&self.left[y0 - 1..y0 - 1 + rows]) {
            *c = T::from_color(l);
        }
        let mut v = [T::default(); L];
        let simd = self.simd && avx2_available();
        let total = state.width + L - 1;
        let mut t0 = 0;
        while t0 < total {
            let steps = CHUNK.min(total - t0);
            fill_turns::<T, L>(state, &mut streams, t0, steps, self.cuts);
            let StripState { vert, turns, .. } = &mut *state;
            let bits = &turns[..steps * L];
            #[cfg(target_arch = "x86_64")]
            if simd {
                // SAFETY: the processor supports AVX2 (checked at run time by `avx2_available`).
                unsafe { wavefront_avx2::<T, L>(vert, t0, bits, &mut v, &mut carry) };
                t0 += steps;
                continue;
            }
            let _ = simd;
            wavefront::<T, L>(vert, t0, bits, &mut v, &mut carry);
            t0 += steps;
        }
        for (r, &c) in self.right[y0 - 1..y0 - 1 + rows].iter_mut().zip(&carry) {
            *r = c.to_color();
        }
    }
}

/// Sweeps rows `from..=to` of one sample with strips of lane type `T` (`L` lanes), starting from
/// and ending in the vertical colors `vert`. Every color must be ≤ `T::MAX_COLOR`.
pub(crate) fn sweep_rows<T: Lane, const L: usize>(
    run: &mut StripRun<'_>,
    scratch: &mut StripScratch,
    vert: &mut [Color],
    from: usize,
    to: usize,
) {
    let state = T::scratch(scratch);
    state.prepare(vert.len(), L);
    state.load(vert);
    let mut y = from;
    while y <= to {
        let rows = (to + 1 - y).min(L);
        run.strip::<T, L>(state, y, rows);
        y += rows;
    }
    state.store(vert);
}

/// Whether the strip kernel can hold colors up to `max` in lane type `T`.
pub(crate) fn fits<T: Lane>(max: Color) -> bool {
    max <= T::MAX_COLOR
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::fill_words;
    use crate::sweep::sweep_row;

    /// One strip against the row kernel on the same words, every lane type, short strips included.
    fn check<T: Lane, const L: usize>(w: usize, h: usize, max: Color, simd: bool) {
        let cuts = Cuts {
            below: 0x5000_0000,
            left: 0xA000_0000,
        };
        let mut rng = sample_stream(77, w as u64, h as u64);
        let mut color = || {
            rng.next_u32()
                .checked_rem(max.wrapping_add(1))
                .unwrap_or(rng.next_u32())
        };
        let vert0: Vec<Color> = (0..w).map(|_| color()).collect();
        let left: Vec<Color> = (0..h).map(|_| color()).collect();
        // Reference.
        let mut vert = vert0.clone();
        let mut right_ref = vec![0; h];
        let mut bytes = vec![0; 4 * w];
        let mut words = vec![0; w];
        for y in 1..=h {
            fill_words(3, 4, y as u64, &mut bytes, &mut words);
            right_ref[y - 1] = sweep_row(&mut vert, &words, left[y - 1], cuts);
        }
        // Strips.
        let mut fast = vert0;
        let mut right = vec![0; h];
        let mut run = StripRun {
            seed: 3,
            index: 4,
            cuts,
            simd,
            left: &left,
            right: &mut right,
        };
        let mut scratch = StripScratch::default();
        sweep_rows::<T, L>(&mut run, &mut scratch, &mut fast, 1, h);
        assert_eq!((fast, right), (vert, right_ref), "w {w} h {h} max {max}");
    }

    #[test]
    fn strips_match_rows() {
        for simd in [false, true] {
            for (w, h) in [(1, 1), (1, 40), (3, 2), (17, 33), (40, 7), (64, 64)] {
                check::<u8, 32>(w, h, 255, simd);
                check::<u8, 32>(w, h, 2, simd);
                check::<u16, 16>(w, h, 65535, simd);
                check::<u32, 8>(w, h, u32::MAX, simd);
                check::<u32, 8>(w, h, 5, simd);
            }
        }
    }
}
