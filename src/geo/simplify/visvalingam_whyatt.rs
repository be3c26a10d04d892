//! Visvalingam & Whyatt (1993): repeatedly remove the interior vertex with
//! the smallest effective area (the triangle it forms with its current
//! neighbours), recomputing its neighbours. The area at removal, clamped
//! so it never falls below the area removed before it, is the vertex's
//! importance: a vertex is kept for an area threshold A exactly when its
//! importance exceeds A.

use std::cmp::Reverse;
use std::collections::BinaryHeap;

use crate::geo::model::Coord;

fn tri_area(a: Coord, b: Coord, c: Coord) -> f64 {
    ((b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1])).abs() / 2.0
}

#[derive(PartialEq)]
struct Entry(f64, usize);
impl Eq for Entry {}
impl PartialOrd for Entry {
    fn partial_cmp(&self, o: &Self) -> Option<std::cmp::Ordering> {
        Some(self.cmp(o))
    }
}
impl Ord for Entry {
    fn cmp(&self, o: &Self) -> std::cmp::Ordering {
        self.0.total_cmp(&o.0).then(self.1.cmp(&o.1))
    }
}

/// Importance (effective area) of every vertex of an open path; the ends
/// get infinity.
pub fn importance(path: &[Coord]) -> Vec<f64> {
    let n = path.len();
    let mut imp = vec![f64::INFINITY; n];
    if n < 3 {
        return imp;
    }
    let mut prev: Vec<usize> = (0..n).map(|i| i.wrapping_sub(1)).collect();
    let mut next: Vec<usize> = (1..=n).collect();
    let mut current = vec![0.0; n];
    let mut heap = BinaryHeap::new();
    for i in 1..n - 1 {
        current[i] = tri_area(path[i - 1], path[i], path[i + 1]);
        heap.push(Reverse(Entry(current[i], i)));
    }
    let mut removed = vec![false; n];
    let mut floor = 0.0f64;
    while let Some(Reverse(Entry(area, i))) = heap.pop() {
        if removed[i] || area != current[i] {
            continue; // stale entry
        }
        floor = floor.max(area);
        imp[i] = floor;
        removed[i] = true;
        let (p, q) = (prev[i], next[i]);
        next[p] = q;
        prev[q] = p;
        for j in [p, q] {
            if j != 0 && j != n - 1 {
                current[j] = tri_area(path[prev[j]], path[j], path[next[j]]);
                heap.push(Reverse(Entry(current[j], j)));
            }
        }
    }
    imp
}
