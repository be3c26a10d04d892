//! Batch runs of the `hueproof` binary (spawned): many specs and globs at
//! once, results in input order, a run that goes on past a bad figure and
//! ends with one exit code, the same bytes for every `--jobs`, and an
//! interrupted run (SIGINT) that leaves only complete files and no
//! temporary ones. The batch's SARIF log is checked against the OASIS
//! SARIF 2.1.0 schema (tests/fixtures/sarif-schema-2.1.0.json) with a
//! general-purpose validator (`boon`), and its JUnit XML read back with a
//! general-purpose XML parser (`roxmltree`). The figures are the built-in
//! templates over the invented demo data.

mod common;

use std::collections::BTreeMap;
use std::io::{BufRead, BufReader};
use std::path::Path;
use std::process::{Command, Output, Stdio};

fn hueproof(dir: &Path, args: &[&str]) -> Output {
    common::hueproof_command(dir, args).output().unwrap()
}

/// A folder `specs/` with `n` copies of the choropleth template (c00 ...)
/// and one of the dot plot, sharing the demo data in `specs/data/`.
fn batch(name: &str, n: usize) -> std::path::PathBuf {
    let d = common::scratch("batch", name);
    let specs = d.join("specs");
    std::fs::create_dir_all(&specs).unwrap();
    for t in ["choropleth", "dot-plot"] {
        let o = hueproof(&specs, &["new", t, "-o", &format!("{t}.toml")]);
        assert!(o.status.success(), "{o:?}");
    }
    for i in 0..n {
        std::fs::copy(
            specs.join("choropleth.toml"),
            specs.join(format!("c{i:02}.toml")),
        )
        .unwrap();
    }
    std::fs::remove_file(specs.join("choropleth.toml")).unwrap();
    d
}

/// Every file below `dir` with its bytes.
fn files(dir: &Path) -> BTreeMap<String, Vec<u8>> {
    let mut out = BTreeMap::new();
    if !dir.exists() {
        return out;
    }
    for e in std::fs::read_dir(dir).unwrap() {
        let p = e.unwrap().path();
        if p.is_file() {
            out.insert(
                p.file_name().unwrap().to_string_lossy().into_owned(),
                std::fs::read(&p).unwrap(),
            );
        }
    }
    out
}

