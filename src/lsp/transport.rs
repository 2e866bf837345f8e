//! The base protocol of the Language Server Protocol: each message is a header
//! (`Content-Length: N`, other header fields ignored) and a blank line, then N bytes of
//! JSON (LSP 3.17, "Base Protocol"). Reads are bounded: a header line of at most
//! [`MAX_HEADER_LINE`] bytes, at most [`MAX_HEADER_FIELDS`] fields, a body of at most
//! [`MAX_MESSAGE_BYTES`]; a larger body is read and dropped in pieces, never held.

use std::io::{self, BufRead, Read, Write};

/// Largest message body accepted: room for a design at the source limit with every
/// character escaped in JSON (`\uXXXX`, six bytes).
pub const MAX_MESSAGE_BYTES: usize = 6 * crate::syntax::MAX_SOURCE_BYTES + 64 * 1024;
/// Longest header line, bytes.
pub const MAX_HEADER_LINE: usize = 1024;
/// Most header fields of one message.
pub const MAX_HEADER_FIELDS: usize = 16;

/// What the next frame of the input holds.
#[derive(Debug, PartialEq)]
pub enum Frame {
    /// A message body (not yet parsed).
    Message(Vec<u8>),
    /// A message larger than [`MAX_MESSAGE_BYTES`]: its length; the body was skipped.
    TooLarge(usize),
    /// A header without a usable `Content-Length`, or over the header limits: why.
    BadHeader(String),
    /// The input ended.
    End,
}

/// Read one header line (without its line end), at most [`MAX_HEADER_LINE`] bytes; a
/// longer line is consumed to its end and reported as `Err(())` inside `Ok`.
fn header_line(input: &mut dyn BufRead) -> io::Result<Option<Result<String, ()>>> {
    let mut line = Vec::new();
    let n = Read::take(&mut *input, MAX_HEADER_LINE as u64 + 1).read_until(b'\n', &mut line)?;
    if n == 0 {
        return Ok(None);
    }
    if !line.ends_with(b"\n") {
        if line.len() <= MAX_HEADER_LINE {
            return Ok(None); // the input ended inside a header
        }
        skip_line(input)?;
        return Ok(Some(Err(())));
    }
    while matches!(line.last(), Some(b'\n' | b'\r')) {
        line.pop();
    }
    Ok(Some(String::from_utf8(line).map_err(|_| ())))
}

/// Consume the input up to and including the next `\n`.
fn skip_line(input: &mut dyn BufRead) -> io::Result<()> {
    loop {
        let buf = input.fill_buf()?;
        if buf.is_empty() {
            return Ok(());
        }
        if let Some(i) = buf.iter().position(|b| *b == b'\n') {
            input.consume(i + 1);
            return Ok(());
        }
        let n = buf.len();
        input.consume(n);
    }
}

/// Read the next frame.
pub fn read_frame(input: &mut dyn BufRead) -> io::Result<Frame> {
    let mut length: Option<usize> = None;
    let mut problem: Option<String> = None;
    let mut fields = 0;
    loop {
        let Some(line) = header_line(input)? else {
            return Ok(Frame::End);
        };
        let Ok(line) = line else {
            problem = Some(format!("a header line longer than {MAX_HEADER_LINE} bytes"));
            continue;
        };
        if line.is_empty() {
            if fields == 0 && problem.is_none() {
                continue; // blank lines between messages
            }
            break;
        }
        fields += 1;
        if fields > MAX_HEADER_FIELDS {
            problem = Some(format!("more than {MAX_HEADER_FIELDS} header fields"));
        }
        let Some((name, value)) = line.split_once(':') else {
            problem = Some(format!("a header line without `:`: {}", clip(&line)));
            continue;
        };
        if name.trim().eq_ignore_ascii_case("content-length") {
            match value.trim().parse::<usize>() {
                Ok(n) => length = Some(n),
                Err(_) => {
                    problem = Some(format!(
                        "Content-Length `{}` is not a number",
                        clip(value.trim())
                    ))
                }
            }
        }
    }
    if let Some(p) = problem {
        return Ok(Frame::BadHeader(p));
    }
    let Some(length) = length else {
        return Ok(Frame::BadHeader("a header without Content-Length".into()));
    };
    if length > MAX_MESSAGE_BYTES {
        let skipped = io::copy(&mut Read::take(&mut *input, length as u64), &mut io::sink())?;
        if (skipped as usize) < length {
            return Ok(Frame::End);
        }
        return Ok(Frame::TooLarge(length));
    }
    let mut body = vec![0; length];
    match input.read_exact(&mut body) {
        Ok(()) => Ok(Frame::Message(body)),
        Err(e) if e.kind() == io::ErrorKind::UnexpectedEof => Ok(Frame::End),
        Err(e) => Err(e),
    }
}

/// At most 40 characters of a header value, for a message.
fn clip(text: &str) -> String {
    text.chars().take(40).collect()
}

/// Write one message with its header, and flush.
pub fn write_message(output: &mut dyn Write, message: &serde_json::Value) -> io::Result<()> {
    let body = message.to_string();
    write!(output, "Content-Length: {}\r\n\r\n{body}", body.len())?;
    output.flush()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn frames(input: &[u8]) -> Vec<Frame> {
        let mut r = io::Cursor::new(input.to_vec());
        let mut out = Vec::new();
        loop {
            let f = read_frame(&mut r).unwrap();
            let end = f == Frame::End;
            out.push(f);
            if end || out.len() > 10 {
                return out;
            }
        }
    }

    #[test]
    fn reads_messages_and_survives_bad_headers() {
        let input = b"Content-Length: 2\r\n\r\n{}Content-Type: x\r\n\r\nContent-Length: abc\r\n\r\nContent-Length: 3\r\n\r\n[1]";
        let f = frames(input);
        assert_eq!(f[0], Frame::Message(b"{}".to_vec()));
        assert!(matches!(&f[1], Frame::BadHeader(p) if p.contains("without Content-Length")));
        assert!(matches!(&f[2], Frame::BadHeader(p) if p.contains("not a number")));
        assert_eq!(f[3], Frame::Message(b"[1]".to_vec()));
        assert_eq!(f[4], Frame::End);
    }

    #[test]
    fn oversized_bodies_and_lines_are_dropped_not_held() {
        let big = MAX_MESSAGE_BYTES + 1;
        let mut input = format!("Content-Length: {big}\r\n\r\n").into_bytes();
        input.extend(std::iter::repeat_n(b' ', big));
        input.extend(b"Content-Length: 2\r\n\r\n{}");
        let f = frames(&input);
        assert_eq!(f[0], Frame::TooLarge(big));
        assert_eq!(f[1], Frame::Message(b"{}".to_vec()));
        let mut long = vec![b'X'; 5000];
        long.extend(b"\r\n\r\nContent-Length: 2\r\n\r\n{}");
        let f = frames(&long);
        assert!(matches!(&f[0], Frame::BadHeader(p) if p.contains("longer than")));
        assert_eq!(f[1], Frame::Message(b"{}".to_vec()));
        // A body cut short by the end of the input.
        assert_eq!(frames(b"Content-Length: 10\r\n\r\n{}")[0], Frame::End);
    }
}
