//! Station piping per pump (issue 12): `serves = each_pump` lines are each pump's own
//! suction and discharge branches. Each carries one pump's flow; the set offers its
//! headers the pump's head less its own branches' loss (the modified pump curve), and
//! NPSH available is taken along the pump's own suction path: the common suction at
//! the set's flow, the branch at the flow per pump. Checked against hand solutions of
//! a linear pump curve and stated K values.

mod common;
use dutyline::analysis::Analysis;

const GAL: f64 = 3.785_411_784e-3; // m³ per US gallon (NIST SP 811, 2008, Appendix B)
const FT: f64 = 0.3048; // m per ft (NIST SP 811, 2008, Appendix B)

/// Two pumps in parallel, H = 100 − 0.1 q (q gpm per pump, H ft), NPSHr 5 ft; a 24 in
/// common suction (1 ft, negligible loss), each pump's own suction branch (K = 20) and
/// discharge branch (K = 30), a common discharge with K = 100; all 6 in schedule 40
/// pipes 1 ft long. Static head 40 ft (100 ft to 140 ft), centreline 95 ft.
/// With `each_pump = false` the two branches are written as common lines.
fn design(each_pump: bool) -> String {
    let serves = if each_pump { "serves = each_pump" } else { "" };
    let rows: String = (0..=9)
        .map(|i| {
            let q = 100.0 * i as f64;
            format!("        {q} {} 5 12\n", 100.0 - 0.1 * q)
        })
        .collect();
    format!(
        r#"project {{ title = "Station piping per pump", units = us }}
fluid water {{ temperature = 60 degF }}
site {{ elevation = 0 ft }}
tank a {{ level = 100 ft }}
tank b {{ level = 140 ft }}
station {{ centreline = 95 ft }}
line header_in from a to pump {{
    pipe steel 24 in schedule 40 {{ length = 1 ft }}
}}
line own_suction from a to pump {{
    {serves}
    pipe steel 6 in schedule 40 {{ length = 1 ft }}
    loss {{
        k = 20
        why = "isolation valve and reducer"
    }}
}}
line own_discharge from pump to b {{
    {serves}
    pipe steel 6 in schedule 40 {{ length = 1 ft }}
    loss {{
        k = 30
        why = "check valve and isolation valve"
    }}
}}
line header_out from pump to b {{
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

/// Positive root of a q² + b q + c = 0.
fn root(a: f64, b: f64, c: f64) -> f64 {
    (-b + (b * b - 4.0 * a * c).sqrt()) / (2.0 * a)
}

/// Head of K = 1 in 6 in schedule 40, ft per gpm²: ID 6.065 in (ASME B36.10M),
/// v = Q/A, v²/2g with g = 32.174 ft/s² (standard gravity) = 1.9165e-6 ft per gpm².
fn k1() -> f64 {
    let area = std::f64::consts::PI / 4.0 * (6.065_f64 / 12.0).powi(2);
    let v_per_gpm = (GAL / FT.powi(3)) / 60.0 / area;
    v_per_gpm * v_per_gpm / (2.0 * 32.174_048_556)
}

#[test]
fn each_pump_carries_its_own_branch_losses_at_its_own_flow() {
    let a = analyse(&design(true));
    let k = k1();
    assert!((k - 1.9165e-6).abs() < 1e-9, "{k}");
    // Per pump: 100 − 0.1 qp − 50 k qp² (its branches) = 40 + 100 k (2 qp)² (common):
    // 450 k qp² + 0.1 qp − 60 = 0, qp = (−0.1 + √(0.01 + 4 × 8.624e-4 × 60)) / (2 × 8.624e-4)
    // = 212.1 gpm.
    let qp = root(450.0 * k, 0.1, -60.0);
    assert!((qp - 212.1).abs() < 0.1, "{qp}");
    let d = a.cases[0].pumps[0].duty.as_ref().expect("duty");
    // 0.2 %: the 1 ft pipes' wall friction (about 0.03 velocity heads each) is left out
    // of the hand solution.
    let qp_got = d.flow_per_pump / (GAL / 60.0);
    assert!((qp_got / qp - 1.0).abs() < 2e-3, "{qp_got} against {qp}");
    assert!((d.flow / d.flow_per_pump - 2.0).abs() < 1e-12);
    // The pump's own head is the header's head plus its branches' loss.
    let st = d.station.as_ref().expect("station piping at the duty");
    let branch = st.suction_head + st.discharge_head;
    assert!((d.head_per_pump - (d.head + branch)).abs() < 1e-9);
    let branch_ft = branch / FT;
    assert!(
        (branch_ft / (50.0 * k * qp * qp) - 1.0).abs() < 0.05,
        "{branch_ft}"
    );
    let h_pump_ft = d.head_per_pump / FT;
    assert!(
        (h_pump_ft - (100.0 - 0.1 * qp_got)).abs() < 0.05,
        "{h_pump_ft}"
    );
    // NPSH available per pump: the suction minor head is the branch's K = 20 at the
    // flow per pump (the 24 in header has no fittings): −20 k qp².
    let minor_ft = d.npsh_terms.suction_minor_head / FT;
    let want = -20.0 * k * qp_got * qp_got;
    assert!(
        (minor_ft / want - 1.0).abs() < 1e-3,
        "{minor_ft} against {want}"
    );
    assert!((d.npsh_terms.sum() - d.npsh_available).abs() < 1e-9);
    // The path: the header at the set's flow, then the pump's own branch at its flow.
    let path: Vec<(&str, f64)> = st
        .npsh_path
        .iter()
        .map(|(l, _, q)| (l.as_str(), *q))
        .collect();
    assert_eq!(path.len(), 2);
    assert_eq!(path[0].0, "header_in");
    assert!((path[0].1 - d.flow).abs() < 1e-15);
    assert_eq!(path[1].0, "own_suction");
    assert!((path[1].1 - d.flow_per_pump).abs() < 1e-15);
    // The segments at the duty carry the same flows.
    let segments = d.segments(a.cases[0].system.as_ref().expect("system"));
    let seg = |name: &str| segments.iter().find(|s| &*s.line == name).expect(name);
    assert!((seg("own_discharge").flow - d.flow_per_pump).abs() < 1e-15);
    assert!((seg("header_out").flow - d.flow).abs() < 1e-15);
}

#[test]
fn common_lines_carry_the_whole_flow_and_give_less_npsh() {
    // The same piping written as common lines takes its loss at the set's flow:
    // 100 − 0.05 Q = 40 + 150 k Q² at the header, Q = 2 qp.
    let per_pump = analyse(&design(true));
    let common = analyse(&design(false));
    let k = k1();
    let dc = common.cases[0].pumps[0].duty.as_ref().expect("duty");
    assert!(dc.station.is_none());
    let q = root(150.0 * k, 0.05, -60.0);
    let q_got = dc.flow / (GAL / 60.0);
    assert!((q_got / q - 1.0).abs() < 2e-3, "{q_got} against {q}");
    let dp = per_pump.cases[0].pumps[0].duty.as_ref().expect("duty");
    // Per pump the branch loss is a quarter at half the flow: the set delivers more and
    // each pump sees a smaller suction loss (K = 20 at qp, not at 2 qp).
    assert!(dp.flow > dc.flow);
    let gain_ft = (dp.npsh_available - dc.npsh_available) / FT;
    let want = 20.0 * k * (q_got * q_got - (dp.flow_per_pump / (GAL / 60.0)).powi(2));
    assert!(
        (gain_ft - want).abs() < 0.01 * want.abs() + 0.01,
        "{gain_ft} against {want}"
    );
}

#[test]
fn one_pump_alone_sees_its_own_branches_at_its_own_flow() {
    let a = analyse(&design(true));
    let k = k1();
    // Alone in the lowest-head case (static 35 ft): 100 − 0.1 q − 50 k q² = 35 + 100 k q².
    let q = root(150.0 * k, 0.1, -65.0);
    let alone = a.one_alone[0].as_ref().expect("one pump alone");
    assert_eq!(alone.case, "high_suction");
    let got = alone.flow.expect("flow") / (GAL / 60.0);
    assert!((got / q - 1.0).abs() < 2e-3, "{got} against {q}");
}

#[test]
fn results_json_gives_the_per_pump_path() {
    let src = design(true);
    let (design, a) = common::analyse_valid(&src, &dutyline::NoFiles);
    let json = dutyline::results::to_json(&design, &a, "station.duty", &src, &[]);
    let v: serde_json::Value = serde_json::from_str(&json).expect("json");
    let duty = &v["cases"][0]["pumps"][0]["duty"];
    let st = &duty["station_piping"];
    assert!(st["flow_per_pump_m3_s"].as_f64().unwrap() > 0.0);
    let path = st["npsh_suction_path"].as_array().expect("path");
    assert_eq!(path[1]["line"], "own_suction");
    // Format 2: the case's segments are indices into the top-level descriptions.
    let seg = |i: usize| {
        let at = v["cases"][0]["segments"][i].as_u64().expect("index") as usize;
        &v["segments"][at]
    };
    assert_eq!(seg(1)["serves"], "each_pump");
    assert!(seg(0).get("serves").is_none());
}

#[test]
fn a_misspelt_serves_value_is_refused() {
    let src = design(true).replacen("serves = each_pump", "serves = every_pump", 1);
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    let d = checked
        .diagnostics
        .iter()
        .find(|d| d.is_error())
        .expect("an error");
    assert!(d.message.contains("each_pump"), "{}", d.message);
}

#[test]
fn duty_and_npsh_per_pump_match_an_independent_solve_with_friction() {
    // tests/reference/gen_station.py: the same design solved by scipy's brentq with
    // fluids' Colebrook friction and iapws water (wall friction included).
    let text = include_str!("reference/station_scipy.csv");
    let rows = common::read_csv(text);
    assert_eq!(rows.len(), 2);
    let a = analyse(&design(true));
    for row in &rows {
        let case = common::text(row, "case");
        let c = a.cases.iter().find(|c| c.name == case).expect(case);
        let d = c.pumps[0].duty.as_ref().expect("duty");
        let qp = common::num(row, "flow_per_pump_m3_s");
        assert!((d.flow_per_pump / qp - 1.0).abs() < 1e-6, "{case}: flow");
        assert!(
            (d.head - common::num(row, "head_at_headers_m")).abs() < 1e-4,
            "{case}: header"
        );
        assert!(
            (d.head_per_pump - common::num(row, "pump_head_m")).abs() < 1e-4,
            "{case}: pump"
        );
        let npsha = common::num(row, "npsh_available_m");
        assert!(
            (d.npsh_available - npsha).abs() < 1e-4,
            "{case}: NPSHa {} against {npsha}",
            d.npsh_available
        );
    }
}

#[test]
fn the_pressure_screen_takes_station_piping_at_the_flow_per_pump() {
    let a = analyse(&design(true));
    let d = a.cases[0].pumps[0].duty.as_ref().expect("duty");
    let lines = &a.safety.cases[0].lines();
    let line = |name: &str| lines.iter().find(|l| l.name == name).expect(name);
    // The same 6 in pipe: a pump's own discharge carries half the common discharge's
    // velocity, and so (Joukowsky, Δh = a·Δv/g) half its surge head.
    let own = line("own_discharge");
    let common = line("header_out");
    assert!((own.velocities[0] / common.velocities[0] - 0.5).abs() < 1e-12);
    assert!(
        (own.velocities[0] - d.flow_per_pump / (std::f64::consts::PI / 4.0 * 0.154_051f64.powi(2)))
            .abs()
            < 1e-6
    );
    let (jo, jc) = (
        own.surge.as_ref().expect("surge").joukowsky_head,
        common.surge.as_ref().expect("surge").joukowsky_head,
    );
    assert!((jo / jc - 0.5).abs() < 0.05, "{jo} {jc}");
    // The grade at the pump outlet is the destination level plus the common discharge
    // loss and the pump's own: 140 ft + the losses of both at their flows.
    let out = own.grade_duty.as_ref().expect("grade")[0];
    let losses: f64 = d
        .segments(a.cases[0].system.as_ref().expect("system"))
        .iter()
        .filter(|s| &*s.line == "own_discharge" || &*s.line == "header_out")
        .map(|s| s.friction_head + s.minor_head)
        .sum();
    assert!((out - (140.0 * FT + losses)).abs() < 0.5 * FT, "{out}");
}

#[test]
fn in_a_series_set_each_pump_loses_its_own_piping_at_the_whole_flow() {
    // Series: the set's flow passes every pump and its own branches (the interstage
    // piping): 2 (100 − 0.1 Q − 50 k Q²) = 40 + 100 k Q², 200 k Q² + 0.2 Q − 160 = 0.
    let src = design(true).replace("arrangement = parallel", "arrangement = series");
    let a = analyse(&src);
    let k = k1();
    let q = root(200.0 * k, 0.2, -160.0);
    let d = a.cases[0].pumps[0].duty.as_ref().expect("duty");
    let got = d.flow / (GAL / 60.0);
    assert!((got / q - 1.0).abs() < 2e-3, "{got} against {q}");
    assert!((d.flow_per_pump - d.flow).abs() < 1e-15);
    let st = d.station.as_ref().expect("station piping");
    // Each pump's head is half the header's head plus its own branches.
    let branch = st.suction_head + st.discharge_head;
    assert!((d.head_per_pump - (d.head / 2.0 + branch)).abs() < 1e-9);
    // NPSHa of the first pump: its own suction branch at the whole flow.
    let minor_ft = d.npsh_terms.suction_minor_head / FT;
    assert!(
        (minor_ft / (-20.0 * k * got * got) - 1.0).abs() < 1e-3,
        "{minor_ft}"
    );
}

#[test]
fn speed_adjustment_meets_the_requirement_with_each_pump_s_own_losses() {
    // adjust = speed to 350 gpm: each pump carries 175 gpm and must give the headers'
    // 40 + 100 k 350² ft plus its own 50 k 175² ft; by the affinity laws
    // r² H(qp/r) = 100 r² − 0.1 × 175 r = that head, solved for r.
    let src = design(true).replace(
        "    count = 2\n",
        "    count = 2\n    adjust = speed\n    min_speed = 60 %\n",
    ) + "require {\n    flow >= 350 gpm for normal\n}\n";
    let a = analyse(&src);
    let k = k1();
    let need = 40.0 + 100.0 * k * 350.0 * 350.0 + 50.0 * k * 175.0 * 175.0;
    let r = root(100.0, -17.5, -need);
    let p = &a.cases[0].pumps[0];
    let got = p
        .headroom
        .as_ref()
        .and_then(|h| h.needed)
        .expect("speed needed");
    // 0.2 %: the 1 ft pipes' wall friction is left out of the hand solution.
    assert!((got / r - 1.0).abs() < 2e-3, "{got} against {r}");
    let d = p.duty.as_ref().expect("duty");
    assert!(
        (d.flow / (GAL / 60.0) - 350.0).abs() < 0.5,
        "{}",
        d.flow / (GAL / 60.0)
    );
}
