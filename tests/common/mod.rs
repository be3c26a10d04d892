//! Helpers shared by the integration tests: reading the reference fixtures,
//! and the plain Fisher (1958) programme that natural breaks are checked
//! against.

#![allow(dead_code)]

use std::collections::HashMap;
use std::path::PathBuf;

/// Path of a file in `tests/fixtures`.
pub fn fixture(name: &str) -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(name)
}

/// Read a reference CSV (lines starting with `#` are provenance comments)
/// into one map per row, keyed by the header.
pub fn read_csv(name: &str) -> Vec<HashMap<String, String>> {
    let mut r = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(fixture(name))
        .unwrap_or_else(|e| panic!("{name}: {e}"));
    let headers = r.headers().unwrap().clone();
    r.records()
        .map(|rec| {
            let rec = rec.unwrap();
            headers
                .iter()
                .zip(rec.iter())
                .map(|(h, v)| (h.to_string(), v.to_string()))
                .collect()
        })
        .collect()
}

/// A float column of a row.
pub fn f(row: &HashMap<String, String>, key: &str) -> f64 {
    row.get(key)
        .unwrap_or_else(|| panic!("no column {key}"))
        .parse()
        .unwrap_or_else(|e| panic!("{key}: {e}"))
}

/// Assert `|a - b| <= tol` with a message.
pub fn close(a: f64, b: f64, tol: f64, what: &str) {
    assert!((a - b).abs() <= tol, "{what}: {a} vs {b} (tolerance {tol})");
}

/// Minimum SDCM of `k` classes of sorted values `v` by the plain dynamic
/// programme of Fisher (1958), "On grouping for maximum homogeneity", JASA
/// 53(284): best[c][i] = min over every j of best[c-1][j] + ssd(j, i), all
/// O(k n^2) split points tried, with prefix sums of the values centred on
/// their mean.
pub fn plain_fisher_programme(v: &[f64], k: usize) -> f64 {
    let n = v.len();
    let (mut p1, mut p2) = (vec![0.0; n + 1], vec![0.0; n + 1]);
    let mean = v.iter().sum::<f64>() / n as f64;
    for i in 0..n {
        let d = v[i] - mean;
        p1[i + 1] = p1[i] + d;
        p2[i + 1] = p2[i] + d * d;
    }
    let ssd = |a: usize, b: usize| {
        let d = p1[b] - p1[a];
        (p2[b] - p2[a]) - d * d / (b - a) as f64
    };
    let mut best = vec![f64::INFINITY; n + 1];
    for (i, b) in best.iter_mut().enumerate().skip(1) {
        *b = ssd(0, i);
    }
    for c in 2..=k {
        let mut next = vec![f64::INFINITY; n + 1];
        for (i, cell) in next.iter_mut().enumerate().skip(c) {
            for (j, &b) in best.iter().enumerate().take(i).skip(c - 1) {
                let val = b + ssd(j, i);
                if val < *cell {
                    *cell = val;
                }
            }
        }
        best = next;
    }
    best[n]
}

/// Run a hueproof command line through the library (parsed by clap, no
/// process spawned).
pub fn cli(args: &[&str]) -> Result<hueproof::cli::Outcome, hueproof::Error> {
    use clap::Parser;
    let mut argv = vec!["hueproof"];
    argv.extend_from_slice(args);
    hueproof::cli::run(hueproof::cli::Cli::try_parse_from(argv).unwrap())
}

/// A fresh, empty scratch folder for one test.
pub fn scratch(suite: &str, name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("hueproof-{suite}-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

/// The OASIS SARIF 2.1.0 schema (draft-04), compiled by `boon` with
/// format assertions on (so `uri` and `uri-reference` are checked too).
pub fn sarif_schema() -> (boon::Schemas, boon::SchemaIndex) {
    let path = fixture("sarif-schema-2.1.0.json");
    let doc: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    let mut schemas = boon::Schemas::new();
    let mut compiler = boon::Compiler::new();
    compiler.enable_format_assertions();
    let url = "https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json";
    compiler.add_resource(url, doc).unwrap();
    let index = compiler.compile(url, &mut schemas).unwrap();
    (schemas, index)
}

/// The `hueproof` binary, to run in `dir` with `args`: NO_COLOR set (plain
/// progress lines) and no standard input.
pub fn hueproof_command(dir: &std::path::Path, args: &[&str]) -> std::process::Command {
    let mut c = std::process::Command::new(env!("CARGO_BIN_EXE_hueproof"));
    c.args(args)
        .current_dir(dir)
        .env("NO_COLOR", "1")
        .stdin(std::process::Stdio::null());
    c
}

/// A group of marks of class `class` in hueproof's markup (fill, an
/// optional stroke colour and width), one mark per shape.
pub fn marks(class: &str, fill: &str, stroke: Option<(&str, f64)>, shapes: &[String]) -> String {
    let s = match stroke {
        Some((c, w)) => format!(r#" stroke="{c}" stroke-width="{w}""#),
        None => String::new(),
    };
    let mut out =
        format!(r#"<g id="p1-{class}" data-role="marks" data-class="{class}" fill="{fill}"{s}>"#);
    for (i, sh) in shapes.iter().enumerate() {
        out.push_str(&sh.replace(
            "/>",
            &format!(r#" data-key="{class}-{i}" data-class="{class}"/>"#),
        ));
    }
    out.push_str("</g>");
    out
}

/// An SVG rectangle.
pub fn rect(x: f64, y: f64, w: f64, h: f64) -> String {
    format!(r#"<rect x="{x}" y="{y}" width="{w}" height="{h}"/>"#)
}

/// The MediaBox of the single page, read with lopdf.
pub fn media_box(pdf: &[u8]) -> Vec<f64> {
    let doc = lopdf::Document::load_mem(pdf).expect("lopdf reads the PDF");
    let pages = doc.get_pages();
    assert_eq!(pages.len(), 1, "one page");
    let id = *pages.values().next().unwrap();
    let page = doc.get_dictionary(id).unwrap();
    page.get(b"MediaBox")
        .unwrap()
        .as_array()
        .unwrap()
        .iter()
        .map(|o| {
            o.as_float()
                .map(f64::from)
                .or_else(|_| o.as_i64().map(|v| v as f64))
                .unwrap()
        })
        .collect()
}
