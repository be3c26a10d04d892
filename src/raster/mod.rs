//! The raster stage: SVG to pixels with resvg, with the fonts embedded in
//! the binary (DejaVu Sans, licence in `src/font/`), so text renders
//! identically on any machine; and PNG files with their DPI stored.
//!
//! SVG user units are CSS pixels (96 per inch); rendering at `dpi` scales by
//! `dpi / 96`. The output is straight (not premultiplied) RGBA8 composited
//! over an opaque background, ready for the vision models. The audit's
//! label raster, painted in flat opaque colours without anti-aliasing, is
//! rendered with [`render_flat`]: the same pixels, with clipped groups
//! composited more cheaply ([`flat`]).
//!
//! SVG from other tools is untrusted: no external file or address is ever
//! read (an `<image>` that points outside the document is left out and
//! reported), and documents declaring huge sizes are refused before
//! rendering.

pub mod flat;

use std::path::Path;
use std::sync::{Arc, Mutex, OnceLock};

use resvg::tiny_skia;
use resvg::usvg;

use crate::color::Srgb;
use crate::error::{Error, Result};

pub use crate::font::FAMILY as FONT_FAMILY;
use crate::font::{BOLD, REGULAR};

/// The largest raster hueproof renders, in pixels (width times height).
pub const MAX_PIXELS: u64 = 200_000_000;

/// The font database with the embedded fonts; every generic family maps to
/// them, so text in any SVG renders with a known font.
pub fn fonts() -> Arc<usvg::fontdb::Database> {
    static DB: OnceLock<Arc<usvg::fontdb::Database>> = OnceLock::new();
    DB.get_or_init(|| {
        let mut db = usvg::fontdb::Database::new();
        db.load_font_data(REGULAR.to_vec());
        db.load_font_data(BOLD.to_vec());
        db.set_serif_family(FONT_FAMILY);
        db.set_sans_serif_family(FONT_FAMILY);
        db.set_cursive_family(FONT_FAMILY);
        db.set_fantasy_family(FONT_FAMILY);
        db.set_monospace_family(FONT_FAMILY);
        Arc::new(db)
    })
    .clone()
}

/// A parsed SVG document and what parsing noticed.
pub struct Document {
    /// The simplified tree resvg renders.
    pub tree: usvg::Tree,
    /// External references that were refused (never read).
    pub refused: Vec<String>,
}

/// Parse SVG text. `name` names the source in messages.
pub fn parse(name: &Path, data: &[u8]) -> Result<Document> {
    let refused = Arc::new(Mutex::new(Vec::new()));
    let sink = refused.clone();
    let mut opt = usvg::Options {
        fontdb: fonts(),
        font_family: FONT_FAMILY.to_string(),
        resources_dir: None,
        ..usvg::Options::default()
    };
    opt.image_href_resolver = usvg::ImageHrefResolver {
        resolve_data: usvg::ImageHrefResolver::default_data_resolver(),
        resolve_string: Box::new(move |href: &str, _| {
            sink.lock().expect("not poisoned").push(href.to_string());
            None
        }),
    };
    let tree = usvg::Tree::from_data(data, &opt).map_err(|e| Error::Invalid {
        path: name.to_path_buf(),
        location: None,
        message: format!("not a readable SVG document: {e}"),
    })?;
    let refused = refused.lock().expect("not poisoned").clone();
    Ok(Document { tree, refused })
}

/// A rendered raster: straight-alpha RGBA8, row-major.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Raster {
    /// Width in pixels.
    pub width: u32,
    /// Height in pixels.
    pub height: u32,
    /// `width * height * 4` bytes.
    pub rgba: Vec<u8>,
}

impl Raster {
    /// The pixel at (x, y) as RGBA.
    pub fn pixel(&self, x: u32, y: u32) -> [u8; 4] {
        let i = ((y * self.width + x) * 4) as usize;
        [
            self.rgba[i],
            self.rgba[i + 1],
            self.rgba[i + 2],
            self.rgba[i + 3],
        ]
    }
}

