//! The cone (LMS) space shared by the dichromat models, and the LMS of the
//! monochromatic lights that anchor Brettel's half-planes.
//!
//! Linear sRGB is taken to LMS with the display matrix published with
//! Viénot, Brettel & Mollon (1999), built on Smith & Pokorny (1975) cone
//! fundamentals; applying it to linear sRGB is common practice. A
//! monochromatic light of wavelength λ is placed in the same space by taking
//! its CIE 1931 2° tristimulus values to linear sRGB (CSS Color 4 matrix,
//! outside the gamut, so channels may be negative) and then to LMS. Only the
//! directions of these vectors matter: each anchors a plane through the
//! origin.

use crate::color::matrix::{self, Mat3};
use crate::color::xyz::XYZ_TO_LINEAR_SRGB;

/// Linear RGB to LMS for the display of Viénot, Brettel & Mollon (1999).
pub const RGB_TO_LMS: Mat3 = [
    [17.8824, 43.5161, 4.11935],
    [3.45565, 27.1554, 3.86714],
    [0.0299566, 0.184309, 1.46709],
];

/// The inverse of [`RGB_TO_LMS`], computed once.
pub fn lms_to_rgb() -> Mat3 {
    static M: std::sync::OnceLock<Mat3> = std::sync::OnceLock::new();
    *M.get_or_init(|| matrix::inverse(&RGB_TO_LMS).expect("the LMS matrix is invertible"))
}

/// CIE 1931 2° colour-matching functions (x̄, ȳ, z̄) at the wavelengths that
/// anchor Brettel's half-planes, from the CIE 1931 standard observer table
/// at 5 nm steps (values as carried by the colour-science library, see
/// `tests/fixtures/README.md`).
pub const CMF_1931: [(u32, [f64; 3]); 4] = [
    (475, [0.1421, 0.1126, 1.0419]),
    (485, [0.05795, 0.1693, 0.6162]),
    (575, [0.8425, 0.9154, 0.0018]),
    (660, [0.1649, 0.0610, 0.0]),
];

/// LMS of display white (linear RGB 1, 1, 1), the neutral axis used here.
pub fn white() -> [f64; 3] {
    matrix::mul_vec(&RGB_TO_LMS, [1.0, 1.0, 1.0])
}

/// LMS of a monochromatic light of `nm` nanometres (one of [`CMF_1931`]).
pub fn monochromatic(nm: u32) -> [f64; 3] {
    let xyz = CMF_1931
        .iter()
        .find(|(w, _)| *w == nm)
        .map(|(_, v)| *v)
        .unwrap_or_else(|| panic!("no colour-matching values stored for {nm} nm"));
    let rgb = matrix::mul_vec(&XYZ_TO_LINEAR_SRGB, xyz);
    matrix::mul_vec(&RGB_TO_LMS, rgb)
}

/// Which cone is missing.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Cone {
    /// Long-wavelength (protan).
    L,
    /// Medium-wavelength (deutan).
    M,
    /// Short-wavelength (tritan).
    S,
}

impl Cone {
    fn index(self) -> usize {
        match self {
            Cone::L => 0,
            Cone::M => 1,
            Cone::S => 2,
        }
    }
}

/// The LMS matrix that replaces the `missing` cone's response so the result
/// lies on the plane through the origin with normal `n`, leaving the other
/// two responses unchanged.
pub fn projection_onto_plane(n: [f64; 3], missing: Cone) -> Mat3 {
    let i = missing.index();
    let mut m = matrix::IDENTITY;
    for j in 0..3 {
        m[i][j] = if j == i { 0.0 } else { -n[j] / n[i] };
    }
    m
}

/// The same projection expressed on linear RGB: `RGB<-LMS * P * LMS<-RGB`.
pub fn in_rgb(p: &Mat3) -> Mat3 {
    matrix::mul(&lms_to_rgb(), &matrix::mul(p, &RGB_TO_LMS))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn inverse_matches_the_printed_inverse() {
        // The inverse as printed with the Viénot 1999 constants (methods note).
        let printed = [
            [0.0809444479, -0.130504409, 0.116721066],
            [-0.0102485335, 0.0540193266, -0.113614708],
            [-0.000365296938, -0.00412161469, 0.693511405],
        ];
        let inv = lms_to_rgb();
        for i in 0..3 {
            for j in 0..3 {
                assert!(
                    (inv[i][j] - printed[i][j]).abs() < 1e-8,
                    "{i},{j}: {}",
                    inv[i][j]
                );
            }
        }
    }
}
