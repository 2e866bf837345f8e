//! Duty envelopes (issue 15): the ISO 9906:2012 tolerance factors as recalled, a
//! hand-computed envelope, the corners bounding quasi-random samples for monotone
//! designs, and the standing of a candidate that qualifies at nominal only.

mod common;

use dutyline::analysis::envelope::DutyEnvelope;
use dutyline::pumps::tolerance::{Grade, Shift};
use proptest::prelude::*;

/// Standard gravity, m/s² (CGPM 1901, the value the engine uses).
const G: f64 = 9.80665;
/// Bore of the test pipes, m (given directly with `bore 300 mm`).
const BORE: f64 = 0.300;
/// The stated loss on the discharge pipe, K (dimensionless).
const K: f64 = 200.0;

/// A small design whose envelope can be computed by hand: a pump whose published head
/// is exactly H(Q) = 50 − 2000·Q² (m, Q in m³/s; a least-squares quadratic reproduces it),
/// efficiency η(Q) = 0.8 − 40·(Q − 0.09)², NPSH3 = 2 + 20·Q m, a static head of 20 m and
/// a single stated loss K = 200 on a 300 mm bore; the pipes are 0.1 m long, so wall
/// friction (under 0.002 m at these flows: f ≤ 0.02, L/D = 0.33 each, v²/2g ≤ 0.1 m) is
/// negligible beside the minor head.
fn design(grade: &str, uncertainty: &str, motor: &str) -> String {
    let rows: String = (0..=6)
        .map(|i| {
            let q = 0.025 * i as f64;
            let h = 50.0 - 2000.0 * q * q;
            let e = 100.0 * (0.8 - 40.0 * (q - 0.09) * (q - 0.09));
            let n = if i == 0 {
                "-".to_string()
            } else {
                format!("{:.3}", 2.0 + 20.0 * q)
            };
            format!("        {:.1}   {h:.4}   {e:.4}   {n}\n", q * 3600.0)
        })
        .collect();
    format!(
        r#"project {{
    title = "Envelope by hand"
    units = si
}}
fluid water {{ temperature = 20 degC }}
site {{ elevation = 0 m }}
tank low {{ level = 10 m }}
tank high {{ level = 30 m }}
station {{ centreline = 9 m }}
line suction from low to pump {{
    pipe steel bore 300 mm {{ length = 0.1 m }}
}}
line discharge from pump to high {{
    pipe steel bore 300 mm {{
        length = 0.1 m
    }}
    loss {{
        k = {K}
        why = "a control valve, stated"
    }}
}}
case normal {{ hours = 1000 h }}
pump P "test" {{
    speed = 1480 rpm
    {grade}
    {motor}
    curve impeller 400 mm {{
        flow m^3/h   head m   efficiency %   npshr m
{rows}    }}
}}
{uncertainty}
"#
    )
}

fn envelope_of(src: &str) -> (dutyline::analysis::Analysis, DutyEnvelope) {
    let (_, a) = common::analyse_valid(src, &dutyline::NoFiles);
    let e = a.envelope.as_ref().expect("an envelope").cases[0].pumps[0]
        .clone()
        .expect("a duty envelope");
    (a, e)
}

/// The crossing of k_H·(50 − 2000·(Q/k_Q)²) with (20 + Δz) + k_L·c·Q², c = K/(2gA²):
/// Q² = (50·k_H − 20 − Δz)/(2000·k_H/k_Q² + k_L·c).
fn hand_duty(kq: f64, kh: f64, dz: f64, kl: f64) -> (f64, f64) {
    let area = std::f64::consts::PI / 4.0 * BORE * BORE;
    let c = K / (2.0 * G * area * area);
    let q = ((50.0 * kh - 20.0 - dz) / (2000.0 * kh / (kq * kq) + kl * c)).sqrt();
    (q, 20.0 + dz + kl * c * q * q)
}

