//! Diagnosing a palette on its own: the findings of [`crate::findings`]
//! that can be judged without a figure (no mark sizes, no adjacency).
//!
//! - blend (HP101): two classes closer than the CIEDE2000 floor in a view.
//!   In a luminance-only view a qualitative scheme is expected to blend
//!   (its hues share one lightness band), and so are the two arms of a
//!   diverging scheme at equal distance from the midpoint; those are notes:
//!   such a figure needs labels or patterns for grayscale print.
//! - fade (HP102): a class closer than the floor to the background.
//! - glare (HP103): a qualitative class whose L* is far from the others'.
//! - order (HP104): lightness not monotonic in class order (ordered
//!   schemes; for diverging, monotonic towards the midpoint and away from
//!   it: a light midpoint is the lightest class, a dark one the darkest).
//! - steps (HP105): neighbouring steps (CIEDE2000, normal view) uneven.
//! - midpoint (HP106): a diverging midpoint with chroma, or arms whose
//!   lightness differs at equal distance from the midpoint.
//! - crowd (HP107): more classes than common practice keeps apart.

use crate::color::{Lab, ciede2000};
use crate::findings::{Finding, Kind, Severity};

use super::{SchemeKind, SeenPalette, Thresholds};

/// Common-practice upper limits on class counts.
fn crowd_limit(kind: SchemeKind) -> usize {
    match kind {
        SchemeKind::Sequential => 7,
        SchemeKind::Diverging => 9,
        SchemeKind::Qualitative => 8,
    }
}

/// The index of the normal view, or the first view.
fn reference_view(seen: &SeenPalette) -> usize {
    seen.views.iter().position(|v| v == "normal").unwrap_or(0)
}

/// All findings for a palette.
pub fn check(kind: SchemeKind, seen: &SeenPalette, t: &Thresholds) -> Vec<Finding> {
    let mut out = Vec::new();
    blends(kind, seen, t, &mut out);
    fades(seen, t, &mut out);
    if kind.is_ordered() {
        order(kind, seen, &mut out);
        steps(kind, seen, t, &mut out);
    }
    if kind == SchemeKind::Diverging {
        midpoint(seen, t, &mut out);
    }
    if kind == SchemeKind::Qualitative {
        glare(seen, t, &mut out);
    }
    let n = seen.colors.first().map_or(0, Vec::len);
    if n > crowd_limit(kind) {
        out.push(Finding::new(
            Kind::Crowd,
            Severity::Warning,
            (0..n).collect(),
            Vec::new(),
            "classes",
            n as f64,
            crowd_limit(kind) as f64,
            format!(
                "{n} classes is more than a {} scheme keeps apart in common practice ({}); consider fewer classes, direct labels, or small multiples",
                kind.name(),
                crowd_limit(kind)
            ),
        ));
    }
    out
}

fn blends(kind: SchemeKind, seen: &SeenPalette, t: &Thresholds, out: &mut Vec<Finding>) {
    let n = seen.colors.first().map_or(0, Vec::len);
    // Pairs expected to merge in grayscale, reported together as one note.
    let mut gray_pairs: Vec<(usize, usize)> = Vec::new();
    let mut gray_views: Vec<String> = Vec::new();
    let mut gray_worst = f64::INFINITY;
    for i in 0..n {
        for j in i + 1..n {
            let mut views = Vec::new();
            let mut gray_only = true;
            let mut worst = f64::INFINITY;
            for (v, labs) in seen.colors.iter().enumerate() {
                let d = ciede2000(labs[i], labs[j]);
                if d < t.min_delta_e {
                    views.push(seen.views[v].clone());
                    gray_only &= seen.grayscale[v];
                    worst = worst.min(d);
                }
            }
            if views.is_empty() {
                continue;
            }
            // Opposite arms of a diverging scheme share their lightness by
            // design, so like qualitative hues they merge in grayscale.
            let opposite_arms = kind == SchemeKind::Diverging && 2 * i + 1 < n && 2 * j + 1 > n;
            if gray_only && (kind == SchemeKind::Qualitative || opposite_arms) {
                gray_pairs.push((i, j));
                gray_worst = gray_worst.min(worst);
                for v in views {
                    if !gray_views.contains(&v) {
                        gray_views.push(v);
                    }
                }
                continue;
            }
            out.push(Finding::new(
                Kind::Blend,
                Severity::Error,
                vec![i, j],
                views.clone(),
                "delta_e2000",
                worst,
                t.min_delta_e,
                format!(
                    "classes {} and {} are not reliably told apart in {} (ΔE00 {worst:.2} < {:.2})",
                    i + 1,
                    j + 1,
                    views.join(", "),
                    t.min_delta_e
                ),
            ));
        }
    }
    if !gray_pairs.is_empty() {
        let mut classes: Vec<usize> = gray_pairs.iter().flat_map(|&(a, b)| [a, b]).collect();
        classes.sort_unstable();
        classes.dedup();
        let pairs: Vec<String> = gray_pairs
            .iter()
            .map(|(a, b)| format!("{}-{}", a + 1, b + 1))
            .collect();
        out.push(Finding::new(
            Kind::Blend,
            Severity::Note,
            classes,
            gray_views.clone(),
            "delta_e2000",
            gray_worst,
            t.min_delta_e,
            format!(
                "{} pairs of classes share a lightness by design and merge in {} (pairs {}; smallest ΔE00 {gray_worst:.2}); label the classes or add patterns for grayscale print",
                gray_pairs.len(),
                gray_views.join(", "),
                pairs.join(", ")
            ),
        ));
    }
}

