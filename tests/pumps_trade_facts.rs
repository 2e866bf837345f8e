//! Power, affinity laws, motor ratings and present worth against trade facts, standards
//! and published tables.

use dutyline::pumps::motor::WATTS_PER_HP;
use dutyline::pumps::{
    annual_energy_j, energy_cost, fit, hydraulic_power_w, life_cycle_energy_cost,
    motor_input_power_w, present_worth_factor, select_motor, shaft_power_w, standard_ratings_w,
    FitMethod, LccMethod, MotorStandard, PumpCurves, ScaledPump,
};

const FT: f64 = 0.3048; // m, exact (NIST SP 811, 2008, App. B)
const LBF: f64 = 4.448_221_615_260_5; // N, exact (NIST SP 811, 2008, App. B)
const US_GAL: f64 = 3.785_411_784e-3; // m3, exact (NIST SP 811, 2008, App. B)

#[test]
fn water_horsepower_in_foot_pound_units_agrees_with_rho_g_q_h() {
    let (q_cfs, h_ft) = (1.25, 120.0);
    let gamma = 62.4; // lbf/ft3, cold water (common practice)
    let whp = gamma * q_cfs * h_ft / 550.0; // hp, water horsepower (common practice)
    let si = hydraulic_power_w(999.5, q_cfs * FT.powi(3), h_ft * FT); // ρ 999.5 kg/m3 cold water
    assert!((whp * WATTS_PER_HP / si - 1.0).abs() < 0.002);
}

#[test]
fn water_horsepower_from_gpm_and_feet_over_3960() {
    let (gpm, h_ft) = (300.0, 123.0);
    let whp = gpm * h_ft / 3960.0; // hp (common practice: whp = Q[gpm]·H[ft]/3960)
    let si = hydraulic_power_w(999.5, gpm * US_GAL / 60.0, h_ft * FT);
    assert!((whp * WATTS_PER_HP / si - 1.0).abs() < 0.002);
}

#[test]
fn horsepower_conversion_matches_nist() {
    assert!((WATTS_PER_HP - 745.6999).abs() < 1e-4); // 1 hp = 7.456999E+02 W (NIST SP 811 App. B)
    assert!((WATTS_PER_HP - 550.0 * FT * LBF).abs() < 1e-12);
}

#[test]
fn shaft_power_is_water_power_over_efficiency() {
    let ph = hydraulic_power_w(998.0, 0.0214, 36.0);
    assert!((ph - 998.0 * 9.80665 * 0.0214 * 36.0).abs() < 1e-9); // g_n = 9.80665 (CGPM 1901)
    let shaft = shaft_power_w(ph, 0.765).expect("valid"); // shaft = water power / η (common practice)
    assert!((shaft * 0.765 - ph).abs() < 1e-9);
    assert!(shaft_power_w(ph, 0.0).is_err());
    assert!(shaft_power_w(ph, 1.2).is_err());
    let input = motor_input_power_w(shaft, 0.9, Some(0.97)).expect("valid");
    assert!((input - shaft / 0.9 / 0.97).abs() < 1e-9);
    assert!(motor_input_power_w(shaft, f64::NAN, None).is_err());
}

fn base_pump() -> PumpCurves {
    let flow = [0.0, 0.005, 0.010, 0.015, 0.020, 0.025, 0.030];
    let head = [52.0, 51.2, 49.3, 46.0, 41.4, 35.3, 27.8];
    let eff = [0.0, 0.42, 0.62, 0.72, 0.76, 0.74, 0.66];
    let npshr = [1.2, 1.3, 1.6, 2.0, 2.6, 3.4, 4.5];
    let power = [3.0e3, 4.5e3, 6.0e3, 7.5e3, 8.8e3, 9.9e3, 10.7e3];
    let p = |v: &[f64], d| fit(&flow, v, FitMethod::Polynomial { degree: d }).expect("fit");
    PumpCurves {
        head: p(&head, 3),
        efficiency: Some(p(&eff, 3)),
        npshr: Some(p(&npshr, 2)),
        shaft_power: Some(p(&power, 2)),
        speed_rpm: 2900.0,
        impeller_diameter_m: Some(0.2),
        warnings: Vec::new(),
    }
}

