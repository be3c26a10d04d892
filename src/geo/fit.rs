//! Fitting projected geometry into an output frame: uniform scale (aspect
//! kept), padding on every side, centred, and y flipped so y grows down as
//! in SVG. The flip reverses ring orientation on screen.

use super::model::{Coord, Geometry, Polygon};

/// A fitted frame transform: `x' = ox + s·x`, `y' = oy − s·y`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Fit {
    /// Scale, output units per projected unit.
    pub scale: f64,
    /// x offset.
    pub ox: f64,
    /// y offset.
    pub oy: f64,
}

impl Fit {
    /// Fit the bounding box `lo`-`hi` into `width` x `height` with
    /// `padding` on each side. `None` if the frame has no room left or the
    /// box is a point.
    pub fn new(lo: Coord, hi: Coord, width: f64, height: f64, padding: f64) -> Option<Fit> {
        let (w, h) = (hi[0] - lo[0], hi[1] - lo[1]);
        let (fw, fh) = (width - 2.0 * padding, height - 2.0 * padding);
        if fw <= 0.0 || fh <= 0.0 || !(w > 0.0 || h > 0.0) {
            return None;
        }
        let sx = if w > 0.0 { fw / w } else { f64::INFINITY };
        let sy = if h > 0.0 { fh / h } else { f64::INFINITY };
        let scale = sx.min(sy);
        // Centre the scaled box in the frame.
        let ox = padding + (fw - w * scale) / 2.0 - lo[0] * scale;
        let oy = padding + (fh - h * scale) / 2.0 + hi[1] * scale;
        Some(Fit { scale, ox, oy })
    }

    /// Fit geometries by their joint bounding box.
    pub fn for_geometries<'a>(
        geoms: impl Iterator<Item = &'a Geometry>,
        width: f64,
        height: f64,
        padding: f64,
    ) -> Option<Fit> {
        let mut lo = [f64::INFINITY; 2];
        let mut hi = [f64::NEG_INFINITY; 2];
        for g in geoms {
            for [x, y] in g.coords() {
                lo = [lo[0].min(x), lo[1].min(y)];
                hi = [hi[0].max(x), hi[1].max(y)];
            }
        }
        Fit::new(lo, hi, width, height, padding)
    }

    /// Transform one coordinate.
    pub fn apply(&self, c: Coord) -> Coord {
        [self.ox + self.scale * c[0], self.oy - self.scale * c[1]]
    }

    /// Transform a geometry. Rings are kept in their projected order, so
    /// on screen (y down) exteriors run clockwise.
    pub fn apply_geometry(&self, g: &Geometry) -> Geometry {
        let ring = |r: &[Coord]| r.iter().map(|&c| self.apply(c)).collect::<Vec<_>>();
        Geometry {
            polygons: g
                .polygons
                .iter()
                .map(|p| Polygon {
                    exterior: ring(p.exterior()),
                    holes: p.holes().iter().map(|h| ring(h)).collect(),
                })
                .collect(),
            lines: g.lines.iter().map(|l| ring(l)).collect(),
            points: g.points.iter().map(|&c| self.apply(c)).collect(),
        }
    }
}
