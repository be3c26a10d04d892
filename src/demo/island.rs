//! The invented island: its coastline, its districts (Voronoi cells of
//! seeded sites, each cell computed by half-plane clipping of the coastline
//! with Sutherland-Hodgman, so O(n²) half-planes for n districts), its
//! terrain, a lake and two rivers.
//!
//! Geometry is built in a local plane centred on the island, x = (lon −
//! lon0)·cos(lat0) and y = lat − lat0 (degrees of latitude), so cells look
//! even on a map; every vertex then goes to lon/lat through one function
//! and is rounded to 1e-6° (about 0.1 m). Vertices that two districts
//! share are merged before rounding, so both write the very same numbers;
//! the points where district borders meet the coast are inserted into the
//! coastline, so the districts tile the refined outline exactly.

use super::sutherland_hodgman::{Tag, Vertex, clip_half_plane};
use crate::geo::measure::area::ring_signed_area;
use crate::geo::measure::inaccessibility::signed_distance;
use crate::geo::model::Polygon;
use crate::random::SplitMix64;

/// Centre of the island, longitude (open South Pacific, far from land).
pub const LON0: f64 = -125.0;
/// Centre of the island, latitude.
pub const LAT0: f64 = -35.0;
/// Mean radius of the island in the local plane (degrees of latitude).
pub const RADIUS: f64 = 1.7;
/// Vertices of the coastline before refinement.
const COAST_VERTICES: usize = 160;
/// Merge tolerance for vertices computed twice (local degrees).
const MERGE_TOLERANCE: f64 = 1e-9;

/// A point in the local plane.
pub(crate) type Local = [f64; 2];

/// A stream of numbers for one part of the scenario, independent of the
/// others so that changing one part leaves the rest as it was.
pub(crate) fn stream(seed: u64, part: u64) -> SplitMix64 {
    SplitMix64(crate::random::finalize(
        seed ^ part.wrapping_mul(0x9E37_79B9_7F4A_7C15),
    ))
}

/// A standard normal deviate (Box-Muller).
pub(crate) fn normal(rng: &mut SplitMix64) -> f64 {
    let (u1, u2) = (rng.uniform(), rng.uniform());
    (-2.0 * u1.ln()).sqrt() * (std::f64::consts::TAU * u2).cos()
}

/// Local plane to lon/lat, rounded to 1e-6 degree.
pub(crate) fn to_lonlat(p: Local) -> [f64; 2] {
    let round6 = |v: f64| (v * 1e6).round() / 1e6;
    [
        round6(LON0 + p[0] / LAT0.to_radians().cos()),
        round6(LAT0 + p[1]),
    ]
}

/// The coastline: a star-shaped ring (counter-clockwise, open) whose
/// radius is a sum of seeded harmonics, large ones for the shape and small
/// ones for the detail of a coast. The amplitudes add up to less than 0.4,
/// so the radius stays positive and the ring is simple.
pub(crate) fn coastline(seed: u64) -> Vec<Local> {
    let mut rng = stream(seed, 1);
    let harmonics: Vec<(f64, f64, f64)> = (2..=24)
        .map(|h| {
            let h = h as f64;
            let scale = if h < 10.0 {
                0.22 / h.powf(1.2)
            } else {
                0.22 / h.powf(1.5)
            };
            let amplitude = scale * (0.4 + 0.6 * rng.uniform());
            (h, amplitude, std::f64::consts::TAU * rng.uniform())
        })
        .collect();
    (0..COAST_VERTICES)
        .map(|k| {
            let theta = std::f64::consts::TAU * k as f64 / COAST_VERTICES as f64;
            let r = RADIUS
                * (1.0
                    + harmonics
                        .iter()
                        .map(|(h, a, phi)| a * (h * theta + phi).cos())
                        .sum::<f64>());
            [r * theta.cos(), r * theta.sin()]
        })
        .collect()
}

/// The island as a polygon in the local plane (for distances).
pub(crate) fn island_polygon(coast: &[Local]) -> Polygon {
    Polygon::new(coast.to_vec(), vec![]).expect("the coastline has 160 vertices")
}

/// `count` points inside the island at least `margin` from the coast and
/// at least `spacing` from each other, by rejection; `None` if the
/// attempts run out.
pub(crate) fn scatter(
    rng: &mut SplitMix64,
    island: &Polygon,
    count: usize,
    margin: f64,
    spacing: f64,
) -> Option<Vec<Local>> {
    let mut pts: Vec<Local> = Vec::with_capacity(count);
    let extent = RADIUS * 1.45;
    for _ in 0..count * 400 {
        if pts.len() == count {
            break;
        }
        let p = [
            (rng.uniform() * 2.0 - 1.0) * extent,
            (rng.uniform() * 2.0 - 1.0) * extent,
        ];
        if signed_distance(p, island) < margin {
            continue;
        }
        let d2 = spacing * spacing;
        if pts
            .iter()
            .any(|q| (q[0] - p[0]).powi(2) + (q[1] - p[1]).powi(2) < d2)
        {
            continue;
        }
        pts.push(p);
    }
    (pts.len() == count).then_some(pts)
}

