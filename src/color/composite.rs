//! Alpha compositing ("source over") of a translucent colour onto an opaque
//! background.
//!
//! Browsers and resvg composite in encoded sRGB, not in linear light:
//! `out = a * fg + (1 - a) * bg` on the encoded channel values. hueproof
//! does the same, so a translucent fill is measured as readers see it. resvg
//! (through tiny-skia) works on premultiplied 8-bit values, so its results
//! can differ from this exact form by rounding, at most one 8-bit level.

use super::srgb::{Rgba, Srgb};

/// Composite `fg` over an opaque `bg` in encoded sRGB.
pub fn over(fg: Rgba, bg: Srgb) -> Srgb {
    let a = fg.alpha.clamp(0.0, 1.0);
    let mix = |f: f64, b: f64| a * f + (1.0 - a) * b;
    Srgb::new(
        mix(fg.rgb.r, bg.r),
        mix(fg.rgb.g, bg.g),
        mix(fg.rgb.b, bg.b),
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn half_black_over_white_is_encoded_mid_grey() {
        // Encoded-space compositing gives 0.5, not the linear-light midpoint.
        let c = over(
            Rgba {
                rgb: Srgb::new(0.0, 0.0, 0.0),
                alpha: 0.5,
            },
            Srgb::new(1.0, 1.0, 1.0),
        );
        assert_eq!(c, Srgb::new(0.5, 0.5, 0.5));
        assert_eq!(c.to_hex(), "#808080");
    }

    #[test]
    fn opaque_and_transparent_ends() {
        let fg = Rgba {
            rgb: Srgb::new(0.2, 0.4, 0.6),
            alpha: 1.0,
        };
        let bg = Srgb::new(1.0, 1.0, 1.0);
        assert_eq!(over(fg, bg), fg.rgb);
        assert_eq!(over(Rgba { alpha: 0.0, ..fg }, bg), bg);
    }
}
