//! Standard-deviation classes: bounds at the mean plus multiples of the
//! standard deviation.
//!
//! Bounds are mean + m s for each multiple m (ascending), with s the
//! **sample** standard deviation (n - 1 in the denominator). The maximum is
//! appended as a last bound only when the last bound is below it, so the
//! last bound can exceed the maximum. Bounds below the minimum are kept:
//! leading classes can then be empty. This is the convention of the
//! reference classification library used in the tests
//! (tests/fixtures/README.md).
//!
//! With [`Multiples::Classes`], an odd number of classes puts the mean in
//! the centre of a middle class (multiples ±step, ±2 step, ...), an even
//! number makes the mean a break (multiples 0, ±step, ...).

use super::{Bounds, check_classes, mean};
use crate::error::Error;

/// Which multiples of the standard deviation become bounds.
#[derive(Debug, Clone, PartialEq)]
pub enum Multiples {
    /// `classes` classes in steps of `step` standard deviations (1 or 0.5
    /// are usual).
    Classes {
        /// Number of classes wanted (the maximum adds one when needed).
        classes: usize,
        /// Step between bounds, in standard deviations.
        step: f64,
    },
    /// Explicit multiples, e.g. [-2, -1, 1, 2].
    Explicit(Vec<f64>),
    /// Every whole multiple from the one at the minimum to the one at the
    /// maximum, each truncated toward zero: int((min - mean)/s) ..=
    /// int((max - mean)/s).
    Anchored,
}

/// The multiples that [`Multiples::Classes`] stands for.
pub fn class_multiples(classes: usize, step: f64) -> Vec<f64> {
    let k = classes as i64;
    if k % 2 == 1 {
        let h = (k - 1) / 2;
        (-h..=h)
            .filter(|&i| i != 0)
            .map(|i| i as f64 * step)
            .collect()
    } else {
        let h = k / 2 - 1;
        (-h..=h).map(|i| i as f64 * step).collect()
    }
}

/// The sample standard deviation (ddof = 1) of `x`, with its mean.
pub fn mean_and_sd(x: &[f64]) -> (f64, f64) {
    let m = mean(x);
    if x.len() < 2 {
        return (m, 0.0);
    }
    let ss: f64 = x.iter().map(|v| (v - m) * (v - m)).sum();
    (m, (ss / (x.len() - 1) as f64).sqrt())
}

/// Upper bounds of standard-deviation classes over sorted values `x`.
pub fn bounds(x: &[f64], multiples: &Multiples) -> Result<Bounds, Error> {
    let max = x[x.len() - 1];
    let (m, s) = mean_and_sd(x);
    if s == 0.0 {
        return Ok(Bounds {
            upper: vec![max],
            warnings: vec![format!(
                "the standard deviation is 0 ({} value(s), all equal to {max}): one class",
                x.len()
            )],
        });
    }
    let mut mult: Vec<f64> = match multiples {
        Multiples::Classes { classes, step } => {
            check_classes(*classes)?;
            if !(step.is_finite() && *step > 0.0) {
                return Err(Error::Usage {
                    what: "--stddev-step".into(),
                    message: format!("expected a positive step such as 1 or 0.5, got {step}"),
                });
            }
            class_multiples(*classes, *step)
        }
        Multiples::Explicit(v) => {
            if v.is_empty() || v.iter().any(|m| !m.is_finite()) {
                return Err(Error::Usage {
                    what: "--stddev-multiples".into(),
                    message: "expected a non-empty list of finite numbers such as -1,1".into(),
                });
            }
            v.clone()
        }
        Multiples::Anchored => {
            let lo = ((x[0] - m) / s).trunc() as i64;
            let hi = ((max - m) / s).trunc() as i64;
            (lo..=hi).map(|i| i as f64).collect()
        }
    };
    mult.sort_by(f64::total_cmp);
    mult.dedup();
    let mut upper: Vec<f64> = mult.iter().map(|k| m + k * s).collect();
    if upper.last().is_none_or(|&b| b < max) {
        upper.push(max);
    }
    let mut warnings = Vec::new();
    if upper[0] < x[0] {
        let empty = upper.iter().filter(|&&b| b < x[0]).count();
        warnings.push(format!(
            "{empty} bound(s) lie below the minimum {}: the lowest class(es) are empty",
            x[0]
        ));
    }
    Ok(Bounds { upper, warnings })
}
