//! Unclassed (continuous) colouring of ordered data.
//!
//! Instead of classes, each value gets a position t in 0..1 along a
//! continuous colour ramp:
//!
//! - without a midpoint, t = (v - min) / (max - min), linear over the data
//!   range;
//! - with a midpoint (diverging data), the two sides are scaled separately
//!   so that min maps to 0, the midpoint to 0.5 and max to 1. Each side is
//!   linear, so one unit of data is not the same colour distance on both
//!   sides when they differ in extent; use [`position_symmetric`] to keep
//!   one scale for both sides (the shorter side then does not reach its
//!   end of the ramp).
//!
//! Values outside [min, max] are clamped. A degenerate range (min = max)
//! maps everything to 0.5. Unclassed colouring shows every difference but
//! lets readers look up no value from a legend exactly; say so in the
//! figure's caption when it matters.

use serde::Serialize;

use super::{Histogram, Sample, histogram};
use crate::error::Error;

/// Position of `v` in 0..1 over `[min, max]`, optionally split at `midpoint`.
pub fn position(v: f64, min: f64, max: f64, midpoint: Option<f64>) -> f64 {
    let t = match midpoint {
        None => {
            if max > min {
                (v - min) / (max - min)
            } else {
                0.5
            }
        }
        Some(mid) => {
            if v <= mid {
                if mid > min {
                    0.5 * (v - min) / (mid - min)
                } else {
                    0.5
                }
            } else if max > mid {
                0.5 + 0.5 * (v - mid) / (max - mid)
            } else {
                0.5
            }
        }
    };
    t.clamp(0.0, 1.0)
}

/// Position of `v` in 0..1 with the midpoint at 0.5 and one scale for both
/// sides: the larger of (mid - min) and (max - mid) spans half the ramp.
pub fn position_symmetric(v: f64, min: f64, max: f64, midpoint: f64) -> f64 {
    let extent = (midpoint - min).max(max - midpoint);
    if extent > 0.0 {
        (0.5 + 0.5 * (v - midpoint) / extent).clamp(0.0, 1.0)
    } else {
        0.5
    }
}

/// One legend tick of a continuous ramp.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Tick {
    /// The data value.
    pub value: f64,
    /// Its position on the ramp, 0..1.
    pub position: f64,
}

/// What a continuous legend needs: the ramp's domain and ticks.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Ramp {
    /// Always `unclassed`.
    pub method: String,
    /// The smallest value (position 0, unless symmetric).
    pub min: f64,
    /// The largest value (position 1, unless symmetric).
    pub max: f64,
    /// The midpoint (position 0.5), if any.
    pub midpoint: Option<f64>,
    /// Whether both sides share one scale.
    pub symmetric: bool,
    /// Evenly spaced values from min to max (and the midpoint) with their
    /// positions.
    pub ticks: Vec<Tick>,
    /// Number of values.
    pub n: usize,
    /// Number of missing values.
    pub missing: usize,
    /// Equal-width histogram of the values.
    pub histogram: Histogram,
}

/// Describe the continuous ramp for `sample`: `ticks` evenly spaced values
/// (at least 2) plus the midpoint, each with its position.
pub fn ramp(
    sample: &Sample,
    midpoint: Option<f64>,
    symmetric: bool,
    ticks: usize,
    histogram_bins: usize,
) -> Result<Ramp, Error> {
    let (Some(min), Some(max)) = (sample.min(), sample.max()) else {
        return Err(Error::Usage {
            what: "values".into(),
            message: format!("there is no value to colour ({} missing)", sample.missing()),
        });
    };
    if let Some(m) = midpoint {
        if !m.is_finite() {
            return Err(Error::Usage {
                what: "--midpoint".into(),
                message: format!("expected a finite number, got {m}"),
            });
        }
    }
    let pos = |v: f64| match (midpoint, symmetric) {
        (Some(m), true) => position_symmetric(v, min, max, m),
        _ => position(v, min, max, midpoint),
    };
    let t = ticks.max(2);
    let mut values: Vec<f64> = (0..t)
        .map(|i| min + (max - min) * i as f64 / (t - 1) as f64)
        .collect();
    values[t - 1] = max;
    if let Some(m) = midpoint {
        values.push(m);
        values.sort_by(f64::total_cmp);
        values.dedup();
    }
    Ok(Ramp {
        method: "unclassed".into(),
        min,
        max,
        midpoint,
        symmetric,
        ticks: values
            .into_iter()
            .map(|value| Tick {
                value,
                position: pos(value),
            })
            .collect(),
        n: sample.len(),
        missing: sample.missing(),
        histogram: histogram(sample.sorted(), histogram_bins),
    })
}

/// Text rendering of a ramp for people.
pub fn render(r: &Ramp) -> String {
    let mut s = format!(
        "unclassed: continuous ramp over {} .. {}, {} values, {} missing\n",
        r.min, r.max, r.n, r.missing
    );
    if let Some(m) = r.midpoint {
        s.push_str(&format!(
            "midpoint {m} at 0.5 ({})\n",
            if r.symmetric {
                "one scale for both sides"
            } else {
                "each side scaled to its own extent"
            }
        ));
    }
    s.push_str("    value  position\n");
    for t in &r.ticks {
        s.push_str(&format!("{:>9}  {:.6}\n", t.value, t.position));
    }
    s
}
