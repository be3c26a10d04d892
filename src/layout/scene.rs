//! The laid-out figure as a display list: groups and primitives in page
//! points (y down), each with the attributes the figure carries
//! (`data-key`, `data-class`, roles). The SVG stage only serialises this.

use crate::color::Srgb;

/// How text is anchored at its point.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Anchor {
    /// Left.
    Start,
    /// Centre.
    Middle,
    /// Right.
    End,
}

/// A primitive.
#[derive(Debug, Clone, PartialEq)]
pub enum Shape {
    /// Closed rings (polygons with holes, several parts).
    Area(Vec<Vec<[f64; 2]>>),
    /// Open polylines.
    Lines(Vec<Vec<[f64; 2]>>),
    /// A circle.
    Circle {
        /// Centre.
        c: [f64; 2],
        /// Radius.
        r: f64,
    },
    /// An axis-aligned rectangle.
    Rect {
        /// Left.
        x: f64,
        /// Top.
        y: f64,
        /// Width.
        w: f64,
        /// Height.
        h: f64,
    },
    /// A line of text.
    Text {
        /// Anchor point (baseline).
        at: [f64; 2],
        /// The text.
        text: String,
        /// Size, points.
        size: f64,
        /// Bold face.
        bold: bool,
        /// Anchor.
        anchor: Anchor,
        /// Rotated a quarter turn counter-clockwise (vertical axis titles).
        vertical: bool,
    },
}

/// Fill of a primitive or group.
#[derive(Debug, Clone, PartialEq)]
pub enum Fill {
    /// No fill.
    None,
    /// A colour.
    Color(Srgb),
    /// The no-data hatch over a base colour.
    Hatch,
    /// A gradient defined in [`Scene::gradients`], by index.
    Gradient(usize),
}

/// Paint of a group or primitive; `None` fields inherit.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Paint {
    /// Fill.
    pub fill: Option<Fill>,
    /// Stroke colour and width (width 0: no stroke).
    pub stroke: Option<(Srgb, f64)>,
}

/// A primitive with its attributes.
#[derive(Debug, Clone, PartialEq)]
pub struct Node {
    /// The primitive.
    pub shape: Shape,
    /// Its paint (inherits from its group where `None`).
    pub paint: Paint,
    /// Attributes, written in order (`data-key`, `data-class`, ...).
    pub attrs: Vec<(&'static str, String)>,
}

/// A group of elements.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Group {
    /// Stable id, if any.
    pub id: Option<String>,
    /// Attributes, written in order (`data-role` first by convention).
    pub attrs: Vec<(&'static str, String)>,
    /// Paint inherited by children.
    pub paint: Paint,
    /// Clip to a rectangle (x, y, w, h).
    pub clip: Option<[f64; 4]>,
    /// Children.
    pub children: Vec<Element>,
}

/// A group or a primitive.
#[derive(Debug, Clone, PartialEq)]
pub enum Element {
    /// A group.
    Group(Group),
    /// A primitive.
    Node(Node),
}

/// A linear gradient of evenly spaced stops.
#[derive(Debug, Clone, PartialEq)]
pub struct Gradient {
    /// Stops from start to end.
    pub stops: Vec<Srgb>,
    /// Start and end points.
    pub from: [f64; 2],
    /// End point.
    pub to: [f64; 2],
}

/// The whole figure.
#[derive(Debug, Clone, PartialEq)]
pub struct Scene {
    /// Width, points.
    pub width: f64,
    /// Height, points.
    pub height: f64,
    /// Page colour.
    pub background: Srgb,
    /// Accessible title.
    pub title: String,
    /// Accessible description.
    pub description: String,
    /// Gradients.
    pub gradients: Vec<Gradient>,
    /// The no-data hatch: base colour and line colour.
    pub hatch: (Srgb, Srgb),
    /// Text colour.
    pub text_color: Srgb,
    /// Top-level groups, drawn in order.
    pub groups: Vec<Group>,
    /// Attributes of the root element (`data-kind`, ...).
    pub attrs: Vec<(&'static str, String)>,
}

impl Node {
    /// A node with no paint of its own.
    pub fn new(shape: Shape) -> Node {
        Node {
            shape,
            paint: Paint::default(),
            attrs: Vec::new(),
        }
    }

    /// With an attribute.
    pub fn attr(mut self, k: &'static str, v: impl Into<String>) -> Node {
        self.attrs.push((k, v.into()));
        self
    }

    /// With a fill.
    pub fn fill(mut self, f: Fill) -> Node {
        self.paint.fill = Some(f);
        self
    }

    /// With a stroke.
    pub fn stroke(mut self, c: Srgb, w: f64) -> Node {
        self.paint.stroke = Some((c, w));
        self
    }
}

impl Group {
    /// A group with a role.
    pub fn role(role: &str) -> Group {
        Group {
            attrs: vec![("data-role", role.to_string())],
            ..Group::default()
        }
    }

    /// Add a node.
    pub fn push(&mut self, n: Node) {
        self.children.push(Element::Node(n));
    }

    /// Add a group.
    pub fn push_group(&mut self, g: Group) {
        self.children.push(Element::Group(g));
    }

    /// Every node in the group, depth first.
    pub fn nodes(&self) -> Vec<&Node> {
        let mut out = Vec::new();
        for c in &self.children {
            match c {
                Element::Node(n) => out.push(n),
                Element::Group(g) => out.extend(g.nodes()),
            }
        }
        out
    }
}

/// A text node.
pub fn text(at: [f64; 2], s: &str, size: f64, bold: bool, anchor: Anchor) -> Node {
    Node::new(Shape::Text {
        at,
        text: s.to_string(),
        size,
        bold,
        anchor,
        vertical: false,
    })
}
