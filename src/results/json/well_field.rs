//! The JSON of a well field: `cases[].pumps[].wells[]`, the candidate at each running
//! well pump at its own duty (docs/results-json.md, "Well fields"). The pump's `duty`
//! is then the field's total (see [`crate::analysis::well_field`]).

use serde::Serialize;

use super::engineering;
use crate::analysis::well_field::WellDuty;

/// One well pump at its duty.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
#[allow(non_snake_case)]
pub(super) struct WellOut<'a> {
    /// The well pump's name.
    name: &'a str,
    /// The well (tank) it draws from.
    well: &'a str,
    static_level_m: f64,
    drawdown_m: f64,
    pumping_level_m: f64,
    pump_elevation_m: f64,
    /// Flow of the candidate's set in this well.
    flow_m3_s: f64,
    /// Head the set adds.
    head_m: f64,
    flow_per_pump_m3_s: f64,
    efficiency: Option<f64>,
    flow_ratio_to_bep: Option<f64>,
    hydraulic_power_W: f64,
    shaft_power_W: Option<f64>,
    input_power_W: Option<f64>,
    npsh_available_m: f64,
    npsh_required_m: Option<f64>,
    npsh_margin_ratio: Option<f64>,
    npsh_terms: engineering::NpshTermsOut,
    suction_velocity_m_s: Option<f64>,
    discharge_velocity_m_s: Option<f64>,
    /// The pump's check valve holds it at zero flow.
    closed: bool,
}

/// The wells of a pump result (empty unless the design is a well field).
pub(super) fn wells(wells: &[WellDuty]) -> Vec<WellOut<'_>> {
    wells
        .iter()
        .map(|w| {
            let d = &w.duty;
            WellOut {
                name: &w.name,
                well: &w.well,
                static_level_m: w.static_level,
                drawdown_m: w.drawdown,
                pumping_level_m: w.pumping_level,
                pump_elevation_m: w.pump_elevation,
                flow_m3_s: d.flow,
                head_m: d.head,
                flow_per_pump_m3_s: d.flow_per_pump,
                efficiency: d.efficiency,
                flow_ratio_to_bep: d.flow_ratio_to_bep,
                hydraulic_power_W: d.hydraulic_power,
                shaft_power_W: d.shaft_power,
                input_power_W: d.input_power,
                npsh_available_m: d.npsh_available,
                npsh_required_m: d.npsh_required,
                npsh_margin_ratio: d
                    .npsh_required
                    .filter(|n| *n > 0.0)
                    .map(|n| d.npsh_available / n),
                npsh_terms: engineering::npsh_terms(&d.npsh_terms),
                suction_velocity_m_s: d.suction_velocity,
                discharge_velocity_m_s: d.discharge_velocity,
                closed: w.closed,
            }
        })
        .collect()
}
