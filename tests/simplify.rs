//! Topology-safe simplification: after simplifying, every border that two
//! shapes shared is still shared vertex for vertex (each directed edge of a
//! ring is matched by the reverse edge of its neighbour, except on the
//! outer frame), and no ring falls below a triangle. The data comes from
//! the repository's generator of grid cells with winding shared borders.

use std::collections::HashSet;

use hueproof::geo::Geometry;
use hueproof::geo::fit::Fit;
use hueproof::geo::generate::Grid;
use hueproof::geo::simplify::{Method, douglas_peucker, simplify};

fn fitted_grid() -> Vec<Geometry> {
    let grid = Grid::new(30, 25, 7);
    let geoms = grid.geometries();
    let fit = Fit::for_geometries(geoms.iter(), 800.0, 600.0, 10.0).unwrap();
    geoms.iter().map(|g| fit.apply_geometry(g)).collect()
}

type Key = [u64; 2];

fn key(c: [f64; 2]) -> Key {
    [c[0].to_bits(), c[1].to_bits()]
}

/// Directed edges of every ring that have no reverse in any ring and do
/// not lie on the outer frame (straight in the fitted plane).
fn unmatched_edges(geoms: &[Geometry]) -> usize {
    let mut lo = [f64::INFINITY; 2];
    let mut hi = [f64::NEG_INFINITY; 2];
    let mut edges = HashSet::new();
    let mut all = Vec::new();
    for g in geoms {
        for p in &g.polygons {
            for r in p.rings() {
                for i in 0..r.len() {
                    let (a, b) = (r[i], r[(i + 1) % r.len()]);
                    edges.insert((key(a), key(b)));
                    all.push((a, b));
                    for c in [a, b] {
                        lo = [lo[0].min(c[0]), lo[1].min(c[1])];
                        hi = [hi[0].max(c[0]), hi[1].max(c[1])];
                    }
                }
            }
        }
    }
    let on_frame = |a: [f64; 2], b: [f64; 2]| {
        (0..2).any(|k| (a[k] == lo[k] && b[k] == lo[k]) || (a[k] == hi[k] && b[k] == hi[k]))
    };
    all.iter()
        .filter(|(a, b)| !edges.contains(&(key(*b), key(*a))) && !on_frame(*a, *b))
        .count()
}

#[test]
fn shared_borders_stay_shared_vertex_for_vertex() {
    let geoms = fitted_grid();
    assert_eq!(unmatched_edges(&geoms), 0, "the generator shares borders");
    for method in [Method::DouglasPeucker, Method::VisvalingamWhyatt] {
        for tol in [0.25, 2.0, 40.0] {
            let (out, rep) = simplify(&geoms, method, tol, 1.0);
            assert_eq!(unmatched_edges(&out), 0, "{method:?} at {tol} px");
            assert!(rep.vertices_out < rep.vertices_in, "{rep:?}");
            for g in &out {
                for p in &g.polygons {
                    assert!(p.exterior().len() >= 3);
                }
            }
            assert!(rep.tiny.is_empty());
        }
    }
}

/// The check above can fail: simplifying each ring on its own (the naive
/// way) leaves borders that no longer match.
#[test]
fn naive_per_ring_simplification_breaks_borders() {
    let geoms = fitted_grid();
    let naive: Vec<Geometry> = geoms
        .iter()
        .map(|g| {
            let (one, _) = simplify(std::slice::from_ref(g), Method::DouglasPeucker, 2.0, 0.0);
            one.into_iter().next().unwrap()
        })
        .collect();
    assert!(unmatched_edges(&naive) > 0);
}

