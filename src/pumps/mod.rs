//! Pumps: curve fitting, affinity laws, curve families, arrangements, duty points,
//! motor selection and energy.
//!
//! Units (SI `f64` throughout, as in the rest of the engine): flow in m³/s, head and
//! NPSHr in m of the pumped liquid, power in W, impeller diameter in m, energy in J.
//! Speed is the one exception to SI: it is carried as **revolutions per minute** in an
//! `f64` (`speed_rpm`), because pump data sheets and the design language state speed
//! in rpm and the affinity laws only ever use speed *ratios*. Efficiencies are
//! fractions (0.77, not 77).
//!
//! Map of the module:
//! - [`curves`]: the published table ([`CurveTable`]), its fitted form ([`PumpCurves`])
//!   and the best efficiency point ([`best_efficiency_point`]).
//! - [`mod@fit`]: least-squares polynomials ([`lsq`]) and the Fritsch–Carlson monotone
//!   spline ([`spline`]) behind one [`FittedCurve`].
//! - [`affinity`]: the pump at another speed or trimmed diameter ([`ScaledPump`]),
//!   [`speed_for_duty`] and [`trim_for_duty`]; [`mod@family`] interpolates between several
//!   published curves.
//! - [`arrangement`]: identical pumps in parallel, in series, duty/standby.
//! - [`duty`]: the pump/system intersection ([`solve_duty`]) and Brent's root finder.
//! - [`motor`]: NEMA MG 1 and IEC 60072-1 standard ratings and motor selection;
//!   [`motor_efficiency`]: IE3 class efficiencies by rating and poles (IEC 60034-30-1).
//! - [`energy`]: hydraulic, shaft and input power; annual energy; present worth.
//! - [`stability`]: where a head curve rises with flow (unstable curves).
//! - [`tolerance`]: ISO 9906:2012 acceptance grades and the shifted curve of a pump within them.
//! - [`viscous`]: whether a viscous liquid needs the water curve corrected (ANSI/HI 9.6.7).

pub mod affinity;
pub mod arrangement;
pub mod curves;
pub mod duty;
pub mod energy;
pub mod family;
pub mod fit;
pub mod lsq;
pub mod motor;
pub mod motor_efficiency;
pub mod part_load;
pub mod spline;
pub mod stability;
pub mod tolerance;
pub mod viscous;

pub use affinity::{speed_for_duty, trim_for_duty, ScaledPump, SpeedForDuty};
pub use arrangement::{combined_head, ArrangedPump, Arrangement};
pub use curves::{best_efficiency_point, fit_table, Bep, CurveTable, PumpCurves};
pub use duty::{brent, solve_duty, solve_duty_scanned, DutyOutcome, PumpScan};
pub use energy::{
    annual_energy_j, energy_cost, hydraulic_power_w, life_cycle_energy_cost, motor_input_power_w,
    present_worth_factor, shaft_power_w, LccMethod, STANDARD_GRAVITY,
};
pub use family::{family, FamilyKind, FamilyPoint, PumpFamily};
pub use fit::{fit, FitMethod, FitResiduals, FittedCurve, Quantity};
pub use motor::{
    default_service_factor, motor_of_rating, select_motor, standard_ratings_w, MotorChoice,
    MotorStandard,
};
pub use viscous::{viscosity_parameter_b, viscosity_warning};

use std::fmt;

/// The one error type of the pumps module: a message that says what was wrong with
/// which input, with the numbers, ready to become a diagnostic.
#[derive(Clone, Debug, PartialEq)]
pub struct PumpError {
    /// Human-readable explanation, with the offending values.
    pub message: String,
}

impl PumpError {
    /// Builds an error from anything that turns into a message.
    pub fn new(message: impl Into<String>) -> Self {
        Self {
            message: message.into(),
        }
    }
}

impl fmt::Display for PumpError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for PumpError {}

/// Returns an error unless `value` is finite and strictly positive.
pub(crate) fn require_positive(name: &str, value: f64) -> Result<(), PumpError> {
    if value.is_finite() && value > 0.0 {
        Ok(())
    } else {
        Err(PumpError::new(format!(
            "{name} must be a finite number greater than zero, got {value}"
        )))
    }
}

/// Returns an error unless `value` is finite and not negative.
pub(crate) fn require_non_negative(name: &str, value: f64) -> Result<(), PumpError> {
    if value.is_finite() && value >= 0.0 {
        Ok(())
    } else {
        Err(PumpError::new(format!(
            "{name} must be a finite number of at least zero, got {value}"
        )))
    }
}
