//! Default projections from the data's extent. The standard-parallel rule
//! (1/6 and 5/6 of the latitude range) is Deetz & Adams (1934) as given in
//! Snyder (1987) section 14; the choice of projection family per extent is
//! this project's documented rule (common practice: equal-area for areal
//! data, azimuthal for polar and equatorial regions).

use hueproof::geo::CoordinateKind;
use hueproof::geo::extent::Extent;
use hueproof::geo::projection::{
    Ellipsoid, Projection, ProjectionName, Purpose, choose_projection,
};

fn choose(coords: &[[f64; 2]], requested: Option<ProjectionName>) -> (Projection, Vec<String>) {
    let c = choose_projection(
        Extent::of(coords.iter().copied()),
        CoordinateKind::Geographic,
        requested,
        Ellipsoid::wgs84(),
        Purpose::Areal,
    )
    .unwrap();
    (c.projection, c.warnings)
}

#[test]
fn mid_latitude_region_gets_albers_with_deetz_adams_parallels() {
    let (p, w) = choose(&[[-109.0, 37.0], [-102.0, 41.0], [-105.0, 43.0]], None);
    assert!(w.is_empty());
    let params = p.params();
    assert_eq!(p.name(), ProjectionName::Albers);
    assert_eq!(params["lat_1"], 38.0); // 37 + 6/6
    assert_eq!(params["lat_2"], 42.0); // 43 - 6/6
    assert_eq!(params["lat_0"], 40.0);
    assert_eq!(params["lon_0"], -105.5);
}

#[test]
fn world_polar_equatorial_and_antimeridian_extents() {
    // Coastlines all round the world: span over 300 deg, centred on 0.
    let world: Vec<[f64; 2]> = (0..36)
        .map(|k| [-180.0 + 10.0 * k as f64, 40.0 - k as f64])
        .collect();
    let (p, _) = choose(&world, None);
    assert_eq!(p.name(), ProjectionName::EqualEarth);
    assert_eq!(p.params()["lon_0"], 0.0);
    let (p, _) = choose(&[[-60.0, -85.0], [60.0, -65.0], [150.0, -70.0]], None);
    assert_eq!(p.name(), ProjectionName::LambertAzimuthal);
    assert_eq!(p.params()["lat_0"], -90.0);
    let (p, _) = choose(&[[10.0, -5.0], [20.0, 8.0]], None);
    assert_eq!(p.name(), ProjectionName::LambertAzimuthal);
    assert_eq!(p.params()["lat_0"], 1.5);
    // Islands either side of 180 deg: the narrowest arc is centred on 180.
    let (p, _) = choose(&[[177.0, -20.0], [-178.0, -15.0]], None);
    assert_eq!(p.name(), ProjectionName::Albers);
    assert_eq!(p.params()["lon_0"], 179.5);
}

#[test]
fn non_equal_area_choice_warns_for_areal_data() {
    let pts = [[-109.0, 37.0], [-102.0, 41.0]];
    for name in [ProjectionName::WebMercator, ProjectionName::Equirectangular] {
        let (_, w) = choose(&pts, Some(name));
        assert_eq!(w.len(), 1, "{name}");
    }
    let (_, w) = choose(&pts, Some(ProjectionName::EqualEarth));
    assert!(w.is_empty());
    // Albers on parallels symmetric about the equator is refused.
    let err = choose_projection(
        Extent::of([[0.0, -10.0], [5.0, 10.0]].into_iter()),
        CoordinateKind::Geographic,
        Some(ProjectionName::Albers),
        Ellipsoid::wgs84(),
        Purpose::Areal,
    )
    .unwrap_err();
    assert!(err.contains("lambert-azimuthal"), "{err}");
}
