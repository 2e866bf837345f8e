//! The calculation package's content: the sections of `shared/design/report.md`
//! built as layout blocks from a design, its analysis and its source, one file per
//! chapter. Reads the analysis; computes no engineering values of its own.

mod appendix;
mod assumptions;
mod attached;
mod candidate;
mod changes;
mod checks;
mod design_basis;
mod envelope;
mod front;
mod method;
mod network;
mod operation;
mod references;
mod safety;
mod selection;
pub(crate) mod summary;
pub use summary::SUMMARY_CASES;
pub(crate) mod sources;
mod system_curves;
mod well_field;
mod wording;

use super::layout::document::{Attachment, Block, Document, PageMeta, PdfInfo};
use crate::analysis::Analysis;
use crate::display::Units;
use crate::model::Design;

/// Extra content: a changes section comparing with an earlier revision.
pub struct Changes {
    /// The compared revision's id.
    pub old_revision: String,
    /// SHA-256 of the compared revision's source file (hex).
    pub old_sha256: String,
    /// Changed inputs, one line each in report units.
    pub inputs: Vec<String>,
    /// Rows: case, pump, quantity, before, after, change.
    pub results: Vec<Vec<String>>,
    /// Rows: case, pump, check, before, after, message.
    pub checks: Vec<Vec<String>>,
    /// The recommendation before and after, in one sentence.
    pub recommendation: String,
}

/// Build the document: the chapters in the order of `shared/design/report.md`.
pub fn document(
    design: &Design,
    analysis: &Analysis,
    source: &str,
    sha256: &str,
    changes: Option<&Changes>,
) -> Document {
    document_attached(design, analysis, source, sha256, changes, Vec::new())
}

/// [`document`] carrying `attachments`, said on the cover and listed in the appendix.
pub fn document_attached(
    design: &Design,
    analysis: &Analysis,
    source: &str,
    sha256: &str,
    changes: Option<&Changes>,
    attachments: Vec<Attachment>,
) -> Document {
    let units = Units::new(design.project.units);
    let project = &design.project;
    let revision_text = design
        .revisions
        .last()
        .map(|r| format!("rev. {}", r.id))
        .unwrap_or_else(|| "no revision".into());
    let mut blocks: Vec<Block> = Vec::new();
    front::title_block(&mut blocks, design, sha256);
    attached::cover_note(&mut blocks, &attachments, summary::summarised(design));
    front::revision_history(&mut blocks, design);
    front::purpose(&mut blocks, design, analysis);
    if let Some(changes) = changes {
        changes::chapter(&mut blocks, changes);
    }
    let (full_design, full_analysis) = (design, analysis);
    let kept = summary::summarised(design).then(|| summary::governing(analysis));
    let restricted = kept.as_ref().map(|kept| {
        let keep: Vec<usize> = kept.iter().map(|g| g.index).collect();
        summary::restricted(design, analysis, &keep)
    });
    // A summarised package's per-case chapters see only the governing cases.
    let (design, analysis) = restricted
        .as_ref()
        .map_or((design, analysis), |(d, a)| (d, a));
    design_basis::chapter(&mut blocks, design, analysis, &units);
    method::chapter(&mut blocks, &units);
    if let Some(kept) = &kept {
        summary::chapter(&mut blocks, full_analysis, kept, &units);
    }
    system_curves::chapter(&mut blocks, analysis, &units);
    network::chapter(&mut blocks, design, analysis, &units);
    well_field::chapter(&mut blocks, design, analysis, &units);
    for (index, _) in design.pumps.iter().enumerate() {
        candidate::chapter(&mut blocks, design, analysis, index, &units);
    }
    operation::chapter(&mut blocks, full_design, full_analysis, &units);
    envelope::chapter(&mut blocks, full_design, full_analysis, &units);
    selection::chapter(&mut blocks, design, analysis, &units);
    checks::chapter(&mut blocks, analysis, &units, kept.is_some());
    safety::chapter(&mut blocks, analysis, &units);
    assumptions::chapter(&mut blocks, full_design, full_analysis);
    references::chapter(&mut blocks, full_design, full_analysis);
    appendix::chapter(&mut blocks, source, sha256);
    attached::appendix(&mut blocks, &attachments);

    Document {
        title: format!("{} — {}", project.number, project.title),
        meta: PageMeta {
            header_left: project.title.clone(),
            header_number: project.number.clone(),
            header_right: revision_text,
            footer_left: format!("source SHA-256 {}…", &sha256[..sha256.len().min(12)]),
        },
        info: PdfInfo {
            author: project.prepared.clone(),
            subject: SUBJECT.to_string(),
            date: design.revisions.last().and_then(|r| iso_date(&r.date)),
        },
        id_seed: sha256.to_string(),
        blocks,
        attachments,
    }
}

/// The package's subject line (title block and PDF information).
pub const SUBJECT: &str = "Pump selection: system curves, duty points, NPSH, power and energy";

/// `(year, month, day)` of an ISO 8601 calendar date "YYYY-MM-DD"; `None` otherwise.
fn iso_date(text: &str) -> Option<(i32, u8, u8)> {
    let mut parts = text.trim().splitn(3, '-');
    let year: i32 = parts.next()?.parse().ok()?;
    let month: u8 = parts.next()?.parse().ok()?;
    let day: u8 = parts.next()?.parse().ok()?;
    ((1..=9999).contains(&year) && (1..=12).contains(&month) && (1..=31).contains(&day))
        .then_some((year, month, day))
}

/// Cases per system-curve table and per plot, so columns and legends stay legible.
pub const CASES_PER_GROUP: usize = 6;

/// " (part k of n)" when a table or plot is split into groups of cases, else nothing.
fn group_label(group: usize, groups: usize) -> String {
    if groups > 1 {
        format!(" (part {} of {groups})", group + 1)
    } else {
        String::new()
    }
}

/// Data columns per matrix table (cases or segments across); wider matrices are
/// split into several tables, each repeating the row label.
pub const MATRIX_COLUMNS: usize = 7;

/// A matrix table (row label, then one column per item) split into tables of at most
/// [`MATRIX_COLUMNS`] item columns; `headers` are the item columns' headers and every
/// row holds its label followed by one cell per item.
fn matrix_tables(
    blocks: &mut Vec<Block>,
    label: &str,
    headers: &[String],
    rows: &[Vec<String>],
    caption: &str,
) {
    use super::layout::document::{Align, Column};
    let groups = headers.len().div_ceil(MATRIX_COLUMNS).max(1);
    let per = headers.len().div_ceil(groups).max(1);
    for (k, start) in (0..headers.len()).step_by(per).enumerate() {
        let end = (start + per).min(headers.len());
        let share = 0.78 / per as f64;
        let mut columns = vec![Column::new(label, 0.22, Align::Left)];
        columns.extend(
            headers[start..end]
                .iter()
                .map(|h| Column::new(h.clone(), share, Align::Right)),
        );
        let cells = rows
            .iter()
            .map(|row| {
                let mut out = vec![row[0].clone()];
                out.extend(row[1 + start..1 + end].iter().cloned());
                out
            })
            .collect();
        blocks.push(Block::Table {
            columns,
            rows: cells,
            caption: Some(format!("{caption}{}", group_label(k, groups))),
        });
    }
}

/// The lines in their first order, each once.
fn dedup(lines: Vec<String>) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for line in lines {
        if !out.contains(&line) {
            out.push(line);
        }
    }
    out
}
