//! Glycol–water mixtures against Melinder (2010), *Properties of Secondary Working
//! Fluids for Indirect Systems* (IIR), as transcribed in CoolProp's incompressible
//! tables MEG and MPG (tests/reference/glycol_coolprop.csv from gen_glycol.py), and
//! the freezing points published in trade tables.

mod reference_csv;

use dutyline::fluid::glycol::{freezing_point_k, glycol_properties, Glycol};

fn rel(a: f64, b: f64) -> f64 {
    (a / b - 1.0).abs()
}

#[test]
fn density_viscosity_and_freezing_point_match_the_transcription() {
    let table = reference_csv::load("glycol_coolprop.csv");
    assert!(table.rows.len() >= 90);
    for row in &table.rows {
        let num = |name| table.number(row, name).expect("cell");
        let glycol = match table.text(row, "glycol") {
            "ethylene" => Glycol::Ethylene,
            _ => Glycol::Propylene,
        };
        let (x, t) = (num("mass_fraction"), num("T_K"));
        let (rho, mu) = glycol_properties(glycol, x, t).unwrap_or_else(|e| panic!("{x} {t}: {e}"));
        // The same polynomial evaluated twice: density to rounding (1e-9); viscosity to
        // 1e-5 (the transcription stores exp(...) in Pa·s with its own scaling: worst
        // seen 3e-7).
        assert!(rel(rho, num("density_kg_m3")) < 1e-9, "rho {x} {t}: {rho}");
        assert!(rel(mu, num("viscosity_pa_s")) < 1e-5, "mu {x} {t}: {mu}");
        let tf = freezing_point_k(glycol, x);
        assert!((tf - num("freeze_K")).abs() < 1e-6, "freeze {x}: {tf}");
    }
}

#[test]
fn freezing_points_agree_with_published_trade_tables() {
    // Freezing points of aqueous glycols by mass, as printed in the usual trade tables
    // (ASHRAE Handbook—Fundamentals, chapter "Physical properties of secondary
    // coolants", from memory): ethylene glycol 30 % → −15.4 °C, 40 % → −23.5 °C;
    // propylene glycol 30 % → −12.9 °C, 40 % → −21.1 °C. Melinder's fit is a different
    // data set, so agreement within 1.5 K is what to expect.
    for (g, x, tf_c) in [
        (Glycol::Ethylene, 0.30, -15.4),
        (Glycol::Ethylene, 0.40, -23.5),
        (Glycol::Propylene, 0.30, -12.9),
        (Glycol::Propylene, 0.40, -21.1),
    ] {
        let got = freezing_point_k(g, x) - 273.15;
        assert!((got - tf_c).abs() < 1.5, "{g:?} {x}: {got} vs {tf_c}");
    }
}
