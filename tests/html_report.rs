//! The HTML report (`check --html`) read as text, without a browser
//! (`html_browser.rs` loads it in one): it is self-contained, its images
//! decode, its findings and colour differences are the JSON report's, its
//! own colours pass WCAG 2.x contrast, and the same input gives the same
//! bytes.

mod html_page;

use std::collections::BTreeSet;

use base64::Engine as _;
use html_page::{FAILING_SPEC, Row, attr, decode_png, json_rows, make, scratch, tags};
use hueproof::color::{Srgb, wcag};
use hueproof::report::html::{COLOURS, TEXT_ON, text_on};

fn hex(s: &str) -> Srgb {
    let v = |i: usize| u8::from_str_radix(&s[i..i + 2], 16).unwrap();
    Srgb::from_rgb8(v(1), v(3), v(5))
}

#[test]
fn the_page_needs_nothing_from_outside() {
    let dir = scratch("outside");
    let (_, html, _) = make(FAILING_SPEC, &dir);
    // Every src and href is a data: URI (no http:, https:, file: or
    // protocol-relative // reference).
    let mut refs = 0;
    for name in ["img", "link", "a", "source", "iframe", "object", "embed"] {
        for t in tags(&html, name) {
            for a in ["src", "href", "srcset", "data"] {
                if let Some(v) = attr(t, a) {
                    refs += 1;
                    assert!(
                        v.starts_with("data:"),
                        "{name} {a}='{v}' is not a data: URI"
                    );
                }
            }
        }
    }
    assert!(refs >= 2, "the figure and the icon are data: URIs");
    // The only address in the text is the SVG namespace name, which is
    // never fetched (Namespaces in XML 1.0, section 2.2).
    let text = html.replace("xmlns=\"http://www.w3.org/2000/svg\"", "");
    for needle in [
        "http:",
        "https:",
        "file:",
        "url(",
        "@import",
        "<script",
        "javascript:",
    ] {
        assert!(!text.contains(needle), "the page contains '{needle}'");
    }
    // No event-handler attributes (` onload=` and the like).
    for (i, _) in text.match_indices(" on") {
        let name: String = text[i + 3..]
            .chars()
            .take_while(|c| c.is_ascii_lowercase())
            .collect();
        assert!(
            !text[i + 3 + name.len()..].starts_with('='),
            "an event handler on{name}"
        );
    }
    // A policy that forbids every outside request, a phone viewport and a
    // print style sheet.
    assert!(html.contains("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'\">"));
    assert!(
        html.contains("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">")
    );
    assert!(html.contains("@media print"));
    // The caution, in the audit's own words (the constant the text
    // report ends with).
    assert!(html.contains(&hueproof::svg::escape(hueproof::audit::text::CAUTION)));
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn every_image_is_a_png_that_decodes_at_its_stated_size() {
    let dir = scratch("images");
    let (_, html, _) = make(FAILING_SPEC, &dir);
    let imgs = tags(&html, "img");
    assert!(!imgs.is_empty());
    for t in imgs {
        let src = attr(t, "src").unwrap();
        let b64 = src
            .strip_prefix("data:image/png;base64,")
            .expect("a PNG data URI");
        let bytes = base64::engine::general_purpose::STANDARD
            .decode(b64)
            .unwrap();
        let (w, h, px, ch) = decode_png(&bytes);
        if let (Some(aw), Some(ah)) = (attr(t, "width"), attr(t, "height")) {
            assert_eq!(
                (aw.parse::<u32>().unwrap(), ah.parse::<u32>().unwrap()),
                (w, h)
            );
        }
        assert!(html_page::distinct_colours(&px, ch) > 10, "a drawn figure");
        assert!(!attr(t, "alt").unwrap_or_default().is_empty(), "alt text");
    }
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_findings_on_the_page_are_the_json_reports() {
    let dir = scratch("findings");
    let (_, html, json) = make(FAILING_SPEC, &dir);
    let rows: Vec<Row> = tags(&html, "tr")
        .into_iter()
        .filter(|t| t.contains("data-code="))
        .map(|t| Row::from_attrs(|k| attr(t, k).unwrap_or_default()))
        .collect();
    let expected = json_rows(&json);
    assert!(expected.len() >= 5, "the failing demo has findings");
    assert_eq!(rows, expected);
    // The verdict says what the JSON says.
    let v = tags(&html, "p")
        .into_iter()
        .find(|t| t.contains("id=\"verdict\""))
        .unwrap();
    assert_eq!(attr(v, "data-passed").unwrap(), json["passed"].to_string());
    let _ = std::fs::remove_dir_all(&dir);
}

/// CIEDE2000 by the `palette` crate, a general-purpose colour library
/// from the registry (its own tests use the Sharma, Wu & Dalal 2005
/// data; hueproof's colour core is checked against the same published
/// pairs in tests/color_reference.rs).
fn palette_ciede2000(a: Srgb, b: Srgb) -> f64 {
    use palette::IntoColor;
    use palette::color_difference::Ciede2000;
    let lab = |c: Srgb| -> palette::Lab<palette::white_point::D65, f64> {
        palette::Srgb::new(c.r, c.g, c.b).into_color()
    };
    lab(a).difference(lab(b))
}

#[test]
fn the_heat_maps_hold_ciede2000_of_the_measured_colours_and_mark_the_blends() {
    let dir = scratch("matrix");
    let (_, html, json) = make(FAILING_SPEC, &dir);
    let views: Vec<String> = json["views"]
        .as_array()
        .unwrap()
        .iter()
        .map(|v| v.as_str().unwrap().to_string())
        .collect();
    let measured = |id: &str, view: &str| -> Srgb {
        let c = json["classes"]
            .as_array()
            .unwrap()
            .iter()
            .find(|c| c["id"] == id)
            .unwrap();
        hex(c["measured"][view].as_str().unwrap())
    };
    let svgs = tags(&html, "svg");
    assert_eq!(svgs.len(), views.len(), "one heat map per view");
    let mut cells = 0;
    for (k, view) in views.iter().enumerate() {
        assert_eq!(attr(svgs[k], "data-view").as_deref(), Some(view.as_str()));
        let start = html.find(svgs[k]).unwrap();
        let end = start + html[start..].find("</svg>").unwrap();
        let svg = &html[start..end];
        let n = json["classes"].as_array().unwrap().len();
        let groups = tags(svg, "g");
        assert_eq!(
            groups.len(),
            n * (n - 1),
            "every ordered pair off the diagonal"
        );
        let mut failing = BTreeSet::new();
        for g in groups {
            let (a, b) = (attr(g, "data-a").unwrap(), attr(g, "data-b").unwrap());
            let de: f64 = attr(g, "data-de").unwrap().parse().unwrap();
            let (ca, cb) = (measured(&a, view), measured(&b, view));
            let ours = hueproof::color::ciede2000(ca.to_lab(), cb.to_lab());
            assert!(
                (de - ours).abs() <= 0.0005,
                "{view} {a}-{b}: {de} vs {ours}"
            );
            let theirs = palette_ciede2000(ca, cb);
            assert!(
                (de - theirs).abs() <= 0.01,
                "{view} {a}-{b}: {de} vs palette {theirs}"
            );
            if attr(g, "class").unwrap().contains("failing") {
                let mut p = [a, b];
                p.sort();
                failing.insert(p);
            }
            cells += 1;
        }
        let blends: BTreeSet<[String; 2]> = json_rows(&json)
            .into_iter()
            .filter(|r| r.kind == "blend" && &r.view == view)
            .map(|r| {
                let mut p = [r.classes[0].clone(), r.classes[1].clone()];
                p.sort();
                p
            })
            .collect();
        assert_eq!(failing, blends, "{view}: the marked pairs are the blends");
    }
    assert!(cells > 0);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_pages_own_colours_pass_wcag_contrast_for_body_text() {
    let colour = |name: &str| hex(COLOURS.iter().find(|(n, _)| *n == name).unwrap().1);
    for (fg, bg) in TEXT_ON {
        let r = wcag::contrast_ratio(colour(fg), colour(bg));
        // WCAG 2.x SC 1.4.3: 4.5:1 for body text.
        assert!(r >= 4.5, "{fg} on {bg}: {r:.2}:1");
    }
    // The style sheet has no colour of its own (all through the checked
    // custom properties).
    let css = include_str!("../templates/report.css");
    let body = css.split("*/").skip(1).collect::<Vec<_>>().join("*/");
    assert!(
        !body.contains('#'),
        "a literal colour in templates/report.css"
    );
    for word in ["rgb(", "hsl(", "oklch("] {
        assert!(
            !body.contains(word),
            "a literal colour in templates/report.css"
        );
    }
    // Text in the heat maps contrasts with its cell by at least 4.5:1.
    for l in 0..=100 {
        let bg = Srgb::new(l as f64 / 100.0, 0.3, 0.6);
        assert!(wcag::contrast_ratio(text_on(bg), bg) >= 4.5, "{bg:?}");
    }
    let dir = scratch("contrast");
    let (_, html, _) = make(FAILING_SPEC, &dir);
    let mut rest = html.as_str();
    let mut checked = 0;
    while let Some(i) = rest.find("<rect ") {
        let rect = &rest[i..i + rest[i..].find('>').unwrap()];
        let after = &rest[i + rect.len()..];
        if let Some(t) = after.strip_prefix("><text ") {
            let text_tag = &t[..t.find('>').unwrap()];
            let fill = |tag: &str| hex(&attr(&format!(" {tag}"), "fill").unwrap());
            let r = wcag::contrast_ratio(fill(rect), fill(text_tag));
            assert!(r >= 4.5, "heat-map text at {r:.2}:1");
            checked += 1;
        }
        rest = after;
    }
    assert!(checked > 20);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_join_and_classification_of_a_spec_are_shown() {
    let dir = scratch("join");
    let (_, html, _) = make(FAILING_SPEC, &dir);
    // The keys counted straight from the demo files the spec names.
    let geo: serde_json::Value = serde_json::from_str(
        &std::fs::read_to_string("sample-output/data/districts.geojson").unwrap(),
    )
    .unwrap();
    let shape_keys: BTreeSet<String> = geo["features"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| f["properties"]["key"].as_str().unwrap().to_string())
        .collect();
    let mut rdr = csv::Reader::from_path("sample-output/data/districts.csv").unwrap();
    let key_col = rdr
        .headers()
        .unwrap()
        .iter()
        .position(|h| h == "key")
        .unwrap();
    let row_keys: BTreeSet<String> = rdr
        .records()
        .map(|r| r.unwrap()[key_col].to_string())
        .collect();
    let count = |id: &str| -> usize {
        let t = tags(&html, "dd")
            .into_iter()
            .find(|t| t.contains(&format!("id=\"{id}\"")))
            .unwrap_or_else(|| panic!("no {id}"));
        attr(t, "data-count").unwrap().parse().unwrap()
    };
    assert_eq!(
        count("join-matched"),
        shape_keys.intersection(&row_keys).count()
    );
    assert_eq!(
        count("join-rows-without-shape"),
        row_keys.difference(&shape_keys).count()
    );
    assert_eq!(
        count("join-shapes-without-row"),
        shape_keys.difference(&row_keys).count()
    );
    // The classification: one row per class, counts adding up to the
    // values classified.
    assert!(html.contains("<dd id=\"class-method\">natural</dd>"));
    let counts: usize = tags(&html, "tr")
        .into_iter()
        .filter_map(|t| attr(t, "data-count"))
        .map(|c| c.parse::<usize>().unwrap())
        .sum();
    assert!(counts > 0 && counts <= row_keys.len());
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn same_input_same_bytes_and_a_passing_figure_says_so() {
    let (d1, d2) = (scratch("same-1"), scratch("same-2"));
    let (_, a, _) = make("sample-output/choropleth.toml", &d1);
    let (_, b, json) = make("sample-output/choropleth.toml", &d2);
    assert!(a == b, "two runs differ");
    assert_eq!(json["passed"], true);
    assert!(a.contains("class=\"verdict pass\""));
    // `check --html` embeds the contact sheet `hueproof sheet` draws for
    // the same audit, byte for byte.
    let spec = std::path::Path::new("sample-output/choropleth.toml");
    let r = hueproof::render::render(hueproof::figure::load(spec).unwrap()).unwrap();
    let opt = hueproof::audit::settings::for_figure(&r);
    let examined = hueproof::audit::examine(spec, &r.svg, &opt).unwrap();
    let sheet =
        hueproof::sheet::sheet_png("sample-output/choropleth.toml", &examined, &opt).unwrap();
    let uri = format!(
        "data:image/png;base64,{}",
        base64::engine::general_purpose::STANDARD.encode(&sheet)
    );
    assert!(a.contains("<section id=\"sheet\">") && a.contains(&uri));
    let _ = std::fs::remove_dir_all(&d1);
    let _ = std::fs::remove_dir_all(&d2);
}

#[test]
fn an_svg_from_elsewhere_gets_a_page_without_spec_sections() {
    let dir = scratch("svg");
    let svg = dir.join("pair.svg");
    std::fs::write(
        &svg,
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"60mm\" height=\"30mm\" viewBox=\"0 0 60 30\"><rect width=\"60\" height=\"30\" fill=\"#ffffff\"/><rect x=\"2\" y=\"2\" width=\"27\" height=\"26\" fill=\"#d45f3c\"/><rect x=\"31\" y=\"2\" width=\"27\" height=\"26\" fill=\"#5e8d3a\"/></svg>",
    )
    .unwrap();
    let (_, html, json) = make(svg.to_str().unwrap(), &dir);
    assert!(!html.contains("id=\"join\"") && !html.contains("id=\"classification\""));
    let rows = tags(&html, "tr")
        .into_iter()
        .filter(|t| t.contains("data-code="))
        .count();
    assert_eq!(rows, json_rows(&json).len());
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn a_contact_sheet_given_as_png_gets_its_section() {
    use hueproof::report::html::{HtmlInput, render};
    let svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"40mm\" height=\"20mm\" viewBox=\"0 0 40 20\"><rect width=\"40\" height=\"20\" fill=\"#ffffff\"/><rect x=\"2\" y=\"2\" width=\"17\" height=\"16\" fill=\"#2b6cb0\"/><rect x=\"21\" y=\"2\" width=\"17\" height=\"16\" fill=\"#f6ad55\"/></svg>";
    let name = std::path::Path::new("two.svg");
    let opt = hueproof::audit::Options::new();
    let report = hueproof::audit::audit_svg(name, svg, &opt).unwrap();
    // Any PNG stands in for the sheet here: the figure itself, drawn.
    let doc = hueproof::raster::parse(name, svg.as_bytes()).unwrap();
    let img = hueproof::raster::render(name, &doc, 96.0, Srgb::new(1.0, 1.0, 1.0)).unwrap();
    let sheet = hueproof::raster::encode_png(&img, 96.0).unwrap();
    let mut page = HtmlInput {
        input: name,
        report: &report,
        svg,
        background: Srgb::new(1.0, 1.0, 1.0),
        rendered: None,
        join: None,
        proposal: "",
        sheet_png: Some(&sheet),
    };
    let with = render(&page).unwrap();
    assert!(with.contains("<section id=\"sheet\">"));
    let uri = format!(
        "data:image/png;base64,{}",
        base64::engine::general_purpose::STANDARD.encode(&sheet)
    );
    assert!(with.contains(&uri), "the sheet's bytes, as given");
    page.sheet_png = None;
    let without = render(&page).unwrap();
    assert!(!without.contains("id=\"sheet\"") && !without.contains(&uri));
}
