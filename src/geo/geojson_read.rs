//! GeoJSON (RFC 7946) input through the `geojson` crate: FeatureCollection,
//! Feature or a bare Geometry, every geometry type, into a [`Layer`].

use std::path::Path;

use geojson::{GeoJson, GeometryValue, feature::Id};

use super::model::{CoordinateKind, Feature, Geometry, Layer, Polygon};
use super::validate::Checker;
use crate::error::{Error, Result};

/// Where a feature's key comes from.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum KeySource {
    /// The property of that name; when a feature has no such property and
    /// the name is `id`, the feature's own `id` member.
    Property(String),
    /// The feature's `id` member only.
    FeatureId,
}

/// How to read a geographic file.
#[derive(Debug, Clone)]
pub struct ReadOptions {
    /// Where keys come from; `None` numbers features by index.
    pub key: Option<KeySource>,
    /// Fix the problems that have a well-defined repair.
    pub repair: bool,
    /// Geographic (lon/lat) or already-projected coordinates.
    pub coordinates: CoordinateKind,
}

impl Default for ReadOptions {
    fn default() -> Self {
        ReadOptions {
            key: None,
            repair: false,
            coordinates: CoordinateKind::Geographic,
        }
    }
}

/// Read a GeoJSON file into a layer.
pub fn read_geojson_file(path: &Path, options: &ReadOptions) -> Result<Layer> {
    let text = std::fs::read_to_string(path).map_err(|source| Error::Read {
        path: path.to_path_buf(),
        source,
    })?;
    read_geojson_str(&text, options).map_err(|message| Error::Invalid {
        path: path.to_path_buf(),
        location: None,
        message,
    })
}

/// Read GeoJSON text into a layer. The error is a message for the user.
pub fn read_geojson_str(text: &str, options: &ReadOptions) -> std::result::Result<Layer, String> {
    // A FeatureCollection streams feature by feature (no copy of the whole
    // document in memory); anything else goes through the full parse.
    if let Some(layer) = super::geojson_stream::read_collection(text, options)? {
        return Ok(layer);
    }
    let gj: GeoJson = text
        .parse()
        .map_err(|e| format!("not valid GeoJSON (RFC 7946): {e}"))?;
    let features: Vec<geojson::Feature> = match gj {
        GeoJson::FeatureCollection(fc) => fc.features,
        GeoJson::Feature(f) => vec![f],
        GeoJson::Geometry(g) => vec![geojson::Feature {
            geometry: Some(g),
            ..Default::default()
        }],
    };
    Ok(convert_features(&features, options))
}

/// Turn parsed GeoJSON features into a validated layer.
pub fn convert_features(features: &[geojson::Feature], options: &ReadOptions) -> Layer {
    let mut b = LayerBuilder::new(options);
    for f in features {
        let prop = match &options.key {
            Some(KeySource::Property(name)) => f.properties.as_ref().and_then(|p| p.get(name)),
            _ => None,
        };
        let key = b.key(f.id.as_ref(), prop);
        b.push(key, f.geometry.as_ref());
    }
    b.finish()
}

/// Builds a layer one feature at a time (shared by the whole-document and
/// the streaming readers).
pub(crate) struct LayerBuilder<'o> {
    options: &'o ReadOptions,
    features: Vec<Feature>,
    problems: Vec<super::model::Problem>,
}

impl<'o> LayerBuilder<'o> {
    pub(crate) fn new(options: &'o ReadOptions) -> Self {
        LayerBuilder {
            options,
            features: Vec::new(),
            problems: Vec::new(),
        }
    }

    /// The key from a feature's id and the key property's value, by the
    /// key source. `Some(None)` means "no key found".
    pub(crate) fn key(
        &self,
        id: Option<&Id>,
        prop: Option<&serde_json::Value>,
    ) -> Option<Option<String>> {
        let from_id = || {
            id.map(|id| match id {
                Id::String(s) => s.clone(),
                Id::Number(n) => n.to_string(),
            })
        };
        let source = self.options.key.as_ref()?;
        Some(match source {
            KeySource::FeatureId => from_id(),
            KeySource::Property(name) => match prop {
                Some(serde_json::Value::String(s)) => Some(s.clone()),
                Some(serde_json::Value::Number(n)) => Some(n.to_string()),
                Some(serde_json::Value::Bool(b)) => Some(b.to_string()),
                Some(serde_json::Value::Null) | None if name == "id" => from_id(),
                _ => None,
            },
        })
    }

