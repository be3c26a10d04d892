//! Audit reports as one SARIF log (Static Analysis Results Interchange
//! Format, version 2.1.0, an OASIS Standard), the format code-review tools
//! and CI systems read findings from. Turns [`Audited`] inputs into JSON;
//! measures nothing.
//!
//! The log holds one run. Its `tool.driver` names hueproof and its
//! version and lists one rule (`reportingDescriptor`) per finding code
//! that occurs, in code order; every finding becomes one `result` in input
//! order, then in the report's order. Where a result points in its input
//! comes from [`super::audited::Anchors`]; the measured numbers are kept
//! in the result's property bag.

use serde::Serialize;

use super::audited::Audited;
use crate::audit::AuditFinding;
use crate::error::{Error, Result};
use crate::findings::{Kind, Severity};

/// The schema URI the log names (the OASIS Standard's, errata 01).
pub const SCHEMA_URI: &str =
    "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json";

/// The SARIF level of a severity.
pub fn level(s: Severity) -> &'static str {
    match s {
        Severity::Error => "error",
        Severity::Warning => "warning",
        Severity::Note => "note",
    }
}

/// The finding's message, then its fix when there is one.
pub fn message_with_fix(f: &AuditFinding) -> String {
    match &f.fix {
        Some(fix) => {
            let stop = if f.message.ends_with('.') { "" } else { "." };
            format!("{}{stop} Fix: {fix}", f.message)
        }
        None => f.message.clone(),
    }
}

#[derive(Serialize)]
struct Log<'a> {
    #[serde(rename = "$schema")]
    schema: &'static str,
    version: &'static str,
    runs: [Run<'a>; 1],
}

#[derive(Serialize)]
struct Run<'a> {
    tool: Tool,
    results: Vec<SarifResult<'a>>,
}

#[derive(Serialize)]
struct Tool {
    driver: Driver,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct Driver {
    name: &'static str,
    version: &'static str,
    semantic_version: &'static str,
    rules: Vec<Rule>,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct Rule {
    id: &'static str,
    name: &'static str,
    short_description: Text,
    default_configuration: Configuration,
}

#[derive(Serialize)]
struct Text {
    text: String,
}

#[derive(Serialize)]
struct Configuration {
    level: &'static str,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct SarifResult<'a> {
    rule_id: &'static str,
    rule_index: usize,
    level: &'static str,
    message: Text,
    locations: [Location<'a>; 1],
    properties: Properties<'a>,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct Location<'a> {
    physical_location: PhysicalLocation<'a>,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct PhysicalLocation<'a> {
    artifact_location: ArtifactLocation<'a>,
    #[serde(skip_serializing_if = "Option::is_none")]
    region: Option<Region>,
}

#[derive(Serialize)]
struct ArtifactLocation<'a> {
    uri: &'a str,
}

#[derive(Serialize)]
#[serde(rename_all = "camelCase")]
struct Region {
    start_line: usize,
}

#[derive(Serialize)]
struct Properties<'a> {
    view: &'a str,
    classes: &'a [String],
    measured: f64,
    threshold: f64,
    measure: &'static str,
}

/// One SARIF 2.1.0 log of `inputs`, pretty-printed, ending in a newline.
/// The rules' `defaultConfiguration.level` is the most severe level any
/// of their results has in this log (hueproof's severities depend on the
/// case, e.g. a blend is an error unless the classes are meant to look
/// alike).
pub fn render(inputs: &[Audited]) -> Result<String> {
    let findings = || inputs.iter().flat_map(|a| a.report.findings.iter());
    let mut kinds: Vec<(Kind, Severity)> = Vec::new();
    for f in findings() {
        match kinds.iter_mut().find(|(k, _)| *k == f.kind) {
            Some((_, s)) => *s = (*s).max(f.severity),
            None => kinds.push((f.kind, f.severity)),
        }
    }
    kinds.sort_by_key(|(k, _)| k.code());
    let rules = kinds
        .iter()
        .map(|&(k, s)| Rule {
            id: k.code(),
            name: k.name(),
            short_description: Text {
                text: k.meaning().into(),
            },
            default_configuration: Configuration { level: level(s) },
        })
        .collect();
    let results = inputs
        .iter()
        .flat_map(|a| a.report.findings.iter().map(move |f| (a, f)))
        .map(|(a, f)| SarifResult {
            rule_id: f.kind.code(),
            rule_index: kinds.iter().position(|(k, _)| *k == f.kind).unwrap_or(0),
            level: level(f.severity),
            message: Text {
                text: message_with_fix(f),
            },
            locations: [Location {
                physical_location: PhysicalLocation {
                    artifact_location: ArtifactLocation { uri: &a.uri },
                    region: a.anchors.line(f).map(|start_line| Region { start_line }),
                },
            }],
            properties: Properties {
                view: &f.view,
                classes: &f.classes,
                measured: f.measured,
                threshold: f.threshold,
                measure: f.measure,
            },
        })
        .collect();
    let log = Log {
        schema: SCHEMA_URI,
        version: "2.1.0",
        runs: [Run {
            tool: Tool {
                driver: Driver {
                    name: "hueproof",
                    version: env!("CARGO_PKG_VERSION"),
                    semantic_version: env!("CARGO_PKG_VERSION"),
                    rules,
                },
            },
            results,
        }],
    };
    let mut s = serde_json::to_string_pretty(&log)
        .map_err(|e| Error::Internal(format!("serialising the SARIF log: {e}")))?;
    s.push('\n');
    Ok(s)
}
