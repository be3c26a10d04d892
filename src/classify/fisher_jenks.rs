//! Exact optimal natural breaks (Fisher 1958, "On grouping for maximum
//! homogeneity", JASA 53(284); popularised for maps by Jenks 1977).
//!
//! The values are split into k consecutive classes (in sorted order) that
//! minimise the sum over classes of squared deviations from the class mean
//! (SDCM). The optimum is found exactly, without sampling:
//!
//! 1. Repeated values are collapsed into weighted unique values (a class
//!    never splits a block of equal values, since bounds are
//!    upper-inclusive), which leaves m <= n points.
//! 2. With prefix sums of weight, weighted value and weighted squared value
//!    (of values centred on their mean, to keep the differences accurate),
//!    the cost of any class is O(1).
//! 3. The dynamic programme D[c][i] = min_j D[c-1][j] + cost(j, i) is solved
//!    layer by layer. The first layer is closed form, D[1][i] = cost(0, i).
//!    The cost is a Monge array (the within-class sum of squares satisfies
//!    the quadrangle inequality), so the leftmost optimal j is
//!    non-decreasing in i.
//! 4. From 20,000 distinct values on, the pruned programme of
//!    `jenks_pruning.rs` runs first: bounds computed on a coarse grid
//!    prove that most rows of every layer cannot lie on an optimal
//!    partition, and those rows are never computed. It finds the same ends
//!    as the full programme below. Where it would not pay (it stops as
//!    soon as a layer needs more than half of its rows, or when the
//!    rounding margin is as large as the costs), the full programme runs.
//! 5. The full programme solves layers 2..k-2 by divide and conquer over
//!    the monotone argmin in O(m log m); blocks of at most four rows are
//!    filled row by row from the previous row's argmin instead of being
//!    divided further, and blocks with wide candidate ranges are split
//!    across threads. Row i of layer c scans from the argmin of row i in
//!    layer c - 1 on (with more classes, the last class of a prefix starts
//!    no earlier: the monotonicity used with the quadrangle inequality
//!    since Yao 1980, checked here by the tests against the plain
//!    programme).
//! 6. The layer k-1 is needed only where the last class can start. Every
//!    s-th row (s = 4 sqrt(m)) is solved first; a gap between two such rows
//!    i0 < i1 is solved only if the exact lower bound
//!    D[k-1][i0] + cost(i1 - 1, m) (D grows with the prefix, and a class's
//!    sum of squares grows when points are added) can beat the best split
//!    found so far, with a margin of 1e-9 of the total sum of squares for
//!    rounding. Pruning never changes the result. The last layer is one
//!    cell, O(m). Total O(k m log m) time after sorting and O(k m) memory
//!    for the back-pointers.
//! 7. The candidate scan of one row, q[j] - (S1[i] - S1[j])^2 / (W[i] - W[j]),
//!    is written so that the compiler vectorises it with the baseline
//!    instruction set (no target-specific flags, no unsafe code): class
//!    weights are whole numbers, so the division becomes a multiplication
//!    by a tabulated reciprocal (exactly 1.0 / d, so the pruned programme,
//!    which divides, computes the same entries); the table is reversed so
//!    that a row's reciprocals are one contiguous slice when the candidates
//!    have weight 1 (otherwise they are gathered tile by tile); the loop
//!    keeps per-lane minima of blocks of 32 candidates only, and the
//!    leftmost argmin is recovered by rescanning the one block that holds
//!    the minimum with the same arithmetic. Rows shorter than a block use a
//!    plain scan written with selects instead of branches.
//! 8. Memory touched for the first time costs a page fault, so each run
//!    allocates little: the prefix weights are integers shared with the
//!    reciprocal table, q is written over the previous layer, and only the
//!    pruned layer is reset to +inf.
//!
//! Speed: see `jenks_pruning.rs` and the README ("Speed"). On
//! 1,000,000 lognormal values, k = 7, the full programme alone takes about
//! 4.5-5 times the sort of the same values, and the default (pruned)
//! path about 2.
//!
//! The bounds reported are the largest value of each class, so they are
//! actual data values. With fewer distinct values than classes, each
//! distinct value gets its own class and a warning says so.

use super::{Bounds, check_classes};
use crate::error::Error;

