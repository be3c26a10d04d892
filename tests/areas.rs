//! Planar areas and the equal-area property against reference set A
//! (polygons.json, polygon_areas.csv: pyproj.Geod geodesic areas, pyproj
//! Albers + shoelace, and analytic box areas from Snyder 1987 eq. 3-12).

use hueproof::geo::measure::{polygon_area, ring_signed_area};
use hueproof::geo::projection::{Albers, Ellipsoid, EqualEarth, LambertAzimuthal, Projection};
use hueproof::geo::{Coord, Polygon};

fn fixture(name: &str) -> String {
    format!(
        "{}/tests/fixtures/reference/{name}",
        env!("CARGO_MANIFEST_DIR")
    )
}

fn polygons() -> Vec<(String, Vec<Coord>)> {
    let v: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(fixture("polygons.json")).unwrap()).unwrap();
    v["polygons"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| {
            let ring = p["lonlat"]
                .as_array()
                .unwrap()
                .iter()
                .map(|c| [c[0].as_f64().unwrap(), c[1].as_f64().unwrap()])
                .collect();
            (p["id"].as_str().unwrap().to_string(), ring)
        })
        .collect()
}

fn areas() -> Vec<csv::StringRecord> {
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(fixture("polygon_areas.csv"))
        .unwrap();
    rdr.records().map(|r| r.unwrap()).collect()
}

/// The fixture's densification: N = 1000 equal lon/lat steps per edge,
/// `lo0 + (lo1 - lo0) * (s / N)` for s = 0..N-1.
fn densify_1000(ring: &[Coord]) -> Vec<Coord> {
    let n = 1000;
    let mut out = Vec::new();
    for i in 0..ring.len() {
        let a = ring[i];
        let b = ring[(i + 1) % ring.len()];
        for s in 0..n {
            let t = s as f64 / n as f64;
            out.push([a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]);
        }
    }
    out
}

fn project(p: &Projection, ring: &[Coord]) -> Vec<Coord> {
    ring.iter()
        .map(|c| p.forward(c[0], c[1]).unwrap())
        .collect()
}

fn rel(a: f64, b: f64) -> f64 {
    ((a - b) / b).abs()
}

fn albers(e: Ellipsoid) -> Projection {
    Projection::Albers(Albers::new(29.5, 45.5, 23.0, -96.0, e).unwrap())
}

/// Our projection plus our shoelace against pyproj's projection plus the
/// same shoelace: relative 1e-9 (fixture README section 6), signed.
#[test]
fn shoelace_of_albers_matches_reference() {
    let polys = polygons();
    for r in areas() {
        let ring = &polys.iter().find(|(id, _)| id == &r[0]).unwrap().1;
        for (e, col_v, col_d) in [
            (Ellipsoid::wgs84(), 5, 6),
            (Ellipsoid::sphere(6_370_997.0), 8, 9),
        ] {
            let p = albers(e);
            let v = ring_signed_area(&project(&p, ring));
            let d = ring_signed_area(&project(&p, &densify_1000(ring)));
            let (rv, rd): (f64, f64) = (r[col_v].parse().unwrap(), r[col_d].parse().unwrap());
            assert!(rel(v, rv) < 1e-9, "{} vertices: {v} vs {rv}", &r[0]);
            assert!(rel(d, rd) < 1e-9, "{} densified: {d} vs {rd}", &r[0]);
        }
    }
}

/// The equal-area property for every equal-area projection: the densified
/// planar area equals the analytic ellipsoidal (or spherical) box area and
/// the densified geodesic area, relative 1e-6 (fixture README section 6).
#[test]
fn equal_area_projections_preserve_box_areas() {
    let polys = polygons();
    let wgs = Ellipsoid::wgs84();
    let projections = [
        albers(wgs),
        Projection::LambertAzimuthal(LambertAzimuthal::new(45.0, -100.0, 0.0, 0.0, wgs)),
        Projection::EqualEarth(EqualEarth {
            lon0: -60.0,
            ellipsoid: wgs,
        }),
    ];
    let mut checked = 0;
    for r in areas() {
        let ring = &polys.iter().find(|(id, _)| id == &r[0]).unwrap().1;
        let dense = densify_1000(ring);
        let geodesic_dense: f64 = r[4].parse().unwrap();
        let analytic: f64 = r[7].parse().unwrap();
        for p in &projections {
            let a = ring_signed_area(&project(p, &dense));
            assert!(
                rel(a, geodesic_dense) < 1e-6,
                "{} {:?}: {a} vs geodesic {geodesic_dense}",
                &r[0],
                p.name()
            );
            if analytic.is_finite() {
                assert!(rel(a, analytic) < 1e-6, "{}: {a} vs {analytic}", &r[0]);
                checked += 1;
            }
        }
        // The sphere of R = 6370997 against the spherical analytic box.
        let sph: f64 = r[10].parse().unwrap();
        if sph.is_finite() {
            let s = Ellipsoid::sphere(6_370_997.0);
            for p in [
                albers(s),
                Projection::EqualEarth(EqualEarth {
                    lon0: 0.0,
                    ellipsoid: s,
                }),
            ] {
                let a = ring_signed_area(&project(&p, &dense));
                assert!(rel(a, sph) < 1e-6, "{} sphere: {a} vs {sph}", &r[0]);
            }
        }
    }
    assert_eq!(checked, 4 * 3);
}

/// Reversing a ring flips the sign (box_co_like_cw), and the model's
/// polygon re-winds to counter-clockwise so its area is positive.
#[test]
fn orientation_and_rewinding() {
    let polys = polygons();
    let cw = &polys
        .iter()
        .find(|(id, _)| id == "box_co_like_cw")
        .unwrap()
        .1;
    let p = albers(Ellipsoid::wgs84());
    let signed = ring_signed_area(&project(&p, cw));
    assert!(signed < 0.0);
    let poly = Polygon::new(project(&p, cw), vec![]).unwrap();
    assert!((polygon_area(&poly) + signed).abs() < 1e-3);
}
