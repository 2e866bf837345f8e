//! The selection chapter: the ranking beside its basis, the capacity of each
//! candidate per case, the requirement × case matrix and the recommendation.

use crate::analysis::checks::Status;
use crate::analysis::Analysis;
use crate::display::{percent, significant, typeset, Units};
use crate::model::Design;
use crate::report::layout::document::{Align, Block, Column, Span};

/// "—" for a missing value.
fn or_dash(value: Option<String>) -> String {
    value.unwrap_or_else(|| "—".into())
}

/// The selection chapter.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    blocks.push(Block::heading(1, "Selection"));
    let selection = &analysis.selection;
    blocks.push(Block::Paragraph(vec![
        Span::bold("Basis of the ranking: "),
        Span::plain(super::wording::plain(&units.render(&selection.basis))),
    ]));
    blocks.push(Block::text(super::wording::plain(&selection.criteria_text)));
    ranking(blocks, design, analysis, units);
    match (&selection.recommended, &selection.refusal) {
        (Some(n), _) => blocks.push(Block::Paragraph(vec![Span::bold(format!("Recommended: pump {n}. ")), Span::plain("Subject to certified curves from the manufacturer and the review of this calculation.")])),
        (None, Some(why)) => blocks.push(Block::Paragraph(vec![Span::bold("No candidate is recommended. "), Span::plain(super::wording::plain(why))])),
        _ => {}
    }
    if let Some(remark) = &selection.close_call {
        blocks.push(Block::Paragraph(vec![
            Span::bold("Close call. "),
            Span::plain(format!("{}.", super::wording::plain(remark))),
        ]));
    }
    capacity(blocks, design, analysis, units);
    requirement_matrix(blocks, design, analysis);
}

/// The ranking with the figures it is based on.
fn ranking(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis, units: &Units) {
    let currency = &design.energy.currency;
    let (se, vol, en) = (
        units.specific_energy(),
        units.volume_column(),
        units.energy(),
    );
    let per_volume = units.volume_cost_unit();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Rank", 0.05, Align::Right),
            Column::new("Candidate", 0.09, Align::Left),
            Column::new(format!("Volume per year ({})", vol.label), 0.10, Align::Right),
            Column::new(format!("Energy per year ({})", en.label), 0.10, Align::Right),
            Column::new(format!("Specific energy ({})", se.label), 0.10, Align::Right),
            Column::new(format!("Cost per year ({currency})"), 0.09, Align::Right),
            Column::new(
                if analysis.operation.is_empty() {
                    format!("Life energy cost ({currency})")
                } else {
                    format!("Life-cycle cost ({currency})")
                },
                0.10,
                Align::Right,
            ),
            Column::new(format!("Life cost per {per_volume} ({currency})"), 0.10, Align::Right),
            Column::new("Wire to water", 0.08, Align::Right),
            Column::new("Qualifies", 0.19, Align::Left),
        ],
        rows: analysis
            .selection
            .ranking
            .iter()
            .enumerate()
            .map(|(k, r)| {
                vec![
                    (k + 1).to_string(),
                    r.name.clone(),
                    or_dash(r.annual_volume_m3.map(|v| vol.figure(v))),
                    or_dash(r.annual_energy_j.map(|e| en.figure(e))),
                    or_dash(r.specific_energy_j_m3.map(|e| se.figure(e))),
                    or_dash(r.annual_cost.map(|c| typeset(c, 0))),
                    or_dash(r.life_cost.map(|c| typeset(c, 0))),
                    or_dash(
                        r.life_cost_per_m3
                            .map(|c| significant(c * units.volume_per_cost_unit(), 4)),
                    ),
                    or_dash(r.mean_wire_to_water.map(percent)),
                    super::wording::plain(&r.why) + &envelope_standing(design, analysis, r),
                ]
            })
            .collect(),
        caption: Some("Ranking of the candidates, on the basis stated above; a failing candidate is listed but never ranked above a qualifying one".into()),
    });
}

/// Flow of each candidate per case at its limit (full speed or largest impeller).
/// With duty envelopes, a qualifying candidate's standing across them ("; qualifies at
/// nominal only"), else nothing.
fn envelope_standing(
    design: &Design,
    analysis: &Analysis,
    r: &crate::analysis::selection::Ranked,
) -> String {
    let Some(e) = analysis.envelope.as_ref().filter(|_| r.qualifies) else {
        return String::new();
    };
    let i = design
        .pumps
        .iter()
        .position(|p| p.name == r.name)
        .unwrap_or(usize::MAX);
    format!("; {}", e.standing(i, r.qualifies))
}

fn capacity(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis, units: &Units) {
    if analysis
        .capacity
        .iter()
        .all(|row| row.iter().all(Option::is_none))
    {
        return;
    }
    let fl = units.flow();
    let headers: Vec<String> = analysis
        .cases
        .iter()
        .map(|c| format!("{} ({})", c.name, fl.label))
        .collect();
    let rows: Vec<Vec<String>> = design
        .pumps
        .iter()
        .zip(&analysis.capacity)
        .map(|(pump, row)| {
            let mut cells = vec![pump.name.clone()];
            cells.extend(row.iter().map(|q| or_dash(q.map(|q| fl.figure(q)))));
            cells.resize(headers.len() + 1, "—".into());
            cells
        })
        .collect();
    blocks.push(Block::heading(2, "Capacity per case"));
    super::matrix_tables(
        blocks,
        "Candidate",
        &headers,
        &rows,
        "Flow of each candidate in each case at its limit (maximum speed or largest impeller allowed)",
    );
}

/// Which requirement applies in which case, and each candidate's status there.
fn requirement_matrix(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis) {
    let units = Units::new(design.project.units);
    let matrix = &analysis.requirement_matrix;
    if matrix.is_empty() {
        return;
    }
    let headers: Vec<String> = analysis.cases.iter().map(|c| c.name.clone()).collect();
    let mark = |status: Option<Status>| match status {
        Some(Status::Pass) => "pass",
        Some(Status::Warn) => "WARN",
        Some(Status::Fail) => "FAIL",
        None => "—",
    };
    let rows: Vec<Vec<String>> = matrix
        .iter()
        .map(|row| {
            let mut cells = vec![super::wording::plain(&units.render(&row.text))];
            for (k, applies) in row.applies.iter().enumerate() {
                cells.push(if *applies {
                    design
                        .pumps
                        .iter()
                        .zip(&row.status)
                        .map(|(pump, statuses)| {
                            format!(
                                "{}: {}",
                                pump.name,
                                mark(statuses.get(k).copied().flatten())
                            )
                        })
                        .collect::<Vec<_>>()
                        .join(", ")
                } else {
                    "does not apply".into()
                });
            }
            cells.resize(headers.len() + 1, "—".into());
            cells
        })
        .collect();
    blocks.push(Block::heading(2, "Requirements per case"));
    super::matrix_tables(
        blocks,
        "Requirement",
        &headers,
        &rows,
        "Requirement × case: where each requirement applies and each candidate's status there",
    );
}
