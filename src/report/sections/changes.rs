//! The changes chapter: what changed since an earlier revision, in inputs, duty
//! points, check statuses and the recommendation.

use super::Changes;
use crate::report::layout::document::{Align, Block, Column, Span};

/// "Changes since revision X", placed after the purpose.
pub(super) fn chapter(blocks: &mut Vec<Block>, changes: &Changes) {
    blocks.push(Block::heading(
        1,
        format!("Changes since revision {}", changes.old_revision),
    ));
    blocks.push(Block::Paragraph(vec![
        Span::plain(format!(
            "Compared with revision {}, source file SHA-256 ",
            changes.old_revision
        )),
        Span::mono(changes.old_sha256.clone()),
        Span::plain("."),
    ]));
    blocks.push(Block::heading(2, "Input changes"));
    if changes.inputs.is_empty() {
        blocks.push(Block::text("No input changed."));
    } else {
        blocks.push(Block::Table {
            columns: vec![Column::new("Change", 1.0, Align::Left)],
            rows: changes
                .inputs
                .iter()
                .map(|s| vec![super::wording::plain(s)])
                .collect(),
            caption: Some("Inputs changed since the earlier revision".into()),
        });
    }
    blocks.push(Block::heading(2, "Effect on the duty points"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.16, Align::Left),
            Column::new("Pump", 0.10, Align::Left),
            Column::new("Quantity", 0.22, Align::Left),
            Column::new("Before", 0.18, Align::Right),
            Column::new("After", 0.18, Align::Right),
            Column::new("Change", 0.16, Align::Right),
        ],
        rows: changes.results.clone(),
        caption: Some("Duty points before and after".into()),
    });
    blocks.push(Block::heading(2, "Checks whose status changed"));
    if changes.checks.is_empty() {
        blocks.push(Block::text("No check changed its status."));
    } else {
        blocks.push(Block::Table {
            columns: vec![
                Column::new("Case", 0.13, Align::Left),
                Column::new("Pump", 0.08, Align::Left),
                Column::new("Check", 0.20, Align::Left),
                Column::new("Before", 0.08, Align::Left),
                Column::new("After", 0.08, Align::Left),
                Column::new("Finding now", 0.43, Align::Left),
            ],
            rows: changes.checks.clone(),
            caption: Some("Checks whose status changed".into()),
        });
    }
    blocks.push(Block::text(changes.recommendation.clone()));
}
