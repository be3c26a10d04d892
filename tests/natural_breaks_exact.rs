//! Exactness of the fast natural-breaks programme on inputs large enough to
//! use every path of it: the vector-lane candidate scan (rows of 16 or more
//! candidates), the gathered reciprocals (candidate ranges containing
//! repeated values), the row-by-row short blocks, and the pruned sparse pass
//! of the layer before the last cell (several sparse rows and gaps).
//!
//! Reference: Fisher (1958), "On grouping for maximum homogeneity", JASA
//! 53(284): the optimal partition is the minimum of the dynamic programme
//! D[c][i] = min_j D[c-1][j] + ssd(j, i) over all split points. Here that
//! programme is run in full, O(k n^2), over the raw sorted values, with no
//! shortcut, and our partition's cost must equal its minimum.

use hueproof::classify::{Sample, fisher_jenks};
use proptest::prelude::*;

/// Plain Fisher (1958) programme over raw sorted values with prefix sums
/// (centred on the mean), every split point tried.
fn plain_programme(x: &[f64], k: usize) -> f64 {
    let n = x.len();
    let mean = x.iter().sum::<f64>() / n as f64;
    let (mut p1, mut p2) = (vec![0.0; n + 1], vec![0.0; n + 1]);
    for i in 0..n {
        let d = x[i] - mean;
        p1[i + 1] = p1[i] + d;
        p2[i + 1] = p2[i] + d * d;
    }
    let ssd = |a: usize, b: usize| {
        let d = p1[b] - p1[a];
        ((p2[b] - p2[a]) - d * d / (b - a) as f64).max(0.0)
    };
    let mut best: Vec<f64> = (0..=n)
        .map(|i| if i == 0 { f64::INFINITY } else { ssd(0, i) })
        .collect();
    for c in 2..=k {
        let mut next = vec![f64::INFINITY; n + 1];
        for (i, cell) in next.iter_mut().enumerate().skip(c) {
            for (j, &b) in best.iter().enumerate().take(i).skip(c - 1) {
                let v = b + ssd(j, i);
                if v < *cell {
                    *cell = v;
                }
            }
        }
        best = next;
    }
    best[n]
}

/// Lognormal-like values (exp of a sum of uniforms) rounded to `step`, so
/// that a coarse step gives many repeated values and a fine one almost none.
fn values(seed: u64, n: usize, step: f64) -> Vec<f64> {
    let mut s = seed;
    let mut uniform = || {
        s = s
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (s >> 11) as f64 / (1u64 << 53) as f64
    };
    (0..n)
        .map(|_| {
            let z = (0..4).map(|_| uniform()).sum::<f64>() - 2.0;
            ((2.0 + 1.5 * z).exp() / step).round() * step
        })
        .collect()
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(24))]

    #[test]
    fn fast_programme_equals_plain_programme(
        seed in 0u64..10_000,
        n in 200usize..900,
        step in prop_oneof![Just(1e-6f64), Just(0.05), Just(1.0)],
        k in 2usize..9,
    ) {
        let sample = Sample::new(values(seed, n, step), 0).unwrap();
        let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
        let k = k.min(u.len());
        let ends = fisher_jenks::optimal_ends(&u, &w, k);
        prop_assert_eq!(ends.len(), k);
        prop_assert!(ends.windows(2).all(|e| e[0] < e[1]));
        let got = fisher_jenks::partition_cost(&u, &w, &ends);
        let want = plain_programme(sample.sorted(), k);
        let sdam = plain_programme(sample.sorted(), 1);
        prop_assert!(
            (got - want).abs() <= 1e-9 * sdam.max(1.0),
            "cost {} plain programme {} (n {}, k {})", got, want, n, k
        );
    }
}
