//! Whether a partial result (a shard's output or a checkpoint) may be used: its digest (a file
//! altered or damaged after it was written is refused), its format, the motley version that wrote
//! it, its scenario, its shard, and its slots, matched by name against the plan, each of the
//! slot's kind and holding exactly the samples the partial says are done. Merging
//! ([`check_partials`](crate::finish::check_partials)) and resuming both ask here.
//!
//! Nothing inconsistent is ever merged: a partial that passes these checks adds exactly its
//! `done` samples to every slot.

use crate::plan::Plan;
use crate::run::{Partial, Shard, PARTIAL_SCHEMA};
use crate::scenario::Scenario;

/// Why a partial result was not written for this scenario by this motley.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum Mismatch {
    /// Not a partial result of this format.
    #[error("has schema `{found}`, expected `{PARTIAL_SCHEMA}`")]
    Schema {
        /// Schema found.
        found: String,
    },
    /// Written by another motley version.
    #[error("was written by motley {found}, this is {}", crate::VERSION)]
    Version {
        /// Version found.
        found: String,
    },
    /// From another scenario (or another version of the file).
    #[error("belongs to another scenario (hash {found}, this file has {expected})")]
    Scenario {
        /// Its scenario name.
        name: String,
        /// Its hash.
        found: String,
        /// The scenario's hash.
        expected: String,
    },
}

/// Why a partial result cannot be used.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum PartialError {
    /// Not JSON of a partial result.
    #[error("is corrupt ({0})")]
    Corrupt(String),
    /// The digest does not match the content.
    #[error(
        "has been altered or damaged since it was written (its digest does not match its content)"
    )]
    Digest,
    /// Not written for this scenario by this motley.
    #[error(transparent)]
    Origin(#[from] Mismatch),
    /// A shard number outside its count.
    #[error("names shard {index}/{count}, which does not exist")]
    BadShard {
        /// Its shard number.
        index: u64,
        /// Its shard count.
        count: u64,
    },
    /// More samples done than its shard holds, or fewer than none.
    #[error(
        "says samples up to index {done} are done, but its shard holds indices {start} to {end}"
    )]
    Done {
        /// Its `done`.
        done: u64,
        /// First index of its shard.
        start: u64,
        /// End of its shard.
        end: u64,
    },
    /// Written for another shard or sample count (resuming only).
    #[error(
        "is for shard {}/{} with {found_samples} samples, this run is shard {}/{} with {samples}",
        found.index, found.count, shard.index, shard.count
    )]
    Shard {
        /// Its shard.
        found: Shard,
        /// Its samples per side.
        found_samples: u64,
        /// The run's shard.
        shard: Shard,
        /// The run's samples per side.
        samples: u64,
    },
    /// A slot of the plan is missing.
    #[error("lacks the values of `{0}`")]
    MissingSlot(String),
    /// A slot the plan does not have.
    #[error("holds values of `{0}`, which this run does not collect")]
    UnknownSlot(String),
    /// A slot given twice.
    #[error("holds the values of `{0}` twice")]
    DuplicateSlot(String),
    /// A slot of the wrong kind or count.
    #[error("slot `{name}` {why}")]
    Slot {
        /// The slot's name.
        name: String,
        /// What is wrong with it.
        why: String,
    },
}

impl Partial {
    /// Reads a partial result from the text of its file and checks its digest.
    ///
    /// # Errors
    /// [`PartialError::Corrupt`] if it is not a partial result, [`PartialError::Digest`] if its
    /// content does not match its digest.
    pub fn from_json(text: &str) -> Result<Partial, PartialError> {
        let p: Partial =
            serde_json::from_str(text).map_err(|e| PartialError::Corrupt(e.to_string()))?;
        if p.digest != p.content_digest() {
            return Err(PartialError::Digest);
        }
        Ok(p)
    }

    /// Checks that this partial has the current schema and version and belongs to scenario `s`.
    ///
    /// # Errors
    /// The first [`Mismatch`] found, in the order schema, version, scenario.
    pub fn check_origin(&self, s: &Scenario) -> Result<(), Mismatch> {
        if self.schema != PARTIAL_SCHEMA {
            return Err(Mismatch::Schema {
                found: self.schema.clone(),
            });
        }
        if self.motley_version != crate::VERSION {
            return Err(Mismatch::Version {
                found: self.motley_version.clone(),
            });
        }
        if self.scenario_hash != s.hash {
            return Err(Mismatch::Scenario {
                name: self.scenario.clone(),
                found: self.scenario_hash.clone(),
                expected: s.hash.clone(),
            });
        }
        Ok(())
    }

