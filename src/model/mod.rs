//! Model: the syntax tree lowered to a typed, unit-checked [`Design`], with
//! names resolved, pipe sizes looked up, fittings found and cases applied.

use crate::diagnostics::Code;
pub mod design;
pub mod eval;
mod fields;
pub mod keywords;
mod lower;
pub mod network;
pub mod operation;
mod pumps;
pub mod ranges;
pub mod scenario;
mod size_change;
pub mod uncertainty;
pub mod vacuum;

pub use design::*;
pub use lower::{lower, MAX_CASES, MAX_PUMPS, MAX_SEGMENTS};
pub use pumps::{MAX_CURVES, MAX_CURVE_POINTS};

/// The only door to other files (CSV curve tables, style files): the caller decides
/// what a path means. The CLI reads regular files inside the design file's folder (see
/// grammar/LANGUAGE.md, "File access"); tests use a map.
pub trait FileAccess {
    /// The text of the file at `path` as written in the design (relative to the design's folder for the CLI), or why it cannot be read.
    fn read_text(&self, path: &str) -> Result<String, FileError>;
}

/// Why a file could not be read. File content never appears in these, so a refused
/// file cannot leak into a diagnostic.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum FileError {
    /// Nothing at that path.
    NotFound,
    /// More than `syntax::MAX_SOURCE_BYTES` bytes; `line` is where the limit is crossed.
    TooLarge {
        /// 1-based line where the limit is crossed.
        line: usize,
    },
    /// Not UTF-8 text; the first bad byte is at `line`:`column`.
    NotUtf8 {
        /// 1-based line of the first bad byte.
        line: usize,
        /// 1-based column (in characters) of the first bad byte.
        column: usize,
    },
    /// A folder, FIFO, device or socket (named in `kind`), never opened.
    NotRegularFile {
        /// What it is, in words ("a folder", "a FIFO (named pipe)").
        kind: &'static str,
    },
    /// Outside the design file's folder and every folder the user allowed, or absolute.
    OutsideAllowed,
    /// Any other reason the system gave (permissions, ...).
    Unreadable(String),
    /// No file access was given (a source checked without a folder).
    Unavailable,
}

impl FileError {
    /// The diagnostic code for this kind of failure.
    pub fn code(&self) -> Code {
        match self {
            FileError::TooLarge { .. } => Code::FileTooLarge,
            FileError::NotUtf8 { .. } => Code::InvalidUtf8,
            FileError::NotRegularFile { .. } => Code::NotARegularFile,
            FileError::OutsideAllowed => Code::FileNotAllowed,
            FileError::NotFound | FileError::Unreadable(_) | FileError::Unavailable => {
                Code::FileNotRead
            }
        }
    }

    /// What to do about it.
    pub fn help(&self) -> &'static str {
        match self {
            FileError::NotFound => "the path is relative to the folder of the design file",
            FileError::TooLarge { .. } => "files read by a design are limited to 1 MiB (1 048 576 bytes); is this the right file?",
            FileError::NotUtf8 { .. } => "save the file as UTF-8 text (from a spreadsheet: CSV UTF-8)",
            FileError::NotRegularFile { .. } => "give the path of an ordinary file; folders, FIFOs, devices and sockets are not read",
            FileError::OutsideAllowed => "a design reads only files in its own folder or below: copy the file there, or allow its folder on the command line with `--allow-dir DIR`",
            FileError::Unreadable(_) => "check that the file exists and may be read",
            FileError::Unavailable => "check the design from a file so that its folder is known",
        }
    }
}

impl std::fmt::Display for FileError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            FileError::NotFound => write!(f, "no such file"),
            FileError::TooLarge { line } => write!(
                f,
                "the file is larger than {} bytes (the limit is crossed on line {line})",
                crate::syntax::MAX_SOURCE_BYTES
            ),
            FileError::NotUtf8 { line, column } => write!(
                f,
                "the file is not UTF-8 text (first bad byte at line {line}, column {column})"
            ),
            FileError::NotRegularFile { kind } => write!(f, "it is {kind}, not a regular file"),
            FileError::OutsideAllowed => write!(
                f,
                "the path is absolute or leaves the design file's folder, and no `--allow-dir` allows it"
            ),
            FileError::Unreadable(reason) => write!(f, "{reason}"),
            FileError::Unavailable => write!(f, "no file access was given"),
        }
    }
}

impl From<crate::syntax::TextError> for FileError {
    fn from(error: crate::syntax::TextError) -> FileError {
        match error.problem {
            crate::syntax::TextProblem::TooLarge => FileError::TooLarge { line: error.line },
            crate::syntax::TextProblem::NotUtf8 => FileError::NotUtf8 {
                line: error.line,
                column: error.column,
            },
        }
    }
}

/// File access that finds nothing (for sources without imports).
pub struct NoFiles;

impl FileAccess for NoFiles {
    fn read_text(&self, _path: &str) -> Result<String, FileError> {
        Err(FileError::Unavailable)
    }
}

/// Files from an in-memory map, for tests.
impl FileAccess for std::collections::BTreeMap<String, String> {
    fn read_text(&self, path: &str) -> Result<String, FileError> {
        self.get(path).cloned().ok_or(FileError::NotFound)
    }
}
