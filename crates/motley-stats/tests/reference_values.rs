//! Two-sample KS p-values against a reference library, and distribution tables at the crate level.

use motley_stats::{
    chi_square_quantile, chi_square_sf, kolmogorov_cdf, ks_two_sample, ks_two_sample_counts,
    CategoricalCounts, KsMethod, KsPValueMethod, ScalarSample,
};

fn sample(v: &[f64]) -> ScalarSample {
    ScalarSample::from_values(v.to_vec()).unwrap()
}

#[test]
fn exact_two_sample_ks_matches_scipy() {
    // scipy 1.17.1, scipy.stats.ks_2samp(x, y, method='exact') on data drawn once with
    // numpy.random.default_rng(7) and rounded to 4 decimals:
    // statistic 0.36359000509943906, pvalue 0.004222091219605954.
    let x = [
        0.0012, 0.2987, -0.2741, -0.8906, -0.4547, -0.9916, 0.0601, 1.3402, -0.4922, -0.6205,
        0.4898, 0.3569, 0.1054, -0.9305, -0.0293, 0.6953, -1.3442, -0.4576, -1.9012, -1.2895,
        -1.8417, -0.2351, -1.2674, 0.2713, 0.1568, -0.1869, -2.5168, -0.5387, -0.0485, 0.1133,
        -1.5301, -0.4778, -0.9785, -0.8088, 1.0609, -0.8075, -0.0325,
    ];
    let y = [
        1.3613, -0.4003, 0.166, 0.4326, 0.3765, -1.1701, 0.3914, 1.9306, -1.5566, 1.3313, 0.4432,
        -0.4698, 2.7005, 1.2147, -1.1391, 0.3894, 0.992, 0.0735, 1.1195, 0.2202, 1.1007, 2.0262,
        -0.5108, 0.5438, -0.256, 0.4527, -1.1246, -0.3952, 0.0646, 1.3785, 1.6743, -1.2882,
        -0.6536, 1.0763, -2.0909, -0.2558, 0.1833, 1.8084, 1.1273, -0.0927, -0.1423, -0.0002,
        2.1282, -0.2136, -0.0644, 0.7231, 0.1551, 0.0633, -1.0369, 0.2862, -0.2323, 1.6994, 1.0837,
    ];
    let r = ks_two_sample(&sample(&x), &sample(&y), KsMethod::Auto).unwrap();
    assert_eq!(r.method, KsPValueMethod::Exact);
    assert!(!r.ties);
    assert!((r.statistic - 0.36359000509943906).abs() < 1e-15);
    assert!(
        (r.p_value / 0.004222091219605954 - 1.0).abs() < 1e-10,
        "{}",
        r.p_value
    );
    // Symmetric in the two samples.
    let s = ks_two_sample(&sample(&y), &sample(&x), KsMethod::Auto).unwrap();
    assert_eq!(s.p_value.to_bits(), r.p_value.to_bits());
}

#[test]
fn exact_two_sample_ks_far_tail_and_ties_match_scipy() {
    // scipy 1.17.1, ks_2samp(range(100), [i + 51 for i in range(100)], method='exact'):
    // statistic 0.51, pvalue 3.319419024623016e-12.
    let a: Vec<f64> = (0..100).map(|i| i as f64).collect();
    let b: Vec<f64> = (0..100).map(|i| (i + 51) as f64).collect();
    let r = ks_two_sample(&sample(&a), &sample(&b), KsMethod::Exact).unwrap();
    assert!((r.statistic - 0.51).abs() < 1e-15);
    assert!(
        (r.p_value / 3.319419024623016e-12 - 1.0).abs() < 1e-9,
        "{}",
        r.p_value
    );
    // Asymptotic approximation is in the same range but visibly different.
    let asy = ks_two_sample(&sample(&a), &sample(&b), KsMethod::Asymptotic).unwrap();
    assert_eq!(asy.method, KsPValueMethod::Asymptotic);
    assert!(asy.p_value != r.p_value && asy.p_value < 1e-9);

    // scipy 1.17.1, ks_2samp([1,2,2,3,3,3,4], [2,3,4,4,5,5,6,6], method='exact'):
    // statistic 0.6071428571428571, pvalue 0.08702408702408701 (continuous-null p-value for tied data).
    let mut ca = CategoricalCounts::new();
    let mut cb = CategoricalCounts::new();
    for x in [1i64, 2, 2, 3, 3, 3, 4] {
        ca.add(x);
    }
    for x in [2i64, 3, 4, 4, 5, 5, 6, 6] {
        cb.add(x);
    }
    let r = ks_two_sample_counts(&ca, &cb, KsMethod::Auto).unwrap();
    assert!((r.statistic - 0.6071428571428571).abs() < 1e-15);
    assert!(
        (r.p_value - 0.08702408702408701).abs() < 1e-13,
        "{}",
        r.p_value
    );
    assert!(r.ties && r.conservative);

    // Kolmogorov distribution, common table: P(K <= 1.358) ≈ 0.95.
    assert!((kolmogorov_cdf(1.358) - 0.95).abs() < 5e-4);
}

#[test]
fn chi_square_table_at_crate_level() {
    // NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.4: upper 0.05 critical value for
    // 10 degrees of freedom is 18.307 (quoted in issue 4).
    assert!((chi_square_quantile(0.95, 10.0) - 18.307).abs() < 5e-4);
    assert!((chi_square_sf(18.307, 10.0) - 0.05).abs() < 1e-5);
}
