//! Tables and key/value lists: column widths, cell wrapping, row chunks, header rows
//! repeated after page breaks, and rows taller than a page split by lines.

use super::blocks::Ctx;
use super::document::{Align, Column};
use super::font::Face;
use super::page::{Item, Stroke};
use super::paginate::Chunk;
use super::style::Colour;
use super::text::{wrap, wrap_plain, Line};
use super::LayoutError;
use std::rc::Rc;

/// Horizontal cell padding in points.
const PAD_X: f64 = 3.0;
/// Vertical cell padding in points.
const PAD_Y: f64 = 2.2;

/// One cell to lay out.
struct Cell<'a> {
    text: &'a str,
    face: Face,
    align: Align,
    colour: Colour,
}

/// Column widths in points from the width fractions; column `i` gets at least
/// `minimums[i]` (e.g. its longest header word), and every column at least `floor`.
/// When the minimums do not all fit, they shrink in proportion, never below `floor`.
pub fn column_widths_with_minimums(
    fractions: &[f64],
    total: f64,
    floor: f64,
    minimums: &[f64],
) -> Result<Vec<f64>, String> {
    if fractions.is_empty() {
        return Err("a table needs at least one column".into());
    }
    if let Some(bad) = fractions.iter().find(|f| !(f.is_finite() && **f > 0.0)) {
        return Err(format!(
            "column width fraction {bad} must be a positive number"
        ));
    }
    if floor * fractions.len() as f64 > total {
        return Err(format!(
            "{} columns do not fit the page width at a legible size",
            fractions.len()
        ));
    }
    let wanted: Vec<f64> = minimums.iter().map(|m| m.max(floor)).collect();
    let wanted_sum: f64 = wanted.iter().sum();
    let minimums: Vec<f64> = if wanted_sum > total {
        let floors = floor * wanted.len() as f64;
        let scale = (total - floors) / (wanted_sum - floors).max(1e-9);
        wanted.iter().map(|w| floor + (w - floor) * scale).collect()
    } else {
        wanted
    };
    let sum: f64 = fractions.iter().sum();
    let mut widths: Vec<f64> = fractions.iter().map(|f| f / sum * total).collect();
    let mut pinned = vec![false; widths.len()];
    for _ in 0..widths.len() {
        let narrow: Vec<usize> = (0..widths.len())
            .filter(|&i| !pinned[i] && widths[i] < minimums[i] - 1e-9)
            .collect();
        if narrow.is_empty() {
            break;
        }
        for i in narrow {
            pinned[i] = true;
            widths[i] = minimums[i];
        }
        let fixed: f64 = (0..widths.len())
            .filter(|&i| pinned[i])
            .map(|i| widths[i])
            .sum();
        let free: f64 = (0..widths.len())
            .filter(|&i| !pinned[i])
            .map(|i| fractions[i])
            .sum();
        for i in 0..widths.len() {
            if !pinned[i] && free > 0.0 {
                widths[i] = fractions[i] / free * (total - fixed);
            }
        }
    }
    Ok(widths)
}

/// Width in points a column needs so that no word of its header is split.
fn header_word_width(ctx: &Ctx, header: &str, size: f64) -> f64 {
    header
        .split_whitespace()
        .map(|word| ctx.fonts.width(Face::Bold, word, size))
        .fold(0.0, f64::max)
        + 2.0 * PAD_X
        + 0.5
}

/// Width in points a column needs so that no percentage of its body ("123.2 %") is
/// split from its sign: the widest cell that is a number followed by " %".
fn percent_width(ctx: &Ctx, rows: &[Vec<String>], column: usize, size: f64) -> f64 {
    rows.iter()
        .filter_map(|r| r.get(column))
        .filter(|cell| {
            cell.strip_suffix(" %").is_some_and(|n| {
                n.len() <= 8
                    && n.trim_start_matches(['-', '\u{2212}'])
                        .parse::<f64>()
                        .is_ok()
            })
        })
        .map(|cell| ctx.fonts.width(Face::Regular, cell, size) + 2.0 * PAD_X + 0.5)
        .fold(0.0, f64::max)
}

/// Rows kept together at the start and at the end of a table, so a table never
/// leaves one or two rows alone on a page.
pub const MIN_ROWS_TOGETHER: usize = 3;

/// Lines of one cell wrapped to the cell's inner width.
pub fn cell_lines(ctx: &Ctx, text: &str, face: Face, size: f64, col_width: f64) -> Vec<Line> {
    wrap_plain(ctx.fonts, text, face, size, col_width - 2.0 * PAD_X)
}

