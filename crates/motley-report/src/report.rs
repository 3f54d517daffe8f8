//! Writing a whole report folder: `summary.md`, `result.json`, `scenario.yaml` and `figures/`, staged
//! in a hidden sibling and moved into place only when complete.

use std::fs;
use std::path::{Path, PathBuf};

use motley_scenario::result::{ClaimResult, RunResult};

use crate::atomic::{json_text, sync_dir, write_synced, Staging};
use crate::error::ReportError;
use crate::extras::ReportExtras;
use crate::law_table::LAWS;

/// Names of the files in a report folder.
pub mod files {
    /// The Markdown summary.
    pub const SUMMARY: &str = "summary.md";
    /// The machine-readable result.
    pub const RESULT: &str = "result.json";
    /// The copy of the scenario file.
    pub const SCENARIO: &str = "scenario.yaml";
    /// The folder of figures.
    pub const FIGURES: &str = "figures";
}

/// Writes the report for `result` into the folder `dir`, atomically, and returns `dir`.
///
/// The folder holds `summary.md`, `result.json` (pretty JSON with a trailing newline), `scenario.yaml`
/// and `figures/` (`<claim>-ecdf.svg`, `<claim>-inclusion.svg`, `<claim>-size-law.svg`,
/// `<claim>-probabilities.svg` where the claim has the data; `sample.svg`, or `sample.png` and
/// `sample-corner.svg` for a large picture), and `laws/<claim>.csv` for each claim with full laws
/// (see `law_table`). Missing parent folders are created.
///
/// Everything is written into a hidden sibling `.{name}.partial-{pid}-{n}` first and renamed to `dir`
/// when complete, so `dir` never holds a half-written report, even if the process is killed. With
/// `overwrite`, an existing report at `dir` is moved aside, replaced and then deleted.
///
/// # Errors
/// - [`ReportError::Exists`] if `dir` exists and `overwrite` is false (checked before any work and again
///   just before the rename);
/// - [`ReportError::NotAReport`] if `dir` exists, `overwrite` is true, but `dir` is neither empty nor
///   holds a `result.json`: such a folder is never deleted;
/// - [`ReportError::BadPicture`] if the picture in `extras` is inconsistent;
/// - [`ReportError::Io`], [`ReportError::Json`], [`ReportError::Draw`], [`ReportError::Png`] naming the
///   file that failed. On any error nothing is left under `dir` that was not there before, and the
///   staging folder is removed.
pub fn write_report(
    dir: &Path,
    result: &RunResult,
    extras: &ReportExtras,
    overwrite: bool,
) -> Result<PathBuf, ReportError> {
    if let Some(p) = &extras.picture {
        p.validate()?;
    }
    let staging = Staging::begin(dir, files::RESULT, overwrite)?;
    let root = staging.path().to_path_buf();

    let json_path = root.join(files::RESULT);
    write_synced(
        &json_path,
        json_text(&dir.join(files::RESULT), result)?.as_bytes(),
    )?;
    write_synced(&root.join(files::SCENARIO), extras.scenario_text.as_bytes())?;

    let fig_dir = root.join(files::FIGURES);
    fs::create_dir(&fig_dir).map_err(|e| ReportError::io("create folder", &fig_dir, e))?;
    let stems = crate::figures::stems(&result.claims);
    let mut figures = Vec::with_capacity(result.claims.len());
    for (claim, stem) in result.claims.iter().zip(&stems) {
        figures.push(crate::figures::draw_claim(
            claim,
            stem,
            result.scenario.alpha,
            &root,
        )?);
    }
    let picture = match &extras.picture {
        Some(p) => {
            let caption = if extras.picture_caption.trim().is_empty() {
                "One sample configuration; each path colored by its color".to_string()
            } else {
                extras
                    .picture_caption
                    .trim()
                    .trim_end_matches('.')
                    .to_string()
            };
            Some(crate::picture_draw::draw(p, &root, &caption)?)
        }
        None => None,
    };
    if fs::read_dir(&fig_dir)
        .map(|mut d| d.next().is_none())
        .unwrap_or(false)
    {
        let _ = fs::remove_dir(&fig_dir);
    } else {
        sync_dir(&fig_dir);
    }

    let with_laws: Vec<(&ClaimResult, &String)> = result
        .claims
        .iter()
        .zip(&stems)
        .filter(|(c, _)| !c.estimates.laws.is_empty())
        .collect();
    if !with_laws.is_empty() {
        let law_dir = root.join(LAWS);
        fs::create_dir(&law_dir).map_err(|e| ReportError::io("create folder", &law_dir, e))?;
        for (claim, stem) in with_laws {
            let path = law_dir.join(format!("{stem}.csv"));
            write_synced(
                &path,
                crate::law_table::csv(&claim.estimates.laws).as_bytes(),
            )?;
        }
        sync_dir(&law_dir);
    }

    let summary = crate::summary::render(result, extras, &stems, &figures, picture.as_ref());
    write_synced(&root.join(files::SUMMARY), summary.as_bytes())?;
    staging.publish(overwrite)
}
