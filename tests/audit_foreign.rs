//! The audit of SVG made by other tools (no `data-class` markup): classes
//! are detected from the distinct solid fills, styled in any of the ways
//! SVG allows (presentation attributes, `style` attributes, `<style>`
//! sheets with class selectors; CSS colour syntaxes), and judged like
//! hueproof's own figures. Each figure here is drawn the way a generic
//! plotting or GIS tool writes SVG, with the defects of tests/audit.rs.

use std::path::Path;

use hueproof::audit::{self, Options, Report};
use hueproof::color::Srgb;
use hueproof::findings::Severity;
use hueproof::scheme::SchemeKind;
use hueproof::vision::Simulation;

fn audit(svg: &str, dpi: f64, scheme: Option<SchemeKind>) -> Report {
    let mut opt = Options::new();
    opt.dpi = dpi;
    opt.scheme = scheme;
    audit::audit_svg(Path::new("other-tool.svg"), svg, &opt).unwrap()
}

fn flagged(r: &Report) -> Vec<(String, String, Vec<String>)> {
    r.findings
        .iter()
        .map(|f| (f.code.to_string(), f.view.clone(), f.classes.clone()))
        .collect()
}

fn ids(r: &Report) -> Vec<&str> {
    r.classes.iter().map(|c| c.id.as_str()).collect()
}

fn page(w: u32, h: u32, body: &str) -> String {
    format!(
        r##"<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" width="{w}pt" height="{h}pt" viewBox="0 0 {w} {h}">
<rect x="0" y="0" width="100%" height="100%" style="fill: white"/>
{body}
</svg>"##
    )
}

#[test]
fn classes_are_the_distinct_solid_fills_above_the_minimum_area() {
    // One blue written four ways (hex through a class selector, a style
    // attribute, rgb(), and the same hex in upper case via a presentation
    // attribute); a speck of magenta under the minimum area; a gradient;
    // a white page rectangle, which is the background and no class.
    let svg = page(
        200,
        100,
        r##"<style type="text/css">.area { fill: #3060a0 } .other { fill: #e0a040; stroke: #333333 }</style>
<defs><linearGradient id="g"><stop offset="0" stop-color="#000"/><stop offset="1" stop-color="#fff"/></linearGradient></defs>
<g class="layer">
  <path class="area" d="M10 10 H60 V60 H10 Z"/>
  <rect style="fill:#3060a0" x="60" y="10" width="30" height="50"/>
  <rect fill="rgb(48, 96, 160)" x="10" y="60" width="50" height="30"/>
  <rect fill="#3060A0" x="60" y="60" width="30" height="30"/>
  <rect class="other" x="100" y="10" width="60" height="80"/>
  <rect fill="#ff00ff" x="190" y="95" width="1" height="1"/>
  <rect fill="url(#g)" x="165" y="10" width="30" height="30"/>
</g>"##,
    );
    let r = audit(&svg, 96.0, None);
    assert_eq!(r.classes_from, "fills");
    // Lightest first (the order of a sequential reading).
    assert_eq!(ids(&r), ["#e0a040", "#3060a0"], "{:?}", r.classes);
    // Four shapes of the blue make one class of one region (they tile).
    let blue = &r.classes[1];
    assert_eq!(blue.regions, 1);
    // 80 x 80 pt at 96 dpi = 106.7 px on a side, less its anti-aliased
    // rim shared with the orange: the label raster counts whole pixels.
    let side = 80.0 * 96.0 / 72.0;
    let expected = side * side;
    assert!(
        (blue.area_px as f64 - expected).abs() < 2.0 * side,
        "{} vs {expected}",
        blue.area_px
    );
}

