//! PDF output with printpdf: subset fonts, page content, deterministic file identity.
//!
//! Determinism: printpdf 0.12 names fonts and the trailer `/ID` from a process-wide
//! counter, so the second document of a process would differ from the first. Fonts
//! are therefore registered under fixed resource names, the info dates stay at
//! printpdf's fixed default (1970-01-01, no clock is read), and the trailer `/ID`
//! strings are replaced by a digest of the caller's `id_seed` and the file's body.
//! printpdf's document is finished with lopdf (the copy printpdf itself uses): empty
//! information keys are removed and the attachments embedded (`attach.rs`).

use super::document::{Attachment, PdfInfo};
use super::font::{Face, FontSet};
use super::page::Layout;
use super::stream::{page_content, resource_name, Glyphs};
use super::subset::subset;
use super::LayoutError;
use printpdf::{
    FontId, Mm, Op, ParsedFont, PdfDocument, PdfFont, PdfFontHandle, PdfPage, PdfSaveOptions, Pt,
    TextItem,
};
use std::collections::BTreeSet;

/// Resource name of each face in the PDF.
fn resource(face: Face) -> FontId {
    FontId(resource_name(face).to_string())
}

/// Writes the laid-out pages as PDF bytes.
pub fn write(
    layout: &Layout,
    fonts: &FontSet,
    title: &str,
    info: &PdfInfo,
    id_seed: &str,
    attachments: &[Attachment],
) -> Result<Vec<u8>, LayoutError> {
    let used = used_chars(layout);
    let mut doc = PdfDocument::new(title);
    doc.metadata.info.producer = "dutyline".to_string();
    doc.metadata.info.creator = "dutyline".to_string();
    doc.metadata.info.author = info.author.clone();
    doc.metadata.info.subject = info.subject.clone();
    if let Some((year, month, day)) = info.date {
        let date = printpdf::DateTime {
            date: printpdf::Date { year, month, day },
            time: printpdf::Time {
                hour: 0,
                minute: 0,
                second: 0,
                millisecond: 0,
            },
            offset: printpdf::Offset {
                hours: 0,
                minutes: 0,
                seconds: 0,
                milliseconds: 0,
            },
        };
        doc.metadata.info.creation_date = date;
        doc.metadata.info.modification_date = date;
        doc.metadata.info.metadata_date = date;
    }
    let glyphs = embed_fonts(&mut doc, fonts, &used)?;
    let (w, h) = (layout.page_width, layout.page_height);
    let contents: Vec<Vec<u8>> = layout
        .pages
        .iter()
        .map(|page| page_content(&page.items, h, &glyphs))
        .collect();
    // printpdf learns which glyphs each font uses from the pages' text operators
    // (its widths and ToUnicode map); the first page carries one text run per face
    // for that, and every page's content stream is replaced after translation.
    let usage = glyph_usage_ops(layout, &glyphs);
    for i in 0..layout.pages.len() {
        let ops = if i == 0 { usage.clone() } else { Vec::new() };
        doc.pages.push(PdfPage::new(
            Mm(w as f32 * 25.4 / 72.0),
            Mm(h as f32 * 25.4 / 72.0),
            ops,
        ));
    }
    let opts = PdfSaveOptions {
        optimize: true,
        subset_fonts: false,
        secure: true,
        image_optimization: None,
    };
    let mut warnings = Vec::new();
    // printpdf's own `save` is `to_lopdf_document`, `compress`, `save_to`; the
    // attachments go in between, so a document without them is written as before.
    let mut lo = doc.to_lopdf_document(&opts, &mut warnings);
    let mut deflater = Deflater::new();
    set_page_contents(&mut lo, contents, &mut deflater)?;
    drop_empty_info_keys(&mut lo);
    super::attach::embed(&mut lo, attachments, &pdf_date(info.date), &mut deflater)?;
    compress(&mut lo, &mut deflater);
    // Room for the whole file at once: every stream is in memory, compressed, and the
    // objects around them are small.
    let stream_bytes: usize = lo
        .objects
        .values()
        .filter_map(|o| o.as_stream().ok())
        .map(|s| s.content.len() + 256)
        .sum();
    let mut bytes = Vec::with_capacity(stream_bytes + 64 * lo.objects.len() + 4096);
    lo.save_to(&mut bytes)
        .map_err(|e| LayoutError::Pdf(format!("the PDF could not be written: {e}")))?;
    // Everything before the trailer is deterministic; the trailer holds printpdf's
    // counter-based /ID, replaced here.
    let body_end = find_last(&bytes, b"trailer").unwrap_or(bytes.len());
    let digest = hex(&digest128(&[id_seed.as_bytes(), &bytes[..body_end]]));
    set_trailer_id(&mut bytes, &digest)?;
    Ok(bytes)
}

