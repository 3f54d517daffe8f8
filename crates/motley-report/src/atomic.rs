//! Atomic placement on the file system: single files (temp file, fsync, rename) and whole folders
//! (a hidden staging sibling, renamed into place once complete).
//!
//! # Design
//! Everything is written next to its final name, in the same folder, so the last step is a `rename`
//! within one file system, which POSIX makes atomic: a reader (or a later run) sees the old state or the
//! complete new one, never a half-written file or folder. A process killed half-way leaves only a hidden
//! `.{name}.partial-{pid}-{n}` (or `.tmp-`) sibling; names carry the process id and a per-process counter,
//! so a leftover never collides with a later run, and staging sweeps away leftovers of its own folder
//! whose process no longer exists (on Linux, where `/proc` tells).
//!
//! Replacing an existing folder takes two renames: the old folder is moved aside to
//! `.{name}.old-{pid}-{n}`, the new one moved in, then the old one deleted. Between the two renames the
//! final name is briefly absent, never half-written.
//!
//! # What may be replaced
//! Every folder written here holds [`WRITTEN`], a list of the files written into it and the kind of
//! folder (its marker file: `result.json` for a report, `partial.json` for a shard). Only an empty
//! folder, or a folder of the same kind whose files are all on its list, is ever replaced: a folder
//! with a file of someone else's (notes, a shard folder put inside a report) is kept whole, so a
//! mistaken `--out $HOME --overwrite` or `--out thesis --overwrite` deletes nothing.
//!
//! # Interruption
//! Every staging folder of the process is registered while it exists. [`abandon_staging`] (called
//! by the command-line tool when a signal arrives during the report phase) deletes them all and
//! makes every later publication fail with [`ReportError::Abandoned`]; publication and
//! abandonment exclude each other, so either a folder was published whole before the signal, or
//! nothing of it is left.

use std::fs;
use std::io::Write;
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicU64, Ordering};
use std::sync::Mutex;

use serde::Serialize;

use crate::error::ReportError;

/// The file in every folder written here that lists what was written (see the module docs).
pub const WRITTEN: &str = ".motley-written";

/// The content of [`WRITTEN`].
#[derive(Debug, Serialize, serde::Deserialize)]
struct Written {
    /// Always `motley`.
    written_by: String,
    /// The marker file of the folder's kind.
    kind: String,
    /// Every file written, relative to the folder, `/`-separated, sorted.
    files: Vec<String>,
}

/// The files under `dir`, relative, `/`-separated, sorted (folders are not listed, their files are).
fn files_under(dir: &Path) -> Result<Vec<String>, ReportError> {
    let mut out = Vec::new();
    let mut stack = vec![(dir.to_path_buf(), String::new())];
    while let Some((d, prefix)) = stack.pop() {
        for e in fs::read_dir(&d).map_err(|e| ReportError::io("read folder", &d, e))? {
            let e = e.map_err(|e| ReportError::io("read folder", &d, e))?;
            let name = format!("{prefix}{}", e.file_name().to_string_lossy());
            let kind = e
                .file_type()
                .map_err(|err| ReportError::io("inspect", e.path(), err))?;
            if kind.is_dir() {
                stack.push((e.path(), format!("{name}/")));
            } else {
                out.push(name);
            }
        }
    }
    out.sort();
    Ok(out)
}

/// Distinguishes temporary names made by one process.
static COUNTER: AtomicU64 = AtomicU64::new(0);

/// The staging folders of this process that exist now, whether they were abandoned, and how many
/// folders were published; publication and abandonment hold this lock.
static REGISTRY: Mutex<Registry> = Mutex::new(Registry {
    live: Vec::new(),
    abandoned: false,
    published: 0,
});

struct Registry {
    live: Vec<PathBuf>,
    abandoned: bool,
    published: u64,
}

fn registry() -> std::sync::MutexGuard<'static, Registry> {
    REGISTRY.lock().unwrap_or_else(|e| e.into_inner())
}

