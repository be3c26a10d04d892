//! The audit's fast measurements equal the straightforward ones.
//!
//! The audit measures each view from the distinct colours it reads (a
//! palette simulated once per view) and computes its geometry with run
//! union-find, row-ordered column scans and row-wise masks. Here every one
//! of those results is compared, exactly, with the plain computation the
//! README defines: the whole raster simulated in place with the vision
//! fast path (`simulate_rgba8`, itself checked against published matrices
//! in tests/vision_reference.rs) and read pixel by pixel; flood-fill
//! components; a 3 x 3 window per pixel; every row and column scanned as
//! a line of pixels; and the label raster rendered with clipped groups
//! composited directly, byte for byte as resvg renders it. Figures: the
//! choropleth template on the demo data and a figure made here with
//! sub-3-px marks, a gradient (many distinct colours), text without a
//! flat fill and an odd pixel count; random label rasters; clipped
//! scenes with and without anti-aliasing.

mod common;

use std::path::Path;

use hueproof::audit::labels::{self, Labels, Part};
use hueproof::audit::measure::{self, Geometry, Palette, Reads};
use hueproof::audit::{Options, TEXT_MARGIN_PX};
use hueproof::color::Srgb;
use hueproof::color::wcag::{contrast_ratio_of_luminances, relative_luminance};
use hueproof::random::SplitMix64;
use hueproof::vision::raster::simulate_rgba8;
use hueproof::vision::{CvdModel, Simulation};
use hueproof::{figure, raster, render};

/// Per-channel median of the pixels where `select` holds.
fn median_rgb(rgba: &[u8], select: impl Fn(usize) -> bool) -> Option<[u8; 3]> {
    let mut ch: [Vec<u8>; 3] = [vec![], vec![], vec![]];
    for (i, p) in rgba.chunks_exact(4).enumerate() {
        if select(i) {
            for c in 0..3 {
                ch[c].push(p[c]);
            }
        }
    }
    if ch[0].is_empty() {
        return None;
    }
    // The lower middle of an even count (the median the audit documents:
    // the first value reaching half the pixels).
    Some([0, 1, 2].map(|c| {
        ch[c].sort_unstable();
        ch[c][(ch[c].len() - 1) / 2]
    }))
}

