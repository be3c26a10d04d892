//! The command line: argument definitions and dispatch to the library.
//!
//! Each subcommand owns one file here that defines its arguments (with the
//! help text beside each flag) and turns them into a call to the library.
//! Nothing in this module computes anything itself.

use std::ffi::OsString;
use std::io::Write;
use std::process::ExitCode;

use clap::{Parser, Subcommand};

use crate::error::{Error, ExitKind};

mod breaks;
mod check;
mod inspect;
mod join;
mod palette;
mod render;
mod seeing;
mod shapes;
mod sheet;
mod starter;

/// hueproof: colours that fit the data, proven on the rendered figure.
#[derive(Debug, Parser)]
#[command(name = "hueproof", version, about, long_about = None)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Measure colours: CIELAB, OKLCH, luminance, contrast, and how they look
    /// under simulated colour-vision deficiencies.
    Inspect(inspect::InspectArgs),
    /// Generate, diagnose and repair colour schemes.
    Palette(palette::PaletteArgs),
    /// Class breaks for a classed map from one column of a CSV file, with
    /// counts and goodness of variance fit.
    Breaks(breaks::BreaksArgs),
    /// Join shapes to data rows by key and report every mismatch.
    Join(join::JoinArgs),
    /// Report the projection, area, label point, parts and vertices of each
    /// shape, and every geometry problem.
    Shapes(shapes::ShapesArgs),
    /// Render a figure spec (TOML) to SVG, PNG and PDF.
    Render(render::RenderArgs),
    /// Write a starter spec (and the demo data it uses); `new list` lists
    /// the templates.
    New(starter::NewArgs),
    /// Render every template against the built-in demo data.
    Demo(starter::DemoArgs),
    /// Audit a figure on its rendered pixels under every view: classes
    /// that blend, fade, glare or break their order.
    Check(check::CheckArgs),
    /// The simulation contact sheet: the figure under every view, with
    /// the audit's findings marked.
    Sheet(sheet::SheetArgs),
}

/// What a command produced: text for standard output and the outcome class.
#[derive(Debug)]
pub struct Outcome {
    /// Text to print on standard output.
    pub stdout: String,
    /// Warnings to print on standard error.
    pub warnings: Vec<String>,
    /// Success, or findings the user asked to be told about.
    pub kind: ExitKind,
}

impl Outcome {
    /// A successful outcome that prints `stdout`.
    pub fn success(stdout: String) -> Self {
        Outcome {
            stdout,
            warnings: Vec::new(),
            kind: ExitKind::Success,
        }
    }
}

/// Run a parsed command line and return what it produced.
pub fn run(cli: Cli) -> Result<Outcome, Error> {
    match cli.command {
        Command::Inspect(args) => inspect::run(args),
        Command::Palette(args) => palette::run(args),
        Command::Breaks(args) => breaks::run(args),
        Command::Join(args) => join::run(args),
        Command::Shapes(args) => shapes::run(args),
        Command::Render(args) => render::run(args),
        Command::New(args) => starter::run_new(args),
        Command::Demo(args) => starter::run_demo(args),
        Command::Check(args) => check::run(args),
        Command::Sheet(args) => sheet::run(args),
    }
}

/// Parse `args` (program name first), run, print, and map to an exit code.
pub fn main_with_args<I, T>(args: I) -> ExitCode
where
    I: IntoIterator<Item = T>,
    T: Into<OsString> + Clone,
{
    let cli = match Cli::try_parse_from(args) {
        Ok(cli) => cli,
        Err(e) => {
            // clap prints help and version on stdout, usage errors on stderr.
            let _ = e.print();
            return ExitCode::from(if e.use_stderr() {
                ExitKind::BadInput.code()
            } else {
                ExitKind::Success.code()
            });
        }
    };
    match run(cli) {
        Ok(outcome) => {
            for w in &outcome.warnings {
                eprintln!("hueproof: warning: {w}");
            }
            let mut out = std::io::stdout().lock();
            if let Err(e) = out.write_all(outcome.stdout.as_bytes()) {
                // A closed pipe (e.g. `| head`) is not an error of ours.
                if e.kind() != std::io::ErrorKind::BrokenPipe {
                    eprintln!("hueproof: cannot write to standard output: {e}");
                    return ExitCode::from(ExitKind::OutputFailed.code());
                }
            }
            let _ = out.flush();
            ExitCode::from(outcome.kind.code())
        }
        Err(e) => {
            eprintln!("hueproof: error: {e}");
            ExitCode::from(e.exit_kind().code())
        }
    }
}
