//! The join report as text: every list in full.

use std::fmt::Write as _;

use super::JoinReport;

/// Render the report for a terminal.
pub fn render_text(r: &JoinReport) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "matched: {} key(s){}",
        r.matched,
        if r.normalized {
            " (keys normalised: trimmed, case-folded, leading zeros of numeric keys dropped)"
        } else {
            ""
        }
    );
    let _ = writeln!(s, "value columns: {}", list_or_none(&r.value_columns));
    section(&mut s, "rows without a shape", &r.rows_without_shape);
    section(
        &mut s,
        "shapes without a row (drawn as no data)",
        &r.shapes_without_row,
    );
    section(
        &mut s,
        "rows with missing values",
        &r.rows_with_missing_values,
    );
    let _ = writeln!(s, "duplicate keys: {}", r.duplicates.len());
    for d in &r.duplicates {
        let (what, unit) = if d.side == "row" {
            ("data rows", "lines")
        } else {
            ("shapes", "features")
        };
        let _ = writeln!(
            s,
            "  '{}': {what} on {unit} {} and {}",
            d.key, d.first, d.second
        );
    }
    let _ = writeln!(s, "values that are not numbers: {}", r.invalid_values.len());
    for v in &r.invalid_values {
        let _ = writeln!(
            s,
            "  line {}, key '{}', column '{}': '{}': {}",
            v.line, v.key, v.column, v.text, v.reason
        );
    }
    if r.would_match_normalized > 0 {
        let _ = writeln!(
            s,
            "hint: {} unmatched row(s) would match with --normalize-keys",
            r.would_match_normalized
        );
    }
    s
}

fn list_or_none(v: &[String]) -> String {
    if v.is_empty() {
        "none".into()
    } else {
        v.join(", ")
    }
}

fn section(s: &mut String, title: &str, keys: &[String]) {
    let _ = writeln!(s, "{title}: {}", keys.len());
    for k in keys {
        let _ = writeln!(s, "  '{k}'");
    }
}