/// Deletes every staging folder of this process and refuses every later publication (they fail
/// with [`ReportError::Abandoned`]). Returns how many folders this process published before, so
/// that a caller interrupted just after publishing knows its output is complete.
pub fn abandon_staging() -> u64 {
    let mut r = registry();
    r.abandoned = true;
    for dir in r.live.drain(..) {
        let _ = fs::remove_dir_all(dir);
    }
    r.published
}

/// Marker inside a temporary folder name: `.{name}.partial-{pid}-{n}`.
const PARTIAL: &str = "partial";
/// Marker of an old folder moved aside while being replaced: `.{name}.old-{pid}-{n}`.
const OLD: &str = "old";
/// Marker of a temporary file: `.{name}.tmp-{pid}-{n}`.
const TMP: &str = "tmp";

/// Writes `bytes` to `path` atomically: a temporary sibling is written, flushed to disk and renamed
/// over `path`. Readers see the old content or the new, never a mixture.
///
/// # Errors
/// [`ReportError::Io`] naming the file when the folder is missing or not writable, or the rename fails;
/// the temporary file is removed in that case.
pub fn write_file_atomic(path: &Path, bytes: &[u8]) -> Result<(), ReportError> {
    let (parent, name) = split(path)?;
    let temp = temp_name(&parent, &name, TMP);
    let outcome = write_synced(&temp, bytes).and_then(|()| {
        fs::rename(&temp, path).map_err(|e| ReportError::io("rename into place", path, e))
    });
    if outcome.is_err() {
        let _ = fs::remove_file(&temp);
    }
    outcome?;
    sync_dir(&parent);
    Ok(())
}

/// Writes `value` as pretty-printed JSON with a trailing newline to `path`, atomically (see
/// [`write_file_atomic`]). Used for `result.json` and for the command-line tool's checkpoints and shard
/// results.
///
/// # Errors
/// [`ReportError::Json`] when the value cannot be serialized (e.g. a map with non-string keys),
/// [`ReportError::Io`] as for [`write_file_atomic`].
pub fn write_json_atomic<T: Serialize + ?Sized>(path: &Path, value: &T) -> Result<(), ReportError> {
    let text = json_text(path, value)?;
    write_file_atomic(path, text.as_bytes())
}

/// Writes a folder `dir` holding exactly `files` (name, content) atomically: they are written into a
/// hidden staging sibling, flushed to disk, and the staging folder is renamed to `dir` once complete.
/// Missing parent folders are created. Returns `dir`.
///
/// `marker` names the file that marks a folder as one of this kind (it should be among `files`): an
/// existing `dir` is replaced only with `overwrite`, and only when it is empty or motley wrote it as
/// a folder of this kind and every file in it (see the module docs).
///
/// # Errors
/// As [`check_destination`] (checked before writing and again just before the rename), and
/// [`ReportError::Io`] naming the file or folder that failed; on any error the staging folder is
/// removed and `dir` is left as it was.
pub fn write_folder_atomic(
    dir: &Path,
    files: &[(&str, &[u8])],
    marker: &str,
    overwrite: bool,
) -> Result<PathBuf, ReportError> {
    let staging = Staging::begin(dir, marker, overwrite)?;
    for (name, bytes) in files {
        write_synced(&staging.path().join(name), bytes)?;
    }
    staging.publish(overwrite)
}

/// Checks that a folder may be written at `dir`: it does not exist, or `overwrite` is asked and it
/// is empty or was written by motley as a folder of kind `marker` with no file added. Returns
/// whether it exists.
///
/// # Errors
/// - [`ReportError::NoFolderName`] if `dir` has no final component;
/// - [`ReportError::Exists`] if `dir` exists and `overwrite` is false;
/// - [`ReportError::NotAReport`] if `dir` exists and is neither empty nor a folder of this kind
///   that holds only files motley wrote (see the module docs);
/// - [`ReportError::Io`] if `dir` cannot be inspected.
pub fn check_destination(dir: &Path, marker: &str, overwrite: bool) -> Result<bool, ReportError> {
    split(dir)?;
    check_target(dir, marker, overwrite)
}

