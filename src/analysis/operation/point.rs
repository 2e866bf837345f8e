//! One pump set at one load point with a given number of pumps running: speed, per-pump
//! flow and head, efficiency, NPSH, and the power chain shaft → motor → drive → supply.
//!
//! Affinity scaling (Q ∝ N, H ∝ N², P ∝ N³) keeps the pump's efficiency at corresponding
//! points equal to the published value (`pumps::affinity`); no reduced-speed efficiency
//! correction is applied, which is optimistic well below rated speed (common practice).
//! Shaft power per pump P_s = ρ·g·Q_p·H_p/η_p; motor efficiency η_m = η_FL · r(x) with
//! x = P_s / rating and r the typical part-load ratio (`pumps::part_load`), or the
//! design's own table η_m(x); drive losses from the drive part-load table scaled to its
//! full-load efficiency, or the design's losses at the IEC 61800-9-2 points at the
//! motor's speed and torque (P_s/P_rated)/(N/N_rated); input
//! power = Σ (P_s/η_m + drive losses). Wire-to-water efficiency = ρ·g·Q·H_set / input,
//! with H_set the head the running set develops (DOE/Hydraulic Institute usage).

use crate::analysis::{CaseSystem, G};
use crate::message::{self, against, flow, Kind, Message};
use crate::pumps::part_load::{self, DriveLosses};
use crate::pumps::{brent, PumpCurves, ScaledPump};

/// How the set's speed may move.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum SpeedRange {
    /// Variable-frequency drive between these fractions of the published speed.
    Variable {
        /// Lowest speed, fraction of the published speed.
        min: f64,
        /// Highest speed, fraction of the published speed.
        max: f64,
    },
    /// Fixed at this fraction of the published speed.
    Fixed(f64),
}

/// The fixed data of one candidate for the profile: its evaluated curve, how many
/// pumps it has, its motor and drive.
#[derive(Clone, Debug)]
pub struct SetModel<'a> {
    /// The evaluated published curve (before trim and speed change).
    pub base: &'a PumpCurves,
    /// Impeller diameter ratio to `base`.
    pub trim: f64,
    /// Best-efficiency flow of `base` at its own speed, m³/s (before trim).
    pub bep_flow: Option<f64>,
    /// Best-efficiency point of `base` (for the viscosity correction's parameter B).
    pub bep: Option<crate::pumps::Bep>,
    /// Kinematic viscosity of the liquid, m²/s, when it is not water: the curve is then
    /// corrected by ANSI/HI 9.6.7 as in the duty solve ([`SetModel::on_liquid`]).
    pub liquid_viscosity: Option<f64>,
    /// Duty pumps of a parallel set (1 otherwise).
    pub parallel: u32,
    /// Pumps in series (1 otherwise).
    pub series: u32,
    /// How the set's speed may move.
    pub speed: SpeedRange,
    /// Motor nameplate per pump, W, and its full-load efficiency (fraction).
    pub motor_rating_w: f64,
    /// Motor full-load efficiency (fraction).
    pub motor_full_load_efficiency: f64,
    /// The drive of each pump, when on variable speed.
    pub drive: Option<DriveLosses>,
    /// The design's motor table (load fraction, efficiency), used instead of the
    /// typical part-load curve when given.
    pub motor_table: Option<Vec<(f64, f64)>>,
}

