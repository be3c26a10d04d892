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
//! SVG gives the same bytes. (svg2pdf 0.13 writes the entries of resource
//! dictionaries in hash-map order, which changes from run to run; they are
//! put in sorted order afterwards, in place, so the cross-reference offsets
//! stay valid.)
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
    let mut pdf = svg2pdf::to_pdf(&tree, options, page).map_err(|e| match e {
        svg2pdf::ConversionError::UnknownError => {
            Error::Internal(format!("{}: PDF conversion failed: {e}", name.display()))
        }
        _ => invalid(format!("cannot be converted to PDF: {e}")),
    })?;
    sort_resource_entries(&mut pdf);
    Ok(pdf)
}

/// The resource dictionaries whose entries svg2pdf writes in hash order.
const RESOURCE_KINDS: [&[u8]; 6] = [
    b"/XObject <<\n",
    b"/ExtGState <<\n",
    b"/Pattern <<\n",
    b"/Shading <<\n",
    b"/ColorSpace <<\n",
    b"/Font <<\n",
];

/// Sort the entries of every resource dictionary, in place. The writer
/// puts one `/name N 0 R` entry per line between a `/Kind <<` line and a
/// `>>` line; sorting the lines keeps the file's length and every object's
/// offset. Stream data is skipped; a block of any other shape is left as
/// it is.
fn sort_resource_entries(pdf: &mut [u8]) {
    let mut i = 0;
    while i < pdf.len() {
        if pdf[i..].starts_with(b"stream\n") {
            match find_bytes(&pdf[i..], b"\nendstream") {
                Some(k) => i += k + b"\nendstream".len(),
                None => return,
            }
            continue;
        }
        let Some(kind) = RESOURCE_KINDS.iter().find(|k| pdf[i..].starts_with(k)) else {
            i += 1;
            continue;
        };
        let body = i + kind.len();
        let mut lines: Vec<Vec<u8>> = Vec::new();
        let mut at = body;
        let mut closed = false;
        while let Some(len) = pdf[at..].iter().position(|&b| b == b'\n') {
            let line = &pdf[at..at + len];
            let text = line.trim_ascii();
            if text == b">>" {
                closed = true;
                break;
            }
            if !(text.starts_with(b"/") && text.ends_with(b" R")) {
                break;
            }
            lines.push(line.to_vec());
            at += len + 1;
        }
        if closed && lines.len() > 1 {
            lines.sort();
            let mut w = body;
            for line in &lines {
                pdf[w..w + line.len()].copy_from_slice(line);
                pdf[w + line.len()] = b'\n';
                w += line.len() + 1;
            }
        }
        i = at.max(i + 1);
    }
}

fn find_bytes(hay: &[u8], needle: &[u8]) -> Option<usize> {
    hay.windows(needle.len()).position(|w| w == needle)
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
