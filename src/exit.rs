//! Failures of the command and their exit codes.
//!
//! | code | meaning |
//! |---|---|
//! | 0 | done (whatever the verdicts) |
//! | 1 | the run failed (I/O error, engine error) |
//! | 2 | bad input: scenario, arguments, existing output folder, refused merge or checkpoint |
//! | 3 | `--fail-on-reject` was given and a claim was rejected |
//! | 130 | interrupted; a checkpoint was written and `--resume` continues |

/// Why the command stopped.
#[derive(Debug)]
pub enum Failure {
    /// Exit 2.
    BadInput(String),
    /// Exit 1.
    Runtime(String),
    /// Exit 3.
    Rejected(String),
    /// Exit 130.
    Interrupted(String),
}

impl Failure {
    /// The message printed after `motley: `.
    pub fn message(&self) -> &str {
        match self {
            Failure::BadInput(m)
            | Failure::Runtime(m)
            | Failure::Rejected(m)
            | Failure::Interrupted(m) => m,
        }
    }

    /// The exit code.
    pub fn code(&self) -> i32 {
        match self {
            Failure::BadInput(_) => 2,
            Failure::Runtime(_) => 1,
            Failure::Rejected(_) => 3,
            Failure::Interrupted(_) => 130,
        }
    }
}
