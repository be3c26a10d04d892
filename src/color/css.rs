//! Parsing colours written in the notations of CSS Color Module Level 4:
//! hex (`#rgb`, `#rgba`, `#rrggbb`, `#rrggbbaa`), `rgb()`/`rgba()`,
//! `hsl()`/`hsla()`, `hwb()`, `lab()`, `lch()`, `oklab()`, `oklch()`, the
//! CSS named colours and `transparent`.
//!
//! Both the modern space-separated syntax (with `/ alpha` and `none`) and
//! the legacy comma syntax of `rgb()` and `hsl()` are accepted. Names and
//! function names are ASCII case-insensitive. `lab()` and `lch()` are D50
//! (CSS's definition) and are adapted to D65 with Bradford. Colours that
//! fall outside sRGB are brought in with the CSS gamut-mapping algorithm and
//! flagged.

use std::fmt;

use super::cielab::{Lab, Lch};
use super::gamut;
use super::oklab::{Oklab, Oklch};
use super::srgb::{Rgba, Srgb};
use super::xyz::{D50_WHITE, adapt_d50_to_d65};

/// A colour that could not be parsed: the text and what was expected.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct ParseColorError {
    /// The text as given.
    pub text: String,
    /// What was wrong and what was expected instead.
    pub expected: String,
}

impl fmt::Display for ParseColorError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "invalid colour '{}': {}", self.text, self.expected)
    }
}

impl std::error::Error for ParseColorError {}

/// A parsed colour, in sRGB with straight alpha.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ParsedColor {
    /// The colour, inside the sRGB gamut.
    pub rgba: Rgba,
    /// Whether the written colour lay outside sRGB and was gamut-mapped.
    pub gamut_mapped: bool,
}

const EXAMPLES: &str = "a colour such as #2b5c8a, rgb(43 92 138), hsl(209 52% 35%), \
                        oklch(45% 0.1 250) or a CSS colour name";

/// Parse one colour.
pub fn parse_color(text: &str) -> Result<ParsedColor, ParseColorError> {
    let err = |expected: String| ParseColorError {
        text: text.to_string(),
        expected,
    };
    let s = text.trim().to_ascii_lowercase();
    if s.is_empty() {
        return Err(err(format!("the text is empty; expected {EXAMPLES}")));
    }
    if let Some(hex) = s.strip_prefix('#') {
        return parse_hex(hex).map_err(err);
    }
    if let Some(open) = s.find('(') {
        let name = s[..open].trim_end();
        let Some(body) = s[open + 1..].strip_suffix(')') else {
            return Err(err(format!(
                "'{name}(' is not closed; expected ')' at the end"
            )));
        };
        return parse_function(name, body).map_err(err);
    }
    if s == "transparent" {
        return Ok(ParsedColor {
            rgba: Rgba {
                rgb: Srgb::new(0.0, 0.0, 0.0),
                alpha: 0.0,
            },
            gamut_mapped: false,
        });
    }
    match palette::named::from_str(&s) {
        Some(c) => Ok(opaque(Srgb::from_rgb8(c.red, c.green, c.blue))),
        None => Err(err(format!("not a CSS colour name; expected {EXAMPLES}"))),
    }
}

fn opaque(rgb: Srgb) -> ParsedColor {
    ParsedColor {
        rgba: Rgba::opaque(rgb),
        gamut_mapped: false,
    }
}

fn parse_hex(hex: &str) -> Result<ParsedColor, String> {
    if !hex.bytes().all(|b| b.is_ascii_hexdigit()) {
        return Err("a hex colour takes only the digits 0-9 and a-f after '#'".into());
    }
    let digit = |i: usize| u8::from_str_radix(&hex[i..i + 1], 16).expect("checked hex digit");
    let pair = |i: usize| u8::from_str_radix(&hex[i..i + 2], 16).expect("checked hex digits");
    let (r, g, b, a) = match hex.len() {
        3 => (digit(0) * 17, digit(1) * 17, digit(2) * 17, 255),
        4 => (digit(0) * 17, digit(1) * 17, digit(2) * 17, digit(3) * 17),
        6 => (pair(0), pair(2), pair(4), 255),
        8 => (pair(0), pair(2), pair(4), pair(6)),
        n => {
            return Err(format!(
                "a hex colour has 3, 4, 6 or 8 digits after '#', found {n}"
            ));
        }
    };
    Ok(ParsedColor {
        rgba: Rgba {
            rgb: Srgb::from_rgb8(r, g, b),
            alpha: a as f64 / 255.0,
        },
        gamut_mapped: false,
    })
}

