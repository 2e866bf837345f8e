//! Closed loops (issue 12): the network returns to the tank the pumps draw from, the
//! loop's pressure reference. Hand solutions: the system curve is the sum of the
//! losses (static head cancels), NPSH available term by term from the minimum
//! reference pressure, the high-point check by hydrostatics, the expansion tank on the
//! discharge warned, and an equipment drop rated on water restated for the glycol.

mod common;

use dutyline::analysis::Analysis;
use dutyline::fluid::glycol::{glycol_properties, Glycol};

const G: f64 = 9.80665; // standard gravity, m/s² (CGPM 1901)
const LS: f64 = 1e-3; // m³/s per L/s

/// A loop: expansion tank (level 2 m, `pressure`) → 1 m of 24 in pipe → pump (centreline
/// 0.5 m) → 1 m of 24 in pipe → coil (50 kPa at 10 L/s) → 1 m of 24 in pipe → back to
/// the tank. The 24 in pipes carry 10 L/s at 0.04 m/s: friction about 4e-6 m, left out
/// of the hand solutions. Pump H = 40 − 0.1 q² (q in L/s).
fn design(fluid: &str, tank: &str, coil: &str) -> String {
    format!(
        r#"project {{ title = "Closed loop", units = si }}
fluid {fluid}
site {{ elevation = 0 m }}
tank et {{
    level = 2 m
    {tank}
}}
station {{ centreline = 0.5 m }}
line suction from et to pump {{
    pipe steel 24 in schedule 40 {{ length = 1 m }}
}}
line discharge from pump to coil_in {{
    pipe steel 24 in schedule 40 {{ length = 1 m }}
}}
junction coil_in {{ elevation = 1 m }}
junction coil_out {{ elevation = 30 m }}
equipment coil from coil_in to coil_out {{
    drop = 50 kPa
    rated_flow = 10 L/s
    {coil}
}}
line back from coil_out to et {{
    pipe steel 24 in schedule 40 {{ length = 1 m }}
}}
case design {{ hours = 1000 h }}
pump P "test" {{
    speed = 1450 rpm
    curve impeller 200 mm {{
        flow L/s   head m   npshr m
        0          40.0     -
        10         30.0     2
        20         0.0      4
    }}
}}
"#
    )
}

fn analyse(src: &str) -> Analysis {
    common::analyse_valid(src, &dutyline::NoFiles).1
}

const GLYCOL: &str = "ethylene_glycol { fraction = 30 %, basis = mass, temperature = 10 degC }";

#[test]
fn the_system_curve_is_the_losses_and_npsh_uses_the_minimum_pressure() {
    let a = analyse(&design(GLYCOL, "pressure = 200 kPa", ""));
    let (rho, _) = glycol_properties(Glycol::Ethylene, 0.30, 283.15).unwrap();
    let c = &a.cases[0];
    let sys = c.system.as_ref().expect("system");
    // Static head cancels: one surface at both ends.
    assert!(sys.static_head.abs() < 1e-12, "{}", sys.static_head);
    // Coil: h = 50 kPa/(ρg)·(q/10)²; pump 40 − 0.1 q² → 40 = (0.1 + r) q².
    let r = 50e3 / (rho * G) / 100.0;
    let q = (40.0 / (0.1 + r)).sqrt();
    let d = c.pumps[0].duty.as_ref().expect("duty");
    assert!((d.flow / LS - q).abs() < 1e-3, "{} vs {q}", d.flow / LS);
    assert!(
        (d.head - r * q * q).abs() < 1e-3,
        "{} vs {}",
        d.head,
        r * q * q
    );
    // NPSHa term by term: (200 kPa + p_baro)/(ρg) + (2 − 0.5) − p_v/(ρg) − suction losses.
    let t = &d.npsh_terms;
    let p_baro = 101_325.0; // U.S. Standard Atmosphere 1976 at sea level
    assert!((t.barometric_head - p_baro / (rho * G)).abs() < 1e-6);
    assert!((t.surface_pressure_head - 200e3 / (rho * G)).abs() < 1e-9);
    assert!((t.static_suction_head - 1.5).abs() < 1e-12);
    let pv = dutyline::fluid::saturation_pressure_pa(283.15).unwrap();
    // Water's vapour pressure at 10 °C (IAPWS-IF97: 1.2282 kPa) stands in for the mixture's.
    assert!((pv - 1228.2).abs() < 1.0, "{pv}");
    assert!((t.vapour_pressure_head + pv / (rho * G)).abs() < 1e-9);
    assert!(t.suction_friction_head.abs() < 1e-4);
    assert!((t.sum() - d.npsh_available).abs() < 1e-9);
}

