//! From partial results to the final [`RunResult`]: checks that the partials belong together, merges
//! them, and evaluates every claim (exact ones by exact laws).

use crate::accumulate::Accumulator;
use crate::partial_check::{Mismatch, PartialError};
use crate::plan::Plan;
use crate::result::{
    ClaimKindName, ClaimResult, DecidedBy, ErrorControl, RunResult, ScenarioInfo, Timing, SCHEMA,
};
use crate::run::{Partial, PARTIAL_SCHEMA};
use crate::scenario::Scenario;

/// Why partial results cannot be merged.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum MergeError {
    /// Not a partial result of this format.
    #[error("{file}: not a motley partial result (schema `{found}`, expected `{PARTIAL_SCHEMA}`)")]
    Schema {
        /// Where it came from.
        file: String,
        /// Schema found.
        found: String,
    },
    /// Written by another motley version.
    #[error(
        "{file}: written by motley {found}, this is motley {}; rerun the shard with this version",
        crate::VERSION
    )]
    Version {
        /// Where it came from.
        file: String,
        /// Version found.
        found: String,
    },
    /// From another scenario (or another version of the file).
    #[error("{file}: belongs to scenario `{name}` with hash {found}, expected hash {expected}")]
    Foreign {
        /// Where it came from.
        file: String,
        /// Its scenario name.
        name: String,
        /// Its hash.
        found: String,
        /// The expected hash.
        expected: String,
    },
    /// Sample counts disagree.
    #[error("{file}: has {found} samples per side, the first shard has {expected}")]
    Samples {
        /// Where it came from.
        file: String,
        /// Its samples per side.
        found: u64,
        /// The first shard's samples per side.
        expected: u64,
    },
    /// Shard counts disagree.
    #[error(
        "{file}: is shard {index}/{count}, but other shards say the run has {expected} shards"
    )]
    ShardCount {
        /// Where it came from.
        file: String,
        /// Its shard number.
        index: u64,
        /// Its count.
        count: u64,
        /// The count of the others.
        expected: u64,
    },
    /// A shard given twice.
    #[error("shard {index}/{count} is given twice: {first} and {second}")]
    Duplicate {
        /// Shard number.
        index: u64,
        /// Count.
        count: u64,
        /// First file.
        first: String,
        /// Second file.
        second: String,
    },
    /// Shards missing.
    #[error("shards missing: {missing} of {count} (have {have})")]
    Missing {
        /// Missing shard numbers.
        missing: String,
        /// Count.
        count: u64,
        /// Present shard numbers.
        have: String,
    },
    /// A shard that did not finish.
    #[error("{file}: shard {index}/{count} is incomplete ({done} of its samples); resume it with --resume")]
    Incomplete {
        /// Where it came from.
        file: String,
        /// Shard number.
        index: u64,
        /// Count.
        count: u64,
        /// Samples done.
        done: u64,
    },
    /// A partial result that is damaged or does not fit the plan.
    #[error("{file}: {why}")]
    Invalid {
        /// Where it came from.
        file: String,
        /// What is wrong.
        why: PartialError,
    },
    /// No input.
    #[error("nothing to merge")]
    Empty,
}

