//! Legends: classed and categorical swatches with range labels, the
//! no-data entry with its hatch, an optional histogram of the values
//! under classed swatches, and continuous ramps with nice ticks and the
//! midpoint marked.

use super::scene::{Anchor, Fill, Gradient, Group, Node, Shape, text};
use super::ticks;
use crate::classify;
use crate::encode::{Encoding, Scale, label};
use crate::figure::{Figure, Kind};
use crate::font::{text_width, wrap};

/// A legend laid out at the origin, and its size.
pub struct Block {
    /// Its elements, at the origin.
    pub group: Group,
    /// Gradients it uses (indices are local; the caller renumbers).
    pub gradients: Vec<Gradient>,
    /// Width.
    pub width: f64,
    /// Height.
    pub height: f64,
}

fn swatch(fig: &Figure, x: f64, y: f64, w: f64, h: f64, fill: Fill) -> Node {
    if matches!(fig.kind, Kind::Choropleth) {
        Node::new(Shape::Rect { x, y, w, h }).fill(fill)
    } else {
        let r = (fig.marks.size / 2.0).min(h / 2.0).max(1.5);
        let n = Node::new(Shape::Circle {
            c: [x + w / 2.0, y + h / 2.0],
            r,
        });
        if fig.marks.hollow {
            match fill {
                Fill::Color(c) => n.fill(Fill::None).stroke(c, 1.0),
                other => n.fill(other),
            }
        } else {
            n.fill(fill)
        }
    }
}

