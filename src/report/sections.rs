//! The calculation package's content: the sections of `shared/design/report.md`
//! built as layout blocks from a design, its analysis and its source. Reads the
//! analysis; computes no engineering values of its own.

use super::layout::chart::{Chart, HLine, Marker, Series, YAxis};
use super::layout::document::{Align, Block, Column, Document, PageMeta, Signatory, Span};
use crate::analysis::checks::Status;
use crate::analysis::{Analysis, CaseResult};
use crate::display::{percent, Units};
use crate::model::{Design, ReportUnits};

/// Extra content: a changes section comparing with an earlier revision.
pub struct Changes {
    pub old_revision: String,
    pub inputs: Vec<String>,
    /// Rows: case, pump, quantity, before, after, change.
    pub results: Vec<Vec<String>>,
    /// Rows: case, pump, check, before, after, message.
    pub checks: Vec<Vec<String>>,
    pub recommendation: String,
}

/// Build the document.
pub fn document(
    design: &Design,
    analysis: &Analysis,
    source: &str,
    sha256: &str,
    changes: Option<&Changes>,
) -> Document {
    let u = Units::new(design.project.units);
    let p = &design.project;
    let rev = design.revisions.last();
    let rev_text = rev
        .map(|r| format!("rev. {}", r.id))
        .unwrap_or_else(|| "no revision".into());
    let mut b: Vec<Block> = Vec::new();

    // 1. Title block.
    let mut lines = vec![
        ("Project".to_string(), p.title.clone()),
        ("Calculation number".into(), p.number.clone()),
        ("Client".into(), p.client.clone()),
        (
            "Revision".into(),
            rev.map(|r| format!("{} — {} — {}", r.id, r.date, r.description))
                .unwrap_or_else(|| "—".into()),
        ),
        (
            "Subject".into(),
            "Pump selection: system curves, duty points, NPSH, power and energy".into(),
        ),
        ("Source file SHA-256".into(), sha256.to_string()),
        (
            "Prepared with".into(),
            format!("dutyline {}", crate::VERSION),
        ),
    ];
    lines.retain(|(_, v)| !v.is_empty());
    let date = rev.map(|r| r.date.clone()).unwrap_or_default();
    b.push(Block::TitleBlock {
        lines,
        seal_box: true,
        signatures: vec![
            Signatory::new("Prepared", p.prepared.clone(), date.clone()),
            Signatory::new("Checked", p.checked.clone(), String::new()),
            Signatory::new("Approved", p.approved.clone(), String::new()),
        ],
    });
    b.push(Block::caution(
        "This calculation assists a licensed engineer. Its results depend on the pump manufacturer's certified curves and on the installed conditions; they must be reviewed by a licensed engineer and checked against the codes and the authority having jurisdiction where the system is built.",
    ));
    b.push(Block::heading(1, "Revision history"));
    b.push(Block::Table {
        columns: vec![
            Column::new("Revision", 0.14, Align::Left),
            Column::new("Date", 0.18, Align::Left),
            Column::new("Description", 0.68, Align::Left),
        ],
        rows: if design.revisions.is_empty() {
            vec![vec![
                "—".into(),
                "—".into(),
                "no revision given in the design file".into(),
            ]]
        } else {
            design
                .revisions
                .iter()
                .map(|r| vec![r.id.clone(), r.date.clone(), r.description.clone()])
                .collect()
        },
        caption: None,
    });
    b.push(Block::PageBreak);
    b.push(Block::Contents);
    b.push(Block::PageBreak);

    // 4. Purpose.
    b.push(Block::heading(1, "Purpose and scope"));
    match &design.purpose {
        // Paragraphs are separated by blank lines; line breaks inside one are the author's wrapping.
        Some(text) => {
            for para in text.split("\n\n").filter(|p| !p.trim().is_empty()) {
                b.push(Block::text(
                    para.split_whitespace().collect::<Vec<_>>().join(" "),
                ));
            }
        }
        None => b.push(Block::text("The design file states no purpose.")),
    }
    b.push(Block::text(format!(
        "The calculation covers {} operating case(s) and {} pump candidate(s). Values are reported in {} units; the engine works in SI.",
        analysis.cases.len(),
        design.pumps.len(),
        if p.units == ReportUnits::Us { "US customary" } else { "SI" }
    )));
    if let Some(ch) = changes {
        changes_section(&mut b, ch);
    }
    design_basis(&mut b, design, analysis, &u);
    method(&mut b, design);
    system_curves(&mut b, analysis, &u);
    for (i, _) in design.pumps.iter().enumerate() {
        candidate(&mut b, design, analysis, i, &u);
    }
    selection(&mut b, design, analysis, &u);
    checks(&mut b, analysis, &u);
    assumptions(&mut b, design, analysis);
    references(&mut b);
    b.push(Block::PageBreak);
    b.push(Block::heading(1, "Appendix: design file"));
    b.push(Block::Paragraph(vec![
        Span::plain("The file compiled, verbatim. SHA-256: "),
        Span::mono(sha256.to_string()),
    ]));
    b.push(Block::Preformatted {
        lines: source.lines().map(str::to_string).collect(),
        line_numbers: true,
    });

    Document {
        title: format!("{} — {}", p.number, p.title),
        meta: PageMeta {
            header_left: format!("{} · {}", p.title, p.number),
            header_right: rev_text,
            footer_left: format!("source SHA-256 {}…", &sha256[..sha256.len().min(12)]),
        },
        id_seed: sha256.to_string(),
        blocks: b,
    }
}

