//! The audit report as readable text: the classes as measured per view,
//! then each finding with its numbers and the fix. Turns a [`Report`] into
//! text; measures nothing.

use std::fmt::Write as _;

use super::Report;

/// What every report ends with.
pub const CAUTION: &str = "This audit is an aid for design and review, computed from simulations \
and a published model at a stated viewing distance; it is not a certification of conformance \
with WCAG or any accessibility regulation. Follow the rules that apply to you and test with real readers.";

/// The report as text.
pub fn render(r: &Report) -> String {
    render_with(r, "")
}

/// The report as text, with `extra` (e.g. a proposed palette) before the
/// closing caution.
pub fn render_with(r: &Report, extra: &str) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "{}: {} classes{}, {} views, {} dpi, viewing distance {} cm",
        if r.passed { "passed" } else { "FAILED" },
        r.classes.len(),
        if r.classes_from == "fills" {
            " (detected from distinct fills)"
        } else {
            ""
        },
        r.views.len(),
        r.dpi,
        r.viewing_distance_cm
    );
    let id_w = r
        .classes
        .iter()
        .map(|c| c.id.len())
        .max()
        .unwrap_or(0)
        .max(5);
    let view_w: Vec<usize> = r.views.iter().map(|v| v.len().max(7)).collect();
    let _ = write!(s, "\n{:<id_w$}  fill     area_px  regions   size", "class");
    for (v, w) in r.views.iter().zip(&view_w) {
        let _ = write!(s, "  {v:<w$}");
    }
    s.truncate(s.trim_end().len());
    s.push('\n');
    for c in &r.classes {
        let _ = write!(
            s,
            "{:<id_w$}  {:<7} {:>8} {:>8} {:>5.2}°",
            c.id, c.fill, c.area_px, c.regions, c.mark_angle_deg
        );
        for ((_, hex), w) in c.measured.0.iter().zip(&view_w) {
            let _ = write!(s, "  {hex:<w$}");
        }
        s.truncate(s.trim_end().len());
        s.push('\n');
    }
    if r.findings.is_empty() {
        s.push_str("\nno findings\n");
    } else {
        let _ = writeln!(s, "\n{} findings:", r.findings.len());
        for f in &r.findings {
            let _ = writeln!(
                s,
                "{}: {} (measured {}, threshold {})",
                headline(f, ""),
                f.message,
                f.measured,
                f.threshold
            );
            if let Some(fix) = &f.fix {
                let _ = writeln!(s, "    fix: {fix}");
            }
        }
    }
    s.push_str(extra);
    let _ = writeln!(s, "\n{CAUTION}");
    s
}

/// `CODE kind severity [view] classes` of a finding; `no_classes` stands
/// in for the classes of a finding that has none (text).
fn headline(f: &super::AuditFinding, no_classes: &str) -> String {
    let classes = if f.classes.is_empty() {
        no_classes.to_string()
    } else {
        f.classes.join(", ")
    };
    format!(
        "{} {} {} [{}] {classes}",
        f.code,
        f.kind.name(),
        f.severity.name(),
        f.view
    )
}

/// The most findings a summary lists one by one.
pub const SUMMARY_LINES: usize = 12;

/// A short summary for `render`: the verdict with counts, then one line
/// per finding (at most [`SUMMARY_LINES`]).
pub fn summary(r: &Report) -> String {
    use crate::findings::Severity;
    let count = |sev: Severity| r.findings.iter().filter(|f| f.severity == sev).count();
    let plural = |n: usize, word: &str| format!("{n} {word}{}", if n == 1 { "" } else { "s" });
    let mut s = format!(
        "audit: {} in {} at {} dpi ({}, {})\n",
        if r.passed { "passed" } else { "FAILED" },
        plural(r.views.len(), "view"),
        r.dpi,
        plural(count(Severity::Error), "error"),
        plural(count(Severity::Warning), "warning"),
    );
    for f in r.findings.iter().take(SUMMARY_LINES) {
        let _ = writeln!(
            s,
            "  {}: {} {} against {}",
            headline(f, "text"),
            f.measure,
            f.measured,
            f.threshold
        );
    }
    if r.findings.len() > SUMMARY_LINES {
        let _ = writeln!(s, "  ... and {} more", r.findings.len() - SUMMARY_LINES);
    }
    s
}
