//! What a reviewer recomputes for a candidate, printed from the analysis: NPSH
//! available term by term, every segment at each duty, hydraulic, shaft and input
//! power with specific energy and wire-to-water efficiency, headroom and capacity,
//! the motor findings and one pump of a parallel set running alone.

use super::CaseRun;
use crate::analysis::duty::AdjustLimit;
use crate::analysis::motor::MotorSizing;
use crate::analysis::parallel::OneAlone;
use crate::display::{percent, typeset, Units};
use crate::model::{Adjust, PumpCandidate};
use crate::report::layout::document::{Align, Block, Column};

/// "—" for a missing value.
fn or_dash(value: Option<String>) -> String {
    value.unwrap_or_else(|| "—".into())
}

/// NPSH available per case, term by term, against NPSH required (NPSH3).
/// The NPSH available terms as table cells, in the order they add (barometric, surface
/// gauge, static suction, vapour, suction friction, suction minor), then their sum.
pub(in crate::report::sections) fn npsh_term_cells(
    hd: crate::display::Shown,
    t: &crate::analysis::system::NpshTerms,
    npsh_available: f64,
) -> Vec<String> {
    vec![
        hd.figure(t.barometric_head),
        hd.figure(t.surface_pressure_head),
        hd.figure(t.static_suction_head),
        hd.figure(t.vapour_pressure_head),
        hd.figure(t.suction_friction_head),
        hd.figure(t.suction_minor_head),
        hd.figure(npsh_available),
    ]
}

pub(super) fn npsh_terms(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    units: &Units,
) {
    let hd = units.head();
    let rows: Vec<Vec<String>> = results
        .iter()
        .filter_map(|(case, run)| {
            let duty = run.duty.as_ref()?;
            let t = &duty.npsh_terms;
            let ratio = duty
                .npsh_required
                .filter(|r| *r > 0.0)
                .map(|r| typeset(duty.npsh_available / r, 2));
            let excess = duty
                .npsh_required
                .map(|r| hd.figure(duty.npsh_available - r));
            let mut row = vec![case.name.clone()];
            row.extend(npsh_term_cells(hd, t, duty.npsh_available));
            row.extend([
                or_dash(duty.npsh_required.map(|r| hd.figure(r))),
                or_dash(ratio),
                or_dash(excess),
            ]);
            Some(row)
        })
        .collect();
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::heading(
        2,
        format!("NPSH available term by term, {}", pump.name),
    ));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new("Barometric", 0.09, Align::Right),
            Column::new("Surface gauge", 0.09, Align::Right),
            Column::new("Static suction", 0.09, Align::Right),
            Column::new("Vapour pressure", 0.09, Align::Right),
            Column::new("Suction friction", 0.09, Align::Right),
            Column::new("Suction minor", 0.08, Align::Right),
            Column::new("NPSHa", 0.08, Align::Right),
            Column::new("NPSHr (NPSH3)", 0.08, Align::Right),
            Column::new("Ratio", 0.06, Align::Right),
            Column::new("Excess", 0.07, Align::Right),
        ],
        rows,
        caption: Some(format!(
            "Heads in {} of the case's fluid at the duty flow, signed as they add: NPSHa = barometric + surface gauge + static suction + vapour pressure + suction friction + suction minor (equation 5); ratio = NPSHa/NPSHr, excess = NPSHa − NPSHr",
            hd.label
        )),
    });
}

/// Each pump's own station piping at the duty, when the design gives any: the flow per
/// pump, its branches' losses and its own head (the header's head plus them).
pub(super) fn station_piping(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    units: &Units,
) {
    let (fl, hd) = (units.flow(), units.head());
    let rows: Vec<Vec<String>> = results
        .iter()
        .filter_map(|(case, run)| {
            let duty = run.duty.as_ref()?;
            let st = duty.station.as_ref()?;
            let path: Vec<String> = st
                .npsh_path
                .iter()
                .map(|(line, i, q)| format!("{line} {} at {}", i + 1, fl.text(*q)))
                .collect();
            Some(vec![
                case.name.clone(),
                fl.figure(st.flow_per_pump),
                hd.figure(st.suction_head),
                hd.figure(st.discharge_head),
                hd.figure(duty.head_per_pump - st.suction_head - st.discharge_head),
                hd.figure(duty.head_per_pump),
                path.join(", "),
            ])
        })
        .collect();
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::heading(
        2,
        format!("Station piping of each pump, {}", pump.name),
    ));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new("Flow per pump", 0.11, Align::Right),
            Column::new("Own suction loss", 0.11, Align::Right),
            Column::new("Own discharge loss", 0.11, Align::Right),
            Column::new("Head at headers", 0.11, Align::Right),
            Column::new("Pump head", 0.1, Align::Right),
            Column::new("Suction path of NPSHa (segment at flow)", 0.34, Align::Left),
        ],
        rows,
        caption: Some(format!(
            "Heads in {}, flows in {}. Each pump has its own suction and discharge branch carrying one pump's flow; pump head = head at headers + own suction loss + own discharge loss (the modified pump curve: the set offers its headers each pump's head less its own branches' loss). NPSHa in the table above is each pump's own: the common suction at the set's flow, the pump's own branch at its flow. Pumps of a set and their branches are taken as identical, so they share the flow equally",
            hd.label, fl.label
        )),
    });
}

