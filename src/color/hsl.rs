//! HSL and HWB to sRGB, as defined by CSS Color 4 (both are encodings of
//! sRGB, not colour spaces of their own).

use super::srgb::Srgb;

/// HSL to encoded sRGB: hue in degrees, saturation and lightness in 0..1.
pub fn hsl_to_srgb(hue: f64, sat: f64, light: f64) -> Srgb {
    let hue = hue.rem_euclid(360.0);
    let f = |n: f64| {
        let k = (n + hue / 30.0).rem_euclid(12.0);
        let a = sat * light.min(1.0 - light);
        light - a * (k - 3.0).min(9.0 - k).clamp(-1.0, 1.0)
    };
    Srgb::new(f(0.0), f(8.0), f(4.0))
}

/// HWB to encoded sRGB: hue in degrees, whiteness and blackness in 0..1.
pub fn hwb_to_srgb(hue: f64, white: f64, black: f64) -> Srgb {
    if white + black >= 1.0 {
        let g = white / (white + black);
        return Srgb::new(g, g, g);
    }
    let base = hsl_to_srgb(hue, 1.0, 0.5);
    let k = 1.0 - white - black;
    Srgb::new(base.r * k + white, base.g * k + white, base.b * k + white)
}
