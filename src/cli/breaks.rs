//! `hueproof breaks FILE.csv --column NAME --method M ...`: class breaks
//! for a classed map, with counts and goodness of variance fit.

use std::path::PathBuf;

use clap::{Args, ValueEnum};

use crate::classify::column::{self, ColumnSpec};
use crate::classify::diverging::{self, Arrangement, SideMethod};
use crate::classify::head_tail::StopRule;
use crate::classify::rounding::{self, RoundRule};
use crate::classify::std_dev::Multiples;
use crate::classify::{self, Classification, Method, Sample, text, unclassed};
use crate::error::Error;

use super::Outcome;

/// Arguments of `breaks`.
#[derive(Debug, Args)]
pub struct BreaksArgs {
    /// The CSV file (first line: header).
    #[arg(value_name = "FILE.csv")]
    pub file: PathBuf,
    /// Header name of the numeric column to classify.
    #[arg(long, value_name = "NAME")]
    pub column: String,
    /// Classification method.
    #[arg(long, value_enum, value_name = "METHOD")]
    pub method: MethodArg,
    /// Number of classes (equal, quantile, natural, stddev; ignored by
    /// headtail, which lets the data decide).
    #[arg(long, value_name = "K")]
    pub classes: Option<usize>,
    /// Manual class upper bounds, comma-separated and increasing, e.g.
    /// 10,25,50 (the maximum closes the top class if it lies above).
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    pub breaks: Option<String>,
    /// stddev: step between bounds in standard deviations (1 or 0.5 are usual).
    #[arg(long, value_name = "S", default_value_t = 1.0)]
    pub stddev_step: f64,
    /// stddev: explicit multiples of the standard deviation, e.g. -2,-1,1,2
    /// (instead of --classes).
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    pub stddev_multiples: Option<String>,
    /// stddev: every whole multiple from the minimum to the maximum
    /// (instead of --classes).
    #[arg(long)]
    pub stddev_anchor: bool,
    /// headtail: also stop when a head holds more than this share of the
    /// values it was cut from (e.g. 0.4). Default: cut until the head is a
    /// single value.
    #[arg(long, value_name = "SHARE")]
    pub head_share: Option<f64>,
    /// Round the bounds to readable values: 'auto' (coarsest power of ten
    /// keeping classes distinct) or a step such as 5 or 0.1. Reports how many
    /// observations changed class.
    #[arg(long, value_name = "auto|STEP")]
    pub round: Option<String>,
    /// Arrange diverging classes around this value (equal, quantile,
    /// natural; with manual, checks that the breaks respect it).
    #[arg(long, value_name = "X", allow_negative_numbers = true)]
    pub midpoint: Option<f64>,
    /// Whether the midpoint is a class bound (even class count) or the
    /// centre of a middle class (odd class count; equal and manual only).
    #[arg(long, value_enum, default_value = "break", value_name = "HOW")]
    pub midpoint_as: MidpointArg,
    /// Missing-value markers, comma-separated, replacing the defaults
    /// (empty cell, NA, NaN). An empty item stands for the empty cell, e.g.
    /// ",NA,-999".
    #[arg(long, value_name = "LIST", allow_hyphen_values = true)]
    pub missing: Option<String>,
    /// Field delimiter (one ASCII character, e.g. ';' or 'tab').
    #[arg(long, default_value = ",", value_name = "CHAR")]
    pub delimiter: String,
    /// Number of equal-width histogram bins reported for legends.
    #[arg(long, default_value_t = classify::DEFAULT_HISTOGRAM_BINS, value_name = "N")]
    pub histogram_bins: usize,
    /// unclassed: number of evenly spaced legend ticks from min to max.
    #[arg(long, default_value_t = 5, value_name = "N")]
    pub ticks: usize,
    /// unclassed with --midpoint: one scale for both sides (the shorter side
    /// does not reach its end of the ramp).
    #[arg(long)]
    pub symmetric: bool,
    /// Print one JSON object instead of text.
    #[arg(long)]
    pub json: bool,
}