#[test]
fn tolerance_factors_are_those_of_iso_9906_as_recalled() {
    // ISO 9906:2012 Table 8, from memory: (tQ, tH, tη) of each grade; U grades 0 to +.
    let table = [
        (Grade::G1B, 0.05, 0.05, 0.03, 0.03, 0.03),
        (Grade::G1E, 0.05, 0.05, 0.03, 0.03, 0.0),
        (Grade::G1U, 0.0, 0.10, 0.0, 0.06, 0.0),
        (Grade::G2B, 0.08, 0.08, 0.05, 0.05, 0.05),
        (Grade::G2U, 0.0, 0.16, 0.0, 0.10, 0.05),
        (Grade::G3B, 0.09, 0.09, 0.07, 0.07, 0.07),
    ];
    for (g, qm, qp, hm, hp, em) in table {
        let t = g.tolerance(Some(50_000.0));
        assert_eq!(
            (
                t.flow_minus,
                t.flow_plus,
                t.head_minus,
                t.head_plus,
                t.efficiency_minus
            ),
            (qm, qp, hm, hp, em),
            "{}",
            g.label()
        );
        assert_eq!(Grade::parse(&g.label().to_lowercase()), Some(g));
    }
    // Shift at the plus corner of 2B: k_Q = 1.08, k_H = 1.05, k_η = 0.95.
    let s = Shift::at(&Grade::G2B.tolerance(None), 1.0);
    assert!((s.power() - 1.08 * 1.05 / 0.95).abs() < 1e-12);
}

#[test]
fn the_corner_envelope_matches_the_hand_calculation() {
    let src = design(
        "test_grade = \"2B\"",
        "uncertainty {\n    level low 1 m\n    loss 20 %\n}",
        "",
    );
    let (_, e) = envelope_of(&src);
    assert_eq!(e.corners.len(), 3 * 4);
    // Lowest flow: pump minus (k_Q = 0.92, k_H = 0.95), source 1 m low (static 21 m),
    // loss +20 %: Q² = (47.5 − 21)/(2000·0.95/0.8464 + 1.2c).
    let (q_lo, _) = hand_duty(0.92, 0.95, 1.0, 1.2);
    // Highest flow: pump plus (1.08, 1.05), source 1 m high (static 19 m), loss −20 %.
    let (q_hi, _) = hand_duty(1.08, 1.05, -1.0, 0.8);
    // Lowest head: pump minus on the flattest, lowest system; highest: plus on the steepest.
    let (_, h_lo) = hand_duty(0.92, 0.95, -1.0, 0.8);
    let (_, h_hi) = hand_duty(1.08, 1.05, 1.0, 1.2);
    let close = |a: f64, b: f64| (a - b).abs() <= 2e-4 * b.abs();
    assert!(
        close(e.flow_min.value, q_lo),
        "{} vs {q_lo}",
        e.flow_min.value
    );
    assert!(
        close(e.flow_max.value, q_hi),
        "{} vs {q_hi}",
        e.flow_max.value
    );
    assert!(
        close(e.head_min.value, h_lo),
        "{} vs {h_lo}",
        e.head_min.value
    );
    assert!(
        close(e.head_max.value, h_hi),
        "{} vs {h_hi}",
        e.head_max.value
    );
    assert_eq!(
        e.corners[e.flow_min.corner].name,
        "pump minus, low level low, stated losses high"
    );
    assert_eq!(
        e.corners[e.head_max.corner].name,
        "pump plus, low level low, stated losses high"
    );
    // NPSH3 at the highest-flow corner: 2 + 20·(Q/k_Q), plus its 2B tolerance
    // max(6 %, 0.30 m) = 0.30 m below 5 m.
    let d = e.corners[e.flow_max.corner].duty.as_ref().unwrap();
    let n3 = 2.0 + 20.0 * q_hi / 1.08;
    assert!(
        (d.npsh_required.unwrap() - (n3 + 0.30)).abs() < 2e-3,
        "{:?}",
        d.npsh_required
    );
}

