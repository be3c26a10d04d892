//! An interior label point: the pole of inaccessibility, the interior point
//! farthest from the polygon's boundary, found by a best-first search over
//! square cells (common practice for label placement).
//!
//! Method: cover the bounding box with square cells; each cell's centre has
//! a signed distance `d` to the boundary (positive inside) and no point in
//! the cell can beat `d + half-diagonal`. Cells are taken best-bound first
//! from a priority queue and split in four while their bound can improve
//! the best centre by more than the precision. The result is inside the
//! polygon whenever its distance is positive; if the search finds no
//! inside centre (slivers thinner than the precision), a scanline through
//! the polygon gives the midpoint of its widest inside span, which is also
//! inside. So the returned point always lies inside (or, for a polygon of
//! zero area, on) the shape.

use std::cmp::Ordering;
use std::collections::BinaryHeap;

use crate::geo::model::{Coord, Geometry, Polygon};

use super::area::{polygon_area, polygon_centroid};

/// Label point of a geometry: the pole of inaccessibility of its largest
/// polygon; for a geometry without polygons, the middle vertex of its
/// first line or its first point.
pub fn label_point(g: &Geometry) -> Option<Coord> {
    let largest = g
        .polygons
        .iter()
        .max_by(|a, b| polygon_area(a).total_cmp(&polygon_area(b)));
    if let Some(p) = largest {
        let (w, h) = bbox_size(p);
        let precision = (w.max(h) * 1e-3).max(f64::MIN_POSITIVE);
        return Some(pole_of_inaccessibility(p, precision).0);
    }
    if let Some(l) = g.lines.first() {
        return Some(l[l.len() / 2]);
    }
    g.points.first().copied()
}

struct Cell {
    c: Coord,
    half: f64,
    d: f64,
    bound: f64,
}

impl Cell {
    fn new(c: Coord, half: f64, p: &Polygon) -> Cell {
        let d = signed_distance(c, p);
        Cell {
            c,
            half,
            d,
            bound: d + half * std::f64::consts::SQRT_2,
        }
    }
}

impl PartialEq for Cell {
    fn eq(&self, o: &Self) -> bool {
        self.bound.total_cmp(&o.bound) == Ordering::Equal
    }
}
impl Eq for Cell {}
impl PartialOrd for Cell {
    fn partial_cmp(&self, o: &Self) -> Option<Ordering> {
        Some(self.cmp(o))
    }
}
impl Ord for Cell {
    fn cmp(&self, o: &Self) -> Ordering {
        self.bound.total_cmp(&o.bound)
    }
}

fn bbox(p: &Polygon) -> (Coord, Coord) {
    let mut lo = [f64::INFINITY; 2];
    let mut hi = [f64::NEG_INFINITY; 2];
    for &[x, y] in p.exterior() {
        lo = [lo[0].min(x), lo[1].min(y)];
        hi = [hi[0].max(x), hi[1].max(y)];
    }
    (lo, hi)
}

fn bbox_size(p: &Polygon) -> (f64, f64) {
    let (lo, hi) = bbox(p);
    (hi[0] - lo[0], hi[1] - lo[1])
}

/// The pole of inaccessibility of `p` within `precision` (same units as
/// the coordinates), and its distance to the boundary.
pub fn pole_of_inaccessibility(p: &Polygon, precision: f64) -> (Coord, f64) {
    let (lo, hi) = bbox(p);
    let (w, h) = (hi[0] - lo[0], hi[1] - lo[1]);
    let size = w.min(h);
    if size <= 0.0 {
        return (p.exterior()[0], 0.0);
    }
    let half = size / 2.0;
    let mut queue = BinaryHeap::new();
    let mut x = lo[0];
    while x < hi[0] {
        let mut y = lo[1];
        while y < hi[1] {
            queue.push(Cell::new([x + half, y + half], half, p));
            y += size;
        }
        x += size;
    }
    let mut best = Cell::new([lo[0] + w / 2.0, lo[1] + h / 2.0], 0.0, p);
    if let Some(c) = polygon_centroid(p) {
        let cc = Cell::new(c, 0.0, p);
        if cc.d > best.d {
            best = cc;
        }
    }
    // Bounded work: the precision and a split budget (smaller for rings
    // with many vertices, each split costs four distance scans) both stop
    // the search; the best centre so far is still inside.
    let mut budget = (8_000_000 / p.vertex_count().max(1)).clamp(16, 2_000);
    while let Some(cell) = queue.pop() {
        if cell.d > best.d {
            best = Cell {
                c: cell.c,
                half: 0.0,
                d: cell.d,
                bound: cell.d,
            };
        }
        if cell.bound - best.d <= precision || budget == 0 {
            // The queue is ordered by bound: nothing left can do better.
            break;
        }
        budget -= 1;
        let q = cell.half / 2.0;
        for (dx, dy) in [(-q, -q), (q, -q), (-q, q), (q, q)] {
            queue.push(Cell::new([cell.c[0] + dx, cell.c[1] + dy], q, p));
        }
    }
    if best.d > 0.0 {
        return (best.c, best.d);
    }
    let c = widest_span_midpoint(p).unwrap_or(p.exterior()[0]);
    (c, signed_distance(c, p).max(0.0))
}

/// Midpoint of the widest inside span over a few horizontal scanlines.
fn widest_span_midpoint(p: &Polygon) -> Option<Coord> {
    let (lo, hi) = bbox(p);
    let mut best: Option<(f64, Coord)> = None;
    for k in 1..64 {
        let y = lo[1] + (hi[1] - lo[1]) * (k as f64) / 64.0;
        let mut xs = Vec::new();
        for ring in p.rings() {
            let n = ring.len();
            for i in 0..n {
                let [x0, y0] = ring[i];
                let [x1, y1] = ring[(i + 1) % n];
                if (y0 > y) != (y1 > y) {
                    xs.push(x0 + (y - y0) / (y1 - y0) * (x1 - x0));
                }
            }
        }
        xs.sort_by(f64::total_cmp);
        for pair in xs.chunks_exact(2) {
            let w = pair[1] - pair[0];
            if best.is_none_or(|(bw, _)| w > bw) {
                best = Some((w, [(pair[0] + pair[1]) / 2.0, y]));
            }
        }
    }
    best.map(|(_, c)| c)
}

/// Distance from `c` to the polygon boundary, positive inside (even-odd
/// rule over all rings), negative outside.
pub fn signed_distance(c: Coord, p: &Polygon) -> f64 {
    let mut inside = false;
    let mut min_sq = f64::INFINITY;
    let [px, py] = c;
    for ring in p.rings() {
        let n = ring.len();
        for i in 0..n {
            let [ax, ay] = ring[i];
            let [bx, by] = ring[(i + 1) % n];
            if (ay > py) != (by > py) && px < (bx - ax) * (py - ay) / (by - ay) + ax {
                inside = !inside;
            }
            min_sq = min_sq.min(segment_distance_sq(c, ring[i], ring[(i + 1) % n]));
        }
    }
    let d = min_sq.sqrt();
    if inside { d } else { -d }
}

/// Squared distance from point `p` to segment `a`-`b`.
pub fn segment_distance_sq(p: Coord, a: Coord, b: Coord) -> f64 {
    let (dx, dy) = (b[0] - a[0], b[1] - a[1]);
    let len_sq = dx * dx + dy * dy;
    let t = if len_sq > 0.0 {
        (((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len_sq).clamp(0.0, 1.0)
    } else {
        0.0
    };
    let (ex, ey) = (a[0] + t * dx - p[0], a[1] + t * dy - p[1]);
    ex * ex + ey * ey
}