fn changes_section(b: &mut Vec<Block>, ch: &Changes) {
    b.push(Block::heading(
        1,
        format!("Changes since revision {}", ch.old_revision),
    ));
    b.push(Block::heading(2, "Input changes"));
    if ch.inputs.is_empty() {
        b.push(Block::text("No input changed."));
    } else {
        b.push(Block::Table {
            columns: vec![Column::new("Change", 1.0, Align::Left)],
            rows: ch.inputs.iter().map(|s| vec![s.clone()]).collect(),
            caption: None,
        });
    }
    b.push(Block::heading(2, "Effect on the duty points"));
    b.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.16, Align::Left),
            Column::new("Pump", 0.10, Align::Left),
            Column::new("Quantity", 0.22, Align::Left),
            Column::new("Before", 0.18, Align::Right),
            Column::new("After", 0.18, Align::Right),
            Column::new("Change", 0.16, Align::Right),
        ],
        rows: ch.results.clone(),
        caption: None,
    });
    b.push(Block::heading(2, "Checks whose status changed"));
    if ch.checks.is_empty() {
        b.push(Block::text("No check changed its status."));
    } else {
        b.push(Block::Table {
            columns: vec![
                Column::new("Case", 0.13, Align::Left),
                Column::new("Pump", 0.08, Align::Left),
                Column::new("Check", 0.20, Align::Left),
                Column::new("Before", 0.08, Align::Left),
                Column::new("After", 0.08, Align::Left),
                Column::new("Finding now", 0.43, Align::Left),
            ],
            rows: ch.checks.clone(),
            caption: None,
        });
    }
    b.push(Block::text(ch.recommendation.clone()));
}

