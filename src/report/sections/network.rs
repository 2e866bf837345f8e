//! The network chapter (general-form designs only): how the network is solved, its
//! links with the data each loss is computed from, and per case and candidate the
//! nodes (head, pressure, flags) and links (flow, velocity, head loss) at the duty.

use crate::analysis::network::station::{NetworkAtDuty, StationNetwork};
use crate::analysis::network::{Characteristic, Element};
use crate::analysis::system::k_of;
use crate::analysis::Analysis;
use crate::analysis::CaseSystem;
use crate::display::Units;
use crate::model::Design;
use crate::report::layout::chart::{Chart, Marker, Series};
use crate::report::layout::document::{Align, Block, Column};

/// The chapter, when the design has a network.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    if design.base.network.is_none() {
        return;
    }
    blocks.push(Block::heading(1, "Network"));
    let valve_law = if units.system == crate::model::ReportUnits::Us {
        "valves follow Δp = SG·(Q/Cv)² with Δp in psi and Q in US gal/min (Cv = 1.156 Kv; \
         IEC 60534-2-1, SG relative to water of the Kv definition)"
    } else {
        "valves follow Δp = (ρ/ρ₀)·(Q/Kv)² with Δp in bar and Q in m³/h (IEC 60534-2-1, ρ₀ \
         of water, 1000 kg/m³; Cv = 1.156 Kv)"
    };
    let field = crate::analysis::well_field::is_field(&design.base);
    let (opening, closing) = if field {
        (
            "The well pumps discharge into the collector (see Well field); from there the \
             flow goes to the delivery points, junction demands and the downstream tanks.",
            "Each well adds its static level (a fixed head), its drawdown, suction, pump and \
             discharge links to the network, named after its well pump.",
        )
    } else {
        (
            "The discharge lines end at the network's entry node; from there the flow \
             divides between the delivery points, junction demands and the downstream tanks.",
            "The system curve is the head the station must supply at each flow with the \
             split solved at that flow: its 'network' part is the entry node's head above \
             its value at zero station flow.",
        )
    };
    blocks.push(Block::text(format!(
        "{opening} Heads at \
         the junctions and flows in the links are solved together by the global gradient \
         algorithm (Todini, E. and Pilati, S., \"A gradient algorithm for the analysis of \
         pipe networks\", Computer Applications in Water Supply, vol. 1, 1988): every link's \
         head loss equals the head difference across it and the flows balance at every \
         junction, both far below the printed precision. Pipe runs use the same friction and \
         fitting methods as the chain; {valve_law}, at the Kv of their inherent \
         characteristic (linear Kv = x·Kvs, equal percentage Kv = Kvs·R⁽ˣ⁻¹⁾ with R the rangeability, x the \
         opening); equipment scales its stated drop as (Q/Q_rated)ⁿ. {closing}"
    )));
    if let Some(text) = closed_loop_method(design, units) {
        blocks.push(Block::text(text));
    }
    if let Some(text) = demand_only_method(analysis, units) {
        blocks.push(Block::text(text));
    }
    if let Some(text) = valve_check_method(design) {
        blocks.push(Block::text(text));
    }
    blocks.push(Block::text(
        "Pressures are steady-state values. Nodes below atmospheric pressure or near the \
         vapour pressure are flagged; such pressures, and every pressure rating, call for a \
         transient (surge) analysis and for review by a licensed engineer under the local \
         codes, with the pipe and valve manufacturers' certified data.",
    ));
    if let Some((net, _)) = analysis
        .cases
        .iter()
        .find_map(|c| c.system.as_ref().and_then(|s| s.network.as_ref()))
    {
        links_table(blocks, net, units);
    }
    if !design.node_requirements.is_empty() {
        let pr = units.gauge_pressure();
        let fl = units.flow();
        let rows = design
            .node_requirements
            .iter()
            .map(|r| {
                let (what, limit) = match r.quantity {
                    crate::model::network::NodeQuantity::Pressure => {
                        ("pressure", pr.fmt(r.limit_si))
                    }
                    crate::model::network::NodeQuantity::Flow => {
                        ("flow into the tank", fl.fmt(r.limit_si))
                    }
                };
                vec![
                    format!(
                        "{what} at {} {} {limit}",
                        r.node,
                        if r.at_least { "≥" } else { "≤" }
                    ),
                    if r.cases.is_empty() {
                        "every case".to_string()
                    } else {
                        r.cases.join(", ")
                    },
                ]
            })
            .collect();
        blocks.push(Block::Table {
            columns: vec![
                Column::new("Requirement at a node", 0.6, Align::Left),
                Column::new("Applies to", 0.4, Align::Left),
            ],
            rows,
            caption: Some(
                "Requirements at network nodes (checked at every duty; see Checks)".into(),
            ),
        });
    }
    if let Some((case, p, at)) = analysis.cases.iter().find_map(|c| {
        c.pumps
            .iter()
            .find_map(|p| p.network.as_ref().map(|at| (c, p, at)))
    }) {
        if let Some(sys) = &case.system {
            schematic(blocks, sys, &case.name, &p.name, at, units);
        }
    }
    for case in &analysis.cases {
        for p in &case.pumps {
            if let Some(at) = &p.network {
                state_tables(
                    blocks,
                    &format!("case {}, pump {}", case.name, p.name),
                    at,
                    units,
                );
            }
        }
    }
}

