//! A pump curve at another speed and/or a trimmed impeller diameter.
//!
//! **Speed (exact similarity).** For one pump at speeds N₁ and N₂ the affinity
//! (similarity) laws give Q₂/Q₁ = N₂/N₁, H₂/H₁ = (N₂/N₁)², P₂/P₁ = (N₂/N₁)³ at
//! corresponding points, with efficiency unchanged. They follow from dimensional
//! analysis of geometrically and kinematically similar flows (Stepanoff, *Centrifugal
//! and Axial Flow Pumps*, 2nd ed., Wiley, 1957, ch. 5; Karassik et al., *Pump Handbook*,
//! 4th ed., McGraw-Hill, 2008, §2.1 — chapter numbers from memory). Validity: the
//! efficiency step-up/step-down with size and Reynolds number (Moody, Ackeret) is
//! **not** applied; below about half the published speed, holding efficiency equal is
//! optimistic (common practice, from memory) and a warning is given.
//!
//! **Impeller trim (approximate).** Cutting a radial impeller's outer diameter while
//! its outlet width stays the same is modelled by the "constant-width" trim law
//! Q ∝ D, H ∝ D², P ∝ D³ (outlet area ∝ D·b with b fixed, tip speed ∝ D; Karassik et al.
//! 2008; Gülich, *Centrifugal Pumps*, 2nd ed., Springer, 2010, §4.5 on impeller
//! trimming — from memory). It is an approximation of common practice, not a
//! similarity law. Validity, common practice (from memory): trims below about 80 % of the
//! published diameter, and any diameter above it, are not reliable; both give warnings.
//!
//! Combined: Q ∝ N·D, H ∝ N²·D², P ∝ N³·D³. Efficiency is held equal at corresponding
//! points. NPSHr is scaled with speed only, NPSHr ∝ N² at Q ∝ N (common practice; the
//! similarity exponent for suction performance is less certain), and is taken from the
//! base curve at the same flow for a trimmed impeller, since trimming the outer diameter
//! leaves the impeller eye unchanged (common practice).

use super::curves::PumpCurves;
use super::duty::brent;
use super::viscous::ViscousCorrection;
use super::{require_non_negative, require_positive, PumpError};

/// Trims below this fraction of the published diameter are flagged as unreliable
/// (common practice, from memory).
pub const TRIM_RELIABLE_MIN_RATIO: f64 = 0.8;
/// Speeds below this fraction of the published speed are flagged: equal efficiency is
/// optimistic there (common practice, from memory).
pub const SPEED_EFFICIENCY_WARN_RATIO: f64 = 0.5;

/// A pump's curves at another speed and/or impeller diameter (see the module docs).
#[derive(Clone, Debug, PartialEq)]
pub struct ScaledPump<'a> {
    base: &'a PumpCurves,
    speed_ratio: f64,
    diameter_ratio: f64,
    warnings: Vec<String>,
    viscous: Option<ViscousCorrection>,
}

impl<'a> ScaledPump<'a> {
    /// The base pump at `speed_ratio` × its speed and `diameter_ratio` × its diameter.
    /// Errors unless both ratios are positive finite numbers; out-of-range ratios give
    /// warnings ([`ScaledPump::warnings`]).
    pub fn new(
        base: &'a PumpCurves,
        speed_ratio: f64,
        diameter_ratio: f64,
    ) -> Result<Self, PumpError> {
        require_positive("speed ratio", speed_ratio)?;
        require_positive("impeller diameter ratio", diameter_ratio)?;
        let mut warnings = Vec::new();
        if speed_ratio > 1.0 + 1e-12 {
            warnings.push(format!(
                "speed {:.0} rpm is above the published {:.0} rpm: confirm the mechanical \
                 rating and the motor with the manufacturer",
                speed_ratio * base.speed_rpm,
                base.speed_rpm
            ));
        }
        if speed_ratio < SPEED_EFFICIENCY_WARN_RATIO {
            warnings.push(format!(
                "speed is {:.0} % of the published speed: efficiency is held equal by the \
                 affinity laws, which is optimistic this far down (common practice)",
                100.0 * speed_ratio
            ));
        }
        if diameter_ratio > 1.0 + 1e-12 {
            warnings.push(format!(
                "impeller diameter {:.1} % of the published curve's: the trim law is not \
                 reliable beyond the published diameter",
                100.0 * diameter_ratio
            ));
        } else if diameter_ratio < TRIM_RELIABLE_MIN_RATIO {
            warnings.push(format!(
                "impeller trimmed to {:.1} % of the published diameter: the trim law is not \
                 reliable below about {:.0} % (common practice)",
                100.0 * diameter_ratio,
                100.0 * TRIM_RELIABLE_MIN_RATIO
            ));
        }
        if (diameter_ratio - 1.0).abs() > 1e-12 {
            warnings.push(
                "trimmed impeller: efficiency held at the published curve's value (trimmed \
                 impellers usually lose some) and NPSHr taken from the published curve at the \
                 same flow"
                    .to_string(),
            );
        }
        Ok(Self {
            base,
            speed_ratio,
            diameter_ratio,
            warnings,
            viscous: None,
        })
    }

