//! One pump of a parallel set running alone (issue 10.4), evaluated against the
//! lowest-head case at the limit, with hand-solved duty points; beyond the end of the
//! published curve it fails ("no published data there").

mod common;
use common::said;
use dutyline::analysis::checks::Status;
use dutyline::analysis::Analysis;

const GAL: f64 = 3.785_411_784e-3; // m³ per US gallon (NIST SP 811, 2008, Appendix B)

/// 24 in suction (negligible loss), 1 ft of 6 in schedule 40 discharge carrying a
/// stated K = 100, static head 40 ft (case normal) or 35 ft (case high_suction).
fn design(last_flow_gpm: u32) -> String {
    let rows: String = (0..=last_flow_gpm / 100)
        .map(|i| {
            let q = 100.0 * i as f64;
            format!("        {q} {} 5 12\n", 100.0 - 0.1 * q)
        })
        .collect();
    format!(
        r#"project {{ title = "One pump alone", units = us }}
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
case normal {{ }}
case high_suction {{ a.level = 105 ft }}
motor {{ standard = nema }}
pump PAIR "test pair" {{
    speed = 1750 rpm
    arrangement = parallel
    count = 2
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
fn one_pump_alone_runs_out_against_the_lowest_head_case() {
    let a = analyse(&design(900));
    let k = common::k100_in_6in_sch40_ft_per_gpm2();
    assert!((k - 1.9165e-4).abs() < 1e-7, "{k}");
    // The pair in case normal: 100 − 0.05 Q = 40 + k Q²: Q = 444.1 gpm, 222 per pump.
    let pair = a.cases[0].pumps[0].duty.as_ref().expect("pair duty");
    let q_pair = common::positive_root(k, 0.05, -60.0);
    assert!((q_pair - 444.1).abs() < 0.1, "{q_pair}");
    // Tolerance 0.2 %: the 1 ft of pipe friction (about 0.03 velocity heads) is left out
    // of the hand solution.
    assert!((pair.flow / (GAL / 60.0) / q_pair - 1.0).abs() < 2e-3);
    // Alone against the lowest-head case (high_suction, static 35 ft):
    // 100 − 0.1 q = 35 + k q²: q = (−0.1 + √(0.01 + 4 k 65)) / 2k = 377.2 gpm.
    let alone = a.one_alone[0].as_ref().expect("one pump alone");
    assert_eq!(alone.case, "high_suction");
    let q_alone = common::positive_root(k, 0.1, -65.0);
    assert!((q_alone - 377.2).abs() < 0.1, "{q_alone}");
    let q = alone.flow.expect("flow") / (GAL / 60.0);
    assert!((q / q_alone - 1.0).abs() < 2e-3, "{q}");
    // Its head: 100 − 0.1 × 377.2 = 62.3 ft.
    let h = alone.head.expect("head") / 0.3048;
    assert!((h - (100.0 - 0.1 * q_alone)).abs() < 0.2, "{h}");
    // 12 hp per pump at every flow: within the 15 hp motor (NEMA series 10, 15 hp);
    // NPSHr 5 ft against about 33.9 + 10 ft available: the check passes.
    assert_eq!(
        alone.check.status,
        Status::Pass,
        "{}",
        said(&a, &alone.check.message.get())
    );
    // The check sits in the case it was evaluated against.
    let in_case = a.cases[1].pumps[0]
        .checks
        .iter()
        .find(|c| c.id == "one-pump-alone")
        .expect("check in high_suction");
    assert_eq!(in_case.status, Status::Pass);
    assert!(
        said(&a, &in_case.message.get()).contains("377 gpm"),
        "{}",
        said(&a, &in_case.message.get())
    );
    assert!(a.cases[0].pumps[0]
        .checks
        .iter()
        .all(|c| c.id != "one-pump-alone"));
}

#[test]
fn one_pump_alone_beyond_the_published_curve_fails() {
    // The curve ends at 300 gpm: the pair (222 gpm per pump) stays on it, one pump alone
    // (377 gpm) would not.
    let a = analyse(&design(300));
    assert!(a.cases[0].pumps[0].duty.is_some());
    let alone = a.one_alone[0].as_ref().expect("one pump alone");
    assert!(alone.flow.is_none());
    assert_eq!(alone.check.status, Status::Fail);
    assert!(
        said(&a, &alone.check.message.get()).contains("no published data there"),
        "{}",
        said(&a, &alone.check.message.get())
    );
    assert!(a.selection.recommended.is_none());
}
