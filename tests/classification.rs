//! Classification checked against outside references.
//!
//! - Reference set A (tests/fixtures/classification_*.{csv,json}, see
//!   tests/fixtures/README.md): a general-purpose Python classification
//!   library from PyPI (name, version and calls in the JSON provenance) on
//!   its bundled 58-county example dataset and on 500 lognormal values.
//!   Tolerances from the reference README: bounds, SDAM, SDCM relative 1e-9,
//!   GVF abs 1e-9, counts exact.
//! - Fisher (1958): the optimal partition is the minimum of the dynamic
//!   programme over all split points; checked against a plain O(k n^2)
//!   dynamic programme on random small inputs (property test).
//! - Jiang (2013): the head/tail worked example (from memory, see below).

mod common;

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};

use hueproof::ExitKind;
use hueproof::classify::column::{self, ColumnSpec};
use hueproof::classify::diverging::{self, Arrangement, SideMethod};
use hueproof::classify::head_tail::StopRule;
use hueproof::classify::rounding::{self, RoundRule};
use hueproof::classify::std_dev::{self, Multiples};
use hueproof::classify::{self, Method, Sample, fisher_jenks, unclassed};
use proptest::prelude::*;
use serde_json::Value;

const FIXTURES: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures");

fn inputs() -> BTreeMap<String, Vec<f64>> {
    let mut r = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(Path::new(FIXTURES).join("classification_inputs.csv"))
        .unwrap();
    let mut out: BTreeMap<String, Vec<f64>> = BTreeMap::new();
    for rec in r.records() {
        let rec = rec.unwrap();
        let idx: usize = rec[1].parse().unwrap();
        let v = out.entry(rec[0].to_string()).or_default();
        assert_eq!(v.len(), idx, "inputs are in index order");
        v.push(rec[2].parse().unwrap());
    }
    out
}

fn results() -> Vec<Value> {
    let text =
        std::fs::read_to_string(Path::new(FIXTURES).join("classification_results.json")).unwrap();
    let v: Value = serde_json::from_str(&text).unwrap();
    v["results"].as_array().unwrap().clone()
}

fn floats(v: &Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

fn ints(v: &Value) -> Vec<usize> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_u64().unwrap() as usize)
        .collect()
}

fn rel_close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * a.abs().max(b.abs()).max(1e-300)
}

/// Our method for a reference entry.
fn method_for(entry: &Value) -> Method {
    let p = &entry["parameters"];
    let k = || p["k"].as_u64().unwrap() as usize;
    match entry["method"].as_str().unwrap() {
        "EqualInterval" => Method::EqualInterval { classes: k() },
        "Quantiles" => Method::Quantile { classes: k() },
        "FisherJenks" => Method::NaturalBreaks { classes: k() },
        "StdMean" => {
            if p.get("anchor").and_then(Value::as_bool) == Some(true) {
                Method::StdDev(Multiples::Anchored)
            } else {
                Method::StdDev(Multiples::Explicit(floats(&p["multiples"])))
            }
        }
        "HeadTailBreaks" => Method::HeadTail(StopRule::SingleValue),
        m => panic!("unknown reference method {m}"),
    }
}

/// Compare one of our classifications with a reference entry.
fn assert_matches(c: &classify::Classification, entry: &Value, label: &str) {
    let bins = floats(&entry["bins"]);
    let counts = ints(&entry["counts"]);
    assert_eq!(
        c.classes,
        entry["k"].as_u64().unwrap() as usize,
        "{label}: k"
    );
    assert_eq!(c.breaks.len(), bins.len(), "{label}: number of bounds");
    for (i, (a, b)) in c.breaks.iter().zip(&bins).enumerate() {
        assert!(rel_close(*a, *b, 1e-9), "{label}: bound {i}: {a} vs {b}");
    }
    assert_eq!(c.counts, counts, "{label}: counts");
    let gvf = entry["gvf"].as_f64().unwrap();
    assert!(
        (c.gvf.unwrap() - gvf).abs() <= 1e-9,
        "{label}: gvf {:?} vs {gvf}",
        c.gvf
    );
    assert!(
        rel_close(c.sdam, entry["sdam"].as_f64().unwrap(), 1e-9),
        "{label}: sdam"
    );
    assert!(
        rel_close(c.sdcm, entry["sdcm"].as_f64().unwrap(), 1e-9),
        "{label}: sdcm"
    );
}

