//! PDF output: page size from the SVG's physical size, deterministic bytes,
//! text drawn as paths. The PDF is parsed back with `lopdf`, a
//! general-purpose PDF reader, as an outside check of its structure.

use std::path::Path;

mod common;
use common::media_box;

use hueproof::pdf::svg_to_pdf;

const FIGURE: &str = r##"<svg xmlns="http://www.w3.org/2000/svg" width="89mm" height="60mm" viewBox="0 0 890 600">
<rect x="10" y="10" width="400" height="300" fill="#2a6f97"/>
<path d="M 500 100 L 800 100 L 650 400 Z" fill="#e9c46a" stroke="#264653" stroke-width="4"/>
</svg>"##;

const TEXT_ONLY: &str = r##"<svg xmlns="http://www.w3.org/2000/svg" width="50mm" height="20mm" viewBox="0 0 500 200">
<text x="20" y="120" font-family="sans-serif" font-size="80" fill="#000000">Harbour</text>
</svg>"##;

fn convert(svg: &str) -> Vec<u8> {
    svg_to_pdf(Path::new("figure.svg"), svg.as_bytes()).unwrap()
}

#[test]
fn starts_with_a_pdf_header_and_ends_with_eof() {
    // ISO 32000-1 section 7.5.2 (header) and 7.5.5 (end-of-file marker).
    let pdf = convert(FIGURE);
    assert!(pdf.starts_with(b"%PDF-1."), "{:?}", &pdf[..8]);
    let tail = String::from_utf8_lossy(&pdf[pdf.len() - 16..]).to_string();
    assert!(tail.trim_end().ends_with("%%EOF"), "{tail:?}");
}

#[test]
fn the_same_svg_gives_the_same_bytes() {
    assert_eq!(convert(FIGURE), convert(FIGURE));
    assert_eq!(convert(TEXT_ONLY), convert(TEXT_ONLY));
}

#[test]
fn page_size_is_the_svg_physical_size_in_points() {
    // 1 pt = 1/72 in and 1 in = 25.4 mm (the PostScript point, as PDF
    // uses it: ISO 32000-1 section 8.3.2.3), so 89 mm x 60 mm is
    // 252.28 x 170.08 pt.
    let b = media_box(&convert(FIGURE));
    assert_eq!(b.len(), 4);
    assert!(b[0].abs() < 1e-6 && b[1].abs() < 1e-6, "{b:?}");
    assert!((b[2] - 252.28).abs() < 0.01, "{b:?}");
    assert!((b[3] - 170.08).abs() < 0.01, "{b:?}");
    // CSS pixels (96 per inch): 96 px is 72 pt.
    let px = convert(
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="96" height="48"><rect width="96" height="48"/></svg>"#,
    );
    let b = media_box(&px);
    assert!(
        (b[2] - 72.0).abs() < 0.01 && (b[3] - 36.0).abs() < 0.01,
        "{b:?}"
    );
}

#[test]
fn text_survives_as_filled_paths_without_a_font() {
    let pdf = convert(TEXT_ONLY);
    let doc = lopdf::Document::load_mem(&pdf).unwrap();
    let id = *doc.get_pages().values().next().unwrap();
    let content = doc.get_page_content(id).unwrap();
    let ops = lopdf::content::Content::decode(&content)
        .unwrap()
        .operations;
    let count = |name: &str| ops.iter().filter(|o| o.operator == name).count();
    // ISO 32000-1 table 59 (path construction) and 60 (painting): glyph
    // outlines are curves (c), closed (h) and filled (f).
    assert!(
        count("m") >= 7,
        "one outline or more per letter: {}",
        count("m")
    );
    assert!(count("c") + count("l") > 50);
    assert!(count("f") + count("f*") >= 1);
    // No text object and no font: the text is drawn, not typeset.
    assert_eq!(count("BT"), 0);
    assert!(!doc.objects.values().any(|o| o.as_dict().is_ok_and(|d| {
        d.get(b"Type")
            .is_ok_and(|t| t.as_name().is_ok_and(|n| n == b"Font"))
    })));
}

#[test]
fn errors_name_the_file() {
    let e = svg_to_pdf(Path::new("broken.svg"), b"<svg").unwrap_err();
    assert_eq!(e.exit_kind(), hueproof::ExitKind::BadInput);
    assert!(e.to_string().contains("broken.svg"), "{e}");
    let img = r#"<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><image width="10" height="10" href="data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg=="/></svg>"#;
    let e = svg_to_pdf(Path::new("photo.svg"), img.as_bytes()).unwrap_err();
    assert!(
        e.to_string().contains("photo.svg") && e.to_string().contains("raster image"),
        "{e}"
    );
}