/// A source well at each duty: the drawdown s = B·Q + C·Q² in its parts from the test
/// point, and the pumping level NPSH available and the static head start from.
pub(super) fn well_levels(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    units: &Units,
) {
    let (fl, hd, el) = (units.flow(), units.head(), units.elevation());
    let rows: Vec<Vec<String>> = results
        .iter()
        .filter_map(|(case, run)| {
            let duty = run.duty.as_ref()?;
            let w = duty.well?;
            let test = case.system.as_ref()?.well?;
            Some(vec![
                case.name.clone(),
                format!(
                    "{} at {} ({} well loss)",
                    hd.text(test.drawdown),
                    fl.text(test.test_flow),
                    hd.text(test.well_loss)
                ),
                fl.figure(duty.flow),
                el.figure(w.static_level),
                hd.figure(w.aquifer_loss),
                hd.figure(w.well_loss),
                el.figure(w.pumping_level),
            ])
        })
        .collect();
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::heading(
        2,
        format!("Well pumping level, {}", pump.name),
    ));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new("Drawdown test", 0.26, Align::Left),
            Column::new("Duty flow", 0.1, Align::Right),
            Column::new("Static level", 0.12, Align::Right),
            Column::new("Aquifer loss B·Q", 0.13, Align::Right),
            Column::new("Well loss C·Q²", 0.13, Align::Right),
            Column::new("Pumping level", 0.14, Align::Right),
        ],
        rows,
        caption: Some(format!(
            "Levels in {}, heads in {}, flows in {}. Drawdown s = B·Q + C·Q² (Jacob 1947; step-drawdown tests, Driscoll, Groundwater and Wells, 2nd ed., 1986, ch. 16), fitted to the test: B·Qt = test drawdown − its well loss, C·Qt² = its well loss, so aquifer loss = (s − well loss)·Q/Qt and well loss = well loss·(Q/Qt)². Pumping level = static level − aquifer loss − well loss; the static suction head of NPSHa and the system's static head are taken from it. The drawdown grows with seasons and years of pumping: confirm the test with the well's own record",
            el.label, hd.label, fl.label
        )),
    });
}

/// Every segment at each case's duty flow: flow, velocity, Re, f, friction and minor
/// head and the K of each fitting at that Reynolds number.
pub(super) fn segments(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    units: &Units,
) {
    let (fl, hd, vel) = (units.flow(), units.head(), units.velocity());
    let mut rows = Vec::new();
    for (case, run) in results {
        let (Some(duty), Some(sys)) = (&run.duty, &case.system) else {
            continue;
        };
        for segment in &duty.segments(sys) {
            rows.push(vec![
                case.name.clone(),
                format!("{} {}", segment.line, segment.index + 1),
                fl.figure(segment.flow),
                vel.figure(segment.velocity),
                format!("{:.3e}", segment.reynolds).replace('e', " × 10^"),
                or_dash(segment.friction_factor.map(|f| format!("{f:.5}"))),
                format!("{:.3}", hd.value(segment.friction_head)),
                format!("{:.3}", hd.value(segment.minor_head)),
                if segment.fittings_k.is_empty() {
                    "—".into()
                } else {
                    segment
                        .fittings_k
                        .iter()
                        .map(|k| format!("{k:.3}"))
                        .collect::<Vec<_>>()
                        .join(", ")
                },
            ]);
        }
    }
    if rows.is_empty() {
        return;
    }
    for row in &mut rows {
        row[4] = superscript_exponent(&row[4]);
    }
    blocks.push(Block::heading(
        2,
        format!("Segments at the duty points of {}", pump.name),
    ));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.11, Align::Left),
            Column::new("Line / seg.", 0.11, Align::Left),
            Column::new(format!("Flow ({})", fl.label), 0.09, Align::Right),
            Column::new(format!("Velocity ({})", vel.label), 0.09, Align::Right),
            Column::new("Reynolds number", 0.12, Align::Right),
            Column::new("Friction factor f", 0.09, Align::Right),
            Column::new(format!("Friction head ({})", hd.label), 0.10, Align::Right),
            Column::new(format!("Minor head ({})", hd.label), 0.09, Align::Right),
            Column::new("K of each fitting, in order", 0.20, Align::Left),
        ],
        rows,
        caption: Some(
            "Each segment at the duty flow: f by Colebrook or the laminar law (— where Hazen-Williams C applies); minor head = ΣK·v²/(2g) with the K listed (count as in the fittings table) plus stated losses".into(),
        ),
    });
}

