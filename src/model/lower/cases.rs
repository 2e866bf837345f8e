//! The cases: the base scenario with overrides, or the base alone as case `design`.

use super::{duplicate_name, source_text, Block, Blocks, MAX_CASES};
use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};
use crate::model::design::*;
use crate::model::eval::Env;
use crate::model::fields::block_name;
use crate::model::scenario;
use crate::syntax::ast::StatementKind;
use std::collections::HashMap;

/// Every case in file order; without any, the base as case `design` (with a warning).
pub fn lower_cases(
    blocks: &Blocks,
    base: Option<&Scenario>,
    source: &str,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Vec<Case> {
    let mut cases: Vec<Case> = Vec::new();
    // Names seen so far, for the duplicate check in constant time per case.
    let mut names: HashMap<String, Span> = HashMap::new();
    let written = blocks.all("case").count();
    for block in blocks.all("case") {
        if let Some(case) = lower_case(block, &names, base, source, env, diags) {
            names.insert(case.name.clone(), case.span);
            cases.push(case);
        }
        // Over the limit is an error, not a slow run: the rest is not lowered.
        if cases.len() > MAX_CASES {
            break;
        }
    }
    if let Some(first_over) = cases.get(MAX_CASES) {
        diags.push(
            Diagnostic::error(
                Code::TooMany,
                format!("the design has {written} cases; at most {MAX_CASES} are accepted"),
                Some(first_over.span),
            )
            .with_label(format!("case {} of {written}", MAX_CASES + 1))
            .with_help("split the cases over several design files (copies differing only in their cases), or drop cases that repeat another's conditions"),
        );
    }
    if cases.is_empty() {
        if let Some(base) = base {
            diags.push(
                Diagnostic::warning(
                    Code::NoCases,
                    "no `case` given: the base design is analysed as case `design`",
                    None,
                )
                .with_help("add `case normal { }` and cases for low levels and aged pipe"),
            );
            cases.push(Case {
                name: "design".into(),
                scenario: base.clone(),
                overrides: Vec::new(),
                span: Span::new(0, 0),
            });
        }
    }
    cases
}

/// One `case NAME { path = value ... }` applied to a copy of the base.
fn lower_case(
    block: &Block,
    earlier: &HashMap<String, Span>,
    base: Option<&Scenario>,
    source: &str,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<Case> {
    let (name, name_span) = block_name(
        block.args,
        block.span,
        Code::BadCase,
        "a case",
        "case normal { }",
        diags,
    )?;
    if let Some(first) = earlier.get(name.as_str()) {
        diags.push(duplicate_name(&format!("case `{name}`"), name_span, *first));
        return None;
    }
    let mut scenario = base?.clone();
    let mut overrides = Vec::new();
    let mut set: Vec<(String, Span)> = Vec::new();
    for statement in block.statements() {
        let StatementKind::Assign { path, value } = &statement.kind else {
            diags.push(Diagnostic::error(
                Code::Unexpected,
                "a case holds only overrides such as `sump.level = 101.0 m`",
                Some(statement.span),
            ));
            continue;
        };
        let dotted = path.dotted();
        if let Some((_, first)) = set.iter().find(|(p, _)| *p == dotted) {
            diags.push(
                Diagnostic::error(
                    Code::DuplicateField,
                    format!("case `{name}` sets `{dotted}` twice"),
                    Some(path.span),
                )
                .with_secondary(*first, "first set here"),
            );
            continue;
        }
        set.push((dotted.clone(), path.span));
        match scenario::apply_override(&mut scenario, path, value, env) {
            Ok(()) => overrides.push(format!("{dotted} = {}", source_text(source, value.span))),
            Err(e) => diags.push(e),
        }
    }
    Some(Case {
        name: name.clone(),
        scenario,
        overrides,
        span: name_span,
    })
}
