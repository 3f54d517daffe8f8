//! Exact laws of small systems: the generator on arrangements, solved by uniformization.
//!
//! # Formula
//! With `Q` the generator on the arrangements reachable from the initial one and `Λ` the largest exit
//! rate, `P = I + Q/Λ` is stochastic and `μ P(t) = Σ_k Pois(Λt; k) μ Pᵏ` (uniformization). The sum is cut
//! after the first `K ≥ Λt` with tail bound `Pois(Λt; K+1) / (1 − Λt/(K+2))` below the requested bound;
//! that bound on the ℓ¹ error is reported with the law ([`Law::error_bound`]).
//!
//! # Precision
//! Poisson weights are computed in log space (`ln w_k = −Λt + k ln Λt − ln k!`), so large `Λt` neither
//! underflows nor loses relative precision beyond `O(k ε)`. The stationary law is found by iterating
//! the lazy chain `I + Q/(2Λ)` (aperiodic) until the ℓ¹ change per step is below a tolerance.
//!
//! This solver shares nothing with the samplers but the rates' meaning: it enumerates arrangements
//! and rates directly, so Monte Carlo checked against it is checked against independent code.

use hashbrown::HashMap;
use motley_colorblind::Color;

use crate::{ExclusionError, FiniteLattice, FiniteProcess, Law};

/// Default bound on the neglected Poisson tail.
pub const DEFAULT_TAIL: f64 = 1e-15;
/// Most sites the solver accepts.
pub const MAX_EXACT_SITES: usize = 10;
/// Most arrangements the solver accepts.
pub const MAX_EXACT_STATES: usize = 400_000;

/// The generator of a small segment or ring, ready to be solved at any time.
#[derive(Debug, Clone)]
pub struct ExactSolver {
    states: Vec<Vec<Color>>,
    initial: usize,
    /// CSR transitions: `targets[offsets[i]..offsets[i+1]]` with `rates` alongside.
    offsets: Vec<usize>,
    targets: Vec<usize>,
    rates: Vec<f64>,
    exit: Vec<f64>,
    max_exit: f64,
}

impl ExactSolver {
    /// Enumerates the arrangements reachable from the process's initial data and their rates.
    ///
    /// # Errors
    /// [`ExclusionError::TooManySitesForExact`] above [`MAX_EXACT_SITES`] sites,
    /// [`ExclusionError::TooManyStates`] above [`MAX_EXACT_STATES`] arrangements.
    pub fn new(process: &FiniteProcess) -> Result<Self, ExclusionError> {
        let system = process.system();
        let n = system.len();
        if n > MAX_EXACT_SITES {
            return Err(ExclusionError::TooManySitesForExact {
                sites: n,
                max: MAX_EXACT_SITES,
            });
        }
        let (p, q) = (process.rates().p(), process.rates().q());
        let bonds: Vec<(usize, usize)> = match system.lattice() {
            FiniteLattice::Segment => (0..n - 1).map(|x| (x, x + 1)).collect(),
            FiniteLattice::Ring => (0..n).map(|x| (x, (x + 1) % n)).collect(),
        };
        let moves = |s: &[Color]| -> Vec<(Vec<Color>, f64)> {
            let mut out = Vec::new();
            for &(x, y) in &bonds {
                let rate = if s[x] > s[y] {
                    p
                } else if s[y] > s[x] {
                    q
                } else {
                    0.0
                };
                if rate > 0.0 {
                    let mut t = s.to_vec();
                    t.swap(x, y);
                    out.push((t, rate));
                }
            }
            out
        };
        // Breadth-first search over reachable arrangements.
        let start = system.colors().to_vec();
        let mut seen: HashMap<Vec<Color>, ()> = HashMap::new();
        let mut queue = vec![start.clone()];
        seen.insert(start.clone(), ());
        while let Some(s) = queue.pop() {
            for (t, _) in moves(&s) {
                if !seen.contains_key(&t) {
                    if seen.len() >= MAX_EXACT_STATES {
                        return Err(ExclusionError::TooManyStates {
                            max: MAX_EXACT_STATES,
                        });
                    }
                    seen.insert(t.clone(), ());
                    queue.push(t);
                }
            }
        }
        let mut states: Vec<Vec<Color>> = seen.into_keys().collect();
        states.sort();
        let index: HashMap<Vec<Color>, usize> = states
            .iter()
            .enumerate()
            .map(|(i, s)| (s.clone(), i))
            .collect();
        let mut offsets = vec![0];
        let mut targets = Vec::new();
        let mut rates = Vec::new();
        let mut exit = Vec::with_capacity(states.len());
        for s in &states {
            let mut e = 0.0;
            for (t, r) in moves(s) {
                targets.push(index[&t]);
                rates.push(r);
                e += r;
            }
            offsets.push(targets.len());
            exit.push(e);
        }
        let initial = index[&start];
        let max_exit = exit.iter().copied().fold(0.0, f64::max);
        Ok(ExactSolver {
            states,
            initial,
            offsets,
            targets,
            rates,
            exit,
            max_exit,
        })
    }

