//! A well field: `wellpump NAME from WELL to NODE { ... }` links, each the candidate
//! pump set in its own well, discharging into a collector network of junctions, lines,
//! valves and equipment that ends at a tank or at deliveries (grammar/LANGUAGE.md,
//! "Well fields"). A design with well pumps has no `station` and no chain lines.

use uom::si::f64::Length;
use uom::si::volume_rate::cubic_meter_per_second;

use super::lines::line_ends;
use super::network::{
    demand_only_destination, lower_link, too_many, unknown_node, MAX_NETWORK_ITEMS,
};
use super::{duplicate_name, Block, Blocks};
use crate::diagnostics::{Code, Diagnostic, Span};
use crate::model::design::*;
use crate::model::eval::Env;
use crate::model::fields::{missing, read_fields};
use crate::model::network::*;
use crate::model::scenario::{expect_level, lower_segments};
use crate::syntax::ast::{Statement, StatementKind};

/// What a well field gives the base scenario.
pub struct Field {
    /// The collector network with its well pumps.
    pub layout: NetworkLayout,
    /// The first well pump's well (the scenario's source slot).
    pub source: Tank,
    /// The first tank downstream (or the demand-only stand-in).
    pub destination: Tank,
    /// The first well pump's setting (the scenario's centreline slot).
    pub centreline: Length,
}

/// True when the design states a well pump.
pub fn is_field(blocks: &Blocks) -> bool {
    blocks.all("wellpump").next().is_some()
}

/// A `station` block or a chain line (to or from `pump`) in a well-field design.
fn station_conflicts(blocks: &Blocks, diags: &mut Vec<Diagnostic>) {
    let first = blocks.all("wellpump").next().map(|b| b.span);
    let conflict = |span: Span, what: &str| {
        let mut d = Diagnostic::error(
            Code::WellFieldWithStation,
            format!("{what} in a design with well pumps"),
            Some(span),
        )
        .with_label("a station design's statement")
        .with_help("a well field has no station: each `wellpump` is its own pump setting; write the piping inside the well pumps and as `line NAME from NODE to NODE`");
        if let Some(f) = first {
            d = d.with_secondary(f, "the first well pump");
        }
        d
    };
    if let Some(s) = blocks.one("station") {
        diags.push(conflict(s.span, "a `station`"));
    }
    for b in blocks.all("line") {
        if line_ends(b.args).is_some_and(|(_, _, a, z)| a.0 == "pump" || z.0 == "pump") {
            diags.push(conflict(b.span, "a line to or from `pump`"));
        }
    }
}

/// Lower a well-field design's network: the links between nodes, the well pumps, the
/// downstream tank. `None` when something essential is missing (diagnosed).
pub fn lower_field(
    blocks: &Blocks,
    tanks: &[Tank],
    nodes: Vec<NetNode>,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<Field> {
    station_conflicts(blocks, diags);
    let names: Vec<String> = nodes
        .iter()
        .map(|n| n.name.clone())
        .chain(tanks.iter().map(|t| t.name.clone()))
        .collect();
    let mut all: Vec<&Block> = blocks
        .all("line")
        .filter(|b| line_ends(b.args).is_some_and(|(_, _, a, z)| a.0 != "pump" && z.0 != "pump"))
        .chain(blocks.all("valve"))
        .chain(blocks.all("equipment"))
        .collect();
    all.sort_by_key(|b| b.span.start);
    let mut links: Vec<NetLink> = Vec::new();
    for block in all {
        if let Some(link) = lower_link(block, &links, &[], &names, env, diags) {
            links.push(link);
        }
    }
    if let Some(over) = links.get(MAX_NETWORK_ITEMS) {
        diags.push(too_many("links", links.len(), over.span));
    }
    let mut wells: Vec<WellPump> = Vec::new();
    for block in blocks.all("wellpump") {
        let known = Known {
            tanks,
            nodes: &nodes,
            links: &links,
            names: &names,
        };
        if let Some(w) = lower_well_pump(block, &wells, &known, env, diags) {
            wells.push(w);
        }
    }
    if let Some(over) = wells.get(MAX_NETWORK_ITEMS) {
        diags.push(too_many("well pumps", wells.len(), over.span));
    }
    well_loops(&wells, &links, diags);
    unused_nodes(&nodes, &links, &wells, diags);
    let first = wells.first()?;
    let source = tanks.iter().find(|t| t.name == first.well)?.clone();
    let destination = downstream(tanks, &nodes, &links, &wells, diags)?;
    let entry = first.to.clone();
    let centreline = first.elevation;
    let tanks: Vec<Tank> = tanks
        .iter()
        .filter(|t| t.name != source.name && t.name != destination.name)
        .filter(|t| {
            wells.iter().any(|w| w.well == t.name || w.to == t.name)
                || links.iter().any(|l| l.from == t.name || l.to == t.name)
        })
        .cloned()
        .collect();
    Some(Field {
        layout: NetworkLayout {
            entry,
            nodes,
            tanks,
            links,
            wells,
        },
        source,
        destination,
        centreline,
    })
}

/// What a well pump's ends and name are checked against.
struct Known<'a> {
    tanks: &'a [Tank],
    nodes: &'a [NetNode],
    links: &'a [NetLink],
    names: &'a [String],
}

