//! Reading a scenario (file or built-in example) into a validated scenario.

use std::io::Read;

use motley_scenario::validate::MAX_SAMPLES;
use motley_scenario::Scenario;

/// The largest scenario file read, in bytes (a scenario with a large `table` law is a few hundred
/// KiB); a larger file, or an endless one such as /dev/zero, is refused at once.
pub const MAX_SCENARIO_BYTES: u64 = 8 << 20;

use crate::cli::Source;
use crate::exit::Failure;

/// A loaded scenario with its text and the name used in messages.
#[derive(Clone)]
pub struct Loaded {
    /// The validated scenario.
    pub scenario: Scenario,
    /// Its text.
    pub text: String,
    /// File name (or `example:NAME`).
    pub file: String,
}

/// Loads `text`, named `file` in messages; `samples` overrides the sample count.
pub fn load_text(text: String, file: String, samples: Option<u64>) -> Result<Loaded, Failure> {
    let mut scenario =
        motley_scenario::load_str(&text, &file).map_err(|e| Failure::BadInput(e.to_string()))?;
    if let Some(n) = samples {
        if n == 0 || n > MAX_SAMPLES {
            return Err(Failure::BadInput(format!(
                "--samples must be an integer in [1, 2^40] (the limit of `samples` in a scenario), got {n}"
            )));
        }
        if let Some(looks) = &scenario.looks {
            if !looks.contains(&n) {
                let list: Vec<String> = looks.iter().map(|l| l.to_string()).collect();
                return Err(Failure::BadInput(format!(
                    "{file}: the scenario plans looks at {} samples per side; --samples must be one of them (one look at a time), got {n}",
                    list.join(", ")
                )));
            }
        }
        scenario.samples = n;
    }
    Ok(Loaded {
        scenario,
        text,
        file,
    })
}

/// Loads the scenario named by `source`.
pub fn load(source: &Source, samples: Option<u64>) -> Result<Loaded, Failure> {
    let (text, file) = match (&source.file, &source.example) {
        (_, Some(name)) => (
            crate::examples::find(name)?.to_string(),
            format!("example:{name}"),
        ),
        (Some(path), None) => {
            let file = path.display().to_string();
            let cannot = |e: std::io::Error| {
                Failure::BadInput(format!("{file}: cannot read the scenario: {e}"))
            };
            let mut bytes = Vec::new();
            std::fs::File::open(path)
                .and_then(|f| f.take(MAX_SCENARIO_BYTES + 1).read_to_end(&mut bytes))
                .map_err(cannot)?;
            if bytes.len() as u64 > MAX_SCENARIO_BYTES {
                return Err(Failure::BadInput(format!(
                    "{file}: larger than {} MiB, the limit of a scenario file",
                    MAX_SCENARIO_BYTES >> 20
                )));
            }
            let text = String::from_utf8(bytes).map_err(|_| {
                Failure::BadInput(format!(
                    "{file}: not a text file (invalid UTF-8); a scenario is a YAML file"
                ))
            })?;
            (text, file)
        }
        (None, None) => {
            return Err(Failure::BadInput(
                "give a scenario file or --example NAME".into(),
            ))
        }
    };
    load_text(text, file, samples)
}

/// Number of worker threads: as asked, or every core.
pub fn threads(asked: Option<usize>) -> Result<usize, Failure> {
    match asked {
        Some(0) => Err(Failure::BadInput("--threads must be at least 1".into())),
        Some(n) if n > 1024 => Err(Failure::BadInput(format!(
            "--threads must be at most 1024, got {n}"
        ))),
        Some(n) => Ok(n),
        None => Ok(std::thread::available_parallelism().map_or(1, |n| n.get())),
    }
}

/// `1536`, `512K`, `512M`, `4G`, `1.5T` (binary multiples; an optional `B` or `iB` may follow):
/// bytes.
pub fn parse_size(text: &str) -> Option<f64> {
    let t = text.trim();
    let t = t
        .strip_suffix("iB")
        .or_else(|| t.strip_suffix('B'))
        .unwrap_or(t);
    let (digits, unit) = match t.char_indices().last() {
        Some((i, c)) if c.is_ascii_alphabetic() => (&t[..i], c.to_ascii_uppercase()),
        _ => (t, ' '),
    };
    let factor = match unit {
        ' ' => 1.0,
        'K' => 1024.0,
        'M' => 1024f64.powi(2),
        'G' => 1024f64.powi(3),
        'T' => 1024f64.powi(4),
        _ => return None,
    };
    let v: f64 = digits.trim().parse().ok()?;
    (v.is_finite() && v > 0.0).then_some(v * factor)
}

/// The machine's available memory in bytes (`MemAvailable` of /proc/meminfo), if known.
fn available_memory() -> Option<f64> {
    let info = std::fs::read_to_string("/proc/meminfo").ok()?;
    let line = info.lines().find(|l| l.starts_with("MemAvailable:"))?;
    let kib: f64 = line.split_whitespace().nth(1)?.parse().ok()?;
    Some(kib * 1024.0)
}

/// A cgroup memory limit file's content in bytes: cgroup v2 `memory.max` (`max` is no limit) or
/// v1 `memory.limit_in_bytes` (a huge number, at or above 2^60, is no limit).
pub fn cgroup_limit(text: &str) -> Option<f64> {
    let v: u64 = text.trim().parse().ok()?;
    (v < 1 << 60).then_some(v as f64)
}

