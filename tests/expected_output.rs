//! Expected-output tests for what users read: the rendered diagnostics (source line,
//! underline, label, help; no colour) of the broken designs in tests/designs/broken/,
//! grouped by stage; `fmt` output and the `results` text of each demo; the `diff` text
//! between the orchard revisions. The expected texts live in tests/expected/.
//!
//! Bless (rewrite) them after an intended change with
//! `DUTYLINE_BLESS=1 cargo test --test expected_output`, then read the git diff.

mod common;
use common::DemoFiles;
use dutyline::diagnostics::Code;
use std::path::{Path, PathBuf};

fn blessing() -> bool {
    std::env::var_os("DUTYLINE_BLESS").is_some()
}

/// A readable line diff: each differing line with its number, expected then actual.
fn line_diff(expected: &str, actual: &str) -> String {
    let (e, a): (Vec<&str>, Vec<&str>) = (expected.lines().collect(), actual.lines().collect());
    let mut out = String::new();
    for i in 0..e.len().max(a.len()) {
        let (x, y) = (e.get(i), a.get(i));
        if x != y {
            out.push_str(&format!(
                "line {}:\n  - {}\n  + {}\n",
                i + 1,
                x.unwrap_or(&"<none>"),
                y.unwrap_or(&"<none>")
            ));
        }
    }
    out
}

/// Compare `actual` with the file, or write it when blessing. Returns a failure message.
fn expect(path: &Path, actual: &str) -> Option<String> {
    if blessing() {
        std::fs::create_dir_all(path.parent().unwrap()).unwrap();
        std::fs::write(path, actual).unwrap();
        return None;
    }
    let expected = std::fs::read_to_string(path).unwrap_or_default();
    (expected != actual).then(|| {
        format!(
            "{} differs (bless with DUTYLINE_BLESS=1):\n{}",
            path.display(),
            line_diff(&expected, actual)
        )
    })
}

fn files(dir: &str, ext: &str) -> Vec<PathBuf> {
    let mut out = Vec::new();
    for entry in std::fs::read_dir(dir).unwrap().flatten() {
        let p = entry.path();
        if p.is_dir() {
            out.extend(files(p.to_str().unwrap(), ext));
        } else if p.extension().is_some_and(|x| x == ext) {
            out.push(p);
        }
    }
    out.sort();
    out
}

fn finish(failures: Vec<String>) {
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}

/// Codes no design file can show through `check` and `analyse`, each with the test that
/// shows it instead.
const NOT_FROM_A_DESIGN: &[(Code, &str)] = &[
    (Code::Usage, "command-line arguments, not a design"),
    (Code::OutputRefused, "the `-o` target: tests/regression_io.rs"),
    (Code::WriteFailed, "a failing write of an output, not a design"),
    (Code::FormatFailed, "fmt's guard against losing text; no known design reaches it"),
    (Code::Style, "a style file: tests/regression_io.rs"),
    (Code::Layout, "what the page cannot hold, which `check` rejects first: tests/regression_input.rs"),
    (Code::CaseFailed, "a case `check` let through but the engine cannot resolve; `check` rejects each known cause first (tests/regression_input.rs)"),
    (Code::FileTooLarge, "a file over 1 MiB is not committed: tests/input_limits.rs"),
    (Code::NotAPackage, "a PDF given to `verify` or `extract`, not a design: tests/package_verify.rs"),
];

/// The diagnostics of a design as a user reads them: `check`, and when the design is
/// valid the analysis warnings too.
fn checked_and_analysed(source: &str) -> Vec<dutyline::diagnostics::Diagnostic> {
    let checked = dutyline::check(source, &dutyline::NoFiles);
    let mut all = checked.diagnostics;
    if let Some(design) = checked.design {
        let analysis = dutyline::analysis::analyse(&design);
        let units = dutyline::display::Units::new(design.project.units);
        all.extend(
            analysis
                .warnings
                .iter()
                .map(|w| w.diagnostic(|m| units.render(m))),
        );
    }
    all
}

/// What `dutyline check` prints for a design of tests/designs/broken/files/, which reads
/// files through the command line's confined file access; and the codes it shows.
fn checked_by_the_cli(path: &Path) -> (String, Vec<Code>) {
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_dutyline"))
        .arg("check")
        .arg(path)
        .output()
        .expect("run dutyline");
    let stderr = String::from_utf8_lossy(&out.stderr).into_owned();
    let codes = stderr
        .lines()
        .filter_map(|l| l.split_once('[').and_then(|(_, r)| r.split_once(']')))
        .filter_map(|(code, _)| Code::from_text(code))
        .collect();
    (stderr, codes)
}

#[test]
fn broken_designs_render_their_diagnostics() {
    let mut failures = Vec::new();
    let mut codes = std::collections::BTreeSet::new();
    for path in files("tests/designs/broken", "duty") {
        let name = path.strip_prefix("tests/designs/broken").unwrap();
        let rendered = if name.starts_with("files") {
            let (stderr, shown) = checked_by_the_cli(&path);
            assert!(!shown.is_empty(), "{} is not broken", path.display());
            codes.extend(shown);
            stderr
        } else {
            let source = std::fs::read_to_string(&path).unwrap();
            let all = checked_and_analysed(&source);
            assert!(!all.is_empty(), "{} is not broken", path.display());
            codes.extend(all.iter().map(|d| d.code));
            dutyline::diagnostics::render(&all, &name.display().to_string(), &source)
        };
        let expected = Path::new("tests/expected/diagnostics")
            .join(name)
            .with_extension("txt");
        failures.extend(expect(&expected, &rendered));
    }
    // Every code a design can trigger is shown by at least one broken design.
    for code in Code::ALL {
        let elsewhere = NOT_FROM_A_DESIGN.iter().any(|(c, _)| c == code);
        if !elsewhere && !codes.contains(code) {
            failures.push(format!("no broken design shows `{code}`"));
        }
    }
    finish(failures);
}

#[test]
fn demos_format_results_and_diff_as_expected() {
    let mut failures = Vec::new();
    let mut checked_demos = Vec::new();
    for path in files("examples-demo", "duty") {
        let source = std::fs::read_to_string(&path).unwrap();
        let stem = path.file_stem().unwrap().to_str().unwrap().to_string();
        let formatted = dutyline::syntax::format_source(&source).expect("demo formats");
        failures.extend(expect(
            &Path::new("tests/expected/fmt").join(format!("{stem}.duty")),
            &formatted,
        ));
        let checked = dutyline::check(&source, &DemoFiles);
        let design = checked.design.expect("demo is valid");
        let analysis = dutyline::analysis::analyse(&design);
        let text = dutyline::results::to_text(&design, &analysis);
        failures.extend(expect(
            &Path::new("tests/expected/results").join(format!("{stem}.txt")),
            &text,
        ));
        checked_demos.push((stem, design, analysis));
    }
    let find = |stem: &str| checked_demos.iter().find(|d| d.0 == stem).expect("demo");
    let (old, new) = (find("orchard-lift-rev-a"), find("orchard-lift-rev-b"));
    let diff = dutyline::diff::diff(&old.1, &old.2, &new.1, &new.2);
    let text = dutyline::diff::render_text(&diff);
    failures.extend(expect(
        Path::new("tests/expected/diff/orchard-lift-rev-a-to-b.txt"),
        &text,
    ));
    finish(failures);
}