/// One component of a colour function.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Comp {
    Number(f64),
    Percent(f64),
    /// An angle with a unit, converted to degrees.
    Angle(f64),
    None,
}

fn parse_number(t: &str) -> Option<f64> {
    let first = t.as_bytes().first()?;
    if !(first.is_ascii_digit() || matches!(first, b'.' | b'+' | b'-')) {
        return None;
    }
    t.parse::<f64>().ok().filter(|v| v.is_finite())
}

fn parse_comp(t: &str) -> Result<Comp, String> {
    if t == "none" {
        return Ok(Comp::None);
    }
    if let Some(p) = t.strip_suffix('%') {
        return parse_number(p)
            .map(Comp::Percent)
            .ok_or_else(|| format!("'{t}' is not a percentage"));
    }
    for (unit, to_deg) in [
        ("deg", 1.0),
        ("grad", 0.9),
        ("rad", 180.0 / std::f64::consts::PI),
        ("turn", 360.0),
    ] {
        if let Some(n) = t.strip_suffix(unit) {
            if let Some(v) = parse_number(n) {
                return Ok(Comp::Angle(v * to_deg));
            }
        }
    }
    parse_number(t)
        .map(Comp::Number)
        .ok_or_else(|| format!("'{t}' is not a number, a percentage, an angle or 'none'"))
}

struct Args {
    comps: Vec<Comp>,
    alpha: Option<Comp>,
    legacy: bool,
}

fn split_args(name: &str, body: &str) -> Result<Args, String> {
    let body = body.trim();
    if body.contains(',') {
        if !matches!(name, "rgb" | "rgba" | "hsl" | "hsla") {
            return Err(format!(
                "{name}() takes space-separated components, not commas, e.g. {name}(50% 0.1 120)"
            ));
        }
        let parts: Vec<&str> = body.split(',').map(str::trim).collect();
        if parts.len() != 3 && parts.len() != 4 {
            return Err(format!(
                "{name}() with commas takes 3 components and an optional alpha, found {}",
                parts.len()
            ));
        }
        let mut comps = Vec::new();
        for p in &parts {
            if p.is_empty() || p.contains(char::is_whitespace) {
                return Err(format!(
                    "{name}(): each comma-separated component must be a single value, found '{p}'"
                ));
            }
            let c = parse_comp(p)?;
            if c == Comp::None {
                return Err(format!(
                    "{name}(): 'none' is allowed only in the space-separated syntax"
                ));
            }
            comps.push(c);
        }
        let alpha = if comps.len() == 4 { comps.pop() } else { None };
        return Ok(Args {
            comps,
            alpha,
            legacy: true,
        });
    }
    let (main, alpha) = match body.split_once('/') {
        Some((m, a)) => {
            let a = a.trim();
            if a.is_empty() || a.contains(char::is_whitespace) || a.contains('/') {
                return Err(format!(
                    "{name}(): expected one alpha value after '/', found '{a}'"
                ));
            }
            (m, Some(parse_comp(a)?))
        }
        None => (body, None),
    };
    let comps = main
        .split_whitespace()
        .map(parse_comp)
        .collect::<Result<Vec<_>, _>>()?;
    if comps.len() != 3 {
        return Err(format!(
            "{name}() takes 3 space-separated components (then an optional '/ alpha'), found {}",
            comps.len()
        ));
    }
    Ok(Args {
        comps,
        alpha,
        legacy: false,
    })
}

fn alpha_of(name: &str, a: Option<Comp>) -> Result<f64, String> {
    Ok(match a {
        None => 1.0,
        Some(Comp::Number(v)) => v.clamp(0.0, 1.0),
        Some(Comp::Percent(p)) => (p / 100.0).clamp(0.0, 1.0),
        Some(Comp::None) => 0.0,
        Some(Comp::Angle(_)) => {
            return Err(format!(
                "{name}(): alpha must be a number or a percentage, not an angle"
            ));
        }
    })
}

