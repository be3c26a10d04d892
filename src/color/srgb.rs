//! sRGB: the IEC 61966-2-1 transfer curve, encoded and linear RGB, 8-bit
//! quantisation and hex notation.
//!
//! The transfer curve is the `palette` crate's (checked against the
//! reference tables in `tests/`), extended to negative inputs by odd symmetry
//! as CSS Color 4 does, so out-of-gamut intermediates survive a round trip.

use palette::encoding::{FromLinear, IntoLinear, Srgb as SrgbCurve};

/// Decode one encoded sRGB channel (0..1 nominal) to linear light.
#[inline]
pub fn decode(c: f64) -> f64 {
    let v: f64 = <SrgbCurve as IntoLinear<f64, f64>>::into_linear(c.abs());
    v.copysign(c)
}

/// Encode one linear-light channel to encoded sRGB (0..1 nominal).
#[inline]
pub fn encode(l: f64) -> f64 {
    let v: f64 = <SrgbCurve as FromLinear<f64, f64>>::from_linear(l.abs());
    v.copysign(l)
}

/// Quantise an encoded channel to 8 bits: clamp to 0..1, then
/// `floor(v * 255 + 0.5)` (round half up).
#[inline]
pub fn to_u8(c: f64) -> u8 {
    if c.is_nan() {
        return 0;
    }
    (c.clamp(0.0, 1.0) * 255.0 + 0.5).floor() as u8
}

/// An encoded (gamma-compressed) sRGB colour, channels nominally in 0..1.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Srgb {
    /// Red.
    pub r: f64,
    /// Green.
    pub g: f64,
    /// Blue.
    pub b: f64,
}

/// A linear-light sRGB colour (same primaries, no transfer curve).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LinearRgb {
    /// Red.
    pub r: f64,
    /// Green.
    pub g: f64,
    /// Blue.
    pub b: f64,
}

/// An encoded sRGB colour with straight (not premultiplied) alpha in 0..1.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rgba {
    /// The colour.
    pub rgb: Srgb,
    /// Opacity, 0 (transparent) to 1 (opaque).
    pub alpha: f64,
}

impl Srgb {
    /// A colour from encoded channels.
    pub const fn new(r: f64, g: f64, b: f64) -> Self {
        Srgb { r, g, b }
    }

    /// A colour from 8-bit channels.
    pub fn from_rgb8(r: u8, g: u8, b: u8) -> Self {
        Srgb::new(r as f64 / 255.0, g as f64 / 255.0, b as f64 / 255.0)
    }

    /// The channels as an array.
    pub fn to_array(self) -> [f64; 3] {
        [self.r, self.g, self.b]
    }

    /// A colour from an array of channels.
    pub fn from_array(a: [f64; 3]) -> Self {
        Srgb::new(a[0], a[1], a[2])
    }

    /// Linearise with the sRGB transfer curve.
    pub fn to_linear(self) -> LinearRgb {
        LinearRgb {
            r: decode(self.r),
            g: decode(self.g),
            b: decode(self.b),
        }
    }

    /// Clamp every channel to 0..1.
    pub fn clamped(self) -> Self {
        let c = |v: f64| if v.is_nan() { 0.0 } else { v.clamp(0.0, 1.0) };
        Srgb::new(c(self.r), c(self.g), c(self.b))
    }

    /// Whether every channel lies in 0..1, allowing `tolerance` outside.
    pub fn in_gamut(self, tolerance: f64) -> bool {
        self.to_array()
            .iter()
            .all(|&v| v >= -tolerance && v <= 1.0 + tolerance)
    }

    /// The 8-bit channels (clamped, rounded half up).
    pub fn to_rgb8(self) -> [u8; 3] {
        [to_u8(self.r), to_u8(self.g), to_u8(self.b)]
    }

    /// `#rrggbb`, lower case, from the 8-bit channels.
    pub fn to_hex(self) -> String {
        let [r, g, b] = self.to_rgb8();
        format!("#{r:02x}{g:02x}{b:02x}")
    }
}

impl LinearRgb {
    /// A colour from linear channels.
    pub const fn new(r: f64, g: f64, b: f64) -> Self {
        LinearRgb { r, g, b }
    }

    /// The channels as an array.
    pub fn to_array(self) -> [f64; 3] {
        [self.r, self.g, self.b]
    }

    /// A colour from an array of channels.
    pub fn from_array(a: [f64; 3]) -> Self {
        LinearRgb::new(a[0], a[1], a[2])
    }

    /// Encode with the sRGB transfer curve.
    pub fn to_srgb(self) -> Srgb {
        Srgb::new(encode(self.r), encode(self.g), encode(self.b))
    }

    /// Clamp every channel to 0..1.
    pub fn clamped(self) -> Self {
        let c = |v: f64| if v.is_nan() { 0.0 } else { v.clamp(0.0, 1.0) };
        LinearRgb::new(c(self.r), c(self.g), c(self.b))
    }
}

impl Rgba {
    /// An opaque colour.
    pub fn opaque(rgb: Srgb) -> Self {
        Rgba { rgb, alpha: 1.0 }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn curve_thresholds_match_iec_61966_2_1() {
        // IEC 61966-2-1: linear segment slope 12.92 below 0.04045 encoded.
        assert!((decode(0.04) - 0.04 / 12.92).abs() < 1e-16);
        assert!((decode(1.0) - 1.0).abs() < 1e-15);
        assert!((encode(0.002) - 0.002 * 12.92).abs() < 1e-16);
    }

    #[test]
    fn negative_values_use_odd_symmetry() {
        // CSS Color 4 extends the curve by sign(x) f(|x|).
        assert_eq!(decode(-0.5), -decode(0.5));
        assert_eq!(encode(-0.2), -encode(0.2));
    }

    #[test]
    fn quantisation_rounds_half_up() {
        assert_eq!(to_u8(0.5 / 255.0), 1);
        assert_eq!(to_u8(1.2), 255);
        assert_eq!(to_u8(-0.1), 0);
        assert_eq!(Srgb::from_rgb8(18, 52, 86).to_hex(), "#123456");
    }
}