/// Checks, before any work, that a folder can be written at `dir`: creates its parent folders and
/// writes and deletes a small file beside it (where the staging folder, and a checkpoint, will go).
///
/// # Errors
/// [`ReportError::NoFolderName`] or [`ReportError::Io`] naming the folder that cannot be created or
/// written.
pub fn probe_destination(dir: &Path) -> Result<(), ReportError> {
    let (parent, name) = split(dir)?;
    fs::create_dir_all(&parent).map_err(|e| ReportError::io("create folder", &parent, e))?;
    let probe = temp_name(&parent, &name, "probe");
    let outcome = write_synced(&probe, b"motley checks that this folder is writable\n");
    let _ = fs::remove_file(&probe);
    outcome
}

/// Pretty JSON with a trailing newline.
pub(crate) fn json_text<T: Serialize + ?Sized>(
    path: &Path,
    value: &T,
) -> Result<String, ReportError> {
    let mut text = serde_json::to_string_pretty(value).map_err(|source| ReportError::Json {
        path: path.to_path_buf(),
        source,
    })?;
    text.push('\n');
    Ok(text)
}

/// Creates (or truncates) `path`, writes `bytes` and flushes them to disk.
pub(crate) fn write_synced(path: &Path, bytes: &[u8]) -> Result<(), ReportError> {
    let mut file = fs::File::create(path).map_err(|e| ReportError::io("create file", path, e))?;
    file.write_all(bytes)
        .map_err(|e| ReportError::io("write file", path, e))?;
    file.sync_all()
        .map_err(|e| ReportError::io("flush file to disk", path, e))
}

/// Flushes a folder's entries to disk (best effort: not every platform can open a folder).
pub(crate) fn sync_dir(dir: &Path) {
    #[cfg(unix)]
    if let Ok(d) = fs::File::open(dir) {
        let _ = d.sync_all();
    }
    #[cfg(not(unix))]
    let _ = dir;
}

/// The parent folder (`.` for a bare name) and the final component of `path`.
fn split(path: &Path) -> Result<(PathBuf, String), ReportError> {
    let name = path
        .file_name()
        .and_then(|n| n.to_str())
        .filter(|n| !n.is_empty())
        .ok_or_else(|| ReportError::NoFolderName {
            path: path.to_path_buf(),
        })?
        .to_string();
    let parent = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
        _ => PathBuf::from("."),
    };
    Ok((parent, name))
}

/// `{parent}/.{name}.{marker}-{pid}-{n}`, unique within this process.
fn temp_name(parent: &Path, name: &str, marker: &str) -> PathBuf {
    let n = COUNTER.fetch_add(1, Ordering::Relaxed);
    parent.join(format!(".{name}.{marker}-{}-{n}", std::process::id()))
}

/// The process id in a temporary name made by [`temp_name`] for `name` with `marker`, if it is one.
fn temp_owner(entry: &str, name: &str, marker: &str) -> Option<u32> {
    let rest = entry.strip_prefix(&format!(".{name}.{marker}-"))?;
    let (pid, n) = rest.split_once('-')?;
    n.parse::<u64>().ok()?;
    pid.parse().ok()
}

/// Whether process `pid` is known to be gone. Only Linux's `/proc` can tell; elsewhere nothing is
/// known to be gone, and leftovers stay (harmless: they never collide with new names).
fn process_gone(pid: u32) -> bool {
    if pid == std::process::id() {
        return false;
    }
    let proc_root = Path::new("/proc/self");
    proc_root.exists() && !Path::new(&format!("/proc/{pid}")).exists()
}

