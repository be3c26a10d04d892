//! Spec plus data into the validated [`Figure`]: units converted, colours
//! parsed, columns found, values read by their level of measurement, rows
//! joined to shapes, everything projected. Every error names the spec key
//! or the data file and line.

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

use super::model::*;
use crate::classify::Method;
use crate::classify::diverging::Arrangement;
use crate::classify::head_tail::StopRule;
use crate::classify::std_dev::Multiples;
use crate::color::{Srgb, parse_color};
use crate::error::Error;
use crate::geo::extent::Extent;
use crate::geo::projection::choose::{Purpose, choose_projection};
use crate::geo::projection::{Ellipsoid, Projection, ProjectionName};
use crate::geo::{CoordinateKind, Geometry, KeySource, ReadOptions, read_shapes_file};
use crate::scheme::SchemeKind;
use crate::spec::SpecFile;
use crate::spec::length::{mm_to_pt, parse_length};
use crate::spec::schema::{self, Spec};
use crate::table::csv_read::DEFAULT_MISSING;
use crate::table::parse_number;
use crate::table::text::TextTable;

/// Journal column widths (common practice: about 89 mm single, 120 mm one
/// and a half, 183 mm double column).
pub const COLUMNS: [(&str, f64); 3] = [
    ("single-column", 89.0),
    ("one-and-a-half-column", 120.0),
    ("double-column", 183.0),
];

/// The smallest text size allowed by default, points (common practice
/// for print).
pub const MIN_TEXT_PT: f64 = 6.0;

/// Read a spec file and its data into a validated figure.
pub fn load(path: &Path) -> Result<Figure, Error> {
    let file = SpecFile::read(path)?;
    build(&file)
}

struct Ctx<'a> {
    file: &'a SpecFile,
    warnings: Vec<String>,
    inputs: Vec<PathBuf>,
}

impl Ctx<'_> {
    fn err(&self, key: &str, message: impl Into<String>) -> Error {
        self.file.error(key, message)
    }

    fn length(&self, key: &str, text: Option<&String>, default: f64) -> Result<f64, Error> {
        match text {
            None => Ok(default),
            Some(t) => parse_length(t).map_err(|m| self.err(key, m)),
        }
    }

    fn color(&mut self, key: &str, text: Option<&String>, default: Srgb) -> Result<Srgb, Error> {
        let Some(t) = text else {
            return Ok(default);
        };
        let parsed = parse_color(t).map_err(|e| self.err(key, e.to_string()))?;
        if parsed.gamut_mapped {
            self.warnings
                .push(format!("{key}: '{t}' is outside sRGB and was gamut-mapped"));
        }
        if parsed.rgba.alpha < 1.0 {
            return Err(self.err(
                key,
                format!("'{t}' is translucent; figure colours must be opaque so every reader sees the same colour"),
            ));
        }
        Ok(crate::scheme::to_8bit(parsed.rgba.rgb))
    }

    fn choice<T: Copy>(&self, key: &str, text: &str, options: &[(T, &str)]) -> Result<T, Error> {
        if let Some((v, _)) = options.iter().find(|(_, n)| *n == text) {
            return Ok(*v);
        }
        let names: Vec<&str> = options.iter().map(|(_, n)| *n).collect();
        let hint = crate::spec::suggest::closest(text, &names)
            .map(|s| format!(" Did you mean '{s}'?"))
            .unwrap_or_default();
        Err(self.err(
            key,
            format!("'{text}' is not one of {}.{hint}", names.join(", ")),
        ))
    }
}