    /// This pump on a liquid of kinematic viscosity `kinematic_viscosity_m2_s` (m²/s): the
    /// water curve corrected by ANSI/HI 9.6.7 ([`ViscousCorrection`]) when its parameter B,
    /// at the water best-efficiency point `bep` of the base curve carried to this speed and
    /// diameter, exceeds 1; unchanged otherwise (or without a BEP, which B needs).
    pub fn on_liquid(mut self, kinematic_viscosity_m2_s: f64, bep: Option<&super::Bep>) -> Self {
        self.viscous = bep.and_then(|b| {
            ViscousCorrection::for_pump(
                kinematic_viscosity_m2_s,
                b.flow * self.flow_scale(),
                b.head * self.head_scale(),
                self.speed_rpm(),
            )
        });
        self
    }

    /// The viscosity correction applied to the water curve, if any.
    pub fn viscous(&self) -> Option<&ViscousCorrection> {
        self.viscous.as_ref()
    }

    /// The water-curve flow corresponding to the flow q on this liquid (q itself on water).
    fn water_flow(&self, q: f64) -> f64 {
        self.viscous.map_or(q, |v| v.water_flow(q))
    }

    /// The best-efficiency flow of the base curve's `bep_flow` (m³/s) carried to this
    /// speed, diameter and liquid.
    pub fn bep_flow(&self, bep_flow: f64) -> f64 {
        let q = bep_flow * self.flow_scale();
        self.viscous.map_or(q, |v| q * v.flow)
    }

    /// Same as [`ScaledPump::new`] without range warnings, for callers (curve families)
    /// that explain the scaling themselves. Ratios must already be validated.
    pub(crate) fn quiet(base: &'a PumpCurves, speed_ratio: f64, diameter_ratio: f64) -> Self {
        Self {
            base,
            speed_ratio,
            diameter_ratio,
            warnings: Vec::new(),
            viscous: None,
        }
    }

    /// The base pump at another speed (rpm).
    pub fn at_speed(base: &'a PumpCurves, speed_rpm: f64) -> Result<Self, PumpError> {
        require_positive("speed (rpm)", speed_rpm)?;
        Self::new(base, speed_rpm / base.speed_rpm, 1.0)
    }

    /// The base pump with its impeller trimmed to `diameter_m`; errors when the base
    /// curve has no stated diameter.
    pub fn at_diameter(base: &'a PumpCurves, diameter_m: f64) -> Result<Self, PumpError> {
        require_positive("impeller diameter (m)", diameter_m)?;
        let d0 = base.impeller_diameter_m.ok_or_else(|| {
            PumpError::new("the published curve states no impeller diameter to trim from")
        })?;
        Self::new(base, 1.0, diameter_m / d0)
    }

