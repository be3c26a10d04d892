//! Reports: turning measurement results into text for people and JSON for
//! programs. No measuring happens here.

pub mod audited;
pub mod export;
pub mod html;
pub mod inspect_text;
pub mod junit;
pub mod palette_text;
pub mod sarif;
