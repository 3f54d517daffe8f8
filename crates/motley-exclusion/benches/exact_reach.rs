//! The exact reach targets, one core: the sparse solver (build and solve) on two classes on 20
//! sites (184 756 arrangements), three classes on 15 sites (756 756) and nine distinct colors
//! (362 880), ASEP `p = 1, q = 1/2` on a segment up to `t = 5`; the multiline-queue count of an
//! 8-site ring in exact integers; stationary samples of a 1000-site ring. Run with
//! `cargo bench -p motley-exclusion --bench exact_reach`.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use motley_colorblind::Color;
use motley_exclusion::{
    multiline_queue_law, FiniteLattice, FiniteSystem, Rates, SparseSolver, StationarySampler,
    DEFAULT_TAIL,
};
use std::hint::black_box;

/// `counts[k]` sites of color `k`, strongest (largest) first from site 1.
fn blocks(lattice: FiniteLattice, counts: &[usize]) -> FiniteSystem {
    let mut colors: Vec<Color> = Vec::new();
    for (c, &m) in counts.iter().enumerate().rev() {
        colors.extend(std::iter::repeat_n(c as Color, m));
    }
    FiniteSystem::new(lattice, colors).unwrap()
}

fn solve(c: &mut Criterion, name: &str, system: FiniteSystem) {
    let rates = Rates::new(1.0, 0.5).unwrap();
    let mut g = c.benchmark_group(name);
    g.sample_size(10);
    g.bench_function("build_and_solve_t5", |b| {
        b.iter(|| {
            let solver = SparseSolver::new(&system, rates).unwrap();
            let law = solver.law_at(5.0, DEFAULT_TAIL).unwrap();
            black_box(law.error_bound())
        })
    });
    g.finish();
}

fn two_classes_20(c: &mut Criterion) {
    solve(
        c,
        "exact_two_classes_20_sites",
        blocks(FiniteLattice::Segment, &[10, 10]),
    );
}

fn three_classes_15(c: &mut Criterion) {
    solve(
        c,
        "exact_three_classes_15_sites",
        blocks(FiniteLattice::Segment, &[5, 5, 5]),
    );
}

fn permutations_9(c: &mut Criterion) {
    solve(
        c,
        "exact_permutations_9_sites",
        blocks(FiniteLattice::Segment, &[1; 9]),
    );
}

fn queues(c: &mut Criterion) {
    let rates = Rates::tasep(1.0).unwrap();
    let mut g = c.benchmark_group("stationary_ring");
    g.sample_size(10);
    let ring8 = blocks(FiniteLattice::Ring, &[2, 2, 2, 2]);
    g.bench_function("queue_count_8_sites_4_classes", |b| {
        b.iter(|| black_box(multiline_queue_law(&ring8, &rates).unwrap().0.len()))
    });
    let big = blocks(FiniteLattice::Ring, &[400, 300, 300]);
    let sampler = StationarySampler::new(&big, &rates).unwrap();
    g.throughput(Throughput::Elements(1));
    let mut i = 0;
    g.bench_function("sample_1000_sites_3_classes", |b| {
        b.iter(|| {
            i += 1;
            black_box(sampler.sample(1, i))
        })
    });
    g.finish();
}

criterion_group!(
    name = benches;
    config = Criterion::default()
        .warm_up_time(std::time::Duration::from_millis(500))
        .measurement_time(std::time::Duration::from_secs(5));
    targets = two_classes_20, three_classes_15, permutations_9, queues
);
criterion_main!(benches);
