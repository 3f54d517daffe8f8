//! Invariants shared by every sample: conservation of colors, the basic coupling with the colorblind
//! projection, the definition of the height function, and independence of the thread count.

use motley_colorblind::{Color, Projection};
use motley_sixvertex::{Boundary, ColorRule, HeightQuery, Model, ReadoutSpec, Side};
use proptest::prelude::*;
use rayon::prelude::*;

fn side(len: usize) -> impl Strategy<Value = Side> {
    prop_oneof![
        Just(Side::Empty),
        Just(Side::Rainbow),
        (0u32..6).prop_map(Side::Step),
        proptest::collection::vec(0u32..8, len).prop_map(Side::Explicit),
        (0..=len, 0u32..6, 0u32..6).prop_map(|(first_len, first, rest)| Side::Blocks {
            first_len,
            first,
            rest
        }),
        (0.0f64..=1.0, 0u32..6, any::<bool>()).prop_map(|(density, c, by_index)| Side::Bernoulli {
            density,
            color: if by_index {
                ColorRule::Index { offset: c }
            } else {
                ColorRule::Fixed(c)
            }
        }),
    ]
}

fn model() -> impl Strategy<Value = Model> {
    (1usize..9, 1usize..9, 0.0f64..=1.0, 0.0f64..=1.0).prop_flat_map(|(w, h, b1, b2)| {
        (side(h), side(w))
            .prop_map(move |(l, d)| Model::new(b1, b2, Boundary::new(w, h, l, d).unwrap()).unwrap())
    })
}

fn sorted_nonzero(colors: impl Iterator<Item = Color>) -> Vec<Color> {
    let mut v: Vec<Color> = colors.filter(|&c| c != 0).collect();
    v.sort_unstable();
    v
}

/// The whole configuration and every point of the height function.
fn full(model: &Model) -> ReadoutSpec {
    ReadoutSpec {
        configuration: true,
        heights: (0..=model.width())
            .flat_map(|a| (0..=model.height()).map(move |b| HeightQuery::all(a, b)))
            .collect(),
        ..ReadoutSpec::default()
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 300, failure_persistence: None, ..ProptestConfig::default() })]

    /// The multiset of incoming colors equals the multiset of outgoing colors, for the whole
    /// rectangle and for every vertex.
    #[test]
    fn colors_are_conserved(m in model(), seed in any::<u64>(), index in 0u64..1000) {
        let mut r = m.readout(full(&m)).unwrap();
        m.sample(seed, index, &mut r);
        let incoming = sorted_nonzero(r.left().iter().chain(r.bottom()).copied());
        let outgoing = sorted_nonzero(r.top().iter().chain(r.right()).copied());
        prop_assert_eq!(incoming, outgoing);
        let c = r.configuration().unwrap();
        for y in 1..=m.height() {
            for x in 1..=m.width() {
                let mut a = [c.up(x, y - 1), c.right(x - 1, y)];
                let mut b = [c.up(x, y), c.right(x, y)];
                a.sort_unstable();
                b.sort_unstable();
                prop_assert_eq!(a, b);
            }
        }
    }

    /// The basic coupling: the projection of a colored sample equals, edge for edge, the sample of
    /// the model on the projected boundary with the same seed and index (thresholds and merges).
    #[test]
    fn projection_commutes_with_sampling(
        m in model(),
        seed in any::<u64>(),
        index in 0u64..1000,
        threshold in 0u32..10,
        steps in proptest::collection::vec(0u32..2, 20),
    ) {
        let max = m.boundary().max_color() as usize;
        let mut table = vec![0u32];
        for k in 1..=max {
            table.push(table[k - 1] + steps[k % steps.len()]);
        }
        for p in [Projection::threshold(threshold), Projection::merge(table.clone()).unwrap()] {
            let blind = m.project(&p).unwrap();
            let mut rc = m.readout(full(&m)).unwrap();
            let mut rb = blind.readout(full(&blind)).unwrap();
            m.sample(seed, index, &mut rc);
            blind.sample(seed, index, &mut rb);
            let (cc, cb) = (rc.configuration().unwrap(), rb.configuration().unwrap());
            for y in 0..=m.height() {
                prop_assert_eq!(p.apply_slice(cc.vertical_line(y)).unwrap(), cb.vertical_line(y).to_vec());
            }
            for y in 1..=m.height() {
                for x in 0..=m.width() {
                    prop_assert_eq!(p.apply(cc.right(x, y)).unwrap(), cb.right(x, y));
                }
            }
        }
    }

    /// The height function matches its definition from the whole configuration, and conservation
    /// makes it equal to the paths entering the region {a+1..W} × {1..b}.
    #[test]
    fn height_function_definition(m in model(), seed in any::<u64>(), t in 0u32..5) {
        let mut spec = full(&m);
        for q in &mut spec.heights { q.threshold = t; }
        let mut r = m.readout(spec).unwrap();
        m.sample(seed, 0, &mut r);
        let c = r.configuration().unwrap();
        let t = t.max(1);
        for (q, &h) in r.height_queries().iter().zip(r.heights()) {
            let (a, b) = (q.a, q.b);
            let above = (a + 1..=m.width()).filter(|&x| c.up(x, b) >= t).count();
            let right = (1..=b).filter(|&y| c.right(m.width(), y) >= t).count();
            prop_assert_eq!(h, (above + right) as u64);
            let through_line = (1..=b).filter(|&y| c.right(a, y) >= t).count();
            let from_below = (a + 1..=m.width()).filter(|&x| c.up(x, 0) >= t).count();
            prop_assert_eq!(h, (through_line + from_below) as u64);
        }
    }
}