/// The legend, `max_width` wide at most; `horizontal` flows entries in
/// rows (a legend under the panels).
pub fn legend(fig: &Figure, enc: &Encoding, max_width: f64, horizontal: bool) -> Option<Block> {
    if enc.classes.is_empty() && !matches!(enc.scale, Scale::Continuous { .. }) {
        return None;
    }
    if matches!(enc.scale, Scale::Single) {
        return None;
    }
    let size = fig.text.size;
    let line = size * 1.25;
    let mut g = Group::role("legend");
    let mut y = 0.0;
    let mut width: f64 = 0.0;
    for l in wrap(&fig.legend.title, size, true, max_width) {
        y += line;
        width = width.max(text_width(&l, size, true));
        g.push(text([0.0, y - size * 0.25], &l, size, true, Anchor::Start));
    }
    y += size * 0.4;
    let mut gradients = Vec::new();
    let border = if fig.kind == Kind::Choropleth && fig.border.width > 0.0 {
        Some((fig.border.color, fig.border.width))
    } else {
        None
    };
    match &enc.scale {
        Scale::Continuous {
            min,
            max,
            midpoint,
            stops,
        } => {
            let bar = size * 1.2;
            let len = if horizontal {
                max_width.min(size * 22.0)
            } else {
                size * 12.0
            };
            let t = ticks::inside(*min, *max, 5);
            let pos = |v: f64| classify::unclassed::position(v, *min, *max, *midpoint);
            let mut ramp = Group::role("legend-ramp");
            ramp.attrs.push(("data-class", "ramp".into()));
            if horizontal {
                gradients.push(Gradient {
                    stops: stops.clone(),
                    from: [0.0, 0.0],
                    to: [len, 0.0],
                });
                ramp.push(
                    Node::new(Shape::Rect {
                        x: 0.0,
                        y,
                        w: len,
                        h: bar,
                    })
                    .fill(Fill::Gradient(0)),
                );
                for v in &t.values {
                    let x = pos(*v) * len;
                    ramp.push(
                        Node::new(Shape::Lines(vec![vec![
                            [x, y + bar],
                            [x, y + bar + size * 0.3],
                        ]]))
                        .stroke(fig.text.color, 0.4),
                    );
                    ramp.push(text(
                        [x, y + bar + size * 1.3],
                        &label::number(*v, t.decimals.max(enc.decimals.min(t.decimals))),
                        size,
                        false,
                        Anchor::Middle,
                    ));
                }
                if let Some(m) = midpoint {
                    let x = pos(*m) * len;
                    ramp.push(
                        Node::new(Shape::Lines(vec![vec![[x, y - size * 0.3], [x, y + bar]]]))
                            .stroke(fig.text.color, 0.8)
                            .attr("data-role", "midpoint"),
                    );
                }
                y += bar + size * 1.6;
                width = width.max(len);
            } else {
                gradients.push(Gradient {
                    stops: stops.clone(),
                    from: [0.0, y + len],
                    to: [0.0, y],
                });
                ramp.push(
                    Node::new(Shape::Rect {
                        x: 0.0,
                        y,
                        w: bar,
                        h: len,
                    })
                    .fill(Fill::Gradient(0)),
                );
                let mut lw: f64 = 0.0;
                for v in &t.values {
                    let yy = y + len - pos(*v) * len;
                    let s = label::number(*v, t.decimals);
                    lw = lw.max(text_width(&s, size, false));
                    ramp.push(
                        Node::new(Shape::Lines(vec![vec![[bar, yy], [bar + size * 0.3, yy]]]))
                            .stroke(fig.text.color, 0.4),
                    );
                    ramp.push(text(
                        [bar + size * 0.5, yy + size * 0.35],
                        &s,
                        size,
                        false,
                        Anchor::Start,
                    ));
                }
                if let Some(m) = midpoint {
                    let yy = y + len - pos(*m) * len;
                    ramp.push(
                        Node::new(Shape::Lines(vec![vec![[-size * 0.3, yy], [bar, yy]]]))
                            .stroke(fig.text.color, 0.8)
                            .attr("data-role", "midpoint"),
                    );
                }
                y += len + size * 0.6;
                width = width.max(bar + size * 0.5 + lw);
            }
            g.push_group(ramp);
            if let Some(m) = midpoint {
                let s = format!("Midpoint: {}", label::number(*m, enc.decimals));
                y += line;
                width = width.max(text_width(&s, size, false));
                g.push(text([0.0, y - size * 0.25], &s, size, false, Anchor::Start));
            }
        }
        _ => {
            let sw = size * 1.5;
            let sh = size * 1.1;
            let gap = size * 0.5;
            let mut entries: Vec<(String, String, Fill)> = enc
                .classes
                .iter()
                .map(|c| (c.id.clone(), c.label.clone(), Fill::Color(c.color)))
                .collect();
            if enc.no_data.count > 0 {
                let fill = if fig.kind == Kind::Choropleth {
                    Fill::Hatch
                } else {
                    Fill::Color(enc.no_data.color)
                };
                entries.push((enc.no_data.id.clone(), enc.no_data.label.clone(), fill));
            }
            let entry_w = entries
                .iter()
                .map(|(_, l, _)| sw + gap + text_width(l, size, false))
                .fold(0.0, f64::max)
                + size;
            let per_row = if horizontal {
                ((max_width / entry_w).floor() as usize).max(1)
            } else {
                1
            };
            let rows = entries.len().div_ceil(per_row);
            for (i, (id, l, fill)) in entries.into_iter().enumerate() {
                let (col, row) = (i % per_row, i / per_row);
                let x = col as f64 * entry_w;
                // The no-data entry sits apart from the classes.
                let extra = if id == "no-data" && !horizontal {
                    size * 0.5
                } else {
                    0.0
                };
                let yy = y + row as f64 * (sh + size * 0.35) + extra;
                let mut e = Group::role("legend-entry");
                e.attrs.push(("data-class", id.clone()));
                let mut s = swatch(fig, x, yy, sw, sh, fill);
                if let Some((c, w)) = border {
                    s = s.stroke(c, w);
                }
                e.push(s);
                e.push(text(
                    [x + sw + gap, yy + sh * 0.5 + size * 0.35],
                    &l,
                    size,
                    false,
                    Anchor::Start,
                ));
                g.push_group(e);
            }
            y += rows as f64 * (sh + size * 0.35)
                + if enc.no_data.count > 0 && !horizontal {
                    size * 0.5
                } else {
                    0.0
                };
            width = width.max(if horizontal {
                entry_w * per_row.min(enc.classes.len() + 1) as f64
            } else {
                entry_w
            });
            // A diverging classification names its midpoint under the
            // swatches.
            if let Some(m) = enc
                .classification
                .as_ref()
                .and_then(|c| c.midpoint.as_ref())
            {
                let how = match m.arrangement {
                    classify::diverging::Arrangement::Break => "a class bound",
                    classify::diverging::Arrangement::Centre => "the centre of the middle class",
                };
                let s = format!("Midpoint {} is {how}", label::number(m.value, enc.decimals));
                for l in wrap(&s, size, false, max_width) {
                    y += line;
                    width = width.max(text_width(&l, size, false));
                    g.push(
                        text([0.0, y - size * 0.25], &l, size, false, Anchor::Start)
                            .attr("data-role", "midpoint"),
                    );
                }
            }
            if fig.legend.histogram && !horizontal {
                if let Some(c) = &enc.classification {
                    let hw = width.max(size * 10.0).min(max_width);
                    let hh = size * 4.0;
                    y += size * 0.6;
                    let mut hg = Group::role("legend-histogram");
                    let top = c.histogram.counts.iter().copied().max().unwrap_or(1).max(1) as f64;
                    let bins = c.histogram.counts.len().max(1) as f64;
                    for (i, n) in c.histogram.counts.iter().enumerate() {
                        let h = hh * *n as f64 / top;
                        let mid = (c.histogram.edges[i] + c.histogram.edges[i + 1]) / 2.0;
                        let col = enc.color(&crate::figure::Value::Number(mid));
                        hg.push(
                            Node::new(Shape::Rect {
                                x: hw * i as f64 / bins,
                                y: y + hh - h,
                                w: hw / bins,
                                h,
                            })
                            .fill(Fill::Color(col)),
                        );
                    }
                    hg.push(
                        Node::new(Shape::Lines(vec![vec![[0.0, y + hh], [hw, y + hh]]]))
                            .stroke(fig.text.color, 0.4),
                    );
                    y += hh + size * 0.3;
                    let lo = label::number(c.min, enc.decimals);
                    let hi = label::number(c.max, enc.decimals);
                    y += size;
                    hg.push(text([0.0, y], &lo, size, false, Anchor::Start));
                    hg.push(text([hw, y], &hi, size, false, Anchor::End));
                    y += size * 0.3;
                    g.push_group(hg);
                    width = width.max(hw);
                }
            }
        }
    }
    Some(Block {
        group: g,
        gradients,
        width,
        height: y,
    })
}
