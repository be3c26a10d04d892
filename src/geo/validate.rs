//! Geometry checks shared by the readers: positions, rings and emptiness.
//!
//! Each check records a [`Problem`] with the feature's index and key. With
//! `repair` on, the problems that have a well-defined fix are fixed:
//!
//! - an unclosed ring is closed (its last vertex joins its first);
//! - a ring with fewer than three distinct vertices is dropped (it encloses
//!   no area); a polygon whose exterior is dropped goes with it;
//! - an empty geometry is kept as a feature that draws nothing.
//!
//! Bad coordinates (NaN, infinite, fewer than two numbers) and latitudes
//! outside -90..90 have no safe fix and always exclude the feature.

use super::model::{CoordinateKind, Problem, ProblemKind};

/// Collects the problems of one feature.
pub(crate) struct Checker<'a> {
    pub feature: usize,
    pub key: &'a str,
    pub repair: bool,
    pub coordinates: CoordinateKind,
    pub problems: Vec<Problem>,
    /// Set when an unrepaired problem excludes the feature.
    pub excluded: bool,
}

impl<'a> Checker<'a> {
    pub fn new(feature: usize, key: &'a str, repair: bool, coordinates: CoordinateKind) -> Self {
        Checker {
            feature,
            key,
            repair,
            coordinates,
            problems: Vec::new(),
            excluded: false,
        }
    }

    /// Record a problem; it is repaired when `repair` is on and the kind
    /// allows it, otherwise the feature is excluded.
    pub fn report(&mut self, kind: ProblemKind, detail: String) -> bool {
        let repaired = self.repair && kind.repairable();
        if !repaired {
            self.excluded = true;
        }
        self.problems.push(Problem {
            feature: self.feature,
            key: self.key.to_string(),
            kind,
            detail,
            repaired,
        });
        repaired
    }

    /// Check one position; returns the coordinate if it is usable.
    pub fn position(&mut self, p: &[f64], place: &str) -> Option<[f64; 2]> {
        if p.len() < 2 || !p[0].is_finite() || !p[1].is_finite() {
            let shown: Vec<String> = p.iter().map(|v| v.to_string()).collect();
            self.report(
                ProblemKind::BadCoordinate,
                format!(
                    "{place}: position [{}] is not two finite numbers",
                    shown.join(", ")
                ),
            );
            return None;
        }
        if self.coordinates == CoordinateKind::Geographic && !(-90.0..=90.0).contains(&p[1]) {
            self.report(
                ProblemKind::LatitudeOutOfRange,
                format!(
                    "{place}: latitude {} is outside -90..90 (projected data? use planar coordinates)",
                    p[1]
                ),
            );
            return None;
        }
        Some([p[0], p[1]])
    }

    /// Check a ring given as positions (closed by GeoJSON's rule). Returns
    /// the open ring, or `None` when it is unusable or dropped.
    pub fn ring<'p, I>(&mut self, positions: I, place: &str) -> Option<Vec<[f64; 2]>>
    where
        I: IntoIterator<Item = &'p [f64]>,
    {
        let mut ring = Vec::new();
        let mut ok = true;
        for (i, p) in positions.into_iter().enumerate() {
            match self.position(p, &format!("{place}, position {i}")) {
                Some(c) => ring.push(c),
                None => ok = false,
            }
        }
        if !ok {
            return None;
        }
        if ring.is_empty() {
            self.report(
                ProblemKind::TooFewPositions,
                format!("{place}: ring has no positions"),
            );
            return None;
        }
        let n = ring.len();
        if ring[0] == ring[n - 1] && n > 1 {
            ring.pop();
        } else if !self.report(
            ProblemKind::UnclosedRing,
            format!(
                "{place}: ring is not closed (first position {:?}, last {:?})",
                ring[0],
                ring[n - 1]
            ),
        ) {
            return None;
        }
        // Consecutive repeats carry no shape; drop them before counting.
        ring.dedup();
        while ring.len() > 1 && ring[0] == ring[ring.len() - 1] {
            ring.pop();
        }
        if ring.len() < 3 {
            self.report(
                ProblemKind::TooFewPositions,
                format!(
                    "{place}: ring has {n} positions, {} distinct; a ring needs four positions (three distinct vertices)",
                    ring.len()
                ),
            );
            return None;
        }
        Some(ring)
    }

    /// Record that the feature's geometry is empty or missing.
    pub fn empty(&mut self, what: &str) {
        self.report(ProblemKind::EmptyGeometry, what.to_string());
    }
}
