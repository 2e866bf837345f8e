//! A viscous liquid against water-test pump curves: the screen and the correction.
//!
//! Published pump curves are measured on water (about 1 cSt). On a more viscous liquid
//! head, flow and efficiency fall and the shaft power rises. Above the threshold of
//! ANSI/HI 9.6.7 the engine corrects the water curve by the standard's factors
//! ([`ViscousCorrection`]) and says so; a corrected curve from the manufacturer, tested
//! or stated for the liquid, remains the better basis.

/// The ANSI/HI 9.6.7 screening parameter B, SI form:
///
/// B = 16.5 · ν^0.50 · H_BEP^0.0625 / (Q_BEP^0.375 · N^0.25),
///
/// with ν the kinematic viscosity in cSt, Q_BEP the water best-efficiency flow in m³/h,
/// H_BEP the water head per stage at that flow in m and N the speed in rpm.
/// Source: ANSI/HI 9.6.7-2015 (edition from memory), *Rotodynamic Pumps — Guideline for Effects of Liquid
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
    let c = ViscousCorrection::from_b(b, bep_flow_m3_s);
    let nu_cst = kinematic_viscosity_m2_s * 1e6;
    let mut w = format!(
        "the liquid's kinematic viscosity is {nu_cst:.1} cSt: ANSI/HI 9.6.7 parameter B = {b:.2} \
         exceeds 1, so head, flow and efficiency fall below the water-test curve; the water \
         curve is corrected here by the standard's factors (C_Q = {:.3}, C_H at BEP = {:.3}, \
         C_eta = {:.3}; NPSH required not corrected): confirm with the manufacturer's curve for \
         this liquid",
        c.flow, c.bep_head, c.efficiency
    );
    if b >= 40.0 {
        w.push_str(" (B >= 40: the ANSI/HI 9.6.7 correlation itself is highly uncertain)");
    }
    if nu_cst > 3000.0 {
        w.push_str(" (beyond the 3000 cSt of the correlation's test data)");
    }
    Some(w)
}

/// The ANSI/HI 9.6.7 correction of a water-test curve for one pump on one liquid.
///
/// With B from [`viscosity_parameter_b`] at the pump's water best-efficiency point
/// (Q_BEP-W, H_BEP-W at its speed and impeller), for 1 < B:
///
/// - flow: C_Q = 2.71^(−0.165·(log₁₀ B)^3.15), Q_vis = C_Q·Q_W;
/// - head at the best-efficiency point: C_BEP-H = C_Q; at other flows
///   C_H = 1 − (1 − C_BEP-H)·(Q_W/Q_BEP-W)^0.75, H_vis = C_H·H_W (so shut-off head is
///   unchanged);
/// - efficiency: C_η = B^−(0.0547·B^0.69), η_vis = C_η·η_W;
///
/// each viscous point (Q_vis, H_vis, η_vis) corresponding to the water point
/// (Q_W, H_W, η_W). Source: ANSI/HI 9.6.7-2015 (edition from memory), *Rotodynamic Pumps — Guideline for
/// Effects of Liquid Viscosity on Performance*, Hydraulic Institute, the correction
/// method's equations for C_Q, C_H and C_η (from memory; no open transcription was found
/// to check them against, so the package says so). The standard's data cover about
/// 1–3000 cSt and B up to 40; beyond B = 40 the factors are applied with a warning that
/// the correlation is highly uncertain ([`viscosity_warning`]). NPSH required is not
/// corrected (the standard's NPSH correction is not applied): the water value at the
/// corresponding water flow is used, and the package says so.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ViscousCorrection {
    /// The parameter B.
    pub b: f64,
    /// C_Q, flow factor.
    pub flow: f64,
    /// C_BEP-H, the head factor at the best-efficiency flow (equal to C_Q).
    pub bep_head: f64,
    /// C_η, efficiency factor.
    pub efficiency: f64,
    /// The water best-efficiency flow Q_BEP-W the head factor is referred to, m³/s.
    pub bep_flow_water: f64,
}

impl ViscousCorrection {
    /// The correction for a pump whose water best-efficiency point is `bep_flow_m3_s`,
    /// `bep_head_m` at `speed_rpm`, on a liquid of kinematic viscosity
    /// `kinematic_viscosity_m2_s`; `None` when B ≤ 1 (the water curve applies) or an
    /// input is not a positive finite number.
    pub fn for_pump(
        kinematic_viscosity_m2_s: f64,
        bep_flow_m3_s: f64,
        bep_head_m: f64,
        speed_rpm: f64,
    ) -> Option<Self> {
        let b = viscosity_parameter_b(
            kinematic_viscosity_m2_s,
            bep_flow_m3_s,
            bep_head_m,
            speed_rpm,
        )?;
        (b > 1.0).then(|| Self::from_b(b, bep_flow_m3_s))
    }

    /// The factors at a given B (> 1) for a pump whose water BEP flow is `bep_flow_water`.
    pub fn from_b(b: f64, bep_flow_water: f64) -> Self {
        let c_q = 2.71_f64.powf(-0.165 * b.log10().powf(3.15));
        let c_eta = b.powf(-(0.0547 * b.powf(0.69)));
        ViscousCorrection {
            b,
            flow: c_q,
            bep_head: c_q,
            efficiency: c_eta,
            bep_flow_water,
        }
    }

    /// The head factor C_H at the water flow `q_water` (m³/s), never below 0.
    pub fn head_factor(&self, q_water: f64) -> f64 {
        let r = (q_water / self.bep_flow_water).max(0.0);
        (1.0 - (1.0 - self.bep_head) * r.powf(0.75)).max(0.0)
    }

