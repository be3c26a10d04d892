//! The measurements behind `hueproof inspect`: each colour in every colour
//! space hueproof reports, its WCAG luminance and contrast against a
//! background, its appearance in each simulated view, and the CIEDE2000
//! difference of every pair of colours in every view.
//!
//! Translucent colours are composited over the background first (in encoded
//! sRGB, as browsers do), so every number describes what a reader sees. A
//! translucent background is composited over white, the page. Colours are
//! then measured as the 8-bit sRGB colour a figure file would carry, so
//! `hex` and every number beside it describe the same colour; simulated
//! views keep full precision (`rgb`) besides their 8-bit `hex`.

use serde::Serialize;
use serde::ser::SerializeMap;

use crate::color::{self, Srgb, composite, parse_color, wcag};
use crate::error::Result;
use crate::vision::{CvdModel, NamedView, Simulation};

/// What to inspect.
#[derive(Debug, Clone)]
pub struct Request {
    /// Colours as written by the user.
    pub colors: Vec<String>,
    /// Background colour as written.
    pub background: String,
    /// Views to simulate, in the order reported.
    pub views: Vec<NamedView>,
    /// Model override for the deficiency views.
    pub model: Option<CvdModel>,
}

/// A map from view name to a value, serialised in view order.
#[derive(Debug, Clone, PartialEq)]
pub struct ViewMap<T>(pub Vec<(String, T)>);

impl<T: Serialize> Serialize for ViewMap<T> {
    fn serialize<S: serde::Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        let mut m = s.serialize_map(Some(self.0.len()))?;
        for (k, v) in &self.0 {
            m.serialize_entry(k, v)?;
        }
        m.end()
    }
}

impl<T> ViewMap<T> {
    /// The value for a view name.
    pub fn get(&self, name: &str) -> Option<&T> {
        self.0.iter().find(|(k, _)| k == name).map(|(_, v)| v)
    }
}

/// A colour as seen in one view.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ViewColor {
    /// `#rrggbb`.
    pub hex: String,
    /// Encoded sRGB floats in 0..1 (not quantised).
    pub rgb: [f64; 3],
}

/// Everything measured about one colour.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ColorReport {
    /// The text as given.
    pub input: String,
    /// `#rrggbb` of the colour as seen (after compositing).
    pub hex: String,
    /// The written opacity (1 for opaque colours).
    pub alpha: f64,
    /// Whether the written colour lay outside sRGB and was gamut-mapped.
    pub gamut_mapped: bool,
    /// Linear-light RGB.
    pub linear_rgb: [f64; 3],
    /// CIE XYZ, D65, Y in 0..1.
    pub xyz: [f64; 3],
    /// CIELAB, D65.
    pub lab: [f64; 3],
    /// OKLab.
    pub oklab: [f64; 3],
    /// OKLCH, hue in degrees (0 when chroma is negligible).
    pub oklch: [f64; 3],
    /// WCAG 2.x relative luminance.
    pub relative_luminance: f64,
    /// WCAG contrast ratio against the background.
    pub contrast_ratio: f64,
    /// The colour in each view.
    pub views: ViewMap<ViewColor>,
}

/// The CIEDE2000 difference of two colours in one view.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PairReport {
    /// Index of the first colour.
    pub a: usize,
    /// Index of the second colour.
    pub b: usize,
    /// View name.
    pub view: String,
    /// ΔE00 between the two simulated colours (CIELAB D65).
    pub delta_e2000: f64,
}

/// The whole inspection.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Inspection {
    /// The background, measured like a colour.
    pub background: ColorReport,
    /// The colours, in input order.
    pub colors: Vec<ColorReport>,
    /// Every pair in every view, view by view, then by (a, b).
    pub pairs: Vec<PairReport>,
    /// The simulation model each view used.
    pub models: ViewMap<String>,
}

impl Inspection {
    /// The closest pair (smallest ΔE00) in a view, if there are two colours.
    pub fn closest_pair(&self, view: &str) -> Option<&PairReport> {
        self.pairs
            .iter()
            .filter(|p| p.view == view)
            .min_by(|x, y| x.delta_e2000.total_cmp(&y.delta_e2000))
    }
}

fn measure(
    input: &str,
    seen: Srgb,
    alpha: f64,
    gamut_mapped: bool,
    bg: Srgb,
    sims: &[(String, Simulation)],
) -> ColorReport {
    let lin = seen.to_linear();
    let xyz = lin.to_xyz();
    let ok = xyz.to_oklab();
    let oklch = ok.to_oklch();
    let views = sims
        .iter()
        .map(|(name, sim)| {
            let s = sim.apply(seen);
            (
                name.clone(),
                ViewColor {
                    hex: s.to_hex(),
                    rgb: s.to_array(),
                },
            )
        })
        .collect();
    ColorReport {
        input: input.to_string(),
        hex: seen.to_hex(),
        alpha,
        gamut_mapped,
        linear_rgb: lin.to_array(),
        xyz: xyz.to_array(),
        lab: xyz.to_lab().to_array(),
        oklab: ok.to_array(),
        oklch: [oklch.l, oklch.c, oklch.h],
        relative_luminance: wcag::relative_luminance(seen),
        contrast_ratio: wcag::contrast_ratio(seen, bg),
        views: ViewMap(views),
    }
}

fn quantised(c: Srgb) -> Srgb {
    let [r, g, b] = c.to_rgb8();
    Srgb::from_rgb8(r, g, b)
}

/// Run an inspection.
pub fn inspect(req: &Request) -> Result<Inspection> {
    let bg_parsed = parse_color(&req.background)?;
    let white = Srgb::new(1.0, 1.0, 1.0);
    let bg = quantised(composite::over(bg_parsed.rgba, white));
    let sims: Vec<(String, Simulation)> = req
        .views
        .iter()
        .map(|v| (v.name.clone(), Simulation::new(v.view, req.model)))
        .collect();
    let background = measure(
        &req.background,
        bg,
        bg_parsed.rgba.alpha,
        bg_parsed.gamut_mapped,
        bg,
        &sims,
    );
    let mut colors = Vec::with_capacity(req.colors.len());
    for text in &req.colors {
        let p = parse_color(text)?;
        let seen = quantised(composite::over(p.rgba, bg));
        colors.push(measure(text, seen, p.rgba.alpha, p.gamut_mapped, bg, &sims));
    }
    let mut pairs = Vec::new();
    for (name, _) in &sims {
        let labs: Vec<color::Lab> = colors
            .iter()
            .map(|c| Srgb::from_array(c.views.get(name).expect("every view measured").rgb).to_lab())
            .collect();
        for a in 0..labs.len() {
            for b in a + 1..labs.len() {
                pairs.push(PairReport {
                    a,
                    b,
                    view: name.clone(),
                    delta_e2000: color::ciede2000(labs[a], labs[b]),
                });
            }
        }
    }
    let models = ViewMap(
        sims.iter()
            .map(|(n, s)| (n.clone(), s.model().to_string()))
            .collect(),
    );
    Ok(Inspection {
        background,
        colors,
        pairs,
        models,
    })
}
