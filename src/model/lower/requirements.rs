//! The requirements: `QUANTITY >= VALUE [for CASE, ...]` inside `require { ... }`.

use super::{source_text, Blocks};
use crate::diagnostics::Code;
use crate::diagnostics::Diagnostic;
use crate::model::design::*;
use crate::model::eval::{self, expect_dim, Env};
use crate::model::network::{NodeQuantity, NodeRequirement};
use crate::names::nearest;
use crate::syntax::ast::{Expr, Ident, Statement, StatementKind};
use crate::units::Dimension;

/// The requirements of the `require` block, if any.
pub fn lower_requirements(
    blocks: &Blocks,
    cases: &[Case],
    source: &str,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> (Vec<Requirement>, Vec<NodeRequirement>) {
    match blocks.one("require") {
        Some(block) => lower_require_body(block.statements(), cases, env, source, diags),
        None => (Vec::new(), Vec::new()),
    }
}

fn lower_require_body(
    body: &[Statement],
    cases: &[Case],
    env: &Env,
    source: &str,
    d: &mut Vec<Diagnostic>,
) -> (Vec<Requirement>, Vec<NodeRequirement>) {
    let mut out = Vec::new();
    let mut at_nodes = Vec::new();
    for st in body {
        let StatementKind::Condition {
            path,
            at,
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
        if let Some(node) = at {
            let names = case_names(scope, cases, d);
            if let Some(r) = node_requirement(&name, path.span, node, value, cases, env, d) {
                at_nodes.push(NodeRequirement {
                    at_least: *op == crate::syntax::ast::CompareOp::AtLeast,
                    text: source_text(source, st.span),
                    cases: names,
                    span: st.span,
                    ..r
                });
            }
            continue;
        }
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
        let names = case_names(scope, cases, d);
        out.push(Requirement {
            metric: *metric,
            at_least: *op == crate::syntax::ast::CompareOp::AtLeast,
            limit_si: limit,
            text: source_text(source, st.span),
            cases: names,
            span: st.span,
        });
    }
    (out, at_nodes)
}

/// The cases a requirement names, with an error for each unknown one.
fn case_names(scope: &[Ident], cases: &[Case], d: &mut Vec<Diagnostic>) -> Vec<String> {
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
    names
}

/// `pressure at NODE` or `flow at TANK`: the quantity, node and limit (the caller fills
/// the rest), or `None` with a diagnostic.
fn node_requirement(
    quantity: &str,
    quantity_span: crate::diagnostics::Span,
    node: &Ident,
    value: &Expr,
    cases: &[Case],
    env: &Env,
    d: &mut Vec<Diagnostic>,
) -> Option<NodeRequirement> {
    let (q, dim) = match quantity {
        "pressure" => (NodeQuantity::Pressure, Dimension::PRESSURE),
        "flow" => (NodeQuantity::Flow, Dimension::VOLUME_RATE),
        _ => {
            d.push(
                Diagnostic::error(
                    Code::UnknownField,
                    format!("`{quantity} at NODE` cannot be required"),
                    Some(quantity_span),
                )
                .with_help(
                    "a node requirement is `pressure at NODE >= VALUE` or `flow at TANK >= VALUE`",
                ),
            );
            return None;
        }
    };
    let layout = cases.first().and_then(|c| c.scenario.network.as_ref());
    let is_node = layout.is_some_and(|n| n.nodes.iter().any(|x| x.name == node.name));
    let is_tank = cases.first().is_some_and(|c| {
        c.scenario.destination.name == node.name
            || layout.is_some_and(|n| n.tanks.iter().any(|t| t.name == node.name))
    });
    if !(is_node || (layout.is_some() && is_tank)) {
        let mut names: Vec<&str> = layout
            .map(|n| n.nodes.iter().map(|x| x.name.as_str()).collect())
            .unwrap_or_default();
        names.extend(
            layout
                .map(|n| n.tanks.iter().map(|t| t.name.as_str()).collect::<Vec<_>>())
                .unwrap_or_default(),
        );
        let near = nearest(&node.name, names.iter().copied());
        d.push(Diagnostic::error(Code::UnknownName, format!("there is no network node `{}`", node.name), Some(node.span))
            .with_label("unknown node")
            .with_help(if near.is_empty() { "node requirements name a `junction`, `delivery` or downstream `tank` of the network".to_string() } else { format!("did you mean {}?", eval::quote_list(&near)) }));
        return None;
    }
    if q == NodeQuantity::Flow && !is_tank {
        d.push(Diagnostic::error(Code::BadRequirement, format!("`flow at {}`: a junction's flow is its demand, which the solve always delivers", node.name), Some(quantity_span))
            .with_help("require `pressure at NODE` at a junction or delivery point; `flow at TANK` is the flow into a downstream tank"));
        return None;
    }
    let limit = match expect_dim(value, env, dim, quantity) {
        Ok(v) if v.kind == crate::units::QuantityKind::AbsolutePressure => {
            d.push(
                Diagnostic::error(
                    Code::UnitMismatch,
                    "a node pressure requirement is a gauge pressure",
                    Some(value.span),
                )
                .with_help("write it as `35 psi`, `35 psig` or `240 kPa(g)`"),
            );
            return None;
        }
        Ok(v) => v.si,
        Err(e) => {
            d.push(e);
            return None;
        }
    };
    Some(NodeRequirement {
        quantity: q,
        node: node.name.clone(),
        at_least: true,
        limit_si: limit,
        text: String::new(),
        cases: Vec::new(),
        span: node.span,
    })
}
