//! Chart annotations: clipping of series to the plot, duty-point markers with labels
//! placed where they cover the least data, reference lines, and the legend.

use super::chart::{rgb, series_look, units, Axes, Chart, YAxis};
use super::chart_backend::{Recorder, RecorderError};
use super::font::{Face, FontSet};
use super::style::{Colour, LineStyle, Style};
use super::ticks::Axis;
use plotters::coord::Shift;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};
use std::cell::Cell;
use std::ops::Range;

type Area<'a> = DrawingArea<Recorder<'a>, Shift>;
type DrawResult = Result<(), DrawingAreaErrorKind<RecorderError>>;
/// Backend pixel of a data point on a given y axis.
pub type CoordFn<'c> = dyn Fn(f64, f64, YAxis) -> (i32, i32) + 'c;
/// Pixel ranges (x, y) of the plotting area.
pub type PlotBox = (Range<i32>, Range<i32>);

/// What the annotation painters need to know about the plot.
pub struct PlotFrame<'c> {
    /// The chart being drawn.
    pub chart: &'c Chart,
    /// The report style.
    pub style: &'c Style,
    /// The embedded faces.
    pub fonts: &'c FontSet,
    /// The chart's axes.
    pub ax: &'c Axes,
    /// Data to backend pixels.
    pub coord: &'c CoordFn<'c>,
    /// Pixel ranges of the plotting area.
    pub plot: PlotBox,
}

/// Cuts a polyline to the axes' rectangle (Liang–Barsky per segment); non-finite
/// points break the line. Returns the visible pieces, each with two or more points.
pub fn clip_polyline(points: &[(f64, f64)], x: &Axis, y: &Axis) -> Vec<Vec<(f64, f64)>> {
    let mut pieces = Vec::new();
    let mut current: Vec<(f64, f64)> = Vec::new();
    let flush = |current: &mut Vec<(f64, f64)>, pieces: &mut Vec<Vec<(f64, f64)>>| {
        if current.len() >= 2 {
            pieces.push(std::mem::take(current));
        } else {
            current.clear();
        }
    };
    for pair in points.windows(2) {
        let (a, b) = (pair[0], pair[1]);
        let finite = a.0.is_finite() && a.1.is_finite() && b.0.is_finite() && b.1.is_finite();
        let clipped = if finite {
            clip_segment(a, b, x, y)
        } else {
            None
        };
        match clipped {
            Some((p, q)) => {
                if current.last() != Some(&p) {
                    flush(&mut current, &mut pieces);
                    current.push(p);
                }
                current.push(q);
                if q != b {
                    flush(&mut current, &mut pieces);
                }
            }
            None => flush(&mut current, &mut pieces),
        }
    }
    flush(&mut current, &mut pieces);
    pieces
}

fn clip_segment(
    a: (f64, f64),
    b: (f64, f64),
    x: &Axis,
    y: &Axis,
) -> Option<((f64, f64), (f64, f64))> {
    let (dx, dy) = (b.0 - a.0, b.1 - a.1);
    let (mut t0, mut t1) = (0.0f64, 1.0f64);
    for (p, q) in [
        (-dx, a.0 - x.lo),
        (dx, x.hi - a.0),
        (-dy, a.1 - y.lo),
        (dy, y.hi - a.1),
    ] {
        if p == 0.0 {
            if q < 0.0 {
                return None;
            }
        } else {
            let t = q / p;
            if p < 0.0 {
                t0 = t0.max(t);
            } else {
                t1 = t1.min(t);
            }
        }
    }
    if t0 > t1 {
        return None;
    }
    let at = |t: f64| {
        if t == 0.0 {
            a
        } else if t == 1.0 {
            b
        } else {
            (a.0 + t * dx, a.1 + t * dy)
        }
    };
    Some((at(t0), at(t1)))
}

const SAMPLE_PT: f64 = 20.0;

/// A label's lines (split at `\n`) and the width of its widest line, drawing units.
fn label_lines(label: &str, fonts: &FontSet, size: f64) -> (Vec<String>, i32) {
    let lines: Vec<String> = label.split('\n').map(str::to_string).collect();
    let width = lines
        .iter()
        .map(|l| units(fonts.width(Face::Regular, l, size)))
        .max()
        .unwrap_or(0);
    (lines, width)
}

fn entry_width(fonts: &FontSet, name: &str, size: f64) -> f64 {
    SAMPLE_PT + 4.0 + fonts.width(Face::Regular, name, size) + 14.0
}

