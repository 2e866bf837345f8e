//! The wave-2 fields of the results document: what a reviewer recomputes (NPSH
//! available term by term, every segment at the duty flow, hydraulic and input
//! power), the motor of each candidate, one pump alone, headroom, capacity and the
//! requirement × case matrix. Documented field by field in docs/results-json.md.

// JSON keys carry SI unit symbols (`rating_W`) as the contract says.
#![allow(non_snake_case)]

use serde::Serialize;

use crate::analysis::capacity::RequirementRow;
use crate::analysis::duty::{Headroom, StationPiping, WellAtDuty};
use crate::analysis::motor::MotorSizing;
use crate::analysis::parallel::OneAlone;
use crate::analysis::{Analysis, NpshTerms, SegmentAtFlow};
use crate::display::Units;
use crate::pumps::MotorStandard;

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct NpshTermsOut {
    barometric_head_m: f64,
    surface_pressure_head_m: f64,
    static_suction_head_m: f64,
    vapour_pressure_head_m: f64,
    suction_friction_head_m: f64,
    suction_minor_head_m: f64,
}

pub(super) fn npsh_terms(t: &NpshTerms) -> NpshTermsOut {
    NpshTermsOut {
        barometric_head_m: t.barometric_head,
        surface_pressure_head_m: t.surface_pressure_head,
        static_suction_head_m: t.static_suction_head,
        vapour_pressure_head_m: t.vapour_pressure_head,
        suction_friction_head_m: t.suction_friction_head,
        suction_minor_head_m: t.suction_minor_head,
    }
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct StationPipingOut<'a> {
    flow_per_pump_m3_s: f64,
    suction_branch_head_m: f64,
    discharge_branch_head_m: f64,
    npsh_suction_path: Vec<PathStepOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct WellOut {
    static_level_m: f64,
    aquifer_loss_m: f64,
    well_loss_m: f64,
    drawdown_m: f64,
    pumping_level_m: f64,
}

pub(super) fn well(w: &WellAtDuty) -> WellOut {
    WellOut {
        static_level_m: w.static_level,
        aquifer_loss_m: w.aquifer_loss,
        well_loss_m: w.well_loss,
        drawdown_m: w.aquifer_loss + w.well_loss,
        pumping_level_m: w.pumping_level,
    }
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct PathStepOut<'a> {
    line: &'a str,
    index: usize,
    flow_m3_s: f64,
}

pub(super) fn station_piping(s: &StationPiping) -> StationPipingOut<'_> {
    StationPipingOut {
        flow_per_pump_m3_s: s.flow_per_pump,
        suction_branch_head_m: s.suction_head,
        discharge_branch_head_m: s.discharge_head,
        npsh_suction_path: s
            .npsh_path
            .iter()
            .map(|(line, index, flow)| PathStepOut {
                line,
                index: *index,
                flow_m3_s: *flow,
            })
            .collect(),
    }
}

/// Format 2: every segment at the duty flow as columns; element i of each array is
/// the case's segment i (`cases[].segments[i]`, the order of the analysis).
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct SegmentsOut {
    flow_m3_s: Vec<f64>,
    velocity_m_s: Vec<f64>,
    velocity_head_m: Vec<f64>,
    reynolds: Vec<f64>,
    friction_factor: Vec<Option<f64>>,
    friction_head_m: Vec<f64>,
    minor_head_m: Vec<f64>,
    fittings_k: Vec<Vec<Option<f64>>>,
}

