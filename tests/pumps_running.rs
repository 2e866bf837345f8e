//! `PUMP.running = N` per case (issue 12): a case runs fewer pumps of a parallel set;
//! its duty is found with N pumps sharing the flow, and per-pump powers (the motor
//! check) divide by the pumps running. Hand-solved on a linear pump curve.

mod common;
use dutyline::analysis::Analysis;

const GAL: f64 = 3.785_411_784e-3; // m³ per US gallon (NIST SP 811, 2008, Appendix B)
const HP: f64 = 745.699_872; // W per horsepower (NIST SP 811, 2008, Appendix B)

/// Two pumps in parallel, H = 100 − 0.1 q ft (q gpm per pump), 12 hp each at every
/// flow; static head 40 ft; 1 ft of 6 in schedule 40 discharge with K = 100.
fn design(case_two: &str) -> String {
    let rows: String = (0..=9)
        .map(|i| {
            let q = 100.0 * i as f64;
            format!("        {q} {} 5 12\n", 100.0 - 0.1 * q)
        })
        .collect();
    format!(
        r#"project {{ title = "Pumps running", units = us }}
fluid water {{ temperature = 60 degF }}
site {{ elevation = 0 ft }}
tank a {{ level = 100 ft }}
tank b {{ level = 140 ft }}
station {{ centreline = 95 ft }}
line s from a to pump {{
    pipe steel 24 in schedule 40 {{ length = 1 ft }}
}}
line d from pump to b {{
    pipe steel 6 in schedule 40 {{ length = 1 ft }}
    loss {{
        k = 100
        why = "test resistance"
    }}
}}
case both {{ }}
case one {{ {case_two} }}
motor {{ standard = nema }}
pump PAIR "test pair" {{
    speed = 1750 rpm
    arrangement = parallel
    count = 2
    curve impeller 8 in {{
        flow gpm head ft npshr ft power hp
{rows}    }}
}}
pump SOLO "test single" {{
    speed = 1750 rpm
    curve impeller 8 in {{
        flow gpm head ft npshr ft power hp
{rows}    }}
}}
"#
    )
}

fn analyse(src: &str) -> Analysis {
    common::analyse_valid(src, &dutyline::NoFiles).1
}

#[test]
fn a_case_running_one_pump_of_the_pair_finds_its_own_duty() {
    let a = analyse(&design("PAIR.running = 1"));
    let k = common::k100_in_6in_sch40_ft_per_gpm2();
    // Both: 100 − 0.05 Q = 40 + k Q²; one: 100 − 0.1 Q = 40 + k Q².
    let (q2, q1) = (
        common::positive_root(k, 0.05, -60.0),
        common::positive_root(k, 0.1, -60.0),
    );
    let both = &a.cases[0].pumps[0];
    let one = &a.cases[1].pumps[0];
    assert_eq!((both.count, one.count), (2, 1));
    let d2 = both.duty.as_ref().expect("duty");
    let d1 = one.duty.as_ref().expect("duty");
    // 0.2 %: the 1 ft of pipe friction is left out of the hand solution.
    assert!((d2.flow / (GAL / 60.0) / q2 - 1.0).abs() < 2e-3);
    assert!(
        (d1.flow / (GAL / 60.0) / q1 - 1.0).abs() < 2e-3,
        "{}",
        d1.flow / (GAL / 60.0)
    );
    assert!((d1.flow_per_pump - d1.flow).abs() < 1e-15);
    // 12 hp per pump: the pair takes 24 hp, the one 12 hp.
    assert!((d2.shaft_power.expect("power") / HP - 24.0).abs() < 1e-6);
    assert!((d1.shaft_power.expect("power") / HP - 12.0).abs() < 1e-6);
    // The motor is sized on the power per pump of the pumps running: 12 hp in both
    // cases, so a 15 hp NEMA motor (not one sized on 12 / 2 = 6 hp in case one).
    let motor = a.motor_sizing[0].as_ref().expect("motor");
    assert!((motor.max_operating_shaft_power / HP - 12.0).abs() < 1e-6);
    // The other candidate, a single pump, is untouched by the override.
    assert_eq!(a.cases[1].pumps[1].count, 1);
}

#[test]
fn running_more_pumps_than_the_set_has_is_refused() {
    let checked = dutyline::check(&design("PAIR.running = 3"), &dutyline::NoFiles);
    let d = checked
        .diagnostics
        .iter()
        .find(|d| d.is_error())
        .expect("an error");
    assert_eq!(d.code.as_str(), "out-of-range");
    assert!(d.message.contains("1 to 2"), "{}", d.message);
}

#[test]
fn running_on_a_single_pump_is_refused() {
    let checked = dutyline::check(&design("SOLO.running = 1"), &dutyline::NoFiles);
    let d = checked
        .diagnostics
        .iter()
        .find(|d| d.is_error())
        .expect("an error");
    assert_eq!(d.code.as_str(), "out-of-range");
    assert!(d.message.contains("not a parallel set"), "{}", d.message);
}

#[test]
fn the_revision_diff_names_a_case_running_fewer_pumps() {
    let lower = |src: &str| {
        dutyline::check(src, &dutyline::NoFiles)
            .design
            .expect("design")
    };
    let changes: Vec<String> =
        dutyline::diff::diff_designs(&lower(&design("")), &lower(&design("PAIR.running = 1")))
            .iter()
            .map(dutyline::diff::InputChange::render)
            .collect();
    assert!(
        changes
            .iter()
            .any(|c| c.contains("PAIR") && c.contains("running") && c.contains('1')),
        "{changes:?}"
    );
}
