//! Pipe friction: the Darcy friction factor over all flow regimes, the correlations it
//! is built from, and the Hazen–Williams method.
//!
//! [`darcy_friction_factor`] is what the system curve uses:
//! - Re <= 2000: laminar, f = 64/Re ([`laminar`]);
//! - Re >= 4000: Colebrook (1939), solved to convergence ([`colebrook`]);
//! - 2000 < Re < 4000: the *critical zone* that Moody (1944) leaves undefined. There the
//!   shape of Churchill's (1977) all-regime equation is used, multiplied by a correction
//!   factor whose logarithm runs linearly in ln Re from f_laminar/f_Churchill at Re 2000
//!   to f_Colebrook/f_Churchill at Re 4000 ([`transitional_friction_factor`]). The result
//!   meets 64/Re at 2000 and Colebrook at 4000 exactly (so f is continuous in Re),
//!   follows a published transition shape in between, and keeps f·Re² (hence head loss at
//!   fixed pipe and fluid) increasing with flow, which the system curve needs.
//!   Churchill's own equation is within about 3 % of both ends for eps/D <= 0.05, so the
//!   correction is small (tests check it stays within 5 %).

mod colebrook;
mod explicit;
mod hazen_williams;

pub use colebrook::{
    colebrook, colebrook_slope, colebrook_warm, solve_colebrook, von_karman_fully_rough,
    ColebrookSolution,
};
pub use explicit::{churchill_1977, haaland_1983, laminar, swamee_jain_1976};
pub use hazen_williams::{
    hazen_williams_head_loss_m, hazen_williams_psi_per_ft, hazen_williams_remarks,
    hazen_williams_validity, HazenWilliamsRemark, HAZEN_WILLIAMS_SI_CONSTANT,
    HAZEN_WILLIAMS_US_CONSTANT, HW_MAX_VELOCITY, HW_MIN_DIAMETER, HW_TEMPERATURE_RANGE_K,
};

use std::fmt;

/// Highest Reynolds number treated as laminar (common practice; Moody 1944 chart).
pub const LAMINAR_LIMIT_RE: f64 = 2000.0;
/// Lowest Reynolds number treated as fully turbulent (common practice; Moody 1944 chart).
pub const TURBULENT_LIMIT_RE: f64 = 4000.0;
/// Largest relative roughness on Moody's (1944) chart; beyond it a warning is given.
pub const MOODY_MAX_RELATIVE_ROUGHNESS: f64 = 0.05;
/// Largest Reynolds number on Moody's (1944) chart; beyond it a warning is given.
pub const MOODY_MAX_RE: f64 = 1e8;

/// Label for the correlation used in the laminar regime.
pub const LAMINAR_NAME: &str = "laminar 64/Re (Hagen-Poiseuille)";
/// Label for the correlation used in the transitional regime.
pub const TRANSITIONAL_NAME: &str =
    "Churchill (1977) shape scaled to 64/Re at Re 2000 and Colebrook at Re 4000";
/// Label for the correlation used in the turbulent regime.
pub const TURBULENT_NAME: &str = "Colebrook-White (1939)";
/// Label returned with a NaN friction factor for inputs without a meaning.
pub const INVALID_NAME: &str = "invalid input";

/// Flow regime by Reynolds number.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FlowRegime {
    /// Re <= 2000.
    Laminar,
    /// 2000 < Re < 4000.
    Transitional,
    /// Re >= 4000.
    Turbulent,
}

/// A Darcy friction factor with the regime and the correlation that produced it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Friction {
    /// Darcy (Moody) friction factor, dimensionless.
    pub f: f64,
    /// Regime the Reynolds number falls in.
    pub regime: FlowRegime,
    /// Name of the correlation used, for reports.
    pub correlation: &'static str,
}

/// A friction-factor request that has no answer.
#[derive(Clone, Debug, PartialEq)]
pub struct FrictionError {
    /// Human-readable explanation naming the offending values.
    pub message: String,
}

