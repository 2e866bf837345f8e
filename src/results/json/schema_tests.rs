//! The JSON Schema of the results document (`docs/results.schema.json`) is generated
//! from the types that serialize it (schemars, a dev-dependency), so it cannot drift from
//! the output. Regenerate with `DUTYLINE_BLESS=1 cargo test --lib results::json`.

use serde_json::Value;

use super::{Doc, FORMAT};

/// Objects are closed: a property the types do not have is an error.
fn close_objects(v: &mut Value) {
    match v {
        Value::Object(map) => {
            if map.contains_key("properties") {
                map.insert("additionalProperties".into(), Value::Bool(false));
            }
            map.values_mut().for_each(close_objects);
        }
        Value::Array(items) => items.iter_mut().for_each(close_objects),
        _ => {}
    }
}

/// The schema as committed: draft 2020-12, titled with the format string.
pub fn results_schema() -> String {
    let mut schema = serde_json::to_value(schemars::schema_for!(Doc)).expect("a schema");
    close_objects(&mut schema);
    let map = schema.as_object_mut().expect("an object schema");
    map.insert("title".into(), Value::String(FORMAT.into()));
    map.insert(
        "description".into(),
        Value::String(
            "The results document of `dutyline results --format json`; every field is explained in docs/results-json.md. SI units, named in the keys; ratios as fractions; null where a value does not exist.".into(),
        ),
    );
    map.insert(
        "$id".into(),
        Value::String("dutyline-results-2.schema.json".into()),
    );
    serde_json::to_string_pretty(&schema).expect("text") + "\n"
}

#[test]
fn the_committed_schema_is_generated_from_the_result_types() {
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/docs/results.schema.json");
    let text = results_schema();
    if std::env::var_os("DUTYLINE_BLESS").is_some() {
        std::fs::write(path, &text).expect("write the schema");
    }
    let committed = std::fs::read_to_string(path).unwrap_or_default();
    assert!(
        committed == text,
        "docs/results.schema.json is stale: DUTYLINE_BLESS=1 cargo test --lib results::json"
    );
}
