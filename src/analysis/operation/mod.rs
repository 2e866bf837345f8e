//! Operation over the year: every candidate run through every load profile of the
//! design, with its control strategy and staging, part-load motor and drive
//! efficiency, the yearly energy and cost, the profile checks and the life-cycle cost.
//!
//! Phases: [`control`] (the head a strategy asks for), [`point`] (one set at one load
//! point), [`staging`] (how many pumps run), [`checks`] (across the profile), [`lcc`]
//! (life-cycle cost). A stage of its own above the engine; it reads the case systems,
//! fitted curves and motor sizing of the analysis and changes none of them.

pub mod checks;
pub mod control;
pub mod lcc;
pub mod point;
pub mod staging;

use super::checks::{Check, AOR};
use super::duty::{stages, CandidateCurves};
use super::motor::MotorSizing;
use super::{CaseResult, CaseSystem};
use crate::message::{against, flow, Kind, Message};
use crate::model::operation::{Control, LoadProfile};
use crate::model::{Adjust, Design, PumpCandidate};
use crate::pumps::part_load::DriveLosses;
use point::{SetModel, SetState, SpeedRange};

/// Halvings of the bracket around each switching point of a parallel set (2⁻¹² of the
/// gap between neighbouring load points).
pub const SWITCH_BISECTIONS: usize = 12;

/// One load point of one candidate.
#[derive(Clone, Debug, PartialEq)]
pub struct PointResult {
    /// The case whose system the point runs on.
    pub case: String,
    /// Demanded total flow, m³/s, and hours per year, h.
    pub flow: f64,
    /// Hours per year at the point, h.
    pub hours: f64,
    /// The running set (mid level band for on/off); `None` when not delivered.
    pub state: Option<SetState>,
    /// Why the point is not delivered.
    pub failure: Option<Message>,
    /// Share of the hours the set runs (1 for continuous control; Q/Q_run for on/off).
    pub duty_cycle: f64,
    /// On/off: worst starts per hour, Q_run/(4·V) (inflow half the pump flow).
    pub starts_per_hour: Option<f64>,
    /// Input energy per year at this point, J.
    pub energy_j: f64,
    /// Input energy per volume delivered, J/m³.
    pub specific_energy: Option<f64>,
    /// Hydraulic power of the set over its input power while running.
    pub wire_to_water: Option<f64>,
    /// Mean input power over the hours (W) by running count, or why that count fails.
    pub by_count: Vec<(u32, Result<f64, Message>)>,
}

/// Energy, cost and efficiency over a year.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Yearly {
    /// Input energy, J.
    pub energy_j: f64,
    /// Energy cost, currency per year (with a price).
    pub cost: Option<f64>,
    /// Volume delivered, m³, and the profile's hours, h.
    pub volume_m3: f64,
    /// Hours of all load points together, h.
    pub hours: f64,
    /// Σ hydraulic energy / Σ input energy.
    pub mean_wire_to_water: Option<f64>,
    /// Σ hydraulic energy / Σ shaft energy: the energy-weighted pump efficiency.
    pub mean_pump_efficiency: Option<f64>,
    /// Input energy per volume, J/m³.
    pub specific_energy: Option<f64>,
}

/// A control curve of one profile for the plots.
#[derive(Clone, Debug, PartialEq)]
pub struct ControlPlot {
    /// The case the profile runs on.
    pub case: String,
    /// The control the curve follows.
    pub control: Control,
    /// (flow m³/s, head m).
    pub points: Vec<(f64, f64)>,
}