impl FrictionError {
    /// Builds an error from any message.
    pub fn new(message: impl Into<String>) -> Self {
        Self {
            message: message.into(),
        }
    }

    pub(crate) fn invalid(re: f64, rr: f64) -> Self {
        Self::new(format!(
            "friction factor needs a finite Reynolds number > 0 and a finite relative \
             roughness >= 0; got Re = {re}, eps/D = {rr}"
        ))
    }
}

impl fmt::Display for FrictionError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for FrictionError {}

/// True when `re` and `rr` are inside every correlation's mathematical domain
/// (finite, Re > 0, eps/D >= 0).
pub(crate) fn valid_inputs(re: f64, rr: f64) -> bool {
    re.is_finite() && re > 0.0 && rr.is_finite() && rr >= 0.0
}

/// Regime for a Reynolds number (2000 / 4000 limits, common practice).
pub fn flow_regime(re: f64) -> FlowRegime {
    if re <= LAMINAR_LIMIT_RE {
        FlowRegime::Laminar
    } else if re < TURBULENT_LIMIT_RE {
        FlowRegime::Transitional
    } else {
        FlowRegime::Turbulent
    }
}

/// Darcy friction factor for any Re > 0 and relative roughness eps/D >= 0: laminar
/// 64/Re up to Re 2000, Colebrook (1939) from Re 4000, and the continuous Churchill-shaped
/// bridge of [`transitional_friction_factor`] in between (see the module documentation).
///
/// For inputs without a meaning (non-finite, Re <= 0, eps/D < 0, eps/D >= 3.7) the result
/// has `f = NaN` and `correlation == INVALID_NAME`; use [`checked_darcy_friction_factor`]
/// for an error, and [`friction_warnings`] for validity-range warnings.
pub fn darcy_friction_factor(re: f64, relative_roughness: f64) -> Friction {
    checked_darcy_friction_factor(re, relative_roughness).unwrap_or(Friction {
        f: f64::NAN,
        regime: flow_regime(re),
        correlation: INVALID_NAME,
    })
}

/// As [`darcy_friction_factor`], returning an error instead of NaN.
pub fn checked_darcy_friction_factor(re: f64, rr: f64) -> Result<Friction, FrictionError> {
    if !valid_inputs(re, rr) {
        return Err(FrictionError::invalid(re, rr));
    }
    let regime = flow_regime(re);
    let (f, correlation) = match regime {
        FlowRegime::Laminar => {
            // Colebrook's domain limit applies to every regime so the answer does not
            // depend on the flow for an impossible roughness.
            if rr >= 3.7 {
                return Err(FrictionError::new(format!(
                    "relative roughness {rr} is not physical (Colebrook needs eps/D < 3.7)"
                )));
            }
            (laminar(re), LAMINAR_NAME)
        }
        FlowRegime::Transitional => (
            kept(re, rr, || transitional_friction_factor(re, rr))?,
            TRANSITIONAL_NAME,
        ),
        FlowRegime::Turbulent => (
            kept(re, rr, || solve_colebrook(re, rr, None).map(|s| s.f))?,
            TURBULENT_NAME,
        ),
    };
    if !f.is_finite() {
        return Err(FrictionError::new(format!(
            "friction factor overflows at Re = {re:e} (64/Re exceeds the largest number)"
        )));
    }
    Ok(Friction {
        f,
        regime,
        correlation,
    })
}