/// Validate a parsed spec file into a figure, reading its data.
pub fn build(file: &SpecFile) -> Result<Figure, Error> {
    let mut cx = Ctx {
        file,
        warnings: Vec::new(),
        inputs: vec![file.path.clone()],
    };
    let spec: &Spec = &file.spec;
    let f = &spec.figure;
    let kind = cx.choice("figure.kind", &f.kind, &Kind::ALL)?;

    // Page.
    let width = match (&f.column, &f.width) {
        (Some(_), Some(_)) => {
            return Err(cx.err(
                "figure.column",
                "give either figure.column or figure.width, not both",
            ));
        }
        (Some(c), None) => {
            let opts: Vec<(f64, &str)> = COLUMNS.iter().map(|(n, w)| (*w, *n)).collect();
            mm_to_pt(cx.choice("figure.column", c, &opts)?)
        }
        (None, Some(w)) => cx.length("figure.width", Some(w), 0.0)?,
        (None, None) => mm_to_pt(COLUMNS[0].1),
    };
    let height = cx.length("figure.height", f.height.as_ref(), width * 0.75)?;
    for (key, v) in [("figure.width", width), ("figure.height", height)] {
        if !(mm_to_pt(20.0)..=mm_to_pt(2000.0)).contains(&v) {
            return Err(cx.err(key, "expected a size between 20mm and 2000mm"));
        }
    }
    let dpi = f.dpi.unwrap_or(300.0);
    if !(dpi.is_finite() && (36.0..=2400.0).contains(&dpi)) {
        return Err(cx.err(
            "figure.dpi",
            format!("expected 36 to 2400 dots per inch, got {dpi}"),
        ));
    }
    let white = Srgb::new(1.0, 1.0, 1.0);
    let background = cx.color("figure.background", f.background.as_ref(), white)?;
    let page = Page {
        width,
        height,
        dpi,
        background,
    };

    // Text.
    let t = spec.text.as_ref();
    let min_size = cx.length(
        "text.min_size",
        t.and_then(|t| t.min_size.as_ref()),
        MIN_TEXT_PT,
    )?;
    if min_size < MIN_TEXT_PT {
        cx.warnings.push(format!(
            "text.min_size is {min_size:.1}pt, below the {MIN_TEXT_PT}pt that print usually needs (common practice)"
        ));
    }
    let size = cx.length(
        "text.size",
        t.and_then(|t| t.size.as_ref()),
        7.0_f64.max(min_size),
    )?;
    let title_size = cx.length(
        "text.title_size",
        t.and_then(|t| t.title_size.as_ref()),
        (size * 9.0 / 7.0).max(min_size),
    )?;
    for (key, v) in [("text.size", size), ("text.title_size", title_size)] {
        if v < min_size {
            return Err(cx.err(
                key,
                format!("{v:.2}pt is below the smallest text size allowed ({min_size:.2}pt; set text.min_size to change it)"),
            ));
        }
    }
    let text_color = cx.color(
        "text.color",
        t.and_then(|t| t.color.as_ref()),
        Srgb::new(0.1, 0.1, 0.1),
    )?;
    let text = TextStyle {
        size,
        title_size,
        min_size,
        color: text_color,
    };

    let formats = match &f.formats {
        None => vec![Format::Svg],
        Some(list) => {
            let mut out = Vec::new();
            for (i, s) in list.iter().enumerate() {
                let fmt = Format::parse(s).ok_or_else(|| {
                    cx.err(
                        &format!("figure.formats.{i}"),
                        format!("'{s}' is not one of svg, png, pdf"),
                    )
                })?;
                if !out.contains(&fmt) {
                    out.push(fmt);
                }
            }
            out
        }
    };

    // Data.
    let d = &spec.data;
    let table_path = file.resolve(&d.table);
    let table = TextTable::read(&table_path)?;
    cx.inputs.push(table_path.clone());
    let key_col = table.column(&d.key, "data.key")?;
    let value_col = match &d.value {
        Some(v) => Some(table.column(v, "data.value")?),
        None => None,
    };
    let level = match (&d.level, value_col) {
        (Some(l), _) => cx.choice("data.level", l, &Level::ALL)?,
        (None, None) => Level::Nominal,
        (None, Some(_)) => {
            return Err(cx.err(
                "data.value",
                "data.level is needed with data.value: nominal, ordinal, interval or ratio (Stevens's levels of measurement)",
            ));
        }
    };
    if d.midpoint.is_some()
        && matches!(level, Level::Nominal | Level::Ordinal)
        && value_col.is_some()
    {
        return Err(cx.err(
            "data.midpoint",
            format!(
                "a midpoint needs interval or ratio data; data.level is {}",
                level.name()
            ),
        ));
    }
    if let Some(m) = d.midpoint {
        if !m.is_finite() {
            return Err(cx.err("data.midpoint", "expected a finite number"));
        }
    }
    let missing: Vec<String> = d
        .missing
        .clone()
        .unwrap_or_else(|| DEFAULT_MISSING.iter().map(|s| s.to_string()).collect());

    // Panels.
    let (panel_col, panel_names) = match &spec.panels {
        None => (None, vec![String::new()]),
        Some(p) => {
            let col = table.column(&p.by, "panels.by")?;
            let mut names: Vec<String> = Vec::new();
            for (_, cells) in &table.rows {
                let v = &cells[col];
                if !missing.contains(v) && !names.contains(v) {
                    names.push(v.clone());
                }
            }
            let names = match &p.order {
                Some(order) => {
                    for (i, o) in order.iter().enumerate() {
                        if !names.contains(o) {
                            return Err(cx.err(
                                &format!("panels.order.{i}"),
                                format!("no row has '{o}' in column '{}'", p.by),
                            ));
                        }
                    }
                    let left: Vec<&String> = names.iter().filter(|n| !order.contains(n)).collect();
                    if !left.is_empty() {
                        cx.warnings.push(format!(
                            "panels.order leaves out {} value(s) of '{}'; their rows are not drawn",
                            left.len(),
                            p.by
                        ));
                    }
                    order.clone()
                }
                None => sort_names(names),
            };
            if names.is_empty() {
                return Err(cx.err("panels.by", format!("column '{}' has no values", p.by)));
            }
            (Some(col), names)
        }
    };
    let panel_columns = match spec.panels.as_ref().and_then(|p| p.columns) {
        Some(0) => return Err(cx.err("panels.columns", "expected at least 1")),
        Some(c) => c,
        None => (panel_names.len() as f64).sqrt().ceil() as usize,
    };

    // Values by level.
    let mut categories = d.categories.clone().unwrap_or_default();
    let mut rows: Vec<Row> = Vec::new();
    let mut numeric_ordinal = level == Level::Ordinal && categories.is_empty();
    if numeric_ordinal {
        if let Some(vc) = value_col {
            numeric_ordinal = table
                .rows
                .iter()
                .all(|(_, c)| missing.contains(&c[vc]) || parse_number(&c[vc]).is_ok());
        }
    }
    for (line, cells) in &table.rows {
        let panel = match panel_col {
            None => Some(0),
            Some(pc) => panel_names.iter().position(|n| *n == cells[pc]),
        };
        let Some(panel) = panel else { continue };
        let value = match value_col {
            None => Value::Plain,
            Some(vc) => {
                let text = &cells[vc];
                if missing.contains(text) {
                    Value::Missing
                } else if level.is_numeric() || numeric_ordinal {
                    let v = parse_number(text).map_err(|e| Error::Invalid {
                        path: table_path.clone(),
                        location: Some(format!("line {line}, column '{}'", table.headers[vc])),
                        message: format!("{e}; data.level is {}, so every value must be a number or a missing marker", level.name()),
                    })?;
                    Value::Number(v)
                } else {
                    if d.categories.is_some() && !categories.contains(text) {
                        return Err(Error::Invalid {
                            path: table_path.clone(),
                            location: Some(format!("line {line}, column '{}'", table.headers[vc])),
                            message: format!(
                                "'{text}' is not one of data.categories ({})",
                                categories.join(", ")
                            ),
                        });
                    }
                    if !categories.contains(text) {
                        categories.push(text.clone());
                    }
                    Value::Category(text.clone())
                }
            }
        };
        rows.push(Row {
            line: *line,
            key: cells[key_col].clone(),
            panel,
            value,
            cells: cells.clone(),
        });
    }
    if d.categories.is_none() {
        categories = sort_names(categories);
        if level == Level::Ordinal && !numeric_ordinal {
            cx.warnings.push(
                "ordinal text values are ordered alphabetically; list data.categories to give their real order".into(),
            );
        }
    }
    if level == Level::Ratio
        && rows
            .iter()
            .any(|r| matches!(r.value, Value::Number(v) if v < 0.0))
    {
        cx.warnings.push(
            "data.level is ratio but some values are negative; interval may be the right level"
                .into(),
        );
    }

    // Scheme from the level.
    let c = spec.colors.as_ref();
    let natural = match (level, d.midpoint) {
        (Level::Nominal, _) => SchemeKind::Qualitative,
        (_, Some(_)) => SchemeKind::Diverging,
        _ => SchemeKind::Sequential,
    };
    let scheme = match c.and_then(|c| c.scheme.as_ref()) {
        None => natural,
        Some(s) => {
            let k = cx.choice(
                "colors.scheme",
                s,
                &[
                    (SchemeKind::Sequential, "sequential"),
                    (SchemeKind::Diverging, "diverging"),
                    (SchemeKind::Qualitative, "qualitative"),
                ],
            )?;
            if k == SchemeKind::Diverging && d.midpoint.is_none() {
                return Err(cx.err(
                    "colors.scheme",
                    "a diverging scheme needs a meaningful middle: set data.midpoint (or use sequential)",
                ));
            }
            if k == SchemeKind::Qualitative && level != Level::Nominal {
                cx.warnings.push(format!(
                    "colors.scheme is qualitative but the data is {}: hue-only classes hide the order; a sequential scheme shows it",
                    level.name()
                ));
            }
            if k != SchemeKind::Qualitative && level == Level::Nominal && value_col.is_some() {
                cx.warnings.push(format!(
                    "colors.scheme is {} but the data is nominal: ordered lightness suggests an order the categories do not have",
                    k.name()
                ));
            }
            k
        }
    };
    let mut list = None;
    if let Some(items) = c.and_then(|c| c.list.as_ref()) {
        let mut out = Vec::new();
        for (i, s) in items.iter().enumerate() {
            out.push(cx.color(&format!("colors.list.{i}"), Some(s), white)?);
        }
        list = Some(out);
    }
    let hues = match c.and_then(|c| c.hues.as_ref()) {
        None => None,
        Some(h) if h.len() == 2 => Some((h[0], h[1])),
        Some(_) => {
            return Err(cx.err(
                "colors.hues",
                "expected two hues (low arm, high arm) in OKLCH degrees",
            ));
        }
    };
    let no_data = cx.color(
        "colors.no_data",
        c.and_then(|c| c.no_data.as_ref()),
        Srgb::new(0.86, 0.86, 0.86),
    )?;
    let colors = ColorRequest {
        scheme,
        list,
        hue: c.and_then(|c| c.hue),
        hues,
        no_data,
    };

    let classes = class_request(&mut cx, spec, level)?;

    // Marks and legend.
    let m = spec.marks.as_ref();
    let marks = MarkStyle {
        size: cx.length("marks.size", m.and_then(|m| m.size.as_ref()), 4.0)?,
        hollow: m.and_then(|m| m.hollow).unwrap_or(false),
        emphasis: m.and_then(|m| m.emphasis.clone()).unwrap_or_default(),
        outline: Stroke {
            color: cx.color("marks.outline", m.and_then(|m| m.outline.as_ref()), white)?,
            width: cx.length(
                "marks.outline_width",
                m.and_then(|m| m.outline_width.as_ref()),
                0.4,
            )?,
        },
    };
    let label = d
        .label
        .clone()
        .or_else(|| d.value.clone())
        .unwrap_or_default();
    let lg = spec.legend.as_ref();
    let position = match lg.and_then(|l| l.position.as_ref()) {
        None => LegendPosition::Right,
        Some(p) => cx.choice(
            "legend.position",
            p,
            &[
                (LegendPosition::Right, "right"),
                (LegendPosition::Bottom, "bottom"),
                (LegendPosition::None, "none"),
            ],
        )?,
    };
    let legend = LegendStyle {
        title: lg
            .and_then(|l| l.title.clone())
            .unwrap_or_else(|| match &d.units {
                Some(u) if !label.is_empty() => format!("{label} ({u})"),
                _ => label.clone(),
            }),
        position: if value_col.is_none() {
            LegendPosition::None
        } else {
            position
        },
        histogram: lg.and_then(|l| l.histogram).unwrap_or(false),
    };

    let variable = Variable {
        column: d.value.clone(),
        label,
        units: d.units.clone(),
        precision: d.precision,
        level,
        midpoint: d.midpoint,
        categories,
    };

    let mut fig = Figure {
        spec_path: file.path.clone(),
        inputs: Vec::new(),
        kind,
        page,
        text,
        titles: Titles {
            title: f.title.clone(),
            subtitle: f.subtitle.clone(),
            source: f.source.clone(),
            note: f.note.clone(),
        },
        description: f.description.clone(),
        data_copy: f.data_copy.unwrap_or(false),
        formats,
        variable,
        classes,
        colors,
        legend,
        marks,
        border: Stroke {
            color: white,
            width: 0.0,
        },
        base: Vec::new(),
        land: Srgb::new(0.93, 0.93, 0.92),
        context: Vec::new(),
        axes: None,
        descending: true,
        panels: panel_names,
        panel_column: spec.panels.as_ref().map(|p| p.by.clone()),
        panel_columns,
        items: Vec::new(),
        projection: None,
        simplify: 0.0,
        locations: ["colors.list", "data.level", "marks.emphasis"]
            .iter()
            .map(|k| (k.to_string(), file.location(k)))
            .collect(),
        audit: super::audit::audit_settings(file, page.dpi)?,
        warnings: Vec::new(),
    };
    match kind {
        Kind::Choropleth | Kind::DotMap => map_items(&mut cx, spec, &table, rows, &mut fig)?,
        Kind::DotPlot | Kind::RankedDots => plot_items(&mut cx, spec, &table, rows, &mut fig)?,
    }
    if fig.items.is_empty() {
        return Err(cx.err(
            "data.table",
            format!("'{}' gives nothing to draw", table_path.display()),
        ));
    }
    fig.inputs = cx.inputs;
    fig.warnings = cx.warnings;
    Ok(fig)
}

