//! Screening a viscous liquid against water-test pump curves.
//!
//! Published pump curves are measured on water (about 1 cSt). On a more viscous liquid
//! head, flow and efficiency fall and the shaft power rises. The engine does not correct
//! the curves; it says when a correction is needed.

/// The ANSI/HI 9.6.7 screening parameter B, SI form:
///
/// B = 16.5 · ν^0.50 · H_BEP^0.0625 / (Q_BEP^0.375 · N^0.25),
///
/// with ν the kinematic viscosity in cSt, Q_BEP the water best-efficiency flow in m³/h,
/// H_BEP the water head per stage at that flow in m and N the speed in rpm.
/// Source: ANSI/HI 9.6.7-2010, *Rotodynamic Pumps — Guideline for Effects of Liquid
/// Viscosity on Performance*, Hydraulic Institute (the parameter B of its correction
/// method; from memory, checked against published restatements of the standard).
///
/// Meaning: B ≤ 1, the water performance applies; 1 < B < 40, head, flow and efficiency
/// must be corrected; B ≥ 40, the correlation is highly uncertain. Validity range of the
/// underlying test data: 1–3000 cSt, Newtonian liquids; [`viscosity_warning`] says so
/// outside it. Returns `None` when an input is not finite and positive.
pub fn viscosity_parameter_b(
    kinematic_viscosity_m2_s: f64,
    bep_flow_m3_s: f64,
    bep_head_m: f64,
    speed_rpm: f64,
) -> Option<f64> {
    let inputs = [
        kinematic_viscosity_m2_s,
        bep_flow_m3_s,
        bep_head_m,
        speed_rpm,
    ];
    if !inputs.iter().all(|x| x.is_finite() && *x > 0.0) {
        return None;
    }
    let nu_cst = kinematic_viscosity_m2_s * 1e6;
    let q_m3_h = bep_flow_m3_s * 3600.0;
    let b = 16.5 * nu_cst.sqrt() * bep_head_m.powf(0.0625)
        / (q_m3_h.powf(0.375) * speed_rpm.powf(0.25));
    b.is_finite().then_some(b)
}

/// A warning when the liquid needs a viscosity correction of the water-test curve
/// (B > 1 by [`viscosity_parameter_b`]), with a note when ν lies outside the 1–3000 cSt
/// of the correlation's data; `None` when the water curve applies or B cannot be formed.
pub fn viscosity_warning(
    kinematic_viscosity_m2_s: f64,
    bep_flow_m3_s: f64,
    bep_head_m: f64,
    speed_rpm: f64,
) -> Option<String> {
    let b = viscosity_parameter_b(
        kinematic_viscosity_m2_s,
        bep_flow_m3_s,
        bep_head_m,
        speed_rpm,
    )?;
    if b <= 1.0 {
        return None;
    }
    let nu_cst = kinematic_viscosity_m2_s * 1e6;
    let mut w = format!(
        "the liquid's kinematic viscosity is {nu_cst:.1} cSt: ANSI/HI 9.6.7 parameter B = {b:.2} \
         exceeds 1, so head, flow and efficiency fall below the water-test curve; no viscosity \
         correction is applied: obtain curves corrected for this liquid"
    );
    if b >= 40.0 {
        w.push_str(" (B >= 40: the ANSI/HI 9.6.7 correlation itself is highly uncertain)");
    }
    if nu_cst > 3000.0 {
        w.push_str(" (beyond the 3000 cSt of the correlation's test data)");
    }
    Some(w)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn water_needs_no_correction_and_oil_does() {
        // A 55 m³/h, 38 m pump at 1750 rpm (invented). Water at 15 °C is about 1.14 cSt.
        let q = 55.0 / 3600.0;
        assert!(viscosity_parameter_b(1.14e-6, q, 38.0, 1750.0).expect("b") < 1.0);
        assert!(viscosity_warning(1.14e-6, q, 38.0, 1750.0).is_none());
        // 250 cSt gear oil: the same B from the standard's US-customary form,
        // B = 26.6·ν^0.5·H_ft^0.0625 / (Q_gpm^0.375·N^0.25) (ANSI/HI 9.6.7, from memory).
        let b = viscosity_parameter_b(250e-6, q, 38.0, 1750.0).expect("b");
        let q_gpm = q / 3.785411784e-3 * 60.0; // 1 US gal = 3.785411784 L (NIST SP 811)
        let h_ft: f64 = 38.0 / 0.3048; // 1 ft = 0.3048 m (NIST SP 811)
        let us =
            26.6 * 250f64.sqrt() * h_ft.powf(0.0625) / (q_gpm.powf(0.375) * 1750f64.powf(0.25));
        assert!((b / us - 1.0).abs() < 0.005, "SI {b} against US form {us}");
        assert!(b > 1.0);
        assert!(viscosity_warning(250e-6, q, 38.0, 1750.0)
            .expect("warning")
            .contains("9.6.7"));
    }

    #[test]
    fn b_grows_with_the_square_root_of_viscosity() {
        let q = 0.01;
        let one = viscosity_parameter_b(10e-6, q, 30.0, 1450.0).expect("b");
        let four = viscosity_parameter_b(40e-6, q, 30.0, 1450.0).expect("b");
        assert!((four / one - 2.0).abs() < 1e-12);
    }

    #[test]
    fn meaningless_inputs_give_none() {
        assert!(viscosity_parameter_b(0.0, 0.01, 30.0, 1450.0).is_none());
        assert!(viscosity_parameter_b(1e-6, f64::NAN, 30.0, 1450.0).is_none());
        assert!(viscosity_warning(1e-6, 0.01, -1.0, 1450.0).is_none());
    }
}
