//! The figure specification: TOML spec files, with helpers that point messages at the right place.
pub mod locate;
pub mod suggest;
