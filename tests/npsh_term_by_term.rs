//! NPSH available worked by hand for one demo case, term by term, from the fields of
//! the results JSON, with the formula of the trade (common practice; the definition of
//! ANSI/HI 9.6.1):
//!
//!   NPSHa = p_abs,source/(rho g) + (z_source − z_centreline) − h_suction − p_v/(rho g)
//!
//! The case is the orchard demo's `low_river` (the lowest wet-well level, a suction
//! lift) with pump A, the first candidate, so the fitting K values the JSON reports are
//! those at pump A's duty flow. The suction wall friction is worked with the explicit
//! Swamee and Jain (1976) friction factor instead of the engine's Colebrook solution.

mod common;
use common::DemoFiles;
use serde_json::Value;

const G: f64 = 9.80665; // standard gravity, m/s² (CGPM 1901; NIST SP 330)
const FT: f64 = 0.3048; // m per ft, exact (NIST SP 811)

fn results_json(demo: &str) -> Value {
    let path = format!("{}/examples-demo/{demo}.duty", env!("CARGO_MANIFEST_DIR"));
    let source = std::fs::read_to_string(&path).expect("demo source");
    let checked = dutyline::check(&source, &DemoFiles);
    assert!(!checked.has_errors());
    let design = checked.design.expect("design");
    let analysis = dutyline::analysis::analyse(&design);
    let json = dutyline::results::to_json(&design, &analysis, &path, &source, &checked.diagnostics);
    serde_json::from_str(&json).expect("results are JSON")
}

fn f(v: &Value, key: &str) -> f64 {
    v[key]
        .as_f64()
        .unwrap_or_else(|| panic!("{key} is not a number"))
}

/// Swamee, P. K. and Jain, A. K. (1976), "Explicit equations for pipe-flow problems",
/// J. Hydraulics Division ASCE 102(HY5), 657–664: f = 0.25 / [log10(ε/3.7D + 5.74/Re^0.9)]²,
/// within about 1 % of Colebrook for 1e-6 ≤ ε/D ≤ 1e-2 and 5000 ≤ Re ≤ 1e8.
fn swamee_jain(re: f64, relative_roughness: f64) -> f64 {
    let l = (relative_roughness / 3.7 + 5.74 / re.powf(0.9)).log10();
    0.25 / (l * l)
}

#[test]
fn npsh_available_of_orchard_low_river_pump_a_by_hand() {
    let doc = results_json("orchard-lift-rev-a");
    let case = doc["cases"]
        .as_array()
        .and_then(|c| c.iter().find(|c| c["name"] == "low_river"))
        .expect("case low_river");
    let pump = &case["pumps"][0];
    assert_eq!(pump["name"], "A");
    let duty = &pump["duty"];
    let q = f(duty, "flow_m3_s");
    let rho = f(&case["fluid"], "density_kg_m3");
    let mu = f(&case["fluid"], "dynamic_viscosity_Pa_s");
    let levels = &case["levels"];
    let rho_g = rho * G;

    // Term 1: absolute pressure on the wet-well surface as head.
    let p_abs = f(case, "barometric_pressure_Pa") + f(levels, "source_gauge_pressure_Pa");
    let pressure_head = p_abs / rho_g;
    // Term 2: static suction head (negative: the level is below the pump, a lift).
    let static_head = f(levels, "source_m") - f(levels, "pump_centreline_m");
    assert!((static_head - (1202.0 - 1204.0) * FT).abs() < 1e-9); // design file: wet_well.level = 1202.0 ft, centreline = 1204.0 ft
                                                                  // Term 3: suction losses at the duty flow: f L/D + Σ K, on each segment's velocity head.
    let mut friction = 0.0;
    let mut minor = 0.0;
    // Format 2: the case's segments index the top-level descriptions; the fittings'
    // K at the case's design flow (its first duty, pump A's) are `fittings_k`.
    let descriptions = doc["segments"].as_array().expect("segments");
    for (j, at) in case["segments"]
        .as_array()
        .expect("segments")
        .iter()
        .enumerate()
    {
        let seg = &descriptions[at.as_u64().expect("index") as usize];
        let ks = &case["fittings_k"][j];
        if seg["side"] != "suction" {
            continue;
        }
        let d = f(seg, "inner_diameter_m");
        let v = q / (std::f64::consts::PI * d * d / 4.0);
        let velocity_head = v * v / (2.0 * G);
        let re = rho * v * d / mu;
        assert!(re > 5000.0, "Swamee-Jain range"); // Swamee and Jain (1976) validity
        assert_eq!(seg["friction_model"], "darcy-colebrook");
        let fd = swamee_jain(re, f(seg, "roughness_m") / d);
        friction += fd * (f(seg, "length_m") + f(seg, "equivalent_length_m")) / d * velocity_head;
        let fittings: f64 = seg["fittings"]
            .as_array()
            .expect("fittings")
            .iter()
            .enumerate()
            .map(|(m, x)| f(x, "count") * ks[m].as_f64().expect("k"))
            .sum();
        let extra: f64 = seg["losses"]
            .as_array()
            .expect("losses")
            .iter()
            .filter_map(|l| l["k"].as_f64())
            .sum();
        minor += (fittings + extra) * velocity_head;
    }
    // Term 4: vapour pressure as head.
    let vapour_head = f(&case["fluid"], "vapor_pressure_Pa") / rho_g;

    let by_hand = pressure_head + static_head - (friction + minor) - vapour_head;
    let engine = f(duty, "npsh_available_m");
    // Error budget: Swamee-Jain within 1 % of Colebrook on the friction term (their paper),
    // everything else is the same arithmetic.
    let allowed = 0.01 * friction + 1e-9;
    assert!(
        (by_hand - engine).abs() <= allowed,
        "NPSHa by hand {by_hand} m (pressure {pressure_head}, static {static_head}, \
         friction {friction}, minor {minor}, vapour {vapour_head}), engine {engine} m"
    );
    // Trade fact: about 33.9 ft of water at sea level, falling about 1.2 ft per 1000 ft of
    // elevation near sea level (common practice, from memory); the site is at 1205 ft.
    let rule_of_thumb_ft = 33.9 - 1.2 * 1.205;
    assert!((pressure_head / FT / rule_of_thumb_ft - 1.0).abs() < 0.02);
}
