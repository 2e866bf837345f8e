//! `dutyline lsp` driven through standard input and output with JSON-RPC messages, as an
//! editor does (issue 16): diagnostics with LSP ranges (UTF-16 columns), hover in SI,
//! formatting by `fmt`, completion, symbols, definition, and malformed input answered
//! without a crash.

use std::io::Write;
use std::process::{Command, Stdio};

use serde_json::{json, Value};

const BIN: &str = env!("CARGO_BIN_EXE_dutyline");
const URI: &str = "file:///nonexistent-folder/lift.duty";

fn demo() -> String {
    std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/examples-demo/orchard-lift-rev-a.duty"
    ))
    .unwrap()
}

fn frame(message: &Value) -> Vec<u8> {
    let body = message.to_string();
    let mut out = format!("Content-Length: {}\r\n\r\n", body.len()).into_bytes();
    out.extend(body.bytes());
    out
}

/// Run the server on these raw bytes; its exit status and every message it wrote.
fn run_raw(input: &[u8]) -> (Option<i32>, Vec<Value>) {
    let mut child = Command::new(BIN)
        .arg("lsp")
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    // Write from another thread so a full output pipe cannot block the input.
    let mut stdin = child.stdin.take().unwrap();
    let bytes = input.to_vec();
    let writer = std::thread::spawn(move || {
        let _ = stdin.write_all(&bytes);
    });
    let out = child.wait_with_output().unwrap();
    writer.join().unwrap();
    let mut messages = Vec::new();
    let mut rest = &out.stdout[..];
    while !rest.is_empty() {
        let text = std::str::from_utf8(rest).unwrap();
        let (header, body) = text.split_once("\r\n\r\n").expect("a header");
        let n: usize = header
            .trim_start_matches("Content-Length: ")
            .parse()
            .unwrap();
        messages.push(serde_json::from_slice(&body.as_bytes()[..n]).unwrap());
        rest = &body.as_bytes()[n..];
    }
    (out.status.code(), messages)
}

/// Initialize, send `messages`, shut down and exit.
fn session(messages: &[Value]) -> Vec<Value> {
    let mut input =
        frame(&json!({"jsonrpc": "2.0", "id": 0, "method": "initialize", "params": {}}));
    input.extend(frame(
        &json!({"jsonrpc": "2.0", "method": "initialized", "params": {}}),
    ));
    for m in messages {
        input.extend(frame(m));
    }
    input.extend(frame(
        &json!({"jsonrpc": "2.0", "id": 999, "method": "shutdown"}),
    ));
    input.extend(frame(&json!({"jsonrpc": "2.0", "method": "exit"})));
    let (status, out) = run_raw(&input);
    assert_eq!(status, Some(0));
    out
}

fn open(text: &str) -> Value {
    json!({"jsonrpc": "2.0", "method": "textDocument/didOpen", "params": {
        "textDocument": {"uri": URI, "languageId": "duty", "version": 1, "text": text}}})
}

fn request(id: u64, method: &str, params: Value) -> Value {
    json!({"jsonrpc": "2.0", "id": id, "method": method, "params": params})
}

fn at(line: usize, character: usize) -> Value {
    json!({"textDocument": {"uri": URI}, "position": {"line": line, "character": character}})
}

fn response(out: &[Value], id: u64) -> &Value {
    out.iter()
        .find(|m| m["id"] == id)
        .unwrap_or_else(|| panic!("no response {id}: {out:?}"))
}

fn published(out: &[Value]) -> Vec<&Value> {
    out.iter()
        .filter(|m| m["method"] == "textDocument/publishDiagnostics")
        .collect()
}

/// Zero-based line and UTF-16 column of the first `needle` in `text`.
fn lsp_position(text: &str, needle: &str) -> (usize, usize) {
    let at = text.find(needle).unwrap();
    let line = text[..at].matches('\n').count();
    let start = text[..at].rfind('\n').map_or(0, |i| i + 1);
    (line, text[start..at].encode_utf16().count())
}

