//! The canonical formatter: a design file printed back in one layout.
//!
//! [`format_source`] parses the file, prints the tree in the canonical layout
//! below, puts every comment back, and checks its own work: the output must
//! parse to the same statements and hold the same comments in the same order,
//! or an error is returned instead of text. Formatting is idempotent.
//!
//! # The canonical layout
//!
//! * **Lines.** One statement per line; `,` and `;` separators become line breaks,
//!   except inside a one-line body (see **Blocks**).
//!   Indentation is 4 spaces per level; lines end in `\n`; no trailing white space;
//!   the file ends with one line break (an empty file stays empty).
//! * **Spacing.** Single spaces between block words and arguments
//!   (`pipe steel 8 in schedule 40`), around `=`, `>=`, `<=` and the operators
//!   `+ - * /` (`1460 ft + 35 ft`, `2 * 7.5 ft`); none after a unary minus (`-2.5 ft`),
//!   around `^` or inside parentheses (kept as written). No column alignment of `=`:
//!   a changed line never re-aligns its neighbours, so diffs stay small.
//! * **Values.** Numbers and units exactly as written (`1208.5`, `1.5e-3`, `m^3/h`),
//!   with one space between a number and its unit (`94.1 %`). `>=`/`≥` print as `>=`,
//!   `×`/`·` as `*`, `−` as `-`, dashes in tables as `-`. Requirement scopes print as
//!   `for normal, dry`.
//! * **Texts.** A text without a line break prints in `"` quotes, with `\` and `"`
//!   escaped as `\\` and `\"`. A text with line breaks prints as a `"""` block: the
//!   opening `"""` ends the statement's first line, the text follows indented one
//!   level deeper than the statement, and the closing `"""` stands alone at the
//!   statement's indentation. (A text holding both a line break and `"""` prints in
//!   `"` quotes with `\n` escapes.)
//! * **Blocks.** `keyword args {`, the body one level deeper, `}` on its own line.
//!   A body prints on the header's line in exactly three cases, and only when no
//!   comment lies between its braces: an empty body prints `{ }`; a body of exactly one
//!   field or requirement (`name = value`, `flow >= 700 gpm`) prints `{ hours = 1400 h }`;
//!   a body of several fields or requirements that the source already wrote on one line
//!   stays there, separated by `, ` (`project { title = "A", units = us }`). Either only
//!   when the whole line, indentation included, is at most [`MAX_INLINE_WIDTH`]
//!   characters and every value is on one line. Every other body is expanded.
//! * **Curve tables.** The header and each row on their own line, one level inside
//!   the `curve ... {`. Header cells are `name unit`; each column is as wide as its
//!   widest cell (header included), cells are left-aligned and columns are
//!   separated by three spaces; the last cell of a line is not padded. Empty
//!   cells print `-`.
//! * **Blank lines.** Between two statements of the same block (or of the file),
//!   or before a comment, one blank line is kept where the source had one or more;
//!   none is kept after a `{`, before a `}`, inside a curve table, or at the start
//!   or end of the file.
//! * **Comments** are kept verbatim (from `#` to the end of the line, trailing white
//!   space removed). A comment alone on its line prints on its own line at the
//!   indentation of the statement (or table row) that follows it, or of the block's
//!   body when it is the last thing before a `}`. A comment after code on the same
//!   line stays at the end of that line, after two spaces: on a block header it
//!   stays on the header (`line suction from wet_well to pump {  # flooded`), after
//!   a `}` on the `}` line, on a table row on that row. A comment on a line that
//!   several statements end belongs to the last of them, and of nested statements
//!   to the outermost (`case dry { hours = 300 h }  # note` keeps it after the `}`).

use super::ast::*;
use super::comments::{code_end, is_blank_char, scan_comments, Comment};
use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};

/// Indentation of one level.
pub const INDENT: &str = "    ";
/// Widest line, in characters, on which a body may stay on its header's line.
pub const MAX_INLINE_WIDTH: usize = 80;
/// Space between the columns of a curve table.
const TABLE_GUTTER: &str = "   ";

