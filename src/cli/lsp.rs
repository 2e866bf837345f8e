//! `dutyline lsp`: the language server on standard input and output. The library's
//! [`dutyline::lsp`] does the protocol; this gives it the streams and, per document, the
//! disk files of the document's folder under the usual file-access rule.

use std::io::BufReader;
use std::path::Path;
use std::process::ExitCode;

use dutyline::model::FileAccess;

use super::error::CliError;
use super::files::DiskFiles;

/// The files a document may read: those of its folder for a `file://` URI, none else.
fn files_for(uri: &str) -> Box<dyn FileAccess> {
    let disk = dutyline::lsp::file_path_of_uri(uri)
        .and_then(|path| DiskFiles::for_design(Path::new(&path), &[]).ok());
    match disk {
        Some(files) => Box::new(files),
        None => Box::new(dutyline::NoFiles),
    }
}

/// Serve until the client sends `exit` or closes the input.
pub fn run(output: &mut super::output::Out) -> Result<ExitCode, CliError> {
    let stdin = std::io::stdin();
    let mut input = BufReader::new(stdin.lock());
    let status = dutyline::lsp::serve(&mut input, output, &files_for).map_err(CliError::stdout)?;
    Ok(ExitCode::from(status))
}
