//! Viénot, Brettel & Mollon (1999), "Digital video colourmaps for checking
//! the legibility of displays by dichromats", Color Research & Application
//! 24(4):243-252.
//!
//! For protanopia and deuteranopia the two half-planes of Brettel 1997 are
//! replaced by one plane through black, white and the display's blue
//! primary, giving a single matrix per deficiency. The paper defines no
//! tritan variant; hueproof uses Brettel 1997 for tritanopia.

use crate::color::matrix::{self, Mat3};

use super::lms::{self, Cone, RGB_TO_LMS};

/// The LMS projection for a missing L (`Cone::L`) or M (`Cone::M`) cone.
pub fn lms_projection(missing: Cone) -> Mat3 {
    let white = lms::white();
    let blue = matrix::mul_vec(&RGB_TO_LMS, [0.0, 0.0, 1.0]);
    lms::projection_onto_plane(matrix::cross(white, blue), missing)
}

/// The linear-RGB matrix for protanopia (`Cone::L`) or deuteranopia
/// (`Cone::M`).
pub fn rgb_matrix(missing: Cone) -> Mat3 {
    lms::in_rgb(&lms_projection(missing))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reproduces_the_published_plane_coefficients() {
        // Viénot et al. (1999), as widely reproduced: protan
        // L' = 2.02344 M - 2.52581 S; deutan M' = 0.494207 L + 1.24827 S.
        let p = lms_projection(Cone::L);
        assert!((p[0][1] - 2.02344).abs() < 5e-6, "{p:?}");
        assert!((p[0][2] + 2.52581).abs() < 5e-6, "{p:?}");
        let d = lms_projection(Cone::M);
        assert!((d[1][0] - 0.494207).abs() < 5e-7, "{d:?}");
        assert!((d[1][2] - 1.24827).abs() < 5e-6, "{d:?}");
    }
}
