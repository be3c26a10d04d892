//! The label raster: the figure's SVG rewritten so that every part of the
//! scene is painted in a flat label colour (each class's marks, each
//! class's legend swatch, borders, text, everything else, the background),
//! rendered without anti-aliasing (`shape-rendering="crispEdges"`,
//! `text-rendering="optimizeSpeed"`) with the same size and DPI as the
//! normal raster, and decoded back into label ids.

use std::fmt::Write as _;
use std::path::Path;

use crate::color::Srgb;
use crate::error::{Error, Result};
use crate::raster;

use super::detect::fill_id;
use super::style::Cascade;

/// The background (and anything outside every drawn element).
pub const BACKGROUND: u16 = 0;
/// Strokes: borders of marks and swatches.
pub const BORDER: u16 = 1;
/// Text.
pub const TEXT: u16 = 2;
/// Everything else drawn: axes, gridlines, context layers, histograms.
pub const OTHER: u16 = 3;

/// Text element `j` (in document order) has label `TEXT_BASE + j`.
pub const TEXT_BASE: u16 = 0x8000;
/// The most text elements labelled one by one; later ones share the last.
pub const MAX_TEXTS: usize = 0x7fff;

/// A text element as written: its fill, size in points and weight.
#[derive(Debug, Clone, PartialEq)]
pub struct TextInfo {
    /// The specified fill, when a flat colour.
    pub fill: Option<Srgb>,
    /// Font size in points.
    pub size_pt: f64,
    /// Bold (font-weight bold or at least 700).
    pub bold: bool,
    /// The text content.
    pub content: String,
}

/// The label of class `k`'s marks.
pub fn fill_label(k: usize) -> u16 {
    4 + 2 * k as u16
}

/// The label of class `k`'s legend swatch.
pub fn swatch_label(k: usize) -> u16 {
    5 + 2 * k as u16
}

/// What a label stands for.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Part {
    /// The page background.
    Background,
    /// A stroke.
    Border,
    /// Text.
    Text,
    /// Anything else.
    Other,
    /// Marks of class k.
    Fill(usize),
    /// Legend swatch of class k.
    Swatch(usize),
}

/// The part a label stands for.
pub fn part(label: u16) -> Part {
    match label {
        l if l >= TEXT_BASE => Part::Text,
        BACKGROUND => Part::Background,
        BORDER => Part::Border,
        TEXT => Part::Text,
        OTHER => Part::Other,
        l if l % 2 == 0 => Part::Fill(((l - 4) / 2) as usize),
        l => Part::Swatch(((l - 5) / 2) as usize),
    }
}

/// The most classes a label raster can tell apart.
pub const MAX_CLASSES: usize = 30_000;
const MAX_DEPTH: usize = 200;

/// The scene's classes as found in the SVG.
#[derive(Debug, Clone, PartialEq)]
pub struct SceneClasses {
    /// Class ids in legend order (`c1`, `c2`, ..., then `no-data`, `ramp`,
    /// `all`).
    pub ids: Vec<String>,
    /// The nominal fill of each class's first mark, where it is a flat colour.
    pub fills: Vec<Option<Srgb>>,
    /// The background rectangle's fill, if there is one.
    pub background: Option<Srgb>,
}

/// The label SVG and the classes it labels.
#[derive(Debug, Clone)]
pub struct LabelSvg {
    /// The rewritten SVG text.
    pub svg: String,
    /// The classes.
    pub classes: SceneClasses,
    /// The text elements, in document order.
    pub texts: Vec<TextInfo>,
    /// For SVG without `data-class` marks: the classes were detected from
    /// distinct solid fills (their alphas, 0-255, here) and are
    /// provisional until [`settle_detected`] drops the small ones and
    /// orders the rest.
    pub detected: Option<Vec<u8>>,
}

fn label_hex(l: u16) -> String {
    format!("#{:02x}{:02x}00", l & 0xff, l >> 8)
}

