//! Projection values against an outside reference: pyproj 3.7.2 (PROJ
//! 9.5.1) forward projections and Snyder (1987) worked examples, copied
//! into tests/fixtures/reference (provenance in tests/fixtures/README.md).

use hueproof::geo::projection::{
    Albers, Ellipsoid, EqualEarth, LambertAzimuthal, Projection, WEB_MERCATOR_MAX_LAT, WebMercator,
    wrap_lambda,
};

fn rows(name: &str) -> Vec<csv::StringRecord> {
    let path = format!(
        "{}/tests/fixtures/reference/{name}",
        env!("CARGO_MANIFEST_DIR")
    );
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .flexible(true)
        .from_path(&path)
        .unwrap();
    rdr.records().map(|r| r.unwrap()).collect()
}

/// The seven definitions of reference set A (projection_definitions.csv).
fn reference_projection(id: &str) -> Projection {
    let wgs = Ellipsoid::wgs84();
    match id {
        "aea_wgs84" => Projection::Albers(Albers::new(29.5, 45.5, 23.0, -96.0, wgs).unwrap()),
        "aea_sphere" => Projection::Albers(
            Albers::new(29.5, 45.5, 23.0, -96.0, Ellipsoid::sphere(6_370_997.0)).unwrap(),
        ),
        "laea_wgs84" => Projection::LambertAzimuthal(LambertAzimuthal::new(
            52.0,
            10.0,
            4_321_000.0,
            3_210_000.0,
            wgs,
        )),
        "laea_sphere" => Projection::LambertAzimuthal(LambertAzimuthal::new(
            52.0,
            10.0,
            0.0,
            0.0,
            Ellipsoid::sphere(6_371_007.0),
        )),
        "eqearth_wgs84" => Projection::EqualEarth(EqualEarth {
            lon0: 0.0,
            ellipsoid: wgs,
        }),
        "eqearth_sphere" => Projection::EqualEarth(EqualEarth {
            lon0: 0.0,
            ellipsoid: Ellipsoid::sphere(6_371_007.0),
        }),
        "webmerc_epsg3857" => Projection::WebMercator(WebMercator { lon0: 0.0 }),
        other => panic!("unknown projection {other}"),
    }
}

/// Every `ok` row of projections.csv within 1e-5 m (the file's stated
/// tolerance, well inside the 1 mm asked for on the ellipsoid); the
/// ill-conditioned LAEA south pole within 0.5 m, as the file advises.
#[test]
fn forward_projections_match_pyproj() {
    let mut checked = 0;
    for r in rows("projections.csv") {
        let (point, lon, lat, id, status) = (
            &r[0],
            r[1].parse::<f64>().unwrap(),
            r[2].parse::<f64>().unwrap(),
            &r[3],
            &r[6],
        );
        let p = reference_projection(id);
        let got = p.forward(lon, lat);
        match status {
            "ok" | "ill_conditioned" => {
                let (x, y): (f64, f64) = (r[4].parse().unwrap(), r[5].parse().unwrap());
                let [gx, gy] = got.unwrap_or_else(|| panic!("{point} {id}: no value"));
                let tol = if status == "ok" { 1e-5 } else { 0.5 };
                assert!(
                    (gx - x).abs() <= tol && (gy - y).abs() <= tol,
                    "{point} {id}: got ({gx}, {gy}), pyproj ({x}, {y})"
                );
                checked += 1;
            }
            "undefined" if id == "webmerc_epsg3857" => {
                // PROJ has no meaningful value at the poles. We clamp the
                // latitude to the published limit instead (documented), so
                // a pole lands on the frame edge y = ±πR.
                let [_, gy] = got.unwrap();
                let edge = std::f64::consts::PI * WebMercator::R;
                assert!((gy.abs() - edge).abs() < 1e-6, "{point}: {gy}");
            }
            "undefined" => assert!(got.is_none(), "{point} {id}: expected no value"),
            s => panic!("unexpected status {s}"),
        }
    }
    assert_eq!(checked, 72 * 7 - 4);
}

fn clarke1866() -> Ellipsoid {
    // PROJ's clrk66: a = 6378206.4 m, b = 6356583.8 m.
    let (a, b) = (6_378_206.4f64, 6_356_583.8f64);
    Ellipsoid::new(a, 1.0 - (b * b) / (a * a))
}

