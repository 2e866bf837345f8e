//! The title block: document title, a boxed grid of labelled fields, a blank box for
//! the reviewer's seal or stamp, and signature rows (prepared / checked / approved).

use super::blocks::Ctx;
use super::document::Signatory;
use super::font::Face;
use super::page::{Item, Stroke, PT_PER_MM};
use super::paginate::Chunk;
use super::text::wrap;

/// Inner padding of the title-block cells in points.
const PAD: f64 = 4.0;

/// Chunks of the title block.
pub fn title_chunks(
    ctx: &Ctx,
    title: &str,
    lines: &[(String, String)],
    seal_box: bool,
    signatures: &[Signatory],
) -> Vec<Chunk> {
    let t = &ctx.style.text;
    let mut out = Vec::new();

    let size = t.heading_sizes_pt[0] * 1.45;
    let title_lines = wrap(ctx.fonts, &[(Face::Bold, title)], size, ctx.width);
    let lh = size * 1.2;
    let mut chunk = Chunk {
        keep_with_next: true,
        ..Chunk::default()
    };
    for (i, line) in title_lines.iter().enumerate() {
        let base = i as f64 * lh + ctx.fonts.ascent(Face::Bold, size);
        chunk
            .items
            .extend(line.items(0.0, base, size, t.colour, ctx.width));
    }
    chunk.height = title_lines.len() as f64 * lh + 10.0;
    out.push(chunk);

    let outline = Stroke::solid(0.6, t.rule_colour);
    let hair = Stroke::solid(0.3, t.rule_colour);
    let seal_w = if seal_box {
        (0.36 * ctx.width).max(55.0 * PT_PER_MM)
    } else {
        0.0
    };
    let seal_h = if seal_box { 50.0 * PT_PER_MM } else { 0.0 };
    let combined = field_rows(ctx, lines, ctx.width - seal_w);
    let total: f64 = combined.iter().map(|f| f.0).sum();
    if total.max(seal_h) <= ctx.body_height * 0.8 {
        let grid_w = ctx.width - seal_w;
        let height = total.max(seal_h);
        let mut grid = Chunk {
            height,
            items: vec![Item::rect(0.0, 0.0, ctx.width, height, Some(outline), None)],
            keep_with_next: true,
            ..Chunk::default()
        };
        let mut y = 0.0;
        for (i, (h, items)) in combined.into_iter().enumerate() {
            grid.items.extend(items.into_iter().map(|mut it| {
                it.translate(0.0, y);
                it
            }));
            y += h;
            if i + 1 < lines.len() || y < height - 1.0 {
                grid.items.push(Item::line((0.0, y), (grid_w, y), hair));
            }
        }
        if seal_box {
            grid.items
                .push(Item::line((grid_w, 0.0), (grid_w, height), outline));
            grid.items.extend(seal_label(ctx, grid_w, seal_w));
        }
        out.push(grid);
    } else {
        // Too many fields for one box: one boxed row per field, the seal box below.
        for (h, items) in field_rows(ctx, lines, ctx.width) {
            let mut chunk = Chunk {
                height: h,
                items: vec![Item::rect(0.0, 0.0, ctx.width, h, Some(outline), None)],
                ..Chunk::default()
            };
            chunk.items.extend(items);
            out.push(chunk);
        }
        if seal_box {
            let mut chunk = Chunk {
                height: seal_h,
                items: vec![Item::rect(0.0, 0.0, ctx.width, seal_h, Some(outline), None)],
                space_before: 6.0,
                ..Chunk::default()
            };
            chunk.items.extend(seal_label(ctx, 0.0, ctx.width));
            out.push(chunk);
        }
    }

    if !signatures.is_empty() {
        out.push(signature_chunk(ctx, signatures));
    }
    out
}

