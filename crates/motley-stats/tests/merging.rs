//! Merging: splitting the same data into 1, 2 and 7 parts, accumulating each part separately and
//! merging (in different orders) gives bit-identical statistics for every test in the crate.
//! Results are compared through their `Debug` text, which spells every `f64` exactly (shortest
//! round-trip form), so equal text means equal bits.

use crate::common::{exponential, rng, uniform};
use motley_stats::{
    chi_square_goodness_of_fit, chi_square_homogeneity, compare_inclusion, ks_one_sample,
    ks_permutation_test, ks_permutation_test_counts, ks_two_sample, ks_two_sample_counts,
    total_variation, total_variation_to_law, CategoricalCounts, ChiSquareMethod, ChiSquareOptions,
    ExactLaw, InclusionCounts, KsMethod, ScalarSample,
};

/// One observation: a random set (sorted element list) and a real value.
type Obs = (Vec<u32>, f64);

fn data(seed: u64, n: usize, q: &[f64]) -> Vec<Obs> {
    let mut r = rng(seed, 0);
    (0..n)
        .map(|_| {
            let set: Vec<u32> = (0..q.len() as u32)
                .filter(|&e| uniform(&mut r) < q[e as usize])
                .collect();
            (set, exponential(&mut r))
        })
        .collect()
}

#[derive(Clone, Default)]
struct Acc {
    sets: CategoricalCounts<Vec<u32>>,
    sizes: CategoricalCounts<i64>,
    incl: InclusionCounts,
    values: ScalarSample,
}

impl Acc {
    fn add(&mut self, o: &Obs) {
        self.sets.add(o.0.clone());
        self.sizes.add(o.0.len() as i64);
        self.incl.add(o.0.iter().map(|&e| e as usize)).unwrap();
        self.values.add(o.1).unwrap();
    }
    fn merge(&mut self, o: &Acc) {
        self.sets.merge(&o.sets);
        self.sizes.merge(&o.sizes);
        self.incl.merge(&o.incl);
        self.values.merge(&o.values);
    }
}

/// Accumulates `obs` in `parts` uneven contiguous chunks and merges them back in a shuffled order.
fn split_merge(obs: &[Obs], parts: usize) -> Acc {
    let n = obs.len();
    // Uneven cut points: chunk k has weight k + 1.
    let total: usize = (1..=parts).sum();
    let mut cuts = vec![0usize];
    let mut acc = 0;
    for k in 1..=parts {
        acc += k;
        cuts.push(n * acc / total);
    }
    let chunks: Vec<Acc> = cuts
        .windows(2)
        .map(|w| {
            let mut a = Acc::default();
            for o in &obs[w[0]..w[1]] {
                a.add(o);
            }
            a
        })
        .collect();
    // Merge order: odd chunks first (descending), then even ones.
    let mut order: Vec<usize> = (0..parts).rev().filter(|i| i % 2 == 1).collect();
    order.extend((0..parts).filter(|i| i % 2 == 0));
    let mut out = chunks[order[0]].clone();
    for &i in &order[1..] {
        out.merge(&chunks[i]);
    }
    out
}

fn fingerprint(a: &Acc, b: &Acc, law: &ExactLaw<Vec<u32>>) -> String {
    let pearson = ChiSquareOptions::default();
    let g = ChiSquareOptions {
        method: ChiSquareMethod::GTest,
        ..Default::default()
    };
    format!(
        "{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}\n{:?}",
        chi_square_homogeneity(&a.sets, &b.sets, &pearson).unwrap(),
        chi_square_homogeneity(&a.sets, &b.sets, &g).unwrap(),
        chi_square_goodness_of_fit(&a.sets, law, &pearson).unwrap(),
        total_variation(&a.sets, &b.sets, 0.05).unwrap(),
        total_variation_to_law(&a.sets, law, 0.05).unwrap(),
        compare_inclusion(&a.incl, &b.incl).unwrap(),
        ks_two_sample(&a.values, &b.values, KsMethod::Auto).unwrap(),
        ks_two_sample(&a.values, &b.values, KsMethod::Asymptotic).unwrap(),
        ks_two_sample_counts(&a.sizes, &b.sizes, KsMethod::Auto).unwrap(),
        ks_permutation_test_counts(&a.sizes, &b.sizes, 199, 5).unwrap(),
        ks_permutation_test(&a.values, &b.values, 49, 6).unwrap(),
        ks_one_sample(&a.values, |x: f64| 1.0 - (-x).exp(), KsMethod::Auto).unwrap(),
    )
}

fn product_law(q: &[f64]) -> ExactLaw<Vec<u32>> {
    let k = q.len();
    let cells = (0..1usize << k)
        .map(|s| {
            let set: Vec<u32> = (0..k as u32).filter(|&e| s >> e & 1 == 1).collect();
            let p = (0..k)
                .map(|i| if s >> i & 1 == 1 { q[i] } else { 1.0 - q[i] })
                .product();
            (set, p)
        })
        .collect();
    ExactLaw::new(cells).unwrap()
}

#[test]
fn one_two_and_seven_parts_give_bit_identical_statistics() {
    let q = [0.1, 0.25, 0.4, 0.5, 0.6, 0.75, 0.9, 0.05];
    let qb = [0.1, 0.25, 0.42, 0.5, 0.6, 0.75, 0.9, 0.05];
    let da = data(301, 3000, &q);
    let db = data(302, 2500, &qb);
    let law = product_law(&q);
    let reference = fingerprint(&split_merge(&da, 1), &split_merge(&db, 1), &law);
    for parts in [2usize, 7] {
        let fp = fingerprint(&split_merge(&da, parts), &split_merge(&db, parts), &law);
        assert_eq!(fp, reference, "{parts} parts differ");
    }
    // Mixed: a in 7 parts, b in 2, and a accumulated in reverse order.
    let mut rev = Acc::default();
    for o in da.iter().rev() {
        rev.add(o);
    }
    assert_eq!(fingerprint(&rev, &split_merge(&db, 2), &law), reference);
    // Near miss: dropping one observation must change the statistics.
    let fewer = fingerprint(&split_merge(&da[1..], 7), &split_merge(&db, 2), &law);
    assert_ne!(fewer, reference);
}
