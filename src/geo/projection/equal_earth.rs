//! Equal Earth, Šavrič, Patterson & Jenny (2018), "The Equal Earth map
//! projection", IJGIS, doi:10.1080/13658816.2018.1504949, with the
//! ellipsoidal form through the authalic latitude:
//!
//! sin β = q/q_p (sin φ on the sphere), θ = asin(M sin β), M = √3/2,
//! x = R_q·λ cos θ / (M (A1 + 3A2 θ² + θ⁶(7A3 + 9A4 θ²))),
//! y = R_q·θ (A1 + A2 θ² + θ⁶(A3 + A4 θ²)), R_q = a·sqrt(q_p/2).

use super::{Ellipsoid, wrap_lambda};

const A1: f64 = 1.340264;
const A2: f64 = -0.081106;
const A3: f64 = 0.000893;
const A4: f64 = 0.003796;

/// Equal Earth parameters.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EqualEarth {
    /// Central meridian, degrees.
    pub lon0: f64,
    /// Figure of the Earth.
    pub ellipsoid: Ellipsoid,
}

impl EqualEarth {
    /// Forward projection of (lon, lat) in degrees to metres.
    pub fn forward(&self, lon: f64, lat: f64) -> Option<[f64; 2]> {
        let m = 3f64.sqrt() / 2.0;
        let lam = wrap_lambda((lon - self.lon0).to_radians());
        let sinb = self.ellipsoid.sin_authalic(lat.to_radians());
        let rq = self.ellipsoid.authalic_radius();
        let t = (m * sinb).asin();
        let t2 = t * t;
        let t6 = t2 * t2 * t2;
        let x = lam * t.cos() / (m * (A1 + 3.0 * A2 * t2 + t6 * (7.0 * A3 + 9.0 * A4 * t2)));
        let y = t * (A1 + A2 * t2 + t6 * (A3 + A4 * t2));
        Some([rq * x, rq * y])
    }
}
