//! Findings: what a check or an audit reports, with stable codes of
//! hueproof's own, a severity, the views involved, the measured value and
//! the threshold it was judged against.
//!
//! The codes are stable: builds and tools may match on them.
//!
//! | code | name | meaning |
//! | --- | --- | --- |
//! | HP101 | blend | two classes are too similar to be told apart reliably in a view |
//! | HP102 | fade | a class does not separate from the background in a view |
//! | HP103 | glare | a class stands out by lightness alone in a scheme meant to give classes equal weight |
//! | HP104 | order | the lightness of an ordered scheme does not follow the class order in a view |
//! | HP105 | steps | the steps between neighbouring classes of an ordered scheme are uneven |
//! | HP106 | midpoint | a diverging scheme's midpoint is not neutral and lightest, or its arms are unbalanced |
//! | HP107 | crowd | more classes than can stay distinguishable; use fewer classes, labels or small multiples |
//! | HP109 | legend | a legend swatch does not look like the marks of its class in a view |
//! | HP108 | text | text does not reach the contrast WCAG 2.x SC 1.4.3 asks against what is behind it |

use serde::Serialize;

/// How serious a finding is. Errors fail a build; warnings and notes are
/// reported.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Severity {
    /// Worth knowing.
    Note,
    /// Likely to mislead some readers.
    Warning,
    /// The figure or palette does not work for some readers.
    Error,
}

impl Severity {
    /// The name as in JSON: `note`, `warning`, `error`.
    pub fn name(self) -> &'static str {
        match self {
            Severity::Note => "note",
            Severity::Warning => "warning",
            Severity::Error => "error",
        }
    }
}

/// The kinds of finding, each with a stable code.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Kind {
    /// HP101.
    Blend,
    /// HP102.
    Fade,
    /// HP103.
    Glare,
    /// HP104.
    Order,
    /// HP105.
    Steps,
    /// HP106.
    Midpoint,
    /// HP107.
    Crowd,
    /// HP108.
    Text,
    /// HP109.
    Legend,
}

impl Kind {
    /// The stable code, e.g. `HP101`.
    pub fn code(self) -> &'static str {
        match self {
            Kind::Blend => "HP101",
            Kind::Fade => "HP102",
            Kind::Glare => "HP103",
            Kind::Order => "HP104",
            Kind::Steps => "HP105",
            Kind::Midpoint => "HP106",
            Kind::Crowd => "HP107",
            Kind::Text => "HP108",
            Kind::Legend => "HP109",
        }
    }

    /// The short name, e.g. `blend`.
    pub fn name(self) -> &'static str {
        match self {
            Kind::Blend => "blend",
            Kind::Fade => "fade",
            Kind::Glare => "glare",
            Kind::Order => "order",
            Kind::Steps => "steps",
            Kind::Midpoint => "midpoint",
            Kind::Crowd => "crowd",
            Kind::Text => "text",
            Kind::Legend => "legend",
        }
    }

    /// What a finding of this kind means, in one sentence (the table
    /// above).
    pub fn meaning(self) -> &'static str {
        match self {
            Kind::Blend => "Two classes are too similar to be told apart reliably in a view.",
            Kind::Fade => "A class does not separate from the background in a view.",
            Kind::Glare => {
                "A class stands out by lightness alone in a scheme meant to give classes equal weight."
            }
            Kind::Order => {
                "The lightness of an ordered scheme does not follow the class order in a view."
            }
            Kind::Steps => {
                "The steps between neighbouring classes of an ordered scheme are uneven."
            }
            Kind::Midpoint => {
                "A diverging scheme's midpoint is not neutral and lightest, or its arms are unbalanced."
            }
            Kind::Crowd => {
                "More classes than can stay distinguishable; use fewer classes, labels or small multiples."
            }
            Kind::Text => {
                "Text does not reach the contrast WCAG 2.x SC 1.4.3 asks against what is behind it."
            }
            Kind::Legend => "A legend swatch does not look like the marks of its class in a view.",
        }
    }
}

/// One finding.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Finding {
    /// Stable code, e.g. `HP101`.
    pub code: &'static str,
    /// Short name, e.g. `blend`.
    pub name: &'static str,
    /// How serious it is.
    pub severity: Severity,
    /// The classes involved (0-based, in class order).
    pub classes: Vec<usize>,
    /// The views in which it occurs, by name.
    pub views: Vec<String>,
    /// The measured value (its unit is named in `measure`).
    pub measured: f64,
    /// The threshold the value was judged against.
    pub threshold: f64,
    /// What was measured, e.g. `delta_e2000`.
    pub measure: &'static str,
    /// One sentence for people.
    pub message: String,
}

impl Finding {
    /// A finding of `kind`.
    #[allow(clippy::too_many_arguments)]
    pub fn new(
        kind: Kind,
        severity: Severity,
        classes: Vec<usize>,
        views: Vec<String>,
        measure: &'static str,
        measured: f64,
        threshold: f64,
        message: String,
    ) -> Finding {
        Finding {
            code: kind.code(),
            name: kind.name(),
            severity,
            classes,
            views,
            measured,
            threshold,
            measure,
            message,
        }
    }

    /// Whether this finding is of `kind`.
    pub fn is(&self, kind: Kind) -> bool {
        self.code == kind.code()
    }
}
