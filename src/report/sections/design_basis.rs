//! The design basis chapter: fluid and site, levels, pipe segments, fittings,
//! cases and requirements, as the analysis used them.

use crate::analysis::system::{CaseSystem, SegmentState};
use crate::analysis::{Analysis, CaseResult};
use crate::display::Units;
use crate::model::Design;
use crate::report::layout::document::{Align, Block, Column};

/// The design basis chapter.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    design: &Design,
    analysis: &Analysis,
    units: &Units,
) {
    blocks.push(Block::heading(1, "Design basis"));
    fluid_and_site(blocks, design, analysis, units);
    if crate::analysis::well_field::is_field(&design.base) {
        super::well_field::design_basis(blocks, design, units);
        cases(blocks, analysis);
        requirements(blocks, design, units);
        return;
    }
    levels(blocks, design, analysis, units);
    blocks.push(Block::heading(2, "Pipe segments"));
    if let Some((case, system)) = analysis
        .cases
        .iter()
        .find_map(|c| c.system.as_ref().map(|s| (c, s)))
    {
        pipe_segments(blocks, case, system, units);
        pipe_condition(blocks, analysis, system, units);
        fittings(blocks, design, case, system, units);
    }
    cases(blocks, analysis);
    requirements(blocks, design, units);
}

/// Fluid properties and barometric pressure per case, with their sources.
fn fluid_and_site(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis, units: &Units) {
    blocks.push(Block::heading(2, "Fluid and site"));
    let rows: Vec<Vec<String>> = analysis
        .cases
        .iter()
        .filter_map(analysed)
        .map(|(case, system)| {
            vec![
                case.name.clone(),
                system.fluid.name.clone(),
                system
                    .fluid
                    .temperature_k
                    .map(|t| units.temperature().text(t))
                    .unwrap_or_else(|| "—".into()),
                units.density().text(system.fluid.density),
                units.viscosity().text(system.fluid.viscosity),
                units
                    .absolute_pressure()
                    .text(system.fluid.vapor_pressure.pa()),
                units.absolute_pressure().text(system.barometric.pa()),
            ]
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.16, Align::Left),
            Column::new("Fluid", 0.14, Align::Left),
            Column::new("Temperature", 0.13, Align::Right),
            Column::new("Density", 0.15, Align::Right),
            Column::new("Viscosity", 0.13, Align::Right),
            Column::new("Vapour pressure", 0.14, Align::Right),
            Column::new("Barometric", 0.15, Align::Right),
        ],
        rows,
        caption: Some("Fluid properties and barometric pressure per case".into()),
    });
    if let Some(system) = analysis.cases.iter().find_map(|case| case.system.as_ref()) {
        blocks.push(Block::KeyValue(vec![
            (
                "Fluid properties".into(),
                super::sources::publication(&system.fluid.source, units),
            ),
            (
                "Barometric pressure".into(),
                super::sources::publication(&system.barometric_source, units),
            ),
            (
                "Site elevation".into(),
                units
                    .elevation()
                    .text(design.base.site.elevation.get::<uom::si::length::meter>()),
            ),
        ]));
    }
}

/// For a network that floats on tanks: the static head is the head at zero station flow,
/// not the lift between the surfaces; say so with each case's lift, so that a reader who
/// subtracts the levels in the table is not misled.
fn floating_note(analysis: &Analysis, units: &Units) -> String {
    let lifts: Vec<String> = analysis
        .cases
        .iter()
        .filter_map(|c| {
            let s = c.system.as_ref()?;
            let (net, _) = s.network.as_ref()?;
            net.pattern.is_none().then(|| {
                let lift = s.destination_level.m() - s.source_level.m();
                format!("{} {}", c.name, units.head().text(lift))
            })
        })
        .collect();
    if lifts.is_empty() {
        return String::new();
    }
    format!(
        "; in a network case the static head is the head the station must supply at zero station flow: the entry node's head with the case's tanks floating and its demands drawn (from the tanks), less the source grade, so it differs from the lift between the surfaces (source to destination level: {}) by what the network loses or gains at zero station flow, see Network",
        lifts.join(", ")
    )
}

/// For a network without a downstream tank: which node the destination columns give.
fn governing_note(analysis: &Analysis) -> String {
    let names: Vec<String> = analysis
        .cases
        .iter()
        .filter_map(|c| {
            let (net, _) = c.system.as_ref()?.network.as_ref()?;
            let i = net.governing_at_zero()?;
            Some(format!("{} {}", c.name, net.network.nodes[i].name))
        })
        .collect();
    if names.is_empty() {
        return String::new();
    }
    format!(
        "; the network has no downstream tank: the destination columns give its governing node at zero flow (elevation and required pressure; {}), see Network",
        names.join(", ")
    )
}

