//! The exact programme at the sizes the scenarios need: 5×5 rainbow and 4×4 with all eight boundary
//! edges carrying distinct colors, in rationals, with exact checks of what they must satisfy.

use std::time::Instant;

use motley_colorblind::{occupied_positions, Projection};
use motley_sixvertex::{exact_law, ratio, Boundary, Outcome, Side};
use num_traits::Zero;

/// 5×5 rainbow: a probability law, colors conserved in every outcome, and the color–position
/// symmetry (Borodin and Bufetov 2021, see color_position_symmetry.rs) one size beyond that test.
#[test]
fn rainbow_5x5() {
    let (b1, b2) = (ratio(3, 10), ratio(3, 5));
    let start = Instant::now();
    let law = exact_law(b1.clone(), b2.clone(), &Boundary::rainbow(5, 5).unwrap()).unwrap();
    println!(
        "5x5 rainbow: {} outcomes in {:?}",
        law.len(),
        start.elapsed()
    );
    assert_eq!(law.total(), ratio(1, 1));
    for (o, _) in law.entries() {
        let mut c: Vec<u32> = o
            .top
            .iter()
            .chain(&o.right)
            .copied()
            .filter(|&c| c > 0)
            .collect();
        c.sort_unstable();
        assert_eq!(c, vec![1, 2, 3, 4, 5]);
    }
    let colored = law.map(|o| {
        let mut s: Vec<usize> = o
            .top
            .iter()
            .filter(|&&c| c > 0)
            .map(|&c| 6 - c as usize)
            .collect();
        s.sort_unstable();
        s
    });
    let blind = exact_law(b1, b2, &Boundary::step(5, 5).unwrap())
        .unwrap()
        .map(|o| occupied_positions(&o.top).elements());
    assert!(colored.total_variation(&blind).is_zero());
}

/// 4×4 with eight distinct boundary colors: every outcome is a permutation of them, and for every
/// threshold the push-forward of the colored law equals the exact law of the projected model (the
/// basic coupling, in law).
#[test]
fn distinct_colors_4x4() {
    let boundary = Boundary::new(
        4,
        4,
        Side::Explicit(vec![3, 8, 1, 6]),
        Side::Explicit(vec![5, 2, 7, 4]),
    )
    .unwrap();
    let (b1, b2) = (ratio(2, 7), ratio(4, 5));
    let start = Instant::now();
    let law = exact_law(b1.clone(), b2.clone(), &boundary).unwrap();
    println!(
        "4x4 distinct colors: {} outcomes in {:?}",
        law.len(),
        start.elapsed()
    );
    assert_eq!(law.total(), ratio(1, 1));
    for (o, _) in law.entries() {
        let mut c: Vec<u32> = o.top.iter().chain(&o.right).copied().collect();
        c.sort_unstable();
        assert_eq!(c, (1..=8).collect::<Vec<_>>());
    }
    for t in 1..=8 {
        let p = Projection::threshold(t);
        let pushed = law.map(|o| Outcome {
            top: p.apply_slice(&o.top).unwrap(),
            right: p.apply_slice(&o.right).unwrap(),
        });
        let direct = exact_law(b1.clone(), b2.clone(), &boundary.project(&p).unwrap()).unwrap();
        assert_eq!(pushed, direct, "threshold {t}");
    }
}
