//! Exact pruning of the Fisher (1958) natural-breaks programme by bounds
//! computed on a coarse grid: on large inputs most rows of every layer
//! provably cannot lie on an optimal partition and are never computed.
//!
//! The programme of [`super::fisher_jenks`] fills D[c][i] (the best c-class
//! split of the first i points) for every row i of every layer. Only the
//! rows near the optimal class ends matter. With
//!
//! - U, the cost of one feasible k-class partition (an upper bound on the
//!   optimum), and
//! - LB[r](i), a lower bound on the best r-class split of the points from
//!   i on (the suffix),
//!
//! a row i of layer c can lie on an optimal partition only if
//! D[c][i] + LB[k-c](i) <= U. Rows are computed on the grid first (every
//! s-th row); D is non-decreasing in the prefix, so a gap between two grid
//! rows x0 < x1 is skipped when D[c][x0] + min LB over the gap > U, and
//! every computed row that fails the test is dropped as well. The next
//! layer takes its candidates only from the rows kept.
//!
//! Why this is exact: every row of every optimal partition passes the test
//! (its prefix part is exact, because the rows of that partition in earlier
//! layers were kept, by induction, and its suffix part is at least the
//! bound). A row dropped from a layer ties with no optimal partition, so
//! leftmost argmins along the optimal partition are the same as in the full
//! programme, and the entries use the same arithmetic as it; the partition
//! found is the one the full programme finds. A margin of 1e-9 of the total
//! sum of squares in every test covers rounding.
//!
//! The bounds:
//!
//! - U: the optimal k-class partition whose ends lie on the grid (a
//!   programme on the G + 1 grid points only), improved by Lloyd
//!   iterations (each class end moved to the midpoint between the
//!   neighbouring class means, while the cost falls).
//! - LB[r](i): shrink every class of any r-class split of the suffix from
//!   i to the grid points inside it (a class's sum of squares can only fall
//!   when points are removed). The shrunk classes start and end on grid
//!   points, one after the other with at most one grid cell between them,
//!   so the best such chain, L[r][a] from grid point a, is a lower bound
//!   for every suffix starting in the cell that ends at grid point a. L is
//!   a programme on the grid too: L[1][a] = cost(a, end) and
//!   L[r][a] = min over b >= a of cost(a, b) + min(L[r-1][b], L[r-1][b+1]).
//!
//! All three programmes on rows (grid, suffix bounds, kept rows) use the
//! monotone leftmost argmin of a Monge array (the within-class sum of
//! squares satisfies the quadrangle inequality) with divide and conquer.
//! The grid has about 8,192 cells of at most m / 8,192 points each, and a
//! cell of more than one point spans less than 1/8,192 of the value range
//! (fine cells in the sparse tail of skewed data, where a class holds few
//! points far apart).
//!
//! It stops early, and the full programme runs instead, where pruning
//! cannot pay: when a layer computes more than half of its rows, and when
//! the rounding margin exceeds 1e-4 of U (classes tiny next to the total
//! spread, as with far clusters, where every cost is within rounding of
//! its neighbours).
//!
//! Measured on 1,000,000 lognormal values, k = 7 (`cargo bench --bench
//! natural_breaks`): the grid bounds take about 8 ms; the six layers
//! compute about 97,000, 65,000, 37,000, 19,000, 11,000 and 10,000 rows
//! instead of a million each and keep 87,000 down to 75; the whole is
//! about 2 times the sort of the same values, against about 4 for the
//! full programme.

use rayon::prelude::*;

use super::fisher_jenks::Prefix;

/// The grid: positions 0 = g(0) < g(1) < ... < g(last) = m. A cell holds
/// at most `s` points and, unless it is one point, spans less than a
/// value step `dv` (so that sparse, spread-out stretches of the data,
/// such as the tail of skewed data, get fine cells: the bounds lose the
/// points of a cell, and a spread-out cell would lose much).
struct Grid {
    pts: Vec<usize>,
    /// Index of the last grid point (g(last) = m).
    last: usize,
}

impl Grid {
    fn new(values: &[f64], s: usize, dv: f64) -> Grid {
        let m = values.len();
        let mut pts = vec![0];
        let mut a = 0;
        while a < m {
            let end = (a + s).min(m);
            let reach = values[a] + dv;
            let b = a + 1 + values[a + 1..end].partition_point(|&v| v < reach);
            pts.push(b);
            a = b;
        }
        let last = pts.len() - 1;
        Grid { pts, last }
    }

    /// Position of grid point a.
    fn at(&self, a: usize) -> usize {
        self.pts[a]
    }

    /// The first grid point at or after position i.
    fn ceil(&self, i: usize) -> usize {
        self.pts.partition_point(|&g| g < i).min(self.last)
    }
}

