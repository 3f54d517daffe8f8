//! Command-line arguments.

use std::path::PathBuf;

use clap::{Args, Parser, Subcommand};

/// Colored interacting particle systems: exact laws, Monte Carlo and sound statistics from YAML
/// scenarios.
#[derive(Debug, Parser)]
#[command(name = "motley", version, about, long_about = None)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The commands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Run a scenario into a report folder (or, with --shard, into a partial result).
    Run(RunArgs),
    /// Validate a scenario and estimate its time and memory, without running it.
    Check(CheckArgs),
    /// Merge the partial results of all shards of a run into one report.
    Merge(MergeArgs),
    /// List, show or copy out the built-in example scenarios.
    Examples(ExamplesArgs),
}

/// Where the scenario comes from.
#[derive(Debug, Args)]
pub struct Source {
    /// The scenario file.
    #[arg(required_unless_present = "example", conflicts_with = "example")]
    pub file: Option<PathBuf>,
    /// A built-in example by name (see `motley examples list`).
    #[arg(long, value_name = "NAME")]
    pub example: Option<String>,
}

/// `motley run`.
#[derive(Debug, Args)]
pub struct RunArgs {
    /// The scenario.
    #[command(flatten)]
    pub source: Source,
    /// Report folder (default: reports/<scenario name>, or reports/<name>-shard-K-of-N with --shard).
    #[arg(long, value_name = "DIR")]
    pub out: Option<PathBuf>,
    /// Worker threads (default: all cores). Results do not depend on it.
    #[arg(long, value_name = "N")]
    pub threads: Option<usize>,
    /// Run shard K of N: a disjoint slice of the samples, merged later by `motley merge`.
    #[arg(long, value_name = "K/N")]
    pub shard: Option<String>,
    /// Override the scenario's sample count (e.g. for a quick look); recorded in the result.
    #[arg(long, value_name = "N")]
    pub samples: Option<u64>,
    /// Refuse when the estimated peak memory exceeds SIZE (e.g. `512M`, `4G`; `none`: no limit).
    /// Default: the job's allowance (cgroup memory limit, else Slurm's SLURM_MEM_PER_NODE or
    /// SLURM_MEM_PER_CPU) or the machine's available memory (MemAvailable), whichever is smaller.
    #[arg(long, value_name = "SIZE")]
    pub memory_limit: Option<String>,
    /// Replace the report folder if it exists and motley wrote it (nothing added since).
    #[arg(long)]
    pub overwrite: bool,
    /// Continue from the checkpoint of an interrupted run.
    #[arg(long)]
    pub resume: bool,
    /// Seconds between checkpoints (0: only when interrupted).
    #[arg(long, value_name = "SECONDS", default_value_t = 60.0)]
    pub checkpoint_every: f64,
    /// Exit with code 3 when a claim is rejected.
    #[arg(long)]
    pub fail_on_reject: bool,
    /// No progress bar.
    #[arg(long)]
    pub quiet: bool,
    /// Start a run even when its estimated time exceeds 24 hours (without it such a run is refused).
    #[arg(long)]
    pub yes: bool,
    /// Seconds between progress lines when stderr is not a terminal (a batch job's log).
    #[arg(long, value_name = "SECONDS", default_value_t = 60.0)]
    pub log_every: f64,
}

/// `motley check`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// The scenario.
    #[command(flatten)]
    pub source: Source,
    /// Threads to estimate for (default: all cores).
    #[arg(long, value_name = "N")]
    pub threads: Option<usize>,
    /// Override the sample count, as `motley run --samples` would.
    #[arg(long, value_name = "N")]
    pub samples: Option<u64>,
    /// Print the validation and the estimate as JSON (for scripts).
    #[arg(long)]
    pub json: bool,
    /// Refuse when the estimated peak memory exceeds SIZE (e.g. `512M`, `4G`; `none`: no limit).
    /// Default: the job's allowance (cgroup memory limit, else Slurm's SLURM_MEM_PER_NODE or
    /// SLURM_MEM_PER_CPU) or the machine's available memory (MemAvailable), whichever is smaller.
    #[arg(long, value_name = "SIZE")]
    pub memory_limit: Option<String>,
}

/// `motley merge`.
#[derive(Debug, Args)]
pub struct MergeArgs {
    /// Shard folders written by `motley run --shard K/N`.
    #[arg(required = true, value_name = "DIR")]
    pub shards: Vec<PathBuf>,
    /// Report folder for the merged result.
    #[arg(long, value_name = "DIR")]
    pub out: PathBuf,
    /// Replace the report folder if it exists.
    #[arg(long)]
    pub overwrite: bool,
}

/// `motley examples`.
#[derive(Debug, Args)]
pub struct ExamplesArgs {
    /// What to do with the examples.
    #[command(subcommand)]
    pub action: Option<ExamplesAction>,
}

/// `motley examples …`.
#[derive(Debug, Subcommand)]
pub enum ExamplesAction {
    /// List the built-in examples with their titles.
    List,
    /// Print one example scenario.
    Show {
        /// Example name.
        name: String,
    },
    /// Copy one example (or `all`) into a folder, to edit and run.
    Copy {
        /// Example name, or `all`.
        name: String,
        /// Destination folder.
        #[arg(default_value = ".")]
        to: PathBuf,
    },
}
