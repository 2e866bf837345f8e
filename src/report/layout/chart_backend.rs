//! A plotters drawing backend that records vector shapes and text as layout items
//! (points, y down), so charts become PDF paths and real text in the embedded font.
//!
//! Plotters works in integer pixels; this backend uses [`UNITS_PER_PT`] pixels per
//! point, fine enough that rounding is invisible in print.

use super::font::{Face, FontSet};
use super::page::{Item, Stroke, TextRun};
use super::style::{Colour, LineStyle};
use plotters::prelude::DrawingBackend;
use plotters_backend::text_anchor::{HPos, VPos};
use plotters_backend::{
    BackendColor, BackendCoord, BackendStyle, BackendTextStyle, DrawingErrorKind, FontFamily,
    FontTransform,
};
use std::cell::{Cell, RefCell};
use std::rc::Rc;

/// Backend pixels per point.
pub const UNITS_PER_PT: f64 = 10.0;

/// Family name plotters passes for bold chart text.
pub const BOLD_FAMILY: &str = "bold";

/// The (never produced) error of the recorder.
#[derive(Debug)]
pub struct RecorderError;

impl std::fmt::Display for RecorderError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("chart recorder error")
    }
}

impl std::error::Error for RecorderError {}

/// Records plotters drawing calls as [`Item`]s.
pub struct Recorder<'a> {
    fonts: &'a FontSet,
    size: (u32, u32),
    items: Rc<RefCell<Vec<Item>>>,
    dash: Rc<Cell<LineStyle>>,
}

impl<'a> Recorder<'a> {
    /// A recorder of `width` x `height` points. Items go to `items`; `dash` is the dash
    /// pattern applied to lines and paths drawn while it is set.
    pub fn new(
        fonts: &'a FontSet,
        width: f64,
        height: f64,
        items: Rc<RefCell<Vec<Item>>>,
        dash: Rc<Cell<LineStyle>>,
    ) -> Self {
        let w = (width * UNITS_PER_PT).round().clamp(1.0, 1e6) as u32;
        let h = (height * UNITS_PER_PT).round().clamp(1.0, 1e6) as u32;
        Recorder {
            fonts,
            size: (w, h),
            items,
            dash,
        }
    }

    fn push(&self, item: Item) {
        self.items.borrow_mut().push(item);
    }

    fn stroke<S: BackendStyle>(&self, style: &S) -> Option<Stroke> {
        let c = style.color();
        (c.alpha > 0.0).then(|| Stroke {
            width: f64::from(style.stroke_width().max(1)) / UNITS_PER_PT,
            colour: colour(c),
            dash: self.dash.get(),
        })
    }
}

fn pt(p: BackendCoord) -> (f64, f64) {
    (f64::from(p.0) / UNITS_PER_PT, f64::from(p.1) / UNITS_PER_PT)
}

fn colour(c: BackendColor) -> Colour {
    Colour::rgb(c.rgb.0, c.rgb.1, c.rgb.2)
}

/// The face plotters asks for by family name.
pub fn face_of(family: FontFamily) -> Face {
    match family {
        FontFamily::Monospace => Face::Mono,
        FontFamily::Name(name) if name == BOLD_FAMILY => Face::Bold,
        _ => Face::Regular,
    }
}

