//! Equal-interval classes: k classes of equal width between the minimum and
//! the maximum of the data.
//!
//! Width w = (max - min) / k. The bounds are generated the way an array
//! "range" with a floating-point step is usually filled (first bound
//! b0 = min + w, step d = (b0 + w) - b0, bound i = b0 + i*d, as numpy's
//! `arange` fills a float array; recalled from its source), then the last
//! bound is set to the maximum exactly so that the maximum is always in the
//! top class. These bounds differ from min + w*(i+1) by a few ulps at most.

use super::{Bounds, check_classes};
use crate::error::Error;

/// Upper bounds of `classes` equal-width classes over sorted values `x`.
pub fn bounds(x: &[f64], classes: usize) -> Result<Bounds, Error> {
    check_classes(classes)?;
    let (min, max) = (x[0], x[x.len() - 1]);
    if min == max {
        return Ok(Bounds {
            upper: vec![max],
            warnings: vec![format!(
                "all values equal {max}: one class instead of {classes}"
            )],
        });
    }
    let w = (max - min) / classes as f64;
    let b0 = min + w;
    let d = (b0 + w) - b0;
    let mut upper: Vec<f64> = (0..classes).map(|i| b0 + i as f64 * d).collect();
    upper[classes - 1] = max;
    // Guard against a non-increasing sequence from extreme rounding.
    upper.dedup_by(|b, a| *b <= *a);
    Ok(Bounds {
        upper,
        warnings: Vec::new(),
    })
}
