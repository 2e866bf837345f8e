//! The well-field chapter (issue 12): the method, and per case and candidate each well
//! pump at its duty — static level, drawdown, pumping level, flow, head, NPSH available
//! against NPSH required with the margin, efficiency and power — beside the network
//! tables of the Network chapter; a schematic of the field with the well pumps marked.

use crate::analysis::network::station::NetworkAtDuty;
use crate::analysis::well_field::is_field;
use crate::analysis::Analysis;
use crate::display::{percent, Units};
use crate::model::Design;
use crate::report::layout::chart::{Marker, Series};
use crate::report::layout::document::{Align, Block, Column};

/// The chapter, when the design is a well field.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    if !is_field(&design.base) {
        return;
    }
    blocks.push(Block::heading(1, "Well field"));
    blocks.push(Block::text(
        "Each well pump is the candidate, as arranged, set in its well at the stated \
         elevation; all of them discharge into the collector, which is solved with them as \
         one network (global gradient algorithm, Todini and Pilati 1988), so identical \
         pumps in unequal wells with unequal piping deliver unequal flows. Each well's \
         source is its pumping level, the static level less the drawdown s = B·Q + C·Q² \
         at that well's own flow (Jacob, C. E., \"Drawdown test to determine effective \
         radius of artesian well\", Trans. ASCE 112, 1947; B·Qt = drawdown − well loss and \
         C·Qt² = well loss at the test flow Qt). NPSH available per pump is \
         pₐ/(ρ·g) + pₛ/(ρ·g) + (pumping level − pump setting) − suction losses − pᵥ/(ρ·g), \
         compared with NPSH required by the margin of ANSI/HI 9.6.1 (or the design's own). \
         The candidate's totals are the field's: flow and power summed, the head \
         flow-weighted (ΣQᵢHᵢ/ΣQᵢ, so that ρ·g·Q·H is the summed hydraulic power); the \
         flow requirements apply to the total, every pump check (operating region, NPSH, \
         velocities, minimum flow, motor) to each well. There is no single station flow \
         and so no system curve; adjusting speed or trim to a requirement, one pump of a \
         set alone, the surge screen, the yearly operation and duty envelopes are not \
         computed for a well field.",
    ));
    // The schematic first, under the chapter's own heading: it shows the first case and
    // candidate, which its caption names, and the per-case sections follow it.
    if let Some((case, p, at)) = analysis.cases.iter().find_map(|c| {
        c.pumps
            .iter()
            .find_map(|p| p.network.as_ref().map(|at| (c, p, at)))
    }) {
        schematic(blocks, &case.name, &p.name, at, units);
    }
    for case in &analysis.cases {
        for p in case.pumps.iter().filter(|p| !p.wells.is_empty()) {
            well_table(blocks, &case.name, p, units);
        }
    }
}

fn well_table(
    blocks: &mut Vec<Block>,
    case: &str,
    p: &crate::analysis::duty::PumpResult,
    units: &Units,
) {
    let (fl, hd, el, pw) = (units.flow(), units.head(), units.elevation(), units.power());
    let rows = p
        .wells
        .iter()
        .map(|w| {
            let d = &w.duty;
            let margin = d
                .npsh_required
                .filter(|n| *n > 0.0)
                .map(|n| format!("{:.2}", d.npsh_available / n));
            vec![
                format!("{} ({})", w.name, w.well),
                el.figure(w.static_level),
                hd.figure(w.drawdown),
                el.figure(w.pumping_level),
                if w.closed {
                    "closed".into()
                } else {
                    fl.figure(d.flow)
                },
                hd.figure(d.head),
                hd.figure(d.npsh_available),
                d.npsh_required
                    .map(|n| hd.figure(n))
                    .unwrap_or_else(|| "–".into()),
                margin.unwrap_or_else(|| "–".into()),
                d.efficiency.map(percent).unwrap_or_else(|| "–".into()),
                d.shaft_power
                    .map(|x| pw.figure(x))
                    .unwrap_or_else(|| "–".into()),
            ]
        })
        .collect();
    let total = p.duty.as_ref().map_or(String::new(), |d| {
        format!(
            "; field total {} at a flow-weighted head of {}, shaft power {}",
            fl.fmt(d.flow),
            hd.fmt(d.head),
            d.shaft_power.map_or("–".to_string(), |x| pw.fmt(x))
        )
    });
    blocks.push(Block::heading(
        2,
        format!("Wells, case {case}, pump {}", p.name),
    ));
    let terms = p
        .wells
        .iter()
        .map(|w| {
            let mut row = vec![w.name.clone()];
            let cells =
                super::candidate::npsh_term_cells(hd, &w.duty.npsh_terms, w.duty.npsh_available);
            row.extend(cells);
            row
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Well pump (well)", 0.16, Align::Left),
            Column::new(format!("Static ({})", el.label), 0.08, Align::Right),
            Column::new(format!("Drawdown ({})", hd.label), 0.09, Align::Right),
            Column::new(format!("Pumping ({})", el.label), 0.09, Align::Right),
            Column::new(format!("Flow ({})", fl.label), 0.09, Align::Right),
            Column::new(format!("Head ({})", hd.label), 0.08, Align::Right),
            Column::new(format!("NPSHa ({})", hd.label), 0.08, Align::Right),
            Column::new(format!("NPSHr ({})", hd.label), 0.08, Align::Right),
            Column::new("NPSHa/ NPSHr", 0.07, Align::Right),
            Column::new("Eff.", 0.07, Align::Right),
            Column::new(format!("Shaft ({})", pw.label), 0.11, Align::Right),
        ],
        rows,
        caption: Some(format!(
            "Each well pump at its duty, case {case}, pump {}: static and pumping levels, drawdown at the well's flow, NPSH available against required{total}",
            p.name
        )),
    });
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Well pump", 0.16, Align::Left),
            Column::new("Barometric", 0.12, Align::Right),
            Column::new("Surface gauge", 0.12, Align::Right),
            Column::new("Static suction", 0.12, Align::Right),
            Column::new("Vapour pressure", 0.12, Align::Right),
            Column::new("Suction friction", 0.12, Align::Right),
            Column::new("Suction minor", 0.12, Align::Right),
            Column::new("NPSHa", 0.12, Align::Right),
        ],
        rows: terms,
        caption: Some(format!(
            "NPSH available term by term per well pump, case {case}, pump {} (heads in {} of the case's fluid, signed as they add; static suction = pumping level − the pump's setting)",
            p.name, hd.label
        )),
    });
}

