//! The bad-scenario corpus: every file under `tests/bad_scenarios/` is refused with exit code 2 and
//! the exact first line listed in `tests/bad_scenarios/expected.txt`, and nothing panics. Also an
//! unreadable path and an existing report folder.

use std::path::PathBuf;
use std::process::Output;

use crate::common::*;

fn corpus() -> PathBuf {
    root().join("tests").join("bad_scenarios")
}

/// `(file, flags, expected first line)` of every manifest entry.
fn manifest() -> Vec<(String, Vec<String>, String)> {
    let text = std::fs::read_to_string(corpus().join("expected.txt")).expect("manifest");
    text.lines()
        .filter(|l| !l.trim().is_empty() && !l.starts_with('#'))
        .map(|l| {
            let (cmd, expected) = l
                .split_once('\t')
                .unwrap_or_else(|| panic!("no tab in manifest line {l:?}"));
            let mut words = cmd.split_whitespace().map(str::to_string);
            let file = words.next().expect("a file name");
            (file, words.collect(), expected.to_string())
        })
        .collect()
}

fn stderr(out: &Output) -> String {
    String::from_utf8_lossy(&out.stderr).into_owned()
}

fn assert_refused(out: &Output, expected_first: &str, what: &str) {
    let err = stderr(out);
    assert!(!err.contains("panicked"), "{what}: panicked:\n{err}");
    assert_eq!(
        out.status.code(),
        Some(2),
        "{what}: exit code, stderr:\n{err}"
    );
    assert_eq!(
        err.lines().next().unwrap_or(""),
        format!("motley: {expected_first}"),
        "{what}: first line"
    );
}

#[test]
fn every_bad_scenario_is_refused_with_its_message() {
    let entries = manifest();
    assert!(
        entries.len() >= 35,
        "the corpus has {} entries",
        entries.len()
    );
    let mut failures = Vec::new();
    for (file, flags, expected) in &entries {
        let out = motley()
            .current_dir(corpus())
            .arg("check")
            .arg(file)
            .args(flags)
            .output()
            .expect("motley runs");
        let err = stderr(&out);
        let first = err.lines().next().unwrap_or("").to_string();
        if err.contains("panicked")
            || out.status.code() != Some(2)
            || first != format!("motley: {expected}")
        {
            failures.push(format!(
                "{file}: exit {:?}\n  expected: motley: {expected}\n  got:      {first}",
                out.status.code()
            ));
        }
    }
    assert!(
        failures.is_empty(),
        "{} of {} cases differ:\n{}",
        failures.len(),
        entries.len(),
        failures.join("\n")
    );
}

#[test]
fn every_corpus_file_is_in_the_manifest() {
    let listed: Vec<String> = manifest().into_iter().map(|(f, ..)| f).collect();
    for e in std::fs::read_dir(corpus()).unwrap() {
        let name = e.unwrap().file_name().to_string_lossy().into_owned();
        if name.ends_with(".yaml") {
            assert!(listed.contains(&name), "{name} has no line in expected.txt");
        }
    }
}

#[test]
fn run_refuses_the_bad_scenarios_too() {
    // `motley run` goes through the same loader: spot-check two cases and the memory limit, with an
    // output folder that must not appear.
    let d = tempfile::tempdir().unwrap();
    for (file, flags, expected) in manifest().into_iter().filter(|(f, ..)| {
        [
            "b1-above-one.yaml",
            "unknown-key-widht.yaml",
            "memory-over-limit.yaml",
        ]
        .contains(&f.as_str())
    }) {
        let out_dir = d.path().join(file.trim_end_matches(".yaml"));
        let out = motley()
            .current_dir(corpus())
            .args(["run", &file, "--quiet", "--out"])
            .arg(&out_dir)
            .args(&flags)
            .output()
            .unwrap();
        assert_refused(&out, &expected, &file);
        assert!(!out_dir.exists(), "{file}: a report folder was written");
    }
}

