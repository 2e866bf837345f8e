//! A pump candidate's chapter: its summary, published curves and fits, head, NPSH
//! and power plots per group of cases, the duty table and the remarks.

use super::{dedup, group_label, CASES_PER_GROUP};
use crate::analysis::duty::{CandidateCurves, PumpResult};
use crate::analysis::{Analysis, CaseResult};
use crate::display::{percent, Units};
use crate::model::{Design, PumpCandidate};
use crate::pumps::MotorChoice;
use crate::report::layout::chart::{Chart, HLine, Marker, Series, YAxis};
use crate::report::layout::document::{Align, Block, Column};

/// A case with this candidate's result in it.
type CaseRun<'a> = (&'a CaseResult, &'a PumpResult);

/// The chapter of candidate `index` of the design.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    index: usize,
    units: &Units,
) {
    let pump = &design.pumps[index];
    let motor = analysis.motors.get(index).and_then(Option::as_ref);
    let curves = &analysis.candidates[index];
    summary(blocks, pump, motor);
    published_curves(blocks, pump, curves, units);
    let all_results: Vec<CaseRun> = analysis
        .cases
        .iter()
        .filter_map(|c| c.pumps.get(index).map(|r| (c, r)))
        .collect();
    let groups = all_results.len().div_ceil(CASES_PER_GROUP).max(1);
    for (group, results) in all_results.chunks(CASES_PER_GROUP).enumerate() {
        let part = group_label(group, groups);
        head_plot(blocks, pump, curves, results, &part, units);
        npsh_plot(blocks, pump, results, &part, units);
        power_plot(blocks, pump, motor, results, &part, units);
    }
    duty_table(blocks, pump, &all_results, units);
    remarks(blocks, pump, &all_results);
}

/// The arrangement in words: "single pump", "2 in parallel", "3 in series".
fn arrangement(pump: &PumpCandidate) -> String {
    match pump.arrangement {
        crate::model::ArrangementKind::Single => "single pump".to_string(),
        crate::model::ArrangementKind::Parallel => format!("{} in parallel", pump.count),
        crate::model::ArrangementKind::Series => format!("{} in series", pump.count),
    }
}

/// The chapter heading and the candidate's description, arrangement, speed and motor.
fn summary(blocks: &mut Vec<Block>, pump: &PumpCandidate, motor: Option<&MotorChoice>) {
    let arrangement = arrangement(pump);
    blocks.push(Block::PageBreak);
    blocks.push(Block::heading(1, format!("Pump candidate {}", pump.name)));
    let mut kv = vec![
        (
            "Description".to_string(),
            if pump.description.is_empty() {
                "—".into()
            } else {
                pump.description.clone()
            },
        ),
        (
            "Arrangement".into(),
            format!(
                "{arrangement}{}",
                if pump.standby > 0 {
                    format!(", {} standby", pump.standby)
                } else {
                    String::new()
                }
            ),
        ),
        (
            "Rated speed".into(),
            format!(
                "{:.0} rpm",
                pump.rated_speed
                    .get::<uom::si::frequency::cycle_per_minute>()
            ),
        ),
        (
            "Speed or trim".into(),
            match pump.adjust {
                crate::model::Adjust::None => "as published".to_string(),
                crate::model::Adjust::Speed {
                    min_ratio,
                    max_ratio,
                } => format!(
                    "variable speed {:.0}–{:.0} % of rated, set to each case's flow requirement",
                    min_ratio * 100.0,
                    max_ratio * 100.0
                ),
                crate::model::Adjust::Trim { min_ratio } => format!(
                    "impeller trimmed to the flow requirement, not below {:.0} %",
                    min_ratio * 100.0
                ),
            },
        ),
    ];
    if let Some(m) = motor {
        kv.push((
            "Motor".into(),
            format!(
                "{} per pump, service factor {:.2}",
                m.rating_label, m.service_factor
            ),
        ));
    }
    blocks.push(Block::KeyValue(kv));
}