/// Upper bounds of the optimal `classes`-class partition of sorted `x`.
pub fn bounds(x: &[f64], classes: usize) -> Result<Bounds, Error> {
    check_classes(classes)?;
    let (values, weights) = unique_weighted(x);
    let mut warnings = Vec::new();
    let k = if values.len() < classes {
        warnings.push(format!(
            "only {} distinct value(s): {} classes instead of {classes}",
            values.len(),
            values.len()
        ));
        values.len()
    } else {
        classes
    };
    let ends = optimal_ends(&values, &weights, k);
    let upper = ends.iter().map(|&e| values[e - 1]).collect();
    Ok(Bounds { upper, warnings })
}

/// Collapse sorted values into unique values and their multiplicities.
pub fn unique_weighted(x: &[f64]) -> (Vec<f64>, Vec<f64>) {
    // Sized for all-distinct values (the common case for measured data), so
    // that the vectors are never reallocated and copied while they grow.
    let mut values: Vec<f64> = Vec::with_capacity(x.len());
    let mut weights: Vec<f64> = Vec::with_capacity(x.len());
    for &v in x {
        match values.last() {
            Some(&last) if last == v => *weights.last_mut().unwrap_or(&mut 0.0) += 1.0,
            _ => {
                values.push(v);
                weights.push(1.0);
            }
        }
    }
    (values, weights)
}

/// Prefix sums for O(1) class costs over weighted points. The weights are
/// whole numbers (multiplicities), so their prefix sums are kept as
/// integers; a difference of two of them converts exactly to f64.
pub(crate) struct Prefix {
    pub(crate) w: Vec<u32>,
    pub(crate) s1: Vec<f64>,
    pub(crate) s2: Vec<f64>,
    /// The weighted mean the values are centred on.
    pub(crate) centre: f64,
}

impl Prefix {
    pub(crate) fn new(values: &[f64], weights: &[f64]) -> Prefix {
        let total: f64 = weights.iter().sum();
        let centre = values.iter().zip(weights).map(|(v, w)| v * w).sum::<f64>() / total;
        let m = values.len();
        let (mut w, mut s1, mut s2) = (
            Vec::with_capacity(m + 1),
            Vec::with_capacity(m + 1),
            Vec::with_capacity(m + 1),
        );
        let (mut aw, mut a1, mut a2) = (0u32, 0.0, 0.0);
        w.push(0);
        s1.push(0.0);
        s2.push(0.0);
        for (v, wt) in values.iter().zip(weights) {
            let d = v - centre;
            aw += *wt as u32;
            a1 += wt * d;
            a2 += wt * d * d;
            w.push(aw);
            s1.push(a1);
            s2.push(a2);
        }
        Prefix { w, s1, s2, centre }
    }

    /// Within-class sum of squares of points [j, i) (j < i).
    #[inline(always)]
    pub(crate) fn cost(&self, j: usize, i: usize) -> f64 {
        let dw = (self.w[i] - self.w[j]) as f64;
        let d1 = self.s1[i] - self.s1[j];
        let c = (self.s2[i] - self.s2[j]) - d1 * d1 / dw;
        if c > 0.0 { c } else { 0.0 }
    }
}

/// Exclusive end indices (into `values`) of the k optimal classes; the last
/// is `values.len()`. Requires 1 <= k <= values.len() and whole-number
/// weights (multiplicities).
pub fn optimal_ends(values: &[f64], weights: &[f64], k: usize) -> Vec<usize> {
    let m = values.len();
    if k == 1 || k == m || m < PRUNE_FROM {
        return optimal_ends_full(values, weights, k);
    }
    let p = Prefix::new(values, weights);
    let spacing = m.div_ceil(PRUNE_GRID);
    super::jenks_pruning::optimal_ends(values, &p, k, spacing, true)
        .unwrap_or_else(|| full_programme(&p, k))
}

/// Inputs with at least this many distinct values are first tried with the
/// pruned programme (`jenks_pruning.rs`).
const PRUNE_FROM: usize = 20_000;

/// Grid points of the pruned programme's bounds.
const PRUNE_GRID: usize = 8192;

