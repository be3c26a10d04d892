//! `hueproof join SHAPES DATA`: the join report of shapes and data rows.

use std::path::PathBuf;

use clap::Args;

use crate::error::{Error, ExitKind};
use crate::geo::{KeySource, ReadOptions, read_shapes_file};
use crate::join::{join, report};
use crate::table::{TableOptions, read_table_file};

use super::Outcome;

/// Arguments of `join`.
#[derive(Debug, Args)]
pub struct JoinArgs {
    /// Boundary or point file (GeoJSON).
    #[arg(value_name = "SHAPES")]
    pub shapes: PathBuf,
    /// Data table (CSV with a header row).
    #[arg(value_name = "DATA")]
    pub data: PathBuf,
    /// Feature property holding the key (`id` falls back to the feature id).
    #[arg(long, value_name = "K")]
    pub shape_key: String,
    /// Column of the data table holding the key.
    #[arg(long, value_name = "K")]
    pub data_key: String,
    /// Match keys after trimming, case folding and dropping leading zeros
    /// of numeric keys.
    #[arg(long)]
    pub normalize_keys: bool,
    /// Comma-separated value columns (default: every other column whose
    /// cells all look numeric).
    #[arg(long, value_name = "LIST")]
    pub values: Option<String>,
    /// Comma-separated missing-value markers (default: empty, NA, N/A,
    /// null, -).
    #[arg(long, value_name = "LIST")]
    pub missing: Option<String>,
    /// TopoJSON object to read (default: the first object).
    #[arg(long, value_name = "NAME")]
    pub object: Option<String>,
    /// Print one JSON object instead of text.
    #[arg(long)]
    pub json: bool,
}

/// Run `join`.
pub fn run(args: JoinArgs) -> Result<Outcome, Error> {
    let layer = read_shapes_file(
        &args.shapes,
        &ReadOptions {
            key: Some(KeySource::Property(args.shape_key.clone())),
            // Geometry problems do not change keys; `shapes` reports them.
            repair: true,
            ..ReadOptions::default()
        },
        args.object.as_deref(),
    )?;
    let mut topts = TableOptions::new(&args.data_key);
    if let Some(v) = &args.values {
        topts.value_columns = Some(split_list(v));
    }
    if let Some(m) = &args.missing {
        topts.missing_markers = m.split(',').map(|s| s.trim().to_string()).collect();
    }
    let table = read_table_file(&args.data, &topts)?;
    let rep = join(&layer, &table, args.normalize_keys);
    let stdout = if args.json {
        let mut s = serde_json::to_string_pretty(&rep)
            .map_err(|e| Error::Internal(format!("serialising the join report: {e}")))?;
        s.push('\n');
        s
    } else {
        report::render_text(&rep)
    };
    let mut warnings = Vec::new();
    let geometry_problems = layer
        .problems()
        .iter()
        .filter(|p| p.kind != crate::geo::ProblemKind::MissingKey)
        .count();
    if geometry_problems > 0 {
        warnings.push(format!(
            "'{}' has {geometry_problems} geometry problem(s); run `hueproof shapes` to see them",
            args.shapes.display()
        ));
    }
    Ok(Outcome {
        stdout,
        warnings,
        kind: if rep.is_complete() {
            ExitKind::Success
        } else {
            ExitKind::Findings
        },
    })
}

fn split_list(s: &str) -> Vec<String> {
    s.split(',')
        .map(|p| p.trim().to_string())
        .filter(|p| !p.is_empty())
        .collect()
}