/// Render `doc` at `dpi` over an opaque `background`.
pub fn render(name: &Path, doc: &Document, dpi: f64, background: Srgb) -> Result<Raster> {
    draw(name, doc, dpi, background, |tree, ts, pm| {
        resvg::render(tree, ts, pm)
    })
}

/// Render `doc` as [`render`] does, byte for byte, for a scene painted in
/// flat opaque colours without anti-aliasing (the audit's label raster):
/// its clipped groups are composited more cheaply ([`flat`]); trees with
/// gradients, patterns, images, masks, filters or group opacity are
/// rendered by resvg.
pub fn render_flat(name: &Path, doc: &Document, dpi: f64, background: Srgb) -> Result<Raster> {
    draw(name, doc, dpi, background, |tree, ts, pm| {
        if flat::supported(tree.root()) {
            let max_bbox = flat::max_bbox(pm.width(), pm.height());
            flat::render_nodes(tree.root(), max_bbox, ts, pm);
        } else {
            resvg::render(tree, ts, pm);
        }
    })
}

fn draw(
    name: &Path,
    doc: &Document,
    dpi: f64,
    background: Srgb,
    paint: impl FnOnce(&usvg::Tree, tiny_skia::Transform, &mut tiny_skia::PixmapMut),
) -> Result<Raster> {
    let size = doc.tree.size();
    let scale = dpi / 96.0;
    let w = (size.width() as f64 * scale).ceil();
    let h = (size.height() as f64 * scale).ceil();
    if !(w >= 1.0 && h >= 1.0) || w * h > MAX_PIXELS as f64 {
        return Err(Error::Invalid {
            path: name.to_path_buf(),
            location: None,
            message: format!(
                "the document is {:.0} x {:.0} px at {dpi} dpi; expected between 1 and {MAX_PIXELS} pixels in all",
                w, h
            ),
        });
    }
    let mut pixmap = tiny_skia::Pixmap::new(w as u32, h as u32)
        .ok_or_else(|| Error::Internal("a pixmap of a checked size could not be made".into()))?;
    let [r, g, b] = background.to_rgb8();
    pixmap.fill(tiny_skia::Color::from_rgba8(r, g, b, 255));
    paint(
        &doc.tree,
        tiny_skia::Transform::from_scale(scale as f32, scale as f32),
        &mut pixmap.as_mut(),
    );
    // Over an opaque background every pixel is opaque, so premultiplied
    // and straight values are the same: the pixmap's bytes are taken as
    // they are (no copy). A pixel that is not opaque (none is expected) is
    // demultiplied in place.
    let mut rgba = pixmap.take();
    for p in rgba.chunks_exact_mut(4) {
        if p[3] != 255 {
            let c = tiny_skia::PremultipliedColorU8::from_rgba(p[0], p[1], p[2], p[3])
                .map(|c| c.demultiply())
                .unwrap_or(tiny_skia::ColorU8::from_rgba(0, 0, 0, 0));
            p.copy_from_slice(&[c.red(), c.green(), c.blue(), c.alpha()]);
        }
    }
    Ok(Raster {
        width: w as u32,
        height: h as u32,
        rgba,
    })
}