/// [`optimal_ends`] by the pruned programme with grid step `spacing`,
/// never stopping early even where pruning does not pay (for tests on
/// small inputs); None only when the grid has too few points for k
/// classes. Requires 2 <= k < values.len().
pub fn optimal_ends_pruned(
    values: &[f64],
    weights: &[f64],
    k: usize,
    spacing: usize,
) -> Option<Vec<usize>> {
    let p = Prefix::new(values, weights);
    super::jenks_pruning::optimal_ends(values, &p, k, spacing, false)
}

/// [`optimal_ends`] by the full programme (every row of every layer).
pub fn optimal_ends_full(values: &[f64], weights: &[f64], k: usize) -> Vec<usize> {
    let m = values.len();
    debug_assert!(k >= 1 && k <= m);
    if k == 1 {
        return vec![m];
    }
    if k == m {
        return (1..=m).collect();
    }
    full_programme(&Prefix::new(values, weights), k)
}

/// The full programme on prefix sums of m points, 2 <= k < m.
fn full_programme(p: &Prefix, k: usize) -> Vec<usize> {
    let m = p.w.len() - 1;
    let layer = Layer::new(p);
    // prev[i] = D[c-1][i] for i in 0..=m (cost of the best (c-1)-class split of
    // the first i points); unreachable cells are +inf. From layer 3 on, the
    // cells outside the rows a layer owns hold stale values from two layers
    // before; no step reads them (layer c reads columns c - 1..=m - (k - c + 1),
    // exactly the rows of layer c - 1), except the last cell, which reads
    // layer k - 1 after it was reset to +inf.
    let mut prev: Vec<f64> = (0..=m)
        .map(|i| if i == 0 { f64::INFINITY } else { p.cost(0, i) })
        .collect();
    let mut cur = vec![f64::INFINITY; m + 1];
    // back[c - 2][i] = start of the last class in the best c-class split of
    // the first i points, for layers c = 2..k-1.
    let mut back: Vec<Vec<u32>> = Vec::with_capacity(k.saturating_sub(2));
    for c in 2..k {
        let mut arg = vec![0u32; m + 1];
        // q[j] = D[c-1][j] - S2[j]: the part of an entry that depends on j
        // only, in place of D[c-1] (which no later step reads).
        for (d, s2) in prev.iter_mut().zip(&p.s2) {
            *d -= s2;
        }
        // Rows i = c..=m - (k - c): later rows cannot lead to a k-class split.
        // Columns j = c - 1..i (the start of the last class).
        let (lo, hi) = (c, m - (k - c));
        let job = Job {
            layer: &layer,
            q: &prev,
            floor: back.last().map(|a| &a[..]),
        };
        if c + 1 < k {
            job.solve(&mut cur[lo..=hi], &mut arg[lo..=hi], (lo, 1), c - 1, hi - 1);
        } else {
            // Rows that the pruning skips must read as unreachable in the
            // last cell; the layers before write every row they own.
            cur.iter_mut().for_each(|v| *v = f64::INFINITY);
            last_split_rows(&job, &mut cur, &mut arg, lo, hi);
        }
        back.push(arg);
        std::mem::swap(&mut prev, &mut cur);
    }
    // Last layer: one cell, i = m (rows left at +inf were pruned).
    let mut best = f64::INFINITY;
    let mut best_j = k - 1;
    for (j, &d) in prev.iter().enumerate().take(m).skip(k - 1) {
        let v = d + p.cost(j, m);
        if v < best {
            best = v;
            best_j = j;
        }
    }
    let mut ends = vec![0usize; k];
    ends[k - 1] = m;
    let mut j = best_j;
    for c in (1..k).rev() {
        ends[c - 1] = j;
        if c >= 2 {
            j = back[c - 2][j] as usize;
        }
    }
    ends
}