pub(super) fn segments(s: &[SegmentAtFlow]) -> SegmentsOut {
    SegmentsOut {
        flow_m3_s: s.iter().map(|g| g.flow).collect(),
        velocity_m_s: s.iter().map(|g| g.velocity).collect(),
        velocity_head_m: s.iter().map(|g| g.velocity_head).collect(),
        reynolds: s.iter().map(|g| g.reynolds).collect(),
        friction_factor: s.iter().map(|g| g.friction_factor).collect(),
        friction_head_m: s.iter().map(|g| g.friction_head).collect(),
        minor_head_m: s.iter().map(|g| g.minor_head).collect(),
        fittings_k: s
            .iter()
            .map(|g| {
                g.fittings_k
                    .iter()
                    .map(|k| k.is_finite().then_some(*k))
                    .collect()
            })
            .collect(),
    }
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct HeadroomOut {
    limit: &'static str,
    needed: Option<f64>,
    limit_value: f64,
    headroom: Option<f64>,
}

pub(super) fn headroom(h: &Headroom) -> HeadroomOut {
    HeadroomOut {
        limit: h.limit.keyword(),
        needed: h.needed,
        limit_value: h.limit_value,
        headroom: h.fraction(),
    }
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct MotorOut<'a> {
    standard: &'static str,
    rating_W: f64,
    rating_label: &'a str,
    rating_stated: bool,
    service_factor: f64,
    variable_speed: bool,
    max_operating_shaft_power_W: f64,
    max_operating_case: &'a str,
    run_out_shaft_power_W: f64,
    run_out_case: &'a str,
    run_out_flow_per_pump_m3_s: f64,
    run_out_speed_rpm: f64,
    run_out_density_kg_m3: f64,
    within_nameplate: bool,
    non_overloading: bool,
    efficiency: f64,
    efficiency_source: &'a str,
    poles: u32,
    supply_frequency_Hz: f64,
}

pub(super) fn motor(m: &MotorSizing) -> MotorOut<'_> {
    MotorOut {
        standard: match m.choice.standard {
            MotorStandard::Nema => "nema",
            MotorStandard::Iec => "iec",
        },
        rating_W: m.choice.rating_w,
        rating_label: &m.choice.rating_label,
        rating_stated: m.rating_stated,
        service_factor: m.choice.service_factor,
        variable_speed: m.variable_speed,
        max_operating_shaft_power_W: m.max_operating_shaft_power,
        max_operating_case: &m.max_operating_case,
        run_out_shaft_power_W: m.run_out_shaft_power,
        run_out_case: &m.run_out_case,
        run_out_flow_per_pump_m3_s: m.run_out_flow,
        run_out_speed_rpm: m.run_out_speed_rpm,
        run_out_density_kg_m3: m.run_out_density,
        within_nameplate: m.choice.within_nameplate,
        non_overloading: m.choice.non_overloading,
        efficiency: m.efficiency,
        efficiency_source: &m.efficiency_source,
        poles: m.poles,
        supply_frequency_Hz: m.supply_hz,
    }
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct OneAloneOut<'a> {
    case: &'a str,
    speed_rpm: f64,
    /// `null` when the pump runs beyond the end of its published curve.
    duty: Option<OneAloneDutyOut>,
    status: &'static str,
    message: String,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct OneAloneDutyOut {
    flow_m3_s: f64,
    head_m: f64,
    shaft_power_W: Option<f64>,
    npsh_available_m: f64,
    npsh_required_m: Option<f64>,
}

pub(super) fn one_alone(a: &OneAlone, units: Units) -> OneAloneOut<'_> {
    OneAloneOut {
        case: &a.case,
        speed_rpm: a.speed_rpm,
        duty: match (a.flow, a.head, a.npsh_available) {
            (Some(q), Some(h), Some(n)) => Some(OneAloneDutyOut {
                flow_m3_s: q,
                head_m: h,
                shaft_power_W: a.shaft_power,
                npsh_available_m: n,
                npsh_required_m: a.npsh_required,
            }),
            _ => None,
        },
        status: a.check.status.keyword(),
        message: units.render(&a.check.message.get()),
    }
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct CapacityOut<'a> {
    case: &'a str,
    flow_at_limit_m3_s: Option<f64>,
    required_flow_m3_s: Option<f64>,
}

