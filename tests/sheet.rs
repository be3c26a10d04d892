//! The simulation contact sheet (`hueproof sheet`): its panels are the
//! audit's raster through the vision models pixel for pixel, its marks
//! land on the classes the findings name, and its own text and marks pass
//! the audit's rules. Outside references are named beside each check.

mod common;

use std::path::Path;

use common::{cli, marks, media_box, read_csv, rect, scratch};

use hueproof::ExitKind;
use hueproof::audit::labels::fill_label;
use hueproof::audit::{self, Examined, Options};
use hueproof::color::{Srgb, wcag};
use hueproof::sheet::{self, marks};
use hueproof::vision::{self, Simulation, raster::simulate_rgba8};

fn page(w: f64, h: f64, body: &str) -> String {
    format!(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="{w}pt" height="{h}pt" viewBox="0 0 {w} {h}"><rect data-role="background" width="{w}" height="{h}" fill="#ffffff"/>{body}</svg>"##
    )
}

/// Classes c1, c2, ... of `fills`, one 40 x 40 square each, `pitch` apart.
fn row<S: AsRef<str>>(fills: &[S], pitch: f64) -> String {
    fills
        .iter()
        .enumerate()
        .map(|(i, f)| {
            let x = 10.0 + pitch * i as f64;
            marks(
                &format!("c{}", i + 1),
                f.as_ref(),
                None,
                &[rect(x, 10.0, 40.0, 40.0)],
            )
        })
        .collect()
}

// A red and a green of nearly equal lightness (CIELAB L* about 54 and 53),
// the confusion pair of protan and deutan readers (common practice), as in
// tests/audit.rs, where the audit flags them under protanopia,
// deuteranopia and achromatopsia and not under normal vision.
const RED: &str = "#d45f3c";
const GREEN: &str = "#5e8d3a";

fn red_green() -> String {
    page(
        160.0,
        80.0,
        &(marks("c1", RED, None, &[rect(10.0, 10.0, 70.0, 60.0)])
            + &marks("c2", GREEN, None, &[rect(80.0, 10.0, 70.0, 60.0)])),
    )
}

fn examine(svg: &str, dpi: f64, views: Option<&str>) -> (Examined, Options) {
    let mut opt = Options::new();
    opt.dpi = dpi;
    if let Some(v) = views {
        opt.views = vision::parse_views(v).unwrap();
    }
    let ex = audit::examine(Path::new("test.svg"), svg, &opt).unwrap();
    (ex, opt)
}

fn decode(bytes: &[u8]) -> (u32, u32, Vec<u8>) {
    let d = png::Decoder::new(std::io::Cursor::new(bytes));
    let mut r = d.read_info().unwrap();
    let mut buf = vec![0; r.output_buffer_size().unwrap()];
    let info = r.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    (info.width, info.height, buf)
}

/// The panel of view `i` cropped out of the sheet's PNG pixels.
fn crop(sheet_px: &(u32, u32, Vec<u8>), p: &sheet::figure::PanelPlace, w: u32, h: u32) -> Vec<u8> {
    let (sw, _, px) = sheet_px;
    let mut out = Vec::with_capacity((w * h * 4) as usize);
    for y in 0..h {
        let at = (((p.y + y) * sw + p.x) * 4) as usize;
        out.extend_from_slice(&px[at..at + (w * 4) as usize]);
    }
    out
}

fn simulated(ex: &Examined, opt: &Options, i: usize) -> Vec<u8> {
    let mut rgba = ex.raster.rgba.clone();
    simulate_rgba8(
        &Simulation::new(opt.views[i].view, None),
        ex.raster.width as usize,
        &mut rgba,
    );
    rgba
}