/// Flood-fill components, plain window core, line scans: the geometry as
/// first written.
fn plain_geometry(l: &Labels, classes: usize, dpi: f64) -> Geometry {
    let (w, h) = (l.width as usize, l.height as usize);
    let fill = |id: u16| match labels::part(id) {
        Part::Fill(k) if k < classes => Some(k),
        _ => None,
    };
    // Chamfer 3-4, two raster passes.
    let mut d = vec![u32::MAX / 2; w * h];
    for y in 0..h {
        for x in 0..w {
            let i = y * w + x;
            let id = l.ids[i];
            if x == 0
                || y == 0
                || x + 1 == w
                || y + 1 == h
                || [i - 1, i + 1, i - w, i + w].iter().any(|&j| l.ids[j] != id)
            {
                d[i] = 3;
            }
        }
    }
    let get = |d: &[u32], x: isize, y: isize| {
        if x < 0 || y < 0 || x >= w as isize || y >= h as isize {
            u32::MAX / 2
        } else {
            d[y as usize * w + x as usize]
        }
    };
    for y in 0..h as isize {
        for x in 0..w as isize {
            let v = [(-1, 0, 3), (0, -1, 3), (-1, -1, 4), (1, -1, 4)]
                .iter()
                .map(|&(dx, dy, c)| get(&d, x + dx, y + dy) + c)
                .fold(d[y as usize * w + x as usize], u32::min);
            d[y as usize * w + x as usize] = v;
        }
    }
    for y in (0..h as isize).rev() {
        for x in (0..w as isize).rev() {
            let v = [(1, 0, 3), (0, 1, 3), (1, 1, 4), (-1, 1, 4)]
                .iter()
                .map(|&(dx, dy, c)| get(&d, x + dx, y + dy) + c)
                .fold(d[y as usize * w + x as usize], u32::min);
            d[y as usize * w + x as usize] = v;
        }
    }
    let mut area = vec![0; classes];
    let mut sizes: Vec<Vec<(usize, u32)>> = vec![vec![]; classes];
    let mut seen = vec![false; w * h];
    for s in 0..w * h {
        let Some(k) = fill(l.ids[s]) else { continue };
        area[k] += 1;
        if seen[s] {
            continue;
        }
        seen[s] = true;
        let (mut stack, mut n, mut dm) = (vec![s], 0, 0);
        while let Some(i) = stack.pop() {
            n += 1;
            dm = dm.max(d[i]);
            let (x, y) = (i % w, i / w);
            let mut next = vec![];
            if x > 0 {
                next.push(i - 1);
            }
            if x + 1 < w {
                next.push(i + 1);
            }
            if y > 0 {
                next.push(i - w);
            }
            if y + 1 < h {
                next.push(i + w);
            }
            for j in next {
                if !seen[j] && l.ids[j] == l.ids[s] {
                    seen[j] = true;
                    stack.push(j);
                }
            }
        }
        sizes[k].push((n, dm));
    }
    let diameter = |d: u32| (2.0 * d as f64 / 3.0 - 1.0).max(1.0);
    let size_px = sizes
        .iter()
        .map(|r| {
            let big: Vec<f64> = r
                .iter()
                .filter(|c| c.0 >= 4)
                .map(|c| diameter(c.1))
                .collect();
            let all: Vec<f64> = r.iter().map(|c| diameter(c.1)).collect();
            measure::median(if big.is_empty() { all } else { big })
        })
        .collect();
    let gap = measure::max_gap(dpi);
    let mut contacts = std::collections::BTreeMap::new();
    let mut crossings = vec![vec![]; classes];
    let mut lines: Vec<Vec<usize>> = (0..h)
        .map(|y| (0..w).map(|x| y * w + x).collect())
        .collect();
    lines.extend((0..w).map(|x| (0..h).map(|y| y * w + x).collect::<Vec<_>>()));
    for line in &lines {
        let mut last: Option<(u16, usize)> = None;
        for (pos, &i) in line.iter().enumerate() {
            let id = l.ids[i];
            if id == labels::BORDER {
                continue;
            }
            if let Some((prev, at)) = last {
                if prev != id && pos - at - 1 <= gap {
                    match (fill(prev), fill(id)) {
                        (Some(a), Some(b)) => {
                            *contacts.entry((a.min(b), a.max(b))).or_insert(0) += 1
                        }
                        (Some(a), None) | (None, Some(a))
                            if prev == labels::BACKGROUND || id == labels::BACKGROUND =>
                        {
                            crossings[a].push(line[at..=pos].to_vec())
                        }
                        _ => {}
                    }
                }
            }
            last = Some((id, pos));
        }
    }
    let core = (0..w * h)
        .map(|i| {
            let (x, y) = ((i % w) as isize, (i / w) as isize);
            (-1..=1).all(|dy| {
                (-1..=1).all(|dx| {
                    let (xx, yy) = (x + dx, y + dy);
                    xx < 0
                        || yy < 0
                        || xx >= w as isize
                        || yy >= h as isize
                        || l.ids[yy as usize * w + xx as usize] == l.ids[i]
                })
            })
        })
        .collect();
    Geometry {
        area,
        regions: sizes.iter().map(Vec::len).collect(),
        size_px,
        contacts: contacts.into_iter().collect(),
        crossings,
        core,
    }
}

fn assert_same_geometry(a: &Geometry, b: &Geometry) {
    assert_eq!(a.area, b.area);
    assert_eq!(a.regions, b.regions);
    assert_eq!(a.size_px, b.size_px);
    assert_eq!(a.contacts, b.contacts);
    assert_eq!(a.crossings, b.crossings);
    assert!(a.core == b.core, "core masks differ");
}

