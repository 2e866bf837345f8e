//! The general form: `junction` and `delivery` nodes, and the links between nodes —
//! `line NAME from A to B` with neither end `pump`, `valve NAME from A to B`,
//! `equipment NAME from A to B` — gathered into a [`NetworkLayout`] when the discharge
//! lines end at a node.

use uom::si::f64::{Length, Pressure, VolumeRate};
use uom::si::length::meter;
use uom::si::pressure::pascal;
use uom::si::volume_rate::cubic_meter_per_second;

use super::lines::{self, line_ends};
use super::{duplicate_name, Block, Blocks};
use crate::diagnostics::{Code, Diagnostic, Span};
use crate::model::design::*;
use crate::model::eval::{self, Env};
use crate::model::fields::{block_name, missing, read_fields};
use crate::model::network::*;
use crate::model::scenario::lower_segments;
use crate::names::nearest;

/// Most nodes and links a network accepts (grammar/LANGUAGE.md, "Limits").
pub const MAX_NETWORK_ITEMS: usize = 2000;

/// Every `junction` and `delivery` block, in file order.
pub fn lower_nodes(
    blocks: &Blocks,
    tanks: &[Tank],
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Vec<NetNode> {
    let mut all: Vec<&Block> = blocks
        .all("junction")
        .chain(blocks.all("delivery"))
        .collect();
    all.sort_by_key(|b| b.span.start);
    let mut nodes: Vec<NetNode> = Vec::new();
    for block in all {
        if let Some(node) = lower_node(block, &nodes, tanks, env, diags) {
            nodes.push(node);
        }
    }
    if let Some(over) = nodes.get(MAX_NETWORK_ITEMS) {
        diags.push(too_many("nodes", nodes.len(), over.span));
    }
    nodes
}

pub(super) fn too_many(what: &str, n: usize, span: Span) -> Diagnostic {
    Diagnostic::error(
        Code::TooMany,
        format!("the design has {n} network {what}; at most {MAX_NETWORK_ITEMS} are accepted"),
        Some(span),
    )
}

fn lower_node(
    block: &Block,
    earlier: &[NetNode],
    tanks: &[Tank],
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<NetNode> {
    let delivery = block.keyword == "delivery";
    let example = if delivery {
        "delivery upper_block { elevation = 1312 ft, demand = 180 gpm, pressure = 35 psi }"
    } else {
        "junction J1 { elevation = 1250 ft }"
    };
    let (name, span) = block_name(
        block.args,
        block.span,
        Code::BadNode,
        "a node",
        example,
        diags,
    )?;
    if name == "pump" {
        diags.push(Diagnostic::error(
            Code::ReservedName,
            "`pump` names the pump end of a line; choose another node name",
            Some(span),
        ));
        return None;
    }
    if let Some(t) = tanks.iter().find(|t| &t.name == name) {
        diags.push(duplicate_name(&format!("node `{name}`"), span, t.span));
        return None;
    }
    if let Some(first) = earlier.iter().find(|n| &n.name == name) {
        diags.push(duplicate_name(&format!("node `{name}`"), span, first.span));
        return None;
    }
    let mut node = NetNode {
        name: name.clone(),
        delivery,
        elevation: Length::default(),
        demand: VolumeRate::default(),
        required_pressure: None,
        span,
    };
    let what = format!("{} {name}", block.keyword);
    let fields = read_fields(block.statements(), &what, NODE_FIELDS, diags);
    if fields.get("elevation").is_none() {
        diags.push(missing(
            "elevation",
            &what,
            block.span,
            "elevation = 1250 ft",
        ));
    }
    if delivery && fields.get("demand").is_none() {
        diags.push(missing("demand", &what, block.span, "demand = 180 gpm"));
    }
    for field in &fields.fields {
        if let Err(e) = set_node(&mut node, field.name, field.value, env) {
            diags.push(e);
        }
    }
    Some(node)
}

/// The network of a design whose discharge lines end at `entry`, and the destination
/// tank the reports name (the first tank the links reach, in file order).
pub fn lower_network(
    blocks: &Blocks,
    tanks: &[Tank],
    nodes: Vec<NetNode>,
    chain: &lines::Network,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> (Option<NetworkLayout>, Option<Tank>) {
    let Some(entry) = chain.entry.clone() else {
        if let Some(n) = nodes.first() {
            diags.push(Diagnostic::error(Code::UnusedNode, format!("node `{}` is not reached: no discharge line ends at a network node", n.name), Some(n.span))
                .with_help("end the discharge line at the node where the network begins: `line discharge from pump to NODE { ... }`"));
        }
        return (None, None);
    };
    let mut all: Vec<&Block> = blocks
        .all("line")
        .filter(|b| lines::is_network_line(b))
        .chain(blocks.all("valve"))
        .chain(blocks.all("equipment"))
        .collect();
    all.sort_by_key(|b| b.span.start);
    let names: Vec<String> = nodes
        .iter()
        .map(|n| n.name.clone())
        .chain(tanks.iter().map(|t| t.name.clone()))
        .collect();
    let mut links: Vec<NetLink> = Vec::new();
    for block in all {
        if let Some(link) = lower_link(block, &links, &chain.lines, &names, env, diags) {
            links.push(link);
        }
    }
    if let Some(over) = links.get(MAX_NETWORK_ITEMS) {
        diags.push(too_many("links", links.len(), over.span));
    }
    for n in &nodes {
        if n.name != entry && !links.iter().any(|l| l.from == n.name || l.to == n.name) {
            diags.push(
                Diagnostic::error(
                    Code::UnusedNode,
                    format!("node `{}` is joined to no link", n.name),
                    Some(n.span),
                )
                .with_help(format!(
                    "join it with `line NAME from {} to NODE {{ ... }}`, or remove it",
                    n.name
                )),
            );
        }
    }
    let source = chain.source.as_ref().map(|t| t.name.as_str());
    let mut reached: Vec<Tank> = Vec::new();
    for l in &links {
        for end in [&l.from, &l.to] {
            if let Some(t) = tanks.iter().find(|t| &t.name == end) {
                if Some(t.name.as_str()) != source && !reached.iter().any(|r| r.name == t.name) {
                    reached.push(t.clone());
                }
            }
        }
    }
    let returns = |t: &Tank| links.iter().any(|l| l.from == t.name || l.to == t.name);
    if let Some(src) = chain
        .source
        .as_ref()
        .filter(|t| reached.is_empty() && returns(t))
    {
        // A closed loop: the network returns to the tank the pumps draw from, the
        // loop's pressure reference (grammar/LANGUAGE.md, "Closed loops").
        let layout = NetworkLayout {
            entry,
            nodes,
            tanks: Vec::new(),
            links,
            wells: Vec::new(),
        };
        return (Some(layout), Some(src.clone()));
    }
    if reached.is_empty() {
        let span = nodes.iter().find(|n| n.name == entry).map(|n| n.span);
        if !nodes
            .iter()
            .any(|n| n.demand.get::<cubic_meter_per_second>() > 0.0)
        {
            diags.push(Diagnostic::error(Code::NoDownstreamTank, "the network reaches no tank downstream of the station and draws no demand: the station's flow has nowhere to go", span)
                .with_help("give the delivery points their demands (`demand = 180 gpm`), or add a tank with `tank NAME { level = ... }` and a line to it"));
            return (None, None);
        }
        let stand_in = demand_only_destination(span.unwrap_or_default());
        return (
            Some(NetworkLayout {
                entry,
                nodes,
                tanks: reached,
                links,
                wells: Vec::new(),
            }),
            Some(stand_in),
        );
    }
    let destination = reached.remove(0);
    (
        Some(NetworkLayout {
            entry,
            nodes,
            tanks: reached,
            links,
            wells: Vec::new(),
        }),
        Some(destination),
    )
}

/// The name of the stand-in destination of a network without a downstream tank (not an
/// identifier, so no case override or requirement can name it).
pub const DEMAND_ONLY_DESTINATION: &str = "network demands";

/// The stand-in destination of a network without a downstream tank: the engine
/// replaces its level and pressure by the governing node's
/// ([`crate::analysis::network::station`]); it only fills the scenario's slot.
pub(super) fn demand_only_destination(span: Span) -> Tank {
    Tank {
        name: DEMAND_ONLY_DESTINATION.into(),
        level: Length::new::<meter>(0.0),
        surface_pressure: SurfacePressure::Gauge(Pressure::new::<pascal>(0.0)),
        drawdown: None,
        test_flow: None,
        well_loss: None,
        reference: crate::model::design::LoopReference::default(),
        span,
    }
}

pub(super) fn lower_link(
    block: &Block,
    earlier: &[NetLink],
    chain: &[Line],
    names: &[String],
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<NetLink> {
    let Some((name, span, from, to)) = line_ends(block.args) else {
        diags.push(
            Diagnostic::error(
                Code::BadLink,
                format!(
                    "a {} is `{} NAME from A to B {{ ... }}`",
                    block.keyword, block.keyword
                ),
                Some(block.span),
            )
            .with_help("e.g. `valve V1 from J1 to J2 { kvs = 63 m^3/h, opening = 60 % }`"),
        );
        return None;
    };
    if let Some(first) = earlier.iter().find(|l| l.name == name) {
        diags.push(duplicate_name(&format!("link `{name}`"), span, first.span));
        return None;
    }
    if let Some(first) = chain.iter().find(|l| l.name == name) {
        diags.push(duplicate_name(&format!("link `{name}`"), span, first.span));
        return None;
    }
    let mut ok = true;
    for end in [&from, &to] {
        if !names.contains(&end.0) {
            diags.push(unknown_node(&end.0, end.1, names));
            ok = false;
        }
    }
    if ok && from.0 == to.0 {
        diags.push(Diagnostic::error(
            Code::BadLink,
            format!("link `{name}` starts and ends at `{}`", from.0),
            Some(span),
        ));
        ok = false;
    }
    let kind = match block.keyword {
        "valve" => NetLinkKind::Valve(lower_valve(block, &name, env, diags)?),
        "equipment" => NetLinkKind::Equipment(lower_equipment(block, &name, env, diags)?),
        _ => {
            let segments = lower_segments(block.statements(), env, diags);
            if segments.is_empty() {
                diags.push(
                    Diagnostic::error(
                        Code::EmptyLine,
                        format!("line `{name}` has no pipe"),
                        Some(span),
                    )
                    .with_help("add `pipe MATERIAL SIZE { length = ... }`"),
                );
                return None;
            }
            NetLinkKind::Pipe(segments)
        }
    };
    let check = match &kind {
        NetLinkKind::Pipe(segs) => segs
            .iter()
            .flat_map(|s| &s.fittings)
            .any(|f| f.spec.name.starts_with("check_valve")),
        _ => false,
    };
    ok.then_some(NetLink {
        name,
        from: from.0,
        to: to.0,
        kind,
        check,
        span,
    })
}

pub(super) fn unknown_node(name: &str, span: Span, names: &[String]) -> Diagnostic {
    let near = nearest(name, names.iter().map(|n| n.as_str()));
    Diagnostic::error(
        Code::UnknownName,
        format!("there is no node or tank `{name}`"),
        Some(span),
    )
    .with_label("unknown node")
    .with_help(if near.is_empty() {
        "define it with `junction NAME { elevation = ... }` or `tank NAME { level = ... }`"
            .to_string()
    } else {
        format!("did you mean {}?", eval::quote_list(&near))
    })
}

fn lower_valve(
    block: &Block,
    name: &str,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<ValveData> {
    let what = format!("valve {name}");
    let fields = read_fields(block.statements(), &what, VALVE_FIELDS, diags);
    let mut v = ValveData {
        kvs: 0.0,
        characteristic: ValveCharacteristic::Linear,
        opening: 1.0,
        control: false,
    };
    match (fields.get("kvs"), fields.get("cvs")) {
        (None, None) => {
            diags.push(missing("kvs", &what, block.span, "kvs = 63 m^3/h"));
            return None;
        }
        (Some(_), Some(c)) => {
            diags.push(
                Diagnostic::error(
                    Code::DuplicateField,
                    format!("{what} gives both `kvs` and `cvs`"),
                    Some(c.span),
                )
                .with_help("give one flow coefficient"),
            );
            return None;
        }
        _ => {}
    }
    // The characteristic first, so a rangeability applies to it.
    let mut ordered: Vec<_> = fields.fields.iter().collect();
    ordered.sort_by_key(|f| (f.name != "characteristic", f.name == "rangeability"));
    let errors = diags.len();
    for field in ordered {
        if let Err(e) = set_valve(&mut v, field.name, field.value, env) {
            diags.push(e);
        }
    }
    (diags.len() == errors).then_some(v)
}

fn lower_equipment(
    block: &Block,
    name: &str,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<EquipmentData> {
    let what = format!("equipment {name}");
    let fields = read_fields(block.statements(), &what, EQUIPMENT_FIELDS, diags);
    let mut q = EquipmentData {
        drop: Pressure::default(),
        rated_flow: VolumeRate::default(),
        exponent: 2.0,
        rated_on_water: false,
    };
    let mut complete = true;
    for (field, example) in [
        ("drop", "drop = 35 kPa"),
        ("rated_flow", "rated_flow = 12 L/s"),
    ] {
        if fields.get(field).is_none() {
            diags.push(missing(field, &what, block.span, example));
            complete = false;
        }
    }
    let errors = diags.len();
    for field in &fields.fields {
        if let Err(e) = set_equipment(&mut q, field.name, field.value, env) {
            diags.push(e);
        }
    }
    (complete && diags.len() == errors).then_some(q)
}
