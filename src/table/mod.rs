//! Data tables from CSV (RFC 4180, through the `csv` crate): a key column
//! and value columns, numbers parsed by one fixed grammar (never by the
//! machine's locale), configurable missing-value markers.

pub mod csv_read;
pub mod number;
pub mod text;

pub use csv_read::{Cell, Row, Table, TableOptions, read_table_file, read_table_str};
pub use number::{NumberError, parse_number};

/// A CSV reader over `bytes` with a header row and records of equal
/// length. A leading byte-order mark (common in spreadsheet exports) is
/// skipped.
pub fn csv_reader(bytes: &[u8], delimiter: u8) -> csv::Reader<&[u8]> {
    let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
    csv::ReaderBuilder::new()
        .delimiter(delimiter)
        .has_headers(true)
        .flexible(false)
        .from_reader(bytes)
}
