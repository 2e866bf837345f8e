//! From source text to the syntax tree, over the pest grammar in
//! `grammar/dutyline.pest`.

use crate::diagnostics::Code;
use pest::iterators::Pair;
use pest::Parser as _;

use super::ast::*;
use crate::diagnostics::{Diagnostic, Span};

/// The pest parser of grammar/dutyline.pest; its generated `Rule` enum names the
/// grammar's rules, which grammar/LANGUAGE.md documents.
mod grammar {
    #![allow(missing_docs)]
    #[derive(pest_derive::Parser)]
    #[grammar = "../grammar/dutyline.pest"]
    pub struct DutyParser;
}
use grammar::{DutyParser, Rule};

/// Largest design file accepted, in bytes (see grammar/LANGUAGE.md, "Limits").
pub const MAX_SOURCE_BYTES: usize = 1 << 20;
/// Deepest nesting of `(` and `{` accepted.
pub const MAX_NESTING: usize = 32;
/// Most terms in one sum or product (keeps expression trees shallow).
pub const MAX_OPERANDS: usize = 64;
/// Most characters of a line shown under a size or encoding diagnostic.
const EXCERPT_CHARS: usize = 120;

/// Why bytes are not a text dutyline reads.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum TextProblem {
    /// More than [`MAX_SOURCE_BYTES`] bytes.
    TooLarge,
    /// A byte sequence that is not UTF-8.
    NotUtf8,
}

/// Bytes refused as text, with the place of the problem: the first bad byte, or the
/// byte where the size limit is crossed.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct TextError {
    /// What is wrong with the bytes.
    pub problem: TextProblem,
    /// 1-based line of the place.
    pub line: usize,
    /// 1-based column (in characters) of the place.
    pub column: usize,
    /// The line up to a little after the place, when short enough to show.
    excerpt: Option<String>,
}

impl TextError {
    /// The diagnostic for a design file, with a span into [`TextError::render_text`].
    pub fn diagnostic(&self) -> Diagnostic {
        let (line, column) = (self.line, self.column);
        let diagnostic = match self.problem {
            TextProblem::TooLarge => Diagnostic::error(
                Code::FileTooLarge,
                format!("the file is larger than the limit: design files are limited to {MAX_SOURCE_BYTES} bytes, and line {line} crosses it at column {column}"),
                None,
            )
            .with_label("the limit is crossed here")
            .with_help("large curve tables belong in CSV files imported with `curve ... from \"file.csv\"`; a design itself is rarely more than a few hundred lines"),
            TextProblem::NotUtf8 => Diagnostic::error(
                Code::InvalidUtf8,
                format!("the file is not valid UTF-8 text: the first bad byte is at line {line}, column {column}"),
                None,
            )
            .with_label("not UTF-8")
            .with_help("design files are plain UTF-8 text; was a binary or a file in another encoding given? Save it as UTF-8"),
        };
        Diagnostic {
            span: self.excerpt.as_ref().map(|_| self.span()),
            ..diagnostic
        }
    }

    /// A text to render [`TextError::diagnostic`] against: blank lines, then the
    /// offending line cut short, so line and column are right and no long line is printed.
    pub fn render_text(&self) -> String {
        let mut text = "\n".repeat(self.line - 1);
        text.push_str(self.excerpt.as_deref().unwrap_or_default());
        text.push('\n');
        text
    }

    fn span(&self) -> Span {
        let excerpt = self.excerpt.as_deref().unwrap_or_default();
        let start = self.line - 1
            + excerpt
                .char_indices()
                .nth(self.column - 1)
                .map_or(excerpt.len(), |(i, _)| i);
        let width = match self.problem {
            TextProblem::NotUtf8 => char::REPLACEMENT_CHARACTER.len_utf8(),
            TextProblem::TooLarge => 1,
        };
        Span::new(start, start + width)
    }
}

