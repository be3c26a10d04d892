//! The classification and palette stage: the figure's values become
//! classes (by the requested method, or categories, or a continuous
//! ramp), and every class gets its colour, from the user's list or from
//! hueproof's generators for the scheme the level of measurement calls
//! for. Emphasis fades the classes not chosen to gray of equal OKLab
//! lightness. The result, [`Encoding`], is all that layout and drawing
//! need to know about colour.

pub mod label;

use crate::classify::diverging::{self, SideMethod};
use crate::classify::rounding::{self, RoundRule};
use crate::classify::{self, Classification, Method, Sample, unclassed};
use crate::color::gamut::map_oklch_to_srgb;
use crate::color::{Oklch, Srgb};
use crate::error::Error;
use crate::figure::{Figure, Level, Value};
use crate::scheme::{self, Context, SchemeKind, Thresholds};

/// Bins of the value histogram drawn under a classed legend.
pub const HISTOGRAM_BINS: usize = 24;

/// Colour stops of a continuous ramp.
pub const RAMP_STOPS: usize = 33;

/// One class.
#[derive(Debug, Clone, PartialEq)]
pub struct Class {
    /// Stable id: `c1`, `c2`, ... or `no-data`, `all`.
    pub id: String,
    /// Legend text.
    pub label: String,
    /// Its colour as drawn (after emphasis).
    pub color: Srgb,
    /// Its colour before emphasis.
    pub base_color: Srgb,
    /// Faded by emphasis.
    pub faded: bool,
    /// Lower bound shown (classed numbers).
    pub lower: Option<f64>,
    /// Upper bound, inclusive (classed numbers).
    pub upper: Option<f64>,
    /// The category (categories).
    pub category: Option<String>,
    /// Marks in this class.
    pub count: usize,
}

/// How values map to colours.
#[derive(Debug, Clone, PartialEq)]
pub enum Scale {
    /// Classes by upper bounds.
    Classed,
    /// One class per category.
    Categories,
    /// A continuous ramp from `min` to `max`.
    Continuous {
        /// Smallest value.
        min: f64,
        /// Largest value.
        max: f64,
        /// Midpoint at the ramp's centre.
        midpoint: Option<f64>,
        /// Colours at evenly spaced ramp positions.
        stops: Vec<Srgb>,
    },
    /// No colour variable.
    Single,
}

/// The encoding of a figure's values.
#[derive(Debug, Clone, PartialEq)]
pub struct Encoding {
    /// The classes in legend order (empty for a continuous scale).
    pub classes: Vec<Class>,
    /// The no-data class.
    pub no_data: Class,
    /// The scale.
    pub scale: Scale,
    /// The classification, for numeric classes and continuous ramps.
    pub classification: Option<Classification>,
    /// Decimals used in labels.
    pub decimals: u32,
    /// Things the user should know.
    pub warnings: Vec<String>,
}

/// Which class a value falls in.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Slot {
    /// A class, by index.
    Class(usize),
    /// No data.
    NoData,
    /// On the continuous ramp.
    Ramp,
}

impl Encoding {
    /// The slot of a value.
    pub fn slot(&self, v: &Value) -> Slot {
        match (v, &self.scale) {
            (Value::Missing, _) => Slot::NoData,
            (Value::Plain, _) => Slot::Class(0),
            (Value::Number(_), Scale::Continuous { .. }) => Slot::Ramp,
            (Value::Number(x), Scale::Classed) => {
                let upper: Vec<f64> = self.classes.iter().filter_map(|c| c.upper).collect();
                Slot::Class(classify::class_of(*x, &upper))
            }
            (Value::Number(x), _) => self
                .classes
                .iter()
                .position(|c| {
                    c.category.as_deref() == Some(label::number(*x, self.decimals).as_str())
                })
                .map_or(Slot::NoData, Slot::Class),
            (Value::Category(s), _) => self
                .classes
                .iter()
                .position(|c| c.category.as_deref() == Some(s.as_str()))
                .map_or(Slot::NoData, Slot::Class),
        }
    }

