//! Line breaking by font metrics: greedy, ragged right, with forced breaks inside words
//! that are wider than the measure (long identifiers, hashes, file paths).

use super::font::{Face, FontSet};
use super::page::{Item, TextRun};
use super::style::Colour;

/// A run of one face inside a line, positioned from the line start.
#[derive(Debug, Clone, PartialEq)]
pub struct Run {
    /// Face actually drawn (after glyph fallback).
    pub face: Face,
    /// Characters drawn.
    pub text: String,
    /// Offset from the line start in points.
    pub x: f64,
    /// Advance width in points.
    pub width: f64,
}

/// One output line.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Line {
    /// Runs, left to right.
    pub runs: Vec<Run>,
    /// Width of the line in points (trailing spaces excluded).
    pub width: f64,
}

impl Line {
    /// Text runs of this line placed at `x` on `baseline`, limited by `limit_right`.
    pub fn items(
        &self,
        x: f64,
        baseline: f64,
        size: f64,
        colour: Colour,
        limit_right: f64,
    ) -> Vec<Item> {
        self.runs
            .iter()
            .map(|r| {
                Item::Text(TextRun {
                    x: x + r.x,
                    baseline,
                    face: r.face,
                    size,
                    colour,
                    text: r.text.clone(),
                    width: r.width,
                    limit_right,
                    angle_deg: 0.0,
                })
            })
            .collect()
    }

    /// The line's text.
    pub fn text(&self) -> String {
        self.runs.iter().map(|r| r.text.as_str()).collect()
    }
}

/// A character with its requested face and measured width.
#[derive(Debug, Clone, Copy)]
struct Glyph {
    face: Face,
    ch: char,
    width: f64,
}

/// A word (a range of the glyph buffer), a space, or a forced break.
enum Token {
    Word(usize, usize),
    Space(Glyph),
    Break,
}

/// Wraps text given as `(face, text)` pieces to `max_width` points at `size` points.
/// Runs of spaces collapse to one; `'\n'` forces a line break. Always returns at
/// least one line.
pub fn wrap(fonts: &FontSet, pieces: &[(Face, &str)], size: f64, max_width: f64) -> Vec<Line> {
    // Every word's glyphs in one buffer, the words as ranges of it.
    let mut glyphs: Vec<Glyph> = Vec::with_capacity(pieces.iter().map(|p| p.1.len()).sum());
    let mut tokens = Vec::new();
    let mut word_start = 0;
    for &(face, text) in pieces {
        let mut chars = text.chars().filter(|c| *c != '\r').peekable();
        while let Some(ch) = chars.next() {
            // A space before a percent sign does not break: "130 %" stays on one line.
            if ch == ' ' && chars.peek() == Some(&'%') && glyphs.len() > word_start {
                glyphs.push(glyph(fonts, face, ' ', size));
                continue;
            }
            if ch == '\n' || ch == ' ' || ch == '\t' {
                if glyphs.len() > word_start {
                    tokens.push(Token::Word(word_start, glyphs.len()));
                    word_start = glyphs.len();
                }
                tokens.push(if ch == '\n' {
                    Token::Break
                } else {
                    Token::Space(glyph(fonts, face, ' ', size))
                });
            } else {
                glyphs.push(glyph(fonts, face, ch, size));
            }
        }
    }
    if glyphs.len() > word_start {
        tokens.push(Token::Word(word_start, glyphs.len()));
    }

    let mut lines = Vec::new();
    let mut line: Vec<Glyph> = Vec::new();
    let mut line_width = 0.0;
    let mut pending_space: Option<Glyph> = None;
    for token in tokens {
        match token {
            Token::Break => {
                lines.push(finish(fonts, &line));
                line.clear();
                line_width = 0.0;
                pending_space = None;
            }
            Token::Space(g) => {
                if !line.is_empty() {
                    pending_space = Some(g);
                }
            }
            Token::Word(a, b) => {
                let w = &glyphs[a..b];
                let word_width: f64 = w.iter().map(|g| g.width).sum();
                let space = pending_space.take();
                let space_width = space.map_or(0.0, |g| g.width);
                if line_width + space_width + word_width <= max_width {
                    if let Some(s) = space {
                        line.push(s);
                    }
                    line.extend_from_slice(w);
                    line_width += space_width + word_width;
                    continue;
                }
                if !line.is_empty() {
                    lines.push(finish(fonts, &line));
                    line.clear();
                }
                let mut rest: &[Glyph] = w;
                let mut rest_width = word_width;
                // Each pass takes at least one glyph, so the loop ends even when
                // `max_width` is negative (an empty rest is never "too wide").
                while !rest.is_empty() && wider_than(rest, &mut rest_width, max_width) {
                    let n = fit_count(rest, max_width);
                    rest_width -= width_of(&rest[..n]);
                    lines.push(finish(fonts, &rest[..n]));
                    rest = &rest[n..];
                }
                line.extend_from_slice(rest);
                line_width = width_of(rest);
            }
        }
    }
    if !line.is_empty() || lines.is_empty() {
        lines.push(finish(fonts, &line));
    }
    lines
}