/// Deflate level of the package's streams (zlib levels 0-9). lopdf's own `compress`
/// uses 9; at 6 (zlib's default) a demo package builds in about a fifth less CPU and
/// is 0.6 % larger (measured, DEVELOPERS.md "Benchmarks").
const DEFLATE_LEVEL: u32 = 6;

/// Deflates every stream that has no filter yet, as lopdf's `Document::compress`
/// does (FlateDecode, ISO 32000-1, 7.4.4; kept only when it saves more than the
/// filter entry costs), at [`DEFLATE_LEVEL`].
fn compress(doc: &mut lopdf::Document, deflater: &mut Deflater) {
    for object in doc.objects.values_mut() {
        let lopdf::Object::Stream(stream) = object else {
            continue;
        };
        if !stream.allows_compression || stream.dict.get(b"Filter").is_ok() {
            continue;
        }
        if let Some(packed) = deflater.pack(&stream.content) {
            stream.dict.set("Filter", "FlateDecode");
            stream.set_content(packed);
        }
    }
}

/// The package's deflate compressor, one for every stream, reset between them:
/// zlib-rs allocates and clears its window and hash tables when a compressor is made.
pub(super) struct Deflater {
    deflate: flate2::Compress,
}

impl Deflater {
    pub(super) fn new() -> Deflater {
        Deflater {
            deflate: flate2::Compress::new(flate2::Compression::new(DEFLATE_LEVEL), true),
        }
    }

    /// The zlib stream (RFC 1950) of `data` when it saves more than the 19 bytes a
    /// `/Filter /FlateDecode` entry costs (lopdf's rule), else `None` (kept raw).
    pub(super) fn pack(&mut self, data: &[u8]) -> Option<Vec<u8>> {
        self.deflate.reset();
        let packed = deflate_all(&mut self.deflate, data)?;
        (packed.len() + 19 < data.len()).then_some(packed)
    }
}

/// The zlib stream (RFC 1950) of `data` from a freshly reset compressor.
fn deflate_all(deflate: &mut flate2::Compress, data: &[u8]) -> Option<Vec<u8>> {
    // zlib's deflateBound for the default settings: room for the whole stream in
    // one call, even for data that does not compress.
    let mut out = Vec::with_capacity(data.len() + (data.len() >> 12) + (data.len() >> 14) + 64);
    loop {
        let consumed = usize::try_from(deflate.total_in()).ok()?;
        let status = deflate
            .compress_vec(
                data.get(consumed..)?,
                &mut out,
                flate2::FlushCompress::Finish,
            )
            .ok()?;
        match status {
            flate2::Status::StreamEnd => return Some(out),
            flate2::Status::Ok | flate2::Status::BufError => {
                out.reserve(out.capacity().max(64));
            }
        }
    }
}

/// A PDF date (ISO 32000-1, 7.9.4) at midnight UTC of `date` (as printpdf writes the information dates), or of 1970-01-01.
fn pdf_date(date: Option<(i32, u8, u8)>) -> String {
    let (y, m, d) = date.unwrap_or((1970, 1, 1));
    format!("D:{y:04}{m:02}{d:02}000000+00'00'")
}

/// Keys printpdf writes into the information dictionary even when they are empty.
const EMPTY_INFO_KEYS: [&[u8]; 5] = [
    b"GTS_PDFXVersion",
    b"Author",
    b"Subject",
    b"Identifier",
    b"Keywords",
];