/// The layer before the single last cell: D[k-1][i] is needed only for the
/// rows i that can start the last class of an optimum. Every
/// `stride`-th row is solved first; a gap of rows (i0, i1) between
/// two of them is then solved only if its lower bound
/// D[k-1][i0] + cost(i1 - 1, m) can beat the best split found so far
/// (D is non-decreasing in the prefix length and a class's sum of squares
/// only grows when points are added, so no row of the gap can do better
/// than the bound). A margin of 1e-9 of the total sum of squares covers
/// rounding, so a gap is skipped only when it is clearly worse. Rows
/// skipped stay at +inf.
fn last_split_rows(job: &Job, cur: &mut [f64], arg: &mut [u32], lo: usize, hi: usize) {
    let p = job.layer.p;
    let m = p.w.len() - 1;
    let stride = (4 * m.isqrt()).max(2);
    let count = (hi - lo) / stride + 1;
    let mut sp_out = vec![0.0; count];
    let mut sp_arg = vec![0u32; count];
    let cols = (lo - 1, hi - 1);
    job.solve(&mut sp_out, &mut sp_arg, (lo, stride), cols.0, cols.1);
    let mut upper = f64::INFINITY;
    for (t, (&d, &g)) in sp_out.iter().zip(&sp_arg).enumerate() {
        let i = lo + t * stride;
        cur[i] = d;
        arg[i] = g;
        upper = upper.min(d + p.cost(i, m));
    }
    let margin = 1e-9 * p.s2[m].abs();
    for t in 0..count {
        let i0 = lo + t * stride;
        let (i1, jhi) = if t + 1 < count {
            (i0 + stride, sp_arg[t + 1] as usize)
        } else {
            (hi + 1, cols.1)
        };
        if i1 <= i0 + 1 || cur[i0] + p.cost(i1 - 1, m) > upper + margin {
            continue;
        }
        let rows = (i0 + 1, 1);
        job.solve(
            &mut cur[i0 + 1..i1],
            &mut arg[i0 + 1..i1],
            rows,
            sp_arg[t] as usize,
            jhi,
        );
    }
}

/// What every layer shares: the prefix sums, whole-number prefix weights and
/// a table of reciprocals. Class weights are whole numbers d = W[i] - W[j]
/// <= T (the total weight), so a multiplication by `rinv[T - d] = 1 / d`
/// replaces the division in the inner loop. The table is reversed so that
/// the reciprocals of one row's candidates j = a..=b are one contiguous,
/// ascending slice whenever points a..b all have weight 1.
struct Layer<'a> {
    p: &'a Prefix,
    wint: &'a [u32],
    total: u32,
    rinv: Vec<f64>,
}

impl<'a> Layer<'a> {
    fn new(p: &'a Prefix) -> Layer<'a> {
        let wint = &p.w[..];
        let total = *wint.last().unwrap_or(&0);
        let rinv = (0..=total)
            .map(|t| {
                let d = total - t;
                if d == 0 { 0.0 } else { 1.0 / d as f64 }
            })
            .collect();
        Layer {
            p,
            wint,
            total,
            rinv,
        }
    }
}

/// One layer of the programme: rows i, columns j (start of the last class),
/// entry q[j] - (S1[i] - S1[j])^2 / (W[i] - W[j]) (+ S2[i], constant in a
/// row). The cost is Monge, so the leftmost argmin is non-decreasing in i.
struct Job<'a> {
    layer: &'a Layer<'a>,
    q: &'a [f64],
    /// The previous layer's argmins (none for layer 2, whose previous
    /// layer is the closed-form first one): the last class of the best
    /// c-class split of a prefix starts no earlier than that of the best
    /// (c-1)-class split of the same prefix, so row i scans from
    /// floor[i] on.
    floor: Option<&'a [u32]>,
}

/// Blocks whose candidate range is at least this wide are split across
/// threads.
const PARALLEL_COLUMNS: usize = 1 << 15;

/// Row blocks up to this size are filled row by row instead of divided.
const SEQ_ROWS: usize = 4;

/// Independent lanes of the candidate scan (a multiple of the vector width,
/// so the compiler keeps them in vector registers).
const LANES: usize = 8;

/// Candidates per block of the scan (a multiple of `LANES`).
const BLOCK: usize = 32;

/// Candidates per gathered tile of reciprocals (a multiple of `BLOCK`).
const TILE: usize = 256;

/// Running minimum over blocks of candidates: the smallest value seen and
/// the first block that holds it. The hot loop keeps per-lane minima only
/// (vector minimum, no index bookkeeping); the leftmost argmin is found
/// afterwards by rescanning that one block for the first candidate equal to
/// the minimum, with the same arithmetic, so the values compared are
/// bit-identical.
struct BlockMin {
    best: f64,
    block: usize,
}

