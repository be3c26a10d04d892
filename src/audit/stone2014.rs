//! Size-dependent colour difference: the engineering model of Stone,
//! Szafir & Setlur (2014), "An engineering model for color difference as a
//! function of size", IS&T Color and Imaging Conference, pp. 253-258; and
//! the conversion of a mark's size on the page to the visual angle it
//! subtends at a viewing distance.
//!
//! `ND(p, s) = p * (A + B / s)` per CIELAB axis, `s` the visual angle in
//! degrees of the mark's smallest dimension, `p` the fraction of observers
//! expected to see the difference; A = (10.16, 10.68, 10.70),
//! B = (1.50, 3.08, 5.74) for L*, a*, b*.

/// The model's A coefficients for L*, a*, b*.
pub const A: [f64; 3] = [10.16, 10.68, 10.70];
/// The model's B coefficients for L*, a*, b*.
pub const B: [f64; 3] = [1.50, 3.08, 5.74];

/// The smallest visual angle the model is evaluated at (degrees). The
/// published fits covered about 1/3 degree to 6 degrees; below that the
/// model is extrapolated, and below this floor it is held constant.
pub const MIN_ANGLE_DEG: f64 = 0.05;

/// Noticeable differences `[ND_L, ND_a, ND_b]` at probability `p` for a
/// mark subtending `angle_deg` degrees.
pub fn noticeable_difference(p: f64, angle_deg: f64) -> [f64; 3] {
    let s = angle_deg.max(MIN_ANGLE_DEG);
    [0, 1, 2].map(|i| p * (A[i] + B[i] / s))
}

/// The visual angle in degrees of `size_mm` seen from `distance_mm`:
/// `2 atan(size / (2 distance))`.
pub fn visual_angle_deg(size_mm: f64, distance_mm: f64) -> f64 {
    (2.0 * (size_mm / (2.0 * distance_mm)).atan()).to_degrees()
}

/// Millimetres of `px` pixels at `dpi`.
pub fn px_to_mm(px: f64, dpi: f64) -> f64 {
    px * 25.4 / dpi
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn at_p_half_the_lightness_threshold_of_a_large_mark_is_about_five() {
        let nd = noticeable_difference(0.5, 100.0);
        assert!((nd[0] - 5.09).abs() < 0.01);
    }
}
