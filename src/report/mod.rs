//! Reports: turning measurement results into text for people and JSON for
//! programs. No measuring happens here.

pub mod inspect_text;
pub mod palette_text;
