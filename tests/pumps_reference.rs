//! Duty points, fits, best efficiency points and affinity solves against an independent
//! computation: numpy.polyfit and scipy.optimize.brentq / minimize_scalar, written by
//! tests/reference/gen_duty.py into the CSV files beside it (committed, so these tests
//! run without Python).

use dutyline::pumps::{
    best_efficiency_point, fit, solve_duty, speed_for_duty, trim_for_duty, DutyOutcome, FitMethod,
    PumpCurves,
};
use std::collections::BTreeMap;

const TABLES: &str = include_str!("reference/pump_tables.csv");
const DUTY: &str = include_str!("reference/duty_scipy.csv");
const BEP: &str = include_str!("reference/bep_scipy.csv");
const AFFINITY: &str = include_str!("reference/affinity_scipy.csv");

/// Rows of a small CSV with a header line, as maps from column name to text.
fn rows(text: &str) -> Vec<BTreeMap<String, String>> {
    let mut lines = text.lines().filter(|l| !l.trim().is_empty());
    let header: Vec<String> = lines
        .next()
        .expect("CSV has a header")
        .split(',')
        .map(|s| s.trim().to_string())
        .collect();
    lines
        .map(|l| {
            header
                .iter()
                .cloned()
                .zip(l.split(',').map(|s| s.trim().to_string()))
                .collect()
        })
        .collect()
}

fn num(row: &BTreeMap<String, String>, key: &str) -> f64 {
    row[key]
        .parse()
        .unwrap_or_else(|_| panic!("column {key} is a number"))
}

struct Table {
    speed_rpm: f64,
    diameter_m: f64,
    flow: Vec<f64>,
    head: Vec<f64>,
    efficiency: Vec<f64>,
}

fn tables() -> BTreeMap<String, Table> {
    let mut out: BTreeMap<String, Table> = BTreeMap::new();
    for r in rows(TABLES) {
        let t = out.entry(r["table"].clone()).or_insert_with(|| Table {
            speed_rpm: num(&r, "speed_rpm"),
            diameter_m: num(&r, "diameter_m"),
            flow: Vec::new(),
            head: Vec::new(),
            efficiency: Vec::new(),
        });
        t.flow.push(num(&r, "flow_m3s"));
        t.head.push(num(&r, "head_m"));
        t.efficiency.push(num(&r, "efficiency"));
    }
    out
}

fn curves_with_degree(t: &Table, head_degree: usize) -> PumpCurves {
    PumpCurves {
        head: fit(
            &t.flow,
            &t.head,
            FitMethod::Polynomial {
                degree: head_degree,
            },
        )
        .expect("head"),
        efficiency: Some(
            fit(&t.flow, &t.efficiency, FitMethod::Polynomial { degree: 3 }).expect("eff"),
        ),
        npshr: None,
        shaft_power: None,
        speed_rpm: t.speed_rpm,
        impeller_diameter_m: Some(t.diameter_m),
        warnings: Vec::new(),
    }
}

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

#[test]
fn reference_files_are_complete() {
    assert_eq!(tables().len(), 3);
    assert_eq!(rows(DUTY).len(), 30); // 3 tables × 2 degrees × 5 systems, gen_duty.py
    assert_eq!(rows(BEP).len(), 3);
    assert_eq!(rows(AFFINITY).len(), 6);
}

#[test]
fn polynomial_coefficients_match_numpy_polyfit() {
    let tables = tables();
    for r in rows(DUTY) {
        let t = &tables[&r["table"]];
        let degree = num(&r, "degree") as usize;
        let curve = fit(&t.flow, &t.head, FitMethod::Polynomial { degree }).expect("fit");
        let ours = curve.monomial_coefficients().expect("polynomial");
        let q_max = t.flow[t.flow.len() - 1];
        for (j, a) in ours.iter().enumerate() {
            let reference = num(&r, &format!("c{j}")); // numpy.polyfit, gen_duty.py
                                                       // Compare each term's contribution at q_max against the shut-off head scale.
            let scale = num(&r, "c0").abs() / q_max.powi(j as i32);
            assert!(
                (a - reference).abs() <= 1e-9 * scale,
                "table {} degree {degree} c{j}: ours {a}, numpy {reference}",
                r["table"]
            );
        }
    }
}

#[test]
fn duty_points_match_scipy_brentq() {
    let tables = tables();
    for r in rows(DUTY) {
        let t = &tables[&r["table"]];
        let degree = num(&r, "degree") as usize;
        let curves = curves_with_degree(t, degree);
        let (hs, k, n) = (num(&r, "static_head_m"), num(&r, "k"), num(&r, "exponent"));
        let pump = |q: f64| curves.head.eval(q);
        let system = move |q: f64| hs + k * q.powf(n);
        let out = solve_duty(&pump, &system, num(&r, "q_end_m3s"));
        let DutyOutcome::Point {
            flow,
            head,
            crossings,
            ..
        } = out
        else {
            panic!(
                "table {} degree {degree}: expected a duty point, got {out:?}",
                r["table"]
            );
        };
        let q_ref = num(&r, "duty_flow_m3s"); // scipy.optimize.brentq, gen_duty.py
        let h_ref = num(&r, "duty_head_m"); // numpy.polyval at the brentq root, gen_duty.py
                                            // The brief asks for 0.1 %; the two solve the same least-squares and root problems,
                                            // so they agree far more closely.
        assert!(rel(flow, q_ref) < 1e-8, "flow {flow} vs {q_ref}");
        assert!(rel(head, h_ref) < 1e-8, "head {head} vs {h_ref}");
        assert!(rel(flow, q_ref) < 1e-3 && rel(head, h_ref) < 1e-3);
        assert_eq!(crossings, 1);
    }
}

#[test]
fn best_efficiency_points_match_numpy_roots() {
    let tables = tables();
    for r in rows(BEP) {
        let t = &tables[&r["table"]];
        let curves = curves_with_degree(t, 2);
        let bep = best_efficiency_point(&curves).expect("efficiency data present");
        let q_ref = num(&r, "bep_flow_m3s"); // numpy.roots of the cubic's derivative, gen_duty.py
        let e_ref = num(&r, "bep_efficiency"); // numpy.polyval there, gen_duty.py
        assert!(
            rel(bep.flow, q_ref) < 1e-7,
            "{} BEP flow {} vs {q_ref}",
            r["table"],
            bep.flow
        );
        assert!(rel(bep.efficiency, e_ref) < 1e-10);
        assert!(!bep.at_domain_end);
        assert!((bep.head - curves.head.eval(bep.flow)).abs() < 1e-12);
    }
}

#[test]
fn speed_and_trim_for_duty_match_scipy_brentq() {
    let tables = tables();
    for r in rows(AFFINITY) {
        let t = &tables[&r["table"]];
        let curves = curves_with_degree(t, 2);
        let (q, h) = (num(&r, "q_req_m3s"), num(&r, "h_req_m"));
        let reference = num(&r, "ratio"); // scipy.optimize.brentq, gen_duty.py
        let ratio = match r["kind"].as_str() {
            "speed" => {
                let s = speed_for_duty(&curves, q, h, 0.5, 1.1).expect("speed");
                assert!(rel(s.speed_rpm, reference * t.speed_rpm) < 1e-10);
                s.speed_ratio
            }
            _ => trim_for_duty(&curves, q, h, 0.5).expect("trim").0,
        };
        assert!(rel(ratio, reference) < 1e-10, "{ratio} vs {reference}");
    }
}