/// "1.234 × 10^5" with the exponent as superscript digits: "1.234 × 10⁵".
fn superscript_exponent(text: &str) -> String {
    let Some((mantissa, exponent)) = text.split_once("^") else {
        return text.to_string();
    };
    let digits: String = exponent
        .chars()
        .map(|c| match c {
            '-' => '⁻',
            '0' => '⁰',
            '1' => '¹',
            '2' => '²',
            '3' => '³',
            '4' => '⁴',
            '5' => '⁵',
            '6' => '⁶',
            '7' => '⁷',
            '8' => '⁸',
            '9' => '⁹',
            other => other,
        })
        .collect();
    format!("{mantissa}{digits}")
}

/// Hydraulic, shaft and input power, the efficiencies between them, specific energy
/// and the yearly hours and volume.
pub(super) fn power(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    units: &Units,
) {
    let (pw, se, vol) = (
        units.power(),
        units.specific_energy(),
        units.volume_column(),
    );
    let rows: Vec<Vec<String>> = results
        .iter()
        .filter_map(|(case, run)| {
            let duty = run.duty.as_ref()?;
            Some(vec![
                case.name.clone(),
                pw.figure(duty.hydraulic_power),
                or_dash(duty.shaft_power.map(|p| pw.figure(p))),
                or_dash(duty.efficiency.map(percent)),
                percent(duty.motor_efficiency),
                if matches!(pump.adjust, Adjust::Speed { .. }) || duty.drive_efficiency < 1.0 {
                    percent(duty.drive_efficiency)
                } else {
                    "none".into()
                },
                or_dash(duty.input_power.map(|p| pw.figure(p))),
                or_dash(duty.wire_to_water_efficiency.map(percent)),
                or_dash(duty.specific_energy.map(|e| se.figure(e))),
                or_dash(run.energy.map(|e| format!("{:.0}", e.hours))),
                or_dash(run.energy.map(|e| vol.figure(e.volume_m3))),
            ])
        })
        .collect();
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::heading(
        2,
        format!("Power and energy of {}", pump.name),
    ));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new(format!("Hydraulic ({})", pw.label), 0.09, Align::Right),
            Column::new(format!("Shaft ({})", pw.label), 0.08, Align::Right),
            Column::new("Pump eff.", 0.08, Align::Right),
            Column::new("Motor eff.", 0.08, Align::Right),
            Column::new("Drive eff.", 0.08, Align::Right),
            Column::new(format!("Input ({})", pw.label), 0.08, Align::Right),
            Column::new("Wire to water", 0.08, Align::Right),
            Column::new(format!("Specific energy ({})", se.label), 0.11, Align::Right),
            Column::new("Hours per year", 0.09, Align::Right),
            Column::new(format!("Volume per year ({})", vol.label), 0.11, Align::Right),
        ],
        rows,
        caption: Some(
            "Whole arrangement at each duty (equation 6): hydraulic = ρ·g·Q·H, shaft = hydraulic / pump efficiency, input = shaft / (motor × drive efficiency); wire to water = hydraulic / input; specific energy = input / flow. Where a case fixes a volume, the hours are that volume ÷ this candidate's flow".into(),
        ),
    });
}

/// Per case the speed or diameter needed, the limit, the headroom left and the flow
/// at the limit (capacity); only for candidates that adjust speed or trim.
pub(super) fn headroom(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    results: &[CaseRun],
    capacity: &[Option<f64>],
    units: &Units,
) {
    let fl = units.flow();
    let rows: Vec<Vec<String>> = results
        .iter()
        .enumerate()
        .filter_map(|(k, (case, run))| {
            let room = run.headroom?;
            let what = match room.limit {
                AdjustLimit::Speed => "speed",
                AdjustLimit::Trim => "impeller diameter",
            };
            Some(vec![
                case.name.clone(),
                what.to_string(),
                or_dash(room.needed.map(percent)),
                percent(room.limit_value),
                or_dash(
                    room.fraction()
                        .map(|f| format!("{} %", typeset(f * 100.0, 1))),
                ),
                or_dash(
                    capacity
                        .get(k)
                        .copied()
                        .flatten()
                        .or(run.capacity_flow)
                        .map(|q| fl.text(q)),
                ),
            ])
        })
        .collect();
    if rows.is_empty() {
        return;
    }
    blocks.push(Block::heading(2, format!("Headroom of {}", pump.name)));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.16, Align::Left),
            Column::new("Adjusted", 0.16, Align::Left),
            Column::new("Needed (of published)", 0.16, Align::Right),
            Column::new("Limit (of published)", 0.16, Align::Right),
            Column::new("Headroom", 0.14, Align::Right),
            Column::new("Flow at the limit", 0.22, Align::Right),
        ],
        rows,
        caption: Some(
            "Speed or diameter each case needs to meet its flow requirement, against the design's limit; headroom = (limit − needed)/limit, below 5 % warned (common practice)".into(),
        ),
    });
}

