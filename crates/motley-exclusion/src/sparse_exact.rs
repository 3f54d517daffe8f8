//! Exact laws of a multi-species exclusion on a segment or ring at the sizes researchers check by
//! hand: a sparse generator on all arrangements of the initial multiset of colors (ranked, no hash
//! table), solved by uniformization with a rigorous error bound.
//!
//! # Merging colors
//! Merging contiguous colors (in strength order) into one class turns a multi-species exclusion into
//! a multi-species exclusion with fewer species: the exchange rate of a bond depends only on which
//! of its two colors is stronger, and a merge keeps that order between different classes (equal
//! classes never swap, and swapping equal colors changes no class arrangement). The merged chain is
//! therefore exactly lumpable, and its law is the law of the merged arrangement. Callers merge the
//! colors first (keeping apart what they read) and hand this solver the merged colors; two classes
//! on 20 sites have 184 756 arrangements, three classes on 15 sites 756 756, nine distinct colors
//! 362 880.
//!
//! # Formula
//! As [`crate::ExactSolver`]: `μ P(t) = Σ_k Pois(Λt; k) μ Pᵏ` with `P = I + Q/Λ`, `Λ` the largest exit
//! rate, the Poisson weights cut with an ℓ¹ tail bound (Fox and Glynn 1988 style, shared code).
//!
//! # Precision
//! [`SparseLaw::error_bound`] bounds the ℓ¹ distance to the true law including rounding: the Poisson
//! tail, plus `1.01 u ((K + 1)(d + 4) + 3K + 4)` with `u = 2⁻⁵³`, `K` the last power used and `d` the
//! number of bonds. Every quantity is nonnegative, so one step `v ↦ vP` computes each entry as a sum
//! of at most `d + 1` products with relative error `γ_{d+4}`, adding at most `γ_{d+4} ‖v‖₁` in ℓ¹;
//! `P` is stochastic, so earlier errors are not amplified; the weighted sum of `K + 1` vectors and
//! the weights' own relative error (recurrences over at most `K` steps, then a normalisation) add
//! `γ_{3K+4}` (Higham 2002, "Accuracy and Stability of Numerical Algorithms", §3.1, `γ_n = nu/(1−nu)`;
//! the factor 1.01 covers `1/(1 − nu)` for `nu < 0.01`).
//!
//! # Memory
//! Before anything is allocated, [`SparseSolver::estimate`] counts the arrangements (a multinomial)
//! and the bytes (three probability vectors, offsets, move counts, one `u32` per transition, at most
//! one per bond and arrangement); [`SparseSolver::new`] refuses more than [`MAX_SPARSE_STATES`]
//! arrangements or [`MAX_EXACT_BYTES`] bytes with a message giving both numbers.

use motley_colorblind::Color;

use crate::exact::poisson_weights;
use crate::multiset::{color_counts, multinomial, MultisetRanking};
use crate::{ExclusionError, FiniteLattice, FiniteSystem, Law, Rates};

/// Most arrangements the sparse solver accepts.
pub const MAX_SPARSE_STATES: u64 = 4_000_000;
/// Most bytes the sparse solver may allocate (estimated before the run).
pub const MAX_EXACT_BYTES: u64 = 2 << 30;

/// Unit roundoff of `f64`.
const U: f64 = f64::EPSILON / 2.0;
/// Marks a transition at rate `q` (the stronger color moving left); others are at rate `p`.
const LEFT: u32 = 1 << 31;

/// The size of a sparse exact computation, known before it runs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SparseSize {
    /// Arrangements of the multiset of colors (`None`: more than `u64::MAX`).
    pub states: Option<u64>,
    /// Bonds of the lattice.
    pub bonds: usize,
    /// Bytes the solver allocates at most (saturating).
    pub bytes: u64,
}

impl SparseSize {
    /// Elementary updates of a solve up to time `t` at rates `rates` (an upper estimate: every
    /// bond of every arrangement active, `Λt + 10√(Λt) + 40` powers), for cost estimates.
    pub fn work(&self, rates: &Rates, t: f64) -> f64 {
        let lambda = self.bonds as f64 * rates.p().max(rates.q());
        let mean = lambda * t;
        let steps = mean + 10.0 * mean.sqrt() + 40.0;
        steps * self.states.map_or(f64::INFINITY, |s| s as f64) * (self.bonds as f64 + 1.0)
    }

    /// Checks the limits.
    ///
    /// # Errors
    /// [`ExclusionError::ExactStatesAbove`], [`ExclusionError::ExactMemoryAbove`].
    pub fn check(&self) -> Result<(), ExclusionError> {
        match self.states {
            Some(s) if s <= MAX_SPARSE_STATES => {}
            states => {
                return Err(ExclusionError::ExactStatesAbove {
                    states,
                    max: MAX_SPARSE_STATES,
                })
            }
        }
        if self.bytes > MAX_EXACT_BYTES {
            return Err(ExclusionError::ExactMemoryAbove {
                bytes: self.bytes,
                max: MAX_EXACT_BYTES,
            });
        }
        Ok(())
    }
}

