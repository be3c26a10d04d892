//! CIEDE2000 colour difference (CIE 142-2001), following the implementation
//! notes of Sharma, Wu & Dalal (2005), with parametric weights kL, kC, kH.
//!
//! The hue-angle arithmetic is written as `atan2(..).to_degrees()
//! .rem_euclid(360)` with `<= 180` comparisons, which lands Sharma's pairs 10
//! and 14 (an exactly 180 degree hue difference) on the published branch.

use super::cielab::Lab;

/// The parametric weighting factors of CIEDE2000 (1, 1, 1 for reference
/// conditions).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Weights {
    /// Lightness weight kL.
    pub k_l: f64,
    /// Chroma weight kC.
    pub k_c: f64,
    /// Hue weight kH.
    pub k_h: f64,
}

impl Default for Weights {
    fn default() -> Self {
        Weights {
            k_l: 1.0,
            k_c: 1.0,
            k_h: 1.0,
        }
    }
}

/// The intermediate terms of one CIEDE2000 evaluation.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Terms {
    /// Lightness weighting function S_L.
    pub s_l: f64,
    /// Chroma weighting function S_C.
    pub s_c: f64,
    /// Hue weighting function S_H.
    pub s_h: f64,
    /// ΔL' = L2 - L1.
    pub delta_l_p: f64,
    /// ΔC' = C'2 - C'1.
    pub delta_c_p: f64,
    /// ΔH' = 2 sqrt(C'1 C'2) sin(Δh'/2).
    pub delta_h_p: f64,
    /// Rotation term R_T.
    pub r_t: f64,
    /// The colour difference ΔE00.
    pub delta_e: f64,
}

fn hue_deg(b: f64, a_p: f64) -> f64 {
    if a_p == 0.0 && b == 0.0 {
        0.0
    } else {
        b.atan2(a_p).to_degrees().rem_euclid(360.0)
    }
}

/// CIEDE2000 between a reference `lab1` and a sample `lab2` with kL = kC =
/// kH = 1.
pub fn ciede2000(lab1: Lab, lab2: Lab) -> f64 {
    ciede2000_terms(lab1, lab2, Weights::default()).delta_e
}

/// CIEDE2000 with explicit weights.
pub fn ciede2000_weighted(lab1: Lab, lab2: Lab, w: Weights) -> f64 {
    ciede2000_terms(lab1, lab2, w).delta_e
}

/// CIEDE2000 with all intermediate terms, for checking against published
/// worked data.
pub fn ciede2000_terms(lab1: Lab, lab2: Lab, w: Weights) -> Terms {
    const P25_7: f64 = 6_103_515_625.0; // 25^7
    let c1 = lab1.a.hypot(lab1.b);
    let c2 = lab2.a.hypot(lab2.b);
    let c_bar = (c1 + c2) / 2.0;
    let c_bar7 = c_bar.powi(7);
    let g = 0.5 * (1.0 - (c_bar7 / (c_bar7 + P25_7)).sqrt());
    let a1p = (1.0 + g) * lab1.a;
    let a2p = (1.0 + g) * lab2.a;
    let c1p = a1p.hypot(lab1.b);
    let c2p = a2p.hypot(lab2.b);
    let h1p = hue_deg(lab1.b, a1p);
    let h2p = hue_deg(lab2.b, a2p);

    let delta_l_p = lab2.l - lab1.l;
    let delta_c_p = c2p - c1p;
    let chroma_product = c1p * c2p;
    let dhp = if chroma_product == 0.0 {
        0.0
    } else {
        let d = h2p - h1p;
        if d > 180.0 {
            d - 360.0
        } else if d < -180.0 {
            d + 360.0
        } else {
            d
        }
    };
    let delta_h_p = 2.0 * chroma_product.sqrt() * (dhp / 2.0).to_radians().sin();

    let l_bar_p = (lab1.l + lab2.l) / 2.0;
    let c_bar_p = (c1p + c2p) / 2.0;
    let h_bar_p = if chroma_product == 0.0 {
        h1p + h2p
    } else if (h1p - h2p).abs() <= 180.0 {
        (h1p + h2p) / 2.0
    } else if h1p + h2p < 360.0 {
        (h1p + h2p + 360.0) / 2.0
    } else {
        (h1p + h2p - 360.0) / 2.0
    };

    let cos_d = |deg: f64| deg.to_radians().cos();
    let t = 1.0 - 0.17 * cos_d(h_bar_p - 30.0)
        + 0.24 * cos_d(2.0 * h_bar_p)
        + 0.32 * cos_d(3.0 * h_bar_p + 6.0)
        - 0.20 * cos_d(4.0 * h_bar_p - 63.0);
    let d_theta = 30.0 * (-((h_bar_p - 275.0) / 25.0).powi(2)).exp();
    let c_bar_p7 = c_bar_p.powi(7);
    let r_c = 2.0 * (c_bar_p7 / (c_bar_p7 + P25_7)).sqrt();
    let r_t = -(2.0 * d_theta).to_radians().sin() * r_c;
    let l50 = (l_bar_p - 50.0).powi(2);
    let s_l = 1.0 + 0.015 * l50 / (20.0 + l50).sqrt();
    let s_c = 1.0 + 0.045 * c_bar_p;
    let s_h = 1.0 + 0.015 * c_bar_p * t;

    let dl = delta_l_p / (w.k_l * s_l);
    let dc = delta_c_p / (w.k_c * s_c);
    let dh = delta_h_p / (w.k_h * s_h);
    let delta_e = (dl * dl + dc * dc + dh * dh + r_t * dc * dh)
        .max(0.0)
        .sqrt();
    Terms {
        s_l,
        s_c,
        s_h,
        delta_l_p,
        delta_c_p,
        delta_h_p,
        r_t,
        delta_e,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn identical_colours_differ_by_zero() {
        let c = Lab::new(40.0, 12.0, -7.0);
        assert_eq!(ciede2000(c, c), 0.0);
    }

    #[test]
    fn weights_scale_the_lightness_term() {
        // With only a lightness difference, ΔE00 = |ΔL'| / (kL SL).
        let a = Lab::new(50.0, 0.0, 0.0);
        let b = Lab::new(60.0, 0.0, 0.0);
        let one = ciede2000(a, b);
        let two = ciede2000_weighted(
            a,
            b,
            Weights {
                k_l: 2.0,
                ..Weights::default()
            },
        );
        assert!((one / two - 2.0).abs() < 1e-12);
    }
}
