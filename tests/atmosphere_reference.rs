//! Barometric pressure against the U.S. Standard Atmosphere 1976 tables and the `fluids`
//! package (tests/reference/atmosphere_fluids.csv from gen_atmosphere.py).

mod reference_csv;

use dutyline::fluid::atmosphere::{geometric_elevation_m, geopotential_altitude_m};
use dutyline::fluid::barometric_pressure_pa;

fn rel(a: f64, b: f64) -> f64 {
    (a / b - 1.0).abs()
}

#[test]
fn us_standard_atmosphere_1976_table_values() {
    // (geometric altitude Z m, pressure Pa). These are the 1976 table's entries at
    // *geometric* altitude (Table I lists Z with H beside it; values as given in the
    // brief, 5 significant digits, confirmed by fluids.atmosphere.ATMOSPHERE_1976(Z)).
    // At 5000 m the geopotential reading (54 020 Pa) would differ by 0.05 %, so the
    // 0.01 % tolerance here tells the two apart.
    let table = [
        (0.0, 101_325.0),   // USSA 1976 Table I, Z = 0 m
        (1000.0, 89_876.0), // USSA 1976 Table I, Z = 1000 m
        (2000.0, 79_501.0), // USSA 1976 Table I, Z = 2000 m
        (3000.0, 70_121.0), // USSA 1976 Table I, Z = 3000 m
        (5000.0, 54_048.0), // USSA 1976 Table I, Z = 5000 m
    ];
    for (z, p) in table {
        let computed = barometric_pressure_pa(z).expect("in range");
        assert!(rel(computed, p) < 1e-4, "Z {z}: {computed} vs {p}");
    }
    // Using the geopotential altitude as if it were geometric would miss at 5000 m.
    let wrong = barometric_pressure_pa(geometric_elevation_m(5000.0)).expect("in range");
    assert!(rel(wrong, 54_048.0) > 4e-4);
}

#[test]
fn matches_fluids_atmosphere_1976() {
    let table = reference_csv::load("atmosphere_fluids.csv");
    assert!(table.rows.len() >= 60);
    for row in &table.rows {
        let z = table.number(row, "elevation_m").expect("Z");
        let h = table.number(row, "geopotential_m").expect("H");
        let p = table.number(row, "pressure_pa").expect("p");
        assert!((geopotential_altitude_m(z) - h).abs() < 1e-6, "Z {z}"); // fluids ATMOSPHERE_1976.H
        let computed = barometric_pressure_pa(z).expect("in range");
        assert!(rel(computed, p) < 1e-9, "Z {z}: {computed} vs {p}"); // fluids ATMOSPHERE_1976.P
    }
}

#[test]
fn pressure_falls_with_elevation() {
    let mut previous = f64::INFINITY;
    for i in 0..=160 {
        let z = -5000.0 + 100.0 * f64::from(i);
        let p = barometric_pressure_pa(z).expect("in range");
        assert!(p < previous && p.is_finite());
        previous = p;
    }
}
