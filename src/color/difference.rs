//! Colour differences other than CIEDE2000 (which has its own module):
//! CIE76 (Euclidean CIELAB) and the Euclidean OKLab difference of CSS
//! Color 4 (deltaEOK).

use super::cielab::Lab;
use super::oklab::Oklab;

/// CIE 1976 ΔE*ab: Euclidean distance in CIELAB.
pub fn cie76(a: Lab, b: Lab) -> f64 {
    ((a.l - b.l).powi(2) + (a.a - b.a).powi(2) + (a.b - b.b).powi(2)).sqrt()
}

/// ΔE OK: Euclidean distance in OKLab (L in 0..1, so 0.02 is about one
/// just-noticeable difference in CSS Color 4's gamut-mapping discussion).
pub fn delta_e_ok(a: Oklab, b: Oklab) -> f64 {
    ((a.l - b.l).powi(2) + (a.a - b.a).powi(2) + (a.b - b.b).powi(2)).sqrt()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pythagorean_triple() {
        assert_eq!(cie76(Lab::new(0.0, 0.0, 0.0), Lab::new(0.0, 3.0, 4.0)), 5.0);
        assert_eq!(
            delta_e_ok(Oklab::new(0.5, 0.0, 0.0), Oklab::new(0.5, 0.03, 0.04)),
            0.05
        );
    }
}