    /// Validate and add one feature; `key` as returned by [`Self::key`].
    pub(crate) fn push(
        &mut self,
        key: Option<Option<String>>,
        geometry: Option<&geojson::Geometry>,
    ) {
        let options = self.options;
        let index = self.features.len();
        let key = match key {
            None => Some(index.to_string()),
            Some(k) => k,
        };
        let shown = key.clone().unwrap_or_else(|| format!("#{index}"));
        let mut ck = Checker::new(index, &shown, options.repair, options.coordinates);
        if key.is_none() {
            let name = match &options.key {
                Some(KeySource::Property(p)) => format!("property '{p}'"),
                _ => "an id".to_string(),
            };
            ck.report(
                super::model::ProblemKind::MissingKey,
                format!("feature has no {name} to join on"),
            );
        }
        let mut out = Geometry::default();
        match geometry {
            None => ck.empty("feature has no geometry (null)"),
            Some(g) => add_geometry(&g.value, &mut out, &mut ck, ""),
        }
        if out.is_empty() && !ck.excluded && geometry.is_some() {
            ck.empty("geometry is empty");
        }
        let excluded = ck.excluded;
        self.problems.append(&mut ck.problems);
        self.features.push(Feature {
            index,
            key,
            geometry: if excluded { None } else { Some(out) },
        });
    }

    /// Number of features so far.
    pub(crate) fn len(&self) -> usize {
        self.features.len()
    }

    /// Where keys come from.
    pub(crate) fn key_source(&self) -> Option<&KeySource> {
        self.options.key.as_ref()
    }

    pub(crate) fn finish(self) -> Layer {
        Layer::new(self.features, self.problems, self.options.coordinates)
    }
}

fn add_geometry(value: &GeometryValue, out: &mut Geometry, ck: &mut Checker, prefix: &str) {
    match value {
        GeometryValue::Point { coordinates } => {
            if let Some(c) = ck.position(coordinates.as_slice(), &format!("{prefix}point")) {
                out.points.push(c);
            }
        }
        GeometryValue::MultiPoint { coordinates } => {
            for (i, p) in coordinates.iter().enumerate() {
                if let Some(c) = ck.position(p.as_slice(), &format!("{prefix}point {i}")) {
                    out.points.push(c);
                }
            }
        }
        GeometryValue::LineString { coordinates } => {
            add_line(coordinates, out, ck, &format!("{prefix}line"));
        }
        GeometryValue::MultiLineString { coordinates } => {
            for (i, l) in coordinates.iter().enumerate() {
                add_line(l, out, ck, &format!("{prefix}line {i}"));
            }
        }
        GeometryValue::Polygon { coordinates } => {
            add_polygon(coordinates, out, ck, &format!("{prefix}polygon"));
        }
        GeometryValue::MultiPolygon { coordinates } => {
            for (i, p) in coordinates.iter().enumerate() {
                add_polygon(p, out, ck, &format!("{prefix}polygon {i}"));
            }
        }
        GeometryValue::GeometryCollection { geometries } => {
            for (i, g) in geometries.iter().enumerate() {
                add_geometry(&g.value, out, ck, &format!("{prefix}member {i}, "));
            }
        }
    }
}

fn add_line(positions: &[geojson::Position], out: &mut Geometry, ck: &mut Checker, place: &str) {
    let mut line = Vec::with_capacity(positions.len());
    for (i, p) in positions.iter().enumerate() {
        if let Some(c) = ck.position(p.as_slice(), &format!("{place}, position {i}")) {
            line.push(c);
        }
    }
    line.dedup();
    if line.len() >= 2 {
        out.lines.push(line);
    } else if !ck.excluded {
        ck.report(
            super::model::ProblemKind::TooFewPositions,
            format!("{place}: a line needs two distinct positions"),
        );
    }
}

fn add_polygon(
    rings: &[Vec<geojson::Position>],
    out: &mut Geometry,
    ck: &mut Checker,
    place: &str,
) {
    let mut exterior = None;
    let mut holes = Vec::new();
    for (i, r) in rings.iter().enumerate() {
        let what = if i == 0 {
            format!("{place}, exterior ring")
        } else {
            format!("{place}, hole {}", i - 1)
        };
        let ring = ck.ring(r.iter().map(|p| p.as_slice()), &what);
        if i == 0 {
            match ring {
                Some(r) => exterior = Some(r),
                // Exterior unusable: the holes cannot stand alone.
                None => return,
            }
        } else if let Some(r) = ring {
            holes.push(r);
        }
    }
    if let Some(ext) = exterior {
        if let Some(p) = Polygon::new(ext, holes) {
            out.polygons.push(p);
        }
    }
}
