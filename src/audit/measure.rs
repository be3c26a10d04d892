//! Measuring the rendered figure: per class its area, separate regions and
//! typical mark size (from the label raster), which classes touch and how
//! long their shared edges are, the crossings from each class to the
//! background, and per view the robust colour of each class, swatch and
//! the background (per-channel median of core pixels of the simulated
//! raster). Per view only the distinct colours the measurements read are
//! simulated ([`Palette`], [`Reads`]): the same values as reading the
//! whole simulated raster, at a fraction of the cost.

use super::labels::{self, Labels, Part};
use crate::color::Srgb;
use crate::vision::Simulation;
use crate::vision::raster::simulate_rgba8_serial;

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
    let fill_of = |id: u16| match labels::part(id) {
        Part::Fill(k) if k < classes => Some(k),
        _ => None,
    };
    // Three independent parts, side by side.
    let ((sizes, core), (contacts, crossings)) = rayon::join(
        || {
            rayon::join(
                || components(l, &chamfer(l), classes, &fill_of),
                || l.core(),
            )
        },
        || transitions(l, classes, max_gap(dpi), &fill_of),
    );
    let area = sizes
        .iter()
        .map(|r| r.iter().map(|(n, _)| n).sum())
        .collect();
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
    Geometry {
        area,
        regions,
        size_px,
        contacts,
        crossings,
        core,
    }
}

/// Per class, its 4-connected components as (pixels, largest distance):
/// runs of one label along each row, joined with the runs they touch in
/// the row above (union-find).
fn components(
    l: &Labels,
    dist: &[u32],
    classes: usize,
    fill_of: &impl Fn(u16) -> Option<usize>,
) -> Vec<Vec<(usize, u32)>> {
    let w = l.width as usize;
    // Runs: (start x, end x exclusive, label), per row; with parent links,
    // pixel counts and largest distances.
    struct Run {
        x0: usize,
        x1: usize,
        id: u16,
    }
    let mut runs: Vec<Run> = Vec::new();
    let mut parent: Vec<usize> = Vec::new();
    let mut count: Vec<usize> = Vec::new();
    let mut dmax: Vec<u32> = Vec::new();
    fn root(parent: &mut [usize], mut a: usize) -> usize {
        while parent[a] != a {
            parent[a] = parent[parent[a]];
            a = parent[a];
        }
        a
    }
    let mut above = 0..0;
    for (y, row) in l.ids.chunks_exact(w.max(1)).enumerate() {
        let here = runs.len();
        let mut x = 0;
        while x < w {
            let id = row[x];
            let mut x1 = x + 1;
            while x1 < w && row[x1] == id {
                x1 += 1;
            }
            if fill_of(id).is_some() {
                let r = runs.len();
                runs.push(Run { x0: x, x1, id });
                parent.push(r);
                count.push(x1 - x);
                dmax.push(
                    dist[y * w + x..y * w + x1]
                        .iter()
                        .copied()
                        .max()
                        .unwrap_or(0),
                );
            }
            x = x1;
        }
        // Join with the runs above that share a column and the label.
        let mut j = above.start;
        for r in here..runs.len() {
            while j < above.end && runs[j].x1 <= runs[r].x0 {
                j += 1;
            }
            let mut k = j;
            while k < above.end && runs[k].x0 < runs[r].x1 {
                if runs[k].id == runs[r].id {
                    let (a, b) = (root(&mut parent, k), root(&mut parent, r));
                    if a != b {
                        let (lo, hi) = (a.min(b), a.max(b));
                        parent[hi] = lo;
                        count[lo] += count[hi];
                        dmax[lo] = dmax[lo].max(dmax[hi]);
                    }
                }
                k += 1;
            }
        }
        above = here..runs.len();
    }
    let mut sizes: Vec<Vec<(usize, u32)>> = vec![Vec::new(); classes];
    for r in 0..runs.len() {
        if parent[r] == r {
            let k = fill_of(runs[r].id).expect("runs are of class marks");
            sizes[k].push((count[r], dmax[r]));
        }
    }
    sizes
}

