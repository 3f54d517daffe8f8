//! `motley run`: validate, run (with checkpoints), and write the report or the shard's partial.

use std::path::{Path, PathBuf};
use std::sync::atomic::AtomicU64;
use std::sync::Arc;

use motley_report::{
    abandon_staging, check_destination, files, probe_destination, write_file_atomic,
    write_folder_atomic, write_report, Picture, ReportError, ReportExtras,
};
use motley_scenario::finish::finish;
use motley_scenario::plan::{plan, Plan};
use motley_scenario::run::{advance, Partial, Shard, Workers};
use motley_scenario::sequential::{freeze_settled, next_look};
use motley_scenario::Scenario;

use crate::cli::RunArgs;
use crate::exit::Failure;
use crate::input::{check_memory, load, long_run, threads, Loaded};
use crate::progress::Progress;
use crate::stopping::{Stops, Waited};

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

fn read_checkpoint(
    path: &Path,
    s: &Scenario,
    plan: &Plan,
    shard: Shard,
) -> Result<Partial, Failure> {
    let shown = path.display();
    let text = std::fs::read_to_string(path).map_err(|e| {
        Failure::BadInput(format!(
            "cannot resume: no readable checkpoint at {shown} ({e})"
        ))
    })?;
    let mut p = Partial::from_json(&text).map_err(|why| {
        Failure::BadInput(format!(
            "cannot resume: checkpoint {shown} {why}; delete it to start over"
        ))
    })?;
    p.check_resume(s, plan, shard).map_err(|why| {
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
        say!("{:<24} {}", c.id, c.verdict);
        if c.rejected {
            rejected.push(c.id.clone());
        }
    }
    say!("report: {}", dir.display());
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
        let cost = motley_scenario::cost::estimate(&slice, &p, threads);
        check_memory(&loaded.file, cost.bytes, a.memory_limit.as_deref())?;
        if let (false, Some(why)) = (a.yes, long_run(cost.seconds, threads)) {
            return Err(Failure::BadInput(format!("{}: {why}", loaded.file)));
        }
    }
    if !(a.checkpoint_every.is_finite() && a.checkpoint_every >= 0.0) {
        return Err(Failure::BadInput(format!(
            "--checkpoint-every must be a number of seconds ≥ 0, got {}",
            a.checkpoint_every
        )));
    }
    if !(a.log_every.is_finite() && a.log_every > 0.0) {
        return Err(Failure::BadInput(format!(
            "--log-every must be a number of seconds > 0, got {}",
            a.log_every
        )));
    }
    let out = a.out.clone().unwrap_or_else(|| {
        // Shards go beside the report, never inside it: the merged report is written there.
        let reports = PathBuf::from("reports");
        match shard {
            Some(sh) => reports.join(format!("{}-shard-{}-of-{}", s.name, sh.index, sh.count)),
            None => reports.join(&s.name),
        }
    });
    // The folder writer refuses an existing folder without --overwrite, and keeps one that is not
    // ours even with it; say so before the run rather than after it.
    let marker = match shard {
        Some(_) => PARTIAL_FILE,
        None => files::RESULT,
    };
    // A folder that cannot be written is found now, not after hours of sampling.
    let unwritable = |e: ReportError| match e {
        ReportError::Io { .. } => Failure::BadInput(format!(
            "cannot write the output: {e}; choose another --out"
        )),
        other => report_failure(other),
    };
    check_destination(&out, marker, a.overwrite).map_err(unwritable)?;
    probe_destination(&out).map_err(unwritable)?;
    let shard_used = shard.unwrap_or(Shard::WHOLE);
    let cp = checkpoint_path(&out);
    let mut partial = if a.resume {
        read_checkpoint(&cp, s, &p, shard_used)?
    } else {
        if cp.exists() {
            return Err(Failure::BadInput(format!(
                "a checkpoint of an interrupted run exists at {}; pass --resume to continue it, or delete it to start over",
                cp.display()
            )));
        }
        Partial::empty(s, &p, shard_used)
    };

    let stops = Stops::install(a.checkpoint_every)?;
    let (start, end) = shard_used.range(s.samples);
    let counter = Arc::new(AtomicU64::new(partial.done - start));
    let bar = Progress::start(counter.clone(), end - start, a.quiet, a.log_every);
    let workers = Workers::new(threads).map_err(|e| Failure::Runtime(e.to_string()))?;
    // Planned looks are taken by a single process; a shard runs its slice of one look's samples.
    let looks = shard.is_none() && s.looks.is_some();
    loop {
        if looks && partial.done == next_look(s, partial.done) && partial.done < end {
            let at_look = finish(s, &p, std::slice::from_ref(&partial), GIT_COMMIT);
            if freeze_settled(&mut partial, &at_look) {
                break;
            }
        }
        let before = partial.done;
        let budget = looks.then(|| next_look(s, partial.done + 1) - partial.done);
        let complete = advance(s, &p, &mut partial, &workers, &counter, &stops.stop, budget)
            .map_err(|e| Failure::Runtime(e.to_string()))?;
        if complete {
            break;
        }
        if stops.interrupted() {
            drop(bar);
            return Err(interrupted(&cp, &partial, start, end, "sampling"));
        }
        if stops.take_due() {
            // A checkpoint that cannot be written loses nothing yet: say so and go on.
            if let Err(e) = write_file_atomic(&cp, partial.to_json().as_bytes()) {
                eprintln!("motley: warning: checkpoint not written ({e}); the run goes on");
            }
        } else if partial.done == before {
            return Err(Failure::Runtime(format!(
                "the run made no progress at sample {} of {}; this is a bug",
                partial.done - start,
                end - start
            )));
        }
    }
    drop(bar);
    // The report phase (exact laws, statistics, figures, writing) runs on its own thread, so that
    // a signal is honoured at once here: the complete partial becomes the checkpoint, and the
    // staging folder is deleted.
    let partial = Arc::new(partial);
    let work = {
        let (loaded, partial, out) = (loaded.clone(), partial.clone(), out.clone());
        let (overwrite, fail_on_reject) = (a.overwrite, a.fail_on_reject);
        move || finish_output(&loaded, &partial, shard, &out, overwrite, fail_on_reject)
    };
    let outcome = match stops.wait_for(work) {
        Waited::Done(r) => r,
        Waited::Interrupted(rx) => {
            if abandon_staging() == 0 {
                return Err(interrupted(&cp, &partial, start, end, "the report phase"));
            }
            // The output was complete before the signal: the rest is printing.
            rx.recv()
                .unwrap_or_else(|_| Err(Failure::Runtime("the report phase failed".into())))
        }
    };
    outcome?;
    let _ = std::fs::remove_file(&cp);
    Ok(())
}

