//! Chart data model (filled by the report sections, no plotters types) and its
//! drawing with plotters into layout items: framed plot, grid, labelled axes (a second
//! y axis when used), series, duty-point markers with value labels, reference lines,
//! and a legend below the plot.

use super::chart_backend::{Recorder, RecorderError, UNITS_PER_PT};
use super::chart_marks::{
    clip_polyline, draw_bands, draw_legend, draw_markers, draw_reference_lines, legend_rows,
    PlotFrame,
};
use super::font::{Face, FontSet};
use super::page::Item;
use super::style::{Colour, LineStyle, Style};
use super::ticks::{Axis, NiceRange};
use plotters::coord::Shift;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};
use std::cell::{Cell, RefCell};
use std::rc::Rc;

/// Which y axis a series or mark belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum YAxis {
    /// The left (primary) axis.
    #[default]
    Left,
    /// The right (secondary) axis.
    Right,
}

/// A line through data points.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Series {
    /// Legend text (series with an empty name stay out of the legend).
    pub name: String,
    /// `(x, y)` points in drawing order; non-finite points break the line.
    pub points: Vec<(f64, f64)>,
    /// Axis of the y values.
    pub axis: YAxis,
    /// Picks colour and line style from the style's palette.
    pub style_index: usize,
    /// Force a dashed line whatever the style says.
    pub dashed: bool,
    /// Force a solid line whatever the style says (ignored when `dashed`).
    pub solid: bool,
    /// Mark every data point.
    pub markers: bool,
}

/// A labelled point, e.g. a duty point "Q = 42.0 m³/h, H = 31.2 m".
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Marker {
    /// X value.
    pub x: f64,
    /// Y value.
    pub y: f64,
    /// Label beside the marker; `'\n'` starts a new label line.
    pub label: String,
    /// Axis of `y`.
    pub axis: YAxis,
}

/// A horizontal reference line across the plot, e.g. a motor rating.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct HLine {
    /// Y value.
    pub y: f64,
    /// Label at the right end of the line.
    pub label: String,
    /// Axis of `y`.
    pub axis: YAxis,
}

/// A shaded band across the plot's height between two x values, e.g. a pump's
/// preferred operating region; drawn behind the series, labelled at its top.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct XBand {
    /// Left x value.
    pub from: f64,
    /// Right x value.
    pub to: f64,
    /// Label inside the band's top (may be empty).
    pub label: String,
}

/// Everything one plot shows.
#[derive(Debug, Clone, PartialEq)]
pub struct Chart {
    /// X axis title with units, e.g. "Flow Q [m³/h]".
    pub x_label: String,
    /// Left y axis title.
    pub y_label: String,
    /// Right y axis title; a right axis is drawn when this is set or anything uses it.
    pub y2_label: Option<String>,
    /// Fixed x range; automatic (from 0 for positive data) when `None`.
    pub x_range: Option<(f64, f64)>,
    /// Fixed left y range.
    pub y_range: Option<(f64, f64)>,
    /// Fixed right y range; by default its ticks line up with the left grid.
    pub y2_range: Option<(f64, f64)>,
    /// Lines.
    pub series: Vec<Series>,
    /// Labelled points (duty points).
    pub points: Vec<Marker>,
    /// Horizontal reference lines.
    pub hlines: Vec<HLine>,
    /// Shaded x bands (regions of flow).
    pub bands: Vec<XBand>,
    /// Shaded closed outlines on the left axis (e.g. a duty envelope), behind the series.
    pub fills: Vec<Vec<(f64, f64)>>,
    /// Draw a legend below the plot.
    pub legend: bool,
}

impl Default for Chart {
    fn default() -> Self {
        Chart {
            x_label: String::new(),
            y_label: String::new(),
            y2_label: None,
            x_range: None,
            y_range: None,
            y2_range: None,
            series: Vec::new(),
            points: Vec::new(),
            hlines: Vec::new(),
            bands: Vec::new(),
            fills: Vec::new(),
            legend: true,
        }
    }
}

