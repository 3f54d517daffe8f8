//! The output location is tested before any sampling; `--overwrite` replaces only what motley wrote;
//! merge never deletes its inputs; shard folders go beside the report (issue 17).

use std::time::Instant;

use crate::common::*;

#[test]
fn an_unwritable_output_is_refused_before_sampling() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("s.yaml");
    // Millions of samples: a refusal after sampling would take minutes.
    std::fs::write(
        &f,
        SMALL_SCENARIO.replace("samples: 2000", "samples: 100000000"),
    )
    .unwrap();
    // A plain file where the output's parent folder should be: it cannot be created (this holds
    // for every user, root included, unlike a read-only folder).
    let blocker = d.path().join("blocker");
    std::fs::write(&blocker, "a file").unwrap();
    let out = blocker.join("report");
    let t = Instant::now();
    let r = run(&[
        "run",
        f.to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
        "--quiet",
    ]);
    assert_eq!(r.status.code(), Some(2));
    assert!(t.elapsed().as_secs_f64() < 5.0, "refused only after work");
    let msg = String::from_utf8_lossy(&r.stderr);
    assert!(msg.contains("cannot write the output"), "{msg}");
}

#[test]
fn overwrite_keeps_folders_and_files_motley_did_not_write() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("s.yaml");
    std::fs::write(&f, SMALL_SCENARIO).unwrap();
    let (f, out) = (f.to_str().unwrap(), d.path().join("report"));
    let o = out.to_str().unwrap();
    run_ok(&["run", f, "--out", o, "--quiet"]);
    run_ok(&["run", f, "--out", o, "--quiet", "--overwrite"]);
    std::fs::write(out.join("my-notes.txt"), "keep me").unwrap();
    let r = run(&["run", f, "--out", o, "--quiet", "--overwrite"]);
    assert_eq!(r.status.code(), Some(2));
    let msg = String::from_utf8_lossy(&r.stderr);
    assert!(msg.contains("motley did not write: my-notes.txt"), "{msg}");
    assert_eq!(
        std::fs::read_to_string(out.join("my-notes.txt")).unwrap(),
        "keep me"
    );
    // A folder holding a `result.json` of someone else's is not ours either.
    let fake = d.path().join("fake");
    std::fs::create_dir(&fake).unwrap();
    std::fs::write(fake.join("result.json"), "{}").unwrap();
    let r = run(&[
        "run",
        f,
        "--out",
        fake.to_str().unwrap(),
        "--quiet",
        "--overwrite",
    ]);
    assert_eq!(r.status.code(), Some(2));
    assert!(fake.join("result.json").is_file());
}

#[test]
fn shards_default_beside_the_report_and_merge_keeps_its_inputs() {
    let d = tempfile::tempdir().unwrap();
    let f = d.path().join("s.yaml");
    std::fs::write(&f, SMALL_SCENARIO).unwrap();
    for k in ["1/2", "2/2"] {
        let r = motley()
            .current_dir(d.path())
            .args(["run", "s.yaml", "--shard", k, "--quiet"])
            .output()
            .unwrap();
        assert!(r.status.success(), "{}", String::from_utf8_lossy(&r.stderr));
    }
    let reports = d.path().join("reports");
    let s1 = reports.join("small-shard-1-of-2");
    let s2 = reports.join("small-shard-2-of-2");
    assert!(s1.join("partial.json").is_file() && s2.join("partial.json").is_file());
    let out = reports.join("small");
    let (a, b, o) = (
        s1.to_str().unwrap(),
        s2.to_str().unwrap(),
        out.to_str().unwrap(),
    );
    run_ok(&["merge", a, b, "--out", o]);
    run_ok(&["merge", a, b, "--out", o, "--overwrite"]);
    assert!(s1.join("partial.json").is_file() && s2.join("partial.json").is_file());
    // Shards inside the report folder: the merge refuses rather than replace its own inputs.
    let inside = out.join("shard-1");
    std::fs::rename(&s1, &inside).unwrap();
    let r = run(&[
        "merge",
        inside.to_str().unwrap(),
        b,
        "--out",
        o,
        "--overwrite",
    ]);
    assert_eq!(r.status.code(), Some(2));
    let msg = String::from_utf8_lossy(&r.stderr);
    assert!(msg.contains("lies inside the report folder"), "{msg}");
    assert!(inside.join("partial.json").is_file());
}