/// The field at one duty: every node at its layer from the wells and its head, the
/// links between them, each well pump marked at the middle of its link.
fn schematic(blocks: &mut Vec<Block>, case: &str, pump: &str, at: &NetworkAtDuty, units: &Units) {
    let hd = units.head();
    // Every well's static level at layer 0, each node one more than the nearest before it.
    let roots: Vec<usize> = (0..at.nodes.len())
        .filter(|&i| at.nodes[i].name.ends_with(" static level"))
        .collect();
    let layer = super::network::layers_from(at, &roots, 0);
    let position = |name: &str| super::network::node_position(at, &layer, &hd, name);
    let mut series = Vec::new();
    let mut points = Vec::new();
    for l in &at.links {
        let (Some(a), Some(b)) = (position(&l.from), position(&l.to)) else {
            continue;
        };
        let is_pump = l.kind == "pump";
        series.push(Series {
            name: String::new(),
            points: vec![a, b],
            style_index: usize::from(is_pump),
            solid: !is_pump,
            dashed: is_pump,
            ..Default::default()
        });
        if is_pump {
            points.push(Marker {
                x: 0.5 * (a.0 + b.0),
                y: 0.5 * (a.1 + b.1),
                label: format!("well pump {}", l.name.trim_end_matches(" pump")),
                ..Default::default()
            });
        }
    }
    for (i, n) in at.nodes.iter().enumerate() {
        // The wells' internal nodes are named by the pump links; label the rest.
        let internal = [" pumping level", " pump suction", " pump discharge"]
            .iter()
            .any(|s| n.name.ends_with(s));
        points.push(Marker {
            x: layer[i] as f64,
            y: hd.value(n.head),
            label: if internal {
                String::new()
            } else {
                n.name.clone()
            },
            ..Default::default()
        });
    }
    let labels = (
        "Layer from the wells' static levels (links)".to_string(),
        format!("Head ({})", hd.label),
    );
    let caption = format!(
        "Well field schematic at the duty, case {case}, pump {pump}: nodes at their layer from the wells and their head; dashed links are the well pumps (static level, drawdown to the pumping level, suction, pump, discharge to the collector)"
    );
    super::network::schematic_figure(blocks, series, points, &layer, labels, caption);
}

/// The design basis of a well field (in place of the chain's levels and segments): each
/// well pump with its well's static level and drawdown test, its setting, and its
/// suction and discharge runs as written (the base design; cases may change them).
pub(super) fn design_basis(blocks: &mut Vec<Block>, design: &Design, units: &Units) {
    use uom::si::{length::meter, volume_rate::cubic_meter_per_second};
    let Some(layout) = &design.base.network else {
        return;
    };
    let (fl, hd, el, len) = (
        units.flow(),
        units.head(),
        units.elevation(),
        units.length(),
    );
    let base = &design.base;
    let tank = |name: &str| {
        [&base.source, &base.destination]
            .into_iter()
            .chain(&layout.tanks)
            .find(|t| t.name == name)
    };
    let run = |segs: &[crate::model::Segment]| {
        if segs.is_empty() {
            return "none".to_string();
        }
        segs.iter()
            .map(|s| {
                format!(
                    "{} {}, {}",
                    s.material.keyword(),
                    s.size_label,
                    len.fmt(s.length.get::<meter>())
                )
            })
            .collect::<Vec<_>>()
            .join("; ")
    };
    blocks.push(Block::heading(2, "Wells and well pumps"));
    let rows = layout
        .wells
        .iter()
        .map(|w| {
            let t = tank(&w.well);
            let level = t.map_or("–".into(), |t| el.figure(t.level.get::<meter>()));
            let test = t
                .and_then(|t| Some((t.drawdown?, t.test_flow?, t.well_loss)))
                .map_or("none (a sump)".to_string(), |(d, q, l)| {
                    format!(
                        "{} at {}{}",
                        hd.fmt(d.get::<meter>()),
                        fl.fmt(q.get::<cubic_meter_per_second>()),
                        l.map(|l| format!(", well loss {}", hd.fmt(l.get::<meter>())))
                            .unwrap_or_default()
                    )
                });
            vec![
                format!("{} ({} → {})", w.name, w.well, w.to),
                level,
                test,
                el.figure(w.elevation.get::<meter>()),
                run(&w.suction),
                run(&w.discharge),
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Well pump (well → node)", 0.18, Align::Left),
            Column::new(format!("Static level ({})", el.label), 0.10, Align::Right),
            Column::new("Drawdown test", 0.22, Align::Left),
            Column::new(format!("Setting ({})", el.label), 0.10, Align::Right),
            Column::new("Suction run", 0.18, Align::Left),
            Column::new("Discharge run", 0.22, Align::Left),
        ],
        rows,
        caption: Some(
            "The well pumps of the base design: each well's static level and drawdown test, the pump's setting (its suction datum) and its own piping; the collector's links are in the Network chapter".into(),
        ),
    });
}
