//! Hazen–Williams in its two published forms: SI head (10.67) and US psi per foot (4.52).

use dutyline::hydraulics::friction::{
    hazen_williams_head_loss_m, hazen_williams_psi_per_ft, HAZEN_WILLIAMS_SI_CONSTANT,
    HAZEN_WILLIAMS_US_CONSTANT,
};

const M_PER_FT: f64 = 0.3048; // NIST SP 811 (2008) Appendix B, exact
const M_PER_IN: f64 = 0.0254; // NIST SP 811 (2008) Appendix B, exact
const M3_PER_US_GAL: f64 = 3.785_411_784e-3; // NIST SP 811 (2008) Appendix B, exact
const PA_PER_PSI: f64 = 6_894.757; // NIST SP 811 (2008) Appendix B
const WATER_LBF_PER_FT3: f64 = 62.4; // common practice, cold water

#[test]
fn published_constants_follow_from_the_original_formula() {
    // Williams and Hazen (1905/1920): V = k C R^0.63 S^0.54, R = D/4, Q = V pi D^2 / 4.
    // Solving for S: S = (4^1.63 Q / (pi k C D^2.63))^(1/0.54).
    let exponent = 1.0 / 0.54;
    // SI, k = 0.849: the constant of h = K L Q^1.852 / (C^1.852 D^4.8704).
    let k_si = (4f64.powf(1.63) / (std::f64::consts::PI * 0.849)).powf(exponent);
    assert!((k_si - HAZEN_WILLIAMS_SI_CONSTANT).abs() < 0.01, "{k_si}"); // 10.674 -> 10.67
    assert!((2.63 * exponent - 4.8704).abs() < 1e-4); // D exponent 4.8704
                                                      // US, k = 1.318 (ft, s), Q in gpm, d in inches, loss in psi per foot at 62.4 lbf/ft^3.
    let cfs_per_gpm = M3_PER_US_GAL / M_PER_FT.powi(3) / 60.0;
    let base = 4f64.powf(1.63) / (std::f64::consts::PI * 1.318) * cfs_per_gpm * 12f64.powf(2.63);
    let k_us = base.powf(exponent) * WATER_LBF_PER_FT3 / 144.0;
    assert!((k_us - HAZEN_WILLIAMS_US_CONSTANT).abs() < 0.015, "{k_us}"); // 4.531 -> 4.52
}

/// Same physical point in both forms: SI head loss per metre (m/m) times the specific
/// weight, converted to psi per foot.
fn si_form_in_psi_per_ft(q_m3_s: f64, d_m: f64, c: f64) -> f64 {
    let gradient = hazen_williams_head_loss_m(q_m3_s, d_m, 1.0, c); // m per m = ft per ft
    let specific_weight_pa_per_m = WATER_LBF_PER_FT3 / 144.0 * PA_PER_PSI / M_PER_FT;
    gradient * specific_weight_pa_per_m * M_PER_FT / PA_PER_PSI
}

#[test]
fn both_unit_systems_agree_within_their_rounding() {
    // The forms round 1.852 -> 1.85 and 4.8704 -> 4.87 and their constants, so they can
    // only agree to about 1-2 % over ordinary pipes (2-24 in, 0.3-3 m/s, C 80-150).
    let mut worst = 0.0_f64;
    for d_in in [2.067, 4.026, 6.065, 10.02, 15.0, 23.25] {
        for velocity in [0.3, 1.0, 3.0] {
            for c in [80.0, 120.0, 150.0] {
                let d_m = d_in * M_PER_IN;
                let q_m3_s = velocity * std::f64::consts::PI * d_m * d_m / 4.0;
                let q_gpm = q_m3_s / M3_PER_US_GAL * 60.0;
                let us = hazen_williams_psi_per_ft(q_gpm, d_in, c);
                let si = si_form_in_psi_per_ft(q_m3_s, d_m, c);
                let deviation = (us / si - 1.0).abs();
                assert!(
                    deviation < 0.02,
                    "d {d_in} in, v {velocity}, C {c}: {deviation}"
                );
                worst = worst.max(deviation);
            }
        }
    }
    // They are not identical either: the rounding shows.
    assert!(worst > 1e-3, "{worst}");
}

#[test]
fn worked_example_in_both_units() {
    // 6 in schedule 40 steel (ID 6.065 in, ASME B36.10M), 500 gpm, C = 120, 1000 ft.
    // US form by hand: 4.52 * 500^1.85 / (120^1.85 * 6.065^4.87)
    //   = 4.52 * 98 423 / (7022.4 * 6492.1) = 0.009758 psi/ft -> 9.758 psi per 1000 ft.
    let us = hazen_williams_psi_per_ft(500.0, 6.065, 120.0) * 1000.0;
    assert!((us - 9.758).abs() < 0.005, "{us}");
    // SI form: Q = 500 gpm = 0.031545 m^3/s, D = 0.154051 m, L = 304.8 m:
    // h = 10.67 * 304.8 * 0.031545^1.852 / (120^1.852 * 0.154051^4.8704) = 6.886 m of water
    // -> gradient 6.886 / 304.8 = 0.022591 ft/ft, times 62.4/144 psi per ft of water
    //    = 0.009790 psi/ft = 9.790 psi per 1000 ft (0.3 % above the US form).
    let q_m3_s = 500.0 * M3_PER_US_GAL / 60.0;
    let h = hazen_williams_head_loss_m(q_m3_s, 6.065 * M_PER_IN, 1000.0 * M_PER_FT, 120.0);
    assert!((h - 6.886).abs() < 0.001, "{h}");
    let si_psi = si_form_in_psi_per_ft(q_m3_s, 6.065 * M_PER_IN, 120.0) * 1000.0;
    assert!((si_psi - 9.790).abs() < 0.002, "{si_psi}");
    assert!((si_psi / us - 1.0).abs() < 0.01, "{si_psi} vs {us}");
}
