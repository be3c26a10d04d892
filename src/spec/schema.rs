//! The spec file as written: TOML tables and keys, before validation.
//!
//! Every table refuses unknown keys (the error then suggests the nearest
//! known key). Lengths and colours stay text here; [`crate::figure`]
//! turns this into the typed, validated figure model. The key names are
//! documented in README.md ("Figure specs").

use serde::Deserialize;

/// A whole spec file.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Spec {
    /// The page: kind of figure, size, resolution, titles.
    pub figure: FigureTable,
    /// The data table and the variable that sets the colour.
    pub data: DataTable,
    /// Map settings (choropleths and dot maps).
    pub map: Option<MapTable>,
    /// Plot settings (dot plots).
    pub plot: Option<PlotTable>,
    /// How values are put into classes.
    pub classes: Option<ClassesTable>,
    /// The colours.
    pub colors: Option<ColorsTable>,
    /// Marker style (dot plots and dot maps).
    pub marks: Option<MarksTable>,
    /// The legend.
    pub legend: Option<LegendTable>,
    /// Small multiples.
    pub panels: Option<PanelsTable>,
    /// Text sizes and colour.
    pub text: Option<TextTable>,
    /// How `check` and `render` audit the figure.
    pub audit: Option<AuditTable>,
}

/// `[figure]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FigureTable {
    /// `choropleth`, `dot-plot`, `ranked-dots` or `dot-map`.
    pub kind: String,
    /// A column width preset (`single-column`, `one-and-a-half-column`,
    /// `double-column`) instead of `width`.
    pub column: Option<String>,
    /// Width with a unit.
    pub width: Option<String>,
    /// Height with a unit.
    pub height: Option<String>,
    /// Raster resolution for PNG output.
    pub dpi: Option<f64>,
    /// Page colour (CSS).
    pub background: Option<String>,
    /// Title line.
    pub title: Option<String>,
    /// Subtitle line.
    pub subtitle: Option<String>,
    /// Source line, at the foot.
    pub source: Option<String>,
    /// Note line, at the foot.
    pub note: Option<String>,
    /// A written description replacing the generated one.
    pub description: Option<String>,
    /// Write the plotted data as CSV beside the figure.
    pub data_copy: Option<bool>,
    /// Output formats when the command line does not say (svg, png, pdf).
    pub formats: Option<Vec<String>>,
}

/// `[data]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DataTable {
    /// CSV file, relative to the spec.
    pub table: String,
    /// Key column (joins rows to shapes; names each mark).
    pub key: String,
    /// The column that sets the colour.
    pub value: Option<String>,
    /// Stevens's level of measurement of `value`: nominal, ordinal,
    /// interval or ratio.
    pub level: Option<String>,
    /// A meaningful middle of the value (makes the scheme diverging).
    pub midpoint: Option<f64>,
    /// Units shown after numbers in the legend.
    pub units: Option<String>,
    /// Digits after the decimal point in labels.
    pub precision: Option<u32>,
    /// What the value is called (legend title and description).
    pub label: Option<String>,
    /// Category order (nominal and ordinal text values).
    pub categories: Option<Vec<String>>,
    /// Cell texts that mean "no data" (default: empty, NA, N/A, null, -).
    pub missing: Option<Vec<String>>,
}

/// `[map]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MapTable {
    /// Boundary file (GeoJSON or TopoJSON), relative to the spec.
    pub shapes: Option<String>,
    /// Feature property holding the key.
    pub shape_key: Option<String>,
    /// TopoJSON object to read.
    pub object: Option<String>,
    /// Projection name (default: an equal-area one from the extent).
    pub projection: Option<String>,
    /// Border colour.
    pub border_color: Option<String>,
    /// Border width with a unit.
    pub border_width: Option<String>,
    /// Simplification tolerance with a unit (0pt: off).
    pub simplify: Option<String>,
    /// Longitude column (dot maps).
    pub lon: Option<String>,
    /// Latitude column (dot maps).
    pub lat: Option<String>,
    /// Fill of the base shapes under a dot map.
    pub land_color: Option<String>,
    /// Layers drawn in a fixed style for context.
    #[serde(default)]
    pub context: Vec<ContextTable>,
}

