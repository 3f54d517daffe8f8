//! Loading: text → structural checks → serde → validation, every error located.

use sha2::{Digest, Sha256};

use yaml_rust2::parser::{Event, MarkedEventReceiver, Parser};
use yaml_rust2::scanner::Marker;

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
    // A UTF-8 byte-order mark (some editors write one) is not part of the YAML.
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
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
    if text
        .lines()
        .all(|l| l.trim().is_empty() || l.trim_start().starts_with('#'))
    {
        return Err(whole("the file holds only comments; a scenario needs at least `name`, `seed`, `samples`, `models`, `observables` and `claims`".into()));
    }
    // Syntax first, so that a file that is not YAML is called that (serde_yaml can report such a
    // file as a type error).
    if let Err(e) = Parser::new_from_str(text).load(&mut IgnoreEvents, true) {
        let at = e.marker();
        return Err(ScenarioError {
            file: file.to_string(),
            line: Some(at.line()),
            column: Some(at.col() + 1),
            path: String::new(),
            message: format!("not valid YAML: {}", e.info()),
            hint: None,
        });
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
            Structure::NullValue { path, at } => ScenarioError {
                file: file.to_string(),
                line: Some(at.line),
                column: Some(at.column),
                path: path.clone(),
                message: "has no value (null); give a value, or leave the key out for its default"
                    .into(),
                hint: None,
            },
        });
    }
    // Enums are written as one-key maps (`step: 3`), not YAML tags: hence `singleton_map_recursive`.
    let raw: RawScenario = serde_yaml::with::singleton_map_recursive::deserialize(
        serde_yaml::Deserializer::from_str(text),
    )
    .map_err(|e| serde_error(e, file, text, &locations))?;
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

/// Receives parser events and drops them: the syntax check needs only the parser's verdict.
struct IgnoreEvents;

impl MarkedEventReceiver for IgnoreEvents {
    fn on_event(&mut self, _: Event, _: Marker) {}
}

pub(crate) fn hex(bytes: &[u8]) -> String {
    bytes.iter().map(|b| format!("{b:02x}")).collect()
}

/// Turns a serde_yaml error into a located [`ScenarioError`], with "did you mean" for unknown keys
/// and variants, and serde's type names ("i64", "enum RawRead") replaced by what the file may hold.
fn serde_error(
    e: serde_yaml::Error,
    file: &str,
    text: &str,
    locations: &Locations,
) -> ScenarioError {
    let full = e.to_string();
    // serde_yaml writes "PATH: MESSAGE at line L column C"; strip the position (kept separately).
    let body = match full.rfind(" at line ") {
        Some(i) => &full[..i],
        None => full.as_str(),
    };
    let (mut path, message) = match body.split_once(": ") {
        Some((p, m)) if !p.contains(' ') => (p.to_string(), m.to_string()),
        _ => (String::new(), body.to_string()),
    };
    let loc = e.location();
    let mut line = loc.as_ref().map(|l| l.line());
    let mut column = loc.as_ref().map(|l| l.column());
    let message = if message.starts_with("did not find expected")
        || message.contains("while scanning")
        || message.contains("while parsing")
    {
        format!("not valid YAML: {message}")
    } else if message.starts_with("control characters are not allowed") {
        format!("not valid YAML (is it a text file?): {message}")
    } else if path.is_empty()
        && message.starts_with("invalid type")
        && message.ends_with("expected struct RawScenario")
    {
        let found = message
            .strip_prefix("invalid type: ")
            .and_then(|m| m.split_once(", expected"))
            .map(|(f, _)| found_name(f))
            .unwrap_or_default();
        format!("not a scenario: the file holds {found}, not a mapping of keys (`name: …`, `seed: …`, …)")
    } else if let Some(key) = message
        .strip_prefix("missing field `")
        .and_then(|r| r.strip_suffix('`'))
    {
        format!("missing key `{key}`")
    } else if let Some((rule, keys)) = untagged(&message) {
        // serde names the enclosing mapping only; find the offending key from the values.
        match untagged_culprit(text, &path, keys, rule == "color") {
            Some((key, found)) => {
                path = format!("{path}.{key}");
                if let Some(p) = locations.find(&path) {
                    line = Some(p.line);
                    column = Some(p.column);
                }
                if rule == "color" {
                    format!("must be a color number or `rainbow`, got {found}")
                } else {
                    format!("must be a number or a fraction like \"1/3\", got {found}")
                }
            }
            None if rule == "color" => "`color` must be a color number or `rainbow`".to_string(),
            None => format!(
                "{} must be numbers or fractions like \"1/3\"",
                keys.join(", ")
            ),
        }
    } else if let Some(rest) = message
        .strip_prefix("invalid type: ")
        .or_else(|| message.strip_prefix("invalid value: "))
    {
        match rest.split_once(", expected ") {
            Some((found, expected)) => {
                format!(
                    "expected {}, got {}",
                    expected_name(expected),
                    found_name(found)
                )
            }
            None => message,
        }
    } else {
        message
    };
    let hint = suggestion(&message);
    ScenarioError {
        file: file.to_string(),
        line,
        column,
        path,
        message,
        hint,
    }
}

