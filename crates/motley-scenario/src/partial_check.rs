//! Whether a partial result (a shard's output or a checkpoint) belongs to a run of a scenario: its
//! format, the motley version that wrote it, its scenario and, to resume from it, its shard and sample
//! count. Merging ([`check_partials`](crate::finish::check_partials)) and resuming both ask here.

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

/// Why a run cannot resume from a partial result.
#[derive(Debug, Clone, PartialEq, Eq, thiserror::Error)]
pub enum ResumeMismatch {
    /// Not written for this scenario by this motley.
    #[error(transparent)]
    Origin(#[from] Mismatch),
    /// Written for another shard or sample count.
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
}

impl Partial {
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

    /// Checks that a run of `shard` of `s` can continue from this partial: [`Partial::check_origin`],
    /// and the same shard and sample count.
    ///
    /// # Errors
    /// The first [`ResumeMismatch`] found.
    pub fn check_resume(&self, s: &Scenario, shard: Shard) -> Result<(), ResumeMismatch> {
        self.check_origin(s)?;
        if self.shard != shard || self.samples != s.samples {
            return Err(ResumeMismatch::Shard {
                found: self.shard,
                found_samples: self.samples,
                shard,
                samples: s.samples,
            });
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fixtures::{tiny, TINY_FILE};

    fn partial(s: &Scenario, shard: Shard) -> Partial {
        let plan = crate::plan::plan(s, TINY_FILE).unwrap();
        Partial::empty(s, &plan, shard)
    }

    #[test]
    fn own_partial_belongs_and_resumes() {
        let s = tiny();
        let p = partial(&s, Shard::WHOLE);
        assert_eq!(p.check_origin(&s), Ok(()));
        assert_eq!(p.check_resume(&s, Shard::WHOLE), Ok(()));
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
            "has schema `motley-partial/0`, expected `motley-partial/1`"
        );
        p.schema = PARTIAL_SCHEMA.into();
        assert_eq!(
            p.check_resume(&s, Shard::WHOLE),
            Err(ResumeMismatch::Origin(Mismatch::Version {
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
        let p = partial(&s, half);
        assert_eq!(p.check_origin(&s), Ok(()));
        assert_eq!(
            p.check_resume(&s, Shard::WHOLE).unwrap_err().to_string(),
            "is for shard 1/2 with 100 samples, this run is shard 1/1 with 100"
        );
        let mut more = s.clone();
        more.samples = 200;
        assert!(matches!(
            p.check_resume(&more, half),
            Err(ResumeMismatch::Shard {
                found_samples: 100,
                samples: 200,
                ..
            })
        ));
    }
}
