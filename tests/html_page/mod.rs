//! Helpers shared by the HTML report's tests (`html_report.rs` reads the
//! page as text, `html_browser.rs` loads it in a browser): making a page
//! and its JSON report with the CLI, reading tags and attributes, the
//! findings as comparable rows, decoding PNG.

#![allow(dead_code)]

use std::path::{Path, PathBuf};

/// One finding as both the page and the JSON report state it.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    pub code: String,
    pub kind: String,
    pub severity: String,
    pub view: String,
    pub classes: Vec<String>,
    pub measured: f64,
    pub threshold: f64,
}

impl Row {
    /// A row from the page's data attributes (classes comma-separated).
    pub fn from_attrs(get: impl Fn(&str) -> String) -> Row {
        let num = |k: &str| {
            let v = get(k);
            v.parse::<f64>()
                .unwrap_or_else(|_| panic!("{k}='{v}' is not a number"))
        };
        let classes = get("data-classes");
        Row {
            code: get("data-code"),
            kind: get("data-kind"),
            severity: get("data-severity"),
            view: get("data-view"),
            classes: if classes.is_empty() {
                Vec::new()
            } else {
                classes.split(',').map(str::to_string).collect()
            },
            measured: num("data-measured"),
            threshold: num("data-threshold"),
        }
    }
}

/// The findings of a JSON audit report.
pub fn json_rows(json: &serde_json::Value) -> Vec<Row> {
    json["findings"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| Row {
            code: f["code"].as_str().unwrap().into(),
            kind: f["kind"].as_str().unwrap().into(),
            severity: f["severity"].as_str().unwrap().into(),
            view: f["view"].as_str().unwrap().into(),
            classes: f["classes"]
                .as_array()
                .unwrap()
                .iter()
                .map(|c| c.as_str().unwrap().to_string())
                .collect(),
            measured: f["measured"].as_f64().unwrap(),
            threshold: f["threshold"].as_f64().unwrap(),
        })
        .collect()
}

/// A fresh scratch folder.
pub fn scratch(name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("hueproof-html-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

/// Run `check INPUT --html=DIR/report.html --json=DIR/report.json` and
/// return the page's path, its text and the JSON report.
pub fn make(input: &str, dir: &Path) -> (PathBuf, String, serde_json::Value) {
    use clap::Parser;
    let html = dir.join("report.html");
    let json = dir.join("report.json");
    let argv = [
        "hueproof".to_string(),
        "check".into(),
        input.into(),
        format!("--html={}", html.display()),
        format!("--json={}", json.display()),
    ];
    hueproof::cli::run(hueproof::cli::Cli::try_parse_from(argv).unwrap()).unwrap();
    let text = std::fs::read_to_string(&html).unwrap();
    let value = serde_json::from_str(&std::fs::read_to_string(&json).unwrap()).unwrap();
    (html, text, value)
}

/// The start tags `<name ...>` in `html`, each as its text.
pub fn tags<'a>(html: &'a str, name: &str) -> Vec<&'a str> {
    let open = format!("<{name}");
    let mut out = Vec::new();
    let mut rest = html;
    while let Some(i) = rest.find(&open) {
        let after = &rest[i + open.len()..];
        if after.starts_with([' ', '>', '/', '\n']) {
            let end = after.find('>').unwrap();
            out.push(&rest[i..i + open.len() + end + 1]);
        }
        rest = after;
    }
    out
}

/// The value of attribute `name` in a start tag, with the five XML
/// entities decoded.
pub fn attr(tag: &str, name: &str) -> Option<String> {
    let key = format!(" {name}=\"");
    let i = tag.find(&key)? + key.len();
    let j = tag[i..].find('"')? + i;
    Some(
        tag[i..j]
            .replace("&quot;", "\"")
            .replace("&apos;", "'")
            .replace("&lt;", "<")
            .replace("&gt;", ">")
            .replace("&amp;", "&"),
    )
}

/// Decode PNG bytes: (width, height, RGBA or RGB samples, channels).
pub fn decode_png(bytes: &[u8]) -> (u32, u32, Vec<u8>, usize) {
    let mut d = png::Decoder::new(std::io::Cursor::new(bytes));
    d.set_transformations(png::Transformations::EXPAND);
    let mut r = d.read_info().expect("a PNG header");
    let mut buf = vec![0; r.output_buffer_size().unwrap()];
    let info = r.next_frame(&mut buf).expect("PNG image data");
    buf.truncate(info.buffer_size());
    let channels = info.color_type.samples();
    (info.width, info.height, buf, channels)
}

/// Distinct colours in decoded samples.
pub fn distinct_colours(samples: &[u8], channels: usize) -> usize {
    let mut set = std::collections::BTreeSet::new();
    for px in samples.chunks(channels) {
        set.insert(px[..3.min(channels)].to_vec());
    }
    set.len()
}

/// The demo inputs the tests use, from the package root (as cargo runs
/// tests): a spec that fails on purpose and one that passes.
pub const FAILING_SPEC: &str = "sample-output/audit/clashing-colours.toml";
