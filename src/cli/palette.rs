//! `hueproof palette make|check|fix`: generate, diagnose and repair colour
//! schemes.

use clap::{Args, Subcommand, ValueEnum};

use crate::color::{Srgb, composite, parse_color};
use crate::error::{Error, ExitKind};
use crate::findings::Severity;
use crate::report::palette_text;
use crate::scheme::report::PaletteReport;
use crate::scheme::{self, Context, SchemeKind, Thresholds};
use crate::vision::{self, CvdModel};

use super::Outcome;
use super::seeing::SeeingArgs;

/// Arguments of `palette`.
#[derive(Debug, Args)]
pub struct PaletteArgs {
    /// What to do with palettes.
    #[command(subcommand)]
    pub action: PaletteAction,
}

/// The palette subcommands.
#[derive(Debug, Subcommand)]
pub enum PaletteAction {
    /// Generate a palette for the data, the background and every reader.
    Make(MakeArgs),
    /// Diagnose a palette: findings in every view.
    Check(CheckArgs),
    /// Repair a palette with the smallest change that passes every check.
    Fix(CheckArgs),
}

/// Scheme names.
#[derive(Debug, Clone, Copy, ValueEnum)]
pub enum SchemeArg {
    /// Ordered lightness (ordinal, interval, ratio data).
    Sequential,
    /// Two arms around a neutral midpoint (data with a meaningful middle).
    Diverging,
    /// Hues of equal lightness (nominal data).
    Qualitative,
}

impl From<SchemeArg> for SchemeKind {
    fn from(s: SchemeArg) -> Self {
        match s {
            SchemeArg::Sequential => SchemeKind::Sequential,
            SchemeArg::Diverging => SchemeKind::Diverging,
            SchemeArg::Qualitative => SchemeKind::Qualitative,
        }
    }
}

/// Output formats.
#[derive(Debug, Clone, Copy, ValueEnum, PartialEq, Eq)]
pub enum Format {
    /// For people.
    Text,
    /// One JSON object (shape in README.md).
    Json,
    /// CSS custom properties.
    Css,
    /// A TOML fragment.
    Toml,
}

/// What every palette command shares.
#[derive(Debug, Args)]
pub struct Common {
    /// The kind of scheme.
    #[arg(long, value_enum)]
    pub scheme: SchemeArg,
    #[command(flatten)]
    pub seeing: SeeingArgs,
    /// Smallest CIEDE2000 difference between classes, and between a class
    /// and the background, in every view.
    #[arg(long, default_value_t = Thresholds::default().min_delta_e, value_name = "X")]
    pub min_delta_e: f64,
    /// The smallest marks the palette will colour, as a length with a unit
    /// (e.g. 4mm): raises the floor to what marks of that size need to be
    /// told apart reliably where they touch (Stone et al. 2014, p = 0.8,
    /// as in the figure audit).
    #[arg(long, value_name = "LENGTH")]
    pub mark_size: Option<String>,
    /// Viewing distance in centimetres for --mark-size.
    #[arg(long, default_value_t = crate::figure::audit::VIEWING_DISTANCE_CM, value_name = "CM")]
    pub viewing_distance: f64,
    /// Output format.
    #[arg(long, value_enum, default_value = "text")]
    pub format: Format,
    /// Shorthand for `--format json`.
    #[arg(long)]
    pub json: bool,
    /// Exit 1 on warnings as well as errors.
    #[arg(long)]
    pub strict: bool,
}

/// Arguments of `palette make`.
#[derive(Debug, Args)]
pub struct MakeArgs {
    #[command(flatten)]
    common: Common,
    /// Number of classes.
    #[arg(long, value_name = "N")]
    classes: usize,
    /// Hue or hues in OKLCH degrees: one for a single-hue sequential ramp,
    /// two for a ramp moving from the first to the second, or the two arms
    /// of a diverging scheme.
    #[arg(long, value_delimiter = ',', value_name = "DEG")]
    hues: Vec<f64>,
    /// Peak chroma (OKLCH).
    #[arg(long, value_name = "C")]
    chroma: Option<f64>,
    /// Sequential: let the far end reach black (white on dark backgrounds).
    #[arg(long)]
    to_extreme: bool,
    /// Qualitative: centre of the lightness band (OKLab L, 0..1).
    #[arg(long, value_name = "L")]
    lightness: Option<f64>,
    /// Qualitative: fix a class's colour, `CLASS=COLOR` (class from 1).
    #[arg(long, value_name = "CLASS=COLOR")]
    pin: Vec<String>,
    /// Qualitative: hue hint for a class, `CLASS=DEG` (class from 1).
    #[arg(long, value_name = "CLASS=DEG")]
    hue_hint: Vec<String>,
    /// Qualitative: seed for the first class.
    #[arg(long, default_value_t = 1)]
    seed: u64,
    /// Also sample the continuous ramp at M points (ordered schemes).
    #[arg(long, value_name = "M")]
    ramp: Option<usize>,
}

