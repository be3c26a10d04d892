//! The measured audit (`hueproof check`) on figures with known defects,
//! made here as SVG text in hueproof's markup (or rendered from a template
//! against the demo data), each flagged with the right code and view and
//! nothing else. Outside references are named beside each check.

mod common;

use common::{cli, marks, rect};

use std::path::Path;

use hueproof::ExitKind;
use hueproof::audit::{self, Options, Report};
use hueproof::color::Srgb;
use hueproof::scheme::SchemeKind;
use hueproof::vision::Simulation;

const VIEWS: [&str; 5] = [
    "normal",
    "protanopia",
    "deuteranopia",
    "tritanopia",
    "achromatopsia",
];

fn page(w: f64, h: f64, body: &str) -> String {
    format!(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="{w}pt" height="{h}pt" viewBox="0 0 {w} {h}"><rect data-role="background" width="{w}" height="{h}" fill="#ffffff"/>{body}</svg>"##
    )
}

/// Classes c1, c2, ... of `fills`, one rectangle each, in a row `pitch`
/// apart.
fn row(fills: &[&str], pitch: f64, w: f64, h: f64) -> String {
    fills
        .iter()
        .enumerate()
        .map(|(i, f)| {
            let x = 10.0 + pitch * i as f64;
            marks(&format!("c{}", i + 1), f, None, &[rect(x, 10.0, w, h)])
        })
        .collect()
}

