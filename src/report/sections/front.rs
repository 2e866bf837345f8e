//! The front matter: title block with the seal box and signatures, the revision
//! history, and the purpose and scope in the design file's own words.

use crate::analysis::Analysis;
use crate::model::{Design, ReportUnits};
use crate::report::layout::document::{Align, Block, Column, Signatory};

/// The title block, its signatures and the opening caution.
pub(super) fn title_block(blocks: &mut Vec<Block>, design: &Design, sha256: &str) {
    let project = &design.project;
    let revision = design.revisions.last();
    let mut lines = vec![
        ("Project".to_string(), project.title.clone()),
        ("Calculation number".into(), project.number.clone()),
        ("Client".into(), project.client.clone()),
        (
            "Revision".into(),
            revision
                .map(|r| format!("{} — {} — {}", r.id, r.date, r.description))
                .unwrap_or_else(|| "—".into()),
        ),
        ("Subject".into(), super::SUBJECT.into()),
        ("Source file SHA-256".into(), sha256.to_string()),
        (
            "Prepared with".into(),
            format!("dutyline {}", crate::VERSION),
        ),
    ];
    lines.retain(|(_, value)| !value.is_empty());
    let date = revision.map(|r| r.date.clone()).unwrap_or_default();
    blocks.push(Block::TitleBlock {
        lines,
        seal_box: true,
        signatures: vec![
            Signatory::new("Prepared", project.prepared.clone(), date.clone()),
            Signatory::new("Checked", project.checked.clone(), String::new()),
            Signatory::new("Approved", project.approved.clone(), String::new()),
        ],
    });
    blocks.push(Block::caution(
        "This calculation assists a licensed engineer. Its results depend on the pump manufacturer's certified curves and on the installed conditions; they must be reviewed by a licensed engineer and checked against the codes and the authority having jurisdiction where the system is built.",
    ));
}

/// The revision history table, then the contents on a page of its own.
pub(super) fn revision_history(blocks: &mut Vec<Block>, design: &Design) {
    blocks.push(Block::heading(1, "Revision history"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Revision", 0.14, Align::Left),
            Column::new("Date", 0.18, Align::Left),
            Column::new("Description", 0.68, Align::Left),
        ],
        rows: if design.revisions.is_empty() {
            vec![vec![
                "—".into(),
                "—".into(),
                "no revision given in the design file".into(),
            ]]
        } else {
            design
                .revisions
                .iter()
                .map(|r| vec![r.id.clone(), r.date.clone(), r.description.clone()])
                .collect()
        },
        caption: Some("Revisions of this calculation".into()),
    });
    blocks.push(Block::PageBreak);
    blocks.push(Block::Contents);
    blocks.push(Block::PageBreak);
}

/// Purpose and scope: the design's own words and what the calculation covers.
pub(super) fn purpose(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis) {
    blocks.push(Block::heading(1, "Purpose and scope"));
    match &design.purpose {
        // Paragraphs are separated by blank lines; line breaks inside one are the author's wrapping.
        Some(text) => {
            for paragraph in text.split("\n\n").filter(|p| !p.trim().is_empty()) {
                blocks.push(Block::text(
                    paragraph.split_whitespace().collect::<Vec<_>>().join(" "),
                ));
            }
        }
        None => blocks.push(Block::text("The design file states no purpose.")),
    }
    blocks.push(Block::text(format!(
        "The calculation covers {} and {}. Values are reported in {} units; the engine works in SI.",
        crate::display::count(analysis.cases.len(), "operating case", "operating cases"),
        crate::display::count(design.pumps.len(), "pump candidate", "pump candidates"),
        if design.project.units == ReportUnits::Us { "US customary" } else { "SI" }
    )));
}
