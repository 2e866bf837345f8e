//! The chapter on operation over the year: the load profile, the control strategy and
//! staging, every candidate at every load point (speed, flow, head, efficiency, NPSH,
//! the power chain), the yearly energy, the profile checks, plots and the life-cycle
//! cost. Reads the analysis; computes no engineering value of its own.

use crate::analysis::operation::{CandidateOperation, PointResult};
use crate::analysis::Analysis;
use crate::display::{percent, Units};
use crate::model::operation::{Control, HourlyBinning, LoadProfile};
use crate::model::Design;
use crate::pumps::part_load::IEC_61800_9_2_POINTS;
use crate::report::layout::chart::{Chart, Marker, Series, YAxis};
use crate::report::layout::document::{Align, Block, CalloutKind, Column, Span};

fn or_dash(v: Option<String>) -> String {
    v.unwrap_or_else(|| "—".into())
}

/// The chapter; nothing when the design has no load profile.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    if analysis.operation.is_empty() {
        return;
    }
    blocks.push(Block::heading(1, "Operation over the year"));
    method(blocks, design, units);
    for p in &design.operation.profiles {
        if let Some(b) = &p.binning {
            binning_table(blocks, p, b, units);
        }
        profile_table(blocks, p, units);
    }
    for op in &analysis.operation {
        candidate(blocks, design, analysis, op, units);
    }
    power_figure(blocks, analysis, units);
    energy_bars(blocks, analysis, units);
    life_cycle(blocks, design, analysis);
    blocks.push(Block::Callout {
        kind: CalloutKind::Caution,
        text: vec![Span::plain(format!("{} Control set points, the minimum speed and the minimum continuous flow are to be confirmed with the pump manufacturer; on/off duty is limited by the motor maker's permitted starts (NEMA MG 1 Part 12 or the maker's data). Surge on pump start and stop, and the pressure rating at shut-off head, are outside this chapter. The calculation is to be reviewed by a licensed engineer against the codes of the authority having jurisdiction.", equipment_caution(design)))],
    });
}

/// The caution on part-load data: typical curves, or the design's tables to confirm.
fn equipment_caution(design: &Design) -> &'static str {
    let m = &design.motor;
    match (m.motor_table.is_some(), m.drive_losses.is_some()) {
        (true, true) => "The part-load motor efficiencies and drive losses are the design's tables: confirm them against the certified data of the motor and drive supplied.",
        (true, false) => "The motor part-load efficiencies are the design's table; the drive losses are a typical published curve: obtain the drive maker's losses declared at the IEC 61800-9-2 reference points before relying on the yearly energy.",
        (false, true) => "The drive losses are the design's IEC 61800-9-2 declaration; the motor part-load efficiencies are a typical published curve: obtain the motor maker's part-load data before relying on the yearly energy.",
        (false, false) => "The part-load motor and drive efficiencies are typical published curves, not the installed equipment's: obtain the motor maker's part-load data and the drive maker's losses declared at the IEC 61800-9-2 reference points before relying on the yearly energy.",
    }
}