/// One data row with its value read.
struct Row {
    line: u64,
    key: String,
    panel: usize,
    value: Value,
    cells: Vec<String>,
}

/// Names sorted as numbers when they all are numbers, else as text.
fn sort_names(mut names: Vec<String>) -> Vec<String> {
    if names.iter().all(|n| parse_number(n).is_ok()) {
        names.sort_by(|a, b| {
            let (x, y) = (
                parse_number(a).unwrap_or(0.0),
                parse_number(b).unwrap_or(0.0),
            );
            x.total_cmp(&y)
        });
    } else {
        names.sort();
    }
    names
}

fn class_request(cx: &mut Ctx, spec: &Spec, level: Level) -> Result<ClassRequest, Error> {
    let c = spec.classes.as_ref();
    let arrangement = match c.and_then(|c| c.midpoint_as.as_ref()) {
        None => Arrangement::Break,
        Some(a) => cx.choice(
            "classes.midpoint_as",
            a,
            &[
                (Arrangement::Break, "break"),
                (Arrangement::Centre, "class"),
            ],
        )?,
    };
    let round = c.and_then(|c| c.round).unwrap_or(false);
    if !level.is_numeric() {
        if c.and_then(|c| c.method.as_ref()).is_some() {
            cx.warnings.push(format!(
                "classes.method is ignored for {} data: each category is its own class",
                level.name()
            ));
        }
        return Ok(ClassRequest {
            method: None,
            round: false,
            arrangement,
        });
    }
    let count = c.and_then(|c| c.count).unwrap_or(5);
    if !(2..=12).contains(&count) {
        return Err(cx.err(
            "classes.count",
            format!("expected 2 to 12 classes, got {count}"),
        ));
    }
    let name = c
        .and_then(|c| c.method.clone())
        .unwrap_or_else(|| "quantile".into());
    let methods = [
        ("equal", 0),
        ("quantile", 1),
        ("natural", 2),
        ("stddev", 3),
        ("headtail", 4),
        ("manual", 5),
        ("continuous", 6),
    ];
    let opts: Vec<(usize, &str)> = methods.iter().map(|(n, i)| (*i, *n)).collect();
    let which = cx.choice("classes.method", &name, &opts)?;
    let breaks = c.and_then(|c| c.breaks.clone());
    if breaks.is_some() && which != 5 {
        return Err(cx.err(
            "classes.breaks",
            "only classes.method = \"manual\" takes classes.breaks",
        ));
    }
    let method = match which {
        0 => Some(Method::EqualInterval { classes: count }),
        1 => Some(Method::Quantile { classes: count }),
        2 => Some(Method::NaturalBreaks { classes: count }),
        3 => {
            let step = c.and_then(|c| c.step).unwrap_or(1.0);
            if !(step > 0.0 && step.is_finite()) {
                return Err(cx.err(
                    "classes.step",
                    "expected a positive number of standard deviations (1 or 0.5 are usual)",
                ));
            }
            Some(Method::StdDev(Multiples::Classes {
                classes: count,
                step,
            }))
        }
        4 => Some(Method::HeadTail(StopRule::HeadShare(0.4))),
        5 => {
            let b = breaks.ok_or_else(|| {
                cx.err(
                    "classes.method",
                    "manual classes need classes.breaks = [upper bounds]",
                )
            })?;
            if b.is_empty()
                || b.windows(2).any(|w| w[0] >= w[1])
                || b.iter().any(|v| !v.is_finite())
            {
                return Err(cx.err(
                    "classes.breaks",
                    "expected finite, strictly increasing upper bounds",
                ));
            }
            Some(Method::Manual { bounds: b })
        }
        _ => None,
    };
    Ok(ClassRequest {
        method,
        round,
        arrangement,
    })
}

