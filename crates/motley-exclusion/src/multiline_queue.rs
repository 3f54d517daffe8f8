//! Multiline queues: the stationary law of a multi-species TASEP on a ring, exactly (integer counts)
//! and as independent samples.
//!
//! # Construction (Ferrari and Martin 2007)
//! P. A. Ferrari and J. B. Martin, "Stationary distributions of multi-type totally asymmetric
//! exclusion processes", Ann. Probab. 35 (2007) 807–832. On the ring `Z/nZ` with `m_1` particles of
//! the strongest class, `m_2` of the next, …, and the weakest class filling the rest, let
//! `a_r = m_1 + … + m_r`. A multiline queue is a list of rows `r = 1, …, K − 1`, row `r` a set of
//! `a_r` sites. Row 1's sites hold class 1. Row `r + 1` is read from row `r` by a queue: the
//! particles of row `r`, strongest class first, each take the first site of row `r + 1` not yet
//! taken, looking from their own site **against** the direction of the jumps (cyclically, their own
//! site included); the sites of row `r + 1` left untaken get class `r + 1`. The classes of the last
//! row (untaken sites: the weakest class) are distributed by the stationary law when the rows are
//! independent uniform sets (Ferrari and Martin 2007, Theorem 2.1; the order of the particles within
//! one class does not change the outcome). Here a stronger color jumps right (rate `p`, `q = 0`),
//! so particles look left; with `p = 0` they jump left and look right. The direction was checked
//! against the null vector of the generator (tests), not taken from memory alone.
//!
//! # Exact law
//! [`multiline_queue_law`] counts, for every arrangement, the multiline queues ending in it, row by
//! row (the counts of the arrangements of the first `r` rows, then every set of row `r + 1`), in
//! exact integers; the probability is the count over `∏ C(n, a_r)`.
//!
//! # Reproducibility
//! [`StationarySampler::sample`] draws sample `i` under seed `s` from stream [`STATIONARY_STREAM`]
//! of [`motley_stream::sample_stream`]`(s, i, ·)` only: row 1's set, then row 2's, …, each by
//! Floyd's algorithm (Bentley and Floyd 1987, "Programming pearls: a sample of brilliance"), one
//! bounded integer (Lemire's method, as every bounded draw of this crate) per element. The streams
//! of the dynamics (0, 1, 2) are untouched, so no existing sample changes.

use std::collections::BTreeMap;

use motley_colorblind::Color;
use motley_stream::sample_stream;
use num_bigint::BigUint;

use crate::multiset::color_counts;
use crate::words::Words;
use crate::{ExclusionError, FiniteLattice, FiniteSystem, Rates};

/// Stream of the multiline-queue rows of a stationary sample (the dynamics use streams 0 to 2).
pub const STATIONARY_STREAM: u64 = 3;

/// Every arrangement with its number of multiline queues (sorted by arrangement), and the total
/// number of multiline queues.
pub type QueueCounts = (Vec<(Vec<Color>, BigUint)>, BigUint);

/// Most elementary queue services [`multiline_queue_law`] performs.
pub const MAX_QUEUE_WORK: f64 = 2e8;

const EMPTY: u8 = u8::MAX;

/// Which way particles look for a free site of the next row.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Look {
    /// Jumps go right (`q = 0`): look left.
    Left,
    /// Jumps go left (`p = 0`): look right.
    Right,
}

/// The classes of a ring, strongest first: distinct colors, their counts, the row sizes `a_r`.
#[derive(Debug, Clone)]
struct Rows {
    /// Distinct colors, increasing (index = class code, larger stronger).
    values: Vec<Color>,
    /// Row sizes `a_1 < a_2 < …` (one row per class but the weakest).
    sizes: Vec<usize>,
    n: usize,
    look: Look,
}

impl Rows {
    fn new(system: &FiniteSystem, rates: &Rates) -> Result<Self, ExclusionError> {
        if system.lattice() != FiniteLattice::Ring {
            return Err(ExclusionError::NoStationaryLaw(
                "multiline queues give stationary laws on a ring only",
            ));
        }
        let look = if rates.q() == 0.0 {
            Look::Left
        } else if rates.p() == 0.0 {
            Look::Right
        } else {
            return Err(ExclusionError::NoStationaryLaw(
                "multiline queues here give the stationary law of TASEP (p = 0 or q = 0); ASEP needs the generator",
            ));
        };
        let colors = system.colors();
        let (values, counts) = color_counts(colors);
        let mut sizes = Vec::new();
        let mut acc = 0;
        for &m in counts.iter().rev().take(counts.len().saturating_sub(1)) {
            acc += m as usize;
            sizes.push(acc);
        }
        Ok(Rows {
            values,
            sizes,
            n: colors.len(),
            look,
        })
    }

