//! What a report needs besides the run's result: the scenario text, the command line and an optional
//! sample picture with its caption.

use motley_scenario::picture::Picture;

/// What a report needs besides the [`RunResult`](motley_scenario::result::RunResult).
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct ReportExtras {
    /// The scenario file's text, copied into the report as `scenario.yaml` so it can be rerun.
    pub scenario_text: String,
    /// The command line that produced the run, one argument per entry (quoted when printed).
    pub command: Vec<String>,
    /// One sample configuration of a six-vertex model to draw, if the scenario has one.
    pub picture: Option<Picture>,
    /// What the picture shows, e.g. `Sample 0 of model "rainbow"`; empty for a generic caption.
    pub picture_caption: String,
}

impl ReportExtras {
    /// Extras with the scenario text and the command line, and no picture.
    pub fn new(scenario_text: impl Into<String>, command: Vec<String>) -> Self {
        ReportExtras {
            scenario_text: scenario_text.into(),
            command,
            picture: None,
            picture_caption: String::new(),
        }
    }

    /// Adds a sample picture with its caption.
    pub fn with_picture(mut self, picture: Picture, caption: impl Into<String>) -> Self {
        self.picture = Some(picture);
        self.picture_caption = caption.into();
        self
    }
}
