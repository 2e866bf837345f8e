//! Why a command failed, printed once by `main` through the one diagnostic renderer,
//! and the exit status each failure maps to.

use dutyline::diagnostics::Code;
use std::path::PathBuf;
use std::process::ExitCode;

use dutyline::diagnostics::{self, Diagnostic};
use dutyline::model::FileError;

/// Exit status: design errors (or warnings with `--deny-warnings`, or changes with
/// `fmt --check` / `diff --exit-code`).
pub const EXIT_DESIGN: u8 = 1;
/// Exit status: usage, reading or writing failed.
pub const EXIT_USAGE_OR_IO: u8 = 2;
/// Exit status of `results` and `build`: analysed, but no candidate is recommended or a
/// case could not be analysed (the output is still written).
pub const EXIT_NO_SELECTION: u8 = 3;
/// Exit status when standard output is closed early (`| head`): 128 + SIGPIPE (13), what a
/// shell reports for a program ended by a closed pipe.
pub const EXIT_CLOSED_PIPE: u8 = 141;

/// A command's failure.
#[derive(Debug)]
pub enum CliError {
    /// The command line asks for something impossible.
    Usage(String),
    /// A file could not be read; `help` replaces the kind's own hint where the context knows better.
    Read {
        path: PathBuf,
        error: FileError,
        help: Option<String>,
    },
    /// An output could not be (or must not be) written.
    Write {
        path: PathBuf,
        problem: WriteProblem,
    },
    /// Diagnostics about a file's content, with the text they point into.
    Rejected {
        file: String,
        source: String,
        diagnostics: Vec<Diagnostic>,
        summary: Option<String>,
    },
    /// Standard output failed: a closed pipe ends quietly, anything else is reported.
    Stdout(std::io::Error),
}

/// Why an output path is refused or failed.
#[derive(Debug)]
pub enum WriteProblem {
    /// The output would replace the design file being built.
    IsTheInput,
    /// An existing folder, FIFO, device, socket or symbolic link (named).
    NotARegularFile(&'static str),
    /// An existing design file (`*.duty`), kept unless `--force`.
    IsADesign,
    /// An existing file that is not a PDF, kept unless `--force`.
    NotAPdf,
    /// An existing file, never replaced (`new`).
    Exists,
    /// An existing file, kept unless `--force` (`extract`).
    KeptWithoutForce,
    /// The system refused (permissions, full disk, ...).
    Io(std::io::Error),
}

impl CliError {
    /// The error of a failed write to standard output.
    pub fn stdout(error: std::io::Error) -> CliError {
        CliError::Stdout(error)
    }

    /// The process exit status for this failure.
    pub fn exit_code(&self) -> ExitCode {
        ExitCode::from(match self {
            CliError::Rejected { .. } => EXIT_DESIGN,
            CliError::Stdout(e) if e.kind() == std::io::ErrorKind::BrokenPipe => EXIT_CLOSED_PIPE,
            _ => EXIT_USAGE_OR_IO,
        })
    }

    /// The text printed on standard error (empty for a closed pipe).
    pub fn render(&self) -> String {
        let diagnostic = match self {
            CliError::Rejected {
                file,
                source,
                diagnostics,
                summary,
            } => {
                let mut text = diagnostics::render(diagnostics, file, source);
                if let Some(summary) = summary {
                    text.push_str(summary);
                    text.push('\n');
                }
                return text;
            }
            CliError::Stdout(e) if e.kind() == std::io::ErrorKind::BrokenPipe => {
                return String::new()
            }
            CliError::Stdout(e) => Diagnostic::error(
                Code::WriteFailed,
                format!("cannot write to standard output: {e}"),
                None,
            ),
            CliError::Usage(message) => Diagnostic::error(Code::Usage, message.clone(), None)
                .with_help("see `dutyline --help` and `dutyline COMMAND --help`"),
            CliError::Read { path, error, help } => Diagnostic::error(
                error.code(),
                format!("cannot read `{}`: {error}", path.display()),
                None,
            )
            .with_help(help.clone().unwrap_or_else(|| read_help(error))),
            CliError::Write { path, problem } => problem.diagnostic(&path.display().to_string()),
        };
        diagnostics::render(&[diagnostic], "", "")
    }
}

/// The hint for a file named on the command line (the kind's own hint speaks of designs).
fn read_help(error: &FileError) -> String {
    match error {
        FileError::NotFound => "check the path (relative paths start at the current folder)".into(),
        other => other.help().into(),
    }
}

impl WriteProblem {
    fn diagnostic(&self, path: &str) -> Diagnostic {
        let (code, message, help) = match self {
            WriteProblem::IsTheInput => (
                Code::OutputRefused,
                format!("the output `{path}` is the design file itself"),
                "choose another `-o`".to_string(),
            ),
            WriteProblem::NotARegularFile(kind) => (
                Code::OutputRefused,
                format!("the output `{path}` exists and is {kind}; only a regular file is replaced"),
                "give the path of a new file or of an earlier package, or `-o -` for standard output".to_string(),
            ),
            WriteProblem::IsADesign => (
                Code::OutputRefused,
                format!("the output `{path}` is a design file (`.duty`); it is not overwritten"),
                "choose another `-o`, or add `--force` to replace it".to_string(),
            ),
            WriteProblem::NotAPdf => (
                Code::OutputRefused,
                format!("the output `{path}` exists and is not a PDF; it is not overwritten"),
                "choose another `-o`, or add `--force` to replace it".to_string(),
            ),
            WriteProblem::Exists => (
                Code::OutputRefused,
                format!("`{path}` exists; `dutyline new` never replaces a file"),
                "choose another name, or remove the file first".to_string(),
            ),
            WriteProblem::KeptWithoutForce => (
                Code::OutputRefused,
                format!("`{path}` exists; nothing was written"),
                "extract into another folder (`-o DIR`), or replace existing files with --force".to_string(),
            ),
            WriteProblem::Io(e) => (
                Code::WriteFailed,
                format!("cannot write `{path}`: {e}"),
                "check that the folder exists and may be written".to_string(),
            ),
        };
        Diagnostic::error(code, message, None).with_help(help)
    }
}
