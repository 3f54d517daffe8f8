//! `motley merge`: the shards' partial results into the report one run would have given.

use std::path::{Path, PathBuf};

use motley_scenario::finish::check_partials;
use motley_scenario::plan::plan;
use motley_scenario::run::Partial;

use crate::cli::MergeArgs;
use crate::exit::Failure;
use crate::input::load_text;
use crate::run_cmd::{report, PARTIAL_FILE, SCENARIO_FILE};

/// `path` made absolute with its existing part resolved (symbolic links, `..`), so that two names
/// of one folder compare equal.
fn absolute(path: &Path) -> PathBuf {
    let abs = std::path::absolute(path).unwrap_or_else(|_| path.to_path_buf());
    let mut existing = abs.as_path();
    let mut rest = Vec::new();
    loop {
        if let Ok(c) = existing.canonicalize() {
            return rest.iter().rev().fold(c, |p: PathBuf, n| p.join(n));
        }
        match (existing.parent(), existing.file_name()) {
            (Some(parent), Some(name)) => {
                rest.push(name.to_os_string());
                existing = parent;
            }
            _ => return abs,
        }
    }
}

/// `motley merge`.
pub fn merge(a: MergeArgs) -> Result<(), Failure> {
    // Merging never deletes its inputs: the report may not be, or hold, a shard folder.
    let out_abs = absolute(&a.out);
    for dir in &a.shards {
        if absolute(dir).starts_with(&out_abs) {
            return Err(Failure::BadInput(format!(
                "shard folder {} lies inside the report folder {}; merge into another --out (shards go beside the report, not inside it)",
                dir.display(),
                a.out.display()
            )));
        }
    }
    let mut partials: Vec<(String, Partial)> = Vec::new();
    let mut scenario: Option<(String, String)> = None;
    for dir in &a.shards {
        let file = dir.join(PARTIAL_FILE);
        let shown = file.display().to_string();
        let text = std::fs::read_to_string(&file).map_err(|e| {
            Failure::BadInput(format!(
                "{shown}: cannot read a shard's partial result: {e}"
            ))
        })?;
        let p = Partial::from_json(&text).map_err(|why| {
            Failure::BadInput(format!("{shown}: not a usable partial result: it {why}"))
        })?;
        if scenario.is_none() {
            let sf = dir.join(SCENARIO_FILE);
            let t = std::fs::read_to_string(&sf).map_err(|e| {
                Failure::BadInput(format!(
                    "{}: cannot read the shard's scenario: {e}",
                    sf.display()
                ))
            })?;
            scenario = Some((t, sf.display().to_string()));
        }
        partials.push((shown, p));
    }
    let (text, file) = scenario.ok_or_else(|| Failure::BadInput("nothing to merge".into()))?;
    let samples = partials.first().map(|(_, p)| p.samples);
    let loaded = load_text(text, file, samples)?;
    let plan =
        plan(&loaded.scenario, &loaded.file).map_err(|e| Failure::BadInput(e.to_string()))?;
    check_partials(&loaded.scenario, &plan, &mut partials)
        .map_err(|e| Failure::BadInput(e.to_string()))?;
    let mut sorted: Vec<Partial> = partials.into_iter().map(|(_, p)| p).collect();
    sorted.sort_by_key(|p| p.shard.index);
    report(&loaded, &sorted, &a.out, a.overwrite, false)
}