/// Chunks of a table: caption, header, then one chunk per row (or per slice of a row
/// that is taller than a page).
pub fn table_chunks(
    ctx: &Ctx,
    columns: &[Column],
    rows: &[Vec<String>],
    caption: Option<(String, &str)>,
) -> Result<Vec<Chunk>, LayoutError> {
    let what = caption
        .as_ref()
        .map_or_else(|| "untitled table".to_string(), |c| c.0.clone());
    let err = |message: String| LayoutError::Table {
        table: what.clone(),
        message,
    };
    let t = &ctx.style.text;
    let size = t.table_size_pt;
    let fractions: Vec<f64> = columns.iter().map(|c| c.width_fraction).collect();
    let header_words: Vec<f64> = columns
        .iter()
        .enumerate()
        .map(|(i, c)| {
            header_word_width(ctx, &c.header, size).max(percent_width(ctx, rows, i, size))
        })
        .collect();
    let widths = column_widths_with_minimums(
        &fractions,
        ctx.width,
        2.0 * PAD_X + 2.5 * size,
        &header_words,
    )
    .map_err(err)?;
    if let Some((i, row)) = rows
        .iter()
        .enumerate()
        .find(|(_, r)| r.len() != columns.len())
    {
        return Err(err(format!(
            "row {} has {} cells but the table has {} columns",
            i + 1,
            row.len(),
            columns.len()
        )));
    }
    let mut chunks = Vec::new();
    let mut repeat = Chunk::default();
    if let Some((label, text)) = &caption {
        let mut chunk = caption_chunk(ctx, label, text);
        chunk.space_before = t.paragraph_gap_pt * 1.5;
        chunk.keep_with_next = true;
        chunks.push(chunk);
        let cont = caption_chunk(ctx, &format!("{label} (continued)"), "");
        repeat.height = cont.height;
        repeat.items = cont.items;
    }
    let header: Vec<Cell> = columns
        .iter()
        .map(|c| Cell {
            text: &c.header,
            face: Face::Bold,
            align: c.align,
            colour: t.colour,
        })
        .collect();
    let mut header_rows = row_chunks(ctx, &widths, &header, size, ctx.body_height / 2.0);
    if header_rows.len() != 1 {
        return Err(err("the header row is taller than half a page".into()));
    }
    let mut head = header_rows.remove(0);
    let fill = Item::rect(
        0.0,
        0.0,
        ctx.width,
        head.height,
        None,
        Some(t.table_header_fill),
    );
    head.items.insert(0, fill);
    head.items.push(rule(ctx, 0.0, 0.8));
    head.items.push(rule(ctx, head.height, 0.5));
    head.keep_with_next = true;
    if caption.is_none() {
        head.space_before = t.paragraph_gap_pt * 1.5;
    }
    for mut item in head.items.clone() {
        item.translate(0.0, repeat.height);
        repeat.items.push(item);
    }
    repeat.height += head.height;
    let repeat = Rc::new(repeat);
    chunks.push(head);
    let max_row = ctx.body_height - repeat.height - 4.0;
    for (r, row) in rows.iter().enumerate() {
        let cells: Vec<Cell> = row
            .iter()
            .zip(columns)
            .map(|(text, c)| Cell {
                text,
                face: Face::Regular,
                align: c.align,
                colour: t.colour,
            })
            .collect();
        let last = r + 1 == rows.len();
        // The first rows stay with the header, and the last rows with each other.
        let keep = rows.len() > MIN_ROWS_TOGETHER
            && (r + 1 < MIN_ROWS_TOGETHER || r + MIN_ROWS_TOGETHER >= rows.len() && !last);
        let parts = row_chunks(ctx, &widths, &cells, size, max_row);
        let count = parts.len();
        for (k, mut part) in parts.into_iter().enumerate() {
            let width = if last { 0.8 } else { 0.25 };
            part.items.push(rule(ctx, part.height, width));
            part.repeat = Some(Rc::clone(&repeat));
            part.keep_with_next = k + 1 == count && keep;
            chunks.push(part);
        }
    }
    Ok(chunks)
}

/// Chunks of a two-column term/value list.
pub fn key_value_chunks(ctx: &Ctx, pairs: &[(String, String)]) -> Vec<Chunk> {
    let t = &ctx.style.text;
    let size = t.base_size_pt;
    let widest = pairs
        .iter()
        .map(|(k, _)| ctx.fonts.width(Face::Regular, k, size))
        .fold(0.0, f64::max);
    let key_w = (widest + 2.0 * PAD_X + size).clamp(0.2 * ctx.width, 0.4 * ctx.width);
    let widths = [key_w, ctx.width - key_w];
    let mut chunks = Vec::new();
    for (i, (key, value)) in pairs.iter().enumerate() {
        let cells = [
            Cell {
                text: key,
                face: Face::Regular,
                align: Align::Left,
                colour: t.muted_colour,
            },
            Cell {
                text: value,
                face: Face::Regular,
                align: Align::Left,
                colour: t.colour,
            },
        ];
        for mut part in row_chunks(ctx, &widths, &cells, size, ctx.body_height * 0.9) {
            if i == 0 {
                part.space_before = t.paragraph_gap_pt;
            }
            chunks.push(part);
        }
    }
    chunks
}