#[test]
fn the_high_point_is_checked_at_rest_from_the_minimum_pressure() {
    let check = |tank: &str| {
        let a = analyse(&design(GLYCOL, tank, ""));
        let p = &a.cases[0].pumps[0];
        let c = p
            .checks
            .iter()
            .find(|c| c.id == "loop-high-point")
            .expect("loop-high-point")
            .clone();
        (c.status.keyword(), c.value.unwrap(), c.limit.unwrap())
    };
    let (rho, _) = glycol_properties(Glycol::Ethylene, 0.30, 283.15).unwrap();
    // Highest node 30 m, reference at 2 m: p = 300 kPa − ρ g 28 m.
    let (status, p, limit) = check("pressure = 300 kPa");
    assert!((p - (300e3 - rho * G * 28.0)).abs() < 1e-6, "{p}");
    assert_eq!((status, limit), ("fail", 30e3)); // 300 − 290.3 = 9.7 kPa < 30 kPa
                                                 // A higher fill pressure passes; a stated high point above the nodes governs.
    let (status, p, _) = check("pressure = 400 kPa");
    assert_eq!(status, "pass", "{p}");
    let (status, p, _) = check("pressure = 400 kPa\n    high_point = 40 m");
    assert!((p - (400e3 - rho * G * 38.0)).abs() < 1e-6);
    assert_eq!(status, "fail");
    let (status, _, limit) = check("pressure = 400 kPa\n    high_point_pressure = 120 kPa");
    assert_eq!((status, limit), ("fail", 120e3));
}

#[test]
fn an_expansion_tank_on_the_discharge_is_warned_and_not_analysed() {
    let src = design(GLYCOL, "pressure = 400 kPa\n    connects = discharge", "");
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    let w = checked
        .diagnostics
        .iter()
        .find(|d| d.code.as_str() == "expansion-tank-discharge")
        .expect("warning");
    assert!(!w.is_error());
    let a = dutyline::analysis::analyse(&checked.design.expect("valid"));
    assert!(a.cases[0].system.is_none());
    assert!(a.cases[0].pumps.iter().all(|p| p.duty.is_none()));
}

#[test]
fn a_drop_rated_on_water_is_restated_by_the_density_ratio() {
    let (rho, _) = glycol_properties(Glycol::Ethylene, 0.30, 283.15).unwrap();
    let stated = analyse(&design(GLYCOL, "pressure = 400 kPa", ""));
    let on_water = analyse(&design(GLYCOL, "pressure = 400 kPa", "rated_on = water"));
    // Δp_fluid = Δp_water·ρ/1000: as head, 50 kPa/(1000 g) regardless of the fluid.
    let r = 50e3 / (1000.0 * G) / 100.0;
    let q = (40.0 / (0.1 + r)).sqrt();
    let d = on_water.cases[0].pumps[0].duty.as_ref().unwrap();
    assert!((d.flow / LS - q).abs() < 1e-3, "{} vs {q}", d.flow / LS);
    // The glycol is denser than the rating fluid, so the restated drop is larger and the
    // flow smaller than with the drop taken as the glycol's.
    let ds = stated.cases[0].pumps[0].duty.as_ref().unwrap();
    assert!(rho > 1000.0 && d.flow < ds.flow);
}

