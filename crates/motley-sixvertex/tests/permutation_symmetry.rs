//! The color–position symmetry for whole exit permutations, checked exactly in rationals.
//!
//! Source: A. Borodin and A. Bufetov, "Color-position symmetry in interacting particle systems",
//! Ann. Probab. 49 (2021). The marginal form (rainbow from the left, empty bottom) is tested in
//! `color_position_symmetry.rs`; the permutation form below, in our conventions (larger color
//! stronger, `b1` from below, `b2` from the left), was found and verified here by exact computation
//! at the sizes and weights listed in the tests, and nothing more is claimed.
//!
//! # The convention
//! On `W` columns × `H` rows, `N = W + H`, number both boundaries going round the rectangle the same
//! way (counterclockwise, starting at the bottom-right corner):
//! - **Entrances.** Entrance `k ≤ W` is the bottom edge of column `W + 1 − k`; entrance `W + y` is the
//!   left edge of row `y`. Entrance `k` carries color `k`: the rainbow from the left shifted by `W`
//!   (row `y` gets `W + y`, a higher row is stronger), and every bottom color is weaker than every
//!   left color, the leftmost column strongest among them.
//! - **Exits.** Exit `y ≤ H` is the right edge of row `y`; exit `H + k` is the top edge of column
//!   `W + 1 − k`.
//! - `σ(k)` is the exit where color `k` leaves, so `σ⁻¹(j)` is the color leaving at exit `j`.
//!
//! **Claim.** `σ⁻¹` of `W × H` with weights `(b1, b2)` has the law of `σ` of `H × W` with the same
//! `(b1, b2)`. In words: the colors read off the exits of `W × H` in exit order have the joint law of
//! the exit numbers of colors `1, …, N` in `H × W`.
//!
//! Verified (total variation exactly 0 in rationals) for all `W, H ≤ 4` and `5 × 2`, `2 × 5`,
//! `5 × 3`, `3 × 5`, with `(b1, b2)` = (3/10, 3/5), (1/3, 1/2), (2/3, 1/5), (1/7, 5/6).
//!
//! A scan of 512 conventions (each side pair numbered in 8 ways, for entrances and exits; color `k`
//! or `N + 1 − k` on entrance `k`; the transposed rectangle with `(b1, b2)` or `(b2, b1)`; with or
//! without the inverse) at all `W, H ≤ 3` with `(b1, b2)` = (1/3, 1/2), (2/3, 1/5) finds exactly four
//! that hold: the one above, the same with color `N + 1 − k` on entrance `k` (strength reversed along
//! the boundary), and these two with both numberings run clockwise from the top-left corner (left
//! from row `H` down, then bottom from column 1; top from column 1, then right from row `H` down),
//! which are the first two relabeled by `k ↦ N + 1 − k`. So there are two distinct statements; both
//! need the inverse and the same weights, and both numberings must run the same way round.
//!
//! The claim contains the marginal one: pushing both sides through one map of permutations gives
//! the two laws of `color_position_symmetry.rs` (checked below).

use std::collections::HashMap;

use motley_colorblind::occupied_positions;
use motley_sixvertex::{exact_law, ratio, Boundary, Color, ExactLaw, Outcome, Side, Weight};
use num_rational::BigRational;

type PermLaw = ExactLaw<Vec<usize>, BigRational>;

/// A way of numbering a pair of sides. For entrances the pair is (left, bottom), for exits (top,
/// right); the first of the pair runs 1..=H or 1..=W in its natural order (rows up, columns right)
/// unless reversed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
struct Numbering {
    /// The second side of the pair is numbered first.
    second_first: bool,
    /// The first side of the pair is run backwards.
    first_reversed: bool,
    /// The second side of the pair is run backwards.
    second_reversed: bool,
}

/// One boundary edge: `(side, index)` with the index counted from 1 (row or column).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Edge {
    Left(usize),
    Bottom(usize),
    Top(usize),
    Right(usize),
}

impl Numbering {
    fn all() -> Vec<Numbering> {
        (0..8u8)
            .map(|c| Numbering {
                second_first: c & 1 != 0,
                first_reversed: c & 2 != 0,
                second_reversed: c & 4 != 0,
            })
            .collect()
    }

    fn order(self, mut first: Vec<Edge>, mut second: Vec<Edge>) -> Vec<Edge> {
        if self.first_reversed {
            first.reverse();
        }
        if self.second_reversed {
            second.reverse();
        }
        if self.second_first {
            second.extend(first);
            second
        } else {
            first.extend(second);
            first
        }
    }