fn class_order(id: &str) -> (u32, u64, String) {
    if let Some(n) = id.strip_prefix('c').and_then(|n| n.parse::<u64>().ok()) {
        (0, n, String::new())
    } else {
        (1, 0, id.to_string())
    }
}

/// Refuse entity declarations in an untrusted document's type
/// declaration: nested entities expand exponentially ("billion laughs")
/// and one large entity referenced often expands quadratically, and an
/// external entity names a file or address to read. SVG needs none of
/// them. Checked on the text, before any parser expands anything.
pub fn refuse_entities(name: &Path, svg: &str) -> Result<()> {
    if svg.contains("<!DOCTYPE") && svg.contains("<!ENTITY") {
        return Err(invalid(
            name,
            "the document type declares entities (<!ENTITY ...>), which are refused: \
             they can expand to gigabytes or name files to read; write the text and \
             colours out in full"
                .into(),
        ));
    }
    Ok(())
}

fn invalid(name: &Path, message: String) -> Error {
    Error::Invalid {
        path: name.to_path_buf(),
        location: None,
        message,
    }
}

fn collect_classes(n: roxmltree::Node, in_marks: bool, out: &mut Vec<String>) {
    let marks = in_marks || n.attribute("data-role") == Some("marks");
    if marks {
        if let Some(c) = n.attribute("data-class") {
            if !out.iter().any(|o| o == c) {
                out.push(c.to_string());
            }
        }
    }
    for c in n.children().filter(|c| c.is_element()) {
        collect_classes(c, marks, out);
    }
}

fn escape(s: &str) -> String {
    crate::svg::escape(s)
}

#[derive(Clone)]
struct Ctx {
    marks: Option<usize>,
    legend: Option<usize>,
    fill: String,
    stroke: String,
    stroke_width: String,
    font_size: String,
    font_weight: String,
    /// `color`, for `currentColor`.
    color: String,
    /// `fill-opacity` (inherited).
    fill_opacity: f64,
    /// The product of the ancestors' and the element's `opacity`.
    opacity: f64,
}

/// A distinct solid fill of SVG made by another tool: colour and total
/// alpha (0-255).
type FillKey = ([u8; 3], u8);

const SHAPES: [&str; 8] = [
    "path", "rect", "circle", "ellipse", "line", "polyline", "polygon", "use",
];
const DROPPED_ATTRS: [&str; 9] = [
    "fill",
    "stroke",
    "opacity",
    "fill-opacity",
    "stroke-opacity",
    "style",
    "shape-rendering",
    "text-rendering",
    "filter",
];

fn painted(v: &str) -> bool {
    let v = v.trim();
    !(v == "none" || v == "transparent" || v.is_empty())
}

struct Writer<'a> {
    ids: &'a [String],
    css: &'a Cascade<'a>,
    /// For SVG without `data-class` marks: the distinct solid fills met
    /// so far, the position being the provisional class index.
    foreign: Option<Vec<FillKey>>,
    /// The canvas in user units (for spotting a background rectangle).
    canvas: Option<(f64, f64)>,
    /// Whether a shape has been painted yet.
    painted_any: bool,
    fills: Vec<Option<Srgb>>,
    background: Option<Srgb>,
    texts: Vec<TextInfo>,
    unit_pt: f64,
    out: String,
}

