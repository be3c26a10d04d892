//! Equirectangular (plate carrée when the true-scale parallel is 0):
//! x = a·λ·cos φ_ts, y = a·φ, the spherical formulas with the semi-major
//! axis, as PROJ's `eqc` applies them on an ellipsoid. Not equal-area.

use super::{Ellipsoid, wrap_lambda};

/// Equirectangular projection parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Equirectangular {
    /// Central meridian, degrees.
    pub lon0: f64,
    /// Latitude of true scale, degrees.
    pub lat_ts: f64,
    /// Figure of the Earth (only `a` is used).
    pub ellipsoid: Ellipsoid,
}

impl Equirectangular {
    /// Forward projection of (lon, lat) in degrees to metres.
    pub fn forward(&self, lon: f64, lat: f64) -> Option<[f64; 2]> {
        let lam = wrap_lambda((lon - self.lon0).to_radians());
        let a = self.ellipsoid.a;
        Some([
            a * lam * self.lat_ts.to_radians().cos(),
            a * lat.to_radians(),
        ])
    }
}