    /// The colour a value is drawn in.
    pub fn color(&self, v: &Value) -> Srgb {
        match self.slot(v) {
            Slot::Class(i) => self.classes[i].color,
            Slot::NoData => self.no_data.color,
            Slot::Ramp => match (v, &self.scale) {
                (
                    Value::Number(x),
                    Scale::Continuous {
                        min,
                        max,
                        midpoint,
                        stops,
                    },
                ) => ramp_color(stops, unclassed::position(*x, *min, *max, *midpoint)),
                _ => self.no_data.color,
            },
        }
    }

    /// The id of the group a value's mark belongs to.
    pub fn group_id(&self, v: &Value) -> &str {
        match self.slot(v) {
            Slot::Class(i) => &self.classes[i].id,
            Slot::NoData => &self.no_data.id,
            Slot::Ramp => "ramp",
        }
    }
}

/// Colour at position `t` (0..1) of evenly spaced stops, interpolated in
/// OKLab.
pub fn ramp_color(stops: &[Srgb], t: f64) -> Srgb {
    if stops.len() < 2 {
        return stops.first().copied().unwrap_or(Srgb::new(0.5, 0.5, 0.5));
    }
    let p = t.clamp(0.0, 1.0) * (stops.len() - 1) as f64;
    let k = (p.floor() as usize).min(stops.len() - 2);
    let f = p - k as f64;
    let (a, b) = (stops[k].to_oklab(), stops[k + 1].to_oklab());
    let mixed = crate::color::Oklab::new(
        a.l + (b.l - a.l) * f,
        a.a + (b.a - a.a) * f,
        a.b + (b.b - a.b) * f,
    );
    scheme::to_8bit(map_oklch_to_srgb(mixed.to_oklch()).0)
}

fn context(fig: &Figure) -> Result<Context, Error> {
    Ok(Context {
        background: fig.page.background,
        views: crate::vision::parse_views(crate::vision::DEFAULT_VIEWS)?,
        model: None,
        thresholds: Thresholds::default(),
    })
}

/// `n` colours of the figure's scheme, or the user's list.
fn colours(fig: &Figure, n: usize) -> Result<Vec<Srgb>, Error> {
    if let Some(list) = &fig.colors.list {
        if list.len() < n {
            return Err(Error::Invalid {
                path: fig.spec_path.clone(),
                location: Some(fig.locate("colors.list")),
                message: format!(
                    "{} colour(s) listed but the figure has {n} classes; list one colour per class",
                    list.len()
                ),
            });
        }
        return Ok(list[..n].to_vec());
    }
    if n == 0 {
        return Ok(Vec::new());
    }
    let ctx = context(fig)?;
    let n2 = n.max(2);
    let mut out = match fig.colors.scheme {
        SchemeKind::Sequential => scheme::sequential::generate(
            &scheme::sequential::Options {
                classes: n2,
                hues: vec![fig.colors.hue.unwrap_or(250.0)],
                ..Default::default()
            },
            &ctx,
        ),
        SchemeKind::Diverging => scheme::diverging::generate(
            &scheme::diverging::Options {
                classes: n2,
                hues: fig.colors.hues,
                ..Default::default()
            },
            &ctx,
        ),
        SchemeKind::Qualitative => {
            scheme::qualitative::generate(
                &scheme::qualitative::Options {
                    classes: n2,
                    ..Default::default()
                },
                &ctx,
            )
            .colors
        }
    };
    if n == 1 {
        // One class: a colour from the far half of the scheme.
        out = vec![out[out.len() - 1]];
    }
    Ok(out)
}

fn class(id: String, label: String, color: Srgb) -> Class {
    Class {
        id,
        label,
        color,
        base_color: color,
        faded: false,
        lower: None,
        upper: None,
        category: None,
        count: 0,
    }
}

