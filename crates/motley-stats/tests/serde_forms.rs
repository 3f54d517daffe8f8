//! Serialised forms the CLI writes into result files: counts sorted by key, laws validated on the
//! way back in, results round-tripping exactly.

use motley_stats::{
    chi_square_homogeneity, CategoricalCounts, ChiSquareOptions, ChiSquareResult, ExactLaw,
    InclusionCounts, ScalarSample,
};

#[test]
fn counts_serialise_sorted_and_round_trip() {
    let mut c = CategoricalCounts::new();
    for k in [9u64, 3, 3, 7, 1, 9, 9] {
        c.add(k);
    }
    let text = serde_json::to_string(&c).unwrap();
    assert_eq!(text, r#"{"total":7,"cells":[[1,1],[3,2],[7,1],[9,3]]}"#);
    let back: CategoricalCounts<u64> = serde_json::from_str(&text).unwrap();
    assert_eq!(back, c);

    let mut inc = InclusionCounts::new();
    inc.add([2usize, 0]).unwrap();
    let back: InclusionCounts =
        serde_json::from_str(&serde_json::to_string(&inc).unwrap()).unwrap();
    assert_eq!(back, inc);

    let s = ScalarSample::from_values(vec![3.5, -1.0, 2.25]).unwrap();
    assert_eq!(
        serde_json::to_string(&s).unwrap(),
        r#"{"values":[-1.0,2.25,3.5]}"#
    );
}

#[test]
fn laws_are_validated_when_read() {
    let law = ExactLaw::new(vec![(2u64, 0.75), (1, 0.25)]).unwrap();
    let text = serde_json::to_string(&law).unwrap();
    assert_eq!(text, "[[1,0.25],[2,0.75]]");
    let back: ExactLaw<u64> = serde_json::from_str(&text).unwrap();
    assert_eq!(back, law);
    let bad = serde_json::from_str::<ExactLaw<u64>>("[[1,0.25],[2,0.5]]");
    let msg = bad.unwrap_err().to_string();
    assert!(msg.contains("must sum to 1"), "{msg}");
}

#[test]
fn results_round_trip_exactly() {
    let mut a = CategoricalCounts::new();
    let mut b = CategoricalCounts::new();
    for i in 0..90u64 {
        a.add(i % 4);
        b.add(i % 3);
    }
    let r = chi_square_homogeneity(&a, &b, &ChiSquareOptions::default()).unwrap();
    let back: ChiSquareResult = serde_json::from_str(&serde_json::to_string(&r).unwrap()).unwrap();
    assert_eq!(back.statistic.to_bits(), r.statistic.to_bits());
    assert_eq!(back.p_value.to_bits(), r.p_value.to_bits());
    assert_eq!(back, r);
}
