//! Same scenario and seed, same result: whatever the thread count, shard split or interruption.

use std::process::Command;

use crate::common::*;

/// A mixed scenario (six-vertex and exclusion, sets, numbers and events) small enough to run fast.
const SCENARIO: &str = "
name: repro
seed: 99
samples: 6000
alpha: 0.01
models:
  rect:
    six-vertex: {width: 6, height: 5, b1: 0.4, b2: 0.7, left: rainbow, bottom: {bernoulli: {density: 0.3, color: 2}}}
  ring:
    exclusion: {lattice: {ring: 9}, p: 1, q: 0.5, strength: smaller-wins, initial: {list: [1, 2, 0, 3, 0, 0, 2, 0, 1]}}
observables:
  top: {of: rect, read: {top: colors}}
  right: {of: rect, read: {right: positions}}
  h: {of: rect, read: {height: {x: 3, y: 5}}}
  where: {of: ring, read: {position: {class: 3, time: 2.5}}}
  current: {of: ring, read: {current: {bond: 4, time: 2.5}}}
claims:
  - id: a
    same-law: [top, right]
    exact: off
  - id: b
    describe: h
  - id: c
    describe: where
  - id: d
    same-law: [where, current]
";

fn write_scenario(dir: &std::path::Path) -> std::path::PathBuf {
    let p = dir.join("repro.yaml");
    std::fs::write(&p, SCENARIO).unwrap();
    p
}

#[test]
fn thread_count_does_not_change_the_result() {
    let d = tempfile::tempdir().unwrap();
    let f = write_scenario(d.path());
    let f = f.to_str().unwrap();
    let one = d.path().join("one");
    let two = d.path().join("two");
    run_ok(&[
        "run",
        f,
        "--out",
        one.to_str().unwrap(),
        "--threads",
        "1",
        "--quiet",
    ]);
    run_ok(&[
        "run",
        f,
        "--out",
        two.to_str().unwrap(),
        "--threads",
        "2",
        "--quiet",
    ]);
    assert_same(&comparable(&one), &comparable(&two), "--threads 1 vs 2");
}

fn run_shards_and_merge(dir: &std::path::Path, f: &str, use_parallel: bool) -> std::path::PathBuf {
    let shard_dir = |k: u32| dir.join(format!("shard-{k}"));
    if use_parallel {
        // GNU parallel runs the four shards concurrently, as the README shows.
        let status = Command::new("parallel")
            .args([
                env!("CARGO_BIN_EXE_motley"),
                "run",
                f,
                "--threads",
                "1",
                "--quiet",
                "--shard",
                "{}/4",
                "--out",
                &format!("{}/shard-{{}}", dir.display()),
                ":::",
                "1",
                "2",
                "3",
                "4",
            ])
            .status()
            .expect("GNU parallel runs");
        assert!(status.success(), "parallel failed");
    } else {
        for k in 1..=4 {
            let shard = format!("{k}/4");
            run_ok(&[
                "run",
                f,
                "--quiet",
                "--shard",
                &shard,
                "--out",
                shard_dir(k).to_str().unwrap(),
            ]);
        }
    }
    let merged = dir.join("merged");
    let mut args = vec!["merge".to_string()];
    args.extend((1..=4).map(|k| shard_dir(k).display().to_string()));
    args.extend(["--out".into(), merged.display().to_string()]);
    let args: Vec<&str> = args.iter().map(|s| s.as_str()).collect();
    run_ok(&args);
    merged
}

fn have_parallel() -> bool {
    Command::new("parallel")
        .arg("--version")
        .output()
        .is_ok_and(|o| o.status.success())
}

#[test]
fn four_shards_merged_equal_one_run() {
    let d = tempfile::tempdir().unwrap();
    let f = write_scenario(d.path());
    let f = f.to_str().unwrap();
    let single = d.path().join("single");
    run_ok(&["run", f, "--out", single.to_str().unwrap(), "--quiet"]);
    let use_parallel = have_parallel();
    // CI installs GNU parallel; there its absence is an error, not a reason to skip.
    if std::env::var("CI").is_ok_and(|v| v == "true") {
        assert!(
            use_parallel,
            "CI must provide GNU parallel for the shard test"
        );
    }
    let merged = run_shards_and_merge(d.path(), f, use_parallel);
    assert_same(
        &comparable(&single),
        &comparable(&merged),
        "4 shards merged vs one run",
    );
}

#[test]
fn merge_refuses_missing_duplicate_and_foreign_shards() {
    let d = tempfile::tempdir().unwrap();
    let f = write_scenario(d.path());
    let f = f.to_str().unwrap();
    let shard = |k: u32| d.path().join(format!("s{k}")).display().to_string();
    for k in 1..=3 {
        run_ok(&[
            "run",
            f,
            "--quiet",
            "--samples",
            "600",
            "--shard",
            &format!("{k}/3"),
            "--out",
            &shard(k),
        ]);
    }
    let out = d.path().join("m").display().to_string();
    let missing = run(&["merge", &shard(1), &shard(3), "--out", &out]);
    assert_eq!(missing.status.code(), Some(2));
    let msg = String::from_utf8_lossy(&missing.stderr);
    assert!(msg.contains("shards missing: 2 of 3 (have 1, 3)"), "{msg}");
    assert!(!d.path().join("m").exists());

    let dup = run(&[
        "merge",
        &shard(1),
        &shard(2),
        &shard(2),
        &shard(3),
        "--out",
        &out,
    ]);
    assert_eq!(dup.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&dup.stderr).contains("shard 2/3 is given twice"));

    // A shard of another scenario (another seed, hence another hash).
    let other = d.path().join("other.yaml");
    std::fs::write(&other, SCENARIO.replace("seed: 99", "seed: 100")).unwrap();
    run_ok(&[
        "run",
        other.to_str().unwrap(),
        "--quiet",
        "--samples",
        "600",
        "--shard",
        "2/3",
        "--out",
        &shard(9),
    ]);
    let foreign = run(&["merge", &shard(1), &shard(9), &shard(3), "--out", &out]);
    assert_eq!(foreign.status.code(), Some(2));
    let msg = String::from_utf8_lossy(&foreign.stderr);
    assert!(
        msg.contains("belongs to scenario `repro` with hash"),
        "{msg}"
    );
    assert!(!d.path().join("m").exists());
}