#[test]
fn a_design_without_grade_or_range_has_no_envelope_and_a_grade_alone_has_one() {
    let (_, a) = common::analyse_valid(&design("", "", ""), &dutyline::NoFiles);
    assert!(a.envelope.is_none());
    assert!(!a
        .warnings
        .iter()
        .any(|w| w.code.as_str() == "no-test-grade"));
    // A unilateral grade has no minus side: nominal and plus only.
    let (_, e) = envelope_of(&design("test_grade = \"1U\"", "", ""));
    assert_eq!(e.corners.len(), 2);
    assert!((e.flow_min.value - hand_duty(1.0, 1.0, 0.0, 1.0).0).abs() < 1e-5);
}

#[test]
fn a_missing_grade_takes_3b_with_a_warning() {
    let (a, e) = envelope_of(&design("", "uncertainty {\n    loss 10 %\n}", ""));
    assert!(a
        .warnings
        .iter()
        .any(|w| w.code.as_str() == "no-test-grade"));
    let (t, assumed) = a.envelope.as_ref().unwrap().grades[0];
    assert!(assumed && t.grade == Grade::G3B);
    let (q_lo, _) = hand_duty(0.91, 0.93, 0.0, 1.1);
    assert!((e.flow_min.value - q_lo).abs() <= 2e-4 * q_lo);
}

#[test]
fn motor_load_over_the_envelope_can_fail_where_the_nominal_passes() {
    // Nominal shaft power ρgQH/η ≈ 37 kW; along the plus curve (×1.08·1.05/0.95 at the
    // corresponding flow) it reaches about 44 kW, above a stated 42 kW nameplate.
    let src = design(
        "test_grade = \"2B\"",
        "uncertainty {\n    level low 1 m\n    loss 20 %\n}",
        "motor_rating = 42 kW",
    );
    let (a, e) = envelope_of(&src);
    let motor = e
        .checks
        .iter()
        .find(|c| c.worst.id.as_str() == "motor")
        .expect("a motor check");
    assert_eq!(motor.nominal.status.keyword(), "pass");
    assert_eq!(motor.worst.status.keyword(), "fail");
    assert_eq!(motor.corner, "pump plus");
    let env = a.envelope.as_ref().unwrap();
    assert!(a.selection.ranking[0].qualifies);
    assert_eq!(env.standing(0, true), "qualifies at nominal only");
}

#[test]
fn a_temperature_range_lowers_the_worst_npsh_at_the_hot_end() {
    // Vapour pressure of water rises from 2.339 kPa at 20 °C to 7.385 kPa at 40 °C
    // (IAPWS-IF97 saturation table, from memory): 5.05 kPa/(992.2 kg/m³·g) = 0.52 m less
    // NPSH available, less the rise of p_baro/ρg as the water gets lighter (998.2 → 992.2
    // kg/m³, 101.325 kPa at sea level: 10.35 → 10.41 m, +0.06 m): about 0.46 m.
    let src = design(
        "test_grade = \"1B\"",
        "uncertainty {\n    temperature 20 K\n}",
        "",
    );
    let (a, e) = envelope_of(&src);
    let w = e.npsh_margin_worst.expect("an NPSH ratio");
    assert!(
        e.corners[w.corner].name.contains("temperature high"),
        "{}",
        e.corners[w.corner].name
    );
    let nominal = a.cases[0].pumps[0].duty.as_ref().unwrap().npsh_available;
    let hot = e.corners[w.corner].duty.as_ref().unwrap().npsh_available;
    assert!((nominal - hot - 0.46).abs() < 0.03, "{nominal} {hot}");
}

