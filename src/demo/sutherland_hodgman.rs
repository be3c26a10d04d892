//! Sutherland-Hodgman polygon clipping (Sutherland & Hodgman 1974,
//! "Reentrant polygon clipping", *Communications of the ACM* 17(1):32-42),
//! one half-plane at a time, with a tag on every vertex that says whether
//! it lies on the original outline, so the pieces of the coast can be
//! stitched back into one refined outline.
//!
//! Clipping a non-convex subject by a convex region can leave a ring that
//! runs out and back along the clip line when the region cuts the subject
//! into two pieces; the caller checks every result ring and rejects such
//! layouts.

/// Where a vertex came from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Tag {
    /// Vertex `k` of the outline, unchanged.
    Outline(usize),
    /// A new vertex on outline edge `k` (from vertex `k` to `k + 1`).
    Coast(usize),
    /// A new vertex inside the outline (on a clip line only).
    Inner,
}

/// A vertex with its provenance.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Vertex {
    pub p: [f64; 2],
    pub tag: Tag,
}

/// The outline edge that the segment `a`-`b` lies on, if any (`m` is the
/// number of outline vertices).
fn outline_edge(a: Tag, b: Tag, m: usize) -> Option<usize> {
    match (a, b) {
        (Tag::Outline(i), Tag::Outline(j)) if j == (i + 1) % m => Some(i),
        (Tag::Outline(i), Tag::Outline(j)) if i == (j + 1) % m => Some(j),
        (Tag::Outline(i), Tag::Coast(k)) | (Tag::Coast(k), Tag::Outline(i))
            if i == k || i == (k + 1) % m =>
        {
            Some(k)
        }
        (Tag::Coast(k), Tag::Coast(l)) if k == l => Some(k),
        _ => None,
    }
}

/// Keep the part of `ring` where `n · p <= c` (the half-plane with outward
/// normal `n`). `m` is the number of outline vertices, for the tags.
pub(crate) fn clip_half_plane(ring: &[Vertex], n: [f64; 2], c: f64, m: usize) -> Vec<Vertex> {
    let side = |p: [f64; 2]| n[0] * p[0] + n[1] * p[1] - c;
    let mut out = Vec::with_capacity(ring.len() + 2);
    let len = ring.len();
    for i in 0..len {
        let cur = ring[i];
        let next = ring[(i + 1) % len];
        let (sc, sn) = (side(cur.p), side(next.p));
        if sc <= 0.0 {
            out.push(cur);
        }
        if (sc <= 0.0) != (sn <= 0.0) {
            let t = sc / (sc - sn);
            let p = [
                cur.p[0] + t * (next.p[0] - cur.p[0]),
                cur.p[1] + t * (next.p[1] - cur.p[1]),
            ];
            let tag = match outline_edge(cur.tag, next.tag, m) {
                Some(k) => Tag::Coast(k),
                None => Tag::Inner,
            };
            out.push(Vertex { p, tag });
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    fn square() -> Vec<Vertex> {
        [[0.0, 0.0], [2.0, 0.0], [2.0, 2.0], [0.0, 2.0]]
            .iter()
            .enumerate()
            .map(|(k, &p)| Vertex {
                p,
                tag: Tag::Outline(k),
            })
            .collect()
    }

    #[test]
    fn clipping_a_square_by_x_le_1_keeps_the_left_half_with_coast_tags() {
        let r = clip_half_plane(&square(), [1.0, 0.0], 1.0, 4);
        let pts: Vec<_> = r.iter().map(|v| v.p).collect();
        assert_eq!(pts, vec![[0.0, 0.0], [1.0, 0.0], [1.0, 2.0], [0.0, 2.0]]);
        assert_eq!(r[1].tag, Tag::Coast(0));
        assert_eq!(r[2].tag, Tag::Coast(2));
        // A second cut crosses the new edge along the clip line: inner.
        let r2 = clip_half_plane(&r, [0.0, 1.0], 1.0, 4);
        assert!(r2.iter().any(|v| v.tag == Tag::Inner && v.p == [1.0, 1.0]));
    }
}
