//! Report layout: a small document model ([`Document`] of [`Block`]s) laid out into
//! pages by font metrics and written to PDF with printpdf.
//!
//! ```no_run
//! use dutyline::report::layout::{render, Block, Document, Style};
//! let style = Style::builtin("a4").expect("built-in style");
//! let doc = Document {
//!     title: "Pump station P-101".into(),
//!     blocks: vec![Block::heading(1, "Purpose"), Block::text("Size the duty pump.")],
//!     ..Document::default()
//! };
//! let pdf: Vec<u8> = render(&doc, &style).expect("render");
//! ```
//!
//! The pipeline: blocks become unbreakable chunks (`blocks.rs`, `table.rs`,
//! `title.rs`), chunks flow into pages (`paginate.rs`, twice when there is a table of
//! contents), and the pages become PDF content with subset fonts (`pdf.rs`,
//! `subset.rs`). Charts are drawn by plotters into a recording backend
//! (`chart_backend.rs`) so they stay vector graphics with real text.

mod attach;
mod blocks;
pub mod chart;
mod chart_backend;
mod chart_marks;
mod contents;
pub mod document;
pub mod font;
mod listing;
pub mod page;
mod paginate;
mod pdf;
mod real;
mod stream;
pub mod style;
mod subset;
mod table;
pub mod text;
pub mod ticks;
mod title;

pub use chart::{Chart, HLine, Marker, Series, YAxis};
pub use document::{
    Align, Attachment, Block, CalloutKind, Column, Document, PageMeta, PdfInfo, Relationship,
    Signatory, Span,
};
pub use page::{HeadingEntry, Item, Layout, Page, TextRun};
pub use style::{Colour, LineStyle, Style, StyleError};

use blocks::Ctx;
use page::PT_PER_MM;
use std::fmt;

/// Why a document could not be laid out or written.
#[derive(Debug, Clone, PartialEq)]
pub enum LayoutError {
    /// An embedded font could not be read or subset.
    Font(String),
    /// A table is malformed (ragged rows, bad widths, too many columns).
    Table {
        /// "Table 3" or "untitled table".
        table: String,
        /// What is wrong.
        message: String,
    },
    /// A chart could not be drawn.
    Chart {
        /// "Figure 2".
        figure: String,
        /// What went wrong.
        message: String,
    },
    /// Contents page numbers did not settle (layout oscillates).
    Unstable,
    /// The PDF writer failed.
    Pdf(String),
}

impl fmt::Display for LayoutError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            LayoutError::Font(m) => write!(f, "font error: {m}"),
            LayoutError::Table { table, message } => write!(f, "{table}: {message}"),
            LayoutError::Chart { figure, message } => write!(f, "{figure}: {message}"),
            LayoutError::Unstable => {
                write!(f, "the contents page numbers did not settle after 4 passes")
            }
            LayoutError::Pdf(m) => write!(f, "PDF output error: {m}"),
        }
    }
}

impl std::error::Error for LayoutError {}

/// A rendered document.
#[derive(Debug, Clone, PartialEq)]
pub struct Rendered {
    /// The PDF file.
    pub bytes: Vec<u8>,
    /// Number of pages.
    pub page_count: usize,
    /// Headings with their page numbers.
    pub headings: Vec<HeadingEntry>,
}

/// Maximum layout passes while contents page numbers settle.
const MAX_PASSES: usize = 4;

/// Lays the document out into pages (header and footer included) without writing
/// PDF; use it to inspect positions, e.g. in tests.
pub fn layout(doc: &Document, style: &Style) -> Result<Layout, LayoutError> {
    let fonts = font::fonts().map_err(LayoutError::Font)?;
    let ctx = Ctx {
        fonts,
        style,
        width: style.body_width_mm() * PT_PER_MM,
        body_height: style.body_height_mm() * PT_PER_MM,
    };
    let has_contents = doc.blocks.iter().any(|b| matches!(b, Block::Contents));
    let mut headings = blocks::collect_headings(&doc.blocks);
    let mut chunks = blocks::chunks(&ctx, &doc.title, &doc.blocks, &headings)?;
    for pass in 0..MAX_PASSES {
        if pass > 0 {
            chunks.relayout_contents(&ctx, &headings);
        }
        let mut placed = headings.clone();
        let (at, count) = paginate::place(&chunks.chunks, style, &mut placed);
        let settled = placed.iter().zip(&headings).all(|(a, b)| a.page == b.page);
        headings = placed;
        if settled || !has_contents {
            let mut pages = paginate::draw(chunks.chunks, &at, count, style);
            let m = &doc.meta;
            paginate::decorate(&mut pages, fonts, style, m);
            return Ok(Layout {
                page_width: style.page.width_mm * PT_PER_MM,
                page_height: style.page.height_mm * PT_PER_MM,
                pages,
                headings,
            });
        }
    }
    Err(LayoutError::Unstable)
}

/// Renders the document to PDF bytes, with its page count and heading pages.
pub fn render_document(doc: &Document, style: &Style) -> Result<Rendered, LayoutError> {
    let laid_out = layout(doc, style)?;
    let fonts = font::fonts().map_err(LayoutError::Font)?;
    let bytes = pdf::write(
        &laid_out,
        fonts,
        &doc.title,
        &doc.info,
        &doc.id_seed,
        &doc.attachments,
    )?;
    Ok(Rendered {
        bytes,
        page_count: laid_out.pages.len(),
        headings: laid_out.headings,
    })
}

/// Renders the document to PDF bytes. Identical input gives identical bytes.
pub fn render(doc: &Document, style: &Style) -> Result<Vec<u8>, LayoutError> {
    render_document(doc, style).map(|r| r.bytes)
}

/// Number of pages the document takes (lays it out, writes no PDF).
pub fn page_count(doc: &Document, style: &Style) -> Result<usize, LayoutError> {
    layout(doc, style).map(|l| l.pages.len())
}
