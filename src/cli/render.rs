//! `hueproof render SPEC`: a figure spec rendered to SVG, PNG and PDF.

use std::path::PathBuf;

use clap::Args;

use crate::audit;
use crate::error::{Error, ExitKind};
use crate::figure::{self, Format};
use crate::render;

use super::Outcome;

/// Arguments of `render`.
#[derive(Debug, Args)]
pub struct RenderArgs {
    /// The figure spec (TOML).
    #[arg(value_name = "SPEC")]
    pub spec: PathBuf,
    /// Output path; its extension is replaced per format (default: the
    /// spec's path). With a .svg, .png or .pdf extension and no --format,
    /// only that format is written.
    #[arg(short, long, value_name = "OUT")]
    pub output: Option<PathBuf>,
    /// Comma-separated formats: svg, png, pdf (default: the spec's
    /// figure.formats, else svg).
    #[arg(long, value_name = "LIST")]
    pub format: Option<String>,
    /// Do not audit the figure after writing it.
    #[arg(long, conflicts_with = "repair")]
    pub no_audit: bool,
    /// When the audit fails on the colours, draw the figure with the
    /// proposed palette instead (the spec is not changed).
    #[arg(long)]
    pub repair: bool,
    /// Views, distance, resolution, fail level and thresholds of the audit.
    #[command(flatten)]
    pub audit: super::check::AuditFlags,
}

/// Parse a format list.
pub fn parse_formats(list: &str) -> Result<Vec<Format>, Error> {
    let mut out = Vec::new();
    for item in list.split(',') {
        let f = Format::parse(item).ok_or_else(|| Error::Usage {
            what: "--format".into(),
            message: format!("'{}' is not one of svg, png, pdf", item.trim()),
        })?;
        if !out.contains(&f) {
            out.push(f);
        }
    }
    Ok(out)
}

/// Run `render`.
pub fn run(args: RenderArgs) -> Result<Outcome, Error> {
    let fig = figure::load(&args.spec)?;
    let ext_format = args
        .output
        .as_ref()
        .and_then(|o| o.extension())
        .and_then(|e| Format::parse(&e.to_string_lossy()));
    let formats = match (&args.format, ext_format) {
        (Some(list), _) => parse_formats(list)?,
        (None, Some(f)) => vec![f],
        (None, None) => fig.formats.clone(),
    };
    let base = args.output.clone().unwrap_or_else(|| args.spec.clone());
    let mut rendered = render::render(fig)?;
    let mut stdout = String::new();
    let mut report = None;
    if !args.no_audit {
        let mut opt = audit::settings::for_figure(&rendered);
        args.audit.apply(&mut opt)?;
        let mut first = audit::audit_svg(&args.spec, &rendered.svg, &opt)?;
        if args.repair && !first.passed {
            match audit::propose::propose(&rendered, &first, &opt)? {
                Some(p) => {
                    stdout.push_str(&format!(
                        "the audit failed; drawing with the {} palette (the spec is not changed):\n",
                        if p.method == "repair" { "repaired" } else { "regenerated" }
                    ));
                    for c in &p.changes {
                        stdout.push_str(&format!(
                            "  {} {} -> {} (CIEDE2000 {:.1})\n",
                            c.class, c.from, c.to, c.delta_e2000
                        ));
                    }
                    let mut fig = rendered.figure.clone();
                    fig.colors.list = Some(
                        p.colors
                            .iter()
                            .map(|h| crate::color::parse_color(h).map(|c| c.rgba.rgb))
                            .collect::<Result<_, _>>()
                            .map_err(|e| Error::Internal(format!("a proposed colour: {e}")))?,
                    );
                    rendered = render::render(fig)?;
                    first = audit::audit_svg(&args.spec, &rendered.svg, &opt)?;
                }
                None => stdout.push_str(
                    "the audit failed and no palette repair applies; drawing the spec's colours\n",
                ),
            }
        }
        report = Some(first);
    }
    // Everything is drawn and audited before anything is written.
    let written = render::write_files(&rendered, &base, &formats)?;
    for p in &written {
        stdout.push_str(&format!("wrote {}\n", p.display()));
    }
    let mut kind = ExitKind::Success;
    if let Some(report) = report {
        // The files stay written either way; a failing audit makes the
        // exit code 1, as `check` does, so a build can stop on it.
        stdout.push_str(&audit::text::summary(&report));
        if !report.findings.is_empty() {
            stdout.push_str(&format!(
                "the full report: hueproof check {}\n",
                args.spec.display()
            ));
        }
        if !report.passed {
            kind = ExitKind::Findings;
        }
    }
    Ok(Outcome {
        stdout,
        warnings: rendered.warnings.clone(),
        kind,
    })
}
