//! The color–position symmetry, checked exactly in rationals.
//!
//! Source: A. Borodin and A. Bufetov, "Color-position symmetry in interacting particle systems",
//! Ann. Probab. 49 (2021); its consequence for the colored stochastic six-vertex model with rainbow
//! boundary, here in our conventions (larger color stronger, `b1` from below, `b2` from the left):
//! rainbow from the left and empty bottom on `W` columns × `H` rows; the set
//! `{H + 1 − c : color c leaves through the top}` has the same law as the set of columns where a path
//! leaves through the top of the colorblind step model on `H` columns × `W` rows, same `b1`, `b2`.

use motley_colorblind::occupied_positions;
use motley_sixvertex::{exact_law, ratio, Boundary, ExactLaw};
use num_rational::BigRational;
use num_traits::Zero;

type SetLaw = ExactLaw<Vec<usize>, BigRational>;

/// Law of `{H + 1 − c : c leaves the top}` (or `{c}` if `reflect` is false), rainbow W × H.
fn colored_side(w: usize, h: usize, b1: &BigRational, b2: &BigRational, reflect: bool) -> SetLaw {
    let law = exact_law(b1.clone(), b2.clone(), &Boundary::rainbow(w, h).unwrap()).unwrap();
    law.map(|o| {
        let mut s: Vec<usize> = o
            .top
            .iter()
            .filter(|&&c| c != 0)
            .map(|&c| {
                if reflect {
                    h + 1 - c as usize
                } else {
                    c as usize
                }
            })
            .collect();
        s.sort_unstable();
        s
    })
}

/// Law of the set of columns where a path leaves the top, colorblind step on `cols` × `rows`.
fn colorblind_side(cols: usize, rows: usize, b1: &BigRational, b2: &BigRational) -> SetLaw {
    let law = exact_law(b1.clone(), b2.clone(), &Boundary::step(cols, rows).unwrap()).unwrap();
    law.map(|o| occupied_positions(&o.top).elements())
}

fn weights() -> Vec<(BigRational, BigRational)> {
    vec![
        (ratio(3, 10), ratio(3, 5)),
        (ratio(1, 3), ratio(1, 2)),
        (ratio(2, 3), ratio(1, 5)),
        (ratio(1, 7), ratio(5, 6)),
    ]
}

#[test]
fn symmetry_holds_exactly_for_all_small_rectangles() {
    let mut worst = [0.0f64; 3];
    let mut worst_at = [(0, 0, 0); 3];
    for (k, (b1, b2)) in weights().iter().enumerate() {
        for w in 1..=4 {
            for h in 1..=4 {
                let colored = colored_side(w, h, b1, b2, true);
                let blind = colorblind_side(h, w, b1, b2);
                // Exact identity: the total variation distance is 0 in rationals.
                let tv = colored.total_variation(&blind);
                assert!(
                    tv.is_zero(),
                    "W={w} H={h} b1={b1} b2={b2}: TV = {tv} ≈ {}",
                    tv_f64(&tv)
                );
                assert_eq!(colored.total(), ratio(1, 1));

                // Near-misses.
                let no_reflection = colored_side(w, h, b1, b2, false).total_variation(&blind);
                let swapped = colored.total_variation(&colorblind_side(h, w, b2, b1));
                let same_rectangle = colored.total_variation(&colorblind_side(w, h, b1, b2));
                for (slot, tv) in [no_reflection, swapped, same_rectangle].iter().enumerate() {
                    let v = tv_f64(tv);
                    if v > worst[slot] {
                        worst[slot] = v;
                        worst_at[slot] = (w, h, k);
                    }
                }
            }
        }
    }
    let names = [
        "no reflection",
        "b1 and b2 swapped",
        "same rectangle, not transposed",
    ];
    let ws = weights();
    for slot in 0..3 {
        let (w, h, k) = worst_at[slot];
        println!(
            "near-miss '{}': largest TV over the grid = {:.6} (W={w}, H={h}, b1={}, b2={})",
            names[slot], worst[slot], ws[k].0, ws[k].1
        );
        // Each near-miss is far from the true law somewhere on the grid.
        assert!(
            worst[slot] > NEAR_MISS_MARGIN,
            "near-miss '{}' is not visibly wrong",
            names[slot]
        );
    }
}

/// A near-miss must differ from the true law by more than this in total variation.
const NEAR_MISS_MARGIN: f64 = 0.05;

/// One fixed case, W = 3, H = 4, b1 = 3/10, b2 = 3/5: every near-miss differs there.
#[test]
fn near_misses_differ_on_a_fixed_case() {
    let (b1, b2) = (ratio(3, 10), ratio(3, 5));
    let (w, h) = (3, 4);
    let colored = colored_side(w, h, &b1, &b2, true);
    let blind = colorblind_side(h, w, &b1, &b2);
    assert!(colored.total_variation(&blind).is_zero());
    let cases = [
        (
            "no reflection",
            colored_side(w, h, &b1, &b2, false).total_variation(&blind),
        ),
        (
            "b1 and b2 swapped",
            colored.total_variation(&colorblind_side(h, w, &b2, &b1)),
        ),
        (
            "same rectangle",
            colored.total_variation(&colorblind_side(w, h, &b1, &b2)),
        ),
    ];
    for (name, tv) in cases {
        println!(
            "W=3 H=4 b1=3/10 b2=3/5, near-miss '{name}': TV = {:.6}",
            tv_f64(&tv)
        );
        assert!(
            tv_f64(&tv) > NEAR_MISS_MARGIN,
            "near-miss '{name}' too close"
        );
    }
}

fn tv_f64(tv: &BigRational) -> f64 {
    motley_sixvertex::Weight::to_f64(tv)
}
