//! Streaming read of a GeoJSON FeatureCollection: features are validated
//! and converted one at a time as the parser reaches them, and of each
//! feature's properties only the key property is kept. Geometries are
//! parsed by the `geojson` crate.

use std::fmt;

use serde::Deserializer as _;
use serde::de::{self, DeserializeSeed, IgnoredAny, MapAccess, SeqAccess, Visitor};

use super::geojson_read::{KeySource, LayerBuilder, ReadOptions};
use super::model::Layer;

/// Read `text` if it is a FeatureCollection; `Ok(None)` if it is valid
/// JSON of another kind (a Feature or a Geometry).
pub(crate) fn read_collection(text: &str, options: &ReadOptions) -> Result<Option<Layer>, String> {
    let mut builder = LayerBuilder::new(options);
    let mut de = serde_json::Deserializer::from_str(text);
    let is_collection = de
        .deserialize_map(Top {
            builder: &mut builder,
        })
        .and_then(|v| de.end().map(|_| v))
        .map_err(|e| format!("not valid GeoJSON (RFC 7946): {e}"))?;
    Ok(is_collection.then(|| builder.finish()))
}

struct Top<'b, 'o> {
    builder: &'b mut LayerBuilder<'o>,
}

impl<'de> Visitor<'de> for Top<'_, '_> {
    type Value = bool;
    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str("a GeoJSON object")
    }
    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<bool, A::Error> {
        let mut ty: Option<String> = None;
        let mut saw_features = false;
        while let Some(k) = map.next_key::<String>()? {
            match k.as_str() {
                "type" => ty = Some(map.next_value()?),
                "features" => {
                    map.next_value_seed(Features {
                        builder: &mut *self.builder,
                    })?;
                    saw_features = true;
                }
                _ => {
                    map.next_value::<IgnoredAny>()?;
                }
            }
        }
        match ty.as_deref() {
            Some("FeatureCollection") if saw_features => Ok(true),
            Some("FeatureCollection") => Err(de::Error::custom(
                "a FeatureCollection needs a \"features\" array",
            )),
            _ => Ok(false),
        }
    }
}

struct Features<'b, 'o> {
    builder: &'b mut LayerBuilder<'o>,
}

impl<'de> DeserializeSeed<'de> for Features<'_, '_> {
    type Value = ();
    fn deserialize<D: serde::Deserializer<'de>>(self, d: D) -> Result<(), D::Error> {
        d.deserialize_seq(self)
    }
}

impl<'de> Visitor<'de> for Features<'_, '_> {
    type Value = ();
    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str("an array of features")
    }
    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<(), A::Error> {
        while seq
            .next_element_seed(OneFeature {
                builder: &mut *self.builder,
            })?
            .is_some()
        {}
        Ok(())
    }
}

struct OneFeature<'b, 'o> {
    builder: &'b mut LayerBuilder<'o>,
}

impl<'de> DeserializeSeed<'de> for OneFeature<'_, '_> {
    type Value = ();
    fn deserialize<D: serde::Deserializer<'de>>(self, d: D) -> Result<(), D::Error> {
        d.deserialize_map(self)
    }
}

impl<'de> Visitor<'de> for OneFeature<'_, '_> {
    type Value = ();
    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str("a GeoJSON Feature object")
    }
    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<(), A::Error> {
        let wanted = match &self.builder_key() {
            Some(KeySource::Property(name)) => Some(name.clone()),
            _ => None,
        };
        let mut ty: Option<String> = None;
        let mut id: Option<geojson::feature::Id> = None;
        let mut prop: Option<serde_json::Value> = None;
        let mut geometry: Option<geojson::Geometry> = None;
        while let Some(k) = map.next_key::<String>()? {
            match k.as_str() {
                "type" => ty = Some(map.next_value()?),
                "id" => id = map.next_value()?,
                "geometry" => geometry = map.next_value()?,
                "properties" => match &wanted {
                    Some(name) => prop = map.next_value_seed(KeyProperty { name })?,
                    None => {
                        map.next_value::<IgnoredAny>()?;
                    }
                },
                _ => {
                    map.next_value::<IgnoredAny>()?;
                }
            }
        }
        if ty.as_deref() != Some("Feature") {
            return Err(de::Error::custom(format!(
                "feature {}: expected \"type\": \"Feature\", found {}",
                self.builder.len(),
                ty.map(|t| format!("\"{t}\""))
                    .unwrap_or_else(|| "no type".into())
            )));
        }
        let key = self.builder.key(id.as_ref(), prop.as_ref());
        self.builder.push(key, geometry.as_ref());
        Ok(())
    }
}

impl OneFeature<'_, '_> {
    fn builder_key(&self) -> Option<KeySource> {
        self.builder.key_source().cloned()
    }
}

/// Keeps only the value of property `name` (or nothing for `null`).
struct KeyProperty<'n> {
    name: &'n str,
}

impl<'de> DeserializeSeed<'de> for KeyProperty<'_> {
    type Value = Option<serde_json::Value>;
    fn deserialize<D: serde::Deserializer<'de>>(self, d: D) -> Result<Self::Value, D::Error> {
        d.deserialize_any(self)
    }
}

impl<'de> Visitor<'de> for KeyProperty<'_> {
    type Value = Option<serde_json::Value>;
    fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
        f.write_str("a properties object or null")
    }
    fn visit_unit<E>(self) -> Result<Self::Value, E> {
        Ok(None)
    }
    fn visit_none<E>(self) -> Result<Self::Value, E> {
        Ok(None)
    }
    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<Self::Value, A::Error> {
        let mut found = None;
        while let Some(k) = map.next_key::<String>()? {
            if k == self.name {
                found = Some(map.next_value()?);
            } else {
                map.next_value::<IgnoredAny>()?;
            }
        }
        Ok(found)
    }
}
