//! The documentation works when pasted: the README's quick start installs the binary
//! before calling it, and every example in `--help`, the README and grammar/LANGUAGE.md
//! parses or runs.

mod cli_common;

use std::path::{Path, PathBuf};
use std::process::Command;

use cli_common::{both, copy_demos, git, scratch, shell, BIN};

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

/// A folder where every documented example can run: the demos, `design.duty` and
/// `pumps/lift.duty` (two commits of each in git, the first tagged `v1`), `old/lift.duty`.
fn example_folder(name: &str) -> PathBuf {
    let dir = scratch(name);
    copy_demos(&dir);
    let demo = read("examples-demo/orchard-lift-rev-a.duty");
    let later = read("examples-demo/orchard-lift-rev-b.duty");
    for folder in ["pumps", "old"] {
        std::fs::create_dir_all(dir.join(folder)).unwrap();
    }
    std::fs::write(dir.join("old/lift.duty"), &demo).unwrap();
    git(&dir, &["init", "-q"]);
    for (text, message) in [(&demo, "first"), (&later, "second")] {
        std::fs::write(dir.join("design.duty"), text).unwrap();
        std::fs::write(dir.join("pumps/lift.duty"), text).unwrap();
        git(&dir, &["add", "-A"]);
        git(&dir, &["commit", "-q", "-m", message]);
        if message == "first" {
            git(&dir, &["tag", "v1"]);
        }
    }
    dir
}

/// The subcommands `dutyline --help` lists.
fn subcommands() -> Vec<String> {
    let out = Command::new(BIN).arg("--help").output().unwrap();
    let text = String::from_utf8(out.stdout).unwrap();
    let list = &text[text.find("Commands:").expect("a command list")..];
    list.lines()
        .skip(1)
        .take_while(|l| l.starts_with("  "))
        .filter_map(|l| l.split_whitespace().next())
        .filter(|name| *name != "help")
        .map(str::to_string)
        .collect()
}

/// The example lines of a help text: the indented lines after `Example(s):`.
fn help_examples(text: &str) -> Vec<String> {
    let Some(start) = text.find("Example") else {
        return Vec::new();
    };
    text[start..]
        .lines()
        .skip(1)
        .take_while(|l| l.starts_with("  "))
        .map(|l| l.trim().to_string())
        .collect()
}

#[test]
fn every_help_example_runs_when_pasted() {
    let dir = example_folder("help-examples");
    let mut ran = 0;
    for command in subcommands() {
        let out = Command::new(BIN)
            .args([&command, "--help"])
            .output()
            .unwrap();
        let examples = help_examples(&String::from_utf8(out.stdout).unwrap());
        assert!(!examples.is_empty(), "`{command} --help` has an example");
        for example in examples {
            assert!(example.contains("dutyline "), "{command}: {example}");
            // `watch` runs until interrupted: here it stops after its first build.
            let example =
                if example.starts_with("dutyline watch ") && !example.contains("--max-builds") {
                    format!("{example} --max-builds 1")
                } else {
                    example
                };
            let out = shell(&dir, &example);
            assert!(out.status.success(), "`{example}`: {}", both(&out));
            ran += 1;
        }
    }
    assert!(ran >= 10, "only {ran} examples found");
}

#[test]
fn every_readme_shell_example_runs() {
    let dir = example_folder("readme-examples");
    let readme = read("README.md");
    for (info, block) in code_blocks(&readme) {
        if info != "sh" {
            continue;
        }
        // cargo itself (install, test) is not what this test is about.
        let script: Vec<&str> = block.lines().filter(|l| !l.starts_with("cargo ")).collect();
        let out = shell(&dir, &format!("set -e\n{}", script.join("\n")));
        assert!(
            out.status.success(),
            "README block:\n{block}\n{}",
            both(&out)
        );
    }
}

/// Design text in a Markdown file: the untagged code blocks.
fn design_blocks(markdown: &str) -> Vec<String> {
    code_blocks(markdown)
        .into_iter()
        .filter(|(info, _)| info.is_empty())
        .map(|(_, text)| text)
        .collect()
}

#[test]
fn the_readme_tour_is_a_valid_design_and_already_canonical() {
    let blocks = design_blocks(&read("README.md"));
    assert!(!blocks.is_empty());
    for block in blocks {
        let checked = dutyline::check(&block, &dutyline::NoFiles);
        let errors: Vec<_> = checked
            .diagnostics
            .iter()
            .filter(|d| d.is_error())
            .collect();
        assert!(errors.is_empty(), "{errors:?}\n{block}");
        // `fmt --check` accepts it as written (one-line blocks included).
        assert_eq!(dutyline::syntax::format_source(&block).unwrap(), block);
    }
}

#[test]
fn every_language_reference_example_parses() {
    let text = read("grammar/LANGUAGE.md");
    let blocks = design_blocks(&text);
    assert!(!blocks.is_empty());
    for block in blocks {
        if let Err(d) = dutyline::syntax::parse(&block) {
            panic!("{d:?}\n{block}");
        }
    }
    // The one-line examples in backticks that hold a whole block.
    let mut inline = 0;
    for snippet in text.split('`').skip(1).step_by(2) {
        let whole = snippet.ends_with('}') && !snippet.contains("...") && !snippet.contains(" | ");
        let block_word = snippet.split_whitespace().next().is_some_and(|w| {
            [
                "tank", "case", "fluid", "site", "station", "require", "loss", "motor",
            ]
            .contains(&w)
        });
        if whole && block_word {
            if let Err(d) = dutyline::syntax::parse(snippet) {
                panic!("`{snippet}`: {d:?}");
            }
            inline += 1;
        }
    }
    assert!(inline >= 3, "only {inline} inline examples");
}

#[test]
fn every_line_the_empty_file_help_suggests_parses() {
    let checked = dutyline::check("", &dutyline::NoFiles);
    let mut suggested = 0;
    for diagnostic in &checked.diagnostics {
        let help = diagnostic.help.as_deref().unwrap_or_default();
        for snippet in help.split('`').skip(1).step_by(2) {
            if snippet.contains("{ ... }") {
                continue; // a placeholder for a body, not a line to paste
            }
            assert!(
                dutyline::syntax::parse(snippet).is_ok(),
                "{}: `{snippet}` does not parse",
                diagnostic.code
            );
            suggested += 1;
        }
    }
    // project, fluid, site (two), station.
    assert!(suggested >= 5, "only {suggested} suggestions");
}
