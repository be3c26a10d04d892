//! The audit as one self-contained HTML page (`check --html`): the figure
//! as a PNG data URI, the verdict and the caution, the findings with their
//! numbers, the classes' measured colours per view, a pairwise CIEDE2000
//! matrix per view as an inline SVG heat map with the blending pairs
//! marked, and for a spec the join report and the classification. Styles
//! are inline (`templates/report.css`), images are data URIs, there is no
//! script, and a Content-Security-Policy forbids every outside request.
//! The same input gives the same bytes.
//!
//! The contact sheet (the figure in every view) comes in as PNG bytes,
//! [`HtmlInput::sheet_png`] (`check` makes it with `sheet::sheet_png`);
//! without it the section is left out.

use std::fmt::Write as _;
use std::path::Path;

use base64::Engine as _;

use crate::audit::{Report, text::CAUTION};
use crate::classify::Classification;
use crate::color::gamut::map_oklch_to_srgb;
use crate::color::{Oklch, Srgb, ciede2000, wcag};
use crate::error::Result;
use crate::findings::Kind;
use crate::join::JoinReport;
use crate::render::Rendered;
use crate::svg::{escape, hex};
use crate::{geo, raster, table};

/// The resolution the figure is drawn at for the page (screen density of
/// a typical laptop display at 1.25x).
pub const FIGURE_DPI: f64 = 120.0;

/// The page's colours, as CSS custom properties (name, `#rrggbb`); the
/// style sheet uses no other.
pub const COLOURS: [(&str, &str); 9] = [
    ("ink", "#1a1a1a"),
    ("paper", "#ffffff"),
    ("muted", "#4d4d4d"),
    ("rule", "#8c8c8c"),
    ("pass-ink", "#0b5a26"),
    ("pass-paper", "#e3f3e8"),
    ("fail-ink", "#8c1d0e"),
    ("fail-paper", "#fbe8e4"),
    ("note-paper", "#f2f2ef"),
];

/// Every (text, background) pair of [`COLOURS`] the page sets text in.
pub const TEXT_ON: [(&str, &str); 6] = [
    ("ink", "paper"),
    ("muted", "paper"),
    ("ink", "note-paper"),
    ("fail-ink", "paper"),
    ("pass-ink", "pass-paper"),
    ("fail-ink", "fail-paper"),
];

const STYLE: &str = include_str!("../../templates/report.css");

/// What the page is made of.
#[derive(Debug, Clone, Copy)]
pub struct HtmlInput<'a> {
    /// The audited input as given (a spec or an SVG).
    pub input: &'a Path,
    /// The audit.
    pub report: &'a Report,
    /// The SVG that was audited (drawn for the page).
    pub svg: &'a str,
    /// The figure's background (white for an SVG from elsewhere).
    pub background: Srgb,
    /// For a spec: the rendered figure (its description and
    /// classification).
    pub rendered: Option<&'a Rendered>,
    /// For a spec of a choropleth: the join of its shapes and rows.
    pub join: Option<&'a JoinReport>,
    /// The proposed palette in words (empty: none).
    pub proposal: &'a str,
    /// The contact sheet as PNG bytes, when made; its section is left out
    /// otherwise.
    pub sheet_png: Option<&'a [u8]>,
}

/// The page's `:root` custom properties.
fn root_vars() -> String {
    let mut s = String::from(":root {");
    for (name, value) in COLOURS {
        let _ = write!(s, " --{name}: {value};");
    }
    s.push_str(" }\n");
    s
}

fn png_data_uri(png: &[u8]) -> String {
    format!(
        "data:image/png;base64,{}",
        base64::engine::general_purpose::STANDARD.encode(png)
    )
}

/// `#rrggbb` to a colour (None: not that form, e.g. a class with no
/// pixels in a view).
fn parse_hex(s: &str) -> Option<Srgb> {
    let h = s.strip_prefix('#').filter(|h| h.len() == 6)?;
    let byte = |i: usize| u8::from_str_radix(&h[i..i + 2], 16).ok();
    Some(Srgb::from_rgb8(byte(0)?, byte(2)?, byte(4)?))
}

