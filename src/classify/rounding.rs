//! Rounding class bounds to readable values.
//!
//! A legend entry such as "12.976589 to 25.818365" is exact but hard to read,
//! while "10 to 30" reads at a glance but moves some observations into
//! another class.
//! This module rounds the bounds and reports exactly how many observations
//! changed class, so the cost of readability is visible.
//!
//! Every bound except the last is rounded to the nearest multiple of the
//! step (halves away from zero). The last bound is rounded **up**, so no
//! value leaves the top class. The rounded bounds must stay strictly
//! increasing. [`RoundRule::Auto`] picks the coarsest power of ten that
//! keeps them strictly increasing and keeps every interior bound inside
//! the data range (min, max); [`RoundRule::Step`] uses the given step and
//! fails if bounds would merge. A midpoint that is a class bound is never
//! rounded.

use serde::Serialize;

use super::{Classification, Sample, class_of, counts, finish};
use crate::error::Error;

/// How to round bounds.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum RoundRule {
    /// The coarsest power of ten that keeps the classes distinct.
    Auto,
    /// A given positive step, e.g. 0.5, 10 or 250.
    Step(f64),
}

/// What rounding did.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RoundingReport {
    /// The step the bounds were rounded to.
    pub step: f64,
    /// The bounds before rounding.
    pub unrounded_breaks: Vec<f64>,
    /// The counts before rounding.
    pub unrounded_counts: Vec<usize>,
    /// How many observations are in a different class after rounding.
    pub changed_class: usize,
}

/// Round `x` to a multiple of `step`, cleaning binary noise by printing
/// with the step's number of decimals.
fn to_step(x: f64, step: f64, up: bool) -> f64 {
    let q = x / step;
    let q = if up { q.ceil() } else { q.round() };
    let v = q * step;
    // As many decimals as the step itself has (0.25 -> 2, 10 -> 0).
    let text = step.to_string();
    let decimals = text.split_once('.').map_or(0, |(_, f)| f.len());
    format!("{v:.decimals$}").parse().unwrap_or(v)
}

/// Round all bounds with one step, leaving a bound equal to `keep` (a
/// midpoint that is a break) as it is; None if they stop increasing.
fn round_all(upper: &[f64], step: f64, keep: Option<f64>) -> Option<Vec<f64>> {
    let n = upper.len();
    let out: Vec<f64> = upper
        .iter()
        .enumerate()
        .map(|(i, &b)| {
            if Some(b) == keep {
                b
            } else {
                to_step(b, step, i + 1 == n)
            }
        })
        .collect();
    if out.windows(2).all(|w| w[0] < w[1]) {
        Some(out)
    } else {
        None
    }
}

/// Round the bounds of `c` (computed from `sample`) by `rule`, recompute
/// counts and fit, and record what changed.
pub fn round(
    sample: &Sample,
    c: &Classification,
    rule: RoundRule,
) -> Result<Classification, Error> {
    let upper = &c.breaks;
    let keep = c
        .midpoint
        .as_ref()
        .filter(|m| m.arrangement == super::diverging::Arrangement::Break)
        .map(|m| m.value);
    let (step, rounded) = match rule {
        RoundRule::Step(step) => {
            if !(step.is_finite() && step > 0.0) {
                return Err(Error::Usage {
                    what: "--round".into(),
                    message: format!("expected 'auto' or a positive step such as 10, got {step}"),
                });
            }
            match round_all(upper, step, keep) {
                Some(r) => (step, r),
                None => {
                    return Err(Error::Usage {
                        what: "--round".into(),
                        message: format!(
                            "a step of {step} merges neighbouring class bounds {upper:?}; use a smaller step or 'auto'"
                        ),
                    });
                }
            }
        }
        RoundRule::Auto => {
            let span = (c.max - c.min)
                .abs()
                .max(upper.iter().fold(0.0f64, |a, b| a.max(b.abs())));
            let top = if span > 0.0 {
                span.log10().floor() as i32
            } else {
                0
            };
            let mut found = None;
            for p in (top - 15..=top).rev() {
                let step = 10f64.powi(p);
                if let Some(r) = round_all(upper, step, keep) {
                    let n = r.len();
                    // An interior bound inside the data range must stay inside it.
                    let inside = r[..n - 1]
                        .iter()
                        .zip(&upper[..n - 1])
                        .all(|(&r, &u)| !(u >= c.min && u < c.max) || (r >= c.min && r < c.max));
                    if inside {
                        found = Some((step, r));
                        break;
                    }
                }
            }
            found.unwrap_or((0.0, upper.clone()))
        }
    };
    let x = sample.sorted();
    let changed = x
        .iter()
        .filter(|&&v| class_of(v, upper) != class_of(v, &rounded))
        .count();
    debug_assert_eq!(counts(x, upper), c.counts);
    let bounds = super::Bounds {
        upper: rounded,
        warnings: c.warnings.clone(),
    };
    let mut out = finish(sample, &c.method, bounds, c.histogram.counts.len())?;
    out.midpoint = c.midpoint.clone();
    if changed > 0 {
        out.warnings.push(format!(
            "rounding the bounds moved {changed} of {} observation(s) into another class",
            x.len()
        ));
    }
    out.rounding = Some(RoundingReport {
        step,
        unrounded_breaks: upper.clone(),
        unrounded_counts: c.counts.clone(),
        changed_class: changed,
    });
    Ok(out)
}
