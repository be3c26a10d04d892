//! The plain-language description of a figure, for the SVG `<desc>`
//! (read by screen readers) and for people reviewing a figure: what is
//! shown, the classes with their ranges and counts, and where the highest
//! and lowest values are.

use crate::encode::{Encoding, Scale, label};
use crate::figure::{Figure, Item, Kind, Place, Value};
use crate::geo::Coord;

/// The accessible title: the figure's title, or what it shows.
pub fn title(fig: &Figure) -> String {
    fig.titles.title.clone().unwrap_or_else(|| {
        let what = if fig.variable.label.is_empty() {
            "data"
        } else {
            &fig.variable.label
        };
        format!("{} of {what}", kind_phrase(fig.kind))
    })
}

fn kind_phrase(k: Kind) -> &'static str {
    match k {
        Kind::Choropleth => "Choropleth map",
        Kind::DotPlot => "Dot plot",
        Kind::RankedDots => "Ranked dot chart",
        Kind::DotMap => "Dot map",
    }
}

fn plural(n: usize, one: &str, many: &str) -> String {
    format!("{n} {}", if n == 1 { one } else { many })
}

/// Compass direction of `p` from the centre of the box `lo`-`hi` (y up).
fn direction(p: Coord, lo: Coord, hi: Coord) -> &'static str {
    let cx = (lo[0] + hi[0]) / 2.0;
    let cy = (lo[1] + hi[1]) / 2.0;
    let (dx, dy) = (
        (p[0] - cx) / (hi[0] - lo[0]).max(1e-12),
        (p[1] - cy) / (hi[1] - lo[1]).max(1e-12),
    );
    if dx.abs() < 1.0 / 6.0 && dy.abs() < 1.0 / 6.0 {
        return "centre";
    }
    let angle = dy.atan2(dx).to_degrees();
    let names = [
        "east",
        "north-east",
        "north",
        "north-west",
        "west",
        "south-west",
        "south",
        "south-east",
    ];
    let i = (((angle + 360.0 + 22.5) % 360.0) / 45.0) as usize;
    names[i.min(7)]
}

fn position(it: &Item) -> Option<Coord> {
    match &it.place {
        Place::Area(g) => crate::geo::measure::inaccessibility::label_point(g),
        Place::Point(p) => Some(*p),
        Place::Rank(_) => None,
    }
}

/// The description.
pub fn describe(fig: &Figure, enc: &Encoding) -> String {
    if let Some(d) = &fig.description {
        return d.clone();
    }
    let mut s = Vec::new();
    let unit = match fig.kind {
        Kind::Choropleth => ("area", "areas"),
        Kind::DotPlot | Kind::DotMap => ("point", "points"),
        Kind::RankedDots => ("item", "items"),
    };
    let first: Vec<&Item> = fig.items.iter().filter(|i| i.panel == 0).collect();
    let per_panel = first.len();
    let what = if fig.variable.label.is_empty() {
        String::new()
    } else {
        format!(" of {}", fig.variable.label)
    };
    let mut head = format!("{}{what}", kind_phrase(fig.kind));
    if let (Kind::DotPlot, Some(a)) = (fig.kind, &fig.axes) {
        head = format!("Dot plot of {} against {}", a.y_title, a.x_title);
        if !fig.variable.label.is_empty() {
            head.push_str(&format!(", coloured by {}", fig.variable.label));
        }
    }
    if fig.panels.len() > 1 {
        head.push_str(&format!(
            ", in {} panels by {} ({}), each with {}",
            fig.panels.len(),
            fig.panel_column.as_deref().unwrap_or("panel"),
            fig.panels.join(", "),
            plural(per_panel, unit.0, unit.1)
        ));
    } else {
        head.push_str(&format!(", {}", plural(fig.items.len(), unit.0, unit.1)));
    }
    s.push(format!("{head}."));
    let units = fig
        .variable
        .units
        .as_deref()
        .map(|u| format!(" {u}"))
        .unwrap_or_default();
    match &enc.scale {
        Scale::Classed => {
            let method = enc
                .classification
                .as_ref()
                .map_or("", |c| c.method.as_str());
            let list: Vec<String> = enc
                .classes
                .iter()
                .map(|c| format!("{}{units} ({})", c.label, c.count))
                .collect();
            s.push(format!(
                "{} classes by {} breaks, upper bounds inclusive: {}.",
                enc.classes.len(),
                method_name(method),
                list.join("; ")
            ));
        }
        Scale::Categories => {
            let list: Vec<String> = enc
                .classes
                .iter()
                .map(|c| format!("{} ({})", c.label, c.count))
                .collect();
            s.push(format!(
                "{}: {}.",
                plural(enc.classes.len(), "category", "categories"),
                list.join("; ")
            ));
        }
        Scale::Continuous {
            min, max, midpoint, ..
        } => {
            let mut t = format!(
                "Continuous colour from {}{units} to {}{units}",
                label::number(*min, enc.decimals),
                label::number(*max, enc.decimals)
            );
            if let Some(m) = midpoint {
                t.push_str(&format!(
                    ", diverging at {}{units}",
                    label::number(*m, enc.decimals)
                ));
            }
            s.push(format!("{t}."));
        }
        Scale::Single => {}
    }
    // Extremes.
    let numbered: Vec<(&Item, f64)> = fig
        .items
        .iter()
        .filter_map(|i| match i.value {
            Value::Number(v) => Some((i, v)),
            _ => None,
        })
        .collect();
    if let (Some(hi), Some(lo)) = (
        numbered
            .iter()
            .max_by(|a, b| a.1.total_cmp(&b.1).then(b.0.key.cmp(&a.0.key))),
        numbered
            .iter()
            .min_by(|a, b| a.1.total_cmp(&b.1).then(a.0.key.cmp(&b.0.key))),
    ) {
        let pts: Vec<Coord> = fig.items.iter().filter_map(position).collect();
        let lo_b = pts
            .iter()
            .fold([f64::INFINITY; 2], |a, p| [a[0].min(p[0]), a[1].min(p[1])]);
        let hi_b = pts.iter().fold([f64::NEG_INFINITY; 2], |a, p| {
            [a[0].max(p[0]), a[1].max(p[1])]
        });
        let say = |it: &Item, v: f64| {
            let mut t = format!(
                "{}{units} at {}",
                label::number(v, enc.decimals),
                it.name.as_deref().unwrap_or(&it.key)
            );
            if fig.kind.is_map() {
                if let Some(p) = position(it) {
                    t.push_str(&format!(
                        " (in the {} of the map)",
                        direction(p, lo_b, hi_b)
                    ));
                }
            }
            if fig.panels.len() > 1 {
                t.push_str(&format!(" in panel {}", fig.panels[it.panel]));
            }
            t
        };
        s.push(format!(
            "Highest: {}. Lowest: {}.",
            say(hi.0, hi.1),
            say(lo.0, lo.1)
        ));
    }
    if enc.no_data.count > 0 {
        let n = enc.no_data.count;
        s.push(format!(
            "{} {} no data{}.",
            plural(n, unit.0, unit.1),
            if n == 1 { "has" } else { "have" },
            if fig.kind == Kind::Choropleth {
                ", shown hatched"
            } else {
                ""
            }
        ));
    }
    s.join(" ")
}

fn method_name(m: &str) -> &str {
    match m {
        "equal" => "equal-interval",
        "quantile" => "quantile",
        "natural" => "natural (Fisher-Jenks)",
        "stddev" => "standard-deviation",
        "headtail" => "head/tail",
        "manual" => "manually set",
        other => other,
    }
}
