//! Liquid water by IAPWS-IF97 (through the `seuif97` crate).
//!
//! Sources:
//! - IAPWS, *Revised Release on the IAPWS Industrial Formulation 1997 for the
//!   Thermodynamic Properties of Water and Steam* (IAPWS-IF97), 2007:
//!   region 1 (compressed liquid, 273.15 K <= T <= 623.15 K, p_sat(T) <= p <= 100 MPa),
//!   region 3 (623.15 K < T, up to the B23 boundary, p <= 100 MPa) and region 4
//!   (saturation line, Eq. 30, 273.15 K <= T <= 647.096 K).
//! - IAPWS R12-08, *Release on the IAPWS Formulation 2008 for the Viscosity of
//!   Ordinary Water Substance*, Eq. (2), evaluated by `seuif97` with the
//!   critical-enhancement factor mu_2 = 1 (the same choice R12-08 makes for its
//!   Table 4 check values), at the IF97 density.

use super::{FluidError, LiquidProperties};

/// Lowest temperature accepted (exclusive): the normal freezing point, K.
/// The triple point is 273.16 K; IF97 region 1 starts at 273.15 K.
pub const FREEZING_POINT_K: f64 = 273.15;
/// Triple point of water, K (IAPWS-IF97: 273.16 K, p = 611.657 Pa).
pub const TRIPLE_POINT_K: f64 = 273.16;
/// Critical temperature of water (IAPWS-IF97 Eq. 3 constant T_c), K. Accepted
/// temperatures are strictly below it.
pub const CRITICAL_TEMPERATURE_K: f64 = 647.096;
/// Highest pressure covered by IAPWS-IF97 regions 1 and 3, Pa.
pub const MAX_PRESSURE_PA: f64 = 100.0e6;

/// Lower edge (K) of the zone where R12-08's critical enhancement of viscosity
/// is not negligible (R12-08 section 3, from memory: about 645.91 K < T < 650.77 K
/// and 245.8 kg/m^3 < rho < 405.3 kg/m^3).
const VISCOSITY_ENHANCEMENT_T_K: f64 = 645.91;
/// Upper density (kg/m^3) of that zone (from memory, see above).
const VISCOSITY_ENHANCEMENT_RHO_MAX: f64 = 405.3;

/// The full answer for one water state: the properties plus how they were obtained.
#[derive(Clone, Debug, PartialEq)]
pub struct WaterState {
    /// Density, viscosity and vapour pressure.
    pub properties: LiquidProperties,
    /// Pressure at which density and viscosity were evaluated, Pa: the requested
    /// pressure, or the saturation pressure when the request was below it.
    pub evaluated_pressure_pa: f64,
    /// True when the requested pressure was below the vapour pressure, so the
    /// properties are those of saturated liquid at the requested temperature.
    pub clamped_to_saturation: bool,
    /// IAPWS-IF97 region used: 1 (compressed liquid), 3 (near-critical liquid)
    /// or 4 (saturated liquid).
    pub if97_region: u8,
    /// Warnings for states near the edge of what the formulation covers.
    pub warnings: Vec<String>,
}

/// Liquid water at temperature `temperature_k` (K) and pressure `pressure_pa` (Pa, absolute)
/// by IAPWS-IF97 (2007) via `seuif97`: density (region 1 or 3), dynamic viscosity
/// (IAPWS R12-08, mu_2 = 1) and the saturation (vapour) pressure at T (region 4, Eq. 30).
///
/// Valid range: 273.15 K < T < 647.096 K and 0 < p <= 100 MPa.
///
/// Pressure below the vapour pressure (the water would boil at that pressure): the
/// properties of **saturated liquid** at T are returned (evaluated at p_sat(T)), not an
/// error. Pump-system inputs often give a reference pressure (e.g. atmospheric) for
/// hot water whose real line pressure is higher; liquid properties hardly depend on
/// pressure, and whether the liquid actually flashes is an NPSH question answered
/// elsewhere with `vapor_pressure_pa`. Use [`water_state`] to see that this happened
/// (`clamped_to_saturation`, plus a warning).
///
/// Errors (never panics): non-finite inputs; T <= 273.15 K (ice; the triple point is
/// 273.16 K); T >= 647.096 K (critical point: no liquid); p <= 0 or p > 100 MPa; or a
/// state that `seuif97` does not place on the liquid side.
pub fn water(temperature_k: f64, pressure_pa: f64) -> Result<LiquidProperties, FluidError> {
    water_state(temperature_k, pressure_pa).map(|state| state.properties)
}

