//! The validated figure model: everything a figure needs, typed, checked
//! and in physical units (points), with the data read, joined and
//! projected. Later stages (encoding, layout, SVG) read only this.

use std::path::PathBuf;

use crate::classify::Method;
use crate::classify::diverging::Arrangement;
use crate::color::Srgb;
use crate::geo::{Coord, Geometry};
use crate::scheme::SchemeKind;

/// The kind of figure.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// Areas filled by class or continuously.
    Choropleth,
    /// Points at numeric x and y, with axes.
    DotPlot,
    /// Items ranked along one axis by value, labelled on the other.
    RankedDots,
    /// Points placed by longitude and latitude.
    DotMap,
}

impl Kind {
    /// All kinds with their spec names.
    pub const ALL: [(Kind, &'static str); 4] = [
        (Kind::Choropleth, "choropleth"),
        (Kind::DotPlot, "dot-plot"),
        (Kind::RankedDots, "ranked-dots"),
        (Kind::DotMap, "dot-map"),
    ];

    /// The spec name.
    pub fn name(self) -> &'static str {
        Kind::ALL
            .iter()
            .find(|(k, _)| *k == self)
            .map_or("", |(_, n)| n)
    }

    /// Whether the figure is a map.
    pub fn is_map(self) -> bool {
        matches!(self, Kind::Choropleth | Kind::DotMap)
    }
}

/// Stevens's (1946) levels of measurement.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Level {
    /// Categories without order.
    Nominal,
    /// Ordered categories or ranks.
    Ordinal,
    /// Numbers with meaningful differences, arbitrary zero.
    Interval,
    /// Numbers with a true zero.
    Ratio,
}

impl Level {
    /// All levels with their spec names.
    pub const ALL: [(Level, &'static str); 4] = [
        (Level::Nominal, "nominal"),
        (Level::Ordinal, "ordinal"),
        (Level::Interval, "interval"),
        (Level::Ratio, "ratio"),
    ];

    /// The spec name.
    pub fn name(self) -> &'static str {
        Level::ALL
            .iter()
            .find(|(k, _)| *k == self)
            .map_or("", |(_, n)| n)
    }

    /// Whether the values are numbers (interval or ratio).
    pub fn is_numeric(self) -> bool {
        matches!(self, Level::Interval | Level::Ratio)
    }
}

/// An output format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
pub enum Format {
    /// Scalable vector graphics.
    Svg,
    /// A raster at the figure's DPI.
    Png,
    /// One PDF page of the figure's size.
    Pdf,
}

impl Format {
    /// Parse a format name.
    pub fn parse(s: &str) -> Option<Format> {
        match s.trim().to_ascii_lowercase().as_str() {
            "svg" => Some(Format::Svg),
            "png" => Some(Format::Png),
            "pdf" => Some(Format::Pdf),
            _ => None,
        }
    }

    /// The file extension.
    pub fn extension(self) -> &'static str {
        match self {
            Format::Svg => "svg",
            Format::Png => "png",
            Format::Pdf => "pdf",
        }
    }
}

/// One value of the colour variable.
#[derive(Debug, Clone, PartialEq)]
pub enum Value {
    /// A number (interval, ratio, or numeric ordinal data).
    Number(f64),
    /// A category (nominal, or ordinal text).
    Category(String),
    /// No data.
    Missing,
    /// No colour variable: every mark in one group.
    Plain,
}

/// Where a mark goes.
#[derive(Debug, Clone, PartialEq)]
pub enum Place {
    /// A projected area (planar, y up).
    Area(Geometry),
    /// A projected point (maps) or a data point (dot plots), y up.
    Point(Coord),
    /// A value along the ranking axis.
    Rank(f64),
}

/// One mark: a shape, a dot or a ranked item.
#[derive(Debug, Clone, PartialEq)]
pub struct Item {
    /// Its data key.
    pub key: String,
    /// A display name (ranked dots: the label on the category axis).
    pub name: Option<String>,
    /// Index into [`Figure::panels`].
    pub panel: usize,
    /// The colour variable's value.
    pub value: Value,
    /// Where it goes.
    pub place: Place,
}

/// Page size and surface.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Page {
    /// Width, points.
    pub width: f64,
    /// Height, points.
    pub height: f64,
    /// Raster resolution.
    pub dpi: f64,
    /// Page colour.
    pub background: Srgb,
}

/// Text sizes (points) and colour.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TextStyle {
    /// Body text.
    pub size: f64,
    /// Title.
    pub title_size: f64,
    /// The smallest size any text may have.
    pub min_size: f64,
    /// Text colour.
    pub color: Srgb,
}

/// Title block and foot lines.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Titles {
    /// Title.
    pub title: Option<String>,
    /// Subtitle.
    pub subtitle: Option<String>,
    /// Source line.
    pub source: Option<String>,
    /// Note line.
    pub note: Option<String>,
}

/// The colour variable.
#[derive(Debug, Clone, PartialEq)]
pub struct Variable {
    /// Its column, if any.
    pub column: Option<String>,
    /// What it is called.
    pub label: String,
    /// Units after numbers.
    pub units: Option<String>,
    /// Fixed decimals for labels (None: as few as tell the breaks apart).
    pub precision: Option<u32>,
    /// Level of measurement.
    pub level: Level,
    /// A meaningful middle.
    pub midpoint: Option<f64>,
    /// Category order for text values.
    pub categories: Vec<String>,
}