/// Decode a file's bytes as UTF-8 text of at most [`MAX_SOURCE_BYTES`] bytes, or say
/// where it is not.
pub fn decode_text(bytes: Vec<u8>) -> Result<String, TextError> {
    if bytes.len() > MAX_SOURCE_BYTES {
        return Err(locate(&bytes, MAX_SOURCE_BYTES, TextProblem::TooLarge));
    }
    String::from_utf8(bytes).map_err(|e| {
        let at = e.utf8_error().valid_up_to();
        locate(e.as_bytes(), at, TextProblem::NotUtf8)
    })
}

/// Decode a design file's bytes, or the located diagnostic (rendered against
/// [`TextError::render_text`]) saying why not.
pub fn source_from_bytes(bytes: Vec<u8>) -> Result<String, Diagnostic> {
    decode_text(bytes).map_err(|e| e.diagnostic())
}

/// Line, column and a short excerpt of the line around byte `at`.
fn locate(bytes: &[u8], at: usize, problem: TextProblem) -> TextError {
    let line_start = bytes[..at]
        .iter()
        .rposition(|&b| b == b'\n')
        .map_or(0, |i| i + 1);
    let line = 1 + bytes[..line_start].iter().filter(|&&b| b == b'\n').count();
    let line_end = bytes[at..]
        .iter()
        .position(|&b| b == b'\n')
        .map_or(bytes.len(), |i| at + i);
    let text = String::from_utf8_lossy(&bytes[line_start..line_end]);
    let column = 1 + String::from_utf8_lossy(&bytes[line_start..at])
        .chars()
        .count();
    let excerpt = (column <= EXCERPT_CHARS).then(|| {
        let mut cut: String = text.chars().take(EXCERPT_CHARS).collect();
        if text.chars().nth(EXCERPT_CHARS).is_some() {
            cut.push('…');
        }
        cut
    });
    TextError {
        problem,
        line,
        column,
        excerpt,
    }
}

/// Parse a design file. Errors are returned as diagnostics; a file with a
/// syntax error yields no tree.
pub fn parse(source: &str) -> Result<File, Vec<Diagnostic>> {
    if source.len() > MAX_SOURCE_BYTES {
        let at = (0..=MAX_SOURCE_BYTES)
            .rev()
            .find(|&i| source.is_char_boundary(i))
            .unwrap_or(0);
        let mut d = locate(source.as_bytes(), at, TextProblem::TooLarge).diagnostic();
        let width = source[at..].chars().next().map_or(0, char::len_utf8);
        d.span = Some(Span::new(at, at + width));
        return Err(vec![d]);
    }
    if let Some(d) = check_nesting(source) {
        return Err(vec![d]);
    }
    let too_long = super::limits::check_lengths(source);
    if !too_long.is_empty() {
        return Err(too_long);
    }
    let mut pairs =
        DutyParser::parse(Rule::file, source).map_err(|e| vec![syntax_error(source, e)])?;
    let mut errors = Vec::new();
    let mut statements = Vec::new();
    if let Some(file) = pairs.next() {
        for p in file.into_inner() {
            if p.as_rule() == Rule::statement {
                statements.push(statement(p, &mut errors));
            }
        }
    }
    if errors.is_empty() {
        Ok(File { statements })
    } else {
        Err(errors)
    }
}

/// Reject nesting deeper than [`MAX_NESTING`] before the recursive parser sees it.
fn check_nesting(source: &str) -> Option<Diagnostic> {
    let mut depth = 0usize;
    let mut in_string = false;
    let mut in_comment = false;
    let bytes = source.as_bytes();
    for (i, &b) in bytes.iter().enumerate() {
        match b {
            b'\n' => in_comment = false,
            _ if in_comment => {}
            b'"' => in_string = !in_string,
            b'#' if !in_string => in_comment = true,
            b'(' | b'{' if !in_string => {
                depth += 1;
                if depth > MAX_NESTING {
                    return Some(
                        Diagnostic::error(
                            Code::TooDeep,
                            format!("brackets are nested more than {MAX_NESTING} deep"),
                            Some(Span::new(i, i + 1)),
                        )
                        .with_label("too deep")
                        .with_help("design files need only a few levels of nesting; is a closing bracket missing?"),
                    );
                }
            }
            b')' | b'}' if !in_string => depth = depth.saturating_sub(1),
            _ => {}
        }
    }
    None
}

