//! Rendering a scene painted in flat, opaque colours (the audit's label
//! raster) as resvg renders it, byte for byte, with clipped groups
//! composited more cheaply.
//!
//! resvg draws a clipped group into a layer, renders the clip path into a
//! second, black pixmap (clearing what it covers), turns that into an
//! alpha mask, inverts it, multiplies the layer by it and composites the
//! layer onto the canvas through a pattern shader. Where every pixel of
//! the clip pixmap is covered or not (alpha 0 or 255) and every masked
//! layer pixel is opaque or transparent, those steps amount to keeping a
//! layer pixel inside the clip and copying the opaque ones onto the
//! canvas, which is what is done here; otherwise the steps are made as
//! resvg makes them. Everything else (the layer's position, transforms,
//! fills and strokes) is drawn with the same calls, in the same order, as
//! resvg 0.49 (`render.rs`, `path.rs`, `clip.rs`). Trees with anything
//! else (gradients, patterns, images, masks, filters, group opacity or
//! blending) are left to resvg.
//!
//! The drawing steps follow resvg 0.49's renderer (Apache-2.0 OR MIT,
//! the licence under which hueproof uses it). Upgrading resvg means
//! checking them again: `tests/audit_speed_equivalence.rs` compares this
//! renderer with resvg byte for byte on the scenes it covers.

use resvg::tiny_skia::{self, IntRect, Pixmap, PixmapMut, Transform};
use resvg::usvg::{self, Group, Node};

/// Whether [`render_nodes`] draws the tree under `g` as resvg would.
pub fn supported(g: &Group) -> bool {
    g.children().iter().all(|n| match n {
        Node::Group(c) => {
            let plain = c.filters().is_empty()
                && c.mask().is_none()
                && c.opacity() == usvg::Opacity::ONE
                && c.blend_mode() == usvg::BlendMode::Normal;
            let clip = c
                .clip_path()
                .is_none_or(|cp| cp.clip_path().is_none() && clip_supported(cp.root()));
            plain && clip && supported(c)
        }
        Node::Path(p) => {
            p.fill()
                .is_none_or(|f| matches!(f.paint(), usvg::Paint::Color(_)))
                && p.stroke()
                    .is_none_or(|s| matches!(s.paint(), usvg::Paint::Color(_)))
        }
        Node::Text(t) => supported(t.flattened()),
        Node::Image(_) => false,
    })
}

fn clip_supported(g: &Group) -> bool {
    g.children().iter().all(|n| match n {
        Node::Group(c) => c.clip_path().is_none() && clip_supported(c),
        Node::Path(p) => p
            .fill()
            .is_none_or(|f| matches!(f.paint(), usvg::Paint::Color(_))),
        Node::Text(t) => clip_supported(t.flattened()),
        // resvg leaves images out of clip paths.
        Node::Image(_) => true,
    })
}

/// The largest layer resvg makes, as in `resvg::render`.
pub fn max_bbox(width: u32, height: u32) -> IntRect {
    IntRect::from_xywh(
        i32::try_from(width).unwrap_or(i32::MAX).saturating_mul(-2),
        i32::try_from(height).unwrap_or(i32::MAX).saturating_mul(-2),
        width.saturating_mul(5),
        height.saturating_mul(5),
    )
    .unwrap_or_else(|| {
        IntRect::from_ltrb(i32::MIN / 2, i32::MIN / 2, i32::MAX / 2, i32::MAX / 2)
            .expect("a valid rectangle")
    })
}

/// Draw the children of `parent` (a tree [`supported`] accepts).
pub fn render_nodes(parent: &Group, max_bbox: IntRect, ts: Transform, pm: &mut PixmapMut) {
    for node in parent.children() {
        match node {
            Node::Group(g) => {
                render_group(g, max_bbox, ts, pm);
            }
            Node::Path(p) => {
                if !p.is_visible() {
                    continue;
                }
                let mode = tiny_skia::BlendMode::SourceOver;
                if p.paint_order() == usvg::PaintOrder::FillAndStroke {
                    fill_path(p, mode, ts, pm);
                    stroke_path(p, mode, ts, pm);
                } else {
                    stroke_path(p, mode, ts, pm);
                    fill_path(p, mode, ts, pm);
                }
            }
            Node::Text(t) => {
                render_group(t.flattened(), max_bbox, ts, pm);
            }
            Node::Image(_) => {}
        }
    }
}

