//! Choosing a projection and its parameters from the data's extent.
//!
//! Documented defaults:
//!
//! - planar data: `planar`, the only choice;
//! - an extent reaching within 10° of a pole and not beyond 30° into the
//!   other hemisphere: Lambert azimuthal equal-area centred on that pole
//!   (whatever its longitude span);
//! - a whole-world extent (longitude span over 180° or latitude span over
//!   90°): Equal Earth, central meridian 0 when the span exceeds 300°,
//!   otherwise the extent's centre;
//! - an extent that straddles the equator: Lambert azimuthal equal-area
//!   centred on the extent (an Albers cone with parallels on both sides of
//!   the equator degenerates);
//! - otherwise Albers equal-area conic with standard parallels at one sixth
//!   and five sixths of the latitude range (Deetz & Adams 1934, as given in
//!   Snyder 1987 section 14), latitude of origin and central meridian at the
//!   extent's centre.
//!
//! Every default is equal-area. A requested projection takes its missing
//! parameters from the same rules; for an areal purpose (a choropleth) a
//! projection that is not equal-area draws a warning.

use super::{
    Albers, Ellipsoid, EqualEarth, Equirectangular, LambertAzimuthal, Planar, Projection,
    ProjectionName, WebMercator,
};
use crate::geo::extent::Extent;
use crate::geo::model::CoordinateKind;

/// What the map is for, which decides warnings.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Purpose {
    /// Areas are compared (choropleths, area reports): equal-area matters.
    Areal,
    /// Reference or context maps: any projection goes.
    Reference,
}

/// The chosen projection, why, and any warnings.
#[derive(Debug, Clone, PartialEq)]
pub struct Choice {
    /// The projection.
    pub projection: Projection,
    /// How it was chosen, for the user.
    pub reason: String,
    /// Warnings (a non-equal-area projection for an areal purpose).
    pub warnings: Vec<String>,
}

/// Choose a projection for data with the given extent. `requested` is the
/// user's choice, `None` for the default. The error is a message.
pub fn choose_projection(
    extent: Option<Extent>,
    coordinates: CoordinateKind,
    requested: Option<ProjectionName>,
    ellipsoid: Ellipsoid,
    purpose: Purpose,
) -> Result<Choice, String> {
    if coordinates == CoordinateKind::Planar {
        return match requested {
            None | Some(ProjectionName::Planar) => Ok(Choice {
                projection: Projection::Planar(Planar),
                reason: "the data is already projected (planar coordinates)".into(),
                warnings: Vec::new(),
            }),
            Some(other) => Err(format!(
                "projection '{other}' needs longitude/latitude data, but the data is planar; use 'planar'"
            )),
        };
    }
    let ext = extent.unwrap_or(Extent {
        lon_min: -180.0,
        lon_max: 180.0,
        lat_min: -90.0,
        lat_max: 90.0,
    });
    let world = ext.lon_span() > 180.0 || ext.lat_span() > 90.0;
    let lon0 = if ext.lon_span() > 300.0 {
        0.0
    } else {
        round_param(ext.centre_lon())
    };
    let polar = if ext.lat_max >= 80.0 && ext.lat_min >= -30.0 {
        Some(90.0)
    } else if ext.lat_min <= -80.0 && ext.lat_max <= 30.0 {
        Some(-90.0)
    } else {
        None
    };
    let name = match requested {
        Some(n) => n,
        None if polar.is_some() => ProjectionName::LambertAzimuthal,
        None if world => ProjectionName::EqualEarth,
        None if ext.lat_min < 0.0 && ext.lat_max > 0.0 => ProjectionName::LambertAzimuthal,
        None => ProjectionName::Albers,
    };
    let lat1 = round_param(ext.lat_min + ext.lat_span() / 6.0);
    let lat2 = round_param(ext.lat_max - ext.lat_span() / 6.0);
    let (projection, reason) = match name {
        ProjectionName::Planar => {
            return Err(
                "projection 'planar' is for projected data, but the data is longitude/latitude"
                    .into(),
            );
        }
        ProjectionName::Equirectangular => (
            Projection::Equirectangular(Equirectangular {
                lon0,
                lat_ts: 0.0,
                ellipsoid,
            }),
            "central meridian at the extent's centre".to_string(),
        ),
        ProjectionName::WebMercator => (
            Projection::WebMercator(WebMercator { lon0: 0.0 }),
            "EPSG:3857 is fixed: central meridian 0, WGS84 semi-major axis".to_string(),
        ),
        ProjectionName::EqualEarth => (
            Projection::EqualEarth(EqualEarth { lon0, ellipsoid }),
            if world && requested.is_none() {
                "whole-world extent: Equal Earth".to_string()
            } else {
                "central meridian at the extent's centre".to_string()
            },
        ),
        ProjectionName::LambertAzimuthal => {
            let (lat0, why) = match polar {
                Some(p) => (p, "extent reaches a pole: polar aspect"),
                None => (
                    round_param(ext.centre_lat()),
                    "centred on the extent (it straddles the equator or was requested)",
                ),
            };
            (
                Projection::LambertAzimuthal(LambertAzimuthal::new(
                    lat0, lon0, 0.0, 0.0, ellipsoid,
                )),
                why.to_string(),
            )
        }
        ProjectionName::Albers => {
            let lat0 = round_param(ext.centre_lat());
            let a = Albers::new(lat1, lat2, lat0, lon0, ellipsoid).ok_or_else(|| {
                format!(
                    "Albers needs standard parallels that are not symmetric about the equator; \
                     the extent gives {lat1} and {lat2}: choose lambert-azimuthal or equal-earth"
                )
            })?;
            (
                Projection::Albers(a),
                "standard parallels at 1/6 and 5/6 of the latitude range, origin at the extent's centre"
                    .to_string(),
            )
        }
    };
    let mut warnings = Vec::new();
    if purpose == Purpose::Areal && !name.is_equal_area() {
        warnings.push(format!(
            "projection '{name}' is not equal-area: shapes far from its centre are drawn larger or \
             smaller than they are, which biases a choropleth; areas reported are map areas only"
        ));
    }
    let reason = if requested.is_none() {
        format!("default for this extent, equal-area ({reason})")
    } else {
        format!("requested ({reason})")
    };
    Ok(Choice {
        projection,
        reason,
        warnings,
    })
}

/// Round a derived parameter to 1e-6 degrees, so reports show clean values
/// and tiny changes in the data do not change every coordinate.
fn round_param(v: f64) -> f64 {
    (v * 1e6).round() / 1e6
}