/// Reference set A: every method and parameter the reference shares with us.
#[test]
fn matches_reference_library_for_every_shared_method() {
    let data = inputs();
    let entries = results();
    assert_eq!(entries.len(), 28, "the fixture holds 28 reference runs");
    for e in &entries {
        let ds = e["dataset"].as_str().unwrap();
        let sample = Sample::new(data[ds].clone(), 0).unwrap();
        let method = method_for(e);
        let c = classify::classify(&sample, &method, 10).unwrap();
        let label = format!("{ds} {} {}", e["method"], e["parameters"]);
        assert_matches(&c, e, &label);
    }
}

/// Reference set A, Fisher-Jenks runs: the pruned programme (used by
/// default from 20,000 distinct values on, larger than these datasets),
/// forced onto them with grids of 2 to 8 points per cell, gives the
/// reference library's bounds too.
#[test]
fn pruned_natural_breaks_match_reference_library() {
    let data = inputs();
    let mut checked = 0;
    for e in results().iter().filter(|e| e["method"] == "FisherJenks") {
        let ds = e["dataset"].as_str().unwrap();
        let sample = Sample::new(data[ds].clone(), 0).unwrap();
        let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
        let k = e["k"].as_u64().unwrap() as usize;
        let bins = floats(&e["bins"]);
        for spacing in [2, 3, 5, 8] {
            let ends = fisher_jenks::optimal_ends_pruned(&u, &w, k, spacing)
                .unwrap_or_else(|| panic!("{ds} k {k} spacing {spacing}: grid too small"));
            let bounds: Vec<f64> = ends.iter().map(|&e| u[e - 1]).collect();
            assert_eq!(bounds.len(), bins.len());
            for (a, b) in bounds.iter().zip(&bins) {
                assert!(
                    rel_close(*a, *b, 1e-9),
                    "{ds} k {k} spacing {spacing}: {a} vs {b}"
                );
            }
            checked += 1;
        }
    }
    assert!(checked >= 12, "{checked} runs checked");
}

/// Reference set A: the class counts and GVF follow from the bounds alone,
/// so manual breaks at the reference's bounds reproduce its counts and fit
/// (this checks the upper-inclusive class assignment on its own).
#[test]
fn manual_breaks_at_reference_bounds_give_reference_counts() {
    let data = inputs();
    for e in &results() {
        let ds = e["dataset"].as_str().unwrap();
        let sample = Sample::new(data[ds].clone(), 0).unwrap();
        let bins = floats(&e["bins"]);
        let c = classify::classify(&sample, &Method::Manual { bounds: bins }, 10).unwrap();
        assert_matches(&c, e, &format!("manual at {ds} {}", e["method"]));
    }
}

/// Reference set A: our `--classes K --stddev-step 1` multiples are the
/// reference's multiples for k = 3, 5, 7 ([-1, 1], [-2, -1, 1, 2], ...).
#[test]
fn stddev_class_multiples_reproduce_reference_multiples() {
    for e in results().iter().filter(|e| e["method"] == "StdMean") {
        if let Some(m) = e["parameters"].get("multiples") {
            let m = floats(m);
            assert_eq!(std_dev::class_multiples(m.len() + 1, 1.0), m);
        }
    }
    // Even counts put the mean on a break; step 0.5 halves the multiples.
    assert_eq!(std_dev::class_multiples(4, 0.5), vec![-0.5, 0.0, 0.5]);
}

/// Reference docstring values quoted in the reference README (section 4):
/// calemp quantile k=5 and Fisher-Jenks k=5.
#[test]
fn calemp_docstring_examples() {
    let sample = Sample::new(inputs()["calemp"].clone(), 0).unwrap();
    let q = classify::classify(&sample, &Method::Quantile { classes: 5 }, 10).unwrap();
    let want = [1.464, 5.798, 13.278, 54.616, 4111.45];
    for (a, b) in q.breaks.iter().zip(want) {
        assert!((a - b).abs() < 1e-9, "{a} vs {b}");
    }
    let n = classify::classify(&sample, &Method::NaturalBreaks { classes: 5 }, 10).unwrap();
    assert_eq!(n.breaks, vec![75.29, 192.05, 370.5, 722.85, 4111.45]);
}