/// The districts and the refined coastline, in lon/lat.
pub(crate) struct Tessellation {
    /// One open counter-clockwise ring per district, in lon/lat.
    pub rings: Vec<Vec<[f64; 2]>>,
    /// The coastline with every border end inserted (open, CCW, lon/lat).
    pub outline: Vec<[f64; 2]>,
}

/// Clip the coastline to the Voronoi cell of each site. Returns `None` when
/// some district is not one simple ring of a reasonable size (the caller
/// tries the next seed).
pub(crate) fn tessellate(coast: &[Local], sites: &[Local]) -> Option<Tessellation> {
    let m = coast.len();
    let subject: Vec<Vertex> = coast
        .iter()
        .enumerate()
        .map(|(k, &p)| Vertex {
            p,
            tag: Tag::Outline(k),
        })
        .collect();
    let cells: Vec<Vec<Vertex>> = sites
        .iter()
        .enumerate()
        .map(|(i, si)| {
            let mut ring = subject.clone();
            for (j, sj) in sites.iter().enumerate() {
                if i == j || ring.is_empty() {
                    continue;
                }
                // Closer to si than to sj: (sj - si) . p <= (|sj|² - |si|²) / 2.
                let n = [sj[0] - si[0], sj[1] - si[1]];
                let c = (sj[0] * sj[0] + sj[1] * sj[1] - si[0] * si[0] - si[1] * si[1]) / 2.0;
                ring = clip_half_plane(&ring, n, c, m);
            }
            ring
        })
        .collect();

    // One canonical point per cluster of near-equal points, in a fixed
    // order: the coastline first, then the cells in order.
    let mut canon: Vec<Local> = coast.to_vec();
    let id_of = |p: Local, canon: &mut Vec<Local>| -> usize {
        let tol2 = MERGE_TOLERANCE * MERGE_TOLERANCE;
        match canon
            .iter()
            .position(|q| (q[0] - p[0]).powi(2) + (q[1] - p[1]).powi(2) <= tol2)
        {
            Some(i) => i,
            None => {
                canon.push(p);
                canon.len() - 1
            }
        }
    };
    let mut cell_ids: Vec<Vec<usize>> = Vec::with_capacity(cells.len());
    let mut coast_points: Vec<Vec<usize>> = vec![Vec::new(); m];
    for cell in &cells {
        let mut ids = Vec::with_capacity(cell.len());
        for v in cell {
            let id = match v.tag {
                Tag::Outline(k) => k,
                _ => id_of(v.p, &mut canon),
            };
            if let Tag::Coast(k) = v.tag {
                coast_points[k].push(id);
            }
            ids.push(id);
        }
        cell_ids.push(ids);
    }
    let lonlat: Vec<[f64; 2]> = canon.iter().map(|&p| to_lonlat(p)).collect();
    // Distinct clusters must stay distinct after rounding.
    let mut sorted: Vec<(u64, u64)> = lonlat
        .iter()
        .map(|p| (p[0].to_bits(), p[1].to_bits()))
        .collect();
    sorted.sort_unstable();
    if sorted.windows(2).any(|w| w[0] == w[1]) {
        return None;
    }

    let mut outline_ids = Vec::new();
    for (k, pts) in coast_points.iter_mut().enumerate() {
        outline_ids.push(k);
        let a = coast[k];
        let b = coast[(k + 1) % m];
        let t = |id: usize| {
            let p = canon[id];
            (p[0] - a[0]) * (b[0] - a[0]) + (p[1] - a[1]) * (b[1] - a[1])
        };
        pts.sort_by(|&x, &y| t(x).total_cmp(&t(y)));
        pts.dedup();
        outline_ids.extend(pts.iter().copied());
    }
    let outline: Vec<[f64; 2]> = outline_ids.iter().map(|&i| lonlat[i]).collect();

    let mut rings = Vec::with_capacity(cells.len());
    for ids in &cell_ids {
        let mut ids = ids.clone();
        ids.dedup();
        while ids.len() > 1 && ids.first() == ids.last() {
            ids.pop();
        }
        let ring: Vec<[f64; 2]> = ids.iter().map(|&i| lonlat[i]).collect();
        rings.push(ring);
    }
    let total: f64 = ring_signed_area(&outline);
    let mean = total / sites.len() as f64;
    let ok = rings
        .iter()
        .all(|r| r.len() >= 3 && ring_signed_area(r) > 0.2 * mean && is_simple(r));
    if !ok || !is_simple(&outline) {
        return None;
    }
    Some(Tessellation { rings, outline })
}