impl BlockMin {
    /// Feed the blocks of candidates starting at offset `j0` (a multiple of
    /// `BLOCK`), entries q - (s1i - s1)^2 * r. All slices have the same
    /// length, a multiple of `LANES`.
    fn feed(&mut self, j0: usize, s1i: f64, q: &[f64], s1: &[f64], r: &[f64]) {
        block_scan(&mut self.best, &mut self.block, j0 / BLOCK, s1i, q, s1, r);
    }
}

/// The hot loop of [`BlockMin::feed`]: per block, per-lane minima on fixed
/// size arrays (compiled to packed subtract, multiply and minimum), then the
/// block minimum against the running one.
#[inline(never)]
fn block_scan(
    best: &mut f64,
    at: &mut usize,
    b0: usize,
    s1i: f64,
    q: &[f64],
    s1: &[f64],
    r: &[f64],
) {
    // Blocks of up to BLOCK candidates (the last may be shorter, still a
    // multiple of LANES). The lane loop has a run-time trip count, which
    // keeps it a loop that the compiler vectorises (fully unrolled
    // fixed-size blocks are not vectorised in every build configuration).
    let n = q.len().min(s1.len()).min(r.len()) / LANES * LANES;
    let blocks = q[..n]
        .chunks(BLOCK)
        .zip(s1[..n].chunks(BLOCK))
        .zip(r[..n].chunks(BLOCK));
    for (b, ((qb, sb), rb)) in blocks.enumerate() {
        let mut acc = [f64::INFINITY; LANES];
        let chunks = qb
            .chunks_exact(LANES)
            .zip(sb.chunks_exact(LANES))
            .zip(rb.chunks_exact(LANES));
        for ((qc, sc), rc) in chunks {
            let mut v = [0.0; LANES];
            for l in 0..LANES {
                let d = s1i - sc[l];
                v[l] = qc[l] - d * d * rc[l];
            }
            for l in 0..LANES {
                // Written on the bits so that it stays a lane-wise select.
                let take = if v[l] < acc[l] { u64::MAX } else { 0 };
                acc[l] = f64::from_bits((v[l].to_bits() & take) | (acc[l].to_bits() & !take));
            }
        }
        let mut m = acc[0];
        for &a in &acc[1..] {
            if a < m {
                m = a;
            }
        }
        if m < *best {
            *best = m;
            *at = b0 + b;
        }
    }
}