/// Removes empty information keys: an empty PDF/X version claims a standard the file
/// does not follow, and empty texts say nothing.
fn drop_empty_info_keys(doc: &mut lopdf::Document) {
    let Ok(id) = doc
        .trailer
        .get(b"Info")
        .and_then(lopdf::Object::as_reference)
    else {
        return;
    };
    let Ok(info) = doc.get_dictionary_mut(id) else {
        return;
    };
    for key in EMPTY_INFO_KEYS {
        let empty = matches!(info.get(key), Ok(lopdf::Object::String(text, _)) if text.is_empty());
        if empty {
            info.remove(key);
        }
    }
}

/// Six capital letters derived from the subset's contents (ISO 32000-1, 9.6.4).
fn subset_tag(face: Face, chars: &BTreeSet<char>) -> String {
    let text: String = chars.iter().collect();
    let d = digest128(&[face.font_name().as_bytes(), text.as_bytes()]);
    d.iter()
        .take(6)
        .map(|b| char::from(b'A' + b % 26))
        .collect()
}

/// A 128-bit FNV-1a style digest (two 64-bit lanes); identifies, does not protect.
pub fn digest128(parts: &[&[u8]]) -> [u8; 16] {
    let mut a: u64 = 0xcbf2_9ce4_8422_2325;
    let mut b: u64 = 0x6c62_272e_07bb_0142;
    for part in parts {
        for &byte in part.iter().chain(&[0xff]) {
            a = (a ^ u64::from(byte)).wrapping_mul(0x0000_0100_0000_01b3);
            b = (b ^ u64::from(byte))
                .wrapping_mul(0x0000_0100_0000_01b3)
                .rotate_left(5);
        }
    }
    let mut out = [0u8; 16];
    out[..8].copy_from_slice(&a.to_be_bytes());
    out[8..].copy_from_slice(&b.to_be_bytes());
    out
}

fn hex(bytes: &[u8]) -> String {
    bytes.iter().map(|b| format!("{b:02X}")).collect()
}

/// Overwrites the two 32-character strings of the trailer's `/ID[(..)(..)]` in place
/// (same length, so the cross-reference offsets stay valid).
fn set_trailer_id(bytes: &mut [u8], id: &str) -> Result<(), LayoutError> {
    let trailer =
        find_last(bytes, b"trailer").ok_or_else(|| LayoutError::Pdf("no trailer".into()))?;
    let at = find_last(&bytes[trailer..], b"/ID")
        .map(|i| trailer + i)
        .ok_or_else(|| LayoutError::Pdf("no /ID in the trailer".into()))?;
    let mut pos = at + 3;
    for _ in 0..2 {
        let open = bytes[pos..]
            .iter()
            .position(|&c| c == b'(')
            .map(|i| pos + i + 1)
            .ok_or_else(|| LayoutError::Pdf("malformed /ID".into()))?;
        let close = bytes[open..]
            .iter()
            .position(|&c| c == b')')
            .map(|i| open + i)
            .ok_or_else(|| LayoutError::Pdf("malformed /ID".into()))?;
        if close - open != id.len() {
            return Err(LayoutError::Pdf(format!(
                "unexpected /ID length {}",
                close - open
            )));
        }
        bytes[open..close].copy_from_slice(id.as_bytes());
        pos = close + 1;
    }
    Ok(())
}

fn find_last(hay: &[u8], needle: &[u8]) -> Option<usize> {
    hay.windows(needle.len()).rposition(|w| w == needle)
}

/// Embeds the subset of each face that draws any character, under its fixed resource
/// name; returns each face's glyph table for the content streams.
fn embed_fonts(
    doc: &mut PdfDocument,
    fonts: &FontSet,
    used: &[BTreeSet<char>; 3],
) -> Result<[Glyphs; 3], LayoutError> {
    let mut glyphs: [Glyphs; 3] = Default::default();
    for face in Face::ALL {
        let chars = &used[face.index()];
        if chars.is_empty() {
            continue;
        }
        let bytes = subset(fonts.file(face), chars).map_err(LayoutError::Font)?;
        let mut warnings = Vec::new();
        let mut parsed = ParsedFont::from_bytes(&bytes, 0, &mut warnings).ok_or_else(|| {
            LayoutError::Font(format!("subset of {} unreadable", face.font_name()))
        })?;
        let tag = subset_tag(face, chars);
        parsed.font_name = Some(format!("{tag}+{}", face.font_name()));
        // The same lookup printpdf's text encoding makes (the subset's cmap).
        glyphs[face.index()] = Glyphs::new(chars.iter().copied(), |c| {
            parsed.lookup_glyph_index(c as u32)
        });
        doc.resources
            .fonts
            .map
            .insert(resource(face), PdfFont::new(parsed));
    }
    Ok(glyphs)
}

