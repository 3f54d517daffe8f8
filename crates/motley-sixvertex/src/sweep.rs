//! The row kernel: one row of vertices swept left to right, with O(W) state.
//!
//! The state is the vector of vertical colors (those entering the row from below, overwritten by
//! those leaving it upward) and the one horizontal color carried along the row. The vertex function
//! is branch-free: the threshold is chosen with an arithmetic mask on "the color from below is
//! stronger", and the exchange of the two colors is an XOR with a mask, so the compiler has no
//! data-dependent branch to mispredict. [`vertex`] is the single definition of the rule; every kernel
//! (this one and any faster multi-row kernel added later) must agree with it bit for bit on the same
//! words.

use motley_colorblind::Color;

use crate::VertexRule;

/// The two thresholds used at a vertex: the stronger color from below goes straight iff
/// `u < below`, the stronger color from the left goes straight iff `u < left`.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) struct Cuts {
    pub below: u64,
    pub left: u64,
}

/// One vertex: `below` enters from below, `left` from the left, `u` is the vertex's word.
/// Returns `(up, right)`.
#[inline(always)]
pub(crate) fn vertex(below: Color, left: Color, u: u32, cuts: Cuts) -> (Color, Color) {
    // All ones when the color from below is the stronger one.
    let below_wins = opaque_u64(u64::from(below > left).wrapping_neg());
    let cut = cuts.left ^ ((cuts.below ^ cuts.left) & below_wins);
    // All ones when the stronger color turns (the two colors exchange their outgoing edges).
    let turn = opaque_u64(u64::from(u64::from(u) >= cut).wrapping_neg()) as u32;
    let d = (below ^ left) & turn;
    (below ^ d, left ^ d)
}

/// The identity, hidden from the optimiser. Without it LLVM recognises `x & mask(c)` as a select on
/// `c` and then (x86 cmov conversion, because the carried color is a long dependency chain) as a
/// branch on a random bit, which is mispredicted half the time. The empty `asm!` block (its text is
/// only a comment naming the register) costs no instruction.
#[inline(always)]
fn opaque_u64(x: u64) -> u64 {
    #[cfg(any(target_arch = "x86_64", target_arch = "aarch64"))]
    {
        let mut x = x;
        // SAFETY: the assembly is a comment: it reads and writes nothing, leaves the register, the
        // flags, the stack and memory unchanged, and has no side effects.
        unsafe {
            core::arch::asm!("/* {0} */", inout(reg) x, options(pure, nomem, nostack, preserves_flags))
        };
        x
    }
    #[cfg(not(any(target_arch = "x86_64", target_arch = "aarch64")))]
    {
        x
    }
}

/// The deliberately wrong rule [`VertexRule::OccupancyOnly`]: two paths that meet always go
/// straight; a lone path decides with `b1` (from below) or `b2` (from the left).
#[inline]
fn vertex_occupancy_only(below: Color, left: Color, u: u32, cuts: Cuts) -> (Color, Color) {
    if below != 0 && left != 0 {
        (below, left)
    } else {
        vertex(below, left, u, cuts)
    }
}

/// Sweeps one row: `vert` holds the colors entering from below and is overwritten by the colors
/// leaving upward; `words[x − 1]` is the word of column `x`; `carry` enters from the left. Returns
/// the color leaving through the right.
#[inline]
pub(crate) fn sweep_row(vert: &mut [Color], words: &[u32], mut carry: Color, cuts: Cuts) -> Color {
    for (v, &u) in vert.iter_mut().zip(words) {
        let (up, right) = vertex(*v, carry, u, cuts);
        *v = up;
        carry = right;
    }
    carry
}

/// As [`sweep_row`], also writing the horizontal color just right of column `x` into
/// `horiz[x − 1]`.
#[inline]
pub(crate) fn sweep_row_recording(
    vert: &mut [Color],
    words: &[u32],
    mut carry: Color,
    cuts: Cuts,
    horiz: &mut [Color],
) -> Color {
    for ((v, &u), h) in vert.iter_mut().zip(words).zip(horiz.iter_mut()) {
        let (up, right) = vertex(*v, carry, u, cuts);
        *v = up;
        carry = right;
        *h = right;
    }
    carry
}

/// Sweeps one row under `rule`, recording horizontal colors if `horiz` is given. The standard rule
/// goes to the branch-free kernels; the wrong rules (test-only) to a plain loop.
#[inline]
pub(crate) fn sweep_row_with(
    rule: VertexRule,
    vert: &mut [Color],
    words: &[u32],
    carry: Color,
    cuts: Cuts,
    horiz: Option<&mut [Color]>,
) -> Color {
    match rule {
        VertexRule::Standard => match horiz {
            Some(h) => sweep_row_recording(vert, words, carry, cuts, h),
            None => sweep_row(vert, words, carry, cuts),
        },
        VertexRule::SwappedWeights => {
            let swapped = Cuts {
                below: cuts.left,
                left: cuts.below,
            };
            match horiz {
                Some(h) => sweep_row_recording(vert, words, carry, swapped, h),
                None => sweep_row(vert, words, carry, swapped),
            }
        }
        VertexRule::OccupancyOnly => {
            let mut carry = carry;
            let mut horiz = horiz;
            for (x, (v, &u)) in vert.iter_mut().zip(words).enumerate() {
                let (up, right) = vertex_occupancy_only(*v, carry, u, cuts);
                *v = up;
                carry = right;
                if let Some(h) = horiz.as_deref_mut() {
                    h[x] = right;
                }
            }
            carry
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The rule written plainly, with branches, as in the crate docs.
    fn vertex_plain(i: Color, j: Color, u: u32, cuts: Cuts) -> (Color, Color) {
        if i == j {
            (i, j)
        } else if i > j {
            if u64::from(u) < cuts.below {
                (i, j)
            } else {
                (j, i)
            }
        } else if u64::from(u) < cuts.left {
            (i, j)
        } else {
            (j, i)
        }
    }

    #[test]
    fn branch_free_vertex_matches_plain_rule() {
        let cut_values = [0u64, 1, 1 << 31, (1 << 32) - 1, 1 << 32];
        let words = [0u32, 1, 1 << 31, u32::MAX - 1, u32::MAX];
        for &below in &cut_values {
            for &left in &cut_values {
                let cuts = Cuts { below, left };
                for &u in &words {
                    for i in 0..4 {
                        for j in 0..4 {
                            assert_eq!(vertex(i, j, u, cuts), vertex_plain(i, j, u, cuts));
                        }
                    }
                }
            }
        }
    }

    #[test]
    fn recording_matches_plain_sweep() {
        let cuts = Cuts {
            below: 1 << 31,
            left: 3 << 30,
        };
        let words: Vec<u32> = (0..16u32).map(|k| k.wrapping_mul(0x9E37_79B9)).collect();
        let mut a: Vec<Color> = (0..16).map(|k| k % 5).collect();
        let mut b = a.clone();
        let mut h = vec![0; 16];
        let ra = sweep_row(&mut a, &words, 3, cuts);
        let rb = sweep_row_recording(&mut b, &words, 3, cuts, &mut h);
        assert_eq!((a, ra), (b, rb));
        assert_eq!(h[15], ra);
    }
}
