//! The geographic extent of data: latitude range and the narrowest
//! longitude range that covers every vertex, across the antimeridian if
//! that is narrower (an island group straddling 180° has a small extent).

use super::model::Coord;

/// A lon/lat extent. `lon_max` may exceed 180 when the extent crosses the
/// antimeridian (e.g. 170..190 for 170°E to 170°W).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Extent {
    /// Western edge, degrees in [-180, 180).
    pub lon_min: f64,
    /// Eastern edge, degrees, `>= lon_min`.
    pub lon_max: f64,
    /// Southern edge, degrees.
    pub lat_min: f64,
    /// Northern edge, degrees.
    pub lat_max: f64,
}

impl Extent {
    /// The extent of `coords`, or `None` when there are none.
    pub fn of(coords: impl Iterator<Item = Coord>) -> Option<Extent> {
        let mut lons = Vec::new();
        let (mut lat_min, mut lat_max) = (f64::INFINITY, f64::NEG_INFINITY);
        for [lon, lat] in coords {
            lons.push((lon + 180.0).rem_euclid(360.0) - 180.0);
            lat_min = lat_min.min(lat);
            lat_max = lat_max.max(lat);
        }
        if lons.is_empty() {
            return None;
        }
        lons.sort_by(f64::total_cmp);
        lons.dedup();
        // The widest empty gap between consecutive longitudes (cyclic);
        // the extent is everything else.
        let n = lons.len();
        let mut gap = lons[0] + 360.0 - lons[n - 1];
        let mut start = 0usize; // index of the first longitude after the gap
        for i in 1..n {
            let g = lons[i] - lons[i - 1];
            if g > gap {
                gap = g;
                start = i;
            }
        }
        let lon_min = lons[start];
        let mut lon_max = if start == 0 {
            lons[n - 1]
        } else {
            lons[start - 1] + 360.0
        };
        // Data reaching both -180 and 180 with no larger gap: whole world.
        if lon_max - lon_min >= 360.0 {
            lon_max = lon_min + 360.0;
        }
        Some(Extent {
            lon_min,
            lon_max,
            lat_min,
            lat_max,
        })
    }

    /// Longitude span in degrees.
    pub fn lon_span(&self) -> f64 {
        self.lon_max - self.lon_min
    }

    /// Latitude span in degrees.
    pub fn lat_span(&self) -> f64 {
        self.lat_max - self.lat_min
    }

    /// Central meridian, in [-180, 180).
    pub fn centre_lon(&self) -> f64 {
        ((self.lon_min + self.lon_max) / 2.0 + 180.0).rem_euclid(360.0) - 180.0
    }

    /// Middle latitude.
    pub fn centre_lat(&self) -> f64 {
        (self.lat_min + self.lat_max) / 2.0
    }
}
