//! A candidate's plots: the published curves of one pump with BEP and the preferred
//! operating region, and per group of cases the head, NPSH and power plots of the
//! arrangement. Every series of a plot has a colour of its own.

use super::CaseRun;
use crate::analysis::checks::POR;
use crate::analysis::duty::CandidateCurves;
use crate::display::Units;
use crate::model::{CurveData, PumpCandidate};
use crate::pumps::MotorChoice;
use crate::report::layout::chart::{Chart, HLine, Marker, Series, XBand, YAxis};
use crate::report::layout::document::Block;

/// Most series one plot shows: the style palette has eight colours, and a plot never
/// reuses one.
pub const MAX_SERIES: usize = 8;

/// Hands out the style indices of one plot, each once.
#[derive(Default)]
struct Palette {
    next: usize,
}

impl Palette {
    fn next(&mut self) -> usize {
        self.next += 1;
        self.next - 1
    }
}

/// Cases per head plot so that no plot needs more than [`MAX_SERIES`] colours: a
/// system curve per case, a pump curve per case where the cases run the pump
/// differently (speed, trim), and the efficiency curve. Groups are balanced.
pub(super) fn cases_per_plot(results: &[CaseRun]) -> usize {
    let one_curve = results
        .windows(2)
        .all(|w| w[0].1.operating_curve == w[1].1.operating_curve);
    let most = if one_curve {
        MAX_SERIES - 2
    } else {
        (MAX_SERIES - 1) / 2
    };
    let groups = results.len().div_ceil(most).max(1);
    results.len().div_ceil(groups).max(1)
}

/// The flow axis title: the arrangement's flow when pumps share it.
fn flow_title(pump: &PumpCandidate, label: &str) -> String {
    if pump.count > 1 && pump.arrangement == crate::model::ArrangementKind::Parallel {
        format!("Flow of the arrangement ({label})")
    } else {
        format!("Flow ({label})")
    }
}

/// "12.500 in at 1780 rpm" or "1780 rpm".
fn curve_name(data: &CurveData, units: &Units) -> String {
    let rpm = data.speed.get::<uom::si::frequency::cycle_per_minute>();
    match data.impeller {
        Some(dm) => format!(
            "{} at {rpm:.0} rpm",
            units.diameter().text(dm.get::<uom::si::length::meter>())
        ),
        None => format!("{rpm:.0} rpm"),
    }
}

/// The preferred operating region as a band, ANSI/HI 9.6.3's fractions of BEP flow.
fn preferred_region(bep_flow: f64, scale: impl Fn(f64) -> f64) -> XBand {
    XBand {
        from: scale(POR.0 * bep_flow),
        to: scale(POR.1 * bep_flow),
        label: format!(
            "preferred operating region\n{:.0}–{:.0} % of BEP flow\n(ANSI/HI 9.6.3)",
            POR.0 * 100.0,
            POR.1 * 100.0
        ),
    }
}

