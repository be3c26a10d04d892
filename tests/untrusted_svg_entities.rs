//! Untrusted SVG with a document type declaration: entity expansion
//! ("billion laughs", OWASP's XML External Entity Prevention Cheat Sheet
//! and its XML security notes describe the attack: nested entities that
//! expand to gigabytes) and external entities (a SYSTEM identifier naming
//! a local file) are refused or left unread. References by `href` to local
//! files and addresses, deep nesting and huge page sizes are covered in
//! tests/audit_foreign.rs.

use std::path::Path;
use std::process::Command;

use hueproof::ExitKind;
use hueproof::audit::{self, Options};

/// Ten levels of ten references each: 10^9 copies of "lol" if expanded.
fn billion_laughs() -> String {
    let mut dtd = String::from("<!ENTITY lol0 \"lol\">\n");
    for i in 1..=9 {
        let refs = format!("&lol{};", i - 1).repeat(10);
        dtd.push_str(&format!("<!ENTITY lol{i} \"{refs}\">\n"));
    }
    format!(
        r##"<?xml version="1.0"?>
<!DOCTYPE svg [
{dtd}]>
<svg xmlns="http://www.w3.org/2000/svg" width="100pt" height="100pt" viewBox="0 0 100 100">
<rect fill="#3060a0" width="50" height="50"/>
<text x="10" y="80">&lol9;</text>
</svg>"##
    )
}

fn options() -> Options {
    let mut opt = Options::new();
    opt.dpi = 48.0;
    opt
}

#[test]
fn nested_entity_expansion_is_refused_as_bad_input_naming_the_file() {
    let e = audit::audit_svg(Path::new("laughs.svg"), &billion_laughs(), &options()).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput, "{e}");
    let m = e.to_string();
    assert!(m.contains("laughs.svg"), "{m}");
    assert!(m.contains("entit"), "the message says why: {m}");
}

#[test]
fn the_command_line_exits_2_on_entity_expansion() {
    let dir = std::env::temp_dir().join(format!("hueproof-laughs-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let svg = dir.join("laughs.svg");
    std::fs::write(&svg, billion_laughs()).unwrap();
    let out = Command::new(env!("CARGO_BIN_EXE_hueproof"))
        .args(["check", "--dpi", "48"])
        .arg(&svg)
        .output()
        .unwrap();
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{stderr}");
    assert!(stderr.contains("laughs.svg"), "{stderr}");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn an_external_entity_naming_a_local_file_is_never_read() {
    // The local file holds a bright red fill; were the entity resolved,
    // a red class would be measured.
    let dir = std::env::temp_dir().join(format!("hueproof-xxe-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let secret = dir.join("fill.txt");
    std::fs::write(&secret, "#ff0000").unwrap();
    let svg = format!(
        r##"<?xml version="1.0"?>
<!DOCTYPE svg [<!ENTITY paint SYSTEM "file://{}">]>
<svg xmlns="http://www.w3.org/2000/svg" width="100pt" height="100pt" viewBox="0 0 100 100">
<rect fill="#3060a0" width="50" height="50"/>
<rect fill="&paint;" x="50" width="50" height="50"/>
</svg>"##,
        secret.display()
    );
    match audit::audit_svg(Path::new("xxe.svg"), &svg, &options()) {
        Ok(r) => {
            let ids: Vec<&str> = r.classes.iter().map(|c| c.id.as_str()).collect();
            assert!(
                !ids.contains(&"#ff0000"),
                "the local file was read: {ids:?}"
            );
        }
        Err(e) => {
            assert_eq!(e.exit_kind(), ExitKind::BadInput, "{e}");
            assert!(e.to_string().contains("xxe.svg"), "{e}");
        }
    }
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_public_svg_doctype_without_entities_is_audited() {
    // The document type declaration of SVG 1.1 (W3C SVG 1.1 Second
    // Edition, section 1.3), which many tools write: allowed, and its DTD
    // address is never fetched.
    let svg = r##"<?xml version="1.0" standalone="no"?>
<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">
<svg xmlns="http://www.w3.org/2000/svg" width="100pt" height="100pt" viewBox="0 0 100 100">
<rect fill="white" width="100" height="100"/>
<rect fill="#3060a0" width="50" height="50"/>
</svg>"##;
    let r = audit::audit_svg(Path::new("public.svg"), svg, &options()).unwrap();
    let ids: Vec<&str> = r.classes.iter().map(|c| c.id.as_str()).collect();
    assert_eq!(ids, ["#3060a0"]);
}
