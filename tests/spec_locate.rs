//! Locating keys and array elements in TOML spec files, for every way the
//! TOML v1.0.0 specification has of writing a key (bare and quoted keys,
//! dotted keys, inline tables, `[table]` headers, `[[array of tables]]`),
//! and line/column numbers checked against the `toml` crate's own error
//! positions (a general-purpose reference).

use hueproof::spec::locate::{Step, find, line_col};

const DOC: &str = r#"# a figure
title = "Rain on the island"
layout.width_mm = 89
layout."height mm" = 60

[legend]
position = { corner = "top-right", inset = [2, 3] }

[scale.colour]
steps = 5

[[panel]]
field = "rain"

[[panel]]
field = "height"
[panel.axis]
label = "metres"
"#;

/// The text of `span` in the document.
fn text_at(path: &[Step]) -> &'static str {
    let r = find(DOC, path).unwrap_or_else(|| panic!("{path:?} not found"));
    &DOC[r]
}

fn pos(path: &[Step]) -> (usize, usize) {
    line_col(DOC, find(DOC, path).unwrap().start)
}

#[test]
fn bare_and_dotted_keys() {
    assert_eq!(text_at(&[Step::Key("title")]), "title");
    assert_eq!(pos(&[Step::Key("title")]), (2, 1));
    assert_eq!(
        text_at(&[Step::Key("layout"), Step::Key("width_mm")]),
        "width_mm"
    );
    assert_eq!(pos(&[Step::Key("layout"), Step::Key("width_mm")]), (3, 8));
    // A quoted key: the span covers the quotes as written.
    assert_eq!(
        text_at(&[Step::Key("layout"), Step::Key("height mm")]),
        "\"height mm\""
    );
    assert_eq!(pos(&[Step::Key("layout"), Step::Key("height mm")]), (4, 8));
}

#[test]
fn table_headers_and_inline_tables() {
    assert_eq!(text_at(&[Step::Key("legend")]), "legend");
    assert_eq!(pos(&[Step::Key("legend")]), (6, 2));
    let corner = [
        Step::Key("legend"),
        Step::Key("position"),
        Step::Key("corner"),
    ];
    assert_eq!(text_at(&corner), "corner");
    assert_eq!(pos(&corner), (7, 14));
    let inset1 = [
        Step::Key("legend"),
        Step::Key("position"),
        Step::Key("inset"),
        Step::Index(1),
    ];
    assert_eq!(text_at(&inset1), "3");
    assert_eq!(pos(&inset1), (7, 48));
    // A dotted header: both parts are found.
    assert_eq!(
        text_at(&[Step::Key("scale"), Step::Key("colour")]),
        "colour"
    );
    assert_eq!(
        pos(&[Step::Key("scale"), Step::Key("colour"), Step::Key("steps")]),
        (10, 1)
    );
}

#[test]
fn arrays_of_tables() {
    let second = [Step::Key("panel"), Step::Index(1), Step::Key("field")];
    assert_eq!(text_at(&second), "field");
    assert_eq!(pos(&second), (16, 1));
    assert_eq!(
        pos(&[Step::Key("panel"), Step::Index(0), Step::Key("field")]),
        (13, 1)
    );
    let label = [
        Step::Key("panel"),
        Step::Index(1),
        Step::Key("axis"),
        Step::Key("label"),
    ];
    assert_eq!(pos(&label), (18, 1));
    // The element itself: its own [[panel]] header.
    let el = [Step::Key("panel"), Step::Index(1)];
    assert_eq!(text_at(&el), "[[panel]]");
    assert_eq!(pos(&el), (15, 1));
    assert_eq!(pos(&[Step::Key("panel"), Step::Index(0)]), (12, 1));
}

#[test]
fn missing_paths_and_bad_documents_give_none() {
    assert_eq!(find(DOC, &[Step::Key("subtitle")]), None);
    assert_eq!(find(DOC, &[Step::Key("panel"), Step::Index(2)]), None);
    assert_eq!(find(DOC, &[Step::Key("title"), Step::Key("x")]), None);
    assert_eq!(find(DOC, &[Step::Index(0)]), None);
    assert_eq!(find(DOC, &[]), None);
    assert_eq!(find("title = ", &[Step::Key("title")]), None);
}

#[test]
fn columns_count_characters_not_bytes() {
    let text = "name = \"Ære\"\nnäme = 1\n";
    // 'n' 'ä' 'm' 'e': the '=' is the 6th character, the 7th byte.
    let eq = text.find("= 1").unwrap();
    assert_eq!(eq, 20);
    assert_eq!(line_col(text, eq), (2, 6));
    assert_eq!(line_col(text, 0), (1, 1));
    assert_eq!(line_col(text, text.len()), (3, 1));
    assert_eq!(line_col(text, 10_000), (3, 1));
    // Inside a multi-byte character: its start.
    assert_eq!(line_col(text, 16), (2, 2));
}

/// Line and column as printed by the toml crate in its error message
/// ("TOML parse error at line L, column C").
fn toml_position(text: &str) -> ((usize, usize), usize) {
    let e = text.parse::<toml::Table>().unwrap_err();
    let msg = e.to_string();
    let rest = &msg[msg.find("line ").expect("a line number") + 5..];
    let line: usize = rest[..rest.find(',').unwrap()].parse().unwrap();
    let rest = &rest[rest.find("column ").unwrap() + 7..];
    let col: usize = rest
        .chars()
        .take_while(char::is_ascii_digit)
        .collect::<String>()
        .parse()
        .unwrap();
    ((line, col), e.span().unwrap().start)
}

#[test]
fn line_and_column_agree_with_the_toml_crate() {
    for bad in [
        "title = \"x\"\nwidth = = 3\n",
        "[legend]\nposition = top\n",
        "a = 1\n\n\n   b = [1, 2\n",
        "x = 1\ny = 2\nz = @\n",
    ] {
        let (expected, offset) = toml_position(bad);
        assert_eq!(line_col(bad, offset), expected, "{bad:?}");
    }
}

#[test]
fn a_table_named_in_two_headers_is_found_where_first_named() {
    let text = "[map.frame]\nwidth = 1\n\n[map.legend]\nshow = true\n";
    let r = find(text, &[Step::Key("map")]).unwrap();
    assert_eq!((&text[r.clone()], line_col(text, r.start)), ("map", (1, 2)));
    let r = find(
        text,
        &[Step::Key("map"), Step::Key("legend"), Step::Key("show")],
    )
    .unwrap();
    assert_eq!(line_col(text, r.start), (5, 1));
}