/// Contacts between classes and crossings into the background, from
/// every row and every column (columns walked row by row, one state per
/// column, so memory is read in order).
#[allow(clippy::type_complexity)]
fn transitions(
    l: &Labels,
    classes: usize,
    gap: usize,
    fill_of: &impl Fn(u16) -> Option<usize>,
) -> (Vec<((usize, usize), usize)>, Vec<Vec<Vec<usize>>>) {
    let w = l.width as usize;
    let mut contacts = std::collections::BTreeMap::new();
    // Crossings with where their scan started (rows first, then columns,
    // each in scan order), sorted into that order at the end.
    let mut found: Vec<(usize, usize, usize, Vec<usize>)> = Vec::new();
    let mut event = |prev: u16, id: u16, key: (usize, usize), run: &dyn Fn() -> Vec<usize>| match (
        fill_of(prev),
        fill_of(id),
    ) {
        (Some(a), Some(b)) => *contacts.entry((a.min(b), a.max(b))).or_insert(0) += 1,
        (Some(a), None) if id == labels::BACKGROUND => found.push((key.0, key.1, a, run())),
        (None, Some(a)) if prev == labels::BACKGROUND => found.push((key.0, key.1, a, run())),
        _ => {}
    };
    for (y, row) in l.ids.chunks_exact(w.max(1)).enumerate() {
        let mut last: Option<(u16, usize)> = None;
        for (x, &id) in row.iter().enumerate() {
            if id == labels::BORDER {
                continue;
            }
            if let Some((prev, at)) = last {
                if prev != id && x - at - 1 <= gap {
                    event(prev, id, (0, y), &|| (y * w + at..=y * w + x).collect());
                }
            }
            last = Some((id, x));
        }
    }
    let mut last: Vec<Option<(u16, usize)>> = vec![None; w];
    for (y, row) in l.ids.chunks_exact(w.max(1)).enumerate() {
        for (x, &id) in row.iter().enumerate() {
            if id == labels::BORDER {
                continue;
            }
            if let Some((prev, at)) = last[x] {
                if prev != id && y - at - 1 <= gap {
                    event(prev, id, (1 + x, y), &|| {
                        (at..=y).map(|yy| yy * w + x).collect()
                    });
                }
            }
            last[x] = Some((id, y));
        }
    }
    found.sort_by_key(|f| (f.0, f.1));
    let mut crossings = vec![Vec::new(); classes];
    for (_, _, a, run) in found {
        crossings[a].push(run);
    }
    (contacts.into_iter().collect(), crossings)
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
    if w == 0 {
        return d;
    }
    for y in 0..h {
        let out = &mut d[y * w..(y + 1) * w];
        if y == 0 || y + 1 == h {
            out.fill(3);
            continue;
        }
        let row = &l.ids[y * w..(y + 1) * w];
        let up = &l.ids[(y - 1) * w..y * w];
        let down = &l.ids[(y + 1) * w..(y + 2) * w];
        out[0] = 3;
        out[w - 1] = 3;
        for x in 1..w - 1 {
            let id = row[x];
            if row[x - 1] != id || row[x + 1] != id || up[x] != id || down[x] != id {
                out[x] = 3;
            }
        }
    }
    // Forward: up, up-left, up-right, then left; backward: down,
    // down-right, down-left, then right (row by row; the order of the
    // minima within a row does not matter, the sweep along it does).
    for x in 1..w.min(d.len()) {
        d[x] = d[x].min(d[x - 1] + 3);
    }
    for y in 1..h {
        let (done, rest) = d.split_at_mut(y * w);
        let cur = &mut rest[..w];
        from_row(cur, &done[(y - 1) * w..]);
        for x in 1..w {
            cur[x] = cur[x].min(cur[x - 1] + 3);
        }
    }
    if h > 0 {
        let last = &mut d[(h - 1) * w..];
        for x in (0..w - 1).rev() {
            last[x] = last[x].min(last[x + 1] + 3);
        }
    }
    for y in (0..h.saturating_sub(1)).rev() {
        let (head, below) = d.split_at_mut((y + 1) * w);
        let cur = &mut head[y * w..];
        from_row(cur, &below[..w]);
        for x in (0..w - 1).rev() {
            cur[x] = cur[x].min(cur[x + 1] + 3);
        }
    }
    d
}