/// Wraps one plain string in one face.
pub fn wrap_plain(fonts: &FontSet, text: &str, face: Face, size: f64, max_width: f64) -> Vec<Line> {
    wrap(fonts, &[(face, text)], size, max_width)
}

/// Breaks a preformatted line (spaces kept, tabs expanded to 4 columns) into pieces no
/// wider than `first_width` (first piece) and `next_width` (continuations).
pub fn break_preformatted(
    fonts: &FontSet,
    text: &str,
    face: Face,
    size: f64,
    first_width: f64,
    next_width: f64,
) -> Vec<Line> {
    let mut expanded = String::with_capacity(text.len());
    let mut column = 0;
    for ch in text.chars().filter(|c| *c != '\r') {
        if ch == '\t' {
            let n = 4 - column % 4;
            expanded.extend(std::iter::repeat_n(' ', n));
            column += n;
        } else {
            expanded.push(ch);
            column += 1;
        }
    }
    let glyphs: Vec<Glyph> = expanded
        .chars()
        .map(|c| glyph(fonts, face, c, size))
        .collect();
    let mut lines = Vec::new();
    let mut rest: &[Glyph] = &glyphs;
    let mut rest_width = width_of(rest);
    let mut width = first_width;
    // Each pass takes at least one glyph (`fit_count`), and an empty rest ends the loop,
    // so it runs at most once per glyph, whatever the widths (negative or NaN included).
    loop {
        if rest.is_empty() || !wider_than(rest, &mut rest_width, width) {
            lines.push(finish_keep_spaces(fonts, rest));
            return lines;
        }
        let n = fit_count(rest, width);
        rest_width -= width_of(&rest[..n]);
        lines.push(finish_keep_spaces(fonts, &rest[..n]));
        rest = &rest[n..];
        width = next_width;
    }
}

fn width_of(glyphs: &[Glyph]) -> f64 {
    glyphs.iter().map(|g| g.width).sum()
}

/// Whether `glyphs` are wider than `max_width`, given `running`, their width kept by
/// subtraction as pieces are taken off the front. A clearly wider rest is decided from
/// the running width alone, so breaking a long word stays linear in its length; near the
/// limit the width is summed afresh (and `running` reset), so rounding in the running
/// width never lets a piece exceed the measure.
fn wider_than(glyphs: &[Glyph], running: &mut f64, max_width: f64) -> bool {
    // One point of margin is far above the rounding of any sum of glyph widths.
    if *running > max_width + 1.0 {
        return true;
    }
    *running = width_of(glyphs);
    *running > max_width
}

fn glyph(fonts: &FontSet, face: Face, ch: char, size: f64) -> Glyph {
    Glyph {
        face,
        ch,
        width: fonts.char_width(face, ch, size),
    }
}

/// How many leading glyphs of an over-long word to put on one line: as many as fit,
/// moved back to just after a '-', '/', '_', '.', ',' or ':' when one lies in the
/// second half. At least one glyph, so progress is guaranteed.
fn fit_count(glyphs: &[Glyph], max_width: f64) -> usize {
    let mut width = 0.0;
    let mut n = 0;
    for g in glyphs {
        if width + g.width > max_width && n > 0 {
            break;
        }
        width += g.width;
        n += 1;
    }
    if n < glyphs.len() {
        if let Some(i) = glyphs[..n]
            .iter()
            .rposition(|g| matches!(g.ch, '-' | '/' | '_' | '.' | ',' | ':' | ';' | '=' | ' '))
        {
            if i + 1 >= n.div_ceil(2) {
                return i + 1;
            }
        }
    }
    n.max(1)
}

fn finish(fonts: &FontSet, glyphs: &[Glyph]) -> Line {
    let end = glyphs
        .iter()
        .rposition(|g| g.ch != ' ')
        .map_or(0, |i| i + 1);
    finish_keep_spaces(fonts, &glyphs[..end])
}

