//! Diverging classes arranged around a stated midpoint (a zero change, a
//! national average, a threshold).
//!
//! Two arrangements ([`Arrangement`]):
//!
//! - **Break**: the midpoint is a class bound. The number of classes must
//!   be even; half lie at or below the midpoint (bounds are
//!   upper-inclusive, so a value equal to the midpoint is on the low side),
//!   half above.
//! - **Centre**: the midpoint is the centre of a middle class. The number of
//!   classes must be odd.
//!
//! Side methods ([`SideMethod`]):
//!
//! - `Equal`: one class width for both sides, so a class step means the
//!   same data step on either side; the width comes from the side that
//!   reaches further from the midpoint. Works with both arrangements.
//! - `Quantile`, `Natural`: each side is classified on its own values with
//!   half the classes (break arrangement only). The side's top bound is
//!   replaced by the midpoint on the low side.
//!
//! When one side holds no value, a warning says so; its classes are then
//! empty (for quantile and natural sides they mirror the other side's
//! bounds about the midpoint).

use serde::Serialize;

use super::{Bounds, Sample, fisher_jenks, quantile};
use crate::error::Error;

/// Where the midpoint sits in the classes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Arrangement {
    /// The midpoint is a class bound.
    Break,
    /// The midpoint is the centre of a middle class.
    Centre,
}

/// How each side is classified.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SideMethod {
    /// Equal widths, the same on both sides.
    Equal,
    /// Quantiles of each side's values.
    Quantile,
    /// Natural breaks of each side's values.
    Natural,
}

/// The midpoint that was used, for reports.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MidpointReport {
    /// The midpoint value.
    pub value: f64,
    /// Break or centre.
    pub arrangement: Arrangement,
    /// Values strictly below the midpoint.
    pub below: usize,
    /// Values equal to the midpoint.
    pub at: usize,
    /// Values strictly above the midpoint.
    pub above: usize,
}

/// Bounds of `classes` diverging classes around `midpoint`, plus the report.
pub fn bounds(
    sample: &Sample,
    side: SideMethod,
    classes: usize,
    midpoint: f64,
    arrangement: Arrangement,
) -> Result<(Bounds, MidpointReport), Error> {
    if !midpoint.is_finite() {
        return Err(Error::Usage {
            what: "--midpoint".into(),
            message: format!("expected a finite number, got {midpoint}"),
        });
    }
    let x = sample.sorted();
    if x.is_empty() {
        return Err(Error::Usage {
            what: "values".into(),
            message: "there is no value to classify".into(),
        });
    }
    let (report, mut warnings) = sides(x, midpoint, arrangement);
    let at_end = report.below + report.at;
    let (min, max) = (x[0], x[x.len() - 1]);
    let extent = (midpoint - min).max(max - midpoint);
    let upper = match arrangement {
        Arrangement::Break => {
            if classes < 2 || classes % 2 != 0 {
                return Err(Error::Usage {
                    what: "--classes".into(),
                    message: format!(
                        "with the midpoint as a break the number of classes must be even (2, 4, 6, ...), got {classes}"
                    ),
                });
            }
            let h = classes / 2;
            match side {
                SideMethod::Equal => {
                    let extent = if extent > 0.0 { extent } else { 1.0 };
                    let w = extent / h as f64;
                    (0..classes)
                        .map(|j| midpoint + (j as f64 - h as f64 + 1.0) * w)
                        .collect()
                }
                SideMethod::Quantile | SideMethod::Natural => {
                    let (low, high) = x.split_at(at_end);
                    let mut lows = side_bounds(low, side, h, &mut warnings)?;
                    let mut highs = side_bounds(high, side, h, &mut warnings)?;
                    if let Some(last) = lows.last_mut() {
                        *last = midpoint;
                    }
                    if lows.is_empty() {
                        // Mirror the high side's lower class edges about the midpoint.
                        lows = highs[..highs.len() - 1]
                            .iter()
                            .rev()
                            .map(|b| 2.0 * midpoint - b)
                            .collect();
                        lows.push(midpoint);
                    }
                    if highs.is_empty() {
                        // Mirror the low side's lower class edges (and the minimum).
                        highs = lows[..lows.len() - 1]
                            .iter()
                            .rev()
                            .map(|b| 2.0 * midpoint - b)
                            .collect();
                        highs.push(2.0 * midpoint - min);
                    }
                    let mut upper = lows;
                    upper.extend(highs);
                    upper.dedup_by(|b, a| *b <= *a);
                    upper
                }
            }
        }
        Arrangement::Centre => {
            if classes % 2 != 1 {
                return Err(Error::Usage {
                    what: "--classes".into(),
                    message: format!(
                        "with the midpoint as the centre of a class the number of classes must be odd (1, 3, 5, ...), got {classes}"
                    ),
                });
            }
            if side != SideMethod::Equal {
                return Err(Error::Usage {
                    what: "--midpoint-as".into(),
                    message: "a middle class centred on the midpoint is available with --method equal; use --midpoint-as break with quantile or natural".into(),
                });
            }
            let h = (classes - 1) / 2;
            let extent = if extent > 0.0 { extent } else { 1.0 };
            let w = extent / (h as f64 + 0.5);
            (0..classes)
                .map(|j| midpoint + (j as f64 - h as f64 + 0.5) * w)
                .collect()
        }
    };
    Ok((Bounds { upper, warnings }, report))
}