/// Importance thresholds give the classic recursive Douglas-Peucker result
/// (Douglas & Peucker 1973, as described in the method notes), for several
/// tolerances.
#[test]
fn douglas_peucker_importance_equals_recursive_method() {
    fn classic(path: &[[f64; 2]], tol: f64, keep: &mut Vec<bool>, a: usize, b: usize) {
        if b <= a + 1 {
            return;
        }
        let d = |p: [f64; 2]| {
            let (dx, dy) = (path[b][0] - path[a][0], path[b][1] - path[a][1]);
            let l2 = dx * dx + dy * dy;
            let t = (((p[0] - path[a][0]) * dx + (p[1] - path[a][1]) * dy) / l2).clamp(0.0, 1.0);
            ((path[a][0] + t * dx - p[0]).powi(2) + (path[a][1] + t * dy - p[1]).powi(2)).sqrt()
        };
        let (i, dmax) = (a + 1..b)
            .map(|i| (i, d(path[i])))
            .fold((a + 1, -1.0), |m, x| if x.1 > m.1 { x } else { m });
        if dmax > tol {
            keep[i] = true;
            classic(path, tol, keep, a, i);
            classic(path, tol, keep, i, b);
        }
    }
    let grid = Grid::new(1, 200, 3);
    let ring = grid.ring(0);
    let path = &ring[..202];
    let imp = douglas_peucker::importance(path);
    for tol in [1e-4, 1e-3, 1e-2, 0.05] {
        let mut keep = vec![false; path.len()];
        keep[0] = true;
        keep[path.len() - 1] = true;
        classic(path, tol, &mut keep, 0, path.len() - 1);
        let ours: Vec<bool> = imp.iter().map(|&i| i > tol).collect();
        assert_eq!(ours, keep, "tolerance {tol}");
    }
}

#[test]
fn tiny_shapes_are_kept_and_reported() {
    let geoms = fitted_grid();
    // Every cell is about 100 x 100 px: a 1e5 px² threshold marks them all.
    let (out, rep) = simplify(&geoms, Method::VisvalingamWhyatt, 1000.0, 1e5);
    assert_eq!(out.len(), geoms.len());
    assert_eq!(rep.tiny.len(), geoms.len());
    for g in &out {
        assert!(g.polygons[0].exterior().len() >= 3);
    }
}

#[test]
fn fit_keeps_aspect_pads_and_flips_y() {
    let fit = Fit::new([0.0, 0.0], [200.0, 100.0], 420.0, 420.0, 10.0).unwrap();
    assert_eq!(fit.scale, 2.0);
    // Bottom-left of the data maps to the bottom of the centred box.
    assert_eq!(fit.apply([0.0, 0.0]), [10.0, 310.0]);
    assert_eq!(fit.apply([200.0, 100.0]), [410.0, 110.0]);
}

/// Background pixels left inside the grid when the shapes are rendered
/// (tiny-skia, no anti-aliasing, one opaque fill per shape), 2 px in from
/// the outer frame (whose edges are straight).
fn background_pixels(out: &[Geometry]) -> usize {
    use resvg::tiny_skia::{FillRule, Paint, PathBuilder, Pixmap, Transform};
    let mut pix = Pixmap::new(800, 600).unwrap();
    let mut paint = Paint {
        anti_alias: false,
        ..Paint::default()
    };
    for (i, g) in out.iter().enumerate() {
        paint.set_color_rgba8(40 + (i * 7 % 200) as u8, 90, 160, 255);
        let mut pb = PathBuilder::new();
        for p in &g.polygons {
            for r in p.rings() {
                pb.move_to(r[0][0] as f32, r[0][1] as f32);
                for c in &r[1..] {
                    pb.line_to(c[0] as f32, c[1] as f32);
                }
                pb.close();
            }
        }
        let path = pb.finish().unwrap();
        pix.fill_path(
            &path,
            &paint,
            FillRule::Winding,
            Transform::identity(),
            None,
        );
    }
    let (mut lo, mut hi) = ([f64::INFINITY; 2], [f64::NEG_INFINITY; 2]);
    for g in out {
        for c in g.coords() {
            lo = [lo[0].min(c[0]), lo[1].min(c[1])];
            hi = [hi[0].max(c[0]), hi[1].max(c[1])];
        }
    }
    let mut background = 0;
    for y in (lo[1] + 2.0) as u32..(hi[1] - 2.0) as u32 {
        for x in (lo[0] + 2.0) as u32..(hi[0] - 2.0) as u32 {
            if pix.pixel(x, y).unwrap().alpha() == 0 {
                background += 1;
            }
        }
    }
    background
}

/// Rendering the simplified neighbours leaves no background pixel inside
/// the grid; simplifying each shape alone does leave some (gaps).
#[test]
fn rendered_neighbours_leave_no_background_pixel() {
    let geoms = fitted_grid();
    let (out, _) = simplify(&geoms, Method::VisvalingamWhyatt, 10.0, 1.0);
    assert_eq!(background_pixels(&out), 0);
    let naive: Vec<Geometry> = geoms
        .iter()
        .map(|g| {
            let (one, _) = simplify(
                std::slice::from_ref(g),
                Method::VisvalingamWhyatt,
                10.0,
                0.0,
            );
            one.into_iter().next().unwrap()
        })
        .collect();
    assert!(background_pixels(&naive) > 0);
}
