//! Where the audit's exports go: JSON, SARIF, JUnit XML and the HTML
//! page, each to standard output or to a file written atomically (never
//! over an input). Owns the routing only; the shapes are in
//! [`super::sarif`], [`super::junit`], [`super::html`] and the serialised
//! [`crate::audit::Report`].

use std::path::{Path, PathBuf};

use super::audited::{Anchors, Audited};
use super::{junit, sarif};
use crate::audit::Report;
use crate::error::{Error, Result};
use crate::findings::Severity;

/// The exports asked for: `None` not asked, `Some(None)` (or a file named
/// `-`) to standard output, `Some(Some(file))` to that file.
#[derive(Debug, Clone, Default)]
pub struct Exports {
    /// The report as one JSON object.
    pub json: Option<Option<PathBuf>>,
    /// A SARIF 2.1.0 log.
    pub sarif: Option<Option<PathBuf>>,
    /// A JUnit XML document.
    pub junit: Option<Option<PathBuf>>,
    /// A self-contained HTML page.
    pub html: Option<Option<PathBuf>>,
}

/// The export formats.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Format {
    Json,
    Sarif,
    Junit,
    Html,
}

impl Format {
    fn flag(self) -> &'static str {
        match self {
            Format::Json => "--json",
            Format::Sarif => "--sarif",
            Format::Junit => "--junit",
            Format::Html => "--html",
        }
    }
}

fn usage(message: String) -> Error {
    Error::Usage {
        what: "check".into(),
        message,
    }
}

impl Exports {
    /// The exports, checked: at most one goes to standard output and no
    /// two name the same file.
    pub fn new(
        json: Option<Option<PathBuf>>,
        sarif: Option<Option<PathBuf>>,
        junit: Option<Option<PathBuf>>,
        html: Option<Option<PathBuf>>,
    ) -> Result<Exports> {
        let e = Exports {
            json,
            sarif,
            junit,
            html,
        };
        let to_stdout: Vec<&str> = e
            .asked()
            .filter(|(_, d)| d.is_none())
            .map(|(f, _)| f.flag())
            .collect();
        if to_stdout.len() > 1 {
            return Err(usage(format!(
                "{} would all print to standard output; give all but one a file (e.g. --sarif=audit.sarif)",
                to_stdout.join(" and ")
            )));
        }
        let files: Vec<(&str, &Path)> = e
            .asked()
            .filter_map(|(f, d)| Some((f.flag(), d?)))
            .collect();
        for (i, (fa, a)) in files.iter().enumerate() {
            if let Some((fb, _)) = files[..i].iter().find(|(_, b)| b == a) {
                return Err(usage(format!(
                    "{fb} and {fa} both name '{}'; give each its own file",
                    a.display()
                )));
            }
        }
        Ok(e)
    }

    /// (format, destination: None for standard output) of each export
    /// asked.
    fn asked(&self) -> impl Iterator<Item = (Format, Option<&Path>)> {
        [
            (Format::Json, &self.json),
            (Format::Sarif, &self.sarif),
            (Format::Junit, &self.junit),
            (Format::Html, &self.html),
        ]
        .into_iter()
        .filter_map(|(format, d)| {
            let d = d.as_ref()?;
            Some((format, d.as_deref().filter(|p| *p != Path::new("-"))))
        })
    }

    /// Write the exports of `report` (the audit of `inputs[0]`, which
    /// read `inputs`; findings at or above `fail_on` fail; `page` is the
    /// HTML page made by [`super::html::render`], needed when it is asked).
    /// Files are written atomically and never over an input; the text of
    /// the export that goes to standard output is returned (None: none
    /// does).
    pub fn write(
        &self,
        inputs: &[PathBuf],
        report: &Report,
        fail_on: Severity,
        page: Option<&str>,
    ) -> Result<Option<String>> {
        let input = inputs
            .first()
            .ok_or_else(|| Error::Internal("exports of an audit without an input".into()))?;
        let audited = [Audited::new(input, report, Anchors::read(input))];
        let mut stdout = None;
        for (format, dest) in self.asked() {
            let text = match format {
                Format::Json => {
                    let mut s = serde_json::to_string_pretty(report)
                        .map_err(|e| Error::Internal(format!("serialising the audit: {e}")))?;
                    s.push('\n');
                    s
                }
                Format::Sarif => sarif::render(&audited)?,
                Format::Junit => junit::render(&audited, fail_on),
                Format::Html => page
                    .ok_or_else(|| Error::Internal("an HTML export without its page".into()))?
                    .to_string(),
            };
            match dest {
                None => stdout = Some(text),
                Some(path) => {
                    crate::output::check_not_an_input(path, inputs)?;
                    crate::output::write_atomic(path, text.as_bytes())?;
                }
            }
        }
        Ok(stdout)
    }
}

