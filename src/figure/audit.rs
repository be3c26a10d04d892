//! The spec's `[audit]` table validated into [`AuditSettings`]: the views,
//! viewing distance, resolution, fail level and thresholds with which
//! `hueproof check` and `hueproof render` audit the figure. Every error
//! names the key and its line.

use crate::error::Error;
use crate::findings::Severity;
use crate::spec::SpecFile;
use crate::spec::length::parse_length;
use crate::thresholds::Thresholds;
use crate::vision::{self, NamedView};

/// How the figure is audited, before any command-line flag.
#[derive(Debug, Clone, PartialEq)]
pub struct AuditSettings {
    /// The views.
    pub views: Vec<NamedView>,
    /// Viewing distance, centimetres.
    pub viewing_distance_cm: f64,
    /// Audit resolution.
    pub dpi: f64,
    /// Findings at or above this severity fail the audit.
    pub fail_on: Severity,
    /// The thresholds.
    pub thresholds: Thresholds,
}

/// The default viewing distance, centimetres (print and screen reading,
/// common practice).
pub const VIEWING_DISTANCE_CM: f64 = 40.0;

/// The accepted viewing distances, centimetres.
pub const VIEWING_DISTANCE_RANGE: (f64, f64) = (5.0, 1000.0);

/// Validate the `[audit]` table of `file`; `dpi` is the figure's.
pub fn audit_settings(file: &SpecFile, dpi: f64) -> Result<AuditSettings, Error> {
    let mut out = AuditSettings {
        views: vision::parse_views(vision::DEFAULT_VIEWS).expect("the default views parse"),
        viewing_distance_cm: VIEWING_DISTANCE_CM,
        dpi,
        fail_on: Severity::Error,
        thresholds: Thresholds::default(),
    };
    let Some(a) = file.spec.audit.as_ref() else {
        return Ok(out);
    };
    if let Some(list) = &a.views {
        if list.is_empty() {
            return Err(file.error("audit.views", "expected at least one view"));
        }
        out.views = vision::parse_views(&list.join(","))
            .map_err(|e| file.error("audit.views", e.to_string()))?;
    }
    if let Some(d) = &a.viewing_distance {
        let pt = parse_length(d).map_err(|m| file.error("audit.viewing_distance", m))?;
        let cm = (pt / 72.0 * 2.54 * 1e6).round() / 1e6;
        let (lo, hi) = VIEWING_DISTANCE_RANGE;
        if !(lo..=hi).contains(&cm) {
            return Err(file.error(
                "audit.viewing_distance",
                format!("'{d}' is {cm:.1} cm; expected {lo} cm to {hi} cm"),
            ));
        }
        out.viewing_distance_cm = cm;
    }
    if let Some(d) = a.dpi {
        if !(d.is_finite() && (10.0..=1200.0).contains(&d)) {
            return Err(file.error(
                "audit.dpi",
                format!("{d}: expected a resolution between 10 and 1200"),
            ));
        }
        out.dpi = d;
    }
    if let Some(f) = &a.fail_on {
        out.fail_on = match f.as_str() {
            "error" => Severity::Error,
            "warning" => Severity::Warning,
            other => {
                return Err(file.error(
                    "audit.fail_on",
                    format!("'{other}': expected 'error' or 'warning'"),
                ));
            }
        };
    }
    for (name, value) in a.thresholds.iter().flatten() {
        out.thresholds
            .set(name, *value)
            .map_err(|m| file.error(&format!("audit.thresholds.{name}"), m))?;
    }
    Ok(out)
}
