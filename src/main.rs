//! The `motley` command: scenario in, report out. Glue only: arguments, loading, running, printing
//! errors with documented exit codes (see `exit.rs`).

/// `println!` that ignores a closed standard output (`motley run … | head -1`): whatever was to be
/// written to files is written, and a reader that stopped reading is no error (and no panic).
macro_rules! say {
    ($($t:tt)*) => {{
        use std::io::Write as _;
        let _ = writeln!(std::io::stdout().lock(), $($t)*);
    }};
}

mod check_cmd;
mod cli;
mod examples;
mod exit;
mod input;
mod merge_cmd;
mod progress;
mod run_cmd;
mod stopping;

use clap::Parser;

fn main() {
    let args = cli::Cli::parse();
    let outcome = match args.command {
        cli::Command::Run(a) => run_cmd::run(a),
        cli::Command::Check(a) => check_cmd::check(a),
        cli::Command::Merge(a) => merge_cmd::merge(a),
        cli::Command::Examples(a) => examples::command(a),
    };
    if let Err(f) = outcome {
        eprintln!("motley: {}", f.message());
        std::process::exit(f.code());
    }
}
