//! Where text goes: standard output through one locked handle (a closed pipe becomes
//! an error the caller ends on quietly), standard error for diagnostics.

use std::io::Write;
use std::path::Path;

use dutyline::diagnostics::{self, Diagnostic};

use super::error::CliError;

/// Standard output, locked once for the whole run.
pub type Out = std::io::StdoutLock<'static>;

/// Write `text` to standard output whole.
pub fn text(out: &mut Out, text: &str) -> Result<(), CliError> {
    out.write_all(text.as_bytes()).map_err(CliError::stdout)
}

/// Write bytes (a PDF) to standard output whole.
pub fn bytes(out: &mut Out, bytes: &[u8]) -> Result<(), CliError> {
    out.write_all(bytes).map_err(CliError::stdout)
}

/// Print text on standard error; a closed standard error leaves nothing to tell.
pub fn error_text(text: &str) {
    let _ = std::io::stderr().lock().write_all(text.as_bytes());
}

/// Print diagnostics (warnings of a valid design) on standard error.
pub fn diagnostics(diagnostics: &[Diagnostic], path: &Path, source: &str) {
    if !diagnostics.is_empty() {
        error_text(&diagnostics::render(
            diagnostics,
            &path.display().to_string(),
            source,
        ));
    }
}
