//! Preformatted blocks (source listings): monospaced lines with an optional line-number
//! gutter; long lines wrap with a continuation mark, one chunk per printed line so the
//! listing splits anywhere across pages. A numbered listing longer than
//! [`MAX_LISTING_PAGES`] is not printed: a paragraph gives its size and line count and
//! says the full listing is the input file itself (issue 11: 100 000 comment lines made a
//! 1 327-page package).

use super::blocks::{paragraph_chunks, Ctx};
use super::document::Span;
use super::font::Face;
use super::page::{Item, Stroke};
use super::paginate::Chunk;
use super::text::{break_preformatted, wrap};

/// Most pages a numbered (source) listing may fill before it is summarised instead.
pub const MAX_LISTING_PAGES: usize = 30;

/// Chunks of a listing.
pub fn preformatted_chunks(ctx: &Ctx, lines: &[String], numbers: bool) -> Vec<Chunk> {
    let t = &ctx.style.text;
    let size = t.mono_size_pt;
    let lh = size * 1.28;
    let base = (lh - size) / 2.0 + ctx.fonts.ascent(Face::Mono, size) * 0.9;
    let digits = lines.len().max(1).to_string().len().max(2);
    let gutter = if numbers {
        ctx.fonts.width(Face::Mono, &"8".repeat(digits), size) + 7.0
    } else {
        0.0
    };
    let mark = ctx.fonts.width(Face::Mono, "↪ ", size);
    let code_x = gutter + 3.0;
    let avail = ctx.width - code_x;
    let rule = Stroke::solid(0.3, ctx.style.chart.grid_colour);
    let lines_per_page = (ctx.body_height / lh).floor().max(1.0) as usize;
    let max_printed = lines_per_page.saturating_mul(MAX_LISTING_PAGES);
    let mut out = Vec::new();
    for (n, text) in lines.iter().enumerate() {
        let parts = break_preformatted(ctx.fonts, text, Face::Mono, size, avail, avail - mark);
        if numbers && out.len() + parts.len() > max_printed {
            return summary_chunks(ctx, lines);
        }
        for (k, part) in parts.iter().enumerate() {
            let mut chunk = Chunk {
                height: lh,
                space_before: if n == 0 && k == 0 {
                    t.paragraph_gap_pt
                } else {
                    0.0
                },
                ..Chunk::default()
            };
            if numbers && k == 0 {
                let label = wrap(
                    ctx.fonts,
                    &[(Face::Mono, &(n + 1).to_string())],
                    size,
                    gutter,
                );
                if let Some(l) = label.first() {
                    let x = gutter - 4.0 - l.width;
                    chunk
                        .items
                        .extend(l.items(x, base, size, t.muted_colour, gutter));
                }
            }
            let x = if k == 0 {
                code_x
            } else {
                let m = wrap(ctx.fonts, &[(Face::Mono, "↪")], size, f64::INFINITY);
                if let Some(l) = m.first() {
                    chunk
                        .items
                        .extend(l.items(code_x, base, size, t.muted_colour, ctx.width));
                }
                code_x + mark
            };
            chunk
                .items
                .extend(part.items(x, base, size, t.colour, ctx.width));
            if numbers {
                chunk
                    .items
                    .push(Item::line((gutter, 0.0), (gutter, lh), rule));
            }
            out.push(chunk);
        }
    }
    out
}

/// In place of a listing longer than [`MAX_LISTING_PAGES`]: its size, its line count and
/// where the full text is. The SHA-256 printed with the appendix identifies the file.
fn summary_chunks(ctx: &Ctx, lines: &[String]) -> Vec<Chunk> {
    // Each line and its line feed; a file without a final line feed is one byte shorter.
    let bytes: usize = lines.iter().map(|l| l.len() + 1).sum();
    paragraph_chunks(
        ctx,
        &[Span::plain(format!(
            "The design file has {} lines ({bytes} bytes with line feeds); printed here it \
             would fill more than {MAX_LISTING_PAGES} pages, so the listing is left out. The \
             full listing is the input file itself: the file whose SHA-256 is given above.",
            lines.len()
        ))],
    )
}
