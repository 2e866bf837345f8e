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
use super::page::{Item, Layout, Stroke};
use super::style::{Colour, LineStyle};
use super::subset::subset;
use super::LayoutError;
use printpdf::{
    Color, FontId, LineCapStyle, LineDashPattern, LineJoinStyle, LinePoint, Mm, Op, PaintMode,
    ParsedFont, PdfDocument, PdfFont, PdfFontHandle, PdfPage, PdfSaveOptions, Point, Polygon,
    PolygonRing, Pt, Rgb, TextItem, TextMatrix, WindingOrder,
};
use std::collections::BTreeSet;

/// Resource name of each face in the PDF.
fn resource(face: Face) -> FontId {
    FontId(
        match face {
            Face::Regular => "DLSans",
            Face::Bold => "DLSansBold",
            Face::Mono => "DLMono",
        }
        .to_string(),
    )
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
    let mut used: [BTreeSet<char>; 3] = Default::default();
    for page in &layout.pages {
        for t in page.texts() {
            used[t.face.index()].extend(t.text.chars());
        }
    }
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
        doc.resources
            .fonts
            .map
            .insert(resource(face), PdfFont::new(parsed));
    }
    let (w, h) = (layout.page_width, layout.page_height);
    for page in &layout.pages {
        let ops = page_ops(&page.items, h);
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
    drop_empty_info_keys(&mut lo);
    super::attach::embed(&mut lo, attachments, &pdf_date(info.date))?;
    compress(&mut lo);
    let mut bytes = Vec::new();
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
fn compress(doc: &mut lopdf::Document) {
    use std::io::Write;
    for object in doc.objects.values_mut() {
        let lopdf::Object::Stream(stream) = object else {
            continue;
        };
        if !stream.allows_compression || stream.dict.get(b"Filter").is_ok() {
            continue;
        }
        let mut encoder = flate2::write::ZlibEncoder::new(
            Vec::with_capacity(stream.content.len() / 3),
            flate2::Compression::new(DEFLATE_LEVEL),
        );
        let Ok(packed) = encoder
            .write_all(&stream.content)
            .and_then(|()| encoder.finish())
        else {
            continue;
        };
        if packed.len() + 19 < stream.content.len() {
            stream.dict.set("Filter", "FlateDecode");
            stream.set_content(packed);
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

fn pdf_colour(c: Colour) -> Color {
    Color::Rgb(Rgb {
        r: f32::from(c.r) / 255.0,
        g: f32::from(c.g) / 255.0,
        b: f32::from(c.b) / 255.0,
        icc_profile: None,
    })
}

fn dash_pattern(dash: LineStyle, width: f64) -> LineDashPattern {
    let w = width.max(0.5) as f32;
    match dash {
        LineStyle::Solid => LineDashPattern::new(0.0, &[]),
        LineStyle::Dashed => LineDashPattern::new(0.0, &[5.0 * w.sqrt(), 3.0 * w.sqrt()]),
        LineStyle::Dotted => LineDashPattern::new(0.0, &[0.0, 2.2 * w.max(1.0)]),
        LineStyle::DashDot => LineDashPattern::new(0.0, &[6.0, 2.5, 0.0, 2.5]),
    }
}

/// Graphics state already set in the content stream, to skip redundant operators.
#[derive(Default)]
struct State {
    fill: Option<Colour>,
    stroke: Option<Stroke>,
    font: Option<(Face, u64)>,
    in_text: bool,
}

fn page_ops(items: &[Item], page_h: f64) -> Vec<Op> {
    let mut ops = vec![
        Op::SetLineJoinStyle {
            join: LineJoinStyle::Round,
        },
        Op::SetLineCapStyle {
            cap: LineCapStyle::Round,
        },
    ];
    let mut st = State::default();
    let point = |(x, y): (f64, f64)| Point {
        x: Pt(x as f32),
        y: Pt((page_h - y) as f32),
    };
    for item in items {
        match item {
            Item::Text(t) => {
                if !st.in_text {
                    ops.push(Op::StartTextSection);
                    st.in_text = true;
                }
                let key = (t.face, t.size.to_bits());
                if st.font != Some(key) {
                    ops.push(Op::SetFont {
                        font: PdfFontHandle::External(resource(t.face)),
                        size: Pt(t.size as f32),
                    });
                    st.font = Some(key);
                }
                set_fill(&mut ops, &mut st, t.colour);
                let p = point((t.x, t.baseline));
                let (cos, sin) = (
                    t.angle_deg.to_radians().cos() as f32,
                    t.angle_deg.to_radians().sin() as f32,
                );
                let matrix = if t.angle_deg == 0.0 {
                    TextMatrix::Translate(p.x, p.y)
                } else {
                    TextMatrix::Raw([cos, sin, -sin, cos, p.x.0, p.y.0])
                };
                ops.push(Op::SetTextMatrix { matrix });
                ops.push(Op::ShowText {
                    items: vec![TextItem::Text(t.text.clone())],
                });
            }
            Item::Path {
                points,
                closed,
                stroke,
                fill,
            } => {
                end_text(&mut ops, &mut st);
                if points.len() < 2 {
                    continue;
                }
                let pts: Vec<LinePoint> = points
                    .iter()
                    .map(|p| LinePoint {
                        p: point(*p),
                        bezier: false,
                    })
                    .collect();
                paint(&mut ops, &mut st, pts, *closed, *stroke, *fill);
            }
            Item::Circle {
                centre,
                radius,
                stroke,
                fill,
            } => {
                end_text(&mut ops, &mut st);
                paint(
                    &mut ops,
                    &mut st,
                    circle_points(*centre, *radius, &point),
                    true,
                    *stroke,
                    *fill,
                );
            }
        }
    }
    end_text(&mut ops, &mut st);
    ops
}

fn end_text(ops: &mut Vec<Op>, st: &mut State) {
    if st.in_text {
        ops.push(Op::EndTextSection);
        st.in_text = false;
    }
}

fn set_fill(ops: &mut Vec<Op>, st: &mut State, c: Colour) {
    if st.fill != Some(c) {
        ops.push(Op::SetFillColor { col: pdf_colour(c) });
        st.fill = Some(c);
    }
}

fn set_stroke(ops: &mut Vec<Op>, st: &mut State, s: Stroke) {
    let old = st.stroke;
    if old.map(|o| o.colour) != Some(s.colour) {
        ops.push(Op::SetOutlineColor {
            col: pdf_colour(s.colour),
        });
    }
    if old.map(|o| o.width) != Some(s.width) {
        ops.push(Op::SetOutlineThickness {
            pt: Pt(s.width as f32),
        });
    }
    if old.map(|o| (o.dash, o.width)) != Some((s.dash, s.width)) {
        ops.push(Op::SetLineDashPattern {
            dash: dash_pattern(s.dash, s.width),
        });
    }
    st.stroke = Some(s);
}

fn paint(
    ops: &mut Vec<Op>,
    st: &mut State,
    points: Vec<LinePoint>,
    closed: bool,
    stroke: Option<Stroke>,
    fill: Option<Colour>,
) {
    if let Some(s) = stroke {
        set_stroke(ops, st, s);
    }
    if let Some(f) = fill {
        set_fill(ops, st, f);
    }
    let mode = match (stroke.is_some(), fill.is_some()) {
        (true, true) => PaintMode::FillStroke,
        (false, true) => PaintMode::Fill,
        (true, false) => PaintMode::Stroke,
        (false, false) => return,
    };
    if !closed && fill.is_none() {
        ops.push(Op::DrawLine {
            line: printpdf::Line {
                points,
                is_closed: false,
            },
        });
        return;
    }
    ops.push(Op::DrawPolygon {
        polygon: Polygon {
            rings: vec![PolygonRing { points }],
            mode,
            winding_order: WindingOrder::NonZero,
        },
    });
}

/// A circle as four cubic Bézier arcs (control distance 0.5523 r).
fn circle_points(c: (f64, f64), r: f64, point: &dyn Fn((f64, f64)) -> Point) -> Vec<LinePoint> {
    let k = 0.552_284_75 * r;
    let (x, y) = c;
    let p = |px: f64, py: f64, bezier: bool| LinePoint {
        p: point((px, py)),
        bezier,
    };
    vec![
        p(x + r, y, false),
        p(x + r, y + k, true),
        p(x + k, y + r, true),
        p(x, y + r, false),
        p(x - k, y + r, true),
        p(x - r, y + k, true),
        p(x - r, y, false),
        p(x - r, y - k, true),
        p(x - k, y - r, true),
        p(x, y - r, false),
        p(x + k, y - r, true),
        p(x + r, y - k, true),
        p(x + r, y, false),
    ]
}