/// As [`water`], but also reports the evaluation pressure, the IF97 region, whether the
/// request was clamped to saturation, and warnings.
pub fn water_state(temperature_k: f64, pressure_pa: f64) -> Result<WaterState, FluidError> {
    check_temperature(temperature_k)?;
    check_pressure(pressure_pa)?;
    let t_celsius = temperature_k - 273.15;
    let p_sat_pa = saturation_pressure_pa(temperature_k)?;

    let mut warnings = Vec::new();
    let (density, viscosity, evaluated_pressure_pa, region, clamped) = if pressure_pa <= p_sat_pa {
        let density = seuif97::tx(t_celsius, 0.0, seuif97::OD);
        let viscosity = seuif97::tx(t_celsius, 0.0, seuif97::ODV);
        let clamped = pressure_pa < p_sat_pa;
        if clamped {
            warnings.push(format!(
                "water at {:.2} degC would boil at {:.1} Pa (vapour pressure {:.1} Pa): \
                 saturated-liquid properties used",
                t_celsius, pressure_pa, p_sat_pa
            ));
        }
        (density, viscosity, p_sat_pa, 4, clamped)
    } else {
        let p_mpa = pressure_pa * 1e-6;
        let region = seuif97::pt(p_mpa, t_celsius, seuif97::OR);
        if region != 1.0 && region != 3.0 {
            return Err(FluidError::new(format!(
                "water at {:.2} degC and {:.1} Pa is not liquid according to IAPWS-IF97 \
                 (region code {}); liquid needs pressure above the vapour pressure {:.1} Pa",
                t_celsius, pressure_pa, region, p_sat_pa
            )));
        }
        let density = seuif97::pt(p_mpa, t_celsius, seuif97::OD);
        let viscosity = seuif97::pt(p_mpa, t_celsius, seuif97::ODV);
        (density, viscosity, pressure_pa, region as u8, false)
    };

    check_output("density", density, temperature_k, pressure_pa)?;
    check_output("dynamic viscosity", viscosity, temperature_k, pressure_pa)?;
    if temperature_k > VISCOSITY_ENHANCEMENT_T_K && density < VISCOSITY_ENHANCEMENT_RHO_MAX {
        warnings.push(format!(
            "water at {:.2} degC, {:.1} kg/m^3 is in the near-critical zone where the \
             IAPWS R12-08 viscosity critical enhancement (not applied) matters",
            t_celsius, density
        ));
    }

    Ok(WaterState {
        properties: LiquidProperties {
            density_kg_m3: density,
            dynamic_viscosity_pa_s: viscosity,
            vapor_pressure_pa: p_sat_pa,
        },
        evaluated_pressure_pa,
        clamped_to_saturation: clamped,
        if97_region: region,
        warnings,
    })
}

/// Saturation (vapour) pressure of water at `temperature_k`, Pa, by the IAPWS-IF97
/// region-4 saturation-pressure equation (Eq. 30). Valid 273.15 K < T < 647.096 K
/// (the lower bound is exclusive here to match [`water`]); errors outside.
pub fn saturation_pressure_pa(temperature_k: f64) -> Result<f64, FluidError> {
    check_temperature(temperature_k)?;
    let p_mpa = seuif97::tx(temperature_k - 273.15, 0.0, seuif97::OP);
    if p_mpa.is_finite() && p_mpa > 0.0 {
        Ok(p_mpa * 1e6)
    } else {
        Err(FluidError::new(format!(
            "no IAPWS-IF97 saturation pressure at {:.2} degC (seuif97 returned {})",
            temperature_k - 273.15,
            p_mpa
        )))
    }
}

fn check_temperature(temperature_k: f64) -> Result<(), FluidError> {
    let range = "liquid water is covered for 0 degC < T < 373.946 degC \
                 (273.15 K < T < 647.096 K)";
    if !temperature_k.is_finite() {
        return Err(FluidError::new(format!(
            "water temperature is not a finite number ({temperature_k} K); {range}"
        )));
    }
    let t_celsius = temperature_k - 273.15;
    if temperature_k <= FREEZING_POINT_K {
        return Err(FluidError::new(format!(
            "water at {t_celsius:.2} degC ({temperature_k} K) is at or below its freezing point \
             (0 degC; triple point 0.01 degC); {range}"
        )));
    }
    if temperature_k >= CRITICAL_TEMPERATURE_K {
        return Err(FluidError::new(format!(
            "water at {t_celsius:.2} degC ({temperature_k} K) is at or above its critical \
             temperature 373.946 degC, where no liquid exists; {range}"
        )));
    }
    Ok(())
}

fn check_pressure(pressure_pa: f64) -> Result<(), FluidError> {
    if !pressure_pa.is_finite() || pressure_pa <= 0.0 {
        return Err(FluidError::new(format!(
            "water pressure must be a positive absolute pressure in Pa, got {pressure_pa}"
        )));
    }
    if pressure_pa > MAX_PRESSURE_PA {
        return Err(FluidError::new(format!(
            "water pressure {pressure_pa} Pa is above the IAPWS-IF97 limit of 100 MPa"
        )));
    }
    Ok(())
}