#[test]
fn clip_paths_gradients_and_opacity_convert() {
    // What a map figure uses: a clipped frame, a gradient legend, a
    // translucent halo and dashed strokes.
    let svg = r##"<svg xmlns="http://www.w3.org/2000/svg" width="120mm" height="80mm" viewBox="0 0 1200 800">
<defs>
<clipPath id="frame"><rect x="50" y="50" width="700" height="600"/></clipPath>
<linearGradient id="ramp" x1="0" x2="1" y1="0" y2="0"><stop offset="0" stop-color="#f7fbff"/><stop offset="1" stop-color="#08306b"/></linearGradient>
</defs>
<g clip-path="url(#frame)"><circle cx="400" cy="350" r="400" fill="#9ecae1"/></g>
<rect x="850" y="100" width="300" height="40" fill="url(#ramp)"/>
<g opacity="0.5"><rect x="850" y="200" width="300" height="100" fill="#ffffff"/></g>
<path d="M 850 400 L 1150 400" stroke="#333333" stroke-width="3" stroke-dasharray="10 5"/>
<text x="850" y="500" font-size="40">Legend</text>
</svg>"##;
    let pdf = convert(svg);
    let doc = lopdf::Document::load_mem(&pdf).unwrap();
    let id = *doc.get_pages().values().next().unwrap();
    let ops = lopdf::content::Content::decode(&doc.get_page_content(id).unwrap())
        .unwrap()
        .operations;
    // ISO 32000-1 table 61: W sets the clipping path; table 57: d sets
    // the dash pattern.
    assert!(ops.iter().any(|o| o.operator == "W" || o.operator == "W*"));
    assert!(ops.iter().any(|o| o.operator == "d"));
    let b = media_box(&pdf);
    assert!((b[2] - 120.0 * 72.0 / 25.4).abs() < 0.01, "{b:?}");
}

#[test]
fn many_resources_still_give_the_same_bytes() {
    // Several translucent groups and gradients: each needs a named
    // resource in the page's resource dictionary.
    let mut svg = String::from(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="60mm" height="60mm" viewBox="0 0 600 600"><defs>"##,
    );
    for i in 0..8 {
        svg.push_str(&format!(
            r##"<linearGradient id="g{i}"><stop offset="0" stop-color="#{:02x}2040"/><stop offset="1" stop-color="#ffffff"/></linearGradient>"##,
            i * 30
        ));
    }
    svg.push_str("</defs>");
    for i in 0..8 {
        svg.push_str(&format!(
            r##"<g opacity="0.{}"><rect x="{}" y="{}" width="100" height="100" fill="url(#g{i})"/></g>"##,
            i + 1,
            i * 60,
            i * 60
        ));
    }
    svg.push_str("</svg>");
    let first = convert(&svg);
    for _ in 0..5 {
        assert_eq!(convert(&svg), first);
    }
    // Every in-use cross-reference entry points at its object (ISO
    // 32000-1 section 7.5.4: "nnnnnnnnnn ggggg n" entries, byte offsets).
    let text = String::from_utf8_lossy(&first).to_string();
    let xref = text.rfind("\nxref\n").expect("a cross-reference table") + 6;
    let mut lines = text[xref..].lines();
    let header: Vec<usize> = lines
        .next()
        .unwrap()
        .split(' ')
        .map(|v| v.parse().unwrap())
        .collect();
    let mut checked = 0;
    for n in header[0]..header[0] + header[1] {
        let entry = lines.next().unwrap();
        if entry.trim_end().ends_with('n') {
            let offset: usize = entry[..10].parse().unwrap();
            let head = format!("{n} 0 obj");
            assert_eq!(
                &first[offset..offset + head.len()],
                head.as_bytes(),
                "object {n}"
            );
            checked += 1;
        }
    }
    assert!(checked > 20, "{checked} objects");
    let doc = lopdf::Document::load_mem(&first).unwrap();
    let id = *doc.get_pages().values().next().unwrap();
    let resources = doc.get_dictionary(id).unwrap().get(b"Resources").unwrap();
    let gs = resources
        .as_dict()
        .unwrap()
        .get(b"ExtGState")
        .unwrap()
        .as_dict()
        .unwrap();
    assert_eq!(gs.len(), 8, "one graphics state per opacity");
}