    /// The base curves.
    pub fn base(&self) -> &'a PumpCurves {
        self.base
    }
    /// N/N₀.
    pub fn speed_ratio(&self) -> f64 {
        self.speed_ratio
    }
    /// D/D₀.
    pub fn diameter_ratio(&self) -> f64 {
        self.diameter_ratio
    }
    /// Speed, rpm.
    pub fn speed_rpm(&self) -> f64 {
        self.speed_ratio * self.base.speed_rpm
    }
    /// Impeller diameter, m, when the base states one.
    pub fn impeller_diameter_m(&self) -> Option<f64> {
        self.base
            .impeller_diameter_m
            .map(|d| d * self.diameter_ratio)
    }
    /// Warnings about the validity of this scaling.
    pub fn warnings(&self) -> &[String] {
        &self.warnings
    }
    /// Flow factor N·D (ratios).
    pub fn flow_scale(&self) -> f64 {
        self.speed_ratio * self.diameter_ratio
    }
    /// Head factor (N·D)².
    pub fn head_scale(&self) -> f64 {
        self.flow_scale().powi(2)
    }
    /// Power factor (N·D)³.
    pub fn power_scale(&self) -> f64 {
        self.flow_scale().powi(3)
    }

    /// Head (m) at flow q (m³/s) on water: H(q) = (N·D)²·H₀(q/(N·D)).
    fn water_head(&self, q: f64) -> f64 {
        self.head_scale() * self.base.head.eval(q / self.flow_scale())
    }

    /// Head (m) at flow q (m³/s): the water head (N·D)²·H₀(q/(N·D)), on a viscous liquid
    /// C_H(Q_W)·H_W(Q_W) at the corresponding water flow Q_W = q/C_Q.
    pub fn eval_head(&self, q: f64) -> f64 {
        match &self.viscous {
            None => self.water_head(q),
            Some(v) => {
                let qw = v.water_flow(q);
                v.head_factor(qw) * self.water_head(qw)
            }
        }
    }

    /// dH/dq of the scaled curve (on a viscous liquid, of C_H(q/C_Q)·H_W(q/C_Q)).
    pub fn head_derivative(&self, q: f64) -> f64 {
        let water_slope =
            |q: f64| self.flow_scale() * self.base.head.derivative(q / self.flow_scale());
        match &self.viscous {
            None => water_slope(q),
            Some(v) => {
                let qw = v.water_flow(q);
                (v.head_factor_slope(qw) * self.water_head(qw)
                    + v.head_factor(qw) * water_slope(qw))
                    / v.flow
            }
        }
    }

    /// Efficiency (fraction) at q: η(q) = η₀(q/(N·D)), on a viscous liquid C_η·η_W(Q_W);
    /// `None` without efficiency data.
    pub fn eval_efficiency(&self, q: f64) -> Option<f64> {
        let eff = self.base.efficiency.as_ref()?;
        let qw = self.water_flow(q);
        let c_eta = self.viscous.map_or(1.0, |v| v.efficiency);
        Some(c_eta * eff.eval(qw / self.flow_scale()))
    }

    /// NPSHr (m) at q: N²·NPSHr₀(q/N) (speed scaling only; see the module docs); on a
    /// viscous liquid the water value at the corresponding water flow (not corrected).
    pub fn eval_npshr(&self, q: f64) -> Option<f64> {
        let n = self.base.npshr.as_ref()?;
        let qw = self.water_flow(q);
        Some(self.speed_ratio.powi(2) * n.eval(qw / self.speed_ratio))
    }

    /// Shaft power (W) at q from the published power curve: (N·D)³·P₀(q/(N·D)); on a
    /// viscous liquid P_W(Q_W)·C_Q·C_H/C_η (P = ρgQH/η with each factor applied).
    pub fn eval_shaft_power(&self, q: f64) -> Option<f64> {
        let p = self.base.shaft_power.as_ref()?;
        let qw = self.water_flow(q);
        let water = self.power_scale() * p.eval(qw / self.flow_scale());
        Some(match &self.viscous {
            None => water,
            Some(v) => water * v.flow * v.head_factor(qw) / v.efficiency,
        })
    }

    /// Head data domain carried to this speed, diameter and liquid, m³/s.
    pub fn domain(&self) -> (f64, f64) {
        let (lo, hi) = self.base.head.domain();
        let c_q = self.viscous.map_or(1.0, |v| v.flow);
        (lo * self.flow_scale() * c_q, hi * self.flow_scale() * c_q)
    }

    /// True when q lies outside the scaled head data domain.
    pub fn is_extrapolating(&self, q: f64) -> bool {
        self.base
            .head
            .is_extrapolating(self.water_flow(q) / self.flow_scale())
    }
}

/// The speed that makes a pump deliver a required duty, with its warnings.
#[derive(Clone, Debug, PartialEq)]
pub struct SpeedForDuty {
    /// Speed, rpm.
    pub speed_rpm: f64,
    /// Speed over the published speed.
    pub speed_ratio: f64,
    /// Validity remarks (above rated speed, extrapolated curve, low speed).
    pub warnings: Vec<String>,
}

fn check_duty(q_req: f64, h_req: f64) -> Result<(), PumpError> {
    require_non_negative("required flow (m3/s)", q_req)?;
    require_non_negative("required head (m)", h_req)
}

