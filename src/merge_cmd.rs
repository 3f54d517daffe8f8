//! `motley merge`: the shards' partial results into the report one run would have given.

use motley_scenario::finish::check_partials;
use motley_scenario::plan::plan;
use motley_scenario::run::Partial;

use crate::cli::MergeArgs;
use crate::exit::Failure;
use crate::input::load_text;
use crate::run_cmd::{report, PARTIAL_FILE, SCENARIO_FILE};

/// `motley merge`.
pub fn merge(a: MergeArgs) -> Result<(), Failure> {
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
