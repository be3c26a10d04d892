//! Measuring and printing shared by every benchmark: timings of each
//! measurement against a baseline measured in the same run, printed in one
//! format. Each result is a ratio to its baseline so that the figures keep
//! their meaning on a loaded machine; the absolute times are printed too.
//!
//! Every bench prints a human table and, for each row, a line
//! `table: | bench | measurement | median ms | ratio (median) | ratio (min) | runs |`
//! that `benches/table.sh` collects into the README's performance table.

#![allow(dead_code)] // each bench uses its part

use std::time::{Duration, Instant};

/// Whether the process was started by `cargo bench` (which passes
/// `--bench`); `cargo test --benches` does not, and the bench then only
/// says how to run it.
pub fn benchmarking(name: &str) -> bool {
    let yes = std::env::args().any(|a| a == "--bench");
    if !yes {
        println!("{name}: run with `cargo bench --bench {name}`");
    }
    yes
}

/// Time one call.
pub fn time<T>(f: impl FnOnce() -> T) -> (Duration, T) {
    let t = Instant::now();
    let v = f();
    (t.elapsed(), v)
}

/// Median and minimum of a set of timings.
pub fn stats(t: &[Duration]) -> (Duration, Duration) {
    let mut t = t.to_vec();
    t.sort();
    (t[t.len() / 2], t[0])
}

/// Milliseconds.
pub fn ms(d: Duration) -> f64 {
    d.as_secs_f64() * 1e3
}

/// The peak resident memory of this process so far (Linux `VmHWM`), bytes.
pub fn peak_bytes() -> Option<u64> {
    let s = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = s.lines().find(|l| l.starts_with("VmHWM:"))?;
    let kb: u64 = line.split_whitespace().nth(1)?.parse().ok()?;
    Some(kb * 1024)
}

/// One benchmark's results: the baseline and the measurements, each a
/// list of repeated timings.
pub struct Results {
    bench: &'static str,
    baseline: (String, Vec<Duration>),
    rows: Vec<(String, Vec<Duration>)>,
}

impl Results {
    /// Results of `bench` against `baseline` (its label and timings).
    pub fn new(bench: &'static str, baseline: &str, times: Vec<Duration>) -> Results {
        Results {
            bench,
            baseline: (baseline.to_string(), times),
            rows: Vec::new(),
        }
    }

    /// Add a measurement.
    pub fn row(&mut self, label: &str, times: Vec<Duration>) {
        self.rows.push((label.to_string(), times));
    }

    /// Print the table (ratios of median to median and minimum to
    /// minimum), then `aim`, then the lines for the README table.
    pub fn print(&self, aim: &str) {
        let (b_med, b_min) = stats(&self.baseline.1);
        println!(
            "  {:<40} {:>10} {:>10} {:>11} {:>10} {:>5}",
            "", "median ms", "min ms", "ratio(med)", "ratio(min)", "runs"
        );
        let all = std::iter::once(&self.baseline).chain(&self.rows);
        let mut lines = Vec::new();
        for (i, (label, t)) in all.enumerate() {
            let (med, min) = stats(t);
            let (rm, rn) = (
                med.as_secs_f64() / b_med.as_secs_f64(),
                min.as_secs_f64() / b_min.as_secs_f64(),
            );
            let label = if i == 0 {
                format!("{label} (baseline)")
            } else {
                label.clone()
            };
            println!(
                "  {label:<40} {:>10.1} {:>10.1} {rm:>11.2} {rn:>10.2} {:>5}",
                ms(med),
                ms(min),
                t.len()
            );
            lines.push(format!(
                "table: | {} | {label} | {:.1} | {rm:.2} | {rn:.2} | {} |",
                self.bench,
                ms(med),
                t.len()
            ));
        }
        if !aim.is_empty() {
            println!("  aim: {aim}");
        }
        for l in lines {
            println!("{l}");
        }
    }
}

/// A generated choropleth for the benches: `cells` grid cells with shared
/// winding borders (`geo::generate::Grid`), one value per cell from a
/// smooth field (`freq` scales its wavelengths) plus noise, so neighbours
/// tend to share a class as on a real map, and a quantile spec. Written
/// into `dir`; returns the spec's path.
pub struct GridFigure {
    /// Number of cells.
    pub cells: usize,
    /// Intermediate vertices per border.
    pub per_border: usize,
    /// Seeds of the borders and of the values.
    pub seeds: (u64, u64),
    /// Spatial frequency of the value field (1: the audit bench's).
    pub freq: f64,
    /// Quantile classes.
    pub classes: usize,
    /// The figure's DPI.
    pub dpi: f64,
    /// Border width, e.g. `0.2pt`.
    pub border_width: &'static str,
}

impl GridFigure {
    /// Write `cells.geojson`, `values.csv` and `figure.toml` into `dir`.
    pub fn write(&self, dir: &std::path::Path) -> std::path::PathBuf {
        use hueproof::geo::generate::Grid;
        use hueproof::random::SplitMix64;
        std::fs::create_dir_all(dir).unwrap();
        let grid = Grid::new(self.cells, self.per_border, self.seeds.0);
        std::fs::write(dir.join("cells.geojson"), grid.geojson()).unwrap();
        let mut rng = SplitMix64(self.seeds.1);
        let mut csv = String::with_capacity(self.cells * 16);
        csv.push_str("code,value\n");
        let f = self.freq;
        for c in 0..self.cells {
            let (x, y) = ((c % grid.nx) as f64, (c / grid.nx) as f64);
            let field =
                (x * 0.11 * f).sin() + (y * 0.13 * f).cos() + 0.5 * ((x + y) * 0.05 * f).sin();
            let v = 100.0 * (0.5 * field + 0.4 * (rng.uniform() - 0.5)).exp();
            csv.push_str(&format!("C{c},{v:.2}\n"));
        }
        std::fs::write(dir.join("values.csv"), csv).unwrap();
        let (n, dpi, classes, bw) = (self.cells, self.dpi, self.classes, self.border_width);
        let spec = format!(
            r#"[figure]
kind = "choropleth"
width = "183mm"
height = "120mm"
title = "Invented index by cell"
subtitle = "{n} cells, quantile classes"
source = "Generated for the benchmark (invented)"
dpi = {dpi}

[data]
table = "values.csv"
key = "code"
value = "value"
level = "ratio"
label = "Index"

[map]
shapes = "cells.geojson"
shape_key = "code"
border_color = "white"
border_width = "{bw}"

[classes]
method = "quantile"
count = {classes}
"#
        );
        let p = dir.join("figure.toml");
        std::fs::write(&p, spec).unwrap();
        p
    }
}

/// Run this bench's executable with `args` and `path` in a fresh process
/// (for a clean peak memory); its standard output.
pub fn run_child(args: &[&str], path: &std::path::Path) -> String {
    let out = std::process::Command::new(std::env::current_exe().unwrap())
        .args(args)
        .arg(path)
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8(out.stdout).unwrap()
}
