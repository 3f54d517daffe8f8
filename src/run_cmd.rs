//! `motley run`: validate, run (with checkpoints), and write the report or the shard's partial.

use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicBool, AtomicU64};
use std::sync::Arc;
use std::time::Instant;

use motley_report::{write_json_atomic, write_report, Picture, ReportExtras};
use motley_scenario::finish::finish;
use motley_scenario::plan::plan;
use motley_scenario::run::{advance, Partial, Shard, Workers, PARTIAL_SCHEMA};
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
    let refuse = |why: String| {
        Failure::BadInput(format!(
            "cannot resume: checkpoint {shown} {why}; delete it to start over"
        ))
    };
    if p.schema != PARTIAL_SCHEMA {
        return Err(refuse(format!(
            "has schema `{}`, expected `{PARTIAL_SCHEMA}`",
            p.schema
        )));
    }
    if p.motley_version != motley_scenario::VERSION {
        return Err(refuse(format!(
            "was written by motley {}, this is {}",
            p.motley_version,
            motley_scenario::VERSION
        )));
    }
    if p.scenario_hash != s.hash {
        return Err(refuse(format!(
            "belongs to another scenario (hash {}, this file has {})",
            p.scenario_hash, s.hash
        )));
    }
    if p.shard != shard || p.samples != s.samples {
        return Err(refuse(format!(
            "is for shard {}/{} with {} samples, this run is shard {}/{} with {}",
            p.shard.index, p.shard.count, p.samples, shard.index, shard.count, s.samples
        )));
    }
    Ok(p)
}

/// Writes a folder holding `files` atomically: a staging folder renamed into place.
pub fn write_folder(dir: &Path, files: &[(&str, Vec<u8>)], overwrite: bool) -> Result<(), Failure> {
    let io = |what: &str, p: &Path, e: std::io::Error| {
        Failure::Runtime(format!("could not {what} {}: {e}", p.display()))
    };
    if dir.exists() && !overwrite {
        return Err(Failure::BadInput(format!(
            "folder {} exists; pass --overwrite to replace it",
            dir.display()
        )));
    }
    let parent = dir
        .parent()
        .filter(|p| !p.as_os_str().is_empty())
        .unwrap_or(Path::new("."));
    std::fs::create_dir_all(parent).map_err(|e| io("create", parent, e))?;
    let name = dir
        .file_name()
        .map(|n| n.to_string_lossy().to_string())
        .unwrap_or_default();
    let staging = parent.join(format!(".{name}.partial-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&staging);
    std::fs::create_dir_all(&staging).map_err(|e| io("create", &staging, e))?;
    for (f, bytes) in files {
        let p = staging.join(f);
        std::fs::write(&p, bytes).map_err(|e| io("write", &p, e))?;
    }
    if dir.exists() {
        let old = parent.join(format!(".{name}.old-{}", std::process::id()));
        std::fs::rename(dir, &old).map_err(|e| io("move aside", dir, e))?;
        std::fs::rename(&staging, dir).map_err(|e| io("rename into", dir, e))?;
        let _ = std::fs::remove_dir_all(&old);
    } else {
        std::fs::rename(&staging, dir).map_err(|e| io("rename into", dir, e))?;
    }
    Ok(())
}

/// The report picture of the scenario's first six-vertex model.
pub fn picture(s: &Scenario) -> Option<(Picture, String)> {
    let p = motley_scenario::picture::sample_picture(s)?;
    let caption = format!(
        "One sample (index 0) of model \"{}\", {}×{}",
        p.model, p.width, p.height
    );
    Some((
        Picture {
            width: p.width,
            height: p.height,
            max_color: p.max_color,
            left: p.left,
            bottom: p.bottom,
            right_out: p.right_out,
            up_out: p.up_out,
        },
        caption,
    ))
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
    let dir = write_report(out, &result, &extras, overwrite).map_err(|e| match e {
        motley_report::ReportError::Exists { .. }
        | motley_report::ReportError::NotAReport { .. }
        | motley_report::ReportError::NoFolderName { .. } => Failure::BadInput(e.to_string()),
        other => Failure::Runtime(other.to_string()),
    })?;
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
    if out.exists() && !a.overwrite {
        return Err(Failure::BadInput(format!(
            "report folder {} exists; pass --overwrite to replace it",
            out.display()
        )));
    }
    // The report writer keeps a folder that is not a report even with --overwrite; say so before
    // the run rather than after it.
    let foreign = shard.is_none()
        && out.is_dir()
        && !out.join("result.json").exists()
        && std::fs::read_dir(&out)
            .map(|mut d| d.next().is_some())
            .unwrap_or(true);
    if foreign {
        return Err(Failure::BadInput(
            motley_report::ReportError::NotAReport { path: out.clone() }.to_string(),
        ));
    }
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
    loop {
        let before = partial.done;
        let complete = advance(
            s,
            &p,
            &mut partial,
            &workers,
            &AtomicU64::new(0),
            &stop,
            Some(step),
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
            write_folder(
                &out,
                &[
                    (PARTIAL_FILE, json),
                    (SCENARIO_FILE, loaded.text.clone().into_bytes()),
                ],
                a.overwrite,
            )?;
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
