//! `planar`: the identity, for data that is already projected. Areas are
//! in the square of the data's own unit.

/// The identity projection.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Planar;

impl Planar {
    /// Returns the coordinates unchanged.
    pub fn forward(&self, x: f64, y: f64) -> Option<[f64; 2]> {
        Some([x, y])
    }
}
