//! The index sheet of several figures: one cell per figure with a
//! thumbnail of the figure under normal vision, its name, its verdict and
//! the views with findings.
//!
//! Thumbnails are shrunk by a whole factor with a box filter (the mean of
//! each block of pixels, in encoded sRGB values as common practice for
//! previews), so they are previews only: the figure's sheet holds the
//! panels at full size.

use crate::audit::Examined;
use crate::raster::Raster;

use super::canvas::{Canvas, INK, Placed, fit, text};
use super::figure::verdict;

/// One figure on the index.
pub struct Entry<'a> {
    /// The figure's name (its file).
    pub name: String,
    /// The name of its own sheet file.
    pub sheet: String,
    /// The audit.
    pub examined: &'a Examined,
}

/// `img` shrunk by the whole factor `f` (box filter).
pub fn shrink(img: &Raster, f: u32) -> Raster {
    let f = f.max(1);
    let (w, h) = (img.width.div_ceil(f), img.height.div_ceil(f));
    let mut rgba = Vec::with_capacity((w * h * 4) as usize);
    for ty in 0..h {
        for tx in 0..w {
            let mut sum = [0u32; 4];
            let mut count = 0u32;
            for y in ty * f..((ty + 1) * f).min(img.height) {
                for x in tx * f..((tx + 1) * f).min(img.width) {
                    let p = img.pixel(x, y);
                    for c in 0..4 {
                        sum[c] += p[c] as u32;
                    }
                    count += 1;
                }
            }
            rgba.extend(sum.map(|s| ((s + count / 2) / count) as u8));
        }
    }
    Raster {
        width: w,
        height: h,
        rgba,
    }
}

/// Lay out the index of `entries` at `dpi` (for the text size and the
/// stored resolution).
pub fn build(entries: &[Entry], dpi: f64) -> Canvas {
    let u = (dpi / 96.0).max(0.5);
    let px = |css: f64| (css * u).round();
    let (margin, thumb_w, thumb_h) = (px(16.0), px(240.0), px(170.0));
    let cols = entries.len().clamp(1, 3);
    let gap = px(24.0);
    let cell_h = thumb_h + px(50.0);
    let mut body = String::new();
    text(
        &mut body,
        margin,
        margin + px(15.0),
        px(16.0),
        true,
        &format!(
            "Contact sheets: {} figure{}",
            entries.len(),
            if entries.len() == 1 { "" } else { "s" }
        ),
    );
    let top = margin + px(30.0);
    let mut images = Vec::new();
    for (i, e) in entries.iter().enumerate() {
        let cx = margin + (i % cols) as f64 * (thumb_w + gap);
        let cy = top + (i / cols) as f64 * (cell_h + gap);
        let img = &e.examined.raster;
        let f = (img.width as f64 / thumb_w)
            .max(img.height as f64 / thumb_h)
            .ceil()
            .max(1.0) as u32;
        let t = shrink(img, f);
        let (x, y) = (cx as u32, cy as u32);
        body.push_str(&format!(
            r#"<rect x="{}" y="{}" width="{}" height="{}" fill="none" stroke="{INK}" stroke-width="1"/>"#,
            x as f64 - 0.5,
            y as f64 - 0.5,
            t.width + 1,
            t.height + 1
        ));
        let below = cy + thumb_h;
        text(
            &mut body,
            cx,
            below + px(16.0),
            px(11.0),
            true,
            &fit(&e.name, px(11.0), true, thumb_w),
        );
        text(
            &mut body,
            cx,
            below + px(30.0),
            px(9.5),
            false,
            &fit(&verdict(e.examined), px(9.5), false, thumb_w),
        );
        let mut flagged: Vec<&str> = Vec::new();
        for f in &e.examined.report.findings {
            if !flagged.contains(&f.view.as_str()) {
                flagged.push(&f.view);
            }
        }
        let views = if flagged.is_empty() {
            format!("sheet: {}", e.sheet)
        } else {
            format!("in {}; sheet: {}", flagged.join(", "), e.sheet)
        };
        text(
            &mut body,
            cx,
            below + px(43.0),
            px(9.5),
            false,
            &fit(&views, px(9.5), false, thumb_w),
        );
        images.push(Placed { x, y, raster: t });
    }
    let rows = entries.len().div_ceil(cols).max(1);
    Canvas {
        width: (2.0 * margin + cols as f64 * thumb_w + (cols - 1) as f64 * gap) as u32,
        height: (top + rows as f64 * cell_h + (rows - 1) as f64 * gap + margin) as u32,
        dpi,
        body,
        images,
    }
}