/// Leftmost minima of the rows r0.. of a matrix whose leftmost argmin is
/// non-decreasing in the row (divide and conquer): row r scans the columns
/// span(r) within [lo, hi]; a row with no column gets +inf at `lo`.
fn monotone_min<S, E>(
    out: &mut [(f64, usize)],
    r0: usize,
    lo: usize,
    hi: usize,
    span: &S,
    entry: &E,
) where
    S: Fn(usize) -> (usize, usize) + Sync,
    E: Fn(usize, usize) -> f64 + Sync,
{
    if out.is_empty() {
        return;
    }
    let mid = out.len() / 2;
    let r = r0 + mid;
    let (a, b) = span(r);
    let (a, b) = (a.max(lo), b.min(hi));
    let mut best = (f64::INFINITY, lo);
    if a <= b {
        best.1 = a;
        for j in a..=b {
            let v = entry(r, j);
            if v < best.0 {
                best = (v, j);
            }
        }
    }
    out[mid] = best;
    let split = best.1;
    let (left, right) = out.split_at_mut(mid);
    let right = &mut right[1..];
    if left.len() >= PARALLEL_ROWS {
        rayon::join(
            || monotone_min(left, r0, lo, split, span, entry),
            || monotone_min(right, r + 1, split, hi, span, entry),
        );
    } else {
        monotone_min(left, r0, lo, split, span, entry);
        monotone_min(right, r + 1, split, hi, span, entry);
    }
}

/// Blocks of at least this many rows are split across threads.
const PARALLEL_ROWS: usize = 2048;

/// The columns lo..=b, or none when b < lo (written so that b - 1 of a
/// zero b is no wrap-around).
fn up_to(lo: usize, b: Option<usize>) -> (usize, usize) {
    match b {
        Some(b) if b >= lo => (lo, b),
        _ => (1, 0),
    }
}

/// The rows of one layer that were kept: their positions (prefix lengths),
/// D[c] there, and the kept row of the layer before that starts their last
/// class.
struct Kept {
    rows: Vec<u32>,
    d: Vec<f64>,
    back: Vec<u32>,
}