/// Every per-view measurement from the reads equals the one read from the
/// whole simulated raster.
fn check_figure(svg: &str, dpi: f64) {
    let name = Path::new("fig.svg");
    let label = labels::label_svg(name, svg).unwrap();
    let bg = label.classes.background.unwrap_or(Srgb::new(1.0, 1.0, 1.0));
    let img = raster::render(name, &raster::parse(name, svg.as_bytes()).unwrap(), dpi, bg).unwrap();
    let lab = labels::render_labels(name, &label, dpi).unwrap();
    // The label raster as resvg renders the label SVG.
    let doc = raster::parse(name, label.svg.as_bytes()).unwrap();
    assert!(raster::flat::supported(doc.tree.root()));
    assert_same_render(&doc, dpi);
    let n = label.classes.ids.len();
    let g = measure::geometry(&lab, n, dpi);
    assert_same_geometry(&g, &plain_geometry(&lab, n, dpi));
    let boxes = measure::text_boxes(&lab, label.texts.len());
    let parts = labels::fill_label(n) as usize;
    let reads = Reads::new(&img.rgba, &lab, &g, &boxes, TEXT_MARGIN_PX, parts);
    let (w, h) = (lab.width as usize, lab.height as usize);
    for v in &Options::new().views {
        for model in [None, Some(CvdModel::Vienot1999)] {
            let sim = Simulation::new(v.view, model);
            let mut buf = img.rgba.clone();
            simulate_rgba8(&sim, img.width as usize, &mut buf);
            let seen = reads.palette.simulate(&sim);
            let measured =
                (0..parts as u16).filter(|&l| l == labels::BACKGROUND || l > labels::OTHER);
            for l in measured {
                let want = median_rgb(&buf, |i| lab.ids[i] == l && g.core[i])
                    .or_else(|| median_rgb(&buf, |i| lab.ids[i] == l));
                assert_eq!(reads.part(&seen, l), want, "{} label {l}", v.name);
            }
            let text = median_rgb(&buf, |i| lab.ids[i] >= labels::TEXT_BASE);
            assert_eq!(reads.text(&seen), text, "{}", v.name);
            for (j, b) in boxes.iter().enumerate() {
                let want = b.and_then(|b| {
                    let m = TEXT_MARGIN_PX;
                    let (x0, y0) = (b[0].saturating_sub(m), b[1].saturating_sub(m));
                    let (x1, y1) = ((b[2] + m).min(w - 1), (b[3] + m).min(h - 1));
                    median_rgb(&buf, |i| {
                        let (x, y) = (i % w, i / w);
                        (x0..=x1).contains(&x)
                            && (y0..=y1).contains(&y)
                            && lab.ids[i] < labels::TEXT_BASE
                    })
                });
                assert_eq!(reads.around(&seen, j), want, "{} text {j}", v.name);
            }
            let lb = relative_luminance(Srgb::new(0.9, 0.9, 0.9));
            let want: Vec<Option<f64>> = g
                .crossings
                .iter()
                .map(|cs| {
                    (!cs.is_empty()).then(|| {
                        measure::median(
                            cs.iter()
                                .map(|run| {
                                    run.iter()
                                        .map(|&i| {
                                            let p = &buf[4 * i..4 * i + 3];
                                            let c = Srgb::from_rgb8(p[0], p[1], p[2]);
                                            contrast_ratio_of_luminances(relative_luminance(c), lb)
                                        })
                                        .fold(1.0, f64::max)
                                })
                                .collect(),
                        )
                    })
                })
                .collect();
            assert_eq!(reads.boundary(&seen, lb), want, "{}", v.name);
        }
    }
}

#[test]
fn the_choropleth_template_measures_the_same_both_ways() {
    // The template and the demo data as `hueproof new` writes them.
    let d = common::scratch("speed-equivalence", "template");
    let spec = d.join("choropleth.toml");
    hueproof::starter::new_spec("choropleth", &spec).unwrap();
    let r = render::render(figure::load(&spec).unwrap()).unwrap();
    check_figure(&r.svg, 72.0);
}

