//! Arcs: the shared-border topology of a set of rings (the procedure of
//! open-source topology builders, arcs as in the TopoJSON specification).
//!
//! 1. A vertex is a *junction* when, over every ring through it, it has
//!    more than two distinct neighbours: a shared run of border starts or
//!    ends there, or three shapes meet.
//! 2. Each ring is cut at its junctions into arcs; a ring without
//!    junctions is one closed arc, rotated to start at its least vertex.
//! 3. Identical arcs, or arcs identical when reversed, are stored once;
//!    a ring refers to each of its arcs forward or reversed.
//!
//! Vertices compare by exact bit pattern, which is right for borders that
//! share their vertices in the source (as GeoJSON boundary sets do). A
//! vertex of one ring lying on another ring's edge is not detected.

use std::collections::HashMap;

use crate::geo::model::Coord;

fn bits(c: Coord) -> [u64; 2] {
    // +0.0 and -0.0 are the same place.
    [(c[0] + 0.0).to_bits(), (c[1] + 0.0).to_bits()]
}

/// A reference from a ring to an arc.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct ArcRef {
    /// Index into [`Topology::arcs`].
    pub arc: usize,
    /// Walk the arc backwards.
    pub reversed: bool,
}

/// Arcs and the rings made from them.
#[derive(Debug, Clone, PartialEq)]
pub struct Topology {
    /// Arcs. An open arc runs from junction to junction (both included);
    /// a closed arc is a whole ring, stored open.
    pub arcs: Vec<Vec<Coord>>,
    /// Whether each arc is closed.
    pub closed: Vec<bool>,
    /// For each input ring, its arcs in order.
    pub rings: Vec<Vec<ArcRef>>,
}

/// Build the topology of open rings.
pub fn build(rings: &[Vec<Coord>]) -> Topology {
    let mut neighbours: HashMap<[u64; 2], Vec<[u64; 2]>> = HashMap::new();
    for r in rings {
        let n = r.len();
        for i in 0..n {
            let set = neighbours.entry(bits(r[i])).or_default();
            for j in [(i + n - 1) % n, (i + 1) % n] {
                let b = bits(r[j]);
                if set.len() < 3 && !set.contains(&b) {
                    set.push(b);
                }
            }
        }
    }
    let is_junction = |c: Coord| neighbours.get(&bits(c)).is_some_and(|s| s.len() > 2);
    let mut topo = Topology {
        arcs: Vec::new(),
        closed: Vec::new(),
        rings: Vec::with_capacity(rings.len()),
    };
    let mut index: HashMap<Vec<[u64; 2]>, ArcRef> = HashMap::new();
    let mut add = |topo: &mut Topology, arc: Vec<Coord>, closed: bool| -> ArcRef {
        let fwd: Vec<[u64; 2]> = arc.iter().map(|&c| bits(c)).collect();
        if let Some(&r) = index.get(&fwd) {
            return r;
        }
        let id = topo.arcs.len();
        let mut rev = fwd.clone();
        rev.reverse();
        if closed {
            // Reversed closed arc, rotated back to start at the same vertex.
            rev.rotate_right(1);
        }
        index.insert(
            fwd,
            ArcRef {
                arc: id,
                reversed: false,
            },
        );
        index.entry(rev).or_insert(ArcRef {
            arc: id,
            reversed: true,
        });
        topo.arcs.push(arc);
        topo.closed.push(closed);
        ArcRef {
            arc: id,
            reversed: false,
        }
    };
    for r in rings {
        let n = r.len();
        let junctions: Vec<usize> = (0..n).filter(|&i| is_junction(r[i])).collect();
        let mut refs = Vec::new();
        if junctions.is_empty() {
            let start = (0..n)
                .min_by(|&a, &b| {
                    r[a][0]
                        .total_cmp(&r[b][0])
                        .then(r[a][1].total_cmp(&r[b][1]))
                })
                .unwrap_or(0);
            let mut arc = r.clone();
            arc.rotate_left(start);
            refs.push(add(&mut topo, arc, true));
        } else {
            for (k, &j) in junctions.iter().enumerate() {
                let end = junctions[(k + 1) % junctions.len()];
                let mut arc = vec![r[j]];
                let mut i = j;
                loop {
                    i = (i + 1) % n;
                    arc.push(r[i]);
                    if i == end {
                        break;
                    }
                }
                refs.push(add(&mut topo, arc, false));
            }
        }
        topo.rings.push(refs);
    }
    topo
}

impl Topology {
    /// Reassemble ring `i` from the arcs, keeping the vertices for which
    /// `keep(arc, vertex)` is true (arc ends are always passed in).
    pub fn ring(&self, i: usize, keep: &dyn Fn(usize, usize) -> bool) -> Vec<Coord> {
        let mut out = Vec::new();
        for r in &self.rings[i] {
            let arc = &self.arcs[r.arc];
            let n = arc.len();
            let idx: Vec<usize> = if r.reversed {
                if self.closed[r.arc] {
                    std::iter::once(0).chain((1..n).rev()).collect()
                } else {
                    (0..n).rev().collect()
                }
            } else {
                (0..n).collect()
            };
            let skip_last = !self.closed[r.arc];
            let take = if skip_last { n - 1 } else { n };
            for &v in idx.iter().take(take) {
                if keep(r.arc, v) {
                    out.push(arc[v]);
                }
            }
        }
        out
    }
}
