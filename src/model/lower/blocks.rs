//! Grouping the top-level statements by keyword, checking keywords and singletons.

use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};
use crate::model::eval;
use crate::names::nearest;
use crate::syntax::ast::{Arg, File, Statement, StatementKind};

const TOP_LEVEL: &[&str] = crate::model::keywords::STATEMENTS;
const ONCE: &[&str] = &[
    "project",
    "purpose",
    "fluid",
    "site",
    "station",
    "require",
    "motor",
    "energy",
    "uncertainty",
];

/// A top-level block: keyword, arguments, body, span of the whole statement.
pub struct Block<'a> {
    pub keyword: &'static str,
    pub args: &'a [Arg],
    /// `None` when the block has no braces at all.
    pub body: Option<&'a [Statement]>,
    pub span: Span,
}

impl<'a> Block<'a> {
    /// The keyword as written at the start of the statement.
    pub fn keyword_span(&self) -> Span {
        Span::new(self.span.start, self.span.start + self.keyword.len())
    }

    /// The statements of the body (none when there are no braces).
    pub fn statements(&self) -> &'a [Statement] {
        self.body.unwrap_or(&[])
    }
}

/// The top-level blocks of a file in file order, known keywords only.
pub struct Blocks<'a> {
    list: Vec<Block<'a>>,
}

impl<'a> Blocks<'a> {
    /// The first (for singletons: the only) block with this keyword.
    pub fn one<'s>(&'s self, keyword: &'s str) -> Option<&'s Block<'a>> {
        self.all(keyword).next()
    }

    /// Every block with this keyword, in file order.
    pub fn all<'s>(&'s self, keyword: &'s str) -> impl Iterator<Item = &'s Block<'a>> + 's {
        self.list.iter().filter(move |b| b.keyword == keyword)
    }

    /// Where a design-wide "missing" diagnostic points: the keyword of the `project`
    /// block, else of the first block, else the start of the file.
    pub fn first_line_span(&self) -> Span {
        self.one("project")
            .or(self.list.first())
            .map_or(Span::new(0, 0), |b| b.keyword_span())
    }

    /// The body of the singleton block with this keyword, if it is there and has braces.
    pub fn body(&self, keyword: &str) -> Option<&'a [Statement]> {
        self.one(keyword).and_then(|b| b.body)
    }

    /// Group the statements other than `let`, with a diagnostic for each unknown keyword,
    /// repeated singleton and statement that belongs inside a block.
    pub fn group(file: &'a File, diags: &mut Vec<Diagnostic>) -> Blocks<'a> {
        let mut seen: Vec<(&str, Span)> = Vec::new();
        let mut list = Vec::new();
        for statement in &file.statements {
            match &statement.kind {
                StatementKind::Let { .. } => {}
                StatementKind::Block {
                    keyword,
                    args,
                    body,
                } => {
                    if let Some(known) = known_keyword(&keyword.name, keyword.span, &seen, diags) {
                        seen.push((known, keyword.span));
                        list.push(Block {
                            keyword: known,
                            args,
                            body: body.as_deref(),
                            span: statement.span,
                        });
                    }
                }
                other => diags.extend(stray(other)),
            }
        }
        Blocks { list }
    }
}

/// The keyword as one of [`TOP_LEVEL`], or a diagnostic when it is reserved, unknown or a
/// repeated singleton.
fn known_keyword(
    keyword: &str,
    span: Span,
    seen: &[(&str, Span)],
    diags: &mut Vec<Diagnostic>,
) -> Option<&'static str> {
    if keyword == "include" {
        diags.push(
            Diagnostic::error(Code::Reserved, "`include` is reserved for a later version of the language", Some(span))
                .with_help("for now a design is one file; curve tables can come from CSV with `curve ... from \"file.csv\"`"),
        );
        return None;
    }
    let Some(known) = TOP_LEVEL.iter().find(|k| **k == keyword) else {
        let near = nearest(keyword, TOP_LEVEL.iter().copied());
        diags.push(
            Diagnostic::error(
                Code::UnknownStatement,
                format!("`{keyword}` is not a statement of the language"),
                Some(span),
            )
            .with_label("unknown keyword")
            .with_help(if near.is_empty() {
                format!("statements are {}", eval::quote_list(TOP_LEVEL))
            } else {
                format!("did you mean {}?", eval::quote_list(&near))
            }),
        );
        return None;
    };
    if ONCE.contains(known) {
        if let Some((_, prev)) = seen.iter().find(|(k, _)| k == known) {
            diags.push(
                Diagnostic::error(
                    Code::DuplicateBlock,
                    format!("`{keyword}` may appear only once"),
                    Some(span),
                )
                .with_secondary(*prev, "first given here")
                .with_help("merge the two into one"),
            );
            return None;
        }
    }
    Some(known)
}

/// The diagnostic for a field, requirement or curve written at the top level.
fn stray(kind: &StatementKind) -> Option<Diagnostic> {
    Some(match kind {
        StatementKind::Assign { path, .. } => Diagnostic::error(Code::StrayField, format!("`{}` is set outside any block", path.dotted()), Some(path.span))
            .with_help("fields go inside a block such as `project { ... }`; constants are written `let name = value`"),
        StatementKind::Condition { path, .. } => Diagnostic::error(Code::StrayRequirement, "a requirement outside `require { ... }`", Some(path.span))
            .with_help("put requirements inside `require { ... }`"),
        StatementKind::Curve { keyword, .. } if keyword.name == "profile" => Diagnostic::error(Code::StrayProfile, "a profile outside a line", Some(keyword.span))
            .with_help("a pipe profile belongs inside `line NAME from A to B { ... }`"),
        StatementKind::Curve { keyword, .. } => Diagnostic::error(Code::StrayCurve, "a curve outside a pump", Some(keyword.span))
            .with_help("curves belong inside `pump NAME { ... }`"),
        StatementKind::Let { .. } | StatementKind::Block { .. } => return None,
    })
}
