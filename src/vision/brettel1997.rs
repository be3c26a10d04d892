//! Brettel, Viénot & Mollon (1997), "Computerized simulation of color
//! appearance for dichromats", JOSA A 14(10):2647-2655.
//!
//! Each colour is projected, along the axis of the missing cone, onto one of
//! two half-planes in LMS that share the neutral axis and contain the lights
//! a dichromat sees as a trichromat does: 575 nm and 475 nm for protan and
//! deutan, 660 nm and 485 nm for tritan. Which half-plane applies depends on
//! the side of the plane through the neutral axis and the missing cone's
//! axis. Brettel 1997 is regarded as the most accurate of the three models
//! for tritanopia.
//!
//! Choices (common practice): the neutral axis is display white rather than
//! the equal-energy stimulus of the paper, so greys stay grey; LMS is the
//! display space of [`super::lms`].

use crate::color::matrix::{self, Mat3};

use super::lms::{self, Cone};

/// The two-half-plane transform on linear RGB: `if sep · rgb < 0` use
/// `below`, else `above`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct HalfPlanes {
    /// Normal of the separating plane, expressed on linear RGB.
    pub sep: [f64; 3],
    /// Linear-RGB matrix for colours with `sep · rgb < 0`.
    pub below: Mat3,
    /// Linear-RGB matrix for the others.
    pub above: Mat3,
}

/// The wavelengths (nm) anchoring the half-planes for a missing cone: the
/// one used on the negative side of the separating plane first.
pub fn anchors(missing: Cone) -> (u32, u32) {
    match missing {
        Cone::L | Cone::M => (575, 475),
        Cone::S => (660, 485),
    }
}

/// Build the transform for a missing cone.
pub fn half_planes(missing: Cone) -> HalfPlanes {
    let e = lms::white();
    let (first, second) = anchors(missing);
    let plane =
        |nm: u32| lms::projection_onto_plane(matrix::cross(e, lms::monochromatic(nm)), missing);
    // Separating plane through the neutral axis and the missing cone's axis:
    // protan compares S/M with the neutral's S/M, deutan S/L, tritan M/L.
    let sep_lms = match missing {
        Cone::L => [0.0, -e[2], e[1]],
        Cone::M => [-e[2], 0.0, e[0]],
        Cone::S => [-e[1], e[0], 0.0],
    };
    // sep_lms · (T rgb) = (Tᵀ sep_lms) · rgb.
    let t = lms::RGB_TO_LMS;
    let sep = [0, 1, 2].map(|j| (0..3).map(|i| t[i][j] * sep_lms[i]).sum::<f64>());
    HalfPlanes {
        sep,
        below: lms::in_rgb(&plane(first)),
        above: lms::in_rgb(&plane(second)),
    }
}

impl HalfPlanes {
    /// The matrix that applies to a linear-RGB colour.
    #[inline]
    pub fn matrix_for(&self, rgb: [f64; 3]) -> &Mat3 {
        if matrix::dot(self.sep, rgb) < 0.0 {
            &self.below
        } else {
            &self.above
        }
    }

    /// Blend each half-plane matrix with the identity (severity below 1).
    pub fn blended(&self, severity: f64) -> HalfPlanes {
        HalfPlanes {
            sep: self.sep,
            below: matrix::lerp(&matrix::IDENTITY, &self.below, severity),
            above: matrix::lerp(&matrix::IDENTITY, &self.above, severity),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn anchor_lights_are_unchanged() {
        // The defining property: the anchor lights and the neutral lie on the
        // reduced surface, so the projection leaves them where they are.
        for cone in [Cone::L, Cone::M, Cone::S] {
            let (a, b) = anchors(cone);
            for nm in [a, b] {
                let q = lms::monochromatic(nm);
                let p = lms::projection_onto_plane(matrix::cross(lms::white(), q), cone);
                let out = matrix::mul_vec(&p, q);
                for k in 0..3 {
                    assert!(
                        (out[k] - q[k]).abs() < 1e-9 * q[k].abs().max(1.0),
                        "{cone:?} {nm}"
                    );
                }
            }
        }
    }
}