/// The state of a running set at one load point.
#[derive(Clone, Debug, PartialEq)]
pub struct SetState {
    /// Pumps running in parallel.
    pub running: u32,
    /// Speed as a fraction of the published speed, and in rpm.
    pub speed_ratio: f64,
    /// Speed, rpm.
    pub speed_rpm: f64,
    /// Total flow, m³/s, and per pump.
    pub flow: f64,
    /// Flow per pump, m³/s.
    pub flow_per_pump: f64,
    /// Head each pump develops, m, and the system head at the flow, m.
    pub head_per_pump: f64,
    /// System head at the total flow, m.
    pub system_head: f64,
    /// Head the set develops above what the line needs (taken by a valve or the
    /// consumers), m.
    pub surplus_head: f64,
    /// Pump efficiency (fraction); `None` without efficiency data.
    pub efficiency: Option<f64>,
    /// Flow per pump over the best-efficiency flow at this speed and trim.
    pub bep_ratio: Option<f64>,
    /// NPSH available and required, m.
    pub npsh_available: f64,
    /// NPSH required at the flow per pump, m; `None` without NPSH data.
    pub npsh_required: Option<f64>,
    /// Shaft power of all running pumps, W.
    pub shaft_power: f64,
    /// Shaft power per pump over the motor nameplate.
    pub motor_load: f64,
    /// Motor efficiency at that load (fraction).
    pub motor_efficiency: f64,
    /// Drive efficiency at its load (1 without a drive).
    pub drive_efficiency: f64,
    /// Drive losses of all running pumps, W.
    pub drive_losses: f64,
    /// Electrical input of all running pumps while running, W.
    pub input_power: f64,
    /// ρ·g·Q·H of the set while running, W.
    pub hydraulic_power: f64,
    /// The speed is at its minimum and the surplus is throttled.
    pub at_min_speed: bool,
    /// The control curve lay below the system curve here (the set gives the system head).
    pub below_system_curve: bool,
}

/// What the system gives at one total flow, shared by every running count of a load
/// point: the system head and the common suction piping's loss (with a well's drawdown),
/// from one evaluation of the system's losses instead of one per count and use.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct AtFlow {
    /// Total flow, m³/s.
    pub flow: f64,
    /// System head at the flow, m: bit for bit [`CaseSystem::head`].
    pub system_head: f64,
    /// Common suction loss plus drawdown at the flow, m: what
    /// [`CaseSystem::npsh_available_per_pump`] adds the pump's own branch to.
    pub suction: f64,
}

impl AtFlow {
    /// The system at total flow `q` (m³/s), from one [`CaseSystem::losses`]: the sums are
    /// those of [`CaseSystem::head`] and [`CaseSystem::npsh_available_per_pump`], in
    /// their order, so every result is the same to the bit.
    pub fn new(sys: &CaseSystem, q: f64) -> AtFlow {
        let l = sys.losses(q);
        AtFlow {
            flow: q,
            system_head: sys.static_head + l.friction + l.minor + l.network + l.drawdown,
            suction: l.suction + l.drawdown,
        }
    }

    /// NPSH available of one pump carrying `qp` (m³/s), m, as
    /// [`CaseSystem::npsh_available_per_pump`] at this flow.
    fn npsh_available(&self, sys: &CaseSystem, qp: f64) -> f64 {
        sys.npsh_available_after(self.suction + sys.station_losses(qp).0)
    }
}

impl SetModel<'_> {
    /// The model on the liquid of `sys`: water leaves it as it is; another liquid's
    /// viscosity is kept so that every evaluation of the curve is corrected as
    /// [`crate::analysis::duty::pump_in_case`] corrects the duty's.
    pub fn on_liquid(&self, sys: &CaseSystem) -> Self {
        let mut m = self.clone();
        m.liquid_viscosity = (!sys.fluid.is_water()).then(|| sys.fluid.kinematic_viscosity());
        m
    }
}

/// The pump at speed ratio `r` with the model's trim, on the model's liquid.
fn scaled<'a>(m: &SetModel<'a>, r: f64) -> ScaledPump<'a> {
    let pump = ScaledPump::quiet(m.base, r, m.trim);
    match m.liquid_viscosity {
        Some(nu) => pump.on_liquid(nu, m.bep.as_ref()),
        None => pump,
    }
}