/// Jiang (2013) illustrates head/tail breaks with the ten values 1, 1/2,
/// ..., 1/10 (recalled from memory, not checked against the paper): the
/// mean 0.293 leaves a head of 3 values (30 %), whose mean 0.611 leaves a
/// head of the single value 1.
#[test]
fn head_tail_jiang_example() {
    let v: Vec<f64> = (1..=10).map(|i| 1.0 / i as f64).collect();
    let sample = Sample::new(v, 0).unwrap();
    for rule in [StopRule::SingleValue, StopRule::HeadShare(0.4)] {
        let c = classify::classify(&sample, &Method::HeadTail(rule), 5).unwrap();
        assert_eq!(c.breaks.len(), 3);
        assert!((c.breaks[0] - 0.2928968).abs() < 1e-6);
        assert!((c.breaks[1] - 0.6111111).abs() < 1e-6);
        assert_eq!(c.breaks[2], 1.0);
        assert_eq!(c.counts, vec![7, 2, 1]);
    }
}

/// The optional head-share stop rule: on 1..=10 (not heavy-tailed) the head
/// above 8 holds 2 of 5 (40 %, kept) and the head above 9.5 holds 1 of 2
/// (50 %, > 40 %: stop). The reference rule keeps cutting to the maximum.
#[test]
fn head_share_rule_stops_when_head_is_not_a_minority() {
    let sample = Sample::new((1..=10).map(f64::from).collect(), 0).unwrap();
    let share =
        classify::classify(&sample, &Method::HeadTail(StopRule::HeadShare(0.4)), 5).unwrap();
    assert_eq!(share.breaks, vec![5.5, 8.0, 10.0]);
    let single = classify::classify(&sample, &Method::HeadTail(StopRule::SingleValue), 5).unwrap();
    assert_eq!(single.breaks, vec![5.5, 8.0, 9.5, 10.0]);
}

/// Common practice (type-7 quantiles, Hyndman & Fan 1996): with ties the
/// equal bounds collapse, a warning says so, and tied values stay together.
#[test]
fn quantile_ties_collapse_and_stay_together() {
    let v = vec![1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 2.0, 3.0, 4.0, 5.0];
    let sample = Sample::new(v, 0).unwrap();
    let c = classify::classify(&sample, &Method::Quantile { classes: 4 }, 5).unwrap();
    // Positions 9 i / 4 = 2.25, 4.5, 6.75, 9 give 1, 1, 2.75, 5; the two 1s merge.
    assert_eq!(c.breaks, vec![1.0, 2.75, 5.0]);
    assert_eq!(c.counts, vec![6, 1, 3]);
    assert!(
        c.warnings
            .iter()
            .any(|w| w.contains("3 classes instead of 4"))
    );
}

