//! Fuzz the whole compile: bytes → parse → check → analyse → results JSON → PDF.
//! Any panic is a finding; so is a non-finite number in the results or the text summary,
//! an unlocated error from `check`, a design that passes `check` but cannot be laid out
//! (issue 11: what `build` cannot lay out, `check` catches), and a run slower than linear
//! in the input (a generous 20 µs per byte over a fixed allowance).
//!
//! Run with `cargo +nightly fuzz run compile` from the crate root (see fuzz/README.md).

#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(source) = dutyline::syntax::source_from_bytes(data.to_vec()) else {
        return;
    };
    let start = std::time::Instant::now();
    let checked = dutyline::check(&source, &dutyline::NoFiles);
    for d in checked.diagnostics.iter().filter(|d| d.is_error()) {
        assert!(d.span.is_some(), "unlocated error {}: {}", d.code, d.message);
    }
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
    let text = dutyline::results::to_text(&design, &analysis);
    assert!(
        !text
            .split(|c: char| !c.is_alphanumeric())
            .any(|t| t == "NaN" || t == "inf"),
        "a non-finite value in the text summary"
    );
    let pdf = dutyline::report::render_pdf(&design, &analysis, &source, &style, None)
        .expect("a design that passes check is laid out");
    assert!(pdf.starts_with(b"%PDF"));
    let allowed = 2.0 + 20e-6 * source.len() as f64;
    let took = start.elapsed().as_secs_f64();
    assert!(took < allowed, "{took:.2} s for {} bytes", source.len());
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