impl Chart {
    /// Whether a right axis is drawn.
    pub fn uses_right_axis(&self) -> bool {
        self.y2_label.is_some()
            || self.series.iter().any(|s| s.axis == YAxis::Right)
            || self.points.iter().any(|p| p.axis == YAxis::Right)
            || self.hlines.iter().any(|h| h.axis == YAxis::Right)
    }
}

/// Colour and dash of series `index` under `style`.
pub fn series_look(style: &Style, series: &Series) -> (Colour, LineStyle) {
    let c = &style.chart;
    let colour = c.palette.get(series.style_index % c.palette.len().max(1));
    let dash = c
        .line_styles
        .get(series.style_index % c.line_styles.len().max(1));
    let dash = if series.dashed {
        LineStyle::Dashed
    } else if series.solid {
        LineStyle::Solid
    } else {
        dash.copied().unwrap_or(LineStyle::Solid)
    };
    (colour.copied().unwrap_or(style.text.colour), dash)
}

/// Plotters colour of a style colour.
pub(crate) fn rgb(c: Colour) -> RGBColor {
    RGBColor(c.r, c.g, c.b)
}

/// Size in backend units.
pub(crate) fn units(pt: f64) -> i32 {
    (pt * UNITS_PER_PT).round() as i32
}

/// Min and max of the finite values (`None` when there are none).
fn extent(values: impl Iterator<Item = f64>) -> Option<(f64, f64)> {
    values
        .filter(|v| v.is_finite())
        .fold(None, |acc, v| match acc {
            None => Some((v, v)),
            Some((lo, hi)) => Some((f64::min(lo, v), f64::max(hi, v))),
        })
}

/// The three axes of a chart.
pub(crate) struct Axes {
    /// X.
    pub x: Axis,
    /// Left y.
    pub y: Axis,
    /// Right y (a copy of `y` when unused).
    pub y2: Axis,
}

/// Axis ranges from the fixed ranges or the data.
pub(crate) fn axes(chart: &Chart, width: f64, plot_height: f64) -> Axes {
    let x_target = ((width / 65.0).round() as usize).clamp(3, 10);
    let y_target = ((plot_height / 38.0).round() as usize).clamp(3, 9);
    let series_x = chart
        .series
        .iter()
        .flat_map(|s| s.points.iter().map(|p| p.0));
    let xs = extent(series_x.chain(chart.points.iter().map(|p| p.x)));
    let ys_of = |side: YAxis| {
        let s = chart
            .series
            .iter()
            .filter(move |s| s.axis == side)
            .flat_map(|s| s.points.iter().map(|p| p.1));
        let m = chart
            .points
            .iter()
            .filter(move |p| p.axis == side)
            .map(|p| p.y);
        let h = chart
            .hlines
            .iter()
            .filter(move |h| h.axis == side)
            .map(|h| h.y);
        extent(s.chain(m).chain(h))
    };
    let auto = |e: Option<(f64, f64)>, target| {
        let (lo, hi) = e.unwrap_or((0.0, 1.0));
        Axis::auto(lo, hi, true, target)
    };
    let x = match chart.x_range {
        Some((a, b)) => Axis::fixed(a, b, x_target),
        None => auto(xs, x_target),
    };
    let y = match chart.y_range {
        Some((a, b)) => Axis::fixed(a, b, y_target),
        None => auto(ys_of(YAxis::Left), y_target),
    };
    let y2 = match chart.y2_range {
        Some((a, b)) => Axis::fixed(a, b, y_target),
        None => {
            let (lo, hi) = ys_of(YAxis::Right).unwrap_or((0.0, 1.0));
            if chart.y_range.is_none() && y.intervals() >= 2 {
                Axis::matched(lo, hi, true, y.intervals())
            } else {
                Axis::auto(lo, hi, true, y_target)
            }
        }
    };
    Axes { x, y, y2 }
}