/// One candidate over every profile.
#[derive(Clone, Debug, PartialEq)]
pub struct CandidateOperation {
    /// The candidate's name.
    pub name: String,
    /// The control each profile applied to this candidate (fixed-speed sets throttle
    /// or cycle on/off), in profile order.
    pub controls: Vec<Control>,
    /// Points of all profiles in design order.
    pub points: Vec<PointResult>,
    /// Where the running count changes, per profile case.
    pub switching: Vec<(String, Vec<staging::Switch>)>,
    /// Energy, cost and efficiency over the year.
    pub yearly: Yearly,
    /// The operation checks of this candidate.
    pub checks: Vec<Check>,
    /// Life-cycle cost, when the design gives a life and valid rates.
    pub lcc: Option<lcc::LifeCycleCost>,
    /// The control curves of the profiles, for the plots.
    pub control_plots: Vec<ControlPlot>,
    /// Why the candidate could not be run over the profile at all.
    pub failure: Option<String>,
    /// Motor rating per pump, W, and full-load efficiency used; drive on/off.
    pub motor_rating_w: f64,
    /// Motor full-load efficiency (fraction).
    pub motor_full_load_efficiency: f64,
    /// Whether the pumps run on a variable-speed drive.
    pub variable_speed: bool,
    /// Drive full-load efficiency (fraction), with a drive.
    pub drive_full_load_efficiency: Option<f64>,
    /// Speed range as fractions of the published speed, and the published speed, rpm.
    pub speed_range: (f64, f64),
    /// The published speed of the pump curves, rpm.
    pub published_speed_rpm: f64,
}

/// Run every candidate over the design's profiles; empty when the design has none.
pub fn analyse(
    design: &Design,
    cases: &[CaseResult],
    candidates: &[CandidateCurves],
    motors: &[Option<MotorSizing>],
) -> Vec<CandidateOperation> {
    if design.operation.profiles.is_empty() {
        return Vec::new();
    }
    // Candidates are independent: on every core, in the design's order.
    let indexed: Vec<(usize, &PumpCandidate)> = design.pumps.iter().enumerate().collect();
    crate::analysis::concurrent::map(&indexed, |&(i, p)| {
        candidate(
            design,
            cases,
            p,
            candidates.get(i),
            motors.get(i).and_then(|m| m.as_ref()),
        )
    })
}

fn empty(p: &PumpCandidate, why: String) -> CandidateOperation {
    CandidateOperation {
        name: p.name.clone(),
        controls: Vec::new(),
        points: Vec::new(),
        switching: Vec::new(),
        yearly: Yearly {
            energy_j: 0.0,
            cost: None,
            volume_m3: 0.0,
            hours: 0.0,
            mean_wire_to_water: None,
            mean_pump_efficiency: None,
            specific_energy: None,
        },
        checks: Vec::new(),
        lcc: None,
        control_plots: Vec::new(),
        failure: Some(why),
        motor_rating_w: 0.0,
        motor_full_load_efficiency: 0.0,
        variable_speed: false,
        drive_full_load_efficiency: None,
        speed_range: (1.0, 1.0),
        published_speed_rpm: 0.0,
    }
}

/// The set model of a candidate: its curve, counts, speed range, motor and drive.
fn set_model<'a>(
    design: &Design,
    p: &PumpCandidate,
    cc: &'a CandidateCurves,
    motor: &MotorSizing,
) -> Option<SetModel<'a>> {
    let (base, trim) = cc.evaluated.as_ref()?;
    let (parallel, series) = stages(p);
    let speed = match p.adjust {
        Adjust::Speed {
            min_ratio,
            max_ratio,
        } => SpeedRange::Variable {
            min: min_ratio,
            max: max_ratio,
        },
        _ => SpeedRange::Fixed(1.0),
    };
    let rating = motor.choice.rating_w;
    let drive = matches!(speed, SpeedRange::Variable { .. }).then(|| DriveLosses {
        declared: design.motor.drive_losses,
        ..DriveLosses::new(rating / motor.efficiency, design.motor.drive_efficiency)
    });
    Some(SetModel {
        base,
        trim: *trim,
        bep_flow: cc.evaluated_bep.map(|b| b.flow),
        bep: cc.evaluated_bep,
        liquid_viscosity: None,
        parallel,
        series,
        speed,
        motor_rating_w: rating,
        motor_full_load_efficiency: motor.efficiency,
        drive,
        motor_table: design.motor.motor_table.clone(),
    })
}