#[test]
fn diagnostics_on_open_and_change_carry_codes_help_and_utf16_ranges() {
    // A note with characters outside the Basic Multilingual Plane, then an unknown
    // statement on the same line: the column counts UTF-16 code units.
    let broken = demo().replacen("length = 18 ft", "length = 18 psi", 1)
        + "note \"𝐐 ° level\"; reservoir x { }\n";
    let fixed = demo();
    let change = json!({"jsonrpc": "2.0", "method": "textDocument/didChange", "params": {
        "textDocument": {"uri": URI, "version": 2}, "contentChanges": [{"text": fixed}]}});
    let out = session(&[open(&broken), change]);
    let lists = published(&out);
    assert_eq!(lists.len(), 2, "{out:?}");
    let first = lists[0]["params"]["diagnostics"].as_array().unwrap();
    let mismatch = first
        .iter()
        .find(|d| d["code"] == "unit-mismatch")
        .expect("unit-mismatch");
    let (line, col) = lsp_position(&broken, "18 psi");
    assert_eq!(
        mismatch["range"]["start"],
        json!({"line": line, "character": col})
    );
    assert_eq!(
        mismatch["range"]["end"],
        json!({"line": line, "character": col + 6})
    );
    assert_eq!(mismatch["severity"], 1);
    assert!(
        mismatch["message"].as_str().unwrap().contains("\nhelp: "),
        "{mismatch}"
    );
    let unknown = first
        .iter()
        .find(|d| d["code"] == "unknown-statement")
        .expect("unknown-statement");
    let (line, col) = lsp_position(&broken, "reservoir x");
    // `note "𝐐 ° level"; ` is 18 characters but 19 UTF-16 code units.
    assert_eq!(col, 19);
    assert_eq!(
        unknown["range"]["start"],
        json!({"line": line, "character": col})
    );
    // After the change: no error, and the analysis warnings of `check --analyse`.
    let second = lists[1]["params"]["diagnostics"].as_array().unwrap();
    assert!(second.iter().all(|d| d["severity"] == 2), "{second:?}");
    let checked = dutyline::check(&fixed, &dutyline::NoFiles);
    let analysis = dutyline::analysis::analyse(checked.design.as_ref().unwrap());
    assert_eq!(
        second.len(),
        checked.diagnostics.len() + analysis.warnings.len()
    );
    assert!(second.iter().any(|d| d["code"] == "pump-curve"));
}

#[test]
fn hover_shows_a_quantity_in_si_and_report_units() {
    let text = demo();
    let (l1, c1) = lsp_position(&text, "18 ft");
    let (l2, c2) = lsp_position(&text, "600        170");
    let (l3, c3) = lsp_position(&text, "riser }");
    let (l4, c4) = lsp_position(&text, "elbow_90_long");
    let out = session(&[
        open(&text),
        request(1, "textDocument/hover", at(l1, c1 + 1)),
        request(2, "textDocument/hover", at(l2, c2)),
        request(3, "textDocument/hover", at(l3, c3 + 2)),
        request(4, "textDocument/hover", at(l4, c4)),
        request(5, "textDocument/hover", at(0, 0)),
    ]);
    let value = |id| {
        response(&out, id)["result"]["contents"]["value"]
            .as_str()
            .unwrap()
            .to_string()
    };
    // 18 ft × 0.3048 m/ft (exact, NIST SP 811 B.8) = 5.4864 m.
    let h = value(1);
    assert!(h.contains("a length") && h.contains("SI: 5.4864 m"), "{h}");
    assert!(h.contains("Report units (US customary): 18 ft"), "{h}");
    assert_eq!(
        response(&out, 1)["result"]["range"]["start"],
        json!({"line": l1, "character": c1})
    );
    // A curve cell in its column's unit: 600 gpm × 3.785411784e-3 m³/gal ÷ 60 s
    // (NIST SP 811 B.8) = 0.0378541 m³/s.
    let h = value(2);
    assert!(h.contains("SI: 0.0378541 m³/s"), "{h}");
    // A constant: its definition, and 38 ft = 11.5824 m.
    let h = value(3);
    assert!(
        h.contains("let riser = 38 ft") && h.contains("11.5824 m"),
        "{h}"
    );
    let h = value(4);
    assert!(h.contains("fitting `elbow_90_long`"), "{h}");
    // A comment: nothing.
    assert_eq!(response(&out, 5)["result"], Value::Null);
}

