//! Statistics for comparing laws of random sets and scalars: chi-square and G tests with pooling,
//! per-element inclusion tests with Holm–Bonferroni, total variation estimates with confidence
//! bounds, Kolmogorov–Smirnov tests (exact and asymptotic), permutation tests, Wilson and
//! Clopper–Pearson intervals, the exact binomial test, and power / sample-size formulas. No I/O and no
//! dependency on any simulator: callers feed counts through mergeable accumulators.
//!
//! # Examples
//! ```
//! use motley_stats::{
//!     chi_square_homogeneity, detectable_total_variation, total_variation, CategoricalCounts,
//!     ChiSquareOptions,
//! };
//! // Two samples of random subsets of {0, 1, 2} encoded as bit sets.
//! let mut a = CategoricalCounts::new();
//! let mut b = CategoricalCounts::new();
//! for i in 0..800u64 {
//!     a.add(i % 8);
//!     b.add((i * 5 + 3) % 8);
//! }
//! let test = chi_square_homogeneity(&a, &b, &ChiSquareOptions::default()).unwrap();
//! assert_eq!(test.dof, 7);
//! assert!(test.p_value > 0.99);
//! let tv = total_variation(&a, &b, 0.05).unwrap();
//! assert!(tv.estimate < 1e-12 && tv.upper_bound < 0.07);
//! let seen = detectable_total_variation(800, 800, test.tested_cells, 0.05, 0.9).unwrap();
//! assert!(seen.unwrap() > 0.05);
//! ```
//!
//! # Errors
//! Every fallible function returns [`StatsError`]; parameters are checked on entry (or in
//! constructors such as [`ExactLaw::new`]), so the computations themselves cannot fail.
//!
//! # Precision
//! p-values come from survival functions (never `1 − cdf`), so they keep relative precision far into
//! the tails. Reference values from published tables and scipy 1.17.1 are checked in the tests of
//! each module; each module documents its formula and accuracy.
//!
//! # Reproducibility
//! Counts live in `hashbrown` maps whose hasher is seeded per process, but every floating-point
//! reduction walks the cells in sorted key order, and all accumulators merge exactly. Splitting data
//! into shards and merging in any order gives bit-identical statistics. The only random procedure,
//! the permutation test, uses ChaCha8 from a caller-supplied seed.

#![deny(missing_docs)]

mod binomial_dist;
mod binomial_test;
mod categorical_counts;
mod chi_square;
mod chi_square_dist;
mod equivalence;
mod error;
mod exact_law;
mod inclusion;
mod kolmogorov;
mod ks_one_sample;
mod ks_two_sample;
mod multiple_testing;
mod permutation;
mod pooling;
mod power;
mod proportion_interval;
mod scalar_sample;
mod spending;
mod total_variation;
mod two_proportion;

pub use binomial_dist::{binomial_lower_tail, binomial_pmf, binomial_upper_tail};
pub use binomial_test::{binomial_test, BinomialTestResult};
pub use categorical_counts::CategoricalCounts;
pub use chi_square::{
    chi_square_goodness_of_fit, chi_square_homogeneity, ChiSquareMethod, ChiSquareOptions,
    ChiSquareResult,
};
pub use chi_square_dist::{
    chi_square_cdf, chi_square_quantile, chi_square_sf, chi_square_upper_quantile,
    noncentral_chi_square_sf, normal_sf, normal_upper_quantile,
};
pub use equivalence::{samples_to_confirm, ToleranceMeasure};
pub use error::StatsError;
pub use exact_law::{ExactLaw, LAW_MASS_TOLERANCE};
pub use inclusion::{compare_inclusion, ElementComparison, InclusionComparison, InclusionCounts};
pub use kolmogorov::{kolmogorov_cdf, kolmogorov_quantile, kolmogorov_sf};
pub use ks_one_sample::{ks_one_sample, ks_one_sample_sf, smirnov_sf, EXACT_ONE_SAMPLE_MAX_N};
pub use ks_two_sample::{
    ks_two_sample, ks_two_sample_counts, KsMethod, KsPValueMethod, KsResult,
    EXACT_TWO_SAMPLE_MAX_PRODUCT,
};
pub use multiple_testing::{benjamini_hochberg, holm_bonferroni, simes};
pub use permutation::{ks_permutation_test, ks_permutation_test_counts, PermutationResult};
pub use power::{
    chi_square_noncentrality_for_power, detectable_probability_gap, detectable_total_variation,
    sample_size_for_probability_gap, sample_size_for_total_variation, two_proportion_power,
};
pub use proportion_interval::{clopper_pearson_interval, wilson_interval, Interval};
pub use scalar_sample::ScalarSample;
pub use spending::look_levels;
pub use total_variation::{total_variation, total_variation_to_law, tv_bound_margin, TvEstimate};
pub use two_proportion::{
    fisher_exact_p_value, two_proportion_p_value, ProportionTest, Z_TEST_MIN_EXPECTED,
};
