//! Regression tests for hostile and broken input: each names the issue and the failure
//! it fixes, and failed before the fix.

use dutyline::diagnostics::Code;
use dutyline::diagnostics::{line_col, Diagnostic};

const DEMO: &str = include_str!("../examples-demo/orchard-lift-rev-a.duty");

/// The demo with one piece of text replaced (the piece must be there).
fn demo_with(from: &str, to: &str) -> String {
    assert!(DEMO.contains(from), "the demo has no `{from}`");
    DEMO.replacen(from, to, 1)
}

fn diagnostics(src: &str) -> Vec<Diagnostic> {
    dutyline::check(src, &dutyline::NoFiles).diagnostics
}

/// The first error with this code, its line and column and the text under its span.
fn error_at(src: &str, code: Code) -> (Diagnostic, (usize, usize), String) {
    let all = diagnostics(src);
    let d = all
        .iter()
        .find(|d| d.is_error() && d.code == code)
        .unwrap_or_else(|| {
            let got: Vec<_> = all.iter().map(|d| (d.code, d.message.clone())).collect();
            panic!("no `{code}` error; got {got:?}")
        })
        .clone();
    let span = d.span.expect("the error is located");
    let text = src[span.start..span.end].to_string();
    (d, line_col(src, span.start), text)
}

/// Line (1-based) of the first occurrence of `needle` in `src`.
fn line_of(src: &str, needle: &str) -> usize {
    src[..src.find(needle).expect("needle")]
        .matches('\n')
        .count()
        + 1
}

#[test]
fn tiny_bore_is_a_located_error() {
    // Issue 11: `pipe steel bore 1e-300 m` passed check and printed NaN heads.
    let src = demo_with("pipe steel 8 in schedule 40", "pipe steel bore 1e-300 m");
    let (d, (line, _), text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "1e-300 m");
    assert_eq!(line, line_of(&src, "bore 1e-300"));
    assert!(d.message.contains("pipe bore"), "{}", d.message);
    // The pipe's fittings are not reported as coming before any pipe as well.
    assert!(!diagnostics(&src)
        .iter()
        .any(|d| d.code == Code::FittingBeforePipe));
}

#[test]
fn huge_energy_price_is_a_located_error() {
    // Issue 11: `price = 1e308 EUR/kWh` printed `inf EUR`.
    let src = demo_with("price = 0.118 USD/kWh", "price = 1e308 EUR/kWh");
    let (d, _, text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "1e308 EUR/kWh");
    assert_eq!(
        line_col(&src, d.span.unwrap().start).0,
        line_of(&src, "1e308")
    );
    assert!(d.message.contains("energy price"), "{}", d.message);
}

#[test]
fn huge_pipe_length_is_a_located_error() {
    // Issue 11: `length = 1e308 m` gave a solver message with `-inf`.
    let src = demo_with("length = 18 ft", "length = 1e308 m");
    let (d, _, text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "1e308 m");
    assert!(d.message.contains("pipe length"), "{}", d.message);
    // And no zero-length warning for the length that was refused.
    assert!(!diagnostics(&src).iter().any(|d| d.code == Code::ZeroLength));
}

#[test]
fn tiny_hazen_williams_c_is_a_located_error() {
    // Issue 11: `hazen_williams_c = 1e-300` gave `inf` heads.
    let src = demo_with(
        "{ length = 18 ft }",
        "{ length = 18 ft, hazen_williams_c = 1e-300 }",
    );
    let (d, _, text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "1e-300");
    assert!(d.message.contains("Hazen-Williams C"), "{}", d.message);
}

#[test]
fn huge_curve_head_is_a_located_error() {
    // Issue 11: a curve head of `1e308` gave "RMS NaN m".
    let row = "        0          186       0              -";
    let src = demo_with(row, "        0          1e308       0              -");
    let (d, (line, _), text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "1e308");
    assert_eq!(line, line_of(&src, "1e308"));
    assert!(d.message.contains("curve head"), "{}", d.message);
}

#[test]
fn negative_curve_cell_names_its_column() {
    // Issue 11: a curve row `-10` was read as `-` and `10` ("this row has 5 values").
    let row = "        200        184       41             6.0";
    let src = demo_with(row, "        200        -10       41             6.0");
    let (d, _, text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "-10");
    assert_eq!(
        d.message,
        "negative values are not allowed in the `head` column"
    );
    assert!(!diagnostics(&src).iter().any(|d| d.code == Code::BadRow));
}

#[test]
fn long_tank_name_fails_at_check() {
    // Issue 11: a 100 000-character tank name passed check and results, then build failed
    // with "the header row is taller than half a page".
    let name = format!("t{}", "a".repeat(99_999));
    let src = DEMO.replace("wet_well", &name);
    let (d, (line, column), _) = error_at(&src, Code::TooLong);
    assert_eq!((line, column), (line_of(&src, "tank t"), 6));
    assert!(d.message.contains("100000 characters"), "{}", d.message);
}

