//! The join on a deliberately dirty table (tests/fixtures/join/dirty.csv:
//! a key that lost its leading zero, a key with a trailing space, missing
//! values, a quoted "1,234" (RFC 4180 section 2 quoting), a row with no
//! shape and a duplicate key), and the fixed number grammar.

use hueproof::geo::{KeySource, ReadOptions, read_geojson_file};
use hueproof::join::{join, normalize_key};
use hueproof::table::{Cell, TableOptions, parse_number, read_table_file, read_table_str};

fn fixture(name: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(name)
}

fn inputs() -> (hueproof::geo::Layer, hueproof::table::Table) {
    let layer = read_geojson_file(
        &fixture("geo/districts.geojson"),
        &ReadOptions {
            key: Some(KeySource::Property("code".into())),
            ..ReadOptions::default()
        },
    )
    .unwrap();
    let table = read_table_file(&fixture("join/dirty.csv"), &TableOptions::new("code")).unwrap();
    (layer, table)
}

#[test]
fn dirty_table_exact_keys() {
    let (layer, table) = inputs();
    // `name` holds text, so only `rate` and `count` are value columns.
    assert_eq!(table.value_columns, ["rate", "count"]);
    let r = join(&layer, &table, false);
    assert_eq!(r.matched, 2);
    assert_eq!(r.rows_without_shape, ["1001", "01002 ", "01099"]);
    assert_eq!(r.shapes_without_row, ["01001", "01002", "01005", "01006"]);
    assert_eq!(r.rows_with_missing_values, ["01002 ", "01004"]);
    assert_eq!(r.duplicate_keys, ["01004"]);
    // Both rows of the duplicate are named (file lines 5 and 7).
    assert_eq!((r.duplicates[0].first, r.duplicates[0].second), (5, 7));
    assert_eq!(r.invalid_values.len(), 1);
    assert_eq!(r.invalid_values[0].text, "1,234");
    assert_eq!(r.would_match_normalized, 2);
    assert!(!r.is_complete());
    // A figure refuses to render with duplicates, naming both rows.
    let err = r.require_unique_keys().unwrap_err();
    assert!(err.contains("'01004' (row lines 5 and 7)"), "{err}");
}

#[test]
fn dirty_table_normalised_keys() {
    let (layer, table) = inputs();
    let r = join(&layer, &table, true);
    assert_eq!(r.matched, 4);
    assert_eq!(r.rows_without_shape, ["01099"]);
    assert_eq!(r.shapes_without_row, ["01005", "01006"]);
    let json = serde_json::to_value(&r).unwrap();
    for k in [
        "matched",
        "rows_without_shape",
        "shapes_without_row",
        "rows_with_missing_values",
        "duplicate_keys",
    ] {
        assert!(json.get(k).is_some(), "{k}");
    }
}

#[test]
fn key_normalisation() {
    assert_eq!(normalize_key(" 08031 "), "8031");
    assert_eq!(normalize_key("8031"), "8031");
    assert_eq!(normalize_key("000"), "0");
    assert_eq!(normalize_key(" ab-1 "), "AB-1");
    // Not all digits: zeros are kept.
    assert_eq!(normalize_key("0A1"), "0A1");
}

/// Numbers by one grammar (the decimal-literal shape common to RFC 8259
/// JSON numbers, with a leading '+' or '.' also allowed), never by locale.
#[test]
fn numbers_without_locale_surprises() {
    assert_eq!(parse_number("12.5"), Ok(12.5));
    assert_eq!(parse_number(" -3e2 "), Ok(-300.0));
    assert_eq!(parse_number(".5"), Ok(0.5));
    assert_eq!(parse_number("+7"), Ok(7.0));
    for bad in [
        "1,234", "3,5", "1 234", "12%", "inf", "NaN", "0x10", "1e", "", ".",
    ] {
        assert!(parse_number(bad).is_err(), "{bad}");
    }
    assert!(parse_number("1,5").unwrap_err().reason.contains("comma"));
}

#[test]
fn missing_markers_are_configurable() {
    let text = "k,v\na,NA\nb,n/d\nc,\n";
    let mut o = TableOptions::new("k");
    o.value_columns = Some(vec!["v".into()]);
    let t = read_table_str(text, &o).unwrap();
    assert_eq!(t.rows[0].values[0], Cell::Missing);
    assert!(matches!(t.rows[1].values[0], Cell::Invalid(..)));
    o.missing_markers = vec!["n/d".into(), "".into()];
    let t = read_table_str(text, &o).unwrap();
    assert!(matches!(t.rows[0].values[0], Cell::Invalid(..)));
    assert_eq!(t.rows[1].values[0], Cell::Missing);
    assert_eq!(t.rows[2].values[0], Cell::Missing);
    // An unknown key column names the columns that exist.
    let err = read_table_str(text, &TableOptions::new("code")).unwrap_err();
    assert!(err.1.contains("k, v"), "{}", err.1);
}
