//! The built-in demo dataset (invented, for the demo only): determinism,
//! that it reads back through hueproof's own readers without problems, and
//! its geometry checked with general-purpose tools (serde_json for the
//! GeoJSON structure, the csv crate for the tables) and textbook formulas
//! (shoelace area, even-odd point in polygon, spherical polygon area).

use std::collections::{BTreeMap, BTreeSet};

use hueproof::demo::{self, DemoData};
use hueproof::geo::{KeySource, ReadOptions, read_geojson_str};
use hueproof::table::{Cell, TableOptions, read_table_str};

fn data() -> &'static DemoData {
    static D: std::sync::OnceLock<DemoData> = std::sync::OnceLock::new();
    D.get_or_init(demo::generate)
}

fn outline() -> &'static Vec<[f64; 2]> {
    static O: std::sync::OnceLock<Vec<[f64; 2]>> = std::sync::OnceLock::new();
    O.get_or_init(demo::island_outline)
}

/// Shoelace signed area of an open ring (positive counter-clockwise).
fn shoelace(r: &[[f64; 2]]) -> f64 {
    let n = r.len();
    (0..n)
        .map(|i| {
            let (a, b) = (r[i], r[(i + 1) % n]);
            a[0] * b[1] - b[0] * a[1]
        })
        .sum::<f64>()
        / 2.0
}

/// Even-odd rule point in polygon (ray casting; common practice).
fn inside(p: [f64; 2], r: &[[f64; 2]]) -> bool {
    let n = r.len();
    let mut c = false;
    for i in 0..n {
        let (a, b) = (r[i], r[(i + 1) % n]);
        if (a[1] > p[1]) != (b[1] > p[1])
            && p[0] < (b[0] - a[0]) * (p[1] - a[1]) / (b[1] - a[1]) + a[0]
        {
            c = !c;
        }
    }
    c
}

/// The rings of a GeoJSON FeatureCollection parsed with serde_json, as
/// written (closed), with each feature's properties.
fn raw_features(text: &str) -> Vec<(serde_json::Value, serde_json::Value)> {
    let v: serde_json::Value = serde_json::from_str(text).expect("valid JSON");
    assert_eq!(v["type"], "FeatureCollection");
    v["features"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| (f["properties"].clone(), f["geometry"].clone()))
        .collect()
}

fn coords(v: &serde_json::Value) -> Vec<[f64; 2]> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|p| [p[0].as_f64().unwrap(), p[1].as_f64().unwrap()])
        .collect()
}

/// District rings as written, with the closing position dropped.
fn district_rings() -> Vec<(String, Vec<[f64; 2]>)> {
    raw_features(&data().districts_geojson)
        .into_iter()
        .map(|(props, geom)| {
            assert_eq!(geom["type"], "Polygon");
            let rings = geom["coordinates"].as_array().unwrap();
            assert_eq!(rings.len(), 1, "one ring, no holes");
            let mut r = coords(&rings[0]);
            assert_eq!(r.first(), r.last(), "RFC 7946 3.1.6: rings are closed");
            r.pop();
            (props["key"].as_str().unwrap().to_string(), r)
        })
        .collect()
}

#[test]
fn two_calls_give_the_same_bytes() {
    let a = demo::generate();
    let b = demo::generate();
    assert_eq!(a, b);
    assert_eq!(demo::island_outline(), *outline());
}

