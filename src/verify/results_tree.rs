//! Two results JSON documents compared quantity by quantity: each document becomes a
//! tree of the diff module ([`crate::diff::tree`]) and the tree diff lists what moved.
//! Numbers compare at 6 significant digits, so the last digits of a float do not count.

use serde_json::Value as Json;

use crate::diff::tree::{diff_nodes, Node, Value};
use crate::diff::InputChange;

/// Most levels of a results document walked (the contract nests far less).
const MAX_DEPTH: usize = 32;

/// Fields that identify an element of a list, in order of preference.
const IDENTIFIERS: [&str; 6] = ["name", "case", "pump", "requirement", "id", "check"];

/// Top-level fields that say which tool wrote the document, not what it computed.
const IGNORED: [&str; 1] = ["tool_version"];

/// The quantities that differ between two results documents, or why they could not
/// be compared.
pub fn changes(old: &str, new: &str) -> Result<Vec<InputChange>, String> {
    let parse = |text: &str, which: &str| {
        serde_json::from_str::<Json>(text)
            .map_err(|e| format!("the {which} results JSON cannot be read: {e}"))
    };
    let (old, new) = (parse(old, "attached")?, parse(new, "recomputed")?);
    let mut out = Vec::new();
    diff_nodes(&top(&old), &top(&new), &[], &mut out);
    Ok(out)
}

fn top(doc: &Json) -> Vec<Node> {
    match doc {
        Json::Object(fields) => fields
            .iter()
            .filter(|(k, _)| !IGNORED.contains(&k.as_str()))
            .map(|(k, v)| node(k.clone(), v, 1))
            .collect(),
        other => vec![node("document".into(), other, 1)],
    }
}

fn node(label: String, value: &Json, depth: usize) -> Node {
    let children: Vec<Node> = match value {
        _ if depth > MAX_DEPTH => return Node::leaf(label, "(nested too deep)"),
        Json::Object(fields) => fields
            .iter()
            .map(|(k, v)| node(k.clone(), v, depth + 1))
            .collect(),
        Json::Array(items) => items
            .iter()
            .enumerate()
            .map(|(i, v)| node(element_label(i, v), v, depth + 1))
            .collect(),
        leaf => return Node::leaf(label, leaf_text(leaf)),
    };
    Node {
        key: label.clone(),
        label,
        value: Value::Group {
            summary: String::new(),
            children,
            itemised: true,
        },
    }
}

/// `average` (a name), `case peak`, `pump KR1`, else `#3` (1-based).
fn element_label(index: usize, value: &Json) -> String {
    IDENTIFIERS
        .iter()
        .find_map(|id| {
            let v = value.get(id).and_then(Json::as_str)?;
            Some(if *id == "name" {
                v.to_string()
            } else {
                format!("{id} {v}")
            })
        })
        .unwrap_or_else(|| format!("#{}", index + 1))
}

fn leaf_text(value: &Json) -> String {
    match value {
        Json::Number(n) => match n.as_f64() {
            Some(v) if v != 0.0 && v.abs().log10() >= 6.0 => format!("{v:.5e}"),
            Some(v) => crate::diff::values::significant(v, 6),
            None => n.to_string(),
        },
        Json::String(s) => s.clone(),
        Json::Null => "null".into(),
        other => other.to_string(),
    }
}