    /// Checks this partial against the plan of its scenario: a real shard, `done` within it, and
    /// exactly the plan's slots (matched by name, then put in the plan's order), each of its
    /// slot's kind and holding exactly the done samples.
    ///
    /// # Errors
    /// The first [`PartialError`] found.
    pub fn check_plan(&mut self, s: &Scenario, plan: &Plan) -> Result<(), PartialError> {
        let sh = self.shard;
        if sh.count == 0 || sh.index == 0 || sh.index > sh.count {
            return Err(PartialError::BadShard {
                index: sh.index,
                count: sh.count,
            });
        }
        let (start, end) = sh.range(self.samples);
        if self.done < start || self.done > end {
            return Err(PartialError::Done {
                done: self.done,
                start,
                end,
            });
        }
        let mut given: Vec<Option<(String, crate::accumulate::Accumulator)>> =
            std::mem::take(&mut self.slots)
                .into_iter()
                .map(Some)
                .collect();
        for (k, slot) in given.iter().enumerate() {
            let Some((name, _)) = slot else { continue };
            if given[..k].iter().flatten().any(|(n, _)| n == name) {
                return Err(PartialError::DuplicateSlot(name.clone()));
            }
        }
        let mut ordered = Vec::with_capacity(plan.slots.len());
        for sl in &plan.slots {
            let name = sl.name(s);
            let found = given
                .iter_mut()
                .find(|g| g.as_ref().is_some_and(|(n, _)| *n == name))
                .and_then(Option::take)
                .ok_or_else(|| PartialError::MissingSlot(name.clone()))?;
            found
                .1
                .check_shape(&sl.accumulator(s), self.done - start)
                .map_err(|why| PartialError::Slot {
                    name: name.clone(),
                    why,
                })?;
            ordered.push(found);
        }
        if let Some((name, _)) = given.into_iter().flatten().next() {
            return Err(PartialError::UnknownSlot(name));
        }
        self.slots = ordered;
        Ok(())
    }

