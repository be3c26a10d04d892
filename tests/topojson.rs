//! TopoJSON input against the decoding rules of the TopoJSON format
//! specification: quantised positions are delta-encoded per arc and
//! decoded as x = (sum of deltas)·scale + translate; an arc index ~i
//! (= -i-1) walks arc i backwards; consecutive arcs of a ring share their
//! end position. The fixture (invented) holds two 1° cells, A and B, that
//! share one arc, plus a quantised point.

use std::path::Path;

use hueproof::geo::measure::ring_signed_area;
use hueproof::geo::simplify::{Method, simplify};
use hueproof::geo::{KeySource, ReadOptions, read_shapes_file};

fn read(object: Option<&str>) -> hueproof::geo::Layer {
    read_shapes_file(
        &Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/geo/two_cells.topojson"),
        &ReadOptions {
            key: Some(KeySource::Property("code".into())),
            ..ReadOptions::default()
        },
        object,
    )
    .unwrap()
}

#[test]
fn arcs_decode_to_the_two_cells() {
    let layer = read(None);
    assert!(layer.problems().is_empty(), "{:?}", layer.problems());
    let keys: Vec<_> = layer.features().iter().map(|f| f.display_key()).collect();
    assert_eq!(keys, ["A", "B"]);
    let mut corners = Vec::new();
    for (_, g) in layer.usable() {
        let ext = g.polygons[0].exterior();
        assert!((ring_signed_area(ext) - 1.0).abs() < 1e-12);
        let mut c: Vec<[f64; 2]> = ext.to_vec();
        c.sort_by(|a, b| a.partial_cmp(b).unwrap());
        corners.push(c);
    }
    assert_eq!(
        corners[0],
        [[10.0, 45.0], [10.0, 46.0], [11.0, 45.0], [11.0, 46.0]]
    );
    assert_eq!(
        corners[1],
        [[11.0, 45.0], [11.0, 46.0], [12.0, 45.0], [12.0, 46.0]]
    );
    // Our own topology finds the file's three arcs again.
    let geoms: Vec<_> = layer.usable().map(|(_, g)| g.clone()).collect();
    let (_, rep) = simplify(&geoms, Method::DouglasPeucker, 0.0, 0.0);
    assert_eq!(rep.arcs, 3);
}

#[test]
fn objects_are_chosen_by_name() {
    let layer = read(Some("marker"));
    let (_, g) = layer.usable().next().unwrap();
    // Quantised point (4, 2) -> (4·0.5 + 10, 2·0.5 + 45).
    assert_eq!(g.points, [[12.0, 46.0]]);
    let err = read_shapes_file(
        &Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/geo/two_cells.topojson"),
        &ReadOptions::default(),
        Some("nope"),
    )
    .unwrap_err();
    assert!(err.to_string().contains("cells, marker"), "{err}");
}
