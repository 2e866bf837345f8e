//! Page flow: stacks the chunks of all blocks into pages, keeps headings with what
//! follows, repeats table headers after a break, and adds the running header and
//! footer.

use super::document::PageMeta;
use super::font::{Face, FontSet};
use super::page::{HeadingEntry, Item, Page, Stroke, PT_PER_MM};
use super::style::Style;
use super::text::{wrap_plain, Line};
use std::rc::Rc;

/// An unbreakable slice of a block, laid out relative to the top left of the text body.
#[derive(Debug, Clone, Default)]
pub struct Chunk {
    /// Height in points.
    pub height: f64,
    /// Drawing, relative to (left margin, top of the chunk).
    pub items: Vec<Item>,
    /// Gap above the chunk, dropped at the top of a page.
    pub space_before: f64,
    /// Keep on the same page as the next chunk (headings, captions, first lines).
    pub keep_with_next: bool,
    /// Start a new page before this chunk.
    pub new_page: bool,
    /// Dropped entirely at the top of a page (spacers).
    pub drop_at_top: bool,
    /// Drawn first when this chunk lands at the top of a page (repeated table header).
    pub repeat: Option<Rc<Chunk>>,
    /// Index of the heading this chunk starts, to record its page.
    pub heading: Option<usize>,
}

/// Longest keep-with-next chain honoured; longer chains break anywhere.
const MAX_KEEP_CHAIN: usize = 12;

/// Where one chunk lands: its page (0-based), its top in the body, and the top of
/// the repeated table header drawn above it at the top of a page.
#[derive(Debug, Clone, Copy)]
pub struct Placed {
    page: usize,
    y: f64,
    header_y: Option<f64>,
}

/// Where the chunks land in pages of the body height (`None`: dropped at the top of
/// a page), and how many pages they fill; records heading pages. Nothing is drawn:
/// the pages are made by [`draw`] once the contents' page numbers have settled.
pub fn place(
    chunks: &[Chunk],
    style: &Style,
    headings: &mut [HeadingEntry],
) -> (Vec<Option<Placed>>, usize) {
    let body_height = style.body_height_mm() * PT_PER_MM;
    let mut placed = Vec::with_capacity(chunks.len());
    let mut page = 0;
    let mut y = 0.0;
    let mut empty = true;
    for (i, chunk) in chunks.iter().enumerate() {
        if chunk.new_page && !empty {
            page += 1;
            y = 0.0;
            empty = true;
        }
        if empty && chunk.drop_at_top {
            placed.push(None);
            continue;
        }
        let space = if empty { 0.0 } else { chunk.space_before };
        let chain = keep_chain_height(chunks, i);
        let need = if chain <= body_height {
            chain
        } else {
            chunk.height
        };
        if !empty && y + space + need > body_height + 1e-6 {
            page += 1;
            y = 0.0;
            empty = true;
            if chunk.drop_at_top {
                placed.push(None);
                continue;
            }
        }
        let space = if empty { 0.0 } else { chunk.space_before };
        let mut header_y = None;
        if empty {
            if let Some(header) = &chunk.repeat {
                header_y = Some(y);
                y += header.height;
            }
        }
        y += space;
        if let Some(h) = chunk.heading.and_then(|h| headings.get_mut(h)) {
            h.page = page + 1;
        }
        placed.push(Some(Placed { page, y, header_y }));
        y += chunk.height;
        empty = false;
    }
    (placed, page + 1)
}

/// The pages of `chunks` placed by [`place`] (body content only, in page
/// coordinates); the chunks' items are moved, not copied.
pub fn draw(
    chunks: Vec<Chunk>,
    placed: &[Option<Placed>],
    count: usize,
    style: &Style,
) -> Vec<Page> {
    let body_top = style.page.margin_top_mm * PT_PER_MM;
    let left = style.page.margin_left_mm * PT_PER_MM;
    let mut pages = vec![Page::default(); count.max(1)];
    for (chunk, at) in chunks.into_iter().zip(placed) {
        let Some(at) = at else {
            continue;
        };
        let Some(page) = pages.get_mut(at.page) else {
            continue;
        };
        if let (Some(header), Some(header_y)) = (&chunk.repeat, at.header_y) {
            for item in &header.items {
                let mut item = item.clone();
                item.translate(left, body_top + header_y);
                page.items.push(item);
            }
        }
        for mut item in chunk.items {
            item.translate(left, body_top + at.y);
            page.items.push(item);
        }
    }
    pages
}