impl Writer<'_> {
    fn class_index(&self, id: &str) -> Option<usize> {
        self.ids.iter().position(|c| c == id)
    }

    fn open(&mut self, n: roxmltree::Node, extra: &str) {
        let _ = write!(self.out, "<{}", n.tag_name().name());
        for a in n.attributes() {
            if DROPPED_ATTRS.contains(&a.name()) {
                continue;
            }
            let name = match a.namespace() {
                Some("http://www.w3.org/1999/xlink") => format!("xlink:{}", a.name()),
                Some("http://www.w3.org/XML/1998/namespace") => format!("xml:{}", a.name()),
                _ => a.name().to_string(),
            };
            let _ = write!(self.out, " {name}=\"{}\"", escape(a.value()));
        }
        self.out.push_str(extra);
    }

    fn copy(&mut self, n: roxmltree::Node, depth: usize) {
        if depth > MAX_DEPTH {
            return;
        }
        if n.is_text() {
            self.out.push_str(&escape(n.text().unwrap_or("")));
            return;
        }
        if !n.is_element() || n.has_tag_name("style") {
            return;
        }
        self.open(n, "");
        self.out.push('>');
        for c in n.children() {
            self.copy(c, depth + 1);
        }
        let _ = write!(self.out, "</{}>", n.tag_name().name());
    }

    fn emit(&mut self, n: roxmltree::Node, ctx: &Ctx, depth: usize, name: &Path) -> Result<()> {
        if depth > MAX_DEPTH {
            return Err(invalid(
                name,
                format!(
                    "elements are nested more than {MAX_DEPTH} deep; expected a flatter document"
                ),
            ));
        }
        if n.is_text() {
            self.out.push_str(&escape(n.text().unwrap_or("")));
            return Ok(());
        }
        if !n.is_element() {
            return Ok(());
        }
        let tag = n.tag_name().name();
        match tag {
            // Style sheets are resolved here (see `style`), so the label
            // SVG must not carry them: they would override label colours.
            "style" => return Ok(()),
            "defs" | "clipPath" | "mask" | "pattern" | "linearGradient" | "radialGradient"
            | "symbol" | "marker" => {
                self.copy(n, depth);
                return Ok(());
            }
            "title" | "desc" | "metadata" | "foreignObject" | "script" => {
                return Ok(());
            }
            _ => {}
        }
        let mut c = self.styled(n, ctx);
        if self
            .css
            .get(n, "display")
            .is_some_and(|d| d.trim() == "none")
        {
            return Ok(());
        }
        if tag == "image" {
            // Embedded pictures are drawn, but are no class: label them as
            // "other" so that they count neither as background nor marks.
            let _ = write!(self.out, "<rect fill=\"{}\"", label_hex(OTHER));
            for a in ["x", "y", "width", "height", "transform"] {
                if let Some(v) = n.attribute(a) {
                    let _ = write!(self.out, " {a}=\"{}\"", escape(v));
                }
            }
            self.out.push_str("/>");
            return Ok(());
        }
        let role = n.attribute("data-role");
        let class = n
            .attribute("data-class")
            .and_then(|id| self.class_index(id));
        if role == Some("marks") {
            c.marks = class;
        } else if role == Some("legend-entry") {
            c.legend = class;
        } else if c.marks.is_some() {
            if let Some(k) = class {
                c.marks = Some(k);
            }
        }
        if SHAPES.contains(&tag) || tag == "text" {
            let fill = painted(&c.fill);
            let stroke = painted(&c.stroke)
                && c.stroke_width
                    .trim()
                    .trim_end_matches(char::is_alphabetic)
                    .parse::<f64>()
                    .map(|w| w > 0.0)
                    .unwrap_or(true);
            let (fl, sl) = if tag == "text" {
                let j = self.texts.len().min(MAX_TEXTS - 1);
                let size = length_pt(&c.font_size, self.unit_pt).unwrap_or(12.0);
                let w = c.font_weight.trim();
                self.texts.push(TextInfo {
                    fill: crate::color::parse_color(&c.fill).ok().map(|p| p.rgba.rgb),
                    size_pt: size,
                    bold: w == "bold"
                        || w == "bolder"
                        || w.parse::<f64>().is_ok_and(|v| v >= 700.0),
                    content: n
                        .descendants()
                        .filter(|d| d.is_text())
                        .filter_map(|d| d.text())
                        .collect(),
                });
                (TEXT_BASE + j as u16, TEXT_BASE + j as u16)
            } else if role == Some("background") {
                if self.background.is_none() {
                    self.background = crate::color::parse_color(&c.fill).ok().map(|p| p.rgba.rgb);
                }
                (BACKGROUND, BORDER)
            } else if let Some(k) = c.marks {
                if self.fills[k].is_none() && fill {
                    self.fills[k] = crate::color::parse_color(&c.fill).ok().map(|p| p.rgba.rgb);
                }
                (fill_label(k), BORDER)
            } else if let Some(k) = c.legend {
                (swatch_label(k), BORDER)
            } else if self.foreign.is_some() && fill {
                (self.foreign_label(n, &c), BORDER)
            } else {
                (OTHER, OTHER)
            };
            self.painted_any |= fill || stroke;
            let mut extra = String::new();
            let _ = write!(
                extra,
                " fill=\"{}\" stroke=\"{}\"",
                if fill { label_hex(fl) } else { "none".into() },
                if stroke { label_hex(sl) } else { "none".into() }
            );
            self.open(n, &extra);
            if tag == "text" {
                self.out.push('>');
                for ch in n.children() {
                    // tspans inherit the text's label.
                    self.copy_text(ch, depth + 1);
                }
                self.out.push_str("</text>");
            } else {
                self.out.push_str("/>");
            }
            return Ok(());
        }
        self.open(n, "");
        self.out.push('>');
        for ch in n.children() {
            self.emit(ch, &c, depth + 1, name)?;
        }
        let _ = write!(self.out, "</{tag}>");
        Ok(())
    }

    /// The context of `n`: its parent's, with the properties `n` declares
    /// (through the cascade) applied.
    fn styled(&self, n: roxmltree::Node, parent: &Ctx) -> Ctx {
        let mut c = parent.clone();
        let get = |name: &str| self.css.get(n, name).map(|v| v.trim().to_string());
        if let Some(v) = get("color") {
            c.color = v;
        }
        let current = |v: String, c: &Ctx| {
            if v.eq_ignore_ascii_case("currentcolor") {
                c.color.clone()
            } else {
                v
            }
        };
        if let Some(v) = get("fill") {
            c.fill = current(v, &c);
        }
        if let Some(v) = get("stroke") {
            c.stroke = current(v, &c);
        }
        if let Some(v) = get("stroke-width") {
            c.stroke_width = v;
        }
        if let Some(v) = get("font-size") {
            c.font_size = v;
        }
        if let Some(v) = get("font-weight") {
            c.font_weight = v;
        }
        let unit = |v: Option<String>| {
            v.and_then(|v| {
                let (num, scale) = match v.strip_suffix('%') {
                    Some(p) => (p.to_string(), 0.01),
                    None => (v, 1.0),
                };
                num.trim()
                    .parse::<f64>()
                    .ok()
                    .map(|x| (x * scale).clamp(0.0, 1.0))
            })
        };
        if let Some(v) = unit(get("fill-opacity")) {
            c.fill_opacity = v;
        }
        if let Some(v) = unit(get("opacity")) {
            c.opacity *= v;
        }
        c
    }

    /// The label of a filled shape of SVG without `data-class` marks: the
    /// background for a first rectangle covering the canvas, else the
    /// provisional class of its solid fill, else "other" (gradients,
    /// patterns, more distinct fills than can be labelled).
    fn foreign_label(&mut self, n: roxmltree::Node, c: &Ctx) -> u16 {
        let Ok(color) = crate::color::parse_color(&c.fill) else {
            return OTHER;
        };
        let alpha = color.rgba.alpha * c.fill_opacity * c.opacity;
        if alpha <= 0.0 {
            return OTHER;
        }
        let rgb = color.rgba.rgb;
        if !self.painted_any && alpha >= 1.0 && n.has_tag_name("rect") && self.covers_canvas(n) {
            self.background = Some(rgb);
            return BACKGROUND;
        }
        let key: FillKey = (rgb.to_rgb8(), (alpha * 255.0).round() as u8);
        let list = self.foreign.as_mut().expect("foreign mode");
        let k = match list.iter().position(|f| *f == key) {
            Some(k) => k,
            None if list.len() < MAX_CLASSES => {
                list.push(key);
                list.len() - 1
            }
            None => return OTHER,
        };
        fill_label(k)
    }

    /// Whether rectangle `n` (untransformed) covers at least 95% of the
    /// canvas in both directions.
    fn covers_canvas(&self, n: roxmltree::Node) -> bool {
        let Some((w, h)) = self.canvas else {
            return false;
        };
        if n.ancestors().any(|a| a.attribute("transform").is_some()) {
            return false;
        }
        let len = |name: &str, full: f64| -> f64 {
            let v = n.attribute(name).unwrap_or("0").trim();
            match v.strip_suffix('%') {
                Some(p) => p
                    .trim()
                    .parse::<f64>()
                    .map(|p| p / 100.0 * full)
                    .unwrap_or(0.0),
                None => v.trim_end_matches("px").parse::<f64>().unwrap_or(0.0),
            }
        };
        let (x, y) = (len("x", w), len("y", h));
        x <= 0.05 * w
            && y <= 0.05 * h
            && x + len("width", w) >= 0.95 * w
            && y + len("height", h) >= 0.95 * h
    }

    fn copy_text(&mut self, n: roxmltree::Node, depth: usize) {
        if depth > MAX_DEPTH {
            return;
        }
        if n.is_text() {
            self.out.push_str(&escape(n.text().unwrap_or("")));
        } else if n.is_element() {
            self.open(n, "");
            self.out.push('>');
            for c in n.children() {
                self.copy_text(c, depth + 1);
            }
            let _ = write!(self.out, "</{}>", n.tag_name().name());
        }
    }
}