#[test]
fn a_batch_goes_past_a_bad_figure_and_gives_the_same_bytes_for_every_job_count() {
    let d = batch("jobs", 3);
    // One bad spec in the middle of the sorted list.
    std::fs::write(d.join("specs/c01b.toml"), "[figure\n").unwrap();
    let mut runs = Vec::new();
    for jobs in ["1", "2", "3"] {
        let out = "out";
        let _ = std::fs::remove_dir_all(d.join(out));
        let r = hueproof(
            &d,
            &[
                "render",
                "specs/c*.toml",
                "specs/dot-plot.toml",
                "specs/c00.toml",
                "-o",
                out,
                "--format",
                "svg,png",
                "--jobs",
                jobs,
            ],
        );
        let c = hueproof(
            &d,
            &[
                "check",
                "specs/*.toml",
                "--jobs",
                jobs,
                "--json=check.json",
                "--sarif=check.sarif",
                "--junit=check.xml",
            ],
        );
        // The bad spec makes the whole run "bad input" (2), the most
        // serious class seen; the good ones were still written.
        assert_eq!(r.status.code(), Some(2), "{r:?}");
        assert_eq!(c.status.code(), Some(2), "{c:?}");
        let stdout = String::from_utf8(r.stdout).unwrap();
        assert!(
            stdout.ends_with("5 inputs: 4 written, 1 bad input; exit code 2\n"),
            "{stdout}"
        );
        let order: Vec<&str> = stdout.lines().filter(|l| l.starts_with("== ")).collect();
        assert_eq!(
            order,
            [
                "== specs/c00.toml ==",
                "== specs/c01.toml ==",
                "== specs/c01b.toml ==",
                "== specs/c02.toml ==",
                "== specs/dot-plot.toml =="
            ],
            "sorted, de-duplicated input order"
        );
        assert!(stdout.contains("== specs/c01b.toml ==\nerror: specs/c01b.toml: line 1"));
        let stderr = String::from_utf8(r.stderr).unwrap();
        assert_eq!(
            stderr.lines().filter(|l| l.starts_with('[')).count(),
            5,
            "one progress line per figure: {stderr}"
        );
        let written = files(&d.join(out));
        assert_eq!(written.len(), 8, "{:?}", written.keys());
        let check_out = String::from_utf8(c.stdout).unwrap();
        let exports: Vec<Vec<u8>> = ["json", "sarif", "xml"]
            .iter()
            .map(|e| std::fs::read(d.join(format!("check.{e}"))).unwrap())
            .collect();
        runs.push((stdout, written, check_out, exports));
    }
    for r in &runs[1..] {
        assert!(r.0 == runs[0].0, "render stdout differs between job counts");
        assert!(r.1 == runs[0].1, "rendered files differ between job counts");
        assert!(r.2 == runs[0].2, "check stdout differs between job counts");
        assert!(r.3 == runs[0].3, "exports differ between job counts");
    }

    // JSON: one entry per input, in input order (shape documented in README).
    let json: serde_json::Value = serde_json::from_slice(&runs[0].3[0]).unwrap();
    let entries = json.as_array().unwrap();
    assert_eq!(entries.len(), 5);
    assert_eq!(entries[2]["input"], "specs/c01b.toml");
    assert_eq!(entries[2]["error"]["exit_code"], 2);
    assert!(entries[0]["report"]["passed"].is_boolean());

    // SARIF: one run for the whole batch, valid against the OASIS schema.
    let sarif: serde_json::Value = serde_json::from_slice(&runs[0].3[1]).unwrap();
    assert_eq!(sarif["runs"].as_array().unwrap().len(), 1);
    let (schemas, index) = common::sarif_schema();
    if let Err(e) = schemas.validate(&sarif, index) {
        panic!("the batch SARIF log is not valid SARIF 2.1.0: {e}");
    }

    // JUnit: one testsuite per audited figure (the bad spec has none).
    let xml = String::from_utf8(runs[0].3[2].clone()).unwrap();
    let doc = roxmltree::Document::parse(&xml).unwrap();
    let suites: Vec<&str> = doc
        .descendants()
        .filter(|n| n.has_tag_name("testsuite"))
        .map(|n| n.attribute("name").unwrap())
        .collect();
    assert_eq!(
        suites,
        [
            "specs/c00.toml",
            "specs/c01.toml",
            "specs/c02.toml",
            "specs/dot-plot.toml"
        ]
    );
}

#[test]
fn an_interrupted_batch_leaves_only_complete_files() {
    let d = batch("interrupt", 9);
    let args = |out: &str| -> Vec<String> {
        ["render", "specs/*.toml", "-o", out, "--format", "svg,png"]
            .iter()
            .map(|s| s.to_string())
            .collect()
    };
    let full = hueproof(
        &d,
        &args("full").iter().map(String::as_str).collect::<Vec<_>>(),
    );
    assert_eq!(full.status.code(), Some(0), "{full:?}");
    let reference = files(&d.join("full"));
    assert_eq!(reference.len(), 20);

    let mut cut_args = args("cut");
    cut_args.extend(["--jobs".to_string(), "1".to_string()]);
    let mut child =
        common::hueproof_command(&d, &cut_args.iter().map(String::as_str).collect::<Vec<_>>())
            .stdout(Stdio::piped())
            .stderr(Stdio::piped())
            .spawn()
            .unwrap();
    // Interrupt once two figures are done (one progress line each).
    let mut stderr = BufReader::new(child.stderr.take().unwrap());
    let mut seen = String::new();
    for _ in 0..2 {
        let mut line = String::new();
        stderr.read_line(&mut line).unwrap();
        seen.push_str(&line);
    }
    let kill = Command::new("kill")
        .args(["-INT", &child.id().to_string()])
        .status()
        .unwrap();
    assert!(kill.success());
    let mut rest = String::new();
    std::io::Read::read_to_string(&mut stderr, &mut rest).unwrap();
    let out = child.wait_with_output().unwrap();
    assert_eq!(out.status.code(), Some(130), "{seen}{rest}");
    let stdout = String::from_utf8(out.stdout).unwrap();
    assert!(stdout.contains("not started"), "{stdout}");
    assert!(stdout.contains("(interrupted); exit code 130"), "{stdout}");

    let cut = files(&d.join("cut"));
    assert!(
        cut.len() >= 4 && cut.len() < reference.len(),
        "{:?}",
        cut.keys()
    );
    for (name, bytes) in &cut {
        assert!(!name.ends_with(".tmp"), "temporary file left: {name}");
        assert!(
            reference.get(name) == Some(bytes),
            "{name} differs from the one a full run writes"
        );
    }
}
