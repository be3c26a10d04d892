//! The one font hueproof draws with, embedded in the binary (DejaVu Sans,
//! regular and bold; licence in `src/font/LICENSE-DejaVu.txt`), and text
//! measurement from its advance widths, so layout and rendering agree on
//! any machine.
//!
//! Widths are the sum of glyph advances (no kerning or shaping), which is
//! within a few per cent of the shaped width for Latin text; layout keeps
//! margins for the difference.

use std::sync::OnceLock;

/// DejaVu Sans Book.
pub const REGULAR: &[u8] = include_bytes!("DejaVuSans.ttf");
/// DejaVu Sans Bold.
pub const BOLD: &[u8] = include_bytes!("DejaVuSans-Bold.ttf");
/// The family name of the embedded font.
pub const FAMILY: &str = "DejaVu Sans";

/// Advance widths of one face, in em, with a fallback for missing glyphs.
struct Metrics {
    advances: Vec<(char, f64)>,
    fallback: f64,
    ascender: f64,
}

fn metrics(data: &'static [u8]) -> Metrics {
    let face = ttf_parser::Face::parse(data, 0).ok();
    let Some(face) = face else {
        return Metrics {
            advances: Vec::new(),
            fallback: 0.6,
            ascender: 0.76,
        };
    };
    let upem = f64::from(face.units_per_em());
    let adv = |c: char| {
        face.glyph_index(c)
            .and_then(|g| face.glyph_hor_advance(g))
            .map(|a| f64::from(a) / upem)
    };
    let advances = (' '..='\u{2FFF}')
        .filter_map(|c| adv(c).map(|a| (c, a)))
        .collect();
    Metrics {
        advances,
        fallback: adv('n').unwrap_or(0.6),
        ascender: f64::from(face.ascender()) / upem,
    }
}

fn face(bold: bool) -> &'static Metrics {
    static R: OnceLock<Metrics> = OnceLock::new();
    static B: OnceLock<Metrics> = OnceLock::new();
    if bold {
        B.get_or_init(|| metrics(BOLD))
    } else {
        R.get_or_init(|| metrics(REGULAR))
    }
}

/// Width of `text` set at `size` (any unit; the result is in the same
/// unit).
pub fn text_width(text: &str, size: f64, bold: bool) -> f64 {
    let m = face(bold);
    text.chars()
        .map(|c| {
            m.advances
                .binary_search_by(|(k, _)| k.cmp(&c))
                .map_or(m.fallback, |i| m.advances[i].1)
        })
        .sum::<f64>()
        * size
}

/// The font's ascender at `size`, in the same unit.
pub fn ascender(size: f64) -> f64 {
    face(false).ascender * size
}

/// Break `text` into lines no wider than `width` at `size`, at spaces; a
/// single word wider than the line stays whole.
pub fn wrap(text: &str, size: f64, bold: bool, width: f64) -> Vec<String> {
    let mut lines = Vec::new();
    let mut line = String::new();
    for word in text.split_whitespace() {
        let candidate = if line.is_empty() {
            word.to_string()
        } else {
            format!("{line} {word}")
        };
        if !line.is_empty() && text_width(&candidate, size, bold) > width {
            lines.push(std::mem::take(&mut line));
            line = word.to_string();
        } else {
            line = candidate;
        }
    }
    if !line.is_empty() {
        lines.push(line);
    }
    lines
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn widths_come_from_the_font() {
        // DejaVu Sans is a proportional face: 'i' is narrower than 'm', and
        // a space is about a third of an em (from the font's hmtx table).
        assert!(text_width("i", 10.0, false) < text_width("m", 10.0, false));
        let space = text_width(" ", 1.0, false);
        assert!(space > 0.25 && space < 0.4, "{space}");
        assert!(text_width("Bold", 10.0, true) > text_width("Bold", 10.0, false));
        assert_eq!(wrap("one two three", 10.0, false, 60.0).len(), 2);
    }
}
