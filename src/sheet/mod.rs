//! The simulation contact sheet: an audited figure side by side as readers
//! with each kind of colour vision see it, with the audit's findings
//! marked on the panels where they occur, on one page (PNG, SVG or PDF); and
//! an index page of thumbnails for several figures.
//!
//! This stage owns the sheet's layout and drawing. It takes what the
//! audit computed ([`crate::audit::examine`]: the normal-vision raster,
//! the label raster and the report) and computes nothing about colour
//! itself: panels are that raster through the vision fast path
//! ([`crate::vision::raster::simulate_rgba8`]), placed at 1:1 pixel scale
//! at whole-pixel offsets; marks ([`marks`]) are drawn on the pixels of
//! the label raster's class regions; the class strips show the report's
//! measured colours.
//!
//! Files: [`figure`] (one figure's sheet), [`marks`] (outline, dash and
//! hatch on the panels), [`index`] (several figures), [`canvas`] (a page:
//! chrome SVG plus placed rasters, to PNG, SVG or PDF), [`prevalence`] (the
//! one-line notes).

pub mod canvas;
pub mod figure;
pub mod index;
pub mod marks;
pub mod prevalence;

use crate::audit::{Examined, Options};
use crate::error::Result;

pub use figure::{Sheet, build};

/// The contact sheet of one audited figure as PNG bytes (the audit DPI
/// stored). `title` names the figure on the sheet; `opt` must be the
/// options `examined` was audited with.
pub fn sheet_png(title: &str, examined: &Examined, opt: &Options) -> Result<Vec<u8>> {
    build(title, examined, opt).canvas.png()
}

/// The same as SVG text, the panels embedded as PNG data.
pub fn sheet_svg(title: &str, examined: &Examined, opt: &Options) -> Result<String> {
    build(title, examined, opt).canvas.svg()
}