/// The method of a network without a downstream tank: scaled demands and the governing
/// node (see [`crate::analysis::network::station`]), with the design demand per case.
fn demand_only_method(analysis: &Analysis, units: &Units) -> Option<String> {
    let per_case: Vec<String> = analysis
        .cases
        .iter()
        .filter_map(|c| {
            let (net, _) = c.system.as_ref()?.network.as_ref()?;
            let d = net.pattern.as_ref()?.design_demand;
            Some(format!("{} {}", c.name, units.flow().text(d)))
        })
        .collect();
    if per_case.is_empty() {
        return None;
    }
    Some(format!(
        "The network reaches no tank downstream of the station, so nothing fixes its heads \
         but the station. At a station flow Q the case's demands are scaled alike by Q / D, \
         D being their sum as designed (scale 1), so that they draw exactly Q; the entry \
         node's head is then the smallest that keeps every node with a required pressure at \
         it, and every node drawing a demand at zero gauge pressure or above (the critical \
         node governs). That head, less its value at zero flow, is the network part of the \
         system curve, and the duty is where the pump curve meets it. The design demands \
         (scale 1) are the requirement point: a duty below them fails the check \
         'design-demand', a duty above them delivers more than designed at the same \
         governing pressure. Node pressures and demands below are at the duty, with the \
         demands scaled. Design demand D per case: {}.",
        per_case.join("; ")
    ))
}

/// The links with the data their losses come from (base case values).
fn links_table(blocks: &mut Vec<Block>, net: &StationNetwork, units: &Units) {
    let (len, dia, rough) = (units.length(), units.diameter(), units.roughness());
    let pr = units.pressure();
    let fl = units.flow();
    let rows = net
        .network
        .links
        .iter()
        .map(|l| {
            let data = match &l.element {
                Element::Pipe(run) => run
                    .segments
                    .iter()
                    .map(|s| {
                        let k: Vec<String> = s
                            .fittings
                            .iter()
                            .map(|f| {
                                format!(
                                    "{} × {} (K {:.3} at Re 1e5)",
                                    f.count,
                                    super::wording::fitting(f.spec.description),
                                    k_of(f, 1e5, s.inner_diameter)
                                )
                            })
                            .collect();
                        format!(
                            "{}, ID {}, {}, roughness {}{}{}",
                            crate::display::pipe(
                                s.material,
                                &s.size_label,
                                s.inner_diameter,
                                units
                            ),
                            dia.fmt(s.inner_diameter),
                            len.fmt(s.length),
                            rough.fmt(s.roughness),
                            if s.k_constant > 0.0 {
                                format!(", constant-K sum {:.2}", s.k_constant)
                            } else {
                                String::new()
                            },
                            if k.is_empty() {
                                String::new()
                            } else {
                                format!("; {}", k.join(", "))
                            }
                        )
                    })
                    .collect::<Vec<_>>()
                    .join("; then "),
                Element::Valve(v) => format!(
                    "{}, {}, opening {:.0} %: {}",
                    coefficient(units, v.kvs, "s"),
                    match v.characteristic {
                        Characteristic::Linear => "linear".to_string(),
                        Characteristic::EqualPercentage { rangeability } =>
                            format!("equal percentage, R = {rangeability:.0}"),
                    },
                    100.0 * v.opening,
                    coefficient(units, v.kv(), "")
                ),
                Element::Equipment(e) => format!(
                    "drop {} at {}, exponent {:.2}",
                    pr.fmt(e.rated_drop),
                    fl.fmt(e.rated_flow),
                    e.exponent
                ),
                Element::Pump(_) => "pump set".to_string(),
                Element::Drawdown(w) => format!(
                    "well drawdown {} at {} (well loss {})",
                    len.fmt(w.drawdown),
                    fl.fmt(w.test_flow),
                    len.fmt(w.well_loss)
                ),
            };
            vec![
                l.name.clone(),
                format!(
                    "{} → {}",
                    net.network.nodes[l.from].name, net.network.nodes[l.to].name
                ),
                format!(
                    "{}{}",
                    l.element.kind(),
                    if l.check { ", check valve" } else { "" }
                ),
                data,
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Link", 0.15, Align::Left),
            Column::new("From → to", 0.22, Align::Left),
            Column::new("Kind", 0.11, Align::Left),
            Column::new("Data (first case)", 0.52, Align::Left),
        ],
        rows,
        caption: Some("Network links".into()),
    });
}

