//! Throughput of the six-vertex sweeps (vertices per second): the colored rainbow and the
//! colorblind step on 2000×2000 with the strip kernel (AVX2 when available), its portable build
//! and the reference row kernel; a "ChaCha8 limit loop" for comparison in the same run; and the
//! time of the exact 5×5 rainbow law. Seeded inputs: seed 1, sample index = iteration count; one
//! thread. `scripts/bench-ratios.sh` runs these with the plain C loop and prints the ratios.

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use motley_sixvertex::{exact_law, ratio, Boundary, Kernel, Model, ReadoutSpec};
use motley_stream::sample_stream;
use rand_core::Rng;
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
        for (kernel, tag) in [
            (Kernel::Auto, "strip"),
            (Kernel::Portable, "strip_portable"),
            (Kernel::Reference, "reference"),
        ] {
            let model = Model::new(0.3, 0.6, boundary.clone())
                .unwrap()
                .with_kernel(kernel);
            let mut out = model.readout(ReadoutSpec::default()).unwrap();
            let mut index = 0u64;
            group.bench_function(format!("{name}/{tag}"), |b| {
                b.iter(|| {
                    model.sample(1, index, &mut out);
                    index += 1;
                    black_box(out.right()[SIDE - 1])
                })
            });
        }
    }
    group.finish();
}

/// The ChaCha8 limit loop: one keystream word per vertex generated in bulk per row (as the engine
/// does: `sample_stream(seed, i, y)`, `fill_bytes`), and a trivial branch-free vertex rule with no
/// chain along the row (`vert[x] ^= 1 & (u ≥ cut)`), so the loop costs what the keystream costs.
/// No reproducible engine on rand_chacha's ChaCha8 can beat it.
fn limit(c: &mut Criterion) {
    let mut group = c.benchmark_group("limit");
    group.throughput(Throughput::Elements((SIDE * SIDE) as u64));
    group.sample_size(20);
    let cut = 0x4CCC_CCCDu32;
    let mut bytes = vec![0u8; 4 * SIDE];
    let mut vert = vec![0u32; SIDE];
    let mut index = 0u64;
    group.bench_function("chacha8_2000x2000", |b| {
        b.iter(|| {
            for y in 1..=SIDE {
                sample_stream(1, index, y as u64).fill_bytes(&mut bytes);
                for (v, w) in vert.iter_mut().zip(bytes.chunks_exact(4)) {
                    let u = u32::from_le_bytes([w[0], w[1], w[2], w[3]]);
                    *v ^= u32::from(u >= cut);
                }
            }
            index += 1;
            black_box(vert[SIDE - 1])
        })
    });
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

criterion_group!(benches, sweeps, limit, exact);
criterion_main!(benches);