#[test]
fn affinity_laws_hold_exactly() {
    let base = base_pump();
    let (n, d) = (0.8, 0.9);
    let s = ScaledPump::new(&base, n, d).expect("valid ratios");
    let close = |a: f64, b: f64| (a - b).abs() <= 1e-12 * b.abs().max(1e-300);
    for i in 0..=30 {
        let q0 = 0.001 * i as f64;
        let q = q0 * n * d; // Q ∝ N·D (affinity laws; constant-width trim law)
        assert!(close(s.eval_head(q), (n * d).powi(2) * base.head.eval(q0))); // H ∝ N²D²
        assert!(close(
            s.eval_shaft_power(q).expect("power"),
            (n * d).powi(3) * base.shaft_power.as_ref().expect("p").eval(q0) // P ∝ N³D³
        ));
        let e0 = base.efficiency.as_ref().expect("eff").eval(q0);
        assert!(close(s.eval_efficiency(q).expect("eff"), e0) || e0.abs() < 1e-15); // η equal
        let npsh0 = base.npshr.as_ref().expect("npshr").eval(q0);
        assert!(close(s.eval_npshr(q0 * n).expect("npshr"), n * n * npsh0)); // NPSHr ∝ N² (common practice)
    }
    assert!(close(s.speed_rpm(), 2320.0));
    assert!(close(s.impeller_diameter_m().expect("diameter"), 0.18));
    assert!(close(s.domain().1, 0.03 * 0.72));
}

#[test]
fn trim_and_speed_warnings_follow_the_stated_limits() {
    let base = base_pump();
    let fine = ScaledPump::new(&base, 1.0, 1.0).expect("valid");
    assert!(fine.warnings().is_empty());
    let deep = ScaledPump::at_diameter(&base, 0.15).expect("valid");
    assert!(deep
        .warnings()
        .iter()
        .any(|w| w.contains("below about 80 %")));
    let big = ScaledPump::new(&base, 1.0, 1.05).expect("valid");
    assert!(big
        .warnings()
        .iter()
        .any(|w| w.contains("beyond the published diameter")));
    let fast = ScaledPump::at_speed(&base, 3200.0).expect("valid");
    assert!(fast
        .warnings()
        .iter()
        .any(|w| w.contains("above the published")));
    assert!(ScaledPump::new(&base, 0.0, 1.0).is_err());
    assert!(ScaledPump::new(&base, 1.0, f64::NAN).is_err());
}

#[test]
fn iec_motor_for_9_9_kw_is_11_kw() {
    let m = select_motor(MotorStandard::Iec, 9.9e3, 10.5e3, 1.0).expect("fits the series");
    assert_eq!(m.rating_label, "11 kW"); // IEC 60072-1 series … 7.5, 11, 15 kW (from memory)
    assert!((m.rating_w - 11e3).abs() < 1e-9);
    assert!(m.within_nameplate && m.non_overloading);
    assert!((m.loading_ratio - 0.9).abs() < 1e-12);
    // Run-out above 11 kW: the next rating, 15 kW, carries it (non-overloading, common
    // practice).
    let m = select_motor(MotorStandard::Iec, 9.9e3, 11.5e3, 1.0).expect("fits");
    assert_eq!(m.rating_label, "15 kW");
    assert!(m.non_overloading && m.warnings.is_empty());
    // Run-out beyond the series (above 1000 kW, the largest rating here): the operating
    // points size the motor, flagged as overloading.
    let m = select_motor(MotorStandard::Iec, 9.9e3, 2.0e6, 1.0).expect("fits");
    assert_eq!(m.rating_label, "11 kW");
    assert!(!m.non_overloading && !m.warnings.is_empty());
    // A power equal to a rating selects that rating.
    let m = select_motor(MotorStandard::Iec, 11e3, 11e3, 1.0).expect("fits");
    assert_eq!(m.rating_label, "11 kW");
}

