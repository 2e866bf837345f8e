//! The roughness and Hazen-Williams C of each material describe similar pipes:
//! Colebrook friction factors from `fluids` for the table's roughness
//! (tests/reference/roughness_fluids.csv, from tests/reference/gen_roughness.py) are
//! compared with the friction factor that the table's C implies at the same point.

mod common;

use common::{num, read_csv, text};
use dutyline::hydraulics::catalogue::Material;
use dutyline::hydraulics::roughness::{roughness, roughness_table};

const ROUGHNESS_CSV: &str = include_str!("reference/roughness_fluids.csv");

/// Reference point of the CSV: D = 0.150 m, V = 1.5 m/s.
const D_M: f64 = 0.150;
const V_M_S: f64 = 1.5;
/// Standard gravity, m/s^2 (CGPM 1901).
const G: f64 = 9.80665;

/// Darcy f implied by Hazen-Williams in SI form, S = 10.67 Q^1.852 / (C^1.852 D^4.8704)
/// (Williams and Hazen, 1905/1920; SI coefficient 10.67).
fn hazen_williams_darcy_f(c: f64) -> f64 {
    let q = V_M_S * std::f64::consts::PI * D_M * D_M / 4.0;
    let slope = 10.67 * q.powf(1.852) / (c.powf(1.852) * D_M.powf(4.8704));
    slope * D_M * 2.0 * G / (V_M_S * V_M_S)
}

#[test]
fn colebrook_with_table_roughness_tracks_hazen_williams_c() {
    let rows = read_csv(ROUGHNESS_CSV);
    assert_eq!(rows.len(), roughness_table().len());
    for row in &rows {
        let material = Material::from_keyword(text(row, "material")).expect("material");
        let entry = roughness(material).expect("entry");
        // The script's copy of the table must be the table.
        assert!(
            (num(row, "new_m") / entry.new_m - 1.0).abs() < 1e-12,
            "{material:?} new"
        );
        assert!(
            (num(row, "aged_m") / entry.aged_m - 1.0).abs() < 1e-12,
            "{material:?} aged"
        );
        // Judgement values: the two routes agree within 25 % at the reference point
        // (largest gaps: smooth copper, where HW with C = 130-140 is conservative).
        for (f_colebrook, c) in [
            (num(row, "f_new"), entry.hw_c_new),
            (num(row, "f_aged"), entry.hw_c_aged),
        ] {
            let f_hw = hazen_williams_darcy_f(c);
            assert!(
                (f_colebrook / f_hw - 1.0).abs() < 0.25,
                "{material:?} C={c}: {f_colebrook} vs {f_hw}"
            );
        }
    }
}
