//! Input limits: a file too large, too many cases, segments or curve points each give
//! one clear error, and the limit itself is still accepted.

mod common;
use dutyline::diagnostics::Code;
use std::collections::BTreeMap;
use std::fmt::Write;

use dutyline::model::{MAX_CASES, MAX_CURVE_POINTS, MAX_SEGMENTS};
use dutyline::syntax::MAX_SOURCE_BYTES;

/// A discharge line of `segments` pipes, `cases` cases and a pump curve of `points` rows.
fn design(segments: usize, cases: usize, points: usize) -> String {
    let mut s = common::SMALL_LIFT_SUCTION.to_string();
    s.push_str("line d from pump to b {\n");
    for _ in 0..segments {
        s.push_str("    pipe steel 4 in schedule 40 { length = 1 m }\n");
    }
    s.push_str("    fitting exit\n}\n");
    for i in 0..cases {
        writeln!(s, "case c{i} {{ }}").unwrap();
    }
    s.push_str("pump P \"limits\" {\n    speed = 1750 rpm\n    curve {\n");
    s.push_str(&curve_rows(points, " "));
    s.push_str("    }\n}\n");
    s
}

/// Header and rows of a falling head curve, 0 to 80 m³/h, columns separated by `sep`.
fn curve_rows(points: usize, sep: &str) -> String {
    let mut s = format!("flow m^3/h{sep}head m{sep}efficiency %\n");
    for i in 0..points {
        let q = 80.0 * i as f64 / (points - 1) as f64;
        let h = 50.0 - 0.003 * q * q;
        let e = 0.02 * q * (100.0 - q);
        writeln!(s, "{q:.6}{sep}{h:.6}{sep}{e:.6}").unwrap();
    }
    s
}

fn too_many(src: &str, files: &BTreeMap<String, String>) -> Vec<String> {
    let c = dutyline::check(src, files);
    c.diagnostics
        .iter()
        .filter(|d| d.is_error())
        .map(|d| format!("{}: {}", d.code, d.message))
        .collect()
}

#[test]
fn the_limits_themselves_are_accepted() {
    // One suction segment plus MAX_SEGMENTS - 1 discharge segments.
    let src = design(MAX_SEGMENTS - 1, MAX_CASES, MAX_CURVE_POINTS);
    let errors = too_many(&src, &BTreeMap::new());
    assert!(errors.is_empty(), "{errors:?}");
}

#[test]
fn too_many_cases_is_one_clear_error() {
    let src = design(5, MAX_CASES + 1, 10);
    let errors = too_many(&src, &BTreeMap::new());
    assert_eq!(errors.len(), 1, "{errors:?}");
    assert_eq!(
        errors[0],
        format!(
            "too-many: the design has {} cases; at most {MAX_CASES} are accepted",
            MAX_CASES + 1
        )
    );
}

#[test]
fn too_many_segments_is_one_clear_error() {
    let src = design(MAX_SEGMENTS, 1, 10);
    let errors = too_many(&src, &BTreeMap::new());
    assert_eq!(errors.len(), 1, "{errors:?}");
    assert_eq!(
        errors[0],
        format!(
            "too-many: the design has {} pipe segments; at most {MAX_SEGMENTS} are accepted",
            MAX_SEGMENTS + 1
        )
    );
}

#[test]
fn too_many_curve_points_is_one_clear_error_inline_and_from_csv() {
    let src = design(5, 1, MAX_CURVE_POINTS + 1);
    let errors = too_many(&src, &BTreeMap::new());
    assert_eq!(errors.len(), 1, "{errors:?}");
    let want = format!(
        "too-many: a curve may have at most {MAX_CURVE_POINTS} points; this one has {}",
        MAX_CURVE_POINTS + 1
    );
    assert_eq!(errors[0], want);
    // The same table imported from a CSV file.
    let inline = design(5, 1, 3);
    let start = inline.find("    curve {").expect("curve");
    let end = inline[start..].find("    }\n").expect("end") + start + 6;
    let src = format!(
        "{}    curve from \"big.csv\"\n{}",
        &inline[..start],
        &inline[end..]
    );
    let mut files = BTreeMap::new();
    files.insert(
        "big.csv".to_string(),
        curve_rows(MAX_CURVE_POINTS + 1, ", "),
    );
    let errors = too_many(&src, &files);
    assert_eq!(errors, vec![want]);
}

#[test]
fn a_file_above_the_size_limit_is_refused_before_parsing() {
    let mut src = design(5, 1, 10);
    src.push_str(&"# padding\n".repeat(MAX_SOURCE_BYTES / 10 + 1));
    assert!(src.len() > MAX_SOURCE_BYTES);
    let c = dutyline::check(&src, &dutyline::NoFiles);
    assert!(c.design.is_none());
    assert_eq!(c.diagnostics.len(), 1);
    let d = &c.diagnostics[0];
    assert_eq!(d.code, Code::FileTooLarge);
    assert!(
        d.message
            .contains(&format!("limited to {MAX_SOURCE_BYTES} bytes")),
        "{}",
        d.message
    );
    let from_bytes = dutyline::syntax::source_from_bytes(src.into_bytes());
    assert_eq!(from_bytes.expect_err("too large").code, Code::FileTooLarge);
    // Exactly at the limit is still read.
    let at_limit = vec![b' '; MAX_SOURCE_BYTES];
    assert!(dutyline::syntax::source_from_bytes(at_limit).is_ok());
}
