//! OKLab and OKLCH (Ottosson 2020) with the matrices of CSS Color 4, which
//! go through CIE XYZ (D65) and were recalculated by the CSS working group
//! for a consistent D65 white at 64-bit precision.

// The matrices are written exactly as CSS Color 4 prints them.
#![allow(clippy::excessive_precision)]

use super::matrix::{self, Mat3};
use super::xyz::Xyz;

/// An OKLab colour: L in 0..1, a and b roughly -0.4..0.4.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Oklab {
    /// Perceived lightness, 0..1.
    pub l: f64,
    /// Green-red axis.
    pub a: f64,
    /// Blue-yellow axis.
    pub b: f64,
}

/// OKLCH: lightness, chroma and hue angle in degrees (0..360).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Oklch {
    /// Perceived lightness, 0..1.
    pub l: f64,
    /// Chroma.
    pub c: f64,
    /// Hue angle in degrees, 0..360.
    pub h: f64,
}

/// XYZ (D65) to LMS, CSS Color 4.
pub const XYZ_TO_LMS: Mat3 = [
    [0.8190224379967030, 0.3619062600528904, -0.1288737815209879],
    [0.0329836539323885, 0.9292868615863434, 0.0361446663506424],
    [0.0481771893596242, 0.2642395317527308, 0.6335478284694309],
];

/// Cube-rooted LMS to OKLab, CSS Color 4.
pub const LMS_TO_OKLAB: Mat3 = [
    [0.2104542683093140, 0.7936177747023054, -0.0040720430116193],
    [1.9779985324311684, -2.4285922420485799, 0.4505937096174110],
    [0.0259040424655478, 0.7827717124575296, -0.8086757549230774],
];

/// OKLab to cube-rooted LMS, CSS Color 4.
pub const OKLAB_TO_LMS: Mat3 = [
    [1.0, 0.3963377773761749, 0.2158037573099136],
    [1.0, -0.1055613458156586, -0.0638541728258133],
    [1.0, -0.0894841775298119, -1.2914855480194092],
];

/// LMS to XYZ (D65), CSS Color 4.
pub const LMS_TO_XYZ: Mat3 = [
    [1.2268798758459243, -0.5578149944602171, 0.2813910456659647],
    [-0.0405757452148008, 1.1122868032803170, -0.0717110580655164],
    [-0.0763729366746601, -0.4214933324022432, 1.5869240198367816],
];

impl Xyz {
    /// OKLab with the CSS Color 4 matrices.
    pub fn to_oklab(self) -> Oklab {
        self.to_oklab_with(&XYZ_TO_LMS, &LMS_TO_OKLAB)
    }

    /// OKLab with any pair of matrices (used by tests to reproduce other
    /// libraries' versions of Ottosson's matrices).
    pub fn to_oklab_with(self, xyz_to_lms: &Mat3, lms_to_lab: &Mat3) -> Oklab {
        let lms = matrix::mul_vec(xyz_to_lms, self.to_array());
        // cbrt keeps the sign, as CSS requires for out-of-gamut colours.
        let lms_p = [lms[0].cbrt(), lms[1].cbrt(), lms[2].cbrt()];
        let [l, a, b] = matrix::mul_vec(lms_to_lab, lms_p);
        Oklab { l, a, b }
    }
}

impl Oklab {
    /// A colour from L, a, b.
    pub const fn new(l: f64, a: f64, b: f64) -> Self {
        Oklab { l, a, b }
    }

    /// The values as an array.
    pub fn to_array(self) -> [f64; 3] {
        [self.l, self.a, self.b]
    }

    /// XYZ (D65).
    pub fn to_xyz(self) -> Xyz {
        let lms_p = matrix::mul_vec(&OKLAB_TO_LMS, self.to_array());
        let lms = lms_p.map(|v| v * v * v);
        Xyz::from_array(matrix::mul_vec(&LMS_TO_XYZ, lms))
    }

    /// Polar form. Hue is reported as 0 when chroma is at or below
    /// 0.000004, the threshold at which CSS treats the hue as missing.
    pub fn to_oklch(self) -> Oklch {
        let c = self.a.hypot(self.b);
        let h = if c <= 4e-6 {
            0.0
        } else {
            self.b.atan2(self.a).to_degrees().rem_euclid(360.0)
        };
        Oklch { l: self.l, c, h }
    }
}

impl Oklch {
    /// A colour from lightness, chroma and hue in degrees.
    pub const fn new(l: f64, c: f64, h: f64) -> Self {
        Oklch { l, c, h }
    }

    /// Rectangular form.
    pub fn to_oklab(self) -> Oklab {
        let (s, co) = self.h.to_radians().sin_cos();
        Oklab::new(self.l, self.c * co, self.c * s)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::color::srgb::LinearRgb;

    #[test]
    fn srgb_white_is_oklab_one_zero_zero() {
        // Methods note [C]: sRGB white -> OKLab (1, 0, 0) to 1e-15 with the
        // CSS matrices; allow a little float noise across platforms.
        let ok = LinearRgb::new(1.0, 1.0, 1.0).to_xyz().to_oklab();
        assert!((ok.l - 1.0).abs() < 1e-12, "{ok:?}");
        assert!(ok.a.abs() < 1e-12 && ok.b.abs() < 1e-12, "{ok:?}");
    }

    #[test]
    fn round_trip() {
        let x = Xyz::new(0.3, 0.2, 0.6);
        let back = x.to_oklab().to_xyz();
        assert!((back.x - x.x).abs() < 1e-12);
        assert!((back.y - x.y).abs() < 1e-12);
        assert!((back.z - x.z).abs() < 1e-12);
    }
}