/// Whether an open ring has no repeated vertex and no two non-adjacent
/// edges that touch or cross.
pub(crate) fn is_simple(ring: &[[f64; 2]]) -> bool {
    let n = ring.len();
    if n < 3 {
        return false;
    }
    let orient = |a: [f64; 2], b: [f64; 2], c: [f64; 2]| {
        let v = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
        if v > 0.0 {
            1
        } else if v < 0.0 {
            -1
        } else {
            0
        }
    };
    let on_segment = |a: [f64; 2], b: [f64; 2], p: [f64; 2]| {
        p[0] >= a[0].min(b[0])
            && p[0] <= a[0].max(b[0])
            && p[1] >= a[1].min(b[1])
            && p[1] <= a[1].max(b[1])
    };
    let touches = |a, b, c, d| {
        let (o1, o2, o3, o4) = (
            orient(a, b, c),
            orient(a, b, d),
            orient(c, d, a),
            orient(c, d, b),
        );
        (o1 * o2 < 0 && o3 * o4 < 0)
            || (o1 == 0 && on_segment(a, b, c))
            || (o2 == 0 && on_segment(a, b, d))
            || (o3 == 0 && on_segment(c, d, a))
            || (o4 == 0 && on_segment(c, d, b))
    };
    for i in 0..n {
        let (a, b) = (ring[i], ring[(i + 1) % n]);
        if a == b {
            return false;
        }
        for j in i + 1..n {
            let adjacent = j == i + 1 || (i == 0 && j == n - 1);
            if adjacent {
                continue;
            }
            if touches(a, b, ring[j], ring[(j + 1) % n]) {
                return false;
            }
        }
    }
    true
}

/// Terrain height in metres at a local point: a main massif and a second
/// hill, tapering to sea level at the coast.
pub(crate) struct Terrain {
    peak: Local,
    hill: Local,
    island: Polygon,
}

impl Terrain {
    pub(crate) fn new(seed: u64, island: Polygon) -> Terrain {
        let mut rng = stream(seed, 3);
        let mut at = |reach: f64| {
            let a = std::f64::consts::TAU * rng.uniform();
            let r = reach * RADIUS * rng.uniform().sqrt();
            [r * a.cos(), r * a.sin()]
        };
        let peak = at(0.3);
        let hill = at(0.6);
        Terrain { peak, hill, island }
    }

    /// Elevation in metres (0 at and beyond the coast).
    pub(crate) fn elevation(&self, p: Local) -> f64 {
        let g = |c: Local, w: f64| {
            (-((p[0] - c[0]).powi(2) + (p[1] - c[1]).powi(2)) / (w * RADIUS).powi(2)).exp()
        };
        let coast = signed_distance(p, &self.island);
        let taper = (coast / (0.15 * RADIUS)).clamp(0.0, 1.0).sqrt();
        (1350.0 * g(self.peak, 0.5) + 420.0 * g(self.hill, 0.3) + 40.0) * taper
    }

    /// Distance to the coast (local degrees, positive inside).
    pub(crate) fn coast_distance(&self, p: Local) -> f64 {
        signed_distance(p, &self.island)
    }

    /// The highest point.
    pub(crate) fn peak(&self) -> Local {
        self.peak
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn simple_ring_check_rejects_crossings_touches_and_repeats() {
        let square = [[0.0, 0.0], [1.0, 0.0], [1.0, 1.0], [0.0, 1.0]];
        assert!(is_simple(&square));
        let bow_tie = [[0.0, 0.0], [1.0, 1.0], [1.0, 0.0], [0.0, 1.0]];
        assert!(!is_simple(&bow_tie));
        // Out and back along a line: what clipping leaves when a cell cuts
        // the island in two.
        let corridor = [
            [0.0, 0.0],
            [1.0, 0.0],
            [1.0, 1.0],
            [2.0, 1.0],
            [2.0, 2.0],
            [1.0, 2.0],
            [1.0, 1.0],
            [0.0, 1.0],
        ];
        assert!(!is_simple(&corridor));
        assert!(!is_simple(&[
            [0.0, 0.0],
            [1.0, 0.0],
            [1.0, 0.0],
            [0.0, 1.0]
        ]));
    }

    #[test]
    fn the_coastline_is_star_shaped_and_counter_clockwise() {
        let c = coastline(7);
        assert!(ring_signed_area(&c) > 0.0);
        let lonlat: Vec<[f64; 2]> = c.iter().map(|&p| to_lonlat(p)).collect();
        assert!(is_simple(&lonlat));
        for p in &c {
            let r = (p[0] * p[0] + p[1] * p[1]).sqrt();
            assert!((0.6 * RADIUS..1.4 * RADIUS).contains(&r), "{r}");
        }
    }
}
