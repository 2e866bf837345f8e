//! Headroom and the governing case (issue 10.3): the speed each case needs against
//! the maximum, the capacity at the limit in every case, and a warning naming both
//! cases where a case without its own flow requirement delivers less at its limit than
//! another case requires. The Kestrel Ridge demo's hot, aged-pipe case delivers
//! 522 m³/h at full speed while peak requires 560 m³/h (without the demo's own
//! requirement for that case).

mod common;
use common::said;
use common::DemoFiles;
use dutyline::analysis::checks::Status;
use dutyline::analysis::Analysis;
use dutyline::diagnostics::Code;

/// The Kestrel demo with flow requirements for peak and average only: the demo itself
/// states what low_well and hot_aged must deliver (520 m³/h), which the warning asks for.
fn kestrel() -> String {
    let path = format!(
        "{}/examples-demo/kestrel-booster.duty",
        env!("CARGO_MANIFEST_DIR")
    );
    let demo = std::fs::read_to_string(path).expect("demo");
    let own = "    flow >= 520 m^3/h for low_well, hot_aged\n";
    assert!(
        demo.contains(own),
        "the demo's own requirement for low_well and hot_aged"
    );
    demo.replacen(own, "", 1)
}

fn analyse(src: &str) -> Analysis {
    common::analyse_valid(src, &DemoFiles).1
}

fn case_index(a: &Analysis, name: &str) -> usize {
    a.cases.iter().position(|c| c.name == name).expect("case")
}

#[test]
fn the_hot_aged_case_is_warned_about_against_peak() {
    let a = analyse(&kestrel());
    let hot = case_index(&a, "hot_aged");
    // KR1 (candidate 0) at full speed in hot_aged: 522.0 m³/h (the engine's duty, which
    // tests/reference_recompute.rs checks against fluids + scipy).
    let q = a.capacity[0][hot].expect("capacity") * 3600.0;
    assert!((q - 522.0).abs() < 0.1, "{q}");
    let w = a
        .warnings
        .iter()
        .find(|w| {
            w.code == Code::GoverningCase
                && said(&a, &w.message).contains("KR1")
                && said(&a, &w.message).contains("hot_aged")
        })
        .expect("governing-case warning");
    assert!(
        said(&a, &w.message).contains("522.0 m³/h"),
        "{}",
        said(&a, &w.message)
    );
    assert!(
        said(&a, &w.message).contains("560.0 m³/h required in case peak"),
        "{}",
        said(&a, &w.message)
    );
    // Peak itself has its requirement: no warning about peak.
    assert!(a
        .warnings
        .iter()
        .filter(|w| w.code == Code::GoverningCase)
        .all(|w| !said(&a, &w.message).contains("in case peak the set")));
}

#[test]
fn giving_the_case_its_own_requirement_answers_the_warning() {
    let src = kestrel().replace(
        "flow >= 560 m^3/h for peak",
        "flow >= 560 m^3/h for peak\n    flow >= 500 m^3/h for hot_aged, low_well",
    );
    let a = analyse(&src);
    assert!(
        a.warnings
            .iter()
            .filter(|w| w.code == Code::GoverningCase)
            .all(|w| !said(&a, &w.message).contains("hot_aged")
                && !said(&a, &w.message).contains("low_well")),
        "{:?}",
        a.warnings
    );
}

#[test]
fn headroom_is_the_speed_needed_against_the_maximum() {
    let a = analyse(&kestrel());
    let peak = &a.cases[case_index(&a, "peak")].pumps[0];
    let h = peak.headroom.expect("headroom");
    // needed = the speed ratio the duty runs at; headroom = (1.0 − needed) / 1.0.
    let ratio = peak.speed_rpm / 1480.0;
    assert!((h.needed.expect("needed") - ratio).abs() < 1e-9);
    let fraction = h.fraction().expect("fraction");
    assert!((fraction - (1.0 - ratio)).abs() < 1e-12);
    // Below 5 % (common practice): a warning.
    assert!(fraction < 0.05 && fraction > 0.0, "{fraction}");
    let c = peak
        .checks
        .iter()
        .find(|c| c.id == "headroom")
        .expect("headroom check");
    assert_eq!(c.status, Status::Warn);
    // Average needs less speed: more than 5 % left, a pass.
    let avg = &a.cases[case_index(&a, "average")].pumps[0];
    let c = avg
        .checks
        .iter()
        .find(|c| c.id == "headroom")
        .expect("check");
    assert_eq!(c.status, Status::Pass, "{}", said(&a, &c.message.get()));
}

#[test]
fn a_requirement_beyond_the_maximum_speed_fails_the_headroom() {
    let src = kestrel().replace("flow >= 560 m^3/h for peak", "flow >= 640 m^3/h for peak");
    let a = analyse(&src);
    let peak = &a.cases[case_index(&a, "peak")].pumps[0];
    let h = peak.headroom.expect("headroom");
    assert!(h.fraction().expect("fraction") < 0.0);
    let c = peak
        .checks
        .iter()
        .find(|c| c.id == "headroom")
        .expect("check");
    assert_eq!(c.status, Status::Fail, "{}", said(&a, &c.message.get()));
    // The pump runs at its maximum speed, which is the published 1480 rpm.
    assert!((peak.speed_rpm - 1480.0).abs() < 1e-9);
}

#[test]
fn the_requirement_matrix_marks_where_each_requirement_applies() {
    let a = analyse(&kestrel());
    let row = a
        .requirement_matrix
        .iter()
        .find(|r| r.written.starts_with("flow >= 560"))
        .expect("row");
    assert_eq!(said(&a, &row.text), "flow at least 560.0 m³/h (case peak)");
    let peak = case_index(&a, "peak");
    for (i, applies) in row.applies.iter().enumerate() {
        assert_eq!(*applies, i == peak);
    }
    // KR1 meets it, KR2 (fixed speed) does not.
    assert_eq!(row.status[0][peak], Some(Status::Pass));
    assert_eq!(row.status[1][peak], Some(Status::Fail));
    assert_eq!(row.status[0][case_index(&a, "average")], None);
}