    /// Checks that a run of `shard` of `s` can continue from this partial: [`Partial::check_origin`],
    /// the same shard and sample count, and [`Partial::check_plan`].
    ///
    /// # Errors
    /// The first [`PartialError`] found.
    pub fn check_resume(
        &mut self,
        s: &Scenario,
        plan: &Plan,
        shard: Shard,
    ) -> Result<(), PartialError> {
        self.check_origin(s)?;
        if self.shard != shard || self.samples != s.samples {
            return Err(PartialError::Shard {
                found: self.shard,
                found_samples: self.samples,
                shard,
                samples: s.samples,
            });
        }
        self.check_plan(s, plan)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::accumulate::Accumulator;
    use crate::fixtures::{tiny, tiny_sampled, TINY_FILE};

    fn plan_of(s: &Scenario) -> Plan {
        crate::plan::plan(s, TINY_FILE).unwrap()
    }

    fn partial(s: &Scenario, shard: Shard) -> Partial {
        Partial::empty(s, &plan_of(s), shard)
    }

    /// A partial of `tiny` with its first `n` samples run.
    fn run_partial(s: &Scenario, n: u64) -> Partial {
        let plan = plan_of(s);
        let mut p = Partial::empty(s, &plan, Shard::WHOLE);
        let w = crate::run::Workers::new(2).unwrap();
        let (progress, stop) = (Default::default(), Default::default());
        crate::run::advance(s, &plan, &mut p, &w, &progress, &stop, Some(n)).unwrap();
        p
    }

    /// `p` written and read back.
    fn reread(p: &Partial) -> Result<Partial, PartialError> {
        Partial::from_json(&p.to_json())
    }

    #[test]
    fn own_partial_belongs_and_resumes() {
        let s = tiny_sampled();
        let mut p = reread(&run_partial(&s, 40)).unwrap();
        assert_eq!(p.check_origin(&s), Ok(()));
        assert_eq!(p.check_resume(&s, &plan_of(&s), Shard::WHOLE), Ok(()));
        let mut again = run_partial(&s, 40);
        again.wall_seconds = p.wall_seconds;
        assert_eq!(p.slots, again.slots);
        assert_eq!(p.slots.len(), 2);
    }

    #[test]
    fn an_edit_is_caught_by_the_digest() {
        let s = tiny_sampled();
        let p = run_partial(&s, 40);
        let text = p.to_json().replacen("\"done\": 40", "\"done\": 41", 1);
        assert_eq!(Partial::from_json(&text), Err(PartialError::Digest));
        assert!(matches!(
            Partial::from_json("{ not json"),
            Err(PartialError::Corrupt(_))
        ));
    }

    #[test]
    fn slots_are_matched_by_name_and_checked_against_done() {
        let s = tiny_sampled();
        let plan = plan_of(&s);
        let p = run_partial(&s, 40);
        // Swapped slots are put back in the plan's order.
        let mut swapped = p.clone();
        swapped.slots.reverse();
        let mut q = reread(&swapped).unwrap();
        assert_eq!(q.check_plan(&s, &plan), Ok(()));
        assert_eq!(q.slots, p.slots);
        // No slots at all, an unknown slot, a slot twice.
        let mut none = p.clone();
        none.slots.clear();
        assert!(matches!(
            none.check_plan(&s, &plan),
            Err(PartialError::MissingSlot(_))
        ));
        let mut extra = p.clone();
        extra.slots.push(("ghost".into(), Accumulator::pairs()));
        assert_eq!(
            extra.check_plan(&s, &plan),
            Err(PartialError::UnknownSlot("ghost".into()))
        );
        let mut twice = p.clone();
        twice.slots.push(p.slots[0].clone());
        assert!(matches!(
            twice.check_plan(&s, &plan),
            Err(PartialError::DuplicateSlot(_))
        ));
        // Counts must equal the samples done: a changed `done` or emptied counts are refused.
        let mut more = p.clone();
        more.done = 60;
        let e = more.check_plan(&s, &plan).unwrap_err();
        assert!(
            e.to_string()
                .contains("holds 40 samples where 60 were done"),
            "{e}"
        );
        let mut emptied = p.clone();
        emptied.slots[0].1 = plan.slots[0].accumulator(&s);
        assert!(matches!(
            emptied.check_plan(&s, &plan),
            Err(PartialError::Slot { .. })
        ));
        // More samples done than the shard holds (once made `--resume` spin).
        let mut beyond = p.clone();
        beyond.done = 1000;
        assert_eq!(
            beyond.check_plan(&s, &plan),
            Err(PartialError::Done {
                done: 1000,
                start: 0,
                end: 100
            })
        );
        let mut bad_shard = p;
        bad_shard.shard = Shard { index: 3, count: 2 };
        assert!(matches!(
            bad_shard.check_plan(&s, &plan),
            Err(PartialError::BadShard { .. })
        ));
    }

    #[test]
    fn schema_is_checked_before_version() {
        let s = tiny();
        let mut p = partial(&s, Shard::WHOLE);
        p.schema = "motley-partial/0".into();
        p.motley_version = "0.0.0".into();
        let e = p.check_origin(&s).unwrap_err();
        assert_eq!(
            e.to_string(),
            "has schema `motley-partial/0`, expected `motley-partial/2`"
        );
        p.schema = PARTIAL_SCHEMA.into();
        assert_eq!(
            p.check_resume(&s, &plan_of(&s), Shard::WHOLE),
            Err(PartialError::Origin(Mismatch::Version {
                found: "0.0.0".into()
            }))
        );
    }

    #[test]
    fn foreign_scenario_is_named() {
        let s = tiny();
        let mut p = partial(&s, Shard::WHOLE);
        p.scenario_hash = "abc".into();
        let e = p.check_origin(&s).unwrap_err();
        assert!(matches!(&e, Mismatch::Scenario { name, .. } if name == "tiny"));
        assert!(e
            .to_string()
            .starts_with("belongs to another scenario (hash abc,"));
    }

    #[test]
    fn another_shard_or_sample_count_cannot_resume() {
        let s = tiny();
        let half = Shard { index: 1, count: 2 };
        let mut p = partial(&s, half);
        assert_eq!(p.check_origin(&s), Ok(()));
        assert_eq!(
            p.check_resume(&s, &plan_of(&s), Shard::WHOLE)
                .unwrap_err()
                .to_string(),
            "is for shard 1/2 with 100 samples, this run is shard 1/1 with 100"
        );
        let mut more = s.clone();
        more.samples = 200;
        assert!(matches!(
            p.check_resume(&more, &plan_of(&s), half),
            Err(PartialError::Shard {
                found_samples: 100,
                samples: 200,
                ..
            })
        ));
    }
}
