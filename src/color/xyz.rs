//! CIE XYZ (Y in 0..1), the linear-sRGB <-> XYZ matrices of CSS Color 4,
//! the D65 and D50 white points, and the Bradford adaptation between them.
//!
//! hueproof measures in D65, the white of sRGB. CSS `lab()` and `lch()` are
//! defined on D50; [`D65_TO_D50`] and [`D50_TO_D65`] carry colours across.

use super::matrix::{self, Mat3};
use super::srgb::LinearRgb;

/// A CIE 1931 XYZ colour, Y (luminance) in 0..1 for sRGB white.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Xyz {
    /// X.
    pub x: f64,
    /// Y (relative luminance).
    pub y: f64,
    /// Z.
    pub z: f64,
}

impl Xyz {
    /// A colour from its tristimulus values.
    pub const fn new(x: f64, y: f64, z: f64) -> Self {
        Xyz { x, y, z }
    }

    /// The values as an array.
    pub fn to_array(self) -> [f64; 3] {
        [self.x, self.y, self.z]
    }

    /// A colour from an array of values.
    pub fn from_array(a: [f64; 3]) -> Self {
        Xyz::new(a[0], a[1], a[2])
    }

    /// Linear sRGB via [`XYZ_TO_LINEAR_SRGB`].
    pub fn to_linear_rgb(self) -> LinearRgb {
        LinearRgb::from_array(matrix::mul_vec(&XYZ_TO_LINEAR_SRGB, self.to_array()))
    }

    /// Linear sRGB via any matrix (used by tests to reproduce other
    /// libraries' conventions).
    pub fn to_linear_rgb_with(self, m: &Mat3) -> LinearRgb {
        LinearRgb::from_array(matrix::mul_vec(m, self.to_array()))
    }
}

impl LinearRgb {
    /// CIE XYZ (D65) via [`LINEAR_SRGB_TO_XYZ`].
    pub fn to_xyz(self) -> Xyz {
        self.to_xyz_with(&LINEAR_SRGB_TO_XYZ)
    }

    /// CIE XYZ via any matrix (used by tests to reproduce other libraries'
    /// conventions, such as the 4-decimal matrix printed in IEC 61966-2-1).
    pub fn to_xyz_with(self, m: &Mat3) -> Xyz {
        Xyz::from_array(matrix::mul_vec(m, self.to_array()))
    }
}

/// Linear sRGB to XYZ (D65): the exact rationals of CSS Color 4.
pub const LINEAR_SRGB_TO_XYZ: Mat3 = [
    [506752.0 / 1228815.0, 87881.0 / 245763.0, 12673.0 / 70218.0],
    [87098.0 / 409605.0, 175762.0 / 245763.0, 12673.0 / 175545.0],
    [7918.0 / 409605.0, 87881.0 / 737289.0, 1001167.0 / 1053270.0],
];

/// XYZ (D65) to linear sRGB: the exact rationals of CSS Color 4.
pub const XYZ_TO_LINEAR_SRGB: Mat3 = [
    [12831.0 / 3959.0, -329.0 / 214.0, -1974.0 / 3959.0],
    [
        -851781.0 / 878810.0,
        1648619.0 / 878810.0,
        36519.0 / 878810.0,
    ],
    [705.0 / 12673.0, -2585.0 / 12673.0, 705.0 / 667.0],
];

/// The D65 white point from the chromaticity (0.3127, 0.3290), Y = 1.
pub const D65_WHITE: Xyz = Xyz::new(0.3127 / 0.3290, 1.0, (1.0 - 0.3127 - 0.3290) / 0.3290);

/// The D50 white point from the chromaticity (0.3457, 0.3585), Y = 1.
pub const D50_WHITE: Xyz = Xyz::new(0.3457 / 0.3585, 1.0, (1.0 - 0.3457 - 0.3585) / 0.3585);

/// Bradford chromatic adaptation from D65 to D50, as printed in CSS Color 4.
pub const D65_TO_D50: Mat3 = [
    [
        1.0479297925449969,
        0.022946870601609652,
        -0.05019226628920524,
    ],
    [
        0.02962780877005599,
        0.9904344267538799,
        -0.017073799063418826,
    ],
    [
        -0.009243040646204504,
        0.015055191490298152,
        0.7518742814281371,
    ],
];

/// Bradford chromatic adaptation from D50 to D65: the inverse of
/// [`D65_TO_D50`], computed once.
pub fn d50_to_d65() -> Mat3 {
    static M: std::sync::OnceLock<Mat3> = std::sync::OnceLock::new();
    *M.get_or_init(|| matrix::inverse(&D65_TO_D50).expect("the Bradford matrix is invertible"))
}

/// Adapt a D65 colour to D50 (Bradford).
pub fn adapt_d65_to_d50(c: Xyz) -> Xyz {
    Xyz::from_array(matrix::mul_vec(&D65_TO_D50, c.to_array()))
}

/// Adapt a D50 colour to D65 (Bradford).
pub fn adapt_d50_to_d65(c: Xyz) -> Xyz {
    Xyz::from_array(matrix::mul_vec(&d50_to_d65(), c.to_array()))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn row_sums_equal_d65_white() {
        // CSS Color 4 builds the matrix so that RGB white maps to D65 white.
        let w = LinearRgb::new(1.0, 1.0, 1.0).to_xyz();
        assert!((w.x - D65_WHITE.x).abs() < 1e-15);
        assert!((w.y - 1.0).abs() < 1e-15);
        assert!((w.z - D65_WHITE.z).abs() < 1e-15);
    }

    #[test]
    fn matrices_are_inverse() {
        let p = matrix::mul(&LINEAR_SRGB_TO_XYZ, &XYZ_TO_LINEAR_SRGB);
        for (i, row) in p.iter().enumerate() {
            for (j, v) in row.iter().enumerate() {
                assert!((v - if i == j { 1.0 } else { 0.0 }).abs() < 1e-12);
            }
        }
    }

    #[test]
    fn bradford_maps_white_to_white() {
        // A von Kries-type adaptation maps the source white onto the
        // destination white; CSS's matrix is built from these chromaticities.
        let w50 = adapt_d65_to_d50(D65_WHITE);
        assert!((w50.x - D50_WHITE.x).abs() < 1e-6, "{w50:?}");
        assert!((w50.y - 1.0).abs() < 1e-6);
        assert!((w50.z - D50_WHITE.z).abs() < 1e-6);
        let back = adapt_d50_to_d65(w50);
        assert!((back.x - D65_WHITE.x).abs() < 1e-12);
    }

    #[test]
    fn white_points_match_methods_reference() {
        // Values computed from the 4-figure chromaticities (methods note).
        assert!((D65_WHITE.x - 0.9504559).abs() < 1e-7);
        assert!((D65_WHITE.z - 1.0890578).abs() < 1e-7);
        assert!((D50_WHITE.x - 0.9642957).abs() < 1e-7);
        assert!((D50_WHITE.z - 0.8251046).abs() < 1e-7);
    }
}