#[test]
fn freeze_margin_warns_near_the_freezing_point_and_passes_above() {
    let status = |t: &str| {
        let f = format!("ethylene_glycol {{ fraction = 30 %, basis = mass, temperature = {t} }}");
        let a = analyse(&design(&f, "pressure = 400 kPa", ""));
        let c = a.cases[0].pumps[0]
            .checks
            .iter()
            .find(|c| c.id == "freeze-margin")
            .expect("freeze-margin")
            .clone();
        (c.status.keyword(), c.limit.unwrap())
    };
    // 30 % ethylene glycol by mass freezes at −14.6 °C (Melinder 2010, the fit).
    let tf = dutyline::fluid::glycol::freezing_point_k(Glycol::Ethylene, 0.30);
    assert!((tf - 273.15 + 14.6).abs() < 0.2, "{tf}");
    let (s, limit) = status("10 degC");
    assert_eq!(s, "pass");
    assert!((limit - (tf + 3.0)).abs() < 1e-9);
    assert_eq!(status("-13 degC").0, "warn");
}

#[test]
fn a_temperature_below_the_freezing_point_is_refused_where_it_is_written() {
    let f = "ethylene_glycol { fraction = 30 %, basis = mass, temperature = -20 degC }";
    let src = design(f, "pressure = 400 kPa", "");
    let d = dutyline::check(&src, &dutyline::NoFiles)
        .diagnostics
        .into_iter()
        .find(|d| d.code.as_str() == "out-of-range")
        .expect("refused");
    assert!(d.message.contains("freezing point"), "{}", d.message);
    let at = d.span.expect("located");
    assert_eq!(&src[at.start..at.end], "-20 degC");
    // A volume fraction above the range by mass is refused too: 58 % by volume of
    // ethylene glycol is 60.5 % by mass.
    let f = "ethylene_glycol { fraction = 58 %, basis = volume, temperature = 10 degC }";
    let d = dutyline::check(&design(f, "pressure = 400 kPa", ""), &dutyline::NoFiles);
    assert!(d
        .diagnostics
        .iter()
        .any(|d| d.code.as_str() == "out-of-range"));
}

#[test]
fn a_chain_whose_discharge_returns_to_its_source_is_a_closed_loop_too() {
    // One tank at both ends of a single chain: 5 m + 200 m of 4 in pipe, ten elbows.
    let src = r#"project { title = "Chain loop", units = si }
fluid propylene_glycol { fraction = 40 %, basis = mass, temperature = 5 degC }
site { elevation = 0 m }
tank et { level = 2 m, pressure = 150 kPa, max_pressure = 500 kPa, high_point = 12 m }
station { centreline = 0.5 m }
line suction from et to pump {
    pipe steel 4 in schedule 40 { length = 5 m }
}
line discharge from pump to et {
    pipe steel 4 in schedule 40 { length = 200 m }
    fitting elbow_90_long * 10
}
case design { hours = 1000 h }
case refilled { et.pressure = 120 kPa }
pump P "test" {
    speed = 1450 rpm
    curve impeller 200 mm {
        flow L/s   head m   npshr m
        0          40.0     -
        10         30.0     2
        20         0.0      4
    }
}
"#;
    let checked = dutyline::check(src, &dutyline::NoFiles);
    // No entrance, exit or static-head remarks: the tank is a tee off the loop.
    let codes: Vec<&str> = checked
        .diagnostics
        .iter()
        .map(|d| d.code.as_str())
        .collect();
    let a = dutyline::analysis::analyse(&checked.design.expect("valid"));
    let warned: Vec<&str> = a.warnings.iter().map(|w| w.code.as_str()).collect();
    for code in ["no-entrance-loss", "no-exit-loss", "static-head"] {
        assert!(!codes.contains(&code) && !warned.contains(&code), "{code}");
    }
    let (rho, _) = glycol_properties(Glycol::Propylene, 0.40, 278.15).unwrap();
    for (case, p_min) in [(0, 150e3), (1, 120e3)] {
        let c = &a.cases[case];
        // A case override of the tank moves both ends: the static head stays zero.
        assert_eq!(c.system.as_ref().unwrap().static_head, 0.0);
        let d = c.pumps[0].duty.as_ref().expect("duty");
        assert!((d.npsh_terms.surface_pressure_head - p_min / (rho * G)).abs() < 1e-9);
        let hp = c.pumps[0]
            .checks
            .iter()
            .find(|k| k.id == "loop-high-point")
            .unwrap();
        // Highest point 12 m (stated) above the 2 m reference: p = p_min − ρ g 10 m.
        assert!((hp.value.unwrap() - (p_min - rho * G * 10.0)).abs() < 1e-6);
    }
    // The rating screen takes the maximum: the shut-off's suction pressure is 500 kPa
    // plus the static column from the reference to the pump, ρ g 1.5 m.
    let so = a.safety.shutoff.as_ref().expect("shut-off");
    assert!(
        (so.suction_pressure - (500e3 + rho * G * 1.5)).abs() < 1e-6,
        "{}",
        so.suction_pressure
    );
    // Ratings see the maximum, minimum-pressure checks the fill: every operating
    // pressure rated lies above 500 kPa less the 10 m column; every lowest pressure
    // checked lies below 150 kPa plus the loop's head (about 12 m) and the column.
    let checks = &a.safety.cases[0].checks;
    let value = |id: &str| {
        checks
            .iter()
            .filter(|c| c.id == id)
            .map(|c| c.value.unwrap())
            .collect::<Vec<f64>>()
    };
    let rated = value("pressure-rating");
    assert!(
        !rated.is_empty() && rated.iter().all(|p| *p > 500e3 - rho * G * 10.0),
        "{rated:?}"
    );
    let lowest = value("minimum-pressure");
    assert!(
        !lowest.is_empty() && lowest.iter().all(|p| *p < 150e3 + rho * G * 14.0),
        "{lowest:?}"
    );
}