/// Arguments of `palette check` and `palette fix`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// The palette's colours in class order (CSS Color 4 notations).
    #[arg(required = true, value_name = "COLOR")]
    colors: Vec<String>,
    #[command(flatten)]
    common: Common,
}

fn usage(what: &str, message: String) -> Error {
    Error::Usage {
        what: what.to_string(),
        message,
    }
}

/// The floor for marks of `size` (a length) seen from `distance_cm`.
fn floor_for_marks(size: &str, distance_cm: f64) -> Result<f64, Error> {
    let (lo, hi) = crate::figure::audit::VIEWING_DISTANCE_RANGE;
    if !(distance_cm.is_finite() && (lo..=hi).contains(&distance_cm)) {
        return Err(usage(
            "--viewing-distance",
            format!("{distance_cm}: expected centimetres between {lo} and {hi}"),
        ));
    }
    let pt = crate::spec::length::parse_length(size).map_err(|m| usage("--mark-size", m))?;
    let mm = crate::spec::length::pt_to_mm(pt);
    if mm.is_nan() || mm <= 0.0 {
        return Err(usage(
            "--mark-size",
            format!("'{size}': expected a positive length"),
        ));
    }
    let angle = crate::audit::stone2014::visual_angle_deg(mm, distance_cm * 10.0);
    let p = crate::thresholds::Thresholds::default().p_touching;
    Ok(crate::audit::judge::blend_threshold(p, angle))
}

fn context(c: &Common) -> Result<Context, Error> {
    if !(c.min_delta_e.is_finite() && c.min_delta_e > 0.0) {
        return Err(usage("--min-delta-e", "expected a positive number".into()));
    }
    let mut floor = c.min_delta_e;
    if let Some(size) = &c.mark_size {
        floor = floor.max(floor_for_marks(size, c.viewing_distance)?);
    }
    let bg = parse_color(&c.seeing.background)?;
    Ok(Context {
        background: scheme::to_8bit(composite::over(bg.rgba, Srgb::new(1.0, 1.0, 1.0))),
        views: vision::parse_views(&c.seeing.views)?,
        model: c.seeing.cvd_model.map(CvdModel::from),
        thresholds: Thresholds {
            min_delta_e: (floor * 100.0).round() / 100.0,
            ..Thresholds::default()
        },
    })
}

fn class_value<'a>(flag: &str, text: &'a str, n: usize) -> Result<(usize, &'a str), Error> {
    let (k, v) = text.split_once('=').ok_or_else(|| {
        usage(
            flag,
            format!("'{text}': expected CLASS=VALUE, e.g. 2=#aa3311"),
        )
    })?;
    let k: usize = k
        .trim()
        .parse()
        .ok()
        .filter(|k| (1..=n).contains(k))
        .ok_or_else(|| {
            usage(
                flag,
                format!("'{text}': the class must be a number from 1 to {n}"),
            )
        })?;
    Ok((k - 1, v.trim()))
}

fn finish(report: PaletteReport, c: &Common) -> Result<Outcome, Error> {
    let format = if c.json { Format::Json } else { c.format };
    let stdout = match format {
        Format::Text => palette_text::render(&report),
        Format::Json => {
            let mut s = serde_json::to_string_pretty(&report)
                .map_err(|e| Error::Internal(format!("serialising the palette: {e}")))?;
            s.push('\n');
            s
        }
        Format::Css => palette_text::css(&report),
        Format::Toml => palette_text::toml(&report),
    };
    let fail_at = if c.strict {
        Severity::Warning
    } else {
        Severity::Error
    };
    let failed = report.worst().is_some_and(|w| w >= fail_at)
        || report.changes.is_some()
            && report
                .findings
                .iter()
                .any(|f| f.severity >= Severity::Warning);
    let mut outcome = Outcome::success(stdout);
    if failed {
        outcome.kind = ExitKind::Findings;
    }
    if format != Format::Text {
        outcome.warnings.extend(report.notes.iter().cloned());
    }
    Ok(outcome)
}

fn parse_colors(texts: &[String], bg: Srgb) -> Result<Vec<Srgb>, Error> {
    texts
        .iter()
        .map(|t| Ok(scheme::to_8bit(composite::over(parse_color(t)?.rgba, bg))))
        .collect()
}

