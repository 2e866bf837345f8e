//! Page content streams written directly as bytes (ISO 32000-1, 7.8.2 content
//! streams; 8.4 graphics state, 8.5 path construction and painting, 9.4 text
//! objects).
//!
//! The bytes are those printpdf 0.12 writes for the same drawing (its
//! `translate_operations` building lopdf operations, then `Content::encode`): one
//! operator a line, operands each followed by a space, reals as Rust prints an `f32`
//! (shortest round-trip form, written by `real.rs`), text as hexadecimal glyph ids of the subset font
//! (Identity-H, two bytes a glyph). Writing them here skips building a printpdf `Op`
//! and a lopdf `Operation` (with its operand vector) for every operator, the
//! largest cost of the package after compression (DEVELOPERS.md "Benchmarks").

use super::font::Face;
use super::page::{Item, Stroke};
use super::real::push_f32;
use super::style::{Colour, LineStyle};

/// The glyph id of each character a face draws, from the subset font's `cmap`
/// (`None` where the subset has none; written as glyph 0, as printpdf does).
#[derive(Debug, Clone)]
pub(super) struct Glyphs {
    /// The glyph id of each ASCII character (most of the text), looked up directly.
    ascii: [Option<u16>; 128],
    /// `(character, glyph id)` of the other characters, sorted by character.
    table: Vec<(char, Option<u16>)>,
}

impl Default for Glyphs {
    fn default() -> Glyphs {
        Glyphs {
            ascii: [None; 128],
            table: Vec::new(),
        }
    }
}

impl Glyphs {
    /// A table from sorted characters and a lookup of each.
    pub(super) fn new(
        chars: impl Iterator<Item = char>,
        lookup: impl Fn(char) -> Option<u16>,
    ) -> Glyphs {
        let mut glyphs = Glyphs::default();
        for c in chars {
            match glyphs.ascii.get_mut(c as usize) {
                Some(slot) => *slot = lookup(c),
                None => glyphs.table.push((c, lookup(c))),
            }
        }
        glyphs
    }

    /// The glyph id of `c`, if the subset has one.
    pub(super) fn get(&self, c: char) -> Option<u16> {
        if let Some(&gid) = self.ascii.get(c as usize) {
            return gid;
        }
        self.table
            .binary_search_by_key(&c, |&(k, _)| k)
            .ok()
            .and_then(|i| self.table[i].1)
    }
}

/// Resource name of each face in the PDF.
pub(super) fn resource_name(face: Face) -> &'static str {
    match face {
        Face::Regular => "DLSans",
        Face::Bold => "DLSansBold",
        Face::Mono => "DLMono",
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

/// The content stream writer: the bytes so far and the graphics state they set.
struct Writer<'a> {
    out: String,
    st: State,
    page_h: f64,
    glyphs: &'a [Glyphs; 3],
}

/// The content stream of one page's items (`page_h` the page height in points: the
/// layout's y grows downwards, PDF's upwards).
pub(super) fn page_content(items: &[Item], page_h: f64, glyphs: &[Glyphs; 3]) -> Vec<u8> {
    let mut w = Writer {
        out: String::with_capacity(64 * items.len() + 16),
        st: State::default(),
        page_h,
        glyphs,
    };
    w.out.push_str("1 j\n1 J");
    for item in items {
        match item {
            Item::Text(t) => w.text(t),
            Item::Path {
                points,
                closed,
                stroke,
                fill,
            } => {
                w.end_text();
                if points.len() < 2 {
                    continue;
                }
                let pts: Vec<(f32, f32, bool)> = points
                    .iter()
                    .map(|&p| {
                        let (x, y) = w.point(p);
                        (x, y, false)
                    })
                    .collect();
                w.paint(&pts, *closed, *stroke, *fill);
            }
            Item::Circle {
                centre,
                radius,
                stroke,
                fill,
            } => {
                w.end_text();
                let pts = circle_points(*centre, *radius, &|p| w.point(p));
                w.paint(&pts, true, *stroke, *fill);
            }
        }
    }
    w.end_text();
    w.out.into_bytes()
}

