//! The strip kernel for AVX2 with 16 rows of `u16` colors per strip, written with `std::arch`
//! intrinsics: the same wavefront as `strip.rs` (lane `k` = row `y₀ + k` processes column `t − k`
//! at step `t`), bit-identical to it and to the row kernel on the same words.
//!
//! Each row's words go from its stream straight into its own row of a small buffer (bulk
//! `fill_bytes`, one chunk of columns at a time, so the buffers stay in L1) and are turned, row by
//! row (vectorised), into two turn bits per vertex, already aligned to the step that uses them
//! (lane `k` lags `k` steps); slots outside the rectangle (the two ends of the strip, rows past the
//! top of a short strip) keep no bit. The bits of rows `2m` and `2m + 1` are interleaved into one
//! `u32` per step, so a step fetches its 16 lanes with one `vpgatherdd` of 8 words, which replaces
//! the transposition of the portable kernel. Every update is lane arithmetic: no data-dependent
//! branch.

#[cfg(target_arch = "x86_64")]
use core::arch::x86_64::*;

use motley_colorblind::Color;
use motley_stream::{sample_stream, ChaCha8Rng};
use rand_core::Rng;

use crate::strip::{StripRun, StripScratch};

/// Rows per strip (one 256-bit vector of `u16`).
pub(crate) const LANES: usize = 16;

/// Steps per chunk: the words of a chunk are `LANES · CHUNK · 4` = 16 KiB.
const CHUNK: usize = 256;

/// The buffers of this kernel.
#[derive(Debug, Clone, Default)]
pub(crate) struct Avx2State {
    width: usize,
    /// `LANES − 1` leading slots, the vertical colors of columns `1..=W`, `LANES` trailing slots.
    vert: Vec<u16>,
    /// Row `k` (`CHUNK` words) holds lane `k`'s words for the steps of the current chunk.
    words: Vec<u32>,
    /// Row `k` holds lane `k`'s turn bits for those steps (bit 0: a stronger color from below
    /// turns; bit 1: a stronger color from the left turns; 0 outside the rectangle).
    bits: Vec<u16>,
    /// Row `m` interleaves the bits of lanes `2m` and `2m + 1` (low and high half of each `u32`),
    /// so that one gather of 8 words yields the 16 lanes of a step in order.
    pairs: Vec<u32>,
}

impl Avx2State {
    fn prepare(&mut self, width: usize) {
        if self.width != width || self.vert.is_empty() {
            self.width = width;
            self.vert = vec![0; width + 2 * LANES];
            self.words = vec![0; LANES * CHUNK];
            self.bits = vec![0; LANES * CHUNK];
            self.pairs = vec![0; LANES / 2 * CHUNK];
        }
    }
}

/// Sweeps rows `from..=to` with 16-row strips if the processor has AVX2 and returns `true`;
/// returns `false` (and does nothing) otherwise. `vert` (length `W`) holds colors ≤ `u16::MAX`.
pub(crate) fn try_sweep_rows(
    run: &mut StripRun<'_>,
    scratch: &mut StripScratch,
    vert: &mut [Color],
    from: usize,
    to: usize,
) -> bool {
    #[cfg(target_arch = "x86_64")]
    if std::is_x86_feature_detected!("avx2") {
        if !matches!(scratch, StripScratch::Avx2(_)) {
            *scratch = StripScratch::Avx2(Avx2State::default());
        }
        if let StripScratch::Avx2(state) = scratch {
            // SAFETY: the processor supports AVX2 (checked just above).
            unsafe { sweep_rows(run, state, vert, from, to) };
            return true;
        }
    }
    let _ = (run, scratch, vert, from, to);
    false
}

/// Sweeps rows `from..=to` with 16-row strips, starting from and ending in `vert` (length `W`,
/// every color ≤ `u16::MAX`).
///
/// # Safety
/// The processor must support AVX2.
#[cfg(target_arch = "x86_64")]
#[target_feature(enable = "avx2")]
unsafe fn sweep_rows(
    run: &mut StripRun<'_>,
    state: &mut Avx2State,
    vert: &mut [Color],
    from: usize,
    to: usize,
) {
    let w = vert.len();
    state.prepare(w);
    for (d, &c) in state.vert[LANES - 1..LANES - 1 + w]
        .iter_mut()
        .zip(vert.iter())
    {
        *d = c as u16;
    }
    let mut y = from;
    while y <= to {
        let rows = (to + 1 - y).min(LANES);
        // SAFETY: AVX2 is available (this function's contract).
        unsafe { strip(run, state, y, rows) };
        y += rows;
    }
    for (d, &c) in vert.iter_mut().zip(&state.vert[LANES - 1..LANES - 1 + w]) {
        *d = Color::from(c);
    }
}

