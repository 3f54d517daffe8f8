//! `motley run`: validate, run (with checkpoints), and write the report or the shard's partial.

use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, AtomicU64};
use std::sync::Arc;
use std::time::Instant;

use motley_report::{
    check_destination, files, write_folder_atomic, write_json_atomic, write_report, Picture,
    ReportError, ReportExtras,
};
use motley_scenario::finish::finish;
use motley_scenario::plan::plan;
use motley_scenario::run::{advance, Partial, Shard, Workers};
use motley_scenario::sequential::{freeze_settled, next_look};
use motley_scenario::Scenario;

use crate::cli::RunArgs;
use crate::exit::Failure;
use crate::input::{check_memory, load, threads, Loaded};
use crate::progress::Progress;

/// The commit this binary was built from.
pub const GIT_COMMIT: &str = env!("MOTLEY_GIT_COMMIT");

/// File names inside a shard folder.
pub const PARTIAL_FILE: &str = "partial.json";
/// The scenario copied beside a partial, so that merge can rebuild the run.
pub const SCENARIO_FILE: &str = "scenario.yaml";

fn parse_shard(text: &str) -> Result<Shard, Failure> {
    let bad = || {
        Failure::BadInput(format!(
            "--shard must look like K/N with 1 ≤ K ≤ N, got \"{text}\""
        ))
    };
    let (k, n) = text.split_once('/').ok_or_else(bad)?;
    let (k, n): (u64, u64) = (
        k.trim().parse().map_err(|_| bad())?,
        n.trim().parse().map_err(|_| bad())?,
    );
    if n == 0 || k == 0 || k > n || n > 1 << 20 {
        return Err(bad());
    }
    Ok(Shard { index: k, count: n })
}

/// `<dir>.checkpoint.json`, beside the output folder.
pub fn checkpoint_path(out: &Path) -> PathBuf {
    let mut name = out
        .file_name()
        .map(|n| n.to_os_string())
        .unwrap_or_default();
    name.push(".checkpoint.json");
    out.with_file_name(name)
}

fn read_checkpoint(path: &Path, s: &Scenario, shard: Shard) -> Result<Partial, Failure> {
    let shown = path.display();
    let text = std::fs::read_to_string(path).map_err(|e| {
        Failure::BadInput(format!(
            "cannot resume: no readable checkpoint at {shown} ({e})"
        ))
    })?;
    let p: Partial = serde_json::from_str(&text).map_err(|e| {
        Failure::BadInput(format!(
            "cannot resume: checkpoint {shown} is corrupt ({e}); delete it to start over"
        ))
    })?;
    p.check_resume(s, shard).map_err(|why| {
        Failure::BadInput(format!(
            "cannot resume: checkpoint {shown} {why}; delete it to start over"
        ))
    })?;
    Ok(p)
}

/// A report writer's error as a failure: a refused destination is the user's input, the rest is
/// the run's.
fn report_failure(e: ReportError) -> Failure {
    match e {
        ReportError::Exists { .. }
        | ReportError::NotAReport { .. }
        | ReportError::NoFolderName { .. } => Failure::BadInput(e.to_string()),
        other => Failure::Runtime(other.to_string()),
    }
}

/// The report picture of the scenario's first six-vertex model.
pub fn picture(s: &Scenario) -> Option<(Picture, String)> {
    let (model, p) = motley_scenario::picture::sample_picture(s)?;
    let caption = format!(
        "One sample (index 0) of model \"{model}\", {}×{}",
        p.width, p.height
    );
    Some((p, caption))
}

/// Writes the final report of complete partials and prints the verdicts.
pub fn report(
    loaded: &Loaded,
    partials: &[Partial],
    out: &Path,
    overwrite: bool,
    fail_on_reject: bool,
) -> Result<(), Failure> {
    let s = &loaded.scenario;
    let p = plan(s, &loaded.file).map_err(|e| Failure::BadInput(e.to_string()))?;
    let result = finish(s, &p, partials, GIT_COMMIT);
    let mut extras = ReportExtras::new(loaded.text.clone(), std::env::args().collect());
    if let Some((pic, caption)) = picture(s) {
        extras = extras.with_picture(pic, caption);
    }
    let dir = write_report(out, &result, &extras, overwrite).map_err(report_failure)?;
    let mut rejected = Vec::new();
    for c in &result.claims {
        println!("{:<24} {}", c.id, c.verdict);
        if c.rejected {
            rejected.push(c.id.clone());
        }
    }
    println!("report: {}", dir.display());
    if fail_on_reject && !rejected.is_empty() {
        return Err(Failure::Rejected(format!(
            "claims rejected: {}",
            rejected.join(", ")
        )));
    }
    Ok(())
}