/// Draws `chart` into a `width` x `height` point box; items are relative to the box's
/// top left corner.
pub(crate) fn draw(
    chart: &Chart,
    style: &Style,
    fonts: &FontSet,
    width: f64,
    height: f64,
) -> Result<Vec<Item>, String> {
    let cs = &style.chart;
    let label_pt = cs.label_size_pt;
    let desc_pt = label_pt + 0.6;
    let right_axis = chart.uses_right_axis();
    let row_h = label_pt * 1.6;
    let (rows, omitted, legend_h) = legend_layout(chart, fonts, label_pt, width, height);
    let plot_h = (height - legend_h).max(height * 0.5);
    let ax = axes(chart, width, plot_h);

    let tick = TICK_PT;
    let (y_area, y2_area, x_area, right_margin) = label_areas(&ax, fonts, label_pt, right_axis);

    let items = Rc::new(RefCell::new(Vec::new()));
    let dash = Rc::new(Cell::new(LineStyle::Solid));
    let backend = Recorder::new(fonts, width, height, Rc::clone(&items), Rc::clone(&dash));
    let root = backend.into_drawing_area();
    let (plot_area, legend_area) = root.split_vertically(units(plot_h));
    let e = |e: DrawingAreaErrorKind<_>| e.to_string();

    let mut ctx = ChartBuilder::on(&plot_area)
        .margin_top(units(label_pt * 0.8))
        .margin_right(units(right_margin))
        .x_label_area_size(units(x_area))
        .y_label_area_size(units(y_area))
        .right_y_label_area_size(units(y2_area))
        .build_cartesian_2d(NiceRange(ax.x.clone()), NiceRange(ax.y.clone()))
        .map_err(e)?
        .set_secondary_coord(NiceRange(ax.x.clone()), NiceRange(ax.y2.clone()));

    let axis_colour = rgb(cs.axis_colour);
    let grid = ShapeStyle {
        color: rgb(cs.grid_colour).to_rgba(),
        filled: false,
        stroke_width: units(0.4).max(1) as u32,
    };
    let axis_line = ShapeStyle {
        color: axis_colour.to_rgba(),
        filled: false,
        stroke_width: units(0.6).max(1) as u32,
    };
    let label_font = ("sans-serif", f64::from(units(label_pt)))
        .into_font()
        .color(&axis_colour);
    let desc_font = ("sans-serif", f64::from(units(desc_pt)))
        .into_font()
        .color(&rgb(style.text.colour));
    let fx = |v: &f64| ax.x.format(*v);
    let fy = |v: &f64| ax.y.format(*v);
    let fy2 = |v: &f64| ax.y2.format(*v);
    ctx.configure_mesh()
        .bold_line_style(grid)
        .light_line_style(TRANSPARENT)
        .axis_style(axis_line)
        .set_all_tick_mark_size(units(tick))
        .x_labels(ax.x.ticks.len().max(2))
        .y_labels(ax.y.ticks.len().max(2))
        .x_label_formatter(&fx)
        .y_label_formatter(&fy)
        .label_style(label_font.clone())
        .axis_desc_style(desc_font.clone())
        .x_desc(chart.x_label.as_str())
        .y_desc(chart.y_label.as_str())
        .draw()
        .map_err(e)?;
    if right_axis {
        ctx.configure_secondary_axes()
            .axis_style(axis_line)
            .set_all_tick_mark_size(units(tick))
            .y_labels(ax.y2.ticks.len().max(2))
            .y_label_formatter(&fy2)
            .label_style(label_font)
            .draw()
            .map_err(e)?;
    }
    let (px, py) = ctx.plotting_area().get_pixel_range();
    if let Some(text) = chart.y2_label.as_deref().filter(|t| !t.is_empty()) {
        // Drawn here rather than by plotters so it reads upwards like the left title.
        let at = (units(width) - units(desc_pt * 0.4), (py.start + py.end) / 2);
        let style = desc_font
            .transform(FontTransform::Rotate270)
            .pos(Pos::new(HPos::Center, VPos::Bottom));
        root.draw(&Text::new(text.to_string(), at, style))
            .map_err(e)?;
    }
    root.draw(&Rectangle::new(
        [(px.start, py.start), (px.end, py.end)],
        axis_line,
    ))
    .map_err(e)?;

    let band_boxes = draw_bands(&root, chart, style, fonts, &ax, &|x, y| {
        ctx.backend_coord(&(x, y))
    })
    .map_err(e)?;
    let coord = |x: f64, y: f64, side: YAxis| match side {
        YAxis::Left => ctx.backend_coord(&(x, y)),
        YAxis::Right => ctx.borrow_secondary().backend_coord(&(x, y)),
    };
    let frame = PlotFrame {
        chart,
        style,
        fonts,
        ax: &ax,
        coord: &coord,
        plot: (px.clone(), py.clone()),
    };
    draw_fills(&root, &frame).map_err(e)?;
    let mut drawn_lines = draw_series(&root, &frame, &dash).map_err(e)?;
    let mut taken = draw_reference_lines(&root, &frame, &dash).map_err(e)?;
    taken.extend(band_boxes);
    // Reference lines count as curves a label must not hide.
    for h in &chart.hlines {
        let axis = if h.axis == YAxis::Left { &ax.y } else { &ax.y2 };
        if h.y.is_finite() && axis.contains(h.y) {
            drawn_lines.push(vec![
                coord(ax.x.lo, h.y, h.axis),
                coord(ax.x.hi, h.y, h.axis),
            ]);
        }
    }
    draw_markers(&root, &frame, &drawn_lines, &taken).map_err(e)?;
    if !rows.is_empty() {
        draw_legend(&legend_area, chart, style, fonts, &rows, px.start, &dash).map_err(e)?;
        if omitted > 0 {
            omitted_note(
                &legend_area,
                style,
                omitted,
                rows.len() as f64 * row_h,
                px.start,
            )
            .map_err(e)?;
        }
    }
    drop(ctx);
    drop(root);
    let out = items.borrow().clone();
    Ok(out)
}

