//! Palettes against their definitions (scheme typology of thematic
//! cartography: Tyner 2010, as summarised in the methods note) and facts of
//! the trade, on many generated palettes with random class counts, hues and
//! backgrounds.
//!
//! The checks recompute every property from its definition with the colour
//! core (CIELAB D65, CIEDE2000) rather than trusting the generator's own
//! numbers.

use hueproof::color::{Lab, Srgb, ciede2000};
use hueproof::findings::{Kind, Severity};
use hueproof::scheme::report::PaletteReport;
use hueproof::scheme::{
    Context, SchemeKind, Thresholds, diverging, qualitative, repair, sequential,
};
use hueproof::vision::{self, Simulation};
use proptest::prelude::*;

fn ctx(bg: Srgb) -> Context {
    Context {
        background: bg,
        views: vision::parse_views(vision::DEFAULT_VIEWS).unwrap(),
        model: None,
        thresholds: Thresholds::default(),
    }
}

fn labs(c: &[Srgb]) -> Vec<Lab> {
    c.iter().map(|c| c.to_lab()).collect()
}

/// Recompute the smallest pairwise ΔE00 per view from the definitions.
fn min_per_view(colors: &[Srgb], c: &Context) -> Vec<f64> {
    c.views
        .iter()
        .map(|v| {
            let sim = Simulation::new(v.view, None);
            let l: Vec<Lab> = colors.iter().map(|&x| sim.apply(x).to_lab()).collect();
            let mut m = f64::INFINITY;
            for i in 0..l.len() {
                for j in i + 1..l.len() {
                    m = m.min(ciede2000(l[i], l[j]));
                }
            }
            m
        })
        .collect()
}

fn serious(r: &PaletteReport) -> Vec<String> {
    r.findings
        .iter()
        .filter(|f| f.severity >= Severity::Warning)
        .map(|f| format!("{} {}", f.code, f.message))
        .collect()
}

fn background() -> impl Strategy<Value = Srgb> {
    prop_oneof![
        Just(Srgb::new(1.0, 1.0, 1.0)),
        (240u8..=255, 236u8..=255, 228u8..=255).prop_map(|(r, g, b)| Srgb::from_rgb8(r, g, b)),
        (10u8..40, 10u8..40, 10u8..45).prop_map(|(r, g, b)| Srgb::from_rgb8(r, g, b)),
    ]
}

/// Fixed seeds keep CI deterministic; raise PROPTEST_CASES locally to
/// stress the generators.
fn config(cases: u32) -> ProptestConfig {
    ProptestConfig {
        cases: std::env::var("PROPTEST_CASES")
            .ok()
            .and_then(|c| c.parse().ok())
            .unwrap_or(cases),
        rng_seed: proptest::test_runner::RngSeed::Fixed(20261201),
        ..ProptestConfig::default()
    }
}