/// One chamfer step from the neighbouring row `nb` into the row `cur`:
/// straight (3) and diagonal (4) neighbours.
fn from_row(cur: &mut [u32], nb: &[u32]) {
    let w = cur.len();
    for (c, &n) in cur.iter_mut().zip(&nb[..w]) {
        *c = (*c).min(n + 3);
    }
    for (c, &n) in cur[1..].iter_mut().zip(&nb[..w - 1]) {
        *c = (*c).min(n + 4);
    }
    for (c, &n) in cur[..w - 1].iter_mut().zip(&nb[1..w]) {
        *c = (*c).min(n + 4);
    }
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

/// Pixels the fast path of the vision stage transforms together; the last
/// `pixels % FAST_PATH_BLOCK` pixels of a raster it transforms one by one
/// (`crate::vision::raster`: blocks of 16 pixels in chunks of 16 rows).
/// The two ways round the last bit differently in rare ties, so a colour
/// read there is simulated the way it would have been in place.
const FAST_PATH_BLOCK: usize = 16;

/// The distinct colours of the pixels the measurements read from the
/// normal raster, each simulated once per view. The vision fast path is a
/// function of the pixel's colour alone (apart from the raster's last
/// pixels, kept apart here, see [`FAST_PATH_BLOCK`]), so a median over the
/// simulated distinct colours weighted by their pixel counts equals the
/// median over the pixels of the whole simulated raster.
#[derive(Debug, Clone)]
pub struct Palette {
    /// Distinct colours: RGB in the low 24 bits, bit 24 set for a colour
    /// read in the raster's last pixels.
    keys: Vec<u32>,
    index: std::collections::HashMap<u32, u32>,
    /// The first of the raster's last pixels.
    tail_from: usize,
    /// The last key looked up and its slot (flat fills repeat it).
    memo: Option<(u32, u32)>,
}

/// The simulated colour of each palette slot in one view.
#[derive(Debug, Clone, PartialEq)]
pub struct Seen(pub Vec<[u8; 3]>);

impl Palette {
    /// An empty palette for a raster of `pixels` pixels.
    pub fn new(pixels: usize) -> Palette {
        Palette {
            keys: Vec::new(),
            index: std::collections::HashMap::new(),
            tail_from: pixels - pixels % FAST_PATH_BLOCK,
            memo: None,
        }
    }

    /// The key of pixel `i` of the straight RGBA8 raster `rgba`.
    #[inline]
    fn key(&self, rgba: &[u8], i: usize) -> u32 {
        let rgb = u32::from_le_bytes([rgba[4 * i], rgba[4 * i + 1], rgba[4 * i + 2], 0]);
        rgb | (u32::from(i >= self.tail_from) << 24)
    }

    /// The slot of pixel `i`'s colour, added when new.
    #[inline]
    pub fn slot(&mut self, rgba: &[u8], i: usize) -> u32 {
        let key = self.key(rgba, i);
        self.slot_of_key(key)
    }

    fn slot_of_key(&mut self, key: u32) -> u32 {
        if let Some((k, s)) = self.memo {
            if k == key {
                return s;
            }
        }
        let next = self.keys.len() as u32;
        let s = *self.index.entry(key).or_insert(next);
        if s == next {
            self.keys.push(key);
        }
        self.memo = Some((key, s));
        s
    }

    /// Distinct colours so far.
    pub fn len(&self) -> usize {
        self.keys.len()
    }

    /// Whether no colour was read.
    pub fn is_empty(&self) -> bool {
        self.keys.is_empty()
    }

    /// Every slot's colour as `sim` transforms it with the fast path, as
    /// it would in place in the whole raster.
    pub fn simulate(&self, sim: &Simulation) -> Seen {
        let rgba = |k: u32| {
            let [r, g, b, _] = k.to_le_bytes();
            [r, g, b, 255]
        };
        // Colours from the body of the raster: blocks of the fast path
        // (padded with the last colour to whole blocks).
        let mut body: Vec<u8> = Vec::with_capacity(4 * (self.keys.len() + FAST_PATH_BLOCK));
        for &k in self.keys.iter().filter(|&&k| k >> 24 == 0) {
            body.extend_from_slice(&rgba(k));
        }
        let filled = body.len() / 4;
        if filled > 0 {
            let last: [u8; 4] = body[body.len() - 4..].try_into().expect("4 bytes");
            while (body.len() / 4) % FAST_PATH_BLOCK != 0 {
                body.extend_from_slice(&last);
            }
        }
        simulate_rgba8_serial(sim, &mut body);
        let mut next = 0;
        let out = self
            .keys
            .iter()
            .map(|&k| {
                if k >> 24 == 0 {
                    let p = &body[4 * next..4 * next + 3];
                    next += 1;
                    [p[0], p[1], p[2]]
                } else {
                    // One pixel on its own: the fast path's one-by-one way.
                    let mut px = rgba(k);
                    simulate_rgba8_serial(sim, &mut px);
                    [px[0], px[1], px[2]]
                }
            })
            .collect();
        Seen(out)
    }
}

/// Pixel counts per palette slot, sorted by slot.
type Counts = Vec<(u32, usize)>;

/// Adds runs of equal slots to a count table (flat fills give long runs).
#[derive(Default)]
struct Tally {
    counts: std::collections::BTreeMap<u32, usize>,
    run: Option<(u32, usize)>,
}

impl Tally {
    #[inline]
    fn add(&mut self, slot: u32, pixels: usize) {
        match &mut self.run {
            Some((s, n)) if *s == slot => *n += pixels,
            run => {
                if let Some((s, n)) = run.take() {
                    *self.counts.entry(s).or_insert(0) += n;
                }
                *run = Some((slot, pixels));
            }
        }
    }

    fn finish(mut self) -> Counts {
        if let Some((s, n)) = self.run.take() {
            *self.counts.entry(s).or_insert(0) += n;
        }
        self.counts.into_iter().collect()
    }
}

/// Per-channel median colour of pixels given as slot counts, seen in one
/// view; None when there are no pixels. The same as the per-channel
/// median over the pixels themselves.
pub fn median_of_counts(seen: &Seen, counts: &[(u32, usize)]) -> Option<[u8; 3]> {
    let mut hist = [[0usize; 256]; 3];
    let mut n = 0usize;
    for &(s, k) in counts {
        n += k;
        let p = seen.0[s as usize];
        for c in 0..3 {
            hist[c][p[c] as usize] += k;
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

/// What the per-view measurements read from the normal raster, gathered
/// once: the palette and, per measurement, its pixels as palette slots.
#[derive(Debug, Clone)]
pub struct Reads {
    /// The distinct colours read.
    pub palette: Palette,
    /// Per label below the `parts` limit given to [`Reads::new`] (the
    /// background, marks and swatches; empty for borders, text and other
    /// drawing): its core pixels, or all its pixels when it has no core
    /// pixel.
    parts: Vec<Counts>,
    /// Every text pixel (any text element).
    text: Counts,
    /// Per text element: the non-text pixels of its box grown by the
    /// margin (None for text that drew nothing).
    around: Vec<Option<Counts>>,
    /// Per class, per crossing into the background: its pixels' slots.
    crossings: Vec<Vec<Vec<u32>>>,
}

impl Reads {
    /// Gather the reads from the straight RGBA8 raster `rgba` (the normal
    /// view) with its label raster `l`, core mask, crossings and text
    /// boxes; `parts` is one more than the highest label whose colour is
    /// measured.
    pub fn new(
        rgba: &[u8],
        l: &Labels,
        g: &Geometry,
        boxes: &[Option<[usize; 4]>],
        margin: usize,
        parts: usize,
    ) -> Reads {
        let (w, h) = (l.width as usize, l.height as usize);
        let mut palette = Palette::new(w * h);
        let mut core: Vec<Tally> = (0..parts).map(|_| Tally::default()).collect();
        let mut text = Tally::default();
        // Borders, text and other drawing (labels 1 to 3) are not measured.
        let measured = |id: u16| {
            (id as usize) < parts
                && matches!(
                    labels::part(id),
                    Part::Background | Part::Fill(_) | Part::Swatch(_)
                )
        };
        // Runs of pixels alike in label, core and colour are counted at
        // once (a run never crosses into the raster's last pixels, whose
        // colours are kept apart).
        let tail_from = palette.tail_from;
        let mut add = |start: usize, len: usize, id: u16, c: bool| {
            if measured(id) {
                if c {
                    core[id as usize].add(palette.slot(rgba, start), len);
                }
            } else if id >= labels::TEXT_BASE {
                text.add(palette.slot(rgba, start), len);
            }
        };
        let mut run: Option<(usize, u16, bool, u32)> = None;
        for (i, ((&id, &c), px)) in l
            .ids
            .iter()
            .zip(&g.core)
            .zip(rgba.chunks_exact(4))
            .enumerate()
        {
            let word = u32::from_le_bytes([px[0], px[1], px[2], px[3]]);
            match run {
                Some((_, rid, rc, rw)) if rid == id && rc == c && rw == word && i != tail_from => {}
                _ => {
                    if let Some((start, rid, rc, _)) = run {
                        add(start, i - start, rid, rc);
                    }
                    run = Some((i, id, c, word));
                }
            }
        }
        if let Some((start, rid, rc, _)) = run {
            add(start, l.ids.len() - start, rid, rc);
        }
        let mut parts_counts: Vec<Counts> = core.into_iter().map(Tally::finish).collect();
        // Labels without core pixels (marks under 3 px): all their pixels.
        let bare: Vec<bool> = (0..parts)
            .map(|k| parts_counts[k].is_empty() && measured(k as u16))
            .collect();
        if bare.iter().any(|&b| b) {
            let mut all: Vec<Tally> = (0..parts).map(|_| Tally::default()).collect();
            for (i, &id) in l.ids.iter().enumerate() {
                if (id as usize) < parts && bare[id as usize] {
                    all[id as usize].add(palette.slot(rgba, i), 1);
                }
            }
            for (k, t) in all.into_iter().enumerate() {
                if bare[k] {
                    parts_counts[k] = t.finish();
                }
            }
        }
        let around = boxes
            .iter()
            .map(|b| {
                let b = (*b)?;
                let (x0, y0) = (b[0].saturating_sub(margin), b[1].saturating_sub(margin));
                let (x1, y1) = ((b[2] + margin).min(w - 1), (b[3] + margin).min(h - 1));
                let mut t = Tally::default();
                for y in y0..=y1 {
                    for i in y * w + x0..=y * w + x1 {
                        if l.ids[i] < labels::TEXT_BASE {
                            t.add(palette.slot(rgba, i), 1);
                        }
                    }
                }
                Some(t.finish())
            })
            .collect();
        let crossings = g
            .crossings
            .iter()
            .map(|cs| {
                cs.iter()
                    .map(|run| run.iter().map(|&i| palette.slot(rgba, i)).collect())
                    .collect()
            })
            .collect();
        Reads {
            palette,
            parts: parts_counts,
            text: text.finish(),
            around,
            crossings,
        }
    }

    /// The robust colour of label `label` (the background, a class's marks
    /// or its swatch) in a view: the median of its core pixels, or of all
    /// its pixels when it has no core.
    pub fn part(&self, seen: &Seen, label: u16) -> Option<[u8; 3]> {
        median_of_counts(seen, self.parts.get(label as usize)?)
    }

    /// The median colour of every text pixel in a view.
    pub fn text(&self, seen: &Seen) -> Option<[u8; 3]> {
        median_of_counts(seen, &self.text)
    }

    /// The median colour of what text element `j` stands on in a view.
    pub fn around(&self, seen: &Seen, j: usize) -> Option<[u8; 3]> {
        median_of_counts(seen, self.around.get(j)?.as_ref()?)
    }

    /// Per class, in a view: the median over its crossings into the
    /// background of the highest WCAG contrast along the crossing against
    /// the background luminance `lb`; None for a class without crossings.
    pub fn boundary(&self, seen: &Seen, lb: f64) -> Vec<Option<f64>> {
        use crate::color::wcag::{contrast_ratio_of_luminances, relative_luminance};
        let lum = |s: u32| {
            let [r, g, b] = seen.0[s as usize];
            relative_luminance(Srgb::from_rgb8(r, g, b))
        };
        self.crossings
            .iter()
            .map(|cs| {
                if cs.is_empty() {
                    return None;
                }
                let per: Vec<f64> = cs
                    .iter()
                    .map(|run| {
                        run.iter()
                            .map(|&s| contrast_ratio_of_luminances(lum(s), lb))
                            .fold(1.0, f64::max)
                    })
                    .collect();
                Some(median(per))
            })
            .collect()
    }
}
