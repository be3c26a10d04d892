//! Mapping colours that fall outside sRGB into it, by the CSS Color 4
//! binary-search algorithm with local MINDE: chroma is reduced in OKLCH at
//! constant lightness and hue until the clipped colour is within one
//! just-noticeable difference (deltaEOK 0.02) of the unclipped one.

use super::difference::delta_e_ok;
use super::oklab::Oklch;
use super::srgb::Srgb;

const JND: f64 = 0.02;
const EPSILON: f64 = 0.0001;
const IN_GAMUT_TOLERANCE: f64 = 1e-6;

fn oklch_to_srgb(c: Oklch) -> Srgb {
    c.to_oklab().to_xyz().to_linear_rgb().to_srgb()
}

fn srgb_to_oklch(c: Srgb) -> Oklch {
    c.to_linear().to_xyz().to_oklab().to_oklch()
}

/// Map an OKLCH colour into the sRGB gamut. In-gamut colours come back
/// unchanged; the second value says whether any mapping happened.
pub fn map_oklch_to_srgb(origin: Oklch) -> (Srgb, bool) {
    if origin.l >= 1.0 {
        return (
            Srgb::new(1.0, 1.0, 1.0),
            !(origin.l == 1.0 && origin.c == 0.0),
        );
    }
    if origin.l <= 0.0 {
        return (
            Srgb::new(0.0, 0.0, 0.0),
            !(origin.l == 0.0 && origin.c == 0.0),
        );
    }
    let direct = oklch_to_srgb(origin);
    if direct.in_gamut(IN_GAMUT_TOLERANCE) {
        return (direct.clamped(), false);
    }
    let mut current = origin;
    let mut clipped = direct.clamped();
    if delta_e_ok(srgb_to_oklch(clipped).to_oklab(), current.to_oklab()) < JND {
        return (clipped, true);
    }
    let mut min = 0.0;
    let mut max = origin.c;
    let mut min_in_gamut = true;
    while max - min > EPSILON {
        let chroma = (min + max) / 2.0;
        current.c = chroma;
        let candidate = oklch_to_srgb(current);
        if min_in_gamut && candidate.in_gamut(IN_GAMUT_TOLERANCE) {
            min = chroma;
            continue;
        }
        clipped = candidate.clamped();
        let e = delta_e_ok(srgb_to_oklch(clipped).to_oklab(), current.to_oklab());
        if e < JND {
            if JND - e < EPSILON {
                return (clipped, true);
            }
            min_in_gamut = false;
            min = chroma;
        } else {
            max = chroma;
        }
    }
    (clipped, true)
}

/// Map an sRGB colour that may lie outside 0..1 into the gamut.
pub fn map_srgb(c: Srgb) -> (Srgb, bool) {
    if c.in_gamut(IN_GAMUT_TOLERANCE) {
        return (c.clamped(), false);
    }
    map_oklch_to_srgb(srgb_to_oklch(c))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn in_gamut_colours_are_unchanged() {
        let c = Srgb::new(0.2, 0.5, 0.7);
        let (m, changed) = map_srgb(c);
        assert!(!changed);
        assert!((m.r - c.r).abs() < 1e-12 && (m.b - c.b).abs() < 1e-12);
    }

    #[test]
    fn out_of_gamut_keeps_lightness_and_hue_within_a_jnd() {
        // A very saturated OKLCH green, outside sRGB.
        let origin = Oklch::new(0.7, 0.35, 145.0);
        let (m, changed) = map_oklch_to_srgb(origin);
        assert!(changed);
        assert!(m.in_gamut(0.0));
        let back = srgb_to_oklch(m);
        assert!((back.l - origin.l).abs() < JND, "{back:?}");
        assert!((back.h - origin.h).abs() < 5.0, "{back:?}");
        assert!(back.c < origin.c);
    }
}
