//! The language server's state and its answer to each message: open documents by URI,
//! diagnostics on open and change, hover, formatting, completion, document symbols and
//! go to definition. JSON-RPC 2.0 error codes as in LSP 3.17.

use std::collections::BTreeMap;

use serde_json::{json, Value};

use super::position::{offset, range};
use super::transport::{Frame, MAX_MESSAGE_BYTES};
use super::{hover, symbols};
use crate::diagnostics::{Diagnostic, Severity};
use crate::model::FileAccess;

/// Most documents held open at once.
pub const MAX_OPEN_DOCUMENTS: usize = 64;

const PARSE_ERROR: i64 = -32700;
const INVALID_REQUEST: i64 = -32600;
const METHOD_NOT_FOUND: i64 = -32601;
const INVALID_PARAMS: i64 = -32602;
const SERVER_NOT_INITIALIZED: i64 = -32002;

/// Gives the files a document may read (its curve CSVs), by the document's URI.
pub type FilesFor<'a> = dyn Fn(&str) -> Box<dyn FileAccess> + 'a;

/// The server: open documents and the protocol state.
pub struct Server<'a> {
    documents: BTreeMap<String, String>,
    files: &'a FilesFor<'a>,
    initialized: bool,
    shut_down: bool,
}

/// What to send back after one message, and whether to stop (with the exit status).
#[derive(Debug, Default)]
pub struct Reply {
    /// Messages to write, in order.
    pub messages: Vec<Value>,
    /// `Some(status)` after `exit`: 0 when `shutdown` came first, else 1.
    pub exit: Option<u8>,
}

