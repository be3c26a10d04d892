//! The measured audit of hueproof's own figures: the figure's SVG is
//! rendered twice at one DPI, once as readers see it and once as a label
//! raster ([`labels`]); the rendered raster is transformed for every view
//! with the vision fast path and measured class by class ([`measure`]);
//! the measurements are judged into findings ([`judge`], with the
//! size-dependent thresholds of [`stone2014`]); the result is a
//! serialisable [`Report`].
//!
//! The two renderings are made side by side on two threads: the figure's
//! (parse and render, which the audit cannot shorten) and the label side
//! (label SVG, label raster, geometry, text boxes), which is shorter; then
//! the reads of the normal raster and the views, the views in parallel.
//! On the 3,000-shape benchmark (`benches/audit.rs`) the whole audit takes
//! about 1.1 times the figure's rasterisation alone on an idle 2-core
//! machine.
//!
//! SVG made by other tools, without hueproof's `data-class` attributes, is
//! audited too: its classes are detected from its distinct solid fills
//! ([`detect`]), with the style cascade resolved ([`style`]).

pub mod detect;
pub mod judge;
pub mod labels;
pub mod measure;
pub mod propose;
pub mod settings;
pub mod stone2014;
pub mod style;
pub mod text;

use std::path::Path;

use serde::Serialize;
use serde::ser::SerializeMap;

use crate::color::Srgb;
use crate::error::Result;
use crate::findings::{Kind, Severity};
use crate::scheme::SchemeKind;
use crate::vision::{CvdModel, NamedView, Simulation};
use crate::{raster, svg};

/// How to audit.
#[derive(Debug, Clone)]
pub struct Options {
    /// The views, by name as in `inspect`.
    pub views: Vec<NamedView>,
    /// The simulation model (None: the documented choice per view).
    pub model: Option<CvdModel>,
    /// Rendering resolution of the audit.
    pub dpi: f64,
    /// Viewing distance in centimetres (40: print and screen).
    pub viewing_distance_cm: f64,
    /// The kind of scheme, when known (from the spec); order, glare and
    /// midpoint are judged only when it is.
    pub scheme: Option<SchemeKind>,
    /// Findings at or above this severity fail the audit.
    pub fail_on: Severity,
    /// Thresholds.
    pub thresholds: judge::Thresholds,
    /// Classes muted on purpose (faded to gray for emphasis of others):
    /// not judged.
    pub muted: Vec<String>,
    /// For a diverging scheme: where the arms meet, when known (from the
    /// spec); else it is taken at the lightest class.
    pub split: Option<judge::Split>,
    /// SVG without `data-class` marks: the smallest rendered area of a
    /// distinct fill that counts as a class, in square millimetres.
    pub min_class_area_mm2: f64,
}

impl Options {
    /// The defaults: the five default views, 40 cm, 150 DPI, fail on errors.
    pub fn new() -> Options {
        Options {
            views: crate::vision::parse_views(crate::vision::DEFAULT_VIEWS)
                .expect("the default views parse"),
            model: None,
            dpi: 150.0,
            viewing_distance_cm: 40.0,
            scheme: None,
            fail_on: Severity::Error,
            thresholds: judge::Thresholds::default(),
            muted: Vec::new(),
            split: None,
            min_class_area_mm2: 2.0,
        }
    }
}

impl Default for Options {
    fn default() -> Self {
        Options::new()
    }
}

/// Colours in view order, serialised as a JSON object `{VIEW: "#rrggbb"}`
/// keeping that order.
#[derive(Debug, Clone, PartialEq)]
pub struct PerView(pub Vec<(String, String)>);

impl Serialize for PerView {
    fn serialize<S: serde::Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(self.0.len()))?;
        for (k, v) in &self.0 {
            m.serialize_entry(k, v)?;
        }
        m.end()
    }
}

/// One class as measured.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ClassReport {
    /// The class id (`c1`, ..., `no-data`, `ramp`, `all`).
    pub id: String,
    /// Its nominal fill (where not a flat colour, the measured normal one).
    pub fill: String,
    /// Rendered area in pixels.
    pub area_px: usize,
    /// Separate regions.
    pub regions: usize,
    /// Typical mark size: median inscribed diameter, pixels.
    pub mark_size_px: f64,
    /// The same as a visual angle at the viewing distance, degrees.
    pub mark_angle_deg: f64,
    /// The measured colour per view.
    pub measured: PerView,
}

/// One finding of the audit.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct AuditFinding {
    /// Stable code, e.g. `HP101`.
    pub code: &'static str,
    /// The kind.
    pub kind: Kind,
    /// Severity.
    pub severity: Severity,
    /// The view it occurs in.
    pub view: String,
    /// The class ids involved.
    pub classes: Vec<String>,
    /// The measured value.
    pub measured: f64,
    /// The threshold it was judged against.
    pub threshold: f64,
    /// What was measured, e.g. `delta_e2000`.
    pub measure: &'static str,
    /// One sentence for people.
    pub message: String,
    /// The smallest change that fixes it, in words (blend, fade, order).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub fix: Option<String>,
}

