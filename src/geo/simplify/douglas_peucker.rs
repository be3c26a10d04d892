//! Douglas & Peucker (1973): keep both ends, keep the vertex farthest from
//! the segment joining them if it is farther than the tolerance, recurse on
//! both halves. Distances are to the segment, not the infinite line.
//!
//! Here each interior vertex gets an importance: the distance at which the
//! recursion keeps it, capped by its parent's importance. A vertex is kept
//! for tolerance t exactly when its importance exceeds t, which is the
//! classic result for every t at once.

use crate::geo::measure::inaccessibility::segment_distance_sq;
use crate::geo::model::Coord;

/// Importance of every vertex of an open path; the ends get infinity.
pub fn importance(path: &[Coord]) -> Vec<f64> {
    let n = path.len();
    let mut imp = vec![0.0; n];
    if n == 0 {
        return imp;
    }
    imp[0] = f64::INFINITY;
    imp[n - 1] = f64::INFINITY;
    // Explicit stack: (first, last, cap from the parent).
    let mut stack = vec![(0usize, n - 1, f64::INFINITY)];
    while let Some((a, b, cap)) = stack.pop() {
        if b <= a + 1 {
            continue;
        }
        let (mut best, mut at) = (-1.0, a + 1);
        for i in a + 1..b {
            let d = segment_distance_sq(path[i], path[a], path[b]);
            if d > best {
                best = d;
                at = i;
            }
        }
        let d = best.sqrt().min(cap);
        imp[at] = d;
        stack.push((a, at, d));
        stack.push((at, b, d));
    }
    imp
}