fn color_paint(paint: &usvg::Paint, opacity: usvg::Opacity) -> tiny_skia::Paint<'static> {
    let mut p = tiny_skia::Paint::default();
    if let usvg::Paint::Color(c) = paint {
        p.set_color_rgba8(c.red, c.green, c.blue, opacity.to_u8());
    }
    p
}

fn fill_path(path: &usvg::Path, mode: tiny_skia::BlendMode, ts: Transform, pm: &mut PixmapMut) {
    let Some(fill) = path.fill() else { return };
    // Horizontal and vertical lines cannot be filled.
    if path.data().bounds().width() == 0.0 || path.data().bounds().height() == 0.0 {
        return;
    }
    let rule = match fill.rule() {
        usvg::FillRule::NonZero => tiny_skia::FillRule::Winding,
        usvg::FillRule::EvenOdd => tiny_skia::FillRule::EvenOdd,
    };
    let mut paint = color_paint(fill.paint(), fill.opacity());
    paint.anti_alias = path.rendering_mode().use_shape_antialiasing();
    paint.blend_mode = mode;
    pm.fill_path(path.data(), &paint, rule, ts, None);
}

fn stroke_path(path: &usvg::Path, mode: tiny_skia::BlendMode, ts: Transform, pm: &mut PixmapMut) {
    let Some(stroke) = path.stroke() else { return };
    let mut paint = color_paint(stroke.paint(), stroke.opacity());
    paint.anti_alias = path.rendering_mode().use_shape_antialiasing();
    paint.blend_mode = mode;
    pm.stroke_path(path.data(), &paint, &stroke.to_tiny_skia(), ts, None);
}

fn render_group(g: &Group, max_bbox: IntRect, ts: Transform, pm: &mut PixmapMut) -> Option<()> {
    let ts = ts.pre_concat(g.transform());
    if !g.should_isolate() {
        render_nodes(g, max_bbox, ts, pm);
        return Some(());
    }
    // Without filters resvg's remaining transform is the identity.
    let rest = Transform::identity();
    let max_bbox = max_bbox.to_rect().transform(rest)?.round_out()?;
    let ts = rest.pre_concat(ts);
    // The layer, as `render_layer` places it.
    let bbox = g.layer_bounding_box().transform(ts)?;
    let ibbox = IntRect::from_xywh(
        (bbox.x().floor() as i32).checked_sub(2)?,
        (bbox.y().floor() as i32).checked_sub(2)?,
        (bbox.width().ceil() as u32).checked_add(4)?,
        (bbox.height().ceil() as u32).checked_add(4)?,
    )?;
    let ibbox = fit_to_rect(ibbox, max_bbox)?;
    let shift = {
        let mut dx = bbox.x();
        let mut dy = bbox.y();
        dx -= bbox.x() - ibbox.x() as f32;
        dy -= bbox.y() - ibbox.y() as f32;
        Transform::from_translate(-dx, -dy)
    };
    let ts = shift.pre_concat(ts);
    let mut layer = Pixmap::new(ibbox.width(), ibbox.height())?;
    render_nodes(g, max_bbox, ts, &mut layer.as_mut());
    let binary = match g.clip_path() {
        Some(clip) => apply_clip(clip, ts, &mut layer),
        None => opaque_or_clear(&layer),
    };
    composite(&layer, binary, ibbox, pm);
    Some(())
}

/// `resvg::geom::fit_to_rect`.
fn fit_to_rect(r: IntRect, bounds: IntRect) -> Option<IntRect> {
    IntRect::from_ltrb(
        r.left().max(bounds.left()),
        r.top().max(bounds.top()),
        r.right().min(bounds.right()),
        r.bottom().min(bounds.bottom()),
    )
}