/// `motley run`.
pub fn run(a: RunArgs) -> Result<(), Failure> {
    let loaded = load(&a.source, a.samples)?;
    let s = &loaded.scenario;
    let p = plan(s, &loaded.file).map_err(|e| Failure::BadInput(e.to_string()))?;
    let threads = threads(a.threads)?;
    let shard = match &a.shard {
        Some(t) => Some(parse_shard(t)?),
        None => None,
    };
    {
        // A shard holds only its slice of the samples.
        let (from, to) = shard.unwrap_or(Shard::WHOLE).range(s.samples);
        let mut slice = s.clone();
        slice.samples = to - from;
        let bytes = motley_scenario::cost::estimate(&slice, &p, threads).bytes;
        check_memory(&loaded.file, bytes, a.memory_limit.as_deref())?;
    }
    if !(a.checkpoint_every.is_finite() && a.checkpoint_every >= 0.0) {
        return Err(Failure::BadInput(format!(
            "--checkpoint-every must be a number of seconds ≥ 0, got {}",
            a.checkpoint_every
        )));
    }
    let out = a.out.clone().unwrap_or_else(|| {
        let base = PathBuf::from("reports").join(&s.name);
        match shard {
            Some(sh) => base.join(format!("shard-{}-of-{}", sh.index, sh.count)),
            None => base,
        }
    });
    // The folder writer refuses an existing folder without --overwrite, and keeps one that is not
    // ours even with it; say so before the run rather than after it.
    let marker = match shard {
        Some(_) => PARTIAL_FILE,
        None => files::RESULT,
    };
    check_destination(&out, marker, a.overwrite).map_err(report_failure)?;
    let shard_used = shard.unwrap_or(Shard::WHOLE);
    let cp = checkpoint_path(&out);
    let mut partial = if a.resume {
        read_checkpoint(&cp, s, shard_used)?
    } else {
        if cp.exists() {
            return Err(Failure::BadInput(format!(
                "a checkpoint of an interrupted run exists at {}; pass --resume to continue it, or delete it to start over",
                cp.display()
            )));
        }
        Partial::empty(s, &p, shard_used)
    };

    let stop = Arc::new(AtomicBool::new(false));
    for sig in [signal_hook::consts::SIGINT, signal_hook::consts::SIGTERM] {
        signal_hook::flag::register(sig, stop.clone())
            .map_err(|e| Failure::Runtime(format!("cannot install the signal handler: {e}")))?;
    }
    let (start, end) = shard_used.range(s.samples);
    let per_unit_done = Arc::new(AtomicU64::new(
        (partial.done - start) * p.units.len() as u64,
    ));
    let total = (end - start) * p.units.len() as u64;
    let counter = Arc::new(AtomicU64::new(0));
    let bar = Progress::start(counter.clone(), total, a.quiet);
    let mut last = Instant::now();
    let step = ((end - start) / 50).max(motley_scenario::run::CHUNK * 8 * threads as u64);
    let workers = Workers::new(threads).map_err(|e| Failure::Runtime(e.to_string()))?;
    // Planned looks are taken by a single process; a shard runs its slice of one look's samples.
    let looks = shard.is_none() && s.looks.is_some();
    loop {
        let mut budget = step;
        if looks {
            let look = next_look(s, partial.done);
            if partial.done == look && look < end {
                let at_look = finish(s, &p, std::slice::from_ref(&partial), GIT_COMMIT);
                if freeze_settled(&mut partial, &at_look) {
                    break;
                }
            }
            budget = budget.min(next_look(s, partial.done + 1) - partial.done);
        }
        let before = partial.done;
        let complete = advance(
            s,
            &p,
            &mut partial,
            &workers,
            &AtomicU64::new(0),
            &stop,
            Some(budget),
        )
        .map_err(|e| Failure::Runtime(e.to_string()))?;
        counter.fetch_add(
            (partial.done - before) * p.units.len() as u64,
            std::sync::atomic::Ordering::Relaxed,
        );
        if complete {
            break;
        }
        if stop.load(std::sync::atomic::Ordering::Relaxed) {
            drop(bar);
            write_json_atomic(&cp, &partial).map_err(|e| Failure::Runtime(e.to_string()))?;
            return Err(Failure::Interrupted(format!(
                "interrupted after {} of {} samples; checkpoint written to {}; continue with the same command and --resume",
                partial.done - start,
                end - start,
                cp.display()
            )));
        }
        if a.checkpoint_every > 0.0 && last.elapsed().as_secs_f64() >= a.checkpoint_every {
            write_json_atomic(&cp, &partial).map_err(|e| Failure::Runtime(e.to_string()))?;
            last = Instant::now();
        }
    }
    drop(bar);
    let _ = per_unit_done;
    match shard {
        Some(sh) => {
            let json =
                serde_json::to_vec_pretty(&partial).map_err(|e| Failure::Runtime(e.to_string()))?;
            write_folder_atomic(
                &out,
                &[
                    (PARTIAL_FILE, json.as_slice()),
                    (SCENARIO_FILE, loaded.text.as_bytes()),
                ],
                PARTIAL_FILE,
                a.overwrite,
            )
            .map_err(report_failure)?;
            println!(
                "shard {}/{}: {} samples per unit written to {}",
                sh.index,
                sh.count,
                end - start,
                out.display()
            );
        }
        None => report(
            &loaded,
            std::slice::from_ref(&partial),
            &out,
            a.overwrite,
            a.fail_on_reject,
        )?,
    }
    let _ = std::fs::remove_file(&cp);
    Ok(())
}
