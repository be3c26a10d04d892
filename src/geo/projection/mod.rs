//! Map projections from longitude/latitude (degrees) to planar metres, one
//! file per projection, plus the defaults chosen from the data's extent.
//!
//! Every projection reduces λ − λ0 into [−180°, 180°] the way PROJ does
//! (values already inside are kept, so +180° stays +180° when λ0 = 0), and
//! returns `None` where it has no value (the antipode of an azimuthal
//! centre). Axis order is always (lon, lat) -> (x = easting, y = northing).

pub mod albers;
pub mod choose;
pub mod ellipsoid;
pub mod equal_earth;
pub mod equirectangular;
pub mod lambert_azimuthal;
pub mod planar;
pub mod web_mercator;

use std::collections::BTreeMap;
use std::fmt;
use std::str::FromStr;

pub use albers::Albers;
pub use choose::{Purpose, choose_projection};
pub use ellipsoid::Ellipsoid;
pub use equal_earth::EqualEarth;
pub use equirectangular::Equirectangular;
pub use lambert_azimuthal::LambertAzimuthal;
pub use planar::Planar;
pub use web_mercator::{WEB_MERCATOR_MAX_LAT, WebMercator};

use crate::geo::model::{Coord, Geometry};

/// Reduce an angle in radians into [−π, π] as PROJ's `adjlon` does: an
/// angle already within π (plus a hair) is returned unchanged.
pub fn wrap_lambda(lam: f64) -> f64 {
    use std::f64::consts::PI;
    if lam.abs() < PI + 1e-12 {
        return lam;
    }
    let t = lam + PI;
    t - 2.0 * PI * (t / (2.0 * PI)).floor() - PI
}

/// The projection names accepted on the command line.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum ProjectionName {
    /// Equirectangular (not equal-area).
    Equirectangular,
    /// Web Mercator, EPSG:3857 (not equal-area).
    WebMercator,
    /// Albers equal-area conic.
    Albers,
    /// Lambert azimuthal equal-area.
    LambertAzimuthal,
    /// Equal Earth.
    EqualEarth,
    /// Already-projected data.
    Planar,
}

impl ProjectionName {
    /// Every name, in documentation order.
    pub const ALL: [ProjectionName; 6] = [
        ProjectionName::Equirectangular,
        ProjectionName::WebMercator,
        ProjectionName::Albers,
        ProjectionName::LambertAzimuthal,
        ProjectionName::EqualEarth,
        ProjectionName::Planar,
    ];

    /// The command-line spelling.
    pub fn as_str(self) -> &'static str {
        match self {
            ProjectionName::Equirectangular => "equirectangular",
            ProjectionName::WebMercator => "web-mercator",
            ProjectionName::Albers => "albers",
            ProjectionName::LambertAzimuthal => "lambert-azimuthal",
            ProjectionName::EqualEarth => "equal-earth",
            ProjectionName::Planar => "planar",
        }
    }

    /// Whether areas on the map are proportional to areas on the ground.
    /// `planar` counts as equal-area: it keeps whatever the data has.
    pub fn is_equal_area(self) -> bool {
        !matches!(
            self,
            ProjectionName::Equirectangular | ProjectionName::WebMercator
        )
    }
}

impl fmt::Display for ProjectionName {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

impl FromStr for ProjectionName {
    type Err = String;
    fn from_str(s: &str) -> Result<Self, String> {
        ProjectionName::ALL
            .into_iter()
            .find(|n| n.as_str() == s)
            .ok_or_else(|| {
                let names: Vec<&str> = ProjectionName::ALL.iter().map(|n| n.as_str()).collect();
                format!(
                    "unknown projection '{s}'; expected one of {}",
                    names.join(", ")
                )
            })
    }
}

/// A projection with all its parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Projection {
    /// See [`Equirectangular`].
    Equirectangular(Equirectangular),
    /// See [`WebMercator`].
    WebMercator(WebMercator),
    /// See [`Albers`].
    Albers(Albers),
    /// See [`LambertAzimuthal`].
    LambertAzimuthal(LambertAzimuthal),
    /// See [`EqualEarth`].
    EqualEarth(EqualEarth),
    /// See [`Planar`].
    Planar(Planar),
}

impl Projection {
    /// Its name.
    pub fn name(&self) -> ProjectionName {
        match self {
            Projection::Equirectangular(_) => ProjectionName::Equirectangular,
            Projection::WebMercator(_) => ProjectionName::WebMercator,
            Projection::Albers(_) => ProjectionName::Albers,
            Projection::LambertAzimuthal(_) => ProjectionName::LambertAzimuthal,
            Projection::EqualEarth(_) => ProjectionName::EqualEarth,
            Projection::Planar(_) => ProjectionName::Planar,
        }
    }