/// dF/dRe of [`darcy_friction_factor`] at (re, eps/D = rr), 1/(unit of Re), given the
/// `friction` it returned there: laminar d(64/Re)/dRe = -f/Re; Colebrook by implicit
/// differentiation ([`colebrook_slope`]); in the critical zone a central difference of
/// [`transitional_friction_factor`] with a step of 1e-6 Re (the bridge has no simple closed
/// derivative, and the zone is rarely met). NaN where the friction factor is NaN.
pub fn darcy_friction_slope(re: f64, rr: f64, friction: &Friction) -> f64 {
    match friction.regime {
        FlowRegime::Laminar => -friction.f / re,
        FlowRegime::Turbulent => colebrook_slope(re, rr, friction.f),
        FlowRegime::Transitional => {
            let h = re * 1e-6;
            match (
                transitional_friction_factor(re + h, rr),
                transitional_friction_factor(re - h, rr),
            ) {
                (Ok(up), Ok(down)) => (up - down) / (2.0 * h),
                _ => f64::NAN,
            }
        }
    }
}

/// The transitional bridge for 2000 <= Re <= 4000:
/// f = f_Ch(Re) · c_2000^(1-w) · c_4000^w, w = ln(Re/2000) / ln 2,
/// c_2000 = (64/2000) / f_Ch(2000), c_4000 = f_Colebrook(4000) / f_Ch(4000),
/// with f_Ch from Churchill (1977) ([`churchill_1977`]).
///
/// This is an interpolation in the critical zone, not a physical model: flow there
/// alternates between laminar and turbulent (Moody 1944 shows no curve). It is chosen
/// because it is continuous with both neighbours, follows Churchill's published
/// transition shape, and keeps f·Re² increasing with Re. Outside 2000..4000 the bridge is
/// still evaluated (it extrapolates), but [`darcy_friction_factor`] only uses it inside.
pub fn transitional_friction_factor(re: f64, rr: f64) -> Result<f64, FrictionError> {
    if !valid_inputs(re, rr) {
        return Err(FrictionError::invalid(re, rr));
    }
    let (ln_c_low, ln_c_high) = bridge_ends(rr)?;
    let w = (re / LAMINAR_LIMIT_RE).ln() / (TURBULENT_LIMIT_RE / LAMINAR_LIMIT_RE).ln();
    let f = churchill_1977(re, rr) * ((1.0 - w) * ln_c_low + w * ln_c_high).exp();
    if f.is_finite() && f > 0.0 {
        Ok(f)
    } else {
        Err(FrictionError::new(format!(
            "transitional friction factor is not finite at Re {re}, eps/D {rr}"
        )))
    }
}

/// ln c_2000 and ln c_4000 of [`transitional_friction_factor`] for a relative roughness.
/// They depend on eps/D alone and cost a Colebrook solve and two Churchill evaluations,
/// so the last few are kept per thread (a network or a system curve evaluates the same
/// few pipes many times); a kept pair is the value the computation gives, bit for bit.
fn bridge_ends(rr: f64) -> Result<(f64, f64), FrictionError> {
    use std::cell::Cell;
    const SLOTS: usize = 16;
    thread_local! {
        static KEPT: [Cell<(u64, f64, f64)>; SLOTS] =
            const { [const { Cell::new((u64::MAX, 0.0, 0.0)) }; SLOTS] };
    }
    let key = rr.to_bits();
    // Fibonacci hashing of the bits picks the slot.
    let slot = (key.wrapping_mul(0x9E37_79B9_7F4A_7C15) >> 60) as usize % SLOTS;
    if let Some((lo, hi)) = KEPT.with(|k| {
        let (bits, lo, hi) = k[slot].get();
        (bits == key).then_some((lo, hi))
    }) {
        return Ok((lo, hi));
    }
    let turbulent_end = solve_colebrook(TURBULENT_LIMIT_RE, rr, None)?.f;
    let ln_c_low = (laminar(LAMINAR_LIMIT_RE) / churchill_1977(LAMINAR_LIMIT_RE, rr)).ln();
    let ln_c_high = (turbulent_end / churchill_1977(TURBULENT_LIMIT_RE, rr)).ln();
    KEPT.with(|k| k[slot].set((key, ln_c_low, ln_c_high)));
    Ok((ln_c_low, ln_c_high))
}

