//! The crate's integration tests, linked into one binary; each module is one concern.

mod common;
mod figures_svg;
mod report_folder;
mod summary_content;
