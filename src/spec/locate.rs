//! Where a key or an array element sits in a TOML spec file, so messages
//! about a value can name its line and column.
//!
//! The document is parsed with the `toml` crate's spanned parser
//! ([`toml::de::DeTable::parse`]), which keeps the byte span of every key
//! and value, so every way TOML (v1.0 specification) has of writing a key
//! is found: bare and quoted keys, dotted keys, inline tables, `[table]`
//! headers and `[[array of tables]]` elements.

use std::ops::Range;

use toml::de::{DeTable, DeValue};

/// One step of a path into a TOML document.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Step<'a> {
    /// A key of a table.
    Key(&'a str),
    /// An element of an array (0-based), including an array of tables.
    Index(usize),
}

/// The 1-based line and column of `byte_offset` in `text`, the column
/// counted in characters (Unicode scalar values) from the line's start.
/// An offset past the end is taken as the end; an offset inside a
/// character as the start of that character.
pub fn line_col(text: &str, byte_offset: usize) -> (usize, usize) {
    let mut end = byte_offset.min(text.len());
    while !text.is_char_boundary(end) {
        end -= 1;
    }
    let before = &text[..end];
    let line = before.matches('\n').count() + 1;
    let line_start = before.rfind('\n').map_or(0, |i| i + 1);
    let col = before[line_start..].chars().count() + 1;
    (line, col)
}

/// The byte span of the key (for a [`Step::Key`] last step) or of the
/// element (for a [`Step::Index`] last step) at `path` in the TOML
/// document `text`. An element of an array of tables spans its
/// `[[name]]` header; an element of an inline array spans the value as
/// written. A key that appears in several places (a table named in a
/// `[a.b]` header and again in `[a.c]`) is found where the parser first
/// saw it. `None` when the document does not parse, the path is empty,
/// or the path does not exist in it.
pub fn find(text: &str, path: &[Step]) -> Option<Range<usize>> {
    let root = DeTable::parse(text).ok()?;
    let (last, init) = path.split_last()?;
    let mut table: Option<&DeTable> = Some(root.get_ref());
    let mut array: Option<&[toml::Spanned<DeValue>]> = None;
    // Walk all steps but the last, keeping the current container.
    for step in init {
        let value = match *step {
            Step::Key(k) => entry(table?, k)?.1.get_ref(),
            Step::Index(i) => array?.get(i)?.get_ref(),
        };
        (table, array) = match value {
            DeValue::Table(t) => (Some(t), None),
            DeValue::Array(a) => (None, Some(a.as_ref())),
            _ => return None,
        };
    }
    match *last {
        Step::Key(k) => Some(entry(table?, k)?.0.span()),
        Step::Index(i) => Some(array?.get(i)?.span()),
    }
}

type Entry<'t, 'i> = (
    &'t toml::Spanned<toml::de::DeString<'i>>,
    &'t toml::Spanned<DeValue<'i>>,
);

fn entry<'t, 'i>(table: &'t DeTable<'i>, key: &str) -> Option<Entry<'t, 'i>> {
    table.iter().find(|(k, _)| k.get_ref().as_ref() == key)
}