fn method(blocks: &mut Vec<Block>, design: &Design, units: &Units) {
    blocks.push(Block::text("Each candidate runs every load point of the profile on the system curve of the profile's case. A variable-speed set follows the control curve; a fixed-speed set runs at its published speed and a valve throttles the surplus head, or it cycles on and off into storage. The head the control asks for at flow Q:"));
    for p in &design.operation.profiles {
        let hd = units.head();
        let text = match p.control {
            Control::ConstantPressure { head } => format!("H_c(Q) = H_set = {} (constant discharge pressure, case {})", hd.fmt(head), p.case),
            Control::SystemCurve { residual } => format!("H_c(Q) = H_sys(Q) + {} (head held at the far end, case {})", hd.fmt(residual), p.case),
            Control::Proportional { zero_flow_head } => format!("H_c(Q) = H_0 + (H_d − H_0)·Q/Q_d, H_0 = {}, Q_d = {}, H_d = H_sys(Q_d) (proportional, case {})", hd.fmt(zero_flow_head), units.flow().fmt(p.design_flow), p.case),
            Control::Throttle => format!("fixed speed, throttled to the demanded flow (case {})", p.case),
            Control::OnOff => format!("on/off into {} of active storage (case {})", units.volume().fmt(p.storage_volume.unwrap_or(0.0)), p.case),
        };
        blocks.push(Block::Equation(text));
    }
    blocks.push(Block::text("The set never gives less than the system head H_sys(Q). The speed ratio r that gives H_c at the flow per pump Q_p solves r²·H(Q_p/r) = H_c/n_s (affinity laws, Q ∝ N, H ∝ N², P ∝ N³, with the pump efficiency held at its published value at corresponding points: no reduced-speed efficiency correction is applied, which is optimistic well below the published speed). Below the minimum speed the set runs at the minimum speed and the surplus is throttled. Staging: of the counts of running pumps that deliver the point, the least input power among those keeping every pump within the allowable operating region, else the least input power."));
    blocks.push(Block::Equation("P_shaft = ρ·g·Q_p·H_p/η_p per pump;  η_m = η_m,FL · r_PL(P_shaft/P_rated);  P_in = P_shaft/η_m + P_loss,drive;  η_ww = ρ·g·Q·H/P_in".into()));
    blocks.push(Block::text(format!("{} {} On/off: the set runs at its duty point; the share of time running is Q/Q_run, the specific energy is averaged over the level band by Simpson's rule (bottom, middle, top), and the worst starts per hour, at an inflow of half the pump flow, are Q_run/(4·V) with V the active volume.", motor_basis(design), drive_basis(design))));
    maker_tables(blocks, design);
}

/// Which motor part-load efficiency is used, in one sentence.
fn motor_basis(design: &Design) -> &'static str {
    match design.motor.motor_table {
        Some(_) => "Motor efficiency: the design's own table of efficiency against load fraction (below), linear between its points and held at its end values beyond them, in place of η_m,FL·r_PL.",
        None => "r_PL is the typical motor part-load ratio of the Washington State Energy Office handbook (1993).",
    }
}

/// Which drive losses are used, in one sentence.
fn drive_basis(design: &Design) -> &'static str {
    match design.motor.drive_losses {
        Some(_) => "Drive losses: the design's declared losses at the eight IEC 61800-9-2 (2017) reference points of relative speed and torque (below), as a share of the drive rating (the motor's full-load input), at the motor's speed ratio and torque ratio (P_shaft/P_rated)/(N/N_rated); linear in torque between 25, 50 and 100 % and in speed between 0, 50 and 90 %, the undeclared (90 %, 25 %) point taken as p(50, 25) + p(90, 50) − p(50, 50), and the 50–90 % slope continued to full speed.",
        None => "The drive losses are P_loss = P_out·(1/η_d − 1) with η_d from the U.S. DOE Motor Systems Tip Sheet #11 (2012) against the drive's output fraction, scaled to the stated full-load drive efficiency.",
    }
}

/// The design's motor and drive tables, when it gives them.
fn maker_tables(blocks: &mut Vec<Block>, design: &Design) {
    if let Some(t) = &design.motor.motor_table {
        blocks.push(Block::Table {
            columns: vec![
                Column::new("Load (share of nameplate)", 0.5, Align::Right),
                Column::new("Motor efficiency", 0.5, Align::Right),
            ],
            rows: t
                .iter()
                .map(|(x, e)| vec![percent(*x), percent(*e)])
                .collect(),
            caption: Some(
                "Motor efficiency at part load, given in the design (the motor maker's data)"
                    .into(),
            ),
        });
    }
    if let Some(p) = &design.motor.drive_losses {
        blocks.push(Block::Table {
            columns: vec![
                Column::new("Relative speed", 0.34, Align::Right),
                Column::new("Relative torque", 0.33, Align::Right),
                Column::new("Loss (share of drive rating)", 0.33, Align::Right),
            ],
            rows: IEC_61800_9_2_POINTS
                .iter()
                .zip(p)
                .map(|((s, q), l)| vec![format!("{s:.0} %"), format!("{q:.0} %"), format!("{:.2} %", l * 100.0)])
                .collect(),
            caption: Some("Drive losses at the IEC 61800-9-2 reference points, given in the design (the drive maker's declaration)".into()),
        });
    }
}