/// Why an existing folder may not be replaced by a folder of kind `marker`, if it may not: it must
/// be empty, or hold [`WRITTEN`] of the same kind listing every file in it.
fn not_ours(dir: &Path, marker: &str) -> Result<Option<String>, ReportError> {
    let present = files_under(dir)?;
    if present.is_empty()
        && fs::read_dir(dir)
            .map(|mut e| e.next().is_none())
            .unwrap_or(false)
    {
        return Ok(None);
    }
    let Ok(text) = fs::read_to_string(dir.join(WRITTEN)) else {
        return Ok(Some(format!("no {WRITTEN}: motley did not write it")));
    };
    let Ok(w) = serde_json::from_str::<Written>(&text) else {
        return Ok(Some(format!("its {WRITTEN} is damaged")));
    };
    if w.kind != marker {
        return Ok(Some(format!(
            "motley wrote it as a folder with {}, not {marker}",
            w.kind
        )));
    }
    let foreign: Vec<&str> = present
        .iter()
        .map(String::as_str)
        .filter(|f| *f != WRITTEN && !w.files.iter().any(|x| x == f))
        .collect();
    if !foreign.is_empty() {
        let shown: Vec<&str> = foreign.iter().take(3).copied().collect();
        return Ok(Some(format!(
            "it holds {} file(s) motley did not write: {}{}",
            foreign.len(),
            shown.join(", "),
            if foreign.len() > 3 { ", …" } else { "" }
        )));
    }
    Ok(None)
}

/// A hidden staging folder that becomes the final folder on [`Staging::publish`]; dropped
/// unpublished (an error or a panic while writing), it is deleted.
#[derive(Debug)]
pub(crate) struct Staging {
    /// The staging folder, written into.
    temp: PathBuf,
    /// The final folder.
    target: PathBuf,
    /// The parent of both.
    parent: PathBuf,
    /// The final component of `target`.
    name: String,
    /// The file that marks a folder at `target` as replaceable.
    marker: String,
    /// Whether `temp` has been renamed away.
    published: bool,
}

impl Staging {
    /// Checks that `target` may be written (absent, or holding `marker` or empty and replaceable with
    /// `overwrite`), sweeps leftovers of dead processes and creates a fresh staging folder beside it.
    pub(crate) fn begin(target: &Path, marker: &str, overwrite: bool) -> Result<Self, ReportError> {
        let (parent, name) = split(target)?;
        check_target(target, marker, overwrite)?;
        fs::create_dir_all(&parent).map_err(|e| ReportError::io("create folder", &parent, e))?;
        sweep_leftovers(&parent, &name);
        loop {
            let temp = temp_name(&parent, &name, PARTIAL);
            let mut r = registry();
            if r.abandoned {
                return Err(ReportError::Abandoned);
            }
            match fs::create_dir(&temp) {
                Ok(()) => {
                    r.live.push(temp.clone());
                    return Ok(Staging {
                        temp,
                        target: target.to_path_buf(),
                        parent,
                        name,
                        marker: marker.to_string(),
                        published: false,
                    });
                }
                // A leftover of an earlier process that had our pid: take the next number.
                Err(e) if e.kind() == std::io::ErrorKind::AlreadyExists => continue,
                Err(e) => return Err(ReportError::io("create staging folder", &temp, e)),
            }
        }
    }

    /// The staging folder to write into.
    pub(crate) fn path(&self) -> &Path {
        &self.temp
    }

    /// Moves the complete staging folder to the final name, replacing an old report if `overwrite`.
    pub(crate) fn publish(mut self, overwrite: bool) -> Result<PathBuf, ReportError> {
        let written = Written {
            written_by: "motley".into(),
            kind: self.marker.clone(),
            files: files_under(&self.temp)?,
        };
        write_synced(
            &self.temp.join(WRITTEN),
            json_text(&self.temp.join(WRITTEN), &written)?.as_bytes(),
        )?;
        sync_dir(&self.temp);
        let mut r = registry();
        if r.abandoned {
            return Err(ReportError::Abandoned);
        }
        // Checked again: another process may have written the report meanwhile.
        let exists = check_target(&self.target, &self.marker, overwrite)?;
        if exists {
            let aside = temp_name(&self.parent, &self.name, OLD);
            fs::rename(&self.target, &aside)
                .map_err(|e| ReportError::io("move the old report aside", &self.target, e))?;
            if let Err(e) = fs::rename(&self.temp, &self.target) {
                // Put the old report back; the staging folder is removed by `drop`.
                let _ = fs::rename(&aside, &self.target);
                return Err(ReportError::io("rename into place", &self.target, e));
            }
            self.published = true;
            r.published += 1;
            r.live.retain(|d| d != &self.temp);
            drop(r);
            sync_dir(&self.parent);
            // The new report is in place; failing to delete the old copy loses nothing, and the
            // next run sweeps it.
            let _ = fs::remove_dir_all(&aside);
        } else {
            fs::rename(&self.temp, &self.target)
                .map_err(|e| ReportError::io("rename into place", &self.target, e))?;
            self.published = true;
            r.published += 1;
            r.live.retain(|d| d != &self.temp);
            drop(r);
            sync_dir(&self.parent);
        }
        Ok(self.target.clone())
    }
}