    fn entrances(self, w: usize, h: usize) -> Vec<Edge> {
        self.order(
            (1..=h).map(Edge::Left).collect(),
            (1..=w).map(Edge::Bottom).collect(),
        )
    }

    fn exits(self, w: usize, h: usize) -> Vec<Edge> {
        self.order(
            (1..=w).map(Edge::Top).collect(),
            (1..=h).map(Edge::Right).collect(),
        )
    }
}

/// The pinned entrance numbering: bottom from column `W` down to 1, then left from row 1 up to `H`.
const ENTRANCES: Numbering = Numbering {
    second_first: true,
    first_reversed: false,
    second_reversed: true,
};

/// The pinned exit numbering: right from row 1 up to `H`, then top from column `W` down to 1.
const EXITS: Numbering = Numbering {
    second_first: true,
    first_reversed: true,
    second_reversed: false,
};

/// A full convention for the claim "law of `σ⁻¹` (or `σ`) on `W × H` = law of `σ` on `H × W`".
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
struct Convention {
    entrances: Numbering,
    exits: Numbering,
    /// Entrance `k` carries color `k` (else `N + 1 − k`).
    stronger_later: bool,
    /// The transposed rectangle uses `(b2, b1)`.
    swapped_weights: bool,
    /// Compare `σ⁻¹` of `W × H` (else `σ`).
    inverse: bool,
}

const PINNED: Convention = Convention {
    entrances: ENTRANCES,
    exits: EXITS,
    stronger_later: true,
    swapped_weights: false,
    inverse: true,
};

/// The color on entrance `k` of `n`.
fn color_of(k: usize, n: usize, stronger_later: bool) -> Color {
    (if stronger_later { k } else { n + 1 - k }) as Color
}

/// The exact law of the boundary-to-exit map colored by `(entrances, stronger_later)`.
fn colored_law(
    w: usize,
    h: usize,
    entrances: Numbering,
    stronger_later: bool,
    b1: &BigRational,
    b2: &BigRational,
) -> ExactLaw<Outcome, BigRational> {
    let n = w + h;
    let (mut left, mut bottom) = (vec![0; h], vec![0; w]);
    for (i, e) in entrances.entrances(w, h).into_iter().enumerate() {
        let c = color_of(i + 1, n, stronger_later);
        match e {
            Edge::Left(y) => left[y - 1] = c,
            Edge::Bottom(x) => bottom[x - 1] = c,
            _ => unreachable!("entrances are left or bottom edges"),
        }
    }
    let boundary = Boundary::new(w, h, Side::Explicit(left), Side::Explicit(bottom)).unwrap();
    exact_law(b1.clone(), b2.clone(), &boundary).unwrap()
}

/// The law of `σ` (as the list `σ(1), …, σ(N)`) from a colored law.
fn sigma_law(
    law: &ExactLaw<Outcome, BigRational>,
    w: usize,
    h: usize,
    exits: Numbering,
    stronger_later: bool,
) -> PermLaw {
    let n = w + h;
    let order = exits.exits(w, h);
    law.map(|o| {
        let mut sigma = vec![0; n];
        for (j, e) in order.iter().enumerate() {
            let c = match *e {
                Edge::Top(x) => o.top[x - 1],
                Edge::Right(y) => o.right[y - 1],
                _ => unreachable!("exits are top or right edges"),
            } as usize;
            let k = if stronger_later { c } else { n + 1 - c };
            sigma[k - 1] = j + 1;
        }
        sigma
    })
}

fn inverse(p: &[usize]) -> Vec<usize> {
    let mut q = vec![0; p.len()];
    for (i, &v) in p.iter().enumerate() {
        q[v - 1] = i + 1;
    }
    q
}

/// Colored laws keyed by (W, H, entrance numbering, strength order, b1, b2): the scan reuses them.
type Cache = HashMap<
    (usize, usize, Numbering, bool, BigRational, BigRational),
    ExactLaw<Outcome, BigRational>,
>;

/// The two sides of the claim under `conv`: (law of σ⁻¹ or σ on W × H, law of σ on H × W).
fn both_sides(
    conv: Convention,
    w: usize,
    h: usize,
    b1: &BigRational,
    b2: &BigRational,
    b1_transposed: &BigRational,
    cache: &mut Cache,
) -> (PermLaw, PermLaw) {
    let mut side = |w: usize, h: usize, b1: &BigRational, b2: &BigRational| {
        let key = (
            w,
            h,
            conv.entrances,
            conv.stronger_later,
            b1.clone(),
            b2.clone(),
        );
        let law = cache
            .entry(key)
            .or_insert_with(|| colored_law(w, h, conv.entrances, conv.stronger_later, b1, b2));
        sigma_law(law, w, h, conv.exits, conv.stronger_later)
    };
    let here = side(w, h, b1, b2);
    let here = if conv.inverse {
        here.map(|p| inverse(p))
    } else {
        here
    };
    let there = if conv.swapped_weights {
        side(h, w, b2, b1_transposed)
    } else {
        side(h, w, b1_transposed, b2)
    };
    (here, there)
}

