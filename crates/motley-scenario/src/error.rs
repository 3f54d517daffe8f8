//! The one error type of scenario loading and validation: where, what, and what is allowed.

use thiserror::Error;

/// A problem with a scenario file, located as precisely as the file allows.
///
/// The first line of the message reads `FILE:LINE:COLUMN: KEY: WHAT` (line and column omitted when
/// unknown); a second line may carry a hint such as "did you mean `width`?".
#[derive(Debug, Clone, PartialEq, Eq, Error)]
#[error("{}", self.render())]
pub struct ScenarioError {
    /// File name as given by the caller.
    pub file: String,
    /// Line, from 1.
    pub line: Option<usize>,
    /// Column, from 1.
    pub column: Option<usize>,
    /// Key path, e.g. `models.colored.six-vertex.b1` (empty for the whole file).
    pub path: String,
    /// What is wrong, what was found and what is allowed.
    pub message: String,
    /// A suggestion.
    pub hint: Option<String>,
}

impl ScenarioError {
    /// The first line of the message (stable: tests compare it).
    pub fn first_line(&self) -> String {
        let mut s = self.file.clone();
        if let Some(l) = self.line {
            s.push_str(&format!(":{l}"));
            if let Some(c) = self.column {
                s.push_str(&format!(":{c}"));
            }
        }
        s.push_str(": ");
        if !self.path.is_empty() {
            s.push_str(&format!("`{}`: ", self.path));
        }
        s.push_str(&self.message);
        s
    }

    fn render(&self) -> String {
        match &self.hint {
            Some(h) => format!("{}\n  hint: {h}", self.first_line()),
            None => self.first_line(),
        }
    }
}
