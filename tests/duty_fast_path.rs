//! The fast duty path against the exact solve (issue 17): the case's system curve read
//! from its table (`CaseSystem::tabulate`) and the pump's grid scan taken once from the
//! published curve (`CandidateCurves::duty_scan`) must give the same outcome, the same
//! number of crossings and every crossing within 1e-6 relative of the exact solve
//! (`pumps::solve_duty` on `CaseSystem::head`, sampling the pump itself). Random
//! invented systems: 1–20 discharge segments of mixed sizes and materials, fittings,
//! Hazen-Williams segments, water from 5 to 80 °C or a viscous liquid (laminar and
//! critical-zone flows), falling and drooping (rising, two-crossing) pump curves at
//! 60–120 % speed, one to three pumps in parallel.

use std::fmt::Write;

use dutyline::analysis::duty::{search_reach, CandidateCurves, SEARCH_BEYOND_CURVE};
use dutyline::analysis::CaseSystem;
use dutyline::pumps::{self, DutyOutcome, ScaledPump};
use dutyline::{check, NoFiles};
use proptest::prelude::*;

const SIZES: [&str; 5] = [
    "steel 4 in schedule 40",
    "steel 6 in schedule 40",
    "steel 8 in schedule 80",
    "ductile_iron 6 in class 350",
    "pvc 6 in schedule 40",
];

#[derive(Clone, Debug)]
struct Case {
    viscous: bool,
    temperature: f64,
    lift: f64,
    segments: Vec<(usize, f64, bool, u32)>,
    shutoff: f64,
    droop: f64,
    speed: f64,
    count: u32,
}

fn design_source(c: &Case) -> String {
    let mut s = String::from("project { title = \"Fast path\", units = si }\n");
    if c.viscous {
        s.push_str(
            "fluid \"oil\" {\n    density = 880 kg/m^3\n    viscosity = 0.08 Pa*s\n    \
             vapor_pressure = 1 kPa(a)\n}\n",
        );
    } else {
        writeln!(
            s,
            "fluid water {{ temperature = {:.1} degC }}",
            c.temperature
        )
        .unwrap();
    }
    writeln!(
        s,
        "site {{ elevation = 50 m }}\ntank low {{ level = 10 m }}\ntank high {{ level = {:.2} m }}\n\
         station {{ centreline = 9 m }}\nline suction from low to pump {{\n    \
         pipe steel 8 in schedule 40 {{ length = 8 m }}\n    fitting entrance_rounded\n}}\n\
         line discharge from pump to high {{",
        10.0 + c.lift
    )
    .unwrap();
    for &(size, length, hw, elbows) in &c.segments {
        let hw = if hw { ", hazen_williams_c = 120" } else { "" };
        writeln!(
            s,
            "    pipe {} {{ length = {length:.1} m{hw} }}",
            SIZES[size]
        )
        .unwrap();
        if elbows > 0 {
            writeln!(s, "    fitting elbow_90_long * {elbows}").unwrap();
        }
    }
    s.push_str(
        "    fitting check_valve_swing\n    fitting exit\n}\ncase normal { hours = 100 h }\n",
    );
    writeln!(
        s,
        "pump P \"invented\" {{\n    speed = 1780 rpm\n    count = {}\n    arrangement = parallel\n    \
         curve impeller 300 mm {{\n        flow L/s head m",
        c.count
    )
    .unwrap();
    // Head H0·(1 + droop·x − (1 + droop)·x²) on x = q/q_max: droop > 0 rises first.
    for k in 0..8 {
        let x = k as f64 / 7.0;
        let h = c.shutoff * (1.0 + c.droop * x - (1.0 + c.droop) * 0.8 * x * x);
        writeln!(s, "        {:.2} {h:.3}", 60.0 * x).unwrap();
    }
    s.push_str("    }\n}\n");
    s
}