/// Legend rows: indices of the named series, filled left to right.
pub fn legend_rows(chart: &Chart, fonts: &FontSet, size: f64, width: f64) -> Vec<Vec<usize>> {
    let available = (width - 60.0).max(100.0);
    let mut rows: Vec<Vec<usize>> = Vec::new();
    let mut used = 0.0;
    for (i, s) in chart.series.iter().enumerate() {
        if s.name.is_empty() {
            continue;
        }
        let w = entry_width(fonts, &s.name, size);
        match rows.last_mut() {
            Some(row) if used + w <= available => {
                row.push(i);
                used += w;
            }
            _ => {
                rows.push(vec![i]);
                used = w;
            }
        }
    }
    rows
}

fn text_style(size: f64, colour: Colour, pos: Pos) -> TextStyle<'static> {
    ("sans-serif", f64::from(units(size)))
        .into_font()
        .color(&rgb(colour))
        .pos(pos)
}

/// Draws the legend rows below the plot, starting at backend x `left`.
pub fn draw_legend(
    area: &Area,
    chart: &Chart,
    style: &Style,
    fonts: &FontSet,
    rows: &[Vec<usize>],
    left: i32,
    dash: &Cell<LineStyle>,
) -> DrawResult {
    let size = style.chart.label_size_pt;
    for (r, row) in rows.iter().enumerate() {
        let yc = units(8.0 + r as f64 * size * 1.6 + size * 0.5);
        let mut x = left;
        for &i in row {
            let Some(series) = chart.series.get(i) else {
                continue;
            };
            let (colour, line) = series_look(style, series);
            let shape = ShapeStyle {
                color: rgb(colour).to_rgba(),
                filled: false,
                stroke_width: units(style.chart.line_width_pt).max(1) as u32,
            };
            dash.set(line);
            let drawn = area.draw(&PathElement::new(
                vec![(x, yc), (x + units(SAMPLE_PT), yc)],
                shape,
            ));
            dash.set(LineStyle::Solid);
            drawn?;
            if series.markers {
                area.draw(&Circle::new(
                    (x + units(SAMPLE_PT / 2.0), yc),
                    units(1.6),
                    shape.filled(),
                ))?;
            }
            let label_style =
                text_style(size, style.text.colour, Pos::new(HPos::Left, VPos::Center));
            area.draw(&Text::new(
                series.name.clone(),
                (x + units(SAMPLE_PT + 4.0), yc),
                label_style,
            ))?;
            x += units(entry_width(fonts, &series.name, size));
        }
    }
    Ok(())
}

/// Draws the shaded x bands (clipped to the x axis) with their labels at the top
/// inside the band; returns the label boxes.
pub fn draw_bands(
    root: &Area,
    chart: &Chart,
    style: &Style,
    fonts: &FontSet,
    ax: &Axes,
    coord: &dyn Fn(f64, f64) -> (i32, i32),
) -> Result<Vec<Rect>, DrawingAreaErrorKind<RecorderError>> {
    let mut boxes = Vec::new();
    let size = style.chart.label_size_pt - 0.6;
    let fill = RGBColor(234, 242, 234);
    for band in &chart.bands {
        if !(band.from.is_finite() && band.to.is_finite()) {
            continue;
        }
        let (lo, hi) = (band.from.max(ax.x.lo), band.to.min(ax.x.hi));
        if lo >= hi {
            continue;
        }
        let top_left = coord(lo, ax.y.hi);
        let bottom_right = coord(hi, ax.y.lo);
        root.draw(&Rectangle::new([top_left, bottom_right], fill.filled()))?;
        if band.label.is_empty() {
            continue;
        }
        let (lines, w) = label_lines(&band.label, fonts, size);
        let lh = units(size * 1.25);
        let centre = (top_left.0 + bottom_right.0) / 2;
        let at = (centre - w / 2, top_left.1 + units(2.0));
        for (i, line) in lines.iter().enumerate() {
            let lw = units(fonts.width(Face::Regular, line, size));
            let text = text_style(
                size,
                style.text.muted_colour,
                Pos::new(HPos::Left, VPos::Center),
            );
            root.draw(&Text::new(
                line.clone(),
                (centre - lw / 2, at.1 + lh * i as i32 + lh / 2),
                text,
            ))?;
        }
        boxes.push((at.0, at.1, at.0 + w, at.1 + lh * lines.len() as i32));
    }
    Ok(boxes)
}

