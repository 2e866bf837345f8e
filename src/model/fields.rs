//! Reading the `name = value` fields of a block body.

use super::eval::quote_list;
use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};
use crate::names::nearest;
use crate::syntax::ast::{Expr, Path, Statement, StatementKind};

/// One field as written.
pub struct Field<'a> {
    pub name: &'static str,
    pub value: &'a Expr,
    pub span: Span,
}

/// The fields of a body, in order, after checking names and duplicates.
/// Statements that are not simple assignments are returned in `rest`.
pub struct Fields<'a> {
    pub fields: Vec<Field<'a>>,
    pub rest: Vec<&'a Statement>,
}

impl<'a> Fields<'a> {
    pub fn get(&self, name: &str) -> Option<&Field<'a>> {
        self.fields.iter().find(|f| f.name == name)
    }
}

/// Split a body into known fields and other statements. Unknown field names and
/// repeated fields become diagnostics.
pub fn read_fields<'a>(
    body: &'a [Statement],
    block: &str,
    allowed: &[&'static str],
    diags: &mut Vec<Diagnostic>,
) -> Fields<'a> {
    let mut out = Fields {
        fields: Vec::new(),
        rest: Vec::new(),
    };
    for st in body {
        match &st.kind {
            StatementKind::Assign { path, value } if path.parts.len() == 1 => {
                let name = path.parts[0].name.as_str();
                match allowed.iter().find(|a| **a == name) {
                    Some(known) => {
                        if let Some(prev) = out.get(known) {
                            diags.push(
                                Diagnostic::error(
                                    Code::DuplicateField,
                                    format!("`{name}` is given twice in {block}"),
                                    Some(path.span),
                                )
                                .with_label("given again here")
                                .with_secondary(prev.span, "first given here")
                                .with_help("keep one of them"),
                            );
                        } else {
                            out.fields.push(Field {
                                name: known,
                                value,
                                span: st.span,
                            });
                        }
                    }
                    None => diags.push(unknown_field(path, block, allowed)),
                }
            }
            StatementKind::Assign { path, .. } => diags.push(unknown_field(path, block, allowed)),
            _ => out.rest.push(st),
        }
    }
    out
}

pub fn unknown_field(path: &Path, block: &str, allowed: &[&str]) -> Diagnostic {
    let name = path.dotted();
    let near = nearest(&name, allowed.iter().copied());
    let help = if near.is_empty() {
        format!("{block} accepts {}", quote_list(allowed))
    } else {
        format!(
            "did you mean {}? {block} accepts {}",
            quote_list(&near),
            quote_list(allowed)
        )
    };
    Diagnostic::error(
        Code::UnknownField,
        format!("{block} has no field `{name}`"),
        Some(path.span),
    )
    .with_label("unknown field")
    .with_help(help)
}

/// A required field that is missing.
pub fn missing(field: &str, block: &str, span: Span, example: &str) -> Diagnostic {
    Diagnostic::error(
        Code::MissingField,
        format!("{block} needs `{field}`"),
        Some(span),
    )
    .with_label(format!("`{field}` is missing"))
    .with_help(format!("add a line such as `{example}`"))
}

/// The name a block starts with (`tank sump`, `case dry`, `pump P1`), or a diagnostic
/// saying the `what` needs one, with an example.
pub fn block_name<'a>(
    args: &'a [crate::syntax::ast::Arg],
    span: Span,
    code: Code,
    what: &str,
    example: &str,
    diags: &mut Vec<Diagnostic>,
) -> Option<(&'a String, Span)> {
    match args.first() {
        Some(crate::syntax::ast::Arg {
            kind: crate::syntax::ast::ArgKind::Word(name),
            span,
        }) => Some((name, *span)),
        _ => {
            diags.push(
                Diagnostic::error(code, format!("{what} needs a name"), Some(span))
                    .with_help(format!("write `{example}`")),
            );
            None
        }
    }
}