fn candidate(
    design: &Design,
    cases: &[CaseResult],
    p: &PumpCandidate,
    cc: Option<&CandidateCurves>,
    motor: Option<&MotorSizing>,
) -> CandidateOperation {
    let (Some(cc), Some(motor)) = (cc, motor) else {
        return empty(
            p,
            "no usable curve with power data, so no motor: the profile cannot be run".into(),
        );
    };
    let Some(m) = set_model(design, p, cc, motor) else {
        return empty(p, "no usable pump curve".into());
    };
    let mut out = empty(p, String::new());
    out.failure = None;
    out.motor_rating_w = m.motor_rating_w;
    out.motor_full_load_efficiency = m.motor_full_load_efficiency;
    out.variable_speed = m.drive.is_some();
    out.drive_full_load_efficiency = m.drive.map(|d| d.full_load_efficiency);
    out.speed_range = match m.speed {
        SpeedRange::Variable { min, max } => (min, max),
        SpeedRange::Fixed(r) => (r, r),
    };
    out.published_speed_rpm = m.base.speed_rpm;
    for profile in &design.operation.profiles {
        let control = if out.variable_speed {
            profile.control
        } else {
            profile.control.for_fixed_speed()
        };
        out.controls.push(control);
        let Some(sys) = cases
            .iter()
            .find(|c| c.name == profile.case)
            .and_then(|c| c.system.as_ref())
        else {
            for lp in &profile.points {
                out.points.push(undelivered(
                    profile,
                    lp,
                    Message::text("the profile's case could not be analysed"),
                ));
            }
            continue;
        };
        let min_flow = profile.min_flow_ratio.unwrap_or(AOR.0);
        let m = m.on_liquid(sys);
        let first = out.points.len();
        for lp in &profile.points {
            out.points.push(run_point(
                profile, control, &m, sys, lp.flow, lp.hours, min_flow,
            ));
        }
        if m.parallel > 1 && profile.staging == crate::model::operation::Staging::LeastPower {
            // The count at each load point is the one just chosen there (it does not
            // depend on the hours), so only the bisections run new points.
            let known: Vec<(f64, Option<u32>)> = out.points[first..]
                .iter()
                .map(|x| (x.flow, x.state.as_ref().map(|s| s.running)))
                .collect();
            let sw = staging::switching_points_from(&known, SWITCH_BISECTIONS, |q| {
                run_point(profile, control, &m, sys, q, 1.0, min_flow)
                    .state
                    .map(|s| s.running)
            });
            out.switching.push((profile.case.clone(), sw));
        }
        if control::control_head(control, sys, profile.design_flow, 0.0).is_some() {
            let q_max = 1.2
                * profile
                    .points
                    .iter()
                    .map(|x| x.flow)
                    .fold(profile.design_flow.max(0.0), f64::max);
            out.control_plots.push(ControlPlot {
                case: profile.case.clone(),
                control,
                points: control::control_curve(control, sys, profile.design_flow, q_max, 41),
            });
        }
    }
    out.yearly = yearly(design, &out.points);
    out.checks = checks::profile_checks(design, &m, &out, cases);
    let elements = design.operation.costs.iter().find(|c| c.pump == p.name);
    out.lcc = out
        .yearly
        .cost
        .and_then(|c| lcc::life_cycle_cost(design, c, elements));
    out
}

fn undelivered(
    profile: &LoadProfile,
    lp: &crate::model::operation::LoadPoint,
    why: Message,
) -> PointResult {
    PointResult {
        case: profile.case.clone(),
        flow: lp.flow,
        hours: lp.hours,
        state: None,
        failure: Some(why),
        duty_cycle: 0.0,
        starts_per_hour: None,
        energy_j: 0.0,
        specific_energy: None,
        wire_to_water: None,
        by_count: Vec::new(),
    }
}