const WELLPUMP_EXAMPLE: &str = "wellpump WP1 from well_1 to collector { elevation = 1120 ft }";

fn lower_well_pump(
    block: &Block,
    earlier: &[WellPump],
    known: &Known,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<WellPump> {
    let Some((name, span, from, to)) = line_ends(block.args) else {
        diags.push(
            Diagnostic::error(
                Code::BadLink,
                "a well pump is `wellpump NAME from WELL to NODE { ... }`",
                Some(block.span),
            )
            .with_help(format!("e.g. `{WELLPUMP_EXAMPLE}`")),
        );
        return None;
    };
    if let Some(first) = earlier.iter().find(|w| w.name == name) {
        diags.push(duplicate_name(
            &format!("well pump `{name}`"),
            span,
            first.span,
        ));
        return None;
    }
    if let Some(first) = known.links.iter().find(|l| l.name == name) {
        diags.push(duplicate_name(&format!("link `{name}`"), span, first.span));
        return None;
    }
    if let Some(n) = known.nodes.iter().find(|n| n.name == name) {
        diags.push(duplicate_name(&format!("well pump `{name}`"), span, n.span));
        return None;
    }
    if let Some(t) = known.tanks.iter().find(|t| t.name == name) {
        diags.push(duplicate_name(&format!("well pump `{name}`"), span, t.span));
        return None;
    }
    let mut ok = true;
    if !known.tanks.iter().any(|t| t.name == from.0) {
        let tank_names: Vec<String> = known.tanks.iter().map(|t| t.name.clone()).collect();
        let near = crate::names::nearest(&from.0, tank_names.iter().map(|n| n.as_str()));
        diags.push(
            Diagnostic::error(
                Code::UnknownName,
                format!(
                    "there is no tank `{}` for well pump `{name}` to draw from",
                    from.0
                ),
                Some(from.1),
            )
            .with_label("a well pump draws from a tank (a well, or a sump without `drawdown`)")
            .with_help(if near.is_empty() {
                "define the well with `tank NAME { level = ..., drawdown = ..., test_flow = ... }`"
                    .to_string()
            } else {
                format!("did you mean {}?", crate::model::eval::quote_list(&near))
            }),
        );
        ok = false;
    }
    if !known.names.contains(&to.0) {
        diags.push(unknown_node(&to.0, to.1, known.names));
        ok = false;
    }
    if ok && from.0 == to.0 {
        diags.push(Diagnostic::error(
            Code::BadLink,
            format!("well pump `{name}` starts and ends at `{}`", from.0),
            Some(span),
        ));
        ok = false;
    }
    if let Some(other) = earlier.iter().find(|w| w.well == from.0) {
        diags.push(
            Diagnostic::error(
                Code::BadLink,
                format!("well `{}` has a second well pump `{name}`", from.0),
                Some(span),
            )
            .with_secondary(other.span, "its first well pump")
            .with_help("one well pump per well: the drawdown follows the well's whole flow; give the second pump its own well"),
        );
        ok = false;
    }
    let what = format!("wellpump {name}");
    let fields = read_fields(block.statements(), &what, WELLPUMP_FIELDS, diags);
    let elevation = match fields.get("elevation") {
        Some(f) => match expect_level(f.value, env, "well pump elevation") {
            Ok(z) => Some(z),
            Err(d) => {
                diags.push(d);
                None
            }
        },
        None => {
            diags.push(missing(
                "elevation",
                &what,
                block.span,
                "elevation = 1120 ft",
            ));
            None
        }
    };
    let (suction, discharge) = split_runs(&fields.rest);
    let suction = suction.map_or_else(Vec::new, |b| lower_segments(b, env, diags));
    let discharge = lower_segment_list(&discharge, env, diags);
    (ok && elevation.is_some()).then(|| WellPump {
        name,
        well: from.0,
        to: to.0,
        elevation: elevation.unwrap_or_default(),
        suction,
        discharge,
        running: true,
        span,
    })
}

/// A well pump's runs: its `suction { ... }` body, and the rest of its body (the
/// discharge run's pipes, fittings and losses).
fn split_runs<'a>(rest: &[&'a Statement]) -> (Option<&'a [Statement]>, Vec<&'a Statement>) {
    let mut suction = None;
    let mut discharge = Vec::new();
    for st in rest {
        match &st.kind {
            StatementKind::Block { keyword, body, .. } if keyword.name == "suction" => {
                suction = Some(body.as_deref().unwrap_or(&[]));
            }
            _ => discharge.push(*st),
        }
    }
    (suction, discharge)
}