fn design_basis(b: &mut Vec<Block>, d: &Design, a: &Analysis, u: &Units) {
    b.push(Block::heading(1, "Design basis"));
    b.push(Block::heading(2, "Fluid and site"));
    let rows: Vec<Vec<String>> = a
        .cases
        .iter()
        .filter_map(|c| c.system.as_ref().map(|s| (c, s)))
        .map(|(c, s)| {
            vec![
                c.name.clone(),
                s.fluid.name.clone(),
                s.fluid
                    .temperature_k
                    .map(|t| u.temperature().fmt(t))
                    .unwrap_or_else(|| "—".into()),
                u.density().fmt(s.fluid.density),
                u.viscosity().fmt(s.fluid.viscosity),
                u.pressure().fmt(s.fluid.vapor_pressure),
                u.pressure().fmt(s.barometric_pa),
            ]
        })
        .collect();
    b.push(Block::Table {
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
    if let Some(s) = a.cases.iter().find_map(|c| c.system.as_ref()) {
        b.push(Block::KeyValue(vec![
            ("Fluid properties".into(), s.fluid.source.clone()),
            ("Barometric pressure".into(), s.barometric_source.clone()),
            (
                "Site elevation".into(),
                u.elevation()
                    .fmt(d.base.site.elevation.get::<uom::si::length::meter>()),
            ),
        ]));
    }
    b.push(Block::heading(2, "Levels and static head"));
    b.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.16, Align::Left),
            Column::new(format!("Source {}", d.base.source.name), 0.17, Align::Right),
            Column::new(
                format!("Destination {}", d.base.destination.name),
                0.19,
                Align::Right,
            ),
            Column::new("Pump centreline", 0.16, Align::Right),
            Column::new("Surface pressures (gauge)", 0.18, Align::Right),
            Column::new("Static head", 0.14, Align::Right),
        ],
        rows: a
            .cases
            .iter()
            .filter_map(|c| c.system.as_ref().map(|s| (c, s)))
            .map(|(c, s)| {
                vec![
                    c.name.clone(),
                    u.elevation().fmt(s.source_level),
                    u.elevation().fmt(s.destination_level),
                    u.elevation().fmt(s.centreline),
                    format!(
                        "{} / {}",
                        u.pressure().fmt(s.source_abs_pa - s.barometric_pa),
                        u.pressure().fmt(s.destination_abs_pa - s.barometric_pa)
                    ),
                    u.head().fmt(s.static_head),
                ]
            })
            .collect(),
        caption: None,
    });
    b.push(Block::heading(2, "Pipe segments"));
    if let Some((c, s)) = a
        .cases
        .iter()
        .find_map(|c| c.system.as_ref().map(|s| (c, s)))
    {
        b.push(Block::Table {
            columns: vec![
                Column::new("Line / seg.", 0.14, Align::Left),
                Column::new("Material and size", 0.22, Align::Left),
                Column::new("Inner diameter", 0.12, Align::Right),
                Column::new("Length", 0.10, Align::Right),
                Column::new("Roughness or C", 0.12, Align::Right),
                Column::new("Sources", 0.30, Align::Left),
            ],
            rows: s
                .segments
                .iter()
                .map(|g| {
                    vec![
                        format!("{} {}", g.line, g.index + 1),
                        format!("{} {}", g.material, g.size_label),
                        u.diameter().fmt(g.inner_diameter),
                        u.length().fmt(g.length),
                        g.hazen_williams_c
                            .map(|c| format!("C = {c}"))
                            .unwrap_or_else(|| u.roughness().fmt(g.roughness)),
                        format!(
                            "diameter: {}; roughness: {}",
                            g.diameter_source, g.roughness_source
                        ),
                    ]
                })
                .collect(),
            caption: Some(format!(
                "Segments as in case {} (roughness follows each case's pipe condition)",
                c.name
            )),
        });
        let q = c.pumps.iter().find_map(|p| p.duty.as_ref().map(|d| d.flow));
        let mut rows = Vec::new();
        for g in &s.segments {
            let re = q.map(|q| s.reynolds(g, q)).unwrap_or(1e5);
            for f in &g.fittings {
                rows.push(vec![
                    format!("{} {}", g.line, g.index + 1),
                    f.spec.name.to_string(),
                    f.count.to_string(),
                    format!(
                        "{:.3}",
                        crate::analysis::system::k_of(f, re, g.inner_diameter)
                    ),
                    f.spec.source.to_string(),
                ]);
            }
        }
        for line in &d.base.lines {
            for (i, seg) in line.segments.iter().enumerate() {
                for l in &seg.losses {
                    let what = match (l.k, l.equivalent_length) {
                        (Some(k), _) => format!("K {k:.3}"),
                        (_, Some(le)) => {
                            format!("L = {}", u.length().fmt(le.get::<uom::si::length::meter>()))
                        }
                        _ => "—".into(),
                    };
                    rows.push(vec![
                        format!("{} {}", line.name, i + 1),
                        "loss".into(),
                        "1".into(),
                        what,
                        format!("given: {}", l.why),
                    ]);
                }
            }
        }
        b.push(Block::heading(2, "Fittings and other losses"));
        b.push(Block::Table {
            columns: vec![
                Column::new("Line / seg.", 0.13, Align::Left),
                Column::new("Fitting", 0.20, Align::Left),
                Column::new("Count", 0.07, Align::Right),
                Column::new("K each", 0.10, Align::Right),
                Column::new("Source of K", 0.50, Align::Left),
            ],
            rows,
            caption: Some(match q {
                Some(q) => format!("K values at the first duty flow of case {} ({}); Reynolds-dependent K change with flow", c.name, u.flow().fmt(q)),
                None => "K values at Re = 10⁵".into(),
            }),
        });
    }
    b.push(Block::heading(2, "Cases"));
    b.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.2, Align::Left),
            Column::new("Hours per year", 0.16, Align::Right),
            Column::new("Overrides of the base design", 0.64, Align::Left),
        ],
        rows: a
            .cases
            .iter()
            .map(|c| {
                vec![
                    c.name.clone(),
                    format!("{:.0} h", c.hours_per_year),
                    if c.overrides.is_empty() {
                        "none (base design)".into()
                    } else {
                        c.overrides.join("; ")
                    },
                ]
            })
            .collect(),
        caption: None,
    });
    b.push(Block::heading(2, "Requirements"));
    if d.requirements.is_empty() {
        b.push(Block::text("The design states no requirements; the checks use the default limits given in the Checks section."));
    } else {
        b.push(Block::Table {
            columns: vec![
                Column::new("Requirement as written", 0.7, Align::Left),
                Column::new("Applies to", 0.3, Align::Left),
            ],
            rows: d
                .requirements
                .iter()
                .map(|r| {
                    vec![
                        r.text.clone(),
                        if r.cases.is_empty() {
                            "every case".into()
                        } else {
                            r.cases.join(", ")
                        },
                    ]
                })
                .collect(),
            caption: None,
        });
    }
}

