//! `hueproof check SPEC|FIGURE.svg...`: the measured audit of a figure,
//! or of many at once (see [`crate::batch`]), as text, JSON, SARIF,
//! JUnit XML or (one figure) an HTML page, with one exit code a build can
//! act on.

use std::path::{Path, PathBuf};

use clap::{Args, ValueEnum};

use crate::audit::{self, Options, Report};
use crate::batch;
use crate::color::Srgb;
use crate::error::{Error, ExitKind};
use crate::figure::audit::VIEWING_DISTANCE_RANGE;
use crate::findings::Severity;
use crate::report::export::{BatchItem, Exports};
use crate::report::html::HtmlInput;
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

/// The audit flags shared by `check` and `render`: each overrides the
/// spec's `[audit]` table.
#[derive(Debug, Args)]
pub struct AuditFlags {
    /// Comma-separated views: normal, protanopia, deuteranopia, tritanopia,
    /// achromatopsia, grayscale (print), protanomaly=S, deuteranomaly=S, tritanomaly=S
    /// (default: the spec's audit.views, else the first five).
    #[arg(long, value_name = "LIST")]
    pub views: Option<String>,
    /// Viewing distance in centimetres, which sets the marks' visual angle
    /// (default: the spec's audit.viewing_distance, else 40).
    #[arg(long, value_name = "CM")]
    pub viewing_distance: Option<f64>,
    /// Audit resolution (default: the spec's audit.dpi, else its figure
    /// DPI; 150 for an SVG).
    #[arg(long, value_name = "N")]
    pub dpi: Option<f64>,
    /// The severity that makes the check fail with exit code 1 (default:
    /// the spec's audit.fail_on, else error).
    #[arg(long, value_enum, value_name = "LEVEL")]
    pub fail_on: Option<FailOn>,
    /// Set a threshold, NAME=VALUE (repeatable, or comma-separated);
    /// names as in the spec's [audit.thresholds] table.
    #[arg(long = "threshold", value_name = "NAME=VALUE", value_delimiter = ',')]
    pub thresholds: Vec<String>,
}

impl AuditFlags {
    /// Apply the flags over `opt`.
    pub fn apply(&self, opt: &mut Options) -> Result<(), Error> {
        if let Some(v) = &self.views {
            opt.views = vision::parse_views(v).map_err(|e| usage(format!("--views: {e}")))?;
        }
        if let Some(d) = self.viewing_distance {
            let (lo, hi) = VIEWING_DISTANCE_RANGE;
            if !(d.is_finite() && (lo..=hi).contains(&d)) {
                return Err(usage(format!(
                    "--viewing-distance {d}: expected centimetres between {lo} and {hi}"
                )));
            }
            opt.viewing_distance_cm = d;
        }
        if let Some(d) = self.dpi {
            if !(d.is_finite() && (10.0..=1200.0).contains(&d)) {
                return Err(usage(format!(
                    "--dpi {d}: expected a resolution between 10 and 1200"
                )));
            }
            opt.dpi = d;
        }
        if let Some(f) = self.fail_on {
            opt.fail_on = match f {
                FailOn::Error => Severity::Error,
                FailOn::Warning => Severity::Warning,
            };
        }
        for t in &self.thresholds {
            let Some((name, value)) = t.split_once('=') else {
                return Err(usage(format!(
                    "--threshold '{t}': expected NAME=VALUE, e.g. text_contrast=7"
                )));
            };
            let v: f64 = value
                .trim()
                .parse()
                .map_err(|_| usage(format!("--threshold '{t}': '{value}' is not a number")))?;
            opt.thresholds
                .set(name.trim(), v)
                .map_err(|m| usage(format!("--threshold: {m}")))?;
        }
        Ok(())
    }
}

/// The flags for SVG figures, shared by `check` and `sheet`.
#[derive(Debug, Args)]
pub struct SvgFlags {
    /// The figure's kind of scheme, for an SVG (a spec says it itself);
    /// order, glare and midpoint are judged only when it is known.
    #[arg(long, value_enum, value_name = "KIND")]
    pub scheme: Option<SchemeArg>,
    /// SVG from other tools: the smallest total area of one fill that
    /// counts as a class, in square millimetres.
    #[arg(long, default_value_t = 2.0, value_name = "MM2")]
    pub min_class_area: f64,
}