/// Exclusive ends of the optimal k-class partition, or None when the
/// pruning does not pay (the caller then runs the full programme).
/// `values` are the sorted unique values whose prefix sums `p` holds;
/// `spacing` is the grid step s; with `give_up`, it stops (None) as soon
/// as a layer computes more than half of its rows. Requires 2 <= k < m.
pub(crate) fn optimal_ends(
    values: &[f64],
    p: &Prefix,
    k: usize,
    spacing: usize,
    give_up: bool,
) -> Option<Vec<usize>> {
    let m = values.len();
    let range = values[m - 1] - values[0];
    let grid = Grid::new(values, spacing.max(1), range * spacing as f64 / m as f64);
    if grid.last < k + 1 {
        return None;
    }
    let (upper, lower) = rayon::join(
        || upper_bound(values, p, k, &grid),
        || suffix_bounds(p, k, &grid),
    );
    let upper = upper?;
    let margin = 1e-9 * p.s2[m].abs();
    // Data whose classes are tiny next to its total spread (far clusters)
    // leave the rounding margin as large as the costs compared: nothing
    // could be pruned.
    if give_up && margin > 1e-4 * upper {
        return None;
    }
    let limit = upper + margin;
    // lb(r, i): lower bound of the best r-class split of points i..m.
    let lb = |r: usize, i: usize| lower[r - 1][grid.ceil(i)];
    let mut layers: Vec<Kept> = Vec::with_capacity(k - 1);
    for c in 1..k {
        // Rows that can end class c of a k-class split.
        let (lo, hi) = (c, m - (k - c));
        let r = k - c;
        // Anchors: the first and last rows and the grid points between.
        let mut anchors: Vec<usize> = vec![lo];
        anchors.extend(
            (grid.ceil(lo + 1)..=grid.last)
                .map(|a| grid.at(a))
                .take_while(|&g| g < hi),
        );
        if hi > lo {
            anchors.push(hi);
        }
        let prev = layers.last();
        let row_min = |rows: &[usize], out: &mut [(f64, usize)], clo: usize, chi: usize| match prev
        {
            None => {
                for (o, &i) in out.iter_mut().zip(rows) {
                    *o = (p.cost(0, i), 0);
                }
            }
            Some(kp) => restricted_rows(p, kp, rows, out, clo, chi),
        };
        let cols_hi = prev.map_or(0, |kp| kp.rows.len().saturating_sub(1));
        let mut at = vec![(0.0, 0); anchors.len()];
        row_min(&anchors, &mut at, 0, cols_hi);
        let mut kept = Kept {
            rows: Vec::new(),
            d: Vec::new(),
            back: Vec::new(),
        };
        let mut computed = anchors.len();
        let keep = |kept: &mut Kept, i: usize, (d, j): (f64, usize)| {
            if d + lb(r, i) <= limit {
                kept.rows.push(i as u32);
                kept.d.push(d);
                kept.back.push(prev.map_or(0, |kp| kp.rows[j]));
            }
        };
        // The gaps between anchors that can hold a row of an optimal
        // partition, then their rows (in parallel: each gap is its own
        // block of the monotone programme), then the rows kept, in order.
        let open: Vec<usize> = (0..anchors.len().saturating_sub(1))
            .filter(|&t| {
                let (x0, x1, d0) = (anchors[t], anchors[t + 1], at[t].0);
                if x1 <= x0 + 1 {
                    return false;
                }
                // A lower bound of D[c] over the gap: a row whose last
                // class starts before x0 costs at least D[c][x0]; one whose
                // last class starts at a kept row j in [x0, x1 - 2] costs at
                // least D[c-1][j].
                let prefix_lb = match prev {
                    None => d0,
                    Some(kp) => {
                        let a = kp.rows.partition_point(|&j| (j as usize) < x0);
                        let b = kp.rows.partition_point(|&j| (j as usize) + 1 < x1);
                        kp.d[a..b].iter().copied().fold(d0, f64::min)
                    }
                };
                let gap_lb = (grid.ceil(x0 + 1)..=grid.ceil(x1 - 1))
                    .map(|a| lower[r - 1][a])
                    .fold(f64::INFINITY, f64::min);
                prefix_lb + gap_lb <= limit
            })
            .collect();
        let gaps: Vec<Vec<(f64, usize)>> = open
            .par_iter()
            .map(|&t| {
                let rows: Vec<usize> = (anchors[t] + 1..anchors[t + 1]).collect();
                let mut out = vec![(0.0, 0); rows.len()];
                row_min(&rows, &mut out, at[t].1, at[t + 1].1);
                out
            })
            .collect();
        let mut gaps = open.iter().zip(&gaps).peekable();
        for (t, (&x0, &d0)) in anchors.iter().zip(&at).enumerate() {
            keep(&mut kept, x0, d0);
            if let Some((_, out)) = gaps.next_if(|g| *g.0 == t) {
                computed += out.len();
                for (i, &o) in (x0 + 1..).zip(out) {
                    keep(&mut kept, i, o);
                }
            }
        }
        if kept.rows.is_empty() || (give_up && computed > m / 2) {
            return None;
        }
        layers.push(kept);
    }
    // The last class: one cell.
    let kp = layers.last()?;
    let mut best = (f64::INFINITY, 0usize);
    for (t, (&j, &d)) in kp.rows.iter().zip(&kp.d).enumerate() {
        let v = d + p.cost(j as usize, m);
        if v < best.0 {
            best = (v, t);
        }
    }
    if best.0.is_nan() || best.0 > limit {
        return None;
    }
    let mut ends = vec![0usize; k];
    ends[k - 1] = m;
    let mut row = kp.rows[best.1];
    for c in (1..k).rev() {
        ends[c - 1] = row as usize;
        let kp = &layers[c - 1];
        let t = kp.rows.binary_search(&row).ok()?;
        row = kp.back[t];
    }
    Some(ends)
}

/// D[c] at `rows` (ascending) from the kept rows of layer c - 1, columns
/// (positions in `kp`) within [clo, chi]: the entries of the full programme,
/// with the same arithmetic, D[c-1][j] - S2[j] - (S1[i] - S1[j])^2 / (W[i] -
/// W[j]) + S2[i].
fn restricted_rows(
    p: &Prefix,
    kp: &Kept,
    rows: &[usize],
    out: &mut [(f64, usize)],
    clo: usize,
    chi: usize,
) {
    let cols = &kp.rows;
    let q: Vec<f64> = kp.d[clo..=chi]
        .iter()
        .zip(&cols[clo..=chi])
        .map(|(&d, &j)| d - p.s2[j as usize])
        .collect();
    // Columns j < i only.
    let span = |r: usize| {
        let i = rows[r] as u32;
        let lim = clo + cols[clo..=chi].partition_point(|&j| j < i);
        up_to(clo, lim.checked_sub(1))
    };
    let entry = |r: usize, t: usize| {
        let i = rows[r];
        let j = cols[t] as usize;
        let d = p.s1[i] - p.s1[j];
        let recip = 1.0 / (p.w[i] - p.w[j]) as f64;
        q[t - clo] - d * d * recip
    };
    monotone_min(out, 0, clo, chi, &span, &entry);
    for (o, &i) in out.iter_mut().zip(rows) {
        o.0 += p.s2[i];
    }
}