/// Length of a tick mark, pt.
const TICK_PT: f64 = 3.0;

/// The room, pt, for the left axis labels, the right axis labels (zero without a right
/// axis), the x axis labels and the right margin (half the last x label, so it is not
/// cut).
fn label_areas(
    ax: &Axes,
    fonts: &FontSet,
    label_pt: f64,
    right_axis: bool,
) -> (f64, f64, f64, f64) {
    let desc_pt = label_pt + 0.6;
    let widest = |a: &Axis| {
        a.ticks
            .iter()
            .map(|t| fonts.width(Face::Regular, &a.format(*t), label_pt))
            .fold(0.0, f64::max)
    };
    let tick = TICK_PT;
    let y_area = widest(&ax.y) + tick + 6.0 + desc_pt * 1.5;
    let y2_area = if right_axis {
        widest(&ax.y2) + tick + 6.0 + desc_pt * 1.5
    } else {
        0.0
    };
    let x_area = label_pt + tick + 6.0 + desc_pt * 1.6;
    let last_x = ax.x.ticks.last().map_or(String::new(), |t| ax.x.format(*t));
    let right_margin = if right_axis {
        2.0
    } else {
        fonts.width(Face::Regular, &last_x, label_pt) / 2.0 + 3.0
    };
    (y_area, y2_area, x_area, right_margin)
}

/// The legend's rows of series, how many series were left out, and its height, pt. The
/// legend may take at most 40 % of the figure; rows beyond that are cut and counted in
/// a closing note.
fn legend_layout(
    chart: &Chart,
    fonts: &FontSet,
    label_pt: f64,
    width: f64,
    height: f64,
) -> (Vec<Vec<usize>>, usize, f64) {
    let row_h = label_pt * 1.6;
    let max_rows = (((height * 0.4 - 8.0) / row_h).floor().max(1.0)) as usize;
    let mut rows = if chart.legend {
        legend_rows(chart, fonts, label_pt, width)
    } else {
        Vec::new()
    };
    let mut omitted = 0;
    if rows.len() > max_rows {
        let keep = max_rows.saturating_sub(1).max(1);
        omitted = rows[keep..].iter().map(Vec::len).sum();
        rows.truncate(keep);
    }
    let note_rows = usize::from(omitted > 0);
    let legend_h = if rows.is_empty() {
        0.0
    } else {
        (rows.len() + note_rows) as f64 * row_h + 8.0
    };
    (rows, omitted, legend_h)
}