#[test]
fn panels_are_the_audit_raster_simulated_pixel_for_pixel_outside_the_marks() {
    let (ex, opt) = examine(&red_green(), 48.0, None);
    let s = sheet::build("red-green", &ex, &opt);
    let png = decode(&s.canvas.png().unwrap());
    assert_eq!((png.0, png.1), (s.canvas.width, s.canvas.height));
    let (w, h) = (ex.raster.width, ex.raster.height);
    assert_eq!(s.panels.len(), 5);
    let mut marked = 0;
    for (i, p) in s.panels.iter().enumerate() {
        let got = crop(&png, p, w, h);
        let want = simulated(&ex, &opt, i);
        for (j, (g, e)) in got.chunks_exact(4).zip(want.chunks_exact(4)).enumerate() {
            match p.marks[j] {
                marks::NONE => assert_eq!(g, e, "{} pixel {j}", p.view),
                marks::ON_DARK => assert_eq!(&g[..3], &marks::DARK, "{} pixel {j}", p.view),
                _ => assert_eq!(&g[..3], &marks::LIGHT, "{} pixel {j}", p.view),
            }
        }
        marked += p.marks.iter().filter(|&&m| m != marks::NONE).count();
    }
    assert!(marked > 100, "{marked}");
}

#[test]
fn panels_match_the_reference_simulation_of_machado_2009() {
    // Six random colours with their simulations from the reference
    // library colour-science 0.4.7 (fixtures/cvd_machado2009_samples.csv:
    // Machado, Oliveira & Fernandes 2009 at severities 1.0 and 0.6), drawn
    // as six large classes; the middle pixel of each class in each panel
    // is the reference's 8-bit result within one level (the fast path's
    // documented tolerance).
    let rows = read_csv("cvd_machado2009_samples.csv");
    let mut colours: Vec<String> = Vec::new();
    for r in &rows {
        if !colours.contains(&r["hex_in"]) && colours.len() < 6 {
            colours.push(r["hex_in"].clone());
        }
    }
    let body = row(&colours, 40.0);
    let views = "normal,protanomaly=1.0,deuteranomaly=1.0,tritanomaly=1.0,protanomaly=0.6,deuteranomaly=0.6";
    let (ex, opt) = examine(&page(260.0, 60.0, &body), 72.0, Some(views));
    let s = sheet::build("reference colours", &ex, &opt);
    let png = decode(&s.canvas.png().unwrap());
    let (w, h) = (ex.raster.width, ex.raster.height);
    let mut checked = 0;
    for p in s.panels.iter().skip(1) {
        let (kind, sev) = p.view.split_once('=').unwrap();
        let sev: f64 = sev.parse().unwrap();
        let got = crop(&png, p, w, h);
        for (k, c) in colours.iter().enumerate() {
            let row = rows
                .iter()
                .find(|r| {
                    &r["hex_in"] == c
                        && r["deficiency"] == kind
                        && (r["severity"].parse::<f64>().unwrap() - sev).abs() < 1e-9
                })
                .unwrap();
            let want = u32::from_str_radix(&row["hex_out"][1..], 16).unwrap();
            let want = [(want >> 16) as u8, (want >> 8) as u8, want as u8];
            // The middle of class k's square (at 72 dpi one point is one pixel).
            let (cx, cy) = (30 + 40 * k as u32, 30u32);
            let i = ((cy * w + cx) * 4) as usize;
            assert_eq!(ex.labels.ids[(cy * w + cx) as usize], fill_label(k));
            assert_eq!(p.marks[(cy * w + cx) as usize], marks::NONE);
            for ch in 0..3 {
                assert!(
                    (got[i + ch] as i32 - want[ch] as i32).abs() <= 1,
                    "{} {c}: {:?} vs {want:?}",
                    p.view,
                    &got[i..i + 3]
                );
            }
            checked += 1;
        }
    }
    assert_eq!(checked, 5 * 6);
}

