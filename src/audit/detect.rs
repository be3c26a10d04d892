//! Class detection for SVG made by other tools, which carries no
//! `data-class` attributes: the classes are the distinct solid fills of its
//! shapes (colour and opacity) whose rendered area reaches a minimum; the
//! rest of the fills count as "other" (neither class nor background).
//! Strokes are borders and text is text, as for hueproof's own figures.
//!
//! Such a figure does not say which class comes first, so the order is
//! reconstructed from the colours as seen with normal vision:
//! - sequential (and unknown) schemes: from the lightest class to the
//!   darkest, so the order finding (HP104) asks whether the order normal
//!   vision sees survives in every other view;
//! - diverging schemes: the classes are split into two arms by hue (around
//!   the two most different hues), a class of clearly lowest chroma is
//!   taken as the middle, and each arm runs from dark to light toward it;
//! - qualitative schemes: from the lightest to the darkest (the order does
//!   not matter to any judgement).

use crate::color::{Lab, Srgb};
use crate::scheme::SchemeKind;

use super::labels::{self, LabelSvg, Labels};

/// The id of a detected class: its fill as `#rrggbb`, followed by `@N%`
/// when it is drawn with an opacity below 1.
pub fn fill_id(rgb: [u8; 3], alpha: u8) -> String {
    let hex = format!("#{:02x}{:02x}{:02x}", rgb[0], rgb[1], rgb[2]);
    if alpha == 255 {
        hex
    } else {
        format!("{hex}@{:.0}%", alpha as f64 / 2.55)
    }
}

/// The colour a fill of `alpha` (0-255) shows over `bg`, blended in sRGB
/// values as renderers composite.
fn over(fill: Srgb, alpha: u8, bg: Srgb) -> Srgb {
    let a = alpha as f64 / 255.0;
    Srgb::new(
        a * fill.r + (1.0 - a) * bg.r,
        a * fill.g + (1.0 - a) * bg.g,
        a * fill.b + (1.0 - a) * bg.b,
    )
}

/// The order of classes with colours `labs` for `scheme`, as indices.
pub fn order(labs: &[Lab], scheme: Option<SchemeKind>) -> Vec<usize> {
    let n = labs.len();
    let mut by_lightness: Vec<usize> = (0..n).collect();
    by_lightness.sort_by(|&a, &b| labs[b].l.total_cmp(&labs[a].l).then(a.cmp(&b)));
    if scheme != Some(SchemeKind::Diverging) || n < 3 {
        return by_lightness;
    }
    let chroma = |k: usize| labs[k].a.hypot(labs[k].b);
    // A middle class: the lowest chroma, clearly below the others' median.
    let mut by_chroma: Vec<usize> = (0..n).collect();
    by_chroma.sort_by(|&a, &b| chroma(a).total_cmp(&chroma(b)).then(a.cmp(&b)));
    let others: Vec<f64> = by_chroma[1..].iter().map(|&k| chroma(k)).collect();
    let median = others[others.len() / 2];
    let middle = (chroma(by_chroma[0]) < 0.5 * median).then_some(by_chroma[0]);
    // The arms: seeds at the two most different hue directions.
    let arms: Vec<usize> = (0..n).filter(|&k| Some(k) != middle).collect();
    let dir = |k: usize| {
        let c = chroma(k).max(1e-9);
        (labs[k].a / c, labs[k].b / c)
    };
    let mut seeds = (arms[0], arms[arms.len() - 1]);
    let mut best = f64::INFINITY;
    for (i, &p) in arms.iter().enumerate() {
        for &q in &arms[i + 1..] {
            let (dp, dq) = (dir(p), dir(q));
            let cos = dp.0 * dq.0 + dp.1 * dq.1;
            if cos < best {
                best = cos;
                seeds = (p, q);
            }
        }
    }
    let (sa, sb) = (dir(seeds.0), dir(seeds.1));
    let (mut low, mut high): (Vec<usize>, Vec<usize>) = arms.iter().partition(|&&k| {
        let d = dir(k);
        d.0 * sa.0 + d.1 * sa.1 >= d.0 * sb.0 + d.1 * sb.1
    });
    // The arm of the smaller seed hue angle first, for a stable order.
    let angle = |k: usize| labs[k].b.atan2(labs[k].a);
    if angle(seeds.0) > angle(seeds.1) {
        std::mem::swap(&mut low, &mut high);
    }
    low.sort_by(|&a, &b| labs[a].l.total_cmp(&labs[b].l).then(a.cmp(&b)));
    high.sort_by(|&a, &b| labs[b].l.total_cmp(&labs[a].l).then(a.cmp(&b)));
    low.into_iter().chain(middle).chain(high).collect()
}

