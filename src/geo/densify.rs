//! Densification: split long edges into equal steps in the source
//! coordinates, so a projected edge follows the straight source line.

use super::model::{Coord, Polygon};

/// Insert vertices so that no step exceeds `max_step` (in both axes). A
/// closed path (`closed = true`) also densifies its closing edge.
pub fn densify_path(path: &[Coord], max_step: f64, closed: bool) -> Vec<Coord> {
    let n = path.len();
    let edges = if closed { n } else { n.saturating_sub(1) };
    let mut out = Vec::with_capacity(n);
    for i in 0..edges {
        let a = path[i];
        let b = path[(i + 1) % n];
        let span = (b[0] - a[0]).abs().max((b[1] - a[1]).abs());
        let steps = ((span / max_step).ceil() as usize).max(1);
        for s in 0..steps {
            let t = s as f64 / steps as f64;
            out.push([a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]);
        }
    }
    if !closed {
        if let Some(&last) = path.last() {
            out.push(last);
        }
    }
    out
}

/// Densify every ring of a polygon.
pub fn densify_polygon(p: &Polygon, max_step: f64) -> Polygon {
    Polygon {
        exterior: densify_path(p.exterior(), max_step, true),
        holes: p
            .holes()
            .iter()
            .map(|h| densify_path(h, max_step, true))
            .collect(),
    }
}