/// One labelled field per entry (small label over the value): height and items.
fn field_rows(ctx: &Ctx, lines: &[(String, String)], width: f64) -> Vec<(f64, Vec<Item>)> {
    let t = &ctx.style.text;
    let (label_size, value_size) = (t.small_size_pt, t.base_size_pt);
    let mut rows = Vec::new();
    for (label, value) in lines {
        let mut items = Vec::new();
        let mut y = PAD * 0.6;
        for (text, size, colour) in [
            (label, label_size, t.muted_colour),
            (value, value_size, t.colour),
        ] {
            for line in wrap(ctx.fonts, &[(Face::Regular, text)], size, width - 2.0 * PAD) {
                let base = y + ctx.baseline(size);
                items.extend(line.items(PAD, base, size, colour, width - PAD));
                y += ctx.line_height(size);
            }
        }
        rows.push((y + PAD * 0.6, items));
    }
    rows
}

/// "Reviewer's seal / stamp" in the top left corner of the seal box at `x`.
fn seal_label(ctx: &Ctx, x: f64, width: f64) -> Vec<Item> {
    let t = &ctx.style.text;
    let size = t.small_size_pt;
    let text = "Reviewer's seal / stamp";
    let mut items = Vec::new();
    for (i, line) in wrap(ctx.fonts, &[(Face::Regular, text)], size, width - 2.0 * PAD)
        .iter()
        .enumerate()
    {
        let base = PAD + i as f64 * ctx.line_height(size) + ctx.baseline(size);
        items.extend(line.items(x + PAD, base, size, t.muted_colour, x + width - PAD));
    }
    items
}

/// A grid: role | name | signature | date, one row per signatory.
fn signature_chunk(ctx: &Ctx, signatures: &[Signatory]) -> Chunk {
    let t = &ctx.style.text;
    let size = t.base_size_pt;
    let label_size = t.small_size_pt;
    let outline = Stroke::solid(0.6, t.rule_colour);
    let hair = Stroke::solid(0.3, t.rule_colour);
    let widths = [0.18, 0.32, 0.32, 0.18].map(|f| f * ctx.width);
    let headers = ["", "Name", "Signature", "Date"];
    let head_h = ctx.line_height(label_size) + PAD;
    let row_h = (2.4 * size).max(24.0);
    let mut items = Vec::new();
    let mut x = 0.0;
    for (w, h) in widths.iter().zip(headers) {
        let l = wrap(ctx.fonts, &[(Face::Regular, h)], label_size, w - 2.0 * PAD);
        if let Some(line) = l.first() {
            let base = PAD * 0.5 + ctx.baseline(label_size);
            items.extend(line.items(x + PAD, base, label_size, t.muted_colour, x + w - PAD));
        }
        x += w;
    }
    let mut y = head_h;
    for s in signatures {
        items.push(Item::line((0.0, y), (ctx.width, y), hair));
        let cells = [
            (Face::Bold, &s.role),
            (Face::Regular, &s.name),
            (Face::Regular, &String::new()),
            (Face::Regular, &s.date),
        ];
        let mut x = 0.0;
        let mut row_height = row_h;
        for ((face, text), w) in cells.iter().zip(widths) {
            let lines = wrap(ctx.fonts, &[(*face, text.as_str())], size, w - 2.0 * PAD);
            let lh = ctx.line_height(size);
            row_height = row_height.max(lines.len() as f64 * lh + 2.0 * PAD);
            for (i, line) in lines.iter().enumerate() {
                let base = y + PAD + i as f64 * lh + ctx.baseline(size);
                items.extend(line.items(x + PAD, base, size, t.colour, x + w - PAD));
            }
            x += w;
        }
        y += row_height;
    }
    let mut x = 0.0;
    for w in &widths[..3] {
        x += w;
        items.push(Item::line((x, 0.0), (x, y), hair));
    }
    items.insert(0, Item::rect(0.0, 0.0, ctx.width, y, Some(outline), None));
    Chunk {
        height: y,
        items,
        space_before: 8.0,
        ..Chunk::default()
    }
}