/// Encode a raster as PNG with its resolution stored (pHYs, pixels per
/// metre, as the PNG specification defines it).
pub fn encode_png(raster: &Raster, dpi: f64) -> Result<Vec<u8>> {
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, raster.width, raster.height);
        enc.set_color(png::ColorType::Rgba);
        enc.set_depth(png::BitDepth::Eight);
        let ppm = (dpi / 0.0254).round() as u32;
        enc.set_pixel_dims(Some(png::PixelDimensions {
            xppu: ppm,
            yppu: ppm,
            unit: png::Unit::Meter,
        }));
        let mut w = enc
            .write_header()
            .map_err(|e| Error::Internal(format!("PNG header: {e}")))?;
        w.write_image_data(&raster.rgba)
            .map_err(|e| Error::Internal(format!("PNG data: {e}")))?;
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn doc(svg: &str) -> Document {
        parse(Path::new("test.svg"), svg.as_bytes()).unwrap()
    }

    #[test]
    fn flat_fill_renders_exactly() {
        let d = doc(
            r##"<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10" fill="#777777"/></svg>"##,
        );
        let r = render(Path::new("t"), &d, 96.0, Srgb::new(1.0, 1.0, 1.0)).unwrap();
        assert_eq!((r.width, r.height), (10, 10));
        assert_eq!(r.pixel(5, 5), [0x77, 0x77, 0x77, 255]);
    }

    #[test]
    fn dpi_scales_physical_size() {
        // One inch wide (96 CSS px) at 300 dpi is 300 pixels.
        let d = doc(r#"<svg xmlns="http://www.w3.org/2000/svg" width="1in" height="0.5in"></svg>"#);
        let r = render(Path::new("t"), &d, 300.0, Srgb::new(1.0, 1.0, 1.0)).unwrap();
        assert_eq!((r.width, r.height), (300, 150));
    }

    #[test]
    fn text_renders_with_the_embedded_font_whatever_the_family() {
        let d = doc(
            r#"<svg xmlns="http://www.w3.org/2000/svg" width="60" height="20"><text x="2" y="15" font-family="NoSuchFamily" font-size="14">Hg</text></svg>"#,
        );
        let r = render(Path::new("t"), &d, 96.0, Srgb::new(1.0, 1.0, 1.0)).unwrap();
        let dark = r.rgba.chunks_exact(4).filter(|p| p[0] < 128).count();
        assert!(dark > 20, "text drew {dark} dark pixels");
    }

    #[test]
    fn external_references_are_refused_not_read() {
        let d = doc(
            r#"<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="10" height="10"><image width="10" height="10" xlink:href="/etc/passwd"/><image width="10" height="10" href="http://127.0.0.1:9/x.png"/></svg>"#,
        );
        assert_eq!(
            d.refused,
            vec![
                "/etc/passwd".to_string(),
                "http://127.0.0.1:9/x.png".to_string()
            ]
        );
    }

    #[test]
    fn png_stores_the_dpi_as_the_png_specification_defines() {
        // PNG specification, pHYs: pixels per unit, unit 1 = metre;
        // 300 dpi = 300 / 0.0254 = 11811 px/m. Decoded with the `png` crate.
        let d = doc(
            r##"<svg xmlns="http://www.w3.org/2000/svg" width="4" height="3"><rect width="4" height="3" fill="#336699"/></svg>"##,
        );
        let r = render(Path::new("t"), &d, 96.0, Srgb::new(1.0, 1.0, 1.0)).unwrap();
        let bytes = encode_png(&r, 300.0).unwrap();
        let dec = png::Decoder::new(std::io::Cursor::new(bytes));
        let mut reader = dec.read_info().unwrap();
        let dims = reader.info().pixel_dims.unwrap();
        assert_eq!(
            (dims.xppu, dims.yppu, dims.unit),
            (11811, 11811, png::Unit::Meter)
        );
        let mut buf = vec![0; reader.output_buffer_size().unwrap()];
        reader.next_frame(&mut buf).unwrap();
        assert_eq!(&buf[..4], &[0x33, 0x66, 0x99, 255]);
    }

    #[test]
    fn huge_declared_sizes_are_refused() {
        let d =
            doc(r#"<svg xmlns="http://www.w3.org/2000/svg" width="100000" height="100000"></svg>"#);
        let e = render(Path::new("big.svg"), &d, 96.0, Srgb::new(1.0, 1.0, 1.0)).unwrap_err();
        assert!(
            e.to_string().contains("big.svg") && e.to_string().contains("pixels"),
            "{e}"
        );
    }
}
