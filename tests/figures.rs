//! Figures rendered from specs: structure, legends against the
//! classification, accessible markup, text sizes, physical size and DPI,
//! determinism, and the open boundary data of a package registry.
//!
//! Outside references: the rendered SVG is read back with roxmltree (a
//! general-purpose XML parser) and rasterised with resvg; the PNG is
//! decoded with the `png` crate; the boundaries and the areas that colour
//! them come from `tests/fixtures/open_data` (US Census Bureau boundaries
//! from npm us-atlas 3.0.1; geodesic areas computed with pyproj), see
//! tests/fixtures/README.md.

mod common;

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

use hueproof::classify::{self, Method, Sample};
use hueproof::encode::Scale;
use hueproof::figure;
use hueproof::render;

fn workdir(name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("hueproof-figures-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

/// A spec for the US states coloured by their geodesic area (km²).
fn states_spec(dir: &Path, extra: &str) -> PathBuf {
    let rows = common::read_csv("open_data/us_states_geodesic_areas.csv");
    let mut csv = String::from("id,area_km2\n");
    for r in &rows {
        csv.push_str(&format!(
            "{},{:.0}\n",
            r["id"],
            common::f(r, "geodesic_area_m2") / 1e6
        ));
    }
    std::fs::write(dir.join("areas.csv"), csv).unwrap();
    std::fs::copy(
        common::fixture("open_data/us_states_10m.topojson"),
        dir.join("states.topojson"),
    )
    .unwrap();
    let spec = format!(
        r#"
[figure]
kind = "choropleth"
column = "single-column"
height = "70mm"
title = "Area of each state"
source = "Boundaries: US Census Bureau (public domain), via npm us-atlas 3.0.1"
dpi = 150

[data]
table = "areas.csv"
key = "id"
value = "area_km2"
level = "ratio"
units = "km²"
label = "Area"

[map]
shapes = "states.topojson"
object = "states"
projection = "albers"
{extra}
"#
    );
    let p = dir.join("states.toml");
    std::fs::write(&p, spec).unwrap();
    p
}

fn marks(doc: &roxmltree::Document) -> Vec<(String, String, String)> {
    doc.descendants()
        .filter(|n| n.attribute("data-key").is_some())
        .map(|n| {
            let panel = n
                .ancestors()
                .find(|a| a.attribute("data-role") == Some("panel"))
                .and_then(|a| a.attribute("data-panel"))
                .unwrap_or("")
                .to_string();
            (
                n.attribute("data-key").unwrap().to_string(),
                n.attribute("data-class").unwrap_or("").to_string(),
                panel,
            )
        })
        .collect()
}

#[test]
fn open_boundaries_render_with_every_feature_once_and_legend_equal_to_breaks() {
    let dir = workdir("states");
    let spec = states_spec(&dir, "[classes]\nmethod = \"natural\"\ncount = 5\n");
    let fig = figure::load(&spec).unwrap();
    let r = render::render(fig).unwrap();
    let doc = roxmltree::Document::parse(&r.svg).expect("well-formed SVG");
    let root = doc.root_element();
    assert_eq!(root.attribute("role"), Some("img"));
    assert_eq!(root.attribute("aria-labelledby"), Some("hp-title hp-desc"));
    assert_eq!(root.attribute("width"), Some("89mm"));
    let title = doc.descendants().find(|n| n.has_tag_name("title")).unwrap();
    assert_eq!(title.attribute("id"), Some("hp-title"));
    assert_eq!(title.text(), Some("Area of each state"));

    // Every state of the topology appears exactly once, keyed by FIPS code.
    let rows = common::read_csv("open_data/us_states_geodesic_areas.csv");
    let m = marks(&doc);
    let keys: Vec<&str> = m.iter().map(|(k, _, _)| k.as_str()).collect();
    assert_eq!(keys.len(), rows.len());
    for row in &rows {
        assert_eq!(
            keys.iter().filter(|k| **k == row["id"]).count(),
            1,
            "{}",
            row["id"]
        );
    }

    // The classes are exactly the natural breaks of the same values,
    // recomputed here through the classification stage (itself checked
    // against the reference library in tests/classification.rs).
    let values: Vec<f64> = rows
        .iter()
        .map(|r| (common::f(r, "geodesic_area_m2") / 1e6).round())
        .collect();
    let c = classify::classify(
        &Sample::new(values.clone(), 0).unwrap(),
        &Method::NaturalBreaks { classes: 5 },
        10,
    )
    .unwrap();
    let uppers: Vec<f64> = r
        .encoding
        .classes
        .iter()
        .map(|c| c.upper.unwrap())
        .collect();
    assert_eq!(uppers, c.breaks);
    // Each mark's class is the class of its value.
    let by_key: BTreeMap<String, f64> = rows
        .iter()
        .map(|r| {
            (
                r["id"].clone(),
                (common::f(r, "geodesic_area_m2") / 1e6).round(),
            )
        })
        .collect();
    for (k, class, _) in &m {
        let expect = format!("c{}", classify::class_of(by_key[k], &c.breaks) + 1);
        assert_eq!(class, &expect, "{k}");
    }
    // Marks are grouped by class: each group's marks share its class.
    for g in doc
        .descendants()
        .filter(|n| n.attribute("data-role") == Some("marks"))
    {
        let gc = g.attribute("data-class").unwrap();
        assert_eq!(g.attribute("id").unwrap(), format!("p1-{gc}"));
        for child in g.children().filter(|n| n.is_element()) {
            assert_eq!(child.attribute("data-class"), Some(gc));
        }
    }
    // One legend entry per class, in order, labelled with its range.
    let entries: Vec<_> = doc
        .descendants()
        .filter(|n| n.attribute("data-role") == Some("legend-entry"))
        .collect();
    assert_eq!(entries.len(), 5);
    for (i, e) in entries.iter().enumerate() {
        assert_eq!(
            e.attribute("data-class"),
            Some(format!("c{}", i + 1).as_str())
        );
        let label = e
            .descendants()
            .find(|n| n.has_tag_name("text"))
            .unwrap()
            .text()
            .unwrap();
        assert_eq!(label, r.encoding.classes[i].label);
    }
    // The description names the classes and the extremes (Alaska, FIPS 02,
    // is the largest state; the District of Columbia, 11, the smallest:
    // common knowledge, and the fixture's areas agree).
    assert!(
        r.description
            .contains("5 classes by natural (Fisher-Jenks) breaks"),
        "{}",
        r.description
    );
    assert!(r.description.contains("at 02"), "{}", r.description);
    assert!(
        r.description.contains("Lowest:") && r.description.contains("at 11"),
        "{}",
        r.description
    );
}

#[test]
fn no_text_below_the_minimum_and_the_png_carries_size_and_dpi() {
    let dir = workdir("sizes");
    let spec = states_spec(&dir, "[legend]\nhistogram = true\n");
    let fig = figure::load(&spec).unwrap();
    let min = fig.text.min_size;
    let r = render::render(fig).unwrap();
    let doc = roxmltree::Document::parse(&r.svg).unwrap();
    let sizes: Vec<f64> = doc
        .descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| n.attribute("font-size").unwrap().parse().unwrap())
        .collect();
    assert!(!sizes.is_empty());
    assert!(sizes.iter().all(|s| *s >= min), "{sizes:?}");
    // 6 pt is the default minimum (common practice for print).
    assert_eq!(min, 6.0);

    let png = render::encode_format(&r, figure::Format::Png, Path::new("states.png")).unwrap();
    let decoder = png::Decoder::new(std::io::Cursor::new(png));
    let reader = decoder.read_info().unwrap();
    let info = reader.info();
    // 89 mm at 150 dpi: 89 / 25.4 * 150 = 525.6 px (the inch is 25.4 mm).
    assert!(
        (info.width as f64 - 89.0 / 25.4 * 150.0).abs() <= 1.0,
        "{}",
        info.width
    );
    let dims = info.pixel_dims.unwrap();
    // pHYs is in pixels per metre: 150 / 0.0254 = 5905.5.
    assert_eq!(dims.xppu, 5906);
    assert_eq!(dims.unit, png::Unit::Meter);
}

#[test]
fn same_spec_same_bytes() {
    let dir = workdir("determinism");
    let spec = states_spec(&dir, "[classes]\nmethod = \"quantile\"\ncount = 4\n");
    let a = render::render(figure::load(&spec).unwrap()).unwrap();
    let b = render::render(figure::load(&spec).unwrap()).unwrap();
    assert_eq!(a.svg, b.svg);
    let pa = render::encode_format(&a, figure::Format::Png, Path::new("a.png")).unwrap();
    let pb = render::encode_format(&b, figure::Format::Png, Path::new("b.png")).unwrap();
    assert_eq!(pa, pb);
}

#[test]
fn missing_rows_are_no_data_with_their_own_entry() {
    let dir = workdir("nodata");
    let spec = states_spec(&dir, "");
    // Drop two states from the table.
    let csv = std::fs::read_to_string(dir.join("areas.csv")).unwrap();
    let kept: Vec<&str> = csv
        .lines()
        .filter(|l| !l.starts_with("06,") && !l.starts_with("48,"))
        .collect();
    std::fs::write(dir.join("areas.csv"), kept.join("\n") + "\n").unwrap();
    let r = render::render(figure::load(&spec).unwrap()).unwrap();
    assert_eq!(r.encoding.no_data.count, 2);
    let doc = roxmltree::Document::parse(&r.svg).unwrap();
    let mut nd: Vec<_> = marks(&doc)
        .into_iter()
        .filter(|(_, c, _)| c == "no-data")
        .map(|(k, _, _)| k)
        .collect();
    nd.sort();
    assert_eq!(nd, vec!["06".to_string(), "48".to_string()]);
    let entry = doc
        .descendants()
        .find(|n| {
            n.attribute("data-role") == Some("legend-entry")
                && n.attribute("data-class") == Some("no-data")
        })
        .expect("a no-data legend entry");
    let swatch = entry.children().find(|n| n.has_tag_name("rect")).unwrap();
    assert_eq!(swatch.attribute("fill"), Some("url(#hp-no-data)"));
    assert!(
        r.warnings
            .iter()
            .any(|w| w.contains("2 shape(s) have no data row")),
        "{:?}",
        r.warnings
    );
    assert!(
        r.description.contains("2 areas have no data"),
        "{}",
        r.description
    );
}

#[test]
fn continuous_colouring_uses_a_ramp_legend() {
    let dir = workdir("continuous");
    let spec = states_spec(&dir, "[classes]\nmethod = \"continuous\"\n");
    let r = render::render(figure::load(&spec).unwrap()).unwrap();
    assert!(matches!(r.encoding.scale, Scale::Continuous { .. }));
    let doc = roxmltree::Document::parse(&r.svg).unwrap();
    assert!(doc.descendants().any(|n| n.has_tag_name("linearGradient")));
    assert!(marks(&doc).iter().all(|(_, c, _)| c == "ramp"));
}
