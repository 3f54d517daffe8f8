//! The strip kernel against the reference row kernel on the same words: bit-identical top and right
//! exits, horizontal lines, heights and whole configuration, over random sizes (widths and heights
//! that are not multiples of any strip height included), boundaries (colors wide enough for each
//! lane type `u8`, `u16`, `u32`), weights (0 and 1 included) and seeds; both the AVX2 build (when the
//! processor has it) and the portable build.

use motley_colorblind::Color;
use motley_sixvertex::{Boundary, ColorRule, HeightQuery, Kernel, Model, ReadoutSpec, Side};
use proptest::prelude::*;

/// Largest colors chosen so that every lane type is exercised.
const MAX_COLORS: [Color; 4] = [3, 255, 65_535, u32::MAX];

fn side(len: usize) -> impl Strategy<Value = Side> {
    let colors = proptest::sample::select(MAX_COLORS.to_vec())
        .prop_flat_map(move |max| proptest::collection::vec(0..=max, len));
    prop_oneof![
        Just(Side::Empty),
        Just(Side::Rainbow),
        prop_oneof![Just(1u32), Just(300), Just(70_000)].prop_map(Side::Step),
        colors.prop_map(Side::Explicit),
        (0.0f64..=1.0, 0u32..70_000, any::<bool>()).prop_map(|(density, c, by_index)| {
            Side::Bernoulli {
                density,
                color: if by_index {
                    ColorRule::Index { offset: c }
                } else {
                    ColorRule::Fixed(c)
                },
            }
        }),
    ]
}

fn weight() -> impl Strategy<Value = f64> {
    prop_oneof![Just(0.0), Just(1.0), 0.0f64..=1.0]
}

fn model() -> impl Strategy<Value = Model> {
    (1usize..90, 1usize..90, weight(), weight()).prop_flat_map(|(w, h, b1, b2)| {
        (side(h), side(w))
            .prop_map(move |(l, d)| Model::new(b1, b2, Boundary::new(w, h, l, d).unwrap()).unwrap())
    })
}

type Sample = (
    Vec<Color>,
    Vec<Color>,
    Vec<Color>,
    Vec<Color>,
    Vec<Vec<Color>>,
    Vec<u64>,
);

fn run(model: &Model, kernel: Kernel, spec: &ReadoutSpec, seed: u64, index: u64) -> Sample {
    let m = model.clone().with_kernel(kernel);
    let mut r = m.readout(spec.clone()).unwrap();
    m.sample(seed, index, &mut r);
    (
        r.left().to_vec(),
        r.bottom().to_vec(),
        r.top().to_vec(),
        r.right().to_vec(),
        spec.horizontal_lines
            .iter()
            .map(|&y| r.horizontal_line(y).unwrap().to_vec())
            .collect(),
        r.heights().to_vec(),
    )
}

const FAST: [Kernel; 3] = [Kernel::Auto, Kernel::Strips, Kernel::Portable];