impl Drop for Staging {
    fn drop(&mut self) {
        if !self.published {
            let mut r = registry();
            r.live.retain(|d| d != &self.temp);
            let _ = fs::remove_dir_all(&self.temp);
        }
    }
}

/// Whether `target` exists, failing when it exists and may not be replaced.
fn check_target(target: &Path, marker: &str, overwrite: bool) -> Result<bool, ReportError> {
    match fs::symlink_metadata(target) {
        Err(e) if e.kind() == std::io::ErrorKind::NotFound => Ok(false),
        Err(e) => Err(ReportError::io("inspect", target, e)),
        Ok(_) if !overwrite => Err(ReportError::Exists {
            path: target.to_path_buf(),
        }),
        Ok(meta) if meta.is_dir() => match not_ours(target, marker)? {
            None => Ok(true),
            Some(why) => Err(ReportError::NotAReport {
                path: target.to_path_buf(),
                why,
            }),
        },
        Ok(_) => Err(ReportError::NotAReport {
            path: target.to_path_buf(),
            why: "it is not a folder".into(),
        }),
    }
}

/// Deletes staging and moved-aside folders of `name` left by processes that no longer exist.
fn sweep_leftovers(parent: &Path, name: &str) {
    let Ok(entries) = fs::read_dir(parent) else {
        return;
    };
    for entry in entries.flatten() {
        let file_name = entry.file_name();
        let Some(entry_name) = file_name.to_str() else {
            continue;
        };
        let owner =
            temp_owner(entry_name, name, PARTIAL).or_else(|| temp_owner(entry_name, name, OLD));
        if let Some(pid) = owner {
            if process_gone(pid) {
                let _ = fs::remove_dir_all(entry.path());
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The names of the entries of `dir`, sorted.
    fn names(dir: &Path) -> Vec<String> {
        let mut names: Vec<String> = fs::read_dir(dir)
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .collect();
        names.sort();
        names
    }

    #[test]
    fn temp_owner_parses_only_our_names() {
        assert_eq!(temp_owner(".run.partial-123-4", "run", PARTIAL), Some(123));
        assert_eq!(temp_owner(".run.partial-123", "run", PARTIAL), None);
        assert_eq!(temp_owner(".run2.partial-123-4", "run", PARTIAL), None);
        assert_eq!(temp_owner(".run.old-9-0", "run", OLD), Some(9));
        assert_eq!(temp_owner("run", "run", PARTIAL), None);
    }

    #[test]
    fn split_handles_bare_names_and_rejects_roots() {
        let (p, n) = split(Path::new("report")).unwrap();
        assert_eq!((p, n.as_str()), (PathBuf::from("."), "report"));
        let (p, n) = split(Path::new("a/b/c")).unwrap();
        assert_eq!((p, n.as_str()), (PathBuf::from("a/b"), "c"));
        assert!(matches!(
            split(Path::new("/")),
            Err(ReportError::NoFolderName { .. })
        ));
    }

    #[test]
    fn json_file_is_replaced_whole_and_ends_with_newline() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("state.json");
        write_json_atomic(&path, &vec![1, 2, 3]).unwrap();
        write_json_atomic(&path, &vec![4]).unwrap();
        let text = fs::read_to_string(&path).unwrap();
        assert_eq!(text, "[\n  4\n]\n");
        // No temporary file is left beside it.
        assert_eq!(names(dir.path()), ["state.json"]);
    }

    #[test]
    fn atomic_file_into_missing_folder_fails_naming_it_and_leaves_nothing() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("missing").join("x.json");
        let err = write_file_atomic(&path, b"{}").unwrap_err();
        assert!(err.to_string().contains("missing"), "{err}");
        assert!(!dir.path().join("missing").exists());
    }

    #[test]
    fn dropped_staging_is_removed() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("rep");
        let staging = Staging::begin(&target, "result.json", false).unwrap();
        let temp = staging.path().to_path_buf();
        assert!(temp.is_dir());
        drop(staging);
        assert!(!temp.exists());
        assert!(!target.exists());
    }

    #[test]
    fn folder_is_written_whole_and_replaced_only_when_marked() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("deep").join("shard");
        let files: [(&str, &[u8]); 2] = [("a.json", b"{}"), ("b.txt", b"text")];
        write_folder_atomic(&target, &files, "a.json", false).unwrap();
        assert_eq!(fs::read(target.join("b.txt")).unwrap(), b"text");
        assert!(matches!(
            write_folder_atomic(&target, &files[..1], "a.json", false),
            Err(ReportError::Exists { .. })
        ));
        write_folder_atomic(&target, &files[..1], "a.json", true).unwrap();
        assert!(target.join("a.json").is_file());
        assert!(
            !target.join("b.txt").exists(),
            "the old folder is replaced whole"
        );
        // A folder of another kind is kept, even with overwrite.
        let err = write_folder_atomic(&target, &files, "b.txt", true).unwrap_err();
        assert!(
            err.to_string()
                .contains("motley wrote it as a folder with a.json, not b.txt"),
            "{err}"
        );
        assert!(target.join("a.json").is_file());
        // So is one with a file motley did not write.
        fs::write(target.join("notes.txt"), b"mine").unwrap();
        let err = write_folder_atomic(&target, &files, "a.json", true).unwrap_err();
        assert!(
            err.to_string()
                .contains("it holds 1 file(s) motley did not write: notes.txt"),
            "{err}"
        );
        assert_eq!(fs::read(target.join("notes.txt")).unwrap(), b"mine");
        // Nothing but the folder is left beside it.
        assert_eq!(names(target.parent().unwrap()), ["shard"]);
    }

    #[test]
    fn destination_check_agrees_with_the_writer() {
        let dir = tempfile::tempdir().unwrap();
        let target = dir.path().join("out");
        assert!(!check_destination(&target, "m", false).unwrap());
        fs::create_dir(&target).unwrap();
        assert!(matches!(
            check_destination(&target, "m", false),
            Err(ReportError::Exists { .. })
        ));
        assert!(check_destination(&target, "m", true).unwrap());
        fs::write(target.join("other"), b"").unwrap();
        assert!(matches!(
            check_destination(&target, "m", true),
            Err(ReportError::NotAReport { .. })
        ));
        // A marker file alone (a `result.json` holding `{}`, say) does not make a folder ours.
        fs::remove_file(target.join("other")).unwrap();
        fs::write(target.join("m"), b"{}").unwrap();
        assert!(matches!(
            check_destination(&target, "m", true),
            Err(ReportError::NotAReport { .. })
        ));
        fs::remove_dir_all(&target).unwrap();
        write_folder_atomic(&target, &[("m", b"{}")], "m", false).unwrap();
        assert!(check_destination(&target, "m", true).unwrap());
        assert!(matches!(
            check_destination(Path::new("/"), "m", true),
            Err(ReportError::NoFolderName { .. })
        ));
    }

    #[test]
    fn sweeps_leftovers_of_dead_processes_only() {
        if !Path::new("/proc/self").exists() {
            return; // Nothing can be known to be dead without /proc.
        }
        let dir = tempfile::tempdir().unwrap();
        // pid 4194304 exceeds Linux's largest pid (2^22), so no such process exists.
        let dead = dir.path().join(".rep.partial-4194304-0");
        let mine = dir
            .path()
            .join(format!(".rep.partial-{}-999999", std::process::id()));
        let other = dir.path().join(".other.partial-4194304-0");
        for d in [&dead, &mine, &other] {
            fs::create_dir(d).unwrap();
        }
        sweep_leftovers(dir.path(), "rep");
        assert!(!dead.exists());
        assert!(mine.exists());
        assert!(other.exists());
    }
}