fn check_output(
    what: &str,
    value: f64,
    temperature_k: f64,
    pressure_pa: f64,
) -> Result<(), FluidError> {
    if value.is_finite() && value > 0.0 {
        Ok(())
    } else {
        Err(FluidError::new(format!(
            "IAPWS-IF97 gave no {what} for water at {:.2} degC and {pressure_pa} Pa \
             (seuif97 returned {value})",
            temperature_k - 273.15
        )))
    }
}

/// Isentropic bulk modulus of liquid water K = ρ·w², Pa, with the density ρ and the
/// speed of sound w of IAPWS-IF97 (region 1) at `temperature_k` and `pressure_pa`
/// (raised to the vapour pressure when below it). This is the modulus of the Korteweg
/// wave speed (Wylie and Streeter, *Fluid Transients in Systems*, 1993, eq. 2.16: the
/// wave speed in a rigid pipe is √(K/ρ) = w). Valid 273.16–623.15 K, liquid only.
pub fn water_bulk_modulus_pa(temperature_k: f64, pressure_pa: f64) -> Result<f64, FluidError> {
    let state = water_state(temperature_k, pressure_pa)?;
    let t_celsius = temperature_k - 273.15;
    let w = if state.if97_region == 4 {
        seuif97::tx(t_celsius, 0.0, seuif97::OW)
    } else {
        seuif97::pt(state.evaluated_pressure_pa * 1e-6, t_celsius, seuif97::OW)
    };
    let k = state.properties.density_kg_m3 * w * w;
    check_output("bulk modulus", k, temperature_k, pressure_pa)?;
    Ok(k)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn cold_water_at_one_atmosphere() {
        // 20 degC, 101325 Pa: rho 998.2 kg/m^3, mu 1.002 mPa s, p_v 2339 Pa (common practice,
        // handbook values for water at 20 degC).
        let w = water(293.15, 101_325.0).expect("liquid");
        assert!((w.density_kg_m3 - 998.2).abs() < 0.1);
        assert!((w.dynamic_viscosity_pa_s - 1.002e-3).abs() < 0.002e-3);
        assert!((w.vapor_pressure_pa - 2339.0).abs() < 2.0);
    }

    #[test]
    fn below_vapour_pressure_gives_saturated_liquid() {
        // 120 degC at 1 atm would boil; p_sat(393.15 K) = 198 665.4 Pa (IAPWS-IF97 Eq. 30,
        // value from the iapws package, iapws97._PSat_T(393.15)).
        let state = water_state(393.15, 101_325.0).expect("clamped, not an error");
        assert!(state.clamped_to_saturation);
        assert_eq!(state.if97_region, 4);
        assert_eq!(state.warnings.len(), 1);
        assert!((state.evaluated_pressure_pa - 198_665.4).abs() < 0.1);
        // Continuity: just above p_sat, region 1 gives the same density.
        let above = water_state(393.15, state.evaluated_pressure_pa * (1.0 + 1e-9)).expect("ok");
        assert_eq!(above.if97_region, 1);
        let rel = (above.properties.density_kg_m3 / state.properties.density_kg_m3 - 1.0).abs();
        assert!(rel < 1e-9, "{rel}");
    }

    #[test]
    fn errors_name_temperature_and_range() {
        let e = water(273.15, 101_325.0).unwrap_err();
        assert!(
            e.message.contains("0.00 degC") && e.message.contains("647.096 K"),
            "{e}"
        );
        let e = water(650.0, 30e6).unwrap_err();
        assert!(e.message.contains("376.85 degC"), "{e}");
        assert!(water(f64::NAN, 101_325.0).is_err());
        assert!(water(-5.0, 101_325.0).is_err());
        assert!(water(300.0, f64::INFINITY).is_err());
        assert!(water(300.0, -1.0).is_err());
        assert!(water(300.0, 0.0).is_err());
        assert!(water(300.0, 100.1e6).is_err());
        assert!(water(300.0, 100.0e6).is_ok());
    }

    #[test]
    fn near_critical_liquid_is_region_3_with_warning() {
        let s = water_state(646.5, 21.91e6).expect("liquid just below critical");
        assert_eq!(s.if97_region, 3);
        assert!(
            s.warnings.iter().any(|w| w.contains("near-critical")),
            "{s:?}"
        );
        let s = water_state(630.0, 20.0e6).expect("region 3 liquid");
        assert_eq!(s.if97_region, 3);
        assert!(s.warnings.is_empty());
    }
}
