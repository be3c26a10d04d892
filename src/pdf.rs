//! PDF output (placeholder until the PDF stage lands on this branch).

use std::path::Path;

use crate::error::{Error, Result};

/// Convert an SVG figure to PDF.
pub fn svg_to_pdf(name: &Path, _svg: &[u8]) -> Result<Vec<u8>> {
    Err(Error::Internal(format!(
        "PDF output for '{}' is not available in this build",
        name.display()
    )))
}
