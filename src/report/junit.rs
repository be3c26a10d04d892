//! Audit reports as JUnit XML, the test-report shape of the Ant JUnit task
//! that CI systems read (a de-facto format, with no formal standard).
//! Turns [`Audited`] inputs into XML; measures nothing.
//!
//! `<testsuites>` holds one `<testsuite>` per input, named by its path.
//! Each suite has one test case for the figure as a whole (`audit
//! passes`) and one per finding, named by code, kind, view and classes.
//! Findings at or above the fail level are `<failure>`s (type = code);
//! the others pass, with their details in `<system-out>`.

use std::fmt::Write as _;

use super::audited::Audited;
use super::sarif::message_with_fix;
use crate::audit::AuditFinding;
use crate::findings::Severity;
use crate::svg::escape;

fn case_name(f: &AuditFinding) -> String {
    let mut name = format!("{} {} [{}]", f.code, f.kind.name(), f.view);
    if !f.classes.is_empty() {
        let _ = write!(name, " {}", f.classes.join(", "));
    }
    name
}

fn details(f: &AuditFinding) -> String {
    format!(
        "{}\nseverity: {}\nview: {}\nclasses: {}\n{}: measured {}, threshold {}\n",
        message_with_fix(f),
        super::sarif::level(f.severity),
        f.view,
        f.classes.join(", "),
        f.measure,
        f.measured,
        f.threshold
    )
}

/// One JUnit XML document of `inputs`; findings at or above `fail_on`
/// are failures.
pub fn render(inputs: &[Audited], fail_on: Severity) -> String {
    render_each(inputs, &vec![fail_on; inputs.len()])
}

/// One JUnit XML document of `inputs`, each with its own fail level
/// (`fail_on[i]` for `inputs[i]`, as a batch of specs may set them apart).
pub fn render_each(inputs: &[Audited], fail_on: &[Severity]) -> String {
    let level_of = |i: usize| fail_on.get(i).copied().unwrap_or(Severity::Error);
    let failing = |i: usize, a: &Audited| {
        a.report
            .findings
            .iter()
            .filter(|f| f.severity >= level_of(i))
            .count()
    };
    let tests: usize = inputs.iter().map(|a| 1 + a.report.findings.len()).sum();
    let failures: usize = inputs
        .iter()
        .enumerate()
        .map(|(i, a)| failing(i, a) + usize::from(failing(i, a) > 0))
        .sum();
    let mut x = String::from("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
    let _ = writeln!(
        x,
        "<testsuites name=\"hueproof\" tests=\"{tests}\" failures=\"{failures}\" errors=\"0\">"
    );
    for (i, a) in inputs.iter().enumerate() {
        let fail_on = level_of(i);
        let r = a.report;
        let path = escape(&a.path);
        let n_fail = failing(i, a);
        let _ = writeln!(
            x,
            "  <testsuite name=\"{path}\" tests=\"{}\" failures=\"{}\" errors=\"0\" skipped=\"0\">",
            1 + r.findings.len(),
            n_fail + usize::from(n_fail > 0)
        );
        x.push_str("    <properties>\n");
        for (k, v) in [
            ("views", r.views.join(",")),
            ("dpi", r.dpi.to_string()),
            ("viewing_distance_cm", r.viewing_distance_cm.to_string()),
            ("fail_on", super::sarif::level(fail_on).to_string()),
        ] {
            let _ = writeln!(x, "      <property name=\"{k}\" value=\"{}\"/>", escape(&v));
        }
        x.push_str("    </properties>\n");
        let _ = write!(
            x,
            "    <testcase classname=\"{path}\" name=\"audit passes\""
        );
        if n_fail == 0 {
            x.push_str("/>\n");
        } else {
            let codes: Vec<String> = r
                .findings
                .iter()
                .filter(|f| f.severity >= fail_on)
                .map(case_name)
                .collect();
            let _ = writeln!(
                x,
                ">\n      <failure message=\"{}\" type=\"audit\">{}</failure>\n    </testcase>",
                escape(&format!(
                    "{n_fail} finding(s) at or above {}",
                    super::sarif::level(fail_on)
                )),
                escape(&(codes.join("\n") + "\n"))
            );
        }
        let mut seen: Vec<String> = Vec::new();
        for f in &r.findings {
            let base = case_name(f);
            let repeat = seen.iter().filter(|s| **s == base).count();
            seen.push(base.clone());
            let name = if repeat == 0 {
                base
            } else {
                format!("{base} #{}", repeat + 1)
            };
            let _ = writeln!(
                x,
                "    <testcase classname=\"{path}\" name=\"{}\">",
                escape(&name)
            );
            if f.severity >= fail_on {
                let _ = writeln!(
                    x,
                    "      <failure message=\"{}\" type=\"{}\">{}</failure>",
                    escape(&f.message),
                    f.code,
                    escape(&details(f))
                );
            } else {
                let _ = writeln!(x, "      <system-out>{}</system-out>", escape(&details(f)));
            }
            x.push_str("    </testcase>\n");
        }
        x.push_str("  </testsuite>\n");
    }
    x.push_str("</testsuites>\n");
    x
}