    /// Number of reachable arrangements.
    pub fn state_count(&self) -> usize {
        self.states.len()
    }

    /// `v ↦ v (I + Q/λ)`.
    fn step(&self, v: &[f64], out: &mut [f64], lambda: f64) {
        for (i, o) in out.iter_mut().enumerate() {
            *o = v[i] * (1.0 - self.exit[i] / lambda);
        }
        for (i, &vi) in v.iter().enumerate() {
            if vi == 0.0 {
                continue;
            }
            for k in self.offsets[i]..self.offsets[i + 1] {
                out[self.targets[k]] += vi * self.rates[k] / lambda;
            }
        }
    }

    fn law_of(&self, v: &[f64], error_bound: f64) -> Law {
        Law::new(
            self.states
                .iter()
                .zip(v)
                .filter(|(_, &p)| p != 0.0)
                .map(|(s, &p)| (s.clone(), p))
                .collect(),
            error_bound,
        )
    }

    /// The law of the arrangement at time `t`, with the Poisson tail cut below `tail_bound`
    /// ([`DEFAULT_TAIL`] is a good default).
    ///
    /// # Errors
    /// [`ExclusionError::BadTime`] for a negative or infinite `t`, [`ExclusionError::BadTolerance`]
    /// for a bound outside (0, 1).
    pub fn law_at(&self, t: f64, tail_bound: f64) -> Result<Law, ExclusionError> {
        if !t.is_finite() || t < 0.0 {
            return Err(ExclusionError::BadTime(t));
        }
        if !(tail_bound > 0.0 && tail_bound < 1.0) {
            return Err(ExclusionError::BadTolerance(tail_bound));
        }
        let m = self.states.len();
        let mut v = vec![0.0; m];
        v[self.initial] = 1.0;
        if self.max_exit == 0.0 || t == 0.0 {
            return Ok(self.law_of(&v, 0.0));
        }
        let lambda = self.max_exit;
        let (first, weights, error_bound) = poisson_weights(lambda * t, tail_bound);
        let mut acc = vec![0.0; m];
        let mut next = vec![0.0; m];
        for k in 0..first + weights.len() {
            if k >= first {
                let w = weights[k - first];
                for (a, &x) in acc.iter_mut().zip(&v) {
                    *a += w * x;
                }
            }
            if k + 1 < first + weights.len() {
                self.step(&v, &mut next, lambda);
                std::mem::swap(&mut v, &mut next);
            }
        }
        Ok(self.law_of(&acc, error_bound))
    }