/// "Table N: caption" (label bold) as a chunk.
fn caption_chunk(ctx: &Ctx, label: &str, text: &str) -> Chunk {
    let t = &ctx.style.text;
    let size = t.small_size_pt + 0.4;
    let separator = if text.is_empty() { "" } else { ": " };
    let joined = format!("{separator}{text}");
    let pieces = [(Face::Bold, label), (Face::Regular, joined.as_str())];
    let lines = wrap(ctx.fonts, &pieces, size, ctx.width);
    let lh = ctx.line_height(size);
    let mut chunk = Chunk::default();
    for (i, line) in lines.iter().enumerate() {
        let base = i as f64 * lh + ctx.baseline(size);
        chunk
            .items
            .extend(line.items(0.0, base, size, t.colour, ctx.width));
    }
    chunk.height = lines.len() as f64 * lh + 2.0;
    chunk
}

fn rule(ctx: &Ctx, y: f64, width: f64) -> Item {
    let colour = if width < 0.5 {
        ctx.style.chart.grid_colour
    } else {
        ctx.style.text.rule_colour
    };
    Item::line((0.0, y), (ctx.width, y), Stroke::solid(width, colour))
}

/// Lays out one row; returns one chunk, or several when the row is taller than
/// `max_height` (then each slice carries the next lines of every cell).
fn row_chunks(ctx: &Ctx, widths: &[f64], cells: &[Cell], size: f64, max_height: f64) -> Vec<Chunk> {
    let lh = ctx.line_height(size);
    let wrapped: Vec<Vec<Line>> = cells
        .iter()
        .zip(widths)
        .map(|(c, w)| cell_lines(ctx, c.text, c.face, size, *w))
        .collect();
    let line_count = wrapped.iter().map(Vec::len).max().unwrap_or(1).max(1);
    let per_part = (((max_height - 2.0 * PAD_Y) / lh).floor() as usize).max(1);
    let mut chunks = Vec::new();
    let mut first = 0;
    while first < line_count {
        let last = (first + per_part).min(line_count);
        let mut chunk = Chunk {
            height: (last - first) as f64 * lh + 2.0 * PAD_Y,
            ..Chunk::default()
        };
        let mut x = 0.0;
        for ((cell, lines), w) in cells.iter().zip(&wrapped).zip(widths) {
            let right = x + w - PAD_X;
            for (row, line) in lines.iter().enumerate().take(last).skip(first) {
                let base = PAD_Y + (row - first) as f64 * lh + ctx.baseline(size);
                let lx = match cell.align {
                    Align::Left => x + PAD_X,
                    Align::Right => right - line.width,
                    Align::Center => x + (w - line.width) / 2.0,
                };
                chunk
                    .items
                    .extend(line.items(lx, base, size, cell.colour, right));
            }
            x += w;
        }
        chunks.push(chunk);
        first = last;
    }
    chunks
}

#[cfg(test)]
mod tests {
    use super::*;

    fn column_widths(fractions: &[f64], total: f64, floor: f64) -> Result<Vec<f64>, String> {
        column_widths_with_minimums(fractions, total, floor, &vec![floor; fractions.len()])
    }

    #[test]
    fn widths_respect_minimum_and_total() {
        let w = column_widths(&[1.0, 10.0, 10.0], 300.0, 40.0).expect("widths");
        assert!((w.iter().sum::<f64>() - 300.0).abs() < 1e-9);
        assert!((w[0] - 40.0).abs() < 1e-9);
        assert!(column_widths(&[1.0; 10], 300.0, 40.0).is_err());
        assert!(column_widths(&[1.0, f64::NAN], 300.0, 40.0).is_err());
    }

    #[test]
    fn a_column_gets_its_minimum_from_the_others() {
        // 300 pt in shares 1:1:1 would give 100 each; column 0 needs 140, so the
        // other two share the remaining 160 (80 each).
        let w = column_widths_with_minimums(&[1.0, 1.0, 1.0], 300.0, 20.0, &[140.0, 0.0, 0.0])
            .expect("widths");
        assert!(
            (w[0] - 140.0).abs() < 1e-9 && (w[1] - 80.0).abs() < 1e-9,
            "{w:?}"
        );
        // Minimums of 200 + 200 on 300 pt shrink in proportion above the 20 pt floor:
        // 20 + (200 − 20)·(300 − 40)/(400 − 40) = 150 each.
        let w =
            column_widths_with_minimums(&[1.0, 1.0], 300.0, 20.0, &[200.0, 200.0]).expect("widths");
        assert!((w[0] - 150.0).abs() < 1e-9, "{w:?}");
    }
}