#[test]
fn small_marks_gradients_and_unfilled_text_measure_the_same_both_ways() {
    // 1 px dots (no core pixels), a gradient fill (a distinct colour per
    // column), a class straight on the background, text painted with the
    // gradient (no flat fill); 101 x 67 px, so the raster's last pixels
    // (101 * 67 = 6767 = 16 * 422 + 15) are simulated one by one.
    let mut dots = String::new();
    for k in 0..12 {
        dots.push_str(&format!(
            r#"<circle data-class="c2" cx="{}" cy="52" r="0.45"/>"#,
            6.0 + 7.0 * k as f64
        ));
    }
    let svg = format!(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="101" height="67" viewBox="0 0 101 67"><defs><linearGradient id="g"><stop offset="0" stop-color="#204080"/><stop offset="1" stop-color="#e0c040"/></linearGradient></defs><rect data-role="background" width="101" height="67" fill="#fafaf5"/><g data-role="marks" data-class="c1" fill="url(#g)" stroke="#ffffff" stroke-width="0.7"><rect data-class="c1" x="3" y="3" width="60" height="30"/></g><g data-role="marks" data-class="c2" fill="#c03020">{dots}</g><g data-role="marks" data-class="c3" fill="#5a9a40"><rect data-class="c3" x="70" y="5" width="28" height="60"/></g><text x="4" y="45" font-size="9" fill="url(#g)">Aq 42</text><text x="40" y="64" font-size="6" fill="#333333">note</text></svg>"##
    );
    check_figure(&svg, 96.0);
}

#[test]
fn the_palette_simulates_every_pixel_as_the_whole_raster_does() {
    // Uniform noise (every pixel its own colour) of 37 x 29 px (1073 =
    // 16 * 67 + 1 pixels), every view and model: simulating each pixel's
    // colour through the palette gives the raster simulated in place,
    // byte for byte, the last pixel included.
    let (w, h) = (37usize, 29usize);
    let mut rng = SplitMix64(2026);
    let mut rgba = vec![255u8; 4 * w * h];
    for p in rgba.chunks_exact_mut(4) {
        let r = rng.next_u64();
        p[..3].copy_from_slice(&r.to_le_bytes()[..3]);
    }
    let mut pal = Palette::new(w * h);
    let slots: Vec<u32> = (0..w * h).map(|i| pal.slot(&rgba, i)).collect();
    for v in &Options::new().views {
        for model in [
            None,
            Some(CvdModel::Machado2009),
            Some(CvdModel::Brettel1997),
            Some(CvdModel::Vienot1999),
        ] {
            let sim = Simulation::new(v.view, model);
            let mut buf = rgba.clone();
            simulate_rgba8(&sim, w, &mut buf);
            let seen = pal.simulate(&sim);
            for (i, &s) in slots.iter().enumerate() {
                assert_eq!(
                    seen.0[s as usize],
                    buf[4 * i..4 * i + 3],
                    "{} px {i}",
                    v.name
                );
            }
        }
    }
}

#[test]
fn random_label_rasters_have_the_same_geometry_both_ways() {
    // Label rasters made of random rectangles and single pixels: classes,
    // swatches, borders (runs of them wider and narrower than the widest
    // gap bridged), the background, text and other drawing; thin strips
    // and squares of odd sizes, one pixel wide or high included.
    let mut rng = SplitMix64(0x6e0_3e7a);
    let pick = |rng: &mut SplitMix64, n: usize| (rng.next_u64() % n as u64) as usize;
    let sizes = [
        (1, 1),
        (1, 9),
        (9, 1),
        (2, 2),
        (3, 17),
        (17, 3),
        (31, 29),
        (64, 48),
        (97, 61),
    ];
    for (case, &(w, h)) in sizes.iter().cycle().take(45).enumerate() {
        let classes = 1 + case % 4;
        let mut ids = vec![labels::BACKGROUND; w * h];
        let label = |rng: &mut SplitMix64| match pick(rng, 10) {
            0 => labels::BACKGROUND,
            1 | 2 => labels::BORDER,
            3 => labels::TEXT_BASE + pick(rng, 2) as u16,
            4 => labels::OTHER,
            5 => labels::swatch_label(pick(rng, classes)),
            // One past the classes: a fill label no class owns.
            6 if case % 3 == 0 => labels::fill_label(classes),
            _ => labels::fill_label(pick(rng, classes)),
        };
        for _ in 0..pick(&mut rng, 40) {
            let (x0, y0) = (pick(&mut rng, w), pick(&mut rng, h));
            let (x1, y1) = (
                (x0 + 1 + pick(&mut rng, w / 2 + 1)).min(w),
                (y0 + 1 + pick(&mut rng, h / 2 + 1)).min(h),
            );
            let l = label(&mut rng);
            for y in y0..y1 {
                ids[y * w + x0..y * w + x1].fill(l);
            }
        }
        for _ in 0..pick(&mut rng, w * h / 8 + 1) {
            let i = pick(&mut rng, w * h);
            ids[i] = label(&mut rng);
        }
        let lab = Labels {
            width: w as u32,
            height: h as u32,
            ids,
        };
        for dpi in [24.0, 96.0] {
            let g = measure::geometry(&lab, classes, dpi);
            assert_same_geometry(&g, &plain_geometry(&lab, classes, dpi));
        }
        // Text boxes: the extremes of each text element's pixels.
        let mut want: Vec<Option<[usize; 4]>> = vec![None; 2];
        for (i, &id) in lab.ids.iter().enumerate() {
            if id >= labels::TEXT_BASE {
                let (x, y) = (i % w, i / w);
                let b = want[(id - labels::TEXT_BASE) as usize].get_or_insert([x, y, x, y]);
                *b = [b[0].min(x), b[1].min(y), b[2].max(x), b[3].max(y)];
            }
        }
        assert_eq!(measure::text_boxes(&lab, 2), want);
        assert_eq!(measure::text_boxes(&lab, 1), want[..1]);
    }
}

