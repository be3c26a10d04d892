//! The style cascade of an SVG document, as far as the audit needs it: a
//! property of an element is taken from its `style` attribute, else from
//! the document's `<style>` sheets (the matching rule of highest
//! specificity, the later one on a tie), else from its presentation
//! attribute (SVG 1.1 section 6.4, CSS 2.1 section 6.4.3). Inheritance is
//! left to the caller, which walks the tree.
//!
//! SVG from other tools often styles its shapes through classes and
//! `style` attributes rather than `fill` attributes; the label raster must
//! see the same fills the renderer does.

use simplecss::{Declaration, Element, StyleSheet};

/// The document's style sheets, rules sorted by specificity (stable, so
/// document order breaks ties).
pub struct Cascade<'a> {
    rules: Vec<(simplecss::Selector<'a>, Vec<Declaration<'a>>)>,
}

struct Node<'a, 'i>(roxmltree::Node<'a, 'i>);

impl Element for Node<'_, '_> {
    fn parent_element(&self) -> Option<Self> {
        self.0.parent_element().map(Node)
    }

    fn prev_sibling_element(&self) -> Option<Self> {
        self.0.prev_sibling_element().map(Node)
    }

    fn has_local_name(&self, name: &str) -> bool {
        self.0.tag_name().name() == name
    }

    fn attribute_matches(&self, name: &str, op: simplecss::AttributeOperator<'_>) -> bool {
        self.0.attribute(name).is_some_and(|v| op.matches(v))
    }

    fn pseudo_class_matches(&self, class: simplecss::PseudoClass<'_>) -> bool {
        matches!(class, simplecss::PseudoClass::FirstChild)
            && self.0.prev_sibling_element().is_none()
    }
}

impl<'a> Cascade<'a> {
    /// Collect the sheets of every `<style>` element (of type text/css or
    /// no type) in `doc`.
    pub fn new(doc: &'a roxmltree::Document<'a>) -> Cascade<'a> {
        let mut sheet = StyleSheet::new();
        for n in doc.descendants().filter(|n| n.has_tag_name("style")) {
            if n.attribute("type").is_some_and(|t| t != "text/css") {
                continue;
            }
            for t in n.children().filter_map(|c| c.text()) {
                sheet.parse_more(t);
            }
        }
        let mut rules: Vec<_> = sheet
            .rules
            .into_iter()
            .map(|r| (r.selector, r.declarations))
            .collect();
        rules.sort_by_key(|(s, _)| s.specificity());
        Cascade { rules }
    }

    /// Whether the document has no style sheet rules.
    pub fn is_empty(&self) -> bool {
        self.rules.is_empty()
    }

    /// The declared value of property `name` on `n` (not inherited).
    pub fn get<'n>(&'n self, n: roxmltree::Node<'n, '_>, name: &str) -> Option<String> {
        if let Some(style) = n.attribute("style") {
            let mut found = None;
            for d in simplecss::DeclarationTokenizer::from(style) {
                if d.name == name {
                    found = Some(d.value.to_string());
                }
            }
            if found.is_some() {
                return found;
            }
        }
        let node = Node(n);
        let mut found = None;
        for (sel, decls) in &self.rules {
            if sel.matches(&node) {
                for d in decls.iter().filter(|d| d.name == name) {
                    found = Some(d.value.to_string());
                }
            }
        }
        found.or_else(|| n.attribute(name).map(str::to_string))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Precedence per CSS 2.1 section 6.4.3 and SVG 1.1 section 6.4: the
    // style attribute over sheets, higher specificity over lower, sheets
    // over presentation attributes.
    #[test]
    fn style_attribute_beats_sheet_beats_attribute() {
        let svg = r##"<svg xmlns="http://www.w3.org/2000/svg">
            <style>rect { fill: #111111 } .a { fill: #222222 } #x { fill: #333333 }</style>
            <rect id="x" class="a" fill="#999999"/>
            <rect class="a" fill="#999999"/>
            <rect fill="#999999"/>
            <rect class="a" style="stroke: red; fill: #444444" fill="#999999"/>
            <circle fill="#999999"/>
        </svg>"##;
        let doc = roxmltree::Document::parse(svg).unwrap();
        let c = Cascade::new(&doc);
        let fills: Vec<_> = doc
            .descendants()
            .filter(|n| n.has_tag_name("rect") || n.has_tag_name("circle"))
            .map(|n| c.get(n, "fill").unwrap())
            .collect();
        assert_eq!(
            fills,
            ["#333333", "#222222", "#111111", "#444444", "#999999"]
        );
    }
}