#[test]
fn nema_motor_for_13_4_hp_is_15_hp_whatever_the_service_factor() {
    // The nameplate covers the largest shaft power, the service factor is margin only
    // (issue 10.1): 10 hp < 13.4 hp <= 15 hp (NEMA MG 1 series, from memory).
    let m = select_motor(
        MotorStandard::Nema,
        13.4 * WATTS_PER_HP,
        14.0 * WATTS_PER_HP,
        1.15,
    )
    .expect("fits");
    assert_eq!(m.rating_label, "15 hp");
    assert!(m.within_nameplate && m.non_overloading);
    // 11 hp fits 10 hp × 1.15 = 11.5 hp, but the service factor is not used to size:
    // 15 hp.
    let m = select_motor(
        MotorStandard::Nema,
        11.0 * WATTS_PER_HP,
        11.4 * WATTS_PER_HP,
        1.15,
    )
    .expect("fits");
    assert_eq!(m.rating_label, "15 hp");
    assert!(m.within_nameplate && m.non_overloading);
    assert!(
        (m.service_factor - 1.15).abs() < 1e-12,
        "reported as margin"
    );
    // Run-out of 16 hp: 15 hp would carry it only on its service factor (15 × 1.15 =
    // 17.25 hp), which is not used to size: 20 hp.
    let m = select_motor(
        MotorStandard::Nema,
        11.0 * WATTS_PER_HP,
        16.0 * WATTS_PER_HP,
        1.15,
    )
    .expect("fits");
    assert_eq!(m.rating_label, "20 hp");
    assert!(m.non_overloading);
}

#[test]
fn motor_selection_errors() {
    assert!(select_motor(MotorStandard::Iec, 2.0e6, 2.0e6, 1.0).is_err());
    assert!(select_motor(MotorStandard::Iec, f64::NAN, 1.0, 1.0).is_err());
    assert!(select_motor(MotorStandard::Iec, 1.0e3, -1.0, 1.0).is_err());
    assert!(select_motor(MotorStandard::Nema, 1.0e3, 1.0e3, 0.9).is_err());
}

#[test]
fn rating_series_are_ascending_and_start_where_the_standards_do() {
    for std in [MotorStandard::Nema, MotorStandard::Iec] {
        let r = standard_ratings_w(std);
        assert!(r.windows(2).all(|w| w[1] > w[0]));
    }
    let iec = standard_ratings_w(MotorStandard::Iec);
    assert!((iec[0] - 60.0).abs() < 1e-9); // 0.06 kW, IEC 60072-1 (from memory)
    let nema = standard_ratings_w(MotorStandard::Nema);
    assert!((nema[0] - 0.25 * WATTS_PER_HP).abs() < 1e-9); // 1/4 hp, NEMA MG 1 (from memory)
}

#[test]
fn present_worth_factors_match_interest_tables() {
    let pa = present_worth_factor(0.08, 0.0, 15.0).expect("valid");
    assert!((pa - 8.5595).abs() < 5e-5); // P/A, i = 8 %, N = 15: 8.5595 (standard interest tables)
    let pa = present_worth_factor(0.10, 0.0, 20.0).expect("valid");
    assert!((pa - 8.5136).abs() < 5e-5); // P/A, i = 10 %, N = 20: 8.5136 (standard interest tables)
    let pa = present_worth_factor(0.05, 0.0, 10.0).expect("valid");
    assert!((pa - 7.7217).abs() < 5e-5); // P/A, i = 5 %, N = 10: 7.7217 (standard interest tables)
    assert!((present_worth_factor(0.04, 0.04, 12.0).expect("valid") - 12.0).abs() < 1e-9);
    assert!(present_worth_factor(-1.0, 0.0, 10.0).is_err());
    assert!(present_worth_factor(0.05, 0.0, -1.0).is_err());
}

#[test]
fn escalated_present_worth_equals_the_discounted_sum() {
    // Σ_{k=1..N} (1+e)^k / (1+i)^k: an annual amount at today's prices escalating yearly.
    let (i, e, n): (f64, f64, i32) = (0.07, 0.03, 20);
    let sum: f64 = (1..=n).map(|k| ((1.0 + e) / (1.0 + i)).powi(k)).sum();
    let pa = present_worth_factor(i, e, f64::from(n)).expect("valid");
    assert!((pa - sum).abs() < 1e-12);
    let cost = life_cycle_energy_cost(
        1000.0,
        20.0,
        LccMethod::Discounted {
            rate: i,
            escalation: e,
        },
    )
    .expect("valid");
    assert!((cost - 1000.0 * sum).abs() < 1e-9);
    let simple = life_cycle_energy_cost(1000.0, 20.0, LccMethod::Simple).expect("valid");
    assert!((simple - 20_000.0).abs() < 1e-9);
}

#[test]
fn annual_energy_and_cost() {
    let e = annual_energy_j(10e3, 2200.0);
    assert!((e - 7.92e10).abs() < 1e-3); // 10 kW × 2200 h = 22 000 kWh = 7.92e10 J
    assert!((energy_cost(e, 0.14) - 3080.0).abs() < 1e-9); // 22 000 kWh × 0.14 per kWh
}