fn method(b: &mut Vec<Block>, d: &Design) {
    b.push(Block::heading(1, "Method"));
    let paras = [
        "Energy equation between the two free surfaces: the head the pump must add is H(Q) = (z₂ − z₁) + (p₂ − p₁)/(ρ·g) + Σ h_f + Σ h_m, with free-surface velocities negligible, z the surface levels, p the absolute surface pressures and g = 9.80665 m/s².",
        "Wall friction by Darcy-Weisbach, h_f = f·(L/D)·v²/(2g). The friction factor is 64/Re for Re ≤ 2000 (laminar), Colebrook-White (1939) solved to 10⁻¹³ relative for Re ≥ 4000, and in the transition 2000 < Re < 4000 the Churchill (1977) equation scaled to meet both limits (a warning marks operation there). Segments given a Hazen-Williams C use h_f = 10.67·L·Q^1.852/(C^1.852·D^4.8704) (SI form), valid for water near ordinary temperatures.",
        "Minor losses h_m = K·v²/(2g) on the velocity of the segment that carries the fitting. K comes from the Darby (1999) 3-K or Hooper (1981) 2-K methods where those papers give constants (K depends on Reynolds number and size), from Borda-Carnot and the Crane TP-410 formulas for expansions and contractions, or is given in the design with its reason. Equivalent lengths are converted with the segment's friction factor.",
        "Pump curves: published head, efficiency, NPSHr and power points are fitted by least squares (quadratic or cubic), or by the Fritsch-Carlson (1980) monotone cubic where a polynomial would not keep head falling with flow; residuals are reported per curve. The best efficiency point is the maximum of the efficiency fit.",
        "Affinity laws: at speed ratio r, Q ∝ r, H ∝ r², P ∝ r³, efficiency unchanged; NPSHr ∝ r² (common practice). Impeller trim uses the constant-width trim law (Q ∝ D, H ∝ D², P ∝ D³), an approximation to be confirmed by the manufacturer. Identical pumps in parallel share the flow (H(Q/n)); in series they add head (n·H(Q)).",
        "Duty point: the largest-flow crossing of pump (or arrangement) head and system head, found by a 200-interval scan and Brent's (1973) method to 10⁻¹⁰ relative. Variable-speed pumps are set to the speed that meets the case's flow requirement.",
        "NPSH available = p_abs,surface/(ρg) + (z_surface − z_centreline) − h_suction losses − p_vapour/(ρg) (ANSI/HI 9.6.1). Power: hydraulic ρ·g·Q·H, shaft = hydraulic / η_pump, input = shaft / (η_motor·η_drive). Energy per year = input power × hours of each case; life-cycle energy cost as the present worth of a uniform series, discounted at the stated rate with escalation (Hydraulic Institute and Europump, Pump Life Cycle Costs, 2001).",
        "Viscous liquids: for a liquid other than water the pump-performance viscosity parameter B of ANSI/HI 9.6.7 is computed at each duty; above B = 1 a warning asks for the viscosity correction of head, flow and efficiency, which this calculation does not apply to the published water curves.",
    ];
    for p in paras {
        b.push(Block::text(p));
    }
    let _ = d;
}

/// Cases per system-curve table and per plot, so columns and legends stay legible.
pub const CASES_PER_GROUP: usize = 6;

fn group_label(k: usize, groups: usize) -> String {
    if groups > 1 {
        format!(" (part {} of {groups})", k + 1)
    } else {
        String::new()
    }
}

