//! GeoJSON input and its geometry checks, against the rules of RFC 7946:
//! section 3.1.6 (a linear ring is closed, has four or more positions, and
//! exteriors are counter-clockwise, holes clockwise by the right-hand
//! rule), section 3.1.1 (a position is two or more numbers, longitude then
//! latitude), sections 3.1.2-3.1.8 (the seven geometry types) and section
//! 3.2 (a feature's geometry may be null, its id a string or a number).

use hueproof::geo::measure::ring_signed_area;
use hueproof::geo::{
    CoordinateKind, KeySource, ProblemKind, ReadOptions, read_geojson_file, read_geojson_str,
};

fn fixture(name: &str) -> std::path::PathBuf {
    std::path::Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures/geo")
        .join(name)
}

fn opts(repair: bool) -> ReadOptions {
    ReadOptions {
        key: Some(KeySource::Property("code".into())),
        repair,
        coordinates: CoordinateKind::Geographic,
    }
}

#[test]
fn every_problem_is_reported_with_index_and_key() {
    let layer = read_geojson_file(&fixture("problems.geojson"), &opts(false)).unwrap();
    let found: Vec<(usize, &str, ProblemKind, bool)> = layer
        .problems()
        .iter()
        .map(|p| (p.feature, p.key.as_str(), p.kind, p.repaired))
        .collect();
    assert_eq!(
        found,
        vec![
            (1, "open", ProblemKind::UnclosedRing, false),
            (2, "thin", ProblemKind::TooFewPositions, false),
            (3, "north", ProblemKind::LatitudeOutOfRange, false),
            (4, "nothing", ProblemKind::EmptyGeometry, false),
            (5, "#5", ProblemKind::MissingKey, false),
        ]
    );
    // Excluded features keep their key (for the join) but no geometry.
    let usable: Vec<&str> = layer
        .usable()
        .map(|(f, _)| f.key.as_deref().unwrap())
        .collect();
    assert_eq!(usable, ["good", "mixed"]);
    assert!(layer.require_clean(&fixture("problems.geojson")).is_err());
}

#[test]
fn repair_fixes_what_has_a_well_defined_fix() {
    let layer = read_geojson_file(&fixture("problems.geojson"), &opts(true)).unwrap();
    let repaired: Vec<(usize, bool)> = layer
        .problems()
        .iter()
        .map(|p| (p.feature, p.repaired))
        .collect();
    // Latitude 95 and a missing key have no safe repair.
    assert_eq!(
        repaired,
        vec![(1, true), (2, true), (3, false), (4, true), (5, false)]
    );
    let f = layer.features();
    // The open ring is closed: a 1 x 1 square of four vertices.
    let open = f[1].geometry.as_ref().unwrap();
    assert_eq!(open.polygons[0].exterior().len(), 4);
    // The degenerate second part is dropped; the triangle stays.
    let thin = f[2].geometry.as_ref().unwrap();
    assert_eq!(thin.polygons.len(), 1);
    assert_eq!(thin.polygons[0].exterior().len(), 3);
    // The null geometry is kept as a feature that draws nothing.
    assert!(f[4].geometry.as_ref().unwrap().is_empty());
    assert!(f[3].geometry.is_none());
}

#[test]
fn rings_are_rewound_by_the_right_hand_rule() {
    let layer = read_geojson_file(&fixture("problems.geojson"), &opts(false)).unwrap();
    let good = layer.features()[0].geometry.as_ref().unwrap();
    let p = &good.polygons[0];
    // The file gives a clockwise exterior and a counter-clockwise hole.
    assert!(ring_signed_area(p.exterior()) > 0.0);
    assert!(ring_signed_area(&p.holes()[0]) < 0.0);
    // Open rings: the repeated closing position is not stored.
    assert_eq!(p.exterior().len(), 4);
}

#[test]
fn collections_flatten_into_points_lines_and_polygons() {
    let layer = read_geojson_file(&fixture("problems.geojson"), &opts(false)).unwrap();
    let mixed = layer.features()[6].geometry.as_ref().unwrap();
    assert_eq!(mixed.points.len(), 3);
    assert_eq!(mixed.lines.len(), 1);
    assert_eq!(mixed.part_count(), 4);
    assert_eq!(mixed.vertex_count(), 5);
}

#[test]
fn keys_from_numeric_properties_and_feature_ids() {
    let text = r#"{"type":"FeatureCollection","features":[
      {"type":"Feature","id":7,"properties":{"fips":8031},"geometry":{"type":"Point","coordinates":[1,2]}},
      {"type":"Feature","id":"x9","properties":{},"geometry":{"type":"Point","coordinates":[1,2]}}]}"#;
    let read = |key| {
        read_geojson_str(
            text,
            &ReadOptions {
                key: Some(key),
                ..ReadOptions::default()
            },
        )
        .unwrap()
    };
    let by_prop = read(KeySource::Property("fips".into()));
    assert_eq!(by_prop.features()[0].key.as_deref(), Some("8031"));
    assert_eq!(by_prop.features()[1].key, None);
    let by_id = read(KeySource::FeatureId);
    assert_eq!(by_id.features()[0].key.as_deref(), Some("7"));
    assert_eq!(by_id.features()[1].key.as_deref(), Some("x9"));
    // `id` as a property name falls back to the feature id.
    let fallback = read(KeySource::Property("id".into()));
    assert_eq!(fallback.features()[1].key.as_deref(), Some("x9"));
}

#[test]
fn bad_positions_and_planar_data() {
    let text = r#"{"type":"Polygon","coordinates":[[[0,0],[1],[1,1],[0,0]]]}"#;
    let layer = read_geojson_str(text, &ReadOptions::default()).unwrap();
    assert_eq!(layer.problems()[0].kind, ProblemKind::BadCoordinate);
    assert!(layer.problems()[0].detail.contains("position 1"));
    // Projected metres are not latitudes: no latitude check for planar data.
    let metres = r#"{"type":"Point","coordinates":[500000,4649776]}"#;
    let geo = read_geojson_str(metres, &ReadOptions::default()).unwrap();
    assert_eq!(geo.problems()[0].kind, ProblemKind::LatitudeOutOfRange);
    let planar = read_geojson_str(
        metres,
        &ReadOptions {
            coordinates: CoordinateKind::Planar,
            ..ReadOptions::default()
        },
    )
    .unwrap();
    assert!(planar.problems().is_empty());
    // Not GeoJSON at all: a message, not a panic.
    assert!(read_geojson_str("{\"type\":\"Nope\"}", &ReadOptions::default()).is_err());
}
