//! Killed runs leave nothing under the report's name; a terminated run resumes to the same result.

use std::process::{Command, Stdio};
use std::time::Duration;

use crate::common::*;

/// About 5 s of work on one thread of the project's machine, so a signal sent after 1.5 s lands
/// mid-run (the test asserts that it did: exit code 130).
const SCENARIO: &str = "
name: long
seed: 5
samples: 200000
models:
  rect:
    six-vertex: {width: 60, height: 60, b1: 0.45, b2: 0.55, left: rainbow, bottom: empty}
observables:
  top: {of: rect, read: {top: colors}}
  h: {of: rect, read: {height: {x: 30, y: 60}}}
claims:
  - id: top
    describe: top
  - id: h
    describe: h
";

fn signal(pid: u32, sig: &str) {
    let ok = Command::new("kill")
        .args([sig, &pid.to_string()])
        .status()
        .unwrap();
    assert!(ok.success());
}

#[test]
fn killed_run_leaves_no_report() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("long.yaml");
    std::fs::write(&f, SCENARIO).unwrap();
    let out = d.path().join("report");
    let mut child = motley()
        .args([
            "run",
            f.to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
            "--threads",
            "1",
            "--quiet",
        ])
        .stdout(Stdio::null())
        .stderr(Stdio::null())
        .spawn()
        .unwrap();
    std::thread::sleep(Duration::from_millis(1500));
    signal(child.id(), "-KILL");
    let status = child.wait().unwrap();
    assert!(
        !status.success(),
        "the run finished before it was killed; make it longer"
    );
    assert!(!out.exists(), "a killed run left {}", out.display());
}

#[test]
fn terminated_run_resumes_to_the_uninterrupted_result() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("long.yaml");
    std::fs::write(&f, SCENARIO).unwrap();
    let f = f.to_str().unwrap();
    let out = d.path().join("report");
    let o = out.to_str().unwrap();
    let child = motley()
        .args([
            "run",
            f,
            "--out",
            o,
            "--threads",
            "1",
            "--quiet",
            "--checkpoint-every",
            "0",
        ])
        .stdout(Stdio::null())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    std::thread::sleep(Duration::from_millis(1500));
    signal(child.id(), "-TERM");
    let done = child.wait_with_output().unwrap();
    let msg = String::from_utf8_lossy(&done.stderr);
    assert_eq!(
        done.status.code(),
        Some(130),
        "expected an interruption: {msg}"
    );
    assert!(msg.contains("checkpoint written"), "{msg}");
    assert!(!out.exists());
    let cp = d.path().join("report.checkpoint.json");
    assert!(cp.is_file());

    // Running again without --resume is refused: the checkpoint is not silently thrown away.
    let again = run(&["run", f, "--out", o, "--quiet"]);
    assert_eq!(again.status.code(), Some(2));

    run_ok(&[
        "run",
        f,
        "--out",
        o,
        "--threads",
        "2",
        "--quiet",
        "--resume",
    ]);
    assert!(
        !cp.exists(),
        "the checkpoint is removed once the report is written"
    );
    let whole = d.path().join("whole");
    run_ok(&["run", f, "--out", whole.to_str().unwrap(), "--quiet"]);
    assert_same(
        &comparable(&out),
        &comparable(&whole),
        "resumed vs uninterrupted",
    );
}

#[test]
fn foreign_or_corrupt_checkpoints_are_refused() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("long.yaml");
    std::fs::write(&f, SCENARIO.replace("samples: 200000", "samples: 500")).unwrap();
    let out = d.path().join("report");
    let cp = d.path().join("report.checkpoint.json");
    std::fs::write(&cp, "{ not json").unwrap();
    let r = run(&[
        "run",
        f.to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
        "--resume",
        "--quiet",
    ]);
    assert_eq!(r.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&r.stderr).contains("is corrupt"));
    // A checkpoint of another scenario: make one by interrupting nothing, just writing a partial.
    let other = d.path().join("other.yaml");
    std::fs::write(
        &other,
        SCENARIO
            .replace("seed: 5", "seed: 6")
            .replace("samples: 200000", "samples: 500"),
    )
    .unwrap();
    let sh = d.path().join("shard");
    run_ok(&[
        "run",
        other.to_str().unwrap(),
        "--shard",
        "1/1",
        "--out",
        sh.to_str().unwrap(),
        "--quiet",
    ]);
    std::fs::copy(sh.join("partial.json"), &cp).unwrap();
    let r = run(&[
        "run",
        f.to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
        "--resume",
        "--quiet",
    ]);
    assert_eq!(r.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&r.stderr).contains("belongs to another scenario"));
    assert!(!out.exists());
}