/// Snyder (1987) Appendix A examples: our values against pyproj's to 1e-9
/// on the unit/small spheres and 1e-5 m on the ellipsoids, and against
/// Snyder's printed digits (recalled from memory, see the fixture README)
/// to half a unit in the last printed digit.
#[test]
fn snyder_worked_examples() {
    for r in rows("snyder1987_examples.csv") {
        let id = &r[0];
        let lon: f64 = r[2].parse().unwrap();
        let lat: f64 = r[3].parse().unwrap();
        let sx: f64 = r[4].parse().unwrap();
        let sy: f64 = r[5].parse().unwrap();
        let px: f64 = r[6].parse().unwrap();
        let py: f64 = r[7].parse().unwrap();
        let (p, tol_py, tol_snyder) = match id {
            "albers_sphere" => (
                Projection::Albers(
                    Albers::new(29.5, 45.5, 23.0, -96.0, Ellipsoid::sphere(1.0)).unwrap(),
                ),
                1e-9,
                5e-8,
            ),
            "albers_clarke1866" => (
                Projection::Albers(Albers::new(29.5, 45.5, 23.0, -96.0, clarke1866()).unwrap()),
                1e-5,
                0.05,
            ),
            "albers_snyder_es" => (
                Projection::Albers(
                    Albers::new(
                        29.5,
                        45.5,
                        23.0,
                        -96.0,
                        Ellipsoid::new(6_378_206.4, 0.00676866),
                    )
                    .unwrap(),
                ),
                1e-5,
                0.05,
            ),
            "laea_sphere" => (
                Projection::LambertAzimuthal(LambertAzimuthal::new(
                    40.0,
                    -100.0,
                    0.0,
                    0.0,
                    Ellipsoid::sphere(3.0),
                )),
                1e-9,
                5e-8,
            ),
            "laea_clarke1866" => (
                Projection::LambertAzimuthal(LambertAzimuthal::new(
                    40.0,
                    -100.0,
                    0.0,
                    0.0,
                    clarke1866(),
                )),
                1e-5,
                0.05,
            ),
            "laea_snyder_es" => (
                Projection::LambertAzimuthal(LambertAzimuthal::new(
                    40.0,
                    -100.0,
                    0.0,
                    0.0,
                    Ellipsoid::new(6_378_206.4, 0.00676866),
                )),
                1e-5,
                0.05,
            ),
            other => panic!("unknown example {other}"),
        };
        let [x, y] = p.forward(lon, lat).unwrap();
        assert!(
            (x - px).abs() <= tol_py && (y - py).abs() <= tol_py,
            "{id}: ({x}, {y}) vs pyproj ({px}, {py})"
        );
        assert!(
            (x - sx).abs() <= tol_snyder && (y - sy).abs() <= tol_snyder,
            "{id}: ({x}, {y}) vs Snyder ({sx}, {sy})"
        );
    }
}

/// Snyder (1987) Appendix A intermediate values for Albers on the sphere
/// (n = 0.6028370), as listed in the project's methods notes (recalled
/// from the book, not checked against a copy).
#[test]
fn albers_cone_constant_matches_snyder() {
    let a = Albers::new(29.5, 45.5, 23.0, -96.0, Ellipsoid::sphere(1.0)).unwrap();
    assert!((a.n() - 0.6028370).abs() < 5e-8);
    let e = Albers::new(
        29.5,
        45.5,
        23.0,
        -96.0,
        Ellipsoid::new(6_378_206.4, 0.00676866),
    )
    .unwrap();
    assert!((e.n() - 0.6029035).abs() < 5e-8);
}

/// PROJ's longitude reduction: values within ±180° kept, others reduced.
#[test]
fn longitude_wrapping_follows_proj() {
    let pi = std::f64::consts::PI;
    assert_eq!(wrap_lambda(pi), pi);
    assert_eq!(wrap_lambda(-pi), -pi);
    assert!((wrap_lambda(276f64.to_radians()) - (-84f64).to_radians()).abs() < 1e-12);
    assert!((wrap_lambda(-540f64.to_radians()) - (-pi)).abs() < 1e-12);
    // Web Mercator's limit is atan(sinh(pi)) (EPSG:3857 tiling convention).
    assert!((WEB_MERCATOR_MAX_LAT - pi.sinh().atan().to_degrees()).abs() < 1e-12);
}