/// Format a design file in the canonical layout. Syntax errors are returned as
/// the parser's diagnostics; the output is checked to mean the same as the input
/// (same statements, same comments in the same order) before it is returned.
/// Costs two parses and three printings of the file.
pub fn format_source(source: &str) -> Result<String, Vec<Diagnostic>> {
    let file = super::parse(source)?;
    let comments = scan_comments(source);
    let out = Printer::new(source, comments.clone(), true).file(&file);
    // Check the output: it must parse, mean the same and keep every comment.
    let again = super::parse(&out).map_err(|_| internal("the output would not parse"))?;
    let meaning = |f: &File, src: &str| Printer::new(src, Vec::new(), false).file(f);
    if meaning(&file, source) != meaning(&again, &out) {
        return Err(internal("the output would not mean the same"));
    }
    let kept: Vec<String> = scan_comments(&out).into_iter().map(|c| c.text).collect();
    if kept != comments.into_iter().map(|c| c.text).collect::<Vec<_>>() {
        return Err(internal("comments would be lost or moved"));
    }
    Ok(out)
}

fn internal(what: &str) -> Vec<Diagnostic> {
    vec![Diagnostic::error(
        Code::FormatFailed,
        format!("the file cannot be formatted: {what}"),
        None,
    )
    .with_help("this is a defect of the formatter; please report it with the file")]
}

struct Printer<'a> {
    src: &'a str,
    comments: Vec<Comment>,
    /// Index of the first comment not yet printed.
    next: usize,
    /// Keep blank lines from the source (off when printing the bare meaning).
    layout: bool,
    out: String,
    /// At the start of the file or of a body: no blank line may come here.
    fresh: bool,
}

impl<'a> Printer<'a> {
    fn new(src: &'a str, comments: Vec<Comment>, layout: bool) -> Self {
        Printer {
            src,
            comments,
            next: 0,
            layout,
            out: String::new(),
            fresh: true,
        }
    }

    fn file(mut self, file: &File) -> String {
        self.statements(&file.statements, 0, self.src.len());
        self.leading(usize::MAX, 0, true);
        self.out
    }

    /// The statements of a body (or file) at `depth`, ending before `close`.
    fn statements(&mut self, list: &[Statement], depth: usize, close: usize) {
        for (i, st) in list.iter().enumerate() {
            let limit = list.get(i + 1).map_or(close, |n| n.span.start);
            self.leading(st.span.start, depth, true);
            self.blank(st.span.start, true);
            self.statement(st, depth, limit);
        }
    }

    fn statement(&mut self, st: &Statement, depth: usize, limit: usize) {
        let end = self.tight_end(st.span);
        match &st.kind {
            StatementKind::Block {
                keyword,
                args,
                body,
            } => {
                let head = self.head(&keyword.name, args, depth);
                match body {
                    None => self.emit(depth, &head, end, limit),
                    Some(body) => {
                        let open = self.open_brace(keyword.span, args);
                        self.body(depth, &head, body, (open, end), limit);
                    }
                }
            }
            StatementKind::Curve {
                keyword,
                args,
                table,
            } => {
                let head = self.head(&keyword.name, args, depth);
                let Some(table) = table else {
                    return self.emit(depth, &head, end, limit);
                };
                let open = self.open_brace(keyword.span, args);
                let close = end.saturating_sub(1);
                self.emit(depth, &format!("{head} {{"), open + 1, table.span.start);
                self.table(table, depth + 1, close);
                self.leading(close, depth + 1, false);
                self.emit(depth, "}", end, limit);
            }
            _ => {
                let text = self.simple(st, depth);
                self.emit(depth, &text, end, limit);
            }
        }
    }

    /// A block body; `braces` are the offsets of `{` and just past `}`.
    fn body(
        &mut self,
        depth: usize,
        head: &str,
        body: &[Statement],
        braces: (usize, usize),
        limit: usize,
    ) {
        let (open, end) = braces;
        let close = end.saturating_sub(1);
        let commented = self.comments[self.next..]
            .iter()
            .any(|c| c.start > open && c.start < close);
        if !commented {
            if body.is_empty() {
                return self.emit(depth, &format!("{head} {{ }}"), end, limit);
            }
            let one_line_source = !self.src[open..close].contains(['\n', '\r']);
            if body.iter().all(is_field) && (body.len() == 1 || one_line_source) {
                let fields: Vec<String> = body.iter().map(|f| self.simple(f, depth + 1)).collect();
                let line = format!("{head} {{ {} }}", fields.join(", "));
                let width = INDENT.len() * depth + line.chars().count();
                if !line.contains('\n') && width <= MAX_INLINE_WIDTH {
                    return self.emit(depth, &line, end, limit);
                }
            }
        }
        let first = body.first().map_or(close, |s| s.span.start);
        self.emit(depth, &format!("{head} {{"), open + 1, first);
        self.fresh = true;
        self.statements(body, depth + 1, close);
        self.leading(close, depth + 1, false);
        self.emit(depth, "}", end, limit);
    }

