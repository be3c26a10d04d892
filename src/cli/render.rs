//! `hueproof render SPEC...`: figure specs rendered to SVG, PNG and PDF,
//! one at a time or many at once (see [`crate::batch`]).

use std::path::{Path, PathBuf};

use clap::Args;

use crate::audit;
use crate::batch;
use crate::error::{Error, ExitKind};
use crate::figure::{self, Format};
use crate::render;

use super::Outcome;

/// Arguments of `render`.
#[derive(Debug, Args)]
pub struct RenderArgs {
    /// The figure specs (TOML): paths or glob patterns (quoted, e.g.
    /// 'maps/*.toml'), expanded by hueproof, sorted.
    #[arg(value_name = "SPEC", required = true, num_args = 1..)]
    pub specs: Vec<String>,
    /// Output path; its extension is replaced per format (default: the
    /// spec's path). With a .svg, .png or .pdf extension and no --format,
    /// only that format is written. With several specs: a folder (made if
    /// missing) that gets one set of files per spec, named after it.
    #[arg(short, long, value_name = "OUT")]
    pub output: Option<PathBuf>,
    /// With several specs: how many figures to work on at once (default:
    /// the number of cores).
    #[arg(long, value_name = "N")]
    pub jobs: Option<usize>,
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

/// Run `render`: one spec as before, several as a batch.
pub fn run(args: RenderArgs) -> Result<Outcome, Error> {
    let jobs = batch::jobs(args.jobs)?;
    let specs = batch::expand(&args.specs)?;
    batch::catch_interrupts();
    if let [spec] = specs.as_slice() {
        return super::check::unless_interrupted(render_one(&args, spec, args.output.as_deref()));
    }
    if let Some(f) = &args.format {
        parse_formats(f)?;
    }
    let base_of = |spec: &Path| match &args.output {
        Some(dir) => dir.join(spec.file_name().unwrap_or(spec.as_os_str())),
        None => spec.to_path_buf(),
    };
    batch::refuse_shared_outputs(&specs, |s| base_of(s).with_extension(""))?;
    if let Some(dir) = &args.output {
        if dir.is_file() {
            return Err(Error::Usage {
                what: "-o".into(),
                message: format!(
                    "'{}' is a file; with several specs -o names a folder",
                    dir.display()
                ),
            });
        }
        std::fs::create_dir_all(dir).map_err(|source| Error::Write {
            path: dir.clone(),
            source,
        })?;
    }
    let done = batch::run(
        &specs,
        jobs,
        batch::Progress::for_stderr(),
        |spec| render_one(&args, spec, Some(&base_of(spec))),
        |r| match r {
            Ok(o) if o.kind == ExitKind::Success => "written".into(),
            Ok(_) => "written; the audit FAILED".into(),
            Err(e) => format!("not rendered: {e}"),
        },
    )?;
    let c = batch::combine(done, |o: Outcome| (o.stdout, o.warnings, o.kind));
    let mut stdout = c.text;
    stdout.push_str(&c.summary.line("written"));
    Ok(Outcome {
        stdout,
        warnings: c.warnings,
        kind: c.summary.exit_kind(),
    })
}

/// Render one spec to `output` (None: beside the spec).
fn render_one(args: &RenderArgs, spec: &Path, output: Option<&Path>) -> Result<Outcome, Error> {
    let fig = figure::load(spec)?;
    let ext_format = output
        .and_then(|o| o.extension())
        .and_then(|e| Format::parse(&e.to_string_lossy()));
    let formats = match (&args.format, ext_format) {
        (Some(list), _) => parse_formats(list)?,
        (None, Some(f)) => vec![f],
        (None, None) => fig.formats.clone(),
    };
    let base = output.unwrap_or(spec).to_path_buf();
    let mut rendered = render::render(fig)?;
    let mut stdout = String::new();
    let mut report = None;
    if !args.no_audit {
        let mut opt = audit::settings::for_figure(&rendered);
        args.audit.apply(&mut opt)?;
        let mut first = audit::audit_svg(spec, &rendered.svg, &opt)?;
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
                    first = audit::audit_svg(spec, &rendered.svg, &opt)?;
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
                spec.display()
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