    /// Forward projection of (lon, lat) in degrees (or planar x, y).
    pub fn forward(&self, lon: f64, lat: f64) -> Option<Coord> {
        match self {
            Projection::Equirectangular(p) => p.forward(lon, lat),
            Projection::WebMercator(p) => p.forward(lon, lat),
            Projection::Albers(p) => p.forward(lon, lat),
            Projection::LambertAzimuthal(p) => p.forward(lon, lat),
            Projection::EqualEarth(p) => p.forward(lon, lat),
            Projection::Planar(p) => p.forward(lon, lat),
        }
    }

    /// Every parameter, by name, for reports. Angles in degrees, lengths in
    /// metres; `a` and `e2` describe the ellipsoid (e2 = 0: a sphere).
    pub fn params(&self) -> BTreeMap<&'static str, f64> {
        let (own, ellipsoid): (Vec<(&'static str, f64)>, Option<&Ellipsoid>) = match self {
            Projection::Equirectangular(p) => (
                vec![("lon_0", p.lon0), ("lat_ts", p.lat_ts)],
                Some(&p.ellipsoid),
            ),
            Projection::WebMercator(p) => (
                vec![
                    ("lon_0", p.lon0),
                    ("a", WebMercator::R),
                    ("max_lat", WEB_MERCATOR_MAX_LAT),
                ],
                None,
            ),
            Projection::Albers(p) => (
                vec![
                    ("lat_1", p.lat1),
                    ("lat_2", p.lat2),
                    ("lat_0", p.lat0),
                    ("lon_0", p.lon0),
                ],
                Some(&p.ellipsoid),
            ),
            Projection::LambertAzimuthal(p) => (
                vec![
                    ("lat_0", p.lat0),
                    ("lon_0", p.lon0),
                    ("x_0", p.x0),
                    ("y_0", p.y0),
                ],
                Some(&p.ellipsoid),
            ),
            Projection::EqualEarth(p) => (vec![("lon_0", p.lon0)], Some(&p.ellipsoid)),
            Projection::Planar(_) => (Vec::new(), None),
        };
        let mut m: BTreeMap<&'static str, f64> = own.into_iter().collect();
        if let Some(e) = ellipsoid {
            m.insert("a", e.a);
            m.insert("e2", e.e2);
        }
        m
    }

    /// The central meridian whose opposite (λ0 + 180°) is a cut on the
    /// map, for projections where that meridian is the frame edge
    /// (cylindrical, pseudo-cylindrical, conic). `None` for the azimuthal
    /// and planar ones, which need no cut.
    pub fn cut_meridian_centre(&self) -> Option<f64> {
        match self {
            Projection::Equirectangular(p) => Some(p.lon0),
            Projection::WebMercator(p) => Some(p.lon0),
            Projection::Albers(p) => Some(p.lon0),
            Projection::EqualEarth(p) => Some(p.lon0),
            Projection::LambertAzimuthal(_) | Projection::Planar(_) => None,
        }
    }

    /// Project a geometry. Rings and lines that cross the meridian opposite
    /// the centre are first cut there ([`crate::geo::antimeridian`]); then
    /// edges longer than `densify_degrees` (when positive) are split into
    /// equal steps in longitude/latitude, which RFC 7946 treats as
    /// straight; without it a projected edge is the chord between projected
    /// vertices. `None` when any vertex has no image.
    pub fn project_geometry(&self, g: &Geometry, densify_degrees: f64) -> Option<Geometry> {
        use crate::geo::{antimeridian, densify};
        let f = |c: Coord| self.forward(c[0], c[1]);
        let cut = self.cut_meridian_centre();
        let mut polygons = Vec::with_capacity(g.polygons.len());
        for p in &g.polygons {
            let pieces = match cut {
                Some(lon0) => antimeridian::cut_polygon(p, lon0),
                None => vec![p.clone()],
            };
            for piece in pieces {
                let piece = if densify_degrees > 0.0 {
                    densify::densify_polygon(&piece, densify_degrees)
                } else {
                    piece
                };
                polygons.push(piece.try_map(f)?);
            }
        }
        let mut lines = Vec::with_capacity(g.lines.len());
        for l in &g.lines {
            let pieces = match cut {
                Some(lon0) => antimeridian::cut_line(l, lon0),
                None => vec![l.clone()],
            };
            for piece in pieces {
                let piece = if densify_degrees > 0.0 {
                    densify::densify_path(&piece, densify_degrees, false)
                } else {
                    piece
                };
                lines.push(piece.into_iter().map(f).collect::<Option<Vec<_>>>()?);
            }
        }
        let points = g.points.iter().map(|&c| f(c)).collect::<Option<Vec<_>>>()?;
        Some(Geometry {
            polygons,
            lines,
            points,
        })
    }
}
