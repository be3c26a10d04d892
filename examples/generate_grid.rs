//! Write invented boundary data for benchmarks and demos: N grid cells
//! with winding, exactly shared borders, as GeoJSON on standard output.
//!
//! `cargo run --release --example generate_grid -- N [VERTICES_PER_BORDER] > grid.geojson`

use std::io::Write;

fn main() {
    let mut args = std::env::args().skip(1);
    let n: usize = args.next().and_then(|a| a.parse().ok()).unwrap_or(1000);
    let per: usize = args.next().and_then(|a| a.parse().ok()).unwrap_or(3);
    let grid = hueproof::geo::generate::Grid::new(n, per, 1);
    let mut out = std::io::stdout().lock();
    out.write_all(grid.geojson().as_bytes()).unwrap();
}
