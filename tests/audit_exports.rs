//! The audit's machine-readable exports (`hueproof check --sarif`,
//! `--junit`, `--json`): the SARIF log validated against the OASIS SARIF
//! 2.1.0 JSON schema (tests/fixtures/sarif-schema-2.1.0.json) with a
//! general-purpose JSON Schema validator (the `boon` crate), the JUnit XML
//! read back with a general-purpose XML parser (`roxmltree`), and both
//! compared with the audit report they come from. The figures are SVG in
//! hueproof's markup with known defects (a red and a green class side by
//! side blend for dichromats; light grey text fails WCAG 2.x SC 1.4.3).

mod common;

use std::path::{Path, PathBuf};

use common::{cli, scratch};
use hueproof::ExitKind;
use hueproof::audit::{self, Options, Report};
use hueproof::findings::Severity;
use hueproof::report::audited::{Anchors, Audited};
use hueproof::report::{junit, sarif};

/// A red and a green class side by side, each element on its own line,
/// and a caption in light grey.
fn defective_svg() -> String {
    figure("#dddddd")
}

/// The red and green classes with a caption in `caption_fill`.
fn figure(caption_fill: &str) -> String {
    [
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="160pt" height="100pt" viewBox="0 0 160 100">"##,
        r##"<rect data-role="background" width="160" height="100" fill="#ffffff"/>"##,
        r##"<g id="p1-c1" data-role="marks" data-class="c1" fill="#d45f3c">"##,
        r##"<rect x="10" y="10" width="70" height="60" data-key="a" data-class="c1"/>"##,
        r##"</g>"##,
        r##"<g id="p1-c2" data-role="marks" data-class="c2" fill="#5e8d3a">"##,
        r##"<rect x="80" y="10" width="70" height="60" data-key="b" data-class="c2"/>"##,
        r##"</g>"##,
        format!(r##"<text x="10" y="88" font-size="9" fill="{caption_fill}">a &lt; b &amp; "c"</text>"##).as_str(),
        r##"</svg>"##,
    ]
    .join("\n")
}

/// The 1-based line of the first occurrence of `needle` in `text`, found
/// by plain text search (independently of the exporter's XML parser).
fn line_of(text: &str, needle: &str) -> usize {
    text.lines()
        .position(|l| l.contains(needle))
        .unwrap_or_else(|| panic!("{needle} not in the text"))
        + 1
}

fn report_of(svg: &str) -> Report {
    let mut opt = Options::new();
    opt.dpi = 48.0;
    audit::audit_svg(Path::new("fig.svg"), svg, &opt).unwrap()
}

fn assert_valid_sarif(log: &serde_json::Value) {
    let (schemas, index) = common::sarif_schema();
    if let Err(e) = schemas.validate(log, index) {
        panic!("not valid SARIF 2.1.0: {e:#}\n{log:#}");
    }
}

#[test]
fn the_validator_rejects_logs_the_schema_forbids() {
    // Guards the schema check itself: logs that break the OASIS schema's
    // rules must fail (a level outside none|note|warning|error, a missing
    // required `runs`, a region line of 0, a URI with a space).
    let (schemas, index) = common::sarif_schema();
    let good = serde_json::json!({
        "version": "2.1.0",
        "runs": [{"tool": {"driver": {"name": "x"}}, "results": [{
            "message": {"text": "m"}, "level": "error",
            "locations": [{"physicalLocation": {
                "artifactLocation": {"uri": "a/b.svg"}, "region": {"startLine": 3}}}]}]}]
    });
    assert!(schemas.validate(&good, index).is_ok());
    let mut bad_level = good.clone();
    bad_level["runs"][0]["results"][0]["level"] = "fatal".into();
    let mut no_runs = good.clone();
    no_runs.as_object_mut().unwrap().remove("runs");
    let mut line_zero = good.clone();
    line_zero["runs"][0]["results"][0]["locations"][0]["physicalLocation"]["region"]["startLine"] =
        0.into();
    let mut bad_uri = good.clone();
    bad_uri["runs"][0]["results"][0]["locations"][0]["physicalLocation"]["artifactLocation"]["uri"] =
        "a b.svg".into();
    for (what, log) in [
        ("level", bad_level),
        ("runs", no_runs),
        ("startLine", line_zero),
        ("uri", bad_uri),
    ] {
        assert!(schemas.validate(&log, index).is_err(), "{what} accepted");
    }
}

#[test]
fn sarif_log_is_valid_and_carries_every_finding() {
    let svg = defective_svg();
    let report = report_of(&svg);
    assert!(report.findings.iter().any(|f| f.code == "HP101"));
    assert!(report.findings.iter().any(|f| f.code == "HP108"));
    let path = Path::new("figures/a map.svg");
    let text = sarif::render(&[Audited::new(path, &report, Anchors::of_svg(&svg))]).unwrap();
    let log: serde_json::Value = serde_json::from_str(&text).unwrap();
    assert_valid_sarif(&log);

    assert_eq!(log["version"], "2.1.0");
    assert_eq!(log["runs"].as_array().unwrap().len(), 1);
    let driver = &log["runs"][0]["tool"]["driver"];
    assert_eq!(driver["name"], "hueproof");
    assert_eq!(driver["version"], env!("CARGO_PKG_VERSION"));
    // One rule per code used, in code order, each named by its kind.
    let rules = driver["rules"].as_array().unwrap();
    let mut codes: Vec<&str> = report.findings.iter().map(|f| f.code).collect();
    codes.sort();
    codes.dedup();
    let ids: Vec<&str> = rules.iter().map(|r| r["id"].as_str().unwrap()).collect();
    assert_eq!(ids, codes);
    for r in rules {
        let f = report.findings.iter().find(|f| f.code == r["id"]).unwrap();
        assert_eq!(r["name"], f.kind.name());
        assert_eq!(r["shortDescription"]["text"], f.kind.meaning());
    }

    let results = log["runs"][0]["results"].as_array().unwrap();
    assert_eq!(results.len(), report.findings.len());
    let severity_level = |s: Severity| match s {
        Severity::Error => "error",
        Severity::Warning => "warning",
        Severity::Note => "note",
    };
    for (res, f) in results.iter().zip(&report.findings) {
        assert_eq!(res["ruleId"], f.code);
        let i = res["ruleIndex"].as_u64().unwrap() as usize;
        assert_eq!(rules[i]["id"], f.code);
        assert_eq!(res["level"], severity_level(f.severity));
        let msg = res["message"]["text"].as_str().unwrap();
        assert!(msg.starts_with(&f.message), "{msg}");
        if let Some(fix) = &f.fix {
            assert!(msg.ends_with(fix.as_str()), "{msg}");
        }
        let loc = &res["locations"][0]["physicalLocation"];
        // RFC 3986: the space is percent-encoded, the separator kept.
        assert_eq!(loc["artifactLocation"]["uri"], "figures/a%20map.svg");
        match f.classes.first() {
            Some(c) => assert_eq!(
                loc["region"]["startLine"],
                line_of(&svg, &format!("data-class=\"{c}\"")),
                "{f:?}"
            ),
            None => assert!(loc["region"].is_null(), "{f:?}"),
        }
        let p = &res["properties"];
        assert_eq!(p["view"], f.view.as_str());
        assert_eq!(p["classes"], serde_json::json!(f.classes));
        assert_eq!(p["measured"].as_f64().unwrap(), f.measured);
        assert_eq!(p["threshold"].as_f64().unwrap(), f.threshold);
        assert_eq!(p["measure"], f.measure);
    }
}

#[test]
fn a_passing_audit_is_a_valid_log_with_no_results() {
    let report = Report {
        passed: true,
        views: vec!["normal".into()],
        dpi: 150.0,
        viewing_distance_cm: 40.0,
        classes_from: "markup",
        classes: Vec::new(),
        contacts: Vec::new(),
        findings: Vec::new(),
        repair: None,
        refused_references: Vec::new(),
    };
    let a = Audited::new(Path::new("ok.svg"), &report, Anchors::default());
    let log: serde_json::Value = serde_json::from_str(&sarif::render(&[a]).unwrap()).unwrap();
    assert_valid_sarif(&log);
    assert_eq!(log["runs"][0]["results"], serde_json::json!([]));
    assert_eq!(
        log["runs"][0]["tool"]["driver"]["rules"],
        serde_json::json!([])
    );
}

/// (attribute, value) of an element, for messages.
fn attr<'a>(n: roxmltree::Node<'a, '_>, name: &str) -> &'a str {
    n.attribute(name)
        .unwrap_or_else(|| panic!("<{}> has no {name}", n.tag_name().name()))
}

fn check_junit(xml: &str, inputs: &[(&str, &Report)], fail_on: Severity) {
    let doc = roxmltree::Document::parse(xml).unwrap();
    let root = doc.root_element();
    assert_eq!(root.tag_name().name(), "testsuites");
    assert_eq!(attr(root, "name"), "hueproof");
    assert_eq!(attr(root, "errors"), "0");
    let suites: Vec<_> = root
        .children()
        .filter(|n| n.has_tag_name("testsuite"))
        .collect();
    assert_eq!(suites.len(), inputs.len());
    let (mut tests, mut failures) = (0, 0);
    for (suite, (path, report)) in suites.iter().zip(inputs) {
        assert_eq!(attr(*suite, "name"), *path);
        let cases: Vec<_> = suite
            .children()
            .filter(|n| n.has_tag_name("testcase"))
            .collect();
        assert_eq!(cases.len(), 1 + report.findings.len());
        assert_eq!(attr(*suite, "tests"), cases.len().to_string());
        let failing: Vec<_> = report
            .findings
            .iter()
            .filter(|f| f.severity >= fail_on)
            .collect();
        let whole = cases[0];
        assert_eq!(attr(whole, "name"), "audit passes");
        assert_eq!(attr(whole, "classname"), *path);
        let whole_fails = whole.children().any(|n| n.has_tag_name("failure"));
        assert_eq!(whole_fails, !failing.is_empty());
        let n_fail = failing.len() + usize::from(whole_fails);
        assert_eq!(attr(*suite, "failures"), n_fail.to_string());
        tests += cases.len();
        failures += n_fail;
        for (case, f) in cases[1..].iter().zip(&report.findings) {
            assert_eq!(attr(*case, "classname"), *path);
            let name = attr(*case, "name");
            assert!(name.starts_with(&format!("{} {} [{}]", f.code, f.kind.name(), f.view)));
            for c in &f.classes {
                assert!(name.contains(c.as_str()), "{name}");
            }
            let failure = case.children().find(|n| n.has_tag_name("failure"));
            let out = case.children().find(|n| n.has_tag_name("system-out"));
            if f.severity >= fail_on {
                let failure = failure.unwrap_or_else(|| panic!("{name}: no failure"));
                assert_eq!(attr(failure, "type"), f.code);
                // The parser gives back the message exactly: escaping held.
                assert_eq!(attr(failure, "message"), f.message);
                assert!(failure.text().unwrap().contains(&f.message));
                assert!(out.is_none());
            } else {
                assert!(failure.is_none(), "{name}");
                assert!(out.unwrap().text().unwrap().contains(&f.message));
            }
        }
    }
    assert_eq!(attr(root, "tests"), tests.to_string());
    assert_eq!(attr(root, "failures"), failures.to_string());
}

#[test]
fn junit_xml_parses_and_counts_match_the_report() {
    // JUnit XML has no formal standard: the element and attribute names
    // follow the Ant JUnit task's reports, common practice for CI readers.
    let svg = defective_svg();
    let report = report_of(&svg);
    let text_finding = report.findings.iter().find(|f| f.code == "HP108").unwrap();
    // The caption's markup characters reach the message and the XML.
    assert!(
        text_finding.message.contains("a < b & \"c\""),
        "{}",
        text_finding.message
    );
    let a = Audited::new(Path::new("figs/fig.svg"), &report, Anchors::of_svg(&svg));
    let xml = junit::render(std::slice::from_ref(&a), Severity::Error);
    check_junit(&xml, &[("figs/fig.svg", &report)], Severity::Error);
    // Two inputs, one of them passing, and a stricter fail level.
    let clean = Report {
        findings: Vec::new(),
        passed: true,
        ..report.clone()
    };
    let b = Audited::new(Path::new("ok.svg"), &clean, Anchors::default());
    for fail_on in [Severity::Error, Severity::Warning, Severity::Note] {
        let xml = junit::render(&[a.clone(), b.clone()], fail_on);
        check_junit(
            &xml,
            &[("figs/fig.svg", &report), ("ok.svg", &clean)],
            fail_on,
        );
    }
}

#[test]
fn findings_below_the_fail_level_pass_with_their_details() {
    let svg = defective_svg();
    let mut report = report_of(&svg);
    // The same findings, one of them lowered to a warning, judged at the
    // error level: it passes and its details go to system-out.
    report.findings[0].severity = Severity::Warning;
    let a = Audited::new(Path::new("fig.svg"), &report, Anchors::of_svg(&svg));
    let xml = junit::render(&[a], Severity::Error);
    check_junit(&xml, &[("fig.svg", &report)], Severity::Error);
    assert!(xml.contains("<system-out>"));
}

fn tmp(name: &str) -> PathBuf {
    scratch("audit-exports", name)
}

fn s(p: &Path) -> &str {
    p.to_str().unwrap()
}

#[test]
fn check_writes_exports_to_files_and_keeps_exit_codes() {
    let d = tmp("files");
    let fig = d.join("fig.svg");
    std::fs::write(&fig, defective_svg()).unwrap();
    let (sar, jun, json) = (d.join("out.sarif"), d.join("out.xml"), d.join("out.json"));
    let sarif_flag = format!("--sarif={}", s(&sar));
    let junit_flag = format!("--junit={}", s(&jun));
    let json_flag = format!("--json={}", s(&json));
    // All to files: the text report still goes to stdout; findings: exit 1.
    let out = cli(&[
        "check",
        s(&fig),
        "--dpi",
        "48",
        &sarif_flag,
        &junit_flag,
        &json_flag,
    ])
    .unwrap();
    assert_eq!(out.kind, ExitKind::Findings);
    assert!(out.stdout.starts_with("FAILED"), "{}", out.stdout);
    let log: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&sar).unwrap()).unwrap();
    assert_valid_sarif(&log);
    let report: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&json).unwrap()).unwrap();
    let n = report["findings"].as_array().unwrap().len();
    assert!(n > 0);
    assert_eq!(log["runs"][0]["results"].as_array().unwrap().len(), n);
    // An absolute input path becomes a file URI.
    let uri = log["runs"][0]["results"][0]["locations"][0]["physicalLocation"]["artifactLocation"]
        ["uri"]
        .as_str()
        .unwrap();
    assert!(
        uri.starts_with("file:///") && uri.ends_with("/fig.svg"),
        "{uri}"
    );
    let xml = std::fs::read_to_string(&jun).unwrap();
    let doc = roxmltree::Document::parse(&xml).unwrap();
    assert_eq!(attr(doc.root_element(), "tests"), (n + 1).to_string());
    // No temporary files are left beside the outputs.
    let mut names: Vec<String> = std::fs::read_dir(&d)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(names, ["fig.svg", "out.json", "out.sarif", "out.xml"]);

    // One format to stdout (bare flag or `-`), the others to files.
    let out = cli(&["check", s(&fig), "--dpi", "48", "--sarif", &junit_flag]).unwrap();
    assert_eq!(out.kind, ExitKind::Findings);
    assert_eq!(
        serde_json::from_str::<serde_json::Value>(&out.stdout).unwrap(),
        log,
        "stdout and file logs differ"
    );
    let out = cli(&["check", s(&fig), "--dpi", "48", "--junit=-"]).unwrap();
    assert!(out.stdout.starts_with("<?xml"));
    // The same inputs give the same bytes.
    let again = cli(&["check", s(&fig), "--dpi", "48", "--junit=-"]).unwrap();
    assert_eq!(out.stdout, again.stdout);
    // A passing audit (dark caption, the normal view only): exit 0, an
    // empty but valid log.
    let ok = d.join("ok.svg");
    std::fs::write(&ok, figure("#222222")).unwrap();
    let out = cli(&[
        "check",
        s(&ok),
        "--dpi",
        "48",
        "--views",
        "normal",
        "--sarif",
    ])
    .unwrap();
    assert_eq!(out.kind, ExitKind::Success);
    let log: serde_json::Value = serde_json::from_str(&out.stdout).unwrap();
    assert_valid_sarif(&log);
    assert_eq!(log["runs"][0]["results"], serde_json::json!([]));
}