/// One pump's published head curves at their published speeds (flow and head per
/// pump), the published efficiency points of the curve the cases evaluate, its BEP
/// and the preferred operating region. Kept apart from the arrangement's curves, whose
/// flow axis differs.
pub(super) fn published_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    curves: &CandidateCurves,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let usable: Vec<&CurveData> = pump
        .curves
        .iter()
        .zip(&curves.published)
        .filter(|(_, fit)| fit.is_ok())
        .map(|(data, _)| data)
        .collect();
    if curves.published_head_samples.is_empty() {
        return;
    }
    let mut palette = Palette::default();
    let mut series = Vec::new();
    for (data, samples) in usable.iter().zip(&curves.published_head_samples) {
        if series.len() + 2 > MAX_SERIES {
            break;
        }
        let points = samples
            .iter()
            .map(|(q, h)| (fl.value(*q), hd.value(*h)))
            .collect();
        let name = format!("head, {}", curve_name(data, units));
        series.push(line(name, points, Stroke::Solid, &mut palette));
    }
    let evaluated = curves.evaluated.as_ref().map(|(c, _)| c);
    let efficiency_data = usable.iter().find(|data| {
        evaluated.is_some_and(|c| {
            data.impeller.map(|d| d.get::<uom::si::length::meter>()) == c.impeller_diameter_m
        })
    });
    if let Some(data) = efficiency_data.or(usable.first()) {
        let points: Vec<(f64, f64)> = data
            .flow
            .iter()
            .zip(&data.efficiency)
            .filter_map(|(q, e)| {
                let e = e.as_ref()?.get::<uom::si::ratio::ratio>();
                Some((
                    fl.value(q.get::<uom::si::volume_rate::cubic_meter_per_second>()),
                    e * 100.0,
                ))
            })
            .collect();
        if !points.is_empty() {
            series.push(Series {
                name: format!("published efficiency, {}", curve_name(data, units)),
                points,
                axis: YAxis::Right,
                style_index: palette.next(),
                markers: true,
                ..Default::default()
            });
        }
    }
    let mut markers = Vec::new();
    let mut bands = Vec::new();
    if let Some(bep) = &curves.evaluated_bep {
        markers.push(left_marker(
            fl.value(bep.flow),
            hd.value(bep.head),
            format!(
                "BEP {} @ {}, {}",
                fl.text(bep.flow),
                hd.text(bep.head),
                crate::display::percent(bep.efficiency)
            ),
        ));
        bands.push(preferred_region(bep.flow, |q| fl.value(q)));
    }
    let per_pump = pump.count > 1;
    let axis = |what: &str, label: &str| {
        if per_pump {
            format!("{what} per pump ({label})")
        } else {
            format!("{what} ({label})")
        }
    };
    let evaluated_name = evaluated
        .map(|c| {
            let d = c
                .impeller_diameter_m
                .map(|d| format!("{} ", units.diameter().text(d)))
                .unwrap_or_default();
            format!("{d}at {:.0} rpm", c.speed_rpm)
        })
        .unwrap_or_default();
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: axis("Flow", fl.label),
            y_label: axis("Head", hd.label),
            y2_label: Some("Efficiency (%)".into()),
            y2_range: Some((0.0, 100.0)),
            series,
            points: markers,
            bands,
            ..Default::default()
        },
        height_mm: 95.0,
        caption: format!(
            "Pump {}: published curves of one pump at their published speeds; BEP and preferred operating region of the curve the cases evaluate ({evaluated_name})",
            pump.name
        ),
    });
}

/// Head curves as run in each case, system curves, duty points and efficiency; the
/// preferred operating region where every case of the group runs one curve whose flow
/// is the pump's own.
pub(super) fn head_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    part: &str,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let mut palette = Palette::default();
    let mut series = Vec::new();
    let mut markers = Vec::new();
    let top = head_axis_top(results).map(|h| hd.value(h));
    for (k, (case, run)) in results.iter().enumerate() {
        let points: Vec<(f64, f64)> = case
            .system_curve
            .iter()
            .map(|point| (fl.value(point.flow), hd.value(point.head)))
            .collect();
        let points = match top {
            Some(top) => clipped_at(&points, top),
            None => points,
        };
        let name = format!("system, {}", case.name);
        series.push(line(name, points, Stroke::Dashed, &mut palette));
        let same_curve = k > 0 && results[k - 1].1.operating_curve == run.operating_curve;
        if !same_curve && !run.operating_curve.is_empty() {
            let which = if results.len() > 1 {
                format!(" ({})", case.name)
            } else {
                String::new()
            };
            // With station piping the set's curve is at the headers (less its own piping).
            let own = match run.duty.as_ref().and_then(|d| d.station.as_ref()) {
                Some(_) => " less own piping",
                None => "",
            };
            let name = format!("pump {} at {:.0} rpm{own}{which}", pump.name, run.speed_rpm);
            let points = run
                .operating_curve
                .iter()
                .map(|q| (fl.value(q.flow), hd.value(q.head)))
                .collect();
            series.push(line(name, points, Stroke::Solid, &mut palette));
        }
        if let Some(duty) = &run.duty {
            markers.push(left_marker(
                fl.value(duty.flow),
                hd.value(duty.head),
                format!(
                    "{}: {} @ {}",
                    case.name,
                    fl.text(duty.flow),
                    hd.text(duty.head)
                ),
            ));
        }
    }
    if let Some((case, run)) = results.first() {
        let efficiency: Vec<(f64, f64)> = run
            .operating_curve
            .iter()
            .filter_map(|q| q.efficiency.map(|e| (fl.value(q.flow), e * 100.0)))
            .collect();
        if !efficiency.is_empty() {
            series.push(Series {
                name: format!("efficiency ({})", case.name),
                points: efficiency,
                axis: YAxis::Right,
                style_index: palette.next(),
                ..Default::default()
            });
        }
    }
    let one_curve = results
        .windows(2)
        .all(|w| w[0].1.operating_curve == w[1].1.operating_curve);
    let bands: Vec<XBand> = results
        .iter()
        .filter_map(|(_, run)| run.duty.as_ref())
        .find(|duty| duty.flow_per_pump == duty.flow)
        .and_then(|duty| duty.bep_flow)
        .filter(|_| one_curve)
        .map(|bep| preferred_region(bep, |q| fl.value(q)))
        .into_iter()
        .collect();
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: flow_title(pump, fl.label),
            y_label: format!("Head ({})", hd.label),
            y2_label: Some("Efficiency (%)".into()),
            y_range: top.map(|top| (0.0, top)),
            y2_range: Some((0.0, 100.0)),
            series,
            points: markers,
            bands,
            ..Default::default()
        },
        height_mm: 110.0,
        caption: format!(
            "Pump {}: head curves of the arrangement as run in each case, system curves and duty points; efficiency on the right axis{part}",
            pump.name
        ),
    });
}

