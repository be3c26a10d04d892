//! Ingest benchmark: read and project a large generated GeoJSON file
//! (N grid cells with shared borders, default N = 200,000; set
//! HUEPROOF_BENCH_POLYGONS to change it), reported as MB/s and as a ratio
//! to parsing the same bytes into a generic `serde_json::Value` in the same
//! run. Each side runs three times in a fresh process (best time kept); its
//! peak memory (Linux VmHWM of that process) is reported against the file
//! size.
//!
//! `cargo bench --bench geo_ingest`

mod common;

use std::time::{Duration, Instant};

use common::Results;

use hueproof::geo::extent::Extent;
use hueproof::geo::generate::Grid;
use hueproof::geo::measure::geometry_area;
use hueproof::geo::projection::{Ellipsoid, Purpose, choose_projection};
use hueproof::geo::{CoordinateKind, KeySource, ReadOptions, read_geojson_file};

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
    let peak = common::peak_bytes().unwrap_or(0);
    println!("{dt} {peak} {check}");
}

/// Run `mode` in a fresh process `runs` times: every time, largest peak.
fn measure(mode: &str, path: &std::path::Path, runs: usize) -> (Vec<Duration>, u64, usize) {
    let mut times = Vec::new();
    let mut peak = 0;
    let mut count = 0;
    for _ in 0..runs {
        let s = common::run_child(&["--child", mode], path);
        let v: Vec<&str> = s.split_whitespace().collect();
        times.push(Duration::from_secs_f64(v[0].parse().unwrap()));
        peak = peak.max(v[1].parse().unwrap());
        count = v[2].parse().unwrap();
    }
    (times, peak, count)
}

fn main() {
    let args: Vec<String> = std::env::args().collect();
    if let Some(i) = args.iter().position(|a| a == "--child") {
        child(&args[i + 1], std::path::Path::new(&args[i + 2]));
        return;
    }
    if !common::benchmarking("geo_ingest") {
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
    let best = |t: &[Duration]| t.iter().min().unwrap().as_secs_f64();
    println!(
        "  best: generic {:.1} MB/s, hueproof {:.1} MB/s; peak memory of hueproof {:.2} x file size \
         (generic {:.2}; aim: < 3; whole process, file text included)",
        mb / best(&t_generic),
        mb / best(&t_ours),
        p_ours as f64 / size as f64,
        p_generic as f64 / size as f64
    );
    let mut results = Results::new("geo_ingest", "serde_json::Value parse", t_generic);
    results.row("read + validate + project (GeoJSON)", t_ours);
    results.print("at most 1.43 x the generic parse (at least 0.7 of its speed)");
    let _ = std::fs::remove_file(&path);
}