/// The place of a pair, without the white space and comments the grammar skips
/// after a rule's last token (so a statement's span ends at its last token).
fn span(p: &Pair<Rule>) -> Span {
    let s = p.as_span();
    Span::new(s.start(), s.start() + super::comments::code_len(s.as_str()))
}

fn describe(rule: &Rule) -> &'static str {
    match rule {
        Rule::EOI => "end of file",
        Rule::statement | Rule::let_stmt | Rule::assign | Rule::condition | Rule::block_stmt => {
            "a statement"
        }
        Rule::curve_stmt => "a curve",
        Rule::body => "`{`",
        Rule::ident | Rule::path | Rule::index => "a name",
        Rule::expr | Rule::term | Rule::factor | Rule::power | Rule::atom | Rule::paren => {
            "a value"
        }
        Rule::add_op | Rule::mul_op => "an operator",
        Rule::cmp_op => "`>=` or `<=`",
        Rule::number | Rule::integer => "a number",
        Rule::quantity | Rule::nominal | Rule::fraction => "a number with a unit",
        Rule::unit => "a unit",
        Rule::string | Rule::plain | Rule::triple => "a quoted text",
        Rule::date => "a date (YYYY-MM-DD)",
        Rule::arg => "an argument",
        Rule::table | Rule::table_head | Rule::column => "a table header (column name and unit)",
        Rule::table_row | Rule::cell => "a row of numbers",
        Rule::case_scope | Rule::kw_for => "`for` and case names",
        _ => "something else",
    }
}

fn syntax_error(source: &str, e: pest::error::Error<Rule>) -> Diagnostic {
    let pos = match e.location {
        pest::error::InputLocation::Pos(p) => p,
        pest::error::InputLocation::Span((s, _)) => s,
    };
    let mut expected: Vec<&str> = match &e.variant {
        pest::error::ErrorVariant::ParsingError { positives, .. } => {
            positives.iter().map(describe).collect()
        }
        pest::error::ErrorVariant::CustomError { .. } => Vec::new(),
    };
    expected.sort_unstable();
    expected.dedup();
    let found_text: String = source[pos.min(source.len())..]
        .chars()
        .take_while(|c| !c.is_whitespace())
        .take(20)
        .collect();
    let found = if pos >= source.len() {
        "end of file".to_string()
    } else if source[pos..].starts_with('\n') || source[pos..].starts_with("\r\n") {
        "end of line".to_string()
    } else {
        format!("`{found_text}`")
    };
    let expected_text = match expected.len() {
        0 => "something else".to_string(),
        1 => expected[0].to_string(),
        _ => {
            let last = expected.pop().unwrap_or_default();
            format!("{} or {}", expected.join(", "), last)
        }
    };
    let end = (pos + found_text.len().max(1)).min(source.len());
    let help = if let Some(scale) = degree_written_apart(source, pos, &found_text) {
        format!(
            "did you mean `{scale}`? A temperature unit is written in one word: {scale} or °{}",
            &scale[3..]
        )
    } else if found_text.starts_with('"') {
        "a quoted text must end on the same line; use \"\"\" ... \"\"\" for text over several lines"
            .into()
    } else if found == "end of file" {
        "is a closing `}` missing?".into()
    } else {
        "see grammar/LANGUAGE.md for the statements and values the language accepts".into()
    };
    Diagnostic::error(
        Code::Syntax,
        format!("expected {expected_text}, found {found}"),
        Some(Span::new(pos, end.max(pos))),
    )
    .with_label(format!("expected {expected_text}"))
    .with_help(help)
}