/// Speed ratio at which one pump gives `head` (m) at `qp` (m³/s) within `min..max`:
/// solves r²·H(qp/r) = head by Brent (1e-10, 100 iterations). `Ok(None)` when even the
/// minimum speed gives more (run at minimum speed, throttled).
fn speed_for(m: &SetModel, qp: f64, head: f64, min: f64, max: f64) -> Result<Option<f64>, Message> {
    let h = |r: f64| scaled(m, r).eval_head(qp);
    if h(max) < head {
        return Err(crate::message![
            "at its maximum speed one pump gives ",
            against(Kind::Head, h(max), head),
            " at ",
            flow(qp),
            ", below the ",
            message::head(head),
            " needed"
        ]);
    }
    if h(min) >= head {
        return Ok(None);
    }
    brent(|r| h(r) - head, min, max, 1e-10, 100)
        .map(Some)
        .map_err(|e| Message::text(e.message))
}

/// The set with `k` pumps running at total flow `q` (m³/s) against the system `sys`,
/// at the head `set_head` (m) a control asks for (`None`: fixed speed, throttled).
/// `Err` says why the point cannot be delivered.
pub fn evaluate(
    m: &SetModel,
    sys: &CaseSystem,
    k: u32,
    q: f64,
    set_head: Option<(f64, bool)>,
) -> Result<SetState, Message> {
    evaluate_at(m, sys, &AtFlow::new(sys, q), k, set_head)
}

/// [`evaluate`] with the system at the total flow already taken ([`AtFlow::new`]), so
/// that the counts of one load point share it.
pub fn evaluate_at(
    m: &SetModel,
    sys: &CaseSystem,
    at: &AtFlow,
    k: u32,
    set_head: Option<(f64, bool)>,
) -> Result<SetState, Message> {
    let q = at.flow;
    let k = k.clamp(1, m.parallel.max(1));
    let qp = q / k as f64;
    let ser = m.series.max(1) as f64;
    let system_head = at.system_head;
    let branch = sys.station_loss(qp);
    let (ratio, at_min, below) = match (m.speed, set_head) {
        (SpeedRange::Variable { min, max }, Some((h, below))) => {
            match speed_for(m, qp, h / ser + branch, min, max)? {
                Some(r) => (r, false, below),
                None => (min, true, below),
            }
        }
        (SpeedRange::Variable { max, .. }, None) => (1.0_f64.min(max), false, false),
        (SpeedRange::Fixed(r), _) => (r, false, false),
    };
    let pump = scaled(m, ratio);
    if qp > pump.domain().1 * (1.0 + 1e-9) {
        return Err(crate::message![
            pumps_running(k),
            " would each carry ",
            against(Kind::Flow, qp, pump.domain().1),
            ", beyond the published curve's end at ",
            flow(pump.domain().1)
        ]);
    }
    let head_per_pump = pump.eval_head(qp);
    if (head_per_pump - branch) * ser < system_head - 1e-6 {
        return Err(crate::message![
            pumps_running(k),
            " give ",
            against(Kind::Head, (head_per_pump - branch) * ser, system_head),
            " at ",
            flow(q),
            ", below the ",
            message::head(system_head),
            " the line needs"
        ]);
    }
    power_chain(m, sys, at, k, ratio, head_per_pump, at_min, below)
}

