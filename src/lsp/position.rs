//! Byte offsets in a document and Language Server Protocol positions: a zero-based line
//! and a zero-based column counted in UTF-16 code units (LSP 3.17, "Position"; the
//! default `positionEncoding` "utf-16"). Lines end at `\n`, `\r\n` or a lone `\r`, as in
//! the grammar.

use serde_json::{json, Value};

/// The LSP position (line, UTF-16 column) of a byte offset; an offset past the end or
/// inside a character is taken at the next character boundary before it.
pub fn position(source: &str, offset: usize) -> (u32, u32) {
    let mut offset = offset.min(source.len());
    while !source.is_char_boundary(offset) {
        offset -= 1;
    }
    let (mut line, mut column) = (0u32, 0u32);
    let mut chars = source[..offset].chars().peekable();
    while let Some(c) = chars.next() {
        match c {
            '\n' => (line, column) = (line.saturating_add(1), 0),
            '\r' if chars.peek() != Some(&'\n') => (line, column) = (line.saturating_add(1), 0),
            '\r' => {}
            c => column = column.saturating_add(c.len_utf16() as u32),
        }
    }
    (line, column)
}

/// The byte offset of an LSP position: a column past the end of its line is the line's
/// end, a line past the last is the end of the document, and a column inside a
/// surrogate pair is the start of that character.
pub fn offset(source: &str, line: u32, column: u32) -> usize {
    let mut at = 0;
    let bytes = source.as_bytes();
    for _ in 0..line {
        match bytes[at..].iter().position(|b| *b == b'\n' || *b == b'\r') {
            Some(i) => {
                at += i + 1;
                if bytes[at - 1] == b'\r' && bytes.get(at) == Some(&b'\n') {
                    at += 1;
                }
            }
            None => return source.len(),
        }
    }
    let mut units = 0u32;
    for (i, c) in source[at..].char_indices() {
        if c == '\n' || c == '\r' {
            return at + i;
        }
        let next = units.saturating_add(c.len_utf16() as u32);
        if next > column {
            return at + i;
        }
        units = next;
    }
    source.len()
}

/// An LSP `Range` of the bytes `start..end`.
pub fn range(source: &str, start: usize, end: usize) -> Value {
    let (a, b) = (position(source, start), position(source, end.max(start)));
    json!({
        "start": { "line": a.0, "character": a.1 },
        "end": { "line": b.0, "character": b.1 },
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn columns_count_utf16_code_units() {
        // `°` is one UTF-16 unit (two bytes), `𝐐` two units (four bytes).
        let s = "a = 1 °C\nq = 𝐐 x\r\nend";
        assert_eq!(position(s, s.find('C').unwrap()), (0, 7));
        assert_eq!(position(s, s.find('x').unwrap()), (1, 7));
        assert_eq!(position(s, s.find("end").unwrap()), (2, 0));
        for target in ['C', 'x', 'e'] {
            let at = s.find(target).unwrap();
            let (l, c) = position(s, at);
            assert_eq!(offset(s, l, c), at, "{target}");
        }
    }

    #[test]
    fn out_of_range_positions_are_clamped() {
        let s = "ab\ncd";
        assert_eq!(offset(s, 0, 99), 2);
        assert_eq!(offset(s, 9, 0), s.len());
        assert_eq!(position(s, 999), (1, 2));
        // Inside the surrogate pair of 𝐐: the start of the character.
        let t = "𝐐z";
        assert_eq!(offset(t, 0, 1), 0);
        assert_eq!(offset(t, 0, 2), 4);
        // A lone carriage return ends a line.
        assert_eq!(position("a\rb", 2), (1, 0));
        assert_eq!(offset("a\rb", 1, 0), 2);
    }
}
