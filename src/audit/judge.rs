//! Judging the measurements into findings: blend (HP101), fade (HP102),
//! glare (HP103), order (HP104), midpoint (HP106), text (HP108) and legend (HP109), each in the view it
//! occurs in, with the measured value, the threshold and, for blend, fade
//! and order, the smallest change that fixes it.
//!
//! Only the numbered classes (`c1`, `c2`, ...) are judged: the no-data
//! class is told apart by its hatch, a continuous ramp and a single colour
//! have no classes to tell apart.

use crate::color::{Lab, Srgb, ciede2000, wcag};
use crate::findings::{Kind, Severity};
use crate::scheme::SchemeKind;

use super::stone2014::noticeable_difference;
use super::{AuditFinding, Measured, Options};

pub use crate::thresholds::Thresholds;

/// Where the two arms of a diverging scheme meet, as indices into the
/// numbered classes in legend order.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Split {
    /// The first class of the upper arm.
    pub upper_start: usize,
    /// Whether the class at `upper_start` is a middle class that belongs
    /// to both arms (the midpoint inside a class) rather than the first
    /// class above a midpoint break.
    pub middle_class: bool,
}

/// The split for a diverging scheme whose numbered classes have the
/// bounds `bounds` (lower, upper; upper-inclusive) around `midpoint`.
pub fn split_at_midpoint(bounds: &[(Option<f64>, Option<f64>)], midpoint: f64) -> Split {
    if let Some(k) = bounds
        .iter()
        .position(|(lo, hi)| lo.is_some_and(|l| l < midpoint) && hi.is_some_and(|h| h > midpoint))
    {
        return Split {
            upper_start: k,
            middle_class: true,
        };
    }
    Split {
        upper_start: bounds
            .iter()
            .filter(|(_, hi)| hi.is_some_and(|h| h <= midpoint))
            .count(),
        middle_class: false,
    }
}

/// The split of `n` classes of lightness `ls` when the spec does not say:
/// at the lightest class (a middle class when it is the centre of an odd
/// count).
fn split_at_lightest(ls: &[f64]) -> Split {
    let n = ls.len();
    let imax = (0..n).max_by(|&a, &b| ls[a].total_cmp(&ls[b])).unwrap_or(0);
    if n % 2 == 1 && imax == n / 2 {
        Split {
            upper_start: imax,
            middle_class: true,
        }
    } else if imax + 1 == n / 2 || imax == n / 2 {
        Split {
            upper_start: n / 2,
            middle_class: false,
        }
    } else {
        Split {
            upper_start: (imax + 1).min(n - 1),
            middle_class: false,
        }
    }
}

/// The CIEDE2000 threshold for telling two marks apart at probability `p`
/// and visual angle `angle_deg`: Stone et al.'s lightness axis `ND_L`.
/// CIEDE2000 weighs lightness differences at mid lightness like CIELAB L*
/// (S_L = 1 at L* = 50), so ND_L serves as a threshold in CIEDE2000 units;
/// using the lightness axis (the smallest of the three) is an
/// interpretation, lenient for differences of hue and chroma alone.
pub fn blend_threshold(p: f64, angle_deg: f64) -> f64 {
    noticeable_difference(p, angle_deg)[0]
}

fn judged(id: &str) -> bool {
    // Numbered classes, and the fills detected in SVG from other tools.
    id.starts_with('#')
        || id
            .strip_prefix('c')
            .is_some_and(|n| n.parse::<u64>().is_ok())
}

fn r2(v: f64) -> f64 {
    (v * 100.0).round() / 100.0
}

/// The L* giving `ratio`:1 WCAG contrast against `bg`, darker when that is
/// possible, else lighter.
fn lightness_for_contrast(bg: Srgb, ratio: f64) -> (f64, &'static str) {
    let yb = wcag::relative_luminance(bg);
    let dark = (yb + 0.05) / ratio - 0.05;
    let (y, dir) = if dark > 0.0 {
        (dark, "darken")
    } else {
        (((yb + 0.05) * ratio - 0.05).min(1.0), "lighten")
    };
    let f = if y > 216.0 / 24389.0 {
        y.cbrt()
    } else {
        (24389.0 / 27.0 * y + 16.0) / 116.0
    };
    (116.0 * f - 16.0, dir)
}