/// The sparse generator of a segment or ring on all arrangements of its colors.
#[derive(Debug, Clone)]
pub struct SparseSolver {
    ranking: MultisetRanking,
    rates: Rates,
    initial: u64,
    bonds: usize,
    /// Transitions of arrangement `i`: `targets[offsets[i]..offsets[i + 1]]`.
    offsets: Vec<u32>,
    /// Target rank, with [`LEFT`] set for a move at rate `q`.
    targets: Vec<u32>,
    /// Moves at rate `p` and at rate `q` out of each arrangement.
    moves: Vec<(u16, u16)>,
    max_exit: f64,
}

/// A law on all arrangements of a multiset of colors, indexed by lexicographic rank.
#[derive(Debug, Clone)]
pub struct SparseLaw {
    ranking: MultisetRanking,
    probabilities: Vec<f64>,
    error_bound: f64,
}

fn bond_list(lattice: FiniteLattice, n: usize) -> Vec<(usize, usize)> {
    match lattice {
        FiniteLattice::Segment => (0..n - 1).map(|x| (x, x + 1)).collect(),
        FiniteLattice::Ring => (0..n).map(|x| (x, (x + 1) % n)).collect(),
    }
}

impl SparseSolver {
    /// The size of the computation for `system`, without building anything.
    pub fn estimate(system: &FiniteSystem) -> SparseSize {
        let colors = system.colors();
        let (_, counts) = color_counts(colors);
        let states = multinomial(&counts);
        let bonds = system.lattice().bonds(colors.len());
        let bytes = states.map_or(u64::MAX, |s| {
            // v, next, acc (f64); offsets (u32); move counts (2 × u16); one u32 per transition.
            s.saturating_mul(3 * 8 + 4 + 4 + 4 * bonds as u64)
        });
        SparseSize {
            states,
            bonds,
            bytes,
        }
    }

    /// Builds the sparse generator of `system` at `rates`.
    ///
    /// # Errors
    /// [`ExclusionError::ExactStatesAbove`] above [`MAX_SPARSE_STATES`] arrangements,
    /// [`ExclusionError::ExactMemoryAbove`] above [`MAX_EXACT_BYTES`], both checked before any
    /// allocation.
    pub fn new(system: &FiniteSystem, rates: Rates) -> Result<Self, ExclusionError> {
        Self::estimate(system).check()?;
        let colors = system.colors();
        let n = colors.len();
        let ranking = MultisetRanking::new(colors).ok_or(ExclusionError::ExactStatesAbove {
            states: None,
            max: MAX_SPARSE_STATES,
        })?;
        let m = ranking.total() as usize;
        let bonds = bond_list(system.lattice(), n);
        let (p, q) = (rates.p(), rates.q());
        let mut left = vec![0u32; ranking.distinct()];
        let initial_indices: Vec<u8> = colors
            .iter()
            .map(|&c| ranking.index_of(c).unwrap_or(0) as u8)
            .collect();
        let initial = ranking.rank_indices(&initial_indices, &mut left);
        let mut offsets = Vec::with_capacity(m + 1);
        let mut targets = Vec::new();
        let mut moves = Vec::with_capacity(m);
        let mut s = ranking.first_indices();
        offsets.push(0u32);
        loop {
            let (mut np, mut nq) = (0u16, 0u16);
            for &(x, y) in &bonds {
                let (a, b) = (s[x], s[y]);
                let flag = if a > b && p > 0.0 {
                    np += 1;
                    0
                } else if b > a && q > 0.0 {
                    nq += 1;
                    LEFT
                } else {
                    continue;
                };
                s.swap(x, y);
                let t = ranking.rank_indices(&s, &mut left) as u32;
                s.swap(x, y);
                targets.push(t | flag);
            }
            offsets.push(targets.len() as u32);
            moves.push((np, nq));
            if !MultisetRanking::next_indices(&mut s) {
                break;
            }
        }
        let max_exit = moves
            .iter()
            .map(|&(a, b)| f64::from(a) * p + f64::from(b) * q)
            .fold(0.0, f64::max);
        Ok(SparseSolver {
            ranking,
            rates,
            initial,
            bonds: bonds.len(),
            offsets,
            targets,
            moves,
            max_exit,
        })
    }

    /// Number of arrangements.
    pub fn state_count(&self) -> usize {
        self.ranking.total() as usize
    }

    /// Number of transitions of the generator.
    pub fn transition_count(&self) -> usize {
        self.targets.len()
    }

    /// `v ↦ v (I + Q/λ)`.
    fn step(&self, v: &[f64], out: &mut [f64], lambda: f64) {
        let (p, q) = (self.rates.p() / lambda, self.rates.q() / lambda);
        for ((o, &x), &(a, b)) in out.iter_mut().zip(v).zip(&self.moves) {
            *o = x * (1.0 - (f64::from(a) * p + f64::from(b) * q));
        }
        for (i, &vi) in v.iter().enumerate() {
            if vi == 0.0 {
                continue;
            }
            let (wp, wq) = (vi * p, vi * q);
            for &t in &self.targets[self.offsets[i] as usize..self.offsets[i + 1] as usize] {
                if t & LEFT == 0 {
                    out[t as usize] += wp;
                } else {
                    out[(t & !LEFT) as usize] += wq;
                }
            }
        }
    }

