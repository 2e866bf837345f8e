//! Aqueous ethylene glycol and propylene glycol (secondary coolants of chilled-water,
//! heating and process loops).
//!
//! Source: Å. Melinder, *Properties of Secondary Working Fluids for Indirect Systems*,
//! 2nd ed., International Institute of Refrigeration (IIR), Paris, 2010: the polynomial
//! fits in mass fraction x and temperature T,
//!
//! f(x, T) = Σᵢ Σⱼ c_ij · (x − x_m)ʲ · (T − T_m)ⁱ
//!
//! for density, for ln(μ / mPa·s) and (in x only) for the freezing point, with the
//! means x_m, T_m of the fitted data. The coefficients below are Melinder's, as
//! transcribed in CoolProp's incompressible-liquid tables (MEG, MPG: x as a mass
//! fraction, T in K); `tests/reference/gen_glycol.py` evaluates that transcription
//! independently. Valid range of the transcription: mass fraction 0 to 0.60, and from
//! the freezing point of the mixture to 373.15 K. The source gives no vapour pressure
//! (callers use water's at the temperature, conservative since glycol lowers it).

use super::FluidError;

/// Which glycol is mixed with the water.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Glycol {
    /// Ethylene glycol (monoethylene glycol, MEG).
    Ethylene,
    /// Propylene glycol (monopropylene glycol, MPG).
    Propylene,
}

/// Lowest mass fraction accepted (water alone is `fluid water`).
pub const MIN_MASS_FRACTION: f64 = 0.0;
/// Highest mass fraction of the transcription's range.
pub const MAX_MASS_FRACTION: f64 = 0.60;
/// Highest temperature of the transcription's range, K.
pub const MAX_TEMPERATURE_K: f64 = 373.15;

/// Water's density at 20 °C for the volume-to-mass conversion, kg/m³ (IAPWS-IF97 at
/// 101.325 kPa: 998.21 kg/m³).
pub const WATER_DENSITY_20C: f64 = 998.21;

/// Melinder's fit of one glycol: means and coefficient rows (row i = power of T − T_m,
/// column j = power of x − x_m).
struct Fit {
    /// Mean mass fraction x_m of the fitted data.
    x_mean: f64,
    /// Mean temperature T_m of the fitted data, K.
    t_mean_k: f64,
    /// Freezing point coefficients in x − x_m, K.
    freeze: [f64; 6],
    /// Density coefficients, kg/m³.
    density: [[f64; 6]; 4],
    /// ln(μ / mPa·s) coefficients.
    ln_viscosity_mpa_s: [[f64; 6]; 4],
    /// Density of the pure glycol at 20 °C, kg/m³ (CRC Handbook of Chemistry and
    /// Physics, from memory), for the volume-to-mass conversion.
    pure_density_20c: f64,
}

const ETHYLENE: Fit = Fit {
    x_mean: 0.308462,
    t_mean_k: 304.878,
    freeze: [257.9, -80.8, -133.4, -72.93, 100.6, 11.4],
    density: [
        [1034.0, 131.1, 0.749, -106.2, -96.23, 489.1],
        [-0.4781, -0.6876, 0.7855, 1.229, -7.211, 0.0],
        [-2.692e-3, 4.805e-3, -3.995e-3, -1.153e-2, 0.0, 0.0],
        [4.725e-6, 1.690e-6, 4.982e-5, 0.0, 0.0, 0.0],
    ],
    ln_viscosity_mpa_s: [
        [0.4705, 2.471, 0.03328, 1.659, 3.089, -18.65],
        [-2.550e-2, -1.171e-2, 1.086e-2, 3.157e-3, 1.831e-2, 0.0],
        [1.782e-4, 1.052e-4, 1.051e-4, 4.063e-4, 0.0, 0.0],
        [-7.669e-7, -1.634e-6, -6.475e-6, 0.0, 0.0, 0.0],
    ],
    pure_density_20c: 1113.5,
};

const PROPYLENE: Fit = Fit {
    x_mean: 0.307031,
    t_mean_k: 305.8583,
    freeze: [259.9, -66.31, -109.4, -228.3, -340.9, 146.5],
    density: [
        [1018.0, 76.04, -24.98, -155.0, -113.1, 234.2],
        [-0.5406, -0.945, 0.27, 2.829, -2.221, 0.0],
        [-2.666e-3, 5.541e-3, -4.018e-3, -7.175e-3, 0.0, 0.0],
        [1.347e-5, -1.343e-5, 3.376e-5, 0.0, 0.0, 0.0],
    ],
    ln_viscosity_mpa_s: [
        [0.6837, 3.328, 0.5453, -3.9, -1.587, 35.64],
        [-3.045e-2, -3.984e-2, -8.6e-4, 0.1054, 4.475e-2, 0.0],
        [2.525e-4, 4.332e-4, -1.593e-4, -1.589e-3, 0.0, 0.0],
        [-1.399e-6, -1.86e-6, -4.465e-7, 0.0, 0.0, 0.0],
    ],
    pure_density_20c: 1036.1,
};

impl Glycol {
    fn fit(self) -> &'static Fit {
        match self {
            Glycol::Ethylene => &ETHYLENE,
            Glycol::Propylene => &PROPYLENE,
        }
    }

    /// The glycol's name in messages and the report ("ethylene glycol").
    pub fn name(self) -> &'static str {
        match self {
            Glycol::Ethylene => "ethylene glycol",
            Glycol::Propylene => "propylene glycol",
        }
    }
}

