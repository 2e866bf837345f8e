//! Power and energy: hydraulic, shaft and input power, annual energy, energy cost and
//! its present worth over a service life.
//!
//! Life-cycle framing: the energy term of a pump's life-cycle cost as set out in
//! Hydraulic Institute and Europump, *Pump Life Cycle Costs: A Guide to LCC Analysis for
//! Pumping Systems* (2001): annual energy cost brought to present value over the life.
//! Present-worth factor of a uniform series, P/A = ((1+i)^N − 1)/(i·(1+i)^N), as tabulated
//! in engineering-economics texts (e.g. Newnan, Eschenbach and Lavelle, *Engineering
//! Economic Analysis*, Oxford University Press, compound interest tables — from memory).
//!
//! Energies are returned in joules (SI). 1 kWh = 3.6 × 10⁶ J exactly.

use super::{require_non_negative, require_positive, PumpError};

/// Standard acceleration of gravity g_n = 9.806 65 m/s² (3rd CGPM, 1901; NIST SP 330,
/// 2019 edition, as a defined value).
pub const STANDARD_GRAVITY: f64 = 9.80665;

/// Joules per kilowatt-hour (exact).
pub const JOULES_PER_KWH: f64 = 3.6e6;

/// Hydraulic (water) power P_h = ρ·g·Q·H in W, with g = [`STANDARD_GRAVITY`].
/// Density in kg/m³, flow in m³/s, head in m. Valid for any liquid whose head is stated
/// in metres of that liquid.
pub fn hydraulic_power_w(density: f64, flow: f64, head: f64) -> f64 {
    density * STANDARD_GRAVITY * flow * head
}

/// Shaft power = hydraulic power / pump efficiency (common practice; the definition of
/// pump efficiency). Errors unless 0 < efficiency ≤ 1 and the power is finite and ≥ 0.
pub fn shaft_power_w(hydraulic_power_w: f64, pump_efficiency: f64) -> Result<f64, PumpError> {
    require_non_negative("hydraulic power (W)", hydraulic_power_w)?;
    check_efficiency("pump efficiency", pump_efficiency)?;
    Ok(hydraulic_power_w / pump_efficiency)
}

fn check_efficiency(name: &str, eta: f64) -> Result<(), PumpError> {
    if eta.is_finite() && eta > 0.0 && eta <= 1.0 {
        Ok(())
    } else {
        Err(PumpError::new(format!(
            "{name} must be a fraction above 0 and at most 1, got {eta}"
        )))
    }
}

/// Electrical input power: shaft power / motor efficiency, and further divided by the
/// variable-frequency drive efficiency when there is a drive. Errors for efficiencies
/// outside (0, 1] or an invalid shaft power.
pub fn motor_input_power_w(
    shaft_power_w: f64,
    motor_efficiency: f64,
    drive_efficiency: Option<f64>,
) -> Result<f64, PumpError> {
    require_non_negative("shaft power (W)", shaft_power_w)?;
    check_efficiency("motor efficiency", motor_efficiency)?;
    let motor_input = shaft_power_w / motor_efficiency;
    match drive_efficiency {
        None => Ok(motor_input),
        Some(eta) => {
            check_efficiency("drive efficiency", eta)?;
            Ok(motor_input / eta)
        }
    }
}

/// Annual energy in J from a constant input power (W) over `hours_per_year` hours:
/// E = P × hours × 3600 s.
pub fn annual_energy_j(input_power_w: f64, hours_per_year: f64) -> f64 {
    input_power_w * hours_per_year * 3600.0
}

/// Cost of an energy (J) at a price per kWh (any currency): E / 3.6e6 × price.
pub fn energy_cost(energy_j: f64, price_per_kwh: f64) -> f64 {
    energy_j / JOULES_PER_KWH * price_per_kwh
}

/// Present-worth factor P/A of a uniform annual series over `years` at interest `rate`
/// with the annual amount escalating at `escalation` per year.
///
/// With escalation the effective rate is i′ = (1 + i)/(1 + e) − 1 and
/// P/A = ((1+i′)^N − 1)/(i′·(1+i′)^N); i′ = 0 gives P/A = N (the limit). The convention:
/// the annual amount is stated at today's prices and grows by (1 + e) each year, the first
/// payment at the end of year 1. Fractional years are accepted (continuous formula).
/// Errors: rates at or below −100 %, negative or non-finite years.
pub fn present_worth_factor(rate: f64, escalation: f64, years: f64) -> Result<f64, PumpError> {
    if !(rate.is_finite() && rate > -1.0 && escalation.is_finite() && escalation > -1.0) {
        return Err(PumpError::new(format!(
            "interest rate and escalation must be finite and above -1 (-100 %), got {rate} and \
             {escalation}"
        )));
    }
    require_non_negative("life (years)", years)?;
    let i = (1.0 + rate) / (1.0 + escalation) - 1.0;
    if i.abs() < 1e-12 {
        return Ok(years);
    }
    let growth = (1.0 + i).powf(years);
    Ok((growth - 1.0) / (i * growth))
}

/// How the energy cost of a life is summed.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum LccMethod {
    /// N × annual cost, undiscounted.
    Simple,
    /// Present worth at an interest rate with energy-price escalation (fractions per year).
    Discounted {
        /// Interest (discount) rate per year.
        rate: f64,
        /// Energy price escalation per year.
        escalation: f64,
    },
}

/// Energy cost over a life of `years`: simple (N × annual) or discounted (annual ×
/// [`present_worth_factor`]). Errors for a negative or non-finite annual cost or years,
/// and as [`present_worth_factor`].
pub fn life_cycle_energy_cost(
    annual_cost: f64,
    years: f64,
    method: LccMethod,
) -> Result<f64, PumpError> {
    require_non_negative("annual energy cost", annual_cost)?;
    require_non_negative("life (years)", years)?;
    match method {
        LccMethod::Simple => Ok(annual_cost * years),
        LccMethod::Discounted { rate, escalation } => {
            Ok(annual_cost * present_worth_factor(rate, escalation, years)?)
        }
    }
}

/// Specific energy of pumping, J per m³ delivered, at input power P (W) and flow Q (m³/s).
pub fn specific_energy_j_per_m3(input_power_w: f64, flow: f64) -> Result<f64, PumpError> {
    require_non_negative("input power (W)", input_power_w)?;
    require_positive("flow (m3/s)", flow)?;
    Ok(input_power_w / flow)
}