/// One load point: choose the count and evaluate it.
fn run_point(
    profile: &LoadProfile,
    control: Control,
    m: &SetModel,
    sys: &CaseSystem,
    q: f64,
    hours: f64,
    min_flow: f64,
) -> PointResult {
    let in_region = |s: &SetState| {
        s.bep_ratio
            .is_none_or(|r| r >= min_flow.max(AOR.0) && r <= AOR.1)
    };
    let choice = if control == Control::OnOff {
        staging::choose(
            m.parallel,
            profile.staging,
            |k| on_off(m, sys, k, q, profile.level_band),
            in_region,
        )
    } else {
        // The system at q once for every count (the head and the common suction).
        let at = point::AtFlow::new(sys, q);
        let head = control::required_head_at(control, sys, profile.design_flow, q, at.system_head);
        staging::choose(
            m.parallel,
            profile.staging,
            |k| {
                point::evaluate_at(m, sys, &at, k, head).map(|s| {
                    let w = s.input_power;
                    (s, w)
                })
            },
            in_region,
        )
    };
    // Worst starts per hour, at inflow = half the pump flow: Q_run/(4·V) (Q in m³/h).
    let starts = match (&choice.chosen, control, profile.storage_volume) {
        (Ok((s, _)), Control::OnOff, Some(v)) => Some(s.flow * 3600.0 / (4.0 * v)),
        _ => None,
    };
    let lp = crate::model::operation::LoadPoint {
        flow: q,
        hours,
        span: profile.span,
    };
    match choice.chosen {
        Ok((state, mean_power)) => {
            let duty_cycle = if control == Control::OnOff {
                (q / state.flow).min(1.0)
            } else {
                1.0
            };
            let energy = mean_power * hours * 3600.0;
            PointResult {
                case: profile.case.clone(),
                flow: q,
                hours,
                specific_energy: (q > 0.0).then(|| mean_power / q),
                wire_to_water: (state.input_power > 0.0)
                    .then(|| state.hydraulic_power / state.input_power),
                state: Some(state),
                failure: None,
                duty_cycle,
                starts_per_hour: starts,
                energy_j: energy,
                by_count: choice.by_count,
            }
        }
        Err(why) => PointResult {
            by_count: choice.by_count,
            ..undelivered(profile, &lp, why)
        },
    }
}

/// On/off with `k` pumps: the set at full flow with the destination at the middle of
/// its level band, and the mean input power over the hours at demand `q`:
/// P̄ = q · ē, with ē the specific energy averaged over the band by Simpson's rule at
/// the bottom, middle and top level (the level moves at a steady rate).
fn on_off(
    m: &SetModel,
    sys: &CaseSystem,
    k: u32,
    q: f64,
    band: f64,
) -> Result<(SetState, f64), Message> {
    let at = |dz: f64| {
        let mut s = sys.clone();
        s.static_head += dz;
        point::full_flow(m, &s, k)
    };
    let (lo, mid, hi) = (at(0.0)?, at(0.5 * band)?, at(band)?);
    if lo.flow.min(mid.flow).min(hi.flow) < q {
        return Err(crate::message![
            crate::numbers::count(k as usize, "pump", "pumps"),
            " deliver ",
            against(Kind::Flow, hi.flow, q),
            " at the top of the level band, less than the ",
            flow(q),
            " demanded"
        ]);
    }
    let se = |s: &SetState| s.input_power / s.flow;
    let mean_se = (se(&lo) + 4.0 * se(&mid) + se(&hi)) / 6.0;
    Ok((mid, q * mean_se))
}

/// The year's totals over the points.
fn yearly(design: &Design, points: &[PointResult]) -> Yearly {
    let energy: f64 = points.iter().map(|p| p.energy_j).sum();
    let volume: f64 = points
        .iter()
        .filter(|p| p.state.is_some())
        .map(|p| p.flow * p.hours * 3600.0)
        .sum();
    let run = |p: &PointResult, f: fn(&SetState) -> f64| {
        p.state
            .as_ref()
            .map_or(0.0, |s| f(s) * p.hours * 3600.0 * p.duty_cycle)
    };
    let hydraulic: f64 = points.iter().map(|p| run(p, |s| s.hydraulic_power)).sum();
    let input: f64 = points.iter().map(|p| run(p, |s| s.input_power)).sum();
    let shaft: f64 = points.iter().map(|p| run(p, |s| s.shaft_power)).sum();
    Yearly {
        energy_j: energy,
        cost: design.energy.price_per_joule.map(|pr| pr * energy),
        volume_m3: volume,
        hours: points.iter().map(|p| p.hours).sum(),
        mean_wire_to_water: (input > 0.0).then(|| hydraulic / input),
        mean_pump_efficiency: (shaft > 0.0).then(|| hydraulic / shaft),
        specific_energy: (volume > 0.0).then(|| energy / volume),
    }
}
