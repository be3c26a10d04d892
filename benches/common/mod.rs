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