/// A hue in degrees from a number, an angle or `none`.
fn hue_of(name: &str, c: Comp) -> Result<f64, String> {
    match c {
        Comp::Number(v) | Comp::Angle(v) => Ok(v),
        Comp::None => Ok(0.0),
        Comp::Percent(_) => Err(format!(
            "{name}(): the hue must be a number or an angle, not a percentage"
        )),
    }
}

/// A component that is a number, a percentage (scaled so 100% = `full`) or
/// `none` (0).
fn scalar_of(name: &str, what: &str, c: Comp, full: f64) -> Result<f64, String> {
    match c {
        Comp::Number(v) => Ok(v),
        Comp::Percent(p) => Ok(p / 100.0 * full),
        Comp::None => Ok(0.0),
        Comp::Angle(_) => Err(format!(
            "{name}(): {what} must be a number or a percentage, not an angle"
        )),
    }
}

fn parse_function(name: &str, body: &str) -> Result<ParsedColor, String> {
    let known = [
        "rgb", "rgba", "hsl", "hsla", "hwb", "lab", "lch", "oklab", "oklch",
    ];
    if !known.contains(&name) {
        return Err(format!(
            "unknown colour function '{name}()'; expected one of rgb(), rgba(), hsl(), hsla(), hwb(), lab(), lch(), oklab(), oklch()"
        ));
    }
    let args = split_args(name, body)?;
    let alpha = alpha_of(name, args.alpha)?;
    let c = &args.comps;
    let (rgb, gamut_mapped) = match name {
        "rgb" | "rgba" => {
            if args.legacy {
                let all_num = c.iter().all(|x| matches!(x, Comp::Number(_)));
                let all_pct = c.iter().all(|x| matches!(x, Comp::Percent(_)));
                if !all_num && !all_pct {
                    return Err(format!(
                        "{name}() with commas takes three numbers or three percentages, not a mix"
                    ));
                }
            }
            let ch = |x: Comp| {
                scalar_of(name, "a channel", x, 255.0).map(|v| (v / 255.0).clamp(0.0, 1.0))
            };
            (Srgb::new(ch(c[0])?, ch(c[1])?, ch(c[2])?), false)
        }
        "hsl" | "hsla" => {
            if args.legacy
                && !(matches!(c[1], Comp::Percent(_)) && matches!(c[2], Comp::Percent(_)))
            {
                return Err(format!(
                    "{name}() with commas takes saturation and lightness as percentages"
                ));
            }
            let h = hue_of(name, c[0])?;
            let s = (scalar_of(name, "saturation", c[1], 100.0)? / 100.0).max(0.0);
            let l = (scalar_of(name, "lightness", c[2], 100.0)? / 100.0).clamp(0.0, 1.0);
            (super::hsl::hsl_to_srgb(h, s, l), false)
        }
        "hwb" => {
            let h = hue_of(name, c[0])?;
            let w = (scalar_of(name, "whiteness", c[1], 100.0)? / 100.0).clamp(0.0, 1.0);
            let b = (scalar_of(name, "blackness", c[2], 100.0)? / 100.0).clamp(0.0, 1.0);
            (super::hsl::hwb_to_srgb(h, w, b), false)
        }
        "lab" | "lch" => {
            let l = scalar_of(name, "lightness", c[0], 100.0)?.clamp(0.0, 100.0);
            let lab = if name == "lab" {
                Lab::new(
                    l,
                    scalar_of(name, "a", c[1], 125.0)?,
                    scalar_of(name, "b", c[2], 125.0)?,
                )
            } else {
                let chroma = scalar_of(name, "chroma", c[1], 150.0)?.max(0.0);
                Lch::new(l, chroma, hue_of(name, c[2])?).to_lab()
            };
            let xyz65 = adapt_d50_to_d65(lab.to_xyz_with_white(D50_WHITE));
            gamut::map_srgb(xyz65.to_linear_rgb().to_srgb())
        }
        _ => {
            // oklab / oklch
            let l = scalar_of(name, "lightness", c[0], 1.0)?.clamp(0.0, 1.0);
            let lch = if name == "oklab" {
                Oklab::new(
                    l,
                    scalar_of(name, "a", c[1], 0.4)?,
                    scalar_of(name, "b", c[2], 0.4)?,
                )
                .to_oklch()
            } else {
                let chroma = scalar_of(name, "chroma", c[1], 0.4)?.max(0.0);
                Oklch::new(l, chroma, hue_of(name, c[2])?)
            };
            gamut::map_oklch_to_srgb(lch)
        }
    };
    Ok(ParsedColor {
        rgba: Rgba { rgb, alpha },
        gamut_mapped,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn hex(s: &str) -> String {
        parse_color(s).unwrap().rgba.rgb.to_hex()
    }

    #[test]
    fn hex_forms() {
        assert_eq!(hex("#abc"), "#aabbcc");
        assert_eq!(hex("#ABCDEF"), "#abcdef");
        let c = parse_color("#11223380").unwrap().rgba;
        assert_eq!(c.rgb.to_hex(), "#112233");
        assert!((c.alpha - 128.0 / 255.0).abs() < 1e-12);
        assert!((parse_color("#abc8").unwrap().rgba.alpha - 0x88 as f64 / 255.0).abs() < 1e-12);
    }

    #[test]
    fn rgb_forms_agree() {
        for s in [
            "rgb(255 128 0)",
            "rgb(255,128,0)",
            "rgba(255, 128, 0, 1)",
            "rgb(100% 50.196% 0%)",
            "RGB(255 128 0 / 100%)",
        ] {
            assert_eq!(hex(s), "#ff8000", "{s}");
        }
        assert_eq!(hex("rgb(300 -5 none)"), "#ff0000");
    }

    #[test]
    fn names_and_transparent() {
        // CSS Color 4 named colours (the keyword table of the standard).
        assert_eq!(hex("RebeccaPurple"), "#663399");
        assert_eq!(hex("white"), "#ffffff");
        assert_eq!(parse_color("transparent").unwrap().rgba.alpha, 0.0);
    }

    #[test]
    fn hsl_and_hwb_examples_from_the_css_specification() {
        // CSS Color 4: hsl(120deg 100% 25%) is rgb(0 127.5 0) -> #008000 after
        // rounding half up; hwb(0 0% 0%) is pure red.
        assert_eq!(hex("hsl(120deg 100% 25%)"), "#008000");
        assert_eq!(hex("hsl(0.5turn, 100%, 50%)"), "#00ffff");
        assert_eq!(hex("hwb(0 0% 0%)"), "#ff0000");
        // Whiteness + blackness >= 100% gives a grey of w / (w + b).
        assert_eq!(hex("hwb(200 60% 60%)"), "#808080");
    }

    #[test]
    fn lab_white_is_white_after_bradford() {
        let c = parse_color("lab(100 0 0)").unwrap();
        assert_eq!(c.rgba.rgb.to_hex(), "#ffffff");
        assert_eq!(hex("oklch(0% 0 0)"), "#000000");
        assert_eq!(hex("oklab(100% 0 0)"), "#ffffff");
    }

    #[test]
    fn out_of_gamut_is_mapped_and_flagged() {
        let c = parse_color("oklch(70% 0.4 145)").unwrap();
        assert!(c.gamut_mapped);
        assert!(c.rgba.rgb.in_gamut(0.0));
    }

    #[test]
    fn errors_name_the_text_and_expectation() {
        for (s, needle) in [
            ("", "empty"),
            ("#12345", "3, 4, 6 or 8 digits"),
            ("#ggg", "0-9 and a-f"),
            ("rgb(1 2)", "3 space-separated"),
            ("rgb(1, 2%, 3)", "not a mix"),
            ("foo(1 2 3)", "unknown colour function"),
            ("notacolour", "not a CSS colour name"),
            ("rgb(1 2 3", "not closed"),
            ("lab(50, 1, 2)", "not commas"),
            ("rgb(inf 0 0)", "not a number"),
            ("hsl(10% 50% 50%)", "hue"),
        ] {
            let e = parse_color(s).unwrap_err();
            assert_eq!(e.text, s);
            assert!(e.to_string().contains(needle), "{s}: {e}");
        }
    }
}
