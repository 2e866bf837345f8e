//! Every field of the demos' results JSON is documented in docs/results-json.md, so the
//! public interface a script reads has no undocumented key.

mod common;
use common::DemoFiles;
use std::collections::BTreeSet;

const DOC: &str = include_str!("../docs/results-json.md");

fn keys(v: &serde_json::Value, out: &mut BTreeSet<String>) {
    match v {
        serde_json::Value::Object(map) => {
            for (k, x) in map {
                out.insert(k.clone());
                keys(x, out);
            }
        }
        serde_json::Value::Array(items) => items.iter().for_each(|x| keys(x, out)),
        _ => {}
    }
}

#[test]
fn every_key_of_the_demo_documents_is_in_docs_results_json() {
    let mut all = BTreeSet::new();
    for demo in [
        "orchard-lift-rev-a",
        "orchard-lift-rev-b",
        "kestrel-booster",
        "hillside-district",
        "wrenfield-chilled-water",
        "cedar-flats-well-field",
    ] {
        let path = format!("{}/examples-demo/{demo}.duty", env!("CARGO_MANIFEST_DIR"));
        let src = std::fs::read_to_string(&path).expect("demo");
        let c = dutyline::check(&src, &DemoFiles);
        let design = c.design.expect("design");
        let a = dutyline::analysis::analyse(&design);
        let text = dutyline::results::to_json(&design, &a, &path, &src, &c.diagnostics);
        let json: serde_json::Value = serde_json::from_str(&text).expect("json");
        keys(&json, &mut all);
    }
    assert!(all.len() > 100, "{}", all.len());
    let missing: Vec<&String> = all
        .iter()
        .filter(|k| {
            // Written `key`, `parent.key`, or `key[]` for a list.
            ![
                format!("`{k}`"),
                format!(".{k}`"),
                format!("`{k}[]"),
                format!(".{k}[]"),
            ]
            .iter()
            .any(|form| DOC.contains(form.as_str()))
        })
        .collect();
    assert!(missing.is_empty(), "undocumented keys: {missing:?}");
}
