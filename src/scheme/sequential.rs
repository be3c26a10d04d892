//! Sequential schemes: one lightness sequence for ordered data.
//!
//! Lightness runs linearly in OKLab from the end nearest the background
//! (class 1, low values) to the far end; chroma is low at the ends and
//! peaks in the middle; hue follows the user's hue, or moves from a first
//! to a second hue. The end nearest the background is the first lightness
//! at which that colour separates from the background by the CIEDE2000
//! floor (with a margin for 8-bit rounding) in every view. The far end
//! stops short of black (OKLab L 0.28) unless black is asked for, or of
//! white (0.96) on a dark background. Classes are then placed at equal
//! CIEDE2000 steps in normal vision.

use crate::color::Srgb;

use super::ramp::{Path, place};
use super::{Context, near_background_lightness, to_8bit};

/// Options of a sequential scheme.
#[derive(Debug, Clone, PartialEq)]
pub struct Options {
    /// Number of classes (at least 2).
    pub classes: usize,
    /// One hue, or a start and an end hue, in OKLCH degrees.
    pub hues: Vec<f64>,
    /// Peak chroma added in the middle of the ramp (OKLCH).
    pub chroma: f64,
    /// Let the far end reach black (light background) or white (dark).
    pub to_extreme: bool,
}

impl Default for Options {
    fn default() -> Self {
        Options {
            classes: 5,
            hues: vec![250.0],
            chroma: 0.1,
            to_extreme: false,
        }
    }
}

/// The OKLCH path of the scheme, with the far end at OKLab lightness
/// `far`.
fn path_to(opts: &Options, ctx: &Context, far: f64) -> Path {
    let h0 = opts.hues.first().copied().unwrap_or(250.0);
    let h1 = opts.hues.get(1).copied().unwrap_or(h0);
    let near_chroma = 0.03;
    let near = near_background_lightness(ctx, |l| {
        Path {
            lightness: (l, far),
            chroma: (near_chroma, 0.05, opts.chroma),
            hue: (h0, h1),
        }
        .srgb(0.0)
    });
    Path {
        lightness: (near, far),
        chroma: (
            near_chroma,
            if opts.to_extreme { 0.0 } else { 0.05 },
            opts.chroma,
        ),
        hue: (h0, h1),
    }
}

/// Generate the classes, in class order (class 1 nearest the background).
///
/// Steps are equal in normal vision; where a deficiency view shrinks a
/// step below the floor (chroma differences vanish, lightness remains),
/// the far end moves further from the background, 0.02 of OKLab
/// lightness at a time, down to 0.18 (up to 0.99 on dark backgrounds);
/// if that is not enough, the chroma peak drops by a fifth at a time (to
/// 0.02), which makes the equal steps lean on lightness, the one cue every
/// view keeps.
pub fn generate(opts: &Options, ctx: &Context) -> Vec<Srgb> {
    let mut o = opts.clone();
    loop {
        let (colors, ok) = generate_once(&o, ctx);
        if ok || o.chroma <= 0.02 {
            return colors;
        }
        o.chroma = (o.chroma * 0.8).max(0.02);
    }
}

/// One attempt at the given chroma; says whether every view keeps every
/// step above the floor.
fn generate_once(opts: &Options, ctx: &Context) -> (Vec<Srgb>, bool) {
    let n = opts.classes.max(2);
    let light = ctx.light_background();
    let (mut far, limit, step) = match (light, opts.to_extreme) {
        (true, false) => (0.28, 0.18, -0.02),
        (false, false) => (0.96, 0.99, 0.01),
        (true, true) => (0.0, 0.0, 0.0),
        (false, true) => (1.0, 1.0, 0.0),
    };
    let sims = ctx.simulations();
    loop {
        let p = path_to(opts, ctx, far);
        let colors: Vec<Srgb> = place(|t| p.srgb(t), &vec![1.0; n - 1])
            .into_iter()
            .map(|t| to_8bit(p.srgb(t)))
            .collect();
        let weakest = colors
            .windows(2)
            .flat_map(|w| {
                sims.iter().map(move |s| {
                    crate::color::ciede2000(s.apply(w[0]).to_lab(), s.apply(w[1]).to_lab())
                })
            })
            .fold(f64::INFINITY, f64::min);
        let next = far + step;
        let can_move = step != 0.0
            && if step < 0.0 {
                next >= limit - 1e-9
            } else {
                next <= limit + 1e-9
            };
        let ok = weakest >= ctx.thresholds.min_delta_e * 1.02;
        if ok || !can_move {
            return (colors, ok);
        }
        far = next;
    }
}
