//! Wells with drawdown (issue 12): a source well's surface is its pumping level, the
//! static level less the drawdown s = B·Q + C·Q² at the flow (Jacob 1947), so the static
//! head and NPSH available follow the flow. Checked against hand solutions.

mod common;
use dutyline::analysis::Analysis;

const M3H: f64 = 1.0 / 3600.0; // m³/s per m³/h

/// A well (static level 95 m) lifts to a tank at 130 m through 1 m of 6 in schedule 40
/// with K = 10; the pump at 80 m, H = 60 − 0.2 q (q in m³/h, H in m). The well: 8 m of
/// drawdown at a test flow of 100 m³/h, of which `well_loss` is well loss.
fn design(well: &str) -> String {
    let rows: String = (0..=8)
        .map(|i| {
            let q = 25.0 * i as f64;
            format!("        {q} {} 3 15\n", 60.0 - 0.2 * q)
        })
        .collect();
    format!(
        r#"project {{ title = "Well drawdown", units = si }}
fluid water {{ temperature = 15 degC }}
site {{ elevation = 0 m }}
tank well {{
    level = 95 m
    {well}
}}
tank tank_b {{ level = 130 m }}
station {{ centreline = 80 m }}
line column from well to pump {{
    pipe steel 6 in schedule 40 {{ length = 0.3 m }}
}}
line rising from pump to tank_b {{
    pipe steel 6 in schedule 40 {{ length = 1 m }}
    loss {{
        k = 10
        why = "test resistance"
    }}
}}
case normal {{ }}
pump W "test well pump" {{
    speed = 2900 rpm
    curve impeller 200 mm {{
        flow m^3/h head m npshr m power kW
{rows}    }}
}}
"#
    )
}

fn analyse(src: &str) -> Analysis {
    common::analyse_valid(src, &dutyline::NoFiles).1
}

/// Head of K = 10 in 6 in schedule 40 (ID 154.05 mm, ASME B36.10M), m per (m³/h)²:
/// 10 / (2 g A²) / 3600², g = 9.80665 m/s² (standard gravity).
fn k10() -> f64 {
    let d = 6.065 * 0.0254;
    let a = std::f64::consts::PI / 4.0 * d * d;
    10.0 / (2.0 * 9.80665 * a * a) / 3600.0_f64.powi(2)
}

#[test]
fn the_pumping_level_sets_the_duty_and_the_npsh() {
    let a = analyse(&design(
        "drawdown = 8 m\n    test_flow = 100 m^3/h\n    well_loss = 2 m",
    ));
    let d = a.cases[0].pumps[0].duty.as_ref().expect("duty");
    // s(q) = 6 (q/100) + 2 (q/100)²; 60 − 0.2 q = 35 + s(q) + k q²:
    // (2e-4 + k) q² + 0.26 q − 25 = 0, q = 87.0 m³/h.
    let k = k10();
    assert!((k - 1.1324e-4).abs() < 1e-7, "{k}");
    let a2 = 2e-4 + k;
    let q = (-0.26 + (0.26f64 * 0.26 + 4.0 * a2 * 25.0).sqrt()) / (2.0 * a2);
    assert!((q - 87.0).abs() < 0.1, "{q}");
    let got = d.flow / M3H;
    // 0.3 %: the 1.3 m of pipe friction is left out of the hand solution.
    assert!((got / q - 1.0).abs() < 3e-3, "{got} against {q}");
    // The pumping level at the engine's own flow, by the formula.
    let w = d.well.expect("well at the duty");
    let s = 6.0 * got / 100.0 + 2.0 * (got / 100.0).powi(2);
    assert!((w.aquifer_loss - 6.0 * got / 100.0).abs() < 1e-9);
    assert!(
        (w.pumping_level - (95.0 - s)).abs() < 1e-9,
        "{}",
        w.pumping_level
    );
    // NPSHa's static suction head is the pumping level above the pump, 80 m.
    assert!((d.npsh_terms.static_suction_head - (95.0 - s - 80.0)).abs() < 1e-9);
    assert!((d.npsh_terms.sum() - d.npsh_available).abs() < 1e-9);
}

