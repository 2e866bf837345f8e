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

/// Positive root of a q² + b q + c = 0 (hand-solved duties on linear pump curves).
pub fn positive_root(a: f64, b: f64, c: f64) -> f64 {
    (-b + (b * b - 4.0 * a * c).sqrt()) / (2.0 * a)
}

/// The head of K = 100 velocity heads in 6 in schedule 40, ft per gpm²: ID 6.065 in
/// (ASME B36.10M), A = π/4 × (6.065/12)² = 0.200 63 ft²; v = Q × 0.002 228 0 ft³/s per
/// gpm / A = 0.011 105 Q ft/s; K v²/2g = 100 × (0.011 105 Q)² / 64.348 = 1.9165e-4 Q² ft
/// (1 US gal = 3.785 411 784 L, NIST SP 811 Appendix B; g = 32.174 ft/s², standard
/// gravity).
pub fn k100_in_6in_sch40_ft_per_gpm2() -> f64 {
    let gal_m3 = 3.785_411_784e-3;
    let area = std::f64::consts::PI / 4.0 * (6.065_f64 / 12.0).powi(2);
    let v_per_gpm = (gal_m3 / 0.3048_f64.powi(3)) / 60.0 / area;
    100.0 * v_per_gpm * v_per_gpm / (2.0 * 32.174_048_556)
}

/// The setting and suction line of a small invented SI lift shared by several test
/// files: water at 15 °C at sea level, tank `a` at 10 m, tank `b` at 40 m, the pump
/// centreline at 9 m, 10 m of 4 in schedule 40 steel with a flush entrance (line `s`).
pub const SMALL_LIFT_SUCTION: &str = r#"project { title = "Small lift", units = si }
fluid water { temperature = 15 degC }
site { elevation = 0 m }
tank a { level = 10 m }
tank b { level = 40 m }
station { centreline = 9 m }
line s from a to pump {
    pipe steel 4 in schedule 40 { length = 10 m }
    fitting entrance_flush
}
"#;

/// The discharge of the small lift: 100 m of 4 in schedule 40 steel to tank `b` with an
/// exit loss (line `d`), and one case `normal`.
pub const SMALL_LIFT_DISCHARGE: &str = r#"line d from pump to b {
    pipe steel 4 in schedule 40 { length = 100 m }
    fitting exit
}
case normal { }
"#;

/// The whole small lift ([`SMALL_LIFT_SUCTION`] then [`SMALL_LIFT_DISCHARGE`]), no pump.
pub fn small_lift() -> String {
    format!("{SMALL_LIFT_SUCTION}{SMALL_LIFT_DISCHARGE}")
}
