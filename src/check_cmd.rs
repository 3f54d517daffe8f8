//! `motley check`: validation and a cost estimate, without running anything.

use motley_scenario::cost::estimate;
use motley_scenario::plan::plan;

use crate::cli::CheckArgs;
use crate::exit::Failure;
use crate::input::{check_memory, human_bytes, load, threads};
use crate::progress::human_seconds;

/// `motley check`.
pub fn check(a: CheckArgs) -> Result<(), Failure> {
    let loaded = load(&a.source, a.samples)?;
    let s = &loaded.scenario;
    let p = plan(s, &loaded.file).map_err(|e| Failure::BadInput(e.to_string()))?;
    let t = threads(a.threads)?;
    say!(
        "{}: valid scenario `{}` ({} models, {} observables, {} claims)",
        loaded.file,
        s.name,
        s.models.len(),
        s.observables.len(),
        s.claims.len()
    );
    for (c, exact) in s.claims.iter().zip(&p.exact) {
        let how = if *exact { "exact laws" } else { "Monte Carlo" };
        say!("  claim {:<22} decided by {how}", c.id);
    }
    let cost = estimate(s, &p, t);
    say!(
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