/// Nodes and links at one duty.
fn state_tables(blocks: &mut Vec<Block>, what: &str, at: &NetworkAtDuty, units: &Units) {
    let (fl, hd, pr, vel, el) = (
        units.flow(),
        units.head(),
        units.gauge_pressure(),
        units.velocity(),
        units.elevation(),
    );
    blocks.push(Block::heading(2, format!("Network at the duty, {what}")));
    let nodes = at
        .nodes
        .iter()
        .map(|n| {
            let mut flags = Vec::new();
            if n.below_required {
                flags.push("below required");
            }
            if n.below_atmospheric {
                flags.push("below atmospheric");
            }
            if n.near_vapour {
                flags.push("near vapour pressure");
            }
            vec![
                n.name.clone(),
                n.kind.to_string(),
                el.figure(n.elevation),
                hd.figure(n.head),
                pr.figure(n.pressure),
                match (n.inflow, n.demand > 0.0) {
                    (Some(q), _) => format!("in {}", fl.figure(q)),
                    (None, true) => fl.figure(n.demand),
                    (None, false) => "–".into(),
                },
                n.required_pressure
                    .map(|r| pr.figure(r))
                    .unwrap_or_else(|| "–".into()),
                if flags.is_empty() {
                    "ok".into()
                } else {
                    flags.join(", ")
                },
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Node", 0.17, Align::Left),
            Column::new("Kind", 0.10, Align::Left),
            Column::new(format!("Elev. ({})", el.label), 0.10, Align::Right),
            Column::new(format!("Head ({})", hd.label), 0.10, Align::Right),
            Column::new(format!("Pressure ({})", pr.label), 0.11, Align::Right),
            Column::new(format!("Demand ({})", fl.label), 0.12, Align::Right),
            Column::new(format!("Required ({})", pr.label), 0.11, Align::Right),
            Column::new("Flag", 0.19, Align::Left),
        ],
        rows: nodes,
        caption: Some(match at.demand_scale {
            None => format!(
                "Nodes at the duty, {what} (station flow {}); pressure = ρg(head − elevation); a tank's column gives its inflow",
                fl.fmt(at.station_flow)
            ),
            Some(scale) => format!(
                "Nodes at the duty, {what} (station flow {}: the design demands {} scaled by {scale:.3}); pressure = ρg(head − elevation)",
                fl.fmt(at.station_flow),
                fl.fmt(at.station_flow / scale)
            ),
        }),
    });
    let links = at
        .links
        .iter()
        .map(|l| {
            vec![
                l.name.clone(),
                format!("{} → {}", l.from, l.to),
                fl.figure(l.flow),
                l.velocity
                    .map(|v| vel.figure(v))
                    .unwrap_or_else(|| "–".into()),
                hd.figure(l.head_loss),
                if l.closed {
                    "closed".into()
                } else {
                    "open".into()
                },
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Link", 0.20, Align::Left),
            Column::new("From → to", 0.30, Align::Left),
            Column::new(format!("Flow ({})", fl.label), 0.13, Align::Right),
            Column::new(format!("Velocity ({})", vel.label), 0.13, Align::Right),
            Column::new(format!("Head loss ({})", hd.label), 0.14, Align::Right),
            Column::new("State", 0.10, Align::Left),
        ],
        rows: links,
        caption: Some(format!("Links at the duty, {what}; head loss = head(from) − head(to); velocity is the largest along a pipe run")),
    });
}