/// The friction factor at (Re, eps/D) from `solve`, or the one it gave there last: the
/// last few are kept per thread, keyed by the bits of both numbers, so a kept value is
/// the value the computation gives, bit for bit. The same pipe at the same flow in the
/// same fluid is often evaluated again (a case's systems that differ only in a level, a
/// head and the NPSH at one flow), and a Colebrook solve costs a power and several
/// logarithms. Errors are not kept.
fn kept(
    re: f64,
    rr: f64,
    solve: impl FnOnce() -> Result<f64, FrictionError>,
) -> Result<f64, FrictionError> {
    use std::cell::Cell;
    const SLOTS: usize = 64;
    thread_local! {
        static KEPT: [Cell<(u64, u64, f64)>; SLOTS] =
            const { [const { Cell::new((u64::MAX, u64::MAX, 0.0)) }; SLOTS] };
    }
    let (kr, ke) = (re.to_bits(), rr.to_bits());
    // Fibonacci hashing of both numbers' bits picks the slot.
    let hash = (kr ^ ke.rotate_left(29)).wrapping_mul(0x9E37_79B9_7F4A_7C15);
    let slot = (hash >> 58) as usize % SLOTS;
    if let Some(f) = KEPT.with(|k| {
        let (a, b, f) = k[slot].get();
        (a == kr && b == ke).then_some(f)
    }) {
        return Ok(f);
    }
    let f = solve()?;
    KEPT.with(|k| k[slot].set((kr, ke, f)));
    Ok(f)
}

/// Warnings for a friction-factor evaluation outside the ranges where the correlations
/// are established; empty when inside.
pub fn friction_warnings(re: f64, rr: f64) -> Vec<String> {
    let mut warnings = Vec::new();
    if !valid_inputs(re, rr) {
        warnings.push(FrictionError::invalid(re, rr).message);
        return warnings;
    }
    if flow_regime(re) == FlowRegime::Transitional {
        warnings.push(format!(
            "Re = {re:.0} is in the critical zone 2000-4000 where the friction factor is \
             uncertain (Moody 1944); an interpolated value is used"
        ));
    }
    if re > MOODY_MAX_RE {
        warnings.push(format!(
            "Re = {re:.3e} is beyond the 1e8 of Moody's (1944) chart and of the Colebrook \
             data"
        ));
    }
    if rr > MOODY_MAX_RELATIVE_ROUGHNESS {
        warnings.push(format!(
            "relative roughness {rr} is beyond the 0.05 of Moody's (1944) chart; \
             Colebrook is extrapolated"
        ));
    }
    warnings
}

#[cfg(test)]
mod tests {
    use super::*;

    const ROUGHNESSES: [f64; 7] = [0.0, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 0.05];

    #[test]
    fn regimes_and_labels() {
        let f = darcy_friction_factor(1500.0, 1e-3);
        assert_eq!(
            (f.regime, f.correlation),
            (FlowRegime::Laminar, LAMINAR_NAME)
        );
        let f = darcy_friction_factor(3000.0, 1e-3);
        assert_eq!(f.regime, FlowRegime::Transitional);
        let f = darcy_friction_factor(4000.0, 1e-3);
        assert_eq!(
            (f.regime, f.correlation),
            (FlowRegime::Turbulent, TURBULENT_NAME)
        );
    }

    #[test]
    fn slope_in_every_regime_matches_a_difference_quotient() {
        for &re in &[500.0, 1999.0, 2500.0, 3900.0, 4100.0, 1e5, 1e7] {
            for rr in ROUGHNESSES {
                let fr = darcy_friction_factor(re, rr);
                let h = re * 1e-5;
                let numeric = (darcy_friction_factor(re + h, rr).f
                    - darcy_friction_factor(re - h, rr).f)
                    / (2.0 * h);
                let analytic = darcy_friction_slope(re, rr, &fr);
                assert!(
                    (analytic - numeric).abs() <= 1e-5 * fr.f / re,
                    "Re {re} rr {rr}: {analytic} vs {numeric}"
                );
            }
        }
    }

