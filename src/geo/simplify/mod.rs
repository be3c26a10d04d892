//! Topology-safe simplification in output units (pixels).
//!
//! Polygons are fitted to the output frame first, then their rings are
//! broken into arcs ([`arcs`]) so that a border shared by neighbours is
//! simplified once, with its end junctions fixed, and every ring is rebuilt
//! from the same simplified arcs: no gap or sliver can open between
//! neighbours. Each arc vertex gets an importance from Douglas-Peucker or
//! Visvalingam-Whyatt; a vertex stays when its importance exceeds the
//! tolerance (pixels for Douglas-Peucker, square pixels t² for
//! Visvalingam-Whyatt). A ring that would fall below a triangle gets back
//! its most important vertices (in the shared arcs, so its neighbours get
//! them too). Shapes smaller than a threshold area are kept and reported.
//!
//! Not guarded against: a simplified arc may cross itself or a neighbour
//! when the tolerance is large compared with the gaps between borders.
//! Lines are simplified one by one, outside the topology.

pub mod arcs;
pub mod douglas_peucker;
pub mod visvalingam_whyatt;

use serde::Serialize;

use crate::geo::measure::geometry_area;
use crate::geo::model::{Coord, Geometry, Polygon};

/// The simplification method.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum Method {
    /// Douglas & Peucker (1973); tolerance is a distance.
    DouglasPeucker,
    /// Visvalingam & Whyatt (1993); tolerance squared is an area.
    VisvalingamWhyatt,
}

impl Method {
    /// The command-line and JSON spelling.
    pub fn as_str(self) -> &'static str {
        match self {
            Method::DouglasPeucker => "douglas-peucker",
            Method::VisvalingamWhyatt => "visvalingam-whyatt",
        }
    }
}

/// What simplification did.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SimplifyReport {
    /// The method.
    pub method: Method,
    /// Tolerance in output units (pixels).
    pub tolerance: f64,
    /// Vertices before (polygons and lines).
    pub vertices_in: usize,
    /// Vertices after.
    pub vertices_out: usize,
    /// Number of distinct arcs.
    pub arcs: usize,
    /// Indices (into the input slice) of geometries whose polygon area is
    /// below the tiny-shape threshold; they are kept, not dropped.
    pub tiny: Vec<usize>,
}

fn importance(method: Method, path: &[Coord]) -> Vec<f64> {
    match method {
        Method::DouglasPeucker => douglas_peucker::importance(path),
        Method::VisvalingamWhyatt => visvalingam_whyatt::importance(path),
    }
}

/// Importance of each vertex of an arc; a closed arc is split at its first
/// vertex and the vertex farthest from it, both fixed.
fn arc_importance(method: Method, arc: &[Coord], closed: bool) -> Vec<f64> {
    if !closed {
        return importance(method, arc);
    }
    let n = arc.len();
    let far = (1..n)
        .max_by(|&a, &b| {
            let d = |i: usize| (arc[i][0] - arc[0][0]).powi(2) + (arc[i][1] - arc[0][1]).powi(2);
            d(a).total_cmp(&d(b))
        })
        .unwrap_or(0);
    let first: Vec<Coord> = arc[..=far].to_vec();
    let mut second: Vec<Coord> = arc[far..].to_vec();
    second.push(arc[0]);
    let mut imp = importance(method, &first);
    let imp2 = importance(method, &second);
    imp.extend_from_slice(&imp2[1..imp2.len() - 1]);
    imp
}

/// Simplify polygon geometries (already in output units) together, so
/// that shared borders stay shared. `tiny_area` is the area (output units
/// squared) below which a shape is reported as tiny.
pub fn simplify(
    geoms: &[Geometry],
    method: Method,
    tolerance: f64,
    tiny_area: f64,
) -> (Vec<Geometry>, SimplifyReport) {
    // Every ring, with where it came from.
    let mut rings = Vec::new();
    for g in geoms {
        for p in &g.polygons {
            for r in p.rings() {
                rings.push(r.to_vec());
            }
        }
    }
    let topo = arcs::build(&rings);
    let threshold = match method {
        Method::DouglasPeucker => tolerance,
        Method::VisvalingamWhyatt => tolerance * tolerance,
    };
    let imps: Vec<Vec<f64>> = topo
        .arcs
        .iter()
        .zip(&topo.closed)
        .map(|(a, &c)| arc_importance(method, a, c))
        .collect();
    let mut kept: Vec<Vec<bool>> = imps
        .iter()
        .map(|v| v.iter().map(|&i| i > threshold).collect())
        .collect();
    // Rings never fall below a triangle: restore the most important
    // dropped vertices of their arcs (shared arcs restore for both sides).
    for ri in 0..topo.rings.len() {
        loop {
            let count = topo.ring(ri, &|a, v| kept[a][v]).len();
            if count >= 3 {
                break;
            }
            let best = topo.rings[ri]
                .iter()
                .flat_map(|r| (0..imps[r.arc].len()).map(move |v| (r.arc, v)))
                .filter(|&(a, v)| !kept[a][v])
                .max_by(|x, y| imps[x.0][x.1].total_cmp(&imps[y.0][y.1]));
            match best {
                Some((a, v)) => kept[a][v] = true,
                None => break,
            }
        }
    }
    let mut out = Vec::with_capacity(geoms.len());
    let mut next_ring = 0;
    let (mut vin, mut vout) = (0, 0);
    let mut tiny = Vec::new();
    for (gi, g) in geoms.iter().enumerate() {
        let mut polygons = Vec::with_capacity(g.polygons.len());
        for p in &g.polygons {
            let nr = 1 + p.holes().len();
            let mut rs: Vec<Vec<Coord>> = (next_ring..next_ring + nr)
                .map(|i| topo.ring(i, &|a, v| kept[a][v]))
                .collect();
            next_ring += nr;
            vin += p.vertex_count();
            vout += rs.iter().map(Vec::len).sum::<usize>();
            let exterior = rs.remove(0);
            polygons.push(Polygon {
                exterior,
                holes: rs,
            });
        }
        let lines: Vec<Vec<Coord>> = g
            .lines
            .iter()
            .map(|l| {
                let imp = importance(method, l);
                l.iter()
                    .zip(&imp)
                    .filter(|(_, i)| **i > threshold)
                    .map(|(c, _)| *c)
                    .collect()
            })
            .collect();
        vin += g.lines.iter().map(Vec::len).sum::<usize>();
        vout += lines.iter().map(Vec::len).sum::<usize>();
        let sg = Geometry {
            polygons,
            lines,
            points: g.points.clone(),
        };
        if !g.polygons.is_empty() && geometry_area(&sg).abs() < tiny_area {
            tiny.push(gi);
        }
        out.push(sg);
    }
    let report = SimplifyReport {
        method,
        tolerance,
        vertices_in: vin,
        vertices_out: vout,
        arcs: topo.arcs.len(),
        tiny,
    };
    (out, report)
}
