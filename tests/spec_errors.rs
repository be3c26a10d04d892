//! Bad specs and bad data: every error names the file, the line and key,
//! and what was expected; the exit class is "bad input".

use std::path::PathBuf;

use hueproof::ExitKind;
use hueproof::figure;

fn dir(name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("hueproof-spec-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    std::fs::write(
        d.join("t.csv"),
        "id,x,y,group,score\na,1,2,red,5\nb,2,3,blue,-1\nc,3,1,red,oops\n",
    )
    .unwrap();
    d
}

const HEAD: &str = "[figure]\nkind = \"dot-plot\"\n\n[data]\ntable = \"t.csv\"\nkey = \"id\"\n";

fn load(name: &str, spec: &str) -> Result<figure::Figure, hueproof::Error> {
    let d = dir(name);
    let p = d.join("fig.toml");
    std::fs::write(&p, spec).unwrap();
    figure::load(&p)
}

fn err(name: &str, spec: &str) -> String {
    let e = load(name, spec).expect_err("the spec should be refused");
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    e.to_string()
}

#[test]
fn unknown_key_names_line_table_and_nearest_key() {
    let e = err(
        "unknown",
        &format!("{HEAD}\n[plot]\nx = \"x\"\nyy = \"y\"\n"),
    );
    assert!(e.contains("fig.toml"), "{e}");
    assert!(e.contains("line 10"), "{e}");
    assert!(
        e.contains("unknown key 'yy' in [plot]; did you mean 'y'?"),
        "{e}"
    );
}

#[test]
fn unknown_table_is_refused() {
    let e = err("table", &format!("{HEAD}\n[legnd]\nposition = \"right\"\n"));
    assert!(
        e.contains("unknown key 'legnd'") && e.contains("did you mean 'legend'?"),
        "{e}"
    );
}

#[test]
fn lengths_need_units() {
    let e = err(
        "length",
        "[figure]\nkind = \"dot-plot\"\nwidth = \"89\"\n\n[data]\ntable = \"t.csv\"\nkey = \"id\"\n[plot]\nx = \"x\"\ny = \"y\"\n",
    );
    assert!(e.contains("line 3, column 1, key figure.width"), "{e}");
    assert!(e.contains("expected a length with a unit"), "{e}");
}

#[test]
fn bad_colour_is_located() {
    let e = err(
        "colour",
        &format!(
            "{HEAD}value = \"group\"\nlevel = \"nominal\"\n[plot]\nx = \"x\"\ny = \"y\"\n[colors]\nlist = [\"#ff0000\", \"bluish\"]\n"
        ),
    );
    assert!(e.contains("key colors.list.1"), "{e}");
    assert!(e.contains("bluish"), "{e}");
}

#[test]
fn unknown_kind_suggests() {
    let e = err(
        "kind",
        "[figure]\nkind = \"dotplot\"\n[data]\ntable = \"t.csv\"\nkey = \"id\"\n",
    );
    assert!(
        e.contains("key figure.kind") && e.contains("Did you mean 'dot-plot'?"),
        "{e}"
    );
}

#[test]
fn missing_column_lists_the_columns() {
    let e = err("column", &format!("{HEAD}[plot]\nx = \"xx\"\ny = \"y\"\n"));
    assert!(
        e.contains("t.csv") && e.contains("no column 'xx' (asked for by plot.x)"),
        "{e}"
    );
    assert!(e.contains("Did you mean 'x'?"), "{e}");
}

#[test]
fn non_numbers_in_ratio_data_name_the_line() {
    let e = err(
        "number",
        &format!("{HEAD}value = \"score\"\nlevel = \"interval\"\n[plot]\nx = \"x\"\ny = \"y\"\n"),
    );
    assert!(e.contains("t.csv: line 4, column 'score'"), "{e}");
    assert!(e.contains("'oops' is not a number"), "{e}");
}

#[test]
fn diverging_needs_a_midpoint() {
    let e = err(
        "diverging",
        &format!(
            "{HEAD}value = \"x\"\nlevel = \"ratio\"\n[plot]\nx = \"x\"\ny = \"y\"\n[colors]\nscheme = \"diverging\"\n"
        ),
    );
    assert!(
        e.contains("key colors.scheme") && e.contains("set data.midpoint"),
        "{e}"
    );
}

#[test]
fn midpoint_needs_numbers() {
    let e = err(
        "midnom",
        &format!(
            "{HEAD}value = \"group\"\nlevel = \"nominal\"\nmidpoint = 0\n[plot]\nx = \"x\"\ny = \"y\"\n"
        ),
    );
    assert!(
        e.contains("key data.midpoint") && e.contains("interval or ratio"),
        "{e}"
    );
}

#[test]
fn forced_mismatches_warn() {
    let f = load("mismatch", &format!("{HEAD}value = \"x\"\nlevel = \"ratio\"\n[plot]\nx = \"x\"\ny = \"y\"\n[colors]\nscheme = \"qualitative\"\n")).unwrap();
    assert!(
        f.warnings
            .iter()
            .any(|w| w.contains("hue-only classes hide the order")),
        "{:?}",
        f.warnings
    );
    let f = load("mismatch2", &format!("{HEAD}value = \"group\"\nlevel = \"nominal\"\n[plot]\nx = \"x\"\ny = \"y\"\n[colors]\nscheme = \"sequential\"\n")).unwrap();
    assert!(
        f.warnings.iter().any(|w| w.contains("suggests an order")),
        "{:?}",
        f.warnings
    );
}

#[test]
fn text_below_the_minimum_is_refused() {
    let e = err(
        "text",
        &format!("{HEAD}[plot]\nx = \"x\"\ny = \"y\"\n[text]\nsize = \"5pt\"\n"),
    );
    assert!(
        e.contains("key text.size") && e.contains("below the smallest text size"),
        "{e}"
    );
}

#[test]
fn missing_data_file_names_it() {
    let e = err(
        "nofile",
        "[figure]\nkind = \"dot-plot\"\n[data]\ntable = \"nope.csv\"\nkey = \"id\"\n",
    );
    assert!(e.contains("nope.csv"), "{e}");
}

#[test]
fn errors_found_after_classification_still_name_the_line() {
    let d = dir("late");
    let p = d.join("fig.toml");
    std::fs::write(
        &p,
        format!("{HEAD}value = \"group\"\nlevel = \"nominal\"\n[plot]\nx = \"x\"\ny = \"y\"\n[marks]\nemphasis = [\"green\"]\n"),
    )
    .unwrap();
    let fig = figure::load(&p).unwrap();
    let e = hueproof::render::render(fig).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    let e = e.to_string();
    assert!(e.contains("line 13, column 1, key marks.emphasis"), "{e}");
    assert!(e.contains("'green' is not a class"), "{e}");
}
