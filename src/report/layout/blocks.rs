//! Blocks to chunks: headings, paragraphs, figures and callouts. Tables and key/value
//! lists live in `table.rs`, listings in `listing.rs`, the contents in `contents.rs`,
//! the title block in `title.rs`.

use super::chart;
use super::document::{Block, CalloutKind, Span};
use super::font::{Face, FontSet};
use super::page::{HeadingEntry, Item, Stroke, PT_PER_MM};
use super::paginate::Chunk;
use super::style::Style;
use super::text::{wrap, Line};
use super::{contents, listing, table, title, LayoutError};

/// Figure height used when the requested one is not a positive number.
const DEFAULT_FIGURE_MM: f64 = 80.0;
/// Smallest figure height; below it axes and legend leave no room for the plot.
const MIN_FIGURE_MM: f64 = 45.0;

/// What every block needs to lay itself out.
pub struct Ctx<'a> {
    /// The embedded faces.
    pub fonts: &'a FontSet,
    /// The style.
    pub style: &'a Style,
    /// Width of the text body in points.
    pub width: f64,
    /// Height of the text body in points.
    pub body_height: f64,
}

impl Ctx<'_> {
    /// Line pitch for a font size.
    pub fn line_height(&self, size: f64) -> f64 {
        size * self.style.text.line_spacing
    }

    /// Baseline offset from the top of a line box, centring the face's ascent and
    /// descent in the line pitch.
    pub fn baseline(&self, size: f64) -> f64 {
        let asc = self.fonts.ascent(Face::Regular, size);
        let desc = self.fonts.descent(Face::Regular, size);
        (self.line_height(size) - asc - desc) / 2.0 + asc
    }

    /// Lines as stacked items starting at `(x, top)`; returns the items and the height.
    pub fn stack(&self, lines: &[Line], x: f64, size: f64, limit: f64) -> (Vec<Item>, f64) {
        let lh = self.line_height(size);
        let mut items = Vec::new();
        for (i, line) in lines.iter().enumerate() {
            let base = i as f64 * lh + self.baseline(size);
            items.extend(line.items(x, base, size, self.style.text.colour, limit));
        }
        (items, lines.len() as f64 * lh)
    }
}

/// Numbers the headings ("3", "3.2", "3.2.1") in document order.
pub fn collect_headings(blocks: &[Block]) -> Vec<HeadingEntry> {
    let mut counters = [0usize; 3];
    let mut entries = Vec::new();
    for block in blocks {
        if let Block::Heading { level, text } = block {
            let level = (*level).clamp(1, 3);
            let depth = usize::from(level);
            counters[depth - 1] += 1;
            for c in counters.iter_mut().skip(depth) {
                *c = 0;
            }
            let number = counters[..depth]
                .iter()
                .map(|c| c.to_string())
                .collect::<Vec<_>>()
                .join(".");
            entries.push(HeadingEntry {
                level,
                number,
                text: text.clone(),
                page: 0,
            });
        }
    }
    entries
}

/// Chunks of a document, with where each contents block's chunks lie.
pub struct Chunks {
    /// Every block's chunks in order.
    pub chunks: Vec<Chunk>,
    /// Start and length in `chunks` of each [`Block::Contents`]' chunks: the only
    /// chunks that depend on heading page numbers.
    pub contents: Vec<(usize, usize)>,
}

impl Chunks {
    /// Replaces the contents chunks by ones laid out with `headings`' page numbers;
    /// every other chunk is independent of them and is kept, not measured again.
    pub fn relayout_contents(&mut self, ctx: &Ctx, headings: &[HeadingEntry]) {
        let mut shift = 0isize;
        for (start, len) in &mut self.contents {
            let at = start.saturating_add_signed(shift);
            let fresh = contents::contents_chunks(ctx, headings);
            shift += fresh.len() as isize - *len as isize;
            let n = fresh.len();
            self.chunks.splice(at..at + *len, fresh);
            (*start, *len) = (at, n);
        }
    }
}