/// Classify and colour a figure's values.
pub fn encode(fig: &Figure) -> Result<Encoding, Error> {
    let mut warnings = Vec::new();
    let no_data = class("no-data".into(), "No data".into(), fig.colors.no_data);
    let values: Vec<&Value> = fig.items.iter().map(|i| &i.value).collect();
    let numbers: Vec<f64> = values
        .iter()
        .filter_map(|v| match v {
            Value::Number(x) => Some(*x),
            _ => None,
        })
        .collect();
    let missing = values
        .iter()
        .filter(|v| matches!(v, Value::Missing))
        .count();
    let mut enc = if fig.variable.column.is_none() {
        let c = colours(fig, 1)?;
        Encoding {
            classes: vec![class("all".into(), String::new(), c[0])],
            no_data,
            scale: Scale::Single,
            classification: None,
            decimals: 0,
            warnings: Vec::new(),
        }
    } else if !fig.variable.level.is_numeric() {
        // Categories: text in the given order, or ordinal numbers sorted.
        let cats: Vec<String> = if fig.variable.categories.is_empty() {
            let mut nums = numbers.clone();
            nums.sort_by(f64::total_cmp);
            nums.dedup();
            let d = label::decimals_for(&nums);
            nums.iter().map(|x| label::number(*x, d)).collect()
        } else {
            fig.variable.categories.clone()
        };
        let decimals = label::decimals_for(&{
            let mut n = numbers.clone();
            n.sort_by(f64::total_cmp);
            n.dedup();
            n
        });
        if cats.len() > 12 {
            return Err(Error::Invalid {
                path: fig.spec_path.clone(),
                location: Some(fig.locate("data.level")),
                message: format!(
                    "{} categories is more than the 12 that colours can keep apart; group them, or treat the values as interval or ratio data",
                    cats.len()
                ),
            });
        }
        if fig.variable.level == Level::Nominal && cats.len() > 8 {
            warnings.push(format!(
                "{} categories: more than about 8 hues are hard to tell apart (common practice); consider grouping",
                cats.len()
            ));
        }
        let cols = colours(fig, cats.len())?;
        let classes = cats
            .iter()
            .zip(cols)
            .enumerate()
            .map(|(i, (name, c))| Class {
                category: Some(name.clone()),
                ..class(format!("c{}", i + 1), name.clone(), c)
            })
            .collect();
        Encoding {
            classes,
            no_data,
            scale: Scale::Categories,
            classification: None,
            decimals,
            warnings: Vec::new(),
        }
    } else {
        numeric(fig, &numbers, missing, no_data, &mut warnings)?
    };
    // Counts.
    for v in &values {
        match enc.slot(v) {
            Slot::Class(i) => enc.classes[i].count += 1,
            Slot::NoData => enc.no_data.count += 1,
            Slot::Ramp => {}
        }
    }
    emphasise(fig, &mut enc)?;
    enc.warnings.extend(warnings);
    Ok(enc)
}