/// The page as HTML text.
pub fn render(page: &HtmlInput) -> Result<String> {
    let r = page.report;
    let name = page.input.to_string_lossy().replace('\\', "/");
    let doc = raster::parse(page.input, page.svg.as_bytes())?;
    let img = raster::render(page.input, &doc, FIGURE_DPI, page.background)?;
    let figure_png = raster::encode_png(&img, FIGURE_DPI)?;

    let mut s = String::new();
    s.push_str("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
    s.push_str("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'\">\n");
    s.push_str("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n");
    s.push_str("<link rel=\"icon\" href=\"data:,\">\n");
    let _ = writeln!(s, "<title>hueproof audit: {}</title>", escape(&name));
    let _ = write!(
        s,
        "<style>\n{}{STYLE}</style>\n</head>\n<body>\n",
        root_vars()
    );
    let _ = writeln!(s, "<h1>Colour audit of <code>{}</code></h1>", escape(&name));

    verdict(&mut s, r);
    let _ = writeln!(
        s,
        "<p class=\"caution\" id=\"caution\">{}</p>",
        escape(CAUTION)
    );

    s.push_str("<section id=\"figure\">\n<h2>The figure</h2>\n<figure>\n");
    let alt = match page.rendered {
        Some(rd) if !rd.description.is_empty() => rd.description.clone(),
        _ => format!("The audited figure, {name}"),
    };
    let _ = writeln!(
        s,
        "<img src=\"{}\" width=\"{}\" height=\"{}\" alt=\"{}\">",
        png_data_uri(&figure_png),
        img.width,
        img.height,
        escape(&alt)
    );
    let _ = writeln!(
        s,
        "<figcaption>As audited, drawn at {FIGURE_DPI} dpi for this page.</figcaption>\n</figure>\n</section>"
    );

    if let Some(sheet) = page.sheet_png {
        s.push_str("<section id=\"sheet\">\n<h2>Contact sheet</h2>\n<figure>\n");
        let _ = writeln!(
            s,
            "<img src=\"{}\" alt=\"The figure in every audited view\">",
            png_data_uri(sheet)
        );
        s.push_str(
            "<figcaption>The figure as simulated in each view.</figcaption>\n</figure>\n</section>\n",
        );
    }

    findings_table(&mut s, r);
    if !page.proposal.trim().is_empty() {
        let _ = writeln!(
            s,
            "<section id=\"proposal\">\n<h2>Proposed palette</h2>\n<pre>{}</pre>\n</section>",
            escape(page.proposal.trim_matches('\n'))
        );
    }
    swatches(&mut s, r);
    matrices(&mut s, r);
    if let Some(j) = page.join {
        let panels = page
            .rendered
            .and_then(|rd| rd.figure.panel_column.as_deref());
        join_section(&mut s, j, panels);
    }
    if let Some(c) = page
        .rendered
        .and_then(|rd| rd.encoding.classification.as_ref())
    {
        classification_section(&mut s, c);
    }
    if !r.refused_references.is_empty() {
        s.push_str("<section id=\"refused\">\n<h2>Not audited</h2>\n<p>References to outside files or addresses were left out and never read; what they would draw was not audited:</p>\n<ul>\n");
        for x in &r.refused_references {
            let _ = writeln!(s, "<li><code>{}</code></li>", escape(x));
        }
        s.push_str("</ul>\n</section>\n");
    }
    let _ = writeln!(
        s,
        "<footer>\n<p class=\"muted\">Made by hueproof {}. {}</p>\n</footer>\n</body>\n</html>",
        env!("CARGO_PKG_VERSION"),
        escape(CAUTION)
    );
    Ok(s)
}

fn plural(n: usize, word: &str) -> String {
    format!("{n} {word}{}", if n == 1 { "" } else { "s" })
}

fn verdict(s: &mut String, r: &Report) {
    use crate::findings::Severity;
    let count = |sev: Severity| r.findings.iter().filter(|f| f.severity == sev).count();
    let _ = writeln!(
        s,
        "<p class=\"verdict {}\" id=\"verdict\" data-passed=\"{}\">{}: {}, {}, {}</p>",
        if r.passed { "pass" } else { "fail" },
        r.passed,
        if r.passed { "Passed" } else { "Failed" },
        plural(count(Severity::Error), "error"),
        plural(count(Severity::Warning), "warning"),
        plural(count(Severity::Note), "note"),
    );
    let _ = writeln!(
        s,
        "<p class=\"muted\">{} ({}), {}: {}; audited at {} dpi for a viewing distance of {} cm.</p>",
        match r.classes.len() {
            1 => "1 class".to_string(),
            n => format!("{n} classes"),
        },
        if r.classes_from == "fills" {
            "detected from the distinct fills"
        } else {
            "from the figure's class marks"
        },
        plural(r.views.len(), "view"),
        escape(&r.views.join(", ")),
        r.dpi,
        r.viewing_distance_cm
    );
}

fn findings_table(s: &mut String, r: &Report) {
    s.push_str("<section id=\"findings\">\n<h2>Findings</h2>\n");
    if r.findings.is_empty() {
        s.push_str("<p>No findings.</p>\n</section>\n");
        return;
    }
    s.push_str("<div class=\"scroll\">\n<table class=\"findings\">\n<thead><tr><th>Code</th><th>Kind</th><th>Severity</th><th>View</th><th>Classes</th><th>Measure</th><th class=\"num\">Measured</th><th class=\"num\">Threshold</th><th>Message</th><th>Fix</th></tr></thead>\n<tbody>\n");
    for f in &r.findings {
        let classes = f.classes.join(",");
        let _ = writeln!(
            s,
            "<tr class=\"{sev}\" data-code=\"{code}\" data-kind=\"{kind}\" data-severity=\"{sev}\" data-view=\"{view}\" data-classes=\"{classes}\" data-measured=\"{m}\" data-threshold=\"{t}\"><td><code>{code}</code></td><td>{kind}</td><td>{sev}</td><td>{view}</td><td>{classes_text}</td><td><code>{measure}</code></td><td class=\"num\">{m}</td><td class=\"num\">{t}</td><td class=\"text\">{msg}</td><td class=\"text\">{fix}</td></tr>",
            sev = f.severity.name(),
            code = f.code,
            kind = f.kind.name(),
            view = escape(&f.view),
            classes = escape(&classes),
            classes_text = escape(&f.classes.join(", ")),
            m = f.measured,
            t = f.threshold,
            measure = f.measure,
            msg = escape(&f.message),
            fix = escape(f.fix.as_deref().unwrap_or("")),
        );
    }
    s.push_str("</tbody>\n</table>\n</div>\n</section>\n");
}

fn swatches(s: &mut String, r: &Report) {
    s.push_str("<section id=\"classes\">\n<h2>Classes as measured</h2>\n<p>The colour of each class as rendered and measured, per view (simulated).</p>\n<div class=\"scroll\">\n<table>\n<thead><tr><th>Class</th><th class=\"num\">Area (px)</th><th class=\"num\">Regions</th><th class=\"num\">Mark size</th>");
    for v in &r.views {
        let _ = write!(s, "<th>{}</th>", escape(v));
    }
    s.push_str("</tr></thead>\n<tbody>\n");
    for c in &r.classes {
        let _ = write!(
            s,
            "<tr data-class=\"{id}\"><td><code>{id}</code></td><td class=\"num\">{}</td><td class=\"num\">{}</td><td class=\"num\">{:.2}°</td>",
            c.area_px,
            c.regions,
            c.mark_angle_deg,
            id = escape(&c.id),
        );
        for (view, hexv) in &c.measured.0 {
            if parse_hex(hexv).is_some() {
                let _ = write!(
                    s,
                    "<td data-view=\"{view}\" data-color=\"{hexv}\"><span class=\"swatch\" style=\"background:{hexv}\"></span><code>{hexv}</code></td>",
                    view = escape(view),
                );
            } else {
                s.push_str("<td class=\"muted\">not drawn</td>");
            }
        }
        s.push_str("</tr>\n");
    }
    s.push_str("</tbody>\n</table>\n</div>\n</section>\n");
}

/// The pairwise CIEDE2000 differences of the classes measured in view
/// `v` (index into `r.views`): the classes (id, colour) and the matrix.
pub fn difference_matrix(r: &Report, v: usize) -> (Vec<(String, Srgb)>, Vec<Vec<f64>>) {
    let classes: Vec<(String, Srgb)> = r
        .classes
        .iter()
        .filter_map(|c| {
            let (_, h) = c.measured.0.get(v)?;
            Some((c.id.clone(), parse_hex(h)?))
        })
        .collect();
    let m = classes
        .iter()
        .map(|(_, a)| {
            classes
                .iter()
                .map(|(_, b)| ciede2000(a.to_lab(), b.to_lab()))
                .collect()
        })
        .collect();
    (classes, m)
}

/// Heat-map fill for a difference: small differences (the ones that
/// blend) strong and dark, large ones pale; one hue, ordered in OKLab
/// lightness so the ramp reads in grayscale too.
fn heat(de: f64) -> Srgb {
    let t = (de / 40.0).clamp(0.0, 1.0);
    map_oklch_to_srgb(Oklch {
        l: 0.42 + 0.55 * t,
        c: 0.14 * (1.0 - t) + 0.02 * t,
        h: 35.0,
    })
    .0
}

/// Black or white, whichever contrasts more with `bg` (at least 4.58:1
/// for any background, by the WCAG 2.x formula).
pub fn text_on(bg: Srgb) -> Srgb {
    let (black, white) = (Srgb::new(0.0, 0.0, 0.0), Srgb::new(1.0, 1.0, 1.0));
    if wcag::contrast_ratio(black, bg) >= wcag::contrast_ratio(white, bg) {
        black
    } else {
        white
    }
}

fn matrices(s: &mut String, r: &Report) {
    s.push_str("<section id=\"matrices\">\n<h2>Colour differences between classes</h2>\n<p>CIEDE2000 difference of every pair of classes as measured in each view: the darker the cell, the closer the colours. Cells outlined and marked with <strong>!</strong> are pairs with a blend finding (HP101) in that view.</p>\n");
    const CELL: usize = 46;
    const MARGIN: usize = 56;
    for (v, view) in r.views.iter().enumerate() {
        let (classes, m) = difference_matrix(r, v);
        let _ = writeln!(s, "<h3>{}</h3>", escape(view));
        if classes.len() < 2 {
            s.push_str("<p>Fewer than two classes measured in this view.</p>\n");
            continue;
        }
        let blends: Vec<&[String]> = r
            .findings
            .iter()
            .filter(|f| f.kind == Kind::Blend && &f.view == view && f.classes.len() == 2)
            .map(|f| f.classes.as_slice())
            .collect();
        let marked = |a: &str, b: &str| {
            blends
                .iter()
                .any(|p| (p[0] == a && p[1] == b) || (p[0] == b && p[1] == a))
        };
        let n = classes.len();
        let size = MARGIN + n * CELL + 2;
        let _ = writeln!(
            s,
            "<div class=\"scroll\"><svg class=\"heat\" data-view=\"{v}\" xmlns=\"http://www.w3.org/2000/svg\" width=\"{size}\" height=\"{size}\" viewBox=\"0 0 {size} {size}\" role=\"img\" aria-label=\"CIEDE2000 differences between classes, {v}\">",
            v = escape(view)
        );
        for (i, (id, _)) in classes.iter().enumerate() {
            let c = MARGIN + i * CELL + CELL / 2;
            let _ = writeln!(
                s,
                "<text x=\"{c}\" y=\"{}\" text-anchor=\"middle\" font-size=\"13\" fill=\"#1a1a1a\">{}</text><text x=\"{}\" y=\"{}\" text-anchor=\"end\" font-size=\"13\" fill=\"#1a1a1a\">{}</text>",
                MARGIN - 12,
                escape(id),
                MARGIN - 8,
                c + 4,
                escape(id)
            );
        }
        for (i, (a, _)) in classes.iter().enumerate() {
            for (j, (b, _)) in classes.iter().enumerate() {
                let (x, y) = (MARGIN + j * CELL, MARGIN + i * CELL);
                if i == j {
                    let _ = writeln!(
                        s,
                        "<rect x=\"{x}\" y=\"{y}\" width=\"{CELL}\" height=\"{CELL}\" fill=\"#ffffff\" stroke=\"#8c8c8c\"/>"
                    );
                    continue;
                }
                let de = m[i][j];
                let fill = heat(de);
                let fail = marked(a, b);
                let _ = writeln!(
                    s,
                    "<g class=\"cell{}\" data-a=\"{}\" data-b=\"{}\" data-de=\"{de:.3}\"><rect x=\"{x}\" y=\"{y}\" width=\"{CELL}\" height=\"{CELL}\" fill=\"{}\" stroke=\"{}\" stroke-width=\"{}\"/><text x=\"{}\" y=\"{}\" text-anchor=\"middle\" font-size=\"12\" fill=\"{}\">{de:.1}{}</text></g>",
                    if fail { " failing" } else { "" },
                    escape(a),
                    escape(b),
                    hex(fill),
                    if fail { "#000000" } else { "#ffffff" },
                    if fail { 3 } else { 1 },
                    x + CELL / 2,
                    y + CELL / 2 + 4,
                    hex(text_on(fill)),
                    if fail { "!" } else { "" },
                );
            }
        }
        s.push_str("</svg></div>\n");
    }
    s.push_str("</section>\n");
}

fn key_list(s: &mut String, title: &str, id: &str, keys: &[String]) {
    let _ = write!(
        s,
        "<dt>{title}</dt><dd id=\"{id}\" data-count=\"{}\">",
        keys.len()
    );
    if keys.is_empty() {
        s.push_str("none");
    } else {
        let shown: Vec<String> = keys
            .iter()
            .map(|k| format!("<code>{}</code>", escape(k)))
            .collect();
        let _ = write!(s, "{}: {}", keys.len(), shown.join(", "));
    }
    s.push_str("</dd>\n");
}

fn join_section(s: &mut String, j: &JoinReport, panel_column: Option<&str>) {
    s.push_str("<section id=\"join\">\n<h2>Join of shapes and data rows</h2>\n<dl>\n");
    let _ = writeln!(
        s,
        "<dt>Matched keys</dt><dd id=\"join-matched\" data-count=\"{0}\">{0}</dd>",
        j.matched
    );
    key_list(
        s,
        "Rows without a shape (not drawn)",
        "join-rows-without-shape",
        &j.rows_without_shape,
    );
    key_list(
        s,
        "Shapes without a row (drawn as no data)",
        "join-shapes-without-row",
        &j.shapes_without_row,
    );
    key_list(
        s,
        "Rows with a missing value",
        "join-missing",
        &j.rows_with_missing_values,
    );
    match panel_column {
        Some(p) => {
            let _ = writeln!(
                s,
                "<dt>Repeated keys</dt><dd>expected: one row per key in each panel (column <code>{}</code>)</dd>",
                escape(p)
            );
        }
        None => key_list(s, "Duplicate keys", "join-duplicates", &j.duplicate_keys),
    }
    s.push_str("</dl>\n</section>\n");
}

fn classification_section(s: &mut String, c: &Classification) {
    s.push_str("<section id=\"classification\">\n<h2>Classification</h2>\n<dl>\n");
    let _ = writeln!(
        s,
        "<dt>Method</dt><dd id=\"class-method\">{}</dd>",
        escape(&c.method)
    );
    let _ = writeln!(
        s,
        "<dt>Values</dt><dd>{} classified, {} missing, from {} to {}</dd>",
        c.n, c.missing, c.min, c.max
    );
    let _ = writeln!(
        s,
        "<dt>Goodness of variance fit</dt><dd id=\"class-gvf\">{}</dd>",
        match c.gvf {
            Some(g) => format!("{g:.4}"),
            None => "undefined (all values equal)".into(),
        }
    );
    s.push_str("</dl>\n<div class=\"scroll\">\n<table>\n<thead><tr><th class=\"num\">Class</th><th class=\"num\">Upper bound (inclusive)</th><th class=\"num\">Count</th></tr></thead>\n<tbody>\n");
    for (k, (b, n)) in c.breaks.iter().zip(&c.counts).enumerate() {
        let _ = writeln!(
            s,
            "<tr data-break=\"{b}\" data-count=\"{n}\"><td class=\"num\">{}</td><td class=\"num\">{b}</td><td class=\"num\">{n}</td></tr>",
            k + 1
        );
    }
    s.push_str("</tbody>\n</table>\n</div>\n</section>\n");
}

/// The join of a rendered choropleth's shapes and data rows, read again
/// from the files its spec names (the figure model keeps only what is
/// drawn). None for other kinds of figure.
pub fn join_of(rendered: &Rendered) -> Result<Option<JoinReport>> {
    use crate::figure::{Kind as FigureKind, Level};
    let fig = &rendered.figure;
    if fig.kind != FigureKind::Choropleth {
        return Ok(None);
    }
    let spec = crate::spec::SpecFile::read(&fig.spec_path)?;
    let Some(shapes) = spec.spec.map.as_ref().and_then(|m| m.shapes.as_ref()) else {
        return Ok(None);
    };
    let map = spec.spec.map.as_ref();
    let data = &spec.spec.data;
    let layer = geo::read_shapes_file(
        &spec.resolve(shapes),
        &geo::ReadOptions {
            key: Some(geo::KeySource::Property(
                map.and_then(|m| m.shape_key.clone())
                    .unwrap_or_else(|| data.key.clone()),
            )),
            repair: true,
            coordinates: geo::CoordinateKind::Geographic,
        },
        map.and_then(|m| m.object.as_deref()),
    )?;
    let mut opts = table::TableOptions::new(&data.key);
    // Only numbers are read as values; categories are text.
    let numeric = matches!(fig.variable.level, Level::Interval | Level::Ratio);
    opts.value_columns = Some(match (&fig.variable.column, numeric) {
        (Some(c), true) => vec![c.clone()],
        _ => Vec::new(),
    });
    if let Some(m) = &data.missing {
        opts.missing_markers = m.iter().map(|x| x.trim().to_string()).collect();
    }
    let rows = table::read_table_file(&spec.resolve(&data.table), &opts)?;
    Ok(Some(crate::join::join(&layer, &rows, false)))
}