/// Run `palette`.
pub fn run(args: PaletteArgs) -> Result<Outcome, Error> {
    match args.action {
        PaletteAction::Make(a) => make(a),
        PaletteAction::Check(a) => {
            let ctx = context(&a.common)?;
            let colors = parse_colors(&a.colors, ctx.background)?;
            finish(
                PaletteReport::judge(a.common.scheme.into(), &colors, &ctx),
                &a.common,
            )
        }
        PaletteAction::Fix(a) => {
            let ctx = context(&a.common)?;
            let kind: SchemeKind = a.common.scheme.into();
            let colors = parse_colors(&a.colors, ctx.background)?;
            let fixed = scheme::repair::repair(kind, &colors, &ctx);
            let mut report = PaletteReport::judge(kind, &fixed.colors, &ctx);
            if !fixed.remaining.is_empty() {
                report.notes.push(
                    "no palette within these hue families passes every check; the closest found is shown, with what remains"
                        .into(),
                );
            }
            report.changes = Some(fixed.changes);
            finish(report, &a.common)
        }
    }
}

fn make(a: MakeArgs) -> Result<Outcome, Error> {
    let ctx = context(&a.common)?;
    let kind: SchemeKind = a.common.scheme.into();
    let n = a.classes;
    if !(2..=24).contains(&n) {
        return Err(usage(
            "--classes",
            format!("{n}: expected a number of classes from 2 to 24"),
        ));
    }
    if a.hues.iter().any(|h| !h.is_finite()) || a.hues.len() > 2 {
        return Err(usage(
            "--hues",
            "expected one or two hues in degrees, e.g. --hues 250 or --hues 80,250".into(),
        ));
    }
    if kind == SchemeKind::Diverging && a.hues.len() == 1 {
        return Err(usage(
            "--hues",
            "a diverging scheme takes two hues (one per arm), or none to choose them".into(),
        ));
    }
    let mut notes = Vec::new();
    let colors = match kind {
        SchemeKind::Sequential => {
            let mut o = scheme::sequential::Options {
                classes: n,
                to_extreme: a.to_extreme,
                ..Default::default()
            };
            if !a.hues.is_empty() {
                o.hues = a.hues.clone();
            }
            if let Some(c) = a.chroma {
                o.chroma = c;
            }
            scheme::sequential::generate(&o, &ctx)
        }
        SchemeKind::Diverging => {
            let mut o = scheme::diverging::Options {
                classes: n,
                hues: (a.hues.len() == 2).then(|| (a.hues[0], a.hues[1])),
                ..Default::default()
            };
            if let Some(c) = a.chroma {
                o.chroma = c;
            }
            scheme::diverging::generate(&o, &ctx)
        }
        SchemeKind::Qualitative => {
            let mut o = scheme::qualitative::Options {
                classes: n,
                lightness: a.lightness,
                seed: a.seed,
                ..Default::default()
            };
            for p in &a.pin {
                let (k, v) = class_value("--pin", p, n)?;
                o.pinned.push((
                    k,
                    scheme::to_8bit(composite::over(parse_color(v)?.rgba, ctx.background)),
                ));
            }
            for h in &a.hue_hint {
                let (k, v) = class_value("--hue-hint", h, n)?;
                let deg: f64 = v
                    .parse()
                    .ok()
                    .filter(|d: &f64| d.is_finite())
                    .ok_or_else(|| usage("--hue-hint", format!("'{h}': expected CLASS=DEGREES")))?;
                o.hue_hints.push((k, deg));
            }
            let out = scheme::qualitative::generate(&o, &ctx);
            if out.min_delta_e < ctx.thresholds.min_delta_e {
                let fit = out
                    .seeding_profile
                    .iter()
                    .position(|&d| d < ctx.thresholds.min_delta_e)
                    .map_or(n, |p| p + 1);
                notes.push(format!(
                    "{n} qualitative classes cannot all be told apart by every reader here (smallest ΔE00 {:.2} against a floor of {:.2}); about {fit} fit: use fewer classes, label the classes directly, or split the figure into small multiples",
                    out.min_delta_e, ctx.thresholds.min_delta_e
                ));
            }
            out.colors
        }
    };
    let mut report = PaletteReport::judge(kind, &colors, &ctx);
    report.notes = notes;
    if let Some(m) = a.ramp {
        if !kind.is_ordered() {
            return Err(usage(
                "--ramp",
                "a continuous ramp needs an ordered (sequential or diverging) scheme".into(),
            ));
        }
        if !(2..=4096).contains(&m) {
            return Err(usage("--ramp", format!("{m}: expected 2 to 4096 samples")));
        }
        report.ramp = Some(
            scheme::ramp::continuous(&colors, m)
                .iter()
                .map(|c| c.to_hex())
                .collect(),
        );
    }
    finish(report, &a.common)
}
