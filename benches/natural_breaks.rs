//! Natural breaks (exact Fisher-Jenks), k = 7, on 1,000,000 lognormal
//! values, timed as a ratio to sorting the same values in the same run.
//!
//! Plain timing harness (`harness = false`): the measurements are
//! interleaved, repeated, and reported as median and minimum. Printed:
//!
//! - `sort`: copying and sorting the values (`sort_unstable_by(total_cmp)`),
//!   the baseline;
//! - `natural`: building the sample (copy + the same sort) and the exact
//!   natural breaks, with the default thread pool and with one thread;
//! - `full programme`: the same without the pruning (every row of every
//!   layer), for comparison;
//! - `classify`: the full result (bounds, counts, GVF, histogram);
//! - then, for uniform, normal and two-cluster values of the same size, the
//!   sort, natural breaks and the full programme (3 runs each).
//!
//! With `--once` (after `--bench`) it runs natural breaks once and prints
//! the bounds only, for instruction counts under a profiler.
//!
//! The values are generated deterministically: splitmix64 uniforms,
//! Box-Muller normals, exp(3 + z) (lognormal, mu = 3, sigma = 1).

mod common;

use std::time::Instant;

use common::{Results, ms, time};
use hueproof::classify::{self, Method, Sample, fisher_jenks};
use hueproof::random::SplitMix64;

const N: usize = 1_000_000;
const K: usize = 7;
const RUNS: usize = 7;

fn lognormal(n: usize, seed: u64) -> Vec<f64> {
    let mut rng = SplitMix64(seed);
    let mut out = Vec::with_capacity(n);
    while out.len() < n {
        let (u1, u2) = (rng.uniform(), rng.uniform());
        let r = (-2.0 * u1.ln()).sqrt();
        let t = std::f64::consts::TAU * u2;
        for z in [r * t.cos(), r * t.sin()] {
            if out.len() < n {
                out.push((3.0 + z).exp());
            }
        }
    }
    out
}

fn main() {
    // `cargo bench` passes `--bench`; `cargo test --benches` passes nothing
    // useful either; run the measurement only when benchmarking.
    if !common::benchmarking("natural_breaks") {
        return;
    }
    let values = lognormal(N, 0x5EED_2026);
    let method = Method::NaturalBreaks { classes: K };
    // `--once`: one single-threaded natural-breaks run and nothing else, for
    // instruction counts (`valgrind --tool=callgrind ... --bench --once`).
    if std::env::args().any(|a| a == "--once") {
        let one = rayon::ThreadPoolBuilder::new()
            .num_threads(1)
            .build()
            .unwrap();
        let s = Sample::new(values, 0).unwrap();
        let t = Instant::now();
        let b = one.install(|| classify::method_bounds(&s, &method).unwrap());
        let e = t.elapsed();
        println!("natural_breaks --once: bounds {:?}", b.upper);
        println!("  breaks on sorted values, one thread: {:.1} ms", ms(e));
        return;
    }

    let one = rayon::ThreadPoolBuilder::new()
        .num_threads(1)
        .build()
        .unwrap();
    // Interleave the measurements so that a change in machine load hits
    // the baseline and the method alike.
    let (mut ts, mut tn, mut t1, mut tf, mut tp) = (vec![], vec![], vec![], vec![], vec![]);
    for _ in 0..RUNS {
        ts.push(time(|| sort_run(&values)).0);
        tn.push(time(|| natural_run(&values)).0);
        t1.push(one.install(|| time(|| natural_run(&values)).0));
        tp.push(time(|| full_programme_run(&values)).0);
        tf.push(
            time(|| {
                let s = Sample::new(values.clone(), 0).unwrap();
                std::hint::black_box(classify::classify(&s, &method, 20).unwrap());
            })
            .0,
        );
    }
    let s = Sample::new(values.clone(), 0).unwrap();
    let c = classify::classify(&s, &method, 20).unwrap();
    println!(
        "natural_breaks: n = {N}, k = {K}, median of {RUNS} runs, {} threads available",
        rayon::current_num_threads()
    );
    println!("  bounds {:?}", c.breaks);
    println!("  gvf {:.6}", c.gvf.unwrap_or(f64::NAN));
    let mut results = Results::new("natural_breaks", "sort", ts);
    results.row("natural breaks", tn);
    results.row("natural breaks, one thread", t1);
    results.row("natural breaks, full programme", tp);
    results.row("full classification", tf);
    results.print("natural breaks at most 3x the sort");

    // Other shapes of data, same n and k: how much the pruning saves where
    // the data has less structure, against the full programme, each
    // against the sort of the same values.
    let shapes: [(&'static str, Vec<f64>); 3] = [
        ("natural_breaks (uniform)", uniform(N, 0x0DD_BA11)),
        (
            "natural_breaks (normal)",
            lognormal(N, 0x5EED_2027).iter().map(|v| v.ln()).collect(),
        ),
        ("natural_breaks (two clusters)", clusters(N, 0xC1A5)),
    ];
    for (name, v) in shapes {
        let (mut ts, mut tn, mut tf) = (vec![], vec![], vec![]);
        for _ in 0..3 {
            ts.push(time(|| sort_run(&v)).0);
            tn.push(time(|| natural_run(&v)).0);
            tf.push(time(|| full_programme_run(&v)).0);
        }
        println!("{name}:");
        let mut results = Results::new(name, "sort", ts);
        results.row("natural breaks", tn);
        results.row("natural breaks, full programme", tf);
        results.print("");
    }
}

/// The baseline: copy and sort.
fn sort_run(values: &[f64]) {
    let mut v = values.to_vec();
    v.sort_unstable_by(f64::total_cmp);
    std::hint::black_box(&v);
}

/// Natural breaks as the library runs them: the sample (copy and sort),
/// then the bounds.
fn natural_run(values: &[f64]) {
    let s = Sample::new(values.to_vec(), 0).unwrap();
    let method = Method::NaturalBreaks { classes: K };
    std::hint::black_box(classify::method_bounds(&s, &method).unwrap());
}

/// The same with the full programme (no pruning).
fn full_programme_run(values: &[f64]) {
    let s = Sample::new(values.to_vec(), 0).unwrap();
    let (u, w) = fisher_jenks::unique_weighted(s.sorted());
    std::hint::black_box(fisher_jenks::optimal_ends_full(&u, &w, K));
}

/// Uniform values on [0, 100).
fn uniform(n: usize, seed: u64) -> Vec<f64> {
    let mut rng = SplitMix64(seed);
    (0..n).map(|_| 100.0 * rng.uniform()).collect()
}

/// Two far clusters of uniform values, one a third of the data.
fn clusters(n: usize, seed: u64) -> Vec<f64> {
    let mut rng = SplitMix64(seed);
    (0..n)
        .map(|i| if i % 3 == 0 { 1e4 } else { 0.0 } + rng.uniform())
        .collect()
}
