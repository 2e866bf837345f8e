//! The selection chapter: the ranking, its criteria and the recommendation.

use crate::analysis::Analysis;
use crate::display::{percent, Units};
use crate::model::Design;
use crate::report::layout::document::{Align, Block, Column, Span};

/// The selection chapter.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    blocks.push(Block::heading(1, "Selection"));
    let s = &analysis.selection;
    blocks.push(Block::text(s.criteria_text.clone()));
    let cur = &design.energy.currency;
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Rank", 0.07, Align::Right),
            Column::new("Candidate", 0.12, Align::Left),
            Column::new("Energy per year", 0.14, Align::Right),
            Column::new("Cost per year", 0.13, Align::Right),
            Column::new("Life energy cost", 0.14, Align::Right),
            Column::new("Mean efficiency", 0.11, Align::Right),
            Column::new("Qualifies", 0.29, Align::Left),
        ],
        rows: s
            .ranking
            .iter()
            .enumerate()
            .map(|(k, r)| {
                vec![
                    (k + 1).to_string(),
                    r.name.clone(),
                    r.annual_energy_j
                        .map(|e| units.energy().text(e))
                        .unwrap_or_else(|| "—".into()),
                    r.annual_cost
                        .map(|c| format!("{c:.0} {cur}"))
                        .unwrap_or_else(|| "—".into()),
                    r.life_cost
                        .map(|c| format!("{c:.0} {cur}"))
                        .unwrap_or_else(|| "—".into()),
                    r.mean_efficiency.map(percent).unwrap_or_else(|| "—".into()),
                    r.why.clone(),
                ]
            })
            .collect(),
        caption: Some("Ranking of the candidates".into()),
    });
    match (&s.recommended, &s.refusal) {
        (Some(n), _) => blocks.push(Block::Paragraph(vec![Span::bold(format!("Recommended: pump {n}. ")), Span::plain("Subject to certified curves from the manufacturer and the review of this calculation.")])),
        (None, Some(why)) => blocks.push(Block::Paragraph(vec![Span::bold("No candidate is recommended. "), Span::plain(why.clone())])),
        _ => {}
    }
}
