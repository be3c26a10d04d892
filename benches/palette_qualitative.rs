//! Benchmark: a qualitative palette of 8 classes optimised over the five
//! default views, reported against a baseline of the same number of
//! CIEDE2000 evaluations measured in the same run (so the ratio says how
//! much the optimiser costs beyond its colour differences). It should
//! finish well under a second.
//!
//! Run with `cargo bench --bench palette_qualitative`.

mod common;

use std::time::Instant;

use common::Results;

use hueproof::color::{Lab, Srgb, ciede2000};
use hueproof::scheme::{Context, Thresholds, qualitative};
use hueproof::vision;

fn main() {
    if !common::benchmarking("palette_qualitative") {
        return;
    }
    let ctx = Context {
        background: Srgb::new(1.0, 1.0, 1.0),
        views: vision::parse_views(vision::DEFAULT_VIEWS).unwrap(),
        model: None,
        thresholds: Thresholds::default(),
    };
    let opts = qualitative::Options {
        classes: 8,
        ..Default::default()
    };
    let mut times = Vec::new();
    let mut out = None;
    for _ in 0..5 {
        let t = Instant::now();
        out = Some(qualitative::generate(&opts, &ctx));
        times.push(t.elapsed());
    }
    let out = out.unwrap();
    let optimise = times;
    // Baseline: the same number of CIEDE2000 evaluations on varied Lab
    // pairs (a deterministic spread over the gamut).
    let labs: Vec<Lab> = (0..997)
        .map(|i| {
            let f = i as f64;
            Lab::new(
                30.0 + (f * 0.37) % 60.0,
                (f * 1.3) % 120.0 - 60.0,
                (f * 2.1) % 120.0 - 60.0,
            )
        })
        .collect();
    let n = out.evaluations as usize;
    let mut times = Vec::new();
    for _ in 0..5 {
        let t = Instant::now();
        let mut acc = 0.0;
        for k in 0..n {
            acc += ciede2000(labs[k % 997], labs[(k * 7 + 3) % 997]);
        }
        std::hint::black_box(acc);
        times.push(t.elapsed());
    }
    println!(
        "palette_qualitative: 8 classes, 5 views (4 optimised), {n} CIEDE2000 calls, \
         smallest ΔE00 {:.2}",
        out.min_delta_e
    );
    let mut results = Results::new("palette_qualitative", "as many CIEDE2000 calls", times);
    results.row("qualitative palette, 8 classes", optimise);
    results.print("");
}
