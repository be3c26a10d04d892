//! The bad-input catalogue: the `hueproof` binary, spawned, on bad specs,
//! data, shapes, SVG and arguments. Every case gets its expected exit code
//! (2 bad input, 3 output not written; 0 where a repair or a merge is
//! reported as a warning), a message that names the file and the line or
//! key and says what was expected, no crash (a panic would exit 101) and
//! no hang (a case is killed after 60 s). For every case the folder is
//! hashed before and after: the user's files are unchanged and nothing
//! was written.
//!
//! The scenario (six invented square districts A-F and a value each) is
//! demo data. The rules checked are the project's own (exit codes,
//! messages); where a case rests on an outside rule it is named: RFC 7946
//! (GeoJSON: closed rings, latitude range), RFC 4180 (CSV records), TOML
//! 1.0 (duplicate keys are invalid), XML 1.0 (well-formedness).

mod common;

use std::collections::BTreeMap;
use std::path::Path;
use std::process::Stdio;
use std::time::{Duration, Instant};

type Files = BTreeMap<String, Vec<u8>>;

const SPEC: &str = r#"[figure]
kind = "choropleth"
title = "Test districts"

[data]
table = "data.csv"
key = "key"
value = "v"
level = "ratio"

[map]
shapes = "shapes.geojson"
shape_key = "key"

[classes]
method = "quantile"
count = 3
"#;

/// Six unit squares, keys A-F, two rows of three.
fn shapes() -> serde_json::Value {
    let features: Vec<serde_json::Value> = "ABCDEF"
        .chars()
        .enumerate()
        .map(|(i, k)| {
            let (x, y) = (10.0 + (i % 3) as f64, 40.0 + (i / 3) as f64);
            serde_json::json!({
                "type": "Feature",
                "properties": {"key": k.to_string()},
                "geometry": {"type": "Polygon", "coordinates": [[
                    [x, y], [x + 1.0, y], [x + 1.0, y + 1.0], [x, y + 1.0], [x, y]
                ]]}
            })
        })
        .collect();
    serde_json::json!({"type": "FeatureCollection", "features": features})
}

fn base() -> Files {
    let mut f = Files::new();
    f.insert("fig.toml".into(), SPEC.into());
    f.insert(
        "data.csv".into(),
        "key,v\nA,1\nB,2\nC,3\nD,4\nE,5\nF,6\n".into(),
    );
    f.insert(
        "shapes.geojson".into(),
        serde_json::to_vec_pretty(&shapes()).unwrap(),
    );
    f
}

fn set(f: &mut Files, name: &str, text: &str) {
    f.insert(name.into(), text.as_bytes().to_vec());
}

fn edit(f: &mut Files, name: &str, from: &str, to: &str) {
    let text = String::from_utf8(f[name].clone()).unwrap();
    assert!(text.contains(from), "{name} has no '{from}'");
    set(f, name, &text.replacen(from, to, 1));
}

fn edit_shapes(f: &mut Files, change: impl Fn(&mut serde_json::Value)) {
    let mut v = shapes();
    change(&mut v);
    f.insert(
        "shapes.geojson".into(),
        serde_json::to_vec_pretty(&v).unwrap(),
    );
}

struct Case {
    name: &'static str,
    setup: fn(&mut Files),
    args: &'static [&'static str],
    code: i32,
    /// Fragments that must all appear in standard error (or output).
    expect: &'static [&'static str],
}

const fn case(
    name: &'static str,
    setup: fn(&mut Files),
    args: &'static [&'static str],
    code: i32,
    expect: &'static [&'static str],
) -> Case {
    Case {
        name,
        setup,
        args,
        code,
        expect,
    }
}

const BAD: i32 = 2;
const NOT_WRITTEN: i32 = 3;

fn nothing(_: &mut Files) {}

const RENDER: &[&str] = &["render", "fig.toml"];
const CHECK: &[&str] = &["check", "fig.toml"];

