//! The report folder as a whole: its files, atomic appearance, refusal to overwrite, safe replacement,
//! and recovery from a killed run.

use crate::common;

use std::fs;
use std::path::Path;
use std::process::Command;
use std::time::Duration;

use motley_report::{write_report, ReportError, ReportExtras};
use motley_scenario::result::RunResult;

const SCENARIO: &str = "name: demo-rainbow\nseed: 20240611\n";

fn extras() -> ReportExtras {
    ReportExtras::new(
        SCENARIO,
        vec!["motley".into(), "run".into(), "demo.yaml".into()],
    )
}

/// Hidden entries (staging or moved-aside folders) left in `parent`.
fn hidden(parent: &Path) -> Vec<String> {
    fs::read_dir(parent)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n.starts_with('.'))
        .collect()
}

/// Whether `dir` holds a complete report of `expected`.
fn assert_complete(dir: &Path, expected: &RunResult) {
    // Compared as text: serde_json without its `float_roundtrip` feature may parse an f64 one unit in
    // the last place off, so a parse-and-compare would fail on a correct file.
    let json = fs::read_to_string(dir.join("result.json")).unwrap();
    assert!(
        json == serde_json::to_string_pretty(expected).unwrap() + "\n",
        "result.json differs"
    );
    let parsed: RunResult = serde_json::from_str(&json).unwrap();
    assert_eq!(parsed.claims.len(), expected.claims.len());
    let md = fs::read_to_string(dir.join("summary.md")).unwrap();
    assert!(
        md.ends_with("only the claims above are tested.\n"),
        "summary.md is truncated"
    );
    assert_eq!(
        fs::read_to_string(dir.join("scenario.yaml")).unwrap(),
        SCENARIO
    );
}

#[test]
fn report_has_result_json_summary_and_scenario() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("reports").join("demo");
    let r = common::full();
    let out = write_report(&dir, &r, &extras(), false).unwrap();
    assert_eq!(out, dir);
    assert_complete(&dir, &r);
    // result.json is exactly the pretty serialization plus a newline.
    let json = fs::read_to_string(dir.join("result.json")).unwrap();
    assert_eq!(json, serde_json::to_string_pretty(&r).unwrap() + "\n");
    // The documented keys scripts rely on.
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert_eq!(v["claims"][1]["id"], "near miss");
    assert_eq!(v["claims"][1]["rejected"], true);
    assert_eq!(
        v["claims"][0]["tests"][0]["name"],
        "chi-square on the joint law"
    );
    assert_eq!(v["claims"][2]["exact"]["discrepancy"], 0.0);
    assert!(hidden(dir.parent().unwrap()).is_empty());
}

#[test]
fn existing_report_is_refused_without_overwrite() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("demo");
    let first = common::full();
    write_report(&dir, &first, &extras(), false).unwrap();
    let mut second = common::full();
    second.scenario.seed = 1;
    let err = write_report(&dir, &second, &extras(), false).unwrap_err();
    assert!(matches!(err, ReportError::Exists { .. }));
    assert_eq!(
        err.to_string(),
        format!(
            "report folder {} exists; pass --overwrite to replace it",
            dir.display()
        )
    );
    // The first report is untouched and no staging folder is left.
    assert_complete(&dir, &first);
    assert!(hidden(tmp.path()).is_empty());
}

#[test]
fn overwrite_replaces_the_whole_folder() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("demo");
    write_report(&dir, &common::full(), &extras(), false).unwrap();
    let second = common::run(vec![common::describe("only")]);
    write_report(&dir, &second, &extras(), true).unwrap();
    assert_complete(&dir, &second);
    // Nothing of the old report survives, and the moved-aside copy is gone.
    assert!(!dir.join("figures").exists());
    assert!(hidden(tmp.path()).is_empty(), "{:?}", hidden(tmp.path()));
    // A file motley did not write keeps the folder from being replaced (issue 17).
    fs::write(dir.join("notes-from-old-run.txt"), "old").unwrap();
    let err = write_report(&dir, &common::full(), &extras(), true).unwrap_err();
    assert!(matches!(err, ReportError::NotAReport { .. }), "{err}");
    assert_eq!(
        fs::read_to_string(dir.join("notes-from-old-run.txt")).unwrap(),
        "old"
    );
    assert_complete(&dir, &second);
    // So does a `result.json` alone: it is not proof that motley wrote the folder.
    let fake = tmp.path().join("fake");
    fs::create_dir(&fake).unwrap();
    fs::write(fake.join("result.json"), "{}").unwrap();
    fs::write(fake.join("data.csv"), "1,2").unwrap();
    let err = write_report(&fake, &common::full(), &extras(), true).unwrap_err();
    assert!(err.to_string().contains("motley did not write it"), "{err}");
    assert!(fake.join("data.csv").is_file());
}