/// A figure read for the audit: its SVG, the audit options (the spec's
/// settings, then the flags), the rendered spec when it was one, and
/// every file read (never to be overwritten).
pub struct Prepared {
    /// The figure's SVG text.
    pub svg: String,
    /// The audit options.
    pub opt: Options,
    /// The rendered spec, for a spec.
    pub rendered: Option<crate::render::Rendered>,
    /// The input and, for a spec, the files it reads.
    pub inputs: Vec<PathBuf>,
}

/// Read `input` (a spec, rendered first, or an SVG) and settle the audit
/// options with `audit` and `svg` over the spec's settings.
pub fn prepare(
    input: &std::path::Path,
    audit: &AuditFlags,
    svg: &SvgFlags,
    what: &str,
) -> Result<Prepared, Error> {
    let usage = |message: String| Error::Usage {
        what: what.into(),
        message,
    };
    let mut inputs = vec![input.to_path_buf()];
    let ext = input
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase);
    let (text, mut opt, rendered) = match ext.as_deref() {
        Some("toml") => {
            let r = crate::render::render(crate::figure::load(input)?)?;
            inputs.extend(r.figure.inputs.iter().cloned());
            let opt = audit::settings::for_figure(&r);
            (r.svg.clone(), opt, Some(r))
        }
        Some("svg") => {
            let text = std::fs::read_to_string(input).map_err(|source| Error::Read {
                path: input.to_path_buf(),
                source,
            })?;
            (text, Options::new(), None)
        }
        _ => {
            return Err(usage(format!(
                "{}: expected a figure spec (.toml) or an SVG file (.svg)",
                input.display()
            )));
        }
    };
    audit.apply(&mut opt)?;
    if !(svg.min_class_area.is_finite() && svg.min_class_area >= 0.0) {
        return Err(usage(format!(
            "--min-class-area {}: expected square millimetres, 0 or more",
            svg.min_class_area
        )));
    }
    opt.min_class_area_mm2 = svg.min_class_area;
    if let Some(s) = svg.scheme {
        opt.scheme = Some(match s {
            SchemeArg::Sequential => SchemeKind::Sequential,
            SchemeArg::Diverging => SchemeKind::Diverging,
            SchemeArg::Qualitative => SchemeKind::Qualitative,
        });
    }
    Ok(Prepared {
        svg: text,
        opt,
        rendered,
        inputs,
    })
}

/// Arguments of `check`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// Figure specs (.toml, rendered first) or SVG files (hueproof's own,
    /// or made by any other tool): paths or glob patterns (quoted, e.g.
    /// 'figures/*.svg'), expanded by hueproof, sorted.
    #[arg(value_name = "SPEC|FIGURE.svg", required = true, num_args = 1..)]
    pub inputs: Vec<String>,
    /// With several inputs: how many figures to audit at once (default:
    /// the number of cores).
    #[arg(long, value_name = "N")]
    pub jobs: Option<usize>,
    /// Views, distance, resolution, fail level and thresholds.
    #[command(flatten)]
    pub audit: AuditFlags,
    /// How to read SVG made by other tools.
    #[command(flatten)]
    pub svg: SvgFlags,
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
    /// The audit as one self-contained HTML page (figure, findings,
    /// colours per view, difference matrices; no scripts, no outside
    /// requests): printed, or written to FILE with `--html=FILE`.
    #[arg(long, value_name = "FILE", num_args = 0..=1, require_equals = true)]
    pub html: Option<Option<PathBuf>>,
}

fn usage(message: String) -> Error {
    Error::Usage {
        what: "check".into(),
        message,
    }
}

/// One audited input.
struct Checked {
    report: Report,
    /// The input, then every file it read.
    inputs: Vec<PathBuf>,
    fail_on: Severity,
    /// The proposed palette, described (specs only).
    extra: String,
    warnings: Vec<String>,
    /// The HTML page, when asked for (one input only).
    page: Option<String>,
}

impl Checked {
    fn kind(&self) -> ExitKind {
        if self.report.passed {
            ExitKind::Success
        } else {
            ExitKind::Findings
        }
    }
}

