//! `hueproof palette` end to end: JSON shape, formats and exit codes.

use clap::Parser;
use hueproof::ExitKind;
use hueproof::cli::{Cli, run};
use serde_json::Value;

fn run_args(args: &[&str]) -> hueproof::cli::Outcome {
    let mut argv = vec!["hueproof", "palette"];
    argv.extend_from_slice(args);
    run(Cli::try_parse_from(argv).unwrap()).unwrap()
}

#[test]
fn make_json_has_the_documented_shape() {
    let out = run_args(&[
        "make",
        "--scheme",
        "sequential",
        "--classes",
        "5",
        "--json",
        "--ramp",
        "9",
    ]);
    assert_eq!(out.kind, ExitKind::Success);
    let v: Value = serde_json::from_str(&out.stdout).unwrap();
    assert_eq!(v["scheme"], "sequential");
    let colors = v["colors"].as_array().unwrap();
    assert_eq!(colors.len(), 5);
    for c in colors {
        let s = c.as_str().unwrap();
        assert!(s.len() == 7 && s.starts_with('#'));
    }
    for view in [
        "normal",
        "protanopia",
        "deuteranopia",
        "tritanopia",
        "achromatopsia",
    ] {
        assert!(v["min_delta_e2000"][view].as_f64().unwrap() > 0.0, "{view}");
    }
    assert_eq!(v["ramp"].as_array().unwrap().len(), 9);
    // The ramp passes through the class colours at its ends.
    assert_eq!(v["ramp"][0], v["colors"][0]);
    assert_eq!(v["ramp"][8], v["colors"][4]);
}

#[test]
fn check_fails_a_build_on_blending_classes() {
    // Pure red and a green of the same luminance merge for deuteranopes.
    let out = run_args(&[
        "check",
        "#d03030",
        "#5a8f00",
        "--scheme",
        "qualitative",
        "--json",
    ]);
    assert_eq!(out.kind, ExitKind::Findings);
    let v: Value = serde_json::from_str(&out.stdout).unwrap();
    let f = &v["findings"][0];
    assert_eq!(f["code"], "HP101");
    assert_eq!(f["severity"], "error");
    assert!(
        f["views"]
            .as_array()
            .unwrap()
            .iter()
            .any(|x| x == "deuteranopia")
    );
}

#[test]
fn fix_reports_changes_and_passes() {
    let out = run_args(&[
        "fix",
        "#d03030",
        "#5a8f00",
        "--scheme",
        "qualitative",
        "--json",
    ]);
    let v: Value = serde_json::from_str(&out.stdout).unwrap();
    assert!(!v["changes"].as_array().unwrap().is_empty());
    assert_eq!(out.kind, ExitKind::Success, "{}", out.stdout);
    let again = run_args(&[
        "check",
        v["colors"][0].as_str().unwrap(),
        v["colors"][1].as_str().unwrap(),
        "--scheme",
        "qualitative",
    ]);
    assert_eq!(again.kind, ExitKind::Success, "{}", again.stdout);
}

#[test]
fn css_and_toml_formats() {
    let css = run_args(&[
        "make",
        "--scheme",
        "diverging",
        "--classes",
        "4",
        "--format",
        "css",
    ])
    .stdout;
    assert!(css.contains(":root {") && css.contains("--class-4: #"));
    let toml = run_args(&[
        "make",
        "--scheme",
        "qualitative",
        "--classes",
        "3",
        "--format",
        "toml",
    ])
    .stdout;
    assert!(toml.contains("scheme = \"qualitative\"") && toml.contains("colors = [\"#"));
}

#[test]
fn bad_arguments_name_the_option() {
    let err = run(Cli::try_parse_from([
        "hueproof",
        "palette",
        "make",
        "--scheme",
        "diverging",
        "--classes",
        "5",
        "--hues",
        "30",
    ])
    .unwrap())
    .unwrap_err();
    assert_eq!(err.exit_kind(), ExitKind::BadInput);
    assert!(err.to_string().starts_with("--hues:"), "{err}");
    let err = run(Cli::try_parse_from([
        "hueproof",
        "palette",
        "make",
        "--scheme",
        "qualitative",
        "--classes",
        "3",
        "--pin",
        "5=red",
    ])
    .unwrap())
    .unwrap_err();
    assert!(err.to_string().contains("from 1 to 3"), "{err}");
}