/// Method names on the command line.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum MethodArg {
    /// Equal-width classes.
    Equal,
    /// Equal-count classes (type-7 quantiles).
    Quantile,
    /// Exact optimal natural breaks (Fisher-Jenks).
    Natural,
    /// Mean plus multiples of the standard deviation.
    Stddev,
    /// Head/tail breaks for heavy-tailed data.
    Headtail,
    /// Bounds given with --breaks.
    Manual,
    /// No classes: a continuous ramp over the data range (ticks and
    /// positions for the legend).
    Unclassed,
}

/// Midpoint arrangements on the command line.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum MidpointArg {
    /// The midpoint is a class bound.
    Break,
    /// The midpoint is the centre of a middle class.
    Centre,
}

fn usage(what: &str, message: String) -> Error {
    Error::Usage {
        what: what.into(),
        message,
    }
}

/// Parse a comma-separated list of numbers for option `what`.
fn number_list(what: &str, list: &str) -> Result<Vec<f64>, Error> {
    list.split(',')
        .map(|item| match item.trim() {
            "" => Err(usage(
                what,
                format!(
                    "empty item in '{list}'; expected comma-separated numbers such as 10,25,50"
                ),
            )),
            item => column::parse_number(item).map_err(|why| usage(what, why)),
        })
        .collect()
}

fn classes_for(args: &BreaksArgs) -> Result<usize, Error> {
    args.classes.ok_or_else(|| {
        usage(
            "--classes",
            format!(
                "--method {} needs the number of classes, e.g. --classes 5",
                method_name(args.method)
            ),
        )
    })
}

fn method_name(m: MethodArg) -> &'static str {
    match m {
        MethodArg::Equal => "equal",
        MethodArg::Quantile => "quantile",
        MethodArg::Natural => "natural",
        MethodArg::Stddev => "stddev",
        MethodArg::Headtail => "headtail",
        MethodArg::Manual => "manual",
        MethodArg::Unclassed => "unclassed",
    }
}

/// Build the library method from the arguments.
fn method(args: &BreaksArgs) -> Result<Method, Error> {
    if args.breaks.is_some() && args.method != MethodArg::Manual {
        return Err(usage(
            "--breaks",
            "only --method manual takes --breaks".into(),
        ));
    }
    Ok(match args.method {
        MethodArg::Equal => Method::EqualInterval {
            classes: classes_for(args)?,
        },
        MethodArg::Quantile => Method::Quantile {
            classes: classes_for(args)?,
        },
        MethodArg::Natural => Method::NaturalBreaks {
            classes: classes_for(args)?,
        },
        MethodArg::Stddev => {
            let m = match (&args.stddev_multiples, args.stddev_anchor) {
                (Some(_), true) => {
                    return Err(usage(
                        "--stddev-anchor",
                        "give either --stddev-multiples or --stddev-anchor, not both".into(),
                    ));
                }
                (Some(list), false) => {
                    Multiples::Explicit(number_list("--stddev-multiples", list)?)
                }
                (None, true) => Multiples::Anchored,
                (None, false) => Multiples::Classes {
                    classes: classes_for(args)?,
                    step: args.stddev_step,
                },
            };
            Method::StdDev(m)
        }
        MethodArg::Headtail => Method::HeadTail(match args.head_share {
            Some(s) => StopRule::HeadShare(s),
            None => StopRule::SingleValue,
        }),
        MethodArg::Unclassed => {
            return Err(Error::Internal(
                "unclassed colouring has no class breaks".into(),
            ));
        }
        MethodArg::Manual => {
            let list = args.breaks.as_deref().ok_or_else(|| {
                usage(
                    "--breaks",
                    "--method manual needs class upper bounds, e.g. --breaks 10,25,50".into(),
                )
            })?;
            Method::Manual {
                bounds: number_list("--breaks", list)?,
            }
        }
    })
}

fn delimiter(d: &str) -> Result<u8, Error> {
    match d {
        "tab" | "\\t" | "\t" => Ok(b'\t'),
        _ if d.len() == 1 && d.is_ascii() => Ok(d.as_bytes()[0]),
        _ => Err(usage(
            "--delimiter",
            format!("expected one ASCII character such as ',' or ';' (or 'tab'), got '{d}'"),
        )),
    }
}

