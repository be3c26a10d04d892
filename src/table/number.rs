//! Numbers in data tables, by one grammar that does not depend on locale:
//! `[+-]digits[.digits][(e|E)[+-]digits]` (or `.digits`), with a full stop
//! as the decimal mark and no grouping. Anything else is rejected with a
//! reason, so `1,234` (grouping or a decimal comma?) is never silently read
//! as 1 or 1234 or 1.234. Surrounding spaces are ignored.

use std::fmt;

/// Why a cell is not a number.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct NumberError {
    /// The text as found.
    pub text: String,
    /// What was wrong, for the user.
    pub reason: &'static str,
}

impl fmt::Display for NumberError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "'{}' is not a number: {}", self.text, self.reason)
    }
}

/// Parse one cell as a number by the fixed grammar.
pub fn parse_number(text: &str) -> Result<f64, NumberError> {
    let err = |reason| NumberError {
        text: text.to_string(),
        reason,
    };
    let t = text.trim();
    let b = t.as_bytes();
    let mut i = 0;
    if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
        i += 1;
    }
    let int_start = i;
    while i < b.len() && b[i].is_ascii_digit() {
        i += 1;
    }
    let mut digits = i - int_start;
    if i < b.len() && b[i] == b'.' {
        i += 1;
        let frac_start = i;
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        digits += i - frac_start;
    }
    if digits == 0 {
        return Err(err("expected digits"));
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        i += 1;
        if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
            i += 1;
        }
        let exp_start = i;
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        if i == exp_start {
            return Err(err("exponent without digits"));
        }
    }
    if i != b.len() {
        return Err(err(match b[i] {
            b',' => {
                "a comma is neither a decimal mark nor a thousands separator here; write numbers with a point and no grouping, e.g. 1234.5"
            }
            b' ' | b'_' | b'\'' => "digit grouping is not allowed; write the digits together",
            b'%' => "a percent sign is not allowed; write the number itself",
            _ => "unexpected character; numbers use digits, an optional sign, '.', and an exponent",
        }));
    }
    let v: f64 = t.parse().map_err(|_| err("not a number"))?;
    if !v.is_finite() {
        return Err(err("out of range"));
    }
    Ok(v)
}

/// Whether a cell looks like an attempt at a number (digits with signs,
/// marks, grouping, exponent or percent, and nothing else). Used to tell
/// value columns from text columns.
pub fn looks_numeric(text: &str) -> bool {
    let t = text.trim();
    t.bytes().any(|c| c.is_ascii_digit())
        && t.bytes()
            .all(|c| c.is_ascii_digit() || b"+-.,eE %'_".contains(&c))
}