    fn law_of(&self, probabilities: Vec<f64>, error_bound: f64) -> SparseLaw {
        SparseLaw {
            ranking: self.ranking.clone(),
            probabilities,
            error_bound,
        }
    }

    /// The law of the arrangement at time `t`, the Poisson tail cut below `tail_bound`.
    ///
    /// # Errors
    /// [`ExclusionError::BadTime`] for a negative or infinite `t`, [`ExclusionError::BadTolerance`]
    /// for a bound outside (0, 1).
    pub fn law_at(&self, t: f64, tail_bound: f64) -> Result<SparseLaw, ExclusionError> {
        if !t.is_finite() || t < 0.0 {
            return Err(ExclusionError::BadTime(t));
        }
        if !(tail_bound > 0.0 && tail_bound < 1.0) {
            return Err(ExclusionError::BadTolerance(tail_bound));
        }
        let m = self.state_count();
        let mut v = vec![0.0; m];
        v[self.initial as usize] = 1.0;
        if self.max_exit == 0.0 || t == 0.0 {
            return Ok(self.law_of(v, 0.0));
        }
        let lambda = self.max_exit;
        let (first, weights, tail) = poisson_weights(lambda * t, tail_bound);
        let last = first + weights.len() - 1;
        let mut acc = vec![0.0; m];
        let mut next = vec![0.0; m];
        for k in 0..=last {
            if k >= first {
                let w = weights[k - first];
                for (a, &x) in acc.iter_mut().zip(&v) {
                    *a += w * x;
                }
            }
            if k < last {
                self.step(&v, &mut next, lambda);
                std::mem::swap(&mut v, &mut next);
            }
        }
        let k = last as f64;
        let d = self.bonds as f64;
        let rounding = 1.01 * U * ((k + 1.0) * (d + 4.0) + 3.0 * k + 4.0);
        Ok(self.law_of(acc, tail + rounding))
    }

    /// The stationary law reached from the initial arrangement, by iterating the lazy chain
    /// `I + Q/(2Λ)` until the ℓ¹ change of one step is below `tolerance` or `max_steps` steps are
    /// done. The law's [`SparseLaw::error_bound`] is then the **residual** `‖π̃ − π̃P‖₁` of the last
    /// step, not a bound on the distance to the stationary law (that needs the chain's mixing).
    pub fn stationary(&self, tolerance: f64, max_steps: usize) -> SparseLaw {
        let m = self.state_count();
        let mut v = vec![0.0; m];
        v[self.initial as usize] = 1.0;
        if self.max_exit == 0.0 {
            return self.law_of(v, 0.0);
        }
        let lambda = 2.0 * self.max_exit;
        let mut next = vec![0.0; m];
        let mut change = f64::INFINITY;
        for _ in 0..max_steps {
            self.step(&v, &mut next, lambda);
            change = v.iter().zip(&next).map(|(a, b)| (a - b).abs()).sum();
            std::mem::swap(&mut v, &mut next);
            if change < tolerance {
                break;
            }
        }
        self.law_of(v, change)
    }
}

impl SparseLaw {
    /// Bound on the ℓ¹ distance to the true law (see the module's *Precision*), or the residual of
    /// a stationary iteration ([`SparseSolver::stationary`]).
    pub fn error_bound(&self) -> f64 {
        self.error_bound
    }

    /// Number of arrangements (of positive probability or not).
    pub fn state_count(&self) -> usize {
        self.probabilities.len()
    }

    /// Calls `f(arrangement, probability)` for every arrangement of positive probability, in
    /// increasing order of arrangements.
    pub fn visit(&self, mut f: impl FnMut(&[Color], f64)) {
        let mut s = self.ranking.first_indices();
        let mut colors = Vec::with_capacity(s.len());
        let mut i = 0;
        loop {
            let p = self.probabilities[i];
            if p != 0.0 {
                self.ranking.colors_of(&s, &mut colors);
                f(&colors, p);
            }
            i += 1;
            if !MultisetRanking::next_indices(&mut s) {
                break;
            }
        }
    }

    /// The same law as a [`Law`] (one vector per arrangement: for comparisons on small systems).
    pub fn to_law(&self) -> Law {
        let mut entries = Vec::new();
        self.visit(|a, p| entries.push((a.to_vec(), p)));
        Law::new(entries, self.error_bound)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn limits_are_checked_before_allocation() {
        let big = FiniteSystem::segment((0..13).map(|x| x as Color).collect()).unwrap();
        let size = SparseSolver::estimate(&big);
        assert_eq!(size.states, Some(6_227_020_800));
        let err = SparseSolver::new(&big, Rates::tasep(1.0).unwrap()).unwrap_err();
        assert!(
            err.to_string().contains("6227020800") && err.to_string().contains("4000000"),
            "{err}"
        );
        let ok = FiniteSystem::ring(vec![1, 1, 0, 0, 0]).unwrap();
        assert_eq!(SparseSolver::estimate(&ok).states, Some(10));
        assert!(SparseSolver::estimate(&ok).check().is_ok());
    }
}
