//! The large-data path end to end: 200,000 polygons with shared borders
//! (the repository's boundary generator, `geo::generate::Grid`, winding
//! borders shared vertex for vertex) and a table of one value per polygon,
//! through every stage of `hueproof render` and `hueproof check`:
//!
//! - load: spec, GeoJSON read and validated, CSV read, joined by key,
//!   projected (`figure::load`);
//! - encode: quantile classification and the palette (`encode::encode`);
//! - layout: fitting to the page, topology-safe Visvalingam-Whyatt
//!   simplification of the shared borders, legend (`layout::layout`);
//! - SVG: the document text (`svg::write`);
//! - audit: the measured audit of that SVG, five default views, at a low
//!   resolution (100 dpi unless HUEPROOF_SCALE_DPI is set) so the run stays
//!   within a few minutes on a 2-core machine.
//!
//! The pipeline runs once in a fresh process, which reports each stage's
//! time and its peak resident memory so far (Linux VmHWM, which only
//! grows). The baseline, in the same run and also in a fresh process, is
//! parsing the same GeoJSON bytes into a generic `serde_json::Value`.
//! HUEPROOF_SCALE_POLYGONS changes the count.
//!
//! `cargo bench --bench scale`

mod common;

use std::path::Path;
use std::time::Duration;

use common::{Results, time};
use hueproof::audit::{self, Options};
use hueproof::scheme::SchemeKind;
use hueproof::{describe, encode, figure, layout, svg};

const CLASSES: usize = 7;

fn env(name: &str, default: f64) -> f64 {
    std::env::var(name)
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(default)
}

/// In a fresh process: the whole pipeline, one line per stage
/// `stage seconds peak_bytes`.
fn child_pipeline(spec: &Path, dpi: f64) {
    let peak = || common::peak_bytes().unwrap_or(0);
    let (t, fig) = time(|| figure::load(spec).unwrap());
    println!("load {} {}", t.as_secs_f64(), peak());
    let (t, enc) = time(|| encode::encode(&fig).unwrap());
    println!("encode {} {}", t.as_secs_f64(), peak());
    assert_eq!(
        enc.classification.as_ref().map(|c| c.counts.len()),
        Some(CLASSES)
    );
    let (t, scene) = time(|| {
        let title = describe::title(&fig);
        let description = describe::describe(&fig, &enc);
        layout::layout(&fig, &enc, &title, &description)
    });
    println!("layout {} {}", t.as_secs_f64(), peak());
    let (t, text) = time(|| svg::write(&scene));
    println!("svg {} {}", t.as_secs_f64(), peak());
    drop(scene);
    let mut opt = Options::new();
    opt.dpi = dpi;
    opt.scheme = Some(SchemeKind::Sequential);
    let (t, report) = time(|| audit::audit_svg(Path::new("scale.svg"), &text, &opt).unwrap());
    println!("audit {} {}", t.as_secs_f64(), peak());
    assert_eq!(report.classes.len(), CLASSES);
    println!(
        "info {} {} {}",
        text.len(),
        report.findings.len(),
        fig.warnings.len()
    );
}

/// In a fresh process: the baseline parse.
fn child_generic(geojson: &Path) {
    let (t, n) = time(|| {
        let bytes = std::fs::read(geojson).unwrap();
        let v: serde_json::Value = serde_json::from_slice(&bytes).unwrap();
        v["features"].as_array().map_or(0, |a| a.len())
    });
    println!(
        "generic {} {} {n}",
        t.as_secs_f64(),
        common::peak_bytes().unwrap_or(0)
    );
}

fn run_child(args: &[&str], path: &Path) -> Vec<Vec<String>> {
    common::run_child(args, path)
        .lines()
        .map(|l| l.split_whitespace().map(str::to_string).collect())
        .collect()
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    let dpi = env("HUEPROOF_SCALE_DPI", 100.0);
    if let Some(i) = args.iter().position(|a| a == "--child") {
        let path = Path::new(&args[i + 2]);
        match args[i + 1].as_str() {
            "generic" => child_generic(path),
            _ => child_pipeline(path, dpi),
        }
        return;
    }
    if !common::benchmarking("scale") {
        return;
    }
    let n = env("HUEPROOF_SCALE_POLYGONS", 200_000.0) as usize;
    let dir = std::env::temp_dir().join(format!("hueproof-bench-scale-{}", std::process::id()));
    let inputs = common::GridFigure {
        cells: n,
        per_border: 3,
        seeds: (0x5CA1_E000, 0x5CA1_E001),
        freq: 0.12,
        classes: CLASSES,
        dpi,
        border_width: "0.1pt",
    };
    let (t_gen, spec) = time(|| inputs.write(&dir));
    let geojson = dir.join("cells.geojson");
    let size = std::fs::metadata(&geojson).unwrap().len();
    println!(
        "scale: {n} polygons with shared borders, GeoJSON {:.1} MB, table {:.1} MB, \
         audit at {dpi} dpi, one run of each (generated in {:.1} s)",
        size as f64 / 1e6,
        std::fs::metadata(dir.join("values.csv")).unwrap().len() as f64 / 1e6,
        t_gen.as_secs_f64()
    );
    let base = run_child(&["--child", "generic"], &geojson);
    let secs = |s: &str| Duration::from_secs_f64(s.parse().unwrap());
    assert_eq!(base[0][3], n.to_string());
    let lines = run_child(&["--child", "pipeline"], &spec);
    let mut results = Results::new(
        "scale",
        "serde_json::Value parse of the GeoJSON",
        vec![secs(&base[0][1])],
    );
    let mut total = Duration::ZERO;
    let mut peak = 0u64;
    println!("  {:<10} {:>9} {:>22}", "stage", "s", "peak RSS so far, MB");
    for l in lines.iter().filter(|l| l[0] != "info") {
        let t = secs(&l[1]);
        total += t;
        peak = l[2].parse().unwrap();
        println!(
            "  {:<10} {:>9.2} {:>22.0}",
            l[0],
            t.as_secs_f64(),
            peak as f64 / 1e6
        );
        let label = match l[0].as_str() {
            "load" => "load: read, validate, join, project",
            "encode" => "encode: quantile classes, palette",
            "layout" => "layout: fit, simplify, legend",
            "svg" => "SVG text",
            "audit" => "audit, 5 views",
            other => other,
        };
        results.row(label, vec![t]);
    }
    results.row("end to end (sum of the stages)", vec![total]);
    let info = lines.iter().find(|l| l[0] == "info").unwrap();
    println!(
        "  SVG {:.1} MB, {} findings; peak memory of the whole run {:.0} MB ({:.2} x the GeoJSON; \
         the baseline parse peaked at {:.0} MB)",
        info[1].parse::<f64>().unwrap() / 1e6,
        info[2],
        peak as f64 / 1e6,
        peak as f64 / size as f64,
        base[0][2].parse::<f64>().unwrap() / 1e6
    );
    println!(
        "table-peak: {:.0} MB ({:.2} x the GeoJSON file)",
        peak as f64 / 1e6,
        peak as f64 / size as f64
    );
    results.print("");
    let _ = std::fs::remove_dir_all(&dir);
}
