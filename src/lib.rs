//! # hueproof
//!
//! Render thematic maps and statistical graphics whose colours fit the data,
//! then prove, on the rendered pixels, that the figure reads for every
//! reader: normal colour vision, simulated colour-vision deficiencies and
//! grayscale print.
//!
//! Data flows one way through the stages, one module each:
//!
//! `spec + data -> validated figure model -> classification and palette ->
//! layout -> SVG -> raster (normal and simulated vision) -> measurements ->
//! report`
//!
//! Stages available so far:
//!
//! - [`color`]: colour parsing (CSS Color 4), conversions, colour
//!   differences, WCAG contrast and alpha compositing. Pure maths.
//! - [`vision`]: simulated colour vision (Machado 2009, Brettel 1997,
//!   Viénot 1999, achromatopsia) for single colours and RGBA8 rasters.
//! - [`scheme`]: palettes: generation, checks and repair; [`findings`]
//!   holds the finding kinds and their stable codes.
//! - [`raster`]: SVG to pixels with resvg and the embedded font; PNG with
//!   its DPI. [`output`] writes files atomically, never over an input.
//! - [`classify`]: class breaks for classed maps (equal interval, quantile,
//!   exact natural breaks, standard deviation, head/tail, manual), their fit,
//!   rounding, diverging arrangement and unclassed positions.
//! - [`geo`]: GeoJSON and TopoJSON input, the validated feature model, map
//!   projections, antimeridian cutting, planar measures (area, centroid,
//!   label point), fitting to a frame and topology-safe simplification.
//! - [`table`]: CSV data tables with typed, locale-free numbers.
//! - [`join`]: shapes joined to table rows by key, and the join report.
//! - [`inspect`]: the measurements behind `hueproof inspect`.
//! - [`report`]: text and JSON renderings of those measurements.
//! - Figures, one stage each: [`spec`] (the TOML spec file, located
//!   errors and "did you mean"), [`figure`] (the validated figure model:
//!   data read by level of measurement, joined and projected), [`encode`]
//!   (classes and their colours), [`layout`] (the page as a display
//!   list, legends, ticks), [`svg`] (accessible SVG), [`describe`] (the
//!   plain-language description), [`pdf`] (one-page PDF, text drawn as
//!   paths) and [`render`] (the files). [`font`] is the embedded font and
//!   its metrics; [`starter`] the templates, `new` and `demo`.
//! - [`demo`]: the built-in demo dataset (an invented island, for the demo only).
//! - [`sheet`]: the simulation contact sheet of audited figures (panels
//!   per view with the findings marked, and an index of thumbnails).
//! - [`batch`]: many inputs at once (globs, `--jobs`, progress, one
//!   exit code, interruption) for `render` and `check`.
//! - [`cli`]: the command line, a thin layer over the stages.
//!
//! An audit by hueproof is an aid to design and review. It is not a
//! certification of conformance with any accessibility law or standard.

#![forbid(unsafe_code)]
#![warn(missing_docs)]

pub mod audit;
pub mod batch;
pub mod classify;
pub mod cli;
pub mod color;
pub mod demo;
pub mod describe;
pub mod encode;
pub mod error;
pub mod figure;
pub mod findings;
pub mod font;
#[doc(hidden)]
pub mod fuzzing;
pub mod geo;
pub mod inspect;
pub mod join;
pub mod layout;
pub mod output;
pub mod pdf;
pub mod random;
pub mod raster;
pub mod render;
pub mod report;
pub mod scheme;
pub mod sheet;
pub mod spec;
pub mod starter;
pub mod svg;
pub mod table;
pub mod thresholds;
pub mod vision;

pub use error::{Error, ExitKind};
