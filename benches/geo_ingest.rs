//! Ingest benchmark: read and project a large generated GeoJSON file
//! (N grid cells with shared borders, default N = 200,000; set
//! HUEPROOF_BENCH_POLYGONS to change it), reported as MB/s and as a ratio
//! to parsing the same bytes into a generic `serde_json::Value` in the same
//! run. Peak memory (Linux VmHWM, reset through /proc/self/clear_refs) is
//! reported against the file size.
//!
//! `cargo bench --bench geo_ingest`

use std::time::{Duration, Instant};

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

/// Reset the peak-RSS counter; returns the current RSS in bytes.
fn reset_peak() -> Option<u64> {
    std::fs::write("/proc/self/clear_refs", "5").ok()?;
    status_kb("VmRSS:").map(|k| k * 1024)
}

fn peak_since(base: Option<u64>) -> Option<u64> {
    Some((status_kb("VmHWM:")? * 1024).saturating_sub(base?))
}

fn best_of<T>(runs: usize, mut f: impl FnMut() -> T) -> (Duration, Option<u64>, T) {
    let mut best = Duration::MAX;
    let mut peak = None;
    let mut out = None;
    for _ in 0..runs {
        drop(out.take());
        let base = reset_peak();
        let t = Instant::now();
        let v = f();
        let dt = t.elapsed();
        let p = peak_since(base);
        if dt < best {
            best = dt;
        }
        peak = peak.max(p);
        out = Some(v);
    }
    (best, peak, out.unwrap())
}

fn main() {
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
    println!("geo_ingest: {n} polygons, file {mb:.1} MB");

    let (t_generic, p_generic, _) = best_of(3, || {
        let bytes = std::fs::read(&path).unwrap();
        let v: serde_json::Value = serde_json::from_slice(&bytes).unwrap();
        v
    });
    let opts = ReadOptions {
        key: Some(KeySource::Property("code".into())),
        repair: false,
        coordinates: CoordinateKind::Geographic,
    };
    let (t_ours, p_ours, total) = best_of(3, || {
        let layer = read_geojson_file(&path, &opts).unwrap();
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
        (layer, projected, area)
    });
    assert_eq!(total.0.features().len(), n);
    let speed = |t: Duration| mb / t.as_secs_f64();
    println!(
        "  generic serde_json::Value parse: {:.3} s, {:.1} MB/s",
        t_generic.as_secs_f64(),
        speed(t_generic)
    );
    println!(
        "  hueproof read + validate + project: {:.3} s, {:.1} MB/s",
        t_ours.as_secs_f64(),
        speed(t_ours)
    );
    println!(
        "  speed ratio (hueproof / generic): {:.2} (aim: >= 0.7)",
        speed(t_ours) / speed(t_generic)
    );
    match (p_generic, p_ours) {
        (Some(g), Some(o)) => println!(
            "  peak memory: generic {:.2} x file, hueproof {:.2} x file (aim: < 3)",
            g as f64 / size as f64,
            o as f64 / size as f64
        ),
        _ => println!("  peak memory: not available on this system"),
    }
    let _ = std::fs::remove_file(&path);
}
