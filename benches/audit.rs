//! The measured audit of a large choropleth, timed as a ratio to resvg's
//! rasterisation of the same SVG measured in the same run.
//!
//! The figure: 3,000 districts sharing their borders vertex for vertex
//! (the repository's boundary generator, `geo::generate::Grid`, winding
//! borders), coloured in 6 quantile classes from a smooth invented field
//! plus noise, rendered by hueproof's own pipeline (spec -> figure model
//! -> SVG) at 183 mm x 120 mm, 300 dpi (about 2,160 x 1,420 px).
//!
//! Plain timing harness (`harness = false`), interleaved runs, median and
//! minimum. Printed:
//!
//! - `raster`: `raster::parse` + `raster::render` of the SVG at 300 dpi,
//!   the code path the audit uses for its normal raster (the baseline);
//! - `audit`: `audit::audit_svg`, five default views, 300 dpi;
//! - the ratio audit / raster (aim: at most 1.3);
//! - a breakdown of the audit's stages, each timed on its own (in the
//!   audit the label SVG, label raster and geometry run beside the
//!   figure's parse and render, so the audit's time is about the longer of
//!   the two sides plus the reads and views).
//!
//! `cargo bench --bench audit`; `-- --once` runs the audit once and
//! prints its summary (for a profiler: `perf record ... --bench --once`).

mod common;

use std::path::Path;
use std::time::Duration;

use common::{Results, ms, stats, time};

use hueproof::audit::{self, Options, TEXT_MARGIN_PX, labels, measure};
use hueproof::color::Srgb;
use hueproof::scheme::SchemeKind;
use hueproof::vision::Simulation;
use hueproof::{figure, raster, render};

const SHAPES: usize = 3_000;
const CLASSES: usize = 6;
const DPI: f64 = 300.0;
const RUNS: usize = 7;

fn figure_svg() -> (String, Srgb) {
    let dir = std::env::temp_dir().join(format!("hueproof-bench-audit-{}", std::process::id()));
    let spec = common::GridFigure {
        cells: SHAPES,
        per_border: 4,
        seeds: (0x0A0D_17ED, 0x7AB1_E5EE_D000_0003),
        freq: 1.0,
        classes: CLASSES,
        dpi: DPI,
        border_width: "0.2pt",
    }
    .write(&dir);
    let fig = figure::load(&spec).unwrap();
    let bg = fig.page.background;
    let r = render::render(fig).unwrap();
    let _ = std::fs::remove_dir_all(&dir);
    (r.svg, bg)
}

fn ratio(a: Duration, b: Duration) -> f64 {
    a.as_secs_f64() / b.as_secs_f64()
}

fn main() {
    if !common::benchmarking("audit") {
        return;
    }
    let name = Path::new("bench.svg");
    let (svg, bg) = figure_svg();
    let mut opt = Options::new();
    opt.dpi = DPI;
    opt.scheme = Some(SchemeKind::Sequential);
    let rasterise = || {
        let doc = raster::parse(name, svg.as_bytes()).unwrap();
        raster::render(name, &doc, DPI, bg).unwrap()
    };
    let run_audit = || audit::audit_svg(name, &svg, &opt).unwrap();

    if std::env::args().any(|a| a == "--once") {
        let (t, r) = time(run_audit);
        println!(
            "audit --once: {} classes, {} findings, passed {}, {:.1} ms",
            r.classes.len(),
            r.findings.len(),
            r.passed,
            ms(t)
        );
        return;
    }

    let img = rasterise();
    let report = run_audit();
    println!(
        "audit: {SHAPES} shapes, {CLASSES} classes, {} x {} px at {DPI} dpi, SVG {:.1} MB, \
         {} views, median of {RUNS} runs, {} threads available",
        img.width,
        img.height,
        svg.len() as f64 / 1e6,
        opt.views.len(),
        rayon::current_num_threads()
    );
    println!(
        "  report: {} classes, {} contacts, {} findings, passed {}",
        report.classes.len(),
        report.contacts.len(),
        report.findings.len(),
        report.passed
    );
    assert_eq!(report.classes.len(), CLASSES);
    assert!(report.contacts.len() >= CLASSES - 1, "the classes touch");

    // Interleaved so that a change in machine load hits both alike.
    let one = rayon::ThreadPoolBuilder::new()
        .num_threads(1)
        .build()
        .unwrap();
    let (mut tr, mut ta, mut t1) = (vec![], vec![], vec![]);
    for _ in 0..RUNS {
        tr.push(time(|| std::hint::black_box(rasterise())).0);
        ta.push(time(|| std::hint::black_box(run_audit())).0);
        t1.push(one.install(|| time(|| std::hint::black_box(run_audit())).0));
    }
    let r_min = stats(&tr).1;
    let mut results = Results::new("audit", "resvg raster", tr);
    results.row("full audit, 5 views", ta);
    results.row("full audit, one thread", t1);
    results.print("the full audit at most 1.3 x the raster");

    // The stages on their own (each once per run, minimum kept), for
    // seeing where the time goes.
    let label = labels::label_svg(name, &svg).unwrap();
    let lab = labels::render_labels(name, &label, DPI).unwrap();
    let n = label.classes.ids.len();
    let geometry = measure::geometry(&lab, n, DPI);
    let mut stages: Vec<(&str, Duration)> = Vec::new();
    let mut add = |name: &'static str, d: Duration| match stages.iter_mut().find(|s| s.0 == name) {
        Some(s) => s.1 = s.1.min(d),
        None => stages.push((name, d)),
    };
    for _ in 0..3 {
        add(
            "parse (usvg)",
            time(|| raster::parse(name, svg.as_bytes())).0,
        );
        add("label SVG", time(|| labels::label_svg(name, &svg)).0);
        add(
            "label raster",
            time(|| labels::render_labels(name, &label, DPI)).0,
        );
        add(
            "geometry (with core mask)",
            time(|| measure::geometry(&lab, n, DPI)).0,
        );
        let boxes = measure::text_boxes(&lab, label.texts.len());
        let parts = labels::fill_label(n) as usize;
        let (t, reads) =
            time(|| measure::Reads::new(&img.rgba, &lab, &geometry, &boxes, TEXT_MARGIN_PX, parts));
        add("reads (pixels the views read)", t);
        add(
            "5 views from the reads",
            time(|| {
                for v in &opt.views {
                    let seen = reads.palette.simulate(&Simulation::new(v.view, opt.model));
                    for l in 0..parts as u16 {
                        std::hint::black_box(reads.part(&seen, l));
                    }
                    std::hint::black_box(reads.boundary(&seen, 0.5));
                }
            })
            .0,
        );
        add(
            "(whole-raster simulation x 4)",
            time(|| {
                for v in opt.views.iter().skip(1) {
                    let sim = Simulation::new(v.view, opt.model);
                    let mut buf = img.rgba.clone();
                    hueproof::vision::raster::simulate_rgba8(&sim, img.width as usize, &mut buf);
                    std::hint::black_box(&buf);
                }
            })
            .0,
        );
    }
    std::hint::black_box(&geometry);
    println!(
        "  stages (best of 3, each on its own, default pool; ratio to the raster's best; \
         the last is what the audit no longer does):"
    );
    for (s, d) in stages {
        println!("    {s:<32} {:>8.1} ms {:>6.2}", ms(d), ratio(d, r_min));
    }
}