/// Under the step boundary H(0, b) = b and H(a, 0) = 0 (the normalisation in the crate docs).
#[test]
fn height_normalisation_under_step() {
    let m = Model::new(0.35, 0.8, Boundary::step(7, 6).unwrap()).unwrap();
    let mut r = m.readout(full(&m)).unwrap();
    for index in 0..50 {
        m.sample(3, index, &mut r);
        for (q, &h) in r.height_queries().iter().zip(r.heights()) {
            if q.a == 0 {
                assert_eq!(h, q.b as u64);
            }
            if q.b == 0 {
                assert_eq!(h, 0);
            }
        }
    }
}

/// Same seed ⇒ same results under thread pools of 1 and 2 threads.
#[test]
fn thread_count_does_not_matter() {
    let m = Model::new(
        0.3,
        0.6,
        Boundary::new(
            40,
            30,
            Side::Bernoulli {
                density: 0.6,
                color: ColorRule::Index { offset: 0 },
            },
            Side::Rainbow,
        )
        .unwrap(),
    )
    .unwrap();
    let spec = ReadoutSpec {
        heights: vec![
            HeightQuery::all(20, 15),
            HeightQuery {
                a: 10,
                b: 30,
                threshold: 12,
            },
        ],
        ..ReadoutSpec::default()
    };
    let run = |threads: usize| {
        let pool = rayon::ThreadPoolBuilder::new()
            .num_threads(threads)
            .build()
            .unwrap();
        pool.install(|| {
            (0..400u64)
                .into_par_iter()
                .map_init(
                    || m.readout(spec.clone()).unwrap(),
                    |r, i| {
                        m.sample(77, i, r);
                        (r.outcome(), r.heights().to_vec())
                    },
                )
                .collect::<Vec<_>>()
        })
    };
    let one = run(1);
    let two = run(2);
    assert_eq!(one, two);
    // And equal to the plain serial loop.
    let mut r = m.readout(spec.clone()).unwrap();
    for (i, got) in one.iter().enumerate() {
        m.sample(77, i as u64, &mut r);
        assert_eq!(&(r.outcome(), r.heights().to_vec()), got);
    }
}