struct Out<'a> {
    m: &'a Measured,
    view: &'a str,
    list: Vec<AuditFinding>,
}

impl Out<'_> {
    #[allow(clippy::too_many_arguments)]
    fn push(
        &mut self,
        kind: Kind,
        severity: Severity,
        classes: &[usize],
        measure: &'static str,
        measured: f64,
        threshold: f64,
        message: String,
        fix: Option<String>,
    ) {
        self.list.push(AuditFinding {
            code: kind.code(),
            kind,
            severity,
            view: self.view.to_string(),
            classes: classes.iter().map(|&k| self.m.ids[k].clone()).collect(),
            measured: r2(measured),
            threshold: r2(threshold),
            measure,
            message,
            fix,
        });
    }
}

/// Judge the measurements.
pub fn judge(m: &Measured, opt: &Options) -> Vec<AuditFinding> {
    let t = &opt.thresholds;
    let classes: Vec<usize> = (0..m.ids.len())
        .filter(|&k| judged(&m.ids[k]) && m.geometry.area[k] > 0 && !opt.muted.contains(&m.ids[k]))
        .collect();
    // The diverging split, from the spec or at the lightest class in the
    // first view.
    let split = match opt.scheme {
        Some(SchemeKind::Diverging) if classes.len() >= 3 => Some(opt.split.unwrap_or_else(|| {
            let ls: Vec<f64> = classes
                .iter()
                .map(|&k| m.colors[0][k].unwrap_or(m.background[0]).to_lab().l)
                .collect();
            split_at_lightest(&ls)
        })),
        _ => None,
    };
    // Positions (in `classes`) on opposite arms of a diverging scheme.
    let opposite = |i: usize, j: usize| match split {
        Some(s) => {
            let side = |x: usize| {
                if s.middle_class && x == s.upper_start {
                    0
                } else if x < s.upper_start {
                    -1
                } else {
                    1
                }
            };
            side(i) * side(j) < 0
        }
        None => false,
    };
    let touching = |a: usize, b: usize| {
        m.geometry
            .contacts
            .iter()
            .any(|((x, y), len)| *len > 0 && *x == a.min(b) && *y == a.max(b))
    };
    let mut all = Vec::new();
    for (vi, v) in opt.views.iter().enumerate() {
        let mut out = Out {
            m,
            view: &v.name,
            list: Vec::new(),
        };
        let colors = &m.colors[vi];
        let bg = m.background[vi];
        let lab = |k: usize| -> Lab { colors[k].unwrap_or(bg).to_lab() };
        let bg_lab = bg.to_lab();
        // Blend.
        let gray = v.view == crate::vision::View::Achromatopsia;
        for (i, &a) in classes.iter().enumerate() {
            for (j, &b) in classes.iter().enumerate().skip(i + 1) {
                // In grayscale only lightness is left: equal-weight
                // categories and the two arms of a diverging scheme are
                // meant to share lightness, so there a blend is a warning
                // to label them (WCAG 2.x SC 1.4.1), not an error.
                let by_design =
                    gray && (opt.scheme == Some(SchemeKind::Qualitative) || opposite(i, j));
                let touch = touching(a, b);
                let p = if touch { t.p_touching } else { t.p_apart };
                let angle = m.angle_deg[a].min(m.angle_deg[b]);
                let thr = blend_threshold(p, angle);
                let de = ciede2000(lab(a), lab(b));
                if de < thr {
                    let (la, lb) = (lab(a).l, lab(b).l);
                    let need = thr - de + 1.0;
                    let (who, dir, to) = if lb >= la && lb + need <= 100.0 {
                        (b, "lighten", lb + need)
                    } else if lb < la && lb - need >= 0.0 {
                        (b, "darken", lb - need)
                    } else if la >= lb {
                        (a, "lighten", (la + need).min(100.0))
                    } else {
                        (a, "darken", (la - need).max(0.0))
                    };
                    out.push(
                        Kind::Blend,
                        if by_design { Severity::Warning } else { Severity::Error },
                        &[a, b],
                        "delta_e2000",
                        de,
                        thr,
                        format!(
                            "{} and {} differ by CIEDE2000 {:.1} under {}; marks of {:.2} degrees that {} need {:.1} (Stone et al. 2014, p = {}){}",
                            m.ids[a],
                            m.ids[b],
                            de,
                            v.name,
                            angle,
                            if touch { "touch on the figure" } else { "meet only through the legend" },
                            thr,
                            p,
                            if by_design {
                                "; in grayscale they can only be told apart by labels or patterns (WCAG 2.x SC 1.4.1)"
                            } else {
                                ""
                            }
                        ),
                        Some(format!(
                            "{dir} {} by about {:.0} L* (to L* {:.0}) so that it stands apart from {} under {}",
                            m.ids[who],
                            need,
                            to,
                            m.ids[if who == a { b } else { a }],
                            v.name
                        )),
                    );
                }
            }
        }
        // Fade.
        for &k in &classes {
            let Some(boundary) = m.boundary[vi][k] else {
                continue;
            };
            let floor = blend_threshold(t.p_apart, m.angle_deg[k]);
            let de = ciede2000(lab(k), bg_lab);
            if de < floor && boundary < t.boundary_contrast {
                let (target, dir) = lightness_for_contrast(bg, t.boundary_contrast);
                out.push(
                    Kind::Fade,
                    Severity::Error,
                    &[k],
                    "contrast_ratio",
                    boundary,
                    t.boundary_contrast,
                    format!(
                        "{} does not separate from the background under {}: its fill is CIEDE2000 {:.1} from it (needs {:.1}) and its boundary as rendered reaches {:.2}:1 (WCAG 2.x SC 1.4.11 asks 3:1)",
                        m.ids[k], v.name, de, floor, boundary
                    ),
                    Some(format!(
                        "{dir} {} to about L* {:.0}, or draw its border in a colour of at least 3:1 against the background",
                        m.ids[k], target
                    )),
                );
            }
        }
        let dl: Vec<f64> = classes
            .iter()
            .map(|&k| (lab(k).l - bg_lab.l).abs())
            .collect();
        // Glare.
        match opt.scheme {
            Some(SchemeKind::Qualitative) if classes.len() >= 3 => {
                for (i, &k) in classes.iter().enumerate() {
                    let others: Vec<f64> = dl
                        .iter()
                        .enumerate()
                        .filter(|(j, _)| *j != i)
                        .map(|(_, v)| *v)
                        .collect();
                    let med = super::measure::median(others);
                    if dl[i] - med > t.glare_lightness {
                        out.push(
                            Kind::Glare,
                            Severity::Warning,
                            &[k],
                            "lightness_excess",
                            dl[i] - med,
                            t.glare_lightness,
                            format!(
                                "{} draws the eye under {}: it differs from the background by {:.0} L*, the other categories by {:.0} (median); categories should carry equal weight",
                                m.ids[k], v.name, dl[i], med
                            ),
                            None,
                        );
                    }
                }
            }
            Some(SchemeKind::Sequential | SchemeKind::Diverging) if classes.len() >= 3 => {
                let ends = dl[0].max(dl[dl.len() - 1]);
                for i in 1..classes.len() - 1 {
                    if dl[i] - ends > t.glare_lightness {
                        out.push(
                            Kind::Glare,
                            Severity::Warning,
                            &[classes[i]],
                            "lightness_excess",
                            dl[i] - ends,
                            t.glare_lightness,
                            format!(
                                "{} draws the eye under {}: a middle class differs from the background by {:.0} L*, more than either end ({:.0})",
                                m.ids[classes[i]], v.name, dl[i], ends
                            ),
                            None,
                        );
                    }
                }
            }
            _ => {}
        }
        // Order.
        let ls: Vec<f64> = classes.iter().map(|&k| lab(k).l).collect();
        let arms: Vec<Vec<usize>> = match opt.scheme {
            Some(SchemeKind::Sequential) if classes.len() >= 2 => {
                vec![(0..classes.len()).collect()]
            }
            Some(SchemeKind::Diverging) if classes.len() >= 3 => {
                let n = classes.len();
                let s = split.unwrap_or(Split {
                    upper_start: n / 2,
                    middle_class: false,
                });
                // Each arm runs from its end toward the middle.
                let lower_end = if s.middle_class {
                    s.upper_start
                } else {
                    s.upper_start.saturating_sub(1)
                };
                vec![
                    (0..=lower_end).collect(),
                    (s.upper_start..n).rev().collect(),
                ]
            }
            _ => Vec::new(),
        };
        for arm in &arms {
            if arm.len() < 2 {
                continue;
            }
            let dir = (ls[arm[arm.len() - 1]] - ls[arm[0]]).signum();
            for w in arm.windows(2) {
                let (i, j) = (w[0], w[1]);
                let step = (ls[j] - ls[i]) * dir;
                let (a, b) = (classes[i], classes[j]);
                let min_step =
                    noticeable_difference(t.p_apart, m.angle_deg[a].min(m.angle_deg[b]))[0];
                if step < 0.0 || step < min_step {
                    let reversal = step < 0.0;
                    let prev = if w[0] == arm[0] {
                        None
                    } else {
                        Some(
                            ls[arm[arm
                                .iter()
                                .position(|&x| x == i)
                                .unwrap_or(0)
                                .saturating_sub(1)]],
                        )
                    };
                    let target = match prev {
                        Some(p) => format!("between L* {:.0} and L* {:.0}", p, ls[j]),
                        None => format!(
                            "{:.0} L* {} than {}",
                            min_step.ceil(),
                            if dir > 0.0 { "lighter" } else { "darker" },
                            m.ids[a]
                        ),
                    };
                    out.push(
                        Kind::Order,
                        if reversal { Severity::Error } else { Severity::Warning },
                        &[a, b],
                        "lightness_step",
                        step,
                        min_step,
                        if reversal {
                            format!(
                                "lightness reverses between {} (L* {:.0}) and {} (L* {:.0}) under {}: the classes no longer read in order",
                                m.ids[a], ls[i], m.ids[b], ls[j], v.name
                            )
                        } else {
                            format!(
                                "the lightness step from {} to {} is {:.1} L* under {}, under the {:.1} needed to notice it (Stone et al. 2014, p = {})",
                                m.ids[a], m.ids[b], step, v.name, min_step, t.p_apart
                            )
                        },
                        {
                            let first = reversal || prev.is_some();
                            let (mover, other) = if first { (a, b) } else { (b, a) };
                            let to = if first {
                                target
                            } else {
                                format!("{:.0} L* further from {}", min_step - step + 1.0, m.ids[a])
                            };
                            Some(format!(
                                "move {} to a lightness {to} (or move {} instead)",
                                m.ids[mover], m.ids[other]
                            ))
                        },
                    );
                }
            }
        }
        // Midpoint.
        if let Some(Split {
            upper_start: mid,
            middle_class: true,
        }) = split.filter(|s| s.upper_start >= 1 && s.upper_start + 1 < classes.len())
        {
            let km = classes[mid];
            let lm = lab(km);
            let chroma = lm.a.hypot(lm.b);
            if chroma > t.midpoint_chroma {
                out.push(
                    Kind::Midpoint,
                    Severity::Warning,
                    &[km],
                    "chroma",
                    chroma,
                    t.midpoint_chroma,
                    format!(
                        "the midpoint class {} is tinted under {} (CIELAB chroma {:.1}); a near-neutral middle reads as neither side",
                        m.ids[km], v.name, chroma
                    ),
                    None,
                );
            }
            let d1 = ciede2000(lm, lab(classes[mid - 1]));
            let d2 = ciede2000(lm, lab(classes[mid + 1]));
            let lean = d1.max(d2) / d1.min(d2).max(1e-6);
            if lean > t.midpoint_lean {
                let near = if d1 < d2 {
                    classes[mid - 1]
                } else {
                    classes[mid + 1]
                };
                out.push(
                    Kind::Midpoint,
                    Severity::Warning,
                    &[km, near],
                    "lean_ratio",
                    lean,
                    t.midpoint_lean,
                    format!(
                        "the midpoint class {} leans toward {} under {} (CIEDE2000 {:.1} against {:.1} to the other arm)",
                        m.ids[km], m.ids[near], v.name, d1.min(d2), d1.max(d2)
                    ),
                    None,
                );
            }
        }
        // The arms reach similar lightness at equal distance from the
        // midpoint (a middle class, or the break between two classes).
        if let Some(sp) = split {
            let n = classes.len();
            let (below, above) = if sp.middle_class {
                (sp.upper_start.checked_sub(1), sp.upper_start + 1)
            } else {
                (sp.upper_start.checked_sub(1), sp.upper_start)
            };
            if let Some(below) = below {
                for k in 0..=below.min(n.saturating_sub(above + 1)) {
                    if above + k >= n {
                        break;
                    }
                    let (a, b) = (classes[below - k], classes[above + k]);
                    let d = (lab(a).l - lab(b).l).abs();
                    if d > t.arm_lightness {
                        out.push(
                            Kind::Midpoint,
                            Severity::Warning,
                            &[a, b],
                            "arm_lightness_difference",
                            d,
                            t.arm_lightness,
                            format!(
                                "the arms are unbalanced under {}: {} and {}, equally far from the midpoint, differ by {:.0} L*",
                                v.name, m.ids[a], m.ids[b], d
                            ),
                            None,
                        );
                    }
                }
            }
        }
        // Legend: each swatch looks like its class's marks (within the
        // difference half the observers notice at the marks' size).
        for &k in &classes {
            let (Some(sw), Some(c)) = (m.swatches[vi][k], colors[k]) else {
                continue;
            };
            let de = ciede2000(sw.to_lab(), c.to_lab());
            let thr = blend_threshold(t.p_apart, m.angle_deg[k]);
            if de > thr {
                out.push(
                    Kind::Legend,
                    Severity::Error,
                    &[k],
                    "delta_e2000",
                    de,
                    thr,
                    format!(
                        "the legend swatch of {} is CIEDE2000 {:.1} from its marks as rendered under {} (noticeable above {:.1}); readers cannot match them",
                        m.ids[k], de, v.name, thr
                    ),
                    None,
                );
            }
        }
        // Text: WCAG 2.x SC 1.4.3, 4.5:1, or 3:1 for large text (at least
        // 18 pt, or 14 pt bold).
        for (j, tx) in m.texts.iter().enumerate() {
            let Some(c) = m.text_contrast.get(vi).and_then(|v| v[j]) else {
                continue;
            };
            let large = tx.size_pt >= 18.0 || (tx.bold && tx.size_pt >= 14.0);
            let need = if large {
                t.large_text_contrast
            } else {
                t.text_contrast
            };
            if c < need {
                out.push(
                    Kind::Text,
                    Severity::Error,
                    &[],
                    "contrast_ratio",
                    c,
                    need,
                    format!(
                        "text \"{}\" ({} pt{}) reaches {:.2}:1 against what is behind it under {}; WCAG 2.x SC 1.4.3 asks {}:1",
                        tx.content.trim(),
                        r2(tx.size_pt),
                        if tx.bold { " bold" } else { "" },
                        c,
                        v.name,
                        need
                    ),
                    None,
                );
            }
        }
        out.list.sort_by(|x, y| x.code.cmp(y.code));
        all.extend(out.list);
    }
    all
}
