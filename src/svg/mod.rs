//! The SVG stage: a laid-out [`Scene`] serialised as compact, accessible
//! SVG 1.1.
//!
//! - The root carries `role="img"` and `aria-labelledby` pointing at its
//!   `<title>` and `<desc>`; the description is the plain-language one.
//! - Coordinates are page points (1 user unit = 1 pt; width and height are
//!   given in mm), rounded to 0.01 pt, trailing zeros dropped.
//! - Marks are grouped by class; each carries `data-key` and `data-class`;
//!   group ids are stable (`p1-c3` is class 3 in panel 1).
//! - Text uses the embedded font family only, so it renders the same
//!   wherever the font is the one hueproof embeds.
//!
//! The same scene always gives the same bytes.

use std::fmt::Write as _;

use crate::color::Srgb;
use crate::font::FAMILY;
use crate::layout::scene::{Anchor, Element, Fill, Group, Node, Paint, Scene, Shape};
use crate::spec::length::pt_to_mm;

/// A number rounded to 0.01, without trailing zeros.
pub fn num(v: f64) -> String {
    let r = (v * 100.0).round() / 100.0;
    let r = if r == 0.0 { 0.0 } else { r };
    let s = format!("{r:.2}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    s.to_string()
}

/// `#rrggbb` of a colour.
pub fn hex(c: Srgb) -> String {
    let [r, g, b] = c.to_rgb8();
    format!("#{r:02x}{g:02x}{b:02x}")
}

/// Escape text for XML content and attribute values.
pub fn escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for ch in s.chars() {
        match ch {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c if (c as u32) < 0x20 && c != '\n' && c != '\t' => {}
            c => out.push(c),
        }
    }
    out
}

/// The id of the no-data hatch pattern.
pub const HATCH_ID: &str = "hp-no-data";

fn paint_attrs(out: &mut String, p: &Paint) {
    if let Some(f) = &p.fill {
        let v = match f {
            Fill::None => "none".to_string(),
            Fill::Color(c) => hex(*c),
            Fill::Hatch => format!("url(#{HATCH_ID})"),
            Fill::Gradient(i) => format!("url(#hp-ramp-{})", i + 1),
        };
        let _ = write!(out, " fill=\"{v}\"");
    }
    if let Some((c, w)) = p.stroke {
        if w > 0.0 {
            let _ = write!(out, " stroke=\"{}\" stroke-width=\"{}\"", hex(c), num(w));
        } else {
            out.push_str(" stroke=\"none\"");
        }
    }
}

