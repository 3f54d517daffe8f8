//! The `series` and `joint` claims of the worked scenarios carry the theory beside the estimates:
//! the profile's values are the limit shape's, the approach to the limits goes the right way, and
//! the joint law's reference cells are the speed-process law's.

use crate::common::*;
use motley_reference::{SixVertexStep, SpeedProcessPair};
use serde_json::Value;

fn run_scenario(name: &str, samples: &str) -> Value {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join(name);
    let path = scenario(name);
    run_ok(&[
        "run",
        path.to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
        "--quiet",
        "--samples",
        samples,
    ]);
    comparable(&out)
}

fn claim<'a>(v: &'a Value, id: &str) -> &'a Value {
    v["claims"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["id"] == id)
        .unwrap_or_else(|| panic!("claim {id} missing"))
}

fn f(v: &Value) -> f64 {
    v.as_f64().unwrap()
}

/// The six-vertex profile: predicted values are L·h(x/L, 1) of Borodin, Corwin and Gorin (2016)
/// at L = 300; the flat region is exact (every column left of the curved region is crossed by
/// all paths above it); in the curved region the means sit above the limit by less than 3% of L
/// (measured 4.1–4.7 at L = 300, i.e. ≤ 1.6%, the KPZ excess of about 1.77 σ L^(1/3)).
#[test]
fn six_vertex_profile_is_the_limit_shape() {
    let v = run_scenario("step-height", "300");
    let c = claim(&v, "along-the-top");
    assert_eq!(c["kind"], "series");
    assert_eq!(c["rejected"], false);
    let shape = SixVertexStep::from_weights(0.3, 0.6).unwrap();
    let points = c["estimates"]["series"].as_array().unwrap();
    assert_eq!(points.len(), 13);
    for p in points {
        let x = f(&p["at"]);
        let predicted = f(&p["predicted"]);
        assert!(
            (predicted - shape.height(x, 300.0)).abs() < 1e-12,
            "x = {x}"
        );
        let excess = f(&p["estimate"]) - predicted;
        if x <= 120.0 {
            assert_eq!(excess, 0.0, "flat region at x = {x}");
        } else {
            assert!(
                excess > -f(&p["estimate"]).abs() * 1e-12 && excess < 9.0,
                "x = {x}: {excess}"
            );
        }
    }
}

/// The speed-process scenario: swaps are final in TASEP, so the swapped fractions along t are
/// nondecreasing on the same paths (pathwise, no noise) and stay below 2/3 plus their interval;
/// the joint law's regions split all samples (the particles never share a site), and the
/// reference cells are the speed-process law's masses (total 1, diagonal cells carrying 1/6 plus
/// their share of the density).
#[test]
fn speed_process_pair_shows_the_approach() {
    let v = run_scenario("speed-process-pair", "2000");
    let s = claim(&v, "swap-over-time");
    let points = s["estimates"]["series"].as_array().unwrap();
    let p: Vec<f64> = points.iter().map(|x| f(&x["estimate"])).collect();
    assert!(p.windows(2).all(|w| w[0] <= w[1]), "{p:?}");
    for x in points {
        assert!(f(&x["lower"]) < SpeedProcessPair::P_SWAPPED_OR_TIED, "{x}");
        assert!((f(&x["predicted"]) - 0.6667).abs() < 1e-12);
    }
    // Still in the initial order at t = 1 − swapped by t (a swap is final), so the `<` share of the
    // joint laws at t = 25, 100, 400 falls along t, pathwise, towards the limit 1/3.
    let in_order: Vec<f64> = ["joint-at-25", "joint-at-100", "joint-at-400"]
        .iter()
        .map(|id| f(&claim(&v, id)["estimates"]["joint"]["regions"][0]["estimate"]["estimate"]))
        .collect();
    for (k, q) in in_order.iter().enumerate() {
        assert!((q + p[k] - 1.0).abs() < 1e-12, "{in_order:?} vs {p:?}");
    }
    let j = &claim(&v, "joint-at-400")["estimates"]["joint"];
    let regions = j["regions"].as_array().unwrap();
    let share = |k: usize| f(&regions[k]["estimate"]["estimate"]);
    assert!((share(0) + share(1) - 1.0).abs() < 1e-12);
    assert_eq!(share(2), 0.0);
    // The swapped share at t = 400 is the series' last point (same paths, same event).
    assert!((share(1) - p[2]).abs() < 1e-12);
    let bins = j["bins"].as_u64().unwrap() as usize;
    let reference: Vec<f64> = j["reference_cells"]
        .as_array()
        .unwrap()
        .iter()
        .map(f)
        .collect();
    assert_eq!(reference.len(), bins * bins);
    assert!((reference.iter().sum::<f64>() - 1.0).abs() < 1e-12);
    let diagonal: f64 = (0..bins).map(|i| reference[i * bins + i]).sum();
    assert!(diagonal > SpeedProcessPair::P_TIED);
    // The grid covers every sample (and [−1, 1]², where the limit lives).
    let measured: f64 = j["cells"].as_array().unwrap().iter().map(f).sum();
    assert!((measured - 1.0).abs() < 1e-9, "{measured}");
    for r in ["x_range", "y_range"] {
        assert!(f(&j[r][0]) <= -1.0 && f(&j[r][1]) >= 1.0);
    }
}

/// The committed Tracy–Widom report (its regeneration is checked by `committed_reports.rs`):
/// the Kolmogorov distance to F₂ shrinks from t = 250 to 4000 and the mean stays above F₂'s
/// (−1.7710868074, Bornemann 2010, from memory) at every time.
#[test]
fn tracy_widom_report_shows_the_approach() {
    let text =
        std::fs::read_to_string(root().join("reports/tasep-tracy-widom/result.json")).unwrap();
    let v: Value = serde_json::from_str(&text).unwrap();
    let c = claim(&v, "approach");
    let points = c["estimates"]["series"].as_array().unwrap();
    let d: Vec<f64> = points.iter().map(|p| f(&p["distance"])).collect();
    assert!(d[0] > d[1] && d[1] > d[2], "{d:?}");
    for p in points {
        assert!((f(&p["predicted"]) + 1.771_086_807_4).abs() < 1e-6);
        assert!(f(&p["estimate"]) > f(&p["predicted"]), "{p}");
    }
}
