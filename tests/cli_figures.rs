//! `hueproof new`, `render` and `demo` driven through the command-line
//! layer (parsed by clap, run by the library, no process spawned).

mod common;

use common::cli;

use hueproof::ExitKind;

fn tmp(name: &str) -> std::path::PathBuf {
    common::scratch("cli-fig", name)
}

#[test]
fn every_template_renders_at_once_after_new() {
    let d = tmp("new");
    let list = cli(&["new", "list"]).unwrap().stdout;
    for t in hueproof::starter::TEMPLATES {
        assert!(list.contains(t.name));
        let spec = d.join(format!("{}.toml", t.name));
        let out = cli(&["new", t.name, "-o", spec.to_str().unwrap()]).unwrap();
        assert!(out.stdout.contains(&format!("{}.toml", t.name)));
        let r = cli(&["render", spec.to_str().unwrap(), "--format", "svg,png"]).unwrap();
        assert_eq!(r.kind, ExitKind::Success);
        assert!(spec.with_extension("svg").exists() && spec.with_extension("png").exists());
    }
    // The data was written once and then kept.
    assert!(d.join("data/districts.csv").exists());
}

#[test]
fn new_never_replaces_a_file() {
    let d = tmp("exists");
    let spec = d.join("mine.toml");
    std::fs::write(&spec, "# my own work\n").unwrap();
    let e = cli(&["new", "choropleth", "-o", spec.to_str().unwrap()]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert_eq!(std::fs::read_to_string(&spec).unwrap(), "# my own work\n");
    let e = cli(&["new", "choroplet"]).unwrap_err().to_string();
    assert!(e.contains("Did you mean 'choropleth'?"), "{e}");
}

#[test]
fn render_refuses_to_write_over_an_input() {
    let d = tmp("input");
    let spec = d.join("c.toml");
    cli(&["new", "choropleth", "-o", spec.to_str().unwrap()]).unwrap();
    // Feed the figure its own earlier data copy (c.data.csv) and ask for a
    // new data copy: that would replace an input, so nothing is written.
    std::fs::copy(d.join("data/districts.csv"), d.join("c.data.csv")).unwrap();
    let text = std::fs::read_to_string(&spec)
        .unwrap()
        .replace("table = \"data/districts.csv\"", "table = \"c.data.csv\"")
        .replace("dpi = 300", "dpi = 300\ndata_copy = true");
    std::fs::write(&spec, &text).unwrap();
    let before = std::fs::read(d.join("c.data.csv")).unwrap();
    let e = cli(&["render", spec.to_str().unwrap()]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(e.to_string().contains("is also an input"), "{e}");
    assert_eq!(std::fs::read(d.join("c.data.csv")).unwrap(), before);
    assert!(!spec.with_extension("svg").exists(), "no partial output");
    // Elsewhere the data copy is written beside the figure.
    let out = d.join("out/fig.svg");
    cli(&[
        "render",
        spec.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ])
    .unwrap();
    let copy = std::fs::read_to_string(d.join("out/fig.data.csv")).unwrap();
    assert!(
        copy.starts_with("key,panel,value,class,class_label,color\n"),
        "{copy}"
    );
    assert_eq!(copy.lines().count(), 41);
}

#[test]
fn render_pdf_has_the_page_size_of_the_spec() {
    let d = tmp("pdf");
    let spec = d.join("c.toml");
    cli(&["new", "choropleth", "-o", spec.to_str().unwrap()]).unwrap();
    cli(&["render", spec.to_str().unwrap(), "--format", "pdf"]).unwrap();
    let pdf = lopdf::Document::load(spec.with_extension("pdf")).unwrap();
    let page = pdf.get_pages().into_values().next().unwrap();
    let media = pdf
        .get_object(page)
        .unwrap()
        .as_dict()
        .unwrap()
        .get(b"MediaBox")
        .unwrap()
        .as_array()
        .unwrap()
        .clone();
    let num = |o: &lopdf::Object| {
        o.as_float()
            .map(f64::from)
            .or_else(|_| o.as_i64().map(|v| v as f64))
            .unwrap()
    };
    // 89 mm x 80 mm in PostScript points (72 per inch, 25.4 mm per inch).
    assert!(
        (num(&media[2]) - 89.0 * 72.0 / 25.4).abs() < 0.05,
        "{media:?}"
    );
    assert!(
        (num(&media[3]) - 80.0 * 72.0 / 25.4).abs() < 0.05,
        "{media:?}"
    );
}
