//! The layout stage: the figure model and its encoding placed on the page
//! in points: title block, a grid of panels (small multiples share one
//! position scale and one colour scale), the legend beside or under them,
//! and the foot lines. Maps are fitted into their panels and simplified
//! there; dot plots get nice-number axes. The output is a [`scene::Scene`]
//! display list.

pub mod legend;
pub mod scene;
pub mod ticks;

use scene::{Anchor, Element, Fill, Gradient, Group, Node, Scene, Shape, text};

use crate::color::Srgb;
use crate::encode::{Encoding, Slot, label};
use crate::figure::{Figure, Item, Kind, LegendPosition, Place};
use crate::font::{text_width, wrap};
use crate::geo::fit::Fit;
use crate::geo::simplify::{self, Method};
use crate::geo::{Coord, Geometry};

/// A rectangle: x, y, width, height.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rect {
    /// Left.
    pub x: f64,
    /// Top.
    pub y: f64,
    /// Width.
    pub w: f64,
    /// Height.
    pub h: f64,
}

/// Lay out a figure; `title` and `description` become its accessible
/// name and description.
pub fn layout(fig: &Figure, enc: &Encoding, title: &str, description: &str) -> Scene {
    let (w, h) = (fig.page.width, fig.page.height);
    let size = fig.text.size;
    let margin = (w.min(h) * 0.03).clamp(4.0, 12.0);
    let mut groups = Vec::new();
    let mut gradients: Vec<Gradient> = Vec::new();

    // Title block.
    let mut head = Group::role("titles");
    let mut y = margin;
    let inner = w - 2.0 * margin;
    if let Some(t) = &fig.titles.title {
        for l in wrap(t, fig.text.title_size, true, inner) {
            y += fig.text.title_size * 1.2;
            head.push(
                text(
                    [margin, y - fig.text.title_size * 0.25],
                    &l,
                    fig.text.title_size,
                    true,
                    Anchor::Start,
                )
                .attr("data-role", "title"),
            );
        }
    }
    if let Some(t) = &fig.titles.subtitle {
        for l in wrap(t, size, false, inner) {
            y += size * 1.3;
            head.push(
                text([margin, y - size * 0.3], &l, size, false, Anchor::Start)
                    .attr("data-role", "subtitle"),
            );
        }
    }
    if y > margin {
        y += size * 0.6;
    }
    let top = y;

    // Foot lines, from the bottom up.
    let foot_size = (size * 0.9).max(fig.text.min_size);
    let mut foot_lines = Vec::new();
    for (role, t) in [("source", &fig.titles.source), ("note", &fig.titles.note)] {
        if let Some(t) = t {
            for l in wrap(t, foot_size, false, inner) {
                foot_lines.push((role, l));
            }
        }
    }
    let foot_h = foot_lines.len() as f64 * foot_size * 1.25
        + if foot_lines.is_empty() {
            0.0
        } else {
            size * 0.5
        };
    let mut fy = h - margin - foot_h + size * 0.5;
    for (role, l) in &foot_lines {
        fy += foot_size * 1.25;
        head.push(
            text(
                [margin, fy - foot_size * 0.25],
                l,
                foot_size,
                false,
                Anchor::Start,
            )
            .attr("data-role", *role),
        );
    }
    let bottom = h - margin - foot_h;

    // Legend.
    let mut body = Rect {
        x: margin,
        y: top,
        w: inner,
        h: bottom - top,
    };
    let horizontal = fig.legend.position == LegendPosition::Bottom;
    let block = match fig.legend.position {
        LegendPosition::None => None,
        LegendPosition::Right => legend::legend(fig, enc, inner * 0.36, false),
        LegendPosition::Bottom => legend::legend(fig, enc, inner, true),
    };
    if let Some(b) = block {
        let mut g = b.group;
        let offset = gradients.len();
        let (lx, ly) = if horizontal {
            body.h -= b.height + size;
            (margin, body.y + body.h + size)
        } else {
            body.w -= b.width + size * 1.5;
            (margin + body.w + size * 1.5, top + size * 0.2)
        };
        translate(&mut g, lx, ly, offset);
        for mut gr in b.gradients {
            gr.from = [gr.from[0] + lx, gr.from[1] + ly];
            gr.to = [gr.to[0] + lx, gr.to[1] + ly];
            gradients.push(gr);
        }
        groups.push(g);
    }

    // Panels.
    let n = fig.panels.len();
    let cols = fig.panel_columns.min(n).max(1);
    let rows = n.div_ceil(cols);
    let gap = if n > 1 { size * 0.8 } else { 0.0 };
    let title_h = if n > 1 { size * 1.4 } else { 0.0 };
    let mut axis_titles = Group::role("axis-titles");
    let plot_area = if let (Some(a), false) = (&fig.axes, fig.kind.is_map()) {
        // Room for the shared axis titles.
        let mut r = body;
        if !a.x_title.is_empty() {
            r.h -= size * 1.6;
            axis_titles.push(
                text(
                    [r.x + r.w / 2.0, r.y + r.h + size * 1.4],
                    &a.x_title,
                    size,
                    false,
                    Anchor::Middle,
                )
                .attr("data-role", "x-title"),
            );
        }
        if !a.y_title.is_empty() && fig.kind == Kind::DotPlot {
            r.x += size * 1.6;
            r.w -= size * 1.6;
            let mut t = text(
                [body.x + size, r.y + r.h / 2.0],
                &a.y_title,
                size,
                false,
                Anchor::Middle,
            )
            .attr("data-role", "y-title");
            if let Shape::Text { vertical, .. } = &mut t.shape {
                *vertical = true;
            }
            axis_titles.push(t);
        }
        r
    } else {
        body
    };
    let cell_w = (plot_area.w - gap * (cols - 1) as f64) / cols as f64;
    let cell_h = (plot_area.h - gap * (rows - 1) as f64) / rows as f64;
    let frames: Vec<Rect> = (0..n)
        .map(|i| Rect {
            x: plot_area.x + (i % cols) as f64 * (cell_w + gap),
            y: plot_area.y + (i / cols) as f64 * (cell_h + gap) + title_h,
            w: cell_w,
            h: cell_h - title_h,
        })
        .collect();
    let mut panel_groups = if fig.kind.is_map() {
        map_panels(fig, enc, &frames)
    } else {
        plot_panels(fig, enc, &frames)
    };
    for (i, g) in panel_groups.iter_mut().enumerate() {
        if n > 1 {
            g.push(
                text(
                    [frames[i].x, frames[i].y - size * 0.45],
                    &fig.panels[i],
                    size,
                    true,
                    Anchor::Start,
                )
                .attr("data-role", "panel-title"),
            );
        }
    }
    let mut all = Vec::new();
    all.extend(panel_groups);
    if !axis_titles.children.is_empty() {
        all.push(axis_titles);
    }
    all.extend(groups);
    all.push(head);
    Scene {
        width: w,
        height: h,
        background: fig.page.background,
        title: title.to_string(),
        description: description.to_string(),
        gradients,
        hatch: (enc.no_data.color, hatch_line(enc.no_data.color)),
        text_color: fig.text.color,
        groups: all,
        attrs: vec![("data-kind", fig.kind.name().to_string())],
    }
}

