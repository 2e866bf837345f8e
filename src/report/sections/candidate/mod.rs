//! A pump candidate's chapter: its summary, published curves and fits, the plots
//! (`plots.rs`), the duty table and the remarks.

mod detail;
mod plots;

pub(super) use detail::npsh_term_cells;

use super::{dedup, group_label};
use crate::analysis::duty::{CandidateCurves, PumpResult};
use crate::analysis::{Analysis, CaseResult};
use crate::display::{percent, Units};
use crate::model::{Design, PumpCandidate};
use crate::pumps::MotorChoice;
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
    plots::published_plot(blocks, pump, curves, units);
    let per_plot = plots::cases_per_plot(&all_results);
    let groups = all_results.len().div_ceil(per_plot).max(1);
    // A well field's duty is the field's total, not a point on one pump's curve: its
    // duties are plotted per well in the Well field chapter.
    let field = crate::analysis::well_field::is_field(&design.base);
    for (group, results) in all_results.chunks(per_plot).enumerate().filter(|_| !field) {
        let part = group_label(group, groups);
        plots::head_plot(blocks, pump, results, &part, units);
        plots::npsh_plot(blocks, pump, curves, results, &part, units);
        plots::power_plot(blocks, pump, motor, results, &part, units);
    }
    duty_table(blocks, pump, &all_results, units);
    if !field {
        // A field's NPSH terms are per well (Well field chapter).
        detail::npsh_terms(blocks, pump, &all_results, units);
    }
    detail::station_piping(blocks, pump, &all_results, units);
    detail::well_levels(blocks, pump, &all_results, units);
    detail::power(blocks, pump, &all_results, units);
    detail::segments(blocks, pump, &all_results, units);
    let capacity = analysis.capacity.get(index).map_or(&[][..], Vec::as_slice);
    detail::headroom(blocks, pump, &all_results, capacity, units);
    if let Some(Some(sizing)) = analysis.motor_sizing.get(index) {
        detail::motor(blocks, pump, sizing, units);
    }
    if let Some(Some(alone)) = analysis.one_alone.get(index) {
        detail::one_alone(blocks, pump, alone, units);
    }
    remarks(blocks, pump, &all_results, units);
}

/// ", running 1 in case low_demand" for the cases that run fewer pumps of a parallel
/// set than it has, else empty.
fn fewer_running(pump: &PumpCandidate, results: &[CaseRun]) -> String {
    let fewer: Vec<String> = results
        .iter()
        .filter(|(_, run)| run.count < pump.count)
        .map(|(case, run)| format!("{} in case {}", run.count, case.name))
        .collect();
    match fewer.is_empty() {
        true => String::new(),
        false => format!(", running {}", fewer.join(", ")),
    }
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
                units.diameter().text(dm.get::<uom::si::length::meter>()),
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
                    fl.figure(data.flow[j].get::<uom::si::volume_rate::cubic_meter_per_second>()),
                    hd.figure(data.head[j].get::<uom::si::length::meter>()),
                    m(
                        data.efficiency[j].map(|e| e.get::<uom::si::ratio::ratio>()),
                        &|e| format!("{:.1}", e * 100.0),
                    ),
                    m(
                        data.npshr[j].map(|e| e.get::<uom::si::length::meter>()),
                        &|e| hd.figure(e),
                    ),
                    m(
                        data.shaft_power[j].map(|e| e.get::<uom::si::power::watt>()),
                        &|e| pw.figure(e),
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
                    hd.text(r.max_abs),
                    hd.text(r.rms)
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
                fl.figure(duty.flow),
                hd.figure(duty.head),
                duty.efficiency.map(percent).unwrap_or_else(|| "—".into()),
                duty.flow_ratio_to_bep
                    .map(|x| format!("{:.0} %", x * 100.0))
                    .unwrap_or_else(|| "—".into()),
                format!(
                    "{} / {}",
                    hd.figure(duty.npsh_available),
                    duty.npsh_required
                        .map(|n| hd.figure(n))
                        .unwrap_or_else(|| "—".into())
                ),
                format!(
                    "{} / {}",
                    duty.suction_velocity
                        .map(|v| units.velocity().figure(v))
                        .unwrap_or_default(),
                    duty.discharge_velocity
                        .map(|v| units.velocity().figure(v))
                        .unwrap_or_default()
                ),
                duty.shaft_power
                    .map(|s| pw.figure(s))
                    .unwrap_or_else(|| "—".into()),
                duty.input_power
                    .map(|s| pw.figure(s))
                    .unwrap_or_else(|| "—".into()),
            ],
            None => vec![
                c.name.clone(),
                "—".into(),
                "no duty point".into(),
                r.failure
                    .as_ref()
                    .map(|m| units.render(m))
                    .unwrap_or_default(),
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
        caption: Some(if results.iter().any(|(_, r)| !r.wells.is_empty()) {
            "A well field: flow and power are the field's totals and head the flow-weighted mean over the running wells; efficiency is the field's; BEP ratio, NPSH and velocities are the governing well's (least NPSH excess); each well is in the Well field chapter".to_string()
        } else {
            format!("Flow, head and power are for the whole arrangement ({arrangement}{}); efficiency, BEP ratio and NPSHr per pump", fewer_running(pump, results))
        }),
    });
}

/// The warnings of every case, each once.
fn remarks(blocks: &mut Vec<Block>, pump: &PumpCandidate, results: &[CaseRun], units: &Units) {
    let warnings: Vec<String> = results
        .iter()
        .flat_map(|(c, r)| {
            r.warnings
                .iter()
                .map(move |w| format!("{}: {}", c.name, units.render(w)))
        })
        .collect();
    if !warnings.is_empty() {
        blocks.push(Block::heading(2, format!("Remarks on {}", pump.name)));
        for w in dedup(warnings) {
            blocks.push(Block::note(super::wording::plain(&w)));
        }
    }
}
