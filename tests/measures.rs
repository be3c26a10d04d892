//! Planar area, centroid and label point against closed-form geometry
//! (common practice: composite-area centroids, the inscribed circle of a
//! rectangle).

use hueproof::geo::Polygon;
use hueproof::geo::measure::area::polygon_centroid;
use hueproof::geo::measure::inaccessibility::signed_distance;
use hueproof::geo::measure::{pole_of_inaccessibility, polygon_area};

fn l_shape() -> Polygon {
    // A 4 x 4 square with its top-right 2 x 2 quarter removed.
    Polygon::new(
        vec![[0., 0.], [4., 0.], [4., 2.], [2., 2.], [2., 4.], [0., 4.]],
        vec![],
    )
    .unwrap()
}

#[test]
fn area_and_centroid_of_an_l_shape() {
    let p = l_shape();
    assert_eq!(polygon_area(&p), 12.0);
    // Composite: 4x2 slab (centroid (2,1)) + 2x2 block (centroid (1,3)).
    let c = polygon_centroid(&p).unwrap();
    let expect = (8.0 * 2.0 + 4.0 * 1.0) / 12.0;
    assert!((c[0] - expect).abs() < 1e-12 && (c[1] - expect).abs() < 1e-12);
}

#[test]
fn holes_subtract() {
    let p = Polygon::new(
        vec![[0., 0.], [10., 0.], [10., 10.], [0., 10.]],
        vec![vec![[2., 2.], [2., 8.], [8., 8.], [8., 2.]]],
    )
    .unwrap();
    assert_eq!(polygon_area(&p), 64.0);
}

#[test]
fn label_point_is_inside_and_near_optimal() {
    // The largest circle inside a 10 x 2 rectangle has radius 1.
    let rect = Polygon::new(vec![[0., 0.], [10., 0.], [10., 2.], [0., 2.]], vec![]).unwrap();
    let (c, d) = pole_of_inaccessibility(&rect, 1e-6);
    assert!((d - 1.0).abs() < 1e-5, "{d}");
    assert!((c[1] - 1.0).abs() < 1e-5);
    // A C-shape whose centroid lies outside: the label point must not.
    let c_shape = Polygon::new(
        vec![
            [0., 0.],
            [6., 0.],
            [6., 1.],
            [1., 1.],
            [1., 5.],
            [6., 5.],
            [6., 6.],
            [0., 6.],
        ],
        vec![],
    )
    .unwrap();
    let centroid = polygon_centroid(&c_shape).unwrap();
    assert!(signed_distance(centroid, &c_shape) < 0.0);
    let (lp, d) = pole_of_inaccessibility(&c_shape, 1e-4);
    assert!(signed_distance(lp, &c_shape) > 0.0);
    // Arms are 1 wide, but the best circle sits in an outer corner,
    // touching both outer walls and the reflex vertex (1, 1): its radius r
    // solves r = sqrt(2)(1 - r), r = 2 - sqrt(2).
    assert!((d - (2.0 - 2f64.sqrt())).abs() < 1e-3, "{d}");
    let (lp, _) = pole_of_inaccessibility(&l_shape(), 1e-4);
    assert!(signed_distance(lp, &l_shape()) > 0.0);
}
