//! The checks chapter: every check of every case and candidate with its status,
//! finding and the source of its limit.

use crate::analysis::checks::Status;
use crate::analysis::Analysis;
use crate::display::Units;
use crate::report::layout::document::{Align, Block, Column};

/// The checks chapter.
/// `summarised`: the analysis holds only the governing cases (the case summary
/// counts every case's checks).
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    analysis: &Analysis,
    units: &Units,
    summarised: bool,
) {
    blocks.push(Block::heading(1, "Checks"));
    let scope = if summarised {
        "Every check of the governing cases (the case summary counts every case's checks)"
    } else {
        "Every check of every case and candidate"
    };
    blocks.push(Block::text(format!("{scope}, with its status and where its limit comes from. A fail disqualifies the candidate; a warning asks for the reviewer's attention.")));
    let mut rows = Vec::new();
    for c in &analysis.cases {
        for p in &c.pumps {
            for check in &p.checks {
                let mark = match check.status {
                    Status::Pass => "pass",
                    Status::Warn => "WARN",
                    Status::Fail => "FAIL",
                };
                rows.push(vec![
                    c.name.clone(),
                    p.name.clone(),
                    check_name(&check.id.to_string()),
                    mark.to_string(),
                    super::wording::plain(&units.render(&check.message.get())),
                    super::sources::publication(&check.source(), units),
                ]);
            }
        }
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.11, Align::Left),
            Column::new("Pump", 0.07, Align::Left),
            Column::new("Check", 0.13, Align::Left),
            Column::new("Status", 0.08, Align::Left),
            Column::new("Finding", 0.39, Align::Left),
            Column::new("Source of the limit", 0.22, Align::Left),
        ],
        rows,
        caption: Some("Checks per case and candidate, with the source of each limit".into()),
    });
}

/// A check's id in words for print: "npsh-margin" → "NPSH margin".
pub(super) fn check_name(id: &str) -> String {
    id.split('-')
        .map(|w| match w {
            "npsh" => "NPSH".to_string(),
            "bep" => "BEP".to_string(),
            other => other.to_string(),
        })
        .collect::<Vec<_>>()
        .join(" ")
}
