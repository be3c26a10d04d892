//! CIELAB 1976 and its polar form CIELCh(ab), relative to a chosen white.
//!
//! hueproof's own measurements use D65 ([`super::xyz::D65_WHITE`]). CSS
//! `lab()`/`lch()` use D50; the parser adapts those with Bradford.

use super::xyz::{D65_WHITE, Xyz};

/// CIE epsilon, 216/24389.
pub const EPSILON: f64 = 216.0 / 24389.0;
/// CIE kappa, 24389/27.
pub const KAPPA: f64 = 24389.0 / 27.0;

/// A CIELAB colour: L* in 0..100, a* and b* unbounded.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Lab {
    /// Lightness L*.
    pub l: f64,
    /// Green-red a*.
    pub a: f64,
    /// Blue-yellow b*.
    pub b: f64,
}

/// CIELCh(ab): lightness, chroma and hue angle in degrees (0..360).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Lch {
    /// Lightness L*.
    pub l: f64,
    /// Chroma C*ab.
    pub c: f64,
    /// Hue angle h_ab in degrees, 0..360.
    pub h: f64,
}

fn f(t: f64) -> f64 {
    if t > EPSILON {
        t.cbrt()
    } else {
        (KAPPA * t + 16.0) / 116.0
    }
}

impl Xyz {
    /// CIELAB relative to D65.
    pub fn to_lab(self) -> Lab {
        self.to_lab_with_white(D65_WHITE)
    }

    /// CIELAB relative to `white`.
    pub fn to_lab_with_white(self, white: Xyz) -> Lab {
        let fx = f(self.x / white.x);
        let fy = f(self.y / white.y);
        let fz = f(self.z / white.z);
        Lab {
            l: 116.0 * fy - 16.0,
            a: 500.0 * (fx - fy),
            b: 200.0 * (fy - fz),
        }
    }
}

impl Lab {
    /// A colour from L*, a*, b*.
    pub const fn new(l: f64, a: f64, b: f64) -> Self {
        Lab { l, a, b }
    }

    /// The values as an array.
    pub fn to_array(self) -> [f64; 3] {
        [self.l, self.a, self.b]
    }

    /// XYZ relative to D65.
    pub fn to_xyz(self) -> Xyz {
        self.to_xyz_with_white(D65_WHITE)
    }

    /// XYZ relative to `white`.
    pub fn to_xyz_with_white(self, white: Xyz) -> Xyz {
        let fy = (self.l + 16.0) / 116.0;
        let fx = fy + self.a / 500.0;
        let fz = fy - self.b / 200.0;
        let inv = |t: f64| {
            let t3 = t * t * t;
            if t3 > EPSILON {
                t3
            } else {
                (116.0 * t - 16.0) / KAPPA
            }
        };
        let yr = if self.l > KAPPA * EPSILON {
            fy * fy * fy
        } else {
            self.l / KAPPA
        };
        Xyz::new(inv(fx) * white.x, yr * white.y, inv(fz) * white.z)
    }

    /// Polar form. The hue of a colour with chroma 0 is reported as 0.
    pub fn to_lch(self) -> Lch {
        let c = self.a.hypot(self.b);
        let h = if c == 0.0 {
            0.0
        } else {
            self.b.atan2(self.a).to_degrees().rem_euclid(360.0)
        };
        Lch { l: self.l, c, h }
    }
}

impl Lch {
    /// A colour from lightness, chroma and hue in degrees.
    pub const fn new(l: f64, c: f64, h: f64) -> Self {
        Lch { l, c, h }
    }

    /// Rectangular form.
    pub fn to_lab(self) -> Lab {
        let (s, co) = self.h.to_radians().sin_cos();
        Lab::new(self.l, self.c * co, self.c * s)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn white_is_l100_neutral() {
        let lab = D65_WHITE.to_lab();
        assert!((lab.l - 100.0).abs() < 1e-12);
        assert!(lab.a.abs() < 1e-12 && lab.b.abs() < 1e-12);
    }

    #[test]
    fn round_trip_through_xyz_including_dark_segment() {
        for lab in [
            Lab::new(50.0, 20.0, -30.0),
            Lab::new(3.0, 1.0, -2.0),
            Lab::new(0.5, 0.0, 0.0),
        ] {
            let back = lab.to_xyz().to_lab();
            for (a, b) in lab.to_array().iter().zip(back.to_array()) {
                assert!((a - b).abs() < 1e-10, "{lab:?} -> {back:?}");
            }
        }
    }
}