proptest! {
    #![proptest_config(ProptestConfig { cases: 400, failure_persistence: None, ..ProptestConfig::default() })]

    /// Exits, horizontal lines and heights at random rows agree with the reference kernel.
    #[test]
    fn strips_equal_reference(
        model in model(),
        seed in any::<u64>(),
        index in 0u64..1000,
        rows in proptest::collection::vec(0usize..100, 0..4),
        points in proptest::collection::vec((0usize..100, 0usize..100, 0u32..300), 0..4),
    ) {
        let (w, h) = (model.width(), model.height());
        let spec = ReadoutSpec {
            horizontal_lines: rows.iter().map(|&y| y % (h + 1)).collect(),
            heights: points
                .iter()
                .map(|&(a, b, t)| HeightQuery { a: a % (w + 1), b: b % (h + 1), threshold: t })
                .collect(),
            ..ReadoutSpec::default()
        };
        let want = run(&model, Kernel::Reference, &spec, seed, index);
        for kernel in FAST {
            prop_assert_eq!(&run(&model, kernel, &spec, seed, index), &want, "{:?}", kernel);
        }
    }

    /// The whole configuration of the reference kernel equals the strip kernel's, edge by edge:
    /// the vertical edges from horizontal lines at every row, the horizontal edges just right of
    /// column `x` from the right exits of the same boundary cut to `x` columns (vertex `(x', y)`
    /// decides on word `x' − 1` of stream `y` whatever the width). The boundary drawn is replayed as
    /// explicit colors, so random boundaries are covered too.
    #[test]
    fn whole_configuration_equals_reference(model in model(), seed in any::<u64>(), index in 0u64..1000) {
        let (w, h) = (model.width(), model.height());
        let reference = model.clone().with_kernel(Kernel::Reference);
        let mut r = reference
            .readout(ReadoutSpec { configuration: true, ..ReadoutSpec::default() })
            .unwrap();
        reference.sample(seed, index, &mut r);
        let config = r.configuration().unwrap().clone();
        let (b1, b2) = (model.weights().b1(), model.weights().b2());
        let replay = |x: usize| {
            let b = Boundary::new(
                x,
                h,
                Side::Explicit(r.left().to_vec()),
                Side::Explicit(r.bottom()[..x].to_vec()),
            )
            .unwrap();
            Model::new(b1, b2, b).unwrap()
        };
        let every_row = ReadoutSpec { horizontal_lines: (0..=h).collect(), ..ReadoutSpec::default() };
        for kernel in [Kernel::Strips, Kernel::Portable] {
            let lines = run(&replay(w), kernel, &every_row, seed, index).4;
            prop_assert_eq!(lines.len(), h + 1);
            for (y, line) in lines.iter().enumerate() {
                prop_assert_eq!(line.as_slice(), config.vertical_line(y), "{:?} row {}", kernel, y);
            }
            for x in 1..=w {
                let right = run(&replay(x), kernel, &ReadoutSpec::default(), seed, index).3;
                let want: Vec<Color> = (1..=h).map(|y| config.right(x, y)).collect();
                prop_assert_eq!(right, want, "{:?} column {}", kernel, x);
            }
        }
    }
}

/// A near miss must show: the strip kernel with `b1` and `b2` exchanged differs from the reference
/// on a rainbow sample (so the comparisons above can fail).
#[test]
fn exchanged_weights_differ() {
    let fast = Model::new(0.6, 0.3, Boundary::rainbow(50, 50).unwrap())
        .unwrap()
        .with_kernel(Kernel::Strips);
    let reference = Model::new(0.3, 0.6, Boundary::rainbow(50, 50).unwrap())
        .unwrap()
        .with_kernel(Kernel::Reference);
    assert_ne!(fast.sample_exits(1, 0), reference.sample_exits(1, 0));
}

/// A large rectangle with several lane types in one run: 2000 columns, 37 rows (not a multiple of
/// 8, 16 or 32), rainbow (u8), rainbow shifted past 255 (u16) and past 65535 (u32).
#[test]
fn large_rectangles_equal_reference() {
    for offset in [0, 300, 70_000] {
        let b = Boundary::new(
            2000,
            37,
            Side::Bernoulli {
                density: 0.7,
                color: ColorRule::Index { offset },
            },
            Side::Bernoulli {
                density: 0.2,
                color: ColorRule::Index { offset },
            },
        )
        .unwrap();
        let m = Model::new(0.35, 0.55, b).unwrap();
        let spec = ReadoutSpec {
            horizontal_lines: vec![20, 37],
            ..ReadoutSpec::default()
        };
        let want = run(&m, Kernel::Reference, &spec, 5, 6);
        for kernel in FAST {
            assert_eq!(
                run(&m, kernel, &spec, 5, 6),
                want,
                "{kernel:?} offset {offset}"
            );
        }
    }
}
