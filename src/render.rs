//! Rendering a figure end to end: model -> encoding -> layout -> SVG, then
//! the requested files (SVG, PNG at the figure's DPI, PDF), the optional
//! data copy, all written atomically and never over an input.

use std::path::{Path, PathBuf};

use crate::encode::{self, Encoding};
use crate::error::{Error, Result};
use crate::figure::{Figure, Format};
use crate::{describe, layout, output, raster, svg};

/// A rendered figure.
#[derive(Debug, Clone)]
pub struct Rendered {
    /// The figure model.
    pub figure: Figure,
    /// Its classes and colours.
    pub encoding: Encoding,
    /// The plain-language description.
    pub description: String,
    /// The SVG text.
    pub svg: String,
    /// Warnings from every stage.
    pub warnings: Vec<String>,
}

/// Encode, lay out and draw a figure.
pub fn render(figure: Figure) -> Result<Rendered> {
    let encoding = encode::encode(&figure)?;
    let title = describe::title(&figure);
    let description = describe::describe(&figure, &encoding);
    let scene = layout::layout(&figure, &encoding, &title, &description);
    let svg = svg::write(&scene);
    let mut warnings = figure.warnings.clone();
    warnings.extend(encoding.warnings.iter().cloned());
    Ok(Rendered {
        figure,
        encoding,
        description,
        svg,
        warnings,
    })
}

/// Bytes of the figure in one format. `name` names the figure in errors.
pub fn encode_format(r: &Rendered, format: Format, name: &Path) -> Result<Vec<u8>> {
    match format {
        Format::Svg => Ok(r.svg.clone().into_bytes()),
        Format::Png => {
            let doc = raster::parse(name, r.svg.as_bytes())?;
            let img = raster::render(name, &doc, r.figure.page.dpi, r.figure.page.background)?;
            raster::encode_png(&img, r.figure.page.dpi)
        }
        Format::Pdf => crate::pdf::svg_to_pdf(name, r.svg.as_bytes()),
    }
}

/// The plotted data as CSV: key, panel, value, class id and label, and
/// the colour drawn.
pub fn data_csv(r: &Rendered) -> String {
    let mut w = csv::WriterBuilder::new().from_writer(Vec::new());
    let _ = w.write_record(["key", "panel", "value", "class", "class_label", "color"]);
    for it in &r.figure.items {
        let value = match &it.value {
            crate::figure::Value::Number(v) => format!("{v}"),
            crate::figure::Value::Category(s) => s.clone(),
            crate::figure::Value::Missing | crate::figure::Value::Plain => String::new(),
        };
        let id = r.encoding.group_id(&it.value).to_string();
        let label = match r.encoding.slot(&it.value) {
            encode::Slot::Class(i) => r.encoding.classes[i].label.clone(),
            encode::Slot::NoData => r.encoding.no_data.label.clone(),
            encode::Slot::Ramp => String::new(),
        };
        let _ = w.write_record([
            it.key.as_str(),
            r.figure.panels[it.panel].as_str(),
            value.as_str(),
            id.as_str(),
            label.as_str(),
            svg::hex(r.encoding.color(&it.value)).as_str(),
        ]);
    }
    String::from_utf8(w.into_inner().unwrap_or_default()).unwrap_or_default()
}

/// Where each format goes for output base `base` (extension replaced).
pub fn output_paths(base: &Path, formats: &[Format]) -> Vec<(Format, PathBuf)> {
    formats
        .iter()
        .map(|f| (*f, base.with_extension(f.extension())))
        .collect()
}

/// Render to files: one per format, plus the data copy if the spec asks.
/// Returns the paths written.
pub fn write_files(r: &Rendered, base: &Path, formats: &[Format]) -> Result<Vec<PathBuf>> {
    let mut planned = output_paths(base, formats);
    let data_path = base.with_extension("data.csv");
    let mut written = Vec::new();
    for (_, p) in &planned {
        output::check_not_an_input(p, &r.figure.inputs)?;
    }
    if r.figure.data_copy {
        output::check_not_an_input(&data_path, &r.figure.inputs)?;
    }
    // Encode everything first so a failure leaves no partial set.
    let mut bytes = Vec::new();
    for (f, p) in planned.drain(..) {
        bytes.push((p.clone(), encode_format(r, f, &p)?));
    }
    if r.figure.data_copy {
        bytes.push((data_path, data_csv(r).into_bytes()));
    }
    for (p, b) in bytes {
        if let Some(dir) = p.parent().filter(|d| !d.as_os_str().is_empty()) {
            std::fs::create_dir_all(dir).map_err(|source| Error::Write {
                path: dir.to_path_buf(),
                source,
            })?;
        }
        output::write_atomic(&p, &b)?;
        written.push(p);
    }
    Ok(written)
}