#[test]
fn overwrite_never_deletes_a_folder_that_is_not_a_report() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("thesis");
    fs::create_dir(&dir).unwrap();
    fs::write(dir.join("chapter1.tex"), "precious").unwrap();
    let err = write_report(&dir, &common::full(), &extras(), true).unwrap_err();
    assert!(matches!(err, ReportError::NotAReport { .. }), "{err}");
    assert_eq!(
        fs::read_to_string(dir.join("chapter1.tex")).unwrap(),
        "precious"
    );
    assert!(hidden(tmp.path()).is_empty());
    // A plain file under the name is not replaced either.
    let file = tmp.path().join("plain");
    fs::write(&file, "x").unwrap();
    assert!(matches!(
        write_report(&file, &common::full(), &extras(), true),
        Err(ReportError::NotAReport { .. })
    ));
    // An empty folder may be filled.
    let empty = tmp.path().join("empty");
    fs::create_dir(&empty).unwrap();
    write_report(&empty, &common::full(), &extras(), true).unwrap();
    assert_complete(&empty, &common::full());
}

#[test]
fn leftovers_of_a_killed_run_do_not_break_the_next() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("demo");
    // A dead process's staging folder (pid above Linux's maximum 2^22, so never alive), and folders
    // with this process's own pid, as if an earlier process had had it.
    let dead = tmp.path().join(".demo.partial-4194304-0");
    fs::create_dir(&dead).unwrap();
    fs::write(dead.join("summary.md"), "half").unwrap();
    let me = std::process::id();
    for n in 0..20 {
        let d = tmp.path().join(format!(".demo.partial-{me}-{n}"));
        fs::create_dir(&d).unwrap();
        fs::write(d.join("result.json"), "{").unwrap();
    }
    write_report(&dir, &common::full(), &extras(), false).unwrap();
    assert_complete(&dir, &common::full());
    if Path::new("/proc/self").exists() {
        assert!(!dead.exists(), "the dead process's staging folder is swept");
    }
}

#[test]
fn invalid_picture_fails_before_anything_is_written() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("demo");
    let mut pic = common::picture();
    pic.up_out[0] = 0; // vertex (0, 0) loses color 2
    let ex = extras().with_picture(pic, "broken");
    let err = write_report(&dir, &common::full(), &ex, false).unwrap_err();
    assert!(err.to_string().contains("vertex (0, 0)"), "{err}");
    assert!(!dir.exists());
    assert!(fs::read_dir(tmp.path()).unwrap().next().is_none());
}

/// Environment variable telling [`child_writes_reports_forever`] where to write.
const CHILD_DIR: &str = "MOTLEY_REPORT_KILL_TEST_DIR";

/// A big result, so that one report takes long enough to be killed part-way.
fn big() -> RunResult {
    let claims = (0..40)
        .map(|i| common::same_law(&format!("claim-{i}"), i % 2 == 0, 0.01))
        .collect();
    common::run(claims)
}

#[test]
#[ignore = "helper: run as a child process by kill_midway_leaves_no_half_written_report"]
fn child_writes_reports_forever() {
    let Ok(dir) = std::env::var(CHILD_DIR) else {
        panic!("{CHILD_DIR} not set: this helper only runs as a child process");
    };
    let r = big();
    loop {
        write_report(Path::new(&dir), &r, &extras(), true).unwrap();
    }
}

#[test]
fn kill_midway_leaves_no_half_written_report() {
    let tmp = tempfile::tempdir().unwrap();
    let dir = tmp.path().join("demo");
    let exe = std::env::current_exe().unwrap();
    // Kill after several delays spread over a few report writes (one write is timed here only to spread
    // them), so the kill lands at different stages. Whatever the stage, the final name holds a complete
    // report or nothing: the assertion does not depend on timing.
    let probe = tmp.path().join("probe");
    let start = std::time::Instant::now();
    write_report(&probe, &big(), &extras(), false).unwrap();
    let one = start.elapsed().as_millis() as u64;
    fs::remove_dir_all(&probe).unwrap();
    for delay_ms in [0.2, 0.7, 1.3, 2.1, 3.4, 5.5].map(|f| 30 + (f * one as f64) as u64) {
        let mut child = Command::new(&exe)
            .args([
                "--exact",
                "report_folder::child_writes_reports_forever",
                "--ignored",
                "--nocapture",
                "--test-threads=1",
            ])
            .env(CHILD_DIR, &dir)
            .stdout(std::process::Stdio::null())
            .stderr(std::process::Stdio::null())
            .spawn()
            .unwrap();
        std::thread::sleep(Duration::from_millis(delay_ms));
        child.kill().unwrap(); // SIGKILL: no destructor runs
        child.wait().unwrap();
        if dir.exists() {
            assert_complete(&dir, &big());
        }
        if std::env::var_os("MOTLEY_REPORT_KILL_TRACE").is_some() {
            eprintln!(
                "kill after {delay_ms} ms: final exists {}, hidden {:?}",
                dir.exists(),
                hidden(tmp.path())
            );
        }
    }
    // The next run succeeds and sweeps the dead children's staging and moved-aside folders.
    write_report(&dir, &common::full(), &extras(), true).unwrap();
    assert_complete(&dir, &common::full());
    if Path::new("/proc/self").exists() {
        assert!(hidden(tmp.path()).is_empty(), "{:?}", hidden(tmp.path()));
    }
}
