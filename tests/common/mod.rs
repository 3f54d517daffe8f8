//! Helpers shared by the end-to-end tests: running the real binary and comparing results.

#![allow(dead_code)]

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

/// The motley binary under test.
pub fn motley() -> Command {
    Command::new(env!("CARGO_BIN_EXE_motley"))
}

/// The repository root.
pub fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// A worked scenario's path.
pub fn scenario(name: &str) -> PathBuf {
    root().join("scenarios").join(format!("{name}.yaml"))
}

/// Runs `motley` with `args`, returning its output.
pub fn run(args: &[&str]) -> Output {
    motley().args(args).output().expect("motley runs")
}

/// Runs and asserts success, printing stderr otherwise.
pub fn run_ok(args: &[&str]) -> Output {
    let out = run(args);
    assert!(
        out.status.success(),
        "motley {args:?} failed ({:?}):\n{}",
        out.status.code(),
        String::from_utf8_lossy(&out.stderr)
    );
    out
}

/// `result.json` of a report folder, without the fields allowed to differ between reruns
/// (`timing` and the build's `git_commit`).
pub fn comparable(dir: &Path) -> serde_json::Value {
    let text = std::fs::read_to_string(dir.join("result.json")).expect("result.json");
    let mut v: serde_json::Value = serde_json::from_str(&text).expect("valid JSON");
    let obj = v.as_object_mut().expect("an object");
    obj.remove("timing");
    obj.remove("git_commit");
    v
}

/// Asserts two results are equal, printing the first differing line of their pretty forms.
pub fn assert_same(a: &serde_json::Value, b: &serde_json::Value, what: &str) {
    if a != b {
        let (ta, tb) = (
            serde_json::to_string_pretty(a).unwrap(),
            serde_json::to_string_pretty(b).unwrap(),
        );
        let line = ta
            .lines()
            .zip(tb.lines())
            .enumerate()
            .find(|(_, (x, y))| x != y)
            .map(|(i, (x, y))| format!("line {}:\n  left:  {x}\n  right: {y}", i + 1))
            .unwrap_or_else(|| "lengths differ".into());
        panic!("{what}: results differ at {line}");
    }
}

/// A small describe-only scenario (a 6 × 5 rectangle, one height) with `samples` per side, for
/// tests of the command line rather than of the numbers.
pub const SMALL_SCENARIO: &str = "name: small
seed: 9
samples: 2000
models:
  rect:
    six-vertex: {width: 6, height: 5, b1: 0.45, b2: 0.55, left: rainbow, bottom: empty}
observables:
  h: {of: rect, read: {height: {x: 3, y: 5}}}
claims:
  - id: h
    describe: h
";