/// The closing note of a cut legend, below its `rows_h` pt of rows, from pixel `x`.
fn omitted_note(
    legend_area: &DrawingArea<Recorder<'_>, Shift>,
    style: &Style,
    omitted: usize,
    rows_h: f64,
    x: i32,
) -> Result<(), DrawingAreaErrorKind<RecorderError>> {
    let label_pt = style.chart.label_size_pt;
    let note = format!("… and {omitted} more series not listed");
    let y = units(8.0 + rows_h + label_pt * 0.5);
    let font = ("sans-serif", f64::from(units(label_pt)))
        .into_font()
        .color(&rgb(style.text.muted_colour))
        .pos(Pos::new(HPos::Left, VPos::Center));
    legend_area.draw(&Text::new(note, (x, y), font))?;
    Ok(())
}

/// The chart's filled outlines (a duty envelope), clamped to the axes.
fn draw_fills(
    root: &DrawingArea<Recorder<'_>, Shift>,
    frame: &PlotFrame,
) -> Result<(), DrawingAreaErrorKind<RecorderError>> {
    let PlotFrame {
        chart, ax, coord, ..
    } = *frame;
    for outline in &chart.fills {
        let clamp = |&(x, y): &(f64, f64)| (x.clamp(ax.x.lo, ax.x.hi), y.clamp(ax.y.lo, ax.y.hi));
        let pixels: Vec<(i32, i32)> = outline
            .iter()
            .filter(|p| p.0.is_finite() && p.1.is_finite())
            .map(|p| {
                let (x, y) = clamp(p);
                coord(x, y, YAxis::Left)
            })
            .collect();
        if pixels.len() >= 3 {
            root.draw(&Polygon::new(pixels, RGBColor(246, 208, 160).filled()))?;
        }
    }
    Ok(())
}

/// Every series: its clipped polyline pieces (returned in pixels, for the labels to
/// avoid) and its markers.
fn draw_series(
    root: &DrawingArea<Recorder<'_>, Shift>,
    frame: &PlotFrame,
    dash: &Cell<LineStyle>,
) -> Result<Vec<Vec<(i32, i32)>>, DrawingAreaErrorKind<RecorderError>> {
    let PlotFrame {
        chart,
        style,
        ax,
        coord,
        ..
    } = *frame;
    let cs = &style.chart;
    let mut drawn_lines: Vec<Vec<(i32, i32)>> = Vec::new();
    for series in &chart.series {
        let (colour, line) = series_look(style, series);
        let shape = ShapeStyle {
            color: rgb(colour).to_rgba(),
            filled: false,
            stroke_width: units(cs.line_width_pt).max(1) as u32,
        };
        let y_axis = match series.axis {
            YAxis::Left => &ax.y,
            YAxis::Right => &ax.y2,
        };
        for piece in clip_polyline(&series.points, &ax.x, y_axis) {
            let pixels: Vec<(i32, i32)> =
                piece.iter().map(|p| coord(p.0, p.1, series.axis)).collect();
            dash.set(line);
            let drawn = root.draw(&PathElement::new(pixels.clone(), shape));
            dash.set(LineStyle::Solid);
            drawn?;
            drawn_lines.push(pixels);
        }
        if series.markers {
            for p in series
                .points
                .iter()
                .filter(|p| ax.x.contains(p.0) && y_axis.contains(p.1))
            {
                let at = coord(p.0, p.1, series.axis);
                root.draw(&Circle::new(at, units(1.6), shape.filled()))?;
            }
        }
    }
    Ok(drawn_lines)
}
