//! `hueproof sheet SPEC|FIGURE.svg...`: the simulation contact sheet of
//! each figure (PNG or SVG), and an index sheet when there are several.

use std::path::{Path, PathBuf};

use clap::{Args, ValueEnum};

use crate::audit;
use crate::error::{Error, ExitKind};
use crate::output::{check_not_an_input, write_atomic};
use crate::sheet::{self, index};

use super::Outcome;
use super::check::{AuditFlags, Prepared, SvgFlags, prepare};

/// Sheet file formats.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Format {
    /// PNG, the audit DPI stored.
    Png,
    /// SVG, the panels embedded as PNG data.
    Svg,
    /// PDF, the panels drawn as vector pixel runs.
    Pdf,
}

impl Format {
    fn ext(self) -> &'static str {
        match self {
            Format::Png => "png",
            Format::Svg => "svg",
            Format::Pdf => "pdf",
        }
    }
}

/// Arguments of `sheet`.
#[derive(Debug, Args)]
pub struct SheetArgs {
    /// Figure specs (.toml, rendered first) or SVG files.
    #[arg(value_name = "SPEC|FIGURE.svg", required = true)]
    pub inputs: Vec<PathBuf>,
    /// The sheet file (.png, .svg or .pdf) for one figure (default:
    /// STEM.sheet.png beside the input); for several, a folder that gets
    /// STEM.sheet.EXT per figure and index.EXT.
    #[arg(short = 'o', long = "out", value_name = "PATH")]
    pub out: Option<PathBuf>,
    /// The format when writing into a folder, or when -o is not given.
    #[arg(long, value_enum, value_name = "FORMAT")]
    pub format: Option<Format>,
    /// Views, distance, resolution, fail level and thresholds, as for
    /// `check`.
    #[command(flatten)]
    pub audit: AuditFlags,
    /// How to read SVG made by other tools, as for `check`.
    #[command(flatten)]
    pub svg: SvgFlags,
}

fn usage(message: String) -> Error {
    Error::Usage {
        what: "sheet".into(),
        message,
    }
}

fn stem(p: &Path) -> String {
    p.file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_else(|| "figure".into())
}

fn format_of(path: &Path) -> Result<Format, Error> {
    match path
        .extension()
        .and_then(|e| e.to_str())
        .map(str::to_ascii_lowercase)
        .as_deref()
    {
        Some("png") => Ok(Format::Png),
        Some("svg") => Ok(Format::Svg),
        Some("pdf") => Ok(Format::Pdf),
        _ => Err(usage(format!(
            "-o {}: expected a file ending in .png, .svg or .pdf",
            path.display()
        ))),
    }
}

/// The largest sheet drawn, in pixels (width times height).
const MAX_SHEET_PIXELS: u64 = 60_000_000;

fn encode(c: &sheet::canvas::Canvas, f: Format) -> Result<Vec<u8>, Error> {
    let pixels = c.width as u64 * c.height as u64;
    if pixels > MAX_SHEET_PIXELS {
        return Err(usage(format!(
            "the sheet would be {} x {} pixels at {} dpi (at most {MAX_SHEET_PIXELS} in all); give a lower --dpi",
            c.width, c.height, c.dpi
        )));
    }
    Ok(match f {
        Format::Png => c.png()?,
        Format::Svg => c.svg()?.into_bytes(),
        Format::Pdf => c.pdf()?,
    })
}

/// Run `sheet`.
pub fn run(args: SheetArgs) -> Result<Outcome, Error> {
    // Read and audit everything first: a bad input writes nothing.
    let mut figures = Vec::new();
    let mut all_inputs: Vec<PathBuf> = Vec::new();
    for input in &args.inputs {
        let Prepared {
            svg, opt, inputs, ..
        } = prepare(input, &args.audit, &args.svg, "sheet")?;
        let ex = audit::examine(input, &svg, &opt)?;
        all_inputs.extend(inputs);
        figures.push((input.clone(), ex, opt));
    }
    let several = figures.len() > 1;
    let folder = several || args.out.as_ref().is_some_and(|o| o.is_dir());
    let mut plan: Vec<(PathBuf, Format)> = Vec::new();
    if folder {
        let Some(dir) = &args.out else {
            return Err(usage(
                "several figures: give -o FOLDER for their sheets and the index".into(),
            ));
        };
        if dir.exists() && !dir.is_dir() {
            return Err(usage(format!(
                "-o {}: several figures need a folder, and this is a file",
                dir.display()
            )));
        }
        let f = args.format.unwrap_or(Format::Png);
        for (input, _, _) in &figures {
            let p = dir.join(format!("{}.sheet.{}", stem(input), f.ext()));
            if plan.iter().any(|(q, _)| q == &p) {
                return Err(usage(format!(
                    "two figures would both write {}; rename one of them",
                    p.display()
                )));
            }
            plan.push((p, f));
        }
    } else {
        let input = &figures[0].0;
        let (p, f) = match &args.out {
            Some(o) => (o.clone(), format_of(o)?),
            None => {
                let f = args.format.unwrap_or(Format::Png);
                let name = format!("{}.sheet.{}", stem(input), f.ext());
                (input.with_file_name(name), f)
            }
        };
        plan.push((p, f));
    }
    let index_path = folder.then(|| {
        let f = args.format.unwrap_or(Format::Png);
        (
            args.out
                .as_ref()
                .expect("a folder was given")
                .join(format!("index.{}", f.ext())),
            f,
        )
    });
    for (p, _) in plan.iter().chain(index_path.iter()) {
        check_not_an_input(p, &all_inputs)?;
    }
    if let Some(dir) = args.out.as_ref().filter(|_| folder) {
        std::fs::create_dir_all(dir).map_err(|source| Error::Write {
            path: dir.clone(),
            source,
        })?;
    }
    let mut stdout = String::new();
    let mut failed = false;
    for ((input, ex, opt), (path, f)) in figures.iter().zip(&plan) {
        let title = input.display().to_string();
        let s = sheet::build(&title, ex, opt);
        write_atomic(path, &encode(&s.canvas, *f)?)?;
        failed |= !ex.report.passed;
        stdout.push_str(&format!(
            "{}: {} -> {}\n",
            input.display(),
            sheet::figure::verdict(ex),
            path.display()
        ));
    }
    if let Some((path, f)) = &index_path {
        let entries: Vec<index::Entry> = figures
            .iter()
            .zip(&plan)
            .map(|((input, ex, _), (p, _))| index::Entry {
                name: input.display().to_string(),
                sheet: p
                    .file_name()
                    .map(|n| n.to_string_lossy().into_owned())
                    .unwrap_or_default(),
                examined: ex,
            })
            .collect();
        let dpi = figures.iter().map(|(_, _, o)| o.dpi).fold(0.0, f64::max);
        write_atomic(path, &encode(&index::build(&entries, dpi), *f)?)?;
        stdout.push_str(&format!("index -> {}\n", path.display()));
    }
    let mut out = Outcome::success(stdout);
    if failed {
        out.kind = ExitKind::Findings;
    }
    for (input, ex, opt) in &figures {
        for r in &ex.report.refused_references {
            out.warnings.push(format!(
                "{}: the reference '{r}' points outside the document and was not read; what it would draw was not audited",
                input.display()
            ));
        }
        if opt.scheme.is_none() {
            out.warnings.push(format!(
                "{}: the SVG does not say its kind of scheme: order, glare and midpoint were not judged (give --scheme)",
                input.display()
            ));
        }
    }
    Ok(out)
}