    fn table(&mut self, t: &Table, depth: usize, close: usize) {
        let mut lines: Vec<(Vec<String>, Span)> = Vec::new();
        let header_span = match (t.columns.first(), t.columns.last()) {
            (Some(a), Some(b)) => a.span.join(b.span),
            _ => t.span,
        };
        lines.push((
            t.columns
                .iter()
                .map(|c| format!("{} {}", c.name.name, c.unit.text))
                .collect(),
            header_span,
        ));
        for r in &t.rows {
            let cells = r
                .cells
                .iter()
                .map(|c| c.value.as_ref().map_or("-".to_string(), |n| n.text.clone()))
                .collect();
            lines.push((cells, r.span));
        }
        let columns = lines.iter().map(|l| l.0.len()).max().unwrap_or(0);
        let widths: Vec<usize> = (0..columns)
            .map(|j| {
                lines
                    .iter()
                    .filter_map(|l| l.0.get(j))
                    .map(|c| c.chars().count())
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        self.fresh = true;
        for (i, (cells, span)) in lines.iter().enumerate() {
            let limit = lines.get(i + 1).map_or(close, |n| n.1.start);
            self.leading(span.start, depth, false);
            let mut text = String::new();
            for (j, cell) in cells.iter().enumerate() {
                if j > 0 {
                    text.push_str(TABLE_GUTTER);
                }
                text.push_str(cell);
                let pad = widths[j].saturating_sub(cell.chars().count());
                text.extend(std::iter::repeat_n(' ', pad));
            }
            let end = self.tight_end(*span);
            self.emit(depth, text.trim_end(), end, limit);
        }
    }

    /// `keyword arg arg`.
    fn head(&self, keyword: &str, args: &[Arg], depth: usize) -> String {
        let mut s = keyword.to_string();
        for a in args {
            s.push(' ');
            s.push_str(&match &a.kind {
                ArgKind::Word(w) => w.clone(),
                ArgKind::Number(n) => n.text.clone(),
                ArgKind::Quantity { value, unit } => format!("{} {}", value.text, unit.text),
                ArgKind::Text(t) => text(t, depth),
                ArgKind::Date(d) => d.clone(),
                ArgKind::Star => "*".to_string(),
            });
        }
        s
    }

    /// A `let`, field or requirement on its own.
    fn simple(&self, st: &Statement, depth: usize) -> String {
        match &st.kind {
            StatementKind::Let { name, value } => {
                format!("let {} = {}", name.name, expr(value, depth))
            }
            StatementKind::Assign { path, value } => {
                format!("{} = {}", path.dotted(), expr(value, depth))
            }
            StatementKind::Condition {
                path,
                at,
                op,
                value,
                cases,
            } => {
                let place = at
                    .as_ref()
                    .map(|n| format!(" at {}", n.name))
                    .unwrap_or_default();
                let mut s = format!(
                    "{}{place} {} {}",
                    path.dotted(),
                    op.symbol(),
                    expr(value, depth)
                );
                if !cases.is_empty() {
                    let names: Vec<&str> = cases.iter().map(|c| c.name.as_str()).collect();
                    s.push_str(" for ");
                    s.push_str(&names.join(", "));
                }
                s
            }
            _ => String::new(),
        }
    }

    /// Print one (possibly multi-line) item, its trailing comment if one ends the
    /// source line at `end` before `limit`, and a line break.
    fn emit(&mut self, depth: usize, text: &str, end: usize, limit: usize) {
        self.fresh = false;
        self.out.push_str(&INDENT.repeat(depth));
        self.out.push_str(text);
        if let Some(c) = self.comments.get(self.next) {
            let same_line = self
                .src
                .get(end..c.start)
                .is_some_and(|gap| !gap.contains(['\n', '\r']));
            if c.start >= end && c.start < limit && same_line {
                self.out.push_str("  ");
                self.out.push_str(&c.text);
                self.next += 1;
            }
        }
        self.out.push('\n');
    }

    /// Print the comments that start before `pos`, each on its own line.
    fn leading(&mut self, pos: usize, depth: usize, blanks: bool) {
        while let Some(c) = self.comments.get(self.next) {
            if c.start >= pos {
                break;
            }
            let (start, text) = (c.start, c.text.clone());
            self.next += 1;
            self.blank(start, blanks);
            self.fresh = false;
            self.out.push_str(&INDENT.repeat(depth));
            self.out.push_str(&text);
            self.out.push('\n');
        }
    }

    /// One blank line when the item at `pos` starts its line and the source line
    /// before it is blank, unless the item opens its body or the file.
    fn blank(&mut self, pos: usize, allowed: bool) {
        if allowed && self.layout && !self.fresh && blank_line_before(self.src, pos) {
            self.out.push('\n');
        }
        self.fresh = false;
    }

    /// The end of a span without the white space and comments the grammar may
    /// have skipped after its last token.
    fn tight_end(&self, span: Span) -> usize {
        code_end(self.src, span.start, span.end, &self.comments)
    }

    /// Offset of the `{` after a block's keyword and arguments.
    fn open_brace(&self, keyword: Span, args: &[Arg]) -> usize {
        let after = args.last().map_or(keyword.end, |a| a.span.end);
        let rest = self.src.get(after..).unwrap_or("");
        after + rest.find('{').unwrap_or(0)
    }
}

/// A field or a requirement: the statements a body may hold on its header's line.
fn is_field(st: &Statement) -> bool {
    matches!(
        st.kind,
        StatementKind::Assign { .. } | StatementKind::Condition { .. }
    )
}

fn blank_line_before(src: &str, pos: usize) -> bool {
    let Some(before) = src.get(..pos) else {
        return false;
    };
    let line_start = before.rfind(['\n', '\r']).map_or(0, |k| k + 1);
    if !before[line_start..].chars().all(is_blank_char) || line_start == 0 {
        return false;
    }
    // Step over the line break ending the previous line (`\n`, `\r\n` or `\r`).
    let mut prev_end = line_start - 1;
    if before.as_bytes()[prev_end] == b'\n'
        && prev_end > 0
        && before.as_bytes()[prev_end - 1] == b'\r'
    {
        prev_end -= 1;
    }
    let prev = &before[..prev_end];
    let prev_start = prev.rfind(['\n', '\r']).map_or(0, |k| k + 1);
    prev[prev_start..].chars().all(is_blank_char)
}

/// An expression with canonical spacing.
fn expr(e: &Expr, depth: usize) -> String {
    match &e.kind {
        ExprKind::Number(n) => n.text.clone(),
        ExprKind::Quantity { value, unit } => format!("{} {}", value.text, unit.text),
        ExprKind::Text(t) => text(t, depth),
        ExprKind::Date(d) => d.clone(),
        ExprKind::Name(p) => p.dotted(),
        ExprKind::Neg(x) => format!("-{}", expr(x, depth)),
        ExprKind::Binary { .. } => {
            // Walk the left spine of a chain (`a + b + c` nests to the left) in a loop,
            // so a long chain costs no stack.
            let mut rights = Vec::new();
            let mut leftmost = e;
            while let ExprKind::Binary { op, left, right } = &leftmost.kind {
                rights.push((*op, right.as_ref()));
                leftmost = left;
            }
            let mut s = expr(leftmost, depth);
            for (op, right) in rights.iter().rev() {
                s.push(' ');
                s.push_str(op.symbol());
                s.push(' ');
                s.push_str(&expr(right, depth));
            }
            s
        }
        ExprKind::Power { base, exponent } => format!("{}^{exponent}", expr(base, depth)),
        ExprKind::Paren(x) => format!("({})", expr(x, depth)),
    }
}

/// A text: a `"""` block when it spans lines, else quoted with escapes.
fn text(t: &str, depth: usize) -> String {
    if t.contains(['\n', '\r']) && !t.contains("\"\"\"") {
        let inner = INDENT.repeat(depth + 1);
        let mut s = String::from("\"\"\"\n");
        for line in t.split('\n') {
            if !line.is_empty() {
                s.push_str(&inner);
                s.push_str(line);
            }
            s.push('\n');
        }
        s.push_str(&INDENT.repeat(depth));
        s.push_str("\"\"\"");
        return s;
    }
    let mut s = String::from("\"");
    for c in t.chars() {
        match c {
            '\\' => s.push_str("\\\\"),
            '"' => s.push_str("\\\""),
            '\n' => s.push_str("\\n"),
            c => s.push(c),
        }
    }
    s.push('"');
    s
}