/// How numbers become classes.
#[derive(Debug, Clone, PartialEq)]
pub struct ClassRequest {
    /// The method, or None for continuous (unclassed) colouring.
    pub method: Option<Method>,
    /// Round breaks to readable values.
    pub round: bool,
    /// Where the midpoint sits in a diverging classification.
    pub arrangement: Arrangement,
}

/// How classes get colours.
#[derive(Debug, Clone, PartialEq)]
pub struct ColorRequest {
    /// The scheme.
    pub scheme: SchemeKind,
    /// Colours listed by the user, in class order.
    pub list: Option<Vec<Srgb>>,
    /// Sequential hue (OKLCH degrees).
    pub hue: Option<f64>,
    /// Diverging arm hues.
    pub hues: Option<(f64, f64)>,
    /// Fill of no-data marks (drawn with a hatch).
    pub no_data: Srgb,
}

/// A line style.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Stroke {
    /// Colour.
    pub color: Srgb,
    /// Width, points (0: none).
    pub width: f64,
}

/// Marker style.
#[derive(Debug, Clone, PartialEq)]
pub struct MarkStyle {
    /// Diameter, points.
    pub size: f64,
    /// Ring markers.
    pub hollow: bool,
    /// Groups kept in colour (empty: all).
    pub emphasis: Vec<String>,
    /// Outline.
    pub outline: Stroke,
}

/// Legend placement.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LegendPosition {
    /// Beside the panels.
    Right,
    /// Under the panels.
    Bottom,
    /// No legend.
    None,
}

/// The legend.
#[derive(Debug, Clone, PartialEq)]
pub struct LegendStyle {
    /// Title.
    pub title: String,
    /// Placement.
    pub position: LegendPosition,
    /// Histogram under a classed legend.
    pub histogram: bool,
}

/// A context layer drawn in a fixed style.
#[derive(Debug, Clone, PartialEq)]
pub struct ContextLayer {
    /// Projected geometries.
    pub geometries: Vec<Geometry>,
    /// Fill of polygons (None: unfilled).
    pub fill: Option<Srgb>,
    /// Lines and outlines.
    pub stroke: Stroke,
    /// Drawn under the data.
    pub below: bool,
    /// Where it came from (for the description).
    pub name: String,
}

/// Axes of a dot plot (data units).
#[derive(Debug, Clone, PartialEq)]
pub struct Axes {
    /// Horizontal title.
    pub x_title: String,
    /// Vertical title (empty for ranked dots).
    pub y_title: String,
    /// Include zero in numeric ranges.
    pub from_zero: bool,
    /// Gridlines at ticks.
    pub grid: bool,
}

/// A validated figure.
#[derive(Debug, Clone, PartialEq)]
pub struct Figure {
    /// The spec file.
    pub spec_path: PathBuf,
    /// Every file read (outputs may never replace one).
    pub inputs: Vec<PathBuf>,
    /// The kind.
    pub kind: Kind,
    /// Page.
    pub page: Page,
    /// Text.
    pub text: TextStyle,
    /// Titles.
    pub titles: Titles,
    /// A written description replacing the generated one.
    pub description: Option<String>,
    /// Write the plotted data beside the figure.
    pub data_copy: bool,
    /// Formats when the command line does not say.
    pub formats: Vec<Format>,
    /// The colour variable.
    pub variable: Variable,
    /// Classes.
    pub classes: ClassRequest,
    /// Colours.
    pub colors: ColorRequest,
    /// Legend.
    pub legend: LegendStyle,
    /// Markers.
    pub marks: MarkStyle,
    /// Borders of areas.
    pub border: Stroke,
    /// Base shapes under a dot map.
    pub base: Vec<Geometry>,
    /// Fill of the base shapes.
    pub land: Srgb,
    /// Context layers.
    pub context: Vec<ContextLayer>,
    /// Axes (dot plots and ranked dots).
    pub axes: Option<Axes>,
    /// Rank descending (ranked dots).
    pub descending: bool,
    /// Panel names ("" for a single figure).
    pub panels: Vec<String>,
    /// The column the panels come from.
    pub panel_column: Option<String>,
    /// Panels per row.
    pub panel_columns: usize,
    /// The marks.
    pub items: Vec<Item>,
    /// The projection, described (maps).
    pub projection: Option<String>,
    /// Simplification tolerance, points (0: off).
    pub simplify: f64,
    /// Where keys that later stages may report on sit in the spec
    /// (`line L, column C, key K`), by key.
    pub locations: Vec<(String, String)>,
    /// How the figure is audited.
    pub audit: super::audit::AuditSettings,
    /// Things the user should know.
    pub warnings: Vec<String>,
}

impl Figure {
    /// The location of a spec key for error messages.
    pub fn locate(&self, key: &str) -> String {
        self.locations
            .iter()
            .find(|(k, _)| k == key)
            .map_or_else(|| format!("key {key}"), |(_, l)| l.clone())
    }
}