/// How an hourly profile was summarised: every bin with its edges, hours and mean flow.
fn binning_table(blocks: &mut Vec<Block>, p: &LoadProfile, b: &HourlyBinning, units: &Units) {
    let fl = units.flow();
    let n = b.hours.len();
    blocks.push(Block::text(format!(
        "The load profile of case {} is summarised from {} hourly flows (file {}): {n} bins of equal width from zero to the largest hourly flow, {} wide; an hour with flow Q falls in bin ⌊n·Q/Q_max⌋ + 1 (the largest flow in the last bin), and each bin runs its hours at the mean flow of those hours, so the year's delivered volume is kept exactly. {:.0} hours with zero flow need no pumping. Bins without hours are not load points.",
        p.case,
        b.rows,
        b.source,
        fl.fmt(b.edges.get(1).copied().unwrap_or(0.0)),
        b.zero_hours
    )));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Bin", 0.10, Align::Right),
            Column::new(format!("From ({})", fl.label), 0.225, Align::Right),
            Column::new(format!("To ({})", fl.label), 0.225, Align::Right),
            Column::new("Hours (h)", 0.20, Align::Right),
            Column::new(format!("Mean flow ({})", fl.label), 0.25, Align::Right),
        ],
        rows: (0..n)
            .map(|k| {
                let upper = if k + 1 == n { " (incl.)" } else { "" };
                vec![
                    (k + 1).to_string(),
                    fl.figure(b.edges[k]),
                    format!("{}{upper}", fl.figure(b.edges[k + 1])),
                    format!("{:.0}", b.hours[k]),
                    if b.hours[k] > 0.0 {
                        fl.figure(b.mean_flow[k])
                    } else {
                        "—".into()
                    },
                ]
            })
            .collect(),
        caption: Some(format!(
            "Binning of the hourly flows of case {} ({} rows, {n} bins)",
            p.case, b.rows
        )),
    });
}

fn profile_table(blocks: &mut Vec<Block>, p: &LoadProfile, units: &Units) {
    let fl = units.flow();
    let total: f64 = p.points.iter().map(|x| x.hours).sum();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Point", 0.10, Align::Right),
            Column::new(format!("Flow ({})", fl.label), 0.25, Align::Right),
            Column::new("Share of design flow", 0.25, Align::Right),
            Column::new("Hours per year (h)", 0.20, Align::Right),
            Column::new("Share of hours", 0.20, Align::Right),
        ],
        rows: p
            .points
            .iter()
            .enumerate()
            .map(|(k, x)| {
                vec![
                    (k + 1).to_string(),
                    fl.figure(x.flow),
                    if p.design_flow.is_finite() && p.design_flow > 0.0 {
                        percent(x.flow / p.design_flow)
                    } else {
                        "—".into()
                    },
                    format!("{:.0}", x.hours),
                    if total > 0.0 {
                        percent(x.hours / total)
                    } else {
                        "—".into()
                    },
                ]
            })
            .collect(),
        caption: Some(format!(
            "Load profile on case {} ({:.0} h a year; control {}, staging {})",
            p.case,
            total,
            p.control.words(),
            p.staging.words()
        )),
    });
}

fn candidate(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    op: &CandidateOperation,
    units: &Units,
) {
    let pw = units.power();
    blocks.push(Block::heading(
        2,
        format!("Pump {} over the profile", op.name),
    ));
    if let Some(why) = &op.failure {
        blocks.push(Block::text(format!("Not run over the profile: {why}.")));
        return;
    }
    blocks.push(Block::KeyValue(vec![
        ("Control".into(), op.controls.iter().map(|c| c.words()).collect::<Vec<_>>().join(", ")),
        ("Motor per pump".into(), format!("{} nameplate, full-load efficiency {}", pw.fmt(op.motor_rating_w), percent(op.motor_full_load_efficiency))),
        ("Drive".into(), match op.drive_full_load_efficiency { Some(e) => format!("variable-frequency drive, full-load efficiency {}, speed {:.0}–{:.0} % of {:.0} rpm", percent(e), op.speed_range.0 * 100.0, op.speed_range.1 * 100.0, op.published_speed_rpm), None => "none (fixed speed)".into() }),
    ]));
    operating_points(blocks, op, units);
    point_powers(blocks, op, units);
    switching_points(blocks, op, units);
    yearly_totals(blocks, design, op, units);
    profile_checks(blocks, op, units);
    head_figure(blocks, analysis, op, units);
}