/// The top of the head axis (m) when a system curve climbs far above every pump curve
/// (a throttled valve's case): 1.3 × the highest pump or duty head, so that the pump
/// curves and duty points keep the plot's height; `None` when every system curve stays
/// below that, and the axis fits all.
fn head_axis_top(results: &[CaseRun]) -> Option<f64> {
    let pump_top = results
        .iter()
        .flat_map(|(_, run)| {
            let curve = run.operating_curve.iter().map(|q| q.head);
            curve.chain(run.duty.as_ref().map(|d| d.head))
        })
        .fold(0.0_f64, f64::max);
    let top = 1.3 * pump_top;
    let system_top = results
        .iter()
        .flat_map(|(case, _)| case.system_curve.iter().map(|p| p.head))
        .fold(0.0_f64, f64::max);
    (pump_top > 0.0 && system_top > top).then_some(top)
}

/// A rising curve (x, y) cut where it first passes `top`, ending on `top` there
/// (linear interpolation between the two samples).
fn clipped_at(points: &[(f64, f64)], top: f64) -> Vec<(f64, f64)> {
    let mut out = Vec::with_capacity(points.len());
    for (k, &(x, y)) in points.iter().enumerate() {
        if y <= top {
            out.push((x, y));
            continue;
        }
        if let Some(&(x0, y0)) = k.checked_sub(1).and_then(|j| points.get(j)) {
            out.push((x0 + (x - x0) * (top - y0) / (y - y0), top));
        }
        break;
    }
    out
}

/// The flow range, in the operating curve's flows, where the evaluated curve has
/// NPSHr data: its NPSHr fit's data range scaled as its head data range is.
fn npshr_range(curves: &CandidateCurves, run: &CaseRun) -> Option<(f64, f64)> {
    let (evaluated, _) = curves.evaluated.as_ref()?;
    let (_, head_end) = evaluated.head.domain();
    let (low, high) = evaluated.npshr.as_ref()?.domain();
    let end = run.1.operating_curve.last()?.flow;
    (head_end > 0.0).then(|| (low * end / head_end, high * end / head_end))
}

/// NPSH required along the curve (over its data only) against NPSH available per case.
pub(super) fn npsh_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    curves: &CandidateCurves,
    results: &[CaseRun],
    part: &str,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let mut palette = Palette::default();
    let mut series = Vec::new();
    let mut markers = Vec::new();
    for (k, run) in results.iter().enumerate() {
        let (case, result) = run;
        let range = npshr_range(curves, run);
        let inside =
            |q: f64| range.is_none_or(|(lo, hi)| q >= lo * (1.0 - 1e-9) && q <= hi * (1.0 + 1e-9));
        let npshr: Vec<(f64, f64)> = result
            .operating_curve
            .iter()
            .filter(|q| inside(q.flow))
            .filter_map(|q| q.npshr.map(|n| (fl.value(q.flow), hd.value(n))))
            .collect();
        if !npshr.is_empty()
            && (k == 0 || results[k - 1].1.operating_curve != result.operating_curve)
        {
            series.push(line(
                format!("NPSHr ({})", case.name),
                npshr,
                Stroke::Solid,
                &mut palette,
            ));
        }
        if let Some(duty) = &result.duty {
            markers.push(left_marker(
                fl.value(duty.flow),
                hd.value(duty.npsh_available),
                format!("NPSHa {}: {}", case.name, hd.text(duty.npsh_available)),
            ));
        }
    }
    for (case, result) in results {
        // With station piping NPSHa is each pump's own, along its own suction path.
        let (npsha, label) = match result.npsh_available_curve.is_empty() {
            true => (&case.npsh_available_curve, "NPSHa"),
            false => (&result.npsh_available_curve, "NPSHa per pump"),
        };
        let points: Vec<(f64, f64)> = case
            .system_curve
            .iter()
            .zip(npsha)
            .map(|(point, n)| (fl.value(point.flow), hd.value(*n)))
            .collect();
        if !points.is_empty() {
            series.push(line(
                format!("{label} ({})", case.name),
                points,
                Stroke::Dashed,
                &mut palette,
            ));
        }
    }
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: flow_title(pump, fl.label),
            y_label: format!("NPSH ({})", hd.label),
            series,
            points: markers,
            ..Default::default()
        },
        height_mm: 85.0,
        caption: format!(
            "Pump {}: NPSH required (NPSH3, over the range of its data) against NPSH available per case{part}",
            pump.name
        ),
    });
}