#[test]
fn a_well_at_its_pumping_level_equals_a_tank_at_that_level() {
    let well = analyse(&design("drawdown = 8 m\n    test_flow = 100 m^3/h"));
    let d = well.cases[0].pumps[0].duty.as_ref().expect("duty");
    let level = d.well.expect("well").pumping_level;
    // Specific capacity only (no well loss): s = 8 m × Q / 100 m³/h.
    assert!((95.0 - level - 0.08 * d.flow / M3H).abs() < 1e-9);
    // A plain tank at that level gives the same NPSHa at the same flow; the system head
    // at the duty flow is the same too.
    let src = design("").replace("level = 95 m", &format!("level = {level:.12} m"));
    let tank = analyse(&src);
    let dt = tank.cases[0].pumps[0].duty.as_ref().expect("duty");
    assert!(dt.well.is_none());
    assert!(
        (dt.flow - d.flow).abs() < 1e-6 * d.flow,
        "{} {}",
        dt.flow,
        d.flow
    );
    assert!((dt.npsh_available - d.npsh_available).abs() < 1e-6);
}

#[test]
fn the_system_curve_carries_the_drawdown() {
    let a = analyse(&design(
        "drawdown = 8 m\n    test_flow = 100 m^3/h\n    well_loss = 2 m",
    ));
    let c = &a.cases[0];
    let p = c.system_curve.last().expect("curve");
    let r = p.flow / (100.0 * M3H);
    assert!((p.drawdown - (6.0 * r + 2.0 * r * r)).abs() < 1e-9);
    let sum = p.static_head + p.friction + p.minor + p.network + p.drawdown;
    assert!((p.head - sum).abs() < 1e-9);
    assert_eq!(c.system_curve[0].drawdown, 0.0);
}

#[test]
fn a_drawdown_without_its_test_flow_is_refused() {
    let checked = dutyline::check(&design("drawdown = 8 m"), &dutyline::NoFiles);
    let d = checked
        .diagnostics
        .iter()
        .find(|d| d.is_error())
        .expect("an error");
    assert_eq!(d.code.as_str(), "missing-field", "{}", d.message);
    assert!(d.message.contains("test_flow"), "{}", d.message);
}

#[test]
fn a_well_loss_above_the_drawdown_is_refused() {
    let src = design("drawdown = 8 m\n    test_flow = 100 m^3/h\n    well_loss = 9 m");
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    let d = checked
        .diagnostics
        .iter()
        .find(|d| d.is_error())
        .expect("an error");
    assert_eq!(d.code.as_str(), "conflicting-fields", "{}", d.message);
}

#[test]
fn a_drawdown_on_the_destination_fails_the_case_in_words() {
    let src = design("").replace(
        "tank tank_b { level = 130 m }",
        "tank tank_b {\n    level = 130 m\n    drawdown = 1 m\n    test_flow = 10 m^3/h\n}",
    );
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    let design = checked.design.expect("a design");
    let a = dutyline::analysis::analyse(&design);
    let err = a.cases[0].error.as_deref().expect("a case error");
    assert!(err.contains("destination"), "{err}");
}

#[test]
fn duty_and_npsh_match_an_independent_solve_with_friction() {
    // tests/reference/gen_well.py: the same well solved by scipy's brentq with fluids'
    // Colebrook friction and iapws water (pipe friction included).
    let rows = common::read_csv(include_str!("reference/well_scipy.csv"));
    let row = &rows[0];
    let a = analyse(&design(
        "drawdown = 8 m\n    test_flow = 100 m^3/h\n    well_loss = 2 m",
    ));
    let d = a.cases[0].pumps[0].duty.as_ref().expect("duty");
    let q = common::num(row, "flow_m3_s");
    assert!((d.flow / q - 1.0).abs() < 1e-6, "{} against {q}", d.flow);
    let w = d.well.expect("well");
    assert!((w.pumping_level - common::num(row, "pumping_level_m")).abs() < 1e-4);
    let npsha = common::num(row, "npsh_available_m");
    assert!(
        (d.npsh_available - npsha).abs() < 1e-4,
        "{} against {npsha}",
        d.npsh_available
    );
}