/// The temperature scale meant when `deg F`, `degree C` or `° C` is written apart: the
/// word before `pos` is a degree and the text found there names a scale, or the text
/// found is a `°` apart from its scale.
fn degree_written_apart(source: &str, pos: usize, found: &str) -> Option<&'static str> {
    if let Some(rest) = source.get(pos..).and_then(|r| r.strip_prefix('°')) {
        let letters: String = rest
            .trim_start_matches([' ', '\t'])
            .chars()
            .take_while(|c| c.is_alphabetic())
            .collect();
        return crate::units::temperature_spelling(&letters);
    }
    let before = source.get(..pos)?;
    let word_end = before.trim_end_matches([' ', '\t']);
    let apart = word_end.len() < before.len();
    let degree = ["deg", "degree", "degrees", "°"]
        .iter()
        .any(|w| word_end.to_lowercase().ends_with(w));
    let letters: String = found.chars().take_while(|c| c.is_alphabetic()).collect();
    (apart && degree)
        .then(|| crate::units::temperature_spelling(&letters))
        .flatten()
}

fn statement(p: Pair<Rule>, errors: &mut Vec<Diagnostic>) -> Statement {
    let sp = span(&p);
    let inner = p.into_inner().next();
    let kind = match inner {
        Some(inner) => match inner.as_rule() {
            Rule::let_stmt => {
                let mut it = inner.into_inner().filter(|x| x.as_rule() != Rule::kw_let);
                let name = it.next().map(ident).unwrap_or_else(|| empty_ident(sp));
                let value = it
                    .next()
                    .map(|x| expr(x, errors))
                    .unwrap_or_else(|| empty_expr(sp));
                StatementKind::Let { name, value }
            }
            Rule::assign => {
                let mut it = inner.into_inner();
                let path = it.next().map(path).unwrap_or_else(|| empty_path(sp));
                let value = it
                    .next()
                    .map(|x| expr(x, errors))
                    .unwrap_or_else(|| empty_expr(sp));
                StatementKind::Assign { path, value }
            }
            Rule::condition => {
                let mut path_v = empty_path(sp);
                let mut op = CompareOp::AtLeast;
                let mut value = empty_expr(sp);
                let mut cases = Vec::new();
                let mut at = None;
                for x in inner.into_inner() {
                    match x.as_rule() {
                        Rule::path => path_v = path(x),
                        Rule::at_node => {
                            at = x
                                .into_inner()
                                .find(|y| y.as_rule() == Rule::ident)
                                .map(ident)
                        }
                        Rule::cmp_op => {
                            op = if matches!(x.as_str(), ">=" | "≥") {
                                CompareOp::AtLeast
                            } else {
                                CompareOp::AtMost
                            }
                        }
                        Rule::expr => value = expr(x, errors),
                        Rule::case_scope => {
                            cases = x
                                .into_inner()
                                .filter(|y| y.as_rule() == Rule::ident)
                                .map(ident)
                                .collect()
                        }
                        _ => {}
                    }
                }
                StatementKind::Condition {
                    path: path_v,
                    at,
                    op,
                    value,
                    cases,
                }
            }
            Rule::block_stmt => {
                let mut keyword = empty_ident(sp);
                let mut args = Vec::new();
                let mut body = None;
                for x in inner.into_inner() {
                    match x.as_rule() {
                        Rule::ident => keyword = ident(x),
                        Rule::arg => args.push(arg(x, errors)),
                        Rule::body => {
                            body = Some(
                                x.into_inner()
                                    .filter(|y| y.as_rule() == Rule::statement)
                                    .map(|y| statement(y, errors))
                                    .collect(),
                            )
                        }
                        _ => {}
                    }
                }
                StatementKind::Block {
                    keyword,
                    args,
                    body,
                }
            }
            Rule::curve_stmt => {
                let mut keyword = empty_ident(sp);
                let mut args = Vec::new();
                let mut tab = None;
                for x in inner.into_inner() {
                    match x.as_rule() {
                        Rule::kw_curve => {
                            keyword = Ident {
                                name: x.as_str().into(),
                                span: span(&x),
                            }
                        }
                        Rule::arg => args.push(arg(x, errors)),
                        Rule::table => tab = Some(table(x, errors)),
                        _ => {}
                    }
                }
                StatementKind::Curve {
                    keyword,
                    args,
                    table: tab,
                }
            }
            _ => StatementKind::Block {
                keyword: empty_ident(sp),
                args: Vec::new(),
                body: None,
            },
        },
        None => StatementKind::Block {
            keyword: empty_ident(sp),
            args: Vec::new(),
            body: None,
        },
    };
    Statement { kind, span: sp }
}