/// Efficiency, NPSH and the power chain of a set whose speed and head are known.
#[allow(clippy::too_many_arguments)]
fn power_chain(
    m: &SetModel,
    sys: &CaseSystem,
    at: &AtFlow,
    k: u32,
    ratio: f64,
    head_per_pump: f64,
    at_min_speed: bool,
    below_system_curve: bool,
) -> Result<SetState, Message> {
    let (q, system_head) = (at.flow, at.system_head);
    let pump = scaled(m, ratio);
    let qp = q / k as f64;
    let ser = m.series.max(1) as f64;
    let rho = sys.fluid.density;
    let efficiency = pump.eval_efficiency(qp).filter(|e| *e > 0.02);
    let shaft_per_pump = match efficiency {
        Some(e) => rho * G * qp * head_per_pump / e,
        None => pump
            .eval_shaft_power(qp)
            .ok_or_else(|| Message::text("the curve gives neither efficiency nor power here"))?,
    };
    let motor_load = shaft_per_pump / m.motor_rating_w;
    let motor_efficiency = match &m.motor_table {
        Some(t) => part_load::motor_efficiency_from_table(t, motor_load),
        None => {
            m.motor_full_load_efficiency
                * part_load::motor_part_load_ratio(m.motor_rating_w, motor_load)
        }
    };
    let motor_input = shaft_per_pump / motor_efficiency;
    // Motor torque as a fraction of rated: (P_s/P_rated)/(N/N_rated).
    let torque = motor_load / ratio.max(1e-6);
    let drive_losses = m
        .drive
        .map_or(0.0, |d| d.losses_at(motor_input, ratio, torque));
    let per_pump_input = motor_input + drive_losses;
    let running = k as f64 * ser;
    let hydraulic_power = rho * G * q * head_per_pump * ser;
    Ok(SetState {
        running: k,
        speed_ratio: ratio,
        speed_rpm: pump.speed_rpm(),
        flow: q,
        flow_per_pump: qp,
        head_per_pump,
        system_head,
        surplus_head: ((head_per_pump - sys.station_loss(qp)) * ser - system_head).max(0.0),
        efficiency,
        bep_ratio: m
            .bep_flow
            .map(|b| pump.bep_flow(b))
            .filter(|b| *b > 0.0)
            .map(|b| qp / b),
        npsh_available: at.npsh_available(sys, qp),
        npsh_required: pump.eval_npshr(qp),
        shaft_power: shaft_per_pump * running,
        motor_load,
        motor_efficiency,
        drive_efficiency: if drive_losses > 0.0 {
            motor_input / per_pump_input
        } else {
            1.0
        },
        drive_losses: drive_losses * running,
        input_power: per_pump_input * running,
        hydraulic_power,
        at_min_speed,
        below_system_curve,
    })
}

/// The set with `k` pumps running at fixed speed against `sys` at its duty point (the
/// crossing of the set's curve with the system curve), for on/off control. `Err` when
/// the curves do not meet within the published data.
pub fn full_flow(m: &SetModel, sys: &CaseSystem, k: u32) -> Result<SetState, Message> {
    let ratio = match m.speed {
        SpeedRange::Fixed(r) => r,
        SpeedRange::Variable { max, .. } => 1.0_f64.min(max),
    };
    let pump = scaled(m, ratio);
    let k = k.clamp(1, m.parallel.max(1));
    let q =
        crate::analysis::duty::meeting_flow(&pump, sys, (k as f64, m.series.max(1) as f64), None)
            .ok_or_else(|| {
            crate::message![
                pumps_running(k),
                " at fixed speed do not meet the system curve within the published data"
            ]
        })?;
    let h = pump.eval_head(q / k as f64);
    power_chain(m, sys, &AtFlow::new(sys, q), k, ratio, h, false, false)
}

/// "1 pump" or "k pumps": the count running, for messages.
fn pumps_running(k: u32) -> String {
    crate::numbers::count(k as usize, "pump", "pumps")
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::{check, NoFiles};

    #[test]
    fn at_flow_is_the_system_head_and_npsh_to_the_bit() {
        let src = include_str!("../../../examples-demo/orchard-lift-rev-a.duty");
        let design = check(src, &NoFiles).design.expect("the demo checks");
        for case in &design.cases {
            let sys = CaseSystem::new(&case.scenario).expect("system");
            for i in 0..=40 {
                let q = 0.12 * i as f64 / 40.0;
                let at = AtFlow::new(&sys, q);
                assert_eq!(at.system_head.to_bits(), sys.head(q).to_bits(), "q {q}");
                for k in 1..=3 {
                    let qp = q / k as f64;
                    let npsh = sys.npsh_available_per_pump(q, qp);
                    assert_eq!(at.npsh_available(&sys, qp).to_bits(), npsh.to_bits());
                }
            }
        }
    }
}
