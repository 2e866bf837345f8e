//! Comments, found by a lexical scan of the source.
//!
//! The grammar skips comments, so the tree has none; the formatter finds them
//! here and puts them back. A comment is a `#` outside a quoted text, running
//! to the end of its line (`\n`, `\r\n` or `\r`), exactly as the grammar's
//! `COMMENT` rule reads it. Texts are skipped the way the grammar reads them:
//! `"""` opens a triple-quoted text that ends at the next `"""`; `"` opens a
//! plain text that ends at the next unescaped `"` or at the end of the line.

/// One comment of the source.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Comment {
    /// Byte offset of the `#`.
    pub start: usize,
    /// Byte offset just past the comment (before the line break).
    pub end: usize,
    /// The comment from `#` on, trailing white space removed.
    pub text: String,
    /// Only white space precedes the comment on its line.
    pub own_line: bool,
}

/// Every comment of `source`, in source order. Runs in one pass over the bytes.
///
/// Scanning bytes is safe for UTF-8 text: every byte the scan looks for (`#`,
/// `"`, `\`, line breaks) is ASCII, and no byte of a multi-byte character is ASCII.
pub fn scan_comments(source: &str) -> Vec<Comment> {
    let bytes = source.as_bytes();
    let mut out = Vec::new();
    let mut i = 0;
    let mut line_start = 0;
    while i < bytes.len() {
        match bytes[i] {
            b'\n' => {
                i += 1;
                line_start = i;
            }
            b'\r' => {
                i += 1;
                if bytes.get(i) == Some(&b'\n') {
                    i += 1;
                }
                line_start = i;
            }
            b'"' if bytes[i..].starts_with(b"\"\"\"") => {
                let body = i + 3;
                let close = source[body..]
                    .find("\"\"\"")
                    .map_or(bytes.len(), |k| body + k + 3);
                // A triple-quoted text may span lines: find where the last one starts.
                if let Some(k) = source[i..close].rfind(['\n', '\r']) {
                    line_start = i + k + 1;
                }
                i = close;
            }
            b'"' => {
                i += 1;
                while i < bytes.len() {
                    match bytes[i] {
                        b'\\' => i += 2,
                        b'"' => {
                            i += 1;
                            break;
                        }
                        b'\n' | b'\r' => break,
                        _ => i += 1,
                    }
                }
            }
            b'#' => {
                let end = source[i..]
                    .find(['\n', '\r'])
                    .map_or(bytes.len(), |k| i + k);
                let own_line = source[line_start..i].chars().all(is_blank_char);
                out.push(Comment {
                    start: i,
                    end,
                    text: source[i..end].trim_end().to_string(),
                    own_line,
                });
                i = end;
            }
            _ => i += 1,
        }
    }
    out
}

/// The end of `src[start..end]` without the white space and comments that follow
/// its last token. `comments` are those of `src`, in source order; `start` must be
/// where a token starts (not inside a text or comment).
pub fn code_end(src: &str, start: usize, end: usize, comments: &[Comment]) -> usize {
    let mut end = end.min(src.len());
    loop {
        let from = start.min(end);
        let trimmed =
            src[from..end].trim_end_matches(|c: char| c.is_whitespace() || c == '\u{FEFF}');
        end = from + trimmed.len();
        // The last comment starting before `end`: does `end` fall inside it?
        let k = comments.partition_point(|c| c.start < end);
        match k.checked_sub(1).map(|k| &comments[k]) {
            Some(c) if end <= c.end && c.start >= from => end = c.start,
            _ => return end,
        }
    }
}

/// The length of `text` (which starts at a token) without trailing white space and
/// comments. Cheap when there is nothing to trim.
pub fn code_len(text: &str) -> usize {
    let ends_blank = text
        .chars()
        .next_back()
        .is_some_and(|c| c.is_whitespace() || c == '\u{FEFF}');
    if !ends_blank && !text.contains('#') {
        return text.len();
    }
    code_end(text, 0, text.len(), &scan_comments(text))
}

/// White space within a line, as the grammar's `WHITESPACE` rule reads it.
pub fn is_blank_char(c: char) -> bool {
    matches!(c, ' ' | '\t' | '\u{FEFF}')
}

#[cfg(test)]
mod tests {
    use super::*;

    fn texts(src: &str) -> Vec<String> {
        scan_comments(src).into_iter().map(|c| c.text).collect()
    }

    #[test]
    fn finds_own_line_and_trailing_comments() {
        let src = "# head\nsite { elevation = 1205 ft }   # trailing  \n";
        let c = scan_comments(src);
        assert_eq!(c.len(), 2);
        assert!(c[0].own_line);
        assert_eq!(c[0].text, "# head");
        assert!(!c[1].own_line);
        assert_eq!(c[1].text, "# trailing");
        assert_eq!(&src[c[1].start..c[1].start + 1], "#");
    }

    #[test]
    fn hash_inside_texts_is_not_a_comment() {
        let src = "note \"pump #2 \\\" # still text\"\npurpose \"\"\"\nline # one\n\"\"\" # real\n";
        assert_eq!(texts(src), vec!["# real".to_string()]);
    }

    #[test]
    fn comment_after_a_multi_line_text_is_trailing() {
        let src = "purpose \"\"\"\na\nb\n\"\"\"  # after\n";
        let c = scan_comments(src);
        assert_eq!(c.len(), 1);
        assert!(!c[0].own_line);
    }

    #[test]
    fn code_len_drops_trailing_blanks_and_comments() {
        assert_eq!(code_len("x = 1 ft   # note\n  "), 8);
        assert_eq!(code_len("x = \"a # b\"  "), 11);
        assert_eq!(code_len("x = 1 ft # a\n  # b\n"), 8);
        assert_eq!(code_len("fitting exit"), 12);
    }

    #[test]
    fn carriage_returns_end_comments() {
        let src = "# one\r\n  # two\rx = 1 # three";
        let c = scan_comments(src);
        assert_eq!(
            texts(src),
            vec!["# one".to_string(), "# two".into(), "# three".into()]
        );
        assert!(c[1].own_line);
        assert!(!c[2].own_line);
    }
}