fn empty_ident(sp: Span) -> Ident {
    Ident {
        name: String::new(),
        span: sp,
    }
}
fn empty_path(sp: Span) -> Path {
    Path {
        parts: Vec::new(),
        span: sp,
    }
}
fn empty_expr(sp: Span) -> Expr {
    Expr {
        kind: ExprKind::Number(Number {
            text: "0".into(),
            value: 0.0,
        }),
        span: sp,
    }
}

fn ident(p: Pair<Rule>) -> Ident {
    Ident {
        name: p.as_str().to_string(),
        span: span(&p),
    }
}

fn path(p: Pair<Rule>) -> Path {
    let sp = span(&p);
    Path {
        parts: p
            .into_inner()
            .map(|x| Ident {
                name: x.as_str().to_string(),
                span: span(&x),
            })
            .collect(),
        span: sp,
    }
}

fn number(p: Pair<Rule>, errors: &mut Vec<Diagnostic>) -> Number {
    let text = p.as_str().to_string();
    let value = parse_number(&text, span(&p), errors);
    Number { text, value }
}

fn parse_number(text: &str, sp: Span, errors: &mut Vec<Diagnostic>) -> f64 {
    match text.parse::<f64>() {
        Ok(v) if v.is_finite() => v,
        _ => {
            errors.push(
                Diagnostic::error(
                    Code::NumberOutOfRange,
                    format!("the number `{text}` is too large to represent"),
                    Some(sp),
                )
                .with_label("not a finite number")
                .with_help("numbers must lie within about ±1.8e308; check the exponent"),
            );
            0.0
        }
    }
}

/// A table cell such as `-10`: the text as written, the value negative.
fn signed_number(p: Pair<Rule>, errors: &mut Vec<Diagnostic>) -> Number {
    let text = p.as_str().to_string();
    let digits = text.trim_start_matches(['-', '−']);
    let value = -parse_number(digits, span(&p), errors);
    Number { text, value }
}

/// Value of a nominal fraction such as `1-1/2` or `3/4`.
fn fraction_value(text: &str) -> Option<f64> {
    let (whole, frac) = match text.split_once('-') {
        Some((w, f)) => (w.parse::<f64>().ok()?, f),
        None => (0.0, text),
    };
    let (n, d) = frac.split_once('/')?;
    let n: f64 = n.parse().ok()?;
    let d: f64 = d.parse().ok()?;
    if d == 0.0 {
        return None;
    }
    Some(whole + n / d)
}

fn unit_text(p: Pair<Rule>) -> UnitText {
    UnitText {
        text: p.as_str().to_string(),
        span: span(&p),
    }
}

fn unquote(p: Pair<Rule>) -> String {
    let raw = p.as_str();
    let inner = p.into_inner().next();
    match inner.map(|i| i.as_rule()) {
        Some(Rule::triple) => dedent(raw.get(3..raw.len().saturating_sub(3)).unwrap_or("")),
        _ => {
            let body = raw.get(1..raw.len().saturating_sub(1)).unwrap_or("");
            let mut out = String::new();
            let mut chars = body.chars();
            while let Some(c) = chars.next() {
                if c == '\\' {
                    match chars.next() {
                        Some('n') => out.push('\n'),
                        Some('t') => out.push('\t'),
                        Some(o) => out.push(o),
                        None => {}
                    }
                } else {
                    out.push(c);
                }
            }
            out
        }
    }
}