/// Checks that `partials` (with the files they came from) are exactly the shards of one run of `s`:
/// one sample count, each written for `s` by this motley ([`Partial::check_origin`]) and fitting its
/// plan ([`Partial::check_plan`], which puts its slots in the plan's order), one shard count, every
/// shard once and complete.
///
/// # Errors
/// [`MergeError`] naming the offending file.
pub fn check_partials(
    s: &Scenario,
    plan: &Plan,
    partials: &mut [(String, Partial)],
) -> Result<(), MergeError> {
    let Some((_, first)) = partials.first() else {
        return Err(MergeError::Empty);
    };
    if let Some((file, p)) = partials.iter().find(|(_, p)| p.samples != first.samples) {
        return Err(MergeError::Samples {
            file: file.clone(),
            found: p.samples,
            expected: first.samples,
        });
    }
    for (file, p) in partials.iter_mut() {
        p.check_origin(s).map_err(|m| {
            let file = file.clone();
            match m {
                Mismatch::Schema { found } => MergeError::Schema { file, found },
                Mismatch::Version { found } => MergeError::Version { file, found },
                Mismatch::Scenario {
                    name,
                    found,
                    expected,
                } => MergeError::Foreign {
                    file,
                    name,
                    found,
                    expected,
                },
            }
        })?;
        p.check_plan(s, plan).map_err(|why| MergeError::Invalid {
            file: file.clone(),
            why,
        })?;
    }
    let first = &partials[0].1;
    let count = first.shard.count;
    let mut seen: Vec<Option<&str>> = vec![None; count as usize];
    for (file, p) in partials.iter() {
        if p.shard.count != count {
            return Err(MergeError::ShardCount {
                file: file.clone(),
                index: p.shard.index,
                count: p.shard.count,
                expected: count,
            });
        }
        let k = (p.shard.index - 1) as usize;
        if let Some(prev) = seen[k] {
            return Err(MergeError::Duplicate {
                index: p.shard.index,
                count,
                first: prev.to_string(),
                second: file.clone(),
            });
        }
        seen[k] = Some(file);
        if !p.complete() {
            return Err(MergeError::Incomplete {
                file: file.clone(),
                index: p.shard.index,
                count,
                done: p.done - p.shard.range(p.samples).0,
            });
        }
    }
    let missing: Vec<String> = (0..count as usize)
        .filter(|&k| seen[k].is_none())
        .map(|k| (k + 1).to_string())
        .collect();
    if !missing.is_empty() {
        let have: Vec<String> = (0..count as usize)
            .filter(|&k| seen[k].is_some())
            .map(|k| (k + 1).to_string())
            .collect();
        return Err(MergeError::Missing {
            missing: missing.join(", "),
            count,
            have: have.join(", "),
        });
    }
    Ok(())
}

/// Builds the final result of `s` from complete, checked partials, with `git_commit` recorded.
pub fn finish(s: &Scenario, plan: &Plan, partials: &[Partial], git_commit: &str) -> RunResult {
    let mut slots: Vec<(crate::unit::Slot, Accumulator)> = plan
        .slots
        .iter()
        .map(|sl| (*sl, sl.accumulator(s)))
        .collect();
    let mut wall = 0.0;
    let mut threads = 0;
    for p in partials {
        for ((_, acc), (_, add)) in slots.iter_mut().zip(&p.slots) {
            acc.merge(add);
        }
        wall += p.wall_seconds;
        threads = threads.max(p.threads);
    }
    for (_, acc) in slots.iter_mut() {
        acc.canonicalize();
    }
    // Samples per side behind these partials: all of `samples`, or a planned look's share.
    let used: u64 = partials
        .iter()
        .map(|p| p.done - p.shard.range(p.samples).0)
        .sum();
    let look = crate::sequential::Look::at(s, used);
    let level = look.as_ref().map_or(s.alpha, |l| l.level);
    let mut claims: Vec<ClaimResult> = (0..s.claims.len())
        .map(|ci| {
            if plan.exact[ci] {
                crate::exact_decide::decide(s, ci).unwrap_or_else(|e| failed(s, ci, e))
            } else {
                crate::evaluate::evaluate(s, ci, &slots, level)
            }
        })
        .collect();
    // Claims a sequential run settled at an earlier look keep that look's verdict.
    for frozen in partials.iter().flat_map(|p| &p.settled) {
        if let Some(c) = claims.iter_mut().find(|c| c.id == frozen.id) {
            *c = frozen.clone();
        }
    }
    if s.error_control == ErrorControl::FalseDiscoveryRate {
        crate::sequential::control_false_discoveries(s, plan, &mut claims);
    }
    let sequential = look.map(|l| l.summary(s, &mut claims));
    let total: u64 = plan.units.len() as u64 * used;
    RunResult {
        schema: SCHEMA.into(),
        motley_version: crate::VERSION.into(),
        git_commit: git_commit.into(),
        scenario: ScenarioInfo {
            name: s.name.clone(),
            title: s.title.clone(),
            description: s.description.clone(),
            hash: s.hash.clone(),
            seed: s.seed,
            samples: s.samples,
            alpha: s.alpha,
            power: s.power,
            error_control: s.error_control,
        },
        timing: Timing {
            wall_seconds: wall,
            threads,
            samples_per_second: if wall > 0.0 { total as f64 / wall } else { 0.0 },
            shards: partials.first().map_or(1, |p| p.shard.count),
        },
        claims,
        sequential,
    }
}