/// For one panel: (dark marks on c1, dark marks on c2, marks neither on nor
/// beside c1 or c2).
fn outline_census(ex: &Examined, p: &sheet::figure::PanelPlace) -> (usize, usize, usize) {
    let (w, h) = (ex.raster.width as usize, ex.raster.height as usize);
    let ids = &ex.labels.ids;
    let blend = |i: usize| ids[i] == fill_label(0) || ids[i] == fill_label(1);
    let (mut a, mut b, mut stray) = (0, 0, 0);
    for (i, &m) in p.marks.iter().enumerate() {
        if m == marks::NONE {
            continue;
        }
        let (x, y) = (i % w, i / w);
        let near = blend(i)
            || (x > 0 && blend(i - 1))
            || (x + 1 < w && blend(i + 1))
            || (y > 0 && blend(i - w))
            || (y + 1 < h && blend(i + w));
        if !near {
            stray += 1;
        }
        if m == marks::ON_DARK {
            if ids[i] == fill_label(0) {
                a += 1;
            } else if ids[i] == fill_label(1) {
                b += 1;
            } else {
                stray += 1;
            }
        }
    }
    (a, b, stray)
}

#[test]
fn a_blend_outlines_both_classes_where_it_occurs_and_nowhere_else() {
    let (ex, opt) = examine(&red_green(), 48.0, None);
    let s = sheet::build("red-green", &ex, &opt);
    let blended: Vec<&str> = ex
        .report
        .findings
        .iter()
        .filter(|f| f.code == "HP101")
        .map(|f| f.view.as_str())
        .collect();
    assert_eq!(blended, ["protanopia", "deuteranopia", "achromatopsia"]);
    for p in &s.panels {
        let (a, b, stray) = outline_census(&ex, p);
        if blended.contains(&p.view.as_str()) {
            // Each rectangle's edge (about 47 x 40 px at 48 dpi) is
            // outlined all round.
            assert!(a > 100 && b > 100, "{}: {a} {b}", p.view);
            assert_eq!(stray, 0, "{}", p.view);
        } else {
            assert!(p.marks.iter().all(|&m| m == marks::NONE), "{}", p.view);
        }
    }
}

#[test]
fn the_marks_contrast_at_least_3_to_1_with_what_they_lie_on_in_every_view() {
    // WCAG 2.x SC 1.4.11 (non-text contrast, 3:1 for graphical objects),
    // with the WCAG 2.x contrast ratio. Black and white are fixed points of
    // every view and model, so the marks look the same in every panel; and
    // at every marked pixel one line of the pair clears 3:1 against the
    // simulated pixel underneath.
    let all = "normal,protanopia,deuteranopia,tritanopia,achromatopsia,grayscale,protanomaly=0.5,deuteranomaly=0.5,tritanomaly=0.5";
    for v in vision::parse_views(all).unwrap() {
        for model in [
            None,
            Some(vision::CvdModel::Machado2009),
            Some(vision::CvdModel::Brettel1997),
            Some(vision::CvdModel::Vienot1999),
        ] {
            let sim = Simulation::new(v.view, model);
            for c in [marks::DARK, marks::LIGHT] {
                let s = sim.apply(Srgb::from_rgb8(c[0], c[1], c[2])).to_rgb8();
                assert_eq!(s, c, "{} {model:?}", v.name);
            }
        }
    }
    let (ex, opt) = examine(&red_green(), 48.0, Some(all));
    let s = sheet::build("red-green", &ex, &opt);
    let rgb = |p: &[u8]| Srgb::from_rgb8(p[0], p[1], p[2]);
    let (dark, light) = (rgb(&marks::DARK), rgb(&marks::LIGHT));
    let mut checked = 0;
    for (i, p) in s.panels.iter().enumerate() {
        let under = simulated(&ex, &opt, i);
        for (j, &m) in p.marks.iter().enumerate() {
            if m == marks::NONE {
                continue;
            }
            let c = rgb(&under[4 * j..4 * j + 3]);
            let best = wcag::contrast_ratio(dark, c).max(wcag::contrast_ratio(light, c));
            assert!(best >= 3.0, "{} pixel {j}: {best}", p.view);
            checked += 1;
        }
    }
    assert!(checked > 500, "{checked}");
}

