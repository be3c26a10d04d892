//! The validated geographic model: features with a key and a geometry made
//! of polygons (with holes), lines and points.
//!
//! Conventions, fixed once here so every later stage can rely on them:
//!
//! - Coordinates are `[x, y]` pairs: `[longitude, latitude]` in degrees for
//!   geographic data, or projected units for planar data.
//! - Rings are stored **open**: the closing position that GeoJSON repeats is
//!   dropped, so the last vertex joins the first implicitly.
//! - Rings are wound by the right-hand rule of RFC 7946 section 3.1.6:
//!   exteriors counter-clockwise, holes clockwise, in a y-up plane. Every
//!   projection here preserves orientation, so projected rings keep it; the
//!   y flip for SVG reverses it on screen.
//! - Every ring has at least three vertices.

use serde::Serialize;

/// A coordinate pair `[x, y]` (`[lon, lat]` in degrees before projection).
pub type Coord = [f64; 2];

/// One polygon: an exterior ring and zero or more holes, all open rings.
#[derive(Debug, Clone, PartialEq)]
pub struct Polygon {
    pub(crate) exterior: Vec<Coord>,
    pub(crate) holes: Vec<Vec<Coord>>,
}

impl Polygon {
    /// A polygon from open rings, re-wound to the convention (exterior
    /// counter-clockwise, holes clockwise). Returns `None` if any ring has
    /// fewer than three vertices.
    pub fn new(exterior: Vec<Coord>, holes: Vec<Vec<Coord>>) -> Option<Polygon> {
        if exterior.len() < 3 || holes.iter().any(|h| h.len() < 3) {
            return None;
        }
        let mut p = Polygon { exterior, holes };
        p.rewind();
        Some(p)
    }

    /// The exterior ring (open, counter-clockwise).
    pub fn exterior(&self) -> &[Coord] {
        &self.exterior
    }

    /// The holes (open, clockwise).
    pub fn holes(&self) -> &[Vec<Coord>] {
        &self.holes
    }

    /// All rings, exterior first.
    pub fn rings(&self) -> impl Iterator<Item = &[Coord]> {
        std::iter::once(self.exterior.as_slice()).chain(self.holes.iter().map(|h| h.as_slice()))
    }

    /// Number of vertices over all rings (open rings, so no repeats).
    pub fn vertex_count(&self) -> usize {
        self.rings().map(|r| r.len()).sum()
    }

    /// Apply `f` to every vertex, then restore the winding convention.
    /// Returns `None` if `f` returns `None` for any vertex.
    pub fn try_map(&self, mut f: impl FnMut(Coord) -> Option<Coord>) -> Option<Polygon> {
        let mut map_ring = |r: &[Coord]| r.iter().map(|&c| f(c)).collect::<Option<Vec<_>>>();
        let exterior = map_ring(&self.exterior)?;
        let holes = self
            .holes
            .iter()
            .map(|h| map_ring(h))
            .collect::<Option<Vec<_>>>()?;
        let mut p = Polygon { exterior, holes };
        p.rewind();
        Some(p)
    }

    fn rewind(&mut self) {
        if crate::geo::measure::area::ring_signed_area(&self.exterior) < 0.0 {
            self.exterior.reverse();
        }
        for h in &mut self.holes {
            if crate::geo::measure::area::ring_signed_area(h) > 0.0 {
                h.reverse();
            }
        }
    }
}

/// The geometry of one feature. A GeoJSON GeometryCollection flattens into
/// the three lists; a feature may therefore carry more than one kind.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Geometry {
    /// Polygons (from Polygon and MultiPolygon).
    pub polygons: Vec<Polygon>,
    /// Open lines (from LineString and MultiLineString), two or more vertices.
    pub lines: Vec<Vec<Coord>>,
    /// Points (from Point and MultiPoint).
    pub points: Vec<Coord>,
}

impl Geometry {
    /// True when the geometry holds nothing at all.
    pub fn is_empty(&self) -> bool {
        self.polygons.is_empty() && self.lines.is_empty() && self.points.is_empty()
    }

    /// Number of parts: polygons plus lines plus points.
    pub fn part_count(&self) -> usize {
        self.polygons.len() + self.lines.len() + self.points.len()
    }

    /// Number of vertices over all parts.
    pub fn vertex_count(&self) -> usize {
        self.polygons
            .iter()
            .map(Polygon::vertex_count)
            .sum::<usize>()
            + self.lines.iter().map(Vec::len).sum::<usize>()
            + self.points.len()
    }

    /// Every coordinate of the geometry.
    pub fn coords(&self) -> impl Iterator<Item = Coord> + '_ {
        self.polygons
            .iter()
            .flat_map(|p| p.rings().flat_map(|r| r.iter().copied()))
            .chain(self.lines.iter().flat_map(|l| l.iter().copied()))
            .chain(self.points.iter().copied())
    }
}

