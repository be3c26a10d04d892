//! The marks drawn on a panel where the audit found a problem in that
//! view, computed on the label raster so they land on the class's own
//! pixels: a solid outline around the regions of classes that blend, a
//! dashed outline around a class that fades into the background, and
//! diagonal hatching over a class that glares.
//!
//! Every mark is a pair of lines side by side, one black and one white.
//! Black and white are fixed points of every simulation here (each model
//! maps linear 0 to 0 and linear 1 to 1 on every channel), so the marks
//! look the same in every view; and every colour has a WCAG contrast of at
//! least sqrt(21) = 4.58:1 with one of the two (the product of its two
//! contrasts is 21), so one line of each pair clears the 3:1 that WCAG 2.x
//! SC 1.4.11 asks of graphical objects against whatever it lies on.

use crate::audit::labels::{Labels, fill_label};

/// A kind of mark.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum Mark {
    /// Diagonal hatching over the class (glare). Drawn first.
    Hatch,
    /// A dashed outline (fade).
    Dashed,
    /// A solid outline (blend). Drawn last, so it stays whole.
    Solid,
}

/// The dark line of each mark.
pub const DARK: [u8; 3] = [0, 0, 0];
/// The light line beside it.
pub const LIGHT: [u8; 3] = [255, 255, 255];

/// Not marked.
pub const NONE: u8 = 0;
/// Marked with [`DARK`].
pub const ON_DARK: u8 = 1;
/// Marked with [`LIGHT`].
pub const ON_LIGHT: u8 = 2;

/// The width of each line of a pair, in pixels: one CSS pixel at the
/// audit DPI, at least one pixel.
pub fn line_width(dpi: f64) -> usize {
    (dpi / 96.0).round().max(1.0) as usize
}

/// One step of erosion (`grow` false) or dilation (`grow` true) with the
/// four-neighbourhood; outside the image counts as outside the mask.
fn step(mask: &[bool], w: usize, h: usize, grow: bool) -> Vec<bool> {
    let mut out = mask.to_vec();
    for y in 0..h {
        for x in 0..w {
            let i = y * w + x;
            let n = [
                (x > 0).then(|| mask[i - 1]),
                (x + 1 < w).then(|| mask[i + 1]),
                (y > 0).then(|| mask[i - w]),
                (y + 1 < h).then(|| mask[i + w]),
            ];
            if grow {
                out[i] = mask[i] || n.contains(&Some(true));
            } else {
                out[i] = mask[i] && n.iter().all(|v| *v == Some(true));
            }
        }
    }
    out
}

/// The mark layer of one panel: per pixel [`NONE`], [`ON_DARK`] or
/// [`ON_LIGHT`], for `marks` (class index as in the label raster, kind).
pub fn layer(labels: &Labels, marks: &[(usize, Mark)], dpi: f64) -> Vec<u8> {
    let (w, h) = (labels.width as usize, labels.height as usize);
    let mut out = vec![NONE; w * h];
    let lw = line_width(dpi);
    let mut order = marks.to_vec();
    order.sort_by_key(|&(k, m)| (m, k));
    order.dedup();
    for (k, mark) in order {
        let label = fill_label(k);
        let mask: Vec<bool> = labels.ids.iter().map(|&l| l == label).collect();
        if !mask.iter().any(|&b| b) {
            continue;
        }
        let (mut inner, mut outer) = (mask.clone(), mask.clone());
        for _ in 0..lw {
            inner = step(&inner, w, h, false);
            outer = step(&outer, w, h, true);
        }
        let dash = 4 * lw;
        let hatch = 6 * lw;
        for y in 0..h {
            for x in 0..w {
                let i = y * w + x;
                let edge_in = mask[i] && !inner[i];
                let edge_out = outer[i] && !mask[i];
                let v = match mark {
                    Mark::Solid | Mark::Dashed => {
                        if mark == Mark::Dashed && ((x + y) / dash) % 2 == 1 {
                            continue;
                        }
                        if edge_in {
                            ON_DARK
                        } else if edge_out {
                            ON_LIGHT
                        } else {
                            continue;
                        }
                    }
                    Mark::Hatch => {
                        if !inner[i] {
                            continue;
                        }
                        match (x + y) % hatch {
                            p if p < lw => ON_DARK,
                            p if p < 2 * lw => ON_LIGHT,
                            _ => continue,
                        }
                    }
                };
                out[i] = v;
            }
        }
    }
    out
}

/// Paint `layer` onto straight RGBA8 pixels of the same size.
pub fn paint(rgba: &mut [u8], layer: &[u8]) {
    for (px, &m) in rgba.chunks_exact_mut(4).zip(layer) {
        let c = match m {
            ON_DARK => DARK,
            ON_LIGHT => LIGHT,
            _ => continue,
        };
        px[..3].copy_from_slice(&c);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn square() -> Labels {
        // A 4 x 4 class-0 square in the middle of an 8 x 8 background.
        let mut ids = vec![0u16; 64];
        for y in 2..6 {
            for x in 2..6 {
                ids[y * 8 + x] = fill_label(0);
            }
        }
        Labels {
            width: 8,
            height: 8,
            ids,
        }
    }

    #[test]
    fn a_solid_outline_is_dark_on_the_region_edge_and_light_just_outside() {
        let l = square();
        let m = layer(&l, &[(0, Mark::Solid)], 96.0);
        let dark = m.iter().filter(|&&v| v == ON_DARK).count();
        let light = m.iter().filter(|&&v| v == ON_LIGHT).count();
        // 12 edge pixels of a 4 x 4 square; 16 four-neighbours outside it.
        assert_eq!((dark, light), (12, 16));
        for (i, &v) in m.iter().enumerate() {
            let on_class = l.ids[i] == fill_label(0);
            match v {
                ON_DARK => assert!(on_class),
                ON_LIGHT => assert!(!on_class),
                _ => {}
            }
        }
        // The middle of the square is not marked.
        assert_eq!(m[3 * 8 + 3], NONE);
    }

    #[test]
    fn hatching_stays_inside_the_class_and_alternates_dark_and_light() {
        let mut ids = vec![0u16; 400];
        for y in 2..18 {
            for x in 2..18 {
                ids[y * 20 + x] = fill_label(0);
            }
        }
        let l = Labels {
            width: 20,
            height: 20,
            ids,
        };
        let m = layer(&l, &[(0, Mark::Hatch)], 96.0);
        let (mut dark, mut light) = (0, 0);
        for (i, &v) in m.iter().enumerate() {
            if v != NONE {
                // Inside, off the edge ring (the edge is for outlines).
                let (x, y) = (i % 20, i / 20);
                assert!((3..17).contains(&x) && (3..17).contains(&y), "{x} {y}");
                let d = (x + y) % 6;
                assert_eq!(v, if d == 0 { ON_DARK } else { ON_LIGHT });
                assert!(d < 2);
            }
            dark += (v == ON_DARK) as usize;
            light += (v == ON_LIGHT) as usize;
        }
        assert!(dark > 20 && light > 20, "{dark} {light}");
    }

    #[test]
    fn a_class_not_in_the_raster_draws_nothing() {
        let m = layer(&square(), &[(3, Mark::Solid)], 96.0);
        assert!(m.iter().all(|&v| v == NONE));
    }
}