/// serde's description of a found value, in the file's terms.
fn found_name(found: &str) -> String {
    match found {
        "sequence" => "a list".into(),
        "map" => "a mapping".into(),
        "unit value" => "nothing (null)".into(),
        f => f.to_string(),
    }
}

/// serde's name of an expected type, in the file's terms.
fn expected_name(expected: &str) -> String {
    let s = match expected {
        "u64" => "a whole number ≥ 0",
        "i64" => "an integer",
        "f64" => "a number",
        "a sequence" => "a list",
        "a map" => "a mapping of keys",
        "an array of length 2" => "a list of two entries",
        "enum RawRead" => "a read-out such as `{top: colors}` or `{height: {x: 1, y: 2}}`",
        "enum RawSetKind" => "`colors` or `positions`",
        "enum RawBoundary" => {
            "`rainbow`, `empty`, `{step: c}`, `{list: […]}`, `{blocks: {…}}` or `{bernoulli: {…}}`"
        }
        "enum RawModel" => "`six-vertex: {…}` or `exclusion: {…}`",
        "enum RawLattice" => "`{segment: n}`, `{ring: n}` or `line`",
        "enum RawInitial" => "`packed`, `{list: […]}` or `{step: {…}}`",
        "enum RawIndexMap" => "`identity`, `reflection` or `{shift: s}`",
        "enum RawReference" => {
            "a reference law such as `{uniform: [a, b]}` or `{normal: {mean: m, sd: s}}`"
        }
        "enum RawExactMode" => "`auto`, `on` or `off`",
        "enum RawStrength" => "`larger-wins` or `smaller-wins`",
        e if e.starts_with("struct Raw") => "a mapping of keys",
        e => e,
    };
    s.to_string()
}

/// For serde's "did not match any variant of untagged enum …": which rule failed and the keys that
/// hold such values.
fn untagged(message: &str) -> Option<(&'static str, &'static [&'static str])> {
    if !message.starts_with("data did not match any variant of untagged enum") {
        return None;
    }
    if message.ends_with("RawNumber") {
        Some(("number", &["b1", "b2", "p", "q"]))
    } else if message.ends_with("RawColorRule") {
        Some(("color", &["color"]))
    } else {
        None
    }
}

/// The first of `keys` under `path` whose value is neither a number nor a string (nor, for
/// `integer`, a non-integer number), with a description of that value.
fn untagged_culprit(
    text: &str,
    path: &str,
    keys: &[&str],
    integer: bool,
) -> Option<(String, String)> {
    use serde_yaml::Value;
    let mut v: Value = serde_yaml::from_str(text).ok()?;
    for seg in path.split('.').filter(|s| !s.is_empty()) {
        let (key, indices) = match seg.find('[') {
            Some(i) => (&seg[..i], &seg[i..]),
            None => (seg, ""),
        };
        v = v.get(key)?.clone();
        for ix in indices.split(['[', ']']).filter(|s| !s.is_empty()) {
            v = v.get(ix.parse::<usize>().ok()?)?.clone();
        }
    }
    keys.iter().find_map(|k| {
        let found = match v.get(*k)? {
            Value::Number(n) if !integer || n.is_i64() => return None,
            Value::String(_) => return None,
            Value::Number(n) => format!("{n}"),
            Value::Sequence(_) => "a list".into(),
            Value::Mapping(_) => "a mapping".into(),
            Value::Bool(b) => format!("`{b}`"),
            Value::Null => "nothing (null)".into(),
            Value::Tagged(_) => "a tagged value".into(),
        };
        Some((k.to_string(), found))
    })
}

/// "unknown field `widht`, expected one of `width`, `height`" → "did you mean `width`?".
fn suggestion(message: &str) -> Option<String> {
    let rest = message
        .strip_prefix("unknown field `")
        .or_else(|| message.strip_prefix("unknown variant `"))?;
    let (word, tail) = rest.split_once('`')?;
    if word.len() > 64 {
        return None; // no key is that long; and the edit distance would cost len² memory
    }
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