fn cases() -> Vec<Case> {
    vec![
        // Spec files (TOML 1.0).
        case(
            "toml: unclosed table header",
            |f| set(f, "fig.toml", "[figure\nkind = \"choropleth\"\n"),
            RENDER,
            BAD,
            &["fig.toml", "line 1", "expected ']'"],
        ),
        case(
            "toml: unterminated string",
            |f| edit(f, "fig.toml", "\"Test districts\"", "\"Test districts"),
            RENDER,
            BAD,
            &["fig.toml", "line 3"],
        ),
        case(
            "toml: duplicate key (invalid in TOML 1.0)",
            |f| edit(f, "fig.toml", "title = ", "title = \"A\"\ntitle = "),
            RENDER,
            BAD,
            &["fig.toml", "line 4", "duplicate key"],
        ),
        case(
            "spec: a string where a whole number goes",
            |f| edit(f, "fig.toml", "count = 3", "count = \"three\""),
            RENDER,
            BAD,
            &[
                "fig.toml",
                "line 17",
                "\"three\"",
                "expected a whole number",
            ],
        ),
        case(
            "spec: a number where text goes",
            |f| edit(f, "fig.toml", "level = \"ratio\"", "level = 3"),
            RENDER,
            BAD,
            &["fig.toml", "line 9", "integer"],
        ),
        case(
            "spec: unknown key",
            |f| edit(f, "fig.toml", "method = ", "methd = "),
            RENDER,
            BAD,
            &["fig.toml", "line 16", "unknown key 'methd'", "'method'"],
        ),
        case(
            "spec: not UTF-8 text",
            |f| {
                f.insert("fig.toml".into(), vec![0xff, 0xfe, b'[', 0x00, 0x81]);
            },
            RENDER,
            BAD,
            &["fig.toml"],
        ),
        case(
            "spec: missing file",
            nothing,
            &["render", "nope.toml"],
            BAD,
            &["nope.toml", "cannot read"],
        ),
        case(
            "spec: a folder, not a file",
            |f| set(f, "folder.toml/keep", ""),
            &["render", "folder.toml"],
            BAD,
            &["folder.toml"],
        ),
        // Data tables (RFC 4180 CSV).
        case(
            "data: missing file",
            |f| {
                f.remove("data.csv");
            },
            RENDER,
            BAD,
            &["data.csv", "cannot read"],
        ),
        case(
            "data: empty file",
            |f| set(f, "data.csv", ""),
            RENDER,
            BAD,
            &["data.csv", "line 1", "empty", "header row"],
        ),
        case(
            "data: a header and no rows",
            |f| set(f, "data.csv", "key,v\n"),
            RENDER,
            BAD,
            &["fig.toml", "data.value", "'v'", "no number"],
        ),
        case(
            "data: every value missing",
            |f| set(f, "data.csv", "key,v\nA,\nB,\nC,\nD,\nE,\nF,\n"),
            RENDER,
            BAD,
            &[
                "fig.toml",
                "data.value",
                "'v'",
                "all 6 item(s) of the figure are missing",
            ],
        ),
        case(
            "data: NaN",
            |f| edit(f, "data.csv", "C,3", "C,NaN"),
            RENDER,
            BAD,
            &["data.csv", "line 4", "column 'v'", "'NaN' is not a number"],
        ),
        case(
            "data: infinite value",
            |f| edit(f, "data.csv", "C,3", "C,inf"),
            RENDER,
            BAD,
            &["data.csv", "line 4", "column 'v'", "'inf' is not a number"],
        ),
        case(
            "data: text in a numeric column",
            |f| edit(f, "data.csv", "E,5", "E,five"),
            RENDER,
            BAD,
            &["data.csv", "line 6", "'five' is not a number", "ratio"],
        ),
        case(
            "data: duplicate key",
            |f| edit(f, "data.csv", "D,4", "C,4"),
            RENDER,
            BAD,
            &["data.csv", "line 5", "key 'C' appears again", "line 4"],
        ),
        case(
            "data: a record with an extra field (RFC 4180)",
            |f| edit(f, "data.csv", "B,2", "B,2,7"),
            RENDER,
            BAD,
            &["data.csv", "line 3", "expected 2 fields"],
        ),
        case(
            "data: one distinct value (classes merged, said)",
            |f| set(f, "data.csv", "key,v\nA,5\nB,5\nC,5\nD,5\nE,5\nF,5\n"),
            CHECK,
            0,
            &["warning", "1 classes instead of 3"],
        ),
        // Boundaries (RFC 7946 GeoJSON, TopoJSON).
        case(
            "geojson: missing file",
            |f| {
                f.remove("shapes.geojson");
            },
            RENDER,
            BAD,
            &["fig.toml", "map.shapes", "no such file", "shapes.geojson"],
        ),
        case(
            "geojson: malformed JSON",
            |f| {
                set(
                    f,
                    "shapes.geojson",
                    "{\"type\": \"FeatureCollection\", \"features\": [\n",
                )
            },
            RENDER,
            BAD,
            &["shapes.geojson", "not valid GeoJSON", "line 2"],
        ),
        case(
            "geojson: a ring that is not closed (RFC 7946 3.1.6; closed, said)",
            |f| {
                edit_shapes(f, |v| {
                    let ring = v["features"][0]["geometry"]["coordinates"][0]
                        .as_array_mut()
                        .unwrap();
                    ring.pop();
                })
            },
            CHECK,
            0,
            &[
                "shapes.geojson",
                "feature 0 ('A')",
                "ring is not closed",
                "ring closed",
            ],
        ),
        case(
            "geojson: latitude outside -90..90 (RFC 7946 3.1.1)",
            |f| {
                edit_shapes(f, |v| {
                    v["features"][0]["geometry"]["coordinates"][0][1][1] = 95.into()
                })
            },
            RENDER,
            BAD,
            &[
                "shapes.geojson",
                "feature 0 ('A')",
                "latitude 95",
                "-90..90",
            ],
        ),
        case(
            "geojson: a position with one number",
            |f| {
                edit_shapes(f, |v| {
                    v["features"][1]["geometry"]["coordinates"][0][2] = serde_json::json!([11.0])
                })
            },
            RENDER,
            BAD,
            &[
                "shapes.geojson",
                "feature 1 ('B')",
                "not two finite numbers",
            ],
        ),
        case(
            "topojson: malformed JSON",
            |f| {
                set(
                    f,
                    "s.topojson",
                    "{\"type\":\"Topology\",\"objects\":{},\"arcs\":[[[0,0],[1\n",
                );
                edit(f, "fig.toml", "shapes.geojson", "s.topojson");
            },
            RENDER,
            BAD,
            &["s.topojson", "not well-formed JSON", "line 2"],
        ),
        case(
            "topojson: no objects",
            |f| {
                set(
                    f,
                    "s.topojson",
                    "{\"type\":\"Topology\",\"objects\":{},\"arcs\":[]}\n",
                );
                edit(f, "fig.toml", "shapes.geojson", "s.topojson");
            },
            RENDER,
            BAD,
            &["s.topojson", "object"],
        ),
        // Colours.
        case(
            "colours: unknown colour name",
            |f| {
                let s = format!("{SPEC}\n[colors]\nlist = [\"red\", \"blurple\", \"blue\"]\n");
                set(f, "fig.toml", &s)
            },
            RENDER,
            BAD,
            &[
                "fig.toml",
                "line 20",
                "colors.list.1",
                "'blurple'",
                "expected a colour",
            ],
        ),
        case(
            "colours: fewer colours than classes",
            |f| {
                let s = format!("{SPEC}\n[colors]\nlist = [\"red\", \"blue\"]\n");
                set(f, "fig.toml", &s)
            },
            RENDER,
            BAD,
            &["fig.toml", "colors.list", "2 colour(s)", "3 classes"],
        ),
        // SVG given to check (XML 1.0).
        case(
            "svg: missing file",
            nothing,
            &["check", "nope.svg"],
            BAD,
            &["nope.svg", "cannot read"],
        ),
        case(
            "svg: not well-formed",
            |f| {
                set(
                    f,
                    "f.svg",
                    "<svg xmlns=\"http://www.w3.org/2000/svg\"><g></svg>\n",
                )
            },
            &["check", "f.svg"],
            BAD,
            &["f.svg", "not a readable SVG", "1:"],
        ),
        case(
            "svg: entity-expansion DOCTYPE",
            |f| {
                set(
                    f,
                    "e.svg",
                    "<?xml version=\"1.0\"?>\n<!DOCTYPE svg [<!ENTITY a \"aaaaaaaaaa\"><!ENTITY b \"&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;\"><!ENTITY c \"&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;\">]>\n<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"10\" height=\"10\"><text>&c;</text></svg>\n",
                )
            },
            &["check", "e.svg"],
            BAD,
            &["e.svg", "entities", "refused"],
        ),
        case(
            "check: neither a spec nor an SVG",
            nothing,
            &["check", "data.csv"],
            BAD,
            &[
                "data.csv",
                "expected a figure spec (.toml) or an SVG file (.svg)",
            ],
        ),
        // Arguments.
        case(
            "--views: unknown view",
            nothing,
            &["check", "fig.toml", "--views", "protanopia,martian"],
            BAD,
            &["--views", "'martian'", "expected one of"],
        ),
        case(
            "--threshold: not a number",
            nothing,
            &["check", "fig.toml", "--threshold", "text_contrast=abc"],
            BAD,
            &["--threshold", "'abc' is not a number"],
        ),
        case(
            "--threshold: unknown name",
            nothing,
            &["check", "fig.toml", "--threshold", "nosuch=3"],
            BAD,
            &["--threshold", "'nosuch'", "expected one of"],
        ),
        case(
            "--dpi: out of range",
            nothing,
            &["check", "fig.toml", "--dpi", "5"],
            BAD,
            &["--dpi 5", "between 10 and 1200"],
        ),
        case(
            "--viewing-distance: negative",
            nothing,
            &["check", "fig.toml", "--viewing-distance=-3"],
            BAD,
            &["--viewing-distance -3", "centimetres"],
        ),
        case(
            "--format: unknown format",
            nothing,
            &["render", "fig.toml", "--format", "svg,gif"],
            BAD,
            &["--format", "'gif'", "svg, png, pdf"],
        ),
        case(
            "--jobs 0",
            nothing,
            &["render", "fig.toml", "--jobs", "0"],
            BAD,
            &["--jobs", "at least 1"],
        ),
        case(
            "a glob that matches nothing",
            nothing,
            &["render", "maps/*.toml"],
            BAD,
            &["'maps/*.toml'", "matches no file"],
        ),
        case(
            "two exports to one file",
            nothing,
            &["check", "fig.toml", "--json=x.json", "--sarif=x.json"],
            BAD,
            &["--json", "--sarif", "'x.json'"],
        ),
        // Outputs.
        case(
            "an export over an input",
            nothing,
            &["check", "fig.toml", "--json=data.csv"],
            BAD,
            &["'data.csv' is also an input"],
        ),
        case(
            "a batch export over an input",
            |f| set(f, "g.toml", SPEC),
            &["check", "fig.toml", "g.toml", "--sarif=data.csv"],
            BAD,
            &["'data.csv' is also an input"],
        ),
        case(
            "unwritable output folder (below a regular file)",
            |f| set(f, "afile", "mine\n"),
            &["render", "fig.toml", "-o", "afile/sub/fig.svg"],
            NOT_WRITTEN,
            &["cannot write", "afile/sub"],
        ),
        case(
            "unwritable export (below a regular file)",
            |f| set(f, "afile", "mine\n"),
            &["check", "fig.toml", "--junit=afile/report.xml"],
            NOT_WRITTEN,
            &["cannot write", "afile/report.xml"],
        ),
        case(
            "batch: two specs that would write the same files",
            |f| {
                for d in ["a", "b"] {
                    let s = SPEC
                        .replace("\"data.csv\"", "\"../data.csv\"")
                        .replace("\"shapes.geojson\"", "\"../shapes.geojson\"");
                    set(f, &format!("{d}/fig.toml"), &s);
                }
            },
            &["render", "a/fig.toml", "b/fig.toml", "-o", "out"],
            BAD,
            &["a/fig.toml", "b/fig.toml", "out/fig"],
        ),
        case(
            "batch: -o names a file",
            |f| {
                set(f, "g.toml", SPEC);
                set(f, "afile", "mine\n");
            },
            &["render", "fig.toml", "g.toml", "-o", "afile"],
            BAD,
            &["'afile' is a file", "names a folder"],
        ),
    ]
}

