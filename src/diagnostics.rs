//! One diagnostic type for every stage, and its rendering with source snippets.
//!
//! Rendering uses `codespan-reporting`: it is small (one dependency besides
//! `termcolor`), prints file:line:col, the source line, an underline and
//! notes, and can render without colour for snapshot tests. See DEVELOPERS.md.

use codespan_reporting::diagnostic::{Diagnostic as CsDiagnostic, Label};
use codespan_reporting::files::SimpleFile;
use codespan_reporting::term;
use serde::Serialize;

mod code;
pub use code::Code;

/// A byte range in a source file.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
pub struct Span {
    /// Byte offset of the first byte.
    pub start: usize,
    /// Byte offset one past the last byte.
    pub end: usize,
}

impl Span {
    /// The bytes `start..end`.
    pub fn new(start: usize, end: usize) -> Span {
        Span { start, end }
    }
    /// The smallest span covering both.
    pub fn join(self, other: Span) -> Span {
        Span::new(self.start.min(other.start), self.end.max(other.end))
    }
}

/// How serious a diagnostic is.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Severity {
    /// Legal, but worth a look.
    Warning,
    /// The design cannot be used as written.
    Error,
}

/// A message about the design, anchored at a place in the source.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Diagnostic {
    /// Error or warning.
    pub severity: Severity,
    /// What kind of problem it is; [`Code::as_str`] is the stable short string.
    pub code: Code,
    /// What is wrong, in one sentence.
    pub message: String,
    /// Primary location; `None` for whole-file problems (I/O, size).
    pub span: Option<Span>,
    /// Text under the primary underline ("expected a length").
    pub label: Option<String>,
    /// Secondary locations with their text ("first defined here").
    pub secondary: Vec<(Span, String)>,
    /// A hint on how to fix it.
    pub help: Option<String>,
}

impl Diagnostic {
    /// An error of kind `code` at `span`.
    pub fn error(code: Code, message: impl Into<String>, span: Option<Span>) -> Self {
        Diagnostic {
            severity: Severity::Error,
            code,
            message: message.into(),
            span,
            label: None,
            secondary: Vec::new(),
            help: None,
        }
    }
    /// A warning of kind `code` at `span`.
    pub fn warning(code: Code, message: impl Into<String>, span: Option<Span>) -> Self {
        Diagnostic {
            severity: Severity::Warning,
            ..Diagnostic::error(code, message, span)
        }
    }
    /// The same with the text under the primary underline.
    pub fn with_label(mut self, label: impl Into<String>) -> Self {
        self.label = Some(label.into());
        self
    }
    /// The same with a hint on how to fix it.
    pub fn with_help(mut self, help: impl Into<String>) -> Self {
        self.help = Some(help.into());
        self
    }
    /// The same with one more location and its text.
    pub fn with_secondary(mut self, span: Span, text: impl Into<String>) -> Self {
        self.secondary.push((span, text.into()));
        self
    }
    /// True for an error (not a warning).
    pub fn is_error(&self) -> bool {
        self.severity == Severity::Error
    }
}

/// 1-based line and column (in characters) of a byte offset.
pub fn line_col(source: &str, offset: usize) -> (usize, usize) {
    let offset = offset.min(source.len());
    let mut line = 1;
    let mut line_start = 0;
    for (i, b) in source.bytes().enumerate().take(offset) {
        if b == b'\n' {
            line += 1;
            line_start = i + 1;
        }
    }
    let col = source
        .get(line_start..offset)
        .map(|s| s.chars().count())
        .unwrap_or(0)
        + 1;
    (line, col)
}

/// Render diagnostics as plain text with source snippets.
pub fn render(diagnostics: &[Diagnostic], file_name: &str, source: &str) -> String {
    let file = SimpleFile::new(file_name, source);
    let config = term::Config::default();
    let mut out = String::new();
    for d in diagnostics {
        let cs = to_codespan(d, source.len());
        if term::emit_to_string(&mut out, &config, &file, &cs).is_err() {
            // Fall back to a plain line so nothing is lost.
            out.push_str(&format!(
                "{}[{}]: {}\n",
                severity_word(d.severity),
                d.code,
                d.message
            ));
        }
    }
    out
}

fn severity_word(s: Severity) -> &'static str {
    match s {
        Severity::Warning => "warning",
        Severity::Error => "error",
    }
}

fn clamp(span: Span, len: usize) -> std::ops::Range<usize> {
    let start = span.start.min(len);
    let end = span.end.clamp(start, len);
    start..end
}

fn to_codespan(d: &Diagnostic, len: usize) -> CsDiagnostic<()> {
    let base = match d.severity {
        Severity::Error => CsDiagnostic::error(),
        Severity::Warning => CsDiagnostic::warning(),
    };
    let mut labels = Vec::new();
    if let Some(span) = d.span {
        labels.push(
            Label::primary((), clamp(span, len)).with_message(d.label.clone().unwrap_or_default()),
        );
    }
    for (span, text) in &d.secondary {
        labels.push(Label::secondary((), clamp(*span, len)).with_message(text.clone()));
    }
    let mut notes = Vec::new();
    if let Some(help) = &d.help {
        notes.push(format!("help: {help}"));
    }
    base.with_code(d.code.as_str())
        .with_message(d.message.clone())
        .with_labels(labels)
        .with_notes(notes)
}
