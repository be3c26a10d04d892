//! The result of `palette make`, `check` or `fix` as one typed, serialisable
//! value, built from the stage's outputs.

use serde::Serialize;

use crate::findings::{Finding, Severity};
use crate::inspect::ViewMap;

use super::repair::Change;
use super::{Context, SchemeKind, Thresholds, check, min_delta_e_per_view};
use crate::color::Srgb;

/// Thresholds as reported.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ThresholdReport {
    /// CIEDE2000 floor between classes and against the background.
    pub min_delta_e2000: f64,
    /// Qualitative: largest L* distance from the median.
    pub glare_lightness: f64,
    /// Ordered: largest relative step deviation.
    pub step_spread: f64,
    /// Diverging: largest midpoint chroma (C*ab).
    pub midpoint_chroma: f64,
    /// Diverging: largest L* difference between arms.
    pub arm_balance: f64,
}

impl From<&Thresholds> for ThresholdReport {
    fn from(t: &Thresholds) -> Self {
        ThresholdReport {
            min_delta_e2000: t.min_delta_e,
            glare_lightness: t.glare_lightness,
            step_spread: t.step_spread,
            midpoint_chroma: t.midpoint_chroma,
            arm_balance: t.arm_balance,
        }
    }
}

/// A palette with its judgement.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PaletteReport {
    /// `sequential`, `diverging` or `qualitative`.
    pub scheme: SchemeKind,
    /// The colours, `#rrggbb`, in class order.
    pub colors: Vec<String>,
    /// The background, `#rrggbb`.
    pub background: String,
    /// Smallest pairwise CIEDE2000 per view (null with fewer than two
    /// colours).
    pub min_delta_e2000: ViewMap<Option<f64>>,
    /// Findings, in check order.
    pub findings: Vec<Finding>,
    /// The thresholds used.
    pub thresholds: ThresholdReport,
    /// For `fix`: what changed.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub changes: Option<Vec<Change>>,
    /// For `make --ramp M`: the continuous ramp sampled at M points.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub ramp: Option<Vec<String>>,
    /// Plain-language notes (e.g. how many classes fit).
    pub notes: Vec<String>,
}

impl PaletteReport {
    /// Judge `colors` and build the report.
    pub fn judge(kind: SchemeKind, colors: &[Srgb], ctx: &Context) -> PaletteReport {
        let seen = ctx.see(colors);
        let findings = check::check(kind, &seen, &ctx.thresholds);
        PaletteReport {
            scheme: kind,
            colors: colors.iter().map(|c| c.to_hex()).collect(),
            background: ctx.background.to_hex(),
            min_delta_e2000: ViewMap(
                min_delta_e_per_view(&seen)
                    .into_iter()
                    .map(|(v, d)| (v, d.is_finite().then_some(d)))
                    .collect(),
            ),
            findings,
            thresholds: (&ctx.thresholds).into(),
            changes: None,
            ramp: None,
            notes: Vec::new(),
        }
    }

    /// The most serious severity among the findings.
    pub fn worst(&self) -> Option<Severity> {
        self.findings.iter().map(|f| f.severity).max()
    }
}