    /// The stationary law reached from the initial arrangement: the lazy chain `I + Q/(2Λ)` iterated
    /// until the ℓ¹ change of one step is below `tolerance` or `max_steps` steps are done. The reported
    /// error bound is the last ℓ¹ change.
    pub fn stationary(&self, tolerance: f64, max_steps: usize) -> Law {
        let m = self.states.len();
        let mut v = vec![0.0; m];
        v[self.initial] = 1.0;
        if self.max_exit == 0.0 {
            return self.law_of(&v, 0.0);
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
        self.law_of(&v, change)
    }
}

/// Poisson(`mean`) weights `w_k`, `k = first..first + len`, and a bound on the ℓ¹ error of using
/// them for the full Poisson law (Fox and Glynn 1988 style: recurrences outward from the mode, then
/// normalisation).
///
/// From the mode `m = ⌊mean⌋` with `u_m = 1`: `u_{k+1} = u_k · mean/(k+1)` and `u_{k−1} = u_k · k/mean`.
/// Right of `R` (once `R + 2 > mean`) the neglected mass is at most `u_{R+1} / (1 − mean/(R+2))`,
/// left of `L` (for `L < mean`) at most `u_L (L/mean) / (1 − L/mean)`; both are cut below
/// `bound/4` (times the normaliser, which is ≥ 1), and normalising by the kept sum `S` then errs by
/// at most `2 (T_left + T_right) / S ≤ bound` in ℓ¹. Each weight carries a relative rounding error of
/// about `ε` per recurrence step from the mode (`O(√mean · ε)`), far below direct summation of logs.
pub(crate) fn poisson_weights(mean: f64, bound: f64) -> (usize, Vec<f64>, f64) {
    let mode = mean.floor() as usize;
    let quarter = bound / 4.0;
    // Right side, from the mode.
    let mut right = vec![1.0];
    let mut k = mode;
    let tail_right = loop {
        let u_next = right[right.len() - 1] * mean / (k + 1) as f64;
        if (k + 2) as f64 > mean {
            let t = u_next / (1.0 - mean / (k + 2) as f64);
            if t <= quarter {
                break t;
            }
        }
        right.push(u_next);
        k += 1;
    };
    // Left side, from the mode.
    let mut left = Vec::new();
    let mut u = 1.0;
    let mut l = mode;
    let tail_left = loop {
        if l == 0 {
            break 0.0;
        }
        let ratio = l as f64 / mean;
        if ratio < 1.0 {
            let t = u * ratio / (1.0 - ratio);
            if t <= quarter {
                break t;
            }
        }
        u *= ratio;
        l -= 1;
        left.push(u);
    };
    left.reverse();
    left.extend_from_slice(&right);
    // Sum from small to large for accuracy: the weights are unimodal, sorting keeps it deterministic.
    let mut sorted = left.clone();
    sorted.sort_by(f64::total_cmp);
    let sum: f64 = sorted.iter().sum();
    for w in &mut left {
        *w /= sum;
    }
    (l, left, 2.0 * (tail_left + tail_right) / sum)
}

#[cfg(test)]
mod tests {
    #[test]
    fn poisson_weights_match_direct_values() {
        // Pois(0.7; k) = e^{-0.7} 0.7^k / k! directly.
        let (first, w, err) = poisson_weights(0.7, 1e-15);
        assert_eq!(first, 0);
        let mut f = 1.0;
        for (k, wk) in w.iter().enumerate() {
            if k > 0 {
                f *= k as f64;
            }
            let direct = (-0.7f64).exp() * 0.7f64.powi(k as i32) / f;
            assert!((wk - direct).abs() < 1e-16 + 1e-14 * direct, "{k}");
        }
        assert!(err <= 1e-15);
        let (first, w, err) = poisson_weights(2000.0, 1e-15);
        assert!(first > 1000 && err <= 1e-15);
        let total: f64 = w.iter().sum();
        assert!((total - 1.0).abs() < 1e-14);
        // Mean: Σ k w_k = 2000.
        let mean: f64 = w
            .iter()
            .enumerate()
            .map(|(i, x)| (first + i) as f64 * x)
            .sum();
        assert!((mean - 2000.0).abs() < 1e-9);
    }

    use super::*;
    use crate::{FiniteSystem, Rates};

    /// Two sites, one particle: the particle's position is a two-state chain with rates p (1 → 2)
    /// and q (2 → 1); P(at 2 at t) = p/(p+q) (1 − e^{−(p+q)t}) (textbook two-state chain, from
    /// memory).
    #[test]
    fn two_state_chain() {
        let (p, q, t) = (1.3, 0.4, 0.9);
        let proc = FiniteProcess::new(
            FiniteSystem::segment(vec![1, 0]).unwrap(),
            Rates::new(p, q).unwrap(),
        );
        let law = ExactSolver::new(&proc)
            .unwrap()
            .law_at(t, DEFAULT_TAIL)
            .unwrap();
        let expect = p / (p + q) * (1.0 - (-(p + q) * t).exp());
        assert!((law.probability(&[0, 1]) - expect).abs() < 1e-14);
        assert!(law.error_bound() < DEFAULT_TAIL);
        let st = ExactSolver::new(&proc).unwrap().stationary(1e-16, 100_000);
        assert!((st.probability(&[0, 1]) - p / (p + q)).abs() < 1e-12);
    }

    #[test]
    fn large_times_do_not_underflow() {
        let proc = FiniteProcess::new(
            FiniteSystem::ring(vec![1, 0, 0]).unwrap(),
            Rates::new(1.0, 0.5).unwrap(),
        );
        let law = ExactSolver::new(&proc)
            .unwrap()
            .law_at(1000.0, DEFAULT_TAIL)
            .unwrap();
        // Uniform by symmetry of the ring at large time.
        for s in [[1, 0, 0], [0, 1, 0], [0, 0, 1]] {
            let d = law.probability(&s) - 1.0 / 3.0;
            assert!(d.abs() < 1e-12, "{d:e} {}", law.error_bound());
        }
    }
}