fn numeric(
    fig: &Figure,
    numbers: &[f64],
    missing: usize,
    no_data: Class,
    warnings: &mut Vec<String>,
) -> Result<Encoding, Error> {
    if numbers.is_empty() {
        // Name the spec and the column rather than the classifier's input.
        return Err(Error::Invalid {
            path: fig.spec_path.clone(),
            location: Some("key data.value".into()),
            message: format!(
                "the column '{}' gives no number to colour by: all {missing} item(s) of the figure are missing; expected at least one number",
                fig.variable.column.as_deref().unwrap_or("?")
            ),
        });
    }
    let sample = Sample::new(numbers.to_vec(), missing)?;
    let mid = fig.variable.midpoint;
    let Some(method) = &fig.classes.method else {
        // Continuous.
        let (min, max) = (sample.min().unwrap_or(0.0), sample.max().unwrap_or(1.0));
        let anchors = colours(fig, if mid.is_some() { 9 } else { 7 })?;
        let stops = scheme::ramp::continuous(&anchors, RAMP_STOPS)
            .into_iter()
            .map(scheme::to_8bit)
            .collect();
        let ramp_mid = mid.filter(|m| *m > min && *m < max);
        if mid.is_some() && ramp_mid.is_none() {
            warnings.push(
                "the midpoint lies outside the data: one arm of the diverging ramp is empty".into(),
            );
        }
        let c = classify::finish(
            &sample,
            "continuous",
            classify::Bounds {
                upper: vec![max],
                warnings: Vec::new(),
            },
            HISTOGRAM_BINS,
        )?;
        let decimals = fig
            .variable
            .precision
            .unwrap_or_else(|| label::decimals_for(&[min, max]));
        return Ok(Encoding {
            classes: Vec::new(),
            no_data,
            scale: Scale::Continuous {
                min,
                max,
                midpoint: ramp_mid,
                stops,
            },
            classification: Some(c),
            decimals,
            warnings: Vec::new(),
        });
    };
    let mut c = match (mid, method) {
        (
            Some(m),
            Method::EqualInterval { classes }
            | Method::Quantile { classes }
            | Method::NaturalBreaks { classes },
        ) => {
            let side = match method {
                Method::EqualInterval { .. } => SideMethod::Equal,
                Method::Quantile { .. } => SideMethod::Quantile,
                _ => SideMethod::Natural,
            };
            let (bounds, report) =
                diverging::bounds(&sample, side, *classes, m, fig.classes.arrangement)?;
            let mut c = classify::finish(&sample, method.name(), bounds, HISTOGRAM_BINS)?;
            c.midpoint = Some(report);
            c
        }
        _ => classify::classify(&sample, method, HISTOGRAM_BINS)?,
    };
    if fig.classes.round {
        c = rounding::round(&sample, &c, RoundRule::Auto)?;
    }
    warnings.extend(c.warnings.iter().cloned());
    let n = c.breaks.len();
    let cols = match mid {
        Some(m) if fig.colors.list.is_none() => {
            // Each side takes the colours of its own arm.
            let below = c.breaks.iter().filter(|b| **b <= m).count();
            let centre = usize::from(
                c.breaks.iter().any(|b| *b >= m) && {
                    let i = below;
                    let lo = if i == 0 { c.min } else { c.breaks[i - 1] };
                    lo < m && c.breaks[i] > m
                },
            );
            let above = n - below - centre;
            if below == 0 || above == 0 {
                warnings.push(format!(
                    "every class lies on one side of the midpoint {}: the diverging scheme has an empty arm",
                    label::number(m, 2)
                ));
            }
            let arm = below.max(above);
            let all = colours(fig, 2 * arm + centre)?;
            let start = arm - below;
            all[start..start + n].to_vec()
        }
        _ => colours(fig, n)?,
    };
    let mut shown = vec![c.min];
    shown.extend(c.breaks.iter().copied());
    let decimals = fig
        .variable
        .precision
        .unwrap_or_else(|| label::decimals_for(&shown));
    let classes = (0..n)
        .map(|i| {
            let lo = if i == 0 { c.min } else { c.breaks[i - 1] };
            let hi = c.breaks[i];
            // An en dash between bounds; "to" when a bound is negative, so
            // a minus sign never sits next to the dash.
            let sep = if lo < 0.0 || hi < 0.0 {
                " to "
            } else {
                "\u{2013}"
            };
            let text = format!(
                "{}{sep}{}",
                label::number(lo, decimals),
                label::number(hi, decimals)
            );
            Class {
                lower: Some(lo),
                upper: Some(c.breaks[i]),
                ..class(format!("c{}", i + 1), text, cols[i])
            }
        })
        .collect();
    Ok(Encoding {
        classes,
        no_data,
        scale: Scale::Classed,
        classification: Some(c),
        decimals,
        warnings: Vec::new(),
    })
}

/// Fade every class not named in the emphasis list to gray of equal
/// OKLab lightness.
fn emphasise(fig: &Figure, enc: &mut Encoding) -> Result<(), Error> {
    let names = &fig.marks.emphasis;
    if names.is_empty() {
        return Ok(());
    }
    for n in names {
        if !enc
            .classes
            .iter()
            .any(|c| c.label == *n || c.category.as_deref() == Some(n))
        {
            let known: Vec<&str> = enc.classes.iter().map(|c| c.label.as_str()).collect();
            return Err(Error::Invalid {
                path: fig.spec_path.clone(),
                location: Some(fig.locate("marks.emphasis")),
                message: format!(
                    "'{n}' is not a class of this figure; the classes are: {}",
                    known.join(", ")
                ),
            });
        }
    }
    for c in &mut enc.classes {
        if !names
            .iter()
            .any(|n| c.label == *n || c.category.as_deref() == Some(n))
        {
            let l = c.base_color.to_oklab().l;
            c.color = scheme::to_8bit(map_oklch_to_srgb(Oklch::new(l, 0.0, 0.0)).0);
            c.faded = true;
        }
    }
    Ok(())
}