/// An audited input of a batch: every file it read (itself first), its
/// report and its fail level.
pub type BatchAudit<'a> = (&'a [PathBuf], &'a Report, Severity);

/// One input of a batch as the exports see it.
#[derive(Debug)]
pub struct BatchItem<'a> {
    /// The input as given.
    pub input: &'a Path,
    /// None: not started (the run was interrupted); else the audit (with
    /// every file the input read, and its fail level) or the error.
    pub result: Option<std::result::Result<BatchAudit<'a>, &'a Error>>,
}

/// One entry of the batch JSON export.
#[derive(serde::Serialize)]
struct JsonEntry<'a> {
    input: String,
    #[serde(skip_serializing_if = "Option::is_none")]
    report: Option<&'a Report>,
    #[serde(skip_serializing_if = "Option::is_none")]
    error: Option<JsonError>,
}

#[derive(serde::Serialize)]
struct JsonError {
    message: String,
    exit_code: u8,
}

impl Exports {
    /// Write the exports of a batch, in input order: JSON as an array
    /// with one `{"input", "report"}` or `{"input", "error"}` object per
    /// input; SARIF as one run holding the results of every audited
    /// input; JUnit XML with one testsuite per audited input. Inputs that
    /// could not be audited are in the JSON only (their errors are in the
    /// text, the summary and the exit code). Files are written atomically
    /// and never over any input of the batch; the text of the export that
    /// goes to standard output is returned (None: none does).
    pub fn write_many(&self, items: &[BatchItem]) -> Result<Option<String>> {
        let audited_items: Vec<(&Path, &Report, Severity)> = items
            .iter()
            .filter_map(|it| match it.result {
                Some(Ok((_, r, s))) => Some((it.input, r, s)),
                _ => None,
            })
            .collect();
        let audited: Vec<Audited> = audited_items
            .iter()
            .map(|(p, r, _)| Audited::new(p, r, Anchors::read(p)))
            .collect();
        let levels: Vec<Severity> = audited_items.iter().map(|(_, _, s)| *s).collect();
        let all_inputs: Vec<PathBuf> = items
            .iter()
            .flat_map(|it| match it.result {
                Some(Ok((read, _, _))) => read.to_vec(),
                _ => vec![it.input.to_path_buf()],
            })
            .collect();
        let mut stdout = None;
        for (format, dest) in self.asked() {
            let text = match format {
                Format::Json => {
                    let entries: Vec<JsonEntry> = items
                        .iter()
                        .map(|it| {
                            let input = it.input.to_string_lossy().replace('\\', "/");
                            match it.result {
                                Some(Ok((_, r, _))) => JsonEntry {
                                    input,
                                    report: Some(r),
                                    error: None,
                                },
                                Some(Err(e)) => JsonEntry {
                                    input,
                                    report: None,
                                    error: Some(JsonError {
                                        message: e.to_string(),
                                        exit_code: e.exit_kind().code(),
                                    }),
                                },
                                None => JsonEntry {
                                    input,
                                    report: None,
                                    error: Some(JsonError {
                                        message: "not started: the run was interrupted".into(),
                                        exit_code: crate::error::ExitKind::Interrupted.code(),
                                    }),
                                },
                            }
                        })
                        .collect();
                    let mut s = serde_json::to_string_pretty(&entries)
                        .map_err(|e| Error::Internal(format!("serialising the audits: {e}")))?;
                    s.push('\n');
                    s
                }
                Format::Sarif => sarif::render(&audited)?,
                Format::Junit => junit::render_each(&audited, &levels),
                // `check` refuses --html with several inputs.
                Format::Html => {
                    return Err(Error::Internal(
                        "an HTML page for a batch of figures".into(),
                    ));
                }
            };
            match dest {
                None => stdout = Some(text),
                Some(path) => {
                    crate::output::check_not_an_input(path, &all_inputs)?;
                    crate::output::write_atomic(path, text.as_bytes())?;
                }
            }
        }
        Ok(stdout)
    }
}