/// Total variation between the two sides of the claim, with the transposed `b1` possibly perturbed.
fn claim_tv(
    conv: Convention,
    w: usize,
    h: usize,
    b1: &BigRational,
    b2: &BigRational,
    b1_transposed: &BigRational,
    cache: &mut Cache,
) -> BigRational {
    let (a, b) = both_sides(conv, w, h, b1, b2, b1_transposed, cache);
    assert_eq!(a.total(), ratio(1, 1));
    assert_eq!(b.total(), ratio(1, 1));
    a.total_variation(&b)
}

fn weights() -> Vec<(BigRational, BigRational)> {
    vec![
        (ratio(3, 10), ratio(3, 5)),
        (ratio(1, 3), ratio(1, 2)),
        (ratio(2, 3), ratio(1, 5)),
        (ratio(1, 7), ratio(5, 6)),
    ]
}

fn sizes_up_to(m: usize) -> Vec<(usize, usize)> {
    (1..=m).flat_map(|w| (1..=m).map(move |h| (w, h))).collect()
}

#[test]
fn permutation_symmetry_holds_exactly() {
    let mut sizes = sizes_up_to(4);
    sizes.extend([(5, 2), (2, 5), (5, 3), (3, 5)]);
    let mut cache = Cache::new();
    for (b1, b2) in weights() {
        for &(w, h) in &sizes {
            let (a, b) = both_sides(PINNED, w, h, &b1, &b2, &b1, &mut cache);
            let tv = a.total_variation(&b);
            assert!(
                Weight::is_zero(&tv),
                "W={w} H={h} b1={b1} b2={b2}: TV = {tv} ≈ {}",
                tv.to_f64()
            );
            assert_eq!(a.total(), ratio(1, 1));
            // Not a triviality: with two or more paths, several permutations have positive probability.
            if w + h >= 2 {
                assert!(a.len() >= 2, "W={w} H={h}: degenerate law");
            }
        }
    }
}

/// The same claim with `b1` of the transposed side moved from 1/3 to 1/3 + 1/50, and the tempting
/// wrong conventions, on W = 3, H = 2 with (b1, b2) = (1/3, 1/2) and over the grid W, H ≤ 3.
#[test]
fn near_misses_fail_visibly() {
    let (b1, b2) = (ratio(1, 3), ratio(1, 2));
    let bumped = &b1 + ratio(1, 50);
    let mut cache = Cache::new();
    for (w, h) in [(3, 2), (2, 3), (2, 2), (3, 3)] {
        assert!(Weight::is_zero(&claim_tv(
            PINNED, w, h, &b1, &b2, &b1, &mut cache
        )));
        let tv = claim_tv(PINNED, w, h, &b1, &b2, &bumped, &mut cache);
        println!(
            "W={w} H={h} b1=1/3 b2=1/2, transposed b1 = 1/3 + 1/50: TV = {tv} ≈ {:.6}",
            tv.to_f64()
        );
        assert!(tv.to_f64() > 1e-4, "perturbed b1 not visibly wrong: {tv}");
    }

    let wrong = [
        (
            "without the inverse",
            Convention {
                inverse: false,
                ..PINNED
            },
        ),
        (
            "transposed side with (b2, b1)",
            Convention {
                swapped_weights: true,
                ..PINNED
            },
        ),
        (
            "exits numbered the other way round",
            Convention {
                exits: Numbering {
                    second_first: false,
                    first_reversed: false,
                    second_reversed: true,
                },
                ..PINNED
            },
        ),
        (
            "exits bottom-up on the right, left to right on top",
            Convention {
                exits: Numbering {
                    second_first: true,
                    first_reversed: false,
                    second_reversed: false,
                },
                ..PINNED
            },
        ),
    ];
    for (name, conv) in wrong {
        let fixed = claim_tv(conv, 3, 2, &b1, &b2, &b1, &mut cache).to_f64();
        let mut worst = (0.0f64, 0, 0);
        for (w, h) in sizes_up_to(3) {
            let tv = claim_tv(conv, w, h, &b1, &b2, &b1, &mut cache).to_f64();
            if tv > worst.0 {
                worst = (tv, w, h);
            }
        }
        println!(
            "near-miss '{name}': TV = {fixed:.6} at W=3 H=2; largest over W, H ≤ 3: {:.6} (W={}, H={})",
            worst.0, worst.1, worst.2
        );
        assert!(fixed > 0.0, "'{name}' holds at W=3 H=2");
        assert!(worst.0 > NEAR_MISS_MARGIN, "'{name}' is not visibly wrong");
    }
}