/// Settle the provisional classes of a label raster made in detection
/// mode: drop the fills of less than `min_area_px` rendered pixels (they
/// become "other"), order the rest with [`order`] and relabel the raster
/// to match. Does nothing for SVG with `data-class` marks.
pub fn settle_detected(
    label: &mut LabelSvg,
    raster: &mut Labels,
    min_area_px: usize,
    scheme: Option<SchemeKind>,
) {
    let Some(alphas) = label.detected.clone() else {
        return;
    };
    let n = label.classes.ids.len();
    let mut area = vec![0usize; n];
    for &l in &raster.ids {
        if let labels::Part::Fill(k) = labels::part(l) {
            if k < n {
                area[k] += 1;
            }
        }
    }
    let bg = label.classes.background.unwrap_or(Srgb::new(1.0, 1.0, 1.0));
    let kept: Vec<usize> = (0..n).filter(|&k| area[k] >= min_area_px).collect();
    let labs: Vec<Lab> = kept
        .iter()
        .map(|&k| {
            let fill = label.classes.fills[k].unwrap_or(bg);
            over(fill, alphas[k], bg).to_lab()
        })
        .collect();
    let ordered: Vec<usize> = order(&labs, scheme).into_iter().map(|i| kept[i]).collect();
    let mut new_of = vec![None; n];
    for (new, &old) in ordered.iter().enumerate() {
        new_of[old] = Some(new);
    }
    for l in raster.ids.iter_mut() {
        if let labels::Part::Fill(k) = labels::part(*l) {
            *l = match new_of.get(k).copied().flatten() {
                Some(new) => labels::fill_label(new),
                None => labels::OTHER,
            };
        }
    }
    label.classes.ids = ordered
        .iter()
        .map(|&k| label.classes.ids[k].clone())
        .collect();
    label.classes.fills = ordered.iter().map(|&k| label.classes.fills[k]).collect();
    label.detected = Some(ordered.iter().map(|&k| alphas[k]).collect());
}

#[cfg(test)]
mod tests {
    use super::*;

    fn lab(l: f64, a: f64, b: f64) -> Lab {
        Lab { l, a, b }
    }

    #[test]
    fn sequential_order_runs_from_light_to_dark() {
        let labs = [
            lab(40.0, 0.0, 0.0),
            lab(90.0, 0.0, 0.0),
            lab(65.0, 0.0, 0.0),
        ];
        assert_eq!(order(&labs, Some(SchemeKind::Sequential)), [1, 2, 0]);
    }

    #[test]
    fn diverging_order_puts_the_neutral_class_between_the_arms() {
        // Two arms (blue-ish, negative b*; orange-ish, positive b*) and a
        // near-gray middle, given shuffled.
        let labs = [
            lab(70.0, 10.0, 40.0),
            lab(95.0, 0.5, 1.0),
            lab(45.0, 5.0, -45.0),
            lab(40.0, 25.0, 55.0),
            lab(75.0, 0.0, -25.0),
        ];
        let o = order(&labs, Some(SchemeKind::Diverging));
        // Each arm runs dark to light toward the middle, then light to dark.
        assert!(o == [2, 4, 1, 0, 3] || o == [3, 0, 1, 4, 2], "{o:?}");
    }
}