/// The audit's result.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Report {
    /// No finding reaches the fail level.
    pub passed: bool,
    /// The views, by name.
    pub views: Vec<String>,
    /// Audit resolution.
    pub dpi: f64,
    /// Viewing distance, cm.
    pub viewing_distance_cm: f64,
    /// Where the classes come from: `markup` (hueproof's `data-class`
    /// attributes) or `fills` (detected from the distinct solid fills of
    /// SVG made by another tool).
    pub classes_from: &'static str,
    /// The classes.
    pub classes: Vec<ClassReport>,
    /// Shared edge length in pixels between touching classes.
    pub contacts: Vec<Contact>,
    /// The findings, by view then code.
    pub findings: Vec<AuditFinding>,
    /// For a spec whose audit fails on its colours: a repaired palette,
    /// checked by drawing and auditing the figure again.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub repair: Option<propose::Proposal>,
    /// References to outside files or addresses that were left out, never
    /// read (SVG is untrusted): what is drawn there was not audited.
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub refused_references: Vec<String>,
}

/// Two classes that touch on the figure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Contact {
    /// The two class ids.
    pub classes: [String; 2],
    /// Shared edge length, pixels (row plus column crossings).
    pub length_px: usize,
}

/// The measurements the judge works on.
#[derive(Debug, Clone)]
pub struct Measured {
    /// Class ids.
    pub ids: Vec<String>,
    /// Geometry from the label raster.
    pub geometry: measure::Geometry,
    /// Typical angle per class, degrees.
    pub angle_deg: Vec<f64>,
    /// Per view: colour of each class (None when it has no pixels).
    pub colors: Vec<Vec<Option<Srgb>>>,
    /// Per view: colour of each class's legend swatch.
    pub swatches: Vec<Vec<Option<Srgb>>>,
    /// Per view: the background colour.
    pub background: Vec<Srgb>,
    /// Per view, per class: the contrast ratio of each crossing into the
    /// background (the highest along the crossing), median over crossings.
    pub boundary: Vec<Vec<Option<f64>>>,
    /// The text elements as written.
    pub texts: Vec<labels::TextInfo>,
    /// Per view, per text element: the WCAG contrast of its specified fill
    /// (simulated) against the median of the pixels around it.
    pub text_contrast: Vec<Vec<Option<f64>>>,
}

/// What text stands on: the non-text pixels of its box grown by this.
pub const TEXT_MARGIN_PX: usize = 2;

fn rgb8(c: [u8; 3]) -> Srgb {
    Srgb::from_rgb8(c[0], c[1], c[2])
}

/// Audit the SVG text `svg` (`name` names it in messages).
pub fn audit_svg(name: &Path, svg_text: &str, opt: &Options) -> Result<Report> {
    examine(name, svg_text, opt).map(|e| e.report)
}

/// The audit's report with what it was computed from, for drawing the
/// findings on the figure (the contact sheet).
#[derive(Debug, Clone)]
pub struct Examined {
    /// The report, as [`audit_svg`] returns it.
    pub report: Report,
    /// The figure as readers with normal vision see it, at the audit DPI.
    pub raster: raster::Raster,
    /// The label raster of the same size: class `k` (as in
    /// `report.classes[k]`) is painted with [`labels::fill_label`]`(k)`.
    pub labels: labels::Labels,
}

