//! The documentation works when pasted: the README's quick start installs the binary
//! before calling it, and every example in `--help`, the README and grammar/LANGUAGE.md
//! parses or runs.

use std::path::Path;

const ROOT: &str = env!("CARGO_MANIFEST_DIR");

fn read(relative: &str) -> String {
    std::fs::read_to_string(Path::new(ROOT).join(relative)).unwrap()
}

/// The fenced code blocks of a Markdown text with their info string (`sh`, ``).
fn code_blocks(markdown: &str) -> Vec<(String, String)> {
    let mut blocks = Vec::new();
    let mut current: Option<(String, String)> = None;
    for line in markdown.lines() {
        match (&mut current, line.strip_prefix("```")) {
            (None, Some(info)) => current = Some((info.trim().to_string(), String::new())),
            (Some(_), Some(_)) => blocks.extend(current.take()),
            (Some((_, text)), None) => {
                text.push_str(line);
                text.push('\n');
            }
            (None, None) => {}
        }
    }
    blocks
}

/// The section of a Markdown text under the heading `## title`.
fn section<'a>(markdown: &'a str, title: &str) -> &'a str {
    let start = markdown
        .find(&format!("\n## {title}\n"))
        .unwrap_or_else(|| panic!("no section {title}"));
    let rest = &markdown[start + 4..];
    &rest[..rest.find("\n## ").unwrap_or(rest.len())]
}

#[test]
fn the_quick_start_installs_the_binary_before_calling_it() {
    let readme = read("README.md");
    let quick = section(&readme, "Quick start");
    let (_, commands) = code_blocks(quick)
        .into_iter()
        .find(|(info, _)| info == "sh")
        .expect("a shell block in the quick start");
    let lines: Vec<&str> = commands.lines().collect();
    let install = lines
        .iter()
        .position(|l| *l == "cargo install --path . --locked")
        .expect("the quick start installs with cargo install --path . --locked");
    let first_call = lines
        .iter()
        .position(|l| l.starts_with("dutyline build "))
        .expect("the quick start runs dutyline build");
    assert!(install < first_call, "{commands}");
    assert!(
        quick.contains("Rust toolchain") && quick.contains("crate registry"),
        "the quick start says what a fresh machine needs"
    );
    // Nowhere does the README call the tool through `cargo run` any more.
    assert!(!readme.contains("cargo run"), "README still uses cargo run");
}