impl<'a> Server<'a> {
    /// A server whose documents read their files through `files`.
    pub fn new(files: &'a FilesFor<'a>) -> Server<'a> {
        Server {
            documents: BTreeMap::new(),
            files,
            initialized: false,
            shut_down: false,
        }
    }

    /// Whether `shutdown` was received.
    pub fn is_shut_down(&self) -> bool {
        self.shut_down
    }

    /// Answer one frame of the input.
    pub fn frame(&mut self, frame: Frame) -> Reply {
        match frame {
            Frame::Message(body) => self.message(&body),
            Frame::TooLarge(n) => reply(error(
                Value::Null,
                INVALID_REQUEST,
                &format!(
                    "message of {n} bytes is larger than the limit of {MAX_MESSAGE_BYTES} bytes"
                ),
            )),
            Frame::BadHeader(why) => reply(error(Value::Null, PARSE_ERROR, &why)),
            Frame::End => Reply::default(),
        }
    }

    /// Answer one message body.
    pub fn message(&mut self, body: &[u8]) -> Reply {
        let Ok(message) = serde_json::from_slice::<Value>(body) else {
            return reply(error(Value::Null, PARSE_ERROR, "the message is not JSON"));
        };
        let id = message.get("id").cloned();
        let Some(method) = message.get("method").and_then(Value::as_str) else {
            // A response from the client, or not a request: nothing to answer unless it
            // carries an id and no result.
            if message.get("result").is_some() || message.get("error").is_some() {
                return Reply::default();
            }
            return reply(error(
                id.unwrap_or(Value::Null),
                INVALID_REQUEST,
                "a request needs a `method`",
            ));
        };
        let params = message.get("params").cloned().unwrap_or(Value::Null);
        match id {
            Some(id) => self.request(id, method, &params),
            None => self.notification(method, &params),
        }
    }

    fn request(&mut self, id: Value, method: &str, params: &Value) -> Reply {
        if method == "initialize" {
            self.initialized = true;
            return reply(result(id, capabilities()));
        }
        if !self.initialized {
            return reply(error(id, SERVER_NOT_INITIALIZED, "initialize first"));
        }
        if self.shut_down {
            return reply(error(id, INVALID_REQUEST, "the server is shutting down"));
        }
        if method == "shutdown" {
            self.shut_down = true;
            return reply(result(id, Value::Null));
        }
        let answer = match method {
            "textDocument/hover" => self.with_position(params, |file, source, at| {
                let uri = params["textDocument"]["uri"].as_str().unwrap_or_default();
                let files = (self.files)(uri);
                let design = crate::check(source, files.as_ref()).design;
                let (text, (a, b)) = hover::hover(file?, design.as_ref(), source, at)?;
                Some(json!({
                    "contents": { "kind": "markdown", "value": text },
                    "range": range(source, a, b),
                }))
            }),
            "textDocument/definition" => self.with_position(params, |file, source, at| {
                let (a, b) = symbols::definition(file?, source, at)?;
                let uri = params["textDocument"]["uri"].clone();
                Some(json!({ "uri": uri, "range": range(source, a, b) }))
            }),
            "textDocument/formatting" => self.with_document(params, formatting),
            "textDocument/documentSymbol" => self.with_document(params, |source| {
                crate::syntax::parse(source)
                    .map(|f| symbols::document_symbols(&f, source))
                    .unwrap_or(Value::Array(Vec::new()))
            }),
            "textDocument/completion" => self.with_document(params, |source| {
                symbols::completion(crate::syntax::parse(source).ok().as_ref())
            }),
            _ => Err((
                METHOD_NOT_FOUND,
                format!("`{}` is not supported", clip(method)),
            )),
        };
        match answer {
            Ok(value) => reply(result(id, value)),
            Err((code, text)) => reply(error(id, code, &text)),
        }
    }

    fn notification(&mut self, method: &str, params: &Value) -> Reply {
        if method == "exit" {
            return Reply {
                messages: Vec::new(),
                exit: Some(if self.shut_down { 0 } else { 1 }),
            };
        }
        if !self.initialized {
            return Reply::default();
        }
        let uri = params["textDocument"]["uri"].as_str().unwrap_or_default();
        match method {
            "textDocument/didOpen" => {
                let text = params["textDocument"]["text"].as_str().unwrap_or_default();
                self.store(uri, text.to_string())
            }
            "textDocument/didChange" => {
                let Some(mut text) = self.documents.get(uri).cloned() else {
                    return Reply::default();
                };
                let changes = params["contentChanges"]
                    .as_array()
                    .cloned()
                    .unwrap_or_default();
                for change in &changes {
                    apply_change(&mut text, change);
                }
                self.store(uri, text)
            }
            "textDocument/didClose" => {
                self.documents.remove(uri);
                reply(publish(uri, Vec::new()))
            }
            _ => Reply::default(),
        }
    }

    /// Keep a document's text and publish its diagnostics.
    fn store(&mut self, uri: &str, text: String) -> Reply {
        if uri.is_empty() {
            return Reply::default();
        }
        if !self.documents.contains_key(uri) && self.documents.len() >= MAX_OPEN_DOCUMENTS {
            return reply(json!({
                "jsonrpc": "2.0",
                "method": "window/showMessage",
                "params": { "type": 2, "message": format!("dutyline: more than {MAX_OPEN_DOCUMENTS} open designs; close some to check {}", clip(uri)) },
            }));
        }
        let files = (self.files)(uri);
        let diagnostics = diagnostics(&text, files.as_ref(), uri);
        self.documents.insert(uri.to_string(), text);
        reply(publish(uri, diagnostics))
    }

    /// Run `answer` on the document named by `params.textDocument.uri`.
    fn with_document(
        &self,
        params: &Value,
        answer: impl FnOnce(&str) -> Value,
    ) -> Result<Value, (i64, String)> {
        let uri = params["textDocument"]["uri"]
            .as_str()
            .ok_or((INVALID_PARAMS, "`textDocument.uri` is missing".to_string()))?;
        let source = self
            .documents
            .get(uri)
            .ok_or((INVALID_PARAMS, format!("{} is not open", clip(uri))))?;
        Ok(answer(source))
    }

    /// Run `answer` on the document and the byte offset of `params.position`; `null` when
    /// it finds nothing.
    fn with_position(
        &self,
        params: &Value,
        answer: impl FnOnce(Option<&crate::syntax::File>, &str, usize) -> Option<Value>,
    ) -> Result<Value, (i64, String)> {
        let line = params["position"]["line"].as_u64();
        let character = params["position"]["character"].as_u64();
        let (Some(line), Some(character)) = (line, character) else {
            return Err((
                INVALID_PARAMS,
                "`position` needs `line` and `character`".into(),
            ));
        };
        let clamp = |n: u64| u32::try_from(n).unwrap_or(u32::MAX);
        self.with_document(params, |source| {
            let at = offset(source, clamp(line), clamp(character));
            let file = crate::syntax::parse(source).ok();
            answer(file.as_ref(), source, at).unwrap_or(Value::Null)
        })
    }
}