/// A flow coefficient in the report's convention: Cv (US gal/min at 1 psi) for US
/// units, Kv (m³/h at 1 bar) for SI; `suffix` is "s" for the fully open value.
fn coefficient(units: &Units, kv: f64, suffix: &str) -> String {
    if units.system == crate::model::ReportUnits::Us {
        format!("Cv{suffix} {:.1}", kv * crate::model::network::CV_PER_KV)
    } else {
        format!("Kv{suffix} {kv:.1} m³/h at 1 bar")
    }
}

/// Each node's layer for a schematic: breadth-first over the links from `roots`, which
/// are at layer `first`; a node no link reaches is drawn at `first` too.
pub(super) fn layers_from(at: &NetworkAtDuty, roots: &[usize], first: usize) -> Vec<usize> {
    let index = |name: &str| at.nodes.iter().position(|x| x.name == name);
    let mut layer = vec![usize::MAX; at.nodes.len()];
    let mut queue = std::collections::VecDeque::new();
    for &r in roots {
        layer[r] = first;
        queue.push_back(r);
    }
    while let Some(i) = queue.pop_front() {
        for l in &at.links {
            let (a, b) = (index(&l.from), index(&l.to));
            for (x, y) in [(a, b), (b, a)] {
                if let (Some(x), Some(y)) = (x, y) {
                    if x == i && layer[y] == usize::MAX {
                        layer[y] = layer[i] + 1;
                        queue.push_back(y);
                    }
                }
            }
        }
    }
    layer
        .iter()
        .map(|&l| if l == usize::MAX { first } else { l })
        .collect()
}

/// Where node `name` is drawn in a schematic: (layer, head in report units).
pub(super) fn node_position(
    at: &NetworkAtDuty,
    layer: &[usize],
    hd: &crate::display::Shown,
    name: &str,
) -> Option<(f64, f64)> {
    at.nodes
        .iter()
        .position(|x| x.name == name)
        .map(|i| (layer[i] as f64, hd.value(at.nodes[i].head)))
}

/// The schematic figure: the links `series` and node `points` on axes fitted to the
/// layers and heads (8 % head margin, at least one unit of head).
pub(super) fn schematic_figure(
    blocks: &mut Vec<Block>,
    series: Vec<Series>,
    points: Vec<Marker>,
    layer: &[usize],
    labels: (String, String),
    caption: String,
) {
    let deepest = layer.iter().copied().max().unwrap_or(1) as f64;
    let (lo, hi) = points
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), m| {
            (a.min(m.y), b.max(m.y))
        });
    let pad = 0.08 * (hi - lo).max(1.0);
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: labels.0,
            y_label: labels.1,
            x_range: Some((-0.3, deepest + 0.8)),
            y_range: Some((lo - pad, hi + pad)),
            series,
            points,
            legend: false,
            ..Default::default()
        },
        height_mm: 110.0,
        caption,
    });
}

