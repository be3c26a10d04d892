//! Audit options for a figure rendered from a spec: the spec's `[audit]`
//! settings, its kind of scheme, the classes muted by emphasis, and where
//! a diverging scheme's arms meet, taken from the figure model and its
//! encoding rather than guessed from the pixels.

use crate::render::Rendered;

use super::{Options, judge};

/// The options for auditing `r`, before any command-line flag.
pub fn for_figure(r: &Rendered) -> Options {
    let a = &r.figure.audit;
    let mut opt = Options::new();
    opt.views = a.views.clone();
    opt.viewing_distance_cm = a.viewing_distance_cm;
    opt.dpi = a.dpi;
    opt.fail_on = a.fail_on;
    opt.thresholds = a.thresholds.clone();
    opt.scheme = Some(r.figure.colors.scheme);
    let classes = &r.encoding.classes;
    opt.muted = classes
        .iter()
        .filter(|c| c.faded)
        .map(|c| c.id.clone())
        .collect();
    if let Some(mid) = r.figure.variable.midpoint {
        let bounds: Vec<_> = classes.iter().map(|c| (c.lower, c.upper)).collect();
        opt.split = Some(judge::split_at_midpoint(&bounds, mid));
    }
    opt
}
