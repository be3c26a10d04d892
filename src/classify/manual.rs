//! Manual breaks: class upper bounds given by the user.
//!
//! The bounds must be finite and strictly increasing. When the last bound
//! is below the maximum, the maximum is appended so that every value has a
//! class (the top class is then (last bound, max]). Values at or below the
//! first bound fall into class 0.

use super::Bounds;
use crate::error::Error;

/// Check user bounds against sorted values `x` and complete them.
pub fn bounds(x: &[f64], given: &[f64]) -> Result<Bounds, Error> {
    if given.is_empty() {
        return Err(Error::Usage {
            what: "--breaks".into(),
            message: "expected at least one upper bound, e.g. --breaks 10,20,50".into(),
        });
    }
    if let Some(b) = given.iter().find(|b| !b.is_finite()) {
        return Err(Error::Usage {
            what: "--breaks".into(),
            message: format!("expected finite numbers, got {b}"),
        });
    }
    if let Some(w) = given.windows(2).find(|w| w[0] >= w[1]) {
        return Err(Error::Usage {
            what: "--breaks".into(),
            message: format!(
                "expected strictly increasing upper bounds, but {} is followed by {}",
                w[0], w[1]
            ),
        });
    }
    let (min, max) = (x[0], x[x.len() - 1]);
    let mut upper = given.to_vec();
    let mut warnings = Vec::new();
    if upper[upper.len() - 1] < max {
        warnings.push(format!(
            "the last bound {} is below the maximum {max}: the maximum closes an extra top class",
            upper[upper.len() - 1]
        ));
        upper.push(max);
    }
    let below = upper.iter().filter(|&&b| b < min).count();
    if below > 0 {
        warnings.push(format!(
            "{below} bound(s) lie below the minimum {min}: the lowest class(es) are empty"
        ));
    }
    Ok(Bounds { upper, warnings })
}
