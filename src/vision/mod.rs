//! Simulated colour vision: how a colour or a raster looks to readers with
//! colour-vision deficiencies, and in luminance only.
//!
//! Models, one module each: [`machado2009`] (any severity, anomalous
//! trichromacy), [`brettel1997`] (dichromats, two half-planes),
//! [`vienot1999`] (protan and deutan dichromats, one plane) and
//! achromatopsia (luminance only, in this module). Every model works on
//! linear RGB and clamps to 0..1 before encoding.
//!
//! Default model per view, and why:
//!
//! | view | default | reason |
//! | --- | --- | --- |
//! | protanopia, deuteranopia | Machado 2009, severity 1.0 | continuous with the anomalous views of the same model; agrees closely with Viénot 1999 |
//! | tritanopia | Brettel 1997 | regarded as the most accurate of the three for tritanopia; Machado's tritan matrices use a different shift paradigm and the single-plane method is poor for tritan |
//! | protanomaly, deuteranomaly, tritanomaly = S | Machado 2009 at severity S | the only one of the three that models anomalous trichromacy; other models only blend with the original |
//! | achromatopsia | luminance | grey of equal WCAG relative luminance; also the grayscale-print check |
//!
//! `--cvd-model` overrides the model for the deficiency views; Viénot 1999
//! has no tritan form, so tritan views then fall back to Brettel 1997 and
//! the report says which model each view used.

pub mod brettel1997;
pub mod lms;
pub mod machado2009;
pub mod raster;
pub mod vienot1999;

use std::fmt;

use crate::color::matrix::{self, Mat3};
use crate::color::{LinearRgb, Srgb};

use lms::Cone;

/// A class of colour-vision deficiency, by the cone it affects.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Deficiency {
    /// L cones (protanopia, protanomaly).
    Protan,
    /// M cones (deuteranopia, deuteranomaly).
    Deutan,
    /// S cones (tritanopia, tritanomaly).
    Tritan,
}

impl Deficiency {
    fn cone(self) -> Cone {
        match self {
            Deficiency::Protan => Cone::L,
            Deficiency::Deutan => Cone::M,
            Deficiency::Tritan => Cone::S,
        }
    }
}

/// One way of seeing a figure.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum View {
    /// Normal trichromatic vision (no transform).
    Normal,
    /// Dichromacy: the cone class is missing.
    Dichromacy(Deficiency),
    /// Anomalous trichromacy with severity 0..1.
    Anomaly(Deficiency, f64),
    /// Luminance only.
    Achromatopsia,
}

/// A simulation model for the deficiency views.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum CvdModel {
    /// Machado, Oliveira & Fernandes (2009).
    Machado2009,
    /// Brettel, Viénot & Mollon (1997).
    Brettel1997,
    /// Viénot, Brettel & Mollon (1999).
    Vienot1999,
}

impl CvdModel {
    /// The model's name as written on the command line and in reports.
    pub fn name(self) -> &'static str {
        match self {
            CvdModel::Machado2009 => "machado2009",
            CvdModel::Brettel1997 => "brettel1997",
            CvdModel::Vienot1999 => "vienot1999",
        }
    }
}

/// A view name that could not be parsed.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct ParseViewError {
    /// The text as given.
    pub text: String,
    /// What was wrong and what was expected.
    pub expected: String,
}

impl fmt::Display for ParseViewError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "invalid view '{}': {}", self.text, self.expected)
    }
}

impl std::error::Error for ParseViewError {}

/// A view together with the name the user wrote for it.
#[derive(Debug, Clone, PartialEq)]
pub struct NamedView {
    /// The name exactly as written (trimmed), e.g. `protanomaly=0.6`.
    pub name: String,
    /// The view.
    pub view: View,
}

/// The default views: normal, protanopia, deuteranopia, tritanopia,
/// achromatopsia.
pub const DEFAULT_VIEWS: &str = "normal,protanopia,deuteranopia,tritanopia,achromatopsia";