    /// Queue services of the exact count: the arrangements of the first `r` rows (at most
    /// `∏_{j ≤ r} C(n, a_j)`) times the sets of row `r + 1`, times `n`.
    fn work(&self) -> f64 {
        let mut work = 0.0;
        // Distinct arrangements of the rows so far: C(n, a_r) placements of the a_r particles
        // times their class orders a_r! / ∏ m_j! (built as ∏ C(a_j, m_j)).
        let mut level = 1.0f64;
        let mut orders = 1.0f64;
        let mut previous = 0;
        for &a in &self.sizes {
            let sets = binomial(self.n, a);
            work += level * sets * self.n as f64;
            orders *= binomial(a, a - previous);
            level = sets * orders;
            previous = a;
        }
        work
    }

    /// The class code of row `r` (0-based) in the engine's order: row 0 is the strongest.
    fn code(&self, r: usize) -> u8 {
        (self.values.len() - 1 - r) as u8
    }
}

/// Serves row `prev` (class codes, [`EMPTY`] where no particle) into the sites where `service` is
/// true, writing the next row into `out`; untaken sites get `fresh`. `parent` is scratch.
fn serve(
    prev: &[u8],
    service: &[bool],
    fresh: u8,
    look: Look,
    parent: &mut Vec<u32>,
    out: &mut Vec<u8>,
) {
    let n = prev.len();
    let step = |x: usize| match look {
        Look::Left => (x + n - 1) % n,
        Look::Right => (x + 1) % n,
    };
    parent.clear();
    parent.extend((0..n).map(|x| if service[x] { x } else { step(x) } as u32));
    out.clear();
    out.resize(n, EMPTY);
    // Strongest class first: codes from the largest down.
    let mut codes: Vec<u8> = prev.iter().copied().filter(|&c| c != EMPTY).collect();
    codes.sort_unstable_by(|a, b| b.cmp(a));
    codes.dedup();
    for c in codes {
        for (x, &here) in prev.iter().enumerate() {
            if here != c {
                continue;
            }
            // First free service site from x, looking against the jumps (x included).
            let mut r = x;
            while parent[r] as usize != r {
                r = parent[r] as usize;
            }
            let mut y = x;
            while parent[y] as usize != r {
                let nxt = parent[y] as usize;
                parent[y] = r as u32;
                y = nxt;
            }
            out[r] = c;
            parent[r] = step(r) as u32;
        }
    }
    for x in 0..n {
        if service[x] && out[x] == EMPTY {
            out[x] = fresh;
        }
    }
}

fn binomial(n: usize, k: usize) -> f64 {
    (0..k).fold(1.0, |acc, i| acc * (n - i) as f64 / (i + 1) as f64)
}

/// All `k`-subsets of `0..n` as masks, in lexicographic order of their elements.
fn subsets(n: usize, k: usize) -> Vec<Vec<bool>> {
    let mut out = Vec::new();
    let mut idx: Vec<usize> = (0..k).collect();
    loop {
        let mut mask = vec![false; n];
        for &i in &idx {
            mask[i] = true;
        }
        out.push(mask);
        // Next combination.
        let mut i = k;
        loop {
            if i == 0 {
                return out;
            }
            i -= 1;
            if idx[i] < n - k + i {
                idx[i] += 1;
                for j in i + 1..k {
                    idx[j] = idx[j - 1] + 1;
                }
                break;
            }
        }
    }
}

/// The exact stationary law of the multi-species TASEP (`q = 0` or `p = 0`) on the ring of
/// `system` with its colors: every arrangement with its number of multiline queues, sorted by
/// arrangement, and the total number `∏ C(n, a_r)` of multiline queues.
///
/// # Errors
/// [`ExclusionError::NoStationaryLaw`] on a segment or for ASEP rates, or when the count would take
/// more than [`MAX_QUEUE_WORK`] queue services.
pub fn multiline_queue_law(
    system: &FiniteSystem,
    rates: &Rates,
) -> Result<QueueCounts, ExclusionError> {
    let rows = Rows::new(system, rates)?;
    let n = rows.n;
    if rows.work() > MAX_QUEUE_WORK {
        return Err(ExclusionError::NoStationaryLaw(
            "the multiline-queue count of this ring is too large for exact rationals (merge more classes)",
        ));
    }
    let mut total = BigUint::from(1u32);
    let mut counts: BTreeMap<Vec<u8>, BigUint> = BTreeMap::new();
    counts.insert(vec![EMPTY; n], BigUint::from(1u32));
    let mut parent = Vec::new();
    let mut out = Vec::new();
    for (r, &a) in rows.sizes.iter().enumerate() {
        let sets = subsets(n, a);
        total *= BigUint::from(sets.len());
        let mut next: BTreeMap<Vec<u8>, BigUint> = BTreeMap::new();
        for (config, count) in &counts {
            for s in &sets {
                serve(config, s, rows.code(r), rows.look, &mut parent, &mut out);
                match next.get_mut(&out) {
                    Some(c) => *c += count,
                    None => {
                        next.insert(out.clone(), count.clone());
                    }
                }
            }
        }
        counts = next;
    }
    let entries = counts
        .into_iter()
        .map(|(config, c)| {
            let colors = config
                .iter()
                .map(|&x| {
                    if x == EMPTY {
                        rows.values[0]
                    } else {
                        rows.values[x as usize]
                    }
                })
                .collect();
            (colors, c)
        })
        .collect::<BTreeMap<Vec<Color>, BigUint>>()
        .into_iter()
        .collect();
    Ok((entries, total))
}

