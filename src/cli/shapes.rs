//! `hueproof shapes SHAPES`: projection, per-feature measures and geometry
//! problems of a boundary file.

use std::path::PathBuf;

use clap::{Args, ValueEnum};

use crate::error::{Error, ExitKind};
use crate::geo::projection::{Ellipsoid, ProjectionName};
use crate::geo::shapes::{OutputRequest, ShapesRequest, render_text, summarise};
use crate::geo::simplify::Method;
use crate::geo::{CoordinateKind, KeySource, ReadOptions, read_shapes_file};

use super::Outcome;

/// Arguments of `shapes`.
#[derive(Debug, Args)]
pub struct ShapesArgs {
    /// Boundary or point file (GeoJSON).
    #[arg(value_name = "SHAPES")]
    pub shapes: PathBuf,
    /// Feature property holding the key (`id` falls back to the feature
    /// id); default: the feature's index.
    #[arg(long, value_name = "K")]
    pub key: Option<String>,
    /// Projection: equirectangular, web-mercator, albers,
    /// lambert-azimuthal, equal-earth, or planar for data already projected
    /// (default: an equal-area one chosen from the extent).
    #[arg(long, value_name = "NAME", value_parser = |s: &str| s.parse::<ProjectionName>())]
    pub projection: Option<ProjectionName>,
    /// Figure of the Earth.
    #[arg(long, value_enum, default_value = "wgs84")]
    pub ellipsoid: EllipsoidArg,
    /// Fix problems with a well-defined repair (close rings, drop
    /// degenerate rings, keep empty features).
    #[arg(long)]
    pub repair: bool,
    /// Split edges longer than DEG degrees before projecting (0: off).
    #[arg(long, value_name = "DEG", default_value_t = 0.0)]
    pub densify: f64,
    /// Fit to an output frame of WxH pixels (e.g. 800x600) and simplify
    /// there; the report then gives vertices in and out.
    #[arg(long, value_name = "WxH")]
    pub frame: Option<String>,
    /// Padding inside the frame, pixels.
    #[arg(long, value_name = "PX", default_value_t = 10.0)]
    pub padding: f64,
    /// Simplification tolerance, output pixels.
    #[arg(long, value_name = "PX", default_value_t = 0.25)]
    pub simplify: f64,
    /// Simplification method.
    #[arg(long, value_enum, default_value = "visvalingam-whyatt")]
    pub method: MethodArg,
    /// Report shapes smaller than this many square pixels (they are kept).
    #[arg(long, value_name = "PX2", default_value_t = 1.0)]
    pub tiny: f64,
    /// TopoJSON object to read (default: the first object).
    #[arg(long, value_name = "NAME")]
    pub object: Option<String>,
    /// Print one JSON object instead of text.
    #[arg(long)]
    pub json: bool,
}

/// Simplification methods on the command line.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum MethodArg {
    /// Visvalingam & Whyatt 1993 (effective area, tolerance² px²).
    VisvalingamWhyatt,
    /// Douglas & Peucker 1973 (distance, tolerance px).
    DouglasPeucker,
}

fn parse_frame(s: &str) -> Result<(f64, f64), Error> {
    let bad = || Error::Usage {
        what: "--frame".into(),
        message: format!("expected WIDTHxHEIGHT in pixels, e.g. 800x600, got '{s}'"),
    };
    let (w, h) = s.split_once(['x', 'X']).ok_or_else(bad)?;
    let w: f64 = w.trim().parse().map_err(|_| bad())?;
    let h: f64 = h.trim().parse().map_err(|_| bad())?;
    if !(w > 0.0 && h > 0.0 && w.is_finite() && h.is_finite()) {
        return Err(bad());
    }
    Ok((w, h))
}

/// Ellipsoid names on the command line.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum EllipsoidArg {
    /// WGS84 ellipsoid.
    Wgs84,
    /// Sphere of the WGS84 authalic radius, 6371007.181 m.
    Sphere,
}

/// Run `shapes`.
pub fn run(args: ShapesArgs) -> Result<Outcome, Error> {
    let projection = args.projection;
    if !(args.densify >= 0.0 && args.densify.is_finite()) {
        return Err(Error::Usage {
            what: "--densify".into(),
            message: format!(
                "expected a non-negative number of degrees, got {}",
                args.densify
            ),
        });
    }
    let coordinates = if projection == Some(ProjectionName::Planar) {
        CoordinateKind::Planar
    } else {
        CoordinateKind::Geographic
    };
    let layer = read_shapes_file(
        &args.shapes,
        &ReadOptions {
            key: args.key.clone().map(KeySource::Property),
            repair: args.repair,
            coordinates,
        },
        args.object.as_deref(),
    )?;
    let ellipsoid = match args.ellipsoid {
        EllipsoidArg::Wgs84 => Ellipsoid::wgs84(),
        EllipsoidArg::Sphere => Ellipsoid::authalic_sphere(),
    };
    for (what, v) in [
        ("--padding", args.padding),
        ("--simplify", args.simplify),
        ("--tiny", args.tiny),
    ] {
        if !(v >= 0.0 && v.is_finite()) {
            return Err(Error::Usage {
                what: what.into(),
                message: format!("expected a non-negative number, got {v}"),
            });
        }
    }
    let output = match &args.frame {
        None => None,
        Some(f) => {
            let (width, height) = parse_frame(f)?;
            Some(OutputRequest {
                width,
                height,
                padding: args.padding,
                method: match args.method {
                    MethodArg::VisvalingamWhyatt => Method::VisvalingamWhyatt,
                    MethodArg::DouglasPeucker => Method::DouglasPeucker,
                },
                tolerance: args.simplify,
                tiny_area: args.tiny,
            })
        }
    };
    let req = ShapesRequest {
        projection,
        ellipsoid,
        densify_degrees: args.densify,
        output,
    };
    let rep = summarise(&layer, &req).map_err(|message| Error::Usage {
        what: "shapes".into(),
        message,
    })?;
    let stdout = if args.json {
        let mut s = serde_json::to_string_pretty(&rep)
            .map_err(|e| Error::Internal(format!("serialising the shapes report: {e}")))?;
        s.push('\n');
        s
    } else {
        render_text(&rep)
    };
    Ok(Outcome {
        stdout,
        warnings: rep.warnings.clone(),
        kind: if rep.unrepaired > 0 {
            ExitKind::Findings
        } else {
            ExitKind::Success
        },
    })
}