/// Height needed to place chunk `i` together with the chunks it must stay with.
fn keep_chain_height(chunks: &[Chunk], i: usize) -> f64 {
    let mut height = chunks[i].height;
    let mut j = i;
    while chunks[j].keep_with_next && j + 1 < chunks.len() && j - i < MAX_KEEP_CHAIN {
        j += 1;
        if chunks[j].new_page {
            break;
        }
        height += chunks[j].space_before + chunks[j].height;
    }
    height
}

/// Adds the running header (left text and number, right text, over a thin rule) and
/// footer (rule, left text, "page N of M") to every page. When the header is full the
/// left text is shortened first; the number and the right text stay whole.
pub fn decorate(pages: &mut [Page], fonts: &FontSet, style: &Style, meta: &PageMeta) {
    let p = &style.page;
    let t = &style.text;
    let size = t.small_size_pt;
    let left = p.margin_left_mm * PT_PER_MM;
    let right = (p.width_mm - p.margin_right_mm) * PT_PER_MM;
    let width = right - left;
    let header_base = (p.margin_top_mm - p.header_offset_mm) * PT_PER_MM;
    let footer_base = (p.height_mm - p.margin_bottom_mm + p.footer_offset_mm) * PT_PER_MM;
    let rule = Stroke::solid(0.4, t.rule_colour);
    let total = pages.len();
    let colour = t.muted_colour;
    let hr = first_line(fonts, &meta.header_right, Face::Regular, size, width / 3.0);
    let number = if meta.header_number.is_empty() || meta.header_left.is_empty() {
        meta.header_number.clone()
    } else {
        format!("· {}", meta.header_number)
    };
    let hn = first_line(fonts, &number, Face::Bold, size, width / 2.0);
    let gap = fonts.width(Face::Bold, " ", size);
    let title_max = (width - hr.width - hn.width - gap - 2.0 * size).max(width / 4.0);
    let hl = first_line(fonts, &meta.header_left, Face::Bold, size, title_max);
    let fl_max = width - fonts.width(Face::Regular, "page 8888 of 8888", size) - size;
    let fl = first_line(fonts, &meta.footer_left, Face::Regular, size, fl_max);
    for (n, page) in pages.iter_mut().enumerate() {
        let page_text = format!("page {} of {}", n + 1, total);
        let pn = first_line(fonts, &page_text, Face::Regular, size, width);
        let mut items = hl.items(left, header_base, size, colour, right);
        let number_at = if hl.width > 0.0 {
            left + hl.width + gap
        } else {
            left
        };
        items.extend(hn.items(number_at, header_base, size, colour, right));
        items.extend(hr.items(right - hr.width, header_base, size, colour, right));
        let rule_y = header_base + 0.35 * size + 1.5;
        items.push(Item::line((left, rule_y), (right, rule_y), rule));
        let rule_y = footer_base - size - 1.5;
        items.push(Item::line((left, rule_y), (right, rule_y), rule));
        items.extend(fl.items(left, footer_base, size, colour, right));
        items.extend(pn.items(right - pn.width, footer_base, size, colour, right));
        page.items.splice(0..0, items);
    }
}

/// The text cut to one line of `max_width`, with an ellipsis when cut.
fn first_line(fonts: &FontSet, text: &str, face: Face, size: f64, max_width: f64) -> Line {
    let text = text.replace('\n', " ");
    let lines = wrap_plain(fonts, &text, face, size, max_width);
    if lines.len() <= 1 {
        return lines.into_iter().next().unwrap_or_default();
    }
    let mut cut: String = lines.first().map(Line::text).unwrap_or_default();
    while !cut.is_empty() && fonts.width(face, &format!("{cut}…"), size) > max_width {
        cut.pop();
    }
    let cut = format!("{}…", cut.trim_end());
    wrap_plain(fonts, &cut, face, size, f64::INFINITY)
        .into_iter()
        .next()
        .unwrap_or_default()
}