/// Run `check`: one input as before, several as a batch.
pub fn run(args: CheckArgs) -> Result<Outcome, Error> {
    let exports = Exports::new(
        args.json.clone(),
        args.sarif.clone(),
        args.junit.clone(),
        args.html.clone(),
    )?;
    let jobs = batch::jobs(args.jobs)?;
    let inputs = batch::expand(&args.inputs)?;
    if inputs.len() > 1 && args.html.is_some() {
        return Err(usage(format!(
            "--html makes the page of one figure, and {} inputs were given: check them one at a time for their pages, or draw them all with `hueproof sheet`",
            inputs.len()
        )));
    }
    batch::catch_interrupts();
    if let [input] = inputs.as_slice() {
        return unless_interrupted(check_one(&args, input).and_then(|c| {
            let stdout = match exports.write(&c.inputs, &c.report, c.fail_on, c.page.as_deref())? {
                Some(export) => export,
                None => audit::text::render_with(&c.report, &c.extra),
            };
            let mut out = Outcome::success(stdout);
            out.kind = c.kind();
            out.warnings = c.warnings;
            Ok(out)
        }));
    }
    let done = batch::run(
        &inputs,
        jobs,
        batch::Progress::for_stderr(),
        |input| check_one(&args, input),
        |r| match r {
            Ok(c) if c.report.passed => "passed".into(),
            Ok(_) => "FAILED".into(),
            Err(e) => format!("not audited: {e}"),
        },
    )?;
    let items: Vec<BatchItem> = done
        .iter()
        .map(|f| BatchItem {
            input: &f.input,
            result: f.result.as_ref().map(|r| {
                r.as_ref()
                    .map(|c| (c.inputs.as_slice(), &c.report, c.fail_on))
            }),
        })
        .collect();
    let export = exports.write_many(&items)?;
    let c = batch::combine(done, |c| {
        let kind = c.kind();
        (
            audit::text::render_with(&c.report, &c.extra),
            c.warnings,
            kind,
        )
    });
    let summary = c.summary.line("passed");
    let stdout = match export {
        Some(export) => {
            // The export owns standard output; the counts go beside it.
            eprint!("{summary}");
            export
        }
        None => c.text + &summary,
    };
    Ok(Outcome {
        stdout,
        warnings: c.warnings,
        kind: c.summary.exit_kind(),
    })
}

/// An interrupted single-input run ends with the interrupted class (130),
/// whatever became of its one input.
pub(super) fn unless_interrupted(r: Result<Outcome, Error>) -> Result<Outcome, Error> {
    if !batch::interrupted() {
        return r;
    }
    Ok(Outcome {
        stdout: String::new(),
        warnings: vec!["interrupted: nothing more was written".into()],
        kind: ExitKind::Interrupted,
    })
}

/// Audit one input.
fn check_one(args: &CheckArgs, input: &Path) -> Result<Checked, Error> {
    let Prepared {
        svg,
        opt,
        rendered,
        inputs,
    } = prepare(input, &args.audit, &args.svg, "check")?;
    // The HTML page shows the contact sheet, which needs the audit's
    // rasters: they are kept only when the page is asked for.
    let (mut report, sheet_png) = if args.html.is_some() {
        let examined = audit::examine(input, &svg, &opt)?;
        let title = input.display().to_string();
        let png = crate::sheet::sheet_png(&title, &examined, &opt)?;
        (examined.report, Some(png))
    } else {
        (audit::audit_svg(input, &svg, &opt)?, None)
    };
    let mut extra = String::new();
    if let Some(r) = &rendered {
        report.repair = audit::propose::propose(r, &report, &opt)?;
        extra = audit::propose::describe(r, &report, &opt, report.repair.as_ref());
    }
    // The page is made only when asked: it draws the figure again.
    let page = match args.html {
        Some(_) => {
            let join = match &rendered {
                Some(r) => crate::report::html::join_of(r)?,
                None => None,
            };
            Some(crate::report::html::render(&HtmlInput {
                input,
                report: &report,
                svg: &svg,
                background: rendered
                    .as_ref()
                    .map_or(Srgb::new(1.0, 1.0, 1.0), |r| r.figure.page.background),
                rendered: rendered.as_ref(),
                join: join.as_ref(),
                proposal: &extra,
                sheet_png: sheet_png.as_deref(),
            })?)
        }
        None => None,
    };
    // The figure's own warnings (repaired shapes, merged classes...).
    let mut warnings = rendered.map(|r| r.warnings).unwrap_or_default();
    for r in &report.refused_references {
        warnings.push(format!(
            "{}: the reference '{r}' points outside the document and was not read; what it would draw was not audited",
            input.display()
        ));
    }
    if opt.scheme.is_none() {
        warnings.push(
            "the SVG does not say its kind of scheme: order, glare and midpoint were not judged (give --scheme)"
                .into(),
        );
    }
    Ok(Checked {
        report,
        inputs,
        fail_on: opt.fail_on,
        extra,
        warnings,
        page,
    })
}