proptest! {
    #![proptest_config(config(24))]

    #[test]
    fn sequential_schemes_meet_their_definition(n in 3usize..=7, h0 in 0.0..360.0f64, h1 in 0.0..360.0f64, two in any::<bool>(), bg in background()) {
        let c = ctx(bg);
        let hues = if two { vec![h0, h1] } else { vec![h0] };
        let colors = sequential::generate(&sequential::Options { classes: n, hues, ..Default::default() }, &c);
        prop_assert_eq!(colors.len(), n);
        let l = labs(&colors);
        // Lightness strictly monotonic, away from the background.
        let light_bg = bg.to_oklab().l >= 0.5;
        for w in l.windows(2) {
            prop_assert!(if light_bg { w[1].l < w[0].l } else { w[1].l > w[0].l }, "{:?}", l);
        }
        // Neighbouring steps equal within 5% (CIEDE2000, normal vision).
        let steps: Vec<f64> = l.windows(2).map(|w| ciede2000(w[0], w[1])).collect();
        let mean = steps.iter().sum::<f64>() / steps.len() as f64;
        for s in &steps {
            prop_assert!((s - mean).abs() / mean <= 0.05, "{steps:?}");
        }
        // The far end is not black (nor white on dark backgrounds).
        let far = colors[n - 1].to_rgb8();
        prop_assert!(far != [0, 0, 0] && far != [255, 255, 255]);
        // It passes its own check, and the reported minima are the
        // definition's.
        let r = PaletteReport::judge(SchemeKind::Sequential, &colors, &c);
        prop_assert!(serious(&r).is_empty(), "{:?} {:?}", r.colors, serious(&r));
        for ((_, reported), recomputed) in r.min_delta_e2000.0.iter().zip(min_per_view(&colors, &c)) {
            prop_assert!((reported.unwrap() - recomputed).abs() < 1e-9);
        }
    }

    #[test]
    fn diverging_schemes_meet_their_definition(n in 3usize..=9, bg in background()) {
        let c = ctx(bg);
        let colors = diverging::generate(&diverging::Options { classes: n, ..Default::default() }, &c);
        prop_assert_eq!(colors.len(), n);
        let l = labs(&colors);
        // Arms match in lightness at equal distance from the midpoint.
        for k in 0..n / 2 {
            prop_assert!((l[k].l - l[n - 1 - k].l).abs() <= 2.0, "{:?}", l);
        }
        // A neutral midpoint for odd counts (C*ab near zero).
        if n % 2 == 1 {
            let m = l[n / 2];
            prop_assert!(m.a.hypot(m.b) < 2.0, "{m:?}");
        }
        let r = PaletteReport::judge(SchemeKind::Diverging, &colors, &c);
        prop_assert!(serious(&r).is_empty(), "{:?} {:?}", r.colors, serious(&r));
    }
}

proptest! {
    #![proptest_config(config(8))]

    #[test]
    fn qualitative_schemes_meet_their_definition(n in 3usize..=8, seed in 0u64..1000, bg in background()) {
        let c = ctx(bg);
        let out = qualitative::generate(&qualitative::Options { classes: n, seed, ..Default::default() }, &c);
        prop_assert_eq!(out.colors.len(), n);
        // Equal salience: L* within a narrow band (no glare findings).
        let r = PaletteReport::judge(SchemeKind::Qualitative, &out.colors, &c);
        prop_assert!(!r.findings.iter().any(|f| f.is(Kind::Glare)), "{:?}", r.findings);
        // The reported smallest difference over the optimised views is the
        // definition's.
        let per_view = min_per_view(&out.colors, &c);
        let colour_views: Vec<f64> = c.views.iter().zip(&per_view).filter(|(v, _)| v.name != "achromatopsia").map(|(_, d)| *d).collect();
        let m = colour_views.iter().copied().fold(f64::INFINITY, f64::min);
        prop_assert!((m - out.min_delta_e).abs() < 1e-9, "{m} vs {}", out.min_delta_e);
        // Deterministic for a seed.
        let again = qualitative::generate(&qualitative::Options { classes: n, seed, ..Default::default() }, &c);
        prop_assert_eq!(again.colors, out.colors);
        // Up to 6 classes stay apart for every reader in colour views; with
        // more, either they do or the outcome says they do not fit (which
        // `palette make` reports in plain words).
        if n <= 6 {
            prop_assert!(serious(&r).is_empty(), "{:?} {:?}", r.colors, serious(&r));
        } else if !serious(&r).is_empty() {
            prop_assert!(out.min_delta_e < c.thresholds.min_delta_e);
        }
    }
}