/// Bounds of `h` classes of one side's sorted values (empty side: none).
fn side_bounds(
    vals: &[f64],
    side: SideMethod,
    h: usize,
    warnings: &mut Vec<String>,
) -> Result<Vec<f64>, Error> {
    if vals.is_empty() {
        return Ok(Vec::new());
    }
    let b = match side {
        SideMethod::Quantile => quantile::bounds(vals, h)?,
        _ => fisher_jenks::bounds(vals, h)?,
    };
    warnings.extend(b.warnings);
    Ok(b.upper)
}

/// Check user-given bounds against a midpoint: it should be one of the
/// bounds (break) or the centre of a class (centre). Returns the report and
/// a warning when the bounds do not respect the midpoint or a side is empty.
pub fn check_manual(
    sample: &Sample,
    upper: &[f64],
    midpoint: f64,
    arrangement: Arrangement,
) -> (MidpointReport, Vec<String>) {
    let (report, mut warnings) = sides(sample.sorted(), midpoint, arrangement);
    let tol = 1e-12 * midpoint.abs().max(1.0);
    let respected = match arrangement {
        Arrangement::Break => upper.iter().any(|&b| (b - midpoint).abs() <= tol),
        Arrangement::Centre => upper
            .windows(2)
            .any(|w| ((w[0] + w[1]) / 2.0 - midpoint).abs() <= tol),
    };
    if !respected {
        warnings.push(format!(
            "the manual breaks do not put the midpoint {midpoint} {}",
            match arrangement {
                Arrangement::Break => "on a class bound",
                Arrangement::Centre => "at the centre of a class",
            }
        ));
    }
    (report, warnings)
}

/// Count the values on each side of the midpoint and warn for an empty side.
fn sides(x: &[f64], midpoint: f64, arrangement: Arrangement) -> (MidpointReport, Vec<String>) {
    let below = x.partition_point(|&v| v < midpoint);
    let at_end = x.partition_point(|&v| v <= midpoint);
    let report = MidpointReport {
        value: midpoint,
        arrangement,
        below,
        at: at_end - below,
        above: x.len() - at_end,
    };
    let mut warnings = Vec::new();
    for (n, side) in [(report.below, "below"), (report.above, "above")] {
        if n == 0 {
            warnings.push(format!(
                "no value lies {side} the midpoint {midpoint}: the classes on that side are empty"
            ));
        }
    }
    (report, warnings)
}