/// Each published curve's points and the residuals of its fits.
fn published_curves(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    curves: &CandidateCurves,
    units: &Units,
) {
    let (fl, hd, pw) = (units.flow(), units.head(), units.power());
    blocks.push(Block::heading(2, "Published curves and fits"));
    for (k, (data, fit)) in pump.curves.iter().zip(&curves.published).enumerate() {
        let label = match data.impeller {
            Some(dm) => format!(
                "Curve {}: impeller {} at {:.0} rpm",
                k + 1,
                units.diameter().fmt(dm.get::<uom::si::length::meter>()),
                data.speed.get::<uom::si::frequency::cycle_per_minute>()
            ),
            None => format!(
                "Curve {}: {:.0} rpm",
                k + 1,
                data.speed.get::<uom::si::frequency::cycle_per_minute>()
            ),
        };
        let rows: Vec<Vec<String>> = (0..data.flow.len())
            .map(|j| {
                let m = |v: Option<f64>, f: &dyn Fn(f64) -> String| {
                    v.map(f).unwrap_or_else(|| "—".into())
                };
                vec![
                    fl.num(data.flow[j].get::<uom::si::volume_rate::cubic_meter_per_second>()),
                    hd.num(data.head[j].get::<uom::si::length::meter>()),
                    m(
                        data.efficiency[j].map(|e| e.get::<uom::si::ratio::ratio>()),
                        &|e| format!("{:.1}", e * 100.0),
                    ),
                    m(
                        data.npshr[j].map(|e| e.get::<uom::si::length::meter>()),
                        &|e| hd.num(e),
                    ),
                    m(
                        data.shaft_power[j].map(|e| e.get::<uom::si::power::watt>()),
                        &|e| pw.num(e),
                    ),
                ]
            })
            .collect();
        let fit_note = match fit {
            Ok(c) => {
                let r = c.head.residuals();
                format!(
                    "{label}. Head fit: {}, largest residual {} (RMS {}).",
                    c.head.method(),
                    hd.fmt(r.max_abs),
                    hd.fmt(r.rms)
                ) + &c
                    .efficiency
                    .as_ref()
                    .map(|e| {
                        format!(
                            " Efficiency fit: {}, largest residual {:.1} points.",
                            e.method(),
                            e.residuals().max_abs * 100.0
                        )
                    })
                    .unwrap_or_default()
            }
            Err(e) => format!("{label}. Not usable: {e}"),
        };
        blocks.push(Block::Table {
            columns: vec![
                Column::new(format!("Flow ({})", fl.label), 0.2, Align::Right),
                Column::new(format!("Head ({})", hd.label), 0.2, Align::Right),
                Column::new("Efficiency (%)", 0.2, Align::Right),
                Column::new(format!("NPSHr ({})", hd.label), 0.2, Align::Right),
                Column::new(format!("Power ({})", pw.label), 0.2, Align::Right),
            ],
            rows,
            caption: Some(fit_note),
        });
    }
}

/// Head curves as run in each case, system curves, duty points and efficiency.
fn head_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    curves: &CandidateCurves,
    results: &[CaseRun],
    part: &str,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let mut series = Vec::new();
    let mut markers = Vec::new();
    for (k, (c, r)) in results.iter().enumerate() {
        series.push(Series {
            name: format!("system, {}", c.name),
            points: c
                .system_curve
                .iter()
                .map(|point| (fl.value(point.flow), hd.value(point.head)))
                .collect(),
            style_index: k,
            dashed: true,
            ..Default::default()
        });
        let same_curve = k > 0 && results[k - 1].1.operating_curve == r.operating_curve;
        if !same_curve && !r.operating_curve.is_empty() {
            series.push(Series {
                name: format!(
                    "pump {} at {:.0} rpm{}",
                    pump.name,
                    r.speed_rpm,
                    if results.len() > 1 {
                        format!(" ({})", c.name)
                    } else {
                        String::new()
                    }
                ),
                points: r
                    .operating_curve
                    .iter()
                    .map(|q| (fl.value(q.flow), hd.value(q.head)))
                    .collect(),
                style_index: k,
                ..Default::default()
            });
        }
        if let Some(duty) = &r.duty {
            markers.push(Marker {
                x: fl.value(duty.flow),
                y: hd.value(duty.head),
                label: format!("{}: {} @ {}", c.name, fl.fmt(duty.flow), hd.fmt(duty.head)),
                axis: YAxis::Left,
            });
        }
    }
    // The whole published family (each impeller or speed), thin and dotted, when there are several.
    if curves.published_head_samples.len() > 1 {
        let good: Vec<&crate::model::CurveData> = pump
            .curves
            .iter()
            .zip(&curves.published)
            .filter(|(_, r)| r.is_ok())
            .map(|(c, _)| c)
            .collect();
        for (data, pts) in good.iter().zip(&curves.published_head_samples) {
            let label = match data.impeller {
                Some(dm) => format!(
                    "published {} at {:.0} rpm",
                    units.diameter().fmt(dm.get::<uom::si::length::meter>()),
                    data.speed.get::<uom::si::frequency::cycle_per_minute>()
                ),
                None => format!(
                    "published at {:.0} rpm",
                    data.speed.get::<uom::si::frequency::cycle_per_minute>()
                ),
            };
            series.push(Series {
                name: label,
                points: pts
                    .iter()
                    .map(|(q, h)| (fl.value(*q), hd.value(*h)))
                    .collect(),
                style_index: 6,
                dashed: true,
                ..Default::default()
            });
        }
    }
    // Efficiency on the right axis (the published curve at rated speed).
    if let Some(r) = results.first().map(|x| x.1) {
        let eff: Vec<(f64, f64)> = r
            .operating_curve
            .iter()
            .filter_map(|q| q.efficiency.map(|e| (fl.value(q.flow), e * 100.0)))
            .collect();
        if !eff.is_empty() {
            series.push(Series {
                name: format!("efficiency ({})", results[0].0.name),
                points: eff,
                axis: YAxis::Right,
                style_index: 7,
                ..Default::default()
            });
        }
    }
    blocks.push(Block::Figure {
    chart: Chart { x_label: format!("Flow ({})", fl.label), y_label: format!("Head ({})", hd.label), y2_label: Some("Efficiency (%)".into()), y2_range: Some((0.0, 100.0)), series, points: markers, ..Default::default() },
    height_mm: 110.0,
    caption: format!("Pump {}: head curves as run in each case, system curves and duty points; efficiency on the right axis{part}", pump.name),
});
}