/// `raster::render_flat` gives resvg's pixels, byte for byte.
fn assert_same_render(doc: &raster::Document, dpi: f64) {
    let name = Path::new("fig.svg");
    let bg = Srgb::new(0.2, 0.4, 0.6);
    let want = raster::render(name, doc, dpi, bg).unwrap();
    let got = raster::render_flat(name, doc, dpi, bg).unwrap();
    assert_eq!((got.width, got.height), (want.width, want.height));
    let differ = got
        .rgba
        .chunks_exact(4)
        .zip(want.rgba.chunks_exact(4))
        .filter(|(a, b)| a != b)
        .count();
    assert_eq!(differ, 0, "{differ} pixels differ from resvg's");
}

#[test]
fn clipped_scenes_render_as_resvg_renders_them() {
    // Clipped groups inside clipped groups, a clip path with its own
    // transform and two shapes, a clip reaching past the canvas, text and
    // strokes inside a clip: without anti-aliasing (the label raster's
    // case, composited directly) and with it (partly covered pixels in
    // the clip or the layer: resvg's own steps), at two resolutions.
    for aa in ["crispEdges", "geometricPrecision"] {
        let svg = format!(
            r##"<svg xmlns="http://www.w3.org/2000/svg" width="90" height="70" viewBox="0 0 90 70" shape-rendering="{aa}" text-rendering="optimizeSpeed">
<defs>
<clipPath id="a"><rect x="4.3" y="5.1" width="60.7" height="50.2"/></clipPath>
<clipPath id="b" transform="rotate(7 30 30)"><circle cx="30" cy="30" r="18.4"/><rect x="50" y="40" width="9.5" height="9.5"/></clipPath>
<clipPath id="c"><rect x="-20" y="-20" width="60" height="200"/></clipPath>
</defs>
<rect width="90" height="70" fill="#000000"/>
<g clip-path="url(#a)"><rect x="0" y="0" width="80" height="60" fill="#040000" stroke="#010000" stroke-width="0.6"/>
<g transform="translate(3.7 2.2)" clip-path="url(#b)"><path d="M5 5L70 12L40 60Z" fill="#060000" stroke="#010000" stroke-width="1.3"/></g>
<text x="8" y="50" font-size="9" fill="#008000">Aq 42</text></g>
<g clip-path="url(#c)"><rect x="20" y="30" width="65" height="35" fill="#080000"/></g>
<circle cx="75" cy="15" r="9.2" fill="#0a0000" stroke="#010000" stroke-width="0.4"/>
</svg>"##
        );
        let doc = raster::parse(Path::new("clip.svg"), svg.as_bytes()).unwrap();
        assert!(raster::flat::supported(doc.tree.root()));
        for dpi in [96.0, 233.0] {
            assert_same_render(&doc, dpi);
        }
    }
    // Group opacity: left to resvg.
    let svg = r##"<svg xmlns="http://www.w3.org/2000/svg" width="20" height="20"><g opacity="0.5"><rect width="10" height="10" fill="#ff0000"/></g></svg>"##;
    let doc = raster::parse(Path::new("op.svg"), svg.as_bytes()).unwrap();
    assert!(!raster::flat::supported(doc.tree.root()));
    assert_same_render(&doc, 96.0);
}
