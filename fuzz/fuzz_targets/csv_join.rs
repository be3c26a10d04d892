//! Fuzz target `csv_join`: see `hueproof::fuzzing::csv_join`.
#![no_main]

use std::path::Path;

use libfuzzer_sys::fuzz_target;

const FIXTURES: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/../tests/fixtures");

fuzz_target!(|data: &[u8]| {
    // Ok or a typed error are both fine; a panic is the finding.
    let _ = hueproof::fuzzing::run("csv_join", data, Path::new(FIXTURES));
});
