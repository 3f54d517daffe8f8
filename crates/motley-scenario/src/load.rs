//! Loading: text → structural checks → serde → validation, every error located.

use sha2::{Digest, Sha256};

use crate::error::ScenarioError;
use crate::locate::{Locations, Structure};
use crate::raw::RawScenario;
use crate::scenario::Scenario;
use crate::suggest::closest;
use crate::validate::validate;

/// Loads a scenario from its text. `file` names it in messages.
///
/// # Errors
/// The first problem found: empty file, not YAML, duplicate key, several documents, unknown key (with
/// a "did you mean"), wrong type, or any range check of [`validate`].
pub fn load_str(text: &str, file: &str) -> Result<Scenario, ScenarioError> {
    let whole = |message: String| ScenarioError {
        file: file.to_string(),
        line: None,
        column: None,
        path: String::new(),
        message,
        hint: None,
    };
    if text.trim().is_empty() {
        return Err(whole("the file is empty; a scenario needs at least `name`, `seed`, `samples`, `models`, `observables` and `claims`".into()));
    }
    let locations = Locations::of(text);
    if let Some(p) = locations.problems().first() {
        return Err(match p {
            Structure::DuplicateKey { path, at, first } => ScenarioError {
                file: file.to_string(),
                line: Some(at.line),
                column: Some(at.column),
                path: path.clone(),
                message: format!("key given twice (first at line {})", first.line),
                hint: None,
            },
            Structure::MultipleDocuments { at } => ScenarioError {
                file: file.to_string(),
                line: Some(at.line),
                column: Some(at.column),
                path: String::new(),
                message: "a scenario file holds one YAML document, found a second `---`".into(),
                hint: None,
            },
        });
    }
    // Enums are written as one-key maps (`step: 3`), not YAML tags: hence `singleton_map_recursive`.
    let raw: RawScenario = serde_yaml::with::singleton_map_recursive::deserialize(
        serde_yaml::Deserializer::from_str(text),
    )
    .map_err(|e| serde_error(e, file, text))?;
    let hash = hex(&Sha256::digest(text.as_bytes()));
    let scenario = validate(&raw, file, &locations, hash)?;
    crate::plan::plan(&scenario, file).map_err(|mut e| {
        if let Some(p) = locations.find(&e.path) {
            e.line = Some(p.line);
            e.column = Some(p.column);
        }
        e
    })?;
    Ok(scenario)
}

fn hex(bytes: &[u8]) -> String {
    bytes.iter().map(|b| format!("{b:02x}")).collect()
}

/// Turns a serde_yaml error into a located [`ScenarioError`], with "did you mean" for unknown keys
/// and variants.
fn serde_error(e: serde_yaml::Error, file: &str, text: &str) -> ScenarioError {
    let full = e.to_string();
    // serde_yaml writes "PATH: MESSAGE at line L column C"; strip the position (kept separately).
    let body = match full.rfind(" at line ") {
        Some(i) => &full[..i],
        None => full.as_str(),
    };
    let (path, message) = match body.split_once(": ") {
        Some((p, m)) if !p.contains(' ') => (p.to_string(), m.to_string()),
        _ => (String::new(), body.to_string()),
    };
    let message = if message.starts_with("did not find expected") || message.contains("while scanning") || message.contains("while parsing") {
        format!("not valid YAML: {message}")
    } else if path.is_empty() && message.starts_with("invalid type") && !text.contains(':') {
        format!("not a scenario: the file is not a YAML mapping of keys ({message})")
    } else {
        message
    };
    let hint = suggestion(&message);
    let loc = e.location();
    ScenarioError {
        file: file.to_string(),
        line: loc.as_ref().map(|l| l.line()),
        column: loc.as_ref().map(|l| l.column()),
        path,
        message,
        hint,
    }
}

/// "unknown field `widht`, expected one of `width`, `height`" → "did you mean `width`?".
fn suggestion(message: &str) -> Option<String> {
    let rest = message
        .strip_prefix("unknown field `")
        .or_else(|| message.strip_prefix("unknown variant `"))?;
    let (word, tail) = rest.split_once('`')?;
    let candidates: Vec<&str> = tail.split('`').skip(1).step_by(2).collect();
    closest(word, candidates).map(|c| format!("did you mean `{c}`?"))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn suggestion_from_serde_message() {
        assert_eq!(
            suggestion("unknown field `widht`, expected one of `width`, `height`"),
            Some("did you mean `width`?".into())
        );
        assert_eq!(suggestion("invalid type: string"), None);
    }
}