/// NPSH required along the curve against NPSH available per case.
fn npsh_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    part: &str,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let mut series = Vec::new();
    let mut markers = Vec::new();
    for (k, (c, r)) in results.iter().enumerate() {
        let npshr: Vec<(f64, f64)> = r
            .operating_curve
            .iter()
            .filter_map(|q| q.npshr.map(|n| (fl.value(q.flow), hd.value(n))))
            .collect();
        if !npshr.is_empty() && (k == 0 || results[k - 1].1.operating_curve != r.operating_curve) {
            series.push(Series {
                name: format!("NPSHr ({})", c.name),
                points: npshr,
                style_index: k,
                ..Default::default()
            });
        }
        if let Some(duty) = &r.duty {
            markers.push(Marker {
                x: fl.value(duty.flow),
                y: hd.value(duty.npsh_available),
                label: format!("NPSHa {}: {}", c.name, hd.fmt(duty.npsh_available)),
                axis: YAxis::Left,
            });
        }
    }
    let npsha_curves: Vec<Series> = results
        .iter()
        .enumerate()
        .filter_map(|(k, (c, _))| {
            let pts: Vec<(f64, f64)> = c
                .system_curve
                .iter()
                .zip(&c.npsh_available_curve)
                .map(|(point, n)| (fl.value(point.flow), hd.value(*n)))
                .collect();
            (!pts.is_empty()).then(|| Series {
                name: format!("NPSHa ({})", c.name),
                points: pts,
                style_index: k,
                dashed: true,
                ..Default::default()
            })
        })
        .collect();
    series.extend(npsha_curves);
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: format!("Flow ({})", fl.label),
            y_label: format!("NPSH ({})", hd.label),
            y_range: None,
            series,
            points: markers,
            ..Default::default()
        },
        height_mm: 85.0,
        caption: format!(
            "Pump {}: NPSH required against NPSH available per case{part}",
            pump.name
        ),
    });
}