impl DrawingBackend for Recorder<'_> {
    type ErrorType = RecorderError;

    fn get_size(&self) -> (u32, u32) {
        self.size
    }

    fn ensure_prepared(&mut self) -> Result<(), DrawingErrorKind<RecorderError>> {
        Ok(())
    }

    fn present(&mut self) -> Result<(), DrawingErrorKind<RecorderError>> {
        Ok(())
    }

    fn draw_pixel(
        &mut self,
        point: BackendCoord,
        color: BackendColor,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        if color.alpha > 0.0 {
            let (x, y) = pt(point);
            let d = 1.0 / UNITS_PER_PT;
            self.push(Item::rect(x, y, d, d, None, Some(colour(color))));
        }
        Ok(())
    }

    fn draw_line<S: BackendStyle>(
        &mut self,
        from: BackendCoord,
        to: BackendCoord,
        style: &S,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        if let Some(stroke) = self.stroke(style) {
            self.push(Item::line(pt(from), pt(to), stroke));
        }
        Ok(())
    }

    fn draw_rect<S: BackendStyle>(
        &mut self,
        upper_left: BackendCoord,
        bottom_right: BackendCoord,
        style: &S,
        fill: bool,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        let (x0, y0) = pt(upper_left);
        let (x1, y1) = pt(bottom_right);
        let (x, y, w, h) = (x0.min(x1), y0.min(y1), (x1 - x0).abs(), (y1 - y0).abs());
        if style.color().alpha <= 0.0 {
            return Ok(());
        }
        let item = if fill {
            Item::rect(x, y, w, h, None, Some(colour(style.color())))
        } else {
            Item::rect(x, y, w, h, self.stroke(style), None)
        };
        self.push(item);
        Ok(())
    }

    fn draw_path<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        path: I,
        style: &S,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        let points: Vec<(f64, f64)> = path.into_iter().map(pt).collect();
        if let (Some(stroke), true) = (self.stroke(style), points.len() >= 2) {
            self.push(Item::Path {
                points,
                closed: false,
                stroke: Some(stroke),
                fill: None,
            });
        }
        Ok(())
    }

    fn draw_circle<S: BackendStyle>(
        &mut self,
        center: BackendCoord,
        radius: u32,
        style: &S,
        fill: bool,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        if style.color().alpha <= 0.0 {
            return Ok(());
        }
        let (stroke, fill) = if fill {
            (None, Some(colour(style.color())))
        } else {
            (self.stroke(style), None)
        };
        self.push(Item::Circle {
            centre: pt(center),
            radius: f64::from(radius) / UNITS_PER_PT,
            stroke,
            fill,
        });
        Ok(())
    }

    fn fill_polygon<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        vert: I,
        style: &S,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        let points: Vec<(f64, f64)> = vert.into_iter().map(pt).collect();
        if style.color().alpha > 0.0 && points.len() >= 3 {
            self.push(Item::Path {
                points,
                closed: true,
                stroke: None,
                fill: Some(colour(style.color())),
            });
        }
        Ok(())
    }

    fn draw_text<T: BackendTextStyle>(
        &mut self,
        text: &str,
        style: &T,
        pos: BackendCoord,
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        if style.color().alpha <= 0.0 || text.is_empty() {
            return Ok(());
        }
        let face = face_of(style.family());
        let size = style.size() / UNITS_PER_PT;
        let lines = super::text::wrap_plain(self.fonts, text, face, size, f64::INFINITY);
        let Some(line) = lines.first() else {
            return Ok(());
        };
        let anchor = style.anchor();
        // Offsets in the text's own frame: along the baseline, and downwards.
        let along = match anchor.h_pos {
            HPos::Left => 0.0,
            HPos::Center => -line.width / 2.0,
            HPos::Right => -line.width,
        };
        let down = match anchor.v_pos {
            VPos::Top => 0.76 * size,
            VPos::Center => 0.36 * size,
            VPos::Bottom => -0.22 * size,
        };
        let (dx, dy, angle): (f64, f64, f64) = match style.transform() {
            FontTransform::None => (along, down, 0.0),
            FontTransform::Rotate90 => (-down, along, -90.0),
            FontTransform::Rotate180 => (-along, -down, 180.0),
            FontTransform::Rotate270 => (down, -along, 90.0),
        };
        let (x, y) = pt(pos);
        let (w, _) = pt((self.size.0 as i32, 0));
        let c = colour(style.color());
        let (cos, sin) = (angle.to_radians().cos(), angle.to_radians().sin());
        for run in &line.runs {
            // Runs follow the baseline direction: (cos, -sin) in y-down coordinates.
            self.push(Item::Text(TextRun {
                x: x + dx + run.x * cos,
                baseline: y + dy - run.x * sin,
                face: run.face,
                size,
                colour: c,
                text: run.text.clone(),
                width: run.width,
                limit_right: w,
                angle_deg: angle,
            }));
        }
        Ok(())
    }

    fn estimate_text_size<T: BackendTextStyle>(
        &self,
        text: &str,
        style: &T,
    ) -> Result<(u32, u32), DrawingErrorKind<RecorderError>> {
        let face = face_of(style.family());
        let size = style.size() / UNITS_PER_PT;
        let width = self.fonts.width(face, text, size) * UNITS_PER_PT;
        Ok((width.ceil() as u32, (size * UNITS_PER_PT).ceil() as u32))
    }

    fn blit_bitmap(
        &mut self,
        _pos: BackendCoord,
        _size: (u32, u32),
        _src: &[u8],
    ) -> Result<(), DrawingErrorKind<RecorderError>> {
        Ok(())
    }
}