fn attrs(out: &mut String, a: &[(&'static str, String)]) {
    for (k, v) in a {
        let _ = write!(out, " {k}=\"{}\"", escape(v));
    }
}

fn path_data(rings: &[Vec<[f64; 2]>], closed: bool) -> String {
    let mut d = String::new();
    for r in rings {
        for (i, p) in r.iter().enumerate() {
            d.push(if i == 0 { 'M' } else { 'L' });
            let _ = write!(d, "{} {}", num(p[0]), num(p[1]));
        }
        if closed && !r.is_empty() {
            d.push('Z');
        }
    }
    d
}

fn node(out: &mut String, n: &Node, indent: usize) {
    out.push_str(&" ".repeat(indent));
    match &n.shape {
        Shape::Area(rings) => {
            let _ = write!(out, "<path d=\"{}\"", path_data(rings, true));
        }
        Shape::Lines(lines) => {
            let _ = write!(out, "<path d=\"{}\"", path_data(lines, false));
            if n.paint.fill.is_none() {
                out.push_str(" fill=\"none\"");
            }
        }
        Shape::Circle { c, r } => {
            let _ = write!(
                out,
                "<circle cx=\"{}\" cy=\"{}\" r=\"{}\"",
                num(c[0]),
                num(c[1]),
                num(*r)
            );
        }
        Shape::Rect { x, y, w, h } => {
            let _ = write!(
                out,
                "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"",
                num(*x),
                num(*y),
                num(*w),
                num(*h)
            );
        }
        Shape::Text {
            at,
            text,
            size,
            bold,
            anchor,
            vertical,
        } => {
            let _ = write!(
                out,
                "<text x=\"{}\" y=\"{}\" font-size=\"{}\"",
                num(at[0]),
                num(at[1]),
                num(*size)
            );
            if *bold {
                out.push_str(" font-weight=\"bold\"");
            }
            match anchor {
                Anchor::Start => {}
                Anchor::Middle => out.push_str(" text-anchor=\"middle\""),
                Anchor::End => out.push_str(" text-anchor=\"end\""),
            }
            if *vertical {
                let _ = write!(
                    out,
                    " transform=\"rotate(-90 {} {})\"",
                    num(at[0]),
                    num(at[1])
                );
            }
            paint_attrs(out, &n.paint);
            attrs(out, &n.attrs);
            let _ = writeln!(out, ">{}</text>", escape(text));
            return;
        }
    }
    paint_attrs(out, &n.paint);
    attrs(out, &n.attrs);
    out.push_str("/>\n");
}

fn group(out: &mut String, g: &Group, indent: usize, clips: &mut usize) {
    out.push_str(&" ".repeat(indent));
    out.push_str("<g");
    if let Some(id) = &g.id {
        let _ = write!(out, " id=\"{}\"", escape(id));
    }
    attrs(out, &g.attrs);
    paint_attrs(out, &g.paint);
    if g.clip.is_some() {
        *clips += 1;
        let _ = write!(out, " clip-path=\"url(#hp-clip-{clips})\"");
    }
    out.push_str(">\n");
    for c in &g.children {
        match c {
            Element::Group(sub) => group(out, sub, indent + 1, clips),
            Element::Node(n) => node(out, n, indent + 1),
        }
    }
    out.push_str(&" ".repeat(indent));
    out.push_str("</g>\n");
}

fn clip_defs(g: &Group, out: &mut Vec<[f64; 4]>) {
    if let Some(c) = g.clip {
        out.push(c);
    }
    for c in &g.children {
        if let Element::Group(sub) = c {
            clip_defs(sub, out);
        }
    }
}

/// Serialise a scene.
pub fn write(scene: &Scene) -> String {
    let mut s = String::new();
    let (w, h) = (scene.width, scene.height);
    let _ = writeln!(
        s,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"{}mm\" height=\"{}mm\" viewBox=\"0 0 {} {}\" role=\"img\" aria-labelledby=\"hp-title hp-desc\" font-family=\"{FAMILY}\" fill=\"{}\"{}>",
        num(pt_to_mm(w)),
        num(pt_to_mm(h)),
        num(w),
        num(h),
        hex(scene.text_color),
        {
            let mut a = String::new();
            attrs(&mut a, &scene.attrs);
            a
        }
    );
    let _ = writeln!(
        s,
        " <title id=\"hp-title\">{}</title>",
        escape(&scene.title)
    );
    let _ = writeln!(
        s,
        " <desc id=\"hp-desc\">{}</desc>",
        escape(&scene.description)
    );
    s.push_str(" <defs>\n");
    let (base, line) = scene.hatch;
    let _ = writeln!(
        s,
        "  <pattern id=\"{HATCH_ID}\" patternUnits=\"userSpaceOnUse\" width=\"3\" height=\"3\" patternTransform=\"rotate(45)\"><rect width=\"3\" height=\"3\" fill=\"{}\"/><path d=\"M1.5 0L1.5 3\" stroke=\"{}\" stroke-width=\"0.9\"/></pattern>",
        hex(base),
        hex(line)
    );
    for (i, g) in scene.gradients.iter().enumerate() {
        let _ = write!(
            s,
            "  <linearGradient id=\"hp-ramp-{}\" gradientUnits=\"userSpaceOnUse\" x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\">",
            i + 1,
            num(g.from[0]),
            num(g.from[1]),
            num(g.to[0]),
            num(g.to[1])
        );
        let last = (g.stops.len().max(2) - 1) as f64;
        for (k, c) in g.stops.iter().enumerate() {
            let _ = write!(
                s,
                "<stop offset=\"{}\" stop-color=\"{}\"/>",
                num(k as f64 / last),
                hex(*c)
            );
        }
        s.push_str("</linearGradient>\n");
    }
    let mut clips = Vec::new();
    for g in &scene.groups {
        clip_defs(g, &mut clips);
    }
    for (i, c) in clips.iter().enumerate() {
        let _ = writeln!(
            s,
            "  <clipPath id=\"hp-clip-{}\"><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/></clipPath>",
            i + 1,
            num(c[0]),
            num(c[1]),
            num(c[2]),
            num(c[3])
        );
    }
    s.push_str(" </defs>\n");
    let _ = writeln!(
        s,
        " <rect data-role=\"background\" width=\"{}\" height=\"{}\" fill=\"{}\"/>",
        num(w),
        num(h),
        hex(scene.background)
    );
    let mut n = 0;
    for g in &scene.groups {
        group(&mut s, g, 1, &mut n);
    }
    s.push_str("</svg>\n");
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_are_compact() {
        assert_eq!(num(1.0), "1");
        assert_eq!(num(1.234), "1.23");
        assert_eq!(num(-0.001), "0");
        assert_eq!(num(2.5), "2.5");
        assert_eq!(escape("a<b & \"c\""), "a&lt;b &amp; &quot;c&quot;");
    }
}