/// Writes the checkpoint of an interrupted run and the failure that ends it (exit 130).
fn interrupted(cp: &Path, partial: &Partial, start: u64, end: u64, phase: &str) -> Failure {
    if let Err(e) = write_file_atomic(cp, partial.to_json().as_bytes()) {
        return Failure::Runtime(format!(
            "interrupted during {phase}, and the checkpoint could not be written: {e}"
        ));
    }
    Failure::Interrupted(format!(
        "interrupted during {phase} after {} of {} samples; checkpoint written to {}; continue with the same command and --resume",
        partial.done - start,
        end - start,
        cp.display()
    ))
}

/// The last phase of a run: the report of a whole run, or the partial of a shard.
fn finish_output(
    loaded: &Loaded,
    partial: &Partial,
    shard: Option<Shard>,
    out: &Path,
    overwrite: bool,
    fail_on_reject: bool,
) -> Result<(), Failure> {
    match shard {
        Some(sh) => {
            let json = partial.to_json();
            write_folder_atomic(
                out,
                &[
                    (PARTIAL_FILE, json.as_bytes()),
                    (SCENARIO_FILE, loaded.text.as_bytes()),
                ],
                PARTIAL_FILE,
                overwrite,
            )
            .map_err(report_failure)?;
            let (start, end) = sh.range(partial.samples);
            say!(
                "shard {}/{}: {} samples per unit written to {}",
                sh.index,
                sh.count,
                end - start,
                out.display()
            );
            Ok(())
        }
        None => report(
            loaded,
            std::slice::from_ref(partial),
            out,
            overwrite,
            fail_on_reject,
        ),
    }
}
