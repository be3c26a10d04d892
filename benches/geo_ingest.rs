//! Ingest benchmark: read and project a large generated GeoJSON file
//! (N grid cells with shared borders, default N = 200,000; set
//! HUEPROOF_BENCH_POLYGONS to change it), reported as MB/s and as a ratio
//! to parsing the same bytes into a generic `serde_json::Value` in the same
//! run. Each side runs three times in a fresh process (best time kept); its
//! peak memory (Linux VmHWM of that process) is reported against the file
//! size.
//!
//! `cargo bench --bench geo_ingest`

use std::time::Instant;

use hueproof::geo::extent::Extent;
use hueproof::geo::generate::Grid;
use hueproof::geo::measure::geometry_area;
use hueproof::geo::projection::{Ellipsoid, Purpose, choose_projection};
use hueproof::geo::{CoordinateKind, KeySource, ReadOptions, read_geojson_file};

fn status_kb(field: &str) -> Option<u64> {
    let s = std::fs::read_to_string("/proc/self/status").ok()?;
    let line = s.lines().find(|l| l.starts_with(field))?;
    line.split_whitespace().nth(1)?.parse().ok()
}

/// One measured run, in this process: prints "seconds peak_bytes".
fn child(mode: &str, path: &std::path::Path) {
    let t = Instant::now();
    let check = match mode {
        "generic" => {
            let bytes = std::fs::read(path).unwrap();
            let v: serde_json::Value = serde_json::from_slice(&bytes).unwrap();
            v["features"].as_array().map_or(0, |a| a.len())
        }
        _ => {
            let opts = ReadOptions {
                key: Some(KeySource::Property("code".into())),
                repair: false,
                coordinates: CoordinateKind::Geographic,
            };
            let layer = read_geojson_file(path, &opts).unwrap();
            let ext = Extent::of(layer.usable().flat_map(|(_, g)| g.coords()));
            let choice = choose_projection(
                ext,
                layer.coordinates(),
                None,
                Ellipsoid::wgs84(),
                Purpose::Areal,
            )
            .unwrap();
            let projected: Vec<_> = layer
                .usable()
                .map(|(_, g)| choice.projection.project_geometry(g, 0.0).unwrap())
                .collect();
            let area: f64 = projected.iter().map(geometry_area).sum();
            assert!(area > 0.0);
            projected.len()
        }
    };
    let dt = t.elapsed().as_secs_f64();
    let peak = status_kb("VmHWM:").map_or(0, |k| k * 1024);
    println!("{dt} {peak} {check}");
}

/// Run `mode` in a fresh process `runs` times: best time, largest peak.
fn measure(mode: &str, path: &std::path::Path, runs: usize) -> (f64, u64, usize) {
    let exe = std::env::current_exe().unwrap();
    let mut best = f64::INFINITY;
    let mut peak = 0;
    let mut count = 0;
    for _ in 0..runs {
        let out = std::process::Command::new(&exe)
            .args(["--child", mode])
            .arg(path)
            .output()
            .unwrap();
        assert!(
            out.status.success(),
            "{}",
            String::from_utf8_lossy(&out.stderr)
        );
        let s = String::from_utf8(out.stdout).unwrap();
        let v: Vec<&str> = s.split_whitespace().collect();
        best = best.min(v[0].parse().unwrap());
        peak = peak.max(v[1].parse().unwrap());
        count = v[2].parse().unwrap();
    }
    (best, peak, count)
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if let Some(i) = args.iter().position(|a| a == "--child") {
        child(&args[i + 1], std::path::Path::new(&args[i + 2]));
        return;
    }
    let n: usize = std::env::var("HUEPROOF_BENCH_POLYGONS")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(200_000);
    let path = std::env::temp_dir().join(format!("hueproof_bench_grid_{n}.geojson"));
    {
        let text = Grid::new(n, 3, 1).geojson();
        std::fs::write(&path, text).unwrap();
    }
    let size = std::fs::metadata(&path).unwrap().len();
    let mb = size as f64 / 1e6;
    println!("geo_ingest: {n} polygons with shared borders, file {mb:.1} MB");
    let (t_generic, p_generic, c1) = measure("generic", &path, 3);
    let (t_ours, p_ours, c2) = measure("hueproof", &path, 3);
    assert_eq!((c1, c2), (n, n));
    println!(
        "  generic serde_json::Value parse: {t_generic:.3} s, {:.1} MB/s, peak {:.2} x file",
        mb / t_generic,
        p_generic as f64 / size as f64
    );
    println!(
        "  hueproof read + validate + project: {t_ours:.3} s, {:.1} MB/s, peak {:.2} x file",
        mb / t_ours,
        p_ours as f64 / size as f64
    );
    println!(
        "  speed ratio (hueproof / generic): {:.2} (aim: >= 0.7)",
        t_generic / t_ours
    );
    println!(
        "  peak memory of hueproof: {:.2} x file size (aim: < 3; whole process, file text included)",
        p_ours as f64 / size as f64
    );
    let _ = std::fs::remove_file(&path);
}