    #[test]
    fn bridge_is_continuous_at_both_ends() {
        for rr in ROUGHNESSES {
            let below = darcy_friction_factor(2000.0, rr).f;
            let above = darcy_friction_factor(2000.0 * (1.0 + 1e-12), rr).f;
            assert!((above / below - 1.0).abs() < 1e-9, "rr {rr} at 2000");
            let below = darcy_friction_factor(4000.0 * (1.0 - 1e-12), rr).f;
            let above = darcy_friction_factor(4000.0, rr).f;
            assert!((above / below - 1.0).abs() < 1e-9, "rr {rr} at 4000");
        }
    }

    #[test]
    fn bridge_correction_to_churchill_is_small() {
        for rr in ROUGHNESSES {
            for i in 0..=40 {
                let re = 2000.0 * 2f64.powf(f64::from(i) / 40.0);
                let ratio =
                    transitional_friction_factor(re, rr).expect("ok") / churchill_1977(re, rr);
                assert!((ratio - 1.0).abs() < 0.05, "rr {rr} Re {re}: {ratio}");
            }
        }
    }

    #[test]
    fn head_loss_rises_with_flow_through_every_regime() {
        // At fixed pipe and fluid, h_f is proportional to f Re^2.
        for rr in ROUGHNESSES.iter().copied().chain([0.2, 1.0]) {
            let mut previous = 0.0;
            for i in 0..=4000 {
                let re = 10f64.powf(1.0 + 7.0 * f64::from(i) / 4000.0);
                let f = darcy_friction_factor(re, rr).f;
                let loss = f * re * re;
                assert!(loss > previous, "rr {rr}: f Re^2 fell at Re {re}");
                previous = loss;
            }
        }
    }

    #[test]
    fn kept_values_are_the_computed_ones_to_the_bit() {
        // Many (Re, eps/D) pairs, more than the slots, each asked twice in two orders:
        // every answer is the fresh solve's (Colebrook) or bridge's value.
        let pairs: Vec<(f64, f64)> = (0..200)
            .map(|i| (2500.0 + 997.0 * i as f64, 1e-5 * (1 + i % 7) as f64))
            .collect();
        for round in 0..2 {
            for &(re, rr) in pairs.iter().rev().skip(round) {
                let kept = checked_darcy_friction_factor(re, rr).unwrap().f;
                let fresh = match flow_regime(re) {
                    FlowRegime::Turbulent => colebrook::solve_colebrook(re, rr, None).unwrap().f,
                    _ => transitional_friction_factor(re, rr).unwrap(),
                };
                assert_eq!(kept.to_bits(), fresh.to_bits(), "Re {re}, eps/D {rr}");
            }
        }
    }

    #[test]
    fn invalid_inputs() {
        for (re, rr) in [
            (0.0, 0.0),
            (-1.0, 0.0),
            (f64::NAN, 0.0),
            (1e5, -1e-3),
            (1e5, 3.7),
        ] {
            assert!(checked_darcy_friction_factor(re, rr).is_err(), "{re} {rr}");
            let f = darcy_friction_factor(re, rr);
            assert!(f.f.is_nan() && f.correlation == INVALID_NAME);
        }
        assert!(checked_darcy_friction_factor(100.0, 3.7).is_err());
        assert_eq!(friction_warnings(f64::NAN, 0.0).len(), 1);
    }

    #[test]
    fn warnings_name_the_limit() {
        assert!(friction_warnings(1e5, 1e-3).is_empty());
        assert!(friction_warnings(3000.0, 1e-3)[0].contains("critical zone"));
        assert!(friction_warnings(2e8, 1e-3)[0].contains("1e8"));
        assert!(friction_warnings(1e5, 0.1)[0].contains("0.05"));
    }
}
