//! The colour core: pure colour maths, no I/O.
//!
//! - [`srgb`]: the IEC 61966-2-1 transfer curve, encoded and linear RGB,
//!   8-bit values and hex.
//! - [`xyz`]: CIE XYZ (D65), the CSS Color 4 matrices, white points and the
//!   Bradford adaptation.
//! - [`cielab`]: CIELAB and CIELCh, on D65 for every hueproof measurement.
//! - [`oklab`]: OKLab and OKLCH with the CSS Color 4 matrices.
//! - [`ciede2000`], [`difference`]: CIEDE2000 (with kL, kC, kH), CIE76 and
//!   the Euclidean OKLab difference.
//! - [`wcag`]: WCAG 2.x relative luminance and contrast ratio.
//! - [`composite`]: alpha compositing in encoded sRGB, as browsers and
//!   resvg do it.
//! - [`gamut`]: the CSS Color 4 gamut-mapping algorithm.
//! - [`css`], [`hsl`]: parsing the CSS Color 4 notations.

pub mod ciede2000;
pub mod cielab;
pub mod composite;
pub mod css;
pub mod difference;
pub mod gamut;
pub mod hsl;
pub mod matrix;
pub mod oklab;
pub mod srgb;
pub mod wcag;
pub mod xyz;

pub use ciede2000::ciede2000;
pub use cielab::{Lab, Lch};
pub use css::{ParseColorError, ParsedColor, parse_color};
pub use oklab::{Oklab, Oklch};
pub use srgb::{LinearRgb, Rgba, Srgb};
pub use xyz::Xyz;

impl Srgb {
    /// CIELAB (D65) of this colour, through the CSS Color 4 matrix.
    pub fn to_lab(self) -> Lab {
        self.to_linear().to_xyz().to_lab()
    }

    /// OKLab of this colour, through the CSS Color 4 matrices.
    pub fn to_oklab(self) -> Oklab {
        self.to_linear().to_xyz().to_oklab()
    }
}
