//! Barometric pressure against elevation by the U.S. Standard Atmosphere 1976
//! (identical to ISO 2533:1975 below 32 km), troposphere layer only.
//!
//! Source: NOAA, NASA, USAF, *U.S. Standard Atmosphere, 1976*, NOAA-S/T 76-1562
//! (Washington, 1976): geopotential altitude H = r0 Z / (r0 + Z) (Eq. 18) and, for a
//! layer with non-zero lapse rate, P = Pb [Tb / (Tb + Lb (H - Hb))]^(g0' M0 / (R* Lb))
//! (Eq. 33a) (equation numbers from memory). Constants from Tables 2-4 of that
//! document as listed below.

use super::FluidError;

/// Sea-level standard pressure P0, Pa (USSA 1976).
pub const SEA_LEVEL_PRESSURE_PA: f64 = 101_325.0;
/// Sea-level standard temperature T0, K (USSA 1976).
pub const SEA_LEVEL_TEMPERATURE_K: f64 = 288.15;
/// Troposphere temperature lapse rate, K per geopotential metre (USSA 1976: -6.5 K/km).
pub const TROPOSPHERE_LAPSE_RATE_K_M: f64 = 0.0065;
/// Standard gravity g0', m^2/(s^2 m') (USSA 1976).
pub const STANDARD_GRAVITY_M_S2: f64 = 9.806_65;
/// Mean molar mass of sea-level air M0, kg/mol (USSA 1976: 28.9644 kg/kmol).
pub const AIR_MOLAR_MASS_KG_MOL: f64 = 0.028_964_4;
/// Gas constant R* as adopted by USSA 1976, J/(mol K) (8.31432; not the later CODATA value).
pub const USSA1976_GAS_CONSTANT_J_MOL_K: f64 = 8.314_32;
/// Effective Earth radius r0 for the geopotential conversion, m (USSA 1976).
pub const EARTH_RADIUS_M: f64 = 6_356_766.0;
/// Lowest geometric elevation accepted, m (the start of the USSA 1976 tables).
pub const MIN_ELEVATION_M: f64 = -5_000.0;
/// Highest geometric elevation accepted, m (below the tropopause at H = 11 km'
/// geopotential, i.e. Z = 11 019 m geometric).
pub const MAX_ELEVATION_M: f64 = 11_000.0;

/// Geopotential altitude H (m') for a geometric elevation Z (m), USSA 1976 Eq. 18.
pub fn geopotential_altitude_m(geometric_elevation_m: f64) -> f64 {
    EARTH_RADIUS_M * geometric_elevation_m / (EARTH_RADIUS_M + geometric_elevation_m)
}

/// Geometric elevation Z (m) for a geopotential altitude H (m'), the inverse of
/// [`geopotential_altitude_m`]: Z = r0 H / (r0 - H).
pub fn geometric_elevation_m(geopotential_altitude_m: f64) -> f64 {
    EARTH_RADIUS_M * geopotential_altitude_m / (EARTH_RADIUS_M - geopotential_altitude_m)
}

/// Standard barometric pressure (Pa, absolute) at a **geometric** elevation above mean
/// sea level (m), by the U.S. Standard Atmosphere 1976 (= ISO 2533:1975) troposphere
/// relation p = p0 (1 - L H / T0)^(g0 M0 / (R* L)), where H is the geopotential altitude
/// from [`geopotential_altitude_m`].
///
/// Valid for -5000 m <= elevation <= 11000 m; outside that range, or for a non-finite
/// elevation, returns an error.
///
/// Worked number: 1000 m gives 89 876 Pa, matching the 1976 table (Table I, geometric
/// altitude 1000 m).
pub fn barometric_pressure_pa(elevation_m: f64) -> Result<f64, FluidError> {
    if !elevation_m.is_finite() {
        return Err(FluidError::new(format!(
            "elevation is not a finite number ({elevation_m} m)"
        )));
    }
    if !(MIN_ELEVATION_M..=MAX_ELEVATION_M).contains(&elevation_m) {
        return Err(FluidError::new(format!(
            "elevation {elevation_m} m is outside the U.S. Standard Atmosphere 1976 \
             troposphere range used here (-5000 m to 11000 m above sea level)"
        )));
    }
    let h = geopotential_altitude_m(elevation_m);
    let exponent = STANDARD_GRAVITY_M_S2 * AIR_MOLAR_MASS_KG_MOL
        / (USSA1976_GAS_CONSTANT_J_MOL_K * TROPOSPHERE_LAPSE_RATE_K_M);
    let temperature_ratio = 1.0 - TROPOSPHERE_LAPSE_RATE_K_M * h / SEA_LEVEL_TEMPERATURE_K;
    Ok(SEA_LEVEL_PRESSURE_PA * temperature_ratio.powf(exponent))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sea_level_is_standard_pressure() {
        assert_eq!(barometric_pressure_pa(0.0), Ok(101_325.0)); // USSA 1976 P0
    }

    #[test]
    fn exponent_is_the_published_5_2559() {
        // g0 M0 / (R* L) = 5.255 88 (USSA 1976 troposphere; common practice value 5.2559).
        let e = STANDARD_GRAVITY_M_S2 * AIR_MOLAR_MASS_KG_MOL
            / (USSA1976_GAS_CONSTANT_J_MOL_K * TROPOSPHERE_LAPSE_RATE_K_M);
        assert!((e - 5.25588).abs() < 1e-5, "{e}");
    }

    #[test]
    fn out_of_range_and_nan_are_errors() {
        assert!(barometric_pressure_pa(-5000.1).is_err());
        assert!(barometric_pressure_pa(11000.1).is_err());
        assert!(barometric_pressure_pa(f64::NAN).is_err());
        assert!(barometric_pressure_pa(f64::NEG_INFINITY).is_err());
        assert!(barometric_pressure_pa(-5000.0).is_ok());
        assert!(barometric_pressure_pa(11000.0).is_ok());
    }

    #[test]
    fn geopotential_round_trip() {
        for z in [-5000.0, 0.0, 1234.5, 11000.0] {
            assert!((geometric_elevation_m(geopotential_altitude_m(z)) - z).abs() < 1e-9);
        }
    }
}