/// Surface levels, pump centreline, surface pressures and static head per case.
fn levels(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis, units: &Units) {
    blocks.push(Block::heading(2, "Levels and static head"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.16, Align::Left),
            Column::new(
                format!("Source {}", design.base.source.name),
                0.17,
                Align::Right,
            ),
            Column::new(
                format!("Destination {}", design.base.destination.name),
                0.19,
                Align::Right,
            ),
            Column::new("Pump centreline", 0.16, Align::Right),
            Column::new(
                format!("Surface pressures ({})", units.gauge_pressure().label),
                0.18,
                Align::Right,
            ),
            Column::new("Static head", 0.14, Align::Right),
        ],
        rows: analysis
            .cases
            .iter()
            .filter_map(analysed)
            .map(|(case, system)| {
                vec![
                    case.name.clone(),
                    units.elevation().text(system.source_level.m()),
                    units.elevation().text(system.destination_level.m()),
                    units.elevation().text(system.centreline.m()),
                    format!(
                        "{} / {}",
                        units
                            .gauge_pressure()
                            .figure(system.source_gauge().pa()),
                        units
                            .gauge_pressure()
                            .figure(system.destination_gauge().pa())
                    ),
                    units.head().text(system.static_head),
                ]
            })
            .collect(),
        caption: Some(format!(
            "{}{}{}",
            match analysis.cases.iter().any(|c| c.system.as_ref().is_some_and(|s| s.well.is_some())) {
                false => "Surface levels, pump datum, surface pressures and static head per case",
                true => "Surface levels, pump datum, surface pressures and static head per case; a well's level is its static water level and the static head is taken from it: the drawdown at each flow is added to the system curve, and the pumping level at each duty is in the candidate chapters",
            },
            governing_note(analysis),
            floating_note(analysis, units)
        )),
    });
}

/// Each segment's material, size, diameter, length and roughness with their sources.
fn pipe_segments(blocks: &mut Vec<Block>, case: &CaseResult, system: &CaseSystem, units: &Units) {
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Line / seg.", 0.14, Align::Left),
            Column::new("Material and size", 0.22, Align::Left),
            Column::new("Inner diameter", 0.12, Align::Right),
            Column::new("Length", 0.10, Align::Right),
            Column::new("Roughness or C", 0.12, Align::Right),
            Column::new("Sources", 0.30, Align::Left),
        ],
        rows: system
            .segments
            .iter()
            .map(|g| {
                vec![
                    segment_label(g),
                    crate::display::pipe(g.material, &g.size_label, g.inner_diameter, units),
                    units.diameter().text(g.inner_diameter),
                    units.length().text(g.length),
                    roughness_or_c(g, units),
                    format!(
                        "{}; {}",
                        super::sources::labelled("diameter", &g.diameter_source, units),
                        super::sources::labelled("roughness", &g.roughness_source, units)
                    ),
                ]
            })
            .collect(),
        caption: Some(format!(
            "Segments as in case {} (roughness follows each case's pipe condition)",
            case.name
        )),
    });
}

/// The roughness or Hazen-Williams C each case uses on each segment (aged cases
/// included): the effective pipe inputs a reviewer recomputes with.
fn pipe_condition(blocks: &mut Vec<Block>, analysis: &Analysis, first: &CaseSystem, units: &Units) {
    let headers: Vec<String> = first.segments.iter().map(segment_label).collect();
    let rows: Vec<Vec<String>> = analysis
        .cases
        .iter()
        .filter_map(analysed)
        .map(|(case, system)| {
            let mut cells = vec![case.name.clone()];
            cells.extend(system.segments.iter().map(|g| roughness_or_c(g, units)));
            cells.resize(headers.len() + 1, "—".into());
            cells
        })
        .collect();
    super::matrix_tables(
        blocks,
        "Case",
        &headers,
        &rows,
        "Roughness or Hazen-Williams C used per case and segment (each case's pipe condition)",
    );
}

/// Every fitting's K at the first duty flow, and the losses given in the design.
fn fittings(
    blocks: &mut Vec<Block>,
    design: &Design,
    case: &CaseResult,
    system: &CaseSystem,
    units: &Units,
) {
    let q = case
        .pumps
        .iter()
        .find_map(|run| run.duty.as_ref().map(|duty| duty.flow));
    let mut rows = Vec::new();
    for g in system.segments.iter() {
        let re = q.map(|q| system.reynolds(g, q)).unwrap_or(1e5);
        for f in &g.fittings {
            rows.push(vec![
                segment_label(g),
                fitting_text(f),
                f.count.to_string(),
                format!(
                    "{:.3}",
                    crate::analysis::system::k_of(f, re, g.inner_diameter)
                ),
                super::sources::publication(f.spec.source, units),
            ]);
        }
    }
    for line in design.base.lines.iter() {
        for (i, seg) in line.segments.iter().enumerate() {
            for l in &seg.losses {
                let what = match (l.k, l.equivalent_length) {
                    (Some(k), _) => format!("{k:.3}"),
                    (_, Some(le)) => {
                        format!(
                            "L = {}",
                            units.length().text(le.get::<uom::si::length::meter>())
                        )
                    }
                    _ => "—".into(),
                };
                rows.push(vec![
                    format!("{} {}", line.name, i + 1),
                    "stated loss".into(),
                    "1".into(),
                    what,
                    format!("given: {}", l.why),
                ]);
            }
        }
    }
    blocks.push(Block::heading(2, "Fittings and other losses"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Line / seg.", 0.12, Align::Left),
            Column::new("Fitting", 0.28, Align::Left),
            Column::new("Count", 0.06, Align::Right),
            Column::new("K each", 0.10, Align::Right),
            Column::new("Source of K", 0.44, Align::Left),
        ],
        rows,
        caption: Some(match q {
            Some(q) => format!("K values at the first duty flow of case {} ({}); Reynolds-dependent K change with flow", case.name, units.flow().text(q)),
            None => "K values at Re = 10⁵".into(),
        }),
    });
}

