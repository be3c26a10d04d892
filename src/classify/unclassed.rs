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
