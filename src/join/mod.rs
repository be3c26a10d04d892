//! Joining shapes to data rows by key, and the join report.
//!
//! Keys match exactly unless normalisation is asked for; then both sides
//! are trimmed, compared without regard to case, and keys made only of
//! digits lose their leading zeros (so a code that a spreadsheet turned
//! from `08031` into `8031` still matches). The report always lists keys as
//! written in the files.

pub mod key;
pub mod report;

use std::collections::BTreeMap;

use serde::Serialize;

pub use key::normalize_key;

use crate::geo::model::Layer;
use crate::table::{Cell, Table};

/// A value that is not a number.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct InvalidValue {
    /// The row's key.
    pub key: String,
    /// The row's line in the file.
    pub line: u64,
    /// The column.
    pub column: String,
    /// The text found.
    pub text: String,
    /// Why it is not a number.
    pub reason: String,
}

/// One key that occurs twice, with where.
#[derive(Debug, Clone, PartialEq)]
pub struct Duplicate {
    /// `"row"` (data table, lines) or `"shape"` (features, indices).
    pub side: &'static str,
    /// The key as first written.
    pub key: String,
    /// Line (rows) or feature index (shapes) of the first occurrence.
    pub first: u64,
    /// Line or feature index of the repeat.
    pub second: u64,
}

/// The join report. The JSON form holds the first five fields as the
/// documented shape plus `value_columns` and `invalid_values`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct JoinReport {
    /// Number of keys present on both sides.
    pub matched: usize,
    /// Keys of rows with no shape, in row order.
    pub rows_without_shape: Vec<String>,
    /// Keys of shapes with no row, in feature order (`#i` for a feature
    /// without a key). They get the figure's no-data treatment.
    pub shapes_without_row: Vec<String>,
    /// Keys of rows with a missing value in any value column.
    pub rows_with_missing_values: Vec<String>,
    /// Keys that occur more than once on either side, sorted.
    pub duplicate_keys: Vec<String>,
    /// The value columns that were read.
    pub value_columns: Vec<String>,
    /// Cells of value columns that are not numbers.
    pub invalid_values: Vec<InvalidValue>,
    /// Each duplicate with both places (text report).
    #[serde(skip)]
    pub duplicates: Vec<Duplicate>,
    /// Whether keys were normalised.
    #[serde(skip)]
    pub normalized: bool,
    /// Without normalisation: how many unmatched rows would match with it.
    #[serde(skip)]
    pub would_match_normalized: usize,
    /// The (feature index, row index) pairs that matched.
    #[serde(skip)]
    pub pairs: Vec<(usize, usize)>,
}

impl JoinReport {
    /// True when every row and every shape matched, without duplicates or
    /// invalid numbers (missing values alone do not count against it).
    pub fn is_complete(&self) -> bool {
        self.rows_without_shape.is_empty()
            && self.shapes_without_row.is_empty()
            && self.duplicate_keys.is_empty()
            && self.invalid_values.is_empty()
    }
}

impl JoinReport {
    /// What a figure requires before it renders: no duplicate key on
    /// either side. The error names every duplicate with both places.
    pub fn require_unique_keys(&self) -> Result<(), String> {
        if self.duplicates.is_empty() {
            return Ok(());
        }
        let list: Vec<String> = self
            .duplicates
            .iter()
            .map(|d| {
                let unit = if d.side == "row" { "lines" } else { "features" };
                format!(
                    "'{}' ({} {unit} {} and {})",
                    d.key, d.side, d.first, d.second
                )
            })
            .collect();
        Err(format!(
            "duplicate keys make the join ambiguous, so the figure is not drawn: {}",
            list.join(", ")
        ))
    }
}

/// Join a layer's features to a table's rows by key.
pub fn join(layer: &Layer, table: &Table, normalize: bool) -> JoinReport {
    let norm = |k: &str| {
        if normalize {
            normalize_key(k)
        } else {
            k.to_string()
        }
    };
    let mut duplicates = Vec::new();
    // Shapes by key: first feature index for each key.
    let mut shapes: BTreeMap<String, usize> = BTreeMap::new();
    for f in layer.features() {
        if let Some(k) = &f.key {
            if let Some(&first) = shapes.get(&norm(k)) {
                duplicates.push(Duplicate {
                    side: "shape",
                    key: k.clone(),
                    first: first as u64,
                    second: f.index as u64,
                });
            } else {
                shapes.insert(norm(k), f.index);
            }
        }
    }
    let mut rows: BTreeMap<String, usize> = BTreeMap::new();
    for (i, r) in table.rows.iter().enumerate() {
        let k = norm(&r.key);
        if let Some(&first) = rows.get(&k) {
            duplicates.push(Duplicate {
                side: "row",
                key: r.key.clone(),
                first: table.rows[first].line,
                second: r.line,
            });
        } else {
            rows.insert(k, i);
        }
    }
    let mut pairs = Vec::new();
    for (k, &fi) in &shapes {
        if let Some(&ri) = rows.get(k) {
            pairs.push((fi, ri));
        }
    }
    pairs.sort_unstable();
    let rows_without_shape: Vec<String> = table
        .rows
        .iter()
        .filter(|r| !shapes.contains_key(&norm(&r.key)))
        .map(|r| r.key.clone())
        .collect();
    let shapes_without_row: Vec<String> = layer
        .features()
        .iter()
        .filter(|f| f.key.as_ref().is_none_or(|k| !rows.contains_key(&norm(k))))
        .map(|f| f.display_key())
        .collect();
    let would_match_normalized = if normalize {
        0
    } else {
        let shape_norm: std::collections::BTreeSet<String> = layer
            .features()
            .iter()
            .filter_map(|f| f.key.as_deref().map(normalize_key))
            .collect();
        table
            .rows
            .iter()
            .filter(|r| !shapes.contains_key(&r.key))
            .filter(|r| shape_norm.contains(&normalize_key(&r.key)))
            .count()
    };
    let mut rows_with_missing_values = Vec::new();
    let mut invalid_values = Vec::new();
    for r in &table.rows {
        if r.values.contains(&Cell::Missing) {
            rows_with_missing_values.push(r.key.clone());
        }
        for (c, col) in r.values.iter().zip(&table.value_columns) {
            if let Cell::Invalid(text, reason) = c {
                invalid_values.push(InvalidValue {
                    key: r.key.clone(),
                    line: r.line,
                    column: col.clone(),
                    text: text.clone(),
                    reason: reason.to_string(),
                });
            }
        }
    }
    let mut duplicate_keys: Vec<String> = duplicates.iter().map(|d| d.key.clone()).collect();
    duplicate_keys.sort();
    duplicate_keys.dedup();
    JoinReport {
        matched: pairs.len(),
        rows_without_shape,
        shapes_without_row,
        rows_with_missing_values,
        duplicate_keys,
        value_columns: table.value_columns.clone(),
        invalid_values,
        duplicates,
        normalized: normalize,
        would_match_normalized,
        pairs,
    }
}
