//! The errors of report writing: one variant per cause, each naming the path it concerns.

use std::path::PathBuf;

/// Why a report, a figure or an atomic file could not be written.
#[derive(Debug, thiserror::Error)]
pub enum ReportError {
    /// The final report folder exists and replacing it was not asked for.
    #[error("report folder {} exists; pass --overwrite to replace it", path.display())]
    Exists {
        /// The report folder.
        path: PathBuf,
    },
    /// Overwriting was asked for, but the existing folder does not look like a report, so it is kept.
    #[error(
        "{} exists and is not a folder motley may replace ({why}); \
         refusing to replace it even with --overwrite: choose another --out",
        path.display()
    )]
    NotAReport {
        /// The folder that was kept.
        path: PathBuf,
        /// Why it may not be replaced.
        why: String,
    },
    /// The report path has no final component (e.g. `/` or `..`).
    #[error("report path {} has no folder name; give a path such as reports/my-run", path.display())]
    NoFolderName {
        /// The path given.
        path: PathBuf,
    },
    /// The process was interrupted and gave up its staging folders (see `abandon_staging`).
    #[error("interrupted: the output was not written")]
    Abandoned,
    /// A file-system operation failed.
    #[error("could not {action} {}: {source}", path.display())]
    Io {
        /// What was being done, e.g. `create folder`.
        action: &'static str,
        /// The path concerned.
        path: PathBuf,
        /// The underlying error.
        #[source]
        source: std::io::Error,
    },
    /// A value could not be serialized to JSON.
    #[error("could not serialize JSON for {}: {source}", path.display())]
    Json {
        /// The file that was to hold it.
        path: PathBuf,
        /// The underlying error.
        #[source]
        source: serde_json::Error,
    },
    /// plotters failed to draw a figure.
    #[error("could not draw figure {}: {message}", path.display())]
    Draw {
        /// The figure file.
        path: PathBuf,
        /// plotters' message.
        message: String,
    },
    /// The PNG encoder failed.
    #[error("could not encode PNG {}: {message}", path.display())]
    Png {
        /// The image file.
        path: PathBuf,
        /// The encoder's message.
        message: String,
    },
    /// A sample picture is inconsistent (wrong lengths, colors out of range, colors not conserved).
    #[error("sample picture is inconsistent: {0}")]
    BadPicture(#[from] motley_scenario::picture::PictureError),
}

impl ReportError {
    /// Wraps an I/O error with the action and path.
    pub(crate) fn io(
        action: &'static str,
        path: impl Into<PathBuf>,
        source: std::io::Error,
    ) -> Self {
        ReportError::Io {
            action,
            path: path.into(),
            source,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exists_message_names_path_and_flag() {
        let e = ReportError::Exists {
            path: PathBuf::from("reports/rainbow"),
        };
        assert_eq!(
            e.to_string(),
            "report folder reports/rainbow exists; pass --overwrite to replace it"
        );
    }

    #[test]
    fn io_message_names_action_and_path() {
        let e = ReportError::io(
            "create folder",
            "/x/y",
            std::io::Error::new(std::io::ErrorKind::PermissionDenied, "denied"),
        );
        assert_eq!(e.to_string(), "could not create folder /x/y: denied");
    }
}