/// A wrong convention must differ from the true law by more than this somewhere on the grid.
const NEAR_MISS_MARGIN: f64 = 0.05;

/// Every convention of the family, on W, H ≤ 3 and two weight pairs: exactly the four of the module
/// docs hold.
#[test]
fn convention_scan_finds_exactly_four() {
    let pairs = [(ratio(1, 3), ratio(1, 2)), (ratio(2, 3), ratio(1, 5))];
    let sizes = sizes_up_to(3);
    let mut cache = Cache::new();
    let mut holding = Vec::new();
    let mut closest_failure = f64::INFINITY;
    let mut scanned = 0;
    for entrances in Numbering::all() {
        for exits in Numbering::all() {
            for stronger_later in [true, false] {
                for swapped_weights in [false, true] {
                    for inverse in [true, false] {
                        let conv = Convention {
                            entrances,
                            exits,
                            stronger_later,
                            swapped_weights,
                            inverse,
                        };
                        scanned += 1;
                        let mut worst = 0.0f64;
                        let mut holds = true;
                        for (b1, b2) in &pairs {
                            for &(w, h) in &sizes {
                                let tv = claim_tv(conv, w, h, b1, b2, b1, &mut cache);
                                holds &= Weight::is_zero(&tv);
                                worst = worst.max(tv.to_f64());
                            }
                        }
                        if holds {
                            holding.push(conv);
                        } else {
                            closest_failure = closest_failure.min(worst);
                        }
                    }
                }
            }
        }
    }
    // The pinned convention, its strength reversal, and both run the other way round (clockwise
    // from the top-left: left from row H down, then bottom from column 1; top from column 1, then
    // right from row H down).
    let clockwise = Convention {
        entrances: Numbering {
            second_first: false,
            first_reversed: true,
            second_reversed: false,
        },
        exits: Numbering {
            second_first: false,
            first_reversed: false,
            second_reversed: true,
        },
        ..PINNED
    };
    let mut expected = vec![
        PINNED,
        Convention {
            stronger_later: false,
            ..PINNED
        },
        clockwise,
        Convention {
            stronger_later: false,
            ..clockwise
        },
    ];
    let key = |c: &Convention| format!("{c:?}");
    holding.sort_by_key(key);
    expected.sort_by_key(key);
    println!(
        "{scanned} conventions scanned, {} hold; the closest failing one has largest TV {closest_failure:.6}",
        holding.len()
    );
    assert_eq!(scanned, 512);
    assert_eq!(holding, expected);
    assert!(closest_failure > NEAR_MISS_MARGIN);
}

/// The marginal statement of `color_position_symmetry.rs` is a push-forward of the permutation one:
/// `φ(π) = {N + 1 − π(k) : k > H, π(k) > W}` maps σ⁻¹ of W × H to `{H + 1 − y : the color of left
/// row y leaves through the top}` and σ of H × W to the columns where a left-entering path leaves
/// its top, and the bottom colors (all weaker) merge into "no path".
#[test]
fn contains_the_marginal_statement() {
    let (b1, b2) = (ratio(3, 10), ratio(3, 5));
    let mut cache = Cache::new();
    for (w, h) in sizes_up_to(3) {
        let n = w + h;
        let phi = |p: &Vec<usize>| {
            let mut s: Vec<usize> = (h + 1..=n)
                .filter(|&k| p[k - 1] > w)
                .map(|k| n + 1 - p[k - 1])
                .collect();
            s.sort_unstable();
            s
        };
        let (here, there) = both_sides(PINNED, w, h, &b1, &b2, &b1, &mut cache);
        let rainbow = exact_law(b1.clone(), b2.clone(), &Boundary::rainbow(w, h).unwrap()).unwrap();
        let reflected = rainbow.map(|o| {
            let mut s: Vec<usize> = o
                .top
                .iter()
                .filter(|&&c| c != 0)
                .map(|&c| h + 1 - c as usize)
                .collect();
            s.sort_unstable();
            s
        });
        let step = exact_law(b1.clone(), b2.clone(), &Boundary::step(h, w).unwrap()).unwrap();
        let blind = step.map(|o| occupied_positions(&o.top).elements());
        assert!(Weight::is_zero(&here.map(phi).total_variation(&reflected)));
        assert!(Weight::is_zero(&there.map(phi).total_variation(&blind)));
    }
}