/// A length in points: CSS units, or user units times `unit_pt`.
fn length_pt(v: &str, unit_pt: f64) -> Option<f64> {
    let v = v.trim();
    let (num, factor) = if let Some(n) = v.strip_suffix("pt") {
        (n, 1.0)
    } else if let Some(n) = v.strip_suffix("px") {
        (n, 0.75)
    } else if let Some(n) = v.strip_suffix("mm") {
        (n, 72.0 / 25.4)
    } else if let Some(n) = v.strip_suffix("cm") {
        (n, 720.0 / 25.4)
    } else if let Some(n) = v.strip_suffix("in") {
        (n, 72.0)
    } else {
        (v, unit_pt)
    };
    num.trim().parse::<f64>().ok().map(|x| x * factor)
}

/// The canvas in user units: the viewBox size, else width and height in
/// CSS px.
fn canvas(root: roxmltree::Node) -> Option<(f64, f64)> {
    if let Some(vb) = root.attribute("viewBox") {
        let v: Vec<f64> = vb
            .split([' ', ','])
            .filter(|s| !s.is_empty())
            .filter_map(|s| s.parse().ok())
            .collect();
        if v.len() == 4 && v[2] > 0.0 && v[3] > 0.0 {
            return Some((v[2], v[3]));
        }
    }
    let w = root.attribute("width").and_then(|w| length_pt(w, 0.75))? / 0.75;
    let h = root.attribute("height").and_then(|h| length_pt(h, 0.75))? / 0.75;
    (w > 0.0 && h > 0.0).then_some((w, h))
}

