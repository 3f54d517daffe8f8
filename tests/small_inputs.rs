//! The small ones of issue 17: a closed standard output, a byte-order mark, an endless scenario
//! file, and progress lines in a batch job's log.

use std::io::Read;
use std::process::Stdio;

use crate::common::*;

#[test]
fn a_closed_standard_output_is_no_panic() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("s.yaml");
    std::fs::write(&f, SMALL_SCENARIO).unwrap();
    let out = d.path().join("report");
    // `motley run … | head -0`: the reader is gone before anything is printed.
    let mut child = motley()
        .args(["run", f.to_str().unwrap(), "--out", out.to_str().unwrap()])
        .arg("--quiet")
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    drop(child.stdout.take());
    let mut err = String::new();
    child
        .stderr
        .take()
        .unwrap()
        .read_to_string(&mut err)
        .unwrap();
    let status = child.wait().unwrap();
    assert!(!err.contains("panicked"), "{err}");
    assert_eq!(status.code(), Some(0), "{err}");
    assert!(out.join("result.json").is_file());
}

#[test]
fn a_byte_order_mark_is_accepted() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("bom.yaml");
    std::fs::write(&f, format!("\u{feff}{SMALL_SCENARIO}")).unwrap();
    let r = run_ok(&["check", f.to_str().unwrap()]);
    assert!(String::from_utf8_lossy(&r.stdout).contains("valid scenario `small`"));
}

#[test]
fn an_endless_scenario_file_is_refused_at_once() {
    if !std::path::Path::new("/dev/zero").exists() {
        return;
    }
    let t = std::time::Instant::now();
    let r = run(&["check", "/dev/zero"]);
    assert_eq!(r.status.code(), Some(2));
    assert_eq!(
        String::from_utf8_lossy(&r.stderr)
            .lines()
            .next()
            .unwrap_or(""),
        "motley: /dev/zero: larger than 8 MiB, the limit of a scenario file"
    );
    assert!(t.elapsed().as_secs_f64() < 5.0);
}

#[test]
fn progress_goes_to_a_log_when_stderr_is_not_a_terminal() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("s.yaml");
    // About 2 s of sampling on one thread (60 × 60 rectangles).
    std::fs::write(
        &f,
        SMALL_SCENARIO
            .replace("samples: 2000", "samples: 40000")
            .replace("width: 6, height: 5", "width: 60, height: 60")
            .replace("x: 3, y: 5", "x: 30, y: 60"),
    )
    .unwrap();
    let out = d.path().join("report");
    let r = run_ok(&[
        "run",
        f.to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
        "--threads",
        "1",
        "--log-every",
        "0.2",
    ]);
    let err = String::from_utf8_lossy(&r.stderr);
    let lines: Vec<&str> = err
        .lines()
        .filter(|l| l.starts_with("motley: progress: "))
        .collect();
    assert!(!lines.is_empty(), "no progress line in:\n{err}");
    assert!(
        lines[0].contains("/40000 samples (") && lines[0].contains("samples/s"),
        "{}",
        lines[0]
    );
}

#[test]
fn a_run_estimated_above_a_day_needs_yes_and_check_says_so_in_json() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("huge.yaml");
    // 2^40 samples of a 60 × 60 rectangle: years of work by any estimate.
    std::fs::write(
        &f,
        SMALL_SCENARIO
            .replace("samples: 2000", "samples: 1099511627776")
            .replace("width: 6, height: 5", "width: 60, height: 60")
            .replace("x: 3, y: 5", "x: 30, y: 60"),
    )
    .unwrap();
    let f = f.to_str().unwrap();
    let out = d.path().join("report");
    let r = run(&[
        "run",
        f,
        "--out",
        out.to_str().unwrap(),
        "--memory-limit",
        "none",
    ]);
    assert_eq!(r.status.code(), Some(2));
    let msg = String::from_utf8_lossy(&r.stderr);
    assert!(msg.contains("pass --yes to start it anyway"), "{msg}");
    assert!(!out.exists());
    let r = run_ok(&[
        "check",
        f,
        "--json",
        "--memory-limit",
        "none",
        "--threads",
        "2",
    ]);
    let v: serde_json::Value = serde_json::from_slice(&r.stdout).unwrap();
    assert_eq!(v["name"], "small");
    assert_eq!(v["long_run"], true);
    assert_eq!(v["threads"], 2);
    assert_eq!(v["samples"], 1099511627776u64);
    assert!(v["seconds"].as_f64().unwrap() > 86400.0);
    assert!(v["peak_bytes"].as_f64().unwrap() > 0.0);
    assert_eq!(v["memory_limit_bytes"], serde_json::Value::Null);
    assert_eq!(v["claims"][0]["decided_by"], "monte-carlo");
    assert!(String::from_utf8_lossy(&r.stderr).is_empty());
    let r = run_ok(&["check", f, "--memory-limit", "none"]);
    assert!(String::from_utf8_lossy(&r.stderr).contains("motley: warning: the run is estimated"));
}
