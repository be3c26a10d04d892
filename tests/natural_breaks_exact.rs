//! Exactness of the fast natural-breaks programme on inputs large enough to
//! use every path of it: the vector-lane candidate scan (rows of 16 or more
//! candidates), the gathered reciprocals (candidate ranges containing
//! repeated values), the row-by-row short blocks, and the pruned sparse pass
//! of the layer before the last cell (several sparse rows and gaps); and of
//! the grid-bounded pruned programme (`src/classify/jenks_pruning.rs`),
//! forced onto small inputs with fine grids and run on large ones of
//! several shapes, which must find the same class ends as the full one.
//!
//! Reference: Fisher (1958), "On grouping for maximum homogeneity", JASA
//! 53(284): the optimal partition is the minimum of the dynamic programme
//! D[c][i] = min_j D[c-1][j] + ssd(j, i) over all split points. Here that
//! programme is run in full, O(k n^2), over the raw sorted values, with no
//! shortcut, and our partition's cost must equal its minimum.

mod common;

use hueproof::classify::{Sample, fisher_jenks};
use proptest::prelude::*;

/// Uniform values on [0, 1) from a 64-bit linear congruential generator
/// (Knuth's MMIX constants), top 53 bits.
fn uniforms(seed: u64) -> impl FnMut() -> f64 {
    let mut s = seed;
    move || {
        s = s
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (s >> 11) as f64 / (1u64 << 53) as f64
    }
}

/// Lognormal-like values (exp of a sum of uniforms) rounded to `step`, so
/// that a coarse step gives many repeated values and a fine one almost none.
fn values(seed: u64, n: usize, step: f64) -> Vec<f64> {
    let mut uniform = uniforms(seed);
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
        let want = common::plain_fisher_programme(sample.sorted(), k);
        let sdam = common::plain_fisher_programme(sample.sorted(), 1);
        prop_assert!(
            (got - want).abs() <= 1e-9 * sdam.max(1.0),
            "cost {} plain programme {} (n {}, k {})", got, want, n, k
        );
    }
}

/// Every class count from 1 to the number of distinct values, on small
/// tie-heavy inputs: k = 2 (the pruned layer is the first one computed),
/// k = 3 (one full layer before it), k = m - 1 and k = m (every distinct
/// value alone), against the plain programme of Fisher (1958) above.
#[test]
fn every_class_count_equals_plain_programme() {
    for (seed, n, step) in [(3u64, 40usize, 1.0f64), (11, 60, 0.05), (29, 25, 5.0)] {
        let sample = Sample::new(values(seed, n, step), 0).unwrap();
        let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
        let sdam = common::plain_fisher_programme(sample.sorted(), 1);
        for k in 1..=u.len() {
            let ends = fisher_jenks::optimal_ends(&u, &w, k);
            assert_eq!(ends.len(), k);
            assert!(ends.windows(2).all(|e| e[0] < e[1]));
            assert_eq!(ends[k - 1], u.len());
            let got = fisher_jenks::partition_cost(&u, &w, &ends);
            let want = common::plain_fisher_programme(sample.sorted(), k);
            assert!(
                (got - want).abs() <= 1e-9 * sdam.max(1.0),
                "seed {seed}, k {k} of {}: cost {got}, plain programme {want}",
                u.len()
            );
        }
    }
}

/// Data shapes for the pruned programme: skewed with and without ties,
/// flat (uniform), two far clusters, and long runs of one value.
fn shaped(kind: u8, seed: u64, n: usize) -> Vec<f64> {
    let mut uniform = uniforms(seed ^ 0x9E37_79B9_7F4A_7C15);
    match kind {
        0 => values(seed, n, 1e-6),
        1 => values(seed, n, 0.5),
        2 => (0..n).map(|_| uniform() * 100.0).collect(),
        3 => (0..n)
            .map(|i| {
                if i % 3 == 0 {
                    1e4 + uniform()
                } else {
                    uniform()
                }
            })
            .collect(),
        _ => (0..n)
            .map(|_| (uniform() * 6.0).floor() * 10.0 + uniform() * 0.01)
            .collect(),
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    /// The pruned programme (bounds on a coarse grid, rows that cannot lie
    /// on an optimal partition never computed), forced onto small inputs
    /// with a fine grid, finds the same class ends as the full programme,
    /// and their cost is the minimum of the plain programme of Fisher
    /// (1958).
    #[test]
    fn pruned_programme_equals_full_programme(
        kind in 0u8..5,
        seed in 0u64..10_000,
        n in 150usize..700,
        spacing in 2usize..24,
        k in 2usize..9,
    ) {
        let sample = Sample::new(shaped(kind, seed, n), 0).unwrap();
        let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
        prop_assume!(k < u.len());
        let full = fisher_jenks::optimal_ends_full(&u, &w, k);
        let pruned = fisher_jenks::optimal_ends_pruned(&u, &w, k, spacing);
        // None only when the grid has fewer than k + 1 cells.
        let cells = u.len().div_ceil(spacing);
        prop_assert!(pruned.is_some() || cells < k + 1, "cells {} k {}", cells, k);
        if let Some(pruned) = pruned {
            prop_assert_eq!(&pruned, &full, "kind {} n {} spacing {} k {}", kind, n, spacing, k);
            let got = fisher_jenks::partition_cost(&u, &w, &pruned);
            let want = common::plain_fisher_programme(sample.sorted(), k);
            let sdam = common::plain_fisher_programme(sample.sorted(), 1);
            prop_assert!((got - want).abs() <= 1e-9 * sdam.max(1.0));
        }
    }
}

/// On 60,000 skewed values (the size where the pruned programme is used
/// by default), the default programme takes the pruned path (it does not
/// stop early) and its ends equal the full programme's, for k = 2..=9.
#[test]
fn pruned_programme_is_used_and_exact_on_a_large_input() {
    let sample = Sample::new(values(77, 60_000, 1e-6), 0).unwrap();
    let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
    assert!(u.len() > 50_000);
    for k in 2..=9 {
        let full = fisher_jenks::optimal_ends_full(&u, &w, k);
        let pruned = fisher_jenks::optimal_ends_pruned(&u, &w, k, u.len().div_ceil(8192))
            .unwrap_or_else(|| panic!("k {k}: the pruned programme stopped early"));
        assert_eq!(pruned, full, "k {k}");
        assert_eq!(fisher_jenks::optimal_ends(&u, &w, k), full, "k {k}");
    }
}

/// The same on 30,000 values of other shapes: flat, two far clusters (where
/// the default path gives the pruning up), and six narrow clusters; the
/// pruned programme, made to run to the end, still finds the full
/// programme's ends.
#[test]
fn pruned_programme_is_exact_on_large_inputs_of_other_shapes() {
    for kind in [2u8, 3, 4] {
        let sample = Sample::new(shaped(kind, 5, 30_000), 0).unwrap();
        let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
        assert!(u.len() > 20_000, "kind {kind}: {} distinct values", u.len());
        for k in [3, 7] {
            let full = fisher_jenks::optimal_ends_full(&u, &w, k);
            let pruned = fisher_jenks::optimal_ends_pruned(&u, &w, k, u.len().div_ceil(8192));
            assert_eq!(pruned.as_ref(), Some(&full), "kind {kind}, k {k}");
            assert_eq!(
                fisher_jenks::optimal_ends(&u, &w, k),
                full,
                "kind {kind}, k {k}"
            );
        }
    }
}