/// `[[map.context]]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ContextTable {
    /// GeoJSON file, relative to the spec.
    pub shapes: String,
    /// `water` (a conventional water style) or `plain`.
    pub style: Option<String>,
    /// Fill of polygons (CSS colour or `none`).
    pub fill: Option<String>,
    /// Line colour.
    pub stroke: Option<String>,
    /// Line width with a unit.
    pub width: Option<String>,
    /// Draw under the data instead of over it.
    pub below: Option<bool>,
}

/// `[plot]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PlotTable {
    /// Horizontal column (dot plot).
    pub x: Option<String>,
    /// Vertical column (dot plot).
    pub y: Option<String>,
    /// Axis titles.
    pub x_title: Option<String>,
    /// Axis titles.
    pub y_title: Option<String>,
    /// The value column along the axis (ranked dots).
    pub rank_by: Option<String>,
    /// The label column on the other axis (ranked dots).
    pub names: Option<String>,
    /// Rank from the largest value down (ranked dots; default true).
    pub descending: Option<bool>,
    /// Start numeric axes at zero.
    pub from_zero: Option<bool>,
    /// Gridlines at the ticks.
    pub grid: Option<bool>,
}

/// `[classes]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ClassesTable {
    /// `equal`, `quantile`, `natural`, `stddev`, `headtail`, `manual` or
    /// `continuous`.
    pub method: Option<String>,
    /// Number of classes.
    pub count: Option<usize>,
    /// Upper bounds (manual).
    pub breaks: Option<Vec<f64>>,
    /// Standard-deviation step: 1 or 0.5.
    pub step: Option<f64>,
    /// Round breaks to readable values.
    pub round: Option<bool>,
    /// Diverging arrangement: `break` (the midpoint is a break) or
    /// `class` (the centre of a middle class).
    pub midpoint_as: Option<String>,
}

/// `[colors]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ColorsTable {
    /// `sequential`, `diverging` or `qualitative` (default: from the level).
    pub scheme: Option<String>,
    /// Colours listed by the user, one per class (CSS notations).
    pub list: Option<Vec<String>>,
    /// Hue of a sequential scheme (OKLCH degrees).
    pub hue: Option<f64>,
    /// Arm hues of a diverging scheme (OKLCH degrees), low then high.
    pub hues: Option<Vec<f64>>,
    /// Fill for missing values.
    pub no_data: Option<String>,
}

/// `[marks]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MarksTable {
    /// Marker diameter with a unit.
    pub size: Option<String>,
    /// Hollow (ring) markers.
    pub hollow: Option<bool>,
    /// Groups (categories or class labels) kept in colour; the others fade
    /// to gray of equal lightness.
    pub emphasis: Option<Vec<String>>,
    /// Marker outline colour.
    pub outline: Option<String>,
    /// Marker outline width with a unit.
    pub outline_width: Option<String>,
}

/// `[legend]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LegendTable {
    /// Legend title (default: the data label).
    pub title: Option<String>,
    /// `right`, `bottom` or `none`.
    pub position: Option<String>,
    /// A histogram of the values under a classed legend.
    pub histogram: Option<bool>,
}

/// `[panels]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PanelsTable {
    /// The column whose values make one panel each.
    pub by: String,
    /// Panels per row.
    pub columns: Option<usize>,
    /// Panel order (default: sorted values).
    pub order: Option<Vec<String>>,
}

/// `[text]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TextTable {
    /// Body text size with a unit.
    pub size: Option<String>,
    /// Title size with a unit.
    pub title_size: Option<String>,
    /// Smallest size allowed anywhere.
    pub min_size: Option<String>,
    /// Text colour.
    pub color: Option<String>,
}

/// `[audit]`.
#[derive(Debug, Clone, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AuditTable {
    /// View names as in `inspect`.
    pub views: Option<Vec<String>>,
    /// Viewing distance with a unit.
    pub viewing_distance: Option<String>,
    /// Audit resolution (default: the figure's).
    pub dpi: Option<f64>,
    /// `error` or `warning`.
    pub fail_on: Option<String>,
    /// Threshold overrides by name (see [`crate::thresholds::SETTINGS`]).
    pub thresholds: Option<std::collections::BTreeMap<String, f64>>,
}