    /// dC_H/dQ_W at `q_water`; 0 at zero flow (where the exact slope is unbounded, so a
    /// solver's derivative stays finite) and where C_H is held at 0.
    pub fn head_factor_slope(&self, q_water: f64) -> f64 {
        let r = q_water / self.bep_flow_water;
        if r <= 0.0 || self.head_factor(q_water) <= 0.0 {
            return 0.0;
        }
        -(1.0 - self.bep_head) * 0.75 * r.powf(-0.25) / self.bep_flow_water
    }

    /// The water flow corresponding to the viscous flow `q` (m³/s): Q_W = Q_vis/C_Q.
    pub fn water_flow(&self, q: f64) -> f64 {
        q / self.flow
    }
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

    #[test]
    fn correction_factors_follow_the_standards_equations() {
        // Hand-evaluated from the equations in the doc comment of `ViscousCorrection`
        // (ANSI/HI 9.6.7-2015, from memory): C_Q = 2.71^(-0.165 (log10 B)^3.15),
        // C_eta = B^-(0.0547 B^0.69).
        for (b, c_q, c_eta) in [
            (2.0, 0.996_259_204_8, 0.940_665_300_2),
            (10.0, 0.848_320_705_1, 0.539_623_663_2),
            (40.0, 0.483_874_256_7, 0.076_368_053_4),
        ] {
            let c = ViscousCorrection::from_b(b, 0.02);
            assert!((c.flow - c_q).abs() < 1e-9, "C_Q at B = {b}: {}", c.flow);
            assert!((c.efficiency - c_eta).abs() < 1e-9, "C_eta at B = {b}");
            assert_eq!(c.bep_head, c.flow);
        }
        // At B = 1 the factors meet the water curve: no step at the threshold.
        let edge = ViscousCorrection::from_b(1.0, 0.02);
        assert_eq!((edge.flow, edge.efficiency), (1.0, 1.0));
    }

    #[test]
    fn the_head_factor_is_one_at_shut_off_and_c_q_at_bep() {
        let c = ViscousCorrection::from_b(10.0, 0.02);
        assert_eq!(c.head_factor(0.0), 1.0);
        assert!((c.head_factor(0.02) - c.flow).abs() < 1e-15);
        // 1 - (1 - C)·2^0.75 at twice the BEP flow.
        let twice = 1.0 - (1.0 - c.flow) * 2f64.powf(0.75);
        assert!((c.head_factor(0.04) - twice).abs() < 1e-15);
        // The slope against a central difference, and held at 0 where C_H is clamped.
        let (q, d) = (0.015, 1e-7);
        let numeric = (c.head_factor(q + d) - c.head_factor(q - d)) / (2.0 * d);
        assert!((c.head_factor_slope(q) / numeric - 1.0).abs() < 1e-6);
        assert_eq!(c.head_factor(10.0), 0.0);
        assert_eq!(c.head_factor_slope(10.0), 0.0);
        assert_eq!(c.head_factor_slope(0.0), 0.0);
    }

    #[test]
    fn a_corrected_pump_moves_its_points_by_the_factors() {
        // An invented 1450 rpm curve: 0–40 L/s, 32 m at shut-off.
        let t = crate::pumps::CurveTable {
            speed_rpm: 1450.0,
            impeller_diameter_m: None,
            flow: vec![0.0, 0.01, 0.02, 0.03, 0.04],
            head: vec![32.0, 31.0, 28.0, 23.0, 16.0],
            efficiency: vec![Some(0.0), Some(0.55), Some(0.75), Some(0.78), Some(0.70)],
            npshr: vec![None, Some(1.5), Some(2.0), Some(2.8), Some(4.0)],
            shaft_power: vec![None; 5],
        };
        let base = crate::pumps::fit_table(&t).expect("fits");
        let bep = crate::pumps::best_efficiency_point(&base).expect("bep");
        let water = crate::pumps::ScaledPump::new(&base, 1.0, 1.0).expect("scaled");
        let nu = 200e-6; // 200 cSt: B well above 1
        let oil = water.clone().on_liquid(nu, Some(&bep));
        let c = *oil.viscous().expect("corrected");
        let b = viscosity_parameter_b(nu, bep.flow, bep.head, 1450.0).expect("b");
        assert!((c.b - b).abs() < 1e-12 && b > 1.0);
        // Shut-off head unchanged; the BEP moves to C_Q·Q with C_Q·H and C_eta·eta.
        assert!((oil.eval_head(0.0) - water.eval_head(0.0)).abs() < 1e-12);
        let q_vis = oil.bep_flow(bep.flow);
        assert!((q_vis - c.flow * bep.flow).abs() < 1e-15);
        assert!((oil.eval_head(q_vis) - c.bep_head * water.eval_head(bep.flow)).abs() < 1e-9);
        let eta = oil.eval_efficiency(q_vis).expect("eta");
        let eta_w = water.eval_efficiency(bep.flow).expect("eta");
        assert!((eta - c.efficiency * eta_w).abs() < 1e-12);
        // NPSHr: the water value at the corresponding water flow.
        let n = oil.eval_npshr(q_vis).expect("npshr");
        assert!((n - water.eval_npshr(bep.flow).expect("npshr")).abs() < 1e-12);
        assert!((oil.domain().1 - c.flow * water.domain().1).abs() < 1e-15);
        // The slope agrees with a central difference of the corrected head.
        let (q, d) = (0.012, 1e-7);
        let numeric = (oil.eval_head(q + d) - oil.eval_head(q - d)) / (2.0 * d);
        assert!((oil.head_derivative(q) / numeric - 1.0).abs() < 1e-5);
        // Water (no BEP given, or B <= 1) is left as it is.
        assert!(water.clone().on_liquid(nu, None).viscous().is_none());
        assert!(water.on_liquid(1.0e-6, Some(&bep)).viscous().is_none());
    }
}
