//! Repairing a palette: the nearest palette (smallest total CIEDE2000
//! change) that passes every check, keeping each class's hue family and,
//! for ordered schemes, the class order.
//!
//! Each class is described in OKLCH. Ordered schemes keep every hue
//! exactly and move lightness and chroma; qualitative schemes may also turn
//! the hue by up to 20 degrees. A neutral class (OKLCH chroma under 0.02)
//! stays near neutral (chroma at most 0.03), and a coloured class stays
//! coloured (chroma at least 0.02), so it keeps its hue family. A pattern
//! search (coordinate steps that halve when nothing improves) minimises
//! the total change plus a heavy penalty for every remaining finding,
//! measured by how far each finding's value is past its threshold. The
//! findings come from [`super::check`], the same judge `palette check`
//! uses, so a repaired palette passes it exactly when the penalty reaches
//! zero.

use serde::Serialize;

use crate::color::gamut::map_oklch_to_srgb;
use crate::color::{Oklch, Srgb, ciede2000};
use crate::findings::{Finding, Severity};

use super::{Context, SchemeKind, check, to_8bit};

/// How one class changed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Change {
    /// Class index (0-based).
    pub class: usize,
    /// The colour before.
    pub from: String,
    /// The colour after.
    pub to: String,
    /// CIEDE2000 between the two (normal vision).
    pub delta_e2000: f64,
}

/// The outcome of a repair.
#[derive(Debug, Clone, PartialEq)]
pub struct Outcome {
    /// The repaired colours.
    pub colors: Vec<Srgb>,
    /// Per class, what changed (classes left alone are omitted).
    pub changes: Vec<Change>,
    /// Findings that remain (empty when the repair fully succeeded).
    pub remaining: Vec<Finding>,
}

const HUE_FREEDOM: f64 = 20.0;
/// A class whose OKLCH chroma is below this is neutral; it stays neutral.
const NEUTRAL: f64 = 0.02;
/// The most chroma a neutral class may gain.
const NEUTRAL_FREEDOM: f64 = 0.03;

fn penalty(findings: &[Finding]) -> f64 {
    findings
        .iter()
        .filter(|f| f.severity >= Severity::Warning)
        .map(|f| (f.measured - f.threshold).abs() + 1.0)
        .sum()
}

fn build(vars: &[[f64; 3]]) -> Vec<Srgb> {
    vars.iter()
        .map(|v| {
            to_8bit(map_oklch_to_srgb(Oklch::new(v[0].clamp(0.0, 1.0), v[1].max(0.0), v[2])).0)
        })
        .collect()
}

/// Repair `colors` for `kind`.
pub fn repair(kind: SchemeKind, colors: &[Srgb], ctx: &Context) -> Outcome {
    let start: Vec<[f64; 3]> = colors
        .iter()
        .map(|c| {
            let o = c.to_oklab().to_oklch();
            [o.l, o.c, o.h]
        })
        .collect();
    let original_labs: Vec<_> = colors.iter().map(|c| c.to_lab()).collect();
    let cost = |vars: &[[f64; 3]]| {
        let built = build(vars);
        let change: f64 = built
            .iter()
            .zip(&original_labs)
            .map(|(c, o)| ciede2000(*o, c.to_lab()))
            .sum();
        let findings = check::check(kind, &ctx.see(&built), &ctx.thresholds);
        (change + 1000.0 * penalty(&findings), findings)
    };
    let mut vars = start.clone();
    let (mut best, mut findings) = cost(&vars);
    if penalty(&findings) == 0.0 {
        return finish(colors, vars, findings);
    }
    let dims: &[usize] = if kind == SchemeKind::Qualitative {
        &[0, 1, 2]
    } else {
        &[0, 1]
    };
    let mut steps = [0.04, 0.03, 8.0];
    for _ in 0..400 {
        let mut improved = false;
        for i in 0..vars.len() {
            for &d in dims {
                for sign in [1.0, -1.0] {
                    let mut trial = vars.clone();
                    trial[i][d] += sign * steps[d];
                    if d == 2 && (trial[i][2] - start[i][2]).abs() > HUE_FREEDOM {
                        continue;
                    }
                    if d == 1 && start[i][1] < NEUTRAL && trial[i][1] > NEUTRAL_FREEDOM {
                        continue;
                    }
                    // A coloured class keeps enough chroma to keep its hue
                    // family: it may not turn neutral.
                    if d == 1 && start[i][1] >= NEUTRAL && trial[i][1] < NEUTRAL {
                        continue;
                    }
                    let (c, f) = cost(&trial);
                    if c < best - 1e-9 {
                        best = c;
                        vars = trial;
                        findings = f;
                        improved = true;
                    }
                }
            }
        }
        if !improved {
            for s in steps.iter_mut() {
                *s /= 2.0;
            }
            if steps[0] < 0.0005 {
                break;
            }
        }
    }
    finish(colors, vars, findings)
}

fn finish(colors: &[Srgb], vars: Vec<[f64; 3]>, findings: Vec<Finding>) -> Outcome {
    let built = build(&vars);
    let built: Vec<Srgb> = built
        .into_iter()
        .zip(colors)
        .map(|(b, o)| if b.to_rgb8() == o.to_rgb8() { *o } else { b })
        .collect();
    let changes = colors
        .iter()
        .zip(&built)
        .enumerate()
        .filter(|(_, (a, b))| a.to_rgb8() != b.to_rgb8())
        .map(|(i, (a, b))| Change {
            class: i,
            from: a.to_hex(),
            to: b.to_hex(),
            delta_e2000: ciede2000(a.to_lab(), b.to_lab()),
        })
        .collect();
    Outcome {
        colors: built,
        changes,
        remaining: findings
            .into_iter()
            .filter(|f| f.severity >= Severity::Warning)
            .collect(),
    }
}
