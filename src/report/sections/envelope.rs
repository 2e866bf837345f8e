//! The package chapter "Duty envelopes" (issue 15): the method with ISO 9906:2012
//! named, the grades and input ranges, per candidate a table of every case's envelope
//! with the points giving its extremes, the worst-point checks, a head plot with the
//! pump's tolerance band, the system band and the duty region, and the standing of
//! each candidate. Reads the analysis; computes no engineering value.

use crate::analysis::envelope::{DutyEnvelope, Envelopes};
use crate::analysis::Analysis;
use crate::display::{percent, uncertainty_range, Units};
use crate::model::Design;
use crate::report::layout::chart::{Chart, Marker, Series, YAxis};
use crate::report::layout::document::{Align, Block, CalloutKind, Column, Span};

/// The chapter; nothing when the design asks for no envelope.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    let Some(e) = &analysis.envelope else { return };
    blocks.push(Block::heading(1, "Duty envelopes"));
    blocks.push(Block::text(e.method_words()));
    grades(blocks, design, e, units);
    if !e.inputs.is_empty() {
        blocks.push(Block::Table {
            columns: vec![
                Column::new("Input", 0.5, Align::Left),
                Column::new("Range", 0.5, Align::Left),
            ],
            rows: e
                .inputs
                .iter()
                .map(|r| {
                    let (a, b) = uncertainty_range(r, units);
                    vec![a, b]
                })
                .collect(),
            caption: Some("Input ranges, applied inside every case".into()),
        });
    }
    for (i, p) in design.pumps.iter().enumerate() {
        blocks.push(Block::heading(
            2,
            format!("Pump {} within its tolerance", p.name),
        ));
        candidate_table(blocks, analysis, e, i, units);
        extremes_table(blocks, analysis, e, i, units);
        checks_table(blocks, e, i, &p.name, units);
        plot(blocks, analysis, e, i, units);
    }
    standing(blocks, design, analysis, e);
    blocks.push(Block::Callout {
        kind: CalloutKind::Caution,
        text: vec![Span::plain("The tolerance factors of ISO 9906:2012 are recalled, not read from the edition in force; the curve shift through the cross's corner bounds, and does not reproduce, the acceptance test. A pump whose envelope reaches cavitation or motor overload is to be confirmed against the manufacturer's certified test curve, and the calculation reviewed by a licensed engineer against the codes of the authority having jurisdiction.")],
    });
}

fn grades(blocks: &mut Vec<Block>, design: &Design, e: &Envelopes, units: &Units) {
    let rows = design
        .pumps
        .iter()
        .zip(&e.grades)
        .map(|(p, (t, assumed))| {
            vec![
                p.name.clone(),
                format!(
                    "{}{}",
                    t.grade.label(),
                    if *assumed { " (assumed)" } else { "" }
                ),
                format!("−{} / +{}", percent(t.flow_minus), percent(t.flow_plus)),
                format!("−{} / +{}", percent(t.head_minus), percent(t.head_plus)),
                format!("−{}", percent(t.efficiency_minus)),
                format!(
                    "+{} or +{}",
                    percent(t.npsh3_relative),
                    units.head().fmt(t.npsh3_minimum_m)
                ),
                if t.small_pump {
                    "applied".into()
                } else {
                    "no".into()
                },
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Pump", 0.10, Align::Left),
            Column::new("Grade", 0.14, Align::Left),
            Column::new("Flow tQ", 0.16, Align::Right),
            Column::new("Head tH", 0.16, Align::Right),
            Column::new("Efficiency tη", 0.13, Align::Right),
            Column::new("NPSH3", 0.18, Align::Right),
            Column::new("Small pump", 0.13, Align::Left),
        ],
        rows,
        caption: Some("Acceptance grades of ISO 9906:2012 (Table 8 and the NPSH3 tolerance, from memory); small-pump tolerances for grade 3B at 10 kW and less; a candidate without a stated grade is taken as 3B".into()),
    });
}

fn envelopes(e: &Envelopes, i: usize) -> impl Iterator<Item = (usize, &str, &DutyEnvelope)> {
    e.cases.iter().enumerate().filter_map(move |(k, c)| {
        c.pumps
            .get(i)
            .and_then(|d| d.as_ref())
            .map(|d| (k, c.case.as_str(), d))
    })
}

