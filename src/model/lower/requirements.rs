//! The requirements: `QUANTITY >= VALUE [for CASE, ...]` inside `require { ... }`.

use super::{source_text, Blocks};
use crate::diagnostics::Code;
use crate::diagnostics::Diagnostic;
use crate::model::design::*;
use crate::model::eval::{self, expect_dim, Env};
use crate::names::nearest;
use crate::syntax::ast::{Statement, StatementKind};
use crate::units::Dimension;

/// The requirements of the `require` block, if any.
pub fn lower_requirements(
    blocks: &Blocks,
    cases: &[Case],
    source: &str,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Vec<Requirement> {
    match blocks.one("require") {
        Some(block) => lower_require_body(block.statements(), cases, env, source, diags),
        None => Vec::new(),
    }
}

fn lower_require_body(
    body: &[Statement],
    cases: &[Case],
    env: &Env,
    source: &str,
    d: &mut Vec<Diagnostic>,
) -> Vec<Requirement> {
    let mut out = Vec::new();
    for st in body {
        let StatementKind::Condition {
            path,
            op,
            value,
            cases: scope,
        } = &st.kind
        else {
            d.push(
                Diagnostic::error(
                    Code::BadRequirement,
                    "a requirement is `QUANTITY >= VALUE [for CASE, ...]`",
                    Some(st.span),
                )
                .with_help("e.g. `flow >= 700 gpm for normal` or `npsh_margin >= 1.3`"),
            );
            continue;
        };
        let name = path.dotted();
        let Some((_, metric)) = Metric::ALL.iter().find(|(k, _)| *k == name) else {
            let near = nearest(&name, Metric::ALL.iter().map(|(k, _)| *k));
            d.push(
                Diagnostic::error(
                    Code::UnknownField,
                    format!("`{name}` cannot be required"),
                    Some(path.span),
                )
                .with_label("unknown quantity")
                .with_help(format!(
                    "{}requirements constrain {}",
                    if near.is_empty() {
                        String::new()
                    } else {
                        format!("did you mean {}? ", eval::quote_list(&near))
                    },
                    eval::quote_list(&Metric::ALL.iter().map(|(k, _)| *k).collect::<Vec<_>>())
                )),
            );
            continue;
        };
        let dim = match metric {
            Metric::Flow => Dimension::VOLUME_RATE,
            Metric::Head | Metric::NpshExcess => Dimension::LENGTH,
            Metric::NpshMargin | Metric::Efficiency => Dimension::NONE,
            Metric::SuctionVelocity | Metric::DischargeVelocity => Dimension::VELOCITY,
            Metric::ShaftPower => Dimension::POWER,
        };
        let limit = match expect_dim(value, env, dim, &name) {
            Ok(q) => q.si,
            Err(e) => {
                d.push(e);
                continue;
            }
        };
        let mut names = Vec::new();
        for c in scope {
            if cases.iter().any(|k| k.name == c.name) {
                names.push(c.name.clone());
            } else {
                let near = nearest(&c.name, cases.iter().map(|k| k.name.as_str()));
                d.push(
                    Diagnostic::error(
                        Code::UnknownName,
                        format!("there is no case `{}`", c.name),
                        Some(c.span),
                    )
                    .with_label("unknown case")
                    .with_help(if near.is_empty() {
                        "requirements name cases defined with `case NAME { ... }`".to_string()
                    } else {
                        format!("did you mean {}?", eval::quote_list(&near))
                    }),
                );
            }
        }
        out.push(Requirement {
            metric: *metric,
            at_least: *op == crate::syntax::ast::CompareOp::AtLeast,
            limit_si: limit,
            text: source_text(source, st.span),
            cases: names,
            span: st.span,
        });
    }
    out
}
