//! `dutyline lsp`: a Language Server Protocol (3.17) server for `*.duty` files, spoken
//! over the caller's input and output streams (the CLI passes standard input and
//! output). Diagnostics on open and on every change (the same codes and help as
//! `check --analyse`), hover (a quantity in SI and report units, a constant's definition,
//! a fitting), formatting through `fmt`, completion of the language's words and the
//! document's names, document symbols and go to definition.
//!
//! No framework: [`transport`] frames messages with bounded reads, [`server`] answers
//! each one from its JSON (`serde_json`), [`position`] converts byte offsets to LSP
//! positions (UTF-16 columns). Nothing here opens a file: a document's curve CSVs are
//! read through the [`crate::model::FileAccess`] the caller gives for its URI.

pub mod hover;
pub mod meaning;
pub mod position;
pub mod server;
pub mod symbols;
pub mod transport;

use std::io::{self, BufRead, Write};

pub use server::{FilesFor, Reply, Server};

/// Serve until `exit` or the end of the input. The exit status: after `exit`, 0 when
/// `shutdown` came first and 1 otherwise (LSP 3.17); 0 when the input ends. Errors are
/// those of the streams.
pub fn serve(
    input: &mut dyn BufRead,
    output: &mut dyn Write,
    files: &FilesFor<'_>,
) -> io::Result<u8> {
    let mut server = Server::new(files);
    loop {
        let frame = transport::read_frame(input)?;
        let end = frame == transport::Frame::End;
        let reply = server.frame(frame);
        for message in &reply.messages {
            transport::write_message(output, message)?;
        }
        if let Some(status) = reply.exit {
            return Ok(status);
        }
        if end {
            return Ok(0);
        }
    }
}

/// The local path of a `file://` URI (percent-decoded), or `None` for another scheme
/// or an invalid escape.
pub fn file_path_of_uri(uri: &str) -> Option<String> {
    let rest = uri.strip_prefix("file://")?;
    // `file://host/path`: only the local host (empty or `localhost`) is a path here.
    let path = match rest.strip_prefix("localhost") {
        Some(p) if p.starts_with('/') => p,
        _ if rest.starts_with('/') => rest,
        _ => return None,
    };
    let bytes = path.as_bytes();
    let mut out = Vec::with_capacity(bytes.len());
    let mut i = 0;
    while i < bytes.len() {
        if bytes[i] == b'%' {
            let hex = path.get(i + 1..i + 3)?;
            out.push(u8::from_str_radix(hex, 16).ok()?);
            i += 3;
        } else {
            out.push(bytes[i]);
            i += 1;
        }
    }
    let decoded = String::from_utf8(out).ok()?;
    // A Windows drive path comes as `/C:/...`.
    match decoded.as_bytes() {
        [b'/', d, b':', ..] if d.is_ascii_alphabetic() => Some(decoded[1..].to_string()),
        _ => Some(decoded),
    }
}

#[cfg(test)]
mod tests {
    use super::file_path_of_uri;

    #[test]
    fn file_uris_become_paths() {
        assert_eq!(
            file_path_of_uri("file:///home/a/pump%20station/lift.duty").as_deref(),
            Some("/home/a/pump station/lift.duty")
        );
        assert_eq!(
            file_path_of_uri("file://localhost/x.duty").as_deref(),
            Some("/x.duty")
        );
        assert_eq!(
            file_path_of_uri("file:///C:/d/x.duty").as_deref(),
            Some("C:/d/x.duty")
        );
        assert_eq!(file_path_of_uri("untitled:Untitled-1"), None);
        assert_eq!(file_path_of_uri("file:///bad%zz"), None);
        assert_eq!(file_path_of_uri("file://server/share/x.duty"), None);
    }
}
