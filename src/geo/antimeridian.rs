//! Cutting geometry at the meridian opposite the central meridian
//! (λ0 + 180°), so a world map draws without streaks across the frame.
//!
//! Each ring is unwrapped into continuous longitudes relative to λ0 (every
//! step taken the short way round). A ring whose unwrapped longitudes end
//! 360° away from where they began goes round a pole: it is closed along
//! the frame through that pole (the pole nearer to the ring's mean
//! latitude). The ring is then clipped (Sutherland-Hodgman) to each 360°
//! strip it touches and every piece is shifted back into [−180°, 180°]
//! relative to λ0. Edges created along the cut meridian and along a pole
//! get a vertex every degree, so they follow the frame in curved
//! projections. A concave ring can yield a piece joined by zero-width
//! runs along the cut meridian; they enclose no area and lie on the frame.
//! Intersections are computed from the edge's endpoints in a fixed order,
//! so two neighbours cut at the same place get bit-identical vertices.

use super::model::{Coord, Polygon};

/// Unwrap a path to longitudes relative to `lon0`, each step under 180°.
/// The first vertex is put on the branch nearest `near`.
fn unwrap(path: &[Coord], lon0: f64, near: f64) -> Vec<Coord> {
    let mut out = Vec::with_capacity(path.len());
    let mut prev: Option<f64> = None;
    for &[lon, lat] in path {
        let mut rel = lon - lon0;
        let target = prev.unwrap_or(near);
        rel += 360.0 * ((target - rel) / 360.0).round();
        out.push([rel, lat]);
        prev = Some(rel);
    }
    out
}

fn inside_range(path: &[Coord]) -> bool {
    path.iter().all(|c| (-180.0..=180.0).contains(&c[0]))
}

/// Where segment a-b crosses x = `x`, computed from the endpoints in
/// lexicographic order so that a-b and b-a give the same bits.
fn cross(a: Coord, b: Coord, x: f64) -> Coord {
    let (p, q) = if (a[0], a[1]) <= (b[0], b[1]) {
        (a, b)
    } else {
        (b, a)
    };
    let t = (x - p[0]) / (q[0] - p[0]);
    [x, p[1] + t * (q[1] - p[1])]
}

/// Clip a closed ring to x >= lo (keep_above) or x <= hi.
fn clip_half(ring: &[Coord], x: f64, keep_above: bool) -> Vec<Coord> {
    let inside = |c: Coord| if keep_above { c[0] >= x } else { c[0] <= x };
    let n = ring.len();
    let mut out = Vec::new();
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        match (inside(a), inside(b)) {
            (true, true) => out.push(b),
            (true, false) => out.push(cross(a, b, x)),
            (false, true) => {
                out.push(cross(a, b, x));
                out.push(b);
            }
            (false, false) => {}
        }
    }
    out.dedup();
    out
}

/// Insert a vertex every degree between consecutive vertices that both lie
/// on the line x = `x0` or x = `x1`, or both on a pole.
fn densify_frame_edges(ring: &[Coord], x0: f64, x1: f64) -> Vec<Coord> {
    let n = ring.len();
    let mut out = Vec::with_capacity(n);
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        out.push(a);
        let on_meridian = (a[0] == x0 && b[0] == x0) || (a[0] == x1 && b[0] == x1);
        let on_pole = a[1].abs() == 90.0 && a[1] == b[1];
        if on_meridian || on_pole {
            let span = (b[0] - a[0]).abs().max((b[1] - a[1]).abs());
            let steps = span.ceil() as usize;
            for s in 1..steps {
                let t = s as f64 / steps as f64;
                out.push([a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]);
            }
        }
    }
    out
}

fn strips(ring: &[Coord]) -> std::ops::RangeInclusive<i64> {
    let lo = ring.iter().map(|c| c[0]).fold(f64::INFINITY, f64::min);
    let hi = ring.iter().map(|c| c[0]).fold(f64::NEG_INFINITY, f64::max);
    let m0 = ((lo + 180.0) / 360.0).floor() as i64;
    let m1 = ((hi - 180.0) / 360.0).ceil() as i64;
    m0.min(m1)..=m1.max(m0)
}