fn system_curves(b: &mut Vec<Block>, a: &Analysis, u: &Units) {
    b.push(Block::heading(1, "System curves"));
    let (fl, hd) = (u.flow(), u.head());
    let cases: Vec<&CaseResult> = a
        .cases
        .iter()
        .filter(|c| !c.system_curve.is_empty())
        .collect();
    let groups = cases.len().div_ceil(CASES_PER_GROUP).max(1);
    for (k, group) in cases.chunks(CASES_PER_GROUP).enumerate() {
        let mut columns = vec![Column::new(
            format!("Flow ({})", fl.label),
            0.16,
            Align::Right,
        )];
        let w = 0.84 / group.len().max(1) as f64;
        for c in group {
            columns.push(Column::new(
                format!("{} ({})", c.name, hd.label),
                w,
                Align::Right,
            ));
        }
        let n = group[0].system_curve.len();
        let rows: Vec<Vec<String>> = (0..n)
            .step_by(2)
            .map(|i| {
                let mut r = vec![fl.num(group[0].system_curve[i].flow)];
                for c in group {
                    r.push(
                        c.system_curve
                            .get(i)
                            .map(|p| hd.num(p.head))
                            .unwrap_or_default(),
                    );
                }
                r
            })
            .collect();
        b.push(Block::Table {
            columns,
            rows,
            caption: Some(format!(
                "System head against flow{}",
                group_label(k, groups)
            )),
        });
        let chart = Chart {
            x_label: format!("Flow ({})", fl.label),
            y_label: format!("Head ({})", hd.label),
            series: group
                .iter()
                .enumerate()
                .map(|(i, c)| Series {
                    name: format!("system, {}", c.name),
                    points: c
                        .system_curve
                        .iter()
                        .map(|p| (fl.value(p.flow), hd.value(p.head)))
                        .collect(),
                    style_index: i,
                    ..Default::default()
                })
                .collect(),
            ..Default::default()
        };
        b.push(Block::Figure {
            chart,
            height_mm: 95.0,
            caption: format!("System curves{}", group_label(k, groups)),
        });
    }
}

