//! Wave 2: the operation over the load profiles per candidate (`profile[]`, `yearly`,
//! `life_cycle_cost`, `switching`, `profile_checks`), SI with the unit in the key.

// JSON keys carry SI unit symbols (`input_power_W`) as the contract says.
#![allow(non_snake_case)]

use serde::Serialize;

use super::{check, finite, CheckOut};
use crate::analysis::operation::{CandidateOperation, PointResult};
use crate::display::Units;
use crate::model::Design;

/// One load point of one candidate.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct PointOut<'a> {
    case: &'a str,
    flow_m3_s: f64,
    hours: f64,
    delivered: bool,
    failure: Option<String>,
    pumps_running: Option<u32>,
    speed_rpm: Option<f64>,
    speed_ratio: Option<f64>,
    flow_per_pump_m3_s: Option<f64>,
    head_per_pump_m: Option<f64>,
    system_head_m: Option<f64>,
    surplus_head_m: Option<f64>,
    efficiency: Option<f64>,
    flow_ratio_to_bep: Option<f64>,
    npsh_available_m: Option<f64>,
    npsh_required_m: Option<f64>,
    shaft_power_W: Option<f64>,
    motor_load: Option<f64>,
    motor_efficiency: Option<f64>,
    drive_efficiency: Option<f64>,
    drive_losses_W: Option<f64>,
    input_power_W: Option<f64>,
    hydraulic_power_W: Option<f64>,
    wire_to_water_efficiency: Option<f64>,
    specific_energy_J_m3: Option<f64>,
    duty_cycle: f64,
    starts_per_hour: Option<f64>,
    energy_J: f64,
    at_min_speed: Option<bool>,
}

/// The year's totals and the life-cycle cost.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct YearlyOut {
    energy_J: f64,
    cost: Option<f64>,
    volume_m3: f64,
    hours: f64,
    specific_energy_J_m3: Option<f64>,
    mean_wire_to_water: Option<f64>,
    mean_pump_efficiency: Option<f64>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct LccOut {
    initial: f64,
    installation: f64,
    energy: f64,
    operation: f64,
    maintenance: f64,
    downtime: f64,
    environmental: f64,
    disposal: f64,
    total: f64,
    years: f64,
    discount_rate: f64,
    escalation: f64,
    general_inflation: f64,
    rates: &'static str,
    energy_present_worth_factor: f64,
    recurring_present_worth_factor: f64,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct SwitchOut<'a> {
    case: &'a str,
    flow_m3_s: f64,
    from_running: u32,
    to_running: u32,
    resolution_m3_s: f64,
}

/// Everything of one candidate's operation.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct OperationOut<'a> {
    pub profile: Vec<PointOut<'a>>,
    pub yearly: YearlyOut,
    pub life_cycle_cost: Option<LccOut>,
    pub switching: Vec<SwitchOut<'a>>,
    pub controls: Vec<&'static str>,
    pub profile_checks: Vec<CheckOut<'a>>,
    pub profile_failure: Option<&'a str>,
    /// `"typical_curve"` (WSEO 1993) or `"design_table"`.
    pub motor_part_load: &'static str,
    /// `"typical_curve"` (DOE Tip Sheet #11), `"design_iec_61800_9_2"`, or `null`
    /// without a drive.
    pub drive_losses: Option<&'static str>,
}

fn point(p: &PointResult, units: Units) -> PointOut<'_> {
    let s = p.state.as_ref();
    PointOut {
        case: &p.case,
        flow_m3_s: p.flow,
        hours: p.hours,
        delivered: s.is_some(),
        failure: p.failure.as_ref().map(|m| units.render(m)),
        pumps_running: s.map(|s| s.running),
        speed_rpm: s.map(|s| s.speed_rpm),
        speed_ratio: s.map(|s| s.speed_ratio),
        flow_per_pump_m3_s: s.map(|s| s.flow_per_pump),
        head_per_pump_m: s.map(|s| s.head_per_pump),
        system_head_m: s.map(|s| s.system_head),
        surplus_head_m: s.map(|s| s.surplus_head),
        efficiency: s.and_then(|s| s.efficiency),
        flow_ratio_to_bep: s.and_then(|s| s.bep_ratio),
        npsh_available_m: s.map(|s| s.npsh_available),
        npsh_required_m: s.and_then(|s| s.npsh_required),
        shaft_power_W: s.map(|s| s.shaft_power),
        motor_load: s.map(|s| s.motor_load),
        motor_efficiency: s.map(|s| s.motor_efficiency),
        drive_efficiency: s.map(|s| s.drive_efficiency),
        drive_losses_W: s.map(|s| s.drive_losses),
        input_power_W: s.map(|s| s.input_power),
        hydraulic_power_W: s.map(|s| s.hydraulic_power),
        wire_to_water_efficiency: p.wire_to_water.and_then(finite),
        specific_energy_J_m3: p.specific_energy.and_then(finite),
        duty_cycle: p.duty_cycle,
        starts_per_hour: p.starts_per_hour,
        energy_J: p.energy_j,
        at_min_speed: s.map(|s| s.at_min_speed),
    }
}

