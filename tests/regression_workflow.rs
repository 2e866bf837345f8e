//! Regressions of issue 16 as a user meets them: one-line blocks through `fmt --check`,
//! temperature spellings, and `check --analyse` counting the analysis warnings.

use dutyline::diagnostics::Code;
mod cli_common;

use cli_common::{both, copy_demos, dutyline, scratch};

#[test]
fn fmt_check_accepts_the_readme_one_line_blocks() {
    let dir = scratch("one-line-blocks");
    let text = "project { title = \"Irrigation lift\", number = \"FB-HYD-007\", units = us }\n\
                motor { standard = nema, service_factor = 1.15 }\n";
    std::fs::write(dir.join("a.duty"), text).unwrap();
    let out = dutyline(&dir, &["fmt", "--check", "a.duty"]);
    assert!(out.status.success(), "{}", both(&out));
    let out = dutyline(&dir, &["fmt", "a.duty"]);
    assert!(out.status.success(), "{}", both(&out));
    assert_eq!(std::fs::read_to_string(dir.join("a.duty")).unwrap(), text);
}

/// The first diagnostic of a design whose water temperature is written `spelling`.
fn temperature_help(spelling: &str) -> String {
    let demo = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/examples-demo/orchard-lift-rev-a.duty"
    ))
    .unwrap();
    let source = demo.replace(
        "temperature = 64 degF",
        &format!("temperature = {spelling}"),
    );
    assert_ne!(source, demo);
    let checked = dutyline::check(&source, &dutyline::NoFiles);
    let first = checked
        .diagnostics
        .iter()
        .find(|d| d.is_error())
        .unwrap_or_else(|| panic!("`{spelling}` is accepted"));
    format!(
        "{} {}",
        first.message,
        first.help.clone().unwrap_or_default()
    )
}

#[test]
fn temperature_spellings_suggest_degc_or_degf() {
    for (spelling, meant) in [
        ("82 C", "degC"),
        ("180 F", "degF"),
        ("180 deg F", "degF"),
        ("82 degree C", "degC"),
        ("82 ° C", "degC"),
        ("60 fahrenheit", "degF"),
    ] {
        let help = temperature_help(spelling);
        assert!(
            help.contains(&format!("did you mean `{meant}`")),
            "{spelling}: {help}"
        );
        assert!(!help.contains("`m`"), "{spelling}: {help}");
    }
    // Already right: `°C` in one word.
    let demo = "fluid water { temperature = 82 °C }\n";
    let checked = dutyline::check(demo, &dutyline::NoFiles);
    assert!(checked
        .diagnostics
        .iter()
        .all(|d| d.code != Code::UnknownUnit));
}

/// The number in "valid (N warning(s))" or "N error(s), M warning(s)".
fn warning_count(text: &str) -> usize {
    let before = &text[..text.rfind(" warning(s)").expect("a warning count")];
    let digits = before.rsplit(|c: char| !c.is_ascii_digit()).next().unwrap();
    digits.parse().unwrap()
}

#[test]
fn check_analyse_counts_the_warnings_results_lists() {
    let dir = scratch("check-analyse");
    copy_demos(&dir);
    for demo in ["kestrel-booster.duty", "orchard-lift-rev-a.duty"] {
        let path = format!("examples-demo/{demo}");
        let plain = dutyline(&dir, &["check", &path]);
        let analysed = dutyline(&dir, &["check", "--analyse", &path]);
        let json = dutyline(&dir, &["results", "--format", "json", &path]);
        assert!(analysed.status.success(), "{}", both(&analysed));
        let doc: serde_json::Value = serde_json::from_slice(&json.stdout).unwrap();
        let listed = doc["warnings"].as_array().unwrap().len();
        let counted = warning_count(&String::from_utf8_lossy(&analysed.stdout));
        assert_eq!(counted, listed, "{demo}");
        // The demos' curve fits warn (pump-curve), which only --analyse sees.
        assert!(counted > warning_count(&String::from_utf8_lossy(&plain.stdout)));
        let stderr = String::from_utf8_lossy(&analysed.stderr);
        assert!(stderr.contains("warning[pump-curve]"), "{stderr}");
        // ... and --deny-warnings then fails the check, for CI.
        let denied = dutyline(&dir, &["check", "--analyse", "--deny-warnings", &path]);
        assert_eq!(denied.status.code(), Some(1), "{}", both(&denied));
        assert_eq!(
            warning_count(&String::from_utf8_lossy(&denied.stderr)),
            listed
        );
        assert!(dutyline(&dir, &["check", "--deny-warnings", &path])
            .status
            .success());
    }
}

#[test]
fn a_bad_length_gives_one_error_and_no_zero_length_warning() {
    // Issue 16: a refused length left the pipe at 0 and a false "zero-length" warning.
    let demo = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/examples-demo/orchard-lift-rev-a.duty"
    ))
    .unwrap();
    for (bad, code) in [
        ("40 psi", "unit-mismatch"),
        ("40", "unit-mismatch"),
        ("-5 ft", "out-of-range"),
        ("abc", "expected-number"),
        ("\"x\"", "expected-number"),
        ("1e999 ft", "number-out-of-range"),
    ] {
        let src = demo.replacen("length = 18 ft", &format!("length = {bad}"), 1);
        let all = dutyline::check(&src, &dutyline::NoFiles).diagnostics;
        let codes: Vec<&str> = all.iter().map(|d| d.code.as_str()).collect();
        assert!(codes.contains(&code), "{bad}: {codes:?}");
        assert!(!codes.contains(&"zero-length"), "{bad}: {codes:?}");
        assert_eq!(
            all.iter().filter(|d| d.is_error()).count(),
            1,
            "{bad}: {codes:?}"
        );
    }
    // A length written as zero still warns.
    let zero = demo.replacen("length = 18 ft", "length = 0 ft", 1);
    let all = dutyline::check(&zero, &dutyline::NoFiles).diagnostics;
    assert!(all.iter().any(|d| d.code.as_str() == "zero-length"));
}
