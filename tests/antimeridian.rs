//! Cutting at the meridian opposite the centre: areas are unchanged
//! (checked against the closed-form area of a spherical zone,
//! A = R²·Δλ·(sin φ2 − sin φ1), a textbook fact), no projected edge jumps
//! across the map, and neighbours cut on a shared edge get identical
//! vertices.

use hueproof::geo::measure::geometry_area;
use hueproof::geo::projection::{Albers, Ellipsoid, EqualEarth, Projection};
use hueproof::geo::{Geometry, Polygon};

const R: f64 = 6_371_007.0;

fn eqearth(lon0: f64) -> Projection {
    Projection::EqualEarth(EqualEarth {
        lon0,
        ellipsoid: Ellipsoid::sphere(R),
    })
}

fn poly(ring: Vec<[f64; 2]>) -> Geometry {
    Geometry {
        polygons: vec![Polygon::new(ring, vec![]).unwrap()],
        ..Geometry::default()
    }
}

fn max_jump(g: &Geometry) -> f64 {
    let mut m: f64 = 0.0;
    for p in &g.polygons {
        for r in p.rings() {
            for i in 0..r.len() {
                m = m.max((r[(i + 1) % r.len()][0] - r[i][0]).abs());
            }
        }
    }
    m
}

/// A 20° x 20° box over the antimeridian, densified along its parallels.
fn straddling_box() -> Geometry {
    let mut ring = Vec::new();
    for k in 0..=20 {
        ring.push([170.0 + k as f64, -10.0]);
    }
    for k in 0..=20 {
        ring.push([190.0 - k as f64, 10.0]);
    }
    // Write longitudes as a file would: in [-180, 180].
    let ring = ring
        .into_iter()
        .map(|[lon, lat]| [if lon > 180.0 { lon - 360.0 } else { lon }, lat])
        .collect();
    poly(ring)
}

#[test]
fn box_across_the_antimeridian_is_cut_without_changing_area() {
    let g = straddling_box();
    // Meridians curve in Equal Earth: densify so chords follow them.
    let cut = eqearth(0.0).project_geometry(&g, 0.05).unwrap();
    assert_eq!(cut.polygons.len(), 2);
    let whole = eqearth(180.0).project_geometry(&g, 0.05).unwrap();
    assert_eq!(whole.polygons.len(), 1);
    let (a_cut, a_whole) = (geometry_area(&cut), geometry_area(&whole));
    // Zone between -10 and 10 deg over 20 deg of longitude.
    let exact = R * R * 20f64.to_radians() * (2.0 * 10f64.to_radians().sin());
    assert!(((a_cut - exact) / exact).abs() < 1e-6, "{a_cut} vs {exact}");
    assert!(
        ((a_whole - exact) / exact).abs() < 1e-6,
        "{a_whole} vs {exact}"
    );
    // No edge runs across the map (the world is ~3.4e7 m wide).
    assert!(max_jump(&cut) < 2.5e6, "{}", max_jump(&cut));
    // Albers centred far away cuts it too.
    let albers =
        Projection::Albers(Albers::new(20.0, 50.0, 35.0, -5.0, Ellipsoid::sphere(R)).unwrap());
    let a = albers.project_geometry(&g, 0.05).unwrap();
    assert_eq!(a.polygons.len(), 2);
    assert!(((geometry_area(&a) - exact) / exact).abs() < 1e-6);
}

#[test]
fn polar_cap_closes_along_the_frame() {
    // A ring along 60 deg S round the whole globe, no pole vertices.
    let ring: Vec<[f64; 2]> = (0..36)
        .map(|k| [-180.0 + 10.0 * k as f64 + 5.0, -60.0])
        .collect();
    let g = Geometry {
        polygons: vec![Polygon::new(ring, vec![]).unwrap()],
        ..Geometry::default()
    };
    let p = eqearth(0.0).project_geometry(&g, 1.0).unwrap();
    let area = geometry_area(&p);
    let cap = 2.0 * std::f64::consts::PI * R * R * (1.0 - 60f64.to_radians().sin());
    // Meridian edges are chords of Equal Earth's curved frame, 1 deg apart.
    assert!(((area - cap) / cap).abs() < 1e-4, "{area} vs {cap}");
    assert!(max_jump(&p) < 2.5e6);
}

#[test]
fn neighbours_cut_on_a_shared_edge_get_identical_vertices() {
    // Two boxes sharing the edge at lat 0 from 175 E to 175 W.
    let south = poly(vec![
        [175.0, -5.0],
        [-175.0, -5.0],
        [-175.0, 0.0],
        [175.0, 0.0],
    ]);
    let north = poly(vec![
        [175.0, 0.0],
        [-175.0, 0.0],
        [-175.0, 5.0],
        [175.0, 5.0],
    ]);
    let ee = eqearth(0.0);
    let s = ee.project_geometry(&south, 0.0).unwrap();
    let n = ee.project_geometry(&north, 0.0).unwrap();
    let bits = |g: &Geometry| {
        let mut v: Vec<[u64; 2]> = g
            .polygons
            .iter()
            .flat_map(|p| p.exterior().to_vec())
            .filter(|c| c[1] == 0.0)
            .map(|c| [c[0].to_bits(), c[1].to_bits()])
            .collect();
        v.sort();
        v
    };
    assert_eq!(bits(&s), bits(&n));
    assert_eq!(bits(&s).len(), 4, "two cut points on each side plus ends");
}

#[test]
fn lines_are_split_at_the_cut() {
    let g = Geometry {
        lines: vec![vec![[170.0, 0.0], [-170.0, 0.0], [-160.0, 0.0]]],
        ..Geometry::default()
    };
    let p = eqearth(0.0).project_geometry(&g, 0.0).unwrap();
    assert_eq!(p.lines.len(), 2);
}
