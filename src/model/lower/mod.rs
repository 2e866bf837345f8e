//! Lowering the syntax tree to a [`Design`]: the phases, in the order they run.
//!
//! Each phase reads the grouped top-level [`Blocks`] and what earlier phases produced,
//! pushes its diagnostics, and hands its result on. Diagnostics come out in phase order.

use crate::diagnostics::Code;
mod blocks;
mod candidates;
mod cases;
mod constants;
mod field;
mod hourly;
mod lines;
mod load_profile;
mod motor_tables;
mod network;
mod operation;
pub(crate) mod profile;
mod project;
mod requirements;
mod setting;
mod tanks;
mod uncertainty;

use uom::si::f64::Time;
use uom::si::time::second;

use super::design::*;
use super::FileAccess;
use crate::diagnostics::{Diagnostic, Span};
use crate::syntax::ast::File;

pub use blocks::{Block, Blocks};
pub(crate) use operation::{ENERGY_FIELDS, MOTOR_FIELDS};
pub(crate) use project::PROJECT_FIELDS;
pub(crate) use setting::STATION_FIELDS;
pub(crate) use uncertainty::{UNCERTAINTY_FIELDS, UNCERTAINTY_ITEMS};

/// Most cases, lines, segments and pumps accepted (grammar/LANGUAGE.md, "Limits").
pub const MAX_CASES: usize = 10_000;
/// Most pipe segments over all lines.
pub const MAX_SEGMENTS: usize = 100;
/// Most pump candidates.
pub const MAX_PUMPS: usize = 20;

/// Lower a parsed file. Returns the design when there were no errors, and all diagnostics.
pub fn lower(
    file: &File,
    source: &str,
    files: &dyn FileAccess,
) -> (Option<Design>, Vec<Diagnostic>) {
    let mut diags: Vec<Diagnostic> = Vec::new();
    let env = constants::lower_constants(file, &mut diags);
    let blocks = Blocks::group(file, &mut diags);
    let texts = project::lower_texts(&blocks, &env, &mut diags);
    let is_field = field::is_field(&blocks);
    let mut setting = setting::lower_setting(&blocks, &env, !is_field, &mut diags);
    let tanks = tanks::lower_tanks(&blocks, &env, &mut diags);
    let nodes = network::lower_nodes(&blocks, &tanks, &env, &mut diags);
    let (network, layout) = if is_field {
        lower_well_field(&blocks, &tanks, nodes, &env, &mut setting, &mut diags)
    } else {
        let node_names: Vec<String> = nodes.iter().map(|n| n.name.clone()).collect();
        let mut network = lines::lower_lines(&blocks, &tanks, &node_names, &env, files, &mut diags);
        let (layout, downstream) =
            network::lower_network(&blocks, &tanks, nodes, &network, &env, &mut diags);
        if layout.is_some() {
            network.destination = downstream;
        }
        (network, layout)
    };
    expansion_tank_side(&network, &mut diags);
    let pump_list = candidates::lower_candidates(&blocks, &env, files, &mut diags);
    let motor = operation::lower_motor(blocks.body("motor"), texts.project.units, &env, &mut diags);
    let energy = operation::lower_energy(blocks.body("energy"), &env, &mut diags);
    let base = base_scenario(setting, network, layout, &pump_list);
    let cases = cases::lower_cases(&blocks, base.as_ref(), source, &env, &mut diags);
    let (requirements, node_requirements) =
        requirements::lower_requirements(&blocks, &cases, source, &env, &mut diags);
    let yearly = crate::model::operation::OperationSettings {
        profiles: load_profile::lower_profiles(
            &blocks,
            &cases,
            &requirements,
            &env,
            files,
            &mut diags,
        ),
        costs: load_profile::lower_costs(&blocks, &pump_list, &env, &mut diags),
        rates: energy.rates,
        inflation: energy.inflation,
    };
    let uncertainty =
        uncertainty::lower_uncertainty(&blocks, base.as_ref(), &pump_list, &env, &mut diags);
    diags.extend(env.warnings.take());
    let has_errors = diags.iter().any(|x| x.is_error());
    let design = match base {
        Some(base) if !has_errors => Some(Design {
            project: texts.project,
            revisions: texts.revisions,
            purpose: texts.purpose,
            assumptions: texts.assumptions,
            notes: texts.notes,
            base,
            cases,
            requirements,
            node_requirements,
            pumps: pump_list,
            motor,
            energy,
            operation: yearly,
            uncertainty,
        }),
        _ => None,
    };
    (design, diags)
}