/// One feature: its position in the input, its join key and its geometry.
#[derive(Debug, Clone, PartialEq)]
pub struct Feature {
    /// 0-based index of the feature in the input file.
    pub index: usize,
    /// The join key, or `None` if the feature has no such property or id.
    pub key: Option<String>,
    /// The validated geometry, or `None` when the feature was excluded
    /// because of a problem that was not repaired (see [`Layer::problems`]).
    pub geometry: Option<Geometry>,
}

impl Feature {
    /// The key for display: the key, or `#index` when there is none.
    pub fn display_key(&self) -> String {
        self.key
            .clone()
            .unwrap_or_else(|| format!("#{}", self.index))
    }
}

/// What kind of geometry problem was found.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ProblemKind {
    /// A ring whose last position differs from its first.
    UnclosedRing,
    /// A ring with fewer than four positions (three distinct vertices).
    TooFewPositions,
    /// A coordinate that is NaN or infinite, or a position with fewer than
    /// two numbers.
    BadCoordinate,
    /// A latitude outside -90..90 in geographic data.
    LatitudeOutOfRange,
    /// A feature with no geometry or an empty one.
    EmptyGeometry,
    /// A feature without the key property (or id).
    MissingKey,
}

impl ProblemKind {
    /// Whether `repair` has a well-defined fix for this kind.
    pub fn repairable(self) -> bool {
        matches!(
            self,
            ProblemKind::UnclosedRing | ProblemKind::TooFewPositions | ProblemKind::EmptyGeometry
        )
    }
}

/// One geometry problem, located by feature index, key and part.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Problem {
    /// 0-based index of the feature in the input.
    pub feature: usize,
    /// The feature's key (or `#index` when it has none).
    pub key: String,
    /// The kind of problem.
    pub kind: ProblemKind,
    /// Where in the geometry and what was found, for the user.
    pub detail: String,
    /// True when `repair` fixed it; false when the feature was excluded.
    pub repaired: bool,
}

impl Problem {
    /// One line for the user: what, where, and what happened.
    pub fn message(&self) -> String {
        let outcome = if self.repaired {
            match self.kind {
                ProblemKind::UnclosedRing => "repaired: ring closed",
                ProblemKind::TooFewPositions => "repaired: degenerate ring dropped",
                ProblemKind::EmptyGeometry => "repaired: kept as a feature with no geometry",
                _ => "repaired",
            }
        } else if self.kind.repairable() {
            "feature excluded (use repair to fix)"
        } else {
            "feature excluded (no automatic repair)"
        };
        format!("{}; {outcome}", self.detail)
    }
}

/// Whether coordinates are longitude/latitude or already projected.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CoordinateKind {
    /// Degrees of longitude and latitude (RFC 7946).
    Geographic,
    /// Already-projected planar coordinates (no latitude check).
    Planar,
}

/// A set of features read from one file, with every problem found.
#[derive(Debug, Clone, PartialEq)]
pub struct Layer {
    pub(crate) features: Vec<Feature>,
    pub(crate) problems: Vec<Problem>,
    pub(crate) coordinates: CoordinateKind,
}

impl Layer {
    /// Build a layer (used by the readers and by tests).
    pub fn new(
        features: Vec<Feature>,
        problems: Vec<Problem>,
        coordinates: CoordinateKind,
    ) -> Self {
        Layer {
            features,
            problems,
            coordinates,
        }
    }

    /// All features in input order, including excluded ones.
    pub fn features(&self) -> &[Feature] {
        &self.features
    }

    /// Every problem found, in input order.
    pub fn problems(&self) -> &[Problem] {
        &self.problems
    }

    /// Problems that were not repaired (their features are excluded).
    pub fn unrepaired(&self) -> impl Iterator<Item = &Problem> {
        self.problems.iter().filter(|p| !p.repaired)
    }

    /// Whether the coordinates are geographic or planar.
    pub fn coordinates(&self) -> CoordinateKind {
        self.coordinates
    }

    /// Features with a usable geometry.
    pub fn usable(&self) -> impl Iterator<Item = (&Feature, &Geometry)> {
        self.features
            .iter()
            .filter_map(|f| f.geometry.as_ref().map(|g| (f, g)))
    }

    /// An error listing every unrepaired problem, for callers that refuse
    /// to go on with excluded features (the default for figures).
    pub fn require_clean(&self, path: &std::path::Path) -> crate::error::Result<()> {
        let bad: Vec<String> = self
            .unrepaired()
            .map(|p| format!("feature {} ('{}'): {}", p.feature, p.key, p.message()))
            .collect();
        if bad.is_empty() {
            Ok(())
        } else {
            Err(crate::error::Error::Invalid {
                path: path.to_path_buf(),
                location: None,
                message: format!("{} geometry problem(s):\n  {}", bad.len(), bad.join("\n  ")),
            })
        }
    }
}
