//! The summary behind `hueproof shapes`: the chosen projection with all
//! its parameters, and per feature its key, projected planar area, label
//! point, parts and vertices, plus every geometry problem.

use std::fmt::Write as _;

use serde::Serialize;

use super::extent::Extent;
use super::fit::Fit;
use super::measure::{geometry_area, label_point};
use super::model::{Coord, Geometry, Layer};
use super::projection::{Ellipsoid, ProjectionName, Purpose, choose_projection};
use super::simplify::{Method, simplify};

/// What to summarise.
#[derive(Debug, Clone)]
pub struct ShapesRequest {
    /// The requested projection, `None` for the default from the extent.
    pub projection: Option<ProjectionName>,
    /// The figure of the Earth.
    pub ellipsoid: Ellipsoid,
    /// Split edges longer than this many degrees before projecting (0: off).
    pub densify_degrees: f64,
    /// Fit to an output frame and simplify there, if set.
    pub output: Option<OutputRequest>,
}

/// Fitting to a frame and simplifying for output.
#[derive(Debug, Clone, Copy)]
pub struct OutputRequest {
    /// Frame width, pixels.
    pub width: f64,
    /// Frame height, pixels.
    pub height: f64,
    /// Padding on every side, pixels.
    pub padding: f64,
    /// Simplification method.
    pub method: Method,
    /// Tolerance, pixels.
    pub tolerance: f64,
    /// Shapes under this area (square pixels) are reported as tiny.
    pub tiny_area: f64,
}

/// What fitting and simplification did.
#[derive(Debug, Clone, Serialize)]
pub struct SimplificationReport {
    /// Frame `[width, height]`, pixels.
    pub frame: [f64; 2],
    /// Padding, pixels.
    pub padding: f64,
    /// Pixels per projected unit.
    pub scale: f64,
    /// The method.
    pub method: Method,
    /// Tolerance, pixels.
    pub tolerance_px: f64,
    /// Vertices before simplification (after cutting and densifying).
    pub vertices_in: usize,
    /// Vertices after.
    pub vertices_out: usize,
    /// Distinct arcs (shared borders counted once).
    pub arcs: usize,
    /// Tiny-shape threshold, square pixels.
    pub tiny_area_px2: f64,
    /// Keys of shapes under the threshold: kept, not dropped.
    pub tiny_shapes: Vec<String>,
}

/// The projection part of the report.
#[derive(Debug, Clone, Serialize)]
pub struct ProjectionReport {
    /// Its command-line name.
    pub name: String,
    /// Every parameter (degrees, metres; `a`, `e2` for the ellipsoid).
    pub params: std::collections::BTreeMap<&'static str, f64>,
}

/// One feature's measures.
#[derive(Debug, Clone, Serialize)]
pub struct FeatureSummary {
    /// The key.
    pub key: String,
    /// Projected planar area (square metres for the metric projections).
    pub area: f64,
    /// Interior label point in projected coordinates, `null` if empty.
    pub label_point: Option<Coord>,
    /// Number of parts (polygons, lines and points).
    pub parts: usize,
    /// Number of vertices (rings counted open).
    pub vertices: usize,
}

/// One problem line.
#[derive(Debug, Clone, Serialize)]
pub struct ProblemEntry {
    /// 0-based feature index.
    pub feature: usize,
    /// The feature's key.
    pub key: String,
    /// What, where, and what happened.
    pub problem: String,
}

/// The whole report.
#[derive(Debug, Clone, Serialize)]
pub struct ShapesReport {
    /// The projection used.
    pub projection: ProjectionReport,
    /// Usable features in input order.
    pub features: Vec<FeatureSummary>,
    /// Every problem, in input order.
    pub problems: Vec<ProblemEntry>,
    /// Fitting and simplification, when a frame was given.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub simplification: Option<SimplificationReport>,
    /// The output geometries (frame pixels, y down), when a frame was
    /// given; in the order of `features`.
    #[serde(skip)]
    pub output: Vec<Geometry>,
    /// Why this projection (text output only).
    #[serde(skip)]
    pub reason: String,
    /// Warnings for standard error.
    #[serde(skip)]
    pub warnings: Vec<String>,
    /// Number of problems that excluded a feature.
    #[serde(skip)]
    pub unrepaired: usize,
}