#[test]
fn malformed_ranges_are_refused_with_bad_uncertainty() {
    let codes = |block: &str| -> Vec<String> {
        dutyline::check(&design("", block, ""), &dutyline::NoFiles)
            .diagnostics
            .iter()
            .filter(|d| d.is_error())
            .map(|d| d.code.as_str().to_string())
            .collect()
    };
    for block in [
        "uncertainty {\n    combine = samples\n}",
        "uncertainty {\n    level nowhere 1 m\n}",
        "uncertainty {\n    roughness 200 % to 50 %\n}",
        "uncertainty {\n    loss 20 %\n    loss 10 %\n}",
        "uncertainty {\n    level low 2 kPa\n}",
        "uncertainty {\n    samples = 64\n}",
        "uncertainty {\n    wind 3 m\n}",
    ] {
        assert_eq!(codes(block), vec!["bad-uncertainty".to_string()], "{block}");
    }
    assert!(
        codes("uncertainty {\n    combine = samples\n    samples = 16\n    level low 1 m\n}")
            .is_empty()
    );
}

proptest! {
    #![proptest_config(ProptestConfig { cases: std::env::var("DUTYLINE_PROPTEST_CASES").ok().and_then(|n| n.parse().ok()).unwrap_or(12), ..ProptestConfig::default() })]

    /// For a design monotone in each input (levels, stated losses, roughness, the
    /// pump's tolerance), every quasi-random sample lies within the corners' bounds.
    #[test]
    fn corners_bound_the_samples(
        level in 0.1f64..3.0,
        loss in 0.01f64..0.5,
        rough_lo in 0.2f64..1.0,
        rough_hi in 1.0f64..5.0,
        grade in 0usize..6,
    ) {
        let g = Grade::ALL[grade].label();
        let ranges = format!("    level low {level:.3} m\n    level high {level:.3} m\n    loss {:.2} %\n    roughness {:.1} % to {:.1} %\n", 100.0 * loss, 100.0 * rough_lo, 100.0 * rough_hi);
        let corners = design(&format!("test_grade = \"{g}\""), &format!("uncertainty {{\n{ranges}}}"), "");
        let samples = design(&format!("test_grade = \"{g}\""), &format!("uncertainty {{\n    combine = samples\n    samples = 64\n{ranges}}}"), "");
        let (_, c) = envelope_of(&corners);
        let (_, s) = envelope_of(&samples);
        let eps = 1e-9;
        prop_assert!(s.flow_min.value >= c.flow_min.value - eps);
        prop_assert!(s.flow_max.value <= c.flow_max.value + eps);
        prop_assert!(s.head_min.value >= c.head_min.value - eps);
        prop_assert!(s.head_max.value <= c.head_max.value + eps);
        prop_assert_eq!(s.corners.len(), 64);
    }
}

/// A parallel pair with one pump running in the case (`P.running = 1`) has the envelope
/// of one pump: the same extremes as the single pump, to the solver's tolerance (the
/// envelope once took the whole set, two pumps, around a one-pump duty).
#[test]
fn the_envelope_runs_the_pumps_running_in_the_case() {
    let single = design("test_grade = \"2B\"", "", "");
    let pair = single
        .replace(
            "    speed = 1480 rpm\n",
            "    speed = 1480 rpm\n    arrangement = parallel\n    count = 2\n",
        )
        .replace(
            "case normal { hours = 1000 h }",
            "case normal {\n    hours = 1000 h\n    P.running = 1\n}",
        );
    let (_, one) = envelope_of(&single);
    let (a, two) = envelope_of(&pair);
    let duty = a.cases[0].pumps[0].duty.as_ref().expect("a duty").flow;
    assert!(two.flow_min.value <= duty && duty <= two.flow_max.value);
    for (x, y) in [
        (one.flow_min.value, two.flow_min.value),
        (one.flow_max.value, two.flow_max.value),
        (one.head_min.value, two.head_min.value),
        (one.head_max.value, two.head_max.value),
    ] {
        assert!((x - y).abs() <= 1e-7 * x.abs(), "{x} {y}");
    }
}
