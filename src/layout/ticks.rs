//! Readable axis ticks by Heckbert's nice numbers (P. S. Heckbert, "Nice
//! numbers for graph labels", Graphics Gems, 1990): steps of 1, 2 or 5
//! times a power of ten, and a range widened to whole steps ("loose"
//! labelling).

/// A nice number near `x`: 1, 2, 5 or 10 times a power of ten; rounded to
/// the nearest when `round`, else the smallest not below `x`.
pub fn nice_number(x: f64, round: bool) -> f64 {
    if !(x > 0.0 && x.is_finite()) {
        return 1.0;
    }
    let exp = x.log10().floor();
    let f = x / 10f64.powf(exp);
    let nf = if round {
        if f < 1.5 {
            1.0
        } else if f < 3.0 {
            2.0
        } else if f < 7.0 {
            5.0
        } else {
            10.0
        }
    } else if f <= 1.0 {
        1.0
    } else if f <= 2.0 {
        2.0
    } else if f <= 5.0 {
        5.0
    } else {
        10.0
    };
    nf * 10f64.powf(exp)
}

/// Loose ticks for `[lo, hi]` with about `n` ticks: the widened range,
/// the step, the tick values and the decimals their labels need.
#[derive(Debug, Clone, PartialEq)]
pub struct Ticks {
    /// Start of the widened range (a tick).
    pub lo: f64,
    /// End of the widened range (a tick).
    pub hi: f64,
    /// Step.
    pub step: f64,
    /// Tick values from `lo` to `hi`.
    pub values: Vec<f64>,
    /// Decimals for labels: max(-floor(log10 step), 0).
    pub decimals: u32,
}

/// Heckbert's loose labelling of `[lo, hi]` with about `n` ticks.
pub fn loose(lo: f64, hi: f64, n: usize) -> Ticks {
    let (lo, hi) = if hi > lo {
        (lo, hi)
    } else if lo == 0.0 {
        (-1.0, 1.0)
    } else {
        (lo - lo.abs() * 0.1, lo + lo.abs() * 0.1)
    };
    let n = n.max(2);
    let range = nice_number(hi - lo, false);
    let step = nice_number(range / (n - 1) as f64, true);
    let glo = (lo / step).floor() * step;
    let ghi = (hi / step).ceil() * step;
    let decimals = (-step.log10().floor()).max(0.0) as u32;
    let count = ((ghi - glo) / step).round() as usize;
    let values = (0..=count)
        .map(|i| {
            let v = glo + i as f64 * step;
            // Snap away binary noise (0.30000000000000004).
            let scale = 10f64.powi(decimals as i32 + 2);
            (v * scale).round() / scale
        })
        .collect();
    Ticks {
        lo: glo,
        hi: ghi,
        step,
        values,
        decimals,
    }
}

/// Ticks inside `[lo, hi]` only (for legends, whose ends are the data's
/// ends): the loose ticks clipped to the range.
pub fn inside(lo: f64, hi: f64, n: usize) -> Ticks {
    let mut t = loose(lo, hi, n);
    let eps = t.step * 1e-9;
    t.values.retain(|v| *v >= lo - eps && *v <= hi + eps);
    t
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn steps_are_one_two_or_five_times_a_power_of_ten() {
        // Heckbert (1990): nice numbers are 1, 2, 5 and 10 times powers of
        // ten; loose labelling widens the range to whole steps.
        for (lo, hi) in [
            (0.0, 1.0),
            (3.2, 97.5),
            (-12.0, 15.0),
            (0.0012, 0.0097),
            (700.0, 2400.0),
            (1e6, 3.7e6),
        ] {
            let t = loose(lo, hi, 5);
            let m = t.step / 10f64.powf(t.step.log10().floor());
            assert!(
                [1.0, 2.0, 5.0].iter().any(|n| (m - n).abs() < 1e-9),
                "{lo}..{hi}: step {}",
                t.step
            );
            assert!(t.lo <= lo && t.hi >= hi, "{t:?}");
            assert!((3..=11).contains(&t.values.len()), "{t:?}");
            assert!(
                t.values
                    .windows(2)
                    .all(|w| (w[1] - w[0] - t.step).abs() < t.step * 1e-6)
            );
        }
        // From memory of the paper's method on a common case: 0..100 with
        // about five ticks gives a step of 20 (range rounded up to 100, then
        // 100 / 4 = 25 rounded to the nice 20).
        let t = loose(0.0, 100.0, 5);
        assert_eq!(t.step, 20.0);
        assert_eq!(t.values, vec![0.0, 20.0, 40.0, 60.0, 80.0, 100.0]);
        assert_eq!(nice_number(25.0, true), 20.0);
        assert_eq!(nice_number(25.0, false), 50.0);
        assert_eq!(loose(0.0, 0.7, 5).decimals, 1);
        // Ticks for legends stay inside the data.
        let t = inside(11.8, 1718.9, 5);
        assert!(t.values.iter().all(|v| (11.8..=1718.9).contains(v)));
    }
}
