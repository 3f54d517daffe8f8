//! Throughput of the row-by-row sweep (vertices per second) and time of the exact 5×5 rainbow law.
//! Seeded inputs: seed 1, sample index = iteration count; one thread.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use motley_sixvertex::{exact_law, ratio, Boundary, Model, ReadoutSpec};
use std::hint::black_box;

const SIDE: usize = 2000;

fn sweeps(c: &mut Criterion) {
    let mut group = c.benchmark_group("sweep");
    group.throughput(Throughput::Elements((SIDE * SIDE) as u64));
    group.sample_size(20);
    let cases = [
        (
            "colored_rainbow_2000x2000",
            Boundary::rainbow(SIDE, SIDE).unwrap(),
        ),
        (
            "colorblind_step_2000x2000",
            Boundary::step(SIDE, SIDE).unwrap(),
        ),
    ];
    for (name, boundary) in cases {
        let model = Model::new(0.3, 0.6, boundary).unwrap();
        let mut out = model.readout(ReadoutSpec::default()).unwrap();
        let mut index = 0u64;
        group.bench_function(name, |b| {
            b.iter(|| {
                model.sample(1, index, &mut out);
                index += 1;
                black_box(out.right()[SIDE - 1])
            })
        });
    }
    group.finish();
}

fn exact(c: &mut Criterion) {
    let mut group = c.benchmark_group("exact");
    group.sample_size(10);
    let boundary = Boundary::rainbow(5, 5).unwrap();
    group.bench_function("rainbow_5x5_rational", |b| {
        b.iter(|| {
            black_box(
                exact_law(ratio(3, 10), ratio(3, 5), &boundary)
                    .unwrap()
                    .len(),
            )
        })
    });
    group.bench_function("rainbow_5x5_f64", |b| {
        b.iter(|| black_box(exact_law(0.3, 0.6, &boundary).unwrap().len()))
    });
    group.finish();
}

criterion_group!(benches, sweeps, exact);
criterion_main!(benches);
