//! Physical lengths in a spec: `89mm`, `3.5in`, `7pt`, `2.5cm`.
//!
//! Everything is converted to PostScript points (1 in = 72 pt exactly;
//! 1 in = 25.4 mm exactly, by the international inch of 1959). Figures are
//! laid out in points, so stroke widths and text sizes keep their units.

/// Points per inch (the PostScript point).
pub const PT_PER_IN: f64 = 72.0;
/// Millimetres per inch (the international inch).
pub const MM_PER_IN: f64 = 25.4;

/// Points in `mm` millimetres.
pub fn mm_to_pt(mm: f64) -> f64 {
    mm * PT_PER_IN / MM_PER_IN
}

/// Millimetres in `pt` points.
pub fn pt_to_mm(pt: f64) -> f64 {
    pt * MM_PER_IN / PT_PER_IN
}

/// Parse a length with a unit into points. The message says what was
/// expected.
pub fn parse_length(text: &str) -> Result<f64, String> {
    let t = text.trim();
    let split = t
        .find(|c: char| c.is_ascii_alphabetic())
        .ok_or_else(|| expected(text))?;
    let (num, unit) = t.split_at(split);
    let v: f64 = num.trim().parse().map_err(|_| expected(text))?;
    if !v.is_finite() || v < 0.0 {
        return Err(format!("expected a non-negative length, got '{text}'"));
    }
    let factor = match unit.trim().to_ascii_lowercase().as_str() {
        "pt" => 1.0,
        "mm" => PT_PER_IN / MM_PER_IN,
        "cm" => 10.0 * PT_PER_IN / MM_PER_IN,
        "in" => PT_PER_IN,
        _ => return Err(expected(text)),
    };
    Ok(v * factor)
}

fn expected(text: &str) -> String {
    format!(
        "expected a length with a unit (mm, cm, in or pt), e.g. \"89mm\" or \"0.5pt\"; got '{text}'"
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn units_convert_by_the_definitions() {
        // 1 in = 25.4 mm = 72 pt (definitions of the inch and the PostScript point).
        assert_eq!(parse_length("1in").unwrap(), 72.0);
        assert!((parse_length("25.4mm").unwrap() - 72.0).abs() < 1e-12);
        assert!((parse_length("2.54cm").unwrap() - 72.0).abs() < 1e-12);
        assert_eq!(parse_length(" 7 pt").unwrap(), 7.0);
        assert!(parse_length("7").is_err());
        assert!(parse_length("7px").is_err());
        assert!(parse_length("-1mm").is_err());
    }
}
