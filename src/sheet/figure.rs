//! The contact sheet of one audited figure: a header with the figure's
//! name and verdict, a key to the marks, and one panel per view (the
//! audit's normal raster simulated for that view, at 1:1 pixel scale, with
//! the view's findings marked), each titled with the view's name and how
//! common it is, and followed by the view's findings in words and a strip
//! of the measured class colours in that view.

use std::fmt::Write as _;

use crate::audit::{Examined, Options};
use crate::findings::{Kind, Severity};
use crate::raster::Raster;
use crate::vision::{Simulation, raster::simulate_rgba8};

use super::canvas::{Canvas, INK, Placed, fit, text};
use super::marks::{self, Mark};
use super::prevalence;

/// Where one view's panel lies on the sheet.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct PanelPlace {
    /// The view's name.
    pub view: String,
    /// Left edge, pixels.
    pub x: u32,
    /// Top edge, pixels.
    pub y: u32,
    /// Per pixel of the panel: [`marks::NONE`], [`marks::ON_DARK`] or
    /// [`marks::ON_LIGHT`].
    pub marks: Vec<u8>,
}

/// A figure's contact sheet.
#[derive(Debug, Clone)]
pub struct Sheet {
    /// The page.
    pub canvas: Canvas,
    /// The panels, in view order (the same order as `canvas.images`).
    pub panels: Vec<PanelPlace>,
}

/// The marks for one view's findings: classes as indices into the
/// report's classes.
pub fn marks_for(ex: &Examined, view: &str) -> Vec<(usize, Mark)> {
    let index = |id: &String| ex.report.classes.iter().position(|c| &c.id == id);
    let mut out = Vec::new();
    for f in ex.report.findings.iter().filter(|f| f.view == view) {
        let mark = match f.kind {
            Kind::Blend => Mark::Solid,
            Kind::Fade => Mark::Dashed,
            Kind::Glare => Mark::Hatch,
            _ => continue,
        };
        out.extend(f.classes.iter().filter_map(index).map(|k| (k, mark)));
    }
    out
}

/// The view's findings in a few words, e.g. `blend c1+c2, fade c3`.
fn findings_line(ex: &Examined, view: &str) -> String {
    let parts: Vec<String> = ex
        .report
        .findings
        .iter()
        .filter(|f| f.view == view)
        .map(|f| format!("{} {}", f.kind.name(), f.classes.join("+")))
        .collect();
    if parts.is_empty() {
        "no findings in this view".into()
    } else {
        parts.join(", ")
    }
}

/// A one-line verdict of a report, e.g. `fails: 3 findings (2 errors)`.
pub fn verdict(ex: &Examined) -> String {
    let r = &ex.report;
    let n = r.findings.len();
    let errors = r
        .findings
        .iter()
        .filter(|f| f.severity == Severity::Error)
        .count();
    let word = if r.passed { "passes" } else { "fails" };
    let s = |k: usize| if k == 1 { "" } else { "s" };
    if n == 0 {
        format!("{word} the audit: no findings")
    } else {
        format!(
            "{word} the audit: {n} finding{} ({errors} error{})",
            s(n),
            s(errors)
        )
    }
}

/// Sizes of the sheet's chrome, in pixels, scaled with the audit DPI so
/// the text keeps its printed size.
struct Units {
    u: f64,
}

impl Units {
    fn px(&self, css: f64) -> f64 {
        css * self.u
    }
}

/// The panels' simulated, marked rasters for every view, with their marks.
fn panels(ex: &Examined, opt: &Options) -> Vec<(Raster, Vec<u8>)> {
    let img = &ex.raster;
    opt.views
        .iter()
        .map(|v| {
            let mut rgba = img.rgba.clone();
            simulate_rgba8(
                &Simulation::new(v.view, opt.model),
                img.width as usize,
                &mut rgba,
            );
            let layer = marks::layer(&ex.labels, &marks_for(ex, &v.name), opt.dpi);
            marks::paint(&mut rgba, &layer);
            (
                Raster {
                    width: img.width,
                    height: img.height,
                    rgba,
                },
                layer,
            )
        })
        .collect()
}

