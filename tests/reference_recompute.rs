//! Every demo in examples-demo/, and the designs tests/designs/recompute-*.duty (the
//! demos' tanks under pressure and vacuum, gauge and absolute), against an independent
//! recomputation by the Python reference libraries: tests/reference/demo_recompute.csv, written by
//! tests/reference/gen_demo_recompute.py (fluids, iapws, scipy, numpy) from the inputs
//! of the demos' results JSON only. Each row is recomputed here by the engine
//! (`dutyline::check` + `dutyline::analysis::analyse`) and compared.

mod common;
use common::DemoFiles;

use std::collections::{BTreeMap, HashMap};

use common::{num, read_csv, text};
use dutyline::analysis::{Analysis, CaseResult, CaseSystem, SYSTEM_CURVE_POINTS};

const CSV: &str = include_str!("reference/demo_recompute.csv");
/// (name, design file from the crate root): the designs the script recomputes.
const DEMOS: &[(&str, &str)] = &[
    (
        "orchard-lift-rev-a",
        "examples-demo/orchard-lift-rev-a.duty",
    ),
    ("kestrel-booster", "examples-demo/kestrel-booster.duty"),
    (
        "recompute-pressure-us",
        "tests/designs/recompute-pressure-us.duty",
    ),
    (
        "recompute-pressure-si",
        "tests/designs/recompute-pressure-si.duty",
    ),
];
/// Standard gravity, 9.806 65 m/s² (CGPM 1901), on the reference side.
const STANDARD_GRAVITY: f64 = 9.806_65;

fn demo_source(demo: &str) -> String {
    let file = DEMOS
        .iter()
        .find(|(name, _)| *name == demo)
        .map(|(_, f)| *f)
        .unwrap_or_else(|| panic!("unknown demo {demo}"));
    let path = format!("{}/{file}", env!("CARGO_MANIFEST_DIR"));
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{path}: {e}"))
}

fn analysed(demo: &str) -> Analysis {
    common::analyse_valid(&demo_source(demo), &DemoFiles).1
}

/// Relative tolerance of each quantity, with the source of the reference value.
fn tolerance(quantity: &str) -> f64 {
    match quantity {
        "barometric_pressure_Pa" => 1e-6, // reference: fluids 1.3 ATMOSPHERE_1976 (U.S. Standard Atmosphere 1976) via tests/reference/gen_demo_recompute.py
        "density_kg_m3" | "vapor_pressure_Pa" => 2e-3, // reference: iapws 1.5 IAPWS97 (IAPWS-IF97) and _PSat_T via tests/reference/gen_demo_recompute.py
        "dynamic_viscosity_Pa_s" => 2e-3, // reference: iapws 1.5 _Viscosity (IAPWS R12-08) via tests/reference/gen_demo_recompute.py
        "static_head_m" => 1e-3, // reference: z2 - z1 + (p2 - p1)/(rho g) with iapws 1.5 IAPWS97 density via tests/reference/gen_demo_recompute.py
        "system_head_m" => 1e-3, // reference: fluids 1.3 Colebrook, Darby3K, Hooper2K, Crane size changes + Hazen-Williams SI + iapws 1.5 IAPWS97 via tests/reference/gen_demo_recompute.py
        "friction_head_m" => 1e-3, // reference: fluids 1.3 Colebrook (Darcy-Weisbach) and Hazen-Williams SI 10.67 form via tests/reference/gen_demo_recompute.py
        "minor_head_m" => 1e-3, // reference: fluids 1.3 Darby3K, Hooper2K, entrance_rounded, exit_normal, diffuser_conical, contraction_conical via tests/reference/gen_demo_recompute.py
        "npsh_barometric_head_m"
        | "npsh_surface_pressure_head_m"
        | "npsh_static_head_m"
        | "npsh_vapour_head_m" => 2e-3, // reference: ANSI/HI 9.6.1 NPSHa terms, p/(rho g) with standard gravity and iapws 1.5 IAPWS97 density via tests/reference/gen_demo_recompute.py
        "npsh_suction_loss_m" => 1e-2, // about Q², so twice the duty-flow tolerance of the spline fits; reference: fluids 1.3 Colebrook + fittings on the suction side via tests/reference/gen_demo_recompute.py
        "npsh_available_m" => 2e-3, // reference: ANSI/HI 9.6.1 NPSHa, fluids 1.3 + iapws 1.5 via tests/reference/gen_demo_recompute.py
        "npsh_required_m" => 2e-2, // reference: numpy 2.4 polyfit of the published NPSHr, NPSHr ~ N^2 (common practice) via tests/reference/gen_demo_recompute.py
        "duty_flow_m3_s" | "duty_head_m" => 1e-2, // reference: numpy 2.4 polyfit / scipy 1.17 PchipInterpolator + affinity laws + scipy brentq via tests/reference/gen_demo_recompute.py
        "efficiency" => 5e-3, // reference: numpy 2.4 polyfit of the published efficiencies at the scipy brentq duty via tests/reference/gen_demo_recompute.py
        "suction_velocity_m_s" | "discharge_velocity_m_s" => 1e-2, // reference: Q/A of the segment next to the pump at the scipy brentq duty via tests/reference/gen_demo_recompute.py
        "hydraulic_power_W" => 1e-2, // reference: rho g Q H at the scipy brentq duty with iapws 1.5 density via tests/reference/gen_demo_recompute.py
        "input_power_W" | "annual_energy_J" => 1e-2, // reference: shaft / (motor x drive efficiency), x running hours, at the scipy brentq duty via tests/reference/gen_demo_recompute.py
        "shaft_power_W" => 5e-3, // reference: rho g Q H / efficiency at the scipy brentq duty (numpy polyfit, iapws density) via tests/reference/gen_demo_recompute.py
        other => panic!("no tolerance for quantity {other}"),
    }
}