fn read_layer(
    cx: &mut Ctx,
    key: &str,
    rel: &str,
    shape_key: Option<&str>,
    object: Option<&str>,
) -> Result<crate::geo::Layer, Error> {
    let path = cx.file.resolve(rel);
    if !path.exists() {
        return Err(cx.err(key, format!("no such file: '{}'", path.display())));
    }
    let layer = read_shapes_file(
        &path,
        &ReadOptions {
            key: shape_key.map(|k| KeySource::Property(k.to_string())),
            repair: true,
            coordinates: CoordinateKind::Geographic,
        },
        object,
    )?;
    layer.require_clean(&path)?;
    // Repairs are never silent: the file is not what RFC 7946 asks for.
    for p in layer.problems.iter().filter(|p| p.repaired) {
        cx.warnings.push(format!(
            "{}: feature {} ('{}'): {}",
            path.display(),
            p.feature,
            p.key,
            p.message()
        ));
    }
    cx.inputs.push(path);
    Ok(layer)
}

fn project(cx: &Ctx, proj: &Projection, g: &Geometry, what: &str) -> Result<Geometry, Error> {
    proj.project_geometry(g, 0.0).ok_or_else(|| {
        cx.err(
            "map.projection",
            format!(
                "{what} has a vertex with no image in '{}'; choose another projection or centre",
                proj.name()
            ),
        )
    })
}