/// One figure of a set's state at a load point, or a dash where the point is not
/// delivered.
fn state_cell(
    p: &PointResult,
    f: &dyn Fn(&crate::analysis::operation::point::SetState) -> String,
) -> String {
    or_dash(p.state.as_ref().map(f))
}

/// The operating point of each running pump at every load point.
fn operating_points(blocks: &mut Vec<Block>, op: &CandidateOperation, units: &Units) {
    let (fl, hd, s) = (units.flow(), units.head(), state_cell);
    blocks.push(Block::Table {
        columns: vec![
            Column::new(format!("Flow ({})", fl.label), 0.09, Align::Right),
            Column::new("Hours", 0.06, Align::Right),
            Column::new("Pumps running", 0.08, Align::Right),
            Column::new("Speed (rpm)", 0.07, Align::Right),
            Column::new(format!("Flow per pump ({})", fl.label), 0.09, Align::Right),
            Column::new(format!("Pump head ({})", hd.label), 0.08, Align::Right),
            Column::new(format!("System head ({})", hd.label), 0.08, Align::Right),
            Column::new("Pump η", 0.08, Align::Right),
            Column::new("% of BEP flow", 0.08, Align::Right),
            Column::new(format!("NPSHa / NPSHr ({})", hd.label), 0.13, Align::Right),
            Column::new("Remark", 0.16, Align::Left),
        ],
        rows: op
            .points
            .iter()
            .map(|p| {
                vec![
                    fl.figure(p.flow),
                    format!("{:.0}", p.hours),
                    s(p, &|x| x.running.to_string()),
                    s(p, &|x| format!("{:.0}", x.speed_rpm)),
                    s(p, &|x| fl.figure(x.flow_per_pump)),
                    s(p, &|x| hd.figure(x.head_per_pump)),
                    s(p, &|x| hd.figure(x.system_head)),
                    s(p, &|x| or_dash(x.efficiency.map(percent))),
                    s(p, &|x| or_dash(x.bep_ratio.map(percent))),
                    s(p, &|x| {
                        format!(
                            "{} / {}",
                            hd.figure(x.npsh_available),
                            or_dash(x.npsh_required.map(|n| hd.figure(n)))
                        )
                    }),
                    match &p.state {
                        None => "not delivered".into(),
                        Some(x) if x.at_min_speed => "minimum speed, throttled".into(),
                        Some(_) if p.duty_cycle < 1.0 => {
                            format!("runs {} of the time", percent(p.duty_cycle))
                        }
                        Some(x) if x.surplus_head > 0.005 => {
                            format!("surplus {}", hd.fmt(x.surplus_head))
                        }
                        Some(_) => String::new(),
                    },
                ]
            })
            .collect(),
        caption: Some(format!(
            "Pump {}: operating point of each running pump at every load point",
            op.name
        )),
    });
}

/// The power of all running pumps at every load point, from shaft to wire.
fn point_powers(blocks: &mut Vec<Block>, op: &CandidateOperation, units: &Units) {
    let (fl, pw, se, s) = (
        units.flow(),
        units.power(),
        units.specific_energy(),
        state_cell,
    );
    // Without a drive there is no drive efficiency to print (not "100.0 %").
    let no_drive = (!op.variable_speed).then_some("none");
    blocks.push(Block::Table {
        columns: vec![
            Column::new(format!("Flow ({})", fl.label), 0.10, Align::Right),
            Column::new(format!("Shaft ({})", pw.label), 0.10, Align::Right),
            Column::new("Motor load", 0.08, Align::Right),
            Column::new("Motor η", 0.08, Align::Right),
            Column::new("Drive η", 0.08, Align::Right),
            Column::new(format!("Drive losses ({})", pw.label), 0.10, Align::Right),
            Column::new(format!("Input ({})", pw.label), 0.10, Align::Right),
            Column::new("Wire to water", 0.09, Align::Right),
            Column::new(
                format!("Specific energy ({})", se.label),
                0.12,
                Align::Right,
            ),
            Column::new("Energy per year (kWh)", 0.15, Align::Right),
        ],
        rows: op
            .points
            .iter()
            .map(|p| {
                vec![
                    fl.figure(p.flow),
                    s(p, &|x| pw.figure(x.shaft_power)),
                    s(p, &|x| percent(x.motor_load)),
                    s(p, &|x| percent(x.motor_efficiency)),
                    no_drive.map_or_else(|| s(p, &|x| percent(x.drive_efficiency)), String::from),
                    no_drive
                        .map_or_else(|| s(p, &|x| pw.figure(x.drive_losses)), |_| "—".to_string()),
                    s(p, &|x| pw.figure(x.input_power)),
                    or_dash(p.wire_to_water.map(percent)),
                    or_dash(p.specific_energy.map(|e| se.figure(e))),
                    format!("{:.0}", units.energy().value(p.energy_j)),
                ]
            })
            .collect(),
        caption: Some(format!(
            "Pump {}: power of all running pumps at every load point (powers while running)",
            op.name
        )),
    });
}