fn fades(seen: &SeenPalette, t: &Thresholds, out: &mut Vec<Finding>) {
    let n = seen.colors.first().map_or(0, Vec::len);
    for i in 0..n {
        let mut views = Vec::new();
        let mut worst = f64::INFINITY;
        for (v, labs) in seen.colors.iter().enumerate() {
            let d = ciede2000(labs[i], seen.background[v]);
            if d < t.min_delta_e {
                views.push(seen.views[v].clone());
                worst = worst.min(d);
            }
        }
        if !views.is_empty() {
            out.push(Finding::new(
                Kind::Fade,
                Severity::Warning,
                vec![i],
                views.clone(),
                "delta_e2000",
                worst,
                t.min_delta_e,
                format!(
                    "class {} is close to the background in {} (ΔE00 {worst:.2} < {:.2}); it needs a border that reaches 3:1 against the background",
                    i + 1,
                    views.join(", "),
                    t.min_delta_e
                ),
            ));
        }
    }
}

/// Expected sign of L*(i+1) - L*(i) for each step: +1 or -1.
fn expected_directions(kind: SchemeKind, labs: &[Lab]) -> Vec<f64> {
    let n = labs.len();
    if n < 2 {
        return Vec::new();
    }
    match kind {
        // Towards the midpoint (class (n-1)/2, or between the two middle
        // classes when n is even) and away after it. A light midpoint
        // (lighter than the ends) rises then falls; a dark one, as on a
        // dark background, falls then rises.
        SchemeKind::Diverging => {
            let mid = labs[n / 2].l.max(labs[(n - 1) / 2].l);
            let light_mid = if mid >= labs[0].l.min(labs[n - 1].l) {
                1.0
            } else {
                -1.0
            };
            (0..n - 1)
                .map(|i| {
                    if (i as f64) < (n as f64 - 1.0) / 2.0 - 1e-9 {
                        light_mid
                    } else {
                        -light_mid
                    }
                })
                .collect()
        }
        _ => {
            let s = if labs[n - 1].l >= labs[0].l {
                1.0
            } else {
                -1.0
            };
            vec![s; n - 1]
        }
    }
}

fn order(kind: SchemeKind, seen: &SeenPalette, out: &mut Vec<Finding>) {
    let r = reference_view(seen);
    let dirs = expected_directions(kind, &seen.colors[r]);
    let mut views = Vec::new();
    let mut classes = Vec::new();
    let mut worst = f64::INFINITY;
    for (v, labs) in seen.colors.iter().enumerate() {
        let mut bad = false;
        for (i, d) in dirs.iter().enumerate() {
            // Step in the expected direction; for an even diverging scheme
            // the middle step joins the two arms and has no order.
            if kind == SchemeKind::Diverging && labs.len() % 2 == 0 && i == labs.len() / 2 - 1 {
                continue;
            }
            let step = (labs[i + 1].l - labs[i].l) * d;
            if step <= 0.0 {
                bad = true;
                worst = worst.min(step);
                for c in [i, i + 1] {
                    if !classes.contains(&c) {
                        classes.push(c);
                    }
                }
            }
        }
        if bad {
            views.push(seen.views[v].clone());
        }
    }
    if !views.is_empty() {
        classes.sort_unstable();
        out.push(Finding::new(
            Kind::Order,
            Severity::Error,
            classes,
            views.clone(),
            "lightness_step",
            worst,
            0.0,
            format!(
                "lightness does not follow the class order in {}; readers of ordered data rely on it",
                views.join(", ")
            ),
        ));
    }
}