/// Clip an unwrapped ring to strip `m` and shift it back to absolute
/// longitudes. `None` when nothing (or less than a triangle) is left.
fn piece(ring: &[Coord], m: i64, lon0: f64) -> Option<Vec<Coord>> {
    let (lo, hi) = (-180.0 + 360.0 * m as f64, 180.0 + 360.0 * m as f64);
    let r = clip_half(&clip_half(ring, lo, true), hi, false);
    if r.len() < 3 || crate::geo::measure::ring_signed_area(&r) == 0.0 {
        return None;
    }
    let r = densify_frame_edges(&r, lo, hi);
    let shift = 360.0 * m as f64;
    Some(r.iter().map(|c| [c[0] - shift + lon0, c[1]]).collect())
}

/// Close a ring that goes round a pole along the frame through the pole.
fn close_polar(ring: &mut Vec<Coord>, drift: f64) {
    let mean_lat = ring.iter().map(|c| c[1]).sum::<f64>() / ring.len() as f64;
    let pole = if mean_lat >= 0.0 { 90.0 } else { -90.0 };
    let first = ring[0];
    let end = [first[0] + drift, first[1]];
    ring.push(end);
    ring.push([end[0], pole]);
    ring.push([first[0], pole]);
}

/// Cut one polygon for a map centred on `lon0`. Polygons that need no cut
/// come back unchanged (the same coordinates, bit for bit).
pub fn cut_polygon(p: &Polygon, lon0: f64) -> Vec<Polygon> {
    let mut ext = unwrap(p.exterior(), lon0, 0.0);
    let n = ext.len();
    // Drift: the total longitude travelled round the closed ring, each
    // step (the closing one too) taken the short way: 0 or ±360°.
    let (first, last) = (ext[0][0], ext[n - 1][0]);
    let drift = -360.0 * ((first - last) / 360.0).round();
    let centre = (ext.iter().map(|c| c[0]).fold(f64::INFINITY, f64::min)
        + ext.iter().map(|c| c[0]).fold(f64::NEG_INFINITY, f64::max))
        / 2.0;
    let holes: Vec<Vec<Coord>> = p.holes().iter().map(|h| unwrap(h, lon0, centre)).collect();
    if drift == 0.0 && inside_range(&ext) && holes.iter().all(|h| inside_range(h)) {
        return vec![p.clone()];
    }
    if drift != 0.0 {
        close_polar(&mut ext, drift);
    }
    let mut out = Vec::new();
    for m in strips(&ext) {
        let Some(e) = piece(&ext, m, lon0) else {
            continue;
        };
        let hs: Vec<Vec<Coord>> = holes.iter().filter_map(|h| piece(h, m, lon0)).collect();
        if let Some(poly) = Polygon::new(e, hs) {
            out.push(poly);
        }
    }
    out
}

/// Cut a line where it crosses λ0 + 180°, into pieces.
pub fn cut_line(line: &[Coord], lon0: f64) -> Vec<Vec<Coord>> {
    let rel = unwrap(line, lon0, 0.0);
    if inside_range(&rel) {
        return vec![line.to_vec()];
    }
    let strip = |x: f64| ((x + 180.0) / 360.0).floor() as i64;
    let mut out = Vec::new();
    let mut cur: Vec<Coord> = Vec::new();
    let mut m = strip(rel[0][0]);
    let abs = |c: Coord, m: i64| [c[0] - 360.0 * m as f64 + lon0, c[1]];
    cur.push(abs(rel[0], m));
    for w in rel.windows(2) {
        let (a, b) = (w[0], w[1]);
        let mb = strip(b[0]);
        if mb != m {
            let x = if mb > m {
                180.0 + 360.0 * m as f64
            } else {
                -180.0 + 360.0 * m as f64
            };
            let c = cross(a, b, x);
            cur.push(abs(c, m));
            out.push(std::mem::take(&mut cur));
            m = mb;
            cur.push(abs(c, m));
        }
        cur.push(abs(b, m));
    }
    out.push(cur);
    out.retain(|l| l.len() >= 2);
    out
}
