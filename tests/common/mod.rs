//! Helpers shared by the test files: reading the committed reference CSVs (no quoting:
//! the generators write none), the demo folder's files, and check-then-analyse.
#![allow(dead_code)] // each test binary uses a different subset of these helpers

use std::collections::HashMap;

/// Rows of a CSV text as header -> value maps; lines starting with '#' are comments.
pub fn read_csv(text: &str) -> Vec<HashMap<String, String>> {
    let mut lines = text
        .lines()
        .filter(|l| !l.trim().is_empty() && !l.starts_with('#'));
    let header: Vec<String> = match lines.next() {
        Some(h) => h.split(',').map(|s| s.trim().to_string()).collect(),
        None => return Vec::new(),
    };
    lines
        .map(|line| {
            header
                .iter()
                .cloned()
                .zip(line.split(',').map(|s| s.trim().to_string()))
                .collect()
        })
        .collect()
}

/// A numeric field; panics with the column name if missing or unreadable.
pub fn num(row: &HashMap<String, String>, column: &str) -> f64 {
    row.get(column)
        .and_then(|v| v.parse::<f64>().ok())
        .unwrap_or_else(|| panic!("column {column} not numeric in {row:?}"))
}

/// A text field; panics with the column name if missing.
pub fn text<'a>(row: &'a HashMap<String, String>, column: &str) -> &'a str {
    row.get(column)
        .map(String::as_str)
        .unwrap_or_else(|| panic!("column {column} missing in {row:?}"))
}

/// The NPS in inches as the catalogue spells it: 0.125 -> "1/8", 1.25 -> "1-1/4".
pub fn nominal_text(nps: f64) -> String {
    let eighths = (nps * 8.0).round() as u32;
    let (whole, rest) = (eighths / 8, eighths % 8);
    if rest == 0 {
        return whole.to_string();
    }
    let (mut n, mut d) = (rest, 8);
    while n.is_multiple_of(2) {
        n /= 2;
        d /= 2;
    }
    if whole == 0 {
        format!("{n}/{d}")
    } else {
        format!("{whole}-{n}/{d}")
    }
}

/// The demo folder's files for designs that import CSV curves (`examples-demo/`).
pub struct DemoFiles;
impl dutyline::FileAccess for DemoFiles {
    fn read_text(&self, path: &str) -> Result<String, dutyline::model::FileError> {
        let full = format!("{}/examples-demo/{path}", env!("CARGO_MANIFEST_DIR"));
        std::fs::read_to_string(full)
            .map_err(|e| dutyline::model::FileError::Unreadable(e.to_string()))
    }
}

/// Check a design that must be valid (panicking with every error, code and message,
/// when it is not) and analyse it.
pub fn analyse_valid(
    src: &str,
    files: &dyn dutyline::FileAccess,
) -> (dutyline::Design, dutyline::analysis::Analysis) {
    let checked = dutyline::check(src, files);
    let errors: Vec<String> = checked
        .diagnostics
        .iter()
        .filter(|d| d.is_error())
        .map(|d| format!("{}: {}", d.code, d.message))
        .collect();
    assert!(errors.is_empty(), "{errors:?}");
    let design = checked.design.expect("a valid design");
    let analysis = dutyline::analysis::analyse(&design);
    (design, analysis)
}

/// A typed message of an analysis in its design's report units, as the outputs print it.
pub fn said(
    analysis: &dutyline::analysis::Analysis,
    message: &dutyline::message::Message,
) -> String {
    dutyline::display::Units::new(analysis.report_units).render(message)
}
