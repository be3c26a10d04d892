//! Measuring the rendered figure: per class its area, separate regions and
//! typical mark size (from the label raster), which classes touch and how
//! long their shared edges are, the crossings from each class to the
//! background, and per view the robust colour of each class, swatch and
//! the background (per-channel median of core pixels of the simulated
//! raster).

use super::labels::{self, Labels, Part};

/// View-independent geometry of the scene.
#[derive(Debug, Clone)]
pub struct Geometry {
    /// Pixels labelled as each class's marks.
    pub area: Vec<usize>,
    /// Separate regions (4-connected components) per class.
    pub regions: Vec<usize>,
    /// Typical mark size per class in pixels: the median over its regions
    /// (of at least 4 pixels, when there are any) of the largest inscribed
    /// diameter from a chamfer distance transform.
    pub size_px: Vec<f64>,
    /// Shared edge length in pixels between classes `(a, b)`, `a < b`,
    /// counted as row and column crossings, directly or through a border.
    pub contacts: Vec<((usize, usize), usize)>,
    /// Per class: the pixel runs crossing from the class into the
    /// background (class-side pixel, border pixels, background-side pixel).
    pub crossings: Vec<Vec<Vec<usize>>>,
    /// Core pixels.
    pub core: Vec<bool>,
}

/// The widest border bridged when classes touch through it, in pixels.
pub fn max_gap(dpi: f64) -> usize {
    // 1.5 pt, the widest border hueproof draws around marks, and one more.
    (1.5 / 72.0 * dpi).ceil() as usize + 1
}

/// Measure the geometry of the label raster at `dpi`.
pub fn geometry(l: &Labels, classes: usize, dpi: f64) -> Geometry {
    let (w, h) = (l.width as usize, l.height as usize);
    let mut area = vec![0; classes];
    for &id in &l.ids {
        if let Part::Fill(k) = labels::part(id) {
            if k < classes {
                area[k] += 1;
            }
        }
    }
    let dist = chamfer(l);
    // Connected components, with the largest distance in each.
    let mut seen = vec![false; w * h];
    let mut sizes: Vec<Vec<(usize, u32)>> = vec![Vec::new(); classes];
    let mut stack = Vec::new();
    for start in 0..w * h {
        let id = l.ids[start];
        let Part::Fill(k) = labels::part(id) else {
            continue;
        };
        if seen[start] || k >= classes {
            continue;
        }
        seen[start] = true;
        stack.push(start);
        let (mut n, mut dmax) = (0usize, 0u32);
        while let Some(i) = stack.pop() {
            n += 1;
            dmax = dmax.max(dist[i]);
            let (x, y) = (i % w, i / w);
            let mut visit = |j: usize| {
                if !seen[j] && l.ids[j] == id {
                    seen[j] = true;
                    stack.push(j);
                }
            };
            if x > 0 {
                visit(i - 1);
            }
            if x + 1 < w {
                visit(i + 1);
            }
            if y > 0 {
                visit(i - w);
            }
            if y + 1 < h {
                visit(i + w);
            }
        }
        sizes[k].push((n, dmax));
    }
    let regions = sizes.iter().map(Vec::len).collect();
    let size_px = sizes
        .iter()
        .map(|r| {
            let big: Vec<f64> = r
                .iter()
                .filter(|(n, _)| *n >= 4)
                .map(|(_, d)| diameter(*d))
                .collect();
            let all: Vec<f64> = r.iter().map(|(_, d)| diameter(*d)).collect();
            median(if big.is_empty() { all } else { big })
        })
        .collect();
    let gap = max_gap(dpi);
    let mut contacts = std::collections::BTreeMap::new();
    let mut crossings = vec![Vec::new(); classes];
    let mut scan = |line: &[usize]| {
        // (label, position in line) of the last non-border pixel.
        let mut last: Option<(u16, usize)> = None;
        for (pos, &i) in line.iter().enumerate() {
            let id = l.ids[i];
            if id == labels::BORDER {
                continue;
            }
            if let Some((prev, at)) = last {
                if prev != id && pos - at - 1 <= gap {
                    match (labels::part(prev), labels::part(id)) {
                        (Part::Fill(a), Part::Fill(b)) if a < classes && b < classes => {
                            *contacts.entry((a.min(b), a.max(b))).or_insert(0) += 1;
                        }
                        (Part::Fill(a), Part::Background) | (Part::Background, Part::Fill(a))
                            if a < classes =>
                        {
                            crossings[a].push(line[at..=pos].to_vec());
                        }
                        _ => {}
                    }
                }
            }
            last = Some((id, pos));
        }
    };
    let mut line = Vec::with_capacity(w.max(h));
    for y in 0..h {
        line.clear();
        line.extend((0..w).map(|x| y * w + x));
        scan(&line);
    }
    for x in 0..w {
        line.clear();
        line.extend((0..h).map(|y| y * w + x));
        scan(&line);
    }
    Geometry {
        area,
        regions,
        size_px,
        contacts: contacts.into_iter().collect(),
        crossings,
        core: l.core(),
    }
}