fn lower_segment_list(body: &[&Statement], env: &Env, diags: &mut Vec<Diagnostic>) -> Vec<Segment> {
    let owned: Vec<Statement> = body.iter().map(|s| (*s).clone()).collect();
    lower_segments(&owned, env, diags)
}

/// A well that a network link reaches, or a well pump discharging into another well
/// pump's well: a closed loop through a well (`well-pump-in-loop`).
fn well_loops(wells: &[WellPump], links: &[NetLink], diags: &mut Vec<Diagnostic>) {
    for w in wells {
        if let Some(l) = links.iter().find(|l| l.from == w.well || l.to == w.well) {
            diags.push(
                Diagnostic::error(
                    Code::WellPumpInLoop,
                    format!("{} `{}` joins well `{}`, which well pump `{}` draws from", l.kind.word(), l.name, w.well, w.name),
                    Some(l.span),
                )
                .with_secondary(w.span, "the well pump")
                .with_help("a well is a source: only its well pump draws from it; end the collector at a tank or at deliveries"),
            );
        }
        if let Some(o) = wells.iter().find(|o| o.well == w.to) {
            diags.push(
                Diagnostic::error(
                    Code::WellPumpInLoop,
                    format!(
                        "well pump `{}` discharges into well `{}`, which well pump `{}` draws from",
                        w.name, w.to, o.name
                    ),
                    Some(w.span),
                )
                .with_help(
                    "discharge into a collector node or a tank that no well pump draws from",
                ),
            );
        }
    }
}

fn unused_nodes(
    nodes: &[NetNode],
    links: &[NetLink],
    wells: &[WellPump],
    diags: &mut Vec<Diagnostic>,
) {
    for n in nodes {
        let used = links.iter().any(|l| l.from == n.name || l.to == n.name)
            || wells.iter().any(|w| w.to == n.name);
        if !used {
            diags.push(
                Diagnostic::error(
                    Code::UnusedNode,
                    format!("node `{}` is joined to no link or well pump", n.name),
                    Some(n.span),
                )
                .with_help(format!(
                    "join it with `line NAME from {} to NODE {{ ... }}`, or remove it",
                    n.name
                )),
            );
        }
    }
}

/// The field's destination: the first tank (in file order of the links and well pumps)
/// that no well pump draws from; else the demand-only stand-in when a node draws a
/// demand; else `no-downstream-tank`.
fn downstream(
    tanks: &[Tank],
    nodes: &[NetNode],
    links: &[NetLink],
    wells: &[WellPump],
    diags: &mut Vec<Diagnostic>,
) -> Option<Tank> {
    let is_well = |name: &str| wells.iter().any(|w| w.well == name);
    let mut ends: Vec<(usize, &str)> = links
        .iter()
        .flat_map(|l| {
            [
                (l.span.start, l.from.as_str()),
                (l.span.start, l.to.as_str()),
            ]
        })
        .chain(wells.iter().map(|w| (w.span.start, w.to.as_str())))
        .collect();
    ends.sort_by_key(|e| e.0);
    if let Some(t) = ends
        .iter()
        .filter(|(_, n)| !is_well(n))
        .find_map(|(_, n)| tanks.iter().find(|t| t.name == *n))
    {
        return Some(t.clone());
    }
    let demand: f64 = nodes
        .iter()
        .map(|n| n.demand.get::<cubic_meter_per_second>())
        .sum();
    let span = wells.first().map(|w| w.span);
    if demand > 0.0 {
        return Some(demand_only_destination(span.unwrap_or_default()));
    }
    diags.push(Diagnostic::error(Code::NoDownstreamTank, "the well field's collector reaches no tank and draws no demand: the wells' flow has nowhere to go", span)
        .with_help("give the delivery points their demands (`demand = 180 gpm`), or add a tank with `tank NAME { level = ... }` and a line to it"));
    None
}