#[test]
fn write_puts_the_five_files_in_order() {
    let dir = std::env::temp_dir().join(format!("hueproof-demo-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let paths = demo::write(&dir.join("nested")).unwrap();
    let names: Vec<_> = paths
        .iter()
        .map(|p| p.file_name().unwrap().to_str().unwrap().to_string())
        .collect();
    assert_eq!(
        names,
        [
            "districts.geojson",
            "districts.csv",
            "districts_by_year.csv",
            "stations.csv",
            "water.geojson"
        ]
    );
    assert_eq!(
        std::fs::read_to_string(&paths[3]).unwrap(),
        data().stations_csv
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn geojson_reads_back_through_hueproof_without_problems() {
    let opts = ReadOptions {
        key: Some(KeySource::Property("key".into())),
        ..ReadOptions::default()
    };
    let layer = read_geojson_str(&data().districts_geojson, &opts).unwrap();
    assert!(layer.problems().is_empty(), "{:?}", layer.problems());
    let keys: Vec<String> = layer
        .features()
        .iter()
        .map(|f| f.key.clone().unwrap())
        .collect();
    let expected: Vec<String> = (1..=40).map(|i| format!("D{i:02}")).collect();
    assert_eq!(keys, expected);
    for (f, g) in layer.usable() {
        assert_eq!(g.polygons.len(), 1, "{}", f.display_key());
    }

    let water = read_geojson_str(&data().water_geojson, &ReadOptions::default()).unwrap();
    assert!(water.problems().is_empty(), "{:?}", water.problems());
    let polys: usize = water.usable().map(|(_, g)| g.polygons.len()).sum();
    let lines: usize = water.usable().map(|(_, g)| g.lines.len()).sum();
    assert_eq!((polys, lines), (1, 2));
}

#[test]
fn rings_are_valid_rfc7946_rings() {
    let rings = district_rings();
    assert_eq!(rings.len(), 40);
    for (key, r) in &rings {
        assert!(r.len() >= 3, "{key}");
        // RFC 7946 3.1.6: exterior rings counter-clockwise.
        assert!(shoelace(r) > 0.0, "{key} is not counter-clockwise");
        for i in 0..r.len() {
            assert_ne!(r[i], r[(i + 1) % r.len()], "{key}: repeated vertex");
        }
        let distinct: BTreeSet<(u64, u64)> =
            r.iter().map(|p| (p[0].to_bits(), p[1].to_bits())).collect();
        assert_eq!(distinct.len(), r.len(), "{key}: a vertex appears twice");
        // The invented place: open ocean around 125°W, 35°S.
        for p in r {
            assert!((-128.0..-122.0).contains(&p[0]) && (-37.5..-32.5).contains(&p[1]));
        }
    }
}

#[test]
fn neighbours_share_their_border_vertices_exactly() {
    // Every edge of a district is either on the coast (used once) or used
    // by exactly one neighbour in the opposite direction: no T-junctions,
    // no gaps, no overlaps along borders.
    let rings = district_rings();
    let bits = |p: [f64; 2]| (p[0].to_bits(), p[1].to_bits());
    type Point = (u64, u64);
    let mut directed: BTreeMap<(Point, Point), usize> = BTreeMap::new();
    for (_, r) in &rings {
        for i in 0..r.len() {
            *directed
                .entry((bits(r[i]), bits(r[(i + 1) % r.len()])))
                .or_default() += 1;
        }
    }
    let coast = outline();
    let coast_edges: BTreeSet<_> = (0..coast.len())
        .map(|i| (bits(coast[i]), bits(coast[(i + 1) % coast.len()])))
        .collect();
    let mut shared = 0;
    for (&(a, b), &n) in &directed {
        assert_eq!(n, 1, "an edge used twice in the same direction");
        if directed.contains_key(&(b, a)) {
            shared += 1;
        } else {
            assert!(
                coast_edges.contains(&(a, b)),
                "an unshared edge off the coast"
            );
        }
    }
    // Every coast edge belongs to some district.
    for e in &coast_edges {
        assert!(directed.contains_key(e));
    }
    // 40 cells of a planar partition have on the order of 3n borders.
    assert!(shared / 2 >= 60, "only {} shared edges", shared / 2);
}

#[test]
fn districts_tile_the_island_exactly() {
    let total: f64 = district_rings().iter().map(|(_, r)| shoelace(r)).sum();
    let island = shoelace(outline());
    assert!(
        ((total - island) / island).abs() < 1e-9,
        "{total} vs {island}"
    );
    // "About 4 degrees across".
    let (lo, hi) = outline().iter().fold((f64::MAX, f64::MIN), |(lo, hi), p| {
        (lo.min(p[0]), hi.max(p[0]))
    });
    assert!((3.0..5.0).contains(&(hi - lo)), "{}", hi - lo);
}

/// Area of a lon/lat ring on the WGS 84 ellipsoid, its edges straight in
/// lon/lat (RFC 7946) and split into 200 steps, each step taken as a
/// trapezoid in longitude of the area between the equator and the
/// latitude: A = Σ (λ2 − λ1)·(F(φ1) + F(φ2))/2 with F(φ) = a²·q(φ)/2 and
/// q(φ) = (1 − e²)·[sin φ/(1 − e² sin² φ) − 1/(2e)·ln((1 − e sin φ)/(1 + e
/// sin φ))] (Snyder 1987, *Map Projections: A Working Manual*, eq. 3-12;
/// on the sphere this is the formula of Chamberlain & Duquette 2007, JPL
/// 07-03; both recalled from memory).
fn ellipsoid_area(ring: &[[f64; 2]]) -> f64 {
    let a: f64 = 6_378_137.0;
    let f: f64 = 1.0 / 298.257_223_563;
    let e2 = f * (2.0 - f);
    let e = e2.sqrt();
    let big_f = |lat: f64| {
        let s = lat.to_radians().sin();
        let q = (1.0 - e2)
            * (s / (1.0 - e2 * s * s) - (1.0 / (2.0 * e)) * ((1.0 - e * s) / (1.0 + e * s)).ln());
        a * a * q / 2.0
    };
    const STEPS: usize = 200;
    let n = ring.len();
    let mut s = 0.0;
    for i in 0..n {
        let (p, q) = (ring[i], ring[(i + 1) % n]);
        let at = |k: usize| {
            let t = k as f64 / STEPS as f64;
            [p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]
        };
        for k in 0..STEPS {
            let (u, v) = (at(k), at(k + 1));
            s += (v[0] - u[0]).to_radians() * (big_f(u[1]) + big_f(v[1])) / 2.0;
        }
    }
    s.abs()
}

fn csv_records(text: &str) -> (Vec<String>, Vec<Vec<String>>) {
    let mut rdr = csv::Reader::from_reader(text.as_bytes());
    let header = rdr.headers().unwrap().iter().map(String::from).collect();
    let rows = rdr
        .records()
        .map(|r| r.unwrap().iter().map(String::from).collect())
        .collect();
    (header, rows)
}

#[test]
fn districts_csv_matches_the_features_and_the_measurement_levels() {
    let (header, rows) = csv_records(&data().districts_csv);
    assert_eq!(
        header,
        ["key", "name", "density", "change", "landuse", "area_km2"]
    );
    let rings = district_rings();
    let feature_keys: Vec<&str> = rings.iter().map(|(k, _)| k.as_str()).collect();
    let row_keys: Vec<&str> = rows.iter().map(|r| r[0].as_str()).collect();
    assert_eq!(row_keys, feature_keys);
    // Names: unique, letters only (invented from syllables).
    let names: BTreeSet<&str> = rows.iter().map(|r| r[1].as_str()).collect();
    assert_eq!(names.len(), 40);
    assert!(
        names
            .iter()
            .all(|n| n.chars().all(|c| c.is_ascii_alphabetic()))
    );
    // The same names in the GeoJSON.
    let props: Vec<String> = raw_features(&data().districts_geojson)
        .iter()
        .map(|(p, _)| p["name"].as_str().unwrap().to_string())
        .collect();
    assert_eq!(props, rows.iter().map(|r| r[1].clone()).collect::<Vec<_>>());

    // hueproof's reader picks the numeric columns and finds no bad cell.
    let t = read_table_str(&data().districts_csv, &TableOptions::new("key")).unwrap();
    assert_eq!(t.value_columns, ["density", "change", "area_km2"]);
    let col = |name: &str| {
        let i = t.value_columns.iter().position(|c| c == name).unwrap();
        t.rows.iter().map(move |r| r.values[i].clone())
    };
    assert!(
        t.rows
            .iter()
            .flat_map(|r| &r.values)
            .all(|c| !matches!(c, Cell::Invalid(..)))
    );
    let density: Vec<Cell> = col("density").collect();
    assert_eq!(density.iter().filter(|c| **c == Cell::Missing).count(), 2);
    let dens: Vec<f64> = density
        .iter()
        .filter_map(|c| {
            if let Cell::Number(v) = c {
                Some(*v)
            } else {
                None
            }
        })
        .collect();
    assert!(dens.iter().all(|&v| (5.0..=3000.0).contains(&v)));
    // Lognormal: the spread spans more than one order of magnitude.
    let (lo, hi) = dens
        .iter()
        .fold((f64::MAX, f64::MIN), |(lo, hi), &v| (lo.min(v), hi.max(v)));
    assert!(hi / lo > 20.0, "{lo}..{hi}");
    let change: Vec<f64> = col("change")
        .map(|c| {
            if let Cell::Number(v) = c {
                v
            } else {
                panic!("{c:?}")
            }
        })
        .collect();
    assert!(change.iter().all(|v| (-12.0..=15.0).contains(v)));
    assert!(change.iter().any(|&v| v < -1.0) && change.iter().any(|&v| v > 1.0));
    let mean = change.iter().sum::<f64>() / change.len() as f64;
    assert!(mean.abs() < 4.0, "centred near 0: mean {mean}");
    let landuse: BTreeSet<&str> = rows.iter().map(|r| r[4].as_str()).collect();
    assert_eq!(landuse, demo::LANDUSE.iter().copied().collect());

    // Area on the ellipsoid (hueproof: densified, then Lambert azimuthal
    // equal-area) against the direct formula on the same ellipsoid. The
    // CSV rounds to 0.1 km², hence 0.05 km² plus 1e-5 of the area.
    let mut csv_total = 0.0;
    let mut direct_total = 0.0;
    for ((_, ring), row) in rings.iter().zip(&rows) {
        let km2: f64 = row[5].parse().unwrap();
        let direct = ellipsoid_area(ring) / 1e6;
        assert!(
            (km2 - direct).abs() < 0.05 + 1e-5 * direct,
            "{}: {km2} vs {direct}",
            row[0]
        );
        csv_total += km2;
        direct_total += direct;
    }
    assert!(((csv_total - direct_total) / direct_total).abs() < 1e-5);
}

#[test]
fn by_year_table_is_long_format_with_two_gaps() {
    let (header, rows) = csv_records(&data().districts_by_year_csv);
    assert_eq!(header, ["key", "year", "rate"]);
    assert_eq!(rows.len(), 160);
    let mut per_key: BTreeMap<&str, Vec<&str>> = BTreeMap::new();
    for r in &rows {
        per_key.entry(&r[0]).or_default().push(&r[1]);
    }
    let expected_keys: BTreeSet<String> = district_rings().into_iter().map(|(k, _)| k).collect();
    assert_eq!(
        per_key
            .keys()
            .map(|k| k.to_string())
            .collect::<BTreeSet<_>>(),
        expected_keys
    );
    assert!(
        per_key
            .values()
            .all(|y| *y == ["2021", "2022", "2023", "2024"])
    );
    let t = read_table_str(&data().districts_by_year_csv, &TableOptions::new("key")).unwrap();
    let rate = t.value_columns.iter().position(|c| c == "rate").unwrap();
    let cells: Vec<&Cell> = t.rows.iter().map(|r| &r.values[rate]).collect();
    assert_eq!(cells.iter().filter(|c| ***c == Cell::Missing).count(), 2);
    assert!(cells.iter().all(|c| match c {
        Cell::Number(v) => *v > 0.0,
        Cell::Missing => true,
        Cell::Invalid(..) => false,
    }));
}

#[test]
fn stations_lie_on_the_island_and_rain_grows_with_height() {
    let (header, rows) = csv_records(&data().stations_csv);
    assert_eq!(
        header,
        [
            "id",
            "lon",
            "lat",
            "elevation_m",
            "rainfall_mm",
            "zone",
            "year"
        ]
    );
    assert_eq!(rows.len(), 120);
    let t = read_table_str(&data().stations_csv, &TableOptions::new("id")).unwrap();
    assert!(
        t.rows
            .iter()
            .flat_map(|r| &r.values)
            .all(|c| matches!(c, Cell::Number(_)))
    );
    let ids: BTreeSet<&str> = rows.iter().map(|r| r[0].as_str()).collect();
    assert_eq!(ids.len(), 120);
    let mut elev = Vec::new();
    let mut rain = Vec::new();
    for r in &rows {
        let p = [r[1].parse::<f64>().unwrap(), r[2].parse::<f64>().unwrap()];
        assert!(inside(p, outline()), "{} at {p:?} is off the island", r[0]);
        elev.push(r[3].parse::<f64>().unwrap());
        rain.push(r[4].parse::<f64>().unwrap());
    }
    let zones: BTreeSet<&str> = rows.iter().map(|r| r[5].as_str()).collect();
    assert_eq!(zones, demo::ZONES.iter().copied().collect());
    let years: BTreeSet<&str> = rows.iter().map(|r| r[6].as_str()).collect();
    assert_eq!(years, ["2022", "2023", "2024"].into_iter().collect());
    // Pearson correlation (textbook formula).
    let n = elev.len() as f64;
    let (me, mr) = (elev.iter().sum::<f64>() / n, rain.iter().sum::<f64>() / n);
    let cov: f64 = elev
        .iter()
        .zip(&rain)
        .map(|(e, r)| (e - me) * (r - mr))
        .sum();
    let ve: f64 = elev.iter().map(|e| (e - me).powi(2)).sum();
    let vr: f64 = rain.iter().map(|r| (r - mr).powi(2)).sum();
    let corr = cov / (ve * vr).sqrt();
    assert!((0.5..0.98).contains(&corr), "correlation {corr}");
}

#[test]
fn the_lake_and_rivers_are_on_the_island() {
    let feats = raw_features(&data().water_geojson);
    assert_eq!(feats.len(), 3);
    let coast = outline();
    for (props, geom) in &feats {
        match props["kind"].as_str().unwrap() {
            "lake" => {
                let mut r = coords(&geom["coordinates"][0]);
                assert_eq!(r.first(), r.last());
                r.pop();
                assert!(shoelace(&r) > 0.0);
                assert!(r.iter().all(|&p| inside(p, coast)));
            }
            "river" => {
                assert_eq!(geom["type"], "LineString");
                let l = coords(&geom["coordinates"]);
                assert!(l.len() >= 10);
                let (mouth, inland) = l.split_last().unwrap();
                assert!(inland.iter().all(|&p| inside(p, coast)));
                assert!(coast.contains(mouth), "a river ends on the coast");
            }
            k => panic!("unexpected kind {k}"),
        }
    }
}
