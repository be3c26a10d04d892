//! A repaired palette for a figure whose audit fails on its colours: the
//! class colours go through the palette repair ([`crate::scheme::repair`],
//! the nearest palette that passes `palette check`, keeping hue families
//! and order), the figure is drawn again with them and audited again on
//! its pixels. Small marks need larger differences than the palette check's
//! floor, so when the redrawn figure still fails, the floor is raised to
//! the largest blend threshold the audit used and the repair runs again,
//! a few rounds at most. The proposal says whether the redrawn figure
//! passes.

use serde::Serialize;

use crate::color::{Srgb, ciede2000};
use crate::error::Result;
use crate::findings::Kind;
use crate::render::{self, Rendered};
use crate::scheme::{self, Context, SchemeKind};
use crate::svg;

use super::{Options, Report, audit_svg};

/// One class's change.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ClassChange {
    /// The class id (`c1`, ...).
    pub class: String,
    /// Its colour before.
    pub from: String,
    /// Its colour after.
    pub to: String,
    /// CIEDE2000 between the two (normal vision).
    pub delta_e2000: f64,
}

/// A repaired palette for the figure.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Proposal {
    /// `repair` (the nearest palette that passes) or `regenerated` (made
    /// afresh by the scheme's generator with the figure's hues, when no
    /// nearby palette made the figure pass).
    pub method: &'static str,
    /// One colour per class, in legend order (`colors.list` of the spec).
    pub colors: Vec<String>,
    /// The classes that changed.
    pub changes: Vec<ClassChange>,
    /// Whether the figure drawn with these colours passes the audit.
    pub audit_passed: bool,
    /// Findings of that audit at or above the fail level, as codes with
    /// their view (e.g. `HP101 protanopia`), when it does not pass.
    pub remaining: Vec<String>,
}

/// The most repair rounds.
const ROUNDS: usize = 4;

fn colour_finding(k: Kind) -> bool {
    matches!(
        k,
        Kind::Blend | Kind::Fade | Kind::Glare | Kind::Order | Kind::Midpoint | Kind::Steps
    )
}

fn failing<'a>(
    report: &'a Report,
    opt: &Options,
) -> impl Iterator<Item = &'a super::AuditFinding> + 'a {
    let level = opt.fail_on;
    report
        .findings
        .iter()
        .filter(move |f| f.severity >= level && colour_finding(f.kind))
}

/// Why no palette can be proposed for `r`, if that is so.
fn not_repairable(r: &Rendered) -> Option<&'static str> {
    let classes = &r.encoding.classes;
    if classes.iter().any(|c| c.faded) {
        return Some("classes are faded by marks.emphasis");
    }
    if !matches!(
        r.encoding.scale,
        crate::encode::Scale::Classed | crate::encode::Scale::Categories
    ) {
        return Some("the figure has no colour classes (a continuous ramp or one colour)");
    }
    None
}

/// Propose a palette for `r`, whose audit `report` was made with `opt`.
/// `Ok(None)` when no colour finding reaches the fail level, or when the
/// figure's colours cannot be repaired as a palette (see the text report).
pub fn propose(r: &Rendered, report: &Report, opt: &Options) -> Result<Option<Proposal>> {
    if failing(report, opt).next().is_none() || not_repairable(r).is_some() {
        return Ok(None);
    }
    let numbered: Vec<&crate::encode::Class> = r
        .encoding
        .classes
        .iter()
        .filter(|c| c.id.starts_with('c') && c.id[1..].parse::<u32>().is_ok())
        .collect();
    if numbered.len() < 2 {
        return Ok(None);
    }
    let original: Vec<Srgb> = numbered.iter().map(|c| c.base_color).collect();
    let ids: Vec<String> = numbered.iter().map(|c| c.id.clone()).collect();
    let kind = r.figure.colors.scheme;
    let try_colors = |colors: Vec<Srgb>, method: &'static str| -> Result<Proposal> {
        let mut fig = r.figure.clone();
        fig.colors.list = Some(colors.clone());
        let redrawn = render::render(fig)?;
        let again = audit_svg(&r.figure.spec_path, &redrawn.svg, opt)?;
        let changes = colors
            .iter()
            .zip(&original)
            .zip(&ids)
            .filter(|((a, b), _)| a.to_rgb8() != b.to_rgb8())
            .map(|((a, b), id)| ClassChange {
                class: id.clone(),
                from: svg::hex(*b),
                to: svg::hex(*a),
                delta_e2000: (ciede2000(b.to_lab(), a.to_lab()) * 100.0).round() / 100.0,
            })
            .collect();
        Ok(Proposal {
            method,
            colors: colors.iter().map(|&c| svg::hex(c)).collect(),
            changes,
            audit_passed: again.passed,
            remaining: failing(&again, opt)
                .map(|f| format!("{} {}", f.code, f.view))
                .collect(),
        })
    };
    let mut best: Option<Proposal> = None;
    let mut keep = |p: Proposal| {
        let better = match &best {
            None => true,
            Some(b) => !b.audit_passed && (p.audit_passed || p.remaining.len() < b.remaining.len()),
        };
        if better {
            best = Some(p);
        }
        best.as_ref().is_some_and(|b| b.audit_passed)
    };
    // The nearest palette, with the floor raised round by round.
    let top = blend_floor(report, opt);
    let mut floor = top;
    for _ in 0..ROUNDS {
        let out = scheme::repair::repair(kind, &original, &context(r, opt, floor));
        if keep(try_colors(out.colors, "repair")?) {
            return Ok(best);
        }
        floor += 2.0;
    }
    // Else a palette generated afresh for the figure, keeping the hues,
    // with the highest floor (from the audit's blend threshold down to the
    // palette default) at which the generator still meets every check.
    let mut floor = top;
    let generated = loop {
        let ctx = context(r, opt, floor);
        let colors = regenerate(kind, &original, &ctx);
        let clean = scheme::check::check(kind, &ctx.see(&colors), &ctx.thresholds)
            .iter()
            .all(|f| f.severity < crate::findings::Severity::Error);
        if clean || floor <= scheme::Thresholds::default().min_delta_e {
            break colors;
        }
        floor = (floor - 0.5).max(scheme::Thresholds::default().min_delta_e);
    };
    keep(try_colors(generated, "regenerated")?);
    Ok(best)
}