#[test]
fn a_pale_borderless_class_gets_a_dashed_mark_in_every_view() {
    // As in tests/audit.rs: #f1efe9 on white is about 1.1:1, under the 3:1
    // of WCAG 2.x SC 1.4.11, so the class fades in every view.
    let shapes = [rect(20.0, 20.0, 40.0, 40.0), rect(80.0, 20.0, 40.0, 40.0)];
    let svg = page(140.0, 80.0, &marks("c1", "#f1efe9", None, &shapes));
    let (ex, opt) = examine(&svg, 96.0, None);
    assert!(ex.report.findings.iter().all(|f| f.code == "HP102"));
    assert_eq!(ex.report.findings.len(), 5);
    let s = sheet::build("pale", &ex, &opt);
    let (w, h) = (ex.raster.width as usize, ex.raster.height as usize);
    let ids = &ex.labels.ids;
    let on = |i: usize| ids[i] == fill_label(0);
    for p in &s.panels {
        // The class's edge pixels, and how many of them carry the dark line.
        let (mut edge, mut dark) = (0, 0);
        for i in 0..w * h {
            let (x, y) = (i % w, i / w);
            if !on(i) {
                assert_ne!(p.marks[i], marks::ON_DARK, "{}", p.view);
                continue;
            }
            let is_edge = x == 0
                || y == 0
                || x + 1 == w
                || y + 1 == h
                || !on(i - 1)
                || !on(i + 1)
                || !on(i - w)
                || !on(i + w);
            if is_edge {
                edge += 1;
                dark += (p.marks[i] == marks::ON_DARK) as usize;
            } else {
                assert_eq!(p.marks[i], marks::NONE, "{}: inside is not marked", p.view);
            }
        }
        // Dashed: about half of the edge, not all of it.
        let share = dark as f64 / edge as f64;
        assert!((0.3..0.7).contains(&share), "{}: {share}", p.view);
    }
}

#[test]
fn a_glaring_class_is_hatched_inside_and_no_other_class_is() {
    // As in tests/audit.rs: one class at CIELAB L* about 20 among three
    // at 55 to 75 in a qualitative scheme glares in every view.
    let fills = ["#b07a5f", "#7fa67c", "#a9b8de", "#2b2f45"];
    let body = row(&fills, 50.0);
    let mut opt = Options::new();
    opt.dpi = 48.0;
    opt.scheme = Some(hueproof::scheme::SchemeKind::Qualitative);
    let ex = audit::examine(Path::new("t.svg"), &page(220.0, 60.0, &body), &opt).unwrap();
    assert!(
        ex.report
            .findings
            .iter()
            .all(|f| f.code == "HP103" && f.classes == ["c4"])
    );
    let s = sheet::build("glare", &ex, &opt);
    for p in &s.panels {
        let on_c4 = p
            .marks
            .iter()
            .zip(&ex.labels.ids)
            .filter(|(m, _)| **m != marks::NONE)
            .map(|(_, &l)| l == fill_label(3))
            .collect::<Vec<_>>();
        assert!(on_c4.len() > 20, "{}", p.view);
        assert!(
            on_c4.iter().all(|&b| b),
            "{}: a hatch left class c4",
            p.view
        );
    }
}

#[test]
fn the_sheet_text_passes_the_audit_text_contrast_rule() {
    // The audit's own text rule (HP108, WCAG 2.x SC 1.4.3) run on the
    // sheet's chrome in every view.
    let (ex, opt) = examine(&red_green(), 96.0, None);
    let s = sheet::build("red-green", &ex, &opt);
    let chrome = s.canvas.chrome_svg();
    let mut o = Options::new();
    o.dpi = 96.0;
    let r = audit::audit_svg(Path::new("sheet.svg"), &chrome, &o).unwrap();
    let text: Vec<_> = r.findings.iter().filter(|f| f.code == "HP108").collect();
    assert!(text.is_empty(), "{text:?}");
    assert!(chrome.matches("<text").count() > 20);
}

