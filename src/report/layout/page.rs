//! Laid-out pages: positioned text runs and vector shapes in points, origin at the top
//! left of the page, y growing downwards. This is what the PDF writer draws and what
//! tests inspect.

use super::font::Face;
use super::style::{Colour, LineStyle};

/// A run of text in one face, drawn from its baseline start point.
#[derive(Debug, Clone, PartialEq)]
pub struct TextRun {
    /// Left end of the baseline (pt from the page's left edge).
    pub x: f64,
    /// Baseline (pt from the page's top edge).
    pub baseline: f64,
    /// Face; every character of `text` has a glyph in it.
    pub face: Face,
    /// Font size in points.
    pub size: f64,
    /// Fill colour.
    pub colour: Colour,
    /// The characters drawn.
    pub text: String,
    /// Advance width of `text` in points, from the font metrics.
    pub width: f64,
    /// Right edge of the box the run was laid out in (cell, column or figure); a run
    /// never ends past it.
    pub limit_right: f64,
    /// Rotation in degrees, counter-clockwise (90 = reading upwards).
    pub angle_deg: f64,
}

/// How a path is stroked.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Stroke {
    /// Line width in points.
    pub width: f64,
    /// Colour.
    pub colour: Colour,
    /// Dash pattern.
    pub dash: LineStyle,
}

impl Stroke {
    /// A solid stroke.
    pub fn solid(width: f64, colour: Colour) -> Stroke {
        Stroke {
            width,
            colour,
            dash: LineStyle::Solid,
        }
    }
}

/// One drawing element.
#[derive(Debug, Clone, PartialEq)]
pub enum Item {
    /// Text.
    Text(TextRun),
    /// A polyline or polygon.
    Path {
        /// Vertices in points.
        points: Vec<(f64, f64)>,
        /// Close the path back to its first point.
        closed: bool,
        /// Outline, if any.
        stroke: Option<Stroke>,
        /// Fill (closed paths), if any.
        fill: Option<Colour>,
    },
    /// A circle.
    Circle {
        /// Centre in points.
        centre: (f64, f64),
        /// Radius in points.
        radius: f64,
        /// Outline, if any.
        stroke: Option<Stroke>,
        /// Fill, if any.
        fill: Option<Colour>,
    },
}

impl Item {
    /// A straight line.
    pub fn line(from: (f64, f64), to: (f64, f64), stroke: Stroke) -> Item {
        Item::Path {
            points: vec![from, to],
            closed: false,
            stroke: Some(stroke),
            fill: None,
        }
    }

    /// A rectangle from its top-left corner and size.
    pub fn rect(
        x: f64,
        y: f64,
        w: f64,
        h: f64,
        stroke: Option<Stroke>,
        fill: Option<Colour>,
    ) -> Item {
        Item::Path {
            points: vec![(x, y), (x + w, y), (x + w, y + h), (x, y + h)],
            closed: true,
            stroke,
            fill,
        }
    }

    /// Moves the item by `(dx, dy)`.
    pub fn translate(&mut self, dx: f64, dy: f64) {
        match self {
            Item::Text(run) => {
                run.x += dx;
                run.baseline += dy;
                run.limit_right += dx;
            }
            Item::Path { points, .. } => {
                for p in points {
                    p.0 += dx;
                    p.1 += dy;
                }
            }
            Item::Circle { centre, .. } => {
                centre.0 += dx;
                centre.1 += dy;
            }
        }
    }
}

/// One laid-out page.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Page {
    /// Everything on the page, in drawing order.
    pub items: Vec<Item>,
}

impl Page {
    /// The text runs of the page.
    pub fn texts(&self) -> impl Iterator<Item = &TextRun> {
        self.items.iter().filter_map(|i| match i {
            Item::Text(t) => Some(t),
            _ => None,
        })
    }

    /// All text on the page joined by spaces (runs in drawing order), for tests.
    pub fn plain_text(&self) -> String {
        self.texts()
            .map(|t| t.text.as_str())
            .collect::<Vec<_>>()
            .join(" ")
    }
}

/// A contents entry: a numbered heading and the page it landed on.
#[derive(Debug, Clone, PartialEq)]
pub struct HeadingEntry {
    /// 1, 2 or 3.
    pub level: u8,
    /// "3.2.1".
    pub number: String,
    /// Heading text.
    pub text: String,
    /// 1-based page number (0 before layout).
    pub page: usize,
}

/// A document laid out into pages.
#[derive(Debug, Clone, PartialEq)]
pub struct Layout {
    /// Page width in points.
    pub page_width: f64,
    /// Page height in points.
    pub page_height: f64,
    /// The pages, header and footer included.
    pub pages: Vec<Page>,
    /// Every heading with its number and page.
    pub headings: Vec<HeadingEntry>,
}

/// Points per millimetre (1 pt = 1/72 in, 1 in = 25.4 mm).
pub const PT_PER_MM: f64 = 72.0 / 25.4;