/// One strip of `rows ≤ 16` rows starting at row `y0`.
///
/// # Safety
/// The processor must support AVX2.
#[cfg(target_arch = "x86_64")]
#[target_feature(enable = "avx2")]
unsafe fn strip(run: &mut StripRun<'_>, state: &mut Avx2State, y0: usize, rows: usize) {
    let w = state.width;
    let mut streams: Vec<ChaCha8Rng> = (0..rows)
        .map(|k| sample_stream(run.seed, run.index, (y0 + k) as u64))
        .collect();
    // u ≥ cut for a cut in [0, 2³²]: compare with min(cut, 2³² − 1), never if cut = 2³².
    let cb = run.cuts.below.min(u64::from(u32::MAX)) as u32;
    let allow_b = run.cuts.below <= u64::from(u32::MAX);
    let cl = run.cuts.left.min(u64::from(u32::MAX)) as u32;
    let allow_l = run.cuts.left <= u64::from(u32::MAX);
    let stride = CHUNK as i32;
    let idx = _mm256_setr_epi32(
        0,
        stride,
        2 * stride,
        3 * stride,
        4 * stride,
        5 * stride,
        6 * stride,
        7 * stride,
    );
    let one = _mm256_set1_epi16(1);
    let zero = _mm256_setzero_si256();

    let mut carry_arr = [0u16; LANES];
    for (c, &l) in carry_arr.iter_mut().zip(&run.left[y0 - 1..y0 - 1 + rows]) {
        *c = l as u16;
    }
    // SAFETY: `carry_arr` is 32 readable bytes.
    let mut c = unsafe { _mm256_loadu_si256(carry_arr.as_ptr().cast()) };
    let mut v = _mm256_setzero_si256();
    let total = w + LANES - 1;
    let mut t0 = 0;
    while t0 < total {
        let steps = CHUNK.min(total - t0);
        state.bits.fill(0);
        for (k, rng) in streams.iter_mut().enumerate() {
            let first = t0.max(k).min(w + k);
            let last = (t0 + steps).max(k).min(w + k);
            if last > first {
                let range = k * CHUNK + first - t0..k * CHUNK + last - t0;
                let row = &mut state.words[range.clone()];
                // SAFETY: a `u32` slice viewed as its bytes: same memory, 4 bytes per word, any byte
                // pattern is a valid `u32`; on x86-64 (little-endian) word `j` of the view is
                // `u32::from_le_bytes` of bytes `4j..4j + 4`, the stream's `next_u32` order.
                let bytes = unsafe {
                    core::slice::from_raw_parts_mut(row.as_mut_ptr().cast::<u8>(), 4 * row.len())
                };
                rng.fill_bytes(bytes);
                for (b, &u) in state.bits[range].iter_mut().zip(row.iter()) {
                    *b = u16::from((u >= cb) & allow_b) | (u16::from((u >= cl) & allow_l) << 1);
                }
            }
        }
        for (m, pair) in state.pairs.chunks_exact_mut(CHUNK).enumerate() {
            let lo = &state.bits[2 * m * CHUNK..(2 * m + 1) * CHUNK];
            let hi = &state.bits[(2 * m + 1) * CHUNK..(2 * m + 2) * CHUNK];
            for ((p, &l), &h) in pair[..steps].iter_mut().zip(lo).zip(hi) {
                *p = u32::from(l) | (u32::from(h) << 16);
            }
        }
        let base = state.pairs.as_ptr();
        let vert = state.vert.as_mut_ptr();
        assert!(t0 + steps + LANES <= state.vert.len());
        for s in 0..steps {
            let t = t0 + s;
            // SAFETY: every gathered index m·CHUNK + s < LANES / 2 · CHUNK is inside `pairs`,
            // and t + LANES − 1 < vert.len() by the assertion above; AVX2 is available.
            unsafe {
                let bits = _mm256_i32gather_epi32::<4>(base.add(s).cast::<i32>(), idx);
                // Lane 0 takes the color below the strip at its column.
                v = _mm256_insert_epi16::<0>(v, *vert.add(t + LANES - 1) as i16);
                // The color from below is not the stronger one iff max(v, c) = c.
                let left_wins = _mm256_cmpeq_epi16(_mm256_max_epu16(v, c), c);
                // Bit 0 decides when the color from below is stronger, bit 1 otherwise.
                let which = _mm256_sub_epi16(one, left_wins);
                let stay = _mm256_cmpeq_epi16(_mm256_and_si256(bits, which), zero);
                let d = _mm256_andnot_si256(stay, _mm256_xor_si256(v, c));
                let up = _mm256_xor_si256(v, d);
                c = _mm256_xor_si256(c, d);
                *vert.add(t) = _mm256_extract_epi16::<15>(up) as u16;
                // Lane k + 1 takes lane k's upward color: shift up by one 16-bit lane.
                let low_half_up = _mm256_permute2x128_si256::<0x08>(up, up);
                v = _mm256_alignr_epi8::<14>(up, low_half_up);
            }
        }
        t0 += steps;
    }
    // SAFETY: `carry_arr` is 32 writable bytes.
    unsafe { _mm256_storeu_si256(carry_arr.as_mut_ptr().cast(), c) };
    for (r, &c) in run.right[y0 - 1..y0 - 1 + rows].iter_mut().zip(&carry_arr) {
        *r = Color::from(c);
    }
}