/// Brute-force Fisher (1958) dynamic programme over the raw sorted values,
/// O(k n^2): best[c][i] = min over j of best[c-1][j] + ssd(x[j..i]).
fn brute_force_sdcm(x: &[f64], k: usize) -> f64 {
    let n = x.len();
    let ssd = |a: usize, b: usize| -> f64 {
        let s = &x[a..b];
        let m = s.iter().sum::<f64>() / s.len() as f64;
        s.iter().map(|v| (v - m) * (v - m)).sum()
    };
    let mut best = vec![vec![f64::INFINITY; n + 1]; k + 1];
    best[0][0] = 0.0;
    for c in 1..=k {
        for i in c..=n {
            for j in (c - 1)..i {
                let v = best[c - 1][j] + ssd(j, i);
                if v < best[c][i] {
                    best[c][i] = v;
                }
            }
        }
    }
    best[k][n]
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    /// Natural breaks are the exact optimum: our SDCM equals the brute-force
    /// minimum (ties and repeated values included).
    #[test]
    fn natural_breaks_equal_brute_force(
        raw in proptest::collection::vec(0u32..40, 1..40),
        scale in prop_oneof![Just(1.0f64), Just(0.37), Just(1000.0)],
        k in 1usize..7,
    ) {
        let x: Vec<f64> = raw.iter().map(|&v| v as f64 * scale + (v % 7) as f64 * 0.01).collect();
        let sample = Sample::new(x, 0).unwrap();
        let c = classify::classify(&sample, &Method::NaturalBreaks { classes: k }, 5).unwrap();
        let sorted = sample.sorted();
        let distinct = fisher_jenks::unique_weighted(sorted).0.len();
        prop_assert_eq!(c.classes, k.min(distinct));
        let want = brute_force_sdcm(sorted, k.min(distinct));
        let tol = 1e-9 * c.sdam.max(1.0);
        prop_assert!((c.sdcm - want).abs() <= tol, "sdcm {} brute force {}", c.sdcm, want);
        // Bounds are data values and every class is non-empty.
        for b in &c.breaks {
            prop_assert!(sorted.contains(b));
        }
        prop_assert!(c.counts.iter().all(|&n| n > 0));
        prop_assert_eq!(c.counts.iter().sum::<usize>(), sorted.len());
    }

    /// The weighted-unique-value programme (divide-and-conquer layers) on 60 random
    /// values with ties, against the plain programme on the raw values.
    #[test]
    fn weighted_dp_agrees_with_partition_cost(seed in 0u64..1000) {
        let mut s = seed;
        let x: Vec<f64> = (0..60).map(|_| {
            s = s.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
            ((s >> 33) % 1000) as f64 / 10.0
        }).collect();
        let sample = Sample::new(x, 0).unwrap();
        let (u, w) = fisher_jenks::unique_weighted(sample.sorted());
        let k = 5.min(u.len());
        let ends = fisher_jenks::optimal_ends(&u, &w, k);
        let cost = fisher_jenks::partition_cost(&u, &w, &ends);
        let want = brute_force_sdcm(sample.sorted(), k);
        prop_assert!((cost - want).abs() <= 1e-9 * want.max(1.0));
    }
}

/// Common practice: GVF is 1 when every distinct value has its own class.
#[test]
fn natural_breaks_with_fewer_distinct_values_than_classes() {
    let sample = Sample::new(vec![3.0, 1.0, 3.0, 2.0, 1.0], 0).unwrap();
    let c = classify::classify(&sample, &Method::NaturalBreaks { classes: 7 }, 5).unwrap();
    assert_eq!(c.breaks, vec![1.0, 2.0, 3.0]);
    assert_eq!(c.counts, vec![2, 1, 2]);
    assert_eq!(c.gvf, Some(1.0));
    assert!(c.warnings[0].contains("only 3 distinct"));
}

