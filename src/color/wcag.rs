//! WCAG 2.x relative luminance and contrast ratio.
//!
//! Relative luminance is `0.2126 R + 0.7152 G + 0.0722 B` on channels
//! linearised with the IEC 61966-2-1 curve (threshold 0.04045; the 0.03928
//! printed before 2021 gives identical results for every 8-bit value). The
//! contrast ratio `(L1 + 0.05) / (L2 + 0.05)` is never rounded: 2.999:1 fails
//! a 3:1 requirement.

use super::srgb::{LinearRgb, Srgb};

/// The WCAG 2.x relative luminance of an encoded sRGB colour (0..1).
pub fn relative_luminance(c: Srgb) -> f64 {
    luminance_of_linear(c.to_linear())
}

/// Relative luminance of a linear-light colour.
pub fn luminance_of_linear(c: LinearRgb) -> f64 {
    0.2126 * c.r + 0.7152 * c.g + 0.0722 * c.b
}

/// The WCAG contrast ratio of two relative luminances, 1..21, lighter over
/// darker whatever the argument order.
pub fn contrast_ratio_of_luminances(l1: f64, l2: f64) -> f64 {
    let (hi, lo) = if l1 >= l2 { (l1, l2) } else { (l2, l1) };
    (hi + 0.05) / (lo + 0.05)
}

/// The WCAG contrast ratio of two colours.
pub fn contrast_ratio(a: Srgb, b: Srgb) -> f64 {
    contrast_ratio_of_luminances(relative_luminance(a), relative_luminance(b))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn black_on_white_is_21() {
        // WCAG 2.x: the maximum ratio is 21:1.
        let r = contrast_ratio(Srgb::new(0.0, 0.0, 0.0), Srgb::new(1.0, 1.0, 1.0));
        assert!((r - 21.0).abs() < 1e-12);
    }

    #[test]
    fn order_does_not_matter() {
        let a = Srgb::from_rgb8(0x77, 0x77, 0x77);
        let b = Srgb::new(1.0, 1.0, 1.0);
        assert_eq!(contrast_ratio(a, b), contrast_ratio(b, a));
    }
}