#[test]
fn long_pump_name_fails_at_check_quickly() {
    // Issue 11: a 100 000-character pump name took 9 s and 160 MB.
    let src = demo_with(
        "pump A \"End",
        &format!("pump {} \"End", "A".repeat(100_000)),
    );
    let start = std::time::Instant::now();
    let (_, _, text) = error_at(&src, Code::TooLong);
    assert_eq!(text.len(), 100_000);
    assert!(start.elapsed().as_secs_f64() < 5.0, "{:?}", start.elapsed());
}

#[test]
fn long_text_is_a_located_error() {
    // Issue 11: texts had no length limit (10 000 characters now).
    let src = format!("{DEMO}\nnote \"{}\"\n", "x".repeat(10_001));
    let (_, (line, column), _) = error_at(&src, Code::TooLong);
    assert_eq!((line, column), (line_of(&src, "note \"x"), 6));
}

fn pdf_of(src: &str) -> Vec<u8> {
    let c = dutyline::check(src, &dutyline::NoFiles);
    let design = c.design.expect("valid design");
    let analysis = dutyline::analysis::analyse(&design);
    let style = dutyline::report::layout::style::Style::builtin("letter").expect("style");
    dutyline::report::render_pdf(&design, &analysis, src, &style, None).expect("pdf")
}

#[test]
fn many_comment_lines_do_not_make_a_thousand_pages() {
    // Issue 11: 100 000 comment lines produced a 1 327-page PDF.
    let src = format!("{DEMO}{}", "# c\n".repeat(100_000));
    let pdf = pdf_of(&src);
    let pages = lopdf::Document::load_mem(&pdf)
        .expect("pdf")
        .get_pages()
        .len();
    // The demo alone is about 17 pages; the listing may add at most 30.
    assert!(pages < 60, "{pages} pages");
}

#[test]
fn one_mebibyte_comment_line_builds_in_linear_time() {
    // Issue 11: a single 1 MiB comment line took 6.5 s (release; 145 s in a debug build)
    // because the listing re-summed the rest of the line for every printed piece.
    let room = dutyline::syntax::MAX_SOURCE_BYTES - DEMO.len() - 3;
    let src = format!("{DEMO}# {}\n", "x".repeat(room));
    let start = std::time::Instant::now();
    let pdf = pdf_of(&src);
    assert!(pdf.starts_with(b"%PDF"));
    // Debug build on a shared 2-core machine: about 2 s measured; quadratic was 145 s.
    assert!(
        start.elapsed().as_secs_f64() < 40.0,
        "{:?}",
        start.elapsed()
    );
}

#[test]
fn too_many_cases_points_at_the_first_case_over() {
    // Issue 11: `too-many` had no line:column.
    let max = dutyline::model::MAX_CASES;
    let extra: String = (0..max).map(|n| format!("case c{n} {{ }}\n")).collect();
    let src = format!("{DEMO}{extra}");
    let (d, (line, _), text) = error_at(&src, Code::TooMany);
    // The demo has 5 cases, so case MAX_CASES + 1 is `c{MAX_CASES - 5}`.
    let first_over = format!("c{}", max - 5);
    assert_eq!(text, first_over);
    assert_eq!(line, line_of(&src, &format!("case {first_over} ")));
    assert!(d.help.is_some());
}

#[test]
fn too_many_pumps_points_at_the_first_pump_over() {
    // Issue 11: `too-many` pumps had no line:column.
    let start = DEMO.find("pump A ").unwrap();
    let pump = &DEMO[start..];
    let end = pump.find("\n}\n").unwrap() + 3;
    let pump = &pump[..end];
    let extra: String = (0..20)
        .map(|n| pump.replacen("pump A ", &format!("pump X{n} "), 1))
        .collect();
    let src = format!("{DEMO}{extra}");
    let (d, (line, _), _) = error_at(&src, Code::TooMany);
    assert!(d.message.contains("pumps"), "{}", d.message);
    assert!(
        line > DEMO.lines().count(),
        "points into the added pumps, line {line}"
    );
}

#[test]
fn too_many_segments_points_at_the_first_segment_over() {
    // Issue 11: `too-many` segments had no line:column.
    let extra = "    pipe steel 8 in schedule 40 { length = 1 ft }\n".repeat(100);
    let src = demo_with(
        "    fitting entrance_rounded\n",
        &format!("    fitting entrance_rounded\n{extra}"),
    );
    let (d, (line, column), _) = error_at(&src, Code::TooMany);
    assert!(d.message.contains("pipe segments"), "{}", d.message);
    // Segment 101: the suction line's own pipe, then 100 more; the 101st is the 100th added.
    assert_eq!(
        (line, column),
        (line_of(&src, "fitting entrance_rounded") + 100, 5)
    );
}

#[test]
fn missing_discharge_line_is_located() {
    // Issue 11: `missing-line` had no line:column.
    let start = DEMO.find("line discharge").unwrap();
    let end = DEMO.find("case normal").unwrap();
    let src = format!("{}{}", &DEMO[..start], &DEMO[end..]);
    let (d, (line, _), text) = error_at(&src, Code::MissingLine);
    assert_eq!(text, "suction");
    assert_eq!(line, line_of(&src, "line suction"));
    assert!(d
        .help
        .as_deref()
        .unwrap_or("")
        .contains("line discharge from pump"));
}