/// Build the report for a layer. The error is a message about the request.
pub fn summarise(layer: &Layer, req: &ShapesRequest) -> Result<ShapesReport, String> {
    let extent = Extent::of(layer.usable().flat_map(|(_, g)| g.coords()));
    let choice = choose_projection(
        extent,
        layer.coordinates(),
        req.projection,
        req.ellipsoid,
        Purpose::Areal,
    )?;
    let proj = choice.projection;
    let mut problems: Vec<ProblemEntry> = layer
        .problems()
        .iter()
        .map(|p| ProblemEntry {
            feature: p.feature,
            key: p.key.clone(),
            problem: format!("{}: {}", kind_name(p.kind), p.message()),
        })
        .collect();
    let mut unrepaired = layer.unrepaired().count();
    let mut features = Vec::new();
    let mut projected = Vec::new();
    for (f, g) in layer.usable() {
        let Some(pg) = proj.project_geometry(g, req.densify_degrees) else {
            problems.push(ProblemEntry {
                feature: f.index,
                key: f.display_key(),
                problem: format!(
                    "unprojectable: a vertex has no image in '{}' (the antipode of its centre?); feature excluded",
                    proj.name()
                ),
            });
            unrepaired += 1;
            continue;
        };
        features.push(FeatureSummary {
            key: f.display_key(),
            area: geometry_area(&pg),
            label_point: label_point(&pg),
            parts: g.part_count(),
            vertices: g.vertex_count(),
        });
        if req.output.is_some() {
            projected.push(pg);
        }
    }
    problems.sort_by_key(|p| p.feature);
    let mut warnings = choice.warnings;
    let (simplification, output) = match req.output {
        None => (None, Vec::new()),
        Some(o) => {
            let fit = Fit::for_geometries(projected.iter(), o.width, o.height, o.padding)
                .ok_or_else(|| {
                    format!(
                        "cannot fit the shapes into {} x {} px with {} px padding",
                        o.width, o.height, o.padding
                    )
                })?;
            let fitted: Vec<Geometry> = projected.iter().map(|g| fit.apply_geometry(g)).collect();
            let (out, rep) = simplify(&fitted, o.method, o.tolerance, o.tiny_area);
            let tiny_shapes: Vec<String> =
                rep.tiny.iter().map(|&i| features[i].key.clone()).collect();
            if !tiny_shapes.is_empty() {
                warnings.push(format!(
                    "{} shape(s) smaller than {} px² at this frame size are kept but will be hard to see: {}",
                    tiny_shapes.len(),
                    o.tiny_area,
                    tiny_shapes.join(", ")
                ));
            }
            (
                Some(SimplificationReport {
                    frame: [o.width, o.height],
                    padding: o.padding,
                    scale: fit.scale,
                    method: o.method,
                    tolerance_px: o.tolerance,
                    vertices_in: rep.vertices_in,
                    vertices_out: rep.vertices_out,
                    arcs: rep.arcs,
                    tiny_area_px2: o.tiny_area,
                    tiny_shapes,
                }),
                out,
            )
        }
    };
    Ok(ShapesReport {
        projection: ProjectionReport {
            name: proj.name().to_string(),
            params: proj.params(),
        },
        features,
        problems,
        simplification,
        output,
        reason: choice.reason,
        warnings,
        unrepaired,
    })
}

fn kind_name(k: super::model::ProblemKind) -> String {
    serde_json::to_value(k)
        .ok()
        .and_then(|v| v.as_str().map(str::to_string))
        .unwrap_or_default()
}

/// The report as text.
pub fn render_text(r: &ShapesReport) -> String {
    let mut s = String::new();
    let _ = writeln!(s, "projection: {} ({})", r.projection.name, r.reason);
    for (k, v) in &r.projection.params {
        let _ = writeln!(s, "  {k} = {v}");
    }
    let _ = writeln!(s, "features: {}", r.features.len());
    for f in &r.features {
        let lp = match f.label_point {
            Some([x, y]) => format!("({x:.3}, {y:.3})"),
            None => "none".into(),
        };
        let _ = writeln!(
            s,
            "  {}: area {:.6e}, label point {lp}, {} part(s), {} vertices",
            f.key, f.area, f.parts, f.vertices
        );
    }
    if let Some(x) = &r.simplification {
        let _ = writeln!(
            s,
            "output: {} x {} px, padding {} px, {} at {} px: {} vertices in, {} out, {} arcs",
            x.frame[0],
            x.frame[1],
            x.padding,
            x.method.as_str(),
            x.tolerance_px,
            x.vertices_in,
            x.vertices_out,
            x.arcs
        );
        let _ = writeln!(
            s,
            "  tiny shapes (< {} px², kept): {}",
            x.tiny_area_px2,
            if x.tiny_shapes.is_empty() {
                "none".to_string()
            } else {
                x.tiny_shapes.join(", ")
            }
        );
    }
    let _ = writeln!(s, "problems: {}", r.problems.len());
    for p in &r.problems {
        let _ = writeln!(s, "  feature {} ('{}'): {}", p.feature, p.key, p.problem);
    }
    s
}
