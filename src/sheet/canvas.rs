//! A sheet page: the chrome (text, swatches, key) as SVG in sheet pixels,
//! and the panels as rasters placed at whole-pixel offsets.
//!
//! For PNG the chrome is rendered with the raster stage (1 SVG unit = 1
//! pixel) and the panels are copied in pixel for pixel, so nothing
//! resamples them. For SVG the panels are embedded as PNG data at their
//! exact pixel size with `image-rendering="optimizeSpeed"`; how a viewer
//! scales them is up to the viewer. For PDF (whose converter takes no
//! raster images) each panel is drawn as vector shapes: one filled path
//! per colour made of the panel's runs of equal pixels, one unit high, so
//! every pixel keeps its colour (a PDF viewer's anti-aliasing may show
//! faint seams between runs when zoomed).

use std::fmt::Write as _;
use std::path::Path;

use base64::Engine as _;

use crate::color::Srgb;
use crate::error::{Error, Result};
use crate::raster::{self, Raster};

/// The sheet's background.
pub const PAPER: &str = "#ffffff";
/// The colour of all the sheet's text (17.4:1 on [`PAPER`] in every view).
pub const INK: &str = "#1a1a1a";

/// A raster placed on the page.
#[derive(Debug, Clone)]
pub struct Placed {
    /// Left edge, pixels.
    pub x: u32,
    /// Top edge, pixels.
    pub y: u32,
    /// The pixels (straight RGBA8, opaque).
    pub raster: Raster,
}

/// One page.
#[derive(Debug, Clone)]
pub struct Canvas {
    /// Width, pixels.
    pub width: u32,
    /// Height, pixels.
    pub height: u32,
    /// The resolution the page is meant at (the audit DPI): stored in the
    /// PNG and used for the SVG's physical size.
    pub dpi: f64,
    /// SVG elements of the chrome, in sheet pixels.
    pub body: String,
    /// The panels and thumbnails.
    pub images: Vec<Placed>,
}

impl Canvas {
    fn svg_with(&self, size: &str, images: &str) -> String {
        let (w, h) = (self.width, self.height);
        format!(
            r#"<svg xmlns="http://www.w3.org/2000/svg" {size} viewBox="0 0 {w} {h}" font-family="{font}"><rect width="{w}" height="{h}" fill="{PAPER}"/>{body}{images}</svg>
"#,
            font = raster::FONT_FAMILY,
            body = self.body,
        )
    }

    /// The chrome alone as SVG (1 unit = 1 pixel), without the panels.
    pub fn chrome_svg(&self) -> String {
        self.svg_with(
            &format!(r#"width="{}" height="{}""#, self.width, self.height),
            "",
        )
    }

    /// The page as one raster.
    pub fn raster(&self) -> Result<Raster> {
        let name = Path::new("contact sheet");
        let doc = raster::parse(name, self.chrome_svg().as_bytes())?;
        let mut page = raster::render(name, &doc, 96.0, Srgb::new(1.0, 1.0, 1.0))?;
        if (page.width, page.height) != (self.width, self.height) {
            return Err(Error::Internal(format!(
                "the sheet rendered at {} x {} px, laid out at {} x {}",
                page.width, page.height, self.width, self.height
            )));
        }
        for p in &self.images {
            let (pw, ph) = (p.raster.width as usize, p.raster.height as usize);
            let (x, y) = (p.x as usize, p.y as usize);
            if x + pw > page.width as usize || y + ph > page.height as usize {
                return Err(Error::Internal("a panel lies outside the sheet".into()));
            }
            let stride = page.width as usize * 4;
            for row in 0..ph {
                let src = &p.raster.rgba[row * pw * 4..(row + 1) * pw * 4];
                let at = (y + row) * stride + x * 4;
                page.rgba[at..at + pw * 4].copy_from_slice(src);
            }
        }
        Ok(page)
    }

    /// The page as PNG, with the page's DPI stored.
    pub fn png(&self) -> Result<Vec<u8>> {
        raster::encode_png(&self.raster()?, self.dpi)
    }

    /// The page as SVG, at its physical size, panels embedded as PNG data.
    pub fn svg(&self) -> Result<String> {
        let mut images = String::new();
        for p in &self.images {
            let png = raster::encode_png(&p.raster, self.dpi)?;
            let data = base64::engine::general_purpose::STANDARD.encode(png);
            let _ = write!(
                images,
                r#"<image x="{}" y="{}" width="{}" height="{}" image-rendering="optimizeSpeed" href="data:image/png;base64,{data}"/>"#,
                p.x, p.y, p.raster.width, p.raster.height
            );
        }
        Ok(self.svg_with(&self.physical_size(), &images))
    }

    /// `width` and `height` attributes at the page's physical size.
    fn physical_size(&self) -> String {
        let mm = |px: u32| crate::svg::num(px as f64 * 25.4 / self.dpi);
        format!(
            r#"width="{}mm" height="{}mm""#,
            mm(self.width),
            mm(self.height)
        )
    }
}

impl Canvas {
    /// The page as a one-page PDF at its physical size, panels as vector
    /// pixel runs.
    pub fn pdf(&self) -> Result<Vec<u8>> {
        let mut runs = String::new();
        for p in &self.images {
            pixel_runs(&mut runs, p);
        }
        let svg = self.svg_with(&self.physical_size(), &runs);
        crate::pdf::svg_to_pdf(Path::new("contact sheet"), svg.as_bytes())
    }
}

/// `p` as one path per colour of its runs of equal pixels, colours in
/// sorted order (deterministic output).
fn pixel_runs(out: &mut String, p: &Placed) {
    let r = &p.raster;
    let mut paths: std::collections::BTreeMap<[u8; 3], String> = Default::default();
    let (w, h) = (r.width as usize, r.height as usize);
    for y in 0..h {
        let row = &r.rgba[y * w * 4..(y + 1) * w * 4];
        let mut x = 0;
        while x < w {
            let c = [row[4 * x], row[4 * x + 1], row[4 * x + 2]];
            let mut e = x + 1;
            while e < w && row[4 * e..4 * e + 3] == c {
                e += 1;
            }
            let d = paths.entry(c).or_default();
            let _ = write!(
                d,
                "M{} {}h{}v1h-{}z",
                p.x as usize + x,
                p.y as usize + y,
                e - x,
                e - x
            );
            x = e;
        }
    }
    for ([r, g, b], d) in paths {
        let _ = write!(out, r##"<path d="{d}" fill="#{r:02x}{g:02x}{b:02x}"/>"##);
    }
}

/// Text at (x, y) (baseline), escaped, in [`INK`].
pub fn text(out: &mut String, x: f64, y: f64, size: f64, bold: bool, s: &str) {
    let weight = if bold { r#" font-weight="bold""# } else { "" };
    let _ = write!(
        out,
        r#"<text x="{}" y="{}" font-size="{}"{weight} fill="{INK}">{}</text>"#,
        crate::svg::num(x),
        crate::svg::num(y),
        crate::svg::num(size),
        crate::svg::escape(s)
    );
}

/// `s` cut to fit `width` at `size`, ending in an ellipsis when cut.
pub fn fit(s: &str, size: f64, bold: bool, width: f64) -> String {
    if crate::font::text_width(s, size, bold) <= width {
        return s.to_string();
    }
    let mut chars: Vec<char> = s.chars().collect();
    while !chars.is_empty() {
        chars.pop();
        let t: String = chars.iter().collect::<String>() + "\u{2026}";
        if crate::font::text_width(&t, size, bold) <= width {
            return t;
        }
    }
    String::new()
}
