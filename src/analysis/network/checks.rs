//! The network at each candidate's duty point, and the node-pressure checks on it.
//!
//! A demand-driven solve always delivers the demands, so "demand met" alone would
//! mislead: each node's pressure is checked instead — against its required residual
//! pressure (a design requirement), against atmospheric pressure (a pipe below zero gauge
//! draws air in at joints and air valves, and pressure pipe is rarely rated for vacuum;
//! common practice) and against the vapour pressure (column separation and cavitation;
//! common practice). Pressures near or below zero gauge call for a transient analysis
//! and for review by a licensed engineer under the local codes.

use super::station::{NetworkAtDuty, NodeAtDuty, NEAR_VAPOUR_HEAD_M};
use crate::analysis::checks::{Check, Status};
use crate::analysis::duty::PumpResult;
use crate::analysis::limits::{CheckId, Source};
use crate::analysis::CaseSystem;
use crate::message::{self, flow, head, Kind};
use crate::model::network::NodeQuantity;
use crate::model::Design;

/// Solve the network at every duty point of a case and append the node checks; an
/// error (a message naming the case's problem) when a solve failed at any flow.
pub fn at_duties(
    design: &Design,
    case: &str,
    system: &CaseSystem,
    pumps: &mut [PumpResult],
) -> Result<(), String> {
    let Some((net, _)) = &system.network else {
        return Ok(());
    };
    for p in pumps.iter_mut() {
        let Some(q) = p.duty.as_ref().map(|d| d.flow) else {
            continue;
        };
        let at = net
            .at_duty(q)
            .map_err(|e| format!("the network at the duty of pump {}: {e}", p.name))?;
        p.checks.extend(node_checks(&at));
        p.checks.extend(design_demand_check(&at));
        p.checks.extend(requirement_checks(design, case, &at));
        p.checks.extend(super::valves::valve_checks(net, &at));
        p.network = Some(Box::new(at));
    }
    if system.network_failed.get() {
        return Err("the network could not be solved at every flow of the system curve (see the network's nodes and links)".into());
    }
    Ok(())
}

/// The node-pressure checks at one duty.
pub fn node_checks(at: &NetworkAtDuty) -> Vec<Check> {
    let pr = |si| message::value(Kind::GaugePressure, si);
    let mut out = Vec::new();
    for n in at.nodes.iter().filter(|n| n.kind != "tank") {
        if let Some(req) = n.required_pressure {
            let (status, verdict) = if n.below_required {
                (Status::Fail, "below")
            } else {
                (Status::Pass, "meets")
            };
            out.push(
                Check::typed(
                    CheckId::NodePressure,
                    status,
                    Some(n.pressure),
                    Some(req),
                    crate::message![
                        format!("{} {}: residual pressure ", n.kind, n.name),
                        pr(n.pressure),
                        format!(" {verdict} the required "),
                        pr(req)
                    ],
                    Source::DesignRequirement,
                )
                .about(n.name.clone()),
            );
        }
        if let Some(c) = vacuum_check(n) {
            out.push(c);
        }
    }
    out
}

/// A network without a downstream tank: the duty's demand scale Q / D against 1. The
/// governing node sits at its required pressure at every station flow (the system curve
/// is built so), so what a pump too small shows is a flow below the design demands: fail
/// below scale 1 (less a part in 10⁹ for rounding).
pub fn design_demand_check(at: &NetworkAtDuty) -> Option<Check> {
    let scale = at.demand_scale?;
    let design = at.station_flow / scale;
    let ok = scale >= 1.0 - 1e-9;
    Some(Check::typed(
        CheckId::DesignDemand,
        if ok { Status::Pass } else { Status::Fail },
        Some(at.station_flow),
        Some(design),
        crate::message![
            "the duty delivers ",
            flow(at.station_flow),
            format!(", {:.1} % of the design demands ", 100.0 * scale),
            flow(design),
            if ok {
                ", every demand scaled alike with the governing node at its required pressure"
            } else {
                ": the network's demands cannot all be met at their required pressures"
            }
        ],
        Source::DesignRequirement,
    ))
}

fn vacuum_check(n: &NodeAtDuty) -> Option<Check> {
    let pr = message::value(Kind::GaugePressure, n.pressure);
    let (status, message, origin) = if n.near_vapour {
        (
            Status::Fail,
            crate::message![
                format!("{} {}: pressure ", n.kind, n.name),
                pr,
                " is within ",
                head(NEAR_VAPOUR_HEAD_M),
                " of the vapour pressure: the column may separate; raise the grade line, and have the transients analysed"
            ],
            Source::CommonPractice("a margin above vapour pressure against column separation"),
        )
    } else if n.below_atmospheric {
        (
            Status::Warn,
            crate::message![
                format!("{} {}: pressure ", n.kind, n.name),
                pr,
                " is below atmospheric: air enters at joints and air valves; confirm the pipe's vacuum rating with the manufacturer"
            ],
            Source::CommonPractice("a pressure main stays above atmospheric pressure"),
        )
    } else {
        return None;
    };
    Some(
        Check::typed(
            CheckId::NodePressure,
            status,
            Some(n.pressure),
            Some(0.0),
            message,
            origin,
        )
        .about(n.name.clone()),
    )
}

/// The design's node requirements that apply to a case, at one duty.
pub fn requirement_checks(design: &Design, case: &str, at: &NetworkAtDuty) -> Vec<Check> {
    design
        .node_requirements
        .iter()
        .filter(|r| r.cases.is_empty() || r.cases.iter().any(|c| c == case))
        .filter_map(|r| {
            let n = at.nodes.iter().find(|n| n.name == r.node)?;
            let (value, shown, limit_shown, what) = match r.quantity {
                NodeQuantity::Pressure => (
                    n.pressure,
                    message::value(Kind::GaugePressure, n.pressure),
                    message::value(Kind::GaugePressure, r.limit_si),
                    "pressure",
                ),
                NodeQuantity::Flow => {
                    let q = n.inflow.unwrap_or(0.0);
                    (q, flow(q), flow(r.limit_si), "flow into the tank")
                }
            };
            let ok = if r.at_least {
                value >= r.limit_si
            } else {
                value <= r.limit_si
            };
            Some(
                Check::typed(
                    CheckId::Requirement,
                    if ok { Status::Pass } else { Status::Fail },
                    Some(value),
                    Some(r.limit_si),
                    crate::message![
                        format!(
                            "{what} at {} {} ",
                            r.node,
                            if r.at_least { "at least" } else { "at most" }
                        ),
                        limit_shown,
                        if ok { ": met, " } else { ": not met, " },
                        shown
                    ],
                    Source::DesignRequirement,
                )
                .about(r.text.clone()),
            )
        })
        .collect()
}
