//! docs/results.schema.json (generated from the result types, see
//! `src/results/json/schema_tests.rs`) accepts the results document of every demo and
//! test design and rejects wrong ones, with the verdicts of the `jsonschema` library
//! (tests/reference/check_results_schema.py → results_schema_check.json) (issue 16).
//!
//! The validator here is minimal: exactly the keywords the schema uses (`type`,
//! `properties`, `required`, `additionalProperties: false`, `items`, `anyOf`, local
//! `$ref`, `minimum`; `format`, `description`, `title`, `$id`, `$schema`, `$defs` are
//! annotations, as for the library by default). Any other keyword fails the test, so
//! the schema cannot start relying on something unchecked.

use serde_json::Value;

const ROOT: &str = env!("CARGO_MANIFEST_DIR");

fn schema() -> Value {
    serde_json::from_str(
        &std::fs::read_to_string(format!("{ROOT}/docs/results.schema.json")).unwrap(),
    )
    .unwrap()
}

/// Why `value` does not satisfy `schema` (at `path`), or `None` when it does.
fn violation(root: &Value, schema: &Value, value: &Value, path: &str) -> Option<String> {
    let Some(rules) = schema.as_object() else {
        return Some(format!("{path}: the schema is not an object"));
    };
    for (keyword, rule) in rules {
        let problem = match keyword.as_str() {
            "$ref" => {
                let name = rule
                    .as_str()?
                    .strip_prefix("#/$defs/")
                    .expect("a local reference");
                violation(root, &root["$defs"][name], value, path)
            }
            "type" => {
                let types: Vec<&str> = match rule {
                    Value::String(t) => vec![t.as_str()],
                    Value::Array(ts) => ts.iter().filter_map(Value::as_str).collect(),
                    _ => panic!("type must be a string or a list"),
                };
                (!types.iter().any(|t| has_type(value, t)))
                    .then(|| format!("{path}: {value} is not of type {types:?}"))
            }
            "properties" => value.as_object().and_then(|object| {
                rule.as_object()?.iter().find_map(|(name, sub)| {
                    let v = object.get(name)?;
                    violation(root, sub, v, &format!("{path}/{name}"))
                })
            }),
            "required" => value.as_object().and_then(|object| {
                rule.as_array()?
                    .iter()
                    .filter_map(Value::as_str)
                    .find(|name| !object.contains_key(*name))
                    .map(|name| format!("{path}: `{name}` is required"))
            }),
            "additionalProperties" => {
                assert_eq!(rule, &Value::Bool(false), "only `false` is supported");
                let known = schema["properties"].as_object();
                value.as_object().and_then(|object| {
                    object
                        .keys()
                        .find(|k| !known.is_some_and(|p| p.contains_key(*k)))
                        .map(|k| format!("{path}: `{k}` is not a property"))
                })
            }
            "items" => value.as_array().and_then(|items| {
                items
                    .iter()
                    .enumerate()
                    .find_map(|(i, v)| violation(root, rule, v, &format!("{path}/{i}")))
            }),
            "anyOf" => {
                let options = rule.as_array().expect("anyOf is a list");
                options
                    .iter()
                    .all(|o| violation(root, o, value, path).is_some())
                    .then(|| format!("{path}: {value} matches no anyOf option"))
            }
            "minimum" => value.as_f64().and_then(|x| {
                (x < rule.as_f64().expect("a number")).then(|| format!("{path}: {x} < {rule}"))
            }),
            "format" | "description" | "title" | "$id" | "$schema" | "$defs" => None,
            other => panic!("the schema uses `{other}`, which this validator does not know"),
        };
        if problem.is_some() {
            return problem;
        }
    }
    None
}

/// JSON Schema types (Draft 2020-12, §6.1.1): an integer is a number without fraction.
fn has_type(value: &Value, t: &str) -> bool {
    match t {
        "null" => value.is_null(),
        "boolean" => value.is_boolean(),
        "object" => value.is_object(),
        "array" => value.is_array(),
        "string" => value.is_string(),
        "number" => value.is_number(),
        "integer" => value.as_f64().is_some_and(|x| x.fract() == 0.0),
        other => panic!("unknown type {other}"),
    }
}

