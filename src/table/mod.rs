//! Data tables from CSV (RFC 4180, through the `csv` crate): a key column
//! and value columns, numbers parsed by one fixed grammar (never by the
//! machine's locale), configurable missing-value markers.

pub mod csv_read;
pub mod number;
pub mod text;

pub use csv_read::{Cell, Row, Table, TableOptions, read_table_file, read_table_str};
pub use number::{NumberError, parse_number};