/// Absolute floor, m or the quantity's unit, for values that are zero at zero flow.
const ABSOLUTE_FLOOR: f64 = 1e-9;

fn case_system<'a>(a: &'a Analysis, name: &str) -> (&'a CaseResult, &'a CaseSystem) {
    let c = a
        .cases
        .iter()
        .find(|c| c.name == name)
        .unwrap_or_else(|| panic!("no case {name}"));
    (c, c.system.as_ref().expect("case was set up"))
}

/// The engine's value of one CSV row.
fn engine_value(a: &Analysis, row: &HashMap<String, String>) -> f64 {
    let (case, sys) = case_system(a, text(row, "case"));
    let q = row.get("flow_m3_s").and_then(|v| v.parse::<f64>().ok());
    let at = || q.expect("row has a flow");
    let duty = || {
        let pump = text(row, "pump");
        case.pumps
            .iter()
            .find(|p| p.name == pump)
            .and_then(|p| p.duty.as_ref())
            .unwrap_or_else(|| panic!("engine has no duty for {pump} in {}", case.name))
    };
    match text(row, "quantity") {
        "barometric_pressure_Pa" => sys.barometric.pa(),
        "density_kg_m3" => sys.fluid.density,
        "dynamic_viscosity_Pa_s" => sys.fluid.viscosity,
        "vapor_pressure_Pa" => sys.fluid.vapor_pressure.pa(),
        "static_head_m" => sys.static_head,
        "system_head_m" => {
            let l = sys.losses(at());
            assert!(l.friction + l.minor >= 0.0, "negative losses at {}", at());
            sys.head(at())
        }
        "friction_head_m" => sys.losses(at()).friction,
        "minor_head_m" => sys.losses(at()).minor,
        "npsh_barometric_head_m" => duty().npsh_terms.barometric_head,
        "npsh_surface_pressure_head_m" => duty().npsh_terms.surface_pressure_head,
        "npsh_static_head_m" => duty().npsh_terms.static_suction_head,
        "npsh_suction_loss_m" => {
            let t = duty().npsh_terms;
            -(t.suction_friction_head + t.suction_minor_head)
        }
        "npsh_vapour_head_m" => -duty().npsh_terms.vapour_pressure_head,
        "npsh_available_m" => {
            // The printed total at the engine's duty.
            duty().npsh_available
        }
        "suction_velocity_m_s" => duty().suction_velocity.expect("velocity"),
        "discharge_velocity_m_s" => duty().discharge_velocity.expect("velocity"),
        "hydraulic_power_W" => {
            // Also ρgQH of the engine's own duty with standard gravity.
            let d = duty();
            let own = sys.fluid.density * STANDARD_GRAVITY * d.flow * d.head;
            assert!((d.hydraulic_power - own).abs() < 1e-9 * own);
            d.hydraulic_power
        }
        "input_power_W" => duty().input_power.expect("input power"),
        "annual_energy_J" => {
            let pump = text(row, "pump");
            let r = case.pumps.iter().find(|p| p.name == pump).expect("pump");
            r.energy.expect("energy").energy_j
        }
        "duty_flow_m3_s" => duty().flow,
        "duty_head_m" => duty().head,
        "efficiency" => duty().efficiency.expect("engine efficiency"),
        "shaft_power_W" => duty().shaft_power.expect("engine shaft power"),
        "npsh_required_m" => duty().npsh_required.expect("engine NPSHr"),
        other => panic!("unknown quantity {other}"),
    }
}