/// Classify as the arguments ask (without reading a file).
pub fn classify_sample(sample: &Sample, args: &BreaksArgs) -> Result<Classification, Error> {
    let method = method(args)?;
    let bins = args.histogram_bins.max(1);
    let mut c = match args.midpoint {
        None => classify::classify(sample, &method, bins)?,
        Some(mid) => {
            let arrangement = match args.midpoint_as {
                MidpointArg::Break => Arrangement::Break,
                MidpointArg::Centre => Arrangement::Centre,
            };
            let side = match &method {
                Method::EqualInterval { .. } => Some(SideMethod::Equal),
                Method::Quantile { .. } => Some(SideMethod::Quantile),
                Method::NaturalBreaks { .. } => Some(SideMethod::Natural),
                Method::Manual { .. } => None,
                _ => {
                    return Err(usage(
                        "--midpoint",
                        format!(
                            "--method {} has its own centre; use --midpoint with equal, quantile, natural or manual",
                            method.name()
                        ),
                    ));
                }
            };
            match side {
                Some(side) => {
                    let (bounds, report) =
                        diverging::bounds(sample, side, classes_for(args)?, mid, arrangement)?;
                    let mut c = classify::finish(sample, method.name(), bounds, bins)?;
                    c.midpoint = Some(report);
                    c
                }
                None => {
                    let mut c = classify::classify(sample, &method, bins)?;
                    let (report, warning) =
                        diverging::check_manual(sample, &c.breaks, mid, arrangement);
                    c.warnings.extend(warning);
                    c.midpoint = Some(report);
                    c
                }
            }
        }
    };
    if let Some(r) = &args.round {
        let rule = if r == "auto" {
            RoundRule::Auto
        } else {
            RoundRule::Step(
                column::parse_number(r)
                    .map_err(|why| usage("--round", format!("expected 'auto' or a step: {why}")))?,
            )
        };
        c = rounding::round(sample, &c, rule)?;
    }
    Ok(c)
}

/// Run `breaks`.
pub fn run(args: BreaksArgs) -> Result<Outcome, Error> {
    let mut spec = ColumnSpec::new(&args.column);
    spec.delimiter = delimiter(&args.delimiter)?;
    if let Some(m) = &args.missing {
        spec.missing = m.split(',').map(|s| s.trim().to_string()).collect();
    }
    let sample = column::read(&args.file, &spec)?;
    if args.method == MethodArg::Unclassed {
        return run_unclassed(&sample, &args);
    }
    let c = classify_sample(&sample, &args)?;
    let stdout = if args.json {
        json(&c)?
    } else {
        text::render(&c)
    };
    Ok(with_warnings(stdout, c.warnings.clone(), c.missing, &args))
}

fn json<T: serde::Serialize>(value: &T) -> Result<String, Error> {
    let mut s = serde_json::to_string_pretty(value)
        .map_err(|e| Error::Internal(format!("serialising the result: {e}")))?;
    s.push('\n');
    Ok(s)
}

fn with_warnings(
    stdout: String,
    mut warnings: Vec<String>,
    missing: usize,
    args: &BreaksArgs,
) -> Outcome {
    if missing > 0 {
        warnings.push(format!(
            "{missing} missing value(s) in column '{}' are in no class",
            args.column
        ));
    }
    let mut outcome = Outcome::success(stdout);
    outcome.warnings = warnings;
    outcome
}

/// `--method unclassed`: the continuous ramp and its legend ticks.
fn run_unclassed(sample: &Sample, args: &BreaksArgs) -> Result<Outcome, Error> {
    for (given, what) in [
        (args.classes.is_some(), "--classes"),
        (args.breaks.is_some(), "--breaks"),
        (args.round.is_some(), "--round"),
    ] {
        if given {
            return Err(usage(
                what,
                "--method unclassed has no classes; drop this option".into(),
            ));
        }
    }
    let r = unclassed::ramp(
        sample,
        args.midpoint,
        args.symmetric,
        args.ticks,
        args.histogram_bins.max(1),
    )?;
    let stdout = if args.json {
        json(&r)?
    } else {
        unclassed::render(&r)
    };
    Ok(with_warnings(stdout, Vec::new(), r.missing, args))
}
