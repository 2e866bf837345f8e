//! Fuzz the whole compile: bytes → parse → check → analyse → results JSON → PDF.
//! Any panic is a finding; so is a non-finite number in the results.
//!
//! Run with `cargo +nightly fuzz run compile` from the crate root (see fuzz/README.md).

#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(source) = dutyline::syntax::source_from_bytes(data.to_vec()) else {
        return;
    };
    let checked = dutyline::check(&source, &dutyline::NoFiles);
    let Some(design) = checked.design else {
        return;
    };
    let analysis = dutyline::analysis::analyse(&design);
    let json = dutyline::results::to_json(&design, &analysis, "fuzz.duty", &source, &checked.diagnostics);
    let value: serde_json::Value = serde_json::from_str(&json).expect("the results are valid JSON");
    assert_finite(&value);
    // A candidate without a score ranks with score +inf by design (JSON `null`).
    let debug = format!("{analysis:?}").replace("score: inf,", "");
    assert!(
        !debug
            .split(|c: char| !c.is_alphanumeric())
            .any(|t| t == "NaN" || t == "inf"),
        "a non-finite value in the analysis"
    );
    let style = dutyline::report::layout::style::Style::builtin("letter").expect("letter style");
    // A render error is a reported failure, not a crash; only panics are findings here.
    if let Ok(pdf) = dutyline::report::render_pdf(&design, &analysis, &source, &style, None) {
        assert!(pdf.starts_with(b"%PDF"));
    }
});

fn assert_finite(v: &serde_json::Value) {
    match v {
        serde_json::Value::Number(n) => {
            assert!(n.as_f64().is_some_and(f64::is_finite), "non-finite number {n}")
        }
        serde_json::Value::Array(items) => items.iter().for_each(assert_finite),
        serde_json::Value::Object(map) => map.values().for_each(assert_finite),
        _ => {}
    }
}
