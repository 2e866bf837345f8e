//! The table of contents: one entry per heading with its number, dot leaders and the
//! page number. Page numbers sit in a fixed-width slot so the entries take the same
//! room on every layout pass, which keeps the two-pass layout stable.

use super::blocks::{heading_like, Ctx};
use super::font::Face;
use super::page::HeadingEntry;
use super::paginate::Chunk;
use super::text::wrap;

/// Chunks of the contents: the "Contents" title and one chunk per entry.
pub fn contents_chunks(ctx: &Ctx, headings: &[HeadingEntry]) -> Vec<Chunk> {
    let t = &ctx.style.text;
    let size = t.base_size_pt;
    let mut out = vec![heading_like(ctx, "Contents")];
    let page_w = ctx.fonts.width(Face::Regular, "8888", size);
    let dot_w = ctx.fonts.width(Face::Regular, ".", size);
    for h in headings {
        let depth = f64::from(h.level.clamp(1, 3) - 1);
        let face = if h.level == 1 {
            Face::Bold
        } else {
            Face::Regular
        };
        let indent = depth * size * 1.6;
        let number_w = size * (2.2 + 0.6 * depth);
        let text_x = indent + number_w;
        let text_w = ctx.width - text_x - page_w - 4.0 * dot_w;
        let lines = wrap(ctx.fonts, &[(face, &h.text)], size, text_w);
        let (mut items, height) = ctx.stack(&lines, text_x, size, text_x + text_w);
        let number = wrap(ctx.fonts, &[(face, &h.number)], size, f64::INFINITY);
        let base = ctx.baseline(size);
        if let Some(n) = number.first() {
            items.extend(n.items(indent, base, size, t.colour, text_x));
        }
        let last_base = base + (lines.len() as f64 - 1.0) * ctx.line_height(size);
        let last_end = text_x + lines.last().map_or(0.0, |l| l.width);
        let page = if h.page == 0 {
            "0".to_string()
        } else {
            h.page.to_string()
        };
        let pn = wrap(ctx.fonts, &[(face, &page)], size, f64::INFINITY);
        let pn_w = pn.first().map_or(0.0, |l| l.width);
        if let Some(p) = pn.first() {
            items.extend(p.items(ctx.width - pn_w, last_base, size, t.colour, ctx.width));
        }
        let leader_from = last_end + dot_w;
        let leader_to = ctx.width - page_w - dot_w;
        let dots = (((leader_to - leader_from) / (2.0 * dot_w)).floor().max(0.0)) as usize;
        if dots > 0 {
            let leader = ". ".repeat(dots);
            let l = wrap(
                ctx.fonts,
                &[(Face::Regular, leader.trim_end())],
                size,
                f64::INFINITY,
            );
            if let Some(l) = l.first() {
                let x = leader_to - l.width;
                items.extend(l.items(x, last_base, size, t.muted_colour, leader_to));
            }
        }
        out.push(Chunk {
            height,
            items,
            space_before: if h.level == 1 { size * 0.5 } else { 0.0 },
            ..Chunk::default()
        });
    }
    out
}
