//! `hueproof inspect` end to end: the documented JSON shape, view names as
//! written, exit codes and error wording.

use std::process::Command;

use clap::Parser;
use hueproof::cli::{Cli, run};
use serde_json::Value;

fn inspect_text(args: &[&str]) -> String {
    let mut argv = vec!["hueproof", "inspect", "--json"];
    argv.extend_from_slice(args);
    run(Cli::try_parse_from(argv).unwrap()).unwrap().stdout
}

fn inspect_json(args: &[&str]) -> Value {
    serde_json::from_str(&inspect_text(args)).unwrap()
}

#[test]
fn json_has_the_documented_shape() {
    let args = [
        "#000000",
        "#ffffff",
        "#777777",
        "--views",
        "normal,protanomaly=0.5,achromatopsia",
    ];
    let text = inspect_text(&args);
    let v: Value = serde_json::from_str(&text).unwrap();
    let colors = v["colors"].as_array().unwrap();
    assert_eq!(colors.len(), 3);
    for key in [
        "input",
        "hex",
        "linear_rgb",
        "xyz",
        "lab",
        "oklab",
        "oklch",
        "relative_luminance",
        "contrast_ratio",
        "views",
    ] {
        assert!(colors[0].get(key).is_some(), "missing {key}");
        assert!(
            v["background"].get(key).is_some(),
            "background missing {key}"
        );
    }
    // Views are keyed by the name as written, in the order written.
    let views = colors[0]["views"].as_object().unwrap();
    assert_eq!(views.len(), 3);
    let pos = |k: &str| text.find(&format!("\"{k}\": {{")).unwrap();
    assert!(
        pos("normal") < pos("protanomaly=0.5") && pos("protanomaly=0.5") < pos("achromatopsia")
    );
    assert_eq!(colors[0]["views"]["protanomaly=0.5"]["hex"], "#000000");
    // Every pair in every view: 3 views x 3 pairs.
    let pairs = v["pairs"].as_array().unwrap();
    assert_eq!(pairs.len(), 9);
    for p in pairs {
        assert!(p["a"].as_u64().unwrap() < p["b"].as_u64().unwrap());
        assert!(p["delta_e2000"].as_f64().unwrap() > 0.0);
    }
    // WCAG: black on white is 21:1; #777777 about 4.48:1.
    assert!((colors[0]["contrast_ratio"].as_f64().unwrap() - 21.0).abs() < 1e-9);
    assert!((colors[2]["contrast_ratio"].as_f64().unwrap() - 4.48).abs() < 0.005);
    // XYZ has Y in 0..1.
    assert!((colors[1]["xyz"][1].as_f64().unwrap() - 1.0).abs() < 1e-12);
}

#[test]
fn translucent_colours_are_composited_over_the_background() {
    let v = inspect_json(&["rgb(0 0 0 / 50%)", "--background", "#ffffff"]);
    assert_eq!(v["colors"][0]["hex"], "#808080");
    assert_eq!(v["colors"][0]["alpha"], 0.5);
}

#[test]
fn output_is_deterministic() {
    let a = inspect_json(&["oklch(60% 0.1 200)", "tomato", "#3a7"]);
    let b = inspect_json(&["oklch(60% 0.1 200)", "tomato", "#3a7"]);
    assert_eq!(a, b);
}

fn binary(args: &[&str]) -> std::process::Output {
    Command::new(env!("CARGO_BIN_EXE_hueproof"))
        .args(args)
        .output()
        .unwrap()
}

#[test]
fn bad_colour_exits_2_naming_the_text() {
    let out = binary(&["inspect", "#12", "red"]);
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("invalid colour '#12'") && err.contains("3, 4, 6 or 8 digits"),
        "{err}"
    );
}

#[test]
fn bad_view_exits_2_naming_the_view() {
    let out = binary(&["inspect", "red", "--views", "normal,protanomaly=2"]);
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(
        err.contains("invalid view 'protanomaly=2'") && err.contains("from 0 to 1"),
        "{err}"
    );
}

#[test]
fn success_exits_0_with_the_caution() {
    let out = binary(&["inspect", "red", "blue"]);
    assert_eq!(out.status.code(), Some(0));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("closest pair per view"));
    assert!(text.contains("not a certification"));
}
