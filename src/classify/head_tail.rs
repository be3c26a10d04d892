//! Head/tail breaks for heavy-tailed data (Jiang 2013, "Head/tail breaks: a
//! new classification scheme for data with a heavy-tailed distribution",
//! The Professional Geographer 65(3)).
//!
//! The first cut is the mean of all values. The values above a cut form
//! the *head*; the next cut is the mean of the head, and so on. The data
//! decides the number of classes.
//!
//! Two stop rules:
//!
//! - [`StopRule::SingleValue`] (the default, and the rule of the reference
//!   classification library used in the tests): continue until the head
//!   holds a single distinct value; the final cut is then that value, the
//!   maximum.
//! - [`StopRule::HeadShare`]: also stop as soon as a head is no longer a
//!   minority, i.e. holds more than the given share (Jiang suggests about
//!   40 %) of the values it was cut from; that head's cut is not made, and
//!   the maximum closes the last class.
//!
//! A cut equal to a value puts that value in the lower class (bounds are
//! upper-inclusive), matching "the head is the values greater than the mean".

use super::{Bounds, mean};
use crate::error::Error;

/// When to stop cutting heads.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum StopRule {
    /// Stop when the head holds one distinct value.
    SingleValue,
    /// Also stop when a head holds more than this share (0..1) of the
    /// values it was cut from.
    HeadShare(f64),
}

/// Upper bounds of head/tail classes over sorted values `x`.
pub fn bounds(x: &[f64], rule: &StopRule) -> Result<Bounds, Error> {
    if let StopRule::HeadShare(share) = rule {
        if !(*share > 0.0 && *share <= 1.0) {
            return Err(Error::Usage {
                what: "--head-share".into(),
                message: format!("expected a share in (0, 1], such as 0.4, got {share}"),
            });
        }
    }
    let max = x[x.len() - 1];
    let mut upper = Vec::new();
    let mut cur = x;
    loop {
        if cur[0] == cur[cur.len() - 1] {
            // One distinct value: the final cut is that value.
            upper.push(max);
            break;
        }
        let cut = mean(cur);
        let head_start = cur.partition_point(|&v| v <= cut);
        let head = &cur[head_start..];
        if let StopRule::HeadShare(share) = rule {
            if !upper.is_empty() && head.len() as f64 > share * cur.len() as f64 {
                upper.push(max);
                break;
            }
        }
        upper.push(cut);
        cur = head;
    }
    upper.dedup_by(|b, a| *b <= *a);
    Ok(Bounds {
        upper,
        warnings: Vec::new(),
    })
}
