//! Albers equal-area conic on the sphere or an ellipsoid, Snyder (1987),
//! USGS Professional Paper 1395, section 14 (eqs. 14-1 to 14-6 and 3-12):
//!
//! n = (m1² − m2²)/(q2 − q1) (n = sin φ1 when φ1 = φ2), C = m1² + n·q1,
//! ρ = a·sqrt(C − n·q)/n, θ = n(λ − λ0), x = ρ sin θ, y = ρ0 − ρ cos θ.
//! On the sphere q = 2 sin φ and m = cos φ, which gives Snyder's spherical
//! forms n = (sin φ1 + sin φ2)/2, C = cos² φ1 + 2n sin φ1.

use super::{Ellipsoid, wrap_lambda};

/// Albers equal-area conic, set up once from its parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Albers {
    /// First standard parallel, degrees.
    pub lat1: f64,
    /// Second standard parallel, degrees.
    pub lat2: f64,
    /// Latitude of origin, degrees.
    pub lat0: f64,
    /// Central meridian, degrees.
    pub lon0: f64,
    /// Figure of the Earth.
    pub ellipsoid: Ellipsoid,
    n: f64,
    c: f64,
    rho0: f64,
}

impl Albers {
    /// Set up the cone. `None` when the standard parallels are symmetric
    /// about the equator (n = 0, the cone degenerates into a cylinder) or
    /// a parallel is a pole.
    pub fn new(lat1: f64, lat2: f64, lat0: f64, lon0: f64, ellipsoid: Ellipsoid) -> Option<Albers> {
        let (p1, p2) = (lat1.to_radians(), lat2.to_radians());
        if lat1.abs() >= 90.0 || lat2.abs() >= 90.0 {
            return None;
        }
        let (m1, m2) = (ellipsoid.m(p1), ellipsoid.m(p2));
        let (q1, q2) = (ellipsoid.q(p1), ellipsoid.q(p2));
        let n = if (lat1 - lat2).abs() < 1e-10 {
            p1.sin()
        } else {
            (m1 * m1 - m2 * m2) / (q2 - q1)
        };
        if n.abs() < 1e-10 {
            return None;
        }
        let c = m1 * m1 + n * q1;
        let under = c - n * ellipsoid.q(lat0.to_radians());
        let rho0 = ellipsoid.a * under.max(0.0).sqrt() / n;
        Some(Albers {
            lat1,
            lat2,
            lat0,
            lon0,
            ellipsoid,
            n,
            c,
            rho0,
        })
    }

    /// The cone constant n.
    pub fn n(&self) -> f64 {
        self.n
    }

    /// Forward projection of (lon, lat) in degrees to metres.
    pub fn forward(&self, lon: f64, lat: f64) -> Option<[f64; 2]> {
        let lam = wrap_lambda((lon - self.lon0).to_radians());
        let under = self.c - self.n * self.ellipsoid.q(lat.to_radians());
        if under < -1e-12 {
            return None;
        }
        let rho = self.ellipsoid.a * under.max(0.0).sqrt() / self.n;
        let theta = self.n * lam;
        Some([rho * theta.sin(), self.rho0 - rho * theta.cos()])
    }
}