#[test]
fn the_same_figure_gives_the_same_bytes() {
    let (ex, opt) = examine(&red_green(), 48.0, None);
    let a = sheet::sheet_png("x", &ex, &opt).unwrap();
    let (ex2, _) = examine(&red_green(), 48.0, None);
    let b = sheet::sheet_png("x", &ex2, &opt).unwrap();
    assert!(a == b);
    assert!(
        sheet::sheet_svg("x", &ex, &opt).unwrap() == sheet::sheet_svg("x", &ex2, &opt).unwrap()
    );
}

#[test]
fn the_svg_sheet_embeds_each_panel_at_its_pixel_size() {
    // Rendered back at the sheet's DPI by resvg, the SVG shows the same
    // panels as the PNG: the embedded images are not resampled.
    let (ex, opt) = examine(&red_green(), 48.0, None);
    let s = sheet::build("red-green", &ex, &opt);
    let svg = s.canvas.svg().unwrap();
    assert_eq!(svg.matches("<image ").count(), 5);
    let doc = hueproof::raster::parse(Path::new("s.svg"), svg.as_bytes()).unwrap();
    let back =
        hueproof::raster::render(Path::new("s.svg"), &doc, opt.dpi, Srgb::new(1.0, 1.0, 1.0))
            .unwrap();
    let png = decode(&s.canvas.png().unwrap());
    // The physical size in millimetres may round up by one pixel.
    assert!(back.width - png.0 <= 1 && back.height - png.1 <= 1);
    let (w, h) = (ex.raster.width, ex.raster.height);
    let again = (back.width, back.height, back.rgba.clone());
    for p in &s.panels {
        assert!(crop(&again, p, w, h) == crop(&png, p, w, h), "{}", p.view);
    }
}

#[test]
fn the_pdf_sheet_is_one_page_at_the_sheet_physical_size_and_deterministic() {
    // Read back with lopdf (a general-purpose PDF library): one page
    // whose MediaBox is the sheet at the audit DPI in PostScript points
    // (72 per inch, the PDF specification's default user space unit).
    let (ex, opt) = examine(&red_green(), 48.0, None);
    let s = sheet::build("red-green", &ex, &opt);
    let pdf = s.canvas.pdf().unwrap();
    assert!(pdf == s.canvas.pdf().unwrap());
    let mb = media_box(&pdf);
    let want = [
        s.canvas.width as f64 * 72.0 / 48.0,
        s.canvas.height as f64 * 72.0 / 48.0,
    ];
    assert!((mb[2] - mb[0] - want[0]).abs() < 0.5, "{mb:?} {want:?}");
    assert!((mb[3] - mb[1] - want[1]).abs() < 0.5, "{mb:?} {want:?}");
}