/// Speed (rpm) at which the pump delivers `q_req` (m³/s) against `h_req` (m), the
/// system head at that flow: solves r²·H₀(q_req/r) = h_req for the ratio
/// r ∈ [min_ratio, max_ratio] by [`brent`] (1e-12 relative, 200 iterations).
///
/// For a head curve that does not rise with flow the left side grows with r, so the
/// answer is unique. Errors: invalid numbers, and a duty the pump cannot reach within
/// the ratio range (the message gives the head available at both ends). Warnings: a
/// speed above the published one, a duty beyond the curve's end, a low speed.
pub fn speed_for_duty(
    base: &PumpCurves,
    q_req: f64,
    h_req: f64,
    min_ratio: f64,
    max_ratio: f64,
) -> Result<SpeedForDuty, PumpError> {
    check_duty(q_req, h_req)?;
    require_positive("minimum speed ratio", min_ratio)?;
    require_positive("maximum speed ratio", max_ratio)?;
    if min_ratio > max_ratio {
        return Err(PumpError::new(format!(
            "minimum speed ratio {min_ratio} exceeds the maximum {max_ratio}"
        )));
    }
    let head_at = |r: f64| r * r * base.head.eval(q_req / r);
    let (h_lo, h_hi) = (head_at(min_ratio), head_at(max_ratio));
    if h_hi < h_req {
        return Err(PumpError::new(format!(
            "even at {:.0} rpm ({:.0} % of the published speed) the pump gives {h_hi:.3} m at \
             {q_req:.6} m3/s, below the {h_req:.3} m required",
            max_ratio * base.speed_rpm,
            100.0 * max_ratio
        )));
    }
    if h_lo > h_req {
        return Err(PumpError::new(format!(
            "at the lowest allowed speed, {:.0} rpm, the pump already gives {h_lo:.3} m at \
             {q_req:.6} m3/s, above the {h_req:.3} m required",
            min_ratio * base.speed_rpm
        )));
    }
    let r = brent(|r| head_at(r) - h_req, min_ratio, max_ratio, 1e-12, 200)?;
    let scaled = ScaledPump::new(base, r, 1.0)?;
    let mut warnings = scaled.warnings().to_vec();
    if scaled.is_extrapolating(q_req) {
        warnings.push(format!(
            "the duty flow {q_req:.6} m3/s lies outside the published curve carried to {:.0} rpm \
             ({:.6} to {:.6} m3/s): extrapolated",
            scaled.speed_rpm(),
            scaled.domain().0,
            scaled.domain().1
        ));
    }
    Ok(SpeedForDuty {
        speed_rpm: r * base.speed_rpm,
        speed_ratio: r,
        warnings,
    })
}

/// Impeller diameter ratio D/D₀ ∈ [min_ratio, 1] at which the pump delivers `q_req`
/// against `h_req` by the constant-width trim law: solves d²·H₀(q_req/d) = h_req by
/// [`brent`]. Returns the ratio and warnings (trim below the reliable range, duty
/// beyond the curve end, efficiency held equal). Errors when the full diameter is
/// too small or even `min_ratio` gives too much head.
pub fn trim_for_duty(
    base: &PumpCurves,
    q_req: f64,
    h_req: f64,
    min_ratio: f64,
) -> Result<(f64, Vec<String>), PumpError> {
    check_duty(q_req, h_req)?;
    require_positive("minimum diameter ratio", min_ratio)?;
    if min_ratio > 1.0 {
        return Err(PumpError::new(format!(
            "minimum diameter ratio {min_ratio} is above 1: a trim cannot enlarge the impeller"
        )));
    }
    let head_at = |d: f64| d * d * base.head.eval(q_req / d);
    let (h_min, h_full) = (head_at(min_ratio), head_at(1.0));
    if h_full < h_req {
        return Err(PumpError::new(format!(
            "the full impeller gives {h_full:.3} m at {q_req:.6} m3/s, below the {h_req:.3} m \
             required: no trim can reach the duty"
        )));
    }
    if h_min > h_req {
        return Err(PumpError::new(format!(
            "trimmed to {:.0} % the impeller still gives {h_min:.3} m at {q_req:.6} m3/s, above \
             the {h_req:.3} m required",
            100.0 * min_ratio
        )));
    }
    let d = brent(|d| head_at(d) - h_req, min_ratio, 1.0, 1e-12, 200)?;
    let scaled = ScaledPump::new(base, 1.0, d)?;
    let mut warnings = scaled.warnings().to_vec();
    if scaled.is_extrapolating(q_req) {
        warnings.push(format!(
            "the duty flow {q_req:.6} m3/s lies outside the published curve carried to the \
             trimmed diameter ({:.6} to {:.6} m3/s): extrapolated",
            scaled.domain().0,
            scaled.domain().1
        ));
    }
    Ok((d, warnings))
}
