//! The attached sources: a note on the cover saying what the PDF carries and how to
//! verify it, and a table of the attached files in the appendix.

use crate::report::layout::document::{Align, Attachment, Block, Column, Span};

/// The cover's note on the attached sources (nothing when there are none).
pub(super) fn cover_note(blocks: &mut Vec<Block>, attachments: &[Attachment], summarised: bool) {
    if attachments.is_empty() {
        return;
    }
    let sources = attachments
        .iter()
        .filter(|a| a.relationship == crate::report::layout::Relationship::Source)
        .count();
    blocks.push(Block::Paragraph(vec![
        Span::bold("Sources attached. "),
        Span::plain(format!(
            "This PDF carries {} files, listed in the last appendix: the design file exactly as compiled with every file it read ({sources} source files in all), the results in machine-readable form (JSON) and the build record. ",
            attachments.len()
        )),
        Span::mono("dutyline verify THIS.pdf"),
        Span::plain(" recompiles them and confirms byte for byte that this package is what they compile to; "),
        Span::mono("dutyline extract THIS.pdf -o DIR"),
        Span::plain(" writes them out to rebuild or compare."),
    ]));
    if summarised {
        blocks.push(Block::Paragraph(vec![
            Span::plain("This package is summarised: its attached results hold the governing cases shown one by one, with the ranking, motor sizing and totals over every case; the results of every case come from the attached design: "),
            Span::mono("dutyline results --format json"),
            Span::plain("."),
        ]));
    }
}

/// The appendix table of attached files, with size and SHA-256 of each.
pub(super) fn appendix(blocks: &mut Vec<Block>, attachments: &[Attachment]) {
    if attachments.is_empty() {
        return;
    }
    let mut sorted: Vec<&Attachment> = attachments.iter().collect();
    sorted.sort_by(|a, b| a.name.as_bytes().cmp(b.name.as_bytes()));
    blocks.push(Block::PageBreak);
    blocks.push(Block::heading(1, "Appendix: attached files"));
    blocks.push(Block::Paragraph(vec![
        Span::plain("Embedded in this PDF as associated files, with their PDF/A-3 relationship in brackets; a PDF viewer lists them under attachments. "),
        Span::mono("dutyline verify"),
        Span::plain(" recompiles the source files with the version in the build record and compares the result with this PDF byte for byte; "),
        Span::mono("dutyline extract"),
        Span::plain(" writes the files out. The SHA-256 of each file is also in its description inside the PDF."),
    ]));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("File", 0.30, Align::Left),
            Column::new("What", 0.20, Align::Left),
            Column::new("Bytes", 0.10, Align::Right),
            Column::new("SHA-256", 0.40, Align::Left),
        ],
        rows: sorted
            .iter()
            .map(|a| {
                vec![
                    a.name.clone(),
                    format!("{} ({})", a.description, a.relationship.as_str()),
                    a.bytes.len().to_string(),
                    a.sha256.clone(),
                ]
            })
            .collect(),
        caption: Some("Files attached to this package".into()),
    });
}
