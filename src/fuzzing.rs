//! Entry points for fuzzing: one function per untrusted input format,
//! shared by the cargo-fuzz targets in `fuzz/` and by
//! `tests/fuzz_corpus.rs`, which replays every committed corpus and
//! regression input on the stable toolchain.
//!
//! Each function takes the raw bytes a fuzzer made, drives the same
//! library entry point the command line uses, and returns `Ok` or the
//! typed [`Error`] a user would see. A panic, a hang or an allocation
//! beyond the fuzzer's limit is a bug in the stage that owns the input.
//! Where a result has an invariant that is cheap to state (a parsed
//! colour lies in sRGB), it is asserted, so a wrong answer is caught as
//! well as a crash.
//!
//! Not part of the public interface: names and behaviour may change.

use std::path::{Path, PathBuf};

use crate::audit::{self, Options};
use crate::color::parse_color;
use crate::error::Error;
use crate::geo::{KeySource, ReadOptions, read_geojson_str};
use crate::table::csv_read::{TableOptions, read_table_str};

/// The resolution of the fuzzed audit: low, so that one input takes
/// milliseconds rather than seconds (the pixel pipeline is the same at
/// every resolution).
pub const AUDIT_DPI: f64 = 24.0;

fn invalid(name: &str, location: Option<String>, message: String) -> Error {
    Error::Invalid {
        path: PathBuf::from(name),
        location,
        message,
    }
}

/// Bytes as text: `None` for bytes that are not UTF-8 (every reader here
/// takes text; the file readers refuse such bytes before parsing).
fn text(data: &[u8]) -> Option<&str> {
    std::str::from_utf8(data).ok()
}

/// Read options chosen by the first byte, so the fuzzer explores each
/// key source and the repair switch; the rest is the document.
fn read_options(data: &[u8]) -> (ReadOptions, &[u8]) {
    let Some((&first, rest)) = data.split_first() else {
        return (ReadOptions::default(), data);
    };
    let key = match first % 3 {
        0 => None,
        1 => Some(KeySource::Property("code".into())),
        _ => Some(KeySource::FeatureId),
    };
    let options = ReadOptions {
        key,
        repair: first & 0x4 != 0,
        ..ReadOptions::default()
    };
    (options, rest)
}

/// A figure spec: TOML text parsed, validated into the figure model (its
/// data files read from `fixtures`, the directory the spec is taken to
/// live in) and rendered to SVG.
pub fn spec(data: &[u8], fixtures: &Path) -> Result<(), Error> {
    let Some(t) = text(data) else {
        return Ok(());
    };
    let file = crate::spec::SpecFile::parse(&fixtures.join("fuzz.toml"), t.to_string())?;
    let figure = crate::figure::build(&file)?;
    crate::render::render(figure)?;
    Ok(())
}

/// A GeoJSON document (after one byte choosing the read options).
pub fn geojson(data: &[u8]) -> Result<(), Error> {
    let (options, doc) = read_options(data);
    let Some(t) = text(doc) else {
        return Ok(());
    };
    let layer = read_geojson_str(t, &options).map_err(|m| invalid("fuzz.geojson", None, m))?;
    check_layer(&layer);
    Ok(())
}

/// A TopoJSON document (after one byte choosing the read options).
pub fn topojson(data: &[u8]) -> Result<(), Error> {
    let (options, doc) = read_options(data);
    let Some(t) = text(doc) else {
        return Ok(());
    };
    let layer = crate::geo::topojson_read::read_topojson_str(t, None, &options)
        .map_err(|m| invalid("fuzz.topojson", None, m))?;
    check_layer(&layer);
    Ok(())
}

/// Every usable geometry has finite coordinates.
fn check_layer(layer: &crate::geo::Layer) {
    for (_, g) in layer.usable() {
        assert!(
            g.coords().all(|[x, y]| x.is_finite() && y.is_finite()),
            "a usable geometry has a coordinate that is not finite"
        );
    }
}

/// A CSV table keyed by `code` (after one byte: bit 0 normalises keys),
/// joined to the six districts of `fixtures/geo/districts.geojson`.
pub fn csv_join(data: &[u8], fixtures: &Path) -> Result<(), Error> {
    let (normalize, doc) = match data.split_first() {
        Some((&b, rest)) => (b & 1 == 1, rest),
        None => (false, data),
    };
    let Some(t) = text(doc) else {
        return Ok(());
    };
    let options = ReadOptions {
        key: Some(KeySource::Property("code".into())),
        ..ReadOptions::default()
    };
    let layer = crate::geo::read_shapes_file(
        &fixtures.join("geo").join("districts.geojson"),
        &options,
        None,
    )?;
    let table = read_table_str(t, &TableOptions::new("code"))
        .map_err(|(loc, m)| invalid("fuzz.csv", loc, m))?;
    let report = crate::join::join(&layer, &table, normalize);
    assert!(report.pairs.len() <= table.rows.len().min(layer.features().len()));
    report
        .require_unique_keys()
        .map_err(|m| invalid("fuzz.csv", None, m))?;
    Ok(())
}

/// One colour in CSS syntax; a parsed colour must lie in sRGB with an
/// alpha in 0..=1.
pub fn color(data: &[u8]) -> Result<(), Error> {
    let Some(t) = text(data) else {
        return Ok(());
    };
    let c = parse_color(t).map_err(Error::Color)?;
    let rgba = c.rgba;
    for v in [rgba.rgb.r, rgba.rgb.g, rgba.rgb.b, rgba.alpha] {
        assert!((0.0..=1.0).contains(&v), "'{t}' parsed outside sRGB: {v}");
    }
    Ok(())
}

/// An SVG document audited at [`AUDIT_DPI`] with the default views.
pub fn svg_audit(data: &[u8]) -> Result<(), Error> {
    let Some(t) = text(data) else {
        return Ok(());
    };
    let mut opt = Options::new();
    opt.dpi = AUDIT_DPI;
    audit::audit_svg(Path::new("fuzz.svg"), t, &opt)?;
    Ok(())
}

/// The targets by name (the names of `fuzz/fuzz_targets/*.rs` and of the
/// corpus folders), each with its entry point.
pub const TARGETS: [&str; 6] = [
    "spec",
    "geojson",
    "topojson",
    "csv_join",
    "color",
    "svg_audit",
];

/// Run target `name` on `data`; `fixtures` is `tests/fixtures`.
/// Panics on an unknown name.
pub fn run(name: &str, data: &[u8], fixtures: &Path) -> Result<(), Error> {
    match name {
        "spec" => spec(data, fixtures),
        "geojson" => geojson(data),
        "topojson" => topojson(data),
        "csv_join" => csv_join(data, fixtures),
        "color" => color(data),
        "svg_audit" => svg_audit(data),
        other => panic!("no fuzz target '{other}'"),
    }
}