#[test]
fn csv_was_generated_from_the_current_demos() {
    for (demo, _) in DEMOS {
        let sha = dutyline::results::sha256_hex(&demo_source(demo));
        let line = format!("# {demo}: demo_{demo}.json from dutyline");
        let header = CSV
            .lines()
            .find(|l| l.starts_with(&line))
            .unwrap_or_else(|| panic!("no header line for {demo}"));
        assert!(
            header.ends_with(&sha),
            "{demo} changed since demo_recompute.csv was written: rerun \
             tests/reference/gen_demo_recompute.py"
        );
    }
}

#[test]
fn every_demo_matches_the_independent_recomputation() {
    let rows = read_csv(CSV);
    let analyses: BTreeMap<&str, Analysis> = DEMOS.iter().map(|(d, _)| (*d, analysed(d))).collect();
    let mut failures = Vec::new();
    let mut worst: BTreeMap<String, (f64, String)> = BTreeMap::new();
    let mut curve_points: BTreeMap<(String, String), usize> = BTreeMap::new();
    let mut duties: BTreeMap<(String, String, String), usize> = BTreeMap::new();
    for row in &rows {
        let demo = text(row, "demo");
        let a = analyses
            .get(demo)
            .unwrap_or_else(|| panic!("unknown demo {demo}"));
        let quantity = text(row, "quantity");
        let expected = num(row, "value");
        let actual = engine_value(a, row);
        let deviation = (actual - expected).abs();
        let relative = if expected == 0.0 {
            deviation
        } else {
            deviation / expected.abs()
        };
        let place = format!(
            "{demo} {} {} {quantity} at {} m3/s",
            text(row, "case"),
            text(row, "pump"),
            text(row, "flow_m3_s")
        );
        // Written so that a NaN from the engine counts as a failure.
        let within = deviation <= tolerance(quantity) * expected.abs() + ABSOLUTE_FLOOR;
        if !within {
            failures.push(format!("{place}: engine {actual}, reference {expected}"));
        }
        let entry = worst
            .entry(quantity.to_string())
            .or_insert((0.0, String::new()));
        if relative > entry.0 {
            *entry = (relative, place);
        }
        let key = (demo.to_string(), text(row, "case").to_string());
        if quantity == "system_head_m" {
            *curve_points.entry(key.clone()).or_default() += 1;
        }
        if quantity == "duty_flow_m3_s" {
            let pump = text(row, "pump").to_string();
            *duties.entry((key.0, key.1, pump)).or_default() += 1;
        }
    }
    for (quantity, (relative, place)) in &worst {
        println!("worst {quantity}: {:.3e} relative ({place})", relative);
    }
    // Coverage: every case's whole system curve and every duty the engine found.
    for (demo, a) in &analyses {
        for c in &a.cases {
            let key = (demo.to_string(), c.name.clone());
            assert_eq!(
                curve_points.get(&key),
                Some(&SYSTEM_CURVE_POINTS),
                "{key:?}"
            );
            for p in c.pumps.iter().filter(|p| p.duty.is_some()) {
                let k = (demo.to_string(), c.name.clone(), p.name.clone());
                assert_eq!(duties.get(&k), Some(&1), "no reference duty for {k:?}");
            }
        }
    }
    assert!(
        failures.is_empty(),
        "{} rows out of tolerance:\n{}",
        failures.len(),
        failures.join("\n")
    );
}