#[test]
fn the_discharge_grade_of_a_loop_starts_from_the_loop_not_the_tank() {
    let a = analyse(&design(GLYCOL, "pressure = 400 kPa", ""));
    let (rho, _) = glycol_properties(Glycol::Ethylene, 0.30, 283.15).unwrap();
    let d = a.cases[0].pumps[0].duty.as_ref().unwrap();
    // At the pump outlet (0.5 m) the energy head is the tank's, 2 m + 400 kPa/(ρg), plus
    // the coil's loss, which is the whole duty head less 4e-6 m of friction.
    let expect = 400e3 + rho * G * (2.0 + d.head - 0.5);
    let line = a.safety.cases[0]
        .lines()
        .iter()
        .find(|l| l.name == "discharge")
        .expect("screened");
    let p0 = line.pressure_duty.as_ref().expect("duty grade")[0];
    // Within 1 mm of head (10 Pa: velocity head and the pipes' friction, each below
    // 1e-4 m); the tank's head alone would be short by the coil's 13 m.
    assert!((p0 - expect).abs() < 10.0, "{p0} vs {expect}");
    assert!(d.head > 10.0);
}

#[test]
fn loop_fields_on_an_open_system_are_warned_unused() {
    let src = design(GLYCOL, "pressure = 400 kPa", "")
        .replace(
            "line back from coil_out to et",
            "line back from coil_out to top",
        )
        .replace(
            "station {",
            "tank top { level = 30 m, max_pressure = 600 kPa }\nstation {",
        );
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    let d = checked
        .diagnostics
        .iter()
        .find(|d| d.code.as_str() == "unused-field")
        .expect("warned");
    assert!(
        !d.is_error() && d.message.contains("tank top"),
        "{}",
        d.message
    );
    assert!(checked.design.is_some());
}

#[test]
fn a_loop_is_ranked_on_the_cost_of_its_hours_not_per_volume() {
    // Wrenfield: a glycol loop with a design-flow requirement in three cases.
    let src = std::fs::read_to_string("examples-demo/wrenfield-chilled-water.duty").unwrap();
    let (design, a) = common::analyse_valid(&src, &common::DemoFiles);
    let sel = &a.selection;
    assert!(sel.criterion.contains("running hours"), "{}", sel.criterion);
    for r in &sel.ranking {
        assert_eq!(
            Some(r.score),
            r.life_cost,
            "{}: the score is the life cost",
            r.name
        );
    }
    assert!(sel.ranking[0].score <= sel.ranking[1].score);
    // A loop fixes no volume: a case with a flow requirement still runs its own hours.
    for (case, dc) in a.cases.iter().zip(&design.cases) {
        assert!(dutyline::analysis::duty::fixed_volume(&design, dc).is_none());
        for p in &case.pumps {
            if let Some(e) = p.energy {
                assert!(
                    (e.hours - case.hours_per_year).abs() < 1e-9,
                    "{}",
                    case.name
                );
            }
        }
    }
}