#[test]
fn zero_speed_is_a_located_error() {
    // Issue 11: a speed of 0 rpm must never reach the analysis, on the pump or in a case.
    let src = demo_with("speed = 1780 rpm", "speed = 0 rpm");
    let (_, (line, _), text) = error_at(&src, Code::OutOfRange);
    assert_eq!(text, "0 rpm");
    assert_eq!(line, line_of(&src, "speed = 0 rpm"));
    let in_case = demo_with("hours = 1400 h", "hours = 1400 h\n    A.speed = 0 rpm");
    let (d, _, text) = error_at(&in_case, Code::OutOfRange);
    assert_eq!(text, "0 rpm");
    assert!(d.message.contains("greater than zero"), "{}", d.message);
}

#[test]
fn a_candidate_without_a_usable_curve_reports_its_rated_speed() {
    // Issue 11: a candidate whose curve could not be used printed "pump P at 0 rpm".
    let mut design = dutyline::check(DEMO, &dutyline::NoFiles)
        .design
        .expect("the demo checks");
    let rated = design.pumps[0]
        .rated_speed
        .get::<uom::si::frequency::cycle_per_minute>();
    design.pumps[0].curves.clear();
    let analysis = dutyline::analysis::analyse(&design);
    let result = &analysis.cases[0].pumps[0];
    assert_eq!(result.speed_rpm, rated);
    assert!(result.duty.is_none());
    let text = dutyline::results::to_text(&design, &analysis);
    assert!(!text.contains(" 0 rpm"), "{text}");
}

#[test]
fn a_vacuum_below_absolute_zero_is_an_error_at_check() {
    // Issue 11: the lower bound of a tank's gauge pressure was a fixed -110 kPa, so
    // -15.2 psig (-104.8 kPa) at the demo's 1205 ft, where the U.S. Standard Atmosphere
    // 1976 gives about 14.07 psi (97.0 kPa) barometric, passed `check` and failed only
    // in the analysis.
    let src = demo_with(
        "hours = 1400 h",
        "hours = 1400 h\n    wet_well.pressure = -15.2 psig",
    );
    let (d, (line, _), _) = error_at(&src, Code::OutOfRange);
    assert!(d.message.contains("below absolute zero"), "{}", d.message);
    assert!(
        d.message.contains("psi") && !d.message.contains("kPa"),
        "{}",
        d.message
    );
    assert_eq!(line, line_of(&src, "case normal"));
    // A vacuum vessel above absolute zero stays legal: -13 psig at 1205 ft.
    let legal = demo_with(
        "hours = 1400 h",
        "hours = 1400 h\n    wet_well.pressure = -13 psig",
    );
    assert!(!diagnostics(&legal).iter().any(|d| d.is_error()));
}

#[test]
fn a_date_that_does_not_exist_is_an_error() {
    // A revision dated 2026-02-30 was accepted: only months 1-12 and days 1-31 were tested.
    for (date, valid) in [
        ("2026-02-30", false),
        ("2026-04-31", false),
        ("2100-02-29", false),
        ("2026-02-28", true),
        ("2028-02-29", true),
        ("2000-02-29", true),
    ] {
        let src = format!("revision A {date} \"first issue\"\n{DEMO}");
        let bad = diagnostics(&src).iter().any(|d| d.code == Code::BadDate);
        assert_eq!(bad, !valid, "{date}");
    }
}

/// Issue 8 (review of the Orchard package): a US package printed the velocity ranges and
/// the NPSH excess as metric figures converted ("1.97 ft/s to 4.921 ft/s", "at least
/// 3.3 ft"). The rules of thumb are the trade's round figures of each system (2–5 ft/s
/// suction, 5–10 ft/s discharge, 3 ft of NPSH excess; 0.6–1.5 m/s, 1.5–3 m/s, 1 m;
/// common practice), so each design's units pick its own.
#[test]
fn rules_of_thumb_are_the_round_figures_of_the_design_units() {
    let text_of = |src: &str| {
        let c = dutyline::check(src, &dutyline::NoFiles);
        let design = c.design.expect("the demo checks");
        let analysis = dutyline::analysis::analyse(&design);
        dutyline::results::to_text(&design, &analysis)
    };
    let us = text_of(DEMO);
    for figure in [
        "(2.00 ft/s to 5.00 ft/s)",
        "(5.00 ft/s to 10.00 ft/s)",
        "(at least 3.0 ft)",
    ] {
        assert!(us.contains(figure), "US text lacks {figure}");
    }
    let si = text_of(&DEMO.replacen("units = us", "units = si", 1));
    for figure in [
        "(0.60 m/s to 1.50 m/s)",
        "(1.50 m/s to 3.00 m/s)",
        "(at least 1.00 m)",
    ] {
        assert!(si.contains(figure), "SI text lacks {figure}");
    }
}
