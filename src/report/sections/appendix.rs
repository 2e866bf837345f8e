//! The appendix: the compiled design file, verbatim, with line numbers.

use crate::report::layout::document::{Block, Span};

/// The appendix chapter on a new page.
pub(super) fn chapter(blocks: &mut Vec<Block>, source: &str, sha256: &str) {
    blocks.push(Block::PageBreak);
    blocks.push(Block::heading(1, "Appendix: design file"));
    blocks.push(Block::Paragraph(vec![
        Span::plain("The file compiled, verbatim. SHA-256: "),
        Span::mono(sha256.to_string()),
    ]));
    blocks.push(Block::Preformatted {
        lines: source.lines().map(str::to_string).collect(),
        line_numbers: true,
    });
}
