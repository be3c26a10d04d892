//! PDF output: an SVG figure as a one-page PDF whose page is the figure's
//! physical size (SVG lengths in mm become PostScript points,
//! 1 pt = 25.4/72 mm; CSS pixels are 1/96 inch, so 1 px = 0.75 pt).
//!
//! The SVG is parsed with the same usvg and embedded font as the raster
//! stage, so the PDF shows the same glyphs as the PNG; text is converted to
//! drawn paths (no font is embedded, text is not selectable or
//! searchable in the PDF). The flattened tree is written back as SVG and
//! handed to the general-purpose `svg2pdf` crate, which brings its own
//! (older) usvg. The output holds no date or random identifier, so the same
//! SVG gives the same bytes.
//!
//! Not supported, and refused with a message rather than silently left
//! out: raster images and filter effects (our figures use neither), and
//! references to external files.

use std::path::Path;

use resvg::usvg;

use crate::error::{Error, Result};

/// Convert SVG bytes to a one-page PDF. `name` names the source in messages.
pub fn svg_to_pdf(name: &Path, svg: &[u8]) -> Result<Vec<u8>> {
    let invalid = |message: String| Error::Invalid {
        path: name.to_path_buf(),
        location: None,
        message,
    };
    let doc = crate::raster::parse(name, svg)?;
    if !doc.refused.is_empty() {
        return Err(invalid(format!(
            "refers to external files ({}), which are never read; expected a self-contained SVG",
            doc.refused.join(", ")
        )));
    }
    if let Some(what) = unsupported(doc.tree.root()) {
        return Err(invalid(format!(
            "contains {what}, which PDF output does not support; expected vector shapes and text only"
        )));
    }
    // Text becomes paths here, with the embedded font.
    let flat = doc.tree.to_string(&usvg::WriteOptions::default());
    let tree =
        svg2pdf::usvg::Tree::from_str(&flat, &svg2pdf::usvg::Options::default()).map_err(|e| {
            Error::Internal(format!(
                "{}: the flattened SVG could not be read back: {e}",
                name.display()
            ))
        })?;
    let options = svg2pdf::ConversionOptions {
        compress: true,
        embed_text: false,
        ..svg2pdf::ConversionOptions::default()
    };
    // usvg sizes are CSS pixels (96 per inch); at 96 dpi svg2pdf makes the
    // page 72/96 pt per pixel, which is mm * 72 / 25.4.
    let page = svg2pdf::PageOptions { dpi: 96.0 };
    svg2pdf::to_pdf(&tree, options, page).map_err(|e| match e {
        svg2pdf::ConversionError::UnknownError => {
            Error::Internal(format!("{}: PDF conversion failed: {e}", name.display()))
        }
        _ => invalid(format!("cannot be converted to PDF: {e}")),
    })
}

/// The first thing in the tree that PDF output does not handle.
fn unsupported(group: &usvg::Group) -> Option<&'static str> {
    if !group.filters().is_empty() {
        return Some("a filter effect");
    }
    for node in group.children() {
        match node {
            usvg::Node::Image(_) => return Some("a raster image"),
            usvg::Node::Group(g) => {
                if let Some(w) = unsupported(g) {
                    return Some(w);
                }
            }
            usvg::Node::Path(_) | usvg::Node::Text(_) => {}
        }
    }
    // Clip paths and masks hold groups of their own.
    if let Some(c) = group.clip_path() {
        if let Some(w) = unsupported(c.root()) {
            return Some(w);
        }
    }
    if let Some(m) = group.mask() {
        if let Some(w) = unsupported(m.root()) {
            return Some(w);
        }
    }
    None
}
