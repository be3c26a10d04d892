//! The spec stage: a TOML figure spec read into [`schema::Spec`], with
//! errors that name the file, the line and the key, and suggest the
//! nearest known key for a misspelt one.
//!
//! Validation beyond the shape of the file (units, colours, columns,
//! levels of measurement) belongs to [`crate::figure`], which reports
//! through [`SpecFile::error`] so its errors carry lines too.

pub mod length;
pub mod locate;
pub mod schema;
pub mod suggest;

use std::path::{Path, PathBuf};

use crate::error::Error;
use locate::{Step, find, line_col};

/// A spec file read and parsed, with its text kept for locating keys.
#[derive(Debug, Clone)]
pub struct SpecFile {
    /// The file as given.
    pub path: PathBuf,
    /// Its text.
    pub text: String,
    /// The parsed tables.
    pub spec: schema::Spec,
}

impl SpecFile {
    /// Read and parse a spec file.
    pub fn read(path: &Path) -> Result<SpecFile, Error> {
        let text = std::fs::read_to_string(path).map_err(|source| Error::Read {
            path: path.to_path_buf(),
            source,
        })?;
        SpecFile::parse(path, text)
    }

    /// Parse spec text (`path` names it in errors and anchors relative
    /// paths).
    pub fn parse(path: &Path, text: String) -> Result<SpecFile, Error> {
        match toml::from_str::<schema::Spec>(&text) {
            Ok(spec) => Ok(SpecFile {
                path: path.to_path_buf(),
                text,
                spec,
            }),
            Err(e) => Err(Error::Invalid {
                path: path.to_path_buf(),
                location: e.span().map(|s| location(&text, s.start, None)),
                message: explain(&text, &e),
            }),
        }
    }

    /// The directory relative paths in the spec start from.
    pub fn base_dir(&self) -> PathBuf {
        self.path
            .parent()
            .map(Path::to_path_buf)
            .unwrap_or_default()
    }

    /// A path from the spec, resolved against the spec's directory.
    pub fn resolve(&self, relative: &str) -> PathBuf {
        let p = Path::new(relative);
        if p.is_absolute() {
            p.to_path_buf()
        } else {
            self.base_dir().join(p)
        }
    }

    /// Where `key` (a dotted path) sits: `line L, column C, key K`, or
    /// `key K` when it is not written in the file.
    pub fn location(&self, key: &str) -> String {
        let steps: Vec<Step> = key
            .split('.')
            .map(|s| match s.parse::<usize>() {
                Ok(i) => Step::Index(i),
                Err(_) => Step::Key(s),
            })
            .collect();
        match find(&self.text, &steps) {
            Some(span) => location(&self.text, span.start, Some(key)),
            None => format!("key {key}"),
        }
    }

    /// An error about the value at `key` (a dotted path such as
    /// `map.border_width` or `colors.list.2`), located in the file.
    pub fn error(&self, key: &str, message: impl Into<String>) -> Error {
        Error::Invalid {
            path: self.path.clone(),
            location: Some(self.location(key)),
            message: message.into(),
        }
    }
}

fn location(text: &str, offset: usize, key: Option<&str>) -> String {
    let (line, col) = line_col(text, offset);
    match key {
        Some(k) => format!("line {line}, column {col}, key {k}"),
        None => format!("line {line}, column {col}"),
    }
}

/// The table header (`[name]`) in force at `offset`.
fn table_at(text: &str, offset: usize) -> Option<String> {
    text[..offset.min(text.len())]
        .lines()
        .rev()
        .map(str::trim)
        .find(|l| l.starts_with('['))
        .map(|l| l.trim_matches(|c| c == '[' || c == ']').trim().to_string())
}

/// A user's message for a TOML or shape error, with "did you mean" for an
/// unknown key.
fn explain(text: &str, e: &toml::de::Error) -> String {
    let msg = e.message().trim().to_string();
    let Some(rest) = msg.strip_prefix("unknown field `") else {
        return plain_types(
            &msg.replace("missing field", "missing key")
                .replace('`', "'"),
        );
    };
    let Some((word, tail)) = rest.split_once('`') else {
        return msg;
    };
    let known: Vec<&str> = tail.split('`').skip(1).step_by(2).collect();
    let table = e
        .span()
        .and_then(|s| table_at(text, s.start))
        .map(|t| format!(" in [{t}]"))
        .unwrap_or_else(|| " at the top level".into());
    let mut out = format!("unknown key '{word}'{table}");
    if let Some(s) = suggest::closest(word, &known) {
        out.push_str(&format!("; did you mean '{s}'?"));
    }
    if !known.is_empty() {
        out.push_str(&format!(" Known keys: {}.", known.join(", ")));
    }
    out
}

/// serde's names of Rust types in a message, in words for the user.
fn plain_types(msg: &str) -> String {
    let mut out = msg.to_string();
    for (rust, plain) in [
        ("expected usize", "expected a whole number, 0 or more"),
        ("expected u64", "expected a whole number, 0 or more"),
        ("expected u32", "expected a whole number, 0 or more"),
        ("expected u16", "expected a whole number, 0 or more"),
        ("expected u8", "expected a whole number, 0 or more"),
        ("expected i64", "expected a whole number"),
        ("expected i32", "expected a whole number"),
        ("expected f64", "expected a number"),
        ("expected f32", "expected a number"),
    ] {
        if let Some(i) = out.find(rust) {
            // Only whole words: `u8` must not match inside a longer name.
            let end = i + rust.len();
            if !out[end..].starts_with(|c: char| c.is_ascii_alphanumeric()) {
                out.replace_range(i..end, plain);
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn parse(text: &str) -> Result<SpecFile, Error> {
        SpecFile::parse(Path::new("fig.toml"), text.to_string())
    }

    #[test]
    fn unknown_key_gets_line_and_suggestion() {
        let e = parse("[figure]\nkind = \"choropleth\"\n\n[data]\ntable = \"a.csv\"\nkey = \"k\"\nlevle = \"ratio\"\n")
            .unwrap_err()
            .to_string();
        assert!(e.contains("line 7"), "{e}");
        assert!(e.contains("unknown key 'levle' in [data]"), "{e}");
        assert!(e.contains("did you mean 'level'?"), "{e}");
    }

    #[test]
    fn missing_table_is_named() {
        let e = parse("[figure]\nkind = \"choropleth\"\n")
            .unwrap_err()
            .to_string();
        assert!(e.contains("missing key 'data'"), "{e}");
    }

    #[test]
    fn semantic_errors_locate_keys() {
        let f = parse("[figure]\nkind = \"dot-plot\"\nwidth = \"89\"\n[data]\ntable = \"a.csv\"\nkey = \"k\"\n").unwrap();
        let e = f.error("figure.width", "bad").to_string();
        assert!(e.contains("line 3, column 1, key figure.width"), "{e}");
    }
}
