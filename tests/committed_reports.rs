//! The committed reports under `reports/` are what the current code produces: rerunning each one's
//! own `scenario.yaml` with its recorded sample count gives the same `result.json` (timing fields and
//! the build's commit aside). `scripts/regenerate-reports.sh` rewrites them.

use crate::common::*;

#[test]
#[ignore = "slow tier: scripts/test-slow.sh"]
fn regenerating_the_reports_gives_the_same_results() {
    let d = tempfile::tempdir().unwrap();
    let mut n = 0;
    let mut dirs: Vec<_> = std::fs::read_dir(root().join("reports"))
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.join("result.json").is_file())
        .collect();
    dirs.sort();
    for dir in dirs {
        let committed = comparable(&dir);
        let samples = committed["scenario"]["samples"]
            .as_u64()
            .unwrap()
            .to_string();
        let name = dir.file_name().unwrap().to_str().unwrap().to_string();
        let out = d.path().join(&name);
        let f = dir.join("scenario.yaml");
        run_ok(&[
            "run",
            f.to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
            "--samples",
            &samples,
            "--quiet",
        ]);
        assert_same(&committed, &comparable(&out), &format!("reports/{name}"));
        n += 1;
    }
    assert!(n >= 6, "expected the six worked reports, found {n}");
}
