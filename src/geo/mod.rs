//! The geographic stage: reading boundary and point data (GeoJSON,
//! TopoJSON), the
//! validated feature model, map projections, and planar measures (area,
//! centroid, interior label point) of projected shapes.
//!
//! Flow: file -> [`geojson_read`] or [`topojson_read`] (with [`validate`]) -> [`model::Layer`]
//! -> [`projection`] -> [`measure`]. [`shapes`] puts these together for
//! `hueproof shapes`; [`fit`] and [`simplify`] prepare shapes for output.

pub mod antimeridian;
pub mod densify;
pub mod extent;
pub mod fit;
pub mod generate;
pub mod geojson_read;
mod geojson_stream;
pub mod measure;
pub mod model;
pub mod projection;
pub mod shapes;
pub mod simplify;
pub mod topojson_read;
pub(crate) mod validate;

pub use geojson_read::{KeySource, ReadOptions, read_geojson_file, read_geojson_str};
pub use model::{Coord, CoordinateKind, Feature, Geometry, Layer, Polygon, Problem, ProblemKind};
pub use topojson_read::{read_shapes_file, read_topojson_str};
