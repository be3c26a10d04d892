//! `hueproof check SPEC|FIGURE.svg`: the measured audit of a figure, as
//! text, JSON, SARIF or JUnit XML, with an exit code a build can act on.

use std::path::PathBuf;

use clap::{Args, ValueEnum};

use crate::audit::{self, Options};
use crate::error::{Error, ExitKind};
use crate::findings::Severity;
use crate::report::export::Exports;
use crate::scheme::SchemeKind;
use crate::vision;

use super::Outcome;

/// The severity that fails the check.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum FailOn {
    /// Only errors fail.
    Error,
    /// Warnings and errors fail.
    Warning,
}

/// Scheme kinds on the command line (for an SVG, which does not say).
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum SchemeArg {
    /// Ordered lightness.
    Sequential,
    /// Two arms around a midpoint.
    Diverging,
    /// Categories of equal weight.
    Qualitative,
}

/// Arguments of `check`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// A figure spec (.toml, rendered first) or an SVG made by hueproof.
    #[arg(value_name = "SPEC|FIGURE.svg")]
    pub input: PathBuf,
    /// Comma-separated views: normal, protanopia, deuteranopia, tritanopia,
    /// achromatopsia, protanomaly=S, deuteranomaly=S, tritanomaly=S.
    #[arg(long, default_value = vision::DEFAULT_VIEWS, value_name = "LIST")]
    pub views: String,
    /// Viewing distance in centimetres (sets the marks' visual angle).
    #[arg(long, default_value_t = 40.0, value_name = "CM")]
    pub viewing_distance: f64,
    /// Audit resolution (default: the spec's DPI; 150 for an SVG).
    #[arg(long, value_name = "N")]
    pub dpi: Option<f64>,
    /// The severity that makes the check fail (exit code 1).
    #[arg(long, value_enum, default_value = "error", value_name = "LEVEL")]
    pub fail_on: FailOn,
    /// The figure's kind of scheme, for an SVG (a spec says it itself);
    /// order, glare and midpoint are judged only when it is known.
    #[arg(long, value_enum, value_name = "KIND")]
    pub scheme: Option<SchemeArg>,
    /// The audit as one JSON object: printed instead of text, or written
    /// to FILE with `--json=FILE`.
    #[arg(long, value_name = "FILE", num_args = 0..=1, require_equals = true)]
    pub json: Option<Option<PathBuf>>,
    /// The findings as a SARIF 2.1.0 log (for code review and CI): printed,
    /// or written to FILE with `--sarif=FILE`.
    #[arg(long, value_name = "FILE", num_args = 0..=1, require_equals = true)]
    pub sarif: Option<Option<PathBuf>>,
    /// The findings as JUnit XML (for CI test reports): printed, or
    /// written to FILE with `--junit=FILE`.
    #[arg(long, value_name = "FILE", num_args = 0..=1, require_equals = true)]
    pub junit: Option<Option<PathBuf>>,
}

fn usage(message: String) -> Error {
    Error::Usage {
        what: "check".into(),
        message,
    }
}

/// Run `check`.
pub fn run(args: CheckArgs) -> Result<Outcome, Error> {
    let exports = Exports::new(args.json, args.sarif, args.junit)?;
    let mut inputs = vec![args.input.clone()];
    let mut opt = Options::new();
    opt.views = vision::parse_views(&args.views)?;
    if !(args.viewing_distance.is_finite()
        && args.viewing_distance >= 5.0
        && args.viewing_distance <= 1000.0)
    {
        return Err(usage(format!(
            "--viewing-distance {}: expected centimetres between 5 and 1000",
            args.viewing_distance
        )));
    }
    opt.viewing_distance_cm = args.viewing_distance;
    opt.fail_on = match args.fail_on {
        FailOn::Error => Severity::Error,
        FailOn::Warning => Severity::Warning,
    };
    if let Some(d) = args.dpi {
        if !(d.is_finite() && (10.0..=1200.0).contains(&d)) {
            return Err(usage(format!(
                "--dpi {d}: expected a resolution between 10 and 1200"
            )));
        }
    }
    let ext = args
        .input
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase);
    let (svg, scheme, dpi) = match ext.as_deref() {
        Some("toml") => {
            let fig = crate::figure::load(&args.input)?;
            let scheme = fig.colors.scheme;
            let r = crate::render::render(fig)?;
            inputs.extend(r.figure.inputs.iter().cloned());
            let classes = &r.encoding.classes;
            opt.muted = classes
                .iter()
                .filter(|c| c.faded)
                .map(|c| c.id.clone())
                .collect();
            if let Some(mid) = r.figure.variable.midpoint {
                let bounds: Vec<_> = classes.iter().map(|c| (c.lower, c.upper)).collect();
                opt.split = Some(audit::judge::split_at_midpoint(&bounds, mid));
            }
            let dpi = r.figure.page.dpi;
            (r.svg, Some(scheme), dpi)
        }
        Some("svg") => {
            let text = std::fs::read_to_string(&args.input).map_err(|source| Error::Read {
                path: args.input.clone(),
                source,
            })?;
            (text, None, 150.0)
        }
        _ => {
            return Err(usage(format!(
                "{}: expected a figure spec (.toml) or an SVG file (.svg)",
                args.input.display()
            )));
        }
    };
    opt.dpi = args.dpi.unwrap_or(dpi);
    opt.scheme = args
        .scheme
        .map(|s| match s {
            SchemeArg::Sequential => SchemeKind::Sequential,
            SchemeArg::Diverging => SchemeKind::Diverging,
            SchemeArg::Qualitative => SchemeKind::Qualitative,
        })
        .or(scheme);
    let report = audit::audit_svg(&args.input, &svg, &opt)?;
    let stdout = match exports.write(&inputs, &report, opt.fail_on)? {
        Some(export) => export,
        None => audit::text::render(&report),
    };
    let mut out = Outcome::success(stdout);
    if !report.passed {
        out.kind = ExitKind::Findings;
    }
    if opt.scheme.is_none() {
        out.warnings.push(
            "the SVG does not say its kind of scheme: order, glare and midpoint were not judged (give --scheme)"
                .into(),
        );
    }
    Ok(out)
}
