//! The calculation package: a deterministic PDF built from an analysis.
//! `layout` is the page-layout layer (text, tables, charts, PDF output);
//! `sections` writes the package's content on top of it.

pub mod layout;
pub mod sections;

use crate::analysis::Analysis;
use crate::model::Design;
use layout::style::Style;

/// Choose the style: the command line's, else the design's, else by report units
/// (letter for US customary, A4 for SI). A name is a built-in style; anything else is
/// the text of a style file the caller has read.
pub fn builtin_style_for(design: &Design) -> &'static str {
    match design.project.units {
        crate::model::ReportUnits::Us => "letter",
        crate::model::ReportUnits::Si => "a4",
    }
}

/// Render the calculation package to PDF bytes.
pub fn render_pdf(
    design: &Design,
    analysis: &Analysis,
    source: &str,
    style: &Style,
    changes: Option<&sections::Changes>,
) -> Result<Vec<u8>, String> {
    let sha = crate::results::sha256_hex(source);
    let doc = sections::document(design, analysis, source, &sha, changes);
    layout::render(&doc, style).map_err(|e| e.to_string())
}
