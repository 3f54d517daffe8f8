//! `motley check`: validation and a cost estimate, without running anything.

use motley_scenario::confirm::samples_to_confirm_claim;
use motley_scenario::cost::{estimate, Cost};
use motley_scenario::plan::plan;
use motley_scenario::plan::Plan;
use motley_scenario::Scenario;

use crate::cli::CheckArgs;
use crate::exit::Failure;
use crate::input::{check_memory, human_bytes, load, long_run, memory_limit, threads};
use crate::progress::human_seconds;

/// `motley check`.
pub fn check(a: CheckArgs) -> Result<(), Failure> {
    let loaded = load(&a.source, a.samples)?;
    let s = &loaded.scenario;
    let p = plan(s, &loaded.file).map_err(|e| Failure::BadInput(e.to_string()))?;
    let t = threads(a.threads)?;
    let cost = estimate(s, &p, t);
    if a.json {
        say!(
            "{}",
            json(&loaded.file, s, &p, &cost, t, a.memory_limit.as_deref())?
        );
        return check_memory(&loaded.file, cost.bytes, a.memory_limit.as_deref());
    }
    say!(
        "{}: valid scenario `{}` ({} models, {} observables, {} claims)",
        loaded.file,
        s.name,
        s.models.len(),
        s.observables.len(),
        s.claims.len()
    );
    for (ci, (c, exact)) in s.claims.iter().zip(&p.exact).enumerate() {
        let how = if *exact { "exact laws" } else { "Monte Carlo" };
        let confirm = match (c.tolerance, *exact) {
            (Some(eps), false) => match samples_to_confirm_claim(s, ci) {
                Some(n) => format!(
                    "; to confirm EQUAL WITHIN {eps} with power {} needs about {n} samples per side{}",
                    s.power,
                    if n > s.samples { " (more than `samples`)" } else { "" }
                ),
                None => format!("; tolerance {eps} (no sample size formula for this kind)"),
            },
            _ => String::new(),
        };
        say!("  claim {:<22} decided by {how}{confirm}", c.id);
    }
    if let Some(looks) = &s.looks {
        let list: Vec<String> = looks.iter().map(|n| n.to_string()).collect();
        say!(
            "  sampling until decided: looks at {} samples per side",
            list.join(", ")
        );
    }
    say!(
        "estimate: {} samples in all ({} units × {}), about {} on {t} threads, peak memory about {}",
        cost.samples,
        p.units.len(),
        s.samples,
        human_seconds(cost.seconds),
        human_bytes(cost.bytes)
    );
    check_memory(&loaded.file, cost.bytes, a.memory_limit.as_deref())?;
    if let Some(why) = long_run(cost.seconds, t) {
        eprintln!("motley: warning: {why}");
    }
    Ok(())
}

/// `check --json`: what the human lines say, for scripts (one key per line, pretty-printed).
fn json(
    file: &str,
    s: &Scenario,
    p: &Plan,
    cost: &Cost,
    threads: usize,
    asked: Option<&str>,
) -> Result<String, Failure> {
    let limit = memory_limit(asked)?;
    let claims: Vec<_> = s
        .claims
        .iter()
        .zip(&p.exact)
        .enumerate()
        .map(|(ci, (c, exact))| {
            serde_json::json!({
                "id": c.id,
                "decided_by": if *exact { "exact" } else { "monte-carlo" },
                "tolerance": c.tolerance,
                "samples_to_confirm": if *exact { None } else { samples_to_confirm_claim(s, ci) },
            })
        })
        .collect();
    let v = serde_json::json!({
        "file": file,
        "name": s.name,
        "models": s.models.len(),
        "observables": s.observables.len(),
        "claims": claims,
        "units": p.units.len(),
        "samples_per_side": s.samples,
        "looks": s.looks,
        "samples": cost.samples,
        "threads": threads,
        "seconds": cost.seconds,
        "peak_bytes": cost.bytes,
        "memory_limit_bytes": limit.map(|(b, _)| b),
        "memory_limit_source": limit.map(|(_, w)| w),
        "long_run": long_run(cost.seconds, threads).is_some(),
    });
    serde_json::to_string_pretty(&v).map_err(|e| Failure::Runtime(e.to_string()))
}
