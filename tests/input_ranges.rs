//! The input ranges keep real designs legal (issue 11): the guard beside the
//! regression tests in regression_input.rs, which passed before the ranges as well.

use dutyline::diagnostics::Code;
use dutyline::diagnostics::Diagnostic;

const DEMO: &str = include_str!("../examples-demo/orchard-lift-rev-a.duty");

fn demo_with(from: &str, to: &str) -> String {
    assert!(DEMO.contains(from), "the demo has no `{from}`");
    DEMO.replacen(from, to, 1)
}

fn diagnostics(src: &str) -> Vec<Diagnostic> {
    dutyline::check(src, &dutyline::NoFiles).diagnostics
}

#[test]
fn legitimate_extremes_stay_legal() {
    // Issue 11: the ranges must keep real designs legal: a level below the datum, a
    // vacuum vessel (negative gauge pressure above absolute zero), a line of 100 km.
    let src = demo_with(
        "tank wet_well { level = 1208.5 ft }",
        "tank wet_well { level = -35 m, pressure = -60 kPa }",
    );
    let src = src.replace(
        "station { centreline = 1204.0 ft }",
        "station { centreline = -40 m }",
    );
    let src = src.replace("length = 2650 ft + riser", "length = 100 km");
    let all = diagnostics(&src);
    let errors: Vec<_> = all
        .iter()
        .filter(|d| d.is_error())
        .map(|d| &d.message)
        .collect();
    assert!(errors.is_empty(), "{errors:?}");
    assert!(
        !all.iter().any(|d| d.code == Code::UnusualValue),
        "no warning either"
    );
}