#[test]
fn hover_on_a_pipe_and_a_pump_shows_what_the_design_resolved() {
    let text = demo();
    let (l1, c1) = lsp_position(&text, "pipe steel 8 in");
    let (l2, c2) = lsp_position(&text, "pump A ");
    let out = session(&[
        open(&text),
        request(1, "textDocument/hover", at(l1, c1 + 6)),
        request(2, "textDocument/hover", at(l2, c2 + 5)),
    ]);
    let value = |id| {
        response(&out, id)["result"]["contents"]["value"]
            .as_str()
            .unwrap()
            .to_string()
    };
    // 8 in schedule 40: OD 8.625 in, wall 0.322 in (ASME B36.10M) → ID 7.981 in
    // = 202.717 mm.
    let h = value(1);
    assert!(h.contains("Inner diameter: 7.981 in (202.717 mm)"), "{h}");
    // Commercial steel 0.00015 ft = 0.04572 mm new (Moody 1944, as the table cites).
    assert!(h.contains("new 0.00180 in (0.04572 mm)"), "{h}");
    // The pump's BEP is the analysis's own.
    let checked = dutyline::check(&text, &dutyline::NoFiles);
    let design = checked.design.unwrap();
    let bep = dutyline::analysis::duty::CandidateCurves::fit(&design.pumps[0])
        .evaluated_bep
        .unwrap();
    let units = dutyline::display::Units::new(design.project.units);
    let h = value(2);
    assert!(
        h.contains(&format!(
            "{} at {}",
            units.flow().fmt(bep.flow),
            units.head().fmt(bep.head)
        )),
        "{h}"
    );
    assert!(
        h.contains(&format!("efficiency {:.1} %", 100.0 * bep.efficiency)),
        "{h}"
    );
}

#[test]
fn formatting_gives_the_fmt_text_completion_symbols_and_definition_answer() {
    let messy = demo().replacen("let riser = 38 ft", "let   riser=38 ft", 1);
    let canonical = dutyline::syntax::format_source(&messy).unwrap();
    let (l, c) = lsp_position(&messy, "riser }");
    let uri = json!({"textDocument": {"uri": URI}});
    let out = session(&[
        open(&messy),
        request(
            1,
            "textDocument/formatting",
            json!({"textDocument": {"uri": URI}, "options": {}}),
        ),
        request(2, "textDocument/completion", at(0, 0)),
        request(3, "textDocument/documentSymbol", uri),
        request(4, "textDocument/definition", at(l, c)),
    ]);
    let edits = response(&out, 1)["result"].as_array().unwrap();
    assert_eq!(edits.len(), 1);
    assert_eq!(edits[0]["newText"], canonical.as_str());
    assert_eq!(
        edits[0]["range"]["start"],
        json!({"line": 0, "character": 0})
    );
    let labels: Vec<&str> = response(&out, 2)["result"]["items"]
        .as_array()
        .unwrap()
        .iter()
        .map(|i| i["label"].as_str().unwrap())
        .collect();
    for word in [
        "pump",
        "pipe",
        "hours",
        "npsh_margin",
        "elbow_90_long",
        "wet_well",
        "riser",
    ] {
        assert!(labels.contains(&word), "{word}");
    }
    let names: Vec<&str> = response(&out, 3)["result"]
        .as_array()
        .unwrap()
        .iter()
        .map(|s| s["name"].as_str().unwrap())
        .collect();
    assert!(
        names.contains(&"tank wet_well") && names.contains(&"let riser"),
        "{names:?}"
    );
    let (dl, dc) = lsp_position(&messy, "riser=");
    assert_eq!(
        response(&out, 4)["result"]["range"]["start"],
        json!({"line": dl, "character": dc})
    );
}

