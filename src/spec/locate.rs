//! Where a key sits in a TOML document, for error messages.

use std::ops::Range;

/// One step of a key path.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Step<'a> {
    /// A table key.
    Key(&'a str),
    /// An array element.
    Index(usize),
}

/// 1-based line and column (in characters) of a byte offset.
pub fn line_col(text: &str, byte_offset: usize) -> (usize, usize) {
    let before = &text[..byte_offset.min(text.len())];
    let line = before.matches('\n').count() + 1;
    let col = before.rsplit('\n').next().map_or(0, |l| l.chars().count()) + 1;
    (line, col)
}

/// Byte span of the key (or array element) at `path`.
pub fn find(text: &str, path: &[Step]) -> Option<Range<usize>> {
    let doc = toml::de::DeTable::parse(text).ok()?;
    let mut table = doc.get_ref();
    let mut span = None;
    let mut value: Option<&toml::Spanned<toml::de::DeValue>> = None;
    for step in path {
        match (step, value) {
            (Step::Key(k), None) => {
                let (key, v) = table.get_key_value(*k)?;
                span = Some(key.span());
                value = Some(v);
            }
            (Step::Key(k), Some(v)) => {
                let t = v.get_ref().as_table()?;
                let (key, v2) = t.get_key_value(*k)?;
                span = Some(key.span());
                value = Some(v2);
            }
            (Step::Index(i), Some(v)) => {
                let a = v.get_ref().as_array()?;
                let e = a.get(*i)?;
                span = Some(e.span());
                value = Some(e);
            }
            (Step::Index(_), None) => return None,
        }
        if let Some(v) = value {
            if let Some(t) = v.get_ref().as_table() {
                table = t;
            }
        }
    }
    span
}