/// The motor rating line and the rating × service factor line; one line saying both
/// when they coincide (service factor 1.0).
fn motor_lines(motor: &MotorChoice, value: impl Fn(f64) -> f64) -> Vec<HLine> {
    let rating = HLine {
        y: value(motor.rating_w),
        label: format!("motor {}", motor.rating_label),
        axis: YAxis::Left,
    };
    if (motor.service_factor - 1.0).abs() < 1e-9 {
        return vec![HLine {
            label: format!("motor {} (service factor 1.00)", motor.rating_label),
            ..rating
        }];
    }
    vec![
        rating,
        HLine {
            y: value(motor.rating_w * motor.service_factor),
            label: format!("rating × service factor {:.2}", motor.service_factor),
            axis: YAxis::Left,
        },
    ]
}

/// Shaft power per pump along the curve, the duty points and the motor lines.
pub(super) fn power_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    motor: Option<&MotorChoice>,
    results: &[CaseRun],
    part: &str,
    units: &Units,
) {
    let (fl, pw) = (units.flow(), units.power());
    let mut palette = Palette::default();
    let mut series = Vec::new();
    for (k, (case, run)) in results.iter().enumerate() {
        if k > 0 && results[k - 1].1.operating_curve == run.operating_curve {
            continue;
        }
        // The pumps running in the case (a case may run fewer of a parallel set).
        let per = run.count.max(1) as f64;
        let points: Vec<(f64, f64)> = run
            .operating_curve
            .iter()
            .filter_map(|q| q.shaft_power.map(|w| (fl.value(q.flow), pw.value(w / per))))
            .collect();
        if !points.is_empty() {
            series.push(line(
                format!("shaft power per pump ({})", case.name),
                points,
                Stroke::Solid,
                &mut palette,
            ));
        }
    }
    let hlines = motor
        .map(|m| motor_lines(m, |w| pw.value(w)))
        .unwrap_or_default();
    let markers: Vec<Marker> = results
        .iter()
        .filter_map(|(case, run)| {
            let duty = run.duty.as_ref()?;
            let shaft = duty.shaft_power?;
            let per = run.count.max(1) as f64;
            Some(left_marker(
                fl.value(duty.flow),
                pw.value(shaft / per),
                format!("{}: {}", case.name, pw.text(shaft / per)),
            ))
        })
        .collect();
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: flow_title(pump, fl.label),
            y_label: format!("Shaft power per pump ({})", pw.label),
            series,
            hlines,
            points: markers,
            ..Default::default()
        },
        height_mm: 80.0,
        caption: format!(
            "Pump {}: shaft power per pump along the curve, duty points and the motor rating{part}",
            pump.name
        ),
    });
}

/// How a line series is drawn: pump curves solid, system and available curves dashed.
#[derive(Clone, Copy)]
enum Stroke {
    Solid,
    Dashed,
}

/// A left-axis line series (points in report units) in the palette's next style.
fn line(name: String, points: Vec<(f64, f64)>, stroke: Stroke, palette: &mut Palette) -> Series {
    Series {
        name,
        points,
        style_index: palette.next(),
        solid: matches!(stroke, Stroke::Solid),
        dashed: matches!(stroke, Stroke::Dashed),
        ..Default::default()
    }
}

/// A labelled point on the left axis, at `x`, `y` in report units.
fn left_marker(x: f64, y: f64, label: String) -> Marker {
    Marker {
        x,
        y,
        label,
        axis: YAxis::Left,
    }
}
