//! The figure of the Earth and the authalic (equal-area) helpers shared by
//! the ellipsoidal projections (Snyder 1987, eqs. 3-12 and 14-15).

/// An ellipsoid of revolution, or a sphere when `e2 == 0`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Ellipsoid {
    /// Semi-major axis (the radius of a sphere), metres.
    pub a: f64,
    /// First eccentricity squared.
    pub e2: f64,
}

impl Ellipsoid {
    /// WGS84: a = 6378137 m, 1/f = 298.257223563 (NIMA TR8350.2).
    pub fn wgs84() -> Ellipsoid {
        let f = 1.0 / 298.257_223_563;
        Ellipsoid {
            a: 6_378_137.0,
            e2: f * (2.0 - f),
        }
    }

    /// The sphere with the same surface area as WGS84, R = 6371007.181 m
    /// (the authalic radius; the value as tabulated in common practice).
    pub fn authalic_sphere() -> Ellipsoid {
        Ellipsoid::sphere(6_371_007.181)
    }

    /// A sphere of radius `r`.
    pub fn sphere(r: f64) -> Ellipsoid {
        Ellipsoid { a: r, e2: 0.0 }
    }

    /// An ellipsoid from its semi-major axis and eccentricity squared.
    pub fn new(a: f64, e2: f64) -> Ellipsoid {
        Ellipsoid { a, e2 }
    }

    /// True when this is a sphere.
    pub fn is_sphere(&self) -> bool {
        self.e2 == 0.0
    }

    /// Eccentricity.
    pub fn e(&self) -> f64 {
        self.e2.sqrt()
    }

    /// Snyder eq. 14-15: m = cos φ / sqrt(1 − e² sin² φ).
    pub fn m(&self, phi: f64) -> f64 {
        let s = phi.sin();
        phi.cos() / (1.0 - self.e2 * s * s).sqrt()
    }

    /// Snyder eq. 3-12: q(φ) = (1−e²)[sin φ/(1−e² sin²φ) −
    /// (1/2e) ln((1−e sin φ)/(1+e sin φ))]; 2 sin φ on the sphere.
    pub fn q(&self, phi: f64) -> f64 {
        let s = phi.sin();
        if self.e2 == 0.0 {
            return 2.0 * s;
        }
        let e = self.e();
        let es = e * s;
        (1.0 - self.e2) * (s / (1.0 - es * es) - (1.0 / (2.0 * e)) * ((1.0 - es) / (1.0 + es)).ln())
    }

    /// q at the pole.
    pub fn qp(&self) -> f64 {
        self.q(std::f64::consts::FRAC_PI_2)
    }

    /// Sine of the authalic latitude, q(φ)/q_p, clamped to [-1, 1].
    pub fn sin_authalic(&self, phi: f64) -> f64 {
        (self.q(phi) / self.qp()).clamp(-1.0, 1.0)
    }

    /// The authalic radius R_q = a·sqrt(q_p/2).
    pub fn authalic_radius(&self) -> f64 {
        self.a * (self.qp() / 2.0).sqrt()
    }
}