/// Lays out every block into chunks. `headings` supplies numbers and (on the second
/// pass, through [`Chunks::relayout_contents`]) page numbers for the contents.
pub fn chunks(
    ctx: &Ctx,
    title_text: &str,
    blocks: &[Block],
    headings: &[HeadingEntry],
) -> Result<Chunks, LayoutError> {
    let mut out = Vec::new();
    let mut contents_at = Vec::new();
    let (mut heading, mut figure, mut table_no, mut equation) = (0, 0, 0, 0);
    for block in blocks {
        match block {
            Block::Heading { .. } => {
                if let Some(entry) = headings.get(heading) {
                    let mut c = heading_chunk(ctx, entry);
                    c.heading = Some(heading);
                    out.push(c);
                }
                heading += 1;
            }
            Block::Paragraph(spans) => out.extend(paragraph_chunks(ctx, spans)),
            Block::Preformatted {
                lines,
                line_numbers,
            } => out.extend(listing::preformatted_chunks(ctx, lines, *line_numbers)),
            Block::Table {
                columns,
                rows,
                caption,
            } => {
                table_no += 1;
                let label = caption.as_deref().map(|c| (format!("Table {table_no}"), c));
                out.extend(table::table_chunks(ctx, columns, rows, label)?);
            }
            Block::KeyValue(pairs) => out.extend(table::key_value_chunks(ctx, pairs)),
            Block::Figure {
                chart,
                height_mm,
                caption,
            } => {
                figure += 1;
                out.push(figure_chunk(ctx, chart, *height_mm, figure, caption)?);
            }
            Block::Equation(text) => {
                equation += 1;
                out.push(equation_chunk(ctx, text, equation));
            }
            Block::Contents => {
                let fresh = contents::contents_chunks(ctx, headings);
                contents_at.push((out.len(), fresh.len()));
                out.extend(fresh);
            }
            Block::TitleBlock {
                lines,
                seal_box,
                signatures,
            } => out.extend(title::title_chunks(
                ctx, title_text, lines, *seal_box, signatures,
            )),
            Block::PageBreak => out.push(Chunk {
                new_page: true,
                drop_at_top: true,
                ..Chunk::default()
            }),
            Block::Spacer(mm) => out.push(Chunk {
                height: if mm.is_finite() {
                    mm.clamp(0.0, 500.0)
                } else {
                    0.0
                } * PT_PER_MM,
                drop_at_top: true,
                ..Chunk::default()
            }),
            Block::Callout { kind, text } => out.extend(callout_chunks(ctx, *kind, text)),
        }
    }
    Ok(Chunks {
        chunks: out,
        contents: contents_at,
    })
}

fn heading_chunk(ctx: &Ctx, entry: &HeadingEntry) -> Chunk {
    let t = &ctx.style.text;
    let level = usize::from(entry.level.clamp(1, 3));
    let size = t.heading_sizes_pt[level - 1];
    let number_w = ctx.fonts.width(Face::Bold, &entry.number, size);
    let indent = if entry.number.is_empty() {
        0.0
    } else {
        number_w + size * 0.8
    };
    let lines = wrap(
        ctx.fonts,
        &[(Face::Bold, &entry.text)],
        size,
        ctx.width - indent,
    );
    let lh = size * 1.25;
    let base = (lh - size) / 2.0 + ctx.fonts.ascent(Face::Bold, size) * 0.9;
    let mut chunk = Chunk::default();
    let number = wrap(
        ctx.fonts,
        &[(Face::Bold, &entry.number)],
        size,
        f64::INFINITY,
    );
    if let Some(n) = number.first() {
        chunk
            .items
            .extend(n.items(0.0, base, size, t.colour, ctx.width));
    }
    for (i, line) in lines.iter().enumerate() {
        let y = base + i as f64 * lh;
        chunk
            .items
            .extend(line.items(indent, y, size, t.colour, ctx.width));
    }
    chunk.height = lines.len() as f64 * lh + 3.0;
    if level == 1 {
        let y = chunk.height;
        chunk.items.push(Item::line(
            (0.0, y),
            (ctx.width, y),
            Stroke::solid(0.5, t.rule_colour),
        ));
        chunk.height += 5.0;
    }
    chunk.space_before = [16.0, 11.0, 8.0][level - 1];
    chunk.keep_with_next = true;
    chunk
}

/// Spans as `(face, text)` pieces.
pub fn pieces(spans: &[Span]) -> Vec<(Face, &str)> {
    spans
        .iter()
        .map(|s| match s {
            Span::Plain(t) => (Face::Regular, t.as_str()),
            Span::Bold(t) => (Face::Bold, t.as_str()),
            Span::Mono(t) => (Face::Mono, t.as_str()),
        })
        .collect()
}

/// Groups lines into chunks: the first two and last two stay together (no orphans or
/// widows), the others break anywhere.
fn line_groups(count: usize) -> Vec<(usize, usize)> {
    if count <= 4 {
        return vec![(0, count)];
    }
    let mut groups = vec![(0, 2)];
    groups.extend((2..count - 2).map(|i| (i, i + 1)));
    groups.push((count - 2, count));
    groups
}

pub(super) fn paragraph_chunks(ctx: &Ctx, spans: &[Span]) -> Vec<Chunk> {
    let size = ctx.style.text.base_size_pt;
    let lines = wrap(ctx.fonts, &pieces(spans), size, ctx.width);
    let mut out = Vec::new();
    for (i, (a, b)) in line_groups(lines.len()).into_iter().enumerate() {
        let (items, height) = ctx.stack(&lines[a..b], 0.0, size, ctx.width);
        out.push(Chunk {
            height,
            items,
            space_before: if i == 0 {
                ctx.style.text.paragraph_gap_pt
            } else {
                0.0
            },
            ..Chunk::default()
        });
    }
    out
}