/// The switching points between pump counts, case by case.
fn switching_points(blocks: &mut Vec<Block>, op: &CandidateOperation, units: &Units) {
    let fl = units.flow();
    for (case, sw) in &op.switching {
        if !sw.is_empty() {
            let text = sw
                .iter()
                .map(|x| {
                    format!(
                        "{} → {} pumps at {} (± {})",
                        x.from,
                        x.to,
                        fl.fmt(x.flow),
                        fl.fmt(x.resolution)
                    )
                })
                .collect::<Vec<_>>()
                .join("; ");
            blocks.push(Block::text(format!(
                "Switching points (case {case}, bisected between neighbouring load points): {text}."
            )));
        }
    }
}

/// The year's energy, cost, volume and mean efficiencies.
fn yearly_totals(blocks: &mut Vec<Block>, design: &Design, op: &CandidateOperation, units: &Units) {
    let se = units.specific_energy();
    let y = &op.yearly;
    let currency = &design.energy.currency;
    blocks.push(Block::KeyValue(vec![
        ("Energy per year".into(), units.energy().text(y.energy_j)),
        (
            "Cost per year".into(),
            or_dash(y.cost.map(|c| format!("{c:.0} {currency}"))),
        ),
        ("Volume per year".into(), units.volume().fmt(y.volume_m3)),
        (
            "Specific energy".into(),
            or_dash(y.specific_energy.map(|e| se.fmt(e))),
        ),
        (
            "Mean wire-to-water efficiency (Σ hydraulic / Σ input energy)".into(),
            or_dash(y.mean_wire_to_water.map(percent)),
        ),
        (
            "Mean pump efficiency (Σ hydraulic / Σ shaft energy)".into(),
            or_dash(y.mean_pump_efficiency.map(percent)),
        ),
    ]));
}

/// The checks across the profile.
fn profile_checks(blocks: &mut Vec<Block>, op: &CandidateOperation, units: &Units) {
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Check", 0.20, Align::Left),
            Column::new("Status", 0.08, Align::Left),
            Column::new("Finding", 0.50, Align::Left),
            Column::new("Limit from", 0.22, Align::Left),
        ],
        rows: op
            .checks
            .iter()
            .map(|c| {
                vec![
                    c.id.as_str().to_string(),
                    c.status.keyword().to_uppercase(),
                    super::wording::plain(&units.render(&c.message.get())),
                    c.source(),
                ]
            })
            .collect(),
        caption: Some(format!("Pump {}: checks across the profile", op.name)),
    });
}