/// The hatch line colour over a no-data fill: darker on light fills,
/// lighter on dark ones.
fn hatch_line(base: Srgb) -> Srgb {
    let l = base.to_oklab().l;
    let t = if l > 0.5 { l - 0.28 } else { l + 0.28 };
    crate::scheme::to_8bit(
        crate::color::gamut::map_oklch_to_srgb(crate::color::Oklch::new(t, 0.0, 0.0)).0,
    )
}

fn translate(g: &mut Group, dx: f64, dy: f64, gradient_offset: usize) {
    let mv = |p: &mut [f64; 2]| {
        p[0] += dx;
        p[1] += dy;
    };
    if let Some(c) = &mut g.clip {
        c[0] += dx;
        c[1] += dy;
    }
    if let Some(Fill::Gradient(i)) = &mut g.paint.fill {
        *i += gradient_offset;
    }
    for c in &mut g.children {
        match c {
            Element::Group(sub) => translate(sub, dx, dy, gradient_offset),
            Element::Node(n) => {
                if let Some(Fill::Gradient(i)) = &mut n.paint.fill {
                    *i += gradient_offset;
                }
                match &mut n.shape {
                    Shape::Area(rings) | Shape::Lines(rings) => {
                        rings.iter_mut().flatten().for_each(mv)
                    }
                    Shape::Circle { c, .. } => mv(c),
                    Shape::Rect { x, y, .. } => {
                        *x += dx;
                        *y += dy;
                    }
                    Shape::Text { at, .. } => mv(at),
                }
            }
        }
    }
}