impl Writer<'_> {
    fn point(&self, (x, y): (f64, f64)) -> (f32, f32) {
        (x as f32, (self.page_h - y) as f32)
    }

    /// Writes an operator after its operands.
    fn op(&mut self, operator: &str) {
        self.out.push_str(operator);
    }

    /// Ends the previous operator's line (lopdf's `Content::encode` separates
    /// operators by a newline, with none after the last).
    fn line(&mut self) {
        self.out.push('\n');
    }

    fn real(&mut self, v: f32) {
        push_f32(&mut self.out, v);
        self.out.push(' ');
    }

    fn text(&mut self, t: &super::page::TextRun) {
        if !self.st.in_text {
            self.line();
            self.op("BT");
            self.st.in_text = true;
        }
        let key = (t.face, t.size.to_bits());
        if self.st.font != Some(key) {
            self.line();
            self.out.push('/');
            self.out.push_str(resource_name(t.face));
            self.out.push(' ');
            self.real(t.size as f32);
            self.op("Tf");
            self.st.font = Some(key);
        }
        self.set_fill(t.colour);
        let (x, y) = self.point((t.x, t.baseline));
        self.line();
        if t.angle_deg == 0.0 {
            self.out.push_str("1 0 0 1 ");
        } else {
            let (cos, sin) = (
                t.angle_deg.to_radians().cos() as f32,
                t.angle_deg.to_radians().sin() as f32,
            );
            for v in [cos, sin, -sin, cos] {
                self.real(v);
            }
        }
        self.real(x);
        self.real(y);
        self.op("Tm");
        self.line();
        self.out.push('<');
        let glyphs = &self.glyphs[t.face.index()];
        const HEX: &[u8; 16] = b"0123456789ABCDEF";
        for c in t.text.chars() {
            let gid = glyphs.get(c).unwrap_or(0);
            for shift in [12, 8, 4, 0] {
                self.out
                    .push(char::from(HEX[usize::from((gid >> shift) & 0xf)]));
            }
        }
        self.out.push_str("> Tj");
    }

    fn end_text(&mut self) {
        if self.st.in_text {
            self.line();
            self.op("ET");
            self.st.in_text = false;
        }
    }

    fn colour(&mut self, c: Colour, operator: &str) {
        self.line();
        for v in [c.r, c.g, c.b] {
            self.real(f32::from(v) / 255.0);
        }
        self.op(operator);
    }

    fn set_fill(&mut self, c: Colour) {
        if self.st.fill != Some(c) {
            self.colour(c, "rg");
            self.st.fill = Some(c);
        }
    }

    fn set_stroke(&mut self, s: Stroke) {
        let old = self.st.stroke;
        if old.map(|o| o.colour) != Some(s.colour) {
            self.colour(s.colour, "RG");
        }
        if old.map(|o| o.width) != Some(s.width) {
            self.line();
            self.real(s.width as f32);
            self.op("w");
        }
        if old.map(|o| (o.dash, o.width)) != Some((s.dash, s.width)) {
            self.line();
            self.out.push('[');
            for (i, v) in dash_pattern(s.dash, s.width).iter().enumerate() {
                if i > 0 {
                    self.out.push(' ');
                }
                push_f32(&mut self.out, *v);
            }
            self.out.push_str("] 0 d");
        }
        self.st.stroke = Some(s);
    }

    /// A path through `points` (`(x, y, is Bézier control)`), painted as printpdf's
    /// `DrawLine` (open, stroked only) or `DrawPolygon` (closed or filled) does.
    fn paint(
        &mut self,
        points: &[(f32, f32, bool)],
        closed: bool,
        stroke: Option<Stroke>,
        fill: Option<Colour>,
    ) {
        if let Some(s) = stroke {
            self.set_stroke(s);
        }
        if let Some(f) = fill {
            self.set_fill(f);
        }
        let paint_op = match (stroke.is_some(), fill.is_some()) {
            (true, true) => "b",
            (false, true) => "f",
            (true, false) => "S",
            (false, false) => return,
        };
        self.path(points);
        if !closed && fill.is_none() {
            self.line();
            self.op("S");
            return;
        }
        self.line();
        self.op("h");
        self.line();
        self.op(paint_op);
    }

    /// `m`, then `l` per point, or `c` where a point and the next are Bézier
    /// controls and a third point follows (printpdf's reading of `LinePoint`s).
    fn path(&mut self, points: &[(f32, f32, bool)]) {
        let Some(&(x, y, _)) = points.first() else {
            return;
        };
        self.line();
        self.real(x);
        self.real(y);
        self.op("m");
        let mut i = 1;
        while i < points.len() {
            let (x, y, bezier) = points[i];
            self.line();
            if bezier && i + 2 < points.len() && points[i + 1].2 {
                for &(px, py, _) in &points[i..i + 3] {
                    self.real(px);
                    self.real(py);
                }
                self.op("c");
                i += 3;
            } else {
                self.real(x);
                self.real(y);
                self.op("l");
                i += 1;
            }
        }
    }
}

/// The dash array of a line style at a width, in points.
fn dash_pattern(dash: LineStyle, width: f64) -> Vec<f32> {
    let w = width.max(0.5) as f32;
    match dash {
        LineStyle::Solid => Vec::new(),
        LineStyle::Dashed => vec![5.0 * w.sqrt(), 3.0 * w.sqrt()],
        LineStyle::Dotted => vec![0.0, 2.2 * w.max(1.0)],
        LineStyle::DashDot => vec![6.0, 2.5, 0.0, 2.5],
    }
}

/// A circle as four cubic Bézier arcs (control distance 0.5523 r).
fn circle_points(
    c: (f64, f64),
    r: f64,
    point: &dyn Fn((f64, f64)) -> (f32, f32),
) -> Vec<(f32, f32, bool)> {
    let k = 0.552_284_75 * r;
    let (x, y) = c;
    let p = |px: f64, py: f64, bezier: bool| {
        let (a, b) = point((px, py));
        (a, b, bezier)
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