struct Folder(&'static str);
impl dutyline::FileAccess for Folder {
    fn read_text(&self, path: &str) -> Result<String, dutyline::model::FileError> {
        std::fs::read_to_string(format!("{ROOT}/{}/{path}", self.0))
            .map_err(|e| dutyline::model::FileError::Unreadable(e.to_string()))
    }
}

/// The results document of a design (path from the repository root).
fn document(design: &str) -> Value {
    let folder = if design.starts_with("examples-demo/") {
        "examples-demo"
    } else {
        "tests/designs"
    };
    let src = std::fs::read_to_string(format!("{ROOT}/{design}")).unwrap();
    let checked = dutyline::check(&src, &Folder(folder));
    let d = checked
        .design
        .unwrap_or_else(|| panic!("{design}: {:?}", checked.diagnostics));
    let a = dutyline::analysis::analyse(&d);
    serde_json::from_str(&dutyline::results::to_json(
        &d,
        &a,
        design,
        &src,
        &checked.diagnostics,
    ))
    .unwrap()
}

/// Apply one mutation of the reference file: set or remove the value at a JSON pointer.
fn mutate(doc: &Value, pointer: &str, op: &str, value: &Value) -> Value {
    let mut doc = doc.clone();
    let (parent, last) = pointer.rsplit_once('/').unwrap();
    let node = doc
        .pointer_mut(parent)
        .unwrap_or_else(|| panic!("no {parent}"));
    match (op, node) {
        ("remove", Value::Object(map)) => {
            map.remove(last).expect("present");
        }
        ("set", Value::Object(map)) => {
            map.insert(last.to_string(), value.clone());
        }
        ("set", Value::Array(items)) => items[last.parse::<usize>().unwrap()] = value.clone(),
        other => panic!("unknown mutation {other:?}"),
    }
    doc
}

#[test]
fn the_validator_agrees_with_the_jsonschema_library_on_every_document_and_mutation() {
    let schema = schema();
    let reference: Value = serde_json::from_str(
        &std::fs::read_to_string(format!("{ROOT}/tests/reference/results_schema_check.json"))
            .unwrap(),
    )
    .unwrap();
    let checks = reference["checks"].as_array().unwrap();
    let mut documents = std::collections::BTreeMap::new();
    let (mut valid, mut invalid) = (0, 0);
    for row in checks {
        let design = row["design"].as_str().unwrap();
        let doc = documents.entry(design).or_insert_with(|| document(design));
        let doc = match row["pointer"].as_str() {
            Some(pointer) => mutate(doc, pointer, row["op"].as_str().unwrap(), &row["value"]),
            None => doc.clone(),
        };
        let verdict = violation(&schema, &schema, &doc, "");
        let expected = row["valid"].as_bool().unwrap();
        // Source: jsonschema (Draft202012Validator), as recorded by check_results_schema.py.
        assert_eq!(
            verdict.is_none(),
            expected,
            "{design} {}: {verdict:?}",
            row["pointer"]
        );
        if expected {
            valid += 1
        } else {
            invalid += 1
        }
    }
    assert!(
        valid >= 7 && invalid >= 8,
        "{valid} valid, {invalid} invalid"
    );
}

#[test]
fn every_demo_validates_and_a_wrong_document_is_rejected_with_its_place() {
    let schema = schema();
    for demo in [
        "orchard-lift-rev-a",
        "orchard-lift-rev-b",
        "kestrel-booster",
        "wrenfield-chilled-water",
        "cedar-flats-well-field",
    ] {
        let doc = document(&format!("examples-demo/{demo}.duty"));
        assert_eq!(violation(&schema, &schema, &doc, ""), None, "{demo}");
    }
    let doc = document("examples-demo/kestrel-booster.duty");
    let wrong = mutate(
        &doc,
        "/cases/1/pumps/0/speed_rpm",
        "set",
        &Value::String("1480".into()),
    );
    let why = violation(&schema, &schema, &wrong, "").expect("rejected");
    assert!(why.starts_with("/cases/1/pumps/0/speed_rpm:"), "{why}");
    assert_eq!(schema["title"], dutyline::results::FORMAT);
}