fn candidate_table(
    blocks: &mut Vec<Block>,
    analysis: &Analysis,
    e: &Envelopes,
    i: usize,
    units: &Units,
) {
    let (fl, hd, pw) = (units.flow(), units.head(), units.power());
    let rows: Vec<Vec<String>> = envelopes(e, i)
        .map(|(k, case, d)| {
            let nominal = analysis.cases[k].pumps.get(i).and_then(|p| p.duty.as_ref());
            let failed = d.corners.iter().filter(|c| c.duty.is_err()).count();
            vec![
                case.to_string(),
                nominal.map_or("—".into(), |n| {
                    format!("{} at {}", fl.figure(n.flow), hd.figure(n.head))
                }),
                format!(
                    "{} – {}",
                    fl.figure(d.flow_min.value),
                    fl.figure(d.flow_max.value)
                ),
                format!(
                    "{} – {}",
                    hd.figure(d.head_min.value),
                    hd.figure(d.head_max.value)
                ),
                d.npsh_margin_worst
                    .map_or("—".into(), |x| format!("{:.2}", x.value)),
                d.shaft_power_max.map_or("—".into(), |x| pw.figure(x.0)),
                format!("{} of {}", d.corners.len() - failed, d.corners.len()),
            ]
        })
        .collect();
    if rows.is_empty() {
        blocks.push(Block::text(
            "No case has a nominal duty point, so there is no envelope.",
        ));
        return;
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.14, Align::Left),
            Column::new(format!("Nominal duty ({}, {})", fl.label, hd.label), 0.20, Align::Right),
            Column::new(format!("Flow range ({})", fl.label), 0.17, Align::Right),
            Column::new(format!("Head range ({})", hd.label), 0.15, Align::Right),
            Column::new("Lowest NPSH ratio", 0.11, Align::Right),
            Column::new(format!("Largest shaft power per pump ({})", pw.label), 0.13, Align::Right),
            Column::new("Points with a duty", 0.10, Align::Right),
        ],
        rows,
        caption: Some(format!("Pump {}: envelope of every case (NPSH ratio: available over NPSH3 at its plus tolerance; shaft power: the largest along the shifted curves between the envelope's flows)", analysis.candidates[i].name)),
    });
}

fn extremes_table(
    blocks: &mut Vec<Block>,
    analysis: &Analysis,
    e: &Envelopes,
    i: usize,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let mut rows = Vec::new();
    for (_, case, d) in envelopes(e, i) {
        let name = |k: usize| d.corners[k].name.clone();
        rows.push(vec![
            case.to_string(),
            "lowest flow".into(),
            fl.fmt(d.flow_min.value),
            name(d.flow_min.corner),
        ]);
        rows.push(vec![
            case.to_string(),
            "highest flow".into(),
            fl.fmt(d.flow_max.value),
            name(d.flow_max.corner),
        ]);
        rows.push(vec![
            case.to_string(),
            "lowest head".into(),
            hd.fmt(d.head_min.value),
            name(d.head_min.corner),
        ]);
        rows.push(vec![
            case.to_string(),
            "highest head".into(),
            hd.fmt(d.head_max.value),
            name(d.head_max.corner),
        ]);
        if let Some(x) = d.npsh_margin_worst {
            rows.push(vec![
                case.to_string(),
                "lowest NPSH ratio".into(),
                format!("{:.2}", x.value),
                name(x.corner),
            ]);
        }
    }
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.14, Align::Left),
            Column::new("Extreme", 0.18, Align::Left),
            Column::new("Value", 0.16, Align::Right),
            Column::new("Point giving it", 0.52, Align::Left),
        ],
        rows,
        caption: Some(format!(
            "Pump {}: the point of the envelope giving each extreme",
            analysis.candidates[i].name
        )),
    });
}