/// The motor: rating, how it was chosen, the largest operating and run-out shaft
/// power per pump with where they occur, loading, service factor and efficiency.
pub(super) fn motor(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    sizing: &MotorSizing,
    units: &Units,
) {
    let (fl, pw) = (units.flow(), units.power());
    let choice = &sizing.choice;
    let mut rows = vec![
        (
            "Rating (nameplate)".to_string(),
            format!(
                "{} per pump, {}",
                choice.rating_label,
                if sizing.rating_stated {
                    "stated in the design"
                } else {
                    "the smallest standard rating covering the largest operating shaft power"
                }
            ),
        ),
        (
            "Largest operating shaft power".into(),
            format!(
                "{} per pump in case {} ({} of rating)",
                pw.text(sizing.max_operating_shaft_power),
                sizing.max_operating_case,
                percent(choice.loading_ratio)
            ),
        ),
        (
            "Largest shaft power to run-out".into(),
            format!(
                "{} per pump in case {} at {} per pump, {:.0} rpm ({} of rating; {})",
                pw.text(sizing.run_out_shaft_power),
                sizing.run_out_case,
                fl.text(sizing.run_out_flow),
                sizing.run_out_speed_rpm,
                percent(choice.runout_loading_ratio),
                match (choice.non_overloading, sizing.run_out_at_data_end) {
                    (true, true) => "non-overloading over the published curve; power still rising at its last point",
                    (true, false) => "non-overloading",
                    (false, _) => "overloads before the end of the curve",
                }
            ),
        ),
        (
            "Service factor".into(),
            format!(
                "{} on the nameplate, reported as margin and not used for sizing{}",
                typeset(choice.service_factor, 2),
                if sizing.variable_speed {
                    "; taken as 1.00 on a variable-frequency drive"
                } else {
                    ""
                }
            ),
        ),
        (
            "Motor efficiency".into(),
            format!(
                "{} at full load, {}-pole at {:.0} Hz ({})",
                percent(sizing.efficiency),
                sizing.poles,
                sizing.supply_hz,
                super::super::sources::publication(&sizing.efficiency_source, units)
            ),
        ),
    ];
    rows.extend(
        choice
            .warnings
            .iter()
            .map(|w| ("Finding".to_string(), super::super::wording::plain(w))),
    );
    blocks.push(Block::heading(2, format!("Motor of {}", pump.name)));
    blocks.push(Block::KeyValue(rows));
}

/// One pump of a parallel set running alone against the lowest-head case.
pub(super) fn one_alone(
    blocks: &mut Vec<Block>,
    pump: &PumpCandidate,
    alone: &OneAlone,
    units: &Units,
) {
    let (fl, hd, pw) = (units.flow(), units.head(), units.power());
    blocks.push(Block::heading(
        2,
        format!("One pump of {} running alone", pump.name),
    ));
    blocks.push(Block::KeyValue(vec![
        (
            "Case".into(),
            format!(
                "{} (lowest system head), {:.0} rpm",
                alone.case, alone.speed_rpm
            ),
        ),
        (
            "Duty point".into(),
            match (alone.flow, alone.head) {
                (Some(q), Some(h)) => format!("{} at {}", fl.text(q), hd.text(h)),
                _ => "beyond the end of the published curve: no published data there".into(),
            },
        ),
        (
            "Shaft power".into(),
            or_dash(alone.shaft_power.map(|p| pw.text(p))),
        ),
        (
            "NPSHa / NPSHr".into(),
            format!(
                "{} / {}",
                or_dash(alone.npsh_available.map(|n| hd.text(n))),
                or_dash(alone.npsh_required.map(|n| hd.text(n)))
            ),
        ),
        (
            "Finding".into(),
            super::super::wording::plain(&units.render(&alone.check.message.get())),
        ),
    ]));
}