/// The operation of one candidate.
pub(super) fn operation<'a>(
    o: &'a CandidateOperation,
    design: &Design,
    units: Units,
) -> OperationOut<'a> {
    let y = &o.yearly;
    let m = &design.motor;
    OperationOut {
        motor_part_load: if m.motor_table.is_some() {
            "design_table"
        } else {
            "typical_curve"
        },
        drive_losses: o.variable_speed.then_some(if m.drive_losses.is_some() {
            "design_iec_61800_9_2"
        } else {
            "typical_curve"
        }),
        profile: o.points.iter().map(|p| point(p, units)).collect(),
        yearly: YearlyOut {
            energy_J: y.energy_j,
            cost: y.cost,
            volume_m3: y.volume_m3,
            hours: y.hours,
            specific_energy_J_m3: y.specific_energy,
            mean_wire_to_water: y.mean_wire_to_water,
            mean_pump_efficiency: y.mean_pump_efficiency,
        },
        life_cycle_cost: o.lcc.as_ref().map(|l| LccOut {
            initial: l.initial,
            installation: l.installation,
            energy: l.energy,
            operation: l.operation,
            maintenance: l.maintenance,
            downtime: l.downtime,
            environmental: l.environmental,
            disposal: l.disposal,
            total: l.total,
            years: l.years,
            discount_rate: l.discount_rate,
            escalation: l.escalation,
            general_inflation: l.inflation,
            rates: l.rates.keyword(),
            energy_present_worth_factor: l.energy_factor,
            recurring_present_worth_factor: l.recurring_factor,
        }),
        switching: o
            .switching
            .iter()
            .flat_map(|(case, sw)| {
                sw.iter().map(move |s| SwitchOut {
                    case,
                    flow_m3_s: s.flow,
                    from_running: s.from,
                    to_running: s.to,
                    resolution_m3_s: s.resolution,
                })
            })
            .collect(),
        controls: o.controls.iter().map(|c| c.keyword()).collect(),
        profile_checks: o.checks.iter().map(|c| check(c, units)).collect(),
        profile_failure: o.failure.as_deref(),
    }
}

/// A load profile as the design gives it (issue 13): its case, control, staging, design
/// flow and load points, and, for `curve hourly from "file.csv"`, how the hourly flows
/// were binned, so a reviewer can rebuild the points from the file.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct LoadProfileOut<'a> {
    case: &'a str,
    control: &'static str,
    staging: &'static str,
    design_flow_m3_s: f64,
    points: Vec<LoadPointOut>,
    hourly: Option<HourlyOut<'a>>,
}

/// One load point of a profile: a flow and its hours per year.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct LoadPointOut {
    flow_m3_s: f64,
    hours: f64,
}

/// The binning of an hourly profile: equal-width bins from zero flow.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct HourlyOut<'a> {
    source: &'a str,
    rows: usize,
    bin_edges_m3_s: &'a [f64],
    hours: &'a [f64],
    mean_flow_m3_s: &'a [f64],
    zero_flow_hours: f64,
}

/// The design's load profiles, in file order.
pub(super) fn load_profiles(design: &Design) -> Vec<LoadProfileOut<'_>> {
    design
        .operation
        .profiles
        .iter()
        .map(|p| LoadProfileOut {
            case: &p.case,
            control: p.control.keyword(),
            staging: p.staging.keyword(),
            design_flow_m3_s: p.design_flow,
            points: p
                .points
                .iter()
                .map(|lp| LoadPointOut {
                    flow_m3_s: lp.flow,
                    hours: lp.hours,
                })
                .collect(),
            hourly: p.binning.as_ref().map(|b| HourlyOut {
                source: &b.source,
                rows: b.rows,
                bin_edges_m3_s: &b.edges,
                hours: &b.hours,
                mean_flow_m3_s: &b.mean_flow,
                zero_flow_hours: b.zero_hours,
            }),
        })
        .collect()
}
