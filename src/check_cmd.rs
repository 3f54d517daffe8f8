//! `motley check`: validation and a cost estimate, without running anything.

use motley_scenario::confirm::samples_to_confirm_claim;
use motley_scenario::cost::estimate;
use motley_scenario::plan::plan;

use crate::cli::CheckArgs;
use crate::exit::Failure;
use crate::input::{check_memory, human_bytes, load, threads};

fn human_seconds(s: f64) -> String {
    if s < 90.0 {
        format!("{s:.1} s")
    } else if s < 5400.0 {
        format!("{:.1} min", s / 60.0)
    } else {
        format!("{:.1} h", s / 3600.0)
    }
}

/// `motley check`.
pub fn check(a: CheckArgs) -> Result<(), Failure> {
    let loaded = load(&a.source, a.samples)?;
    let s = &loaded.scenario;
    let p = plan(s, &loaded.file).map_err(|e| Failure::BadInput(e.to_string()))?;
    let t = threads(a.threads)?;
    println!(
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
        println!("  claim {:<22} decided by {how}{confirm}", c.id);
    }
    if let Some(looks) = &s.looks {
        let list: Vec<String> = looks.iter().map(|n| n.to_string()).collect();
        println!(
            "  sampling until decided: looks at {} samples per side",
            list.join(", ")
        );
    }
    let cost = estimate(s, &p, t);
    println!(
        "estimate: {} samples in all ({} units × {}), about {} on {t} threads, peak memory about {}",
        cost.samples,
        p.units.len(),
        s.samples,
        human_seconds(cost.seconds),
        human_bytes(cost.bytes)
    );
    check_memory(&loaded.file, cost.bytes, a.memory_limit.as_deref())?;
    Ok(())
}
