//! Smooth OKLCH paths, their colours in sRGB, placement of classes at equal
//! perceptual steps, and continuous sampling for unclassed data.
//!
//! A path gives lightness, chroma and hue as functions of t in 0..1. Each
//! point is brought into sRGB with the CSS Color 4 gamut-mapping algorithm,
//! which keeps lightness and hue and lowers chroma, so a path monotonic in
//! lightness stays monotonic after mapping. Classes are placed along the
//! path so that the CIEDE2000 differences between neighbours stand in
//! prescribed ratios (all equal for a sequential scheme), by a fixed-point
//! iteration on the cumulative difference.

use crate::color::gamut::map_oklch_to_srgb;
use crate::color::{Oklch, Srgb, ciede2000};

/// A path through OKLCH.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Path {
    /// Lightness at t = 0 and t = 1 (linear in between).
    pub lightness: (f64, f64),
    /// Chroma at t = 0 and t = 1, and the peak added in the middle.
    pub chroma: (f64, f64, f64),
    /// Hue at t = 0 and t = 1 in degrees (the shorter way round).
    pub hue: (f64, f64),
}

impl Path {
    /// The OKLCH colour at `t` (not yet gamut-mapped).
    pub fn oklch(&self, t: f64) -> Oklch {
        let t = t.clamp(0.0, 1.0);
        let l = self.lightness.0 + (self.lightness.1 - self.lightness.0) * t;
        let (c0, c1, peak) = self.chroma;
        let c = c0 + (c1 - c0) * t + peak * (std::f64::consts::PI * t).sin();
        let mut dh = (self.hue.1 - self.hue.0).rem_euclid(360.0);
        if dh > 180.0 {
            dh -= 360.0;
        }
        let h = (self.hue.0 + dh * t).rem_euclid(360.0);
        Oklch::new(l, c.max(0.0), h)
    }

    /// The colour at `t`, gamut-mapped into sRGB.
    pub fn srgb(&self, t: f64) -> Srgb {
        map_oklch_to_srgb(self.oklch(t)).0
    }
}

/// Place a chain of points on `colour(t)` from t = 0 to t = 1 so that the
/// CIEDE2000 differences between consecutive points are proportional to
/// `weights` (one weight per step). Returns the t of every point, the
/// first 0 and the last 1.
pub fn place(colour: impl Fn(f64) -> Srgb, weights: &[f64]) -> Vec<f64> {
    place_by(
        |a, b| ciede2000(colour(a).to_lab(), colour(b).to_lab()),
        weights,
    )
}

/// [`place`] with any distance between two positions on the path.
pub fn place_by(dist: impl Fn(f64, f64) -> f64, weights: &[f64]) -> Vec<f64> {
    let steps = weights.len();
    let total_w: f64 = weights.iter().sum();
    let mut ts: Vec<f64> = std::iter::once(0.0)
        .chain(weights.iter().scan(0.0, |acc, w| {
            *acc += w / total_w;
            Some(*acc)
        }))
        .collect();
    ts[steps] = 1.0;
    if steps < 2 {
        return ts;
    }
    for _ in 0..80 {
        // Cumulative difference along the chain.
        let mut cum = vec![0.0; steps + 1];
        for i in 0..steps {
            cum[i + 1] = cum[i] + dist(ts[i], ts[i + 1]);
        }
        let total = cum[steps];
        if total <= 0.0 {
            return ts;
        }
        // Where each interior point should sit on the cumulative scale.
        let mut target = 0.0;
        let mut next = ts.clone();
        let mut moved = 0.0f64;
        for k in 1..steps {
            target += weights[k - 1] / total_w * total;
            let j = cum.partition_point(|&c| c < target).clamp(1, steps);
            let span = cum[j] - cum[j - 1];
            let f = if span > 0.0 {
                (target - cum[j - 1]) / span
            } else {
                0.0
            };
            next[k] = ts[j - 1] + (ts[j] - ts[j - 1]) * f;
            moved = moved.max((next[k] - ts[k]).abs());
        }
        ts = next;
        if moved < 1e-7 {
            break;
        }
    }
    ts
}

/// A continuous ramp for unclassed data: `m` colours (m >= 2) running
/// through the class colours in order, interpolated linearly in OKLab and
/// gamut-mapped, so the ramp keeps the classes' lightness order.
pub fn continuous(classes: &[Srgb], m: usize) -> Vec<Srgb> {
    let m = m.max(2);
    if classes.len() < 2 {
        return vec![classes.first().copied().unwrap_or(Srgb::new(0.0, 0.0, 0.0)); m];
    }
    let labs: Vec<_> = classes.iter().map(|c| c.to_oklab()).collect();
    let last = (labs.len() - 1) as f64;
    (0..m)
        .map(|i| {
            let p = i as f64 / (m - 1) as f64 * last;
            let k = (p.floor() as usize).min(labs.len() - 2);
            let f = p - k as f64;
            let (a, b) = (labs[k], labs[k + 1]);
            let mixed = crate::color::Oklab::new(
                a.l + (b.l - a.l) * f,
                a.a + (b.a - a.a) * f,
                a.b + (b.b - a.b) * f,
            );
            map_oklch_to_srgb(mixed.to_oklch()).0
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn placement_equalises_steps() {
        let p = Path {
            lightness: (0.95, 0.35),
            chroma: (0.02, 0.05, 0.1),
            hue: (90.0, 250.0),
        };
        let ts = place(|t| p.srgb(t), &[1.0; 6]);
        let labs: Vec<_> = ts.iter().map(|&t| p.srgb(t).to_lab()).collect();
        let d: Vec<f64> = labs.windows(2).map(|w| ciede2000(w[0], w[1])).collect();
        let mean = d.iter().sum::<f64>() / d.len() as f64;
        for x in &d {
            assert!((x - mean).abs() / mean < 0.01, "{d:?}");
        }
    }
}