/// Draw the key: one sample per kind of mark, with what it means. Returns
/// its height and width.
fn key(body: &mut String, x: f64, y: f64, un: &Units, lw: f64) -> (f64, f64) {
    let rows = [
        (
            Mark::Solid,
            "blend: these classes are too alike to tell apart in this view (each one outlined)",
        ),
        (
            Mark::Dashed,
            "fade: this class does not separate from the background in this view",
        ),
        (
            Mark::Hatch,
            "glare: this class stands out by lightness alone in this view",
        ),
    ];
    let (sw, sh) = (un.px(30.0).round(), un.px(12.0).round());
    let mut at = y;
    let mut wide: f64 = 0.0;
    for (mark, words) in rows {
        let (x0, y0) = (x.round(), at.round());
        // A mid-grey sample with the mark drawn on it as on a panel.
        let _ = write!(
            body,
            r##"<rect x="{x0}" y="{y0}" width="{sw}" height="{sh}" fill="#8a8a8a"/>"##
        );
        match mark {
            Mark::Solid | Mark::Dashed => {
                let dash = if mark == Mark::Dashed {
                    format!(r#" stroke-dasharray="{d} {d}""#, d = 4.0 * lw)
                } else {
                    String::new()
                };
                let i = lw * 2.5;
                let _ = write!(
                    body,
                    r##"<rect x="{}" y="{}" width="{}" height="{}" fill="none" stroke="#ffffff" stroke-width="{lw}"{dash}/><rect x="{}" y="{}" width="{}" height="{}" fill="none" stroke="#000000" stroke-width="{lw}"{dash}/>"##,
                    x0 + i - lw,
                    y0 + i - lw,
                    sw - 2.0 * (i - lw),
                    sh - 2.0 * (i - lw),
                    x0 + i,
                    y0 + i,
                    sw - 2.0 * i,
                    sh - 2.0 * i
                );
            }
            Mark::Hatch => {
                let step = 6.0 * lw;
                let mut d = String::new();
                let mut k = step;
                while k < sw + sh {
                    let _ = write!(d, "M{} {}L{} {}", x0 + k, y0, x0 + k - sh, y0 + sh);
                    k += step;
                }
                let _ = write!(
                    body,
                    r##"<clipPath id="hatch-clip"><rect x="{x0}" y="{y0}" width="{sw}" height="{sh}"/></clipPath><g clip-path="url(#hatch-clip)"><path d="{d}" stroke="#000000" stroke-width="{lw}" transform="translate({lw} 0)" fill="none"/><path d="{d}" stroke="#ffffff" stroke-width="{lw}" fill="none"/></g>"##
                );
            }
        }
        text(
            body,
            x0 + sw + un.px(8.0),
            y0 + sh - un.px(1.5),
            un.px(10.5),
            false,
            words,
        );
        wide = wide.max(sw + un.px(8.0) + crate::font::text_width(words, un.px(10.5), false));
        at += un.px(17.0);
    }
    (at - y, wide)
}

/// Lay out the contact sheet of `ex`, audited with `opt`; `title` names
/// the figure.
pub fn build(title: &str, ex: &Examined, opt: &Options) -> Sheet {
    let un = Units {
        u: (opt.dpi / 96.0).max(0.5),
    };
    let lw = marks::line_width(opt.dpi) as f64;
    let (pw, ph) = (ex.raster.width as f64, ex.raster.height as f64);
    let n = opt.views.len().max(1);
    let cols = match n {
        1..=3 => n,
        4 => 2,
        _ => 3,
    };
    let margin = un.px(16.0).round();
    let cell_w = pw.max(un.px(220.0)).round();
    let gap_x = un.px(24.0).round();
    let mut body = String::new();
    // Header: name, verdict, key.
    text(
        &mut body,
        margin,
        margin + un.px(15.0),
        un.px(16.0),
        true,
        title,
    );
    text(
        &mut body,
        margin,
        margin + un.px(33.0),
        un.px(11.5),
        false,
        &verdict(ex),
    );
    let (key_h, key_w) = key(&mut body, margin, margin + un.px(44.0), &un, lw);
    let head_w = key_w
        .max(crate::font::text_width(title, un.px(16.0), true))
        .max(crate::font::text_width(&verdict(ex), un.px(11.5), false));
    let top = (margin + un.px(44.0) + key_h + un.px(10.0)).round();
    // The class strip: one swatch and id per class, wrapped to the cell.
    let (sw, id_size) = (un.px(14.0).round(), un.px(9.0));
    let strip_cells: Vec<f64> = ex
        .report
        .classes
        .iter()
        .map(|c| sw.max(crate::font::text_width(&c.id, id_size, false)) + un.px(8.0))
        .collect();
    let mut strip_rows = 1usize;
    let mut run = 0.0;
    for &w in &strip_cells {
        if run + w > cell_w && run > 0.0 {
            strip_rows += 1;
            run = 0.0;
        }
        run += w;
    }
    let strip_row_h = sw + un.px(14.0);
    let head_h = un.px(34.0).round();
    let cell_h = (head_h + ph + un.px(22.0) + strip_rows as f64 * strip_row_h).round();
    let gap_y = un.px(18.0).round();
    let rows = n.div_ceil(cols);
    let width =
        (2.0 * margin + (cols as f64 * cell_w + (cols - 1) as f64 * gap_x).max(head_w)).ceil();
    let height = (top + rows as f64 * cell_h + (rows - 1) as f64 * gap_y + margin).ceil();
    let mut images = Vec::new();
    let mut places = Vec::new();
    for (i, ((raster, layer), v)) in panels(ex, opt).into_iter().zip(&opt.views).enumerate() {
        let cx = margin + (i % cols) as f64 * (cell_w + gap_x);
        let cy = top + (i / cols) as f64 * (cell_h + gap_y);
        text(&mut body, cx, cy + un.px(13.0), un.px(13.0), true, &v.name);
        text(
            &mut body,
            cx,
            cy + un.px(27.0),
            un.px(10.0),
            false,
            &fit(
                prevalence::note(&v.name, v.view),
                un.px(10.0),
                false,
                cell_w,
            ),
        );
        let (px, py) = (cx.round() as u32, (cy + head_h).round() as u32);
        // A hairline frame just outside the panel, so a pale panel edge
        // still reads as an edge.
        let _ = write!(
            body,
            r#"<rect x="{}" y="{}" width="{}" height="{}" fill="none" stroke="{INK}" stroke-width="1"/>"#,
            px as f64 - 0.5,
            py as f64 - 0.5,
            pw + 1.0,
            ph + 1.0
        );
        let below = py as f64 + ph;
        text(
            &mut body,
            cx,
            below + un.px(14.0),
            un.px(9.5),
            false,
            &fit(&findings_line(ex, &v.name), un.px(9.5), false, cell_w),
        );
        let (mut sx, mut sy) = (cx, below + un.px(22.0));
        for (c, &w) in ex.report.classes.iter().zip(&strip_cells) {
            if sx + w > cx + cell_w && sx > cx {
                sx = cx;
                sy += strip_row_h;
            }
            let measured = c
                .measured
                .0
                .iter()
                .find(|(name, _)| name == &v.name)
                .map(|(_, hex)| hex.as_str())
                .filter(|h| !h.is_empty());
            let (x0, y0) = (sx.round(), sy.round());
            match measured {
                Some(hex) => {
                    let _ = write!(
                        body,
                        r#"<rect x="{x0}" y="{y0}" width="{sw}" height="{sw}" fill="{hex}"/><rect x="{}" y="{}" width="{}" height="{}" fill="none" stroke="{INK}" stroke-width="1"/>"#,
                        x0 - 0.5,
                        y0 - 0.5,
                        sw + 1.0,
                        sw + 1.0
                    );
                }
                None => text(&mut body, x0, y0 + sw - 2.0, id_size, false, "-"),
            }
            text(&mut body, x0, y0 + sw + un.px(10.0), id_size, false, &c.id);
            sx += w;
        }
        images.push(Placed {
            x: px,
            y: py,
            raster,
        });
        places.push(PanelPlace {
            view: v.name.clone(),
            x: px,
            y: py,
            marks: layer,
        });
    }
    Sheet {
        canvas: Canvas {
            width: width as u32,
            height: height as u32,
            dpi: opt.dpi,
            body,
            images,
        },
        panels: places,
    }
}
