//! Length limits on names and texts, checked in one linear pass before the parser runs,
//! so that oversize input is a located error, not a slow run or a package that cannot
//! be laid out (grammar/LANGUAGE.md, "Limits").

use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};

/// Longest name (identifier, keyword, unit word) accepted, in characters.
pub const MAX_IDENTIFIER_CHARS: usize = 200;
/// Longest quoted text accepted, in characters (quotes excluded).
pub const MAX_TEXT_CHARS: usize = 10_000;
/// Most length errors reported for one file; the rest are the same mistake again.
const MAX_REPORTED: usize = 20;

/// Where the scan is: between tokens, in a comment, or inside a quoted text.
#[derive(Clone, Copy, PartialEq)]
enum State {
    Code,
    Comment,
    Plain,
    Triple,
}

/// Every name longer than [`MAX_IDENTIFIER_CHARS`] and text longer than
/// [`MAX_TEXT_CHARS`] (at most `MAX_REPORTED` of them), in file order.
pub fn check_lengths(source: &str) -> Vec<Diagnostic> {
    let mut out = Vec::new();
    let mut state = State::Code;
    // Start (byte offset) and length (chars) of the current word or text.
    let mut word: Option<(usize, usize, bool)> = None; // (start, chars, has a letter)
    let mut text: (usize, usize) = (0, 0);
    let mut escaped = false;
    let mut chars = source.char_indices().peekable();
    while let Some((i, ch)) = chars.next() {
        match state {
            State::Code => {
                if ch.is_ascii_alphanumeric() || ch == '_' {
                    let w = word.get_or_insert((i, 0, false));
                    w.1 += 1;
                    w.2 |= ch.is_ascii_alphabetic() || ch == '_';
                    continue;
                }
                if let Some((start, n, letter)) = word.take() {
                    if letter && n > MAX_IDENTIFIER_CHARS {
                        out.push(long_name(start, i, n));
                    }
                }
                match ch {
                    '#' => state = State::Comment,
                    '"' if source[i..].starts_with("\"\"\"") => {
                        chars.next();
                        chars.next();
                        state = State::Triple;
                        text = (i, 0);
                    }
                    '"' => {
                        state = State::Plain;
                        text = (i, 0);
                        escaped = false;
                    }
                    _ => {}
                }
            }
            State::Comment => {
                if ch == '\n' {
                    state = State::Code;
                }
            }
            State::Plain => {
                if escaped {
                    escaped = false;
                    text.1 += 1;
                } else if ch == '\\' {
                    escaped = true;
                } else if ch == '"' || ch == '\n' {
                    if text.1 > MAX_TEXT_CHARS {
                        out.push(long_text(text.0, i + 1, text.1));
                    }
                    state = State::Code;
                } else {
                    text.1 += 1;
                }
            }
            State::Triple => {
                if ch == '"' && source[i..].starts_with("\"\"\"") {
                    chars.next();
                    chars.next();
                    if text.1 > MAX_TEXT_CHARS {
                        out.push(long_text(text.0, i + 3, text.1));
                    }
                    state = State::Code;
                } else {
                    text.1 += 1;
                }
            }
        }
        if out.len() >= MAX_REPORTED {
            return out;
        }
    }
    if let Some((start, n, true)) = word {
        if n > MAX_IDENTIFIER_CHARS {
            out.push(long_name(start, source.len(), n));
        }
    }
    if matches!(state, State::Plain | State::Triple) && text.1 > MAX_TEXT_CHARS {
        out.push(long_text(text.0, source.len(), text.1));
    }
    out
}

fn long_name(start: usize, end: usize, chars: usize) -> Diagnostic {
    Diagnostic::error(
        Code::TooLong,
        format!("this name is {chars} characters long; names are limited to {MAX_IDENTIFIER_CHARS}"),
        Some(Span::new(start, end)),
    )
    .with_label("name too long")
    .with_help("use a short name such as `P1` or `sump`; a pump's description goes in quotes after its name")
}

fn long_text(start: usize, end: usize, chars: usize) -> Diagnostic {
    Diagnostic::error(
        Code::TooLong,
        format!("this text is {chars} characters long; texts are limited to {MAX_TEXT_CHARS}"),
        Some(Span::new(start, end)),
    )
    .with_label("text too long")
    .with_help("keep texts to a few paragraphs; cite a separate document for longer material")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn long_names_and_texts_are_found_and_located() {
        let name = "a".repeat(MAX_IDENTIFIER_CHARS + 1);
        let src = format!("tank {name} {{ level = 1 m }}\n");
        let d = check_lengths(&src);
        assert_eq!(d.len(), 1);
        assert_eq!(d[0].span, Some(Span::new(5, 5 + name.len())));
        let text = "x".repeat(MAX_TEXT_CHARS + 1);
        let src = format!("note \"{text}\"\npurpose \"\"\"{text}\"\"\"\n");
        assert_eq!(check_lengths(&src).len(), 2);
    }

    #[test]
    fn at_the_limit_and_in_comments_nothing_is_reported() {
        let name = "a".repeat(MAX_IDENTIFIER_CHARS);
        let long = "b".repeat(5 * MAX_IDENTIFIER_CHARS);
        let digits = "9".repeat(5 * MAX_IDENTIFIER_CHARS);
        let src = format!("tank {name} {{ level = {digits} m }} # {long}\nnote \"{long}\"\n");
        assert!(check_lengths(&src).is_empty());
    }
}
