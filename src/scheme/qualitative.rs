//! Qualitative schemes: hues of similar lightness for nominal data, as far
//! apart as possible for every reader at once.
//!
//! Candidates form a grid in OKLCH inside a lightness band (so no class
//! stands out by lightness), mapped into sRGB and rounded to 8 bits; those
//! too close to the background in any view are dropped. The palette is
//! built by farthest-point seeding (each new class is the candidate
//! farthest, by CIEDE2000 minimised over the views, from the classes
//! already chosen), then improved by local search (replace one class at a
//! time by the candidate that raises the smallest pairwise difference)
//! until nothing improves. Luminance-only views are reported but not
//! optimised: hues of one lightness cannot separate in grayscale. A seed
//! picks the first class, so results are deterministic.

use crate::color::gamut::map_oklch_to_srgb;
use crate::color::{Lab, Oklch, Srgb, ciede2000};
use crate::vision::{Simulation, View};

use super::{Context, to_8bit};
use crate::random::SplitMix64;

/// Options of a qualitative scheme.
#[derive(Debug, Clone, PartialEq)]
pub struct Options {
    /// Number of classes.
    pub classes: usize,
    /// Centre of the lightness band (OKLab L), or None for the default for
    /// the background (0.70 on light, 0.72 on dark backgrounds).
    pub lightness: Option<f64>,
    /// Half-width of the lightness band (OKLab L).
    pub band: f64,
    /// Colours fixed for some classes: (class index, colour).
    pub pinned: Vec<(usize, Srgb)>,
    /// Hue hints per class (OKLCH degrees, within 30 degrees), by index.
    pub hue_hints: Vec<(usize, f64)>,
    /// Seed for the first class.
    pub seed: u64,
}

impl Default for Options {
    fn default() -> Self {
        Options {
            classes: 6,
            lightness: None,
            band: 0.05,
            pinned: Vec::new(),
            hue_hints: Vec::new(),
            seed: 1,
        }
    }
}

/// The outcome: colours and how far apart they are.
#[derive(Debug, Clone, PartialEq)]
pub struct Outcome {
    /// The colours, in class order.
    pub colors: Vec<Srgb>,
    /// The smallest pairwise ΔE00 over the optimised views.
    pub min_delta_e: f64,
    /// For k = 1.. the smallest difference the farthest-point seeding
    /// reached with k + 1 classes, to tell how many classes fit.
    pub seeding_profile: Vec<f64>,
    /// How many CIEDE2000 evaluations the optimisation made.
    pub evaluations: u64,
}

/// Half-width of the lightness band in CIELAB L*, below the glare
/// threshold of the check.
const LSTAR_BAND: f64 = 4.5;

struct Candidate {
    color: Srgb,
    hue: f64,
    labs: Vec<Lab>,
}

fn hue_ok(hint: Option<f64>, hue: f64) -> bool {
    hint.is_none_or(|h| {
        let d = (hue - h).rem_euclid(360.0);
        d.min(360.0 - d) <= 30.0
    })
}

fn candidates(
    opts: &Options,
    ctx: &Context,
    sims: &[Simulation],
    all_sims: &[Simulation],
) -> Vec<Candidate> {
    let centre = opts
        .lightness
        .unwrap_or(if ctx.light_background() { 0.70 } else { 0.72 });
    let mut out: Vec<Candidate> = Vec::new();
    let mut seen = std::collections::BTreeSet::new();
    let floor = ctx.thresholds.min_delta_e * super::BACKGROUND_MARGIN;
    // OKLab L and CIELAB L* disagree across hues (a saturated blue of one
    // OKLab L has a lower L*), so the band is also enforced in L*: within
    // LSTAR_BAND of the L* of the neutral at the band centre.
    let centre_lstar = map_oklch_to_srgb(Oklch::new(centre, 0.0, 0.0)).0.to_lab().l;
    for li in 0..3 {
        let l = centre - opts.band + opts.band * li as f64;
        for ci in 0..5 {
            let c = 0.07 + 0.03 * ci as f64;
            for hi in 0..72 {
                let h = hi as f64 * 5.0;
                let (rgb, _) = map_oklch_to_srgb(Oklch::new(l, c, h));
                let rgb = to_8bit(rgb);
                if (rgb.to_lab().l - centre_lstar).abs() > LSTAR_BAND
                    || !seen.insert(rgb.to_rgb8())
                    || ctx.background_separation(rgb, all_sims) < floor
                {
                    continue;
                }
                out.push(Candidate {
                    color: rgb,
                    hue: rgb.to_oklab().to_oklch().h,
                    labs: sims.iter().map(|s| s.apply(rgb).to_lab()).collect(),
                });
            }
        }
    }
    out
}