/// Draws the horizontal reference lines (dashed) with their labels.
/// Returns the boxes of the labels, which the duty-point labels then avoid.
pub fn draw_reference_lines(
    root: &Area,
    frame: &PlotFrame,
    dash: &Cell<LineStyle>,
) -> Result<Vec<Rect>, DrawingAreaErrorKind<RecorderError>> {
    let mut boxes = Vec::new();
    let PlotFrame {
        chart,
        style,
        fonts,
        ax,
        coord,
        plot,
    } = frame;
    let cs = &style.chart;
    let size = cs.label_size_pt - 0.3;
    for h in &chart.hlines {
        let axis = if h.axis == YAxis::Left { &ax.y } else { &ax.y2 };
        if !(h.y.is_finite() && axis.contains(h.y)) {
            continue;
        }
        let a = coord(ax.x.lo, h.y, h.axis);
        let b = coord(ax.x.hi, h.y, h.axis);
        let shape = ShapeStyle {
            color: rgb(cs.axis_colour).to_rgba(),
            filled: false,
            stroke_width: units(0.8).max(1) as u32,
        };
        dash.set(LineStyle::Dashed);
        let drawn = root.draw(&PathElement::new(vec![a, b], shape));
        dash.set(LineStyle::Solid);
        drawn?;
        if !h.label.is_empty() {
            let w = units(fonts.width(Face::Regular, &h.label, size));
            let lh = units(size * 1.25);
            let above = a.1 - units(size * 1.3 + 1.5);
            let below = a.1 + units(1.5);
            let right = b.0 - units(3.0) - w;
            // Above the line at the right end, else below it, else further left:
            // two labels of lines that (nearly) coincide never print over each other.
            let mut spots = Vec::new();
            for x in [right, right - w - units(8.0), right - 2 * (w + units(8.0))] {
                for y in [above, below] {
                    if y >= plot.1.start && y + lh <= plot.1.end && x >= plot.0.start {
                        spots.push((x, y));
                    }
                }
            }
            let free = |at: &(i32, i32)| {
                let rect = (at.0 - units(1.0), at.1, at.0 + w + units(1.0), at.1 + lh);
                !boxes.iter().any(|o| overlaps(o, &rect))
            };
            let at = spots
                .iter()
                .copied()
                .find(free)
                .unwrap_or((right, below.min(plot.1.end - lh)));
            let lines = [h.label.clone()];
            boxes.push((at.0, at.1, at.0 + w, at.1 + lh));
            label_box(root, fonts, &lines, at, size, cs.axis_colour)?;
        }
    }
    Ok(boxes)
}

/// Text lines on a white ground with the top left corner at `at`.
fn label_box(
    root: &Area,
    fonts: &FontSet,
    lines: &[String],
    at: (i32, i32),
    size: f64,
    colour: Colour,
) -> DrawResult {
    let w = lines
        .iter()
        .map(|l| units(fonts.width(Face::Regular, l, size)))
        .max()
        .unwrap_or(0);
    let lh = units(size * 1.25);
    let pad = units(1.0);
    let h = lh * lines.len() as i32;
    root.draw(&Rectangle::new(
        [(at.0 - pad, at.1 - pad), (at.0 + w + pad, at.1 + h + pad)],
        WHITE.filled(),
    ))?;
    for (i, line) in lines.iter().enumerate() {
        let style = text_style(size, colour, Pos::new(HPos::Left, VPos::Center));
        root.draw(&Text::new(
            line.clone(),
            (at.0, at.1 + lh * i as i32 + lh / 2),
            style,
        ))?;
    }
    Ok(())
}

/// Points along the drawn series, every few points of length, for label placement.
fn samples(lines: &[Vec<(i32, i32)>]) -> Vec<(i32, i32)> {
    let step = f64::from(units(3.0));
    let mut out = Vec::new();
    for line in lines {
        for pair in line.windows(2) {
            let (a, b) = (pair[0], pair[1]);
            let len = f64::from(b.0 - a.0).hypot(f64::from(b.1 - a.1));
            let n = ((len / step).ceil() as usize).clamp(1, 2000);
            for k in 0..=n {
                let t = k as f64 / n as f64;
                out.push((
                    a.0 + (t * f64::from(b.0 - a.0)) as i32,
                    a.1 + (t * f64::from(b.1 - a.1)) as i32,
                ));
            }
        }
    }
    out
}

/// A pixel box: x0, y0, x1, y1.
pub type Rect = (i32, i32, i32, i32);