/// The palette floor the audit asks for: its largest failing blend
/// threshold, at least the palette check's default.
fn blend_floor(report: &Report, opt: &Options) -> f64 {
    failing(report, opt)
        .filter(|f| f.kind == Kind::Blend)
        .map(|f| f.threshold)
        .fold(scheme::Thresholds::default().min_delta_e, f64::max)
}

fn context(r: &Rendered, opt: &Options, floor: f64) -> Context {
    Context {
        background: r.figure.page.background,
        views: opt.views.clone(),
        model: opt.model,
        thresholds: scheme::Thresholds {
            min_delta_e: floor,
            ..scheme::Thresholds::default()
        },
    }
}

fn hue(c: Srgb) -> f64 {
    c.to_oklab().to_oklch().h
}

/// A palette of `original.len()` classes made by the generator of `kind`,
/// following the original's hues: the darkest class's hue (sequential),
/// the two end classes' hues (diverging), each class's hue as a hint
/// (qualitative).
fn regenerate(kind: SchemeKind, original: &[Srgb], ctx: &Context) -> Vec<Srgb> {
    let n = original.len();
    match kind {
        SchemeKind::Sequential => {
            let darkest = original
                .iter()
                .copied()
                .min_by(|a, b| a.to_lab().l.total_cmp(&b.to_lab().l))
                .expect("at least two classes");
            scheme::sequential::generate(
                &scheme::sequential::Options {
                    classes: n,
                    hues: vec![hue(darkest)],
                    ..Default::default()
                },
                ctx,
            )
        }
        SchemeKind::Diverging => scheme::diverging::generate(
            &scheme::diverging::Options {
                classes: n,
                hues: Some((hue(original[0]), hue(original[n - 1]))),
                ..Default::default()
            },
            ctx,
        ),
        SchemeKind::Qualitative => {
            scheme::qualitative::generate(
                &scheme::qualitative::Options {
                    classes: n,
                    hue_hints: original.iter().map(|&c| hue(c)).enumerate().collect(),
                    ..Default::default()
                },
                ctx,
            )
            .colors
        }
    }
}

/// The proposal as text for the report, or why there is none.
pub fn describe(r: &Rendered, report: &Report, opt: &Options, p: Option<&Proposal>) -> String {
    use std::fmt::Write as _;
    let mut s = String::new();
    match p {
        Some(p) => {
            let _ = writeln!(
                s,
                "\nA {} palette ({}):",
                if p.method == "repair" {
                    "repaired"
                } else {
                    "regenerated"
                },
                if p.audit_passed {
                    "the figure drawn with it passes the audit"
                } else {
                    "the figure drawn with it still fails; see below"
                }
            );
            for c in &p.changes {
                let _ = writeln!(
                    s,
                    "  {} {} -> {} (CIEDE2000 {:.1})",
                    c.class, c.from, c.to, c.delta_e2000
                );
            }
            let quoted: Vec<String> = p.colors.iter().map(|c| format!("\"{c}\"")).collect();
            let _ = writeln!(s, "  [colors]\n  list = [{}]", quoted.join(", "));
            if !p.remaining.is_empty() {
                let _ = writeln!(s, "  still failing: {}", p.remaining.join(", "));
            }
            let _ = writeln!(
                s,
                "  (hueproof render SPEC --repair draws the figure with it; the spec is not changed)"
            );
        }
        None => {
            if failing(report, opt).next().is_some() {
                if let Some(why) = not_repairable(r) {
                    let _ = writeln!(s, "\nNo repaired palette: {why}.");
                }
            } else if report
                .findings
                .iter()
                .any(|f| f.severity >= opt.fail_on && f.kind == Kind::Text)
            {
                let _ = writeln!(
                    s,
                    "\nText findings are fixed by the text colour (text.color) or the background, not the palette."
                );
            }
        }
    }
    s
}