fn failed(s: &Scenario, ci: usize, e: String) -> crate::result::ClaimResult {
    let c = &s.claims[ci];
    crate::result::ClaimResult {
        id: c.id.clone(),
        kind: ClaimKindName::Error,
        says: c.says.clone(),
        observables: Vec::new(),
        decided_by: DecidedBy::Exact,
        rejected: false,
        decision: crate::result::Decision::NoClaim,
        level: s.alpha,
        tolerance: c.tolerance,
        look: None,
        verdict: format!("exact law unavailable: {e}"),
        samples: 0,
        tests: Vec::new(),
        effect: None,
        exact: None,
        estimates: Default::default(),
        stated: None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fixtures::{tiny, tiny_sampled, TINY_FILE};
    use crate::run::Shard;

    fn shards(s: &Scenario, count: u64) -> Vec<(String, Partial)> {
        let plan = crate::plan::plan(s, TINY_FILE).unwrap();
        let w = crate::run::Workers::new(1).unwrap();
        (1..=count)
            .map(|index| {
                let mut p = Partial::empty(s, &plan, Shard { index, count });
                let (progress, stop) = (Default::default(), Default::default());
                crate::run::advance(s, &plan, &mut p, &w, &progress, &stop, None).unwrap();
                (format!("shard-{index}/partial.json"), p)
            })
            .collect()
    }

    #[test]
    fn an_emptied_shard_is_refused() {
        let s = tiny_sampled();
        let plan = crate::plan::plan(&s, TINY_FILE).unwrap();
        let mut list = shards(&s, 2);
        list[1].1.slots[0].1 = plan.slots[0].accumulator(&s);
        let e = check_partials(&s, &plan, &mut list).unwrap_err();
        assert!(
            e.to_string().starts_with("shard-2/partial.json: slot `"),
            "{e}"
        );
    }

    #[test]
    fn complete_shards_of_one_run_pass() {
        let s = tiny();
        let plan = crate::plan::plan(&s, TINY_FILE).unwrap();
        assert_eq!(check_partials(&s, &plan, &mut shards(&s, 3)), Ok(()));
    }

    #[test]
    fn sample_counts_must_agree_with_the_first_shard() {
        let s = tiny();
        let plan = crate::plan::plan(&s, TINY_FILE).unwrap();
        let mut list = shards(&s, 2);
        list[1].1.samples = 50;
        // Checked before anything else, so the file with another count is named.
        list[1].1.scenario_hash = "other".into();
        let e = check_partials(&s, &plan, &mut list).unwrap_err();
        assert_eq!(
            e.to_string(),
            "shard-2/partial.json: has 50 samples per side, the first shard has 100"
        );
    }

    #[test]
    fn a_foreign_shard_is_named_with_its_scenario() {
        let s = tiny();
        let plan = crate::plan::plan(&s, TINY_FILE).unwrap();
        let mut list = shards(&s, 2);
        list[1].1.scenario_hash = "other".into();
        assert_eq!(
            check_partials(&s, &plan, &mut list),
            Err(MergeError::Foreign {
                file: "shard-2/partial.json".into(),
                name: "tiny".into(),
                found: "other".into(),
                expected: s.hash.clone(),
            })
        );
        list[1].1.motley_version = "0.0.0".into();
        assert!(matches!(
            check_partials(&s, &plan, &mut list),
            Err(MergeError::Version { found, .. }) if found == "0.0.0"
        ));
    }
}