fn checks_table(blocks: &mut Vec<Block>, e: &Envelopes, i: usize, name: &str, units: &Units) {
    let mut rows = Vec::new();
    for c in &e.cases {
        let Some(Some(d)) = c.pumps.get(i) else {
            continue;
        };
        for w in &d.checks {
            let what = if w.worst.id == crate::analysis::limits::CheckId::Motor {
                "Motor load"
            } else {
                "NPSH margin"
            };
            rows.push(vec![
                c.case.clone(),
                what.into(),
                w.nominal.status.keyword().into(),
                w.worst.status.keyword().into(),
                format!("{}: {}", w.corner, units.render(&w.worst.message.get())),
            ]);
        }
    }
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new("Check", 0.13, Align::Left),
            Column::new("Nominal", 0.10, Align::Left),
            Column::new("Worst", 0.09, Align::Left),
            Column::new("Worst point and finding", 0.56, Align::Left),
        ],
        rows,
        caption: Some(format!(
            "Pump {name}: checks at the nominal duty and at their worst point of the envelope"
        )),
    });
}

fn plot(blocks: &mut Vec<Block>, analysis: &Analysis, e: &Envelopes, i: usize, units: &Units) {
    let (fl, hd) = (units.flow(), units.head());
    let Some((k, case, d)) = envelopes(e, i).next() else {
        return;
    };
    let c = &analysis.cases[k];
    let Some(pr) = c.pumps.get(i) else { return };
    let scale = |pts: &[(f64, f64)]| {
        pts.iter()
            .map(|&(q, h)| (fl.value(q), hd.value(h)))
            .collect::<Vec<_>>()
    };
    let sys: Vec<(f64, f64)> = c.system_curve.iter().map(|p| (p.flow, p.head)).collect();
    let band = &e.cases[k].system_band;
    let lo: Vec<(f64, f64)> = band.iter().map(|b| (b.0, b.1)).collect();
    let hi: Vec<(f64, f64)> = band.iter().map(|b| (b.0, b.2)).collect();
    let nominal: Vec<(f64, f64)> = pr
        .operating_curve
        .iter()
        .map(|p| (p.flow, p.head))
        .collect();
    let line = |name: &str, pts: Vec<(f64, f64)>, style_index: usize, dashed: bool| Series {
        name: name.into(),
        points: pts,
        style_index,
        dashed,
        solid: !dashed,
        ..Series::default()
    };
    let series = vec![
        line("pump, published", scale(&nominal), 0, false),
        line(
            "pump at minus / plus tolerance",
            scale(&d.pump_band.0),
            0,
            true,
        ),
        line("", scale(&d.pump_band.1), 0, true),
        line("system, nominal", scale(&sys), 1, false),
        line(
            "system at the ends of the input ranges",
            scale(&lo),
            1,
            true,
        ),
        line("", scale(&hi), 1, true),
    ];
    let points = pr
        .duty
        .as_ref()
        .map(|n| Marker {
            x: fl.value(n.flow),
            y: hd.value(n.head),
            label: "nominal duty".into(),
            axis: YAxis::Left,
        })
        .into_iter()
        .collect();
    // Zoomed on the envelope: the band's heads from 30 % below the lowest to 25 % above
    // the highest duty head.
    let y_range = (
        hd.value(0.7 * d.head_min.value),
        hd.value(1.25 * d.head_max.value),
    );
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: format!("Flow ({})", fl.label),
            y_label: format!("Head ({})", hd.label),
            x_range: Some((0.0, fl.value(analysis.flow_max))),
            y_range: Some(y_range),
            series,
            points,
            fills: vec![scale(&d.region)],
            ..Default::default()
        },
        height_mm: 95.0,
        caption: format!("Pump {}, case {case}: the tolerance band of the pump curve, the band of the system curve and, shaded, the duty region where they overlap", analysis.candidates[i].name),
    });
}

fn standing(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis, e: &Envelopes) {
    let rows = analysis
        .selection
        .ranking
        .iter()
        .map(|r| {
            let j = design
                .pumps
                .iter()
                .position(|p| p.name == r.name)
                .unwrap_or(usize::MAX);
            vec![
                r.name.clone(),
                if r.qualifies {
                    "qualifies".into()
                } else {
                    "does not qualify".into()
                },
                e.standing(j, r.qualifies).to_string(),
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![Column::new("Pump", 0.2, Align::Left), Column::new("At nominal", 0.3, Align::Left), Column::new("With the envelope", 0.5, Align::Left)],
        rows,
        caption: Some("Standing of each candidate: at its nominal duties, and with a duty at every point of every case's envelope and no worst-point check failing".into()),
    });
}
