//! CSV tables kept as text, for figures whose columns hold categories as
//! well as numbers. Numbers are parsed on demand with the same grammar as
//! [`super::number`].

use std::path::{Path, PathBuf};

use crate::error::Error;

/// A CSV table of text cells.
#[derive(Debug, Clone, PartialEq)]
pub struct TextTable {
    /// The file, for messages.
    pub path: PathBuf,
    /// Header names, trimmed.
    pub headers: Vec<String>,
    /// Records: 1-based start line and the cells, trimmed.
    pub rows: Vec<(u64, Vec<String>)>,
}

impl TextTable {
    /// Read a CSV file (a leading byte-order mark is ignored).
    pub fn read(path: &Path) -> Result<TextTable, Error> {
        let bytes = std::fs::read(path).map_err(|source| Error::Read {
            path: path.to_path_buf(),
            source,
        })?;
        TextTable::from_bytes(path, &bytes)
    }

    /// Parse CSV bytes; `path` names the data in messages.
    pub fn from_bytes(path: &Path, bytes: &[u8]) -> Result<TextTable, Error> {
        let invalid = |location: Option<String>, message: String| Error::Invalid {
            path: path.to_path_buf(),
            location,
            message,
        };
        let mut rdr = super::csv_reader(bytes, b',');
        let headers: Vec<String> = rdr
            .headers()
            .map_err(|e| {
                invalid(
                    Some("line 1".into()),
                    format!("cannot read the header: {e}"),
                )
            })?
            .iter()
            .map(|h| h.trim().to_string())
            .collect();
        if headers.iter().all(String::is_empty) {
            return Err(invalid(
                Some("line 1".into()),
                "the file is empty; expected a header row naming the columns, then one row per record"
                    .into(),
            ));
        }
        let mut rows = Vec::new();
        for rec in rdr.records() {
            let rec = rec.map_err(|e| {
                let line = e.position().map(|p| p.line());
                invalid(
                    line.map(|l| format!("line {l}")),
                    format!(
                        "not a well-formed CSV record ({e}); expected {} fields as in the header",
                        headers.len()
                    ),
                )
            })?;
            let line = rec.position().map_or(0, |p| p.line());
            rows.push((line, rec.iter().map(|c| c.trim().to_string()).collect()));
        }
        Ok(TextTable {
            path: path.to_path_buf(),
            headers,
            rows,
        })
    }

    /// The index of column `name`, or an error that lists the columns and
    /// suggests the nearest; `asked_by` says which spec key wanted it.
    pub fn column(&self, name: &str, asked_by: &str) -> Result<usize, Error> {
        if let Some(i) = self.headers.iter().position(|h| h == name) {
            return Ok(i);
        }
        let known: Vec<&str> = self.headers.iter().map(String::as_str).collect();
        let hint = crate::spec::suggest::closest(name, &known)
            .map(|s| format!(" Did you mean '{s}'?"))
            .unwrap_or_default();
        Err(Error::Invalid {
            path: self.path.clone(),
            location: Some("line 1".into()),
            message: format!(
                "no column '{name}' (asked for by {asked_by}); the columns are: {}.{hint}",
                known.join(", ")
            ),
        })
    }
}
