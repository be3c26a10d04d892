//! A generator of invented boundary data: N grid cells whose borders wind
//! and are shared exactly, vertex for vertex, by the two cells on either
//! side, like a real boundary set. Used by tests and the ingest benchmark.
//!
//! The grid covers 120°W..70°W, 25°N..50°N (an invented layout). Interior
//! borders carry `per_border` intermediate vertices offset from the
//! straight line by a deterministic pseudo-random amount that vanishes at
//! the corners, so borders never cross; the outer frame is straight.

use std::fmt::Write as _;

use super::model::{Coord, Geometry, Polygon};

/// The layout of a generated grid.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Grid {
    /// Columns.
    pub nx: usize,
    /// Rows.
    pub ny: usize,
    /// Number of cells (the last row may be partial).
    pub cells: usize,
    /// Intermediate vertices per border.
    pub per_border: usize,
    /// Seed of the offsets.
    pub seed: u64,
}

impl Grid {
    /// A near-square grid of `cells` cells.
    pub fn new(cells: usize, per_border: usize, seed: u64) -> Grid {
        let nx = ((cells as f64).sqrt().ceil() as usize).max(1);
        let ny = cells.div_ceil(nx).max(1);
        Grid {
            nx,
            ny,
            cells,
            per_border,
            seed,
        }
    }

    fn cell_size(&self) -> f64 {
        (50.0 / self.nx as f64).min(25.0 / self.ny as f64)
    }

    /// Offset in cell units of vertex `k` on a border (splitmix64 hash).
    fn offset(&self, kind: u64, i: usize, j: usize, k: usize) -> f64 {
        let z = crate::random::finalize(
            self.seed
                ^ kind.wrapping_mul(0x9E37_79B9_7F4A_7C15)
                ^ (i as u64).wrapping_mul(0xBF58_476D_1CE4_E5B9)
                ^ (j as u64).wrapping_mul(0x94D0_49BB_1331_11EB)
                ^ (k as u64).wrapping_mul(0x2545_F491_4F6C_DD1D),
        );
        ((z >> 11) as f64 / (1u64 << 53) as f64 - 0.5) * 0.2
    }

    fn lonlat(&self, x: f64, y: f64) -> Coord {
        let s = self.cell_size();
        [-120.0 + x * s, 25.0 + y * s]
    }

    /// Vertical border at column line `i`, from row line `j` to `j + 1`.
    fn vertical(&self, i: usize, j: usize) -> Vec<Coord> {
        let frame = i == 0 || i == self.nx || self.cell(i, j).is_none();
        self.border(1, i, j, frame, |t, off| [i as f64 + off, j as f64 + t])
    }

    /// Horizontal border at row line `j`, from column line `i` to `i + 1`.
    fn horizontal(&self, i: usize, j: usize) -> Vec<Coord> {
        let frame = j == 0 || j == self.ny || self.cell(i, j).is_none();
        self.border(2, i, j, frame, |t, off| [i as f64 + t, j as f64 + off])
    }

    /// The vertices of one border: `at(t, offset)` places parameter `t` in
    /// 0..=1 with its sideways offset (zero on the frame and at the ends).
    fn border(
        &self,
        kind: u64,
        i: usize,
        j: usize,
        frame: bool,
        at: impl Fn(f64, f64) -> [f64; 2],
    ) -> Vec<Coord> {
        let n = self.per_border;
        (0..=n + 1)
            .map(|k| {
                let t = k as f64 / (n + 1) as f64;
                let off = if frame {
                    0.0
                } else {
                    self.offset(kind, i, j, k) * 4.0 * t * (1.0 - t)
                };
                let [x, y] = at(t, off);
                self.lonlat(x, y)
            })
            .collect()
    }

    /// Cell index at column `i`, row `j`, if it exists.
    fn cell(&self, i: usize, j: usize) -> Option<usize> {
        let c = j * self.nx + i;
        (i < self.nx && c < self.cells).then_some(c)
    }

    /// The open, counter-clockwise ring of cell `c`.
    pub fn ring(&self, c: usize) -> Vec<Coord> {
        let (i, j) = (c % self.nx, c / self.nx);
        let mut r = Vec::new();
        let mut push = |mut side: Vec<Coord>, reverse: bool| {
            if reverse {
                side.reverse();
            }
            side.pop();
            r.extend(side);
        };
        push(self.horizontal(i, j), false);
        push(self.vertical(i + 1, j), false);
        push(self.horizontal(i, j + 1), true);
        push(self.vertical(i, j), true);
        r
    }

    /// All cells as geometries (lon/lat).
    pub fn geometries(&self) -> Vec<Geometry> {
        (0..self.cells)
            .map(|c| Geometry {
                polygons: vec![Polygon {
                    exterior: self.ring(c),
                    holes: vec![],
                }],
                ..Geometry::default()
            })
            .collect()
    }

    /// All cells as a GeoJSON FeatureCollection with property `code`
    /// (`C` + the cell number) and a numeric `id`.
    pub fn geojson(&self) -> String {
        let mut s = String::from("{\"type\":\"FeatureCollection\",\"features\":[\n");
        for c in 0..self.cells {
            if c > 0 {
                s.push_str(",\n");
            }
            let _ = write!(
                s,
                "{{\"type\":\"Feature\",\"id\":{c},\"properties\":{{\"code\":\"C{c}\"}},\
                 \"geometry\":{{\"type\":\"Polygon\",\"coordinates\":[["
            );
            let ring = self.ring(c);
            for p in ring.iter().chain(std::iter::once(&ring[0])) {
                let _ = write!(s, "[{},{}],", p[0], p[1]);
            }
            s.pop();
            s.push_str("]]}}");
        }
        s.push_str("\n]}\n");
        s
    }
}