/// Points per user unit of the root: its width over its viewBox width
/// (CSS px, 0.75 pt, when it has no viewBox).
fn unit_pt(root: roxmltree::Node) -> f64 {
    let width = root.attribute("width").and_then(|w| length_pt(w, 0.75));
    let vb = root.attribute("viewBox").and_then(|v| {
        v.split([' ', ','])
            .filter(|s| !s.is_empty())
            .nth(2)?
            .parse::<f64>()
            .ok()
    });
    match (width, vb) {
        (Some(w), Some(b)) if b > 0.0 => w / b,
        _ => 0.75,
    }
}

/// Rewrite `svg` into its label SVG. Errors when the document is not XML
/// or carries no `data-class` marks (class detection for SVG from other
/// tools is not available yet).
pub fn label_svg(name: &Path, svg: &str) -> Result<LabelSvg> {
    refuse_entities(name, svg)?;
    // A document type declaration without entities (the public SVG 1.1
    // one that many tools write) is allowed; nothing it names is fetched.
    let options = roxmltree::ParsingOptions {
        allow_dtd: true,
        ..roxmltree::ParsingOptions::default()
    };
    let doc = roxmltree::Document::parse_with_options(svg, options)
        .map_err(|e| invalid(name, format!("not a readable SVG document: {e}")))?;
    let root = doc.root_element();
    if root.tag_name().name() != "svg" {
        return Err(invalid(name, "expected an <svg> root element".into()));
    }
    let mut ids = Vec::new();
    collect_classes(root, false, &mut ids);
    let foreign = ids.is_empty();
    if ids.len() > MAX_CLASSES {
        return Err(invalid(
            name,
            format!(
                "{} classes; at most {MAX_CLASSES} can be audited",
                ids.len()
            ),
        ));
    }
    ids.sort_by_key(|id| class_order(id));
    let css = Cascade::new(&doc);
    let mut w = Writer {
        ids: &ids,
        css: &css,
        foreign: foreign.then(Vec::new),
        canvas: canvas(root),
        painted_any: false,
        fills: vec![None; ids.len()],
        background: None,
        texts: Vec::new(),
        unit_pt: unit_pt(root),
        out: String::with_capacity(svg.len()),
    };
    let ctx = Ctx {
        marks: None,
        legend: None,
        fill: "black".into(),
        stroke: "none".into(),
        stroke_width: "1".into(),
        font_size: "16".into(),
        font_weight: "normal".into(),
        color: "black".into(),
        fill_opacity: 1.0,
        opacity: 1.0,
    };
    // The root: its attributes, the namespaces, and aliasing turned off.
    let c = w.styled(root, &ctx);
    w.out.push_str("<svg");
    for a in root.attributes() {
        if DROPPED_ATTRS.contains(&a.name()) || a.namespace().is_some() {
            continue;
        }
        let _ = write!(w.out, " {}=\"{}\"", a.name(), escape(a.value()));
    }
    w.out.push_str(
        " xmlns=\"http://www.w3.org/2000/svg\" xmlns:xlink=\"http://www.w3.org/1999/xlink\" shape-rendering=\"crispEdges\" text-rendering=\"optimizeSpeed\">",
    );
    for ch in root.children() {
        w.emit(ch, &c, 1, name)?;
    }
    w.out.push_str("</svg>\n");
    let (ids, fills, detected) = match w.foreign.take() {
        Some(keys) => (
            keys.iter().map(|&(c, a)| fill_id(c, a)).collect(),
            keys.iter()
                .map(|&(c, _)| Some(Srgb::from_rgb8(c[0], c[1], c[2])))
                .collect(),
            Some(keys.iter().map(|&(_, a)| a).collect()),
        ),
        None => (ids.clone(), w.fills.clone(), None),
    };
    let classes = SceneClasses {
        fills,
        background: w.background,
        ids,
    };
    Ok(LabelSvg {
        svg: w.out,
        classes,
        texts: w.texts,
        detected,
    })
}

/// A decoded label raster.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Labels {
    /// Width in pixels.
    pub width: u32,
    /// Height in pixels.
    pub height: u32,
    /// One label per pixel, row-major.
    pub ids: Vec<u16>,
}

/// Render the label SVG at `dpi` (with [`raster::render_flat`]: the same
/// pixels as [`raster::render`]) and decode it. Colours that are no label
/// (there should be none without anti-aliasing) decode as [`OTHER`].
pub fn render_labels(name: &Path, label: &LabelSvg, dpi: f64) -> Result<Labels> {
    let doc = raster::parse(name, label.svg.as_bytes())?;
    let img = raster::render_flat(name, &doc, dpi, Srgb::new(0.0, 0.0, 0.0))?;
    let top = fill_label(label.classes.ids.len());
    let ids = img
        .rgba
        .chunks_exact(4)
        .map(|p| {
            let l = p[0] as u16 | (p[1] as u16) << 8;
            let text = l >= TEXT_BASE && ((l - TEXT_BASE) as usize) < label.texts.len();
            if p[2] != 0 || (l > top && !text) {
                OTHER
            } else {
                l
            }
        })
        .collect();
    Ok(Labels {
        width: img.width,
        height: img.height,
        ids,
    })
}