/// Candidate `k`'s flow at the limit in every case, with the case's own requirement.
pub(super) fn capacity<'a>(
    design: &'a crate::model::Design,
    analysis: &'a Analysis,
    k: usize,
) -> Vec<CapacityOut<'a>> {
    analysis
        .cases
        .iter()
        .enumerate()
        .map(|(i, c)| CapacityOut {
            case: &c.name,
            flow_at_limit_m3_s: analysis
                .capacity
                .get(k)
                .and_then(|row| row.get(i))
                .copied()
                .flatten(),
            required_flow_m3_s: crate::analysis::duty::required_flow(design, &c.name),
        })
        .collect()
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct RequirementOut<'a> {
    requirement: &'a str,
    text: String,
    cases: Vec<RequirementCaseOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct RequirementCaseOut<'a> {
    case: &'a str,
    applies: bool,
    candidates: Vec<RequirementStatusOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct RequirementStatusOut<'a> {
    name: &'a str,
    status: Option<&'static str>,
}

pub(super) fn requirement_matrix<'a>(
    design: &'a crate::model::Design,
    analysis: &'a Analysis,
    rows: &'a [RequirementRow],
) -> Vec<RequirementOut<'a>> {
    rows.iter()
        .map(|r| RequirementOut {
            requirement: &r.written,
            text: crate::display::Units::new(design.project.units).render(&r.text),
            cases: analysis
                .cases
                .iter()
                .enumerate()
                .map(|(i, c)| RequirementCaseOut {
                    case: &c.name,
                    applies: r.applies.get(i).copied().unwrap_or(false),
                    candidates: design
                        .pumps
                        .iter()
                        .enumerate()
                        .map(|(k, p)| RequirementStatusOut {
                            name: &p.name,
                            status: r
                                .status
                                .get(k)
                                .and_then(|s| s.get(i))
                                .copied()
                                .flatten()
                                .map(|s| s.keyword()),
                        })
                        .collect(),
                })
                .collect(),
        })
        .collect()
}

/// The network at a duty point (`cases[].pumps[].network`).
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub struct NetworkOut<'a> {
    station_flow_m3_s: f64,
    /// A network without a downstream tank only: the scale of the design demands.
    #[serde(skip_serializing_if = "Option::is_none")]
    demand_scale: Option<f64>,
    nodes: Vec<NodeOut<'a>>,
    links: Vec<LinkOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
#[allow(non_snake_case)]
struct NodeOut<'a> {
    name: &'a str,
    kind: &'static str,
    elevation_m: f64,
    head_m: f64,
    pressure_Pa: f64,
    demand_m3_s: f64,
    inflow_m3_s: Option<f64>,
    required_pressure_Pa: Option<f64>,
    below_required: bool,
    below_atmospheric: bool,
    near_vapour_pressure: bool,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct LinkOut<'a> {
    name: &'a str,
    kind: &'static str,
    from: &'a str,
    to: &'a str,
    flow_m3_s: f64,
    velocity_m_s: Option<f64>,
    head_loss_m: f64,
    closed: bool,
}

/// The JSON view of a network at a duty point.
pub fn network(n: &crate::analysis::network::station::NetworkAtDuty) -> NetworkOut<'_> {
    NetworkOut {
        station_flow_m3_s: n.station_flow,
        demand_scale: n.demand_scale,
        nodes: n
            .nodes
            .iter()
            .map(|x| NodeOut {
                name: &x.name,
                kind: x.kind,
                elevation_m: x.elevation,
                head_m: x.head,
                pressure_Pa: x.pressure,
                demand_m3_s: x.demand,
                inflow_m3_s: x.inflow,
                required_pressure_Pa: x.required_pressure,
                below_required: x.below_required,
                below_atmospheric: x.below_atmospheric,
                near_vapour_pressure: x.near_vapour,
            })
            .collect(),
        links: n
            .links
            .iter()
            .map(|l| LinkOut {
                name: &l.name,
                kind: l.kind,
                from: &l.from,
                to: &l.to,
                flow_m3_s: l.flow,
                velocity_m_s: l.velocity,
                head_loss_m: l.head_loss,
                closed: l.closed,
            })
            .collect(),
    }
}
