//! The audit report as readable text: the classes as measured per view,
//! then each finding with its numbers and the fix. Turns a [`Report`] into
//! text; measures nothing.

use std::fmt::Write as _;

use super::Report;

/// The report as text.
pub fn render(r: &Report) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "{}: {} classes, {} views, {} dpi, viewing distance {} cm",
        if r.passed { "passed" } else { "FAILED" },
        r.classes.len(),
        r.views.len(),
        r.dpi,
        r.viewing_distance_cm
    );
    let _ = writeln!(
        s,
        "\nclass     fill     area_px  regions  size  {}",
        r.views.join("  ")
    );
    for c in &r.classes {
        let _ = write!(
            s,
            "{:<9} {:<8} {:>8} {:>8} {:>5.2}°",
            c.id, c.fill, c.area_px, c.regions, c.mark_angle_deg
        );
        for (_, hex) in &c.measured.0 {
            let _ = write!(s, "  {hex:<7}");
        }
        s.push('\n');
    }
    if r.findings.is_empty() {
        s.push_str("\nno findings\n");
    } else {
        let _ = writeln!(s, "\n{} findings:", r.findings.len());
        for f in &r.findings {
            let _ = writeln!(
                s,
                "{} {} {:?} [{}] {}: {} (measured {}, threshold {})",
                f.code,
                f.kind.name(),
                f.severity,
                f.view,
                f.classes.join(", "),
                f.message,
                f.measured,
                f.threshold
            );
            if let Some(fix) = &f.fix {
                let _ = writeln!(s, "    fix: {fix}");
            }
        }
    }
    s
}