/// The control curve over the speed family of the set, with the system curve and the
/// load points, on a head plot.
fn head_figure(
    blocks: &mut Vec<Block>,
    analysis: &Analysis,
    op: &CandidateOperation,
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let mut series = Vec::new();
    for (i, plot) in op.control_plots.iter().enumerate() {
        series.push(Series {
            name: format!(
                "control curve ({}, case {})",
                plot.control.words(),
                plot.case
            ),
            points: plot
                .points
                .iter()
                .map(|(q, h)| (fl.value(*q), hd.value(*h)))
                .collect(),
            style_index: i,
            solid: true,
            ..Default::default()
        });
        if let Some(c) = analysis.cases.iter().find(|c| c.name == plot.case) {
            series.push(Series {
                name: format!("system, case {}", c.name),
                points: c
                    .system_curve
                    .iter()
                    .map(|p| (fl.value(p.flow), hd.value(p.head)))
                    .collect(),
                style_index: i + 1,
                dashed: true,
                ..Default::default()
            });
        }
    }
    for (k, f) in speed_family(analysis, op).into_iter().enumerate() {
        series.push(Series {
            name: f.0,
            points: f
                .1
                .iter()
                .map(|(q, h)| (fl.value(*q), hd.value(*h)))
                .collect(),
            style_index: k + 3,
            ..Default::default()
        });
    }
    if series.is_empty() {
        return;
    }
    let points = op
        .points
        .iter()
        .filter_map(|p| {
            p.state.as_ref().map(|s| Marker {
                x: fl.value(p.flow),
                y: hd.value(s.system_head + s.surplus_head),
                label: String::new(),
                axis: YAxis::Left,
            })
        })
        .collect();
    blocks.push(Block::Figure {
        chart: Chart { x_label: format!("Flow ({})", fl.label), y_label: format!("Head ({})", hd.label), series, points, ..Default::default() },
        height_mm: 95.0,
        caption: format!("Pump {}: control curve over the speed family of the set (all duty pumps running), system curve and the load points", op.name),
    });
}

/// The set's head curves at the minimum, middle and maximum speed, all duty pumps
/// running, from the candidate's operating curve in the first profile case.
fn speed_family(analysis: &Analysis, op: &CandidateOperation) -> Vec<(String, Vec<(f64, f64)>)> {
    let Some(case) = op.points.first().map(|p| p.case.as_str()) else {
        return Vec::new();
    };
    let Some(result) = analysis
        .cases
        .iter()
        .find(|c| c.name == case)
        .and_then(|c| c.pumps.iter().find(|p| p.name == op.name))
    else {
        return Vec::new();
    };
    let r0 = result.speed_rpm / op.published_speed_rpm.max(1.0);
    let (lo, hi) = op.speed_range;
    let ratios: Vec<f64> = if (hi - lo).abs() < 1e-9 {
        vec![lo]
    } else {
        vec![lo, 0.5 * (lo + hi), hi]
    };
    ratios
        .iter()
        .map(|r| {
            let s = r / r0.max(1e-6);
            let pts = result
                .operating_curve
                .iter()
                .map(|p| (p.flow * s, p.head * s * s))
                .collect();
            (format!("set at {:.0} rpm", r * op.published_speed_rpm), pts)
        })
        .collect()
}

/// Input power and wire-to-water efficiency against flow, every candidate.
fn power_figure(blocks: &mut Vec<Block>, analysis: &Analysis, units: &Units) {
    let (fl, pw) = (units.flow(), units.power());
    let mut series = Vec::new();
    for (i, op) in analysis.operation.iter().enumerate() {
        let pts: Vec<&PointResult> = op.points.iter().filter(|p| p.state.is_some()).collect();
        series.push(Series {
            name: format!("{} input power", op.name),
            points: pts
                .iter()
                .filter_map(|p| Some((fl.value(p.flow), pw.value(p.state.as_ref()?.input_power))))
                .collect(),
            style_index: i,
            solid: true,
            markers: true,
            ..Default::default()
        });
        series.push(Series {
            name: format!("{} wire to water", op.name),
            points: pts
                .iter()
                .filter_map(|p| Some((fl.value(p.flow), 100.0 * p.wire_to_water?)))
                .collect(),
            style_index: i,
            dashed: true,
            markers: true,
            axis: YAxis::Right,
            ..Default::default()
        });
    }
    blocks.push(Block::Figure {
        chart: Chart { x_label: format!("Flow ({})", fl.label), y_label: format!("Input power while running ({})", pw.label), y2_label: Some("Wire-to-water efficiency (%)".into()), series, ..Default::default() },
        height_mm: 90.0,
        caption: "Input power (solid) and wire-to-water efficiency (dashed) across the profile, every candidate".into(),
    });
}