fn map_items(
    cx: &mut Ctx,
    spec: &Spec,
    table: &TextTable,
    mut rows: Vec<Row>,
    fig: &mut Figure,
) -> Result<(), Error> {
    let default = schema::MapTable {
        shapes: None,
        shape_key: None,
        object: None,
        projection: None,
        border_color: None,
        border_width: None,
        simplify: None,
        lon: None,
        lat: None,
        land_color: None,
        context: Vec::new(),
    };
    let m = spec.map.as_ref().unwrap_or(&default);
    let white = Srgb::new(1.0, 1.0, 1.0);
    fig.border = Stroke {
        color: cx.color("map.border_color", m.border_color.as_ref(), white)?,
        width: cx.length("map.border_width", m.border_width.as_ref(), 0.3)?,
    };
    fig.simplify = cx.length("map.simplify", m.simplify.as_ref(), 0.2)?;
    fig.land = cx.color("map.land_color", m.land_color.as_ref(), fig.land)?;
    let layer = match &m.shapes {
        Some(s) => Some(read_layer(
            cx,
            "map.shapes",
            s,
            Some(m.shape_key.as_deref().unwrap_or(&spec.data.key)),
            m.object.as_deref(),
        )?),
        None if fig.kind == Kind::Choropleth => {
            return Err(cx.err(
                "map",
                "a choropleth needs map.shapes (a GeoJSON or TopoJSON boundary file)",
            ));
        }
        None => None,
    };
    let mut contexts = Vec::new();
    for (i, c) in m.context.iter().enumerate() {
        contexts.push((
            i,
            c,
            read_layer(
                cx,
                &format!("map.context.{i}.shapes"),
                &c.shapes,
                None,
                None,
            )?,
        ));
    }
    let requested = match &m.projection {
        None => None,
        Some(p) => Some(
            p.parse::<ProjectionName>()
                .map_err(|e| cx.err("map.projection", e))?,
        ),
    };
    let mut points: Vec<(Row, [f64; 2])> = Vec::new();
    if fig.kind == Kind::DotMap {
        let lon = table.column(m.lon.as_deref().unwrap_or("lon"), "map.lon")?;
        let lat = table.column(m.lat.as_deref().unwrap_or("lat"), "map.lat")?;
        for r in std::mem::take(&mut rows) {
            let read = |col: usize| {
                parse_number(&r.cells[col]).map_err(|e| Error::Invalid {
                    path: table.path.clone(),
                    location: Some(format!("line {}, column '{}'", r.line, table.headers[col])),
                    message: format!("{e}; expected degrees"),
                })
            };
            let (x, y) = (read(lon)?, read(lat)?);
            if !(-180.0..=180.0).contains(&x) || !(-90.0..=90.0).contains(&y) {
                return Err(Error::Invalid {
                    path: table.path.clone(),
                    location: Some(format!("line {}", r.line)),
                    message: format!(
                        "({x}, {y}) is not a longitude in [-180, 180] and a latitude in [-90, 90]"
                    ),
                });
            }
            points.push((r, [x, y]));
        }
    }
    let mut coords: Vec<[f64; 2]> = points.iter().map(|(_, p)| *p).collect();
    if let Some(l) = &layer {
        coords.extend(l.usable().flat_map(|(_, g)| g.coords()));
    }
    let choice = choose_projection(
        Extent::of(coords.into_iter()),
        CoordinateKind::Geographic,
        requested,
        Ellipsoid::wgs84(),
        Purpose::Areal,
    )
    .map_err(|e| cx.err("map.projection", e))?;
    cx.warnings.extend(choice.warnings.iter().cloned());
    let proj = choice.projection;
    fig.projection = Some(format!("{} ({})", proj.name(), choice.reason));

    for (i, c, l) in contexts {
        let style = c.style.as_deref().unwrap_or("plain");
        let water = cx.choice(
            &format!("map.context.{i}.style"),
            style,
            &[(true, "water"), (false, "plain")],
        )?;
        // A conventional water style: light blue fill, darker blue lines
        // (common practice in cartography).
        let (dfill, dstroke) = if water {
            (
                Some(Srgb::from_rgb8(0xc6, 0xdc, 0xec)),
                Srgb::from_rgb8(0x5b, 0x8d, 0xb8),
            )
        } else {
            (None, Srgb::new(0.45, 0.45, 0.45))
        };
        let fill = match c.fill.as_deref() {
            Some("none") => None,
            Some(t) => Some(cx.color(
                &format!("map.context.{i}.fill"),
                Some(&t.to_string()),
                white,
            )?),
            None => dfill,
        };
        let mut geometries = Vec::new();
        for (f, g) in l.usable() {
            geometries.push(project(
                cx,
                &proj,
                g,
                &format!("context feature {}", f.display_key()),
            )?);
        }
        let stroke = Stroke {
            color: cx.color(
                &format!("map.context.{i}.stroke"),
                c.stroke.as_ref(),
                dstroke,
            )?,
            width: cx.length(&format!("map.context.{i}.width"), c.width.as_ref(), 0.5)?,
        };
        fig.context.push(ContextLayer {
            geometries,
            fill,
            stroke,
            below: c.below.unwrap_or(false),
            name: c.shapes.clone(),
        });
    }

    match fig.kind {
        Kind::DotMap => {
            if let Some(l) = &layer {
                for (f, g) in l.usable() {
                    fig.base.push(project(
                        cx,
                        &proj,
                        g,
                        &format!("feature {}", f.display_key()),
                    )?);
                }
            }
            for (r, [lon, lat]) in points {
                let p = proj.forward(lon, lat).ok_or_else(|| Error::Invalid {
                    path: table.path.clone(),
                    location: Some(format!("line {}", r.line)),
                    message: format!("({lon}, {lat}) has no image in '{}'", proj.name()),
                })?;
                fig.items.push(Item {
                    key: r.key,
                    name: None,
                    panel: r.panel,
                    value: r.value,
                    place: Place::Point(p),
                });
            }
        }
        _ => {
            let layer = layer.ok_or_else(|| Error::Internal("choropleth without shapes".into()))?;
            let mut by_key: BTreeMap<(usize, String), &Row> = BTreeMap::new();
            for r in &rows {
                if let Some(prev) = by_key.insert((r.panel, r.key.clone()), r) {
                    return Err(Error::Invalid {
                        path: table.path.clone(),
                        location: Some(format!("line {}", r.line)),
                        message: format!(
                            "key '{}' appears again (first on line {}){}; each shape takes one row{}",
                            r.key,
                            prev.line,
                            if fig.panels.len() > 1 {
                                format!(" in panel '{}'", fig.panels[r.panel])
                            } else {
                                String::new()
                            },
                            if fig.panels.len() > 1 {
                                " per panel"
                            } else {
                                ""
                            }
                        ),
                    });
                }
            }
            let mut projected = Vec::new();
            let mut shape_keys = std::collections::BTreeSet::new();
            for (f, g) in layer.usable() {
                let key = f.display_key();
                projected.push((
                    key.clone(),
                    project(cx, &proj, g, &format!("feature {key}"))?,
                ));
                shape_keys.insert(key);
            }
            let unmatched: Vec<&str> = rows
                .iter()
                .filter(|r| !shape_keys.contains(&r.key))
                .map(|r| r.key.as_str())
                .collect();
            if !unmatched.is_empty() {
                let mut u = unmatched.clone();
                u.dedup();
                cx.warnings.push(format!(
                    "{} row(s) have no shape and are not drawn: {}",
                    unmatched.len(),
                    u.iter().take(8).cloned().collect::<Vec<_>>().join(", ")
                ));
            }
            for panel in 0..fig.panels.len() {
                let mut without = 0;
                for (key, g) in &projected {
                    let value = match by_key.get(&(panel, key.clone())) {
                        Some(r) => r.value.clone(),
                        None => {
                            without += 1;
                            Value::Missing
                        }
                    };
                    fig.items.push(Item {
                        key: key.clone(),
                        name: None,
                        panel,
                        value,
                        place: Place::Area(g.clone()),
                    });
                }
                if without > 0 {
                    let p = if fig.panels.len() > 1 {
                        format!(" in panel '{}'", fig.panels[panel])
                    } else {
                        String::new()
                    };
                    cx.warnings.push(format!(
                        "{without} shape(s) have no data row{p} and are drawn as no data"
                    ));
                }
            }
        }
    }
    Ok(())
}