fn steps(kind: SchemeKind, seen: &SeenPalette, t: &Thresholds, out: &mut Vec<Finding>) {
    let labs = &seen.colors[reference_view(seen)];
    let n = labs.len();
    if n < 3 {
        return;
    }
    let mut ds: Vec<(usize, f64)> = (0..n - 1)
        .map(|i| (i, ciede2000(labs[i], labs[i + 1])))
        .collect();
    if kind == SchemeKind::Diverging && n % 2 == 0 {
        // The step across the midpoint joins two hues; judge arms only.
        ds.retain(|(i, _)| *i != n / 2 - 1);
    }
    let mean = ds.iter().map(|d| d.1).sum::<f64>() / ds.len() as f64;
    let (worst_i, worst) = ds
        .iter()
        .map(|&(i, d)| (i, (d - mean).abs() / mean))
        .max_by(|a, b| a.1.total_cmp(&b.1))
        .expect("at least two steps");
    if worst > t.step_spread {
        out.push(Finding::new(
            Kind::Steps,
            Severity::Warning,
            vec![worst_i, worst_i + 1],
            vec![seen.views[reference_view(seen)].clone()],
            "relative_step_deviation",
            worst,
            t.step_spread,
            format!(
                "the step between classes {} and {} differs from the mean step ({mean:.2} ΔE00) by {:.0}%; uneven steps exaggerate some class boundaries",
                worst_i + 1,
                worst_i + 2,
                worst * 100.0
            ),
        ));
    }
}

fn midpoint(seen: &SeenPalette, t: &Thresholds, out: &mut Vec<Finding>) {
    let r = reference_view(seen);
    let labs = &seen.colors[r];
    let n = labs.len();
    if n < 2 {
        return;
    }
    if n % 2 == 1 {
        let m = n / 2;
        let chroma = labs[m].a.hypot(labs[m].b);
        if chroma > t.midpoint_chroma {
            out.push(Finding::new(
                Kind::Midpoint,
                Severity::Warning,
                vec![m],
                vec![seen.views[r].clone()],
                "chroma",
                chroma,
                t.midpoint_chroma,
                format!(
                    "the midpoint class {} has chroma {chroma:.1} (C*ab); a diverging midpoint should be neutral",
                    m + 1
                ),
            ));
        }
    }
    let (mut worst, mut pair) = (0.0f64, (0, 0));
    for k in 0..n / 2 {
        let (lo, hi) = (k, n - 1 - k);
        let d = (labs[lo].l - labs[hi].l).abs();
        if d > worst {
            worst = d;
            pair = (lo, hi);
        }
    }
    if worst > t.arm_balance {
        out.push(Finding::new(
            Kind::Midpoint,
            Severity::Warning,
            vec![pair.0, pair.1],
            vec![seen.views[r].clone()],
            "lightness_difference",
            worst,
            t.arm_balance,
            format!(
                "classes {} and {} sit at equal distance from the midpoint but differ by {worst:.1} in L*; one arm will look more important",
                pair.0 + 1,
                pair.1 + 1
            ),
        ));
    }
}

fn glare(seen: &SeenPalette, t: &Thresholds, out: &mut Vec<Finding>) {
    let r = reference_view(seen);
    let labs = &seen.colors[r];
    if labs.len() < 2 {
        return;
    }
    let mut ls: Vec<f64> = labs.iter().map(|c| c.l).collect();
    ls.sort_by(f64::total_cmp);
    let median = if ls.len() % 2 == 1 {
        ls[ls.len() / 2]
    } else {
        (ls[ls.len() / 2 - 1] + ls[ls.len() / 2]) / 2.0
    };
    for (i, c) in labs.iter().enumerate() {
        let d = (c.l - median).abs();
        if d > t.glare_lightness {
            out.push(Finding::new(
                Kind::Glare,
                Severity::Warning,
                vec![i],
                vec![seen.views[r].clone()],
                "lightness_from_median",
                d,
                t.glare_lightness,
                format!(
                    "class {} is {d:.1} L* {} than the others; in a qualitative scheme it draws the eye by lightness alone",
                    i + 1,
                    if c.l > median { "lighter" } else { "darker" }
                ),
            ));
        }
    }
}
