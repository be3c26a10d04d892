//! Web Mercator (EPSG:3857, method EPSG:1024): the spherical Mercator
//! formulas with R = a = 6378137 m applied to WGS84 latitude and longitude,
//! x = R·λ, y = R·ln tan(π/4 + φ/2). Latitudes are clamped to ±85.0511287798°
//! (atan(sinh π), where the world becomes a square), so the poles draw on
//! the frame edge rather than at infinity. Far from equal-area.

use super::wrap_lambda;

/// The latitude limit in degrees: atan(sinh(π)).
pub const WEB_MERCATOR_MAX_LAT: f64 = 85.051_128_779_806_59;

/// Web Mercator parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WebMercator {
    /// Central meridian, degrees (0 for EPSG:3857).
    pub lon0: f64,
}

impl WebMercator {
    /// The radius, metres (the WGS84 semi-major axis).
    pub const R: f64 = 6_378_137.0;

    /// Forward projection; latitudes beyond the limit are clamped to it.
    pub fn forward(&self, lon: f64, lat: f64) -> Option<[f64; 2]> {
        let lam = wrap_lambda((lon - self.lon0).to_radians());
        let phi = lat
            .clamp(-WEB_MERCATOR_MAX_LAT, WEB_MERCATOR_MAX_LAT)
            .to_radians();
        let y = Self::R * (std::f64::consts::FRAC_PI_4 + phi / 2.0).tan().ln();
        Some([Self::R * lam, y])
    }
}