/// Generate a qualitative palette.
pub fn generate(opts: &Options, ctx: &Context) -> Outcome {
    let all_sims = ctx.simulations();
    let sims: Vec<Simulation> = all_sims
        .iter()
        .copied()
        .filter(|s| s.view() != View::Achromatopsia)
        .collect();
    let mut cands = candidates(opts, ctx, &sims, &all_sims);
    let n = opts.classes.max(1);
    // Pinned colours join the candidates so they can be referenced.
    let mut slot: Vec<Option<usize>> = vec![None; n];
    let mut fixed = vec![false; n];
    for &(i, c) in &opts.pinned {
        if i < n {
            cands.push(Candidate {
                color: c,
                hue: c.to_oklab().to_oklch().h,
                labs: sims.iter().map(|s| s.apply(c).to_lab()).collect(),
            });
            slot[i] = Some(cands.len() - 1);
            fixed[i] = true;
        }
    }
    let hint = |i: usize| {
        opts.hue_hints
            .iter()
            .find(|(k, _)| *k == i)
            .map(|(_, h)| *h)
    };
    let mut evaluations = 0u64;
    let mut dist = |a: &Candidate, b: &Candidate| {
        evaluations += a.labs.len() as u64;
        a.labs
            .iter()
            .zip(&b.labs)
            .map(|(x, y)| ciede2000(*x, *y))
            .fold(f64::INFINITY, f64::min)
    };
    // nearest[c] = distance from candidate c to the closest chosen class.
    let mut nearest = vec![f64::INFINITY; cands.len()];
    for s in slot.iter().flatten() {
        for c in 0..cands.len() {
            let d = dist(&cands[*s], &cands[c]);
            nearest[c] = nearest[c].min(d);
        }
    }
    let mut profile = Vec::new();
    for i in 0..n {
        if slot[i].is_some() {
            continue;
        }
        let eligible = |c: &usize| hue_ok(hint(i), cands[*c].hue) && !slot.contains(&Some(*c));
        let pick = if slot.iter().all(Option::is_none) {
            let pool: Vec<usize> = (0..cands.len()).filter(eligible).collect();
            pool[(SplitMix64(opts.seed).next_u64() % pool.len() as u64) as usize]
        } else {
            let best = (0..cands.len())
                .filter(eligible)
                .max_by(|a, b| nearest[*a].total_cmp(&nearest[*b]).then(b.cmp(a)))
                .expect("candidates remain");
            profile.push(nearest[best]);
            best
        };
        slot[i] = Some(pick);
        for c in 0..cands.len() {
            let d = dist(&cands[pick], &cands[c]);
            nearest[c] = nearest[c].min(d);
        }
    }
    let mut chosen: Vec<usize> = slot.into_iter().map(|s| s.expect("filled")).collect();
    // Local search on the smallest pairwise difference.
    // d_to[j][c]: distance from chosen class j to candidate c.
    let mut d_to: Vec<Vec<f64>> = chosen
        .iter()
        .map(|&j| {
            (0..cands.len())
                .map(|c| dist(&cands[j], &cands[c]))
                .collect()
        })
        .collect();
    let pair_min = |chosen: &[usize], d_to: &[Vec<f64>], skip: usize| {
        let mut m = f64::INFINITY;
        for (a, row) in d_to.iter().enumerate() {
            for (b, &cb) in chosen.iter().enumerate().skip(a + 1) {
                if a != skip && b != skip {
                    m = m.min(row[cb]);
                }
            }
        }
        m
    };
    for _sweep in 0..50 {
        let mut improved = false;
        for s in 0..n {
            if fixed[s] {
                continue;
            }
            let others = pair_min(&chosen, &d_to, s);
            let score_of = |c: usize| {
                let mine = (0..n)
                    .filter(|&j| j != s)
                    .map(|j| d_to[j][c])
                    .fold(f64::INFINITY, f64::min);
                mine.min(others)
            };
            let current = score_of(chosen[s]);
            let better = (0..cands.len())
                .filter(|&c| hue_ok(hint(s), cands[c].hue) && !chosen.contains(&c))
                .map(|c| (c, score_of(c)))
                .filter(|&(_, sc)| sc > current + 1e-9)
                .max_by(|a, b| a.1.total_cmp(&b.1).then(b.0.cmp(&a.0)));
            if let Some((c, _)) = better {
                chosen[s] = c;
                d_to[s] = (0..cands.len())
                    .map(|k| dist(&cands[c], &cands[k]))
                    .collect();
                improved = true;
            }
        }
        if !improved {
            break;
        }
    }
    let min_delta_e = pair_min(&chosen, &d_to, usize::MAX);
    Outcome {
        colors: chosen.iter().map(|&c| cands[c].color).collect(),
        min_delta_e,
        seeding_profile: profile,
        evaluations,
    }
}
