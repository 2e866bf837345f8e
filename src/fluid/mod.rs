//! Fluid properties: liquid water from IAPWS-IF97, glycol-water mixtures from
//! Melinder (2010), and barometric pressure from the U.S. Standard Atmosphere 1976.
//!
//! All quantities are SI (K, Pa, kg/m^3, Pa·s).

pub mod atmosphere;
pub mod glycol;
pub mod water;

pub use atmosphere::barometric_pressure_pa;
pub use water::{saturation_pressure_pa, water, water_bulk_modulus_pa, water_state, WaterState};

use std::fmt;

/// The liquid properties the hydraulic engine needs for one fluid state.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LiquidProperties {
    /// Density, kg/m^3.
    pub density_kg_m3: f64,
    /// Dynamic viscosity, Pa·s.
    pub dynamic_viscosity_pa_s: f64,
    /// Vapour (saturation) pressure at the fluid temperature, Pa (absolute).
    pub vapor_pressure_pa: f64,
}

impl LiquidProperties {
    /// Kinematic viscosity, m^2/s (dynamic viscosity over density).
    pub fn kinematic_viscosity_m2_s(&self) -> f64 {
        self.dynamic_viscosity_pa_s / self.density_kg_m3
    }
}

/// A fluid-property request that cannot be answered (state outside the
/// formulation's range, not a liquid, or a non-finite input).
#[derive(Clone, Debug, PartialEq)]
pub struct FluidError {
    /// Human-readable explanation, naming the offending value and the valid range.
    pub message: String,
}

impl FluidError {
    /// Builds an error from any message.
    pub fn new(message: impl Into<String>) -> Self {
        Self {
            message: message.into(),
        }
    }
}

impl fmt::Display for FluidError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for FluidError {}
