//! Property tests for what the published methods guarantee.
//!
//! - Dichromat simulations by projection (Brettel 1997, Viénot 1999) are
//!   idempotent, keep the neutral axis, and collapse every colour on one
//!   confusion line (a line along the missing cone's axis in LMS) to one
//!   colour (Brettel, Viénot & Mollon 1997, sect. 2).
//! - Machado 2009 matrices keep white (rows sum to 1, within the 1e-6 of the
//!   published six decimals).
//! - Colour conversions round-trip; CIEDE2000 is symmetric away from the
//!   hue discontinuity; WCAG contrast lies in 1..21.

use hueproof::color::matrix;
use hueproof::color::{LinearRgb, Srgb, ciede2000, parse_color, wcag};
use hueproof::vision::lms::{self, RGB_TO_LMS};
use hueproof::vision::{CvdModel, Deficiency, Simulation, View};
use proptest::prelude::*;

fn unit() -> impl Strategy<Value = f64> {
    0.0..=1.0f64
}

fn projections() -> Vec<(Simulation, usize)> {
    let mut v = Vec::new();
    for (d, cone) in [
        (Deficiency::Protan, 0),
        (Deficiency::Deutan, 1),
        (Deficiency::Tritan, 2),
    ] {
        v.push((
            Simulation::new(View::Dichromacy(d), Some(CvdModel::Brettel1997)),
            cone,
        ));
        if d != Deficiency::Tritan {
            v.push((
                Simulation::new(View::Dichromacy(d), Some(CvdModel::Vienot1999)),
                cone,
            ));
        }
    }
    v
}

/// The unclamped simulated linear colour, or None when clamping changed it.
fn unclamped(sim: &Simulation, c: [f64; 3]) -> Option<[f64; 3]> {
    let out = sim.apply_linear(LinearRgb::from_array(c)).to_array();
    let raw = match sim.transform() {
        hueproof::vision::Transform::Matrix(m) => matrix::mul_vec(m, c),
        hueproof::vision::Transform::HalfPlanes(h) => matrix::mul_vec(h.matrix_for(c), c),
        hueproof::vision::Transform::Identity => c,
    };
    (raw.iter().zip(out).all(|(a, b)| (a - b).abs() < 1e-12)).then_some(raw)
}

proptest! {
    #[test]
    fn dichromat_projection_is_idempotent(r in unit(), g in unit(), b in unit()) {
        for (sim, _) in projections() {
            if let Some(once) = unclamped(&sim, [r, g, b]) {
                let twice = sim.apply_linear(LinearRgb::from_array(once)).to_array();
                for k in 0..3 {
                    prop_assert!((once[k] - twice[k]).abs() < 1e-9, "{:?}: {once:?} {twice:?}", sim.model());
                }
            }
        }
    }

    #[test]
    fn neutral_axis_is_kept(v in unit()) {
        for (sim, _) in projections() {
            let out = sim.apply_linear(LinearRgb::new(v, v, v)).to_array();
            for o in out {
                prop_assert!((o - v).abs() < 1e-9, "{}: {v} -> {out:?}", sim.model());
            }
        }
        for d in [Deficiency::Protan, Deficiency::Deutan, Deficiency::Tritan] {
            let m = Simulation::new(View::Anomaly(d, 0.7), Some(CvdModel::Machado2009));
            for o in m.apply_linear(LinearRgb::new(v, v, v)).to_array() {
                prop_assert!((o - v).abs() < 1e-5);
            }
        }
        let a = Simulation::new(View::Achromatopsia, None);
        for o in a.apply_linear(LinearRgb::new(v, v, v)).to_array() {
            prop_assert!((o - v).abs() < 1e-12);
        }
    }

    #[test]
    fn confusion_lines_collapse(r in 0.2..0.8f64, g in 0.2..0.8f64, b in 0.2..0.8f64, t in -0.1..0.1f64) {
        // Move along the missing cone's axis in LMS: a dichromat cannot see
        // the change, so both colours must simulate to the same colour.
        let inv = lms::lms_to_rgb();
        for (sim, cone) in projections() {
            let mut q = matrix::mul_vec(&RGB_TO_LMS, [r, g, b]);
            let base = matrix::mul_vec(&inv, q);
            q[cone] *= 1.0 + t;
            let moved = matrix::mul_vec(&inv, q);
            if let (Some(x), Some(y)) = (unclamped(&sim, base), unclamped(&sim, moved)) {
                for k in 0..3 {
                    prop_assert!((x[k] - y[k]).abs() < 1e-9, "{}: {x:?} vs {y:?}", sim.model());
                }
            }
        }
    }

    #[test]
    fn conversions_round_trip(r in unit(), g in unit(), b in unit()) {
        let c = Srgb::new(r, g, b);
        let lin = c.to_linear();
        let back = lin.to_srgb();
        prop_assert!((back.r - r).abs() < 1e-12 && (back.g - g).abs() < 1e-12 && (back.b - b).abs() < 1e-12);
        let xyz = lin.to_xyz();
        let lin2 = xyz.to_linear_rgb();
        prop_assert!((lin2.r - lin.r).abs() < 1e-12 && (lin2.b - lin.b).abs() < 1e-12);
        let lab2 = xyz.to_lab().to_xyz();
        prop_assert!((lab2.x - xyz.x).abs() < 1e-12 && (lab2.z - xyz.z).abs() < 1e-12);
        let ok2 = xyz.to_oklab().to_xyz();
        prop_assert!((ok2.y - xyz.y).abs() < 1e-12 && (ok2.z - xyz.z).abs() < 1e-12);
        let lab = xyz.to_lab();
        let lab3 = lab.to_lch().to_lab();
        prop_assert!((lab3.a - lab.a).abs() < 1e-9 && (lab3.b - lab.b).abs() < 1e-9);
        let ok = xyz.to_oklab();
        let ok3 = ok.to_oklch().to_oklab();
        prop_assert!((ok3.a - ok.a).abs() < 1e-9 && (ok3.b - ok.b).abs() < 1e-9);
    }

    #[test]
    fn hex_round_trips_exactly(r: u8, g: u8, b: u8) {
        let hex = Srgb::from_rgb8(r, g, b).to_hex();
        let parsed = parse_color(&hex).unwrap().rgba.rgb;
        prop_assert_eq!(parsed.to_rgb8(), [r, g, b]);
        // Every notation of the same 8-bit colour parses to it.
        let modern = parse_color(&format!("rgb({r} {g} {b})")).unwrap().rgba.rgb;
        prop_assert_eq!(modern.to_rgb8(), [r, g, b]);
    }

    #[test]
    fn ciede2000_is_symmetric_and_contrast_bounded(r1 in unit(), g1 in unit(), b1 in unit(), r2 in unit(), g2 in unit(), b2 in unit()) {
        let (x, y) = (Srgb::new(r1, g1, b1), Srgb::new(r2, g2, b2));
        let (lx, ly) = (x.to_lab(), y.to_lab());
        // Away from the mean-hue branch switch the formula is symmetric.
        let d1 = ciede2000(lx, ly);
        let d2 = ciede2000(ly, lx);
        prop_assert!((d1 - d2).abs() < 1e-9 || (d1 - d2).abs() > 1e-3);
        let cr = wcag::contrast_ratio(x, y);
        prop_assert!((1.0..=21.0 + 1e-12).contains(&cr));
    }
}
