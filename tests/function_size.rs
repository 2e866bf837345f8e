//! The house rule on function size (issue 19, "Done when"): no function in `src/` is
//! longer than [`MAX_LINES`] lines, counted from its `fn` line to its closing brace.
//! A long flat `match` over a block's fields is the one accepted shape, and the
//! longest of those today (`model::pumps::pump_field`) is well under the limit.

use std::path::{Path, PathBuf};

/// "Functions short enough to read at once (< ~80 lines, never > 150)", with a little
/// slack for rustfmt's line breaks.
const MAX_LINES: usize = 155;

fn rust_files(path: &Path, out: &mut Vec<PathBuf>) {
    let mut entries: Vec<PathBuf> = std::fs::read_dir(path)
        .unwrap_or_else(|e| panic!("{}: {e}", path.display()))
        .map(|e| e.expect("entry").path())
        .collect();
    entries.sort();
    for p in entries {
        if p.is_dir() {
            rust_files(&p, out);
        } else if p.extension().is_some_and(|x| x == "rs") {
            out.push(p);
        }
    }
}

/// The line without its string and character literals and its `//` comment, so that
/// braces inside them are not counted.
fn code_of(line: &str) -> String {
    let mut out = String::new();
    let mut chars = line.chars().peekable();
    let mut in_string = false;
    while let Some(c) = chars.next() {
        if in_string {
            match c {
                '\\' => {
                    chars.next();
                }
                '"' => in_string = false,
                _ => {}
            }
            continue;
        }
        match c {
            '"' => in_string = true,
            '\'' => {
                // A character literal such as '{' or '\n' (a lifetime has no closing quote).
                let rest: String = chars.clone().take(3).collect();
                if rest.chars().nth(1) == Some('\'') {
                    chars.next();
                    chars.next();
                } else if rest.starts_with('\\') && rest.chars().nth(2) == Some('\'') {
                    chars.next();
                    chars.next();
                    chars.next();
                }
            }
            '/' if chars.peek() == Some(&'/') => break,
            _ => out.push(c),
        }
    }
    out
}

/// Whether the line starts a function item (`fn`, `pub fn`, `pub(crate) const fn` ...).
fn starts_fn(line: &str) -> bool {
    let mut words = line.split_whitespace();
    for w in words.by_ref() {
        match w {
            "pub" | "const" | "async" | "unsafe" => continue,
            w if w.starts_with("pub(") => continue,
            "fn" => return true,
            _ => return false,
        }
    }
    false
}

/// (length in lines, first line) of every function body in `text`.
fn functions(text: &str) -> Vec<(usize, usize)> {
    let lines: Vec<String> = text.lines().map(code_of).collect();
    let mut out = Vec::new();
    for (i, line) in lines.iter().enumerate() {
        if !starts_fn(line) {
            continue;
        }
        let mut depth = 0i64;
        let mut opened = false;
        for (j, l) in lines.iter().enumerate().skip(i) {
            for c in l.chars() {
                match c {
                    '{' => {
                        depth += 1;
                        opened = true;
                    }
                    '}' => depth -= 1,
                    _ => {}
                }
            }
            if opened && depth == 0 {
                out.push((j - i + 1, i + 1));
                break;
            }
            if !opened && l.trim_end().ends_with(';') {
                break; // a declaration without a body
            }
        }
    }
    out
}

#[test]
fn the_counter_sees_a_function_and_skips_braces_in_literals() {
    let text = "fn a() {\n    let s = \"{{\";\n    let c = '{';\n    // {\n}\nfn b();\n";
    assert_eq!(functions(text), vec![(5, 1)]);
}

#[test]
fn no_function_is_longer_than_the_limit() {
    let mut files = Vec::new();
    rust_files(
        &Path::new(env!("CARGO_MANIFEST_DIR")).join("src"),
        &mut files,
    );
    assert!(files.len() > 50, "sources under src/: {}", files.len());
    let mut long = Vec::new();
    for f in &files {
        let text = std::fs::read_to_string(f).expect("source");
        for (n, at) in functions(&text) {
            if n > MAX_LINES {
                long.push(format!("{}:{at}: {n} lines", f.display()));
            }
        }
    }
    assert!(
        long.is_empty(),
        "functions over {MAX_LINES} lines:\n{}",
        long.join("\n")
    );
}
