//! Planar measures of projected geometry: area, centroid and an interior
//! label point. Inputs are in projected units with y up.

pub mod area;
pub mod inaccessibility;

pub use area::{geometry_area, polygon_area, polygon_centroid, ring_signed_area};
pub use inaccessibility::{label_point, pole_of_inaccessibility};
