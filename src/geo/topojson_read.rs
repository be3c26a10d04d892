//! TopoJSON input through the `topojson` crate: the chosen object of a
//! Topology is decoded (quantisation transform, delta-encoded arcs, arc
//! references with `~i` for reversed arcs, per the TopoJSON specification)
//! into GeoJSON features, which then take the same validation as GeoJSON.

use std::path::Path;

use super::geojson_read::{ReadOptions, convert_features, read_geojson_str};
use super::model::Layer;
use crate::error::{Error, Result};

/// Read TopoJSON text: object `object`, or the first object when `None`.
pub fn read_topojson_str(
    text: &str,
    object: Option<&str>,
    options: &ReadOptions,
) -> std::result::Result<Layer, String> {
    // JSON first, so a syntax error names its line and column.
    if let Err(e) = serde_json::from_str::<serde::de::IgnoredAny>(text) {
        return Err(format!("not valid TopoJSON: not well-formed JSON: {e}"));
    }
    let topo: topojson::TopoJson = text
        .parse()
        .map_err(|e| format!("not valid TopoJSON: {e}"))?;
    let topology = match topo {
        topojson::TopoJson::Topology(t) => t,
        _ => return Err("expected a TopoJSON object of type \"Topology\"".into()),
    };
    let names = topology.list_names();
    let name = match object {
        Some(n) if names.iter().any(|m| m == n) => n.to_string(),
        Some(n) => {
            return Err(format!(
                "no object '{n}' in the topology; its objects are: {}",
                names.join(", ")
            ));
        }
        None => names
            .first()
            .cloned()
            .ok_or_else(|| "the topology has no objects".to_string())?,
    };
    check_topology(&topology, &name)?;
    let fc = topojson::to_geojson(&topology, &name)
        .map_err(|e| format!("cannot decode object '{name}': {e}"))?;
    // The crate speaks an older `geojson`; its JSON form is the bridge.
    let value = serde_json::to_value(&fc).map_err(|e| format!("cannot decode: {e}"))?;
    let fc: geojson::FeatureCollection =
        serde_json::from_value(value).map_err(|e| format!("cannot decode: {e}"))?;
    Ok(convert_features(&fc.features, options))
}

/// Check what the decoder indexes without checking (found by fuzzing: the
/// `topojson` crate panics on these): every arc reference of object `name`
/// names an existing arc (`i` or `~i`, written `-i - 1`), and every
/// position of the arcs and of the object's points has two coordinates.
fn check_topology(topology: &topojson::Topology, name: &str) -> std::result::Result<(), String> {
    use topojson::Value;
    let arcs = topology.arcs.len();
    for (a, arc) in topology.arcs.iter().enumerate() {
        if let Some(p) = arc.iter().position(|p| p.len() < 2) {
            return Err(format!(
                "arc {a}, position {p}: expected at least two coordinates"
            ));
        }
    }
    let refs = |list: &[i32]| -> std::result::Result<(), String> {
        for &r in list {
            let i = if r < 0 {
                -(i64::from(r)) - 1
            } else {
                i64::from(r)
            };
            if i >= arcs as i64 {
                return Err(format!(
                    "object '{name}' refers to arc {r}, but the topology has {arcs} arcs \
                     (0 to {}, or ~i written -i-1)",
                    arcs.saturating_sub(1)
                ));
            }
        }
        Ok(())
    };
    let point = |p: &[f64]| {
        if p.len() < 2 {
            Err(format!(
                "object '{name}': a point with {} coordinates; expected at least two",
                p.len()
            ))
        } else {
            Ok(())
        }
    };
    let mut stack = vec![
        &topology
            .objects
            .iter()
            .find(|o| o.name == name)
            .expect("the name is one of the topology's")
            .geometry,
    ];
    while let Some(g) = stack.pop() {
        match &g.value {
            Value::Point(p) => point(p)?,
            Value::MultiPoint(ps) => ps.iter().try_for_each(|p| point(p))?,
            Value::LineString(l) => refs(l)?,
            Value::MultiLineString(ls) | Value::Polygon(ls) => {
                ls.iter().try_for_each(|l| refs(l))?
            }
            Value::MultiPolygon(ps) => ps.iter().flatten().try_for_each(|l| refs(l))?,
            Value::GeometryCollection(gs) => stack.extend(gs),
        }
    }
    Ok(())
}

/// Read a boundary file, GeoJSON or TopoJSON: TopoJSON when the name ends
/// in `.topojson` or the text is a `"Topology"` object. `object` picks the
/// TopoJSON object (default: the first).
pub fn read_shapes_file(path: &Path, options: &ReadOptions, object: Option<&str>) -> Result<Layer> {
    let text = std::fs::read_to_string(path).map_err(|source| Error::Read {
        path: path.to_path_buf(),
        source,
    })?;
    let by_name = path
        .extension()
        .is_some_and(|e| e.eq_ignore_ascii_case("topojson"));
    let looks_topo = by_name || text.contains("\"Topology\"");
    let result = if looks_topo {
        match read_topojson_str(&text, object, options) {
            Ok(l) => Ok(l),
            Err(e) if by_name => Err(e),
            Err(topo_err) => read_geojson_str(&text, options)
                .map_err(|geo_err| format!("{geo_err}; as TopoJSON: {topo_err}")),
        }
    } else {
        read_geojson_str(&text, options)
    };
    result.map_err(|message| Error::Invalid {
        path: path.to_path_buf(),
        location: None,
        message,
    })
}