/// Marks of one panel grouped by class, in legend order, no data last.
fn by_class<'a>(fig: &'a Figure, enc: &Encoding, panel: usize) -> Vec<(String, Vec<&'a Item>)> {
    let mut groups: Vec<(String, Vec<&Item>)> = enc
        .classes
        .iter()
        .map(|c| (c.id.clone(), Vec::new()))
        .collect();
    groups.push(("ramp".into(), Vec::new()));
    groups.push((enc.no_data.id.clone(), Vec::new()));
    for it in fig.items.iter().filter(|i| i.panel == panel) {
        let k = match enc.slot(&it.value) {
            Slot::Class(i) => i,
            Slot::Ramp => enc.classes.len(),
            Slot::NoData => enc.classes.len() + 1,
        };
        groups[k].1.push(it);
    }
    // Faded classes draw first so emphasised ones sit on top.
    let faded = |id: &str| enc.classes.iter().any(|c| c.id == id && c.faded);
    let (mut a, b): (Vec<_>, Vec<_>) = groups
        .into_iter()
        .filter(|(_, v)| !v.is_empty())
        .partition(|(id, _)| faded(id));
    a.extend(b);
    a
}

fn class_group(id: &str, panel: usize) -> Group {
    let mut g = Group::role("marks");
    g.id = Some(format!("p{}-{id}", panel + 1));
    g.attrs.push(("data-class", id.to_string()));
    g
}

fn rings_of(g: &Geometry) -> Vec<Vec<[f64; 2]>> {
    g.polygons
        .iter()
        .flat_map(|p| p.rings().map(<[Coord]>::to_vec))
        .collect()
}

fn map_panels(fig: &Figure, enc: &Encoding, frames: &[Rect]) -> Vec<Group> {
    let Some(frame) = frames.first() else {
        return Vec::new();
    };
    let data_geoms: Vec<Geometry> = fig
        .items
        .iter()
        .filter(|i| i.panel == 0)
        .filter_map(|i| match &i.place {
            Place::Area(g) => Some(g.clone()),
            Place::Point(p) => Some(Geometry {
                points: vec![*p],
                ..Geometry::default()
            }),
            Place::Rank(_) => None,
        })
        .chain(fig.base.iter().cloned())
        .collect();
    let pad = fig.marks.size.max(2.0);
    let Some(fit) = Fit::for_geometries(data_geoms.iter(), frame.w, frame.h, pad) else {
        return Vec::new();
    };
    let mut out = Vec::new();
    for (p, fr) in frames.iter().enumerate() {
        let place = |c: Coord| {
            let q = fit.apply(c);
            [q[0] + fr.x, q[1] + fr.y]
        };
        let fitted = |g: &Geometry| {
            let f = fit.apply_geometry(g);
            Geometry {
                polygons: f
                    .polygons
                    .iter()
                    .filter_map(|poly| {
                        crate::geo::Polygon::new(
                            poly.exterior()
                                .iter()
                                .map(|c| [c[0] + fr.x, c[1] + fr.y])
                                .collect(),
                            poly.holes()
                                .iter()
                                .map(|h| h.iter().map(|c| [c[0] + fr.x, c[1] + fr.y]).collect())
                                .collect(),
                        )
                    })
                    .collect(),
                lines: f
                    .lines
                    .iter()
                    .map(|l| l.iter().map(|c| [c[0] + fr.x, c[1] + fr.y]).collect())
                    .collect(),
                points: f
                    .points
                    .iter()
                    .map(|c| [c[0] + fr.x, c[1] + fr.y])
                    .collect(),
            }
        };
        let mut pg = Group::role("map");
        pg.clip = Some([fr.x, fr.y, fr.w, fr.h]);
        let context = |below: bool| {
            let mut g = Group::role(if below {
                "context-below"
            } else {
                "context-above"
            });
            for c in fig.context.iter().filter(|c| c.below == below) {
                for geom in &c.geometries {
                    let f = fitted(geom);
                    if !f.polygons.is_empty() {
                        let mut n = Node::new(Shape::Area(rings_of(&f)))
                            .fill(c.fill.map_or(Fill::None, Fill::Color));
                        if c.stroke.width > 0.0 {
                            n = n.stroke(c.stroke.color, c.stroke.width);
                        }
                        g.push(n);
                    }
                    if !f.lines.is_empty() {
                        g.push(
                            Node::new(Shape::Lines(f.lines.clone()))
                                .fill(Fill::None)
                                .stroke(c.stroke.color, c.stroke.width),
                        );
                    }
                }
            }
            g
        };
        let below = context(true);
        if !below.children.is_empty() {
            pg.push_group(below);
        }
        if !fig.base.is_empty() {
            let mut base = Group::role("base");
            base.paint.fill = Some(Fill::Color(fig.land));
            base.paint.stroke = Some((fig.border.color, fig.border.width));
            for g in &fig.base {
                base.push(Node::new(Shape::Area(rings_of(&fitted(g)))));
            }
            pg.push_group(base);
        }
        let groups = by_class(fig, enc, p);
        if fig.kind == Kind::Choropleth {
            // Topology-safe simplification of the panel's shapes together.
            let items: Vec<&Item> = groups.iter().flat_map(|(_, v)| v.iter().copied()).collect();
            let geoms: Vec<Geometry> = items
                .iter()
                .filter_map(|i| match &i.place {
                    Place::Area(g) => Some(fitted(g)),
                    _ => None,
                })
                .collect();
            let simple = if fig.simplify > 0.0 {
                simplify::simplify(&geoms, Method::VisvalingamWhyatt, fig.simplify, 0.0).0
            } else {
                geoms
            };
            let mut k = 0;
            for (id, members) in &groups {
                let mut g = class_group(id, p);
                g.paint.fill = Some(if id == "no-data" {
                    Fill::Hatch
                } else {
                    Fill::None
                });
                if fig.border.width > 0.0 {
                    g.paint.stroke = Some((fig.border.color, fig.border.width));
                }
                for it in members {
                    let rings = rings_of(&simple[k]);
                    k += 1;
                    let fill = if id == "no-data" {
                        Fill::Hatch
                    } else {
                        Fill::Color(enc.color(&it.value))
                    };
                    g.push(
                        Node::new(Shape::Area(rings))
                            .fill(fill)
                            .attr("data-key", it.key.clone())
                            .attr("data-class", id.clone()),
                    );
                }
                pg.push_group(g);
            }
        } else {
            for (id, members) in &groups {
                let mut g = class_group(id, p);
                for it in members {
                    if let Place::Point(c) = &it.place {
                        g.push(dot(fig, enc, it, place(*c), id));
                    }
                }
                pg.push_group(g);
            }
        }
        let above = context(false);
        if !above.children.is_empty() {
            pg.push_group(above);
        }
        let mut panel = Group::role("panel");
        panel.id = Some(format!("p{}", p + 1));
        panel.attrs.push(("data-panel", fig.panels[p].clone()));
        panel.push_group(pg);
        out.push(panel);
    }
    out
}

