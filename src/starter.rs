//! Starter specs (the files in `templates/`, embedded at build time),
//! `hueproof new KIND` and `hueproof demo`: the templates rendered against
//! the built-in demo data ([`crate::demo`], an invented island).

use std::path::{Path, PathBuf};

use crate::error::{Error, Result};
use crate::figure::Format;
use crate::{demo, figure, output, render};

/// A starter spec.
#[derive(Debug, Clone, Copy)]
pub struct Template {
    /// Its name (`hueproof new NAME`), also its file stem.
    pub name: &'static str,
    /// What it shows.
    pub about: &'static str,
    /// The spec text.
    pub text: &'static str,
}

/// Every starter spec, one per figure kind and the main variants.
pub const TEMPLATES: [Template; 8] = [
    Template {
        name: "choropleth",
        about: "classed choropleth of ratio data (sequential)",
        text: include_str!("../templates/choropleth.toml"),
    },
    Template {
        name: "diverging-map",
        about: "choropleth of interval data around a midpoint (diverging)",
        text: include_str!("../templates/diverging-map.toml"),
    },
    Template {
        name: "categories-map",
        about: "choropleth of nominal categories (qualitative)",
        text: include_str!("../templates/categories-map.toml"),
    },
    Template {
        name: "dot-plot",
        about: "dot plot of two numeric columns, coloured by category, with emphasis",
        text: include_str!("../templates/dot-plot.toml"),
    },
    Template {
        name: "ranked-dots",
        about: "ranked dot chart",
        text: include_str!("../templates/ranked-dots.toml"),
    },
    Template {
        name: "dot-map",
        about: "dot map by longitude and latitude, continuous colour",
        text: include_str!("../templates/dot-map.toml"),
    },
    Template {
        name: "map-panels",
        about: "small multiples of a choropleth, one panel per year",
        text: include_str!("../templates/map-panels.toml"),
    },
    Template {
        name: "dot-panels",
        about: "small multiples of a dot plot, one panel per year",
        text: include_str!("../templates/dot-panels.toml"),
    },
];

/// The folder, beside a spec, that holds the demo data.
pub const DATA_DIR: &str = "data";

/// Find a template by name; the error lists them and suggests one.
pub fn template(name: &str) -> Result<Template> {
    if let Some(t) = TEMPLATES.iter().find(|t| t.name == name) {
        return Ok(*t);
    }
    let names: Vec<&str> = TEMPLATES.iter().map(|t| t.name).collect();
    let hint = crate::spec::suggest::closest(name, &names)
        .map(|s| format!(" Did you mean '{s}'?"))
        .unwrap_or_default();
    Err(Error::Usage {
        what: "KIND".into(),
        message: format!(
            "no template '{name}'; the templates are: {}.{hint}",
            names.join(", ")
        ),
    })
}

fn demo_files() -> Vec<(&'static str, String)> {
    let d = demo::generate();
    vec![
        ("districts.geojson", d.districts_geojson),
        ("districts.csv", d.districts_csv),
        ("districts_by_year.csv", d.districts_by_year_csv),
        ("stations.csv", d.stations_csv),
        ("water.geojson", d.water_geojson),
    ]
}

/// What writing the starter files did.
#[derive(Debug, Clone, Default)]
pub struct Written {
    /// Files written.
    pub files: Vec<PathBuf>,
    /// Things the user should know (files kept as they were).
    pub warnings: Vec<String>,
}

/// Write the demo data into `dir`, leaving files that already exist as
/// they are (a warning names any that differ from the demo's).
fn write_data_keeping(dir: &Path, w: &mut Written) -> Result<()> {
    std::fs::create_dir_all(dir).map_err(|source| Error::Write {
        path: dir.to_path_buf(),
        source,
    })?;
    for (name, text) in demo_files() {
        let p = dir.join(name);
        match std::fs::read(&p) {
            Ok(old) if old == text.as_bytes() => {}
            Ok(_) => w.warnings.push(format!(
                "kept the existing '{}' (it differs from the demo data the template expects)",
                p.display()
            )),
            Err(_) => {
                output::write_atomic(&p, text.as_bytes())?;
                w.files.push(p);
            }
        }
    }
    Ok(())
}

/// `hueproof new`: write template `name` to `out` and the demo data into
/// `data/` beside it, so the spec renders at once. An existing spec file
/// is never replaced.
pub fn new_spec(name: &str, out: &Path) -> Result<Written> {
    let t = template(name)?;
    if out.exists() {
        return Err(Error::Usage {
            what: "--output".into(),
            message: format!(
                "'{}' already exists; choose another name (existing files are never replaced)",
                out.display()
            ),
        });
    }
    let mut w = Written::default();
    let dir = out.parent().map(Path::to_path_buf).unwrap_or_default();
    write_data_keeping(&dir.join(DATA_DIR), &mut w)?;
    output::write_atomic(out, t.text.as_bytes())?;
    w.files.push(out.to_path_buf());
    Ok(w)
}

/// `hueproof demo`: the demo data, every template and its rendering
/// (SVG and PNG; PDF too when `pdf`) in `dir`. Files of earlier demo runs
/// are replaced; the demo writes only its own file names.
pub fn demo(dir: &Path, pdf: bool) -> Result<Written> {
    let mut w = Written::default();
    let data = dir.join(DATA_DIR);
    w.files.extend(demo::write(&data)?);
    let mut formats = vec![Format::Svg, Format::Png];
    if pdf {
        formats.push(Format::Pdf);
    }
    for t in TEMPLATES {
        let spec = dir.join(format!("{}.toml", t.name));
        output::write_atomic(&spec, t.text.as_bytes())?;
        w.files.push(spec.clone());
        let fig = figure::load(&spec)?;
        let r = render::render(fig)?;
        w.warnings
            .extend(r.warnings.iter().map(|m| format!("{}: {m}", t.name)));
        w.files.extend(render::write_files(&r, &spec, &formats)?);
    }
    Ok(w)
}

/// The demo's default folder: `sample-output` inside the hueproof
/// repository (recognised by its Cargo.toml), else `hueproof-demo`.
pub fn default_demo_dir(cwd: &Path) -> PathBuf {
    let manifest = std::fs::read_to_string(cwd.join("Cargo.toml")).unwrap_or_default();
    if manifest.contains("name = \"hueproof\"") {
        cwd.join("sample-output")
    } else {
        cwd.join("hueproof-demo")
    }
}