/// Audit as [`audit_svg`] does, keeping the normal raster and the label
/// raster.
pub fn examine(name: &Path, svg_text: &str, opt: &Options) -> Result<Examined> {
    let px_per_mm = opt.dpi / 25.4;
    let min_area = (opt.min_class_area_mm2 * px_per_mm * px_per_mm).ceil() as usize;
    // The figure's raster and the label raster with its geometry are
    // independent and made side by side. The label SVG is written first
    // on the label side; the figure's side needs only its background
    // colour, after parsing, and takes the label SVG from the label side
    // (or writes it, when that side has not started yet). Errors are
    // reported in that order: label SVG, figure, label raster. Classes
    // detected from fills (SVG from other tools) are settled on the label
    // raster before its geometry is measured.
    labels::refuse_entities(name, svg_text)?;
    let written: std::sync::OnceLock<Result<labels::LabelSvg>> = std::sync::OnceLock::new();
    let label_svg = || {
        written
            .get_or_init(|| labels::label_svg(name, svg_text))
            .as_ref()
    };
    let (img, labelled) = rayon::join(
        || {
            let doc = raster::parse(name, svg_text.as_bytes())?;
            // On an error in the label SVG that error is reported, not this.
            let Ok(label) = label_svg() else {
                return Ok(None);
            };
            let bg = label.classes.background.unwrap_or(Srgb::new(1.0, 1.0, 1.0));
            raster::render(name, &doc, opt.dpi, bg).map(|img| Some((img, doc.refused, bg)))
        },
        || {
            let Ok(written) = label_svg() else {
                return Ok(None);
            };
            let mut lab = labels::render_labels(name, written, opt.dpi)?;
            // What the audit keeps of the label SVG (not its text), with
            // its classes settled.
            let mut label = labels::LabelSvg {
                svg: String::new(),
                classes: written.classes.clone(),
                texts: written.texts.clone(),
                detected: written.detected.clone(),
            };
            detect::settle_detected(&mut label, &mut lab, min_area.max(1), opt.scheme);
            let geometry = measure::geometry(&lab, label.classes.ids.len(), opt.dpi);
            let boxes = measure::text_boxes(&lab, label.texts.len());
            Ok::<_, crate::error::Error>(Some((label, lab, geometry, boxes)))
        },
    );
    if let Some(Err(e)) = written.into_inner() {
        return Err(e);
    }
    let (img, refused, bg) = img?.expect("the label SVG was written");
    let (label, lab, geometry, boxes) = labelled?.expect("the label SVG was written");
    let n = label.classes.ids.len();
    let dist_mm = opt.viewing_distance_cm * 10.0;
    let angle_deg: Vec<f64> = geometry
        .size_px
        .iter()
        .map(|&px| stone2014::visual_angle_deg(stone2014::px_to_mm(px, opt.dpi), dist_mm))
        .collect();
    let mut m = Measured {
        ids: label.classes.ids.clone(),
        geometry,
        angle_deg,
        colors: Vec::new(),
        swatches: Vec::new(),
        background: Vec::new(),
        boundary: Vec::new(),
        texts: label.texts.clone(),
        text_contrast: Vec::new(),
    };
    // What the measurements read, gathered once; per view only the
    // distinct colours read are simulated (the same values as simulating
    // the whole raster: see measure::Palette).
    let reads = measure::Reads::new(
        &img.rgba,
        &lab,
        &m.geometry,
        &boxes,
        TEXT_MARGIN_PX,
        labels::fill_label(n) as usize,
    );
    // The views are independent: measured side by side, kept in order.
    use rayon::prelude::*;
    type ViewMeasures = (
        Vec<Option<Srgb>>,
        Vec<Option<Srgb>>,
        Srgb,
        Vec<Option<f64>>,
        Vec<Option<f64>>,
    );
    let views: Vec<ViewMeasures> = opt
        .views
        .par_iter()
        .map(|v| {
            let sim = Simulation::new(v.view, opt.model);
            let seen = reads.palette.simulate(&sim);
            let part = |l: u16| reads.part(&seen, l).map(rgb8);
            let background = part(labels::BACKGROUND).unwrap_or(sim.apply(bg));
            let colors = (0..n).map(|k| part(labels::fill_label(k))).collect();
            let swatches = (0..n).map(|k| part(labels::swatch_label(k))).collect();
            let lb = crate::color::wcag::relative_luminance(background);
            let text_contrast = boxes
                .iter()
                .zip(&m.texts)
                .enumerate()
                .map(|(j, (bx, t))| {
                    bx.as_ref()?;
                    let around = reads.around(&seen, j)?;
                    let fg = match t.fill {
                        Some(f) => sim.apply(f),
                        None => rgb8(reads.text(&seen)?),
                    };
                    Some(crate::color::wcag::contrast_ratio(fg, rgb8(around)))
                })
                .collect();
            (
                colors,
                swatches,
                background,
                reads.boundary(&seen, lb),
                text_contrast,
            )
        })
        .collect();
    for (colors, swatches, background, boundary, text_contrast) in views {
        m.colors.push(colors);
        m.swatches.push(swatches);
        m.boundary.push(boundary);
        m.text_contrast.push(text_contrast);
        m.background.push(background);
    }
    let findings = judge::judge(&m, opt);
    let classes = (0..n)
        .map(|k| ClassReport {
            id: m.ids[k].clone(),
            fill: label.classes.fills[k]
                .or(m.colors.first().and_then(|c| c[k]))
                .map(svg::hex)
                .unwrap_or_default(),
            area_px: m.geometry.area[k],
            regions: m.geometry.regions[k],
            mark_size_px: (m.geometry.size_px[k] * 100.0).round() / 100.0,
            mark_angle_deg: (m.angle_deg[k] * 1000.0).round() / 1000.0,
            measured: PerView(
                opt.views
                    .iter()
                    .zip(&m.colors)
                    .map(|(v, c)| (v.name.clone(), c[k].map(svg::hex).unwrap_or_default()))
                    .collect(),
            ),
        })
        .collect();
    let contacts = m
        .geometry
        .contacts
        .iter()
        .map(|((a, b), len)| Contact {
            classes: [m.ids[*a].clone(), m.ids[*b].clone()],
            length_px: *len,
        })
        .collect();
    let report = Report {
        passed: !findings.iter().any(|f| f.severity >= opt.fail_on),
        views: opt.views.iter().map(|v| v.name.clone()).collect(),
        dpi: opt.dpi,
        viewing_distance_cm: opt.viewing_distance_cm,
        classes_from: if label.detected.is_some() {
            "fills"
        } else {
            "markup"
        },
        classes,
        contacts,
        findings,
        repair: None,
        refused_references: refused,
    };
    Ok(Examined {
        report,
        raster: img,
        labels: lab,
    })
}