const VIEW_NAMES: &str = "normal, protanopia, deuteranopia, tritanopia, achromatopsia, \
                          grayscale, protanomaly=S, deuteranomaly=S, tritanomaly=S (S from 0 to 1)";

/// Parse one view name.
pub fn parse_view(text: &str) -> Result<NamedView, ParseViewError> {
    let name = text.trim();
    let err = |expected: String| ParseViewError {
        text: name.to_string(),
        expected,
    };
    let view = match name {
        "normal" => View::Normal,
        "protanopia" => View::Dichromacy(Deficiency::Protan),
        "deuteranopia" => View::Dichromacy(Deficiency::Deutan),
        "tritanopia" => View::Dichromacy(Deficiency::Tritan),
        "achromatopsia" => View::Achromatopsia,
        // Grayscale print: the same luminance-only transform (methods 4.4).
        "grayscale" => View::Achromatopsia,
        _ => {
            let Some((kind, sev)) = name.split_once('=') else {
                return Err(err(format!("expected one of {VIEW_NAMES}")));
            };
            let d = match kind.trim() {
                "protanomaly" => Deficiency::Protan,
                "deuteranomaly" => Deficiency::Deutan,
                "tritanomaly" => Deficiency::Tritan,
                other => {
                    return Err(err(format!(
                        "'{other}' takes no severity; expected one of {VIEW_NAMES}"
                    )));
                }
            };
            let s: f64 = sev
                .trim()
                .parse()
                .ok()
                .filter(|s: &f64| (0.0..=1.0).contains(s))
                .ok_or_else(|| {
                    err(format!(
                        "the severity '{}' must be a number from 0 to 1",
                        sev.trim()
                    ))
                })?;
            View::Anomaly(d, s)
        }
    };
    Ok(NamedView {
        name: name.to_string(),
        view,
    })
}

/// Parse a comma-separated view list; a view may be listed only once.
pub fn parse_views(list: &str) -> Result<Vec<NamedView>, ParseViewError> {
    let mut out: Vec<NamedView> = Vec::new();
    for part in list.split(',') {
        if part.trim().is_empty() {
            return Err(ParseViewError {
                text: list.to_string(),
                expected: format!(
                    "an empty entry in the list; expected comma-separated names from {VIEW_NAMES}"
                ),
            });
        }
        let v = parse_view(part)?;
        if out.iter().any(|o| o.name == v.name) {
            return Err(ParseViewError {
                text: v.name,
                expected: "this view is listed twice".into(),
            });
        }
        out.push(v);
    }
    Ok(out)
}

/// The linear-RGB transform a simulation applies.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Transform {
    /// No change (normal vision).
    Identity,
    /// One matrix for every colour.
    Matrix(Mat3),
    /// Brettel's two half-planes.
    HalfPlanes(brettel1997::HalfPlanes),
}

/// The rows that give WCAG relative luminance on linear RGB, repeated so
/// the result is a grey.
pub const LUMINANCE_MATRIX: Mat3 = [
    [0.2126, 0.7152, 0.0722],
    [0.2126, 0.7152, 0.0722],
    [0.2126, 0.7152, 0.0722],
];

/// A resolved simulation: a view, the model chosen for it and its transform.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Simulation {
    view: View,
    model: &'static str,
    transform: Transform,
}

impl Simulation {
    /// Resolve `view` with the model override `model` (None: the default
    /// model per view, see the module documentation).
    pub fn new(view: View, model: Option<CvdModel>) -> Simulation {
        use CvdModel::*;
        let (model, transform) = match view {
            View::Normal => ("none", Transform::Identity),
            View::Achromatopsia => ("luminance", Transform::Matrix(LUMINANCE_MATRIX)),
            View::Dichromacy(d) => {
                let chosen = match (model, d) {
                    (None, Deficiency::Tritan) => Brettel1997,
                    (None, _) => Machado2009,
                    (Some(Vienot1999), Deficiency::Tritan) => Brettel1997,
                    (Some(m), _) => m,
                };
                (chosen.name(), dichromat_transform(chosen, d, 1.0))
            }
            View::Anomaly(d, s) => {
                let chosen = match (model, d) {
                    (None, _) => Machado2009,
                    (Some(Vienot1999), Deficiency::Tritan) => Brettel1997,
                    (Some(m), _) => m,
                };
                (chosen.name(), dichromat_transform(chosen, d, s))
            }
        };
        Simulation {
            view,
            model,
            transform,
        }
    }

