//! The validated figure model ([`model`]) and how a spec and its data
//! become one ([`build`]).

pub mod audit;
pub mod build;
pub mod model;

pub use build::{build, load};
pub use model::*;