/// A hydraulic-grade schematic of the network at one duty: every node at its layer from
/// the source (x) and its head (y), the links between them, the pump set marked.
fn schematic(
    blocks: &mut Vec<Block>,
    sys: &CaseSystem,
    case: &str,
    pump: &str,
    at: &NetworkAtDuty,
    units: &Units,
) {
    let Some((net, _)) = &sys.network else {
        return;
    };
    let hd = units.head();
    let entry = &net.network.nodes[net.entry].name;
    // The source tank at layer 0, the entry node at 1, each node one more than the
    // nearest node upstream (breadth first along the links, either direction).
    let roots: Vec<usize> = at
        .nodes
        .iter()
        .position(|x| &x.name == entry)
        .into_iter()
        .collect();
    let layer = layers_from(at, &roots, 1);
    let source_head = sys.source_grade().m();
    let position = |name: &str| node_position(at, &layer, &hd, name);
    let mut series = Vec::new();
    let mut points = Vec::new();
    let src = (0.0, hd.value(source_head));
    if let Some(e) = position(entry) {
        series.push(Series {
            name: format!("pump set {pump} and the discharge lines"),
            points: vec![src, e],
            style_index: 1,
            dashed: true,
            ..Default::default()
        });
        points.push(Marker {
            x: src.0,
            y: src.1,
            label: "source".into(),
            ..Default::default()
        });
        points.push(Marker {
            x: 0.5,
            y: 0.5 * (src.1 + e.1),
            label: format!("pump set {pump}"),
            ..Default::default()
        });
    }
    for l in &at.links {
        if let (Some(a), Some(b)) = (position(&l.from), position(&l.to)) {
            series.push(Series {
                name: String::new(),
                points: vec![a, b],
                style_index: 0,
                solid: true,
                ..Default::default()
            });
        }
    }
    for (i, n) in at.nodes.iter().enumerate() {
        points.push(Marker {
            x: layer[i] as f64,
            y: hd.value(n.head),
            label: n.name.clone(),
            ..Default::default()
        });
    }
    let labels = (
        "Layer from the source (links)".to_string(),
        format!("Head ({})", hd.label),
    );
    let caption = format!(
        "Network schematic at the duty, case {case}, pump {pump}: nodes at their layer from the source and their head; lines are links"
    );
    schematic_figure(blocks, series, points, &layer, labels, caption);
}

/// The closed-loop paragraph: the reference tank, the cancelled static head, the minimum
/// and maximum pressures, the high point and the equipment rated on water.
fn closed_loop_method(design: &Design, units: &Units) -> Option<String> {
    let s = &design.base;
    if !crate::analysis::closed_loop::is_closed_loop(s) {
        return None;
    }
    let pr = units.pressure();
    let r = &s.source.reference;
    let max = r.max_pressure.map_or_else(
        || "no maximum is stated, so the rating screen takes the minimum".to_string(),
        |p| {
            format!(
                "the maximum, {} gauge, is used for the pressure ratings and the shut-off screen",
                pr.fmt(p.get::<uom::si::pressure::pascal>())
            )
        },
    );
    let least = r
        .high_point_pressure
        .map_or(crate::analysis::limits::LOOP_HIGH_POINT_PA.value, |p| {
            p.get::<uom::si::pressure::pascal>()
        });
    let water = s.network.iter().flat_map(|n| &n.links).any(
        |l| matches!(&l.kind, crate::model::network::NetLinkKind::Equipment(q) if q.rated_on_water),
    );
    let restated = if water {
        " Drops rated on water are restated for the fluid at the same flow by the density ratio, Δp = Δp_water·ρ/ρ₀ (ρ₀ = 1000 kg/m³; the specific-gravity correction of fully turbulent flow); no viscosity correction is applied."
    } else {
        ""
    };
    Some(format!(
        "This is a closed loop: the network returns to {}, the tank the pumps draw from, which is the loop's pressure reference. Its level and surface pressure are both ends of the system, so the static head cancels and the system curve is friction and equipment only. Its stated pressure is the minimum (cold fill or precharge), used for NPSH available and every pressure check; {max}. The loop's high point is checked at rest from the minimum pressure, p = p₀ − ρ·g·Δz (p₀ the minimum pressure at the reference, Δz the height of the high point above it), against the least {} gauge that keeps air out at the vents: with the tank at the pump suction the pumps raise the pressure everywhere downstream, so rest is the lowest.{restated}",
        s.source.name,
        pr.fmt(least),
    ))
}

/// How the valve checks are made, when the network has a valve.
fn valve_check_method(design: &Design) -> Option<&'static str> {
    let net = design.base.network.as_ref()?;
    net.links
        .iter()
        .any(|l| matches!(l.kind, crate::model::network::NetLinkKind::Valve(_)))
        .then_some(
            "Every open valve's opening is checked at each duty: below 10 % control is coarse, \
             above 90 % no margin is left to open (common practice). A control valve's \
             authority is N = Δp₁₀₀ / (Δp₁₀₀ + Δp_rest): Δp₁₀₀ the drop of the fully open \
             valve (at Kvs) at its flow at the duty, Δp_rest the friction and equipment drops \
             at that duty of the links in series with the valve, up to the nearest tank, \
             demand, branching node, the entry node or a pump; below 0.25 it warns, about 0.5 \
             is the usual aim (common practice).",
        )
}
