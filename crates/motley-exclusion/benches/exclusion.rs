//! Throughput of the exclusion engine: the ring kernel (attempted moves per second) beside a
//! "ChaCha8 limit loop" in the same run, the line on step data, and the exact solver on 7 packed
//! sites. Seeded inputs; run with `cargo bench -p motley-exclusion` (or `scripts/bench-ratios.sh`,
//! which adds the plain C loop and prints the ratios).

use criterion::{criterion_group, criterion_main, Criterion, Throughput};
use motley_exclusion::{
    ExactSolver, FiniteLattice, FiniteProcess, FiniteSystem, LineData, LineProcess, Rates,
    DEFAULT_TAIL,
};
use motley_stream::sample_stream;
use rand_core::Rng;
use std::hint::black_box;

/// The ChaCha8 limit loop for the ring: the same attempts as the engine's TASEP ring (uniform bond
/// by multiply-shift on one bulk-generated ChaCha8 word, `fill_bytes` into a 1 KiB buffer; no
/// rejection step), 16-bit colors, a branch-free min/max exchange, and nothing else: no Poisson
/// count, no observer. A reproducible engine on rand_chacha's ChaCha8 cannot beat it by much.
fn ring_limit(c: &mut Criterion) {
    let n = 100_000usize;
    let moves = 10_000_000usize;
    let mut sites: Vec<u16> = (0..n as u32)
        .map(|i| ((i * 7 + i / 13) % 5) as u16)
        .collect();
    let mut bytes = [0u8; 1024];
    let mut g = c.benchmark_group("ring_1e5_tasep");
    g.sample_size(10);
    g.throughput(Throughput::Elements(moves as u64));
    let mut i = 0;
    g.bench_function("chacha8_limit", |b| {
        b.iter(|| {
            i += 1;
            let mut rng = sample_stream(1, i, 1);
            for _ in 0..moves / 256 {
                rng.fill_bytes(&mut bytes);
                for w in bytes.chunks_exact(4) {
                    let u = u32::from_le_bytes([w[0], w[1], w[2], w[3]]);
                    let x = ((u64::from(u) * n as u64) >> 32) as usize;
                    let y = if x + 1 == n { 0 } else { x + 1 };
                    let (a, b) = (sites[x], sites[y]);
                    sites[x] = a.min(b);
                    sites[y] = a.max(b);
                }
            }
            black_box(sites[0])
        })
    });
    g.finish();
}

fn ring_tasep(c: &mut Criterion) {
    let n = 100_000usize;
    let t = 100.0;
    // Five species (colors 0..=4) spread round the ring.
    let colors: Vec<u32> = (0..n as u32).map(|i| (i * 7 + i / 13) % 5).collect();
    let process = FiniteProcess::new(
        FiniteSystem::ring(colors).unwrap(),
        Rates::tasep(1.0).unwrap(),
    );
    let plan = process.plan(&[t], vec![]).unwrap();
    let mut g = c.benchmark_group("ring_1e5_tasep");
    g.sample_size(10);
    g.throughput(Throughput::Elements((n as f64 * t) as u64));
    let mut i = 0;
    g.bench_function("attempted_moves", |b| {
        b.iter(|| {
            i += 1;
            black_box(process.sample(1, i, &plan).attempts)
        })
    });
    let asep = FiniteProcess::new(process.system().clone(), Rates::new(1.0, 0.5).unwrap());
    let mut j = 0;
    // p, q > 0: one extra direction word per attempt; t scaled so the attempts stay 1e7.
    let plan2 = asep.plan(&[t / 1.5], vec![]).unwrap();
    g.bench_function("attempted_moves_asep", |b| {
        b.iter(|| {
            j += 1;
            black_box(asep.sample(1, j, &plan2).attempts)
        })
    });
    g.finish();
}

fn line_step(c: &mut Criterion) {
    let process = LineProcess::new(LineData::step(1), Rates::new(1.0, 0.5).unwrap());
    let plan = process.plan(&[1000.0], vec![]).unwrap();
    let attempts = process.sample(1, 0, &plan).attempts;
    println!("line ASEP(1, 0.5) step, t = 1000: {attempts} attempts in sample 0");
    let mut g = c.benchmark_group("line_step_asep_t1000");
    g.sample_size(10);
    g.throughput(Throughput::Elements(attempts));
    let mut i = 0;
    g.bench_function("one_sample", |b| {
        b.iter(|| {
            i += 1;
            black_box(process.sample(1, i, &plan).attempts)
        })
    });
    g.finish();
}

fn exact_packed7(c: &mut Criterion) {
    let process = FiniteProcess::new(
        FiniteSystem::packed(FiniteLattice::Segment, 7).unwrap(),
        Rates::new(1.0, 0.3).unwrap(),
    );
    let mut g = c.benchmark_group("exact_packed7");
    g.sample_size(10);
    g.bench_function("solve_t1", |b| {
        b.iter(|| {
            let law = ExactSolver::new(&process)
                .unwrap()
                .law_at(1.0, DEFAULT_TAIL)
                .unwrap();
            black_box(law.entries().len())
        })
    });
    g.bench_function("solve_t20", |b| {
        b.iter(|| {
            let law = ExactSolver::new(&process)
                .unwrap()
                .law_at(20.0, DEFAULT_TAIL)
                .unwrap();
            black_box(law.entries().len())
        })
    });
    g.finish();
}

criterion_group!(
    name = benches;
    config = Criterion::default()
        .warm_up_time(std::time::Duration::from_millis(500))
        .measurement_time(std::time::Duration::from_secs(3));
    targets = ring_tasep, ring_limit, line_step, exact_packed7
);
criterion_main!(benches);