/// Σᵢ Σⱼ c_ij (x − x_m)ʲ (T − T_m)ⁱ, Melinder (2010).
fn poly(c: &[[f64; 6]; 4], dx: f64, dt: f64) -> f64 {
    c.iter().rev().fold(0.0, |acc, row| {
        acc * dt + row.iter().rev().fold(0.0, |a, ci| a * dx + ci)
    })
}

/// The mass fraction of a mixture given by volume fraction `phi` (volumes of glycol and
/// water before mixing, at 20 °C): x = φ·ρ_g / (φ·ρ_g + (1 − φ)·ρ_w), with the pure
/// glycol's density at 20 °C (CRC Handbook, from memory: ethylene glycol 1113.5,
/// propylene glycol 1036.1 kg/m³) and water's 998.21 kg/m³ (IAPWS-IF97).
pub fn mass_fraction_from_volume(glycol: Glycol, phi: f64) -> f64 {
    let g = phi * glycol.fit().pure_density_20c;
    g / (g + (1.0 - phi) * WATER_DENSITY_20C)
}

/// Freezing point of the mixture at mass fraction `x`, K (Melinder 2010; the
/// temperature at which ice first forms).
pub fn freezing_point_k(glycol: Glycol, x: f64) -> f64 {
    let fit = glycol.fit();
    let dx = x - fit.x_mean;
    fit.freeze.iter().rev().fold(0.0, |a, c| a * dx + c)
}

/// Checks `x` (mass fraction) and `t_k` against the transcription's range: 0 ≤ x ≤ 0.60
/// and freezing point ≤ T ≤ 373.15 K. The error names the bound.
pub fn check_range(glycol: Glycol, x: f64, t_k: f64) -> Result<(), FluidError> {
    if !(x.is_finite() && t_k.is_finite()) {
        return Err(FluidError::new(
            "the glycol fraction and temperature must be finite",
        ));
    }
    if !(MIN_MASS_FRACTION..=MAX_MASS_FRACTION).contains(&x) {
        return Err(FluidError::new(format!(
            "a {} mass fraction of {:.1} % is outside the correlation's range, 0 to {:.0} % by mass (Melinder 2010)",
            glycol.name(),
            x * 100.0,
            MAX_MASS_FRACTION * 100.0
        )));
    }
    let tf = freezing_point_k(glycol, x);
    if t_k < tf {
        return Err(FluidError::new(format!(
            "{:.1} °C is below the mixture's freezing point of {:.1} °C ({} at {:.1} % by mass, Melinder 2010)",
            t_k - 273.15,
            tf - 273.15,
            glycol.name(),
            x * 100.0
        )));
    }
    if t_k > MAX_TEMPERATURE_K {
        return Err(FluidError::new(format!(
            "{:.1} °C is above the correlation's range, which ends at 100 °C (Melinder 2010)",
            t_k - 273.15
        )));
    }
    Ok(())
}

/// Density (kg/m³) and dynamic viscosity (Pa·s) of the mixture at mass fraction `x`
/// and temperature `t_k` (K), Melinder (2010); an error outside [`check_range`].
pub fn glycol_properties(glycol: Glycol, x: f64, t_k: f64) -> Result<(f64, f64), FluidError> {
    check_range(glycol, x, t_k)?;
    let fit = glycol.fit();
    let (dx, dt) = (x - fit.x_mean, t_k - fit.t_mean_k);
    let density = poly(&fit.density, dx, dt);
    let viscosity = poly(&fit.ln_viscosity_mpa_s, dx, dt).exp() * 1e-3;
    Ok((density, viscosity))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pure_water_end_of_the_fit_is_near_water() {
        // At x = 0 the fit meets water: freezing at 273.15 K within 0.1 K, density
        // near 999.8 kg/m³ at 10 °C (IAPWS-IF97: 999.70), both from the fit's data.
        let tf = freezing_point_k(Glycol::Ethylene, 0.0);
        assert!((tf - 273.15).abs() < 0.2, "{tf}");
        let (rho, _) = glycol_properties(Glycol::Ethylene, 0.0, 283.15).unwrap();
        assert!((rho - 999.7).abs() < 2.0, "{rho}");
    }

    #[test]
    fn range_is_refused_with_the_bound() {
        let e = glycol_properties(Glycol::Propylene, 0.7, 280.0).unwrap_err();
        assert!(e.message.contains("60 %"), "{e}");
        let e = glycol_properties(Glycol::Ethylene, 0.3, 250.0).unwrap_err();
        assert!(e.message.contains("freezing point"), "{e}");
        let e = glycol_properties(Glycol::Ethylene, 0.3, 380.0).unwrap_err();
        assert!(e.message.contains("100 °C"), "{e}");
    }

    #[test]
    fn volume_fraction_is_more_glycol_by_mass_for_the_denser_glycol() {
        // 30 % by volume of ethylene glycol: 0.3·1113.5/(0.3·1113.5 + 0.7·998.21) = 0.3235.
        let x = mass_fraction_from_volume(Glycol::Ethylene, 0.30);
        assert!((x - 0.3235).abs() < 5e-4, "{x}");
    }
}