/// Remove the common indentation and the blank first/last lines of a `"""` text.
pub fn dedent(text: &str) -> String {
    let lines: Vec<&str> = text.lines().collect();
    let start = lines
        .iter()
        .position(|l| !l.trim().is_empty())
        .unwrap_or(lines.len());
    let end = lines
        .iter()
        .rposition(|l| !l.trim().is_empty())
        .map(|i| i + 1)
        .unwrap_or(start);
    let body = &lines[start..end.max(start)];
    let indent = body
        .iter()
        .filter(|l| !l.trim().is_empty())
        .map(|l| l.len() - l.trim_start().len())
        .min()
        .unwrap_or(0);
    body.iter()
        .map(|l| l.get(indent..).unwrap_or(l.trim_start()).trim_end())
        .collect::<Vec<_>>()
        .join("\n")
}

fn arg(p: Pair<Rule>, errors: &mut Vec<Diagnostic>) -> Arg {
    let sp = span(&p);
    let kind = match p.into_inner().next() {
        Some(x) => match x.as_rule() {
            Rule::date => ArgKind::Date(x.as_str().to_string()),
            Rule::nominal => {
                let mut it = x.into_inner();
                let (frac, unit) = (it.next(), it.next());
                let text = frac
                    .as_ref()
                    .map(|f| f.as_str().to_string())
                    .unwrap_or_default();
                let value = fraction_value(&text).unwrap_or_else(|| {
                    errors.push(Diagnostic::error(
                        Code::BadFraction,
                        format!("`{text}` is not a valid fraction"),
                        Some(sp),
                    ));
                    0.0
                });
                match unit {
                    Some(u) => ArgKind::Quantity {
                        value: Number { text, value },
                        unit: unit_text(u),
                    },
                    None => ArgKind::Number(Number { text, value }),
                }
            }
            Rule::quantity => {
                let mut it = x.into_inner();
                let value = it.next().map(|n| number(n, errors)).unwrap_or(Number {
                    text: "0".into(),
                    value: 0.0,
                });
                let unit = it.next().map(unit_text).unwrap_or(UnitText {
                    text: String::new(),
                    span: sp,
                });
                ArgKind::Quantity { value, unit }
            }
            Rule::number => ArgKind::Number(number(x, errors)),
            Rule::string => ArgKind::Text(unquote(x)),
            Rule::star => ArgKind::Star,
            _ => ArgKind::Word(x.as_str().to_string()),
        },
        None => ArgKind::Word(String::new()),
    };
    Arg { kind, span: sp }
}

