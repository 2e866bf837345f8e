//! A rising (unstable) head curve gets a warning naming the flow range and the rise,
//! the cases whose static head lies in the band where the curve is crossed twice, a
//! caution for parallel sets, and a remark in the selection (issue 16).

mod common;
use common::said;
use dutyline::analysis::{analyse, Analysis};

/// The small lift of `common` raised to 41 m static head in case `normal`, 35 m in
/// case `low`.
fn base() -> String {
    common::small_lift().replace("tank b { level = 40 m }", "tank b { level = 51 m }")
        + "case low { b.level = 45 m }\n"
}

/// A drooping curve: 40 m at shut-off, rising to about 47 m near 35 m³/h.
const RISING: &str = "0 40 0 -\n20 46 50 2.0\n40 47 70 2.5\n60 43 75 3.2\n80 33 68 4.5\n";
/// A continuously falling curve.
const FALLING: &str = "0 50 0 -\n20 48 50 2.0\n40 44 70 2.5\n60 37 75 3.2\n80 27 68 4.5\n";

fn design(extra: &str, rows: &str, levels: (&str, &str)) -> String {
    let base = base()
        .replace("tank b { level = 51 m }", levels.0)
        .replace("case low { b.level = 45 m }", levels.1);
    format!(
        "{base}pump P \"test pump\" {{\n    speed = 1750 rpm\n{extra}    curve impeller 200 mm {{\n        flow m^3/h head m efficiency % npshr m\n{rows}    }}\n}}\n"
    )
}

fn analysed(src: &str) -> Analysis {
    let checked = dutyline::check(src, &dutyline::NoFiles);
    assert!(!checked.has_errors(), "{:?}", checked.diagnostics);
    analyse(checked.design.as_ref().unwrap())
}

fn unstable(a: &Analysis) -> Vec<String> {
    a.warnings
        .iter()
        .filter(|w| w.code.as_str() == "unstable-curve")
        .map(|w| said(a, &w.message))
        .collect()
}

const LEVELS: (&str, &str) = ("tank b { level = 51 m }", "case low { b.level = 45 m }");

#[test]
fn a_rising_curve_names_its_flow_range_rise_and_the_case_in_the_band() {
    let a = analysed(&design("", RISING, LEVELS));
    let w = unstable(&a);
    assert_eq!(w.len(), 1, "{w:?}");
    let w = &w[0];
    // The least-squares quadratic of the five points, solved by hand from the normal
    // equations in exact fractions (Python `fractions`): H = 39.9143 + 0.443571 q
    // − 0.00660714 q² (q in m³/h), vertex at q = 33.568 m³/h, H = 47.3591 m, rise 7.4448 m.
    assert!(w.contains("from 0.0 m³/h to 33.6 m³/h"), "{w}");
    assert!(w.contains("39.91 m to 47.36 m"), "{w}");
    assert!(w.contains("by 7.44 m"), "{w}");
    assert!(w.contains("ANSI/HI 9.6.3"), "{w}");
    // Case normal: 51 − 10 = 41 m static head, inside the band; case low: 35 m, below it.
    assert!(
        w.contains("in case normal the static head 41.00 m lies in the band"),
        "{w}"
    );
    assert!(!w.contains("case low"), "{w}");
    assert!(!w.contains("parallel"), "{w}");
    let why = &a.selection.ranking[0].why;
    assert!(why.starts_with("qualifies"), "{why}");
    assert!(why.contains("unstable curve"), "{why}");
}

#[test]
fn no_case_in_the_band_is_said() {
    let levels = ("tank b { level = 45 m }", "case low { b.level = 44 m }");
    let a = analysed(&design("", RISING, levels));
    let w = unstable(&a);
    assert_eq!(w.len(), 1);
    assert!(
        w[0].contains("no case's static head lies in the band"),
        "{}",
        w[0]
    );
}

#[test]
fn a_slower_speed_moves_the_band_by_the_affinity_laws() {
    // At 90 % speed the band is 0.81 × (39.91 … 47.36) = 32.33 … 38.36 m: case low's
    // 35 m static head is then inside it, case normal's 41 m is not.
    let levels = (
        "tank b { level = 51 m }",
        "case low { b.level = 45 m, P.speed = 1575 rpm }\ncase fast { }",
    );
    let a = analysed(&design("", RISING, levels));
    let w = &unstable(&a)[0];
    assert!(w.contains("in case low the static head 35.00 m"), "{w}");
    assert!(w.contains("32.33 m to 38.36 m"), "{w}");
    assert!(w.contains("in case normal the static head 41.00 m"), "{w}");
}

#[test]
fn a_parallel_set_with_a_rising_curve_is_cautioned() {
    let extra = "    arrangement = parallel\n    count = 2\n";
    let a = analysed(&design(extra, RISING, LEVELS));
    let w = &unstable(&a)[0];
    assert!(w.contains("in a parallel set of 2"), "{w}");
    assert!(w.contains("hunt"), "{w}");
    // Heads do not add in parallel: the same band holds case normal.
    assert!(w.contains("case normal"), "{w}");
}

#[test]
fn a_falling_curve_and_the_demos_have_no_unstable_warning() {
    let a = analysed(&design("", FALLING, LEVELS));
    assert!(unstable(&a).is_empty());
    assert!(!a.selection.ranking[0].why.contains("unstable"));
    for demo in ["orchard-lift-rev-a.duty", "orchard-lift-rev-b.duty"] {
        let src = std::fs::read_to_string(format!("examples-demo/{demo}")).unwrap();
        assert!(unstable(&analysed(&src)).is_empty(), "{demo}");
    }
}