/// The cases, their hours and what each overrides.
fn cases(blocks: &mut Vec<Block>, analysis: &Analysis) {
    blocks.push(Block::heading(2, "Cases"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.2, Align::Left),
            Column::new("Hours per year", 0.16, Align::Right),
            Column::new("Changed from the base design", 0.64, Align::Left),
        ],
        rows: analysis
            .cases
            .iter()
            .map(|case| {
                vec![
                    case.name.clone(),
                    format!("{:.0} h", case.hours_per_year),
                    if case.overrides.is_empty() {
                        "none (base design)".into()
                    } else {
                        changed_fields(&case.overrides)
                    },
                ]
            })
            .collect(),
        caption: Some("Operating cases, their hours per year and what each changes; the values each case uses are in the design-basis tables above".into()),
    });
}

/// The requirements as written and the cases they apply to.
fn requirements(blocks: &mut Vec<Block>, design: &Design, units: &Units) {
    blocks.push(Block::heading(2, "Requirements"));
    if design.requirements.is_empty() {
        blocks.push(Block::text("The design states no requirements; the checks use the default limits given in the Checks section."));
    } else {
        blocks.push(Block::Table {
            columns: vec![
                Column::new("Requirement", 0.7, Align::Left),
                Column::new("Applies to", 0.3, Align::Left),
            ],
            rows: design
                .requirements
                .iter()
                .map(|r| {
                    vec![
                        super::wording::requirement(r, units),
                        if r.cases.is_empty() {
                            "every case".into()
                        } else {
                            r.cases.join(", ")
                        },
                    ]
                })
                .collect(),
            caption: Some("Requirements of the design and the cases they apply to".into()),
        });
    }
}

/// A fitting as printed: its description, and the diameter ratio β and total angle θ
/// its K depends on, so the K can be recomputed from the page.
fn fitting_text(f: &crate::analysis::system::FittingState) -> String {
    let mut text = super::wording::fitting(f.spec.description);
    if let Some(beta) = f.beta {
        text.push_str(&format!("; β = {beta:.3}"));
        if f.beta_from_bores {
            text.push_str(" (ratio of the inner diameters)");
        }
    }
    if let Some(angle) = f.angle_rad {
        text.push_str(&format!("; θ = {:.1}°", angle.to_degrees()));
    }
    text
}

/// What a case's overrides change, in words: the field, and a word value such as a
/// pipe condition ("roughness aged"); numbers are left to the tables that print every
/// case's values in report units, so no input expression or input unit is quoted.
/// The hours have their own column and are not repeated.
fn changed_fields(overrides: &[String]) -> String {
    let changed: Vec<String> = overrides
        .iter()
        .filter_map(|o| {
            let (field, value) = o.split_once(" = ").unwrap_or((o.as_str(), ""));
            let word = !value.is_empty() && value.chars().all(|c| c.is_ascii_alphabetic());
            let count = !value.is_empty() && value.chars().all(|c| c.is_ascii_digit());
            match field {
                "hours" | "hours_per_year" => None,
                _ if field.ends_with(".running") && count => Some(format!(
                    "pumps of {} running: {value}",
                    field.trim_end_matches(".running")
                )),
                "roughness" | "pipe_condition" if word => Some(format!("pipe condition: {value}")),
                _ if word => Some(format!("{}: {value}", super::wording::plain(field))),
                _ => Some(super::wording::plain(field)),
            }
        })
        .collect();
    if changed.is_empty() {
        "nothing but the hours".into()
    } else {
        changed.join("; ")
    }
}

/// A case with its system, for the cases that could be set up.
fn analysed(case: &CaseResult) -> Option<(&CaseResult, &CaseSystem)> {
    case.system.as_deref().map(|system| (case, system))
}

/// A segment as the tables name it: its line and its 1-based number ("discharge 2").
fn segment_label(g: &SegmentState) -> String {
    format!("{} {}", g.line, g.index + 1)
}

/// The segment's Hazen-Williams C ("C = 120") when it uses one, else its roughness.
fn roughness_or_c(g: &SegmentState, units: &Units) -> String {
    g.hazen_williams_c
        .map(|hazen_c| format!("C = {hazen_c}"))
        .unwrap_or_else(|| units.roughness().text(g.roughness))
}