#[test]
fn malformed_input_is_answered_and_the_server_keeps_going() {
    let mut input = frame(&request(1, "textDocument/hover", at(0, 0)));
    input.extend(frame(
        &json!({"jsonrpc": "2.0", "id": 2, "method": "initialize", "params": {}}),
    ));
    input.extend(b"Content-Length: 9\r\n\r\n{not json");
    input.extend(b"Content-Length: 12\r\n\r\n[1, 2, 3, 4]");
    input.extend(b"X-Nothing: 1\r\n\r\n");
    input.extend(frame(
        &json!({"jsonrpc": "2.0", "method": "textDocument/didOpen", "params": 7}),
    ));
    input.extend(frame(&request(3, "initialize", json!(null))));
    input.extend(frame(&json!({"jsonrpc": "2.0", "method": "exit"})));
    let (status, out) = run_raw(&input);
    // `exit` without `shutdown`: status 1 (LSP 3.17).
    assert_eq!(status, Some(1));
    assert_eq!(
        response(&out, 1)["error"]["code"],
        -32002,
        "before initialize"
    );
    assert!(response(&out, 2)["result"]["capabilities"].is_object());
    assert!(response(&out, 3)["result"].is_object());
    let null_codes: Vec<i64> = out
        .iter()
        .filter(|m| m["id"].is_null())
        .filter_map(|m| m["error"]["code"].as_i64())
        .collect();
    // Not JSON, not a request, a header without a length.
    assert_eq!(null_codes, [-32700, -32600, -32700], "{out:?}");
    // A length past the limit with the input ending inside its body: the server ends
    // quietly, having held none of it.
    let mut cut = frame(&json!({"jsonrpc": "2.0", "id": 1, "method": "initialize", "params": {}}));
    cut.extend(b"Content-Length: 99999999999\r\n\r\n{}");
    let (status, out) = run_raw(&cut);
    assert_eq!(status, Some(0));
    assert_eq!(out.len(), 1);
}

#[test]
fn the_server_survives_what_follows_a_too_large_message() {
    let big = 7 * 1024 * 1024;
    let mut input =
        frame(&json!({"jsonrpc": "2.0", "id": 1, "method": "initialize", "params": {}}));
    input.extend(format!("Content-Length: {big}\r\n\r\n").bytes());
    input.extend(std::iter::repeat_n(b' ', big));
    input.extend(frame(&request(3, "no/such/method", json!({}))));
    input.extend(frame(&request(
        4,
        "textDocument/hover",
        json!({"textDocument": {"uri": URI}}),
    )));
    input.extend(frame(&request(5, "textDocument/hover", at(0, 0))));
    input.extend(frame(&request(
        6,
        "textDocument/hover",
        json!({
        "textDocument": {"uri": URI}, "position": {"line": -1, "character": 1e300}}),
    )));
    input.extend(frame(
        &json!({"jsonrpc": "2.0", "id": 7, "method": "shutdown"}),
    ));
    input.extend(frame(&json!({"jsonrpc": "2.0", "method": "exit"})));
    let (status, out) = run_raw(&input);
    assert_eq!(status, Some(0));
    let too_large = out
        .iter()
        .find(|m| m["id"].is_null())
        .expect("an error for the large message");
    assert_eq!(too_large["error"]["code"], -32600);
    let code = |id: u64| response(&out, id)["error"]["code"].as_i64();
    assert_eq!(code(3), Some(-32601));
    assert_eq!(code(4), Some(-32602), "no position");
    assert_eq!(code(5), Some(-32602), "document not open");
    assert_eq!(code(6), Some(-32602), "a position that is not a number");
    assert_eq!(response(&out, 7)["result"], Value::Null);
}
