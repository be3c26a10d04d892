//! `hueproof join` and `hueproof shapes` end to end: exit codes, JSON
//! shapes, and areas from the command line against reference set A's
//! analytic box areas (polygon_areas.csv, Snyder 1987 eq. 3-12 on WGS84).

use std::path::{Path, PathBuf};
use std::process::Command;

fn fixture(name: &str) -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(name)
}

fn run(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_hueproof"))
        .args(args)
        .output()
        .unwrap();
    (
        out.status.code().unwrap(),
        String::from_utf8(out.stdout).unwrap(),
        String::from_utf8(out.stderr).unwrap(),
    )
}

fn p(path: &Path) -> &str {
    path.to_str().unwrap()
}

/// `hueproof join SHAPES DATA --shape-key code --data-key code EXTRA...`.
fn join(shapes: &Path, data: &str, extra: &[&str]) -> (i32, String, String) {
    let mut args = vec![
        "join",
        p(shapes),
        data,
        "--shape-key",
        "code",
        "--data-key",
        "code",
    ];
    args.extend_from_slice(extra);
    run(&args)
}

#[test]
fn join_exit_codes_and_json() {
    let shapes = fixture("geo/districts.geojson");
    let dirty = fixture("join/dirty.csv");
    let (code, out, _) = join(&shapes, p(&dirty), &["--normalize-keys", "--json"]);
    assert_eq!(code, 1);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["matched"], 4);
    assert_eq!(v["rows_without_shape"], serde_json::json!(["01099"]));
    assert_eq!(v["duplicate_keys"], serde_json::json!(["01004"]));
    // Text: duplicates name both rows.
    let (_, text, _) = join(&shapes, p(&dirty), &[]);
    assert!(
        text.contains("'01004': data rows on lines 5 and 7"),
        "{text}"
    );
    assert!(text.contains("would match with --normalize-keys"));
    // A clean table: exit 0.
    let dir = PathBuf::from(env!("CARGO_TARGET_TMPDIR"));
    let clean = dir.join("clean_join.csv");
    let rows: String = (1..=6)
        .map(|k| format!("{:05},{k}.5\n", 1000 + k))
        .collect();
    std::fs::write(&clean, format!("code,rate\n{rows}")).unwrap();
    let (code, _, _) = join(&shapes, p(&clean), &[]);
    assert_eq!(code, 0);
    // Unreadable input: exit 2 with the file named.
    let (code, _, err) = join(&shapes, "no-such-file.csv", &[]);
    assert_eq!(code, 2);
    assert!(err.contains("no-such-file.csv"));
}

/// Boxes from polygons.json, written as GeoJSON, measured by `shapes`
/// with densified edges in every equal-area projection: the area equals
/// the analytic ellipsoidal box area within 1e-6 (relative).
#[test]
fn shapes_areas_match_analytic_boxes() {
    let polys: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(fixture("reference/polygons.json")).unwrap())
            .unwrap();
    let boxes = ["box_co_like", "box_equator_1deg", "box_conus_large"];
    let features: Vec<serde_json::Value> = polys["polygons"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|p| boxes.contains(&p["id"].as_str().unwrap()))
        .map(|p| {
            let mut ring = p["lonlat"].as_array().unwrap().clone();
            ring.push(ring[0].clone());
            serde_json::json!({"type": "Feature", "properties": {"id": p["id"]},
                "geometry": {"type": "Polygon", "coordinates": [ring]}})
        })
        .collect();
    let path = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("boxes.geojson");
    std::fs::write(
        &path,
        serde_json::json!({"type": "FeatureCollection", "features": features}).to_string(),
    )
    .unwrap();
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(fixture("reference/polygon_areas.csv"))
        .unwrap();
    let analytic: Vec<(String, f64)> = rdr
        .records()
        .map(|r| {
            let r = r.unwrap();
            (r[0].to_string(), r[7].parse().unwrap())
        })
        .collect();
    for proj in ["albers", "lambert-azimuthal", "equal-earth"] {
        let (code, out, err) = run(&[
            "shapes",
            p(&path),
            "--key",
            "id",
            "--projection",
            proj,
            "--densify",
            "0.005",
            "--json",
        ]);
        assert_eq!(code, 0, "{err}");
        assert!(err.is_empty(), "{err}");
        let v: serde_json::Value = serde_json::from_str(&out).unwrap();
        assert_eq!(v["projection"]["name"], proj);
        for f in v["features"].as_array().unwrap() {
            let key = f["key"].as_str().unwrap();
            let want = analytic.iter().find(|(k, _)| k == key).unwrap().1;
            let got = f["area"].as_f64().unwrap();
            assert!(
                ((got - want) / want).abs() < 1e-6,
                "{proj} {key}: {got} vs {want}"
            );
            assert_eq!(f["parts"], 1);
            assert_eq!(f["vertices"], 4);
        }
    }
    // The default for a US-sized extent is equal-area, and a
    // non-equal-area choice draws a warning.
    let (_, out, _) = run(&["shapes", p(&path), "--json"]);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert_eq!(v["projection"]["name"], "albers");
    let (code, _, err) = run(&["shapes", p(&path), "--projection", "web-mercator"]);
    assert_eq!(code, 0);
    assert!(err.contains("not equal-area"), "{err}");
}

#[test]
fn shapes_reports_problems_and_exits_1() {
    let path = fixture("geo/problems.geojson");
    let (code, out, _) = run(&["shapes", p(&path), "--key", "code", "--json"]);
    assert_eq!(code, 1);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let problems = v["problems"].as_array().unwrap();
    assert_eq!(problems.len(), 5);
    assert_eq!(problems[0]["feature"], 1);
    assert_eq!(problems[0]["key"], "open");
    assert!(
        problems[0]["problem"]
            .as_str()
            .unwrap()
            .starts_with("unclosed-ring")
    );
    assert_eq!(v["features"].as_array().unwrap().len(), 2);
    // Not a GeoJSON file: exit 2.
    let (code, _, _) = run(&["shapes", p(&fixture("join/dirty.csv"))]);
    assert_eq!(code, 2);
}

/// `--frame`: fit and simplify; a full 20 x 20 grid has 760 interior
/// borders plus 76 frame runs between the 4 x 19 frame junctions = 836
/// arcs, each border simplified once.
#[test]
fn shapes_frame_simplifies_and_counts_arcs() {
    let grid = hueproof::geo::generate::Grid::new(400, 5, 11);
    let path = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("grid400.geojson");
    std::fs::write(&path, grid.geojson()).unwrap();
    let (code, out, err) = run(&[
        "shapes",
        p(&path),
        "--key",
        "code",
        "--frame",
        "800x600",
        "--simplify",
        "1",
        "--method",
        "douglas-peucker",
        "--json",
    ]);
    assert_eq!(code, 0, "{err}");
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let s = &v["simplification"];
    assert_eq!(s["arcs"], 836);
    assert_eq!(s["method"], "douglas-peucker");
    assert_eq!(s["vertices_in"], 400 * 4 * 6);
    assert!(s["vertices_out"].as_u64().unwrap() < 400 * 4 * 6);
    assert_eq!(s["tiny_shapes"].as_array().unwrap().len(), 0);
    // A bad frame is a usage error.
    let (code, _, _) = run(&["shapes", p(&path), "--frame", "800"]);
    assert_eq!(code, 2);
}