fn case_strategy() -> impl Strategy<Value = Case> {
    (
        (any::<bool>(), 5.0..80.0f64, 2.0..60.0f64),
        prop::collection::vec(
            (
                0..SIZES.len(),
                5.0..400.0f64,
                prop::bool::weighted(0.2),
                0..4u32,
            ),
            1..=20,
        ),
        (
            30.0..120.0f64,
            prop_oneof![Just(0.0), 0.0..0.6f64],
            0.6..1.2f64,
            1..=3u32,
        ),
    )
        .prop_map(
            |((viscous, temperature, lift), segments, (shutoff, droop, speed, count))| Case {
                viscous: viscous && temperature < 20.0,
                temperature,
                lift,
                segments,
                shutoff,
                droop,
                speed,
                count,
            },
        )
}

/// Every crossing of the fast path within 1e-6 relative of the exact one.
fn agree(exact: &DutyOutcome, fast: &DutyOutcome) -> Result<(), String> {
    let close = |a: f64, b: f64| (a - b).abs() <= 1e-6 * a.abs().max(b.abs()).max(1e-12);
    match (exact, fast) {
        (
            DutyOutcome::Point {
                all_flows: a,
                crossings: n,
                ..
            },
            DutyOutcome::Point {
                all_flows: b,
                crossings: m,
                ..
            },
        ) if n == m && a.iter().zip(b).all(|(x, y)| close(*x, *y)) => Ok(()),
        (DutyOutcome::ShutoffBelowStatic { .. }, DutyOutcome::ShutoffBelowStatic { .. })
        | (DutyOutcome::CurveEndsBeforeSystem { .. }, DutyOutcome::CurveEndsBeforeSystem { .. }) => {
            Ok(())
        }
        _ => Err(format!("exact {exact:?}\nfast {fast:?}")),
    }
}

fn compare(c: &Case, reach_factor: f64) -> Result<usize, String> {
    let src = design_source(c);
    let checked = check(&src, &NoFiles);
    let design = checked
        .design
        .ok_or_else(|| format!("{:?}\n{src}", checked.diagnostics))?;
    let cc = CandidateCurves::fit(&design.pumps[0]);
    let (base, _) = cc.evaluated.as_ref().ok_or("no curve")?;
    let scan = cc.duty_scan.as_ref().ok_or("no scan")?;
    let exact_sys = CaseSystem::new(&design.cases[0].scenario).map_err(|e| e.message)?;
    let mut fast_sys = exact_sys.clone();
    let reach = search_reach(&design.cases[0], &design, std::slice::from_ref(&cc));
    fast_sys.tabulate(reach * c.speed * reach_factor);
    let scaled = ScaledPump::new(base, c.speed, 1.0).map_err(|e| e.message)?;
    let par = c.count as f64;
    let head = |q: f64| scaled.eval_head(q / par);
    let q_end = scaled.domain().1 * par * (1.0 + SEARCH_BEYOND_CURVE);
    let exact = pumps::solve_duty(&head, &|q| exact_sys.head(q), q_end);
    let fast = dutyline::analysis::system_table::solve_duty(&head, &fast_sys, q_end, Some(scan));
    agree(&exact, &fast).map_err(|e| format!("{e}\n{src}"))?;
    Ok(match exact {
        DutyOutcome::Point { crossings, .. } => crossings,
        _ => 0,
    })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: std::env::var("DUTYLINE_PROPTEST_CASES").ok().and_then(|n| n.parse().ok()).unwrap_or(160), ..ProptestConfig::default() })]

    #[test]
    fn fast_duty_agrees_with_the_exact_solve(c in case_strategy(), reach in 1.0..2.5f64) {
        if let Err(e) = compare(&c, reach) {
            prop_assert!(false, "{}", e);
        }
    }
}

/// Drooping curves against a low static head cross twice; both crossings are found by
/// both paths (not one silently), at the same flows.
#[test]
fn drooping_curves_keep_both_crossings() {
    let mut twice = 0;
    for (i, lift) in [40.2, 40.6, 41.0, 41.4, 41.8].into_iter().enumerate() {
        // H0 = 40 m rising to 42.08 m at 21 % of the curve's flow (droop 0.5).
        let c = Case {
            viscous: false,
            temperature: 15.0,
            lift,
            segments: vec![(2, 30.0, false, 1); 1 + i],
            shutoff: 40.0,
            droop: 0.5,
            speed: 1.0,
            count: 1,
        };
        twice += usize::from(compare(&c, 1.0).expect("agree") == 2);
    }
    assert!(twice >= 3, "{twice} designs crossed twice");
}