fn plot_items(
    cx: &mut Ctx,
    spec: &Spec,
    table: &TextTable,
    rows: Vec<Row>,
    fig: &mut Figure,
) -> Result<(), Error> {
    let p = spec.plot.as_ref().ok_or_else(|| {
        cx.err(
            "figure.kind",
            format!("a {} needs a [plot] table", fig.kind.name()),
        )
    })?;
    let number = |r: &Row, col: usize| -> Result<Option<f64>, Error> {
        let t = &r.cells[col];
        if t.is_empty() || DEFAULT_MISSING.contains(&t.as_str()) {
            return Ok(None);
        }
        parse_number(t).map(Some).map_err(|e| Error::Invalid {
            path: table.path.clone(),
            location: Some(format!("line {}, column '{}'", r.line, table.headers[col])),
            message: e.to_string(),
        })
    };
    let mut skipped = 0;
    if fig.kind == Kind::DotPlot {
        let xn = p.x.as_deref().ok_or_else(|| {
            cx.err(
                "plot",
                "a dot plot needs plot.x and plot.y (numeric columns)",
            )
        })?;
        let yn = p.y.as_deref().ok_or_else(|| {
            cx.err(
                "plot",
                "a dot plot needs plot.x and plot.y (numeric columns)",
            )
        })?;
        let (xc, yc) = (table.column(xn, "plot.x")?, table.column(yn, "plot.y")?);
        for r in rows {
            match (number(&r, xc)?, number(&r, yc)?) {
                (Some(x), Some(y)) => fig.items.push(Item {
                    key: r.key,
                    name: None,
                    panel: r.panel,
                    value: r.value,
                    place: Place::Point([x, y]),
                }),
                _ => skipped += 1,
            }
        }
        fig.axes = Some(Axes {
            x_title: p.x_title.clone().unwrap_or_else(|| xn.to_string()),
            y_title: p.y_title.clone().unwrap_or_else(|| yn.to_string()),
            from_zero: p.from_zero.unwrap_or(false),
            grid: p.grid.unwrap_or(true),
        });
    } else {
        let rn = p
            .rank_by
            .as_deref()
            .ok_or_else(|| cx.err("plot", "ranked dots need plot.rank_by (a numeric column)"))?;
        let rc = table.column(rn, "plot.rank_by")?;
        let nc = match &p.names {
            Some(n) => Some(table.column(n, "plot.names")?),
            None => None,
        };
        for r in rows {
            match number(&r, rc)? {
                Some(v) => fig.items.push(Item {
                    name: Some(nc.map_or_else(|| r.key.clone(), |c| r.cells[c].clone())),
                    key: r.key,
                    panel: r.panel,
                    value: r.value,
                    place: Place::Rank(v),
                }),
                None => skipped += 1,
            }
        }
        fig.descending = p.descending.unwrap_or(true);
        fig.axes = Some(Axes {
            x_title: p.x_title.clone().unwrap_or_else(|| rn.to_string()),
            y_title: p.y_title.clone().unwrap_or_default(),
            from_zero: p.from_zero.unwrap_or(false),
            grid: p.grid.unwrap_or(true),
        });
    }
    if skipped > 0 {
        cx.warnings.push(format!(
            "{skipped} row(s) with a missing position are not drawn"
        ));
    }
    Ok(())
}