#[test]
fn measured_colours_equal_the_colour_core_including_a_translucent_fill() {
    // A fill at 50% opacity over white shows the sRGB-value blend (how
    // renderers composite, SVG 1.1 section 14.2 simple alpha compositing);
    // the measured colour in every view equals the colour core's
    // simulation of that blend (the core is checked against Machado et
    // al. 2009 in tests/vision_reference.rs), within one 8-bit step.
    let svg = page(
        160,
        80,
        r##"<rect fill="#2a6f3b" x="10" y="10" width="70" height="60"/>
<g opacity="0.5"><rect fill="#b03a2e" x="80" y="10" width="70" height="60"/></g>"##,
    );
    let r = audit(&svg, 48.0, None);
    assert_eq!(ids(&r), ["#b03a2e@50%", "#2a6f3b"]);
    let red = Srgb::from_rgb8(0xb0, 0x3a, 0x2e);
    let blend = |c: f64| 0.5 * c + 0.5;
    let over_white = Srgb::new(blend(red.r), blend(red.g), blend(red.b));
    for (name, hex) in &r.classes[0].measured.0 {
        let v = hueproof::vision::parse_view(name).unwrap();
        let want = Simulation::new(v.view, None).apply(over_white).to_rgb8();
        let got = u32::from_str_radix(&hex[1..], 16).unwrap();
        let got = [(got >> 16) as u8, (got >> 8) as u8, got as u8];
        for ch in 0..3 {
            assert!(
                (got[ch] as i32 - want[ch] as i32).abs() <= 1,
                "{name}: {hex} vs {want:?}"
            );
        }
    }
}

#[test]
fn red_and_green_drawn_by_another_tool_blend_under_the_red_green_dichromacies() {
    // The pair of tests/audit.rs (a red and a green of CIELAB L* about 54
    // and 53, the textbook protan and deutan confusion pair, common
    // practice), styled through a sheet with classes.
    let svg = page(
        160,
        80,
        r##"<style>.q1{fill:#d45f3c}.q2{fill:#5e8d3a}</style>
<rect class="q1" x="10" y="10" width="70" height="60"/>
<rect class="q2" x="80" y="10" width="70" height="60"/>"##,
    );
    let r = audit(&svg, 48.0, None);
    let f = flagged(&r);
    assert!(f.iter().all(|x| x.0 == "HP101"), "{f:?}");
    let views: Vec<&str> = f.iter().map(|x| x.1.as_str()).collect();
    assert_eq!(
        views,
        ["protanopia", "deuteranopia", "achromatopsia"],
        "{f:?}"
    );
    assert!(!r.passed);
}

#[test]
fn a_diverging_figure_from_another_tool_has_its_order_reconstructed() {
    // The five fills of tests/audit.rs's diverging scheme (blue and orange
    // arms of matching lightness) drawn in shuffled document order, with a
    // saturated yellow middle (CIELAB chroma about 40), then a gray one.
    let draw = |middle: &str| {
        let fills = ["#e0a47a", "#3b6fb0", middle, "#a8602c", "#8fb0d8"];
        let body: String = fills
            .iter()
            .enumerate()
            .map(|(i, f)| {
                format!(
                    r#"<rect fill="{f}" x="{}" y="10" width="40" height="50"/>"#,
                    10 + 40 * i
                )
            })
            .collect();
        page(220, 70, &body)
    };
    // The neutral middle: it is taken as the middle class, and a well-made
    // scheme passes.
    let r = audit(&draw("#e4e4e4"), 48.0, Some(SchemeKind::Diverging));
    let order = ids(&r);
    assert_eq!(order[2], "#e4e4e4", "{order:?}");
    let arms = [&order[..2], &order[3..]];
    assert!(
        arms == [&["#3b6fb0", "#8fb0d8"][..], &["#e0a47a", "#a8602c"][..]]
            || arms == [&["#a8602c", "#e0a47a"][..], &["#8fb0d8", "#3b6fb0"][..]],
        "{order:?}"
    );
    assert!(
        r.findings
            .iter()
            .all(|x| x.code != "HP106" && x.code != "HP104")
    );
    assert!(r.passed, "{:?}", flagged(&r));
    // The yellow middle is not clearly less chromatic than the arms, so it
    // joins the orange arm as its lightest class, and the midpoint finding
    // names it: the lightest class is tinted.
    let r = audit(&draw("#f0d890"), 48.0, Some(SchemeKind::Diverging));
    let f = flagged(&r);
    assert!(
        f.iter()
            .any(|x| x.0 == "HP106" && x.1 == "normal" && x.2 == ["#f0d890"]),
        "{f:?}"
    );
    for x in &r.findings {
        let grayscale_arms =
            x.code == "HP101" && x.view == "achromatopsia" && x.severity == Severity::Warning;
        assert!(x.code == "HP106" || grayscale_arms, "{x:?}");
    }
}