    /// The view simulated.
    pub fn view(&self) -> View {
        self.view
    }

    /// The name of the model used: `machado2009`, `brettel1997`,
    /// `vienot1999`, `luminance` or `none`.
    pub fn model(&self) -> &'static str {
        self.model
    }

    /// The transform on linear RGB.
    pub fn transform(&self) -> &Transform {
        &self.transform
    }

    /// Simulate a linear-light colour; the result is clamped to 0..1.
    pub fn apply_linear(&self, c: LinearRgb) -> LinearRgb {
        let v = c.to_array();
        let m = match &self.transform {
            Transform::Identity => return c.clamped(),
            Transform::Matrix(m) => m,
            Transform::HalfPlanes(h) => h.matrix_for(v),
        };
        LinearRgb::from_array(matrix::mul_vec(m, v)).clamped()
    }

    /// Simulate an encoded sRGB colour.
    pub fn apply(&self, c: Srgb) -> Srgb {
        if self.transform == Transform::Identity {
            return c.clamped();
        }
        self.apply_linear(c.to_linear()).to_srgb()
    }
}

fn dichromat_transform(model: CvdModel, d: Deficiency, severity: f64) -> Transform {
    match model {
        CvdModel::Machado2009 => Transform::Matrix(machado2009::matrix(d, severity)),
        CvdModel::Brettel1997 => {
            Transform::HalfPlanes(brettel1997::half_planes(d.cone()).blended(severity))
        }
        CvdModel::Vienot1999 => Transform::Matrix(matrix::lerp(
            &matrix::IDENTITY,
            &vienot1999::rgb_matrix(d.cone()),
            severity,
        )),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_the_documented_list() {
        let v = parse_views(DEFAULT_VIEWS).unwrap();
        assert_eq!(v.len(), 5);
        let a = parse_views("protanomaly=0.6, tritanomaly=.25").unwrap();
        assert_eq!(a[0].view, View::Anomaly(Deficiency::Protan, 0.6));
        assert_eq!(a[1].name, "tritanomaly=.25");
    }

    #[test]
    fn grayscale_print_is_the_luminance_only_view_under_its_own_name() {
        let v = parse_views("achromatopsia,grayscale").unwrap();
        assert_eq!(v[1].name, "grayscale");
        assert_eq!(v[1].view, View::Achromatopsia);
        assert_eq!(Simulation::new(v[1].view, None).model(), "luminance");
    }

    #[test]
    fn rejects_bad_views_with_the_reason() {
        for (s, needle) in [
            ("protanopia=0.5", "takes no severity"),
            ("protanomaly=1.5", "from 0 to 1"),
            ("protanomaly=abc", "from 0 to 1"),
            ("colourblind", "expected one of"),
            ("normal,,protanopia", "empty entry"),
            ("normal,normal", "listed twice"),
        ] {
            let e = parse_views(s).unwrap_err();
            assert!(e.to_string().contains(needle), "{s}: {e}");
        }
    }

    #[test]
    fn default_models_per_view() {
        let m = |v| Simulation::new(v, None).model();
        assert_eq!(m(View::Dichromacy(Deficiency::Tritan)), "brettel1997");
        assert_eq!(m(View::Dichromacy(Deficiency::Protan)), "machado2009");
        assert_eq!(m(View::Anomaly(Deficiency::Deutan, 0.3)), "machado2009");
        let forced = Simulation::new(
            View::Dichromacy(Deficiency::Tritan),
            Some(CvdModel::Vienot1999),
        );
        assert_eq!(forced.model(), "brettel1997");
    }
}
