//! Reading one numeric column of a CSV file into a [`Sample`].
//!
//! - The first record is the header; the column is chosen by its name.
//! - Numbers are read without locale: an optional sign, digits with an
//!   optional `.` decimal point, and an optional exponent (`1e3`, `2.5E-4`).
//!   Surrounding spaces are ignored. A decimal comma (`1,5`), thousands
//!   separators, `inf` and any other text are errors that name the file,
//!   the line and the column.
//! - Cells equal (after trimming spaces) to one of the missing-value markers
//!   are counted as missing and never enter a class. The default markers
//!   are the empty cell, `NA` and `NaN` ([`DEFAULT_MISSING`]); they are
//!   compared exactly (case matters).
//! - A UTF-8 byte-order mark at the start of the file is ignored.

use crate::table::number;
use std::path::Path;

use super::Sample;
use crate::error::Error;

/// The missing-value markers used when none are given.
pub const DEFAULT_MISSING: &[&str] = &["", "NA", "NaN"];

/// What to read.
#[derive(Debug, Clone, PartialEq)]
pub struct ColumnSpec {
    /// The header name of the column.
    pub column: String,
    /// The field delimiter (`b','` unless told otherwise).
    pub delimiter: u8,
    /// Cells that mean "missing".
    pub missing: Vec<String>,
}

impl ColumnSpec {
    /// Read column `column` with a comma delimiter and the default markers.
    pub fn new(column: &str) -> ColumnSpec {
        ColumnSpec {
            column: column.to_string(),
            delimiter: b',',
            missing: DEFAULT_MISSING.iter().map(|s| s.to_string()).collect(),
        }
    }
}

/// Read the column from the file at `path`.
pub fn read(path: &Path, spec: &ColumnSpec) -> Result<Sample, Error> {
    let bytes = std::fs::read(path).map_err(|source| Error::Read {
        path: path.to_path_buf(),
        source,
    })?;
    parse(&bytes, path, spec)
}

/// Parse the column from CSV `bytes`; `path` names the file in messages.
pub fn parse(bytes: &[u8], path: &Path, spec: &ColumnSpec) -> Result<Sample, Error> {
    let invalid = |location: Option<String>, message: String| Error::Invalid {
        path: path.to_path_buf(),
        location,
        message,
    };
    let mut reader = crate::table::csv_reader(bytes, spec.delimiter);
    let headers = reader
        .headers()
        .map_err(|e| {
            invalid(
                Some("line 1".into()),
                format!("cannot read the header: {e}"),
            )
        })?
        .clone();
    let col = headers
        .iter()
        .position(|h| h.trim() == spec.column)
        .ok_or_else(|| {
            let names: Vec<String> = headers.iter().map(|h| format!("'{h}'")).collect();
            invalid(
                Some("line 1".into()),
                format!(
                    "no column named '{}'; the header has {}",
                    spec.column,
                    names.join(", ")
                ),
            )
        })?;
    let mut values = Vec::new();
    let mut missing = 0usize;
    let mut record = csv::StringRecord::new();
    loop {
        match reader.read_record(&mut record) {
            Ok(false) => break,
            Ok(true) => {}
            Err(e) => {
                let line = e.position().map(|p| p.line()).unwrap_or(0);
                return Err(invalid(
                    Some(format!("line {line}")),
                    format!("not a valid CSV record: {e}"),
                ));
            }
        }
        let line = record.position().map(|p| p.line()).unwrap_or(0);
        let cell = record.get(col).unwrap_or("");
        let cell = cell.trim();
        if spec.missing.iter().any(|m| m.trim() == cell) {
            missing += 1;
            continue;
        }
        match parse_number(cell) {
            Ok(v) => values.push(v),
            Err(why) => {
                return Err(invalid(
                    Some(format!(
                        "line {line}, column {} ('{}')",
                        col + 1,
                        spec.column
                    )),
                    why,
                ));
            }
        }
    }
    Sample::new(values, missing)
}

/// Parse one number with the data-table grammar of
/// [`crate::table::number`] (a point as the decimal mark, no grouping), or
/// say what is wrong.
pub fn parse_number(cell: &str) -> Result<f64, String> {
    if cell.is_empty() {
        return Err(
            "empty cell, and the empty cell is not a missing-value marker here; expected a number"
                .into(),
        );
    }
    number::parse_number(cell).map_err(|e| {
        if cell.contains(',') && number::parse_number(&cell.replace(',', ".")).is_ok() {
            format!("'{cell}' is not a number: the decimal point must be '.', not ','")
        } else {
            format!("{e} (expected e.g. 12, -3.5 or 1.2e3, or a missing-value marker)")
        }
    })
}
