//! Benchmark: a qualitative palette of 8 classes optimised over the five
//! default views, reported against a baseline of the same number of
//! CIEDE2000 evaluations measured in the same run (so the ratio says how
//! much the optimiser costs beyond its colour differences). It should
//! finish well under a second.
//!
//! Run with `cargo bench --bench palette_qualitative`.

use std::time::{Duration, Instant};

use hueproof::color::{Lab, Srgb, ciede2000};
use hueproof::scheme::{Context, Thresholds, qualitative};
use hueproof::vision;

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

fn main() {
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
    let optimise = median(times);
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
    let baseline = median(times);
    println!("qualitative palette, 8 classes, 5 views (4 optimised), median of 5 runs");
    println!(
        "  optimisation        {:>9.1} ms",
        optimise.as_secs_f64() * 1e3
    );
    println!("  CIEDE2000 calls     {:>9}", n);
    println!(
        "  baseline (calls)    {:>9.1} ms",
        baseline.as_secs_f64() * 1e3
    );
    println!(
        "  ratio               {:>9.2}  (optimisation / baseline)",
        optimise.as_secs_f64() / baseline.as_secs_f64()
    );
    println!("  smallest ΔE00       {:>9.2}", out.min_delta_e);
}
