//! The document model the report sections are written in: a flat list of blocks that
//! the layout engine flows into pages.

use super::chart::Chart;

/// A whole report.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Document {
    /// Document title: the PDF title and the big line of the title block.
    pub title: String,
    /// Running header and footer texts.
    pub meta: PageMeta,
    /// The PDF's document information (author, subject, creation date).
    pub info: PdfInfo,
    /// Seed of the PDF file identifier, e.g. the SHA-256 of the source file; the same
    /// seed and content give byte-identical output.
    pub id_seed: String,
    /// The content, in reading order.
    pub blocks: Vec<Block>,
    /// Files carried inside the PDF (embedded files, PDF/A-3 associated files); the
    /// writer orders them by name, so their order here does not matter.
    pub attachments: Vec<Attachment>,
}

/// A file embedded in the PDF: listed in the document's `EmbeddedFiles` name tree and
/// in the catalog's associated files (`/AF`), as ISO 32000-1 7.11.4 and ISO 19005-3
/// (PDF/A-3) 6.8 describe.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Attachment {
    /// The file's name, a relative path with `/` separators (e.g. `curves/kr1.csv`).
    pub name: String,
    /// MIME type, e.g. `text/plain`, `text/csv`, `application/json`.
    pub mime: &'static str,
    /// What the file is, for a reader (e.g. "design file"); the PDF's description
    /// adds its SHA-256.
    pub description: String,
    /// What the file is to the document (PDF/A-3 `AFRelationship`).
    pub relationship: Relationship,
    /// The file's bytes, exactly.
    pub bytes: Vec<u8>,
    /// SHA-256 of `bytes` as 64 lowercase hex digits (FIPS 180-4), computed once by
    /// [`Attachment::new`] for the build record, the appendix and the PDF description.
    pub sha256: String,
}

impl Attachment {
    /// An attachment of `bytes`, with their SHA-256.
    pub fn new(
        name: String,
        mime: &'static str,
        description: String,
        relationship: Relationship,
        bytes: Vec<u8>,
    ) -> Attachment {
        Attachment {
            sha256: sha256_hex(&bytes),
            name,
            mime,
            description,
            relationship,
            bytes,
        }
    }
}

/// SHA-256 (FIPS 180-4) as lowercase hex.
pub fn sha256_hex(bytes: &[u8]) -> String {
    use sha2::{Digest, Sha256};
    const HEX: &[u8; 16] = b"0123456789abcdef";
    let mut out = String::with_capacity(64);
    for b in Sha256::digest(bytes) {
        out.push(char::from(HEX[usize::from(b >> 4)]));
        out.push(char::from(HEX[usize::from(b & 0xf)]));
    }
    out
}

/// The PDF/A-3 `AFRelationship` of an associated file (ISO 19005-3, 6.8).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Relationship {
    /// The file the document was made from (the design and what it imports).
    Source,
    /// Data the document's content shows in machine-readable form (the results).
    Data,
    /// Anything else that supports the document (the build record).
    Supplement,
}

impl Relationship {
    /// The PDF name of the relationship.
    pub fn as_str(self) -> &'static str {
        match self {
            Relationship::Source => "Source",
            Relationship::Data => "Data",
            Relationship::Supplement => "Supplement",
        }
    }
}

/// The PDF document information dictionary. Empty fields are left out of the file.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct PdfInfo {
    /// Author (e.g. the engineer who prepared the calculation).
    pub author: String,
    /// Subject line.
    pub subject: String,
    /// Creation and modification date as `(year, month, day)`, e.g. the current
    /// revision's date; `None` keeps the fixed 1970-01-01 (no clock is read).
    pub date: Option<(i32, u8, u8)>,
}

/// Texts repeated on every page.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct PageMeta {
    /// Header, left (e.g. the project name); shortened with an ellipsis when the
    /// line is full, before `header_number` is.
    pub header_left: String,
    /// Header, after the left text (e.g. the calculation number); kept whole.
    pub header_number: String,
    /// Header, right (e.g. "Calc 2024-017 · Rev B").
    pub header_right: String,
    /// Footer, left (e.g. "source SHA-256 1a2b3c4d…"); the right side is "page N of M".
    pub footer_left: String,
}

/// A run of text in one face.
#[derive(Debug, Clone, PartialEq)]
pub enum Span {
    /// Body text.
    Plain(String),
    /// Bold text.
    Bold(String),
    /// Monospaced text (identifiers, file names, values copied from the source).
    Mono(String),
}

impl Span {
    /// Plain text span.
    pub fn plain(text: impl Into<String>) -> Span {
        Span::Plain(text.into())
    }
    /// Bold span.
    pub fn bold(text: impl Into<String>) -> Span {
        Span::Bold(text.into())
    }
    /// Monospaced span.
    pub fn mono(text: impl Into<String>) -> Span {
        Span::Mono(text.into())
    }
}

/// Horizontal alignment inside a table column.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Align {
    /// Flush left (text).
    #[default]
    Left,
    /// Centred.
    Center,
    /// Flush right (numbers).
    Right,
}