#[test]
fn text_and_strokes_of_another_tool_are_text_and_borders() {
    // Low-contrast text styled by a sheet (WCAG 2.x SC 1.4.3 test vector:
    // #777777 on white is 4.48:1, below 4.5:1) and a dark outline, which
    // must not become a class of its own.
    let svg = page(
        200,
        80,
        r##"<style>text { fill: #777777; font-size: 10px } .outline { fill: none; stroke: #202020; stroke-width: 2 }</style>
<rect fill="#6a8fc0" x="10" y="10" width="80" height="50"/>
<rect class="outline" x="10" y="10" width="80" height="50"/>
<text x="100" y="40">Index of reach</text>"##,
    );
    let r = audit(&svg, 96.0, None);
    assert_eq!(ids(&r), ["#6a8fc0"]);
    let texts: Vec<_> = r.findings.iter().filter(|f| f.code == "HP108").collect();
    assert_eq!(texts.len(), 5, "{:?}", flagged(&r));
    assert!((texts[0].measured - 4.48).abs() < 0.01, "{:?}", texts[0]);
}

#[test]
fn untrusted_svg_reads_no_outside_file_and_refuses_huge_or_deep_documents() {
    // A real local PNG, bright red, that the document points at by path
    // and by file URL, beside an address: none may be read, so no red
    // appears in the measurements and each reference is reported.
    let dir = std::env::temp_dir().join(format!("hueproof-untrusted-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let png = dir.join("red.png");
    {
        let f = std::fs::File::create(&png).unwrap();
        let mut e = png::Encoder::new(std::io::BufWriter::new(f), 2, 2);
        e.set_color(png::ColorType::Rgb);
        e.write_header()
            .unwrap()
            .write_image_data(&[255, 0, 0].repeat(4))
            .unwrap();
    }
    let path = png.to_str().unwrap();
    let svg = page(
        200,
        100,
        &format!(
            r##"<rect fill="#3060a0" x="10" y="10" width="80" height="80"/>
<image href="{path}" x="100" y="10" width="40" height="40"/>
<image href="file://{path}" x="140" y="10" width="40" height="40"/>
<image href="https://example.invalid/tile.png" x="100" y="50" width="40" height="40"/>"##
        ),
    );
    let r = audit(&svg, 48.0, None);
    assert_eq!(ids(&r), ["#3060a0"]);
    assert_eq!(r.refused_references.len(), 3, "{:?}", r.refused_references);
    assert!(
        r.refused_references
            .iter()
            .any(|h| h.starts_with("https://"))
    );
    let _ = std::fs::remove_dir_all(&dir);
    // Elements nested 300 deep: a clear error, not a stack overflow.
    let deep = page(
        100,
        100,
        &format!(
            "{}<rect fill=\"#3060a0\" width=\"50\" height=\"50\"/>{}",
            "<g>".repeat(300),
            "</g>".repeat(300)
        ),
    );
    let mut opt = Options::new();
    opt.dpi = 48.0;
    let e = audit::audit_svg(Path::new("deep.svg"), &deep, &opt).unwrap_err();
    assert_eq!(e.exit_kind(), hueproof::ExitKind::BadInput);
    assert!(e.to_string().contains("deep.svg"), "{e}");
    // A declared size of 10 metres square at 300 dpi: refused before any
    // pixel is allocated, naming the size.
    let huge = r##"<svg xmlns="http://www.w3.org/2000/svg" width="10000mm" height="10000mm" viewBox="0 0 10 10"><rect fill="#3060a0" width="5" height="5"/></svg>"##;
    opt.dpi = 300.0;
    let e = audit::audit_svg(Path::new("huge.svg"), huge, &opt).unwrap_err();
    assert_eq!(e.exit_kind(), hueproof::ExitKind::BadInput);
    assert!(e.to_string().contains("pixels"), "{e}");
}