/// Every file below `dir`, by relative path, with its bytes.
fn snapshot(dir: &Path) -> Files {
    fn walk(root: &Path, dir: &Path, out: &mut Files) {
        for e in std::fs::read_dir(dir).unwrap() {
            let p = e.unwrap().path();
            if p.is_dir() {
                walk(root, &p, out);
            } else {
                let rel = p.strip_prefix(root).unwrap().to_string_lossy().into_owned();
                out.insert(rel, std::fs::read(&p).unwrap());
            }
        }
    }
    let mut out = Files::new();
    walk(dir, dir, &mut out);
    out
}

/// Run the binary in `dir`, killing it after 60 s.
fn run(dir: &Path, args: &[&str]) -> (Option<i32>, String) {
    let mut child = common::hueproof_command(dir, args)
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    let start = Instant::now();
    while child.try_wait().unwrap().is_none() {
        if start.elapsed() > Duration::from_secs(60) {
            let _ = child.kill();
            panic!("{args:?} hung for 60 s");
        }
        std::thread::sleep(Duration::from_millis(20));
    }
    let out = child.wait_with_output().unwrap();
    let text =
        String::from_utf8_lossy(&out.stderr).into_owned() + &String::from_utf8_lossy(&out.stdout);
    (out.status.code(), text)
}

