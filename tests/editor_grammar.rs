//! The TextMate grammar in editors/ highlights the language's own keywords: its
//! keyword alternations equal the lists in `dutyline::model::keywords` (issue 16).

use dutyline::model::keywords;
use std::collections::BTreeSet;

fn grammar() -> serde_json::Value {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/editors/vscode/syntaxes/duty.tmLanguage.json"
    ))
    .expect("the grammar file");
    serde_json::from_str(&text).expect("the grammar is JSON")
}

/// The words of the first `\b(a|b|c)\b` group of a repository rule's `match`.
fn alternatives(g: &serde_json::Value, rule: &str) -> BTreeSet<String> {
    let pattern = g["repository"][rule]["match"]
        .as_str()
        .unwrap_or_else(|| panic!("rule {rule} has a match"));
    let start = pattern.find('(').expect("a group") + 1;
    let end = start + pattern[start..].find(')').expect("a closed group");
    pattern[start..end].split('|').map(str::to_string).collect()
}

fn set(words: &[&str]) -> BTreeSet<String> {
    words.iter().map(|w| w.to_string()).collect()
}

#[test]
fn the_grammar_names_the_language_and_its_files() {
    let g = grammar();
    assert_eq!(g["scopeName"], "source.duty");
    assert_eq!(g["fileTypes"][0], "duty");
    let package: serde_json::Value = serde_json::from_str(
        &std::fs::read_to_string(concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/editors/vscode/package.json"
        ))
        .unwrap(),
    )
    .unwrap();
    let grammars = &package["contributes"]["grammars"][0];
    assert_eq!(grammars["scopeName"], "source.duty");
    assert_eq!(grammars["path"], "./syntaxes/duty.tmLanguage.json");
    assert_eq!(
        package["contributes"]["languages"][0]["extensions"][0],
        ".duty"
    );
    // Every rule the top level includes exists.
    for p in g["patterns"].as_array().unwrap() {
        let name = p["include"].as_str().unwrap().trim_start_matches('#');
        assert!(g["repository"].get(name).is_some(), "{name}");
    }
}

#[test]
fn the_grammar_keywords_are_the_language_keywords() {
    let g = grammar();
    assert_eq!(alternatives(&g, "statement"), set(keywords::STATEMENTS));
    assert_eq!(alternatives(&g, "reserved"), set(keywords::RESERVED));
    assert_eq!(alternatives(&g, "line-item"), set(keywords::LINE_ITEMS));
    assert_eq!(
        alternatives(&g, "uncertainty-item"),
        set(keywords::UNCERTAINTY_ITEMS)
    );
    // `speed` is a field as often as an argument word, so it is left to the field rule.
    let mut args = set(keywords::ARGUMENT_WORDS);
    args.remove("speed");
    assert_eq!(alternatives(&g, "argument-word"), args);
}

#[test]
fn the_statement_keywords_are_the_ones_the_checker_accepts() {
    let unknown = |src: &str| {
        dutyline::check(src, &dutyline::NoFiles)
            .diagnostics
            .iter()
            .any(|d| d.code.as_str() == "unknown-statement")
    };
    for k in keywords::STATEMENTS {
        assert!(!unknown(&format!("{k} x {{ }}\n")), "{k}");
    }
    assert!(unknown("reservoir x { }\n"));
}
