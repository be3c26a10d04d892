//! Measuring the rendered figure: per class its area, separate regions and
//! typical mark size (from the label raster), which classes touch and how
//! long their shared edges are, the crossings from each class to the
//! background, and per view the robust colour of each class, swatch and
//! the background (per-channel median of core pixels of the simulated
//! raster). Per view only the distinct colours the measurements read are
//! simulated ([`Palette`], [`Reads`]): the same values as reading the
//! whole simulated raster, at a fraction of the cost. The geometry takes
//! two passes over the label raster for its distances, core mask and
//! components, and one for its row and column transitions.

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
    /// Core pixels: those whose whole 3 x 3 neighbourhood (inside the
    /// image) carries the same label. The rest are edge pixels.
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
    // Two independent parts, side by side when a thread is free: the
    // distances, core mask and components (two passes over the raster),
    // and the transitions along rows and columns.
    let ((sizes, core), (contacts, crossings)) = rayon::join(
        || {
            let (w, h) = (l.width as usize, l.height as usize);
            if Chamfer16::fits(w, h) {
                scan::<Chamfer16>(l, classes, &fill_of)
            } else {
                scan::<Chamfer32>(l, classes, &fill_of)
            }
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

/// A chamfer (3-4) distance as stored between the two passes: 16 bits
/// where every distance fits, else 32.
trait Chamfer: Copy + Ord + Send {
    /// Not yet reached: above every distance the raster can hold.
    const FAR: Self;
    /// A pixel next to another label or the image edge (one pixel).
    const NEAR: Self;
    /// `self + k` for the steps 3 and 4 (never overflows from `FAR`).
    fn step(self, k: u8) -> Self;
    /// The distance as a number.
    fn get(self) -> u32;
}

#[derive(Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
struct Chamfer16(u16);
#[derive(Clone, Copy, PartialEq, Eq, PartialOrd, Ord)]
struct Chamfer32(u32);

impl Chamfer16 {
    /// Whether every distance of a `w` x `h` raster stays below `FAR`:
    /// after the forward pass a pixel is at most 3 per step from the top
    /// row or the left column (both at 3), so at most `3 * min(w, h)`.
    fn fits(w: usize, h: usize) -> bool {
        3 * w.min(h) + 8 < Self::FAR.0 as usize
    }
}

impl Chamfer for Chamfer16 {
    const FAR: Self = Chamfer16(u16::MAX - 8);
    const NEAR: Self = Chamfer16(3);
    #[inline]
    fn step(self, k: u8) -> Self {
        Chamfer16(self.0 + k as u16)
    }
    #[inline]
    fn get(self) -> u32 {
        self.0 as u32
    }
}

impl Chamfer for Chamfer32 {
    const FAR: Self = Chamfer32(u32::MAX / 2);
    const NEAR: Self = Chamfer32(3);
    #[inline]
    fn step(self, k: u8) -> Self {
        Chamfer32(self.0 + k as u32)
    }
    #[inline]
    fn get(self) -> u32 {
        self.0
    }
}

/// Per class, its 4-connected components as (pixels, largest chamfer
/// distance), and the core mask, in two passes over the label raster.
///
/// The distance is the chamfer (3-4) distance of every pixel to the
/// nearest pixel of another label, pixels next to another label
/// (4-neighbours) or the image edge being at 3 (one pixel). The forward
/// pass finds those pixels and the core pixels (whose whole 3 x 3
/// neighbourhood inside the image carries one label) and sweeps the
/// distances down (up, up-left, up-right, then left); the backward pass
/// sweeps them up (down, down-right, down-left, then right) one row at a
/// time, and as each row's distances are final finds its runs of one
/// label, joined with the runs they touch in the row below (union-find),
/// each keeping its largest distance.
#[allow(clippy::type_complexity)]
fn scan<D: Chamfer>(
    l: &Labels,
    classes: usize,
    fill_of: &impl Fn(u16) -> Option<usize>,
) -> (Vec<Vec<(usize, u32)>>, Vec<bool>) {
    let (w, h) = (l.width as usize, l.height as usize);
    let mut sizes: Vec<Vec<(usize, u32)>> = vec![Vec::new(); classes];
    if w == 0 || h == 0 {
        return (sizes, Vec::new());
    }
    let ids = &l.ids;
    let row_of = |y: usize| &ids[y * w..(y + 1) * w];
    let mut fwd: Vec<D> = vec![D::FAR; w * h];
    let mut core = vec![false; w * h];
    for y in 0..h {
        let row = row_of(y);
        // A missing row above or below stands in as the row itself: the
        // core test then asks nothing more of it, and such a row is on
        // the image edge, all at one pixel.
        let up = row_of(y.saturating_sub(1));
        let down = row_of((y + 1).min(h - 1));
        let (done, rest) = fwd.split_at_mut(y * w);
        let cur = &mut rest[..w];
        let out = &mut core[y * w..(y + 1) * w];
        let edge_row = y == 0 || y + 1 == h;
        let at = |x: usize| {
            let id = row[x];
            let (xl, xr) = (x.saturating_sub(1), (x + 1).min(w - 1));
            let cross = row[xl] == id && row[xr] == id && up[x] == id && down[x] == id;
            let corners = up[xl] == id && up[xr] == id && down[xl] == id && down[xr] == id;
            (!cross || edge_row || x == 0 || x + 1 == w, cross && corners)
        };
        let (s0, c0) = at(0);
        cur[0] = if s0 { D::NEAR } else { D::FAR };
        out[0] = c0;
        if w > 1 {
            let (s1, c1) = at(w - 1);
            cur[w - 1] = if s1 { D::NEAR } else { D::FAR };
            out[w - 1] = c1;
        }
        if w > 2 {
            let inner = row[1..w - 1]
                .iter()
                .zip(row[..w - 2].iter().zip(&row[2..]))
                .zip(up[..w - 2].iter().zip(&up[1..w - 1]).zip(&up[2..]))
                .zip(down[..w - 2].iter().zip(&down[1..w - 1]).zip(&down[2..]));
            for ((((&id, (&l0, &r0)), ((&ul, &uc), &ur)), ((&dl, &dc), &dr)), (c, o)) in
                inner.zip(cur[1..w - 1].iter_mut().zip(&mut out[1..w - 1]))
            {
                let cross = (l0 == id) & (r0 == id) & (uc == id) & (dc == id);
                let corners = (ul == id) & (ur == id) & (dl == id) & (dr == id);
                *o = cross & corners;
                *c = if cross & !edge_row { D::FAR } else { D::NEAR };
            }
        }
        if y > 0 {
            from_row(cur, &done[(y - 1) * w..]);
        }
        sweep(cur.iter_mut());
    }
    // Runs: (start x, end x exclusive, label), with parent links, pixel
    // counts and largest distances.
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
    let mut now: Vec<D> = vec![D::FAR; w];
    let mut below: Vec<D> = vec![D::FAR; w];
    let mut beside = 0..0;
    for y in (0..h).rev() {
        now.copy_from_slice(&fwd[y * w..(y + 1) * w]);
        if y + 1 < h {
            from_row(&mut now, &below);
        }
        sweep(now.iter_mut().rev());
        let row = row_of(y);
        let here = runs.len();
        let mut x = 0;
        while x < w {
            let id = row[x];
            let x1 = x + 1 + same_from(&row[x + 1..], id);
            if fill_of(id).is_some() {
                let r = runs.len();
                runs.push(Run { x0: x, x1, id });
                parent.push(r);
                count.push(x1 - x);
                dmax.push(now[x..x1].iter().map(|d| d.get()).max().unwrap_or(0));
            }
            x = x1;
        }
        // Join with the runs below that share a column and the label.
        let mut j = beside.start;
        for r in here..runs.len() {
            while j < beside.end && runs[j].x1 <= runs[r].x0 {
                j += 1;
            }
            let mut k = j;
            while k < beside.end && runs[k].x0 < runs[r].x1 {
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
        beside = here..runs.len();
        std::mem::swap(&mut now, &mut below);
    }
    for r in 0..runs.len() {
        if parent[r] == r {
            let k = fill_of(runs[r].id).expect("runs are of class marks");
            sizes[k].push((count[r], dmax[r]));
        }
    }
    (sizes, core)
}

/// The chamfer step along a row, in the order given: each pixel at most
/// 3 more than the one before it.
#[inline]
fn sweep<'a, D: Chamfer + 'a>(mut row: impl Iterator<Item = &'a mut D>) {
    let Some(first) = row.next() else { return };
    let mut run = *first;
    for d in row {
        run = (*d).min(run.step(3));
        *d = run;
    }
}

/// How many leading values of `s` equal `v` (compared 16 at a time).
#[inline]
fn same_from<T: Copy + PartialEq>(s: &[T], v: T) -> usize {
    let mut n = 0;
    let mut chunks = s.chunks_exact(16);
    for c in &mut chunks {
        if c.iter().fold(false, |acc, &x| acc | (x != v)) {
            return n + c.iter().position(|&x| x != v).expect("a value differs");
        }
        n += 16;
    }
    n + chunks
        .remainder()
        .iter()
        .position(|&x| x != v)
        .unwrap_or(chunks.remainder().len())
}

/// How many leading pixels of the RGBA8 bytes `s` are the pixel `word`
/// (its four bytes, little-endian; compared 16 pixels at a time).
#[inline]
fn same_colour(s: &[u8], word: u32) -> usize {
    let px = |p: &[u8]| u32::from_le_bytes([p[0], p[1], p[2], p[3]]);
    let mut n = 0;
    let mut chunks = s.chunks_exact(64);
    for c in &mut chunks {
        if c.chunks_exact(4).fold(0, |acc, p| acc | (px(p) ^ word)) != 0 {
            break;
        }
        n += 16;
    }
    n + s[4 * n..]
        .chunks_exact(4)
        .position(|p| px(p) != word)
        .unwrap_or((s.len() - 4 * n) / 4)
}

/// How many leading labels of `a` equal those of `b` at the same place
/// (compared 16 at a time).
#[inline]
fn alike(a: &[u16], b: &[u16]) -> usize {
    let len = a.len().min(b.len());
    let (a, b) = (&a[..len], &b[..len]);
    let mut n = 0;
    for (ca, cb) in a.chunks_exact(16).zip(b.chunks_exact(16)) {
        if ca.iter().zip(cb).fold(0u16, |acc, (&p, &q)| acc | (p ^ q)) != 0 {
            break;
        }
        n += 16;
    }
    n + a[n..]
        .iter()
        .zip(&b[n..])
        .position(|(p, q)| p != q)
        .unwrap_or(len - n)
}

/// Contacts between classes and crossings into the background, from
/// every row and every column (columns walked row by row, one state per
/// column, so memory is read in order).
///
/// Along a line, each pixel that is no border is compared with the last
/// pixel before it that is no border. Where a pixel carries the label of
/// the pixel before it nothing happens, so only the places where the
/// label changes are visited; the last pixel that is no border is the
/// pixel before, unless that is a border, when it was noted where the
/// border began.
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
    const BORDER: u16 = labels::BORDER;
    // Per column: the last pixel that is no border before the border the
    // column is in (when it is in one).
    let mut last: Vec<Option<(u16, usize)>> = vec![None; w];
    let mut up: &[u16] = &[];
    for (y, row) in l.ids.chunks_exact(w.max(1)).enumerate() {
        // Along the row.
        let mut before: Option<(u16, usize)> = None;
        let mut x = 0;
        while x < w {
            let id = row[x];
            if x > 0 {
                let p = row[x - 1];
                if id == BORDER {
                    if p != BORDER {
                        before = Some((p, x - 1));
                    }
                } else {
                    let prev = if p != BORDER {
                        Some((p, x - 1))
                    } else {
                        before
                    };
                    if let Some((prev, at)) = prev {
                        if prev != id && x - at - 1 <= gap {
                            event(prev, id, (0, y), &|| (y * w + at..=y * w + x).collect());
                        }
                    }
                }
            }
            x += 1 + same_from(&row[x + 1..], id);
        }
        // Down the columns.
        if y > 0 {
            let mut x = alike(row, up);
            while x < w {
                let (id, p) = (row[x], up[x]);
                if id == BORDER {
                    if p != BORDER {
                        last[x] = Some((p, y - 1));
                    }
                } else {
                    let prev = if p != BORDER {
                        Some((p, y - 1))
                    } else {
                        last[x]
                    };
                    if let Some((prev, at)) = prev {
                        if prev != id && y - at - 1 <= gap {
                            event(prev, id, (1 + x, y), &|| {
                                (at..=y).map(|yy| yy * w + x).collect()
                            });
                        }
                    }
                }
                x += 1;
                x += alike(&row[x..], &up[x..]);
            }
        }
        up = row;
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

/// One chamfer step from the neighbouring row `nb` into the row `cur`:
/// straight (3) and diagonal (4) neighbours.
fn from_row<D: Chamfer>(cur: &mut [D], nb: &[D]) {
    let w = cur.len();
    for (c, &n) in cur.iter_mut().zip(&nb[..w]) {
        *c = (*c).min(n.step(3));
    }
    if w > 1 {
        for (c, &n) in cur[1..].iter_mut().zip(&nb[..w - 1]) {
            *c = (*c).min(n.step(4));
        }
        for (c, &n) in cur[..w - 1].iter_mut().zip(&nb[1..w]) {
            *c = (*c).min(n.step(4));
        }
    }
}

/// The pixel bounding box `[x0, y0, x1, y1]` (inclusive) of each of `n`
/// text elements' labels; None for text that drew nothing.
pub fn text_boxes(l: &Labels, n: usize) -> Vec<Option<[usize; 4]>> {
    let w = l.width as usize;
    let mut boxes: Vec<Option<[usize; 4]>> = vec![None; n];
    // By runs of one label along each row.
    for (y, row) in l.ids.chunks_exact(w.max(1)).enumerate() {
        let mut x = 0;
        while x < w {
            let id = row[x];
            let end = x + 1 + same_from(&row[x + 1..], id);
            let j = id.wrapping_sub(labels::TEXT_BASE) as usize;
            if id >= labels::TEXT_BASE && j < n {
                let b = boxes[j].get_or_insert([x, y, x, y]);
                b[0] = b[0].min(x);
                b[1] = b[1].min(y);
                b[2] = b[2].max(end - 1);
                b[3] = b[3].max(y);
            }
            x = end;
        }
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

/// The core pixels of the measured labels and every text pixel of the
/// pixels `range` of the raster, as slots of a palette of their own:
/// runs of one label first, skipped when the label is not read, then
/// within them runs of core pixels (for the measured labels), then runs
/// of one colour, each counted at once (a run never crosses into the
/// raster's last pixels, whose colours are kept apart).
fn count_runs(
    rgba: &[u8],
    l: &Labels,
    g: &Geometry,
    range: std::ops::Range<usize>,
    parts: usize,
    measured: &impl Fn(u16) -> bool,
) -> (Palette, Vec<Counts>, Counts) {
    let mut palette = Palette::new(l.ids.len());
    let mut core: Vec<Tally> = (0..parts).map(|_| Tally::default()).collect();
    let mut text = Tally::default();
    let tail_from = palette.tail_from;
    let (ids, core_mask) = (&l.ids[..range.end], &g.core[..range.end]);
    let mut colours = |from: usize, to: usize, tally: &mut Tally| {
        let mut i = from;
        while i < to {
            let end = if i < tail_from { to.min(tail_from) } else { to };
            let word = u32::from_le_bytes([
                rgba[4 * i],
                rgba[4 * i + 1],
                rgba[4 * i + 2],
                rgba[4 * i + 3],
            ]);
            let len = 1 + same_colour(&rgba[4 * (i + 1)..4 * end], word);
            tally.add(palette.slot(rgba, i), len);
            i += len;
        }
    };
    let mut i = range.start;
    while i < range.end {
        let id = ids[i];
        let end = i + 1 + same_from(&ids[i + 1..], id);
        if measured(id) {
            let tally = &mut core[id as usize];
            let mut j = i;
            while j < end {
                let c = core_mask[j];
                let k = j + 1 + same_from(&core_mask[j + 1..end], c);
                if c {
                    colours(j, k, tally);
                }
                j = k;
            }
        } else if id >= labels::TEXT_BASE {
            colours(i, end, &mut text);
        }
        i = end;
    }
    (
        palette,
        core.into_iter().map(Tally::finish).collect(),
        text.finish(),
    )
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
        // Borders, text and other drawing (labels 1 to 3) are not measured.
        let measured = |id: u16| {
            (id as usize) < parts
                && matches!(
                    labels::part(id),
                    Part::Background | Part::Fill(_) | Part::Swatch(_)
                )
        };
        // The two halves of the raster side by side, each with its own
        // palette; the second's slots are then renumbered into the first's.
        let mid = (h / 2) * w;
        let count = |from: usize, to: usize| count_runs(rgba, l, g, from..to, parts, &measured);
        let ((mut palette, first, text_a), (second_palette, second, text_b)) =
            rayon::join(|| count(0, mid), || count(mid, w * h));
        let renumber: Vec<u32> = second_palette
            .keys
            .iter()
            .map(|&k| palette.slot_of_key(k))
            .collect();
        let merge = |a: Counts, b: Counts| -> Counts {
            let mut m: std::collections::BTreeMap<u32, usize> = a.into_iter().collect();
            for (s, n) in b {
                *m.entry(renumber[s as usize]).or_insert(0) += n;
            }
            m.into_iter().collect()
        };
        let mut parts_counts: Vec<Counts> = first
            .into_iter()
            .zip(second)
            .map(|(a, b)| merge(a, b))
            .collect();
        let text = merge(text_a, text_b);
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
            text,
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn both_distance_widths_give_the_same_components_and_core() {
        // A raster of random 1-4 px blocks of three labels, with a large
        // region: the 32-bit distances (for rasters too big for 16 bits)
        // and the 16-bit ones agree, through both passes.
        let (w, h) = (61usize, 43usize);
        let mut rng = crate::random::SplitMix64(7);
        let mut ids = vec![labels::fill_label(0); w * h];
        for _ in 0..300 {
            let r = rng.next_u64();
            let (x, y) = ((r % w as u64) as usize, ((r >> 16) % h as u64) as usize);
            let (bw, bh) = (1 + ((r >> 32) % 4) as usize, 1 + ((r >> 40) % 4) as usize);
            let l =
                [labels::BORDER, labels::fill_label(1), labels::BACKGROUND][(r >> 48) as usize % 3];
            for yy in y..(y + bh).min(h) {
                for xx in x..(x + bw).min(w) {
                    ids[yy * w + xx] = l;
                }
            }
        }
        let l = Labels {
            width: w as u32,
            height: h as u32,
            ids,
        };
        let fill_of = |id: u16| match labels::part(id) {
            Part::Fill(k) if k < 2 => Some(k),
            _ => None,
        };
        let a = scan::<Chamfer16>(&l, 2, &fill_of);
        let b = scan::<Chamfer32>(&l, 2, &fill_of);
        assert_eq!(a, b);
        assert!(a.0[0].iter().any(|&(_, d)| d > 9), "{:?}", a.0[0]);
    }
}