/// U: the cost of the best k-class partition with ends on the grid,
/// improved by Lloyd iterations. None when no such partition exists.
fn upper_bound(values: &[f64], p: &Prefix, k: usize, grid: &Grid) -> Option<f64> {
    let n = grid.last + 1;
    let cost = |a: usize, b: usize| p.cost(grid.at(a), grid.at(b));
    // c = 1: one class from point 0 to grid point b.
    let mut prev: Vec<f64> = (0..n)
        .map(|b| if b == 0 { f64::INFINITY } else { cost(0, b) })
        .collect();
    let mut back: Vec<Vec<usize>> = Vec::with_capacity(k - 1);
    for c in 2..=k {
        let mut out = vec![(f64::INFINITY, 0); n];
        monotone_min(
            &mut out,
            0,
            0,
            n - 1,
            &|b| up_to(c - 1, b.checked_sub(1)),
            &|b, a| prev[a] + cost(a, b),
        );
        back.push(out.iter().map(|o| o.1).collect());
        prev = out.iter().map(|o| o.0).collect();
    }
    if !prev[n - 1].is_finite() {
        return None;
    }
    let mut ends = vec![0usize; k];
    let mut b = n - 1;
    for c in (0..k).rev() {
        ends[c] = grid.at(b);
        if c > 0 {
            b = back[c - 1][b];
        }
    }
    let total = |e: &[usize]| {
        let mut start = 0;
        e.iter()
            .map(|&end| {
                let v = p.cost(start, end);
                start = end;
                v
            })
            .sum::<f64>()
    };
    let mut best = total(&ends);
    // Lloyd: each end moves to the midpoint of its neighbours' means.
    let centre = p.centre;
    for _ in 0..100 {
        let mut next = ends.clone();
        let mut start = 0;
        let means: Vec<f64> = ends
            .iter()
            .map(|&e| {
                let mean = (p.s1[e] - p.s1[start]) / (p.w[e] - p.w[start]) as f64;
                start = e;
                mean
            })
            .collect();
        for c in 0..k - 1 {
            let mid = centre + 0.5 * (means[c] + means[c + 1]);
            next[c] = values.partition_point(|&v| v <= mid);
        }
        let valid = next.windows(2).all(|w| w[0] < w[1]) && next[0] > 0;
        if !valid || next == ends {
            break;
        }
        let t = total(&next);
        if t.is_nan() || t >= best {
            break;
        }
        best = t;
        ends = next;
    }
    Some(best)
}

/// L[r - 1][a] for r = 1..k-1: lower bounds of the best r-class split of
/// the points from any position in the grid cell ending at grid point a.
fn suffix_bounds(p: &Prefix, k: usize, grid: &Grid) -> Vec<Vec<f64>> {
    let n = grid.last + 1;
    let cost = |a: usize, b: usize| {
        let (i, j) = (grid.at(a), grid.at(b));
        if j > i { p.cost(i, j) } else { 0.0 }
    };
    // split[b]: the least cost of cell b (points g(b)..g(b + 1)) cut once
    // strictly inside (+inf for a cell of one point).
    let split: Vec<f64> = (0..n - 1)
        .into_par_iter()
        .map(|b| {
            let (i, j) = (grid.at(b), grid.at(b + 1));
            (i + 1..j)
                .map(|e| p.cost(i, e) + p.cost(e, j))
                .fold(f64::INFINITY, f64::min)
        })
        .collect();
    let mut out: Vec<Vec<f64>> = Vec::with_capacity(k - 1);
    out.push((0..n).map(|a| cost(a, n - 1)).collect());
    for r in 2..k {
        // h[b]: the rest after a shrunk class that ends at grid point b:
        // the next class starts at b; or the one end inside cell b, whose
        // two pieces cost at least split[b]; or two or more ends inside
        // cell b (classes inside the cell, at least 0), leaving at most
        // r - 2 classes from b + 1.
        let l1 = &out[r - 2];
        let l2 = (r >= 3).then(|| &out[r - 3]);
        let h: Vec<f64> = (0..n)
            .map(|b| {
                let mut v = l1[b];
                if b + 1 < n {
                    v = v.min(split[b] + l1[b + 1]);
                    if let Some(l2) = l2 {
                        v = v.min(l2[b + 1]);
                    }
                }
                v
            })
            .collect();
        let mut rows = vec![(f64::INFINITY, 0); n];
        monotone_min(&mut rows, 0, 0, n - 1, &|a| (a, n - 1), &|a, b| {
            cost(a, b) + h[b]
        });
        out.push(rows.iter().map(|o| o.0).collect());
    }
    out
}
