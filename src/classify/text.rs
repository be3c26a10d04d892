//! The text rendering of a [`Classification`] for people.

use std::fmt::Write;

use super::Classification;

/// A long name for each method short name.
fn long_name(method: &str) -> &'static str {
    match method {
        "equal" => "equal interval",
        "quantile" => "quantile",
        "natural" => "natural breaks (Fisher-Jenks, exact)",
        "stddev" => "standard deviation",
        "headtail" => "head/tail breaks",
        "manual" => "manual breaks",
        _ => "classes",
    }
}

/// Render `c` as a table: one line per class with its range and count.
pub fn render(c: &Classification) -> String {
    let mut s = String::new();
    let _ = writeln!(
        s,
        "{}: {} classes, {} values, {} missing",
        long_name(&c.method),
        c.classes,
        c.n,
        c.missing
    );
    if let Some(m) = &c.midpoint {
        let _ = writeln!(
            s,
            "midpoint {} as a {} ({} below, {} equal, {} above)",
            m.value,
            match m.arrangement {
                super::diverging::Arrangement::Break => "class bound",
                super::diverging::Arrangement::Centre => "class centre",
            },
            m.below,
            m.at,
            m.above
        );
    }
    let _ = writeln!(s, "range {} .. {}", c.min, c.max);
    let _ = writeln!(s, "class  from (exclusive)  to (inclusive)  count");
    for (j, (&b, &n)) in c.breaks.iter().zip(&c.counts).enumerate() {
        let from = if j == 0 {
            if c.min <= b {
                format!("{} (incl.)", c.min)
            } else {
                "-inf".to_string()
            }
        } else {
            format!("{}", c.breaks[j - 1])
        };
        let _ = writeln!(s, "{:>5}  {:>17}  {:>14}  {:>5}", j + 1, from, b, n);
    }
    match c.gvf {
        Some(g) => {
            let _ = writeln!(
                s,
                "goodness of variance fit {g:.6} (SDAM {}, SDCM {})",
                c.sdam, c.sdcm
            );
        }
        None => {
            let _ = writeln!(s, "goodness of variance fit undefined (all values equal)");
        }
    }
    if let Some(r) = &c.rounding {
        let _ = writeln!(
            s,
            "bounds rounded to multiples of {}; {} observation(s) changed class",
            r.step, r.changed_class
        );
        let unrounded: Vec<String> = r.unrounded_breaks.iter().map(|b| b.to_string()).collect();
        let _ = writeln!(s, "unrounded bounds {}", unrounded.join(", "));
    }
    s
}
