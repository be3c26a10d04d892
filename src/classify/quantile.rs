//! Quantile classes: k classes holding (as nearly as ties allow) the same
//! number of values.
//!
//! Bound i (i = 1..k) is the (100 i / k)-th percentile computed by linear
//! interpolation between order statistics at position h = (n - 1) i / k
//! (0-based; Hyndman & Fan 1996 definition 7, the default of R and numpy).
//! The weights are formed as scipy's `scoreatpercentile` forms them
//! (x[f] (f + 1 - h) + x[f+1] (h - f)). The position is computed in exact
//! integer arithmetic, so an integral position never interpolates.
//!
//! **Ties.** Repeated values can make two bounds equal. Equal bounds are
//! collapsed into one, so fewer than k classes result, and a warning says
//! so. A value equal to a bound belongs to the lower class, so a block of
//! tied values is never split between classes, and the counts need not be
//! equal.

use super::{Bounds, check_classes};
use crate::error::Error;

/// Upper bounds of `classes` quantile classes over sorted values `x`.
pub fn bounds(x: &[f64], classes: usize) -> Result<Bounds, Error> {
    check_classes(classes)?;
    let n = x.len();
    let mut upper: Vec<f64> = (1..=classes)
        .map(|i| {
            let num = (n - 1) * i;
            let f = num / classes;
            let rem = num % classes;
            if rem == 0 {
                x[f]
            } else {
                let h = f as f64 + rem as f64 / classes as f64;
                let (w0, w1) = (f as f64 + 1.0 - h, h - f as f64);
                (x[f] * w0 + x[f + 1] * w1) / (w0 + w1)
            }
        })
        .collect();
    upper.dedup();
    // Interpolation can never decrease, but keep the invariant explicit.
    upper.dedup_by(|b, a| *b <= *a);
    let mut warnings = Vec::new();
    if upper.len() < classes {
        warnings.push(format!(
            "repeated values made quantile bounds coincide: {} classes instead of {classes}",
            upper.len()
        ));
    }
    Ok(Bounds { upper, warnings })
}