/// `check INPUT --dpi DPI FLAG=TARGET` is refused (exit 2) and TARGET,
/// an input, is left as it was.
fn assert_refused_over(input: &Path, dpi: &str, flag: &str, target: &Path) {
    let before = std::fs::read(target).unwrap();
    let e = cli(&[
        "check",
        s(input),
        "--dpi",
        dpi,
        &format!("{flag}={}", s(target)),
    ])
    .unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput, "{e}");
    assert_eq!(std::fs::read(target).unwrap(), before);
}

#[test]
fn check_refuses_unsafe_or_ambiguous_outputs() {
    let d = tmp("refuse");
    let fig = d.join("fig.svg");
    let svg = defective_svg();
    std::fs::write(&fig, &svg).unwrap();
    // Two formats on stdout: exit 2 before any work.
    let e = cli(&["check", s(&fig), "--sarif", "--junit"]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(e.to_string().contains("--sarif and --junit"), "{e}");
    let e = cli(&["check", s(&fig), "--json", "--sarif=-"]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    // Two formats into one file.
    let same = d.join("x.out");
    let e = cli(&[
        "check",
        s(&fig),
        &format!("--sarif={}", s(&same)),
        &format!("--junit={}", s(&same)),
    ])
    .unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    // Never over the input: refused, the input unchanged.
    assert_refused_over(&fig, "48", "--sarif", &fig);
    // An unwritable place: exit 3, naming the file.
    let e = cli(&[
        "check",
        s(&fig),
        "--dpi",
        "48",
        "--junit=/nonexistent-hueproof-folder/r.xml",
    ])
    .unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::OutputFailed);
    assert!(
        e.to_string().contains("/nonexistent-hueproof-folder/r.xml"),
        "{e}"
    );
}

#[test]
fn a_spec_input_points_findings_at_its_colours_and_text_colour() {
    let d = tmp("spec");
    let spec = d.join("choropleth.toml");
    cli(&["new", "choropleth", "-o", s(&spec)]).unwrap();
    // Five listed colours, two of them a red and a green of one lightness,
    // and light grey text on the white page.
    let mut text = std::fs::read_to_string(&spec).unwrap();
    text.push_str(
        "\n[colors]\nlist = [\"#f4ead8\", \"#e2b98a\", \"#d45f3c\", \"#5e8d3a\", \"#2b2b2b\"]\n\n[text]\ncolor = \"#d8d8d8\"\n",
    );
    std::fs::write(&spec, &text).unwrap();
    let out = cli(&["check", s(&spec), "--dpi", "72", "--sarif"]).unwrap();
    assert_eq!(out.kind, ExitKind::Findings);
    let log: serde_json::Value = serde_json::from_str(&out.stdout).unwrap();
    assert_valid_sarif(&log);
    let results = log["runs"][0]["results"].as_array().unwrap();
    assert!(results.iter().any(|r| r["ruleId"] == "HP108"));
    assert!(results.iter().any(|r| r["ruleId"] != "HP108"));
    // The spec's data is an input too: never overwritten.
    assert_refused_over(&spec, "72", "--json", &d.join("data/districts.csv"));
    let (list_line, color_line) = (
        line_of(&text, "list = ["),
        line_of(&text, "color = \"#d8d8d8\""),
    );
    for r in results {
        let want = if r["ruleId"] == "HP108" {
            color_line
        } else {
            list_line
        };
        assert_eq!(
            r["locations"][0]["physicalLocation"]["region"]["startLine"], want,
            "{r:#}"
        );
    }
}

#[test]
fn repeated_test_case_names_are_numbered() {
    // Two light captions give two text findings per view, one name.
    let svg = figure("#dddddd").replace(
        "</svg>",
        "<text x=\"90\" y=\"88\" font-size=\"9\" fill=\"#e4e4e4\">more</text>\n</svg>",
    );
    let report = report_of(&svg);
    let a = Audited::new(Path::new("fig.svg"), &report, Anchors::of_svg(&svg));
    let xml = junit::render(&[a], Severity::Error);
    let doc = roxmltree::Document::parse(&xml).unwrap();
    let names: Vec<&str> = doc
        .descendants()
        .filter(|n| n.has_tag_name("testcase"))
        .map(|n| attr(n, "name"))
        .collect();
    assert!(names.contains(&"HP108 text [normal]"), "{names:?}");
    assert!(names.contains(&"HP108 text [normal] #2"), "{names:?}");
    let mut unique = names.clone();
    unique.sort();
    unique.dedup();
    assert_eq!(unique.len(), names.len(), "{names:?}");
}
