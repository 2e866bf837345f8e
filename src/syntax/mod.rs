//! Syntax: source text to a spanned tree, and the tree back to canonical text.

pub mod ast;
pub mod comments;
pub mod format;
pub mod limits;
pub mod parse;

pub use ast::File;
pub use format::format_source;
pub use limits::{MAX_IDENTIFIER_CHARS, MAX_TEXT_CHARS};
pub use parse::{
    decode_text, parse, source_from_bytes, TextError, TextProblem, MAX_NESTING, MAX_SOURCE_BYTES,
};
