//! Arrangements of a multiset of colors, ranked in lexicographic order: the state space of the
//! sparse exact solver without a hash table.
//!
//! With `m_c` sites of each color and `L` sites left to fill, the arrangements starting with a given
//! prefix number `L! / ∏ m_c!` (the multinomial of what is left). The lexicographic rank of an
//! arrangement adds, at each site, the arrangements that put a smaller color there:
//! `Σ_x Σ_{c < s_x} multinomial(left − e_c)`, where `multinomial(left − e_c) = multinomial(left) · m_c / L`
//! is an exact integer at every step. Ranks are therefore in the order of the arrangements as
//! sorted vectors, so a law indexed by rank is already sorted.

use motley_colorblind::Color;

/// The arrangements of one multiset of colors, ranked lexicographically (smallest color first).
#[derive(Debug, Clone)]
pub(crate) struct MultisetRanking {
    /// Distinct colors, increasing.
    values: Vec<Color>,
    /// Sites holding each distinct color (same order as `values`).
    counts: Vec<u32>,
    /// Number of sites.
    len: usize,
    /// Number of arrangements.
    total: u64,
}

/// `n! / ∏ m_c!` if it fits in a `u64`.
pub(crate) fn multinomial(counts: &[u32]) -> Option<u64> {
    // Build up color by color: C(s + m, m) for each new block, exact at each step.
    let mut total: u128 = 1;
    let mut placed: u128 = 0;
    for &m in counts {
        for k in 1..=u128::from(m) {
            placed += 1;
            total = total.checked_mul(placed)? / k;
            if total > u128::from(u64::MAX) {
                return None;
            }
        }
    }
    u64::try_from(total).ok()
}

/// The distinct colors of `colors`, increasing, and how many sites hold each (`O(n log n)`).
pub(crate) fn color_counts(colors: &[Color]) -> (Vec<Color>, Vec<u32>) {
    let mut sorted = colors.to_vec();
    sorted.sort_unstable();
    let mut values = Vec::new();
    let mut counts: Vec<u32> = Vec::new();
    for c in sorted {
        if values.last() == Some(&c) {
            *counts
                .last_mut()
                .unwrap_or_else(|| unreachable!("pushed with values")) += 1;
        } else {
            values.push(c);
            counts.push(1);
        }
    }
    (values, counts)
}

impl MultisetRanking {
    /// The ranking of the arrangements of `colors` (any order); `None` when there are more than
    /// `u64::MAX` of them.
    pub(crate) fn new(colors: &[Color]) -> Option<Self> {
        let (values, counts) = color_counts(colors);
        let total = multinomial(&counts)?;
        Some(MultisetRanking {
            values,
            counts,
            len: colors.len(),
            total,
        })
    }

    /// Number of arrangements.
    pub(crate) fn total(&self) -> u64 {
        self.total
    }

    /// Number of distinct colors.
    pub(crate) fn distinct(&self) -> usize {
        self.values.len()
    }

    /// The index of color `c` among the distinct colors.
    pub(crate) fn index_of(&self, c: Color) -> Option<usize> {
        self.values.binary_search(&c).ok()
    }

    /// Rank of an arrangement given as indices into the distinct colors.
    pub(crate) fn rank_indices(&self, s: &[u8], left: &mut [u32]) -> u64 {
        left.copy_from_slice(&self.counts);
        let mut cur = self.total;
        let mut remaining = self.len as u64;
        let mut rank = 0u64;
        for &x in s {
            let x = x as usize;
            for &m in &left[..x] {
                if m > 0 {
                    rank += cur * u64::from(m) / remaining;
                }
            }
            cur = cur * u64::from(left[x]) / remaining;
            left[x] -= 1;
            remaining -= 1;
        }
        rank
    }

    /// The arrangement of rank `rank`, as indices into the distinct colors.
    #[cfg(test)]
    pub(crate) fn unrank_indices(&self, mut rank: u64, out: &mut [u8], left: &mut [u32]) {
        left.copy_from_slice(&self.counts);
        let mut cur = self.total;
        let mut remaining = self.len as u64;
        for o in out.iter_mut() {
            for (c, m) in left.iter_mut().enumerate() {
                if *m == 0 {
                    continue;
                }
                let block = cur * u64::from(*m) / remaining;
                if rank < block {
                    *o = c as u8;
                    cur = block;
                    *m -= 1;
                    break;
                }
                rank -= block;
            }
            remaining -= 1;
        }
    }

    /// The next arrangement in lexicographic order (indices), `false` after the last.
    pub(crate) fn next_indices(s: &mut [u8]) -> bool {
        let n = s.len();
        if n < 2 {
            return false;
        }
        let mut i = n - 1;
        while i > 0 && s[i - 1] >= s[i] {
            i -= 1;
        }
        if i == 0 {
            return false;
        }
        let mut j = n - 1;
        while s[j] <= s[i - 1] {
            j -= 1;
        }
        s.swap(i - 1, j);
        s[i..].reverse();
        true
    }

    /// The first arrangement (indices, increasing).
    pub(crate) fn first_indices(&self) -> Vec<u8> {
        let mut out = Vec::with_capacity(self.len);
        for (c, &m) in self.counts.iter().enumerate() {
            out.extend(std::iter::repeat_n(c as u8, m as usize));
        }
        out
    }

    /// Indices to colors.
    pub(crate) fn colors_of(&self, s: &[u8], out: &mut Vec<Color>) {
        out.clear();
        out.extend(s.iter().map(|&x| self.values[x as usize]));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ranks_follow_the_sorted_order_and_invert() {
        let r = MultisetRanking::new(&[2, 0, 1, 0, 2, 1]).unwrap();
        assert_eq!(r.total(), 90); // 6! / (2! 2! 2!)
        let mut s = r.first_indices();
        let mut left = vec![0; r.distinct()];
        let mut back = vec![0u8; 6];
        let mut k = 0;
        let mut previous: Option<Vec<u8>> = None;
        loop {
            assert_eq!(r.rank_indices(&s, &mut left), k);
            r.unrank_indices(k, &mut back, &mut left);
            assert_eq!(back, s);
            if let Some(p) = &previous {
                assert!(p < &s);
            }
            previous = Some(s.clone());
            k += 1;
            if !MultisetRanking::next_indices(&mut s) {
                break;
            }
        }
        assert_eq!(k, 90);
        assert_eq!(multinomial(&[10, 10]), Some(184_756));
        assert_eq!(multinomial(&[5, 5, 5]), Some(756_756));
        assert_eq!(multinomial(&[1; 9]), Some(362_880));
        assert_eq!(multinomial(&[1; 30]), None);
    }
}