#[test]
fn blue_orange_survives_red_green_deficiencies_and_red_green_does_not() {
    // Fact of the trade (common practice): a blue-orange diverging pair
    // stays distinguishable under protanopia and deuteranopia, a red-green
    // pair does not. Arms at OKLCH hues 250 (blue) / 60 (orange) and
    // 25 (red) / 140 (green).
    let c = ctx(Srgb::new(1.0, 1.0, 1.0));
    let make = |h: (f64, f64)| {
        diverging::generate(
            &diverging::Options {
                classes: 5,
                hues: Some(h),
                ..Default::default()
            },
            &c,
        )
    };
    let blend_views = |colors: &[Srgb]| {
        let r = PaletteReport::judge(SchemeKind::Diverging, colors, &c);
        r.findings
            .iter()
            .filter(|f| f.is(Kind::Blend) && f.severity == Severity::Error)
            .flat_map(|f| f.views.clone())
            .collect::<Vec<_>>()
    };
    let blue_orange = blend_views(&make((250.0, 60.0)));
    assert!(blue_orange.is_empty(), "{blue_orange:?}");
    let red_green = blend_views(&make((25.0, 140.0)));
    assert!(
        red_green
            .iter()
            .any(|v| v == "protanopia" || v == "deuteranopia"),
        "{red_green:?}"
    );
}

#[test]
fn equal_lightness_qualitative_set_shows_no_glare_but_a_light_outlier_does() {
    // Common practice: qualitative hues of similar lightness give classes
    // equal weight; one much lighter class draws the eye.
    let c = ctx(Srgb::new(1.0, 1.0, 1.0));
    let even: Vec<Srgb> = [
        "oklch(68% 0.12 30)",
        "oklch(68% 0.12 150)",
        "oklch(68% 0.12 270)",
    ]
    .iter()
    .map(|s| hueproof::color::parse_color(s).unwrap().rgba.rgb)
    .collect();
    let r = PaletteReport::judge(SchemeKind::Qualitative, &even, &c);
    assert!(!r.findings.iter().any(|f| f.is(Kind::Glare)));
    let mut odd = even.clone();
    odd[1] = hueproof::color::parse_color("oklch(92% 0.05 150)")
        .unwrap()
        .rgba
        .rgb;
    let r = PaletteReport::judge(SchemeKind::Qualitative, &odd, &c);
    assert!(
        r.findings
            .iter()
            .any(|f| f.is(Kind::Glare) && f.classes == vec![1])
    );
}

#[test]
fn repair_keeps_order_and_hue_and_passes_the_check() {
    // A sequential palette with a flat step and a reversed step.
    let c = ctx(Srgb::new(1.0, 1.0, 1.0));
    let bad: Vec<Srgb> = [
        "oklch(90% 0.04 250)",
        "oklch(70% 0.09 250)",
        "oklch(72% 0.09 250)",
        "oklch(45% 0.09 250)",
    ]
    .iter()
    .map(|s| hueproof::color::parse_color(s).unwrap().rgba.rgb)
    .map(hueproof::scheme::to_8bit)
    .collect();
    let before = PaletteReport::judge(SchemeKind::Sequential, &bad, &c);
    assert!(before.findings.iter().any(|f| f.is(Kind::Order)));
    let fixed = repair::repair(SchemeKind::Sequential, &bad, &c);
    assert!(fixed.remaining.is_empty(), "{:?}", fixed.remaining);
    let after = PaletteReport::judge(SchemeKind::Sequential, &fixed.colors, &c);
    assert!(serious(&after).is_empty(), "{:?}", serious(&after));
    for (a, b) in bad.iter().zip(&fixed.colors) {
        let (ha, hb) = (a.to_oklab().to_oklch().h, b.to_oklab().to_oklch().h);
        let d = (ha - hb).rem_euclid(360.0);
        assert!(d.min(360.0 - d) < 8.0, "hue {ha} -> {hb}");
        // Coloured classes stay coloured (OKLCH chroma 0.02, less 8-bit
        // rounding), so the hue family is still seen.
        assert!(b.to_oklab().to_oklch().c > 0.015, "{b:?} turned neutral");
    }
    for ch in &fixed.changes {
        let from = hueproof::color::parse_color(&ch.from)
            .unwrap()
            .rgba
            .rgb
            .to_lab();
        let to = hueproof::color::parse_color(&ch.to)
            .unwrap()
            .rgba
            .rgb
            .to_lab();
        assert!((ciede2000(from, to) - ch.delta_e2000).abs() < 1e-9);
    }
}