/// One text run per face holding, for each glyph it draws, the character printpdf
/// would have recorded for it: the last one drawn with that glyph in page order (its
/// glyph-usage pass keeps the last), so the font's widths and ToUnicode map are the
/// ones the full operators gave.
fn glyph_usage_ops(layout: &Layout, glyphs: &[Glyphs; 3]) -> Vec<Op> {
    let mut last: [Vec<Option<char>>; 3] = Default::default();
    for page in &layout.pages {
        for t in page.texts() {
            let slots = &mut last[t.face.index()];
            for c in t.text.chars() {
                if let Some(gid) = glyphs[t.face.index()].get(c) {
                    let gid = usize::from(gid);
                    if slots.len() <= gid {
                        slots.resize(gid + 1, None);
                    }
                    slots[gid] = Some(c);
                }
            }
        }
    }
    let mut ops = vec![Op::StartTextSection];
    for face in Face::ALL {
        let text: String = last[face.index()].iter().flatten().collect();
        if text.is_empty() {
            continue;
        }
        ops.push(Op::SetFont {
            font: PdfFontHandle::External(resource(face)),
            size: Pt(1.0),
        });
        ops.push(Op::ShowText {
            items: vec![TextItem::Text(text)],
        });
    }
    ops.push(Op::EndTextSection);
    ops
}

/// Replaces the content stream of every page, in page order, by `contents`, deflated
/// as [`compress`] would.
fn set_page_contents(
    lo: &mut lopdf::Document,
    contents: Vec<Vec<u8>>,
    deflater: &mut Deflater,
) -> Result<(), LayoutError> {
    let pages = lo.get_pages();
    if pages.len() != contents.len() {
        return Err(LayoutError::Pdf(format!(
            "{} pages written for {} laid out",
            pages.len(),
            contents.len()
        )));
    }
    for (page_id, content) in pages.into_values().zip(contents) {
        let stream_id = lo
            .get_dictionary(page_id)
            .and_then(|page| page.get(b"Contents"))
            .and_then(lopdf::Object::as_reference)
            .map_err(|e| LayoutError::Pdf(format!("a page without contents: {e}")))?;
        let stream = lo
            .get_object_mut(stream_id)
            .and_then(lopdf::Object::as_stream_mut)
            .map_err(|e| LayoutError::Pdf(format!("a page's contents: {e}")))?;
        if stream.allows_compression && stream.dict.get(b"Filter").is_err() {
            if let Some(packed) = deflater.pack(&content) {
                stream.dict.set("Filter", "FlateDecode");
                stream.set_content(packed);
                continue;
            }
        }
        stream.set_content(content);
    }
    Ok(())
}

/// The characters each face draws. ASCII is marked in a table first (most of the
/// text), the rest in a set, so a package does not insert every character it draws
/// into a tree.
fn used_chars(layout: &Layout) -> [BTreeSet<char>; 3] {
    let mut ascii = [[false; 128]; 3];
    let mut used: [BTreeSet<char>; 3] = Default::default();
    for page in &layout.pages {
        for t in page.texts() {
            let i = t.face.index();
            for c in t.text.chars() {
                match ascii[i].get_mut(c as usize) {
                    Some(seen) => *seen = true,
                    None => {
                        used[i].insert(c);
                    }
                }
            }
        }
    }
    for (set, table) in used.iter_mut().zip(&ascii) {
        set.extend(
            table
                .iter()
                .enumerate()
                .filter(|(_, &seen)| seen)
                .map(|(b, _)| char::from(b as u8)),
        );
    }
    used
}