fn temp_csv(name: &str, content: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("hueproof-classification-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join(name);
    std::fs::write(&p, content).unwrap();
    p
}

fn parse_err(content: &str, spec: &ColumnSpec) -> String {
    column::parse(content.as_bytes(), Path::new("areas.csv"), spec)
        .unwrap_err()
        .to_string()
}

#[test]
fn decimal_comma_is_an_error_naming_file_line_and_column() {
    let spec = ColumnSpec::new("rate");
    let msg = parse_err("id,rate\na,1.5\nb,\"1,5\"\n", &spec);
    assert!(msg.contains("areas.csv"), "{msg}");
    assert!(msg.contains("line 3, column 2 ('rate')"), "{msg}");
    assert!(msg.contains("decimal point must be '.'"), "{msg}");
}

#[test]
fn non_numeric_and_non_finite_cells_are_errors() {
    let spec = ColumnSpec::new("rate");
    let msg = parse_err("id,rate\na,1.5\nb,2\nc,high\n", &spec);
    assert!(
        msg.contains("line 4, column 2 ('rate')") && msg.contains("'high' is not a number"),
        "{msg}"
    );
    let msg = parse_err("id,rate\na,inf\n", &spec);
    assert!(msg.contains("line 2") && msg.contains("'inf'"), "{msg}");
    let msg = parse_err("id,rate\na,1 000\n", &spec);
    assert!(msg.contains("'1 000'"), "{msg}");
    let msg = parse_err("id,value\na,1\n", &spec);
    assert!(
        msg.contains("no column named 'rate'") && msg.contains("'value'"),
        "{msg}"
    );
}

#[test]
fn missing_markers_are_counted_and_configurable() {
    let csv = "id,rate\na,1\nb,\nc,NA\nd,NaN\ne,-999\nf,2.5e1\n";
    let mut spec = ColumnSpec::new("rate");
    spec.missing = vec!["".into(), "NA".into(), "NaN".into(), "-999".into()];
    let s = column::parse(csv.as_bytes(), Path::new("t.csv"), &spec).unwrap();
    assert_eq!(s.sorted(), &[1.0, 25.0]);
    assert_eq!(s.missing(), 4);
    // Defaults: -999 is a number.
    let s = column::parse(csv.as_bytes(), Path::new("t.csv"), &ColumnSpec::new("rate")).unwrap();
    assert_eq!(s.missing(), 3);
    assert_eq!(s.sorted(), &[-999.0, 1.0, 25.0]);
    // Without the empty marker an empty cell is an error.
    spec.missing = vec!["NA".into()];
    let msg = parse_err(csv, &spec);
    assert!(
        msg.contains("line 3") && msg.contains("empty cell"),
        "{msg}"
    );
}

use common::cli;

/// The command end to end on the reference lognormal sample written as a
/// CSV with missing values: same bounds as the reference (natural, k = 5),
/// missing values counted and in no class.
#[test]
fn breaks_command_json_shape_and_reference_values() {
    let data = inputs();
    let mut csv = String::from("cell,density\n");
    for (i, v) in data["lognormal_500"].iter().enumerate() {
        csv.push_str(&format!("c{i},{v}\n"));
        if i % 100 == 0 {
            csv.push_str(&format!("m{i},NA\n"));
        }
    }
    let path = temp_csv("lognormal.csv", &csv);
    let run_on = |method: &str, json: bool| {
        let mut args = vec![
            "breaks",
            path.to_str().unwrap(),
            "--column",
            "density",
            "--method",
            method,
            "--classes",
            "5",
        ];
        if json {
            args.push("--json");
        }
        cli(&args).unwrap()
    };
    let out = run_on("natural", true);
    assert_eq!(out.kind, ExitKind::Success);
    let v: Value = serde_json::from_str(&out.stdout).unwrap();
    let entry = results()
        .into_iter()
        .find(|e| e["dataset"] == "lognormal_500" && e["method"] == "FisherJenks" && e["k"] == 5)
        .unwrap();
    assert_eq!(v["method"], "natural");
    assert_eq!(v["classes"], 5);
    assert_eq!(v["breaks"], entry["bins"]);
    assert_eq!(v["counts"], entry["counts"]);
    assert!((v["gvf"].as_f64().unwrap() - entry["gvf"].as_f64().unwrap()).abs() < 1e-9);
    assert_eq!(
        v["min"].as_f64(),
        data["lognormal_500"].iter().copied().reduce(f64::min)
    );
    assert_eq!(v["missing"], 5);
    assert_eq!(v["n"], 500);
    let h = &v["histogram"];
    assert_eq!(h["counts"].as_array().unwrap().len(), 20);
    assert_eq!(h["edges"].as_array().unwrap().len(), 21);
    assert_eq!(ints(&h["counts"]).iter().sum::<usize>(), 500);
    assert!(out.warnings.iter().any(|w| w.contains("5 missing")));
    // Same input, same bytes.
    assert_eq!(run_on("natural", true).stdout, out.stdout);
    // Text for people.
    let text = run_on("quantile", false);
    assert!(
        text.stdout
            .contains("quantile: 5 classes, 500 values, 5 missing"),
        "{}",
        text.stdout
    );
}

#[test]
fn breaks_command_errors_name_the_problem() {
    let path = temp_csv("small.csv", "id,v\na,1\nb,2\nc,3\nd,4\n");
    let p = path.to_str().unwrap();
    let e = cli(&["breaks", p, "--column", "v", "--method", "equal"]).unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(e.to_string().contains("--classes"), "{e}");
    let e = cli(&["breaks", p, "--column", "v", "--method", "manual"]).unwrap_err();
    assert!(e.to_string().contains("--breaks"), "{e}");
    let e = cli(&[
        "breaks", p, "--column", "v", "--method", "manual", "--breaks", "3,2",
    ])
    .unwrap_err();
    assert!(e.to_string().contains("strictly increasing"), "{e}");
    let e = cli(&[
        "breaks", p, "--column", "v", "--method", "manual", "--breaks", "1,5;2",
    ])
    .unwrap_err();
    assert!(e.to_string().contains("--breaks"), "{e}");
    let e = cli(&["breaks", p, "--column", "w", "--method", "headtail"]).unwrap_err();
    assert!(
        e.to_string().contains("small.csv") && e.to_string().contains("no column named 'w'"),
        "{e}"
    );
    let e = cli(&[
        "breaks",
        p,
        "--column",
        "v",
        "--method",
        "stddev",
        "--classes",
        "3",
        "--midpoint",
        "0",
    ])
    .unwrap_err();
    assert!(e.to_string().contains("--midpoint"), "{e}");
    let e = cli(&[
        "breaks",
        p,
        "--column",
        "v",
        "--method",
        "equal",
        "--classes",
        "3",
        "--midpoint",
        "2",
    ])
    .unwrap_err();
    assert!(e.to_string().contains("must be even"), "{e}");
    let missing = Path::new(FIXTURES).join("no-such-file.csv");
    let e = cli(&[
        "breaks",
        missing.to_str().unwrap(),
        "--column",
        "v",
        "--method",
        "headtail",
    ])
    .unwrap_err();
    assert_eq!(e.exit_kind(), ExitKind::BadInput);
    assert!(e.to_string().contains("no-such-file.csv"), "{e}");
}

/// Rounding: the counts after rounding follow the rounded bounds, and the
/// number of observations reported as moved equals the number whose class
/// differs (counted here independently).
#[test]
fn rounding_reports_moved_observations() {
    let sample = Sample::new(inputs()["lognormal_500"].clone(), 0).unwrap();
    let c = classify::classify(&sample, &Method::NaturalBreaks { classes: 7 }, 10).unwrap();
    let r = rounding::round(&sample, &c, RoundRule::Auto).unwrap();
    let rep = r.rounding.as_ref().unwrap();
    assert_eq!(rep.step, 10.0);
    // Reference bounds 12.98, 25.82, 42.38, 64.98, 95.14, 147.33, 205.61.
    assert_eq!(r.breaks, vec![10.0, 30.0, 40.0, 60.0, 100.0, 150.0, 210.0]);
    let class = |v: f64, b: &[f64]| b.iter().position(|&u| v <= u).unwrap();
    let moved = sample
        .sorted()
        .iter()
        .filter(|&&v| class(v, &c.breaks) != class(v, &r.breaks))
        .count();
    assert_eq!(rep.changed_class, moved);
    assert!(moved > 0);
    assert_eq!(r.counts.iter().sum::<usize>(), 500);
    let step = rounding::round(&sample, &c, RoundRule::Step(0.5)).unwrap();
    assert_eq!(step.breaks[0], 13.0);
    assert!(rounding::round(&sample, &c, RoundRule::Step(100.0)).is_err());
}

/// Diverging classes: the midpoint is a bound (break) or a class centre.
#[test]
fn diverging_arrangements() {
    let v: Vec<f64> = (-4..=10).map(f64::from).collect();
    let sample = Sample::new(v, 0).unwrap();
    let (b, rep) =
        diverging::bounds(&sample, SideMethod::Equal, 4, 0.0, Arrangement::Break).unwrap();
    assert_eq!(b.upper, vec![-5.0, 0.0, 5.0, 10.0]);
    assert_eq!((rep.below, rep.at, rep.above), (4, 1, 10));
    let (b, _) =
        diverging::bounds(&sample, SideMethod::Equal, 5, 0.0, Arrangement::Centre).unwrap();
    // Width 10 / 2.5 = 4: middle class (-2, 2].
    assert_eq!(b.upper, vec![-6.0, -2.0, 2.0, 6.0, 10.0]);
    let (b, _) =
        diverging::bounds(&sample, SideMethod::Quantile, 4, 0.0, Arrangement::Break).unwrap();
    assert!(b.upper.contains(&0.0));
    assert_eq!(b.upper.len(), 4);
    // One side empty: warned.
    let pos = Sample::new((1..=9).map(f64::from).collect(), 0).unwrap();
    let (b, _) = diverging::bounds(&pos, SideMethod::Natural, 4, 0.0, Arrangement::Break).unwrap();
    assert!(b.warnings.iter().any(|w| w.contains("no value lies below")));
    let c = classify::finish(&pos, "natural", b, 5).unwrap();
    assert_eq!(c.counts[..2], [0, 0]);
    assert_eq!(c.counts.iter().sum::<usize>(), 9);
}

/// Unclassed positions: min -> 0, max -> 1, midpoint -> 0.5.
#[test]
fn unclassed_positions() {
    assert_eq!(unclassed::position(5.0, 0.0, 10.0, None), 0.5);
    assert_eq!(unclassed::position(-1.0, 0.0, 10.0, None), 0.0);
    assert_eq!(unclassed::position(2.0, -2.0, 10.0, Some(2.0)), 0.5);
    assert_eq!(unclassed::position(0.0, -2.0, 10.0, Some(2.0)), 0.25);
    assert_eq!(unclassed::position(6.0, -2.0, 10.0, Some(2.0)), 0.75);
    assert_eq!(unclassed::position_symmetric(-2.0, -2.0, 10.0, 2.0), 0.25);
}

/// `--method unclassed`: legend ticks with their ramp positions (linear
/// interpolation, common practice).
#[test]
fn unclassed_command_reports_ticks() {
    let mut csv = String::from("id,v\n");
    for i in 0..=10 {
        csv.push_str(&format!("r{i},{i}\n"));
    }
    let path = temp_csv("ramp.csv", &csv);
    let p = path.to_str().unwrap();
    let out = cli(&[
        "breaks",
        p,
        "--column",
        "v",
        "--method",
        "unclassed",
        "--midpoint",
        "2",
        "--json",
    ])
    .unwrap();
    let v: Value = serde_json::from_str(&out.stdout).unwrap();
    assert_eq!(v["method"], "unclassed");
    let ticks: Vec<(f64, f64)> = v["ticks"]
        .as_array()
        .unwrap()
        .iter()
        .map(|t| {
            (
                t["value"].as_f64().unwrap(),
                t["position"].as_f64().unwrap(),
            )
        })
        .collect();
    assert_eq!(
        ticks,
        vec![
            (0.0, 0.0),
            (2.0, 0.5),
            (2.5, 0.53125),
            (5.0, 0.6875),
            (7.5, 0.84375),
            (10.0, 1.0)
        ]
    );
    let e = cli(&[
        "breaks",
        p,
        "--column",
        "v",
        "--method",
        "unclassed",
        "--classes",
        "4",
    ])
    .unwrap_err();
    assert!(e.to_string().contains("--classes"), "{e}");
}

/// Rounding keeps a midpoint break and prints steps with their own decimals.
#[test]
fn rounding_keeps_midpoint_and_step_decimals() {
    let v: Vec<f64> = (0..40).map(|i| f64::from(i) * 0.37 - 4.1).collect();
    let sample = Sample::new(v, 0).unwrap();
    let (b, rep) =
        diverging::bounds(&sample, SideMethod::Quantile, 4, 2.5, Arrangement::Break).unwrap();
    let mut c = classify::finish(&sample, "quantile", b, 5).unwrap();
    c.midpoint = Some(rep);
    let r = rounding::round(&sample, &c, RoundRule::Step(1.0)).unwrap();
    assert!(r.breaks.contains(&2.5), "{:?}", r.breaks);
    let q = rounding::round(&sample, &c, RoundRule::Step(0.25)).unwrap();
    for b in &q.breaks {
        assert_eq!((b * 4.0).fract(), 0.0, "{b} is a multiple of 0.25");
    }
}

/// A larger case for the divide and conquer (3,000 values with ties, k = 7)
/// against the plain O(k n^2) programme, here with prefix sums.
#[test]
fn natural_breaks_on_3000_values_equal_plain_programme() {
    let mut s = 7u64;
    let x: Vec<f64> = (0..3000)
        .map(|_| {
            s = s
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (((s >> 33) % 100_000) as f64 / 1000.0).powi(2).round() / 10.0
        })
        .collect();
    let sample = Sample::new(x, 0).unwrap();
    let k = 7;
    let want = common::plain_fisher_programme(sample.sorted(), k);
    let c = classify::classify(&sample, &Method::NaturalBreaks { classes: k }, 5).unwrap();
    assert!(
        (c.sdcm - want).abs() <= 1e-9 * c.sdam,
        "sdcm {} plain programme {}",
        c.sdcm,
        want
    );
}
