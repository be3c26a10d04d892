//! The human-readable form of an [`Inspection`]: one block per colour, then
//! the closest pair in each view.

use std::fmt::Write;

use crate::inspect::{ColorReport, Inspection};

fn color_block(out: &mut String, title: &str, c: &ColorReport, with_contrast: bool) {
    let _ = writeln!(out, "{title}: {}  ->  {}", c.input, c.hex);
    if c.alpha < 1.0 {
        let _ = writeln!(
            out,
            "  opacity        {:.3} (composited before measuring)",
            c.alpha
        );
    }
    if c.gamut_mapped {
        let _ = writeln!(
            out,
            "  note           outside sRGB; gamut-mapped (CSS Color 4)"
        );
    }
    let [l, a, b] = c.lab;
    let _ = writeln!(out, "  CIELAB (D65)   L* {l:7.3}  a* {a:8.3}  b* {b:8.3}");
    let [ol, oc, oh] = c.oklch;
    let _ = writeln!(out, "  OKLCH          L {ol:6.4}  C {oc:6.4}  h {oh:7.2}");
    let _ = writeln!(out, "  luminance      {:.4}", c.relative_luminance);
    if with_contrast {
        let _ = writeln!(
            out,
            "  contrast       {:.2}:1 against the background",
            c.contrast_ratio
        );
    }
    let width = c.views.0.iter().map(|(n, _)| n.len()).max().unwrap_or(0);
    for (name, v) in &c.views.0 {
        let _ = writeln!(out, "  {name:<width$}  {}", v.hex);
    }
}

/// Render an inspection as text.
pub fn render(ins: &Inspection) -> String {
    let mut out = String::new();
    color_block(&mut out, "background", &ins.background, false);
    for (i, c) in ins.colors.iter().enumerate() {
        out.push('\n');
        color_block(&mut out, &format!("colour {}", i + 1), c, true);
    }
    if ins.colors.len() >= 2 {
        out.push_str("\nclosest pair per view (CIEDE2000):\n");
        let width = ins.models.0.iter().map(|(n, _)| n.len()).max().unwrap_or(0);
        for (name, model) in &ins.models.0 {
            if let Some(p) = ins.closest_pair(name) {
                let _ = writeln!(
                    out,
                    "  {name:<width$}  colours {} and {}  ΔE00 {:6.2}   ({model})",
                    p.a + 1,
                    p.b + 1,
                    p.delta_e2000
                );
            }
        }
    }
    out.push_str(
        "\nAn aid for design and review, not a certification of conformance with any \
         accessibility law or standard.\n",
    );
    out
}
