//! Where each key of a YAML file sits: a map from key paths to line and column.
//!
//! serde reports positions only for its own (syntax and type) errors. The range checks of
//! [`crate::validate`] run on deserialized values, so they look up the position of the offending key
//! here. The same walk over the parser's events also catches what serde_yaml lets through silently:
//! duplicate keys and files with more than one document.
//!
//! Paths are written `models.colored.six-vertex.b1` and `claims[2].same-law[0]`.

use std::collections::HashMap;

use yaml_rust2::parser::{Event, MarkedEventReceiver, Parser};
use yaml_rust2::scanner::Marker;

/// A line and column, both counted from 1.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Position {
    /// Line, from 1.
    pub line: usize,
    /// Column, from 1.
    pub column: usize,
}

/// A structural problem found while walking the file.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Structure {
    /// A key given twice in one mapping.
    DuplicateKey {
        /// Path of the repeated key.
        path: String,
        /// Where it appears the second time.
        at: Position,
        /// Where it appeared first.
        first: Position,
    },
    /// More than one YAML document.
    MultipleDocuments {
        /// Start of the second document.
        at: Position,
    },
    /// A key whose value is null (`alpha:`, `alpha: ~`, `alpha: null`): never a default in
    /// disguise, always refused.
    NullValue {
        /// Path of the key.
        path: String,
        /// Where the null value is.
        at: Position,
    },
}

/// Positions of every key path of a file.
#[derive(Debug, Clone, Default)]
pub struct Locations {
    positions: HashMap<String, Position>,
    problems: Vec<Structure>,
}

impl Locations {
    /// Walks `text`. A syntax error simply stops the walk: serde reports it with its own position.
    pub fn of(text: &str) -> Self {
        let mut walker = Walker::default();
        let mut parser = Parser::new_from_str(text);
        let _ = parser.load(&mut walker, true);
        Locations {
            positions: walker.positions,
            problems: walker.problems,
        }
    }

    /// Position of `path`, or of its longest known prefix.
    pub fn find(&self, path: &str) -> Option<Position> {
        let mut p = path.to_string();
        loop {
            if let Some(pos) = self.positions.get(&p) {
                return Some(*pos);
            }
            let cut = p.rfind(['.', '['])?;
            p.truncate(cut);
        }
    }

    /// Duplicate keys and extra documents, in file order.
    pub fn problems(&self) -> &[Structure] {
        &self.problems
    }
}

enum Frame {
    Map {
        path: String,
        expecting_key: bool,
        key: Option<String>,
        seen: HashMap<String, Position>,
    },
    Seq {
        path: String,
        index: usize,
    },
}

#[derive(Default)]
struct Walker {
    stack: Vec<Frame>,
    positions: HashMap<String, Position>,
    problems: Vec<Structure>,
    documents: usize,
}

fn join(parent: &str, key: &str) -> String {
    if parent.is_empty() {
        key.to_string()
    } else {
        format!("{parent}.{key}")
    }
}

fn position(mark: &Marker) -> Position {
    Position {
        line: mark.line(),
        column: mark.col() + 1,
    }
}

impl Walker {
    /// The path a value starting now would have; advances the parent's state.
    fn value_path(&mut self, mark: &Marker) -> Option<String> {
        match self.stack.last_mut() {
            None => Some(String::new()),
            Some(Frame::Seq { path, index }) => {
                let p = format!("{path}[{index}]");
                *index += 1;
                self.positions.insert(p.clone(), position(mark));
                Some(p)
            }
            Some(Frame::Map {
                path,
                expecting_key,
                key,
                ..
            }) => {
                if *expecting_key {
                    None
                } else {
                    *expecting_key = true;
                    key.take().map(|k| join(path, &k))
                }
            }
        }
    }
}

impl MarkedEventReceiver for Walker {
    fn on_event(&mut self, ev: Event, mark: Marker) {
        match ev {
            Event::DocumentStart => {
                self.documents += 1;
                if self.documents == 2 {
                    self.problems.push(Structure::MultipleDocuments {
                        at: position(&mark),
                    });
                }
            }
            Event::Scalar(text, style, ..) => {
                if let Some(Frame::Map {
                    path,
                    expecting_key: true,
                    key,
                    seen,
                }) = self.stack.last_mut()
                {
                    let full = join(path, &text);
                    let here = position(&mark);
                    if let Some(first) = seen.get(&text) {
                        self.problems.push(Structure::DuplicateKey {
                            path: full.clone(),
                            at: here,
                            first: *first,
                        });
                    } else {
                        seen.insert(text.clone(), here);
                        self.positions.insert(full, here);
                    }
                    *key = Some(text);
                    if let Some(Frame::Map { expecting_key, .. }) = self.stack.last_mut() {
                        *expecting_key = false;
                    }
                } else {
                    let in_map = matches!(self.stack.last(), Some(Frame::Map { .. }));
                    let path = self.value_path(&mark);
                    let null = style == yaml_rust2::scanner::TScalarStyle::Plain
                        && matches!(text.as_str(), "" | "~" | "null" | "Null" | "NULL");
                    if let (true, true, Some(path)) = (in_map, null, path) {
                        self.problems.push(Structure::NullValue {
                            path,
                            at: position(&mark),
                        });
                    }
                }
            }
            Event::Alias(_) => {
                let _ = self.value_path(&mark);
            }
            Event::MappingStart(..) => {
                let path = self.value_path(&mark).unwrap_or_default();
                self.stack.push(Frame::Map {
                    path,
                    expecting_key: true,
                    key: None,
                    seen: HashMap::new(),
                });
            }
            Event::SequenceStart(..) => {
                let path = self.value_path(&mark).unwrap_or_default();
                self.stack.push(Frame::Seq { path, index: 0 });
            }
            Event::MappingEnd | Event::SequenceEnd => {
                self.stack.pop();
            }
            _ => {}
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const TEXT: &str = "name: a\nmodels:\n  m:\n    six-vertex:\n      width: 3\n      b1: 0.5\nclaims:\n  - id: x\n    same-law: [a, b]\n";

    #[test]
    fn finds_nested_keys_and_items() {
        let l = Locations::of(TEXT);
        assert_eq!(
            l.find("models.m.six-vertex.b1"),
            Some(Position { line: 6, column: 7 })
        );
        assert_eq!(l.find("claims[0].id").map(|p| p.line), Some(8));
        assert_eq!(l.find("claims[0].same-law[1]").map(|p| p.line), Some(9));
        // Unknown leaf: falls back to the parent.
        assert_eq!(l.find("models.m.six-vertex.nope").map(|p| p.line), Some(4));
        assert!(l.problems().is_empty());
    }

    #[test]
    fn reports_duplicates_and_documents() {
        let l = Locations::of("a: 1\nb: 2\na: 3\n");
        assert_eq!(
            l.problems(),
            &[Structure::DuplicateKey {
                path: "a".into(),
                at: Position { line: 3, column: 1 },
                first: Position { line: 1, column: 1 }
            }]
        );
        let l = Locations::of("a: 1\n---\na: 2\n");
        assert!(matches!(
            l.problems(),
            [Structure::MultipleDocuments { .. }]
        ));
    }
}