/// A well field's network in the chain's slots: no lines, the first well as the source,
/// the downstream tank as the destination, the first well pump's setting as the
/// centreline (the field's own stage reads the wells from the layout).
fn lower_well_field(
    blocks: &Blocks,
    tanks: &[Tank],
    nodes: Vec<crate::model::network::NetNode>,
    env: &crate::model::eval::Env,
    setting: &mut setting::Setting,
    diags: &mut Vec<Diagnostic>,
) -> (lines::Network, Option<crate::model::network::NetworkLayout>) {
    let Some(f) = field::lower_field(blocks, tanks, nodes, env, diags) else {
        let none = lines::Network {
            lines: Vec::new(),
            source: None,
            destination: None,
            entry: None,
        };
        return (none, None);
    };
    setting.centreline = Some(f.centreline);
    let network = lines::Network {
        lines: Vec::new(),
        source: Some(f.source),
        destination: Some(f.destination),
        entry: Some(f.layout.entry.clone()),
    };
    (network, Some(f.layout))
}

/// The base scenario, when fluid, both ends and the centreline are known.
fn base_scenario(
    setting: setting::Setting,
    network: lines::Network,
    layout: Option<crate::model::network::NetworkLayout>,
    pump_list: &[PumpCandidate],
) -> Option<Scenario> {
    let setting::Setting {
        fluid,
        site,
        centreline,
    } = setting;
    let lines::Network {
        lines,
        source,
        destination,
        ..
    } = network;
    match (fluid, source, destination, centreline) {
        (Some(fluid), Some(source), Some(destination), Some(centreline)) => Some(Scenario {
            fluid,
            site,
            source,
            destination,
            centreline,
            lines: std::sync::Arc::new(lines),
            network: layout,
            pipe_condition: PipeCondition::New,
            hours_per_year: Time::new::<second>(0.0),
            pump_speeds: pump_list
                .iter()
                .map(|p| (p.name.clone(), p.rated_speed))
                .collect(),
            pump_running: pump_list
                .iter()
                .map(|p| {
                    let parallel = p.arrangement == ArrangementKind::Parallel;
                    (p.name.clone(), p.count, parallel, p.count)
                })
                .collect(),
        }),
        _ => None,
    }
}

/// A closed loop (its discharge returns to the source tank) whose expansion tank
/// connects on the pump discharge: warned (grammar/LANGUAGE.md, "Closed loops").
fn expansion_tank_side(network: &lines::Network, diags: &mut Vec<Diagnostic>) {
    let (Some(src), Some(dst)) = (&network.source, &network.destination) else {
        return;
    };
    if src.name != dst.name {
        for t in [src, dst] {
            let r = &t.reference;
            let stated = r.max_pressure.is_some()
                || r.high_point.is_some()
                || r.high_point_pressure.is_some()
                || r.on_discharge.is_some();
            if stated {
                diags.push(Diagnostic::warning(Code::UnusedField, format!("tank {}: `max_pressure`, `high_point`, `high_point_pressure` and `connects` belong to a closed loop's reference tank, and this design does not return to it; they are not used", t.name), Some(t.span))
                    .with_help("a closed loop ends its network (or its discharge line) at the tank its suction line starts from"));
            }
        }
        return;
    }
    if let Some(at) = src.reference.on_discharge {
        diags.push(Diagnostic::warning(Code::ExpansionTankDischarge, format!("the expansion tank {} connects on the pump discharge: the pumps then lower the pressure at their suction by their head, and the loop's cases are not analysed", src.name), Some(at))
                .with_help("connect the expansion tank at the pump suction (common practice), so that the pumps add pressure to the loop instead of subtracting it"));
    }
}

/// The one "defined twice" diagnostic: `what` names the thing (e.g. "tank `sump`").
pub(super) fn duplicate_name(what: &str, span: Span, first: Span) -> Diagnostic {
    Diagnostic::error(
        Code::DuplicateName,
        format!("{what} is defined twice"),
        Some(span),
    )
    .with_secondary(first, "first defined here")
}

/// The source text under a span (empty when the span is out of range).
fn source_text(source: &str, span: Span) -> String {
    source.get(span.start..span.end).unwrap_or("").to_string()
}
