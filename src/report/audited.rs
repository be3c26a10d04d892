//! An audited input file as the machine-readable exports see it: the URI
//! it is reported under and the line each finding points at in it. Shared
//! by the SARIF ([`super::sarif`]) and JUnit XML ([`super::junit`])
//! renderers; locates, measures nothing.

use std::path::Path;

use crate::audit::{AuditFinding, Report};
use crate::findings::Kind;
use crate::spec::locate::{Step, find, line_col};

/// One audited input with its report.
#[derive(Debug, Clone)]
pub struct Audited<'a> {
    /// The input's path as given, with forward slashes.
    pub path: String,
    /// The input as a URI reference: the path as given, with forward
    /// slashes and percent-encoding (RFC 3986); an absolute path becomes a
    /// `file://` URI.
    pub uri: String,
    /// The audit's result.
    pub report: &'a Report,
    /// Where findings point in the input.
    pub anchors: Anchors,
}

impl<'a> Audited<'a> {
    /// `report` of the input at `path`, anchored by `anchors`.
    pub fn new(path: &Path, report: &'a Report, anchors: Anchors) -> Audited<'a> {
        Audited {
            path: path.to_string_lossy().replace('\\', "/"),
            uri: uri_reference(path),
            report,
            anchors,
        }
    }
}

/// Lines (1-based) in an input that findings point at.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct Anchors {
    /// For an SVG: the first element carrying each class's `data-class`,
    /// in document order of first appearance.
    pub classes: Vec<(String, usize)>,
    /// For a spec: where its colours are written (`colors.list`, else the
    /// `[colors]` table).
    pub colors: Option<usize>,
    /// For a spec: where its text colour is written (`text.color`, else
    /// the `[text]` table); text findings point here, others at `colors`.
    pub text: Option<usize>,
}

impl Anchors {
    /// Anchors in SVG text: the line of the first element carrying each
    /// `data-class`. SVG that does not parse has none.
    pub fn of_svg(svg: &str) -> Anchors {
        let mut classes: Vec<(String, usize)> = Vec::new();
        if let Ok(doc) = roxmltree::Document::parse(svg) {
            for n in doc.descendants().filter(|n| n.is_element()) {
                if let Some(c) = n.attribute("data-class") {
                    if !classes.iter().any(|(k, _)| k == c) {
                        let line = doc.text_pos_at(n.range().start).row as usize;
                        classes.push((c.to_string(), line));
                    }
                }
            }
        }
        Anchors {
            classes,
            ..Anchors::default()
        }
    }

    /// Anchors in a spec's TOML text.
    pub fn of_spec(toml: &str) -> Anchors {
        let line = |path: &[Step]| find(toml, path).map(|s| line_col(toml, s.start).0);
        let either = |table: &str, key: &str| {
            line(&[Step::Key(table), Step::Key(key)]).or_else(|| line(&[Step::Key(table)]))
        };
        Anchors {
            classes: Vec::new(),
            colors: either("colors", "list"),
            text: either("text", "color"),
        }
    }

    /// Anchors of the input file at `path`: a spec (`.toml`) or SVG, read
    /// from disk. An unreadable file has none (the report still stands).
    pub fn read(path: &Path) -> Anchors {
        let Ok(text) = std::fs::read_to_string(path) else {
            return Anchors::default();
        };
        let is_spec = path
            .extension()
            .and_then(|e| e.to_str())
            .is_some_and(|e| e.eq_ignore_ascii_case("toml"));
        if is_spec {
            Anchors::of_spec(&text)
        } else {
            Anchors::of_svg(&text)
        }
    }

    /// The line `f` points at, when known: for an SVG the first of its
    /// classes that is written in the file; for a spec the colours (or,
    /// for a text finding, the text colour, else the colours).
    pub fn line(&self, f: &AuditFinding) -> Option<usize> {
        let by_class = f.classes.iter().find_map(|c| {
            self.classes
                .iter()
                .find(|(k, _)| k == c)
                .map(|&(_, line)| line)
        });
        let spec = if f.kind == Kind::Text {
            self.text.or(self.colors)
        } else {
            self.colors
        };
        by_class.or(spec)
    }
}

/// A file path as a URI reference (RFC 3986): separators become `/`,
/// characters outside the unreserved set, sub-delimiters, `:`, `@` and
/// `/` are percent-encoded as UTF-8, a leading `./` is dropped, and an
/// absolute path becomes a `file://` URI.
pub fn uri_reference(path: &Path) -> String {
    let text = path.to_string_lossy().replace('\\', "/");
    let mut rest = text.as_str();
    while let Some(r) = rest.strip_prefix("./") {
        rest = r;
    }
    let mut out = String::new();
    let absolute = path.is_absolute() || rest.starts_with('/');
    if absolute {
        out.push_str("file://");
        if !rest.starts_with('/') {
            out.push('/'); // a drive letter, e.g. C:/...
        }
    }
    for (i, b) in rest.bytes().enumerate() {
        let keep = b.is_ascii_alphanumeric()
            || b"-._~!$&'()*+,;=@/".contains(&b)
            // A colon in a relative path's first segment would read as a
            // scheme; elsewhere it is allowed.
            || (b == b':' && (absolute || rest[..i].contains('/')));
        if keep {
            out.push(b as char);
        } else {
            out.push_str(&format!("%{b:02X}"));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn paths_become_uri_references() {
        assert_eq!(uri_reference(Path::new("figs/map.svg")), "figs/map.svg");
        assert_eq!(
            uri_reference(Path::new("./a b/ü.toml")),
            "a%20b/%C3%BC.toml"
        );
        assert_eq!(uri_reference(Path::new("/tmp/x.svg")), "file:///tmp/x.svg");
        assert_eq!(uri_reference(Path::new("a:b.svg")), "a%3Ab.svg");
        assert_eq!(uri_reference(Path::new("d/a:b.svg")), "d/a:b.svg");
        assert_eq!(uri_reference(Path::new("100%.svg")), "100%25.svg");
    }

    #[test]
    fn spec_anchors_prefer_the_key_then_the_table() {
        let a = Anchors::of_spec(
            "[figure]\nkind = \"dot-plot\"\n\n[colors]\nscheme = \"sequential\"\nlist = [\"#fff\", \"#000\"]\n",
        );
        assert_eq!(a.colors, Some(6));
        assert_eq!(a.text, None);
        let b = Anchors::of_spec("[colors]\nhue = 20\n[text]\nsize = \"8pt\"\n");
        assert_eq!((b.colors, b.text), (Some(1), Some(3)));
    }

    #[test]
    fn svg_anchors_take_the_first_element_of_each_class() {
        let svg = "<svg xmlns=\"http://www.w3.org/2000/svg\">\n<g data-class=\"c2\">\n<rect data-class=\"c2\"/>\n</g>\n<rect\n data-class=\"c1\"/>\n</svg>";
        let a = Anchors::of_svg(svg);
        assert_eq!(
            a.classes,
            vec![("c2".to_string(), 2), ("c1".to_string(), 5)]
        );
    }
}
