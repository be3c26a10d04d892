//! Colour schemes: generating palettes for the data and the background,
//! diagnosing any palette against every view, and repairing a failing one
//! with the smallest change. Pure computation on the colour core and the
//! vision models; no I/O.
//!
//! - [`check`]: the findings for a palette alone (shared codes with the
//!   figure audit, see [`crate::findings`]).
//! - [`sequential`], [`diverging`], [`qualitative`]: the generators.
//! - [`ramp`]: smooth OKLCH paths, gamut mapping along them, equal-step
//!   placement and continuous sampling.
//! - [`repair`]: the nearest palette that passes every check.
//! - [`report`]: the typed result of making, checking or fixing.

pub mod check;
pub mod diverging;
pub mod qualitative;
pub mod ramp;
pub mod repair;
pub mod report;
pub mod sequential;

use serde::Serialize;

use crate::color::{Lab, Srgb};
use crate::vision::{CvdModel, NamedView, Simulation, View};

/// The kind of scheme, which follows from the data's level of measurement.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum SchemeKind {
    /// Ordered lightness for ordinal, interval and ratio data.
    Sequential,
    /// Two ordered arms around a neutral midpoint, for data with a
    /// meaningful middle.
    Diverging,
    /// Hues of similar lightness for nominal data.
    Qualitative,
}

impl SchemeKind {
    /// The name as written on the command line.
    pub fn name(self) -> &'static str {
        match self {
            SchemeKind::Sequential => "sequential",
            SchemeKind::Diverging => "diverging",
            SchemeKind::Qualitative => "qualitative",
        }
    }

    /// Whether class order matters.
    pub fn is_ordered(self) -> bool {
        !matches!(self, SchemeKind::Qualitative)
    }
}

/// Thresholds for judging a palette; the defaults are documented in
/// README.md with their sources.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Thresholds {
    /// Smallest CIEDE2000 difference between two classes, and between a
    /// class and the background, in every view.
    pub min_delta_e: f64,
    /// Largest distance of a qualitative class's L* from the median L*.
    pub glare_lightness: f64,
    /// Largest relative deviation of a step from the mean step (ordered
    /// schemes).
    pub step_spread: f64,
    /// Largest C*ab of a diverging midpoint.
    pub midpoint_chroma: f64,
    /// Largest L* difference between the two arms at equal distance from
    /// the midpoint.
    pub arm_balance: f64,
}

impl Default for Thresholds {
    fn default() -> Self {
        Thresholds {
            min_delta_e: 6.0,
            glare_lightness: 10.0,
            step_spread: 0.25,
            midpoint_chroma: 10.0,
            arm_balance: 5.0,
        }
    }
}

/// A palette as seen in each view: CIELAB (D65) of every colour and of the
/// background.
#[derive(Debug, Clone)]
pub struct SeenPalette {
    /// View names, in order.
    pub views: Vec<String>,
    /// Which views are luminance-only (grayscale).
    pub grayscale: Vec<bool>,
    /// `colors[v][i]`: colour i in view v.
    pub colors: Vec<Vec<Lab>>,
    /// The background in each view.
    pub background: Vec<Lab>,
}

impl SeenPalette {
    /// Simulate `colors` and `background` in every view.
    pub fn new(
        colors: &[Srgb],
        background: Srgb,
        views: &[NamedView],
        model: Option<CvdModel>,
    ) -> SeenPalette {
        let sims: Vec<Simulation> = views
            .iter()
            .map(|v| Simulation::new(v.view, model))
            .collect();
        SeenPalette {
            views: views.iter().map(|v| v.name.clone()).collect(),
            grayscale: views
                .iter()
                .map(|v| v.view == View::Achromatopsia)
                .collect(),
            colors: sims
                .iter()
                .map(|s| colors.iter().map(|&c| s.apply(c).to_lab()).collect())
                .collect(),
            background: sims.iter().map(|s| s.apply(background).to_lab()).collect(),
        }
    }
}

/// The smallest pairwise CIEDE2000 difference in each view, in view order.
pub fn min_delta_e_per_view(seen: &SeenPalette) -> Vec<(String, f64)> {
    seen.views
        .iter()
        .zip(&seen.colors)
        .map(|(name, labs)| {
            let mut min = f64::INFINITY;
            for i in 0..labs.len() {
                for j in i + 1..labs.len() {
                    min = min.min(crate::color::ciede2000(labs[i], labs[j]));
                }
            }
            (name.clone(), min)
        })
        .collect()
}

/// Everything a generator or repair needs besides its own options: the
/// background, the views to keep apart, the model and the thresholds.
#[derive(Debug, Clone)]
pub struct Context {
    /// The surface the colours sit on (opaque).
    pub background: Srgb,
    /// Views judged (the inspect defaults unless the user says otherwise).
    pub views: Vec<NamedView>,
    /// Simulation model override.
    pub model: Option<CvdModel>,
    /// Judging thresholds.
    pub thresholds: Thresholds,
}

impl Context {
    /// The simulations of the views, in order.
    pub fn simulations(&self) -> Vec<Simulation> {
        self.views
            .iter()
            .map(|v| Simulation::new(v.view, self.model))
            .collect()
    }

    /// Smallest CIEDE2000 difference between `c` and the background over
    /// all views.
    pub fn background_separation(&self, c: Srgb, sims: &[Simulation]) -> f64 {
        sims.iter()
            .map(|s| {
                crate::color::ciede2000(s.apply(c).to_lab(), s.apply(self.background).to_lab())
            })
            .fold(f64::INFINITY, f64::min)
    }

    /// Whether the background is light (OKLab L of at least 0.5).
    pub fn light_background(&self) -> bool {
        self.background.to_oklab().l >= 0.5
    }

    /// Measure `colors` in every view.
    pub fn see(&self, colors: &[Srgb]) -> SeenPalette {
        SeenPalette::new(colors, self.background, &self.views, self.model)
    }
}

/// Round a colour to the 8-bit sRGB value a figure file carries.
pub fn to_8bit(c: Srgb) -> Srgb {
    let [r, g, b] = c.to_rgb8();
    Srgb::from_rgb8(r, g, b)
}

/// Margin over the floor for a class next to the background, so that
/// 8-bit rounding cannot push it below.
pub(crate) const BACKGROUND_MARGIN: f64 = 1.2;

/// The OKLab lightness nearest the background's at which `colour(l)` first
/// separates from the background by the floor (times
/// [`BACKGROUND_MARGIN`]) in every view: searched from just below a light
/// background's lightness downwards, or just above a dark one's upwards, in
/// steps of 0.005 (gives up at the end of 0..1).
pub(crate) fn near_background_lightness(ctx: &Context, colour: impl Fn(f64) -> Srgb) -> f64 {
    let bg_l = ctx.background.to_oklab().l;
    let (mut l, step) = if ctx.light_background() {
        ((bg_l - 0.02).min(0.98), -0.005)
    } else {
        ((bg_l + 0.02).max(0.05), 0.005)
    };
    let floor = ctx.thresholds.min_delta_e * BACKGROUND_MARGIN;
    let sims = ctx.simulations();
    while (0.0..=1.0).contains(&(l + step)) && ctx.background_separation(colour(l), &sims) < floor {
        l += step;
    }
    l
}