fn circle(x: f64, y: f64, r: f64) -> String {
    format!(r#"<circle cx="{x}" cy="{y}" r="{r}"/>"#)
}

fn audit(svg: &str, dpi: f64, scheme: Option<SchemeKind>) -> Report {
    let mut opt = Options::new();
    opt.dpi = dpi;
    opt.scheme = scheme;
    audit::audit_svg(Path::new("test.svg"), svg, &opt).unwrap()
}

/// (code, view, classes) of every finding.
fn flagged(r: &Report) -> Vec<(String, String, Vec<String>)> {
    r.findings
        .iter()
        .map(|f| (f.code.to_string(), f.view.clone(), f.classes.clone()))
        .collect()
}

/// Asserts one finding of `code` on `classes` in each default view, in
/// view order, and nothing else.
fn once_in_every_view(r: &Report, code: &str, classes: &[&str]) {
    let f = flagged(r);
    assert_eq!(f.len(), 5, "{f:?}");
    for (x, v) in f.iter().zip(VIEWS) {
        assert_eq!((x.0.as_str(), x.1.as_str()), (code, v), "{f:?}");
        assert_eq!(x.2, classes, "{f:?}");
    }
}

fn hex(c: Srgb) -> [u8; 3] {
    c.to_rgb8()
}

fn parse_hex(s: &str) -> [u8; 3] {
    let v = u32::from_str_radix(&s[1..], 16).unwrap();
    [(v >> 16) as u8, (v >> 8) as u8, v as u8]
}

fn view(name: &str) -> Simulation {
    let v = hueproof::vision::parse_view(name).unwrap();
    Simulation::new(v.view, None)
}

fn rgb(s: &str) -> Srgb {
    let [r, g, b] = parse_hex(s);
    Srgb::from_rgb8(r, g, b)
}

fn two_side_by_side(a: &str, b: &str) -> String {
    page(
        160.0,
        80.0,
        &(marks("c1", a, None, &[rect(10.0, 10.0, 70.0, 60.0)])
            + &marks("c2", b, None, &[rect(80.0, 10.0, 70.0, 60.0)])),
    )
}

#[test]
fn stone_2014_thresholds_match_the_published_table() {
    // Stone, Szafir & Setlur 2014, via methods.md section 5.1: ND at
    // p = 0.5 for 2, 1, 0.5, 0.25 and 0.1 degrees (L*, a*, b*).
    let table = [
        (2.0, [5.46, 6.11, 6.79]),
        (1.0, [5.83, 6.88, 8.22]),
        (0.5, [6.58, 8.42, 11.09]),
        (0.25, [8.08, 11.50, 16.83]),
        (0.1, [12.58, 20.74, 34.05]),
    ];
    for (s, want) in table {
        let nd = audit::stone2014::noticeable_difference(0.5, s);
        for i in 0..3 {
            assert!(
                (nd[i] - want[i]).abs() < 0.01,
                "{s} deg axis {i}: {} vs {}",
                nd[i],
                want[i]
            );
        }
    }
    // Visual angle, methods.md 5.3: a 12 CSS px point at 50 cm is about
    // 0.36 degrees (12 px = 3.175 mm).
    let a = audit::stone2014::visual_angle_deg(12.0 * 25.4 / 96.0, 500.0);
    assert!((a - 0.36).abs() < 0.005, "{a}");
}

#[test]
fn red_and_green_side_by_side_blend_under_protanopia_and_deuteranopia_not_normal() {
    let svg = two_side_by_side(RED, GREEN);
    let r = audit(&svg, 48.0, None);
    let f = flagged(&r);
    let views: Vec<&str> = f.iter().map(|x| x.1.as_str()).collect();
    assert!(
        f.iter().all(|x| x.0 == "HP101" && x.2 == ["c1", "c2"]),
        "{f:?}"
    );
    // Not under normal vision nor tritanopia; under both dichromacies of the
    // red-green axis, and in grayscale (equal lightness).
    assert_eq!(
        views,
        ["protanopia", "deuteranopia", "achromatopsia"],
        "{f:?}"
    );
    // They touch, and the fix names a class and a lightness.
    assert!(
        r.contacts
            .iter()
            .any(|c| c.classes == ["c1".to_string(), "c2".to_string()] && c.length_px > 20)
    );
    assert!(r.findings[0].fix.as_deref().unwrap().contains("L*"));
    assert!(!r.passed);
}

// A red and a green of nearly equal lightness (CIELAB L* about 54 and
// 53): the textbook confusion pair of protan and deutan readers (common
// practice); equal lightness also leaves them apart only by hue, so they
// blend in grayscale too.
const RED: &str = "#d45f3c";
const GREEN: &str = "#5e8d3a";

#[test]
fn measured_colours_of_large_flat_areas_equal_the_colour_core() {
    // The fast path against the colour core's scalar simulation of the
    // nominal fills (itself checked against the Machado et al. 2009 and
    // Brettel et al. 1997 reference data in tests/vision_reference.rs).
    let svg = two_side_by_side(RED, GREEN);
    let r = audit(&svg, 48.0, None);
    for c in &r.classes {
        for (name, measured) in &c.measured.0 {
            let want = hex(view(name).apply(rgb(&c.fill)));
            let got = parse_hex(measured);
            for i in 0..3 {
                assert!(
                    (want[i] as i32 - got[i] as i32).abs() <= 1,
                    "{} {name}: {got:?} vs {want:?}",
                    c.id
                );
            }
        }
    }
    // Equal rectangles cover equal areas, within the pixel grid (crisp edges
    // at 48 dpi round each side to whole pixels).
    let (a0, a1) = (r.classes[0].area_px as f64, r.classes[1].area_px as f64);
    assert!((a0 - a1).abs() / a0 < 0.05, "{a0} {a1}");
    assert_eq!(r.classes[0].regions, 1);
}

#[test]
fn thin_dark_borders_are_not_mistaken_for_class_colour() {
    let body = marks(
        "c1",
        "#6fa8dc",
        Some(("#202020", 1.0)),
        &[
            rect(10.0, 10.0, 30.0, 30.0),
            rect(40.0, 10.0, 30.0, 30.0),
            rect(10.0, 40.0, 60.0, 20.0),
        ],
    );
    let r = audit(&page(80.0, 70.0, &body), 96.0, None);
    let got = parse_hex(&r.classes[0].measured.0[0].1);
    assert_eq!(got, parse_hex("#6fa8dc"));
    assert_eq!(r.classes[0].regions, 3);
}

#[test]
fn a_pale_class_without_borders_fades_and_a_dark_hairline_saves_it() {
    let pale = "#f1efe9";
    let shapes = [rect(20.0, 20.0, 40.0, 40.0), rect(80.0, 20.0, 40.0, 40.0)];
    let bare = audit(
        &page(140.0, 80.0, &marks("c1", pale, None, &shapes)),
        96.0,
        None,
    );
    once_in_every_view(&bare, "HP102", &["c1"]);
    // WCAG 2.x SC 1.4.11: 3:1 for the boundary of graphical objects.
    assert_eq!(bare.findings[0].threshold, 3.0);
    assert!(bare.findings[0].measured < 1.2);
    let lined = audit(
        &page(
            140.0,
            80.0,
            &marks("c1", pale, Some(("#333333", 0.75)), &shapes),
        ),
        96.0,
        None,
    );
    assert!(lined.findings.is_empty(), "{:?}", flagged(&lined));
}

#[test]
fn an_ordered_scheme_whose_lightness_reverses_is_flagged_in_achromatopsia() {
    // L* of about 82, 48 and 65: the middle class is darker than the last.
    let fills = ["#c9cad8", "#6f7488", "#9c9fb0"];
    let body = row(&fills, 50.0, 50.0, 50.0);
    let r = audit(
        &page(170.0, 70.0, &body),
        48.0,
        Some(SchemeKind::Sequential),
    );
    let f = flagged(&r);
    assert!(
        f.iter().all(|x| x.0 == "HP104" && x.2 == ["c2", "c3"]),
        "{f:?}"
    );
    let views: Vec<&str> = f.iter().map(|x| x.1.as_str()).collect();
    // CIELAB L* depends on luminance alone, so achromatopsia (luminance)
    // keeps the normal lightness; bluish grays keep it under the
    // dichromat views too. Expected views from the colour core:
    let expected: Vec<&str> = VIEWS
        .iter()
        .copied()
        .filter(|v| {
            let l: Vec<f64> = fills
                .iter()
                .map(|c| view(v).apply(rgb(c)).to_lab().l)
                .collect();
            // Falling from c1 to c3 overall, yet rising from c2 to c3.
            l[2] > l[1] && l[2] < l[0]
        })
        .collect();
    assert!(expected.contains(&"achromatopsia"));
    assert_eq!(views, expected);
    assert!(
        r.findings
            .iter()
            .all(|x| x.severity == hueproof::findings::Severity::Error)
    );
}

#[test]
fn one_much_darker_class_in_a_nominal_scheme_glares() {
    // L* about 55, 65, 75 and one at about 20; apart, not touching.
    let fills = ["#b07a5f", "#7fa67c", "#a9b8de", "#2b2f45"];
    let body = row(&fills, 50.0, 40.0, 40.0);
    let r = audit(
        &page(220.0, 60.0, &body),
        48.0,
        Some(SchemeKind::Qualitative),
    );
    once_in_every_view(&r, "HP103", &["c4"]);
}

#[test]
fn small_dots_blend_where_large_areas_of_the_same_colours_do_not() {
    // Grays about 8 L* apart: told apart as large areas (Stone et al.
    // 2014 at p = 0.5: 5.3 at 3 degrees), not as 1.5 pt dots (0.08
    // degrees at 40 cm: about 14).
    let (a, b) = ("#777777", "#888888");
    let large = page(
        180.0,
        80.0,
        &(marks("c1", a, None, &[rect(10.0, 10.0, 60.0, 60.0)])
            + &marks("c2", b, None, &[rect(100.0, 10.0, 60.0, 60.0)])),
    );
    let r = audit(&large, 48.0, None);
    assert!(r.findings.is_empty(), "{:?}", flagged(&r));
    let dots = |x0: f64| {
        (0..8)
            .map(|i| circle(x0 + 6.0 * i as f64, 10.0, 0.75))
            .collect::<Vec<_>>()
    };
    let small = page(
        110.0,
        20.0,
        &(marks("c1", a, None, &dots(5.0)) + &marks("c2", b, None, &dots(60.0))),
    );
    let r = audit(&small, 300.0, None);
    once_in_every_view(&r, "HP101", &["c1", "c2"]);
    assert_eq!(r.classes[0].regions, 8);
    assert!(
        r.classes[0].mark_angle_deg < 0.1,
        "{}",
        r.classes[0].mark_angle_deg
    );
}

#[test]
fn a_diverging_scheme_with_a_tinted_midpoint_is_flagged() {
    // Blue and orange arms of matching lightness (L* about 46 and 70 on
    // each side) around a saturated yellow middle (CIELAB chroma about 40).
    let fills = ["#3b6fb0", "#8fb0d8", "#f0d890", "#e0a47a", "#a8602c"];
    let body = row(&fills, 40.0, 40.0, 50.0);
    let svg = page(220.0, 70.0, &body);
    let r = audit(&svg, 48.0, Some(SchemeKind::Diverging));
    let f = flagged(&r);
    // The midpoint finding in normal vision, on the middle class.
    assert!(
        f.contains(&("HP106".into(), "normal".into(), vec!["c3".into()])),
        "{f:?}"
    );
    // Nothing else, except the grayscale warnings that the two arms share
    // their lightness (by design of a diverging scheme).
    for x in &r.findings {
        let grayscale_arms = x.code == "HP101"
            && x.view == "achromatopsia"
            && x.severity == hueproof::findings::Severity::Warning;
        assert!(x.code == "HP106" || grayscale_arms, "{x:?}");
    }
    // The same scheme with a neutral middle has no midpoint finding.
    let neutral = svg.replace("#f0d890", "#e4e4e4");
    let r = audit(&neutral, 48.0, Some(SchemeKind::Diverging));
    assert!(
        r.findings.iter().all(|x| x.code != "HP106"),
        "{:?}",
        flagged(&r)
    );
    assert!(r.passed);
}

#[test]
fn low_contrast_text_is_flagged_by_wcag_1_4_3() {
    // WCAG 2.x SC 1.4.3 test vectors (methods.md 3.1): #777777 on white is
    // 4.48:1 (fails 4.5:1), #767676 is 4.54:1 (passes); large text (18 pt)
    // needs 3:1 only, which #959595 (2.995:1) misses.
    let shapes = [rect(10.0, 40.0, 30.0, 20.0)];
    let body = |color: &str, size: f64| {
        marks("c1", "#3a6ea5", None, &shapes)
            + &format!(
                r#"<text x="10" y="30" font-size="{size}" fill="{color}">Rainfall by district</text>"#
            )
    };
    let fails = audit(&page(200.0, 70.0, &body("#777777", 9.0)), 150.0, None);
    once_in_every_view(&fails, "HP108", &[]);
    assert_eq!(fails.findings[0].threshold, 4.5);
    assert!((fails.findings[0].measured - 4.48).abs() < 0.01);
    let passes = audit(&page(200.0, 70.0, &body("#767676", 9.0)), 150.0, None);
    assert!(passes.findings.is_empty(), "{:?}", flagged(&passes));
    let large = audit(&page(200.0, 70.0, &body("#959595", 18.0)), 150.0, None);
    assert!(
        large
            .findings
            .iter()
            .all(|x| x.code == "HP108" && x.threshold == 3.0)
    );
    assert_eq!(large.findings.len(), 5);
    let large_ok = audit(&page(200.0, 70.0, &body("#949494", 18.0)), 150.0, None);
    assert!(large_ok.findings.is_empty(), "{:?}", flagged(&large_ok));
}

#[test]
fn a_legend_swatch_that_does_not_match_its_marks_is_flagged() {
    let legend = |swatch: &str| {
        format!(
            r#"<g data-role="legend"><g data-role="legend-entry" data-class="c1"><rect x="120" y="20" width="20" height="15" fill="{swatch}"/></g></g>"#
        )
    };
    let marks_c1 = marks("c1", "#3a6ea5", None, &[rect(10.0, 10.0, 60.0, 50.0)]);
    let same = audit(
        &page(160.0, 70.0, &(marks_c1.clone() + &legend("#3a6ea5"))),
        96.0,
        None,
    );
    assert!(same.findings.is_empty(), "{:?}", flagged(&same));
    // A swatch of clearly another blue (CIEDE2000 about 15).
    let off = audit(
        &page(160.0, 70.0, &(marks_c1 + &legend("#6a9ad5"))),
        96.0,
        None,
    );
    once_in_every_view(&off, "HP109", &["c1"]);
}

#[test]
fn the_label_raster_is_free_of_anti_aliasing() {
    // Circles, a hairline border and text: with crisp edges every pixel
    // decodes to a label that was drawn, none to a blend of two.
    use hueproof::audit::labels;
    let body = marks(
        "c1",
        "#3a6ea5",
        Some(("#ffffff", 0.3)),
        &[circle(20.0, 20.0, 7.3), circle(37.0, 21.0, 6.1)],
    ) + &marks("c2", "#d9a05b", None, &[circle(60.0, 25.0, 9.7)])
        + r#"<text x="5" y="55" font-size="9">Aq 42</text>"#;
    let svg = page(90.0, 60.0, &body);
    let l = labels::label_svg(Path::new("t.svg"), &svg).unwrap();
    assert_eq!(l.classes.ids, ["c1", "c2"]);
    let r = labels::render_labels(Path::new("t.svg"), &l, 200.0).unwrap();
    let allowed = [
        labels::BACKGROUND,
        labels::BORDER,
        labels::fill_label(0),
        labels::fill_label(1),
        labels::TEXT_BASE,
    ];
    let mut seen = std::collections::BTreeSet::new();
    for &id in &r.ids {
        assert!(allowed.contains(&id), "label {id}");
        seen.insert(id);
    }
    assert_eq!(seen.len(), allowed.len());
}

fn tmp(name: &str) -> std::path::PathBuf {
    common::scratch("audit", name)
}

#[test]
fn a_well_made_template_passes_in_every_view() {
    let d = tmp("template");
    let spec = d.join("choropleth.toml");
    cli(&["new", "choropleth", "-o", spec.to_str().unwrap()]).unwrap();
    let out = cli(&["check", spec.to_str().unwrap(), "--dpi", "72", "--json"]).unwrap();
    let v: serde_json::Value = serde_json::from_str(&out.stdout).unwrap();
    assert_eq!(v["passed"], true, "{}", out.stdout);
    assert_eq!(out.kind, ExitKind::Success);
    assert_eq!(v["views"].as_array().unwrap().len(), 5);
    let c = &v["classes"][0];
    assert_eq!(c["id"], "c1");
    assert!(c["fill"].as_str().unwrap().starts_with('#'));
    assert!(c["area_px"].as_u64().unwrap() > 0);
    assert!(
        c["measured"]["achromatopsia"]
            .as_str()
            .unwrap()
            .starts_with('#')
    );
}

#[test]
fn check_exit_codes_and_json_shape() {
    let d = tmp("cli");
    let bad = d.join("fig.svg");
    std::fs::write(&bad, two_side_by_side(RED, GREEN)).unwrap();
    let out = cli(&["check", bad.to_str().unwrap(), "--dpi", "48", "--json"]).unwrap();
    assert_eq!(out.kind, ExitKind::Findings);
    let v: serde_json::Value = serde_json::from_str(&out.stdout).unwrap();
    let f = &v["findings"][0];
    for key in [
        "code",
        "kind",
        "severity",
        "view",
        "classes",
        "measured",
        "threshold",
        "message",
    ] {
        assert!(!f[key].is_null(), "{key}");
    }
    assert_eq!(f["kind"], "blend");
    assert_eq!(f["severity"], "error");
    let text = cli(&[
        "check",
        bad.to_str().unwrap(),
        "--dpi",
        "48",
        "--views",
        "normal",
    ])
    .unwrap();
    assert_eq!(text.kind, ExitKind::Success);
    assert!(text.stdout.contains("passed"));
    // An SVG without hueproof's class markup is audited on its fills.
    let foreign = d.join("other.svg");
    std::fs::write(&foreign, r##"<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><rect width="30" height="30" fill="#4060a0"/></svg>"##).unwrap();
    let out = cli(&["check", foreign.to_str().unwrap(), "--json"]).unwrap();
    assert_eq!(out.kind, ExitKind::Success);
    let v: serde_json::Value = serde_json::from_str(&out.stdout).unwrap();
    assert_eq!(v["classes_from"], "fills");
    assert_eq!(v["classes"][0]["id"], "#4060a0");
    let not_svg = d.join("not.svg");
    std::fs::write(&not_svg, "<svg").unwrap();
    let e = cli(&["check", not_svg.to_str().unwrap()]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    let e = cli(&["check", bad.to_str().unwrap(), "--viewing-distance", "0"]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
}

#[test]
fn the_diverging_template_passes_with_its_class_at_the_midpoint_in_the_low_arm() {
    // Regression: the class whose upper bound is the midpoint (-3.4 to 0]
    // belongs to the low arm; it was once coloured from the high arm,
    // which broke the order and the arms' balance.
    let d = tmp("diverging");
    let spec = d.join("diverging-map.toml");
    cli(&["new", "diverging-map", "-o", spec.to_str().unwrap()]).unwrap();
    let out = cli(&["check", spec.to_str().unwrap(), "--dpi", "72", "--json"]).unwrap();
    let v: serde_json::Value = serde_json::from_str(&out.stdout).unwrap();
    let errors: Vec<_> = v["findings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|f| f["severity"] == "error")
        .collect();
    assert!(errors.is_empty(), "{errors:?}");
    let order: Vec<_> = v["findings"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|f| f["kind"] == "order" || f["kind"] == "midpoint")
        .collect();
    assert!(order.is_empty(), "{order:?}");
}