#[test]
fn the_command_writes_a_sheet_per_figure_and_an_index_and_exits_1_on_findings() {
    let dir = scratch("sheet", "several");
    let a = dir.join("red-green.svg");
    let b = dir.join("calm.svg");
    std::fs::write(&a, red_green()).unwrap();
    std::fs::write(
        &b,
        page(
            160.0,
            80.0,
            &(marks("c1", "#1b4f72", None, &[rect(10.0, 10.0, 70.0, 60.0)])
                + &marks("c2", "#f0b27a", None, &[rect(80.0, 10.0, 70.0, 60.0)])),
        ),
    )
    .unwrap();
    let out = dir.join("sheets");
    let args = [
        "sheet",
        a.to_str().unwrap(),
        b.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
        "--dpi",
        "48",
    ];
    let r = cli(&args).unwrap();
    assert_eq!(r.kind, ExitKind::Findings, "{}", r.stdout);
    for f in ["red-green.sheet.png", "calm.sheet.png", "index.png"] {
        let bytes = std::fs::read(out.join(f)).unwrap();
        let (w, h, _) = decode(&bytes);
        assert!(w > 100 && h > 100, "{f}");
    }
    let first = std::fs::read(out.join("index.png")).unwrap();
    cli(&args).unwrap();
    assert!(first == std::fs::read(out.join("index.png")).unwrap());
    // One passing figure alone: exit 0, the sheet beside it by default.
    let one = cli(&["sheet", b.to_str().unwrap(), "--dpi", "48"]).unwrap();
    assert_eq!(one.kind, ExitKind::Success, "{}", one.stdout);
    assert!(dir.join("calm.sheet.png").exists());
    // The format by extension.
    for (ext, magic) in [("svg", &b"<svg"[..]), ("pdf", &b"%PDF-"[..])] {
        let path = dir.join(format!("calm-sheet.{ext}"));
        let args = ["sheet", b.to_str().unwrap(), "--dpi", "48", "-o"];
        let mut args = args.to_vec();
        args.push(path.to_str().unwrap());
        cli(&args).unwrap();
        assert!(std::fs::read(&path).unwrap().starts_with(magic), "{ext}");
    }
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn bad_input_exits_2_naming_the_file_and_an_input_is_never_overwritten() {
    let dir = scratch("sheet", "bad");
    let bad = dir.join("broken.svg");
    std::fs::write(&bad, "<svg this is not").unwrap();
    let e = cli(&["sheet", bad.to_str().unwrap()]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(e.to_string().contains("broken.svg"), "{e}");
    let missing = dir.join("missing.toml");
    let e = cli(&["sheet", missing.to_str().unwrap()]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(e.to_string().contains("missing.toml"), "{e}");
    let good = dir.join("rg.svg");
    std::fs::write(&good, red_green()).unwrap();
    let e = cli(&[
        "sheet",
        good.to_str().unwrap(),
        "-o",
        good.to_str().unwrap(),
    ])
    .unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(std::fs::read_to_string(&good).unwrap().starts_with("<svg"));
    let e = cli(&[
        "sheet",
        good.to_str().unwrap(),
        "-o",
        dir.join("x.pdf.txt").to_str().unwrap(),
    ])
    .unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    // Several figures need a folder.
    let e = cli(&["sheet", good.to_str().unwrap(), good.to_str().unwrap()]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_committed_sample_sheets_match_a_fresh_run() {
    // Run from the package root (as cargo runs tests), with the arguments
    // of sample-output/sheets/rebuild.sh; PNGs compared pixel by pixel
    // within a small tolerance, as tests/sample_output.rs does.
    let mut specs: Vec<String> = std::fs::read_dir("sample-output")
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|e| e == "toml"))
        .map(|p| p.to_str().unwrap().to_string())
        .collect();
    specs.sort();
    specs.push("sample-output/audit/clashing-colours.toml".into());
    let dir = scratch("sheet", "samples");
    let out = dir.to_str().unwrap().to_string();
    let mut args = vec!["sheet"];
    args.extend(specs.iter().map(String::as_str));
    args.extend(["-o", &out, "--dpi", "100"]);
    let r = cli(&args).unwrap();
    assert_eq!(r.kind, ExitKind::Findings);
    let committed = std::fs::read_to_string("sample-output/sheets/sheets.txt").unwrap();
    assert!(
        r.stdout.replace(&out, "sample-output/sheets") == committed,
        "sample-output/sheets/sheets.txt differs; run sh sample-output/sheets/rebuild.sh"
    );
    let mut names: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name())
        .collect();
    names.sort();
    assert_eq!(names.len(), specs.len() + 1);
    for n in names {
        let fresh = decode(&std::fs::read(dir.join(&n)).unwrap());
        let old = std::fs::read(Path::new("sample-output/sheets").join(&n))
            .unwrap_or_else(|_| panic!("sample-output/sheets/{n:?} is missing; rebuild"));
        let old = decode(&old);
        assert_eq!((fresh.0, fresh.1), (old.0, old.1), "{n:?}");
        let off = fresh
            .2
            .iter()
            .zip(&old.2)
            .filter(|(a, b)| a.abs_diff(**b) > 8)
            .count();
        assert!(
            off * 1000 <= fresh.2.len(),
            "{n:?}: {off} channel values differ by more than 8 levels; run sh sample-output/sheets/rebuild.sh"
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}
