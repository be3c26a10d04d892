//! Shoelace area and area-weighted centroid of planar rings and polygons.

use crate::geo::model::{Coord, Geometry, Polygon};

/// Signed area of an open ring by the shoelace formula,
/// ½ Σ (x_i·y_{i+1} − x_{i+1}·y_i): positive when counter-clockwise (y up).
///
/// Coordinates are taken relative to the first vertex, which gives the
/// same value in exact arithmetic and avoids cancellation far from the
/// origin (projected metres reach 1e7).
pub fn ring_signed_area(ring: &[Coord]) -> f64 {
    let n = ring.len();
    if n < 3 {
        return 0.0;
    }
    let [ox, oy] = ring[0];
    let mut s = 0.0;
    for i in 0..n {
        let [x0, y0] = ring[i];
        let [x1, y1] = ring[(i + 1) % n];
        s += (x0 - ox) * (y1 - oy) - (x1 - ox) * (y0 - oy);
    }
    s / 2.0
}

/// Area of a polygon: exterior minus holes (non-negative for a polygon in
/// the winding convention).
pub fn polygon_area(p: &Polygon) -> f64 {
    p.rings().map(ring_signed_area).sum()
}

/// Total polygon area of a geometry (lines and points add nothing).
pub fn geometry_area(g: &Geometry) -> f64 {
    g.polygons.iter().map(polygon_area).sum()
}

/// Area-weighted centroid of a polygon (holes subtract). `None` when the
/// area is zero.
pub fn polygon_centroid(p: &Polygon) -> Option<Coord> {
    let [ox, oy] = p.exterior()[0];
    let (mut a, mut cx, mut cy) = (0.0, 0.0, 0.0);
    for ring in p.rings() {
        let n = ring.len();
        for i in 0..n {
            let (x0, y0) = (ring[i][0] - ox, ring[i][1] - oy);
            let (x1, y1) = (ring[(i + 1) % n][0] - ox, ring[(i + 1) % n][1] - oy);
            let c = x0 * y1 - x1 * y0;
            a += c;
            cx += (x0 + x1) * c;
            cy += (y0 + y1) * c;
        }
    }
    if a == 0.0 {
        return None;
    }
    Some([ox + cx / (3.0 * a), oy + cy / (3.0 * a)])
}
