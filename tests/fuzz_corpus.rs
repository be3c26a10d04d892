//! Every committed fuzz corpus and regression input (fuzz/corpus/<target>/,
//! fuzz/regressions/<target>/) replayed on the stable toolchain through the
//! same entry points as the cargo-fuzz targets (`hueproof::fuzzing`): no
//! input may panic, and each ends either in `Ok` or in a typed error for
//! the user (bad input, exit 2) whose message names the input.

use std::path::{Path, PathBuf};

use hueproof::ExitKind;
use hueproof::fuzzing::{self, TARGETS};

fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

fn inputs(dir: &Path) -> Vec<PathBuf> {
    let Ok(entries) = std::fs::read_dir(dir) else {
        return Vec::new();
    };
    let mut files: Vec<PathBuf> = entries
        .map(|e| e.unwrap().path())
        .filter(|p| p.is_file())
        .collect();
    files.sort();
    files
}

#[test]
fn every_corpus_and_regression_input_ends_in_ok_or_a_user_error() {
    let fixtures = root().join("tests").join("fixtures");
    for target in TARGETS {
        let corpus = inputs(&root().join("fuzz").join("corpus").join(target));
        let regressions = inputs(&root().join("fuzz").join("regressions").join(target));
        assert!(
            !corpus.is_empty(),
            "fuzz/corpus/{target} has no inputs (it is committed with seeds)"
        );
        let (mut ok, mut refused) = (0, 0);
        for file in corpus.iter().chain(&regressions) {
            let data = std::fs::read(file).unwrap();
            match fuzzing::run(target, &data, &fixtures) {
                Ok(()) => ok += 1,
                Err(e) => {
                    refused += 1;
                    assert_eq!(
                        e.exit_kind(),
                        ExitKind::BadInput,
                        "{target} {}: {e}",
                        file.display()
                    );
                    let message = e.to_string();
                    // The input's name: a spec's errors name the spec or
                    // the data file (both under tests/fixtures); a colour
                    // error quotes the colour text.
                    let named = match target {
                        "spec" => message.contains(fixtures.to_str().unwrap()),
                        "color" => !message.is_empty(),
                        _ => message.contains("fuzz."),
                    };
                    assert!(
                        named,
                        "{target} {}: unnamed input: {message}",
                        file.display()
                    );
                }
            }
        }
        // The seeds include valid inputs, so a reader that refused
        // everything would fail here.
        assert!(
            ok > 0,
            "{target}: no input was accepted ({refused} refused)"
        );
    }
}

#[test]
fn the_seed_figures_render_from_the_fixture_data() {
    // The two spec seeds written against tests/fixtures build and render,
    // so the spec target starts from figures that reach the SVG stage.
    let fixtures = root().join("tests").join("fixtures");
    for seed in ["choropleth.toml", "categories-map.toml"] {
        let data = std::fs::read(root().join("fuzz/corpus/spec").join(seed)).unwrap();
        fuzzing::spec(&data, &fixtures).unwrap_or_else(|e| panic!("{seed}: {e}"));
    }
}

#[test]
fn a_topojson_arc_reference_past_the_last_arc_is_refused_not_a_panic() {
    // Found by the topojson target: the decoder indexed arcs unchecked.
    let data = std::fs::read(root().join("fuzz/regressions/topojson/arc-index-out-of-range.json"))
        .unwrap();
    let e = fuzzing::topojson(&data).unwrap_err();
    assert!(e.to_string().contains("refers to arc"), "{e}");
}