fn figure_chunk(
    ctx: &Ctx,
    chart_data: &chart::Chart,
    height_mm: f64,
    number: usize,
    caption: &str,
) -> Result<Chunk, LayoutError> {
    let t = &ctx.style.text;
    let size = t.small_size_pt + 0.4;
    let label = format!("Figure {number}");
    let rest = if caption.is_empty() {
        String::new()
    } else {
        format!(": {caption}")
    };
    let lines = wrap(
        ctx.fonts,
        &[(Face::Bold, &label), (Face::Regular, &rest)],
        size,
        ctx.width,
    );
    let (mut caption_items, caption_h) = ctx.stack(&lines, 0.0, size, ctx.width);
    let requested = if height_mm.is_finite() && height_mm > 0.0 {
        height_mm * PT_PER_MM
    } else {
        DEFAULT_FIGURE_MM * PT_PER_MM
    };
    let max_h = (ctx.body_height - caption_h - 12.0).max(30.0);
    let chart_h = requested.clamp((MIN_FIGURE_MM * PT_PER_MM).min(max_h), max_h);
    let mut items =
        chart::draw(chart_data, ctx.style, ctx.fonts, ctx.width, chart_h).map_err(|message| {
            LayoutError::Chart {
                figure: label.clone(),
                message,
            }
        })?;
    for item in &mut caption_items {
        item.translate(0.0, chart_h + 5.0);
    }
    items.extend(caption_items);
    Ok(Chunk {
        height: chart_h + 5.0 + caption_h,
        items,
        space_before: t.paragraph_gap_pt * 2.0,
        ..Chunk::default()
    })
}

/// A displayed equation: centred in the body (or flush left when wide), its number
/// "(N)" at the right margin.
fn equation_chunk(ctx: &Ctx, text: &str, number: usize) -> Chunk {
    let size = ctx.style.text.base_size_pt + 0.5;
    let label = format!("({number})");
    let label_w = ctx.fonts.width(Face::Regular, &label, size);
    let room = ctx.width - 2.0 * (label_w + size);
    let lines = wrap(ctx.fonts, &[(Face::Regular, text)], size, room);
    let lh = ctx.line_height(size);
    let mut items = Vec::new();
    for (i, line) in lines.iter().enumerate() {
        let x = if lines.len() == 1 {
            (ctx.width - line.width) / 2.0
        } else {
            label_w + size
        };
        let base = i as f64 * lh + ctx.baseline(size);
        items.extend(line.items(x, base, size, ctx.style.text.colour, ctx.width));
    }
    let last_base = (lines.len().max(1) - 1) as f64 * lh + ctx.baseline(size);
    let number_line = wrap(ctx.fonts, &[(Face::Regular, &label)], size, f64::INFINITY);
    if let Some(n) = number_line.first() {
        items.extend(n.items(
            ctx.width - n.width,
            last_base,
            size,
            ctx.style.text.colour,
            ctx.width,
        ));
    }
    Chunk {
        height: lines.len().max(1) as f64 * lh,
        items,
        space_before: ctx.style.text.paragraph_gap_pt * 1.2,
        ..Chunk::default()
    }
}

/// An unnumbered heading in level-1 style (not listed in the contents).
pub fn heading_like(ctx: &Ctx, text: &str) -> Chunk {
    let entry = HeadingEntry {
        level: 1,
        number: String::new(),
        text: text.to_string(),
        page: 0,
    };
    let mut c = heading_chunk(ctx, &entry);
    c.items
        .retain(|i| !matches!(i, Item::Text(r) if r.text.is_empty()));
    c
}

fn callout_chunks(ctx: &Ctx, kind: CalloutKind, text: &[Span]) -> Vec<Chunk> {
    let t = &ctx.style.text;
    let size = t.base_size_pt;
    let pad = 6.0;
    let bar = 2.2;
    let label = match kind {
        CalloutKind::Caution => "CAUTION",
        CalloutKind::Note => "NOTE",
    };
    let mut all = vec![(Face::Bold, label), (Face::Regular, "  ")];
    all.extend(pieces(text));
    let inner = ctx.width - 2.0 * pad - bar;
    let lines = wrap(ctx.fonts, &all, size, inner);
    let per_chunk = (((ctx.body_height * 0.9 - 2.0 * pad) / ctx.line_height(size)) as usize).max(1);
    let outline_colour = match kind {
        CalloutKind::Caution => t.colour,
        CalloutKind::Note => t.rule_colour,
    };
    let mut out = Vec::new();
    for (i, group) in lines.chunks(per_chunk).enumerate() {
        let (mut items, h) = ctx.stack(group, bar + pad, size, bar + pad + inner);
        for item in &mut items {
            item.translate(0.0, pad);
        }
        let height = h + 2.0 * pad;
        let outline = Stroke::solid(0.6, outline_colour);
        items.insert(
            0,
            Item::rect(0.0, 0.0, ctx.width, height, Some(outline), None),
        );
        items.insert(
            1,
            Item::rect(0.0, 0.0, bar, height, None, Some(outline_colour)),
        );
        out.push(Chunk {
            height,
            items,
            space_before: if i == 0 {
                t.paragraph_gap_pt * 1.5
            } else {
                0.0
            },
            ..Chunk::default()
        });
    }
    out
}
