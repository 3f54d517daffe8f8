//! Every result motley writes validates against `docs/result.schema.json`; so do the committed
//! reports. A deliberately broken result does not.

#[path = "common/schema.rs"]
mod schema;

use crate::common::*;

fn schema() -> serde_json::Value {
    serde_json::from_str(&std::fs::read_to_string(root().join("docs/result.schema.json")).unwrap())
        .unwrap()
}

fn result(dir: &std::path::Path) -> serde_json::Value {
    serde_json::from_str(&std::fs::read_to_string(dir.join("result.json")).unwrap()).unwrap()
}

#[test]
fn fresh_results_of_every_worked_scenario_validate() {
    let s = schema();
    let d = tempfile::tempdir().unwrap();
    for (name, samples) in [
        ("rainbow-symmetry", "3000"),
        ("rainbow-near-miss", "3000"),
        ("second-class-tasep", "300"),
        ("packed-inverse", "3000"),
        ("second-third-swap", "300"),
        ("step-height", "50"),
    ] {
        let out = d.path().join(name);
        let f = scenario(name);
        run_ok(&[
            "run",
            f.to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
            "--samples",
            samples,
            "--quiet",
        ]);
        let errors = schema::validate(&s, &result(&out));
        assert!(errors.is_empty(), "{name}: {errors:#?}");
    }
}

#[test]
fn committed_reports_validate() {
    let s = schema();
    let mut n = 0;
    for e in std::fs::read_dir(root().join("reports")).unwrap() {
        let dir = e.unwrap().path();
        if dir.join("result.json").is_file() {
            let errors = schema::validate(&s, &result(&dir));
            assert!(errors.is_empty(), "{}: {errors:#?}", dir.display());
            n += 1;
        }
    }
    assert!(n >= 6, "expected the six worked reports, found {n}");
}

#[test]
fn a_broken_result_does_not_validate() {
    let s = schema();
    let d = tempfile::tempdir().unwrap();
    let out = d.path().join("r");
    let f = scenario("rainbow-symmetry");
    run_ok(&[
        "run",
        f.to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
        "--samples",
        "500",
        "--quiet",
    ]);
    let mut v = result(&out);
    v["claims"][0]["rejected"] = serde_json::json!("no");
    v["scenario"]["extra"] = serde_json::json!(1);
    let errors = schema::validate(&s, &v);
    assert_eq!(errors.len(), 2, "{errors:#?}");
}