/// One table column.
#[derive(Debug, Clone, PartialEq)]
pub struct Column {
    /// Header text (wraps like any cell).
    pub header: String,
    /// Share of the table width; the fractions of all columns are normalised to 1.
    pub width_fraction: f64,
    /// Alignment of the header and the cells.
    pub align: Align,
}

impl Column {
    /// A column with the given header, width share and alignment.
    pub fn new(header: impl Into<String>, width_fraction: f64, align: Align) -> Column {
        Column {
            header: header.into(),
            width_fraction,
            align,
        }
    }
}

/// The kind of a boxed note.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum CalloutKind {
    /// A safety or validity warning ("CAUTION").
    Caution,
    /// A remark ("NOTE").
    Note,
}

/// One signature row of the title block.
#[derive(Debug, Clone, PartialEq)]
pub struct Signatory {
    /// Role, e.g. "Prepared", "Checked", "Approved".
    pub role: String,
    /// Printed name (may be empty: the line is left to fill in by hand).
    pub name: String,
    /// Date text (may be empty).
    pub date: String,
}

impl Signatory {
    /// A signature row.
    pub fn new(role: impl Into<String>, name: impl Into<String>, date: impl Into<String>) -> Self {
        Signatory {
            role: role.into(),
            name: name.into(),
            date: date.into(),
        }
    }
}

/// A unit of content.
// A figure carries its chart inline; blocks are few (hundreds per package), so the
// size of the largest variant does not matter and boxing would only burden callers.
#[allow(clippy::large_enum_variant)]
#[derive(Debug, Clone, PartialEq)]
pub enum Block {
    /// A section heading, numbered automatically ("3", "3.2", "3.2.1") and listed in
    /// the contents. Levels outside 1..=3 are clamped.
    Heading {
        /// 1, 2 or 3.
        level: u8,
        /// Heading text without its number.
        text: String,
    },
    /// Running text, wrapped by font metrics (ragged right). A `'\n'` forces a break.
    Paragraph(Vec<Span>),
    /// Monospaced lines (source listings); long lines wrap with a continuation mark,
    /// and the block splits across pages.
    Preformatted {
        /// The lines, without line terminators; tabs expand to 4 columns.
        lines: Vec<String>,
        /// Print 1-based line numbers in a gutter.
        line_numbers: bool,
    },
    /// A table with a header row repeated on every page it spans.
    Table {
        /// Columns (header, width share, alignment).
        columns: Vec<Column>,
        /// Rows; each must have one cell per column.
        rows: Vec<Vec<String>>,
        /// Caption printed above as "Table N: caption" (numbered automatically).
        caption: Option<String>,
    },
    /// A two-column list of terms and values.
    KeyValue(Vec<(String, String)>),
    /// A chart with a caption "Figure N: caption" below; never split across pages.
    Figure {
        /// What to plot.
        chart: Chart,
        /// Height of the chart (legend included), capped at the page body.
        height_mm: f64,
        /// Caption text.
        caption: String,
    },
    /// A displayed equation, centred, numbered "(N)" at the right margin
    /// (numbered automatically). Set in Unicode math: ρ, ·, superscripts, subscripts.
    Equation(String),
    /// Table of contents with dot leaders and page numbers.
    Contents,
    /// The boxed title block of the calculation package.
    TitleBlock {
        /// Key/value lines: project, calculation number, client, revision, tool...
        lines: Vec<(String, String)>,
        /// Draw a blank box for the reviewer's seal or stamp.
        seal_box: bool,
        /// Signature rows (prepared / checked / approved).
        signatures: Vec<Signatory>,
    },
    /// Start a new page (ignored at the top of a page).
    PageBreak,
    /// Vertical space in millimetres (dropped at the top of a page).
    Spacer(f64),
    /// A boxed paragraph for cautions and notes.
    Callout {
        /// Caution or note; sets the label.
        kind: CalloutKind,
        /// The text.
        text: Vec<Span>,
    },
}

impl Block {
    /// A heading block.
    pub fn heading(level: u8, text: impl Into<String>) -> Block {
        Block::Heading {
            level,
            text: text.into(),
        }
    }

    /// A paragraph of plain text.
    pub fn text(text: impl Into<String>) -> Block {
        Block::Paragraph(vec![Span::plain(text)])
    }

    /// A caution box with plain text.
    pub fn caution(text: impl Into<String>) -> Block {
        Block::Callout {
            kind: CalloutKind::Caution,
            text: vec![Span::plain(text)],
        }
    }

    /// A note box with plain text.
    pub fn note(text: impl Into<String>) -> Block {
        Block::Callout {
            kind: CalloutKind::Note,
            text: vec![Span::plain(text)],
        }
    }

    /// A source listing with line numbers, split from one text.
    pub fn listing(source: &str) -> Block {
        Block::Preformatted {
            lines: source.lines().map(str::to_string).collect(),
            line_numbers: true,
        }
    }
}
