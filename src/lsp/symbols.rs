//! Names in a document: the word under the cursor, the outline (document symbols), go to
//! definition of a `let` constant or a named block (tank, line, pump, case), and the
//! words completion offers.

use serde_json::{json, Value};

use super::position::range;
use crate::model::keywords;
use crate::syntax::ast::{ArgKind, File, StatementKind};

/// The identifier around byte `offset` (letters, digits, `_`), with its span.
pub fn word_at(source: &str, offset: usize) -> Option<(String, (usize, usize))> {
    let is_word = |c: char| c.is_ascii_alphanumeric() || c == '_';
    let offset = offset.min(source.len());
    if !source.is_char_boundary(offset) {
        return None;
    }
    let start = source[..offset]
        .char_indices()
        .rev()
        .take_while(|(_, c)| is_word(*c))
        .last()
        .map_or(offset, |(i, _)| i);
    let end = source[offset..]
        .char_indices()
        .find(|(_, c)| !is_word(*c))
        .map_or(source.len(), |(i, _)| offset + i);
    let word = &source[start..end];
    (!word.is_empty() && !word.starts_with(|c: char| c.is_ascii_digit()))
        .then(|| (word.to_string(), (start, end)))
}

/// A top-level name: keyword (`let` for a constant), name (empty for a block without
/// one), byte span of the name, byte span of the statement.
type Named<'a> = (&'a str, &'a str, (usize, usize), (usize, usize));

/// The top-level names: `let` constants and blocks with a name.
fn named(file: &File) -> Vec<Named<'_>> {
    file.statements
        .iter()
        .filter_map(|s| match &s.kind {
            StatementKind::Let { name, .. } => Some((
                "let",
                name.name.as_str(),
                (name.span.start, name.span.end),
                (s.span.start, s.span.end),
            )),
            StatementKind::Block { keyword, args, .. } => {
                let (name, span) = match args.first() {
                    Some(a) => match &a.kind {
                        ArgKind::Word(w) => (w.as_str(), (a.span.start, a.span.end)),
                        _ => ("", (keyword.span.start, keyword.span.end)),
                    },
                    None => ("", (keyword.span.start, keyword.span.end)),
                };
                Some((
                    keyword.name.as_str(),
                    name,
                    span,
                    (s.span.start, s.span.end),
                ))
            }
            _ => None,
        })
        .collect()
}

/// `textDocument/documentSymbol`: one `DocumentSymbol` per top-level statement with a
/// keyword (SymbolKind numbers of LSP 3.17).
pub fn document_symbols(file: &File, source: &str) -> Value {
    let symbols: Vec<Value> = named(file)
        .into_iter()
        .map(|(keyword, name, name_span, span)| {
            let kind = match keyword {
                "let" => 14,                             // Constant
                "pump" => 5,                             // Class
                "line" => 18,                            // Array
                "case" => 24,                            // Event
                "tank" | "station" => 19,                // Object
                "project" | "purpose" | "revision" => 2, // Module
                _ => 7,                                  // Property
            };
            let label = if name.is_empty() {
                keyword.to_string()
            } else {
                format!("{keyword} {name}")
            };
            json!({
                "name": label,
                "kind": kind,
                "range": range(source, span.0, span.1),
                "selectionRange": range(source, name_span.0, name_span.1),
            })
        })
        .collect();
    Value::Array(symbols)
}

/// Where the name at `offset` is defined: a `let` constant, or a tank, line, pump or case
/// of that name (the name's span).
pub fn definition(file: &File, source: &str, offset: usize) -> Option<(usize, usize)> {
    let (word, _) = word_at(source, offset)?;
    named(file)
        .into_iter()
        .find(|(keyword, name, _, _)| {
            *name == word && matches!(*keyword, "let" | "tank" | "line" | "pump" | "case")
        })
        .map(|(_, _, span, _)| span)
}

/// `textDocument/completion`: statement keywords, line items, fields of every block,
/// requirement quantities, value words, fittings, and the names the document defines
/// (CompletionItemKind numbers of LSP 3.17). The client filters by what is typed.
pub fn completion(file: Option<&File>) -> Value {
    let mut items: Vec<Value> = Vec::new();
    let mut push = |label: &str, kind: u8, detail: &str| {
        if !items.iter().any(|i| i["label"] == label) {
            items.push(json!({ "label": label, "kind": kind, "detail": detail }));
        }
    };
    for k in keywords::STATEMENTS.iter().chain(keywords::RESERVED) {
        push(k, 14, "statement");
    }
    for k in keywords::LINE_ITEMS {
        push(k, 14, "line item");
    }
    for block in keywords::STATEMENTS.iter().chain(keywords::LINE_ITEMS) {
        for f in keywords::fields(block) {
            push(f, 5, &format!("field of {block}"));
        }
    }
    for q in keywords::requirement_quantities() {
        push(q, 5, "requirement quantity");
    }
    for w in keywords::VALUE_WORDS.iter().chain(keywords::ARGUMENT_WORDS) {
        push(w, 12, "word");
    }
    for f in crate::hydraulics::fittings::all_fittings() {
        push(f.name, 20, f.description);
    }
    for m in crate::hydraulics::catalogue::Material::all() {
        push(m.keyword(), 12, "pipe material");
    }
    for u in crate::units::registry() {
        push(u.name, 11, u.note);
    }
    if let Some(file) = file {
        for (keyword, name, _, _) in named(file) {
            if !name.is_empty() {
                push(name, 6, keyword);
            }
        }
    }
    json!({ "isIncomplete": false, "items": items })
}