impl Job<'_> {
    /// Fill `out[r]`, `arg[r]` for rows i = row0 + r * stride with the
    /// minimum over j in [jlo, min(jhi, i - 1)], by divide and conquer over
    /// the monotone argmin.
    fn solve(
        &self,
        out: &mut [f64],
        arg: &mut [u32],
        (row0, stride): (usize, usize),
        jlo: usize,
        jhi: usize,
    ) {
        if out.len() <= SEQ_ROWS {
            // A short block: rows in order, each from the previous row's
            // argmin (monotone) up to the block's bound; no recursion.
            let mut lo = jlo;
            for (r, (o, g)) in out.iter_mut().zip(arg.iter_mut()).enumerate() {
                let i = row0 + r * stride;
                let (best, best_j) = self.row_min(i, self.from(i, lo), jhi.min(i - 1));
                *o = best + self.layer.p.s2[i];
                *g = best_j as u32;
                lo = best_j;
            }
            return;
        }
        let mid = out.len() / 2;
        let i = row0 + mid * stride;
        let (best, best_j) = self.row_min(i, self.from(i, jlo), jhi.min(i - 1));
        out[mid] = best + self.layer.p.s2[i];
        arg[mid] = best_j as u32;
        let (out_l, out_r) = out.split_at_mut(mid);
        let (arg_l, arg_r) = arg.split_at_mut(mid);
        let (out_r, arg_r) = (&mut out_r[1..], &mut arg_r[1..]);
        let right = (i + stride, stride);
        if jhi - jlo >= PARALLEL_COLUMNS {
            rayon::join(
                || self.solve(out_l, arg_l, (row0, stride), jlo, best_j),
                || self.solve(out_r, arg_r, right, best_j, jhi),
            );
        } else {
            self.solve(out_l, arg_l, (row0, stride), jlo, best_j);
            self.solve(out_r, arg_r, right, best_j, jhi);
        }
    }

    /// The first column row i must scan, given the block's lower bound.
    #[inline]
    fn from(&self, i: usize, lo: usize) -> usize {
        match self.floor {
            Some(f) => lo.max(f[i] as usize).min(i - 1),
            None => lo,
        }
    }

    /// Minimum (without the row constant) and leftmost argmin of row i over
    /// columns a..=b.
    #[inline]
    fn row_min(&self, i: usize, a: usize, b: usize) -> (f64, usize) {
        if b + 1 - a < BLOCK {
            self.short_row_min(i, a, b)
        } else {
            self.long_row_min(i, a, b)
        }
    }

    /// [`Job::row_min`] for short rows (most rows of the deeper levels): a
    /// plain scan, inlined into the recursion. Written as selects, not
    /// branches: which candidate wins is unpredictable, and a mispredicted
    /// branch costs more than the entry itself.
    #[inline(always)]
    fn short_row_min(&self, i: usize, a: usize, b: usize) -> (f64, usize) {
        let l = self.layer;
        let s1i = l.p.s1[i];
        let shift = l.total - l.wint[i];
        let q = &self.q[a..=b];
        let s1 = &l.p.s1[a..=b];
        let w = &l.wint[a..=b];
        let n = q.len().min(s1.len()).min(w.len());
        let rinv = &l.rinv[..];
        let (mut best, mut best_j) = (f64::INFINITY, 0);
        for j in 0..n {
            let d = s1i - s1[j];
            let v = q[j] - d * d * rinv[(w[j] + shift) as usize];
            let lt = v < best;
            best_j = if lt { j } else { best_j };
            best = if lt { v } else { best };
        }
        (best, a + best_j)
    }

    /// [`Job::row_min`] for rows of at least `BLOCK` candidates: the
    /// vectorised block scan.
    #[inline(never)]
    fn long_row_min(&self, i: usize, a: usize, b: usize) -> (f64, usize) {
        let l = self.layer;
        let (s1i, wi) = (l.p.s1[i], l.wint[i]);
        let q = &self.q[a..=b];
        let s1 = &l.p.s1[a..=b];
        let w = &l.wint[a..=b];
        // rinv index of candidate j: W[j] + T - W[i] (< T since W[j] < W[i]).
        let shift = l.total - wi;
        let n = q.len();
        let entry = |j: usize| {
            let d = s1i - s1[j];
            q[j] - d * d * l.rinv[(w[j] + shift) as usize]
        };
        let full = n - n % LANES;
        let mut blocks = BlockMin {
            best: f64::INFINITY,
            block: usize::MAX,
        };
        if w[n - 1] - w[0] == (n - 1) as u32 {
            // Unit weights: the reciprocals are one ascending slice.
            let r0 = (w[0] + shift) as usize;
            let r = &l.rinv[r0..r0 + full];
            blocks.feed(0, s1i, &q[..full], &s1[..full], r);
        } else {
            let mut r = [0.0; TILE];
            for t0 in (0..full).step_by(TILE) {
                let t1 = (t0 + TILE).min(full);
                for (rt, &wj) in r.iter_mut().zip(&w[t0..t1]) {
                    *rt = l.rinv[(wj + shift) as usize];
                }
                let len = t1 - t0;
                blocks.feed(t0, s1i, &q[t0..t1], &s1[t0..t1], &r[..len]);
            }
        }
        let mut best = blocks.best;
        let mut best_j = 0;
        if blocks.block != usize::MAX {
            let start = blocks.block * BLOCK;
            best_j = (start..(start + BLOCK).min(full))
                .find(|&j| entry(j) == best)
                .unwrap_or(start);
        }
        for j in full..n {
            let v = entry(j);
            if v < best {
                best = v;
                best_j = j;
            }
        }
        (best, a + best_j)
    }
}

/// SDCM of the partition of weighted points given by exclusive `ends`.
pub fn partition_cost(values: &[f64], weights: &[f64], ends: &[usize]) -> f64 {
    let p = Prefix::new(values, weights);
    let mut start = 0;
    let mut total = 0.0;
    for &e in ends {
        total += p.cost(start, e);
        start = e;
    }
    total
}