/// Apply one `TextDocumentContentChangeEvent`: the whole text, or a range replaced.
fn apply_change(text: &mut String, change: &Value) {
    let Some(new) = change["text"].as_str() else {
        return;
    };
    let r = &change["range"];
    let at = |p: &Value| {
        let clamp = |v: &Value| u32::try_from(v.as_u64().unwrap_or(0)).unwrap_or(u32::MAX);
        offset(text, clamp(&p["line"]), clamp(&p["character"]))
    };
    if r.is_object() {
        let (a, b) = (at(&r["start"]), at(&r["end"]));
        let (a, b) = (a.min(b), a.max(b));
        if text.len() - (b - a) + new.len() <= MAX_MESSAGE_BYTES {
            text.replace_range(a..b, new);
        }
    } else {
        *text = new.to_string();
    }
}

/// The diagnostics of a document, as `check --analyse` gives them: the check's, and when
/// it has no error the analysis warnings too.
fn diagnostics(source: &str, files: &dyn FileAccess, uri: &str) -> Vec<Value> {
    let checked = crate::check(source, files);
    let mut all = checked.diagnostics;
    if let (false, Some(design)) = (all.iter().any(|d| d.is_error()), &checked.design) {
        let analysis = crate::analysis::analyse(design);
        all.extend(
            analysis.warnings.iter().map(|w| {
                w.diagnostic(|m| crate::display::Units::new(design.project.units).render(m))
            }),
        );
    }
    all.iter().map(|d| lsp_diagnostic(d, source, uri)).collect()
}

/// One LSP `Diagnostic`: the code, the message with its help, the secondary spans as
/// related information.
fn lsp_diagnostic(d: &Diagnostic, source: &str, uri: &str) -> Value {
    let (start, end) = d.span.map_or((0, 0), |s| (s.start, s.end));
    let mut message = d.message.clone();
    if let Some(label) = &d.label {
        message.push_str(&format!(" ({label})"));
    }
    if let Some(help) = &d.help {
        message.push_str(&format!("\nhelp: {help}"));
    }
    let related: Vec<Value> = d
        .secondary
        .iter()
        .map(|(span, text)| {
            json!({
                "location": { "uri": uri, "range": range(source, span.start, span.end) },
                "message": text,
            })
        })
        .collect();
    json!({
        "range": range(source, start, end),
        "severity": if d.severity == Severity::Error { 1 } else { 2 },
        "code": d.code,
        "source": "dutyline",
        "message": message,
        "relatedInformation": related,
    })
}

/// `textDocument/formatting`: one edit replacing the whole text by `fmt`'s, none when
/// it is canonical, `null` when it does not parse.
fn formatting(source: &str) -> Value {
    match crate::syntax::format_source(source) {
        Ok(formatted) if formatted == source => json!([]),
        Ok(formatted) => json!([{ "range": range(source, 0, source.len()), "newText": formatted }]),
        Err(_) => Value::Null,
    }
}

fn capabilities() -> Value {
    json!({
        "capabilities": {
            "positionEncoding": "utf-16",
            "textDocumentSync": { "openClose": true, "change": 1 },
            "hoverProvider": true,
            "definitionProvider": true,
            "documentFormattingProvider": true,
            "documentSymbolProvider": true,
            "completionProvider": { "triggerCharacters": [] },
        },
        "serverInfo": { "name": "dutyline", "version": crate::VERSION },
    })
}

fn publish(uri: &str, diagnostics: Vec<Value>) -> Value {
    json!({
        "jsonrpc": "2.0",
        "method": "textDocument/publishDiagnostics",
        "params": { "uri": uri, "diagnostics": diagnostics },
    })
}

fn result(id: Value, value: Value) -> Value {
    json!({ "jsonrpc": "2.0", "id": id, "result": value })
}

fn error(id: Value, code: i64, message: &str) -> Value {
    json!({ "jsonrpc": "2.0", "id": id, "error": { "code": code, "message": message } })
}

fn reply(message: Value) -> Reply {
    Reply {
        messages: vec![message],
        exit: None,
    }
}

/// At most 80 characters of client text in a message.
fn clip(text: &str) -> String {
    text.chars().take(80).collect()
}