/// The job's memory allowance in bytes, if it has one: the cgroup's limit (what Slurm and
/// containers enforce), else Slurm's `SLURM_MEM_PER_NODE` or `SLURM_MEM_PER_CPU` × `SLURM_CPUS_ON_NODE`
/// (MiB).
fn job_memory() -> Option<(f64, &'static str)> {
    for file in [
        "/sys/fs/cgroup/memory.max",
        "/sys/fs/cgroup/memory/memory.limit_in_bytes",
    ] {
        if let Some(b) = std::fs::read_to_string(file)
            .ok()
            .and_then(|t| cgroup_limit(&t))
        {
            return Some((b, "the cgroup's memory limit"));
        }
    }
    let env = |k: &str| std::env::var(k).ok()?.trim().parse::<f64>().ok();
    let mib = 1024.0 * 1024.0;
    if let Some(m) = env("SLURM_MEM_PER_NODE") {
        return Some((m * mib, "SLURM_MEM_PER_NODE"));
    }
    match (env("SLURM_MEM_PER_CPU"), env("SLURM_CPUS_ON_NODE")) {
        (Some(m), Some(c)) => Some((m * c * mib, "SLURM_MEM_PER_CPU")),
        _ => None,
    }
}

/// The memory limit in bytes and where it comes from: `--memory-limit` if given (`none`: no
/// limit), else the smaller of the job's allowance (cgroup, Slurm) and the available memory, else
/// none.
pub fn memory_limit(asked: Option<&str>) -> Result<Option<(f64, &'static str)>, Failure> {
    match asked {
        Some(t) if t.trim().eq_ignore_ascii_case("none") => Ok(None),
        Some(t) => parse_size(t)
            .map(|b| Some((b, "--memory-limit")))
            .ok_or_else(|| {
                Failure::BadInput(format!(
                    "--memory-limit must be a size like 512M or 4G (or `none`), got \"{t}\""
                ))
            }),
        None => {
            let free = available_memory().map(|b| (b, "available memory"));
            Ok(match (job_memory(), free) {
                (Some(j), Some(f)) => Some(if j.0 < f.0 { j } else { f }),
                (j, f) => j.or(f),
            })
        }
    }
}

/// Refuses a run of `file` whose estimated peak memory `bytes` exceeds the limit.
pub fn check_memory(file: &str, bytes: f64, asked: Option<&str>) -> Result<(), Failure> {
    if let Some((limit, source)) = memory_limit(asked)? {
        if bytes > limit {
            return Err(Failure::BadInput(format!(
                "{file}: the run needs about {} of memory (estimate), more than the limit of {} ({source}); lower samples or sizes, or raise --memory-limit",
                human_bytes(bytes),
                human_bytes(limit)
            )));
        }
    }
    Ok(())
}

/// Estimated time above which `run` asks for `--yes`: a day.
pub const LONG_RUN_SECONDS: f64 = 24.0 * 3600.0;

/// The refusal (without `--yes`) or warning (in `check`) for a run estimated at `seconds` on
/// `threads` threads, if it is above [`LONG_RUN_SECONDS`].
pub fn long_run(seconds: f64, threads: usize) -> Option<String> {
    (seconds > LONG_RUN_SECONDS).then(|| {
        format!(
            "the run is estimated at about {} on {threads} threads, more than {}; pass --yes to start it anyway, or split it into shards (--shard K/N)",
            crate::progress::human_seconds(seconds),
            crate::progress::human_seconds(LONG_RUN_SECONDS)
        )
    })
}

/// Bytes for people: MiB below 1 GiB, then GiB, then TiB.
pub fn human_bytes(b: f64) -> String {
    let mib = b / (1024.0 * 1024.0);
    if mib < 1024.0 {
        format!("{mib:.0} MiB")
    } else if mib < 1024.0 * 1024.0 {
        format!("{:.1} GiB", mib / 1024.0)
    } else {
        format!("{:.1} TiB", mib / (1024.0 * 1024.0))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sizes() {
        assert_eq!(parse_size("1536"), Some(1536.0));
        assert_eq!(parse_size("512M"), Some(512.0 * 1024.0 * 1024.0));
        assert_eq!(parse_size("4G"), Some(4.0 * 1024f64.powi(3)));
        assert_eq!(parse_size("4GiB"), parse_size("4g"));
        assert_eq!(parse_size("1.5K"), Some(1536.0));
        assert_eq!(parse_size("2TB"), Some(2.0 * 1024f64.powi(4)));
        for bad in ["", "G", "4X", "-1G", "0", "nanG", "4 G B"] {
            assert_eq!(parse_size(bad), None, "{bad}");
        }
        assert_eq!(human_bytes(1024f64.powi(3)), "1.0 GiB");
        assert_eq!(human_bytes(3.0 * 1024f64.powi(4)), "3.0 TiB");
    }

    #[test]
    fn cgroup_limits_are_read_and_no_limit_is_none() {
        assert_eq!(cgroup_limit("max\n"), None);
        assert_eq!(cgroup_limit("4294967296\n"), Some(4294967296.0));
        // cgroup v1 writes 2^63 − 4096 rounded to pages for "no limit".
        assert_eq!(cgroup_limit("9223372036854771712"), None);
        assert_eq!(cgroup_limit(""), None);
    }

    #[test]
    fn limit_refuses_above_and_accepts_below() {
        assert!(check_memory("f.yaml", 2e9, Some("1G")).is_err());
        assert!(check_memory("f.yaml", 5e8, Some("1G")).is_ok());
        assert!(check_memory("f.yaml", 1e300, Some("none")).is_ok());
        assert!(matches!(
            check_memory("f.yaml", 1.0, Some("lots")),
            Err(Failure::BadInput(_))
        ));
    }
}
