//! Benchmark: the raster simulation on a 4000 x 3000 RGBA8 buffer, reported
//! in pixels per second and as a ratio to a plain copy of the same buffer
//! measured in the same run (so the figure holds on a noisy machine).
//!
//! Two contents: a figure-like raster (flat class fills with anti-aliased
//! edges, what rendered maps look like) and uniform random noise (the worst
//! case: no two neighbouring pixels alike). Aim: at least 0.3 of copy speed
//! on one core for the figure-like raster.
//!
//! Run with `cargo bench --bench vision_raster`.

mod common;

use std::time::{Duration, Instant};

use common::Results;

use hueproof::random::SplitMix64;
use hueproof::vision::raster::{simulate_rgba8, simulate_rgba8_serial};
use hueproof::vision::{Deficiency, Simulation, View};

const W: usize = 4000;
const H: usize = 3000;
const RUNS: usize = 7;

fn figure_like() -> Vec<u8> {
    // Seven class fills from a smooth field; pixels straddling a class
    // boundary get the anti-aliased mix of the two fills.
    let fills: [[f32; 3]; 7] = [
        [236.0, 231.0, 214.0],
        [205.0, 214.0, 180.0],
        [160.0, 196.0, 150.0],
        [104.0, 170.0, 140.0],
        [62.0, 134.0, 132.0],
        [40.0, 94.0, 118.0],
        [30.0, 56.0, 92.0],
    ];
    let mut buf = vec![0u8; W * H * 4];
    for y in 0..H {
        for x in 0..W {
            let (xf, yf) = (x as f32, y as f32);
            let v = (xf * 0.004).sin() + (yf * 0.005).cos() + 0.5 * ((xf + yf) * 0.002).sin();
            let t = ((v + 2.5) / 5.0 * 7.0).clamp(0.0, 6.999);
            let class = t as usize;
            let frac = t - class as f32;
            // Width of one pixel in field units, roughly.
            let edge = 0.01;
            let c = if frac < edge && class > 0 {
                let a = 0.5 + frac / (2.0 * edge);
                let (p, q) = (fills[class], fills[class - 1]);
                [0, 1, 2].map(|k| p[k] * a + q[k] * (1.0 - a))
            } else {
                fills[class]
            };
            let i = (y * W + x) * 4;
            buf[i..i + 3].copy_from_slice(&c.map(|v| v.round() as u8));
            buf[i + 3] = 255;
        }
    }
    buf
}

fn noise() -> Vec<u8> {
    let mut m = SplitMix64(42);
    let mut buf = vec![255u8; W * H * 4];
    for px in buf.chunks_exact_mut(4) {
        let r = m.next_u64();
        px[0] = r as u8;
        px[1] = (r >> 8) as u8;
        px[2] = (r >> 16) as u8;
    }
    buf
}

/// Time `copy` and `sim` alternately (so both see the same machine load);
/// every run of each.
fn interleaved(src: &[u8], sim: impl Fn(&mut [u8])) -> (Vec<Duration>, Vec<Duration>) {
    let mut dst = vec![0u8; src.len()];
    let mut work = src.to_vec();
    let (mut copy, mut run) = (Vec::new(), Vec::new());
    for _ in 0..RUNS {
        let t = Instant::now();
        dst.copy_from_slice(src);
        std::hint::black_box(&mut dst);
        copy.push(t.elapsed());
        work.copy_from_slice(src);
        let t = Instant::now();
        sim(&mut work);
        std::hint::black_box(&mut work);
        run.push(t.elapsed());
    }
    (copy, run)
}

fn main() {
    if !common::benchmarking("vision_raster") {
        return;
    }
    let views = [
        ("protanopia", View::Dichromacy(Deficiency::Protan)),
        ("deuteranopia", View::Dichromacy(Deficiency::Deutan)),
        ("tritanopia", View::Dichromacy(Deficiency::Tritan)),
        ("achromatopsia", View::Achromatopsia),
    ];
    let pixels = (W * H) as f64;
    println!("vision_raster: {W} x {H} RGBA8, {RUNS} interleaved runs per view");
    for (name, src) in [("figure-like", figure_like()), ("noise", noise())] {
        // The copies interleaved with every view's runs form the baseline.
        let mut copies = Vec::new();
        let mut rows: Vec<(String, Vec<Duration>)> = Vec::new();
        for (vname, view) in views {
            let sim = Simulation::new(view, None);
            let (copy, one) = interleaved(&src, |b| simulate_rgba8_serial(&sim, b));
            copies.extend(copy);
            rows.push((format!("{name}, {vname}, one core"), one));
        }
        let sim = Simulation::new(View::Dichromacy(Deficiency::Tritan), None);
        let (copy, par) = interleaved(&src, |b| simulate_rgba8(&sim, W, b));
        copies.extend(copy);
        rows.push((format!("{name}, tritanopia, rayon"), par));
        let best = rows[0].1.iter().min().unwrap().as_secs_f64();
        println!(
            "  {name}: protanopia on one core {:.1} Mpixel/s",
            pixels / best / 1e6
        );
        let mut results = Results::new("vision_raster", &format!("{name}, copy"), copies);
        for (label, t) in rows {
            results.row(&label, t);
        }
        results.print(if name == "figure-like" {
            "one core at most 3.3 x the copy (at least 0.3 of copy speed)"
        } else {
            ""
        });
    }
}