#[test]
fn every_bad_input_gets_its_message_and_code_and_changes_nothing() {
    let cases = cases();
    assert!(cases.len() >= 30, "{} cases", cases.len());
    let mut failures = Vec::new();
    for (i, c) in cases.iter().enumerate() {
        let dir = common::scratch("bad-inputs", &format!("{i:02}"));
        let mut files = base();
        (c.setup)(&mut files);
        for (name, bytes) in &files {
            let p = dir.join(name);
            std::fs::create_dir_all(p.parent().unwrap()).unwrap();
            std::fs::write(p, bytes).unwrap();
        }
        let before = snapshot(&dir);
        let (code, text) = run(&dir, c.args);
        let after = snapshot(&dir);
        // Shown with --nocapture: the catalogue's messages, for review.
        eprintln!(
            "{} -> {code:?}\n  {}",
            c.name,
            text.trim().replace('\n', "\n  ")
        );
        let mut problems = Vec::new();
        if code != Some(c.code) {
            problems.push(format!("exit code {code:?}, expected {}", c.code));
        }
        for e in c.expect {
            if !text.contains(e) {
                problems.push(format!("no '{e}' in the message"));
            }
        }
        if text.contains("panicked") {
            problems.push("a panic".into());
        }
        if before != after {
            let changed: Vec<&String> = after
                .keys()
                .chain(before.keys())
                .filter(|k| before.get(*k) != after.get(*k))
                .collect();
            problems.push(format!("files changed or written: {changed:?}"));
        }
        if problems.is_empty() {
            let _ = std::fs::remove_dir_all(&dir);
        } else {
            failures.push(format!(
                "{}: {}\n  output: {}",
                c.name,
                problems.join("; "),
                text.trim()
            ));
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}
