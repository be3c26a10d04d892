//! Diverging schemes: two lightness sequences leaving a light, neutral
//! midpoint, for data with a meaningful middle.
//!
//! Both arms share one lightness schedule, so classes at equal distance
//! from the midpoint match in lightness; chroma rises from zero at the
//! midpoint. With an odd class count the middle class is the neutral
//! midpoint (chroma 0); with an even count the two middle classes sit one
//! step either side of it. Unless the user gives the two arm hues, they are
//! chosen (every 10 degrees of OKLCH hue, at least 90 degrees apart) to
//! maximise the smallest CIEDE2000 difference between the arms under
//! normal vision, protanopia, deuteranopia and tritanopia.

use crate::color::{Srgb, ciede2000};
use crate::vision::{Deficiency, Simulation, View};

use super::ramp::{Path, place_by};
use super::{Context, near_background_lightness, to_8bit};

/// Options of a diverging scheme.
#[derive(Debug, Clone, PartialEq)]
pub struct Options {
    /// Number of classes (at least 2).
    pub classes: usize,
    /// The hues of the low arm and the high arm, or None to choose them.
    pub hues: Option<(f64, f64)>,
    /// Chroma at the arm ends (OKLCH).
    pub chroma: f64,
}

impl Default for Options {
    fn default() -> Self {
        Options {
            classes: 7,
            hues: None,
            chroma: 0.12,
        }
    }
}

fn arm(mid: f64, end: f64, hue: f64, chroma: f64) -> Path {
    Path {
        lightness: (mid, end),
        chroma: (0.0, chroma, chroma * 0.35),
        hue: (hue, hue),
    }
}

/// Midpoint and end lightness for this background.
fn lightness_range(ctx: &Context) -> (f64, f64) {
    let mid = near_background_lightness(ctx, |l| {
        crate::color::gamut::map_oklch_to_srgb(crate::color::Oklch::new(l, 0.0, 0.0)).0
    });
    (mid, if ctx.light_background() { 0.42 } else { 0.92 })
}

/// Choose arm hues that stay apart for dichromats.
pub fn choose_hues(chroma: f64, ctx: &Context) -> (f64, f64) {
    let (mid, end) = lightness_range(ctx);
    let sims: Vec<Simulation> = [
        View::Normal,
        View::Dichromacy(Deficiency::Protan),
        View::Dichromacy(Deficiency::Deutan),
        View::Dichromacy(Deficiency::Tritan),
    ]
    .into_iter()
    .map(|v| Simulation::new(v, ctx.model))
    .collect();
    let mut best = ((250.0, 60.0), f64::NEG_INFINITY);
    for i in 0..36 {
        for j in 0..36 {
            let (h1, h2) = (i as f64 * 10.0, j as f64 * 10.0);
            let sep = (h1 - h2).rem_euclid(360.0);
            if !(90.0..=270.0).contains(&sep) || h1 > h2 {
                continue;
            }
            let (a, b) = (arm(mid, end, h1, chroma), arm(mid, end, h2, chroma));
            let mut score = f64::INFINITY;
            for t in [0.35, 1.0] {
                let (ca, cb) = (a.srgb(t), b.srgb(t));
                for s in &sims {
                    score = score.min(ciede2000(s.apply(ca).to_lab(), s.apply(cb).to_lab()));
                }
            }
            if score > best.1 + 1e-9 {
                best = ((h1, h2), score);
            }
        }
    }
    best.0
}

/// Generate the classes, low arm first, midpoint in the middle.
///
/// Where a view shrinks a step between neighbours below the floor, the arm
/// ends move further from the midpoint (0.02 of OKLab lightness at a time,
/// to 0.30 on light backgrounds or 0.98 on dark ones), then the chroma
/// drops by a fifth at a time (to 0.04), as for sequential schemes.
pub fn generate(opts: &Options, ctx: &Context) -> Vec<Srgb> {
    let (mid, mut end) = lightness_range(ctx);
    let (limit, step) = if ctx.light_background() {
        (0.30, -0.02)
    } else {
        (0.98, 0.02)
    };
    let hues = opts.hues.unwrap_or_else(|| choose_hues(opts.chroma, ctx));
    let mut chroma = opts.chroma;
    let sims = ctx.simulations();
    loop {
        let colors = generate_with(opts.classes, mid, end, hues, chroma);
        let weakest = colors
            .windows(2)
            .flat_map(|w| {
                sims.iter()
                    .map(move |s| ciede2000(s.apply(w[0]).to_lab(), s.apply(w[1]).to_lab()))
            })
            .fold(f64::INFINITY, f64::min);
        if weakest >= ctx.thresholds.min_delta_e * 1.02 {
            return colors;
        }
        let next = end + step;
        if (step < 0.0 && next >= limit - 1e-9) || (step > 0.0 && next <= limit + 1e-9) {
            end = next;
        } else if chroma > 0.04 {
            chroma = (chroma * 0.8).max(0.04);
        } else {
            return colors;
        }
    }
}

fn generate_with(
    classes: usize,
    mid: f64,
    end: f64,
    (h_low, h_high): (f64, f64),
    chroma: f64,
) -> Vec<Srgb> {
    let n = classes.max(2);
    let (low, high) = (arm(mid, end, h_low, chroma), arm(mid, end, h_high, chroma));
    let k = n / 2;
    // Both arms share the positions; steps equal on the mean of the arms.
    let d = |p: &Path, a: f64, b: f64| ciede2000(p.srgb(a).to_lab(), p.srgb(b).to_lab());
    let ts = place_by(|a, b| (d(&low, a, b) + d(&high, a, b)) / 2.0, &vec![1.0; k]);
    let mut out: Vec<Srgb> = ts[1..]
        .iter()
        .rev()
        .map(|&t| to_8bit(low.srgb(t)))
        .collect();
    if n % 2 == 1 {
        out.push(to_8bit(low.srgb(0.0)));
    }
    out.extend(ts[1..].iter().map(|&t| to_8bit(high.srgb(t))));
    out
}
