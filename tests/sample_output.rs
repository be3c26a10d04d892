//! The committed `sample-output/` is what the current code renders: the
//! demo is rendered into a fresh folder and compared with it, text files
//! (specs, data, SVG) byte for byte, PNG images pixel by pixel within a
//! small tolerance (the same renderer on another CPU may round a few edge
//! pixels differently). Rebuild with `sh sample-output/rebuild.sh`.

mod common;

use std::path::{Path, PathBuf};

fn decode(p: &Path) -> (u32, u32, Vec<u8>) {
    let d = png::Decoder::new(std::io::BufReader::new(std::fs::File::open(p).unwrap()));
    let mut r = d.read_info().unwrap();
    let mut buf = vec![0; r.output_buffer_size().unwrap()];
    let info = r.next_frame(&mut buf).unwrap();
    buf.truncate(info.buffer_size());
    (info.width, info.height, buf)
}

/// HTML reports are the same: the text byte for byte, the PNG images
/// inside (data URIs) pixel by pixel within the tolerance used above.
fn same_html(a: &str, b: &str) -> bool {
    use base64::Engine as _;
    const PNG: &str = "data:image/png;base64,";
    let (pa, pb): (Vec<&str>, Vec<&str>) = (a.split(PNG).collect(), b.split(PNG).collect());
    if pa.len() != pb.len() || pa[0] != pb[0] {
        return false;
    }
    pa.iter().zip(&pb).skip(1).all(|(x, y)| {
        let (ix, iy) = (x.find('"').unwrap_or(0), y.find('"').unwrap_or(0));
        let pixels = |b64: &str| {
            let bytes = base64::engine::general_purpose::STANDARD
                .decode(b64)
                .unwrap();
            let mut r = png::Decoder::new(std::io::Cursor::new(bytes))
                .read_info()
                .unwrap();
            let mut buf = vec![0; r.output_buffer_size().unwrap()];
            let info = r.next_frame(&mut buf).unwrap();
            buf.truncate(info.buffer_size());
            (info.width, info.height, buf)
        };
        let ((w1, h1, p1), (w2, h2, p2)) = (pixels(&x[..ix]), pixels(&y[..iy]));
        let off = p1
            .iter()
            .zip(&p2)
            .filter(|(u, v)| u.abs_diff(**v) > 8)
            .count();
        x[ix..] == y[iy..] && (w1, h1) == (w2, h2) && off * 1000 <= p1.len()
    })
}

#[test]
fn sample_output_matches_a_fresh_demo() {
    let dir = std::env::temp_dir().join(format!("hueproof-sample-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let written = hueproof::starter::demo(&dir, false).unwrap();
    let committed = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("sample-output");
    assert!(written.files.len() >= 5 + 3 * hueproof::starter::TEMPLATES.len());
    for f in &written.files {
        let rel = f.strip_prefix(&dir).unwrap();
        let old = committed.join(rel);
        assert!(
            old.exists(),
            "sample-output/{} is missing; run sh sample-output/rebuild.sh",
            rel.display()
        );
        if f.extension().is_some_and(|e| e == "png") {
            let (w1, h1, a) = decode(f);
            let (w2, h2, b) = decode(&old);
            assert_eq!((w1, h1), (w2, h2), "{}", rel.display());
            let off = a
                .iter()
                .zip(&b)
                .filter(|(x, y)| x.abs_diff(**y) > 8)
                .count();
            assert!(
                off * 1000 <= a.len(),
                "{}: {off} channel values differ by more than 8 levels",
                rel.display()
            );
        } else {
            let (a, b) = (std::fs::read(f).unwrap(), std::fs::read(&old).unwrap());
            assert!(
                a == b,
                "sample-output/{} differs from a fresh render; run sh sample-output/rebuild.sh",
                rel.display()
            );
        }
    }
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn the_committed_audit_samples_match_a_fresh_check() {
    // Run from the package root (as cargo runs tests), so the input path
    // written into the SARIF and JUnit files is the same relative one.
    let spec = "sample-output/audit/clashing-colours.toml";
    let committed = |ext: &str| {
        std::fs::read_to_string(format!("sample-output/audit/clashing-colours{ext}")).unwrap()
    };
    let run = |args: &[&str]| common::cli(args).unwrap();
    let text = run(&["check", spec]);
    assert_eq!(text.kind, hueproof::ExitKind::Findings);
    assert!(
        text.stdout == committed(".check.txt"),
        "sample-output/audit/clashing-colours.check.txt differs; run sh sample-output/rebuild.sh"
    );
    let dir = std::env::temp_dir().join(format!("hueproof-sample-audit-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let out = |name: &str| dir.join(name).to_str().unwrap().to_string();
    let (json, sarif, junit, svg) = (out("a.json"), out("a.sarif"), out("a.xml"), out("r.svg"));
    let html = out("a.html");
    run(&[
        "check",
        spec,
        &format!("--json={json}"),
        &format!("--sarif={sarif}"),
        &format!("--junit={junit}"),
        &format!("--html={html}"),
    ]);
    run(&["render", spec, "-o", &svg, "--repair"]);
    for (fresh, ext) in [
        (json, ".check.json"),
        (sarif, ".sarif"),
        (junit, ".junit.xml"),
        (svg, "-repaired.svg"),
    ] {
        assert!(
            std::fs::read_to_string(&fresh).unwrap() == committed(ext),
            "sample-output/audit/clashing-colours{ext} differs; run sh sample-output/rebuild.sh"
        );
    }
    assert!(
        same_html(
            &std::fs::read_to_string(&html).unwrap(),
            &committed(".html")
        ),
        "sample-output/audit/clashing-colours.html differs; run sh sample-output/rebuild.sh"
    );
    let passing = out("p.html");
    run(&[
        "check",
        "sample-output/choropleth.toml",
        &format!("--html={passing}"),
    ]);
    assert!(
        same_html(
            &std::fs::read_to_string(&passing).unwrap(),
            &std::fs::read_to_string("sample-output/audit/choropleth.html").unwrap()
        ),
        "sample-output/audit/choropleth.html differs; run sh sample-output/rebuild.sh"
    );
    let _ = std::fs::remove_dir_all(&dir);
}