fn finish_keep_spaces(fonts: &FontSet, glyphs: &[Glyph]) -> Line {
    let mut line = Line::default();
    for (i, g) in glyphs.iter().enumerate() {
        let (face, ch) = fonts.resolve(g.face, g.ch);
        match line.runs.last_mut() {
            Some(run) if run.face == face => {
                run.text.push(ch);
                run.width += g.width;
            }
            _ => {
                // Room for the rest of the line in this run (one byte a glyph).
                let mut text = String::with_capacity(glyphs.len() - i);
                text.push(ch);
                line.runs.push(Run {
                    face,
                    text,
                    x: line.width,
                    width: g.width,
                });
            }
        }
        line.width += g.width;
    }
    line
}

#[cfg(test)]
mod tests {
    use super::super::font::fonts;
    use super::*;

    #[test]
    fn wraps_within_width() {
        let f = fonts().expect("fonts");
        let text = "The system curve rises with the square of the flow rate, \
                    as the Darcy-Weisbach equation predicts for fully rough flow.";
        let lines = wrap_plain(f, text, Face::Regular, 10.0, 120.0);
        assert!(lines.len() > 3);
        for l in &lines {
            assert!(l.width <= 120.0 + 1e-9, "{} is {}", l.text(), l.width);
        }
        let joined: Vec<String> = lines.iter().map(Line::text).collect();
        assert_eq!(joined.join(" "), text);
    }

    #[test]
    fn a_percent_sign_stays_with_its_number() {
        let f = fonts().expect("fonts");
        let text = "outside the allowable 50–130 %";
        // Just too narrow for the whole text: the break falls before "130 %", never
        // between "130" and "%".
        let width = f.width(Face::Regular, text, 9.0) - 1.0;
        let lines = wrap_plain(f, text, Face::Regular, 9.0, width);
        let texts: Vec<String> = lines.iter().map(Line::text).collect();
        assert_eq!(texts, ["outside the allowable", "50–130 %"]);
    }

    #[test]
    fn carriage_returns_are_dropped_and_newlines_break() {
        let f = fonts().expect("fonts");
        let lines = wrap_plain(f, "first\r\nsecond", Face::Regular, 9.0, 500.0);
        let texts: Vec<String> = lines.iter().map(Line::text).collect();
        assert_eq!(texts, ["first", "second"]);
    }

    #[test]
    fn long_words_are_broken() {
        let f = fonts().expect("fonts");
        let hash = "3f786850e387550fdab836ed7e6dc881de23001b3f786850e387550fdab836ed";
        let lines = wrap_plain(f, hash, Face::Mono, 8.0, 50.0);
        assert!(lines.len() > 5);
        assert!(lines.iter().all(|l| l.width <= 50.0 + 1e-9));
        let joined: String = lines.iter().map(Line::text).collect();
        assert_eq!(joined, hash);
    }

    #[test]
    fn faces_mix_and_fall_back() {
        let f = fonts().expect("fonts");
        let lines = wrap(
            f,
            &[(Face::Bold, "Flow:"), (Face::Regular, " 12 m³/h")],
            9.0,
            500.0,
        );
        assert_eq!(lines.len(), 1);
        assert_eq!(lines[0].text(), "Flow: 12 m³/h");
        assert_eq!(lines[0].runs[0].face, Face::Bold);
    }

    #[test]
    fn degenerate_widths_still_end() {
        let f = fonts().expect("fonts");
        for width in [-10.0, 0.0, f64::NAN] {
            let lines = wrap_plain(f, "abc defgh", Face::Regular, 10.0, width);
            let text: String = lines.iter().map(Line::text).collect();
            assert_eq!(text.replace(' ', ""), "abcdefgh", "width {width}");
            let pieces = break_preformatted(f, "abc", Face::Mono, 8.0, width, width);
            let text: String = pieces.iter().map(Line::text).collect();
            assert_eq!(text, "abc", "width {width}");
        }
    }

    #[test]
    fn preformatted_keeps_spaces_and_wraps() {
        let f = fonts().expect("fonts");
        let line = "\tpump P1 { curve = \"a.csv\" }   # trailing comment that is long";
        let pieces = break_preformatted(f, line, Face::Mono, 8.0, 100.0, 90.0);
        assert!(pieces.len() > 1);
        assert!(pieces[0].text().starts_with("    pump"));
        assert!(pieces[0].width <= 100.0 + 1e-9);
        assert!(pieces[1..].iter().all(|p| p.width <= 90.0 + 1e-9));
    }
}
