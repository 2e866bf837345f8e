//! The project block, revisions and the free texts (`purpose`, `assume`, `note`).

use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};
use crate::model::design::*;
use crate::model::eval::{self, Env};
use crate::model::fields::{missing, read_fields};
use crate::syntax::ast::{Arg, ArgKind, Statement};

use super::Blocks;

/// What the title block and the package's front matter print.
pub struct Texts {
    pub project: Project,
    pub revisions: Vec<Revision>,
    pub purpose: Option<String>,
    pub assumptions: Vec<String>,
    pub notes: Vec<String>,
}

/// Project, revisions and texts, in that order.
pub fn lower_texts(blocks: &Blocks, env: &Env, diags: &mut Vec<Diagnostic>) -> Texts {
    let mut project = Project::default();
    if let Some(block) = blocks.one("project") {
        lower_project(&mut project, block.statements(), env, diags);
    } else {
        diags.push(missing(
            "project",
            "the design",
            blocks.first_line_span(),
            "project { title = \"...\", number = \"...\" }",
        ));
    }
    let revisions = blocks
        .all("revision")
        .filter_map(|block| lower_revision(block.args, block.span, diags))
        .collect();
    let purpose = texts_of(blocks, "purpose", diags).into_iter().next();
    let assumptions = texts_of(blocks, "assume", diags);
    let notes = texts_of(blocks, "note", diags);
    Texts {
        project,
        revisions,
        purpose,
        assumptions,
        notes,
    }
}

/// `revision ID YYYY-MM-DD "description"`.
fn lower_revision(args: &[Arg], span: Span, diags: &mut Vec<Diagnostic>) -> Option<Revision> {
    match args {
        [id, Arg {
            kind: ArgKind::Date(date),
            ..
        }, Arg {
            kind: ArgKind::Text(text),
            ..
        }] => {
            let id_text = match &id.kind {
                ArgKind::Word(w) => w.clone(),
                ArgKind::Number(n) => n.text.clone(),
                _ => String::new(),
            };
            if id_text.is_empty() {
                diags.push(Diagnostic::error(
                    Code::BadRevision,
                    "a revision id is a word or number such as `A` or `2`",
                    Some(id.span),
                ));
                None
            } else if let Err(msg) = check_date(date) {
                diags.push(Diagnostic::error(Code::BadDate, msg, Some(args[1].span)));
                None
            } else {
                Some(Revision {
                    id: id_text,
                    date: date.clone(),
                    description: text.clone(),
                })
            }
        }
        _ => {
            diags.push(
                Diagnostic::error(
                    Code::BadRevision,
                    "a revision is `revision ID YYYY-MM-DD \"description\"`",
                    Some(span),
                )
                .with_help("e.g. `revision B 2026-11-30 \"Dry-season case added\"`"),
            );
            None
        }
    }
}

/// The quoted text of every `keyword "..."` statement.
fn texts_of(blocks: &Blocks, keyword: &'static str, diags: &mut Vec<Diagnostic>) -> Vec<String> {
    blocks
        .all(keyword)
        .filter_map(|block| match block.args {
            [Arg {
                kind: ArgKind::Text(t),
                ..
            }] => Some(t.clone()),
            _ => {
                diags.push(
                    Diagnostic::error(
                        Code::BadText,
                        format!("`{keyword}` takes one quoted text"),
                        Some(block.span),
                    )
                    .with_help(format!("write `{keyword} \"...\"`")),
                );
                None
            }
        })
        .collect()
}

fn check_date(date: &str) -> Result<(), String> {
    let parts: Vec<u32> = date.split('-').filter_map(|p| p.parse().ok()).collect();
    match parts.as_slice() {
        [y, m, day] if (1..=12).contains(m) && (1..=days_in_month(*y, *m)).contains(day) => Ok(()),
        _ => Err(format!(
            "`{date}` is not a calendar date (YYYY-MM-DD, a day that exists in its month)"
        )),
    }
}

/// Days in month `month` (1–12) of `year` in the Gregorian calendar (ISO 8601:2019,
/// clause 3.2.1): a leap year is divisible by 4, except centuries not divisible by 400.
fn days_in_month(year: u32, month: u32) -> u32 {
    let leap = year.is_multiple_of(4) && (!year.is_multiple_of(100) || year.is_multiple_of(400));
    match month {
        2 if leap => 29,
        2 => 28,
        4 | 6 | 9 | 11 => 30,
        _ => 31,
    }
}

pub(crate) const PROJECT_FIELDS: &[&str] = &[
    "title", "number", "client", "prepared", "checked", "approved", "units", "style",
];

fn lower_project(p: &mut Project, body: &[Statement], env: &Env, d: &mut Vec<Diagnostic>) {
    let f = read_fields(body, "project", PROJECT_FIELDS, d);
    for field in &f.fields {
        let r = match field.name {
            "units" => {
                eval::expect_word(field.value, env, "report units", &["us", "si"]).map(|w| {
                    p.units = if w == "us" {
                        ReportUnits::Us
                    } else {
                        ReportUnits::Si
                    };
                })
            }
            "style" => match eval::eval(field.value, env) {
                Ok(eval::Value::Word(w)) | Ok(eval::Value::Text(w)) => {
                    p.style = Some(w);
                    p.style_span = Some(field.value.span);
                    Ok(())
                }
                Ok(other) => Err(Diagnostic::error(
                    Code::ExpectedWord,
                    format!(
                        "style: expected a style name or a quoted path, found {}",
                        other.describe()
                    ),
                    Some(field.value.span),
                )),
                Err(e) => Err(e),
            },
            name => eval::expect_text(field.value, env, name).map(|t| {
                let slot = match name {
                    "title" => &mut p.title,
                    "number" => &mut p.number,
                    "client" => &mut p.client,
                    "prepared" => &mut p.prepared,
                    "checked" => &mut p.checked,
                    _ => &mut p.approved,
                };
                *slot = t;
            }),
        };
        if let Err(e) = r {
            d.push(e);
        }
    }
    if p.title.is_empty() {
        d.push(
            Diagnostic::warning(Code::NoTitle, "the project has no title", None)
                .with_help("add `title = \"...\"` to `project`"),
        );
    }
}
