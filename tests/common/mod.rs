//! Helpers shared by the integration tests: reading the reference fixtures.

#![allow(dead_code)]

use std::collections::HashMap;
use std::path::PathBuf;

/// Path of a file in `tests/fixtures`.
pub fn fixture(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(name)
}

/// Read a reference CSV (lines starting with `#` are provenance comments)
/// into one map per row, keyed by the header.
pub fn read_csv(name: &str) -> Vec<HashMap<String, String>> {
    let mut r = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(fixture(name))
        .unwrap_or_else(|e| panic!("{name}: {e}"));
    let headers = r.headers().unwrap().clone();
    r.records()
        .map(|rec| {
            let rec = rec.unwrap();
            headers
                .iter()
                .zip(rec.iter())
                .map(|(h, v)| (h.to_string(), v.to_string()))
                .collect()
        })
        .collect()
}

/// A float column of a row.
pub fn f(row: &HashMap<String, String>, key: &str) -> f64 {
    row.get(key)
        .unwrap_or_else(|| panic!("no column {key}"))
        .parse()
        .unwrap_or_else(|e| panic!("{key}: {e}"))
}

/// Assert `|a - b| <= tol` with a message.
pub fn close(a: f64, b: f64, tol: f64, what: &str) {
    assert!((a - b).abs() <= tol, "{what}: {a} vs {b} (tolerance {tol})");
}
