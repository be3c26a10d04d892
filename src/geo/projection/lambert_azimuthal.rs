//! Lambert azimuthal equal-area on the sphere or an ellipsoid, Snyder
//! (1987) section 24, with the authalic latitude β = asin(q/q_p) and
//! R_q = a·sqrt(q_p/2):
//!
//! oblique: B = R_q·sqrt(2/(1 + sin β1 sin β + cos β1 cos β cos(λ−λ0))),
//! D = a·m1/(R_q cos β1), x = B·D·cos β sin(λ−λ0),
//! y = (B/D)(cos β1 sin β − sin β1 cos β cos(λ−λ0));
//! polar (φ1 = ±90°): ρ = a·sqrt(q_p ∓ q), x = ρ sin(λ−λ0), y = ∓ρ cos(λ−λ0).
//! On the sphere β = φ, R_q = a and D = 1. The antipode of the centre has
//! no single image (it is the bounding circle) and projects to `None`.

use super::{Ellipsoid, wrap_lambda};

/// Lambert azimuthal equal-area, set up once from its parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LambertAzimuthal {
    /// Latitude of the centre, degrees.
    pub lat0: f64,
    /// Longitude of the centre, degrees.
    pub lon0: f64,
    /// False easting, metres.
    pub x0: f64,
    /// False northing, metres.
    pub y0: f64,
    /// Figure of the Earth.
    pub ellipsoid: Ellipsoid,
    qp: f64,
    sinb1: f64,
    cosb1: f64,
    rq: f64,
    d: f64,
}

impl LambertAzimuthal {
    /// Set up the projection centred on (lon0, lat0).
    pub fn new(lat0: f64, lon0: f64, x0: f64, y0: f64, ellipsoid: Ellipsoid) -> LambertAzimuthal {
        let phi1 = lat0.to_radians();
        let qp = ellipsoid.qp();
        let sinb1 = ellipsoid.sin_authalic(phi1);
        let cosb1 = (1.0 - sinb1 * sinb1).max(0.0).sqrt();
        let rq = ellipsoid.authalic_radius();
        let d = if cosb1 > 1e-10 {
            ellipsoid.a * ellipsoid.m(phi1) / (rq * cosb1)
        } else {
            1.0
        };
        LambertAzimuthal {
            lat0,
            lon0,
            x0,
            y0,
            ellipsoid,
            qp,
            sinb1,
            cosb1,
            rq,
            d,
        }
    }

    /// Forward projection of (lon, lat) in degrees to metres.
    pub fn forward(&self, lon: f64, lat: f64) -> Option<[f64; 2]> {
        let lam = wrap_lambda((lon - self.lon0).to_radians());
        let phi = lat.to_radians();
        let (sinlam, coslam) = lam.sin_cos();
        let a = self.ellipsoid.a;
        if 90.0 - self.lat0.abs() < 1e-10 {
            let q = self.ellipsoid.q(phi);
            let (under, sign) = if self.lat0 > 0.0 {
                (self.qp - q, -1.0)
            } else {
                (self.qp + q, 1.0)
            };
            // The opposite pole is the bounding circle, not a point.
            if (2.0 * self.qp - under).abs() < 1e-12 {
                return None;
            }
            let rho = a * under.max(0.0).sqrt();
            return Some([self.x0 + rho * sinlam, self.y0 + sign * rho * coslam]);
        }
        let sinb = self.ellipsoid.sin_authalic(phi);
        let cosb = (1.0 - sinb * sinb).max(0.0).sqrt();
        let den = 1.0 + self.sinb1 * sinb + self.cosb1 * cosb * coslam;
        if den < 1e-10 {
            return None;
        }
        let b = self.rq * (2.0 / den).sqrt();
        Some([
            self.x0 + b * self.d * cosb * sinlam,
            self.y0 + (b / self.d) * (self.cosb1 * sinb - self.sinb1 * cosb * coslam),
        ])
    }
}
