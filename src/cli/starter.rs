//! `hueproof new KIND` and `hueproof demo`.

use std::path::PathBuf;

use clap::Args;

use crate::error::{Error, ExitKind};
use crate::starter;

use super::Outcome;

/// Arguments of `new`.
#[derive(Debug, Args)]
pub struct NewArgs {
    /// The template: choropleth, diverging-map, categories-map, dot-plot,
    /// ranked-dots, dot-map, map-panels, dot-panels (`list` shows them).
    #[arg(value_name = "KIND")]
    pub kind: String,
    /// Where to write the spec (default: KIND.toml); the demo data goes
    /// into `data/` beside it.
    #[arg(short, long, value_name = "FILE")]
    pub output: Option<PathBuf>,
}

/// Arguments of `demo`.
#[derive(Debug, Args)]
pub struct DemoArgs {
    /// Folder to write into (default: sample-output/ inside the hueproof
    /// repository, else hueproof-demo/).
    #[arg(long, value_name = "DIR")]
    pub out: Option<PathBuf>,
    /// Also write a PDF of every figure.
    #[arg(long)]
    pub pdf: bool,
}

fn report(w: starter::Written) -> Outcome {
    let mut stdout = String::new();
    for f in &w.files {
        stdout.push_str(&format!("wrote {}\n", f.display()));
    }
    Outcome {
        stdout,
        warnings: w.warnings,
        kind: ExitKind::Success,
    }
}

/// Run `new`.
pub fn run_new(args: NewArgs) -> Result<Outcome, Error> {
    if args.kind == "list" {
        let mut s = String::new();
        for t in starter::TEMPLATES {
            s.push_str(&format!("{:<16} {}\n", t.name, t.about));
        }
        return Ok(Outcome::success(s));
    }
    let out = args
        .output
        .unwrap_or_else(|| PathBuf::from(format!("{}.toml", args.kind)));
    Ok(report(starter::new_spec(&args.kind, &out)?))
}

/// Run `demo`.
pub fn run_demo(args: DemoArgs) -> Result<Outcome, Error> {
    let dir = match args.out {
        Some(d) => d,
        None => {
            let cwd = std::env::current_dir().map_err(|e| Error::Usage {
                what: "demo".into(),
                message: format!("cannot find the current folder: {e}"),
            })?;
            starter::default_demo_dir(&cwd)
        }
    };
    Ok(report(starter::demo(&dir, args.pdf)?))
}