/// Shaft power per pump along the curve, the duty points and the motor lines.
fn power_plot(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    motor: Option<&MotorChoice>,
    results: &[CaseRun],
    part: &str,
    units: &Units,
) {
    let (fl, pw) = (units.flow(), units.power());
    let mut series = Vec::new();
    for (k, (c, r)) in results.iter().enumerate() {
        if k > 0 && results[k - 1].1.operating_curve == r.operating_curve {
            continue;
        }
        let pts: Vec<(f64, f64)> = r
            .operating_curve
            .iter()
            .filter_map(|q| {
                q.shaft_power
                    .map(|w| (fl.value(q.flow), pw.value(w / pump.count.max(1) as f64)))
            })
            .collect();
        if !pts.is_empty() {
            series.push(Series {
                name: format!("shaft power per pump ({})", c.name),
                points: pts,
                style_index: k,
                ..Default::default()
            });
        }
    }
    let mut hlines = Vec::new();
    if let Some(m) = motor {
        hlines.push(HLine {
            y: pw.value(m.rating_w),
            label: format!("motor {}", m.rating_label),
            axis: YAxis::Left,
        });
        hlines.push(HLine {
            y: pw.value(m.rating_w * m.service_factor),
            label: format!("rating × SF {:.2}", m.service_factor),
            axis: YAxis::Left,
        });
    }
    let per = pump.count.max(1) as f64;
    let markers: Vec<Marker> = results
        .iter()
        .filter_map(|(c, r)| {
            let duty = r.duty.as_ref()?;
            let s = duty.shaft_power?;
            Some(Marker {
                x: fl.value(duty.flow),
                y: pw.value(s / per),
                label: format!("{}: {}", c.name, pw.fmt(s / per)),
                axis: YAxis::Left,
            })
        })
        .collect();
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: format!("Flow of the arrangement ({})", fl.label),
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

/// The duty point of every case: speed, flow, head, efficiency, NPSH, velocities, power.
fn duty_table(blocks: &mut Vec<Block>, pump: &PumpCandidate, results: &[CaseRun], units: &Units) {
    let (fl, hd, pw) = (units.flow(), units.head(), units.power());
    let arrangement = arrangement(pump);
    blocks.push(Block::heading(2, format!("Duty points of {}", pump.name)));
    let rows: Vec<Vec<String>> = results
        .iter()
        .map(|(c, r)| match &r.duty {
            Some(duty) => vec![
                c.name.clone(),
                format!("{:.0}", r.speed_rpm),
                fl.num(duty.flow),
                hd.num(duty.head),
                duty.efficiency.map(percent).unwrap_or_else(|| "—".into()),
                duty.flow_ratio_to_bep
                    .map(|x| format!("{:.0} %", x * 100.0))
                    .unwrap_or_else(|| "—".into()),
                format!(
                    "{} / {}",
                    hd.num(duty.npsh_available),
                    duty.npsh_required
                        .map(|n| hd.num(n))
                        .unwrap_or_else(|| "—".into())
                ),
                format!(
                    "{} / {}",
                    duty.suction_velocity
                        .map(|v| units.velocity().num(v))
                        .unwrap_or_default(),
                    duty.discharge_velocity
                        .map(|v| units.velocity().num(v))
                        .unwrap_or_default()
                ),
                duty.shaft_power
                    .map(|s| pw.num(s))
                    .unwrap_or_else(|| "—".into()),
                duty.input_power
                    .map(|s| pw.num(s))
                    .unwrap_or_else(|| "—".into()),
            ],
            None => vec![
                c.name.clone(),
                "—".into(),
                "no duty point".into(),
                r.failure.clone().unwrap_or_default(),
                String::new(),
                String::new(),
                String::new(),
                String::new(),
                String::new(),
                String::new(),
            ],
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new("Speed (rpm)", 0.08, Align::Right),
            Column::new(format!("Flow ({})", fl.label), 0.09, Align::Right),
            Column::new(format!("Head ({})", hd.label), 0.09, Align::Right),
            Column::new("Eff.", 0.10, Align::Right),
            Column::new("Flow / BEP", 0.08, Align::Right),
            Column::new(format!("NPSHa / NPSHr ({})", hd.label), 0.13, Align::Right),
            Column::new(format!("Velocity suct. / disch. ({})", units.velocity().label), 0.13, Align::Right),
            Column::new(format!("Shaft ({})", pw.label), 0.09, Align::Right),
            Column::new(format!("Input ({})", pw.label), 0.09, Align::Right),
        ],
        rows,
        caption: Some(format!("Flow, head and power are for the whole arrangement ({arrangement}); efficiency, BEP ratio and NPSHr per pump")),
    });
}

/// The warnings of every case, each once.
fn remarks(blocks: &mut Vec<Block>, pump: &PumpCandidate, results: &[CaseRun]) {
    let warnings: Vec<String> = results
        .iter()
        .flat_map(|(c, r)| r.warnings.iter().map(move |w| format!("{}: {w}", c.name)))
        .collect();
    if !warnings.is_empty() {
        blocks.push(Block::heading(2, format!("Remarks on {}", pump.name)));
        for w in dedup(warnings) {
            blocks.push(Block::note(w));
        }
    }
}
