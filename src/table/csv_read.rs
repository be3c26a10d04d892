//! Reading a CSV data table: header row, key column, value columns.

use std::path::Path;

use super::number::{looks_numeric, parse_number};
use crate::error::{Error, Result};

/// How to read a table.
#[derive(Debug, Clone)]
pub struct TableOptions {
    /// The key column's header.
    pub key_column: String,
    /// Value columns; `None` takes every other column whose non-missing
    /// cells all look numeric (text columns such as names are skipped).
    pub value_columns: Option<Vec<String>>,
    /// Cell texts (after trimming) that mean "no value".
    pub missing_markers: Vec<String>,
}

/// The default missing-value markers: empty, `NA`, `N/A`, `null`, `-`.
pub const DEFAULT_MISSING: [&str; 5] = ["", "NA", "N/A", "null", "-"];

impl TableOptions {
    /// Options for `key_column` with the defaults for the rest.
    pub fn new(key_column: &str) -> Self {
        TableOptions {
            key_column: key_column.to_string(),
            value_columns: None,
            missing_markers: DEFAULT_MISSING.iter().map(|s| s.to_string()).collect(),
        }
    }
}

/// One value cell.
#[derive(Debug, Clone, PartialEq)]
pub enum Cell {
    /// A number.
    Number(f64),
    /// A missing-value marker.
    Missing,
    /// Not a number: the text and why.
    Invalid(String, &'static str),
}

/// One data row.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// 1-based line in the file where the record starts.
    pub line: u64,
    /// The key as written.
    pub key: String,
    /// One cell per value column.
    pub values: Vec<Cell>,
}

/// A table of rows.
#[derive(Debug, Clone, PartialEq)]
pub struct Table {
    /// The key column's header.
    pub key_column: String,
    /// The value columns, in file order.
    pub value_columns: Vec<String>,
    /// The rows, in file order.
    pub rows: Vec<Row>,
}

/// Read a CSV file.
pub fn read_table_file(path: &Path, options: &TableOptions) -> Result<Table> {
    let text = std::fs::read(path).map_err(|source| Error::Read {
        path: path.to_path_buf(),
        source,
    })?;
    read_table_bytes(&text, options).map_err(|(location, message)| Error::Invalid {
        path: path.to_path_buf(),
        location,
        message,
    })
}

/// Read CSV text (for tests and in-memory use).
pub fn read_table_str(
    text: &str,
    options: &TableOptions,
) -> std::result::Result<Table, (Option<String>, String)> {
    read_table_bytes(text.as_bytes(), options)
}

fn read_table_bytes(
    bytes: &[u8],
    options: &TableOptions,
) -> std::result::Result<Table, (Option<String>, String)> {
    let mut rdr = super::csv_reader(bytes, b',');
    let headers: Vec<String> = rdr
        .headers()
        .map_err(|e| {
            (
                Some("line 1".to_string()),
                format!("cannot read the header: {e}"),
            )
        })?
        .iter()
        .map(|h| h.trim().to_string())
        .collect();
    let find = |name: &str| {
        headers.iter().position(|h| h == name).ok_or_else(|| {
            (
                Some("line 1".to_string()),
                format!(
                    "no column '{name}'; the columns are: {}",
                    headers.join(", ")
                ),
            )
        })
    };
    let key_idx = find(&options.key_column)?;
    let mut records = Vec::new();
    for rec in rdr.records() {
        let rec = rec.map_err(|e| {
            let loc = e.position().map(|p| format!("line {}", p.line()));
            (loc, format!("not valid CSV (RFC 4180): {e}"))
        })?;
        let line = rec.position().map(|p| p.line()).unwrap_or(0);
        records.push((line, rec));
    }
    let is_missing = |s: &str| options.missing_markers.iter().any(|m| m == s.trim());
    let value_idx: Vec<usize> = match &options.value_columns {
        Some(cols) => cols
            .iter()
            .map(|c| find(c))
            .collect::<std::result::Result<_, _>>()?,
        None => (0..headers.len())
            .filter(|&i| i != key_idx)
            .filter(|&i| {
                let mut any = false;
                let all = records.iter().all(|(_, r)| {
                    let c = &r[i];
                    if is_missing(c) {
                        true
                    } else {
                        any = true;
                        looks_numeric(c)
                    }
                });
                all && any
            })
            .collect(),
    };
    let rows = records
        .iter()
        .map(|(line, r)| Row {
            line: *line,
            key: r[key_idx].to_string(),
            values: value_idx
                .iter()
                .map(|&i| {
                    let c = &r[i];
                    if is_missing(c) {
                        Cell::Missing
                    } else {
                        match parse_number(c) {
                            Ok(v) => Cell::Number(v),
                            Err(e) => Cell::Invalid(e.text, e.reason),
                        }
                    }
                })
                .collect(),
        })
        .collect();
    Ok(Table {
        key_column: options.key_column.clone(),
        value_columns: value_idx.iter().map(|&i| headers[i].clone()).collect(),
        rows,
    })
}