/// Yearly energy by load point per candidate, as bars side by side.
fn energy_bars(blocks: &mut Vec<Block>, analysis: &Analysis, units: &Units) {
    let n = analysis.operation.len().max(1) as f64;
    let width = 0.8 / n;
    let series = analysis
        .operation
        .iter()
        .enumerate()
        .map(|(i, op)| {
            let mut pts = Vec::new();
            for (k, p) in op.points.iter().enumerate() {
                let x0 = k as f64 + 1.0 - 0.4 + width * i as f64;
                let e = units.energy().value(p.energy_j) / 1000.0;
                pts.extend([
                    (x0, 0.0),
                    (x0, e),
                    (x0 + width, e),
                    (x0 + width, 0.0),
                    (f64::NAN, f64::NAN),
                ]);
            }
            Series {
                name: format!("{} (MWh per year)", op.name),
                points: pts,
                style_index: i,
                solid: true,
                ..Default::default()
            }
        })
        .collect();
    let bins = analysis
        .operation
        .iter()
        .map(|o| o.points.len())
        .max()
        .unwrap_or(1) as f64;
    blocks.push(Block::Figure {
        chart: Chart {
            x_label: "Load point (numbered as in the profile table)".into(),
            y_label: "Energy per year (MWh)".into(),
            x_range: Some((0.4, bins + 0.6)),
            series,
            ..Default::default()
        },
        height_mm: 80.0,
        caption: "Yearly input energy by load point, each candidate".into(),
    });
}

/// The life-cycle cost table, per the HI/Europump guide.
fn life_cycle(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis) {
    let with: Vec<&CandidateOperation> = analysis
        .operation
        .iter()
        .filter(|o| o.lcc.is_some())
        .collect();
    let Some(first) = with.first().and_then(|o| o.lcc.as_ref()) else {
        return;
    };
    blocks.push(Block::heading(2, "Life-cycle cost"));
    blocks.push(Block::Equation(
        "LCC = C_ic + C_in + C_e + C_o + C_mr + C_s + C_env + C_d".into(),
    ));
    blocks.push(Block::Equation(
        "PV(A) = A·Σₙ₌₁ᴺ ((1+g)/(1+i))ⁿ;  PV(C_d) = C_d·((1+g)/(1+i))ᴺ".into(),
    ));
    blocks.push(Block::text(format!(
        "After Hydraulic Institute and Europump, Pump Life Cycle Costs: A Guide to LCC Analysis for Pumping Systems (2001): initial (ic), installation and commissioning (in), energy (e), operation (o), maintenance and repair (mr), downtime (s), environmental (env), decommissioning and disposal (d). Life N = {:.0} years, discount rate i = {:.1} %; {} rates: energy grows at g = {:.1} % a year (present-worth factor {:.3}), other yearly costs at g = {:.1} % (factor {:.3}). Elements the design does not give count as zero.",
        first.years, first.discount_rate * 100.0,
        first.rates.keyword(), first.escalation * 100.0, first.energy_factor, first.inflation * 100.0, first.recurring_factor
    )));
    let cur = &design.energy.currency;
    let names = [
        "Initial",
        "Installation",
        "Energy",
        "Operation",
        "Maintenance",
        "Downtime",
        "Environmental",
        "Disposal",
        "Total",
    ];
    let mut columns = vec![Column::new("Present value", 0.22, Align::Left)];
    let share = 0.78 / with.len() as f64;
    columns.extend(
        with.iter()
            .map(|o| Column::new(format!("{} ({cur})", o.name), share, Align::Right)),
    );
    let rows = names
        .iter()
        .enumerate()
        .map(|(k, n)| {
            let mut row = vec![n.to_string()];
            row.extend(with.iter().filter_map(|o| o.lcc.as_ref()).map(|l| {
                let v = [
                    l.initial,
                    l.installation,
                    l.energy,
                    l.operation,
                    l.maintenance,
                    l.downtime,
                    l.environmental,
                    l.disposal,
                    l.total,
                ][k];
                format!("{v:.0}")
            }));
            row
        })
        .collect();
    blocks.push(Block::Table { columns, rows, caption: Some("Life-cycle cost per candidate, present values; a candidate that does not deliver every load point counts only the energy of the points it delivers and is not ranked above one that does".into()) });
}