fn candidate(b: &mut Vec<Block>, d: &Design, a: &Analysis, i: usize, u: &Units) {
    let p = &d.pumps[i];
    let (fl, hd, pw) = (u.flow(), u.head(), u.power());
    b.push(Block::PageBreak);
    b.push(Block::heading(1, format!("Pump candidate {}", p.name)));
    let arrangement = match p.arrangement {
        crate::model::ArrangementKind::Single => "single pump".to_string(),
        crate::model::ArrangementKind::Parallel => format!("{} in parallel", p.count),
        crate::model::ArrangementKind::Series => format!("{} in series", p.count),
    };
    let mut kv = vec![
        (
            "Description".to_string(),
            if p.description.is_empty() {
                "—".into()
            } else {
                p.description.clone()
            },
        ),
        (
            "Arrangement".into(),
            format!(
                "{arrangement}{}",
                if p.standby > 0 {
                    format!(", {} standby", p.standby)
                } else {
                    String::new()
                }
            ),
        ),
        (
            "Rated speed".into(),
            format!(
                "{:.0} rpm",
                p.rated_speed.get::<uom::si::frequency::cycle_per_minute>()
            ),
        ),
        (
            "Speed or trim".into(),
            match p.adjust {
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
    if let Some(Some(m)) = a.motors.get(i) {
        kv.push((
            "Motor".into(),
            format!(
                "{} per pump, service factor {:.2}",
                m.rating_label, m.service_factor
            ),
        ));
    }
    b.push(Block::KeyValue(kv));
    // Curve data and fit residuals.
    b.push(Block::heading(2, "Published curves and fits"));
    let cc = &a.candidates[i];
    for (k, (data, fit)) in p.curves.iter().zip(&cc.published).enumerate() {
        let label = match data.impeller {
            Some(dm) => format!(
                "Curve {}: impeller {} at {:.0} rpm",
                k + 1,
                u.diameter().fmt(dm.get::<uom::si::length::meter>()),
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
        b.push(Block::Table {
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
    // Head plot.
    let results: Vec<(&CaseResult, &crate::analysis::duty::PumpResult)> = a
        .cases
        .iter()
        .filter_map(|c| c.pumps.get(i).map(|r| (c, r)))
        .collect();
    let all_results = results;
    let groups = all_results.len().div_ceil(CASES_PER_GROUP).max(1);
    for (gk, results) in all_results.chunks(CASES_PER_GROUP).enumerate() {
        let part = group_label(gk, groups);
        let mut series = Vec::new();
        let mut markers = Vec::new();
        for (k, (c, r)) in results.iter().enumerate() {
            series.push(Series {
                name: format!("system, {}", c.name),
                points: c
                    .system_curve
                    .iter()
                    .map(|p| (fl.value(p.flow), hd.value(p.head)))
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
                        p.name,
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
            if let Some(d) = &r.duty {
                markers.push(Marker {
                    x: fl.value(d.flow),
                    y: hd.value(d.head),
                    label: format!("{}: {} @ {}", c.name, fl.fmt(d.flow), hd.fmt(d.head)),
                    axis: YAxis::Left,
                });
            }
        }
        // The whole published family (each impeller or speed), thin and dotted, when there are several.
        let cc = &a.candidates[i];
        if cc.published_head_samples.len() > 1 {
            let good: Vec<&crate::model::CurveData> = p
                .curves
                .iter()
                .zip(&cc.published)
                .filter(|(_, r)| r.is_ok())
                .map(|(c, _)| c)
                .collect();
            for (data, pts) in good.iter().zip(&cc.published_head_samples) {
                let label = match data.impeller {
                    Some(dm) => format!(
                        "published {} at {:.0} rpm",
                        u.diameter().fmt(dm.get::<uom::si::length::meter>()),
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
        b.push(Block::Figure {
        chart: Chart { x_label: format!("Flow ({})", fl.label), y_label: format!("Head ({})", hd.label), y2_label: Some("Efficiency (%)".into()), y2_range: Some((0.0, 100.0)), series, points: markers, ..Default::default() },
        height_mm: 110.0,
        caption: format!("Pump {}: head curves as run in each case, system curves and duty points; efficiency on the right axis{part}", p.name),
    });
        // NPSH plot.
        let mut series = Vec::new();
        let mut markers = Vec::new();
        for (k, (c, r)) in results.iter().enumerate() {
            let npshr: Vec<(f64, f64)> = r
                .operating_curve
                .iter()
                .filter_map(|q| q.npshr.map(|n| (fl.value(q.flow), hd.value(n))))
                .collect();
            if !npshr.is_empty()
                && (k == 0 || results[k - 1].1.operating_curve != r.operating_curve)
            {
                series.push(Series {
                    name: format!("NPSHr ({})", c.name),
                    points: npshr,
                    style_index: k,
                    ..Default::default()
                });
            }
            if let Some(d) = &r.duty {
                markers.push(Marker {
                    x: fl.value(d.flow),
                    y: hd.value(d.npsh_available),
                    label: format!("NPSHa {}: {}", c.name, hd.fmt(d.npsh_available)),
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
                    .map(|(p, n)| (fl.value(p.flow), hd.value(*n)))
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
        b.push(Block::Figure {
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
                p.name
            ),
        });
        // Power plot.
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
                        .map(|w| (fl.value(q.flow), pw.value(w / p.count.max(1) as f64)))
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
        if let Some(Some(m)) = a.motors.get(i) {
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
        let per = p.count.max(1) as f64;
        let markers: Vec<Marker> = results
            .iter()
            .filter_map(|(c, r)| {
                let d = r.duty.as_ref()?;
                let s = d.shaft_power?;
                Some(Marker {
                    x: fl.value(d.flow),
                    y: pw.value(s / per),
                    label: format!("{}: {}", c.name, pw.fmt(s / per)),
                    axis: YAxis::Left,
                })
            })
            .collect();
        b.push(Block::Figure {
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
            "Pump {}: shaft power per pump along the curve, duty points and the motor rating{part}", p.name),
    });
    }
    let results = all_results;
    // Duty table.
    b.push(Block::heading(2, format!("Duty points of {}", p.name)));
    let rows: Vec<Vec<String>> = results
        .iter()
        .map(|(c, r)| match &r.duty {
            Some(d) => vec![
                c.name.clone(),
                format!("{:.0}", r.speed_rpm),
                fl.num(d.flow),
                hd.num(d.head),
                d.efficiency.map(percent).unwrap_or_else(|| "—".into()),
                d.flow_ratio_to_bep
                    .map(|x| format!("{:.0} %", x * 100.0))
                    .unwrap_or_else(|| "—".into()),
                format!(
                    "{} / {}",
                    hd.num(d.npsh_available),
                    d.npsh_required
                        .map(|n| hd.num(n))
                        .unwrap_or_else(|| "—".into())
                ),
                format!(
                    "{} / {}",
                    d.suction_velocity
                        .map(|v| u.velocity().num(v))
                        .unwrap_or_default(),
                    d.discharge_velocity
                        .map(|v| u.velocity().num(v))
                        .unwrap_or_default()
                ),
                d.shaft_power
                    .map(|s| pw.num(s))
                    .unwrap_or_else(|| "—".into()),
                d.input_power
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
    b.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.12, Align::Left),
            Column::new("Speed (rpm)", 0.08, Align::Right),
            Column::new(format!("Flow ({})", fl.label), 0.09, Align::Right),
            Column::new(format!("Head ({})", hd.label), 0.09, Align::Right),
            Column::new("Eff.", 0.10, Align::Right),
            Column::new("Flow / BEP", 0.08, Align::Right),
            Column::new(format!("NPSHa / NPSHr ({})", hd.label), 0.13, Align::Right),
            Column::new(format!("Velocity suct. / disch. ({})", u.velocity().label), 0.13, Align::Right),
            Column::new(format!("Shaft ({})", pw.label), 0.09, Align::Right),
            Column::new(format!("Input ({})", pw.label), 0.09, Align::Right),
        ],
        rows,
        caption: Some(format!("Flow, head and power are for the whole arrangement ({arrangement}); efficiency, BEP ratio and NPSHr per pump")),
    });
    let warnings: Vec<String> = results
        .iter()
        .flat_map(|(c, r)| r.warnings.iter().map(move |w| format!("{}: {w}", c.name)))
        .collect();
    if !warnings.is_empty() {
        b.push(Block::heading(2, format!("Remarks on {}", p.name)));
        for w in dedup(warnings) {
            b.push(Block::note(w));
        }
    }
}

fn dedup(v: Vec<String>) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for s in v {
        if !out.contains(&s) {
            out.push(s);
        }
    }
    out
}

fn selection(b: &mut Vec<Block>, d: &Design, a: &Analysis, u: &Units) {
    b.push(Block::heading(1, "Selection"));
    let s = &a.selection;
    b.push(Block::text(s.criteria_text.clone()));
    let cur = &d.energy.currency;
    b.push(Block::Table {
        columns: vec![
            Column::new("Rank", 0.07, Align::Right),
            Column::new("Candidate", 0.12, Align::Left),
            Column::new("Energy per year", 0.14, Align::Right),
            Column::new("Cost per year", 0.13, Align::Right),
            Column::new("Life energy cost", 0.14, Align::Right),
            Column::new("Mean efficiency", 0.11, Align::Right),
            Column::new("Qualifies", 0.29, Align::Left),
        ],
        rows: s
            .ranking
            .iter()
            .enumerate()
            .map(|(k, r)| {
                vec![
                    (k + 1).to_string(),
                    r.name.clone(),
                    r.annual_energy_j
                        .map(|e| u.energy().fmt(e))
                        .unwrap_or_else(|| "—".into()),
                    r.annual_cost
                        .map(|c| format!("{c:.0} {cur}"))
                        .unwrap_or_else(|| "—".into()),
                    r.life_cost
                        .map(|c| format!("{c:.0} {cur}"))
                        .unwrap_or_else(|| "—".into()),
                    r.mean_efficiency.map(percent).unwrap_or_else(|| "—".into()),
                    r.why.clone(),
                ]
            })
            .collect(),
        caption: None,
    });
    match (&s.recommended, &s.refusal) {
        (Some(n), _) => b.push(Block::Paragraph(vec![Span::bold(format!("Recommended: pump {n}. ")), Span::plain("Subject to certified curves from the manufacturer and the review of this calculation.")])),
        (None, Some(why)) => b.push(Block::Paragraph(vec![Span::bold("No candidate is recommended. "), Span::plain(why.clone())])),
        _ => {}
    }
}

fn checks(b: &mut Vec<Block>, a: &Analysis, u: &Units) {
    b.push(Block::heading(1, "Checks"));
    b.push(Block::text("Every check of every case and candidate, with its status and where its limit comes from. A fail disqualifies the candidate; a warning asks for the reviewer's attention."));
    let mut rows = Vec::new();
    for c in &a.cases {
        for p in &c.pumps {
            for ch in &p.checks {
                let mark = match ch.status {
                    Status::Pass => "pass",
                    Status::Warn => "WARN",
                    Status::Fail => "FAIL",
                };
                rows.push(vec![
                    c.name.clone(),
                    p.name.clone(),
                    ch.id.to_string(),
                    mark.to_string(),
                    ch.message.clone(),
                    ch.source.clone(),
                ]);
            }
        }
    }
    let _ = u;
    b.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.11, Align::Left),
            Column::new("Pump", 0.07, Align::Left),
            Column::new("Check", 0.13, Align::Left),
            Column::new("Status", 0.08, Align::Left),
            Column::new("Finding", 0.39, Align::Left),
            Column::new("Source of the limit", 0.22, Align::Left),
        ],
        rows,
        caption: None,
    });
}

fn assumptions(b: &mut Vec<Block>, d: &Design, a: &Analysis) {
    b.push(Block::heading(1, "Assumptions, notes and cautions"));
    b.push(Block::heading(2, "Assumptions of the design"));
    if d.assumptions.is_empty() {
        b.push(Block::text("The design file states no assumptions."));
    }
    for s in &d.assumptions {
        b.push(Block::text(format!("• {s}")));
    }
    b.push(Block::heading(2, "Assumptions of the method"));
    for s in [
        "Steady flow; free-surface velocities are negligible; the suction and discharge lines each run in series from one source to one destination.",
        "Identical pumps in parallel share one suction and one discharge line in this model; branch losses of individual pumps are not modelled unless given as fittings.",
        "Published pump curves are taken as given; no tolerance (ISO 9906 acceptance grades) is applied to them.",
        "Motor efficiency is the design's value or a stated default; it is held constant over the load range.",
    ] {
        b.push(Block::text(format!("• {s}")));
    }
    if !d.notes.is_empty() {
        b.push(Block::heading(2, "Notes"));
        for n in &d.notes {
            b.push(Block::note(n.clone()));
        }
    }
    if !a.warnings.is_empty() {
        b.push(Block::heading(2, "Warnings of the analysis"));
        for w in &a.warnings {
            b.push(Block::note(w.message.clone()));
        }
    }
    b.push(Block::heading(2, "Cautions"));
    for c in [
        "The results depend on the pump manufacturer's certified curves and on the installed conditions. Confirm every selected duty point, NPSH required and motor rating against certified test data before purchase.",
        "Surge and water hammer, pipe pressure ratings, thrust restraint, structural supports, electrical design and controls are outside this calculation unless shown in it. Pump trips and valve closures on long mains can raise pressures far above the steady values here.",
        "Cavitation damages pumps: an NPSH margin below the limits shown must be resolved before the design proceeds. A motor that overloads at run-out needs protection or a larger rating.",
        "This work is to be reviewed by a licensed engineer and checked against the codes and the authority having jurisdiction where the system is built.",
    ] {
        b.push(Block::caution(c));
    }
}

fn references(b: &mut Vec<Block>) {
    b.push(Block::heading(1, "References"));
    for r in [
        "IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the Thermodynamic Properties of Water and Steam (IAPWS-IF97).",
        "IAPWS R12-08(2008), Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water Substance.",
        "U.S. Standard Atmosphere, 1976. NOAA, NASA, USAF, Washington D.C.; ISO 2533:1975 Standard Atmosphere.",
        "Colebrook, C.F. (1939), Turbulent flow in pipes, with particular reference to the transition region between the smooth and rough pipe laws. J. Inst. Civil Eng. 11, 133–156.",
        "Churchill, S.W. (1977), Friction-factor equation spans all fluid-flow regimes. Chemical Engineering 84(24), 91–92.",
        "Moody, L.F. (1944), Friction factors for pipe flow. Trans. ASME 66, 671–684.",
        "Williams, G.S. and Hazen, A. (1920), Hydraulic Tables, 3rd ed. Wiley, New York.",
        "Hooper, W.B. (1981), The two-K method predicts head losses in pipe fittings. Chemical Engineering, 24 August 1981, 96–100.",
        "Darby, R. (1999), Correlate pressure drops through fittings. Chemical Engineering 106(7), July 1999, 101–104.",
        "Crane Co. (2009), Flow of Fluids through Valves, Fittings and Pipe, Technical Paper No. 410.",
        "ASME B36.10M and B36.19M, Welded and Seamless Wrought Steel Pipe; Stainless Steel Pipe. ASTM D1785 (PVC pipe), ASTM B88 (copper tube), AWWA C151/A21.51 (ductile iron pipe), ASTM F714 (PE pipe).",
        "Fritsch, F.N. and Carlson, R.E. (1980), Monotone piecewise cubic interpolation. SIAM J. Numer. Anal. 17(2), 238–246.",
        "Brent, R.P. (1973), Algorithms for Minimization without Derivatives. Prentice-Hall, ch. 4.",
        "ANSI/HI 9.6.1, Rotodynamic Pumps Guideline for NPSH Margin; ANSI/HI 9.6.3, Rotodynamic Pumps Guideline for Allowable Operating Region. Hydraulic Institute.",
        "NEMA MG 1, Motors and Generators; IEC 60072-1, Dimensions and output series for rotating electrical machines.",
        "Hydraulic Institute and Europump (2001), Pump Life Cycle Costs: A Guide to LCC Analysis for Pumping Systems.",
        "NIST Special Publication 811 (2008), Guide for the Use of the International System of Units, Appendix B.",
    ] {
        b.push(Block::text(r));
    }
}
