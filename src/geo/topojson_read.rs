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
    let fc = topojson::to_geojson(&topology, &name)
        .map_err(|e| format!("cannot decode object '{name}': {e}"))?;
    // The crate speaks an older `geojson`; its JSON form is the bridge.
    let value = serde_json::to_value(&fc).map_err(|e| format!("cannot decode: {e}"))?;
    let fc: geojson::FeatureCollection =
        serde_json::from_value(value).map_err(|e| format!("cannot decode: {e}"))?;
    Ok(convert_features(&fc.features, options))
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