fn expr(p: Pair<Rule>, errors: &mut Vec<Diagnostic>) -> Expr {
    let sp = span(&p);
    match p.as_rule() {
        Rule::expr | Rule::term => {
            let mut it = p.into_inner();
            let mut left = match it.next() {
                Some(x) => expr(x, errors),
                None => return empty_expr(sp),
            };
            let mut operands = 1;
            while let (Some(op), Some(rhs)) = (it.next(), it.next()) {
                operands += 1;
                if operands > MAX_OPERANDS {
                    errors.push(
                        Diagnostic::error(
                            Code::TooLong,
                            format!("an expression may have at most {MAX_OPERANDS} terms"),
                            Some(sp),
                        )
                        .with_help("split it with `let` constants"),
                    );
                    return left;
                }
                let op = match op.as_str() {
                    "+" => BinaryOp::Add,
                    "-" | "−" => BinaryOp::Sub,
                    "*" | "×" | "·" => BinaryOp::Mul,
                    _ => BinaryOp::Div,
                };
                let right = expr(rhs, errors);
                let s = left.span.join(right.span);
                left = Expr {
                    kind: ExprKind::Binary {
                        op,
                        left: Box::new(left),
                        right: Box::new(right),
                    },
                    span: s,
                };
            }
            left
        }
        Rule::factor => {
            let mut it = p.into_inner().peekable();
            let negated = it.peek().map(|x| x.as_rule() == Rule::neg).unwrap_or(false);
            if negated {
                it.next();
            }
            let inner = it
                .next()
                .map(|x| expr(x, errors))
                .unwrap_or_else(|| empty_expr(sp));
            if negated {
                Expr {
                    kind: ExprKind::Neg(Box::new(inner)),
                    span: sp,
                }
            } else {
                inner
            }
        }
        Rule::power => {
            let mut it = p.into_inner();
            let base = it
                .next()
                .map(|x| expr(x, errors))
                .unwrap_or_else(|| empty_expr(sp));
            match it.next() {
                Some(e) => {
                    let exponent = e.as_str().parse::<i32>().unwrap_or_else(|_| {
                        errors.push(Diagnostic::error(
                            Code::BadExponent,
                            "the exponent is too large",
                            Some(span(&e)),
                        ));
                        1
                    });
                    Expr {
                        kind: ExprKind::Power {
                            base: Box::new(base),
                            exponent,
                        },
                        span: sp,
                    }
                }
                None => base,
            }
        }
        Rule::atom => match p.into_inner().next() {
            Some(x) => expr(x, errors),
            None => empty_expr(sp),
        },
        Rule::paren => {
            let inner = p
                .into_inner()
                .next()
                .map(|x| expr(x, errors))
                .unwrap_or_else(|| empty_expr(sp));
            Expr {
                kind: ExprKind::Paren(Box::new(inner)),
                span: sp,
            }
        }
        Rule::quantity => {
            let mut it = p.into_inner();
            let value = it.next().map(|n| number(n, errors)).unwrap_or(Number {
                text: "0".into(),
                value: 0.0,
            });
            let unit = it.next().map(unit_text).unwrap_or(UnitText {
                text: String::new(),
                span: sp,
            });
            Expr {
                kind: ExprKind::Quantity { value, unit },
                span: sp,
            }
        }
        Rule::number => Expr {
            kind: ExprKind::Number(number(p, errors)),
            span: sp,
        },
        Rule::string => Expr {
            kind: ExprKind::Text(unquote(p)),
            span: sp,
        },
        Rule::date => Expr {
            kind: ExprKind::Date(p.as_str().to_string()),
            span: sp,
        },
        Rule::path => Expr {
            kind: ExprKind::Name(path(p)),
            span: sp,
        },
        _ => empty_expr(sp),
    }
}

fn table(p: Pair<Rule>, errors: &mut Vec<Diagnostic>) -> Table {
    let sp = span(&p);
    let mut columns = Vec::new();
    let mut rows = Vec::new();
    for x in p.into_inner() {
        match x.as_rule() {
            Rule::table_head => {
                for c in x.into_inner() {
                    let csp = span(&c);
                    let mut it = c.into_inner();
                    if let (Some(n), Some(u)) = (it.next(), it.next()) {
                        columns.push(Column {
                            name: ident(n),
                            unit: unit_text(u),
                            span: csp,
                        });
                    }
                }
            }
            Rule::table_row => {
                let rsp = span(&x);
                let cells = x
                    .into_inner()
                    .map(|c| {
                        let csp = span(&c);
                        let v = c.into_inner().next();
                        let value = match v {
                            Some(v) if v.as_rule() == Rule::number => Some(number(v, errors)),
                            Some(v) if v.as_rule() == Rule::signed => {
                                Some(signed_number(v, errors))
                            }
                            _ => None,
                        };
                        Cell { value, span: csp }
                    })
                    .collect();
                rows.push(Row { cells, span: rsp });
            }
            _ => {}
        }
    }
    Table {
        columns,
        rows,
        span: sp,
    }
}