fn dot(fig: &Figure, enc: &Encoding, it: &Item, c: [f64; 2], id: &str) -> Node {
    let r = fig.marks.size / 2.0;
    let color = enc.color(&it.value);
    let n = Node::new(Shape::Circle { c, r });
    let n = if id == "no-data" {
        n.fill(Fill::None).stroke(enc.no_data.color, 0.8)
    } else if fig.marks.hollow {
        n.fill(Fill::None).stroke(color, (r * 0.35).clamp(0.5, 1.5))
    } else {
        let n = n.fill(Fill::Color(color));
        if fig.marks.outline.width > 0.0 {
            n.stroke(fig.marks.outline.color, fig.marks.outline.width)
        } else {
            n
        }
    };
    n.attr("data-key", it.key.clone())
        .attr("data-class", id.to_string())
}

fn plot_panels(fig: &Figure, enc: &Encoding, frames: &[Rect]) -> Vec<Group> {
    let size = fig.text.size;
    let axes = fig.axes.clone().unwrap_or(crate::figure::Axes {
        x_title: String::new(),
        y_title: String::new(),
        from_zero: false,
        grid: true,
    });
    let color = fig.text.color;
    let grid_color = crate::scheme::to_8bit(Srgb::new(0.88, 0.88, 0.88));
    let (xs, ys): (Vec<f64>, Vec<f64>) = fig
        .items
        .iter()
        .filter_map(|i| match i.place {
            Place::Point([x, y]) => Some((x, y)),
            Place::Rank(v) => Some((v, 0.0)),
            Place::Area(_) => None,
        })
        .unzip();
    let range = |v: &[f64]| {
        let mut lo = v.iter().copied().fold(f64::INFINITY, f64::min);
        let mut hi = v.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        if axes.from_zero {
            lo = lo.min(0.0);
            hi = hi.max(0.0);
        }
        ticks::loose(lo, hi, 5)
    };
    let xt = range(&xs);
    let ranked = fig.kind == Kind::RankedDots;
    // Category order for ranked dots: by the largest value of each name.
    let mut names: Vec<(String, f64)> = Vec::new();
    if ranked {
        for it in &fig.items {
            if let (Some(nm), Place::Rank(v)) = (&it.name, &it.place) {
                match names.iter_mut().find(|(n, _)| n == nm) {
                    Some(e) => e.1 = e.1.max(*v),
                    None => names.push((nm.clone(), *v)),
                }
            }
        }
        names.sort_by(|a, b| {
            if fig.descending {
                b.1.total_cmp(&a.1)
            } else {
                a.1.total_cmp(&b.1)
            }
            .then(a.0.cmp(&b.0))
        });
    }
    let yt = if ranked { None } else { Some(range(&ys)) };
    let ylabels: Vec<String> = match &yt {
        Some(t) => t
            .values
            .iter()
            .map(|v| label::number(*v, t.decimals))
            .collect(),
        None => names.iter().map(|(n, _)| n.clone()).collect(),
    };
    let left = ylabels
        .iter()
        .map(|l| text_width(l, size, false))
        .fold(0.0, f64::max)
        + size * 0.6;
    let bottom = size * 1.5;
    let mut out = Vec::new();
    for (p, fr) in frames.iter().enumerate() {
        let inner = Rect {
            x: fr.x + left,
            y: fr.y + size * 0.3,
            w: (fr.w - left - size * 0.5).max(1.0),
            h: (fr.h - bottom - size * 0.3).max(1.0),
        };
        let sx = |v: f64| inner.x + (v - xt.lo) / (xt.hi - xt.lo) * inner.w;
        let band = inner.h / names.len().max(1) as f64;
        let sy = |v: f64| match &yt {
            Some(t) => inner.y + inner.h - (v - t.lo) / (t.hi - t.lo) * inner.h,
            None => inner.y + band * (v + 0.5),
        };
        let mut pg = Group::role("panel");
        pg.id = Some(format!("p{}", p + 1));
        pg.attrs.push(("data-panel", fig.panels[p].clone()));
        let mut ax = Group::role("axes");
        for v in &xt.values {
            let x = sx(*v);
            if axes.grid {
                ax.push(
                    Node::new(Shape::Lines(vec![vec![
                        [x, inner.y],
                        [x, inner.y + inner.h],
                    ]]))
                    .stroke(grid_color, 0.4),
                );
            }
            ax.push(
                Node::new(Shape::Lines(vec![vec![
                    [x, inner.y + inner.h],
                    [x, inner.y + inner.h + size * 0.3],
                ]]))
                .stroke(color, 0.5),
            );
            ax.push(text(
                [x, inner.y + inner.h + size * 1.3],
                &label::number(*v, xt.decimals),
                size,
                false,
                Anchor::Middle,
            ));
        }
        // Vertical-axis rows: value ticks (with tick marks) or ranked
        // names (bands, no tick marks), each with its gridline and label.
        let rows: Vec<(f64, &String)> = match &yt {
            Some(t) => t.values.iter().map(|v| sy(*v)).zip(&ylabels).collect(),
            None => (0..ylabels.len())
                .map(|i| sy(i as f64))
                .zip(&ylabels)
                .collect(),
        };
        for (y, l) in rows {
            if axes.grid {
                ax.push(
                    Node::new(Shape::Lines(vec![vec![
                        [inner.x, y],
                        [inner.x + inner.w, y],
                    ]]))
                    .stroke(grid_color, 0.4),
                );
            }
            if yt.is_some() {
                ax.push(
                    Node::new(Shape::Lines(vec![vec![
                        [inner.x - size * 0.3, y],
                        [inner.x, y],
                    ]]))
                    .stroke(color, 0.5),
                );
            }
            ax.push(text(
                [inner.x - size * 0.45, y + size * 0.35],
                l,
                size,
                false,
                Anchor::End,
            ));
        }
        ax.push(
            Node::new(Shape::Lines(vec![vec![
                [inner.x, inner.y],
                [inner.x, inner.y + inner.h],
                [inner.x + inner.w, inner.y + inner.h],
            ]]))
            .fill(Fill::None)
            .stroke(color, 0.5),
        );
        pg.push_group(ax);
        for (id, members) in by_class(fig, enc, p) {
            let mut g = class_group(&id, p);
            for it in members {
                let c = match (&it.place, &it.name) {
                    (Place::Point([x, y]), _) => [sx(*x), sy(*y)],
                    (Place::Rank(v), Some(nm)) => {
                        let i = names.iter().position(|(n, _)| n == nm).unwrap_or(0);
                        [sx(*v), sy(i as f64)]
                    }
                    _ => continue,
                };
                g.push(dot(fig, enc, it, c, &id));
            }
            pg.push_group(g);
        }
        out.push(pg);
    }
    out
}
