//! Every diagnostic code is documented in grammar/LANGUAGE.md ("Diagnostic codes") with
//! the tool's own one-line description, and every documented code exists.

use dutyline::diagnostics::Code;
use std::collections::BTreeMap;

/// The `| \`code\` | description |` rows of the "Diagnostic codes" chapter.
fn documented() -> BTreeMap<String, String> {
    let text = std::fs::read_to_string("grammar/LANGUAGE.md").expect("LANGUAGE.md");
    let start = text
        .find("\n## Diagnostic codes\n")
        .expect("a `## Diagnostic codes` chapter");
    let chapter = &text[start + 1..];
    let chapter = match chapter[3..].find("\n## ") {
        Some(end) => &chapter[..end + 3],
        None => chapter,
    };
    let mut rows = BTreeMap::new();
    for line in chapter.lines() {
        let Some(rest) = line.strip_prefix("| `") else {
            continue;
        };
        let (code, rest) = rest.split_once("` | ").expect("a code row");
        let description = rest.strip_suffix(" |").expect("a closed row");
        let earlier = rows.insert(code.to_string(), description.to_string());
        assert!(earlier.is_none(), "`{code}` is documented twice");
    }
    rows
}

#[test]
fn every_code_is_documented_with_its_description() {
    let rows = documented();
    for code in Code::ALL {
        let description = rows
            .get(code.as_str())
            .unwrap_or_else(|| panic!("`{code}` is not in grammar/LANGUAGE.md"));
        assert_eq!(description, code.description(), "`{code}`");
    }
}

#[test]
fn every_documented_code_exists() {
    for code in documented().keys() {
        assert!(
            Code::from_text(code).is_some(),
            "grammar/LANGUAGE.md documents `{code}`, which the tool does not have"
        );
    }
    assert_eq!(documented().len(), Code::ALL.len());
}