fn diameter(d: u32) -> f64 {
    // Chamfer 3-4 units; a pixel on the edge has distance 1 px.
    (2.0 * d as f64 / 3.0 - 1.0).max(1.0)
}

/// The median of `v` (0 when empty; the mean of the middle two when even).
pub fn median(mut v: Vec<f64>) -> f64 {
    if v.is_empty() {
        return 0.0;
    }
    v.sort_by(f64::total_cmp);
    let n = v.len();
    if n % 2 == 1 {
        v[n / 2]
    } else {
        (v[n / 2 - 1] + v[n / 2]) / 2.0
    }
}

/// Chamfer (3-4) distance of every pixel to the nearest pixel of another
/// label; pixels next to another label (4-neighbours) or the image edge are
/// at 3 (one pixel).
fn chamfer(l: &Labels) -> Vec<u32> {
    let (w, h) = (l.width as usize, l.height as usize);
    let mut d = vec![u32::MAX / 2; w * h];
    for y in 0..h {
        for x in 0..w {
            let i = y * w + x;
            let id = l.ids[i];
            let edge = x == 0
                || y == 0
                || x + 1 == w
                || y + 1 == h
                || l.ids[i - 1] != id
                || l.ids[i + 1] != id
                || l.ids[i - w] != id
                || l.ids[i + w] != id;
            if edge {
                d[i] = 3;
            }
        }
    }
    for y in 0..h {
        for x in 0..w {
            let i = y * w + x;
            let mut v = d[i];
            if x > 0 {
                v = v.min(d[i - 1] + 3);
            }
            if y > 0 {
                v = v.min(d[i - w] + 3);
                if x > 0 {
                    v = v.min(d[i - w - 1] + 4);
                }
                if x + 1 < w {
                    v = v.min(d[i - w + 1] + 4);
                }
            }
            d[i] = v;
        }
    }
    for y in (0..h).rev() {
        for x in (0..w).rev() {
            let i = y * w + x;
            let mut v = d[i];
            if x + 1 < w {
                v = v.min(d[i + 1] + 3);
            }
            if y + 1 < h {
                v = v.min(d[i + w] + 3);
                if x + 1 < w {
                    v = v.min(d[i + w + 1] + 4);
                }
                if x > 0 {
                    v = v.min(d[i + w - 1] + 4);
                }
            }
            d[i] = v;
        }
    }
    d
}

/// Per-channel median colour (8-bit) of the pixels of `rgba` where
/// `select` holds; None when no pixel is selected.
pub fn median_rgb(rgba: &[u8], select: impl Fn(usize) -> bool) -> Option<[u8; 3]> {
    let mut hist = [[0usize; 256]; 3];
    let mut n = 0usize;
    for (i, p) in rgba.chunks_exact(4).enumerate() {
        if select(i) {
            n += 1;
            for c in 0..3 {
                hist[c][p[c] as usize] += 1;
            }
        }
    }
    if n == 0 {
        return None;
    }
    let half = n.div_ceil(2);
    Some([0, 1, 2].map(|c| {
        let mut acc = 0;
        for (v, &k) in hist[c].iter().enumerate() {
            acc += k;
            if acc >= half {
                return v as u8;
            }
        }
        255
    }))
}

/// The robust colour of the pixels labelled `label`: the median of its core
/// pixels, or of all its pixels when it has no core (marks under 3 px).
pub fn part_color(rgba: &[u8], l: &Labels, core: &[bool], label: u16) -> Option<[u8; 3]> {
    median_rgb(rgba, |i| l.ids[i] == label && core[i])
        .or_else(|| median_rgb(rgba, |i| l.ids[i] == label))
}

/// The pixel bounding box `[x0, y0, x1, y1]` (inclusive) of each of `n`
/// text elements' labels; None for text that drew nothing.
pub fn text_boxes(l: &Labels, n: usize) -> Vec<Option<[usize; 4]>> {
    let w = l.width as usize;
    let mut boxes: Vec<Option<[usize; 4]>> = vec![None; n];
    for (i, &id) in l.ids.iter().enumerate() {
        if id < labels::TEXT_BASE {
            continue;
        }
        let j = (id - labels::TEXT_BASE) as usize;
        if j >= n {
            continue;
        }
        let (x, y) = (i % w, i / w);
        let b = boxes[j].get_or_insert([x, y, x, y]);
        b[0] = b[0].min(x);
        b[1] = b[1].min(y);
        b[2] = b[2].max(x);
        b[3] = b[3].max(y);
    }
    boxes
}

/// The median colour of the pixels in box `b` grown by `margin` that are
/// not text: what the text stands on.
pub fn around_text(rgba: &[u8], l: &Labels, b: [usize; 4], margin: usize) -> Option<[u8; 3]> {
    let (w, h) = (l.width as usize, l.height as usize);
    let (x0, y0) = (b[0].saturating_sub(margin), b[1].saturating_sub(margin));
    let (x1, y1) = ((b[2] + margin).min(w - 1), (b[3] + margin).min(h - 1));
    median_rgb(rgba, |i| {
        let (x, y) = (i % w, i / w);
        x >= x0 && x <= x1 && y >= y0 && y <= y1 && l.ids[i] < labels::TEXT_BASE
    })
}
