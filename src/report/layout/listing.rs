//! Preformatted blocks (source listings): monospaced lines with an optional line-number
//! gutter; long lines wrap with a continuation mark, one chunk per printed line so the
//! listing splits anywhere across pages.

use super::blocks::Ctx;
use super::font::Face;
use super::page::{Item, Stroke};
use super::paginate::Chunk;
use super::text::{break_preformatted, wrap};

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
    let mut out = Vec::new();
    for (n, text) in lines.iter().enumerate() {
        let parts = break_preformatted(ctx.fonts, text, Face::Mono, size, avail, avail - mark);
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