fn overlaps(a: &Rect, b: &Rect) -> bool {
    a.0 < b.2 && b.0 < a.2 && a.1 < b.3 && b.1 < a.3
}

/// Draws the duty-point markers and their labels. Each label goes to the side of its
/// marker (right/left, above/below) that stays inside the plot, avoids other labels
/// and markers, and covers the fewest points of the drawn curves.
/// `obstacles` are boxes already taken (reference-line labels).
pub fn draw_markers(
    root: &Area,
    frame: &PlotFrame,
    drawn: &[Vec<(i32, i32)>],
    obstacles: &[Rect],
) -> DrawResult {
    let PlotFrame {
        chart,
        style,
        fonts,
        ax,
        coord,
        plot,
    } = frame;
    let cs = &style.chart;
    let size = cs.label_size_pt - 0.2;
    let visible: Vec<_> = chart
        .points
        .iter()
        .filter(|m| {
            let y_axis = if m.axis == YAxis::Left { &ax.y } else { &ax.y2 };
            m.x.is_finite() && m.y.is_finite() && ax.x.contains(m.x) && y_axis.contains(m.y)
        })
        .map(|m| (m, coord(m.x, m.y, m.axis)))
        .collect();
    let curve_points = samples(drawn);
    let gap = units(4.0);
    let r = units(3.0);
    let mut placed: Vec<Rect> = visible
        .iter()
        .map(|(_, p)| (p.0 - r, p.1 - r, p.0 + r, p.1 + r))
        .chain(obstacles.iter().copied())
        .collect();
    let mut labels = Vec::new();
    for (m, p) in &visible {
        if m.label.is_empty() {
            continue;
        }
        let (lines, w) = label_lines(&m.label, fonts, size);
        let h = units(size * 1.25) * lines.len() as i32;
        let mut best = (i64::MAX, (p.0 + gap, p.1 - gap - h), 0);
        let rings = [0.0, 7.0, 16.0, 28.0, 42.0, 60.0];
        for (ring, extra) in rings.into_iter().map(units).enumerate() {
            let g = gap + extra;
            let candidates = [
                (p.0 + g, p.1 - g - h),
                (p.0 - g - w, p.1 - g - h),
                (p.0 + g, p.1 + g),
                (p.0 - g - w, p.1 + g),
                (p.0 + g + r, p.1 - h / 2),
                (p.0 - g - r - w, p.1 - h / 2),
            ];
            for (k, c) in candidates.iter().enumerate() {
                let pad = units(1.0);
                let rect = (c.0 - pad, c.1 - pad, c.0 + w + pad, c.1 + h + pad);
                let mut cost = k as i64 + 60 * ring as i64;
                let outside = rect.0 < plot.0.start
                    || rect.2 > plot.0.end
                    || rect.1 < plot.1.start
                    || rect.3 > plot.1.end;
                if outside {
                    cost += 100_000;
                }
                cost += 50_000 * placed.iter().filter(|o| overlaps(o, &rect)).count() as i64;
                let covered = curve_points
                    .iter()
                    .filter(|q| q.0 >= rect.0 && q.0 <= rect.2 && q.1 >= rect.1 && q.1 <= rect.3)
                    .count();
                cost += 100 * covered as i64;
                if cost < best.0 {
                    best = (cost, *c, ring);
                }
            }
        }
        if best.2 > 0 {
            // A leader from the marker to the nearest corner of a label set further off.
            let c = best.1;
            let corner = (
                if c.0 > p.0 {
                    c.0 - units(1.0)
                } else {
                    c.0 + w + units(1.0)
                },
                if c.1 > p.1 {
                    c.1 - units(1.0)
                } else {
                    c.1 + h + units(1.0)
                },
            );
            let leader = ShapeStyle {
                color: rgb(style.text.muted_colour).to_rgba(),
                filled: false,
                stroke_width: units(0.4).max(1) as u32,
            };
            root.draw(&PathElement::new(vec![*p, corner], leader))?;
        }
        let at = best.1;
        placed.push((at.0, at.1, at.0 + w, at.1 + h));
        labels.push((lines, at));
    }
    for (_, p) in &visible {
        root.draw(&Circle::new(*p, units(3.2), WHITE.filled()))?;
        root.draw(&Circle::new(*p, units(2.4), rgb(cs.marker_colour).filled()))?;
    }
    for (lines, at) in labels {
        label_box(root, fonts, &lines, at, size, style.text.colour)?;
    }
    Ok(())
}
