//! Numbers as legend and description text: a fixed number of decimals,
//! thousands grouped with commas from 10,000 up (four-digit numbers stay
//! ungrouped, common practice in style guides), and the typographic minus
//! sign (U+2212).

/// Format `v` with `decimals` digits after the point.
pub fn number(v: f64, decimals: u32) -> String {
    let s = format!("{:.*}", decimals as usize, v.abs());
    let (int, frac) = match s.split_once('.') {
        Some((i, f)) => (i.to_string(), Some(f.to_string())),
        None => (s.clone(), None),
    };
    let grouped = if int.len() > 4 {
        let mut out = String::new();
        for (i, ch) in int.chars().enumerate() {
            if i > 0 && (int.len() - i) % 3 == 0 {
                out.push(',');
            }
            out.push(ch);
        }
        out
    } else {
        int
    };
    let body = match frac {
        Some(f) => format!("{grouped}.{f}"),
        None => grouped,
    };
    // No minus on a value that rounds to zero.
    if v < 0.0 && body.chars().any(|c| c.is_ascii_digit() && c != '0') {
        format!("\u{2212}{body}")
    } else {
        body
    }
}

/// The fewest decimals (0 to 4) at which `values` print pairwise distinct
/// and each within 1 % of its size (or 0.5 of the last digit).
pub fn decimals_for(values: &[f64]) -> u32 {
    for d in 0..=4u32 {
        let scale = 10f64.powi(d as i32);
        let printed: Vec<String> = values.iter().map(|v| number(*v, d)).collect();
        let mut sorted = printed.clone();
        sorted.sort();
        sorted.dedup();
        let distinct = sorted.len() == printed.len();
        let close = values.iter().all(|v| {
            let r = (v * scale).round() / scale;
            (r - v).abs() <= 0.01 * v.abs()
        });
        if distinct && close {
            return d;
        }
    }
    4
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn formats_like_style_guides() {
        assert_eq!(number(1234.0, 0), "1234");
        assert_eq!(number(12345.6, 1), "12,345.6");
        assert_eq!(number(-2.5, 1), "\u{2212}2.5");
        assert_eq!(number(-0.01, 1), "0.0");
        assert_eq!(number(1_000_000.0, 0), "1,000,000");
        assert_eq!(decimals_for(&[5.0, 20.0, 45.0]), 0);
        assert_eq!(decimals_for(&[0.25, 0.5, 0.75]), 2);
        assert_eq!(decimals_for(&[12.31, 12.36]), 1);
        assert_eq!(decimals_for(&[0.012, 0.034]), 3);
    }
}
