//! The model-family boundary stays exhaustive: the files that dispatch over families, read-outs,
//! claim kinds and profiles contain no catch-all `_ =>` match arm, so that adding a variant makes
//! the compiler list every place to change (the crate's `family` module also holds a
//! `compile_fail` example of a match that forgets a read-out).

/// Files that match on `ModelKind`, `ReadSpec`, a family's read-outs, `ClaimKind`, `Profile` or
/// `RawRead`.
const BOUNDARY_FILES: [&str; 9] = [
    "family.rs",
    "six_vertex_family.rs",
    "exclusion_family.rs",
    "six_vertex_unit.rs",
    "resolve_read.rs",
    "plan.rs",
    "unit.rs",
    "cost.rs",
    "raw.rs",
];

#[test]
fn boundary_files_have_no_catch_all_arms() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("src");
    let mut found = Vec::new();
    for f in BOUNDARY_FILES {
        let text = std::fs::read_to_string(dir.join(f)).unwrap_or_else(|e| panic!("{f}: {e}"));
        for (i, line) in text.lines().enumerate() {
            let code = line.split("//").next().unwrap_or("");
            if code.trim_start().starts_with("_ =>") || code.contains("| _ =>") {
                found.push(format!("{f}:{}: {}", i + 1, line.trim()));
            }
        }
    }
    assert!(
        found.is_empty(),
        "catch-all arms in boundary files:\n{}",
        found.join("\n")
    );
}

/// The scan itself finds a catch-all arm when there is one (a scan that cannot fail proves nothing).
#[test]
fn the_scan_sees_a_catch_all_arm() {
    let sample = "match r {\n    SixVertexRead::Top(_) => 1,\n    _ => 0,\n}";
    let hits = sample
        .lines()
        .filter(|l| {
            l.split("//")
                .next()
                .unwrap_or("")
                .trim_start()
                .starts_with("_ =>")
        })
        .count();
    assert_eq!(hits, 1);
}