#[test]
fn memory_limit_accepts_a_small_run_and_rejects_bad_sizes() {
    let tiny = scenario("rainbow-symmetry");
    let tiny = tiny.to_str().unwrap();
    run_ok(&["check", tiny, "--memory-limit", "1G"]);
    run_ok(&["check", tiny, "--memory-limit", "none"]);
    let out = run(&["check", tiny, "--memory-limit", "lots"]);
    assert_refused(
        &out,
        "--memory-limit must be a size like 512M or 4G (or `none`), got \"lots\"",
        "bad size",
    );
    // 1 MiB is below the program's own 20 MiB allowance: refused, naming the estimate and the limit.
    let out = run(&["check", tiny, "--memory-limit", "1M"]);
    let first = stderr(&out).lines().next().unwrap_or("").to_string();
    assert_eq!(out.status.code(), Some(2));
    assert!(
        first.starts_with(&format!("motley: {tiny}: the run needs about "))
            && first.contains("more than the limit of 1 MiB (--memory-limit)"),
        "{first}"
    );
}

#[test]
fn worked_scenarios_fit_in_a_gibibyte() {
    for name in [
        "packed-inverse",
        "rainbow-near-miss",
        "rainbow-symmetry",
        "second-class-tasep",
        "second-third-swap",
        "step-height",
    ] {
        let path = scenario(name);
        run_ok(&["check", path.to_str().unwrap(), "--memory-limit", "1G"]);
    }
}

#[test]
fn unreadable_path_is_refused() {
    let out = motley()
        .current_dir(corpus())
        .args(["check", "no-such-file.yaml"])
        .output()
        .unwrap();
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(2));
    assert!(!err.contains("panicked"));
    // The OS wording after the colon varies; the start is ours.
    assert!(
        err.starts_with("motley: no-such-file.yaml: cannot read the scenario: "),
        "{err}"
    );
    let out = motley()
        .current_dir(corpus())
        .args(["check", "."])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    assert!(stderr(&out).starts_with("motley: .: cannot read the scenario: "));
}

#[test]
fn existing_report_folder_is_refused_unless_overwrite() {
    let d = tempfile::tempdir().unwrap();
    let out_dir = d.path().join("report");
    let file = scenario("rainbow-symmetry");
    let base = [
        "run",
        file.to_str().unwrap(),
        "--quiet",
        "--samples",
        "2000",
        "--threads",
        "1",
        "--out",
        out_dir.to_str().unwrap(),
    ];
    run_ok(&base);
    let first = std::fs::read(out_dir.join("result.json")).unwrap();
    let out = run(&base);
    assert_refused(
        &out,
        &format!(
            "report folder {} exists; pass --overwrite to replace it",
            out_dir.display()
        ),
        "existing folder",
    );
    assert_eq!(
        std::fs::read(out_dir.join("result.json")).unwrap(),
        first,
        "the report was touched"
    );
    let mut with = base.to_vec();
    with.push("--overwrite");
    run_ok(&with);
    assert!(out_dir.join("result.json").exists());

    // A folder that is not a report is kept even with --overwrite, and refused before the run.
    let foreign = d.path().join("mine");
    std::fs::create_dir(&foreign).unwrap();
    std::fs::write(foreign.join("notes.txt"), "mine").unwrap();
    let mut args = base.to_vec();
    let at = args.len() - 1;
    args[at] = foreign.to_str().unwrap();
    args.push("--overwrite");
    let out = run(&args);
    let err = stderr(&out);
    assert_eq!(out.status.code(), Some(2), "{err}");
    assert!(
        err.starts_with(&format!(
            "motley: {} exists and is not a folder motley may replace (no .motley-written: motley did not write it)",
            foreign.display()
        )),
        "{err}"
    );
    assert_eq!(
        std::fs::read_to_string(foreign.join("notes.txt")).unwrap(),
        "mine"
    );
}