/// The clip path: drawn as resvg draws it; the layer kept where it covers
/// (alpha 0 in the clip pixmap) and cleared where it does not (255), and
/// resvg's mask applied over that where the clip pixmap has other alphas
/// (which it turns into the same values for the pixels already done).
///
/// Returns whether every layer pixel is then opaque or transparent.
fn apply_clip(clip: &usvg::ClipPath, ts: Transform, layer: &mut Pixmap) -> bool {
    let mut clip_pm = Pixmap::new(layer.width(), layer.height()).expect("the layer's size");
    clip_pm.fill(tiny_skia::Color::BLACK);
    clip_children(
        clip.root(),
        tiny_skia::BlendMode::Clear,
        ts.pre_concat(clip.transform()),
        &mut clip_pm.as_mut(),
    );
    let (mut partial, mut translucent) = (false, false);
    for (px, c) in layer
        .data_mut()
        .chunks_exact_mut(4)
        .zip(clip_pm.data().chunks_exact(4))
    {
        let a = c[3];
        let keep = if a == 255 { 0 } else { 0xff };
        for v in px.iter_mut() {
            *v &= keep;
        }
        partial |= a.wrapping_sub(1) < 254;
        translucent |= px[3].wrapping_sub(1) < 254;
    }
    if partial {
        let mut mask = tiny_skia::Mask::from_pixmap(clip_pm.as_ref(), tiny_skia::MaskType::Alpha);
        mask.invert();
        layer.apply_mask(&mask);
        return opaque_or_clear(layer);
    }
    !translucent
}

/// Whether every pixel of `layer` is opaque or transparent.
fn opaque_or_clear(layer: &Pixmap) -> bool {
    !layer
        .data()
        .chunks_exact(4)
        .fold(false, |acc, p| acc | (p[3].wrapping_sub(1) < 254))
}

/// `resvg::clip::draw_children` for the trees [`supported`] accepts.
fn clip_children(parent: &Group, mode: tiny_skia::BlendMode, ts: Transform, pm: &mut PixmapMut) {
    for child in parent.children() {
        match child {
            Node::Path(p) => {
                if p.is_visible() {
                    fill_path(p, mode, ts, pm);
                }
            }
            Node::Text(t) => clip_children(t.flattened(), mode, ts, pm),
            Node::Group(g) => clip_children(g, mode, ts.pre_concat(g.transform()), pm),
            Node::Image(_) => {}
        }
    }
}

/// The layer onto the canvas at `ibbox`: its opaque pixels copied when
/// every pixel is opaque or transparent (`binary`) (what source-over does with such
/// pixels), else through the pattern shader as resvg does.
fn composite(layer: &Pixmap, binary: bool, ibbox: IntRect, pm: &mut PixmapMut) {
    if !binary {
        let paint = tiny_skia::Paint {
            shader: tiny_skia::Pattern::new(
                layer.as_ref(),
                tiny_skia::SpreadMode::Pad,
                tiny_skia::FilterQuality::Bilinear,
                1.0,
                Transform::from_translate(ibbox.x() as f32, ibbox.y() as f32),
            ),
            blend_mode: tiny_skia::BlendMode::SourceOver,
            anti_alias: true,
            ..tiny_skia::Paint::default()
        };
        let path = tiny_skia::PathBuilder::from_rect(ibbox.to_rect());
        pm.fill_path(
            &path,
            &paint,
            tiny_skia::FillRule::Winding,
            Transform::identity(),
            None,
        );
        return;
    }
    let (cw, ch) = (pm.width() as i64, pm.height() as i64);
    let (lw, lh) = (layer.width() as i64, layer.height() as i64);
    let (x0, y0) = (ibbox.x() as i64, ibbox.y() as i64);
    let (xa, xb) = (x0.max(0), (x0 + lw).min(cw));
    let (ya, yb) = (y0.max(0), (y0 + lh).min(ch));
    if xa >= xb || ya >= yb {
        return;
    }
    let src = layer.data();
    let dst = pm.data_mut();
    for y in ya..yb {
        let s = ((y - y0) * lw + (xa - x0)) as usize * 4;
        let d = (y * cw + xa) as usize * 4;
        let n = (xb - xa) as usize * 4;
        for (dp, sp) in dst[d..d + n]
            .chunks_exact_mut(4)
            .zip(src[s..s + n].chunks_exact(4))
        {
            let m = if sp[3] == 255 { 0xff } else { 0 };
            for (d, &s) in dp.iter_mut().zip(sp) {
                *d = (s & m) | (*d & !m);
            }
        }
    }
}