/// The number of queue services [`multiline_queue_law`] would perform for `system` (infinite for a
/// segment), to compare with [`MAX_QUEUE_WORK`] before calling it.
pub fn multiline_queue_work(system: &FiniteSystem) -> f64 {
    match Rows::new(
        system,
        &Rates::tasep(1.0).unwrap_or_else(|_| unreachable!("1 is a rate")),
    ) {
        Ok(rows) => rows.work(),
        Err(_) => f64::INFINITY,
    }
}

/// Independent samples of the stationary law of a multi-species TASEP on a ring, by multiline
/// queues: `O(K n)` per sample for `K` classes on `n` sites.
#[derive(Debug, Clone)]
pub struct StationarySampler {
    rows: Rows,
}

impl StationarySampler {
    /// The sampler for the ring and colors of `system` (its arrangement does not matter: the
    /// stationary law depends only on how many sites hold each color).
    ///
    /// # Errors
    /// [`ExclusionError::NoStationaryLaw`] on a segment or for ASEP rates (`p, q > 0`).
    pub fn new(system: &FiniteSystem, rates: &Rates) -> Result<Self, ExclusionError> {
        Ok(StationarySampler {
            rows: Rows::new(system, rates)?,
        })
    }

    /// Sample `index` under `seed`: the arrangement, site 1 first.
    pub fn sample(&self, seed: u64, index: u64) -> Vec<Color> {
        let n = self.rows.n;
        let mut words = Words::new(sample_stream(seed, index, STATIONARY_STREAM));
        let mut config = vec![EMPTY; n];
        let mut service = vec![false; n];
        let mut parent = Vec::with_capacity(n);
        let mut out = Vec::with_capacity(n);
        for (r, &a) in self.rows.sizes.iter().enumerate() {
            // Floyd's algorithm: a uniform a-subset of 0..n.
            service.iter_mut().for_each(|s| *s = false);
            for j in n - a..n {
                let t = words.below(j as u32 + 1) as usize;
                if service[t] {
                    service[j] = true;
                } else {
                    service[t] = true;
                }
            }
            serve(
                &config,
                &service,
                self.rows.code(r),
                self.rows.look,
                &mut parent,
                &mut out,
            );
            std::mem::swap(&mut config, &mut out);
        }
        config
            .iter()
            .map(|&x| {
                if x == EMPTY {
                    self.rows.values[0]
                } else {
                    self.rows.values[x as usize]
                }
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Three sites, colors 2 > 1 > 0: 9 multiline queues; the arrangements with the second class
    /// just left of the first get 2 each, the others 1 (the hand computation of
    /// `tests/ring_stationary.rs`).
    #[test]
    fn three_site_ring_by_hand() {
        let system = FiniteSystem::ring(vec![2, 1, 0]).unwrap();
        let (law, total) = multiline_queue_law(&system, &Rates::tasep(1.0).unwrap()).unwrap();
        assert_eq!(total, BigUint::from(9u32));
        assert_eq!(law.len(), 6);
        for (a, c) in &law {
            let left_of_first = (0..3).any(|x| a[x] == 1 && a[(x + 1) % 3] == 2);
            let want = if left_of_first { 2u32 } else { 1 };
            assert_eq!(*c, BigUint::from(want), "{a:?}");
        }
        assert!(multiline_queue_law(
            &FiniteSystem::segment(vec![1, 0]).unwrap(),
            &Rates::tasep(1.0).unwrap()
        )
        .is_err());
        assert!(StationarySampler::new(&system, &Rates::new(1.0, 0.5).unwrap()).is_err());
    }

    #[test]
    fn subsets_are_all_there() {
        assert_eq!(subsets(6, 3).len(), 20);
        assert_eq!(subsets(4, 0).len(), 1);
        assert_eq!(subsets(4, 4).len(), 1);
    }
}
