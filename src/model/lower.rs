//! Lowering the syntax tree to a [`Design`]: top-level statements.

use uom::si::f64::{Length, Time};
use uom::si::{length::meter, time::second};

use super::design::*;
use super::eval::{self, expect_dim, expect_number, Env};
use super::fields::{block_name, missing, read_fields};
use super::scenario::{self, expect_length, lower_fluid, lower_segments};
use super::{pumps, FileAccess};
use crate::diagnostics::{Diagnostic, Span};
use crate::names::nearest;
use crate::syntax::ast::{Arg, ArgKind, File, Statement, StatementKind};
use crate::units::Dimension;

/// Most cases, lines, segments and pumps accepted (grammar/LANGUAGE.md, "Limits").
pub const MAX_CASES: usize = 200;
pub const MAX_SEGMENTS: usize = 100;
pub const MAX_PUMPS: usize = 20;

const TOP_LEVEL: &[&str] = &[
    "project", "revision", "purpose", "fluid", "site", "tank", "station", "line", "case",
    "require", "pump", "motor", "energy", "assume", "note",
];
const ONCE: &[&str] = &[
    "project", "purpose", "fluid", "site", "station", "require", "motor", "energy",
];

/// A top-level block: keyword, arguments, body, span.
type TopBlock<'a> = (&'static str, &'a [Arg], Option<&'a [Statement]>, Span);

/// Lower a parsed file. Returns the design when there were no errors, and all diagnostics.
pub fn lower(
    file: &File,
    source: &str,
    files: &dyn FileAccess,
) -> (Option<Design>, Vec<Diagnostic>) {
    let text = |s: Span| source.get(s.start..s.end).unwrap_or("").to_string();
    let mut d: Vec<Diagnostic> = Vec::new();
    let mut env = Env::default();
    // Constants first, in file order.
    for st in &file.statements {
        if let StatementKind::Let { name, value } = &st.kind {
            if let Some((_, prev)) = env.constants.get(&name.name) {
                d.push(
                    Diagnostic::error(
                        "duplicate-name",
                        format!("`{}` is defined twice", name.name),
                        Some(name.span),
                    )
                    .with_secondary(*prev, "first defined here")
                    .with_help("give each constant its own name"),
                );
                continue;
            }
            match eval::eval(value, &env) {
                Ok(v) => {
                    env.constants.insert(name.name.clone(), (v, name.span));
                }
                Err(e) => d.push(e),
            }
        }
    }
    // Group the other statements by keyword, checking names and singletons.
    let mut seen: Vec<(&str, Span)> = Vec::new();
    let mut blocks: Vec<TopBlock> = Vec::new();
    for st in &file.statements {
        match &st.kind {
            StatementKind::Let { .. } => {}
            StatementKind::Block { keyword, args, body } => {
                let kw = keyword.name.as_str();
                if kw == "include" {
                    d.push(
                        Diagnostic::error("reserved", "`include` is reserved for a later version of the language", Some(keyword.span))
                            .with_help("for now a design is one file; curve tables can come from CSV with `curve ... from \"file.csv\"`"),
                    );
                    continue;
                }
                let Some(known) = TOP_LEVEL.iter().find(|k| **k == kw) else {
                    let near = nearest(kw, TOP_LEVEL.iter().copied());
                    d.push(
                        Diagnostic::error("unknown-statement", format!("`{kw}` is not a statement of the language"), Some(keyword.span))
                            .with_label("unknown keyword")
                            .with_help(if near.is_empty() {
                                format!("statements are {}", eval::quote_list(TOP_LEVEL))
                            } else {
                                format!("did you mean {}?", eval::quote_list(&near))
                            }),
                    );
                    continue;
                };
                if ONCE.contains(known) {
                    if let Some((_, prev)) = seen.iter().find(|(k, _)| k == known) {
                        d.push(
                            Diagnostic::error("duplicate-block", format!("`{kw}` may appear only once"), Some(keyword.span))
                                .with_secondary(*prev, "first given here")
                                .with_help("merge the two into one"),
                        );
                        continue;
                    }
                }
                seen.push((known, keyword.span));
                blocks.push((known, args, body.as_deref(), st.span));
            }
            StatementKind::Assign { path, .. } => d.push(
                Diagnostic::error("stray-field", format!("`{}` is set outside any block", path.dotted()), Some(path.span))
                    .with_help("fields go inside a block such as `project { ... }`; constants are written `let name = value`"),
            ),
            StatementKind::Condition { path, .. } => d.push(
                Diagnostic::error("stray-requirement", "a requirement outside `require { ... }`", Some(path.span))
                    .with_help("put requirements inside `require { ... }`"),
            ),
            StatementKind::Curve { keyword, .. } => d.push(
                Diagnostic::error("stray-curve", "a curve outside a pump", Some(keyword.span)).with_help("curves belong inside `pump NAME { ... }`"),
            ),
        }
    }
    let of = |k: &'static str| blocks.iter().filter(move |b| b.0 == k);
    let empty: &[Statement] = &[];

    // Project, revisions, texts.
    let mut project = Project::default();
    if let Some((_, _, body, _)) = of("project").next() {
        lower_project(&mut project, body.unwrap_or(empty), &env, &mut d);
    } else {
        d.push(missing(
            "project",
            "the design",
            Span::new(0, 0),
            "project { title = \"...\", number = \"...\" }",
        ));
    }
    let mut revisions = Vec::new();
    for (_, args, _, span) in of("revision") {
        match args {
            [id, Arg {
                kind: ArgKind::Date(date),
                ..
            }, Arg {
                kind: ArgKind::Text(text),
                ..
            }] => {
                let id_text = match &id.kind {
                    ArgKind::Word(w) => w.clone(),
                    ArgKind::Number(n) => n.text.clone(),
                    _ => String::new(),
                };
                if id_text.is_empty() {
                    d.push(Diagnostic::error(
                        "bad-revision",
                        "a revision id is a word or number such as `A` or `2`",
                        Some(id.span),
                    ));
                } else if let Err(msg) = check_date(date) {
                    d.push(Diagnostic::error("bad-date", msg, Some(args[1].span)));
                } else {
                    revisions.push(Revision {
                        id: id_text,
                        date: date.clone(),
                        description: text.clone(),
                    });
                }
            }
            _ => d.push(
                Diagnostic::error(
                    "bad-revision",
                    "a revision is `revision ID YYYY-MM-DD \"description\"`",
                    Some(*span),
                )
                .with_help("e.g. `revision B 2026-11-30 \"Dry-season case added\"`"),
            ),
        }
    }
    let text_of = |k: &'static str, d: &mut Vec<Diagnostic>| -> Vec<String> {
        of(k)
            .filter_map(|(_, args, _, span)| match args {
                [Arg {
                    kind: ArgKind::Text(t),
                    ..
                }] => Some(t.clone()),
                _ => {
                    d.push(
                        Diagnostic::error(
                            "bad-text",
                            format!("`{k}` takes one quoted text"),
                            Some(*span),
                        )
                        .with_help(format!("write `{k} \"...\"`")),
                    );
                    None
                }
            })
            .collect()
    };
    let purpose = text_of("purpose", &mut d).into_iter().next();
    let assumptions = text_of("assume", &mut d);
    let notes = text_of("note", &mut d);

    // The physical setting.
    let fluid = match of("fluid").next() {
        Some((_, args, body, span)) => {
            lower_fluid(args, body.unwrap_or(empty), *span, &env, &mut d)
        }
        None => {
            d.push(missing(
                "fluid",
                "the design",
                Span::new(0, 0),
                "fluid water { temperature = 15 degC }",
            ));
            None
        }
    };
    let mut site = Site {
        elevation: Length::new::<meter>(0.0),
        barometric_pressure: None,
    };
    match of("site").next() {
        Some((_, _, body, _)) => {
            let f = read_fields(body.unwrap_or(empty), "site", scenario::SITE_FIELDS, &mut d);
            for field in &f.fields {
                if let Err(e) = scenario::set_site(&mut site, field.name, field.value, &env) {
                    d.push(e);
                }
            }
        }
        None => d.push(
            Diagnostic::warning(
                "site-assumed",
                "no `site` given: sea level (101.325 kPa) is assumed for NPSH available",
                None,
            )
            .with_help("add `site { elevation = 350 m }` or `site { pressure = 97 kPa }`"),
        ),
    }
    let mut centreline = None;
    if let Some((_, _, body, span)) = of("station").next() {
        let f = read_fields(body.unwrap_or(empty), "station", &["centreline"], &mut d);
        match f.get("centreline") {
            Some(c) => match expect_length(c.value, &env, "pump centreline") {
                Ok(v) => centreline = Some(v),
                Err(e) => d.push(e),
            },
            None => d.push(missing(
                "centreline",
                "station",
                *span,
                "centreline = 101.5 m",
            )),
        }
    } else {
        d.push(missing(
            "station",
            "the design",
            Span::new(0, 0),
            "station { centreline = 101.5 m }",
        ));
    }

    let mut tanks: Vec<Tank> = Vec::new();
    for (_, args, body, span) in of("tank") {
        let Some((name, name_span)) = block_name(
            args,
            *span,
            "bad-tank",
            "a tank",
            "tank sump { level = 101.2 m }",
            &mut d,
        ) else {
            continue;
        };
        if name == "pump" {
            d.push(Diagnostic::error(
                "reserved-name",
                "`pump` names the pump end of a line; choose another tank name",
                Some(name_span),
            ));
            continue;
        }
        if let Some(prev) = tanks.iter().find(|t| &t.name == name) {
            d.push(
                Diagnostic::error(
                    "duplicate-name",
                    format!("tank `{name}` is defined twice"),
                    Some(name_span),
                )
                .with_secondary(prev.span, "first defined here"),
            );
            continue;
        }
        let mut tank = Tank {
            name: name.clone(),
            level: Length::new::<meter>(0.0),
            surface_pressure: SurfacePressure::Gauge(scenario::pressure(0.0)),
            span: name_span,
        };
        let f = read_fields(
            body.unwrap_or(empty),
            &format!("tank {name}"),
            scenario::TANK_FIELDS,
            &mut d,
        );
        if f.get("level").is_none() {
            d.push(missing(
                "level",
                &format!("tank {name}"),
                *span,
                "level = 101.2 m",
            ));
        }
        for field in &f.fields {
            if let Err(e) = scenario::set_tank(&mut tank, field.name, field.value, &env) {
                d.push(e);
            }
        }
        tanks.push(tank);
    }

    let mut lines: Vec<Line> = Vec::new();
    let mut segment_total = 0;
    let errors_before_lines = d.iter().filter(|x| x.is_error()).count();
    for (_, args, body, span) in of("line") {
        let (name, name_span, from, to) = match args {
            [Arg {
                kind: ArgKind::Word(n),
                span: ns,
            }, Arg {
                kind: ArgKind::Word(f),
                ..
            }, a, Arg {
                kind: ArgKind::Word(t),
                ..
            }, b]
                if f == "from" && t == "to" =>
            {
                match (&a.kind, &b.kind) {
                    (ArgKind::Word(x), ArgKind::Word(y)) => {
                        (n.clone(), *ns, (x.clone(), a.span), (y.clone(), b.span))
                    }
                    _ => {
                        d.push(bad_line(*span));
                        continue;
                    }
                }
            }
            _ => {
                d.push(bad_line(*span));
                continue;
            }
        };
        if let Some(prev) = lines.iter().find(|l| l.name == name) {
            d.push(
                Diagnostic::error(
                    "duplicate-name",
                    format!("line `{name}` is defined twice"),
                    Some(name_span),
                )
                .with_secondary(prev.span, "first defined here"),
            );
            continue;
        }
        let side = match (from.0 == "pump", to.0 == "pump") {
            (false, true) => Side::Suction,
            (true, false) => Side::Discharge,
            _ => {
                d.push(
                    Diagnostic::error("bad-line", "a line runs from a tank to `pump` (suction) or from `pump` to a tank (discharge)", Some(*span))
                        .with_help("e.g. `line suction from sump to pump { ... }`"),
                );
                continue;
            }
        };
        let tank_end = if side == Side::Suction { &from } else { &to };
        if !tanks.iter().any(|t| t.name == tank_end.0) {
            let near = nearest(&tank_end.0, tanks.iter().map(|t| t.name.as_str()));
            d.push(
                Diagnostic::error(
                    "unknown-name",
                    format!("there is no tank `{}`", tank_end.0),
                    Some(tank_end.1),
                )
                .with_label("unknown tank")
                .with_help(if near.is_empty() {
                    "define it with `tank NAME { level = ... }`".to_string()
                } else {
                    format!("did you mean {}?", eval::quote_list(&near))
                }),
            );
            continue;
        }
        let segments = lower_segments(body.unwrap_or(empty), &env, &mut d);
        segment_total += segments.len();
        if segments.is_empty() && body.is_some_and(|b| b.is_empty()) || body.is_none() {
            d.push(
                Diagnostic::error(
                    "empty-line",
                    format!("line `{name}` has no pipe"),
                    Some(name_span),
                )
                .with_help("add `pipe MATERIAL SIZE { length = ... }`"),
            );
        }
        lines.push(Line {
            name,
            side,
            from: from.0,
            to: to.0,
            segments,
            span: name_span,
        });
    }
    if segment_total > MAX_SEGMENTS {
        d.push(Diagnostic::error(
            "too-many",
            format!(
                "the design has {segment_total} pipe segments; at most {MAX_SEGMENTS} are accepted"
            ),
            None,
        ));
    }
    let line_failed = d.iter().filter(|x| x.is_error()).count() > errors_before_lines;
    let suction_tanks: Vec<&str> = lines
        .iter()
        .filter(|l| l.side == Side::Suction)
        .map(|l| l.from.as_str())
        .collect();
    let discharge_tanks: Vec<&str> = lines
        .iter()
        .filter(|l| l.side == Side::Discharge)
        .map(|l| l.to.as_str())
        .collect();
    let ends = |names: &[&str], what: &str, d: &mut Vec<Diagnostic>| -> Option<Tank> {
        let first = names.first()?;
        if names.iter().any(|n| n != first) {
            d.push(Diagnostic::error("bad-line", format!("all {what} lines must connect to the same tank"), None)
                .with_help("dutyline analyses one source and one destination; lines on one side run in series in file order"));
            return None;
        }
        tanks.iter().find(|t| t.name == *first).cloned()
    };
    let source = ends(&suction_tanks, "suction", &mut d);
    let destination = ends(&discharge_tanks, "discharge", &mut d);
    if !line_failed && !lines.is_empty() && source.is_none() && suction_tanks.is_empty() {
        d.push(
            Diagnostic::error("missing-line", "the design has no suction line", None)
                .with_help("add `line suction from SOURCE to pump { ... }`"),
        );
    }
    if !line_failed && !lines.is_empty() && destination.is_none() && discharge_tanks.is_empty() {
        d.push(
            Diagnostic::error("missing-line", "the design has no discharge line", None)
                .with_help("add `line discharge from pump to DESTINATION { ... }`"),
        );
    }
    if lines.is_empty() && !line_failed {
        d.push(missing(
            "line",
            "the design",
            Span::new(0, 0),
            "line suction from sump to pump { ... }",
        ));
    }

    // Pumps.
    let mut pump_list: Vec<PumpCandidate> = Vec::new();
    for (_, args, body, span) in of("pump") {
        if let Some(p) = pumps::lower_pump(args, body.unwrap_or(empty), *span, &env, files, &mut d)
        {
            if let Some(prev) = pump_list.iter().find(|q| q.name == p.name) {
                d.push(
                    Diagnostic::error(
                        "duplicate-name",
                        format!("pump `{}` is defined twice", p.name),
                        Some(*span),
                    )
                    .with_secondary(prev.span, "first defined here"),
                );
                continue;
            }
            pump_list.push(p);
        }
    }
    if pump_list.len() > MAX_PUMPS {
        d.push(Diagnostic::error(
            "too-many",
            format!(
                "the design has {} pumps; at most {MAX_PUMPS} are accepted",
                pump_list.len()
            ),
            None,
        ));
    }
    if pump_list.is_empty() && !of("pump").any(|_| true) {
        d.push(Diagnostic::warning(
            "no-pumps",
            "the design has no pump candidates: only system curves are computed",
            None,
        ));
    }

    let motor = lower_motor(
        of("motor").next().and_then(|b| b.2),
        project.units,
        &env,
        &mut d,
    );
    let energy = lower_energy(of("energy").next().and_then(|b| b.2), &env, &mut d);

    let base = match (fluid, source, destination, centreline) {
        (Some(fluid), Some(source), Some(destination), Some(centreline)) => Some(Scenario {
            fluid,
            site,
            source,
            destination,
            centreline,
            lines,
            pipe_condition: PipeCondition::New,
            hours_per_year: Time::new::<second>(0.0),
            pump_speeds: pump_list
                .iter()
                .map(|p| (p.name.clone(), p.rated_speed))
                .collect(),
        }),
        _ => None,
    };

    // Cases: the base plus overrides.
    let mut cases: Vec<Case> = Vec::new();
    for (_, args, body, span) in of("case") {
        let Some((name, name_span)) =
            block_name(args, *span, "bad-case", "a case", "case normal { }", &mut d)
        else {
            continue;
        };
        if let Some(prev) = cases.iter().find(|c| &c.name == name) {
            d.push(
                Diagnostic::error(
                    "duplicate-name",
                    format!("case `{name}` is defined twice"),
                    Some(name_span),
                )
                .with_secondary(prev.span, "first defined here"),
            );
            continue;
        }
        let Some(base) = &base else { continue };
        let mut sc = base.clone();
        let mut overrides = Vec::new();
        let src = body.unwrap_or(empty);
        let mut set: Vec<(String, Span)> = Vec::new();
        for st in src {
            match &st.kind {
                StatementKind::Assign { path, value } => {
                    let dotted = path.dotted();
                    if let Some((_, prev)) = set.iter().find(|(p, _)| *p == dotted) {
                        d.push(
                            Diagnostic::error(
                                "duplicate-field",
                                format!("case `{name}` sets `{dotted}` twice"),
                                Some(path.span),
                            )
                            .with_secondary(*prev, "first set here"),
                        );
                        continue;
                    }
                    set.push((dotted.clone(), path.span));
                    match scenario::apply_override(&mut sc, path, value, &env) {
                        Ok(()) => overrides.push(format!("{dotted} = {}", text(value.span))),
                        Err(e) => d.push(e),
                    }
                }
                _ => d.push(Diagnostic::error(
                    "unexpected",
                    "a case holds only overrides such as `sump.level = 101.0 m`",
                    Some(st.span),
                )),
            }
        }
        cases.push(Case {
            name: name.clone(),
            scenario: sc,
            overrides,
            span: name_span,
        });
    }
    if cases.len() > MAX_CASES {
        d.push(Diagnostic::error(
            "too-many",
            format!(
                "the design has {} cases; at most {MAX_CASES} are accepted",
                cases.len()
            ),
            None,
        ));
    }
    if cases.is_empty() {
        if let Some(base) = &base {
            d.push(
                Diagnostic::warning(
                    "no-cases",
                    "no `case` given: the base design is analysed as case `design`",
                    None,
                )
                .with_help("add `case normal { }` and cases for low levels and aged pipe"),
            );
            cases.push(Case {
                name: "design".into(),
                scenario: base.clone(),
                overrides: Vec::new(),
                span: Span::new(0, 0),
            });
        }
    }

    let requirements = match of("require").next() {
        Some((_, _, body, _)) => {
            lower_requirements(body.unwrap_or(empty), &cases, &env, &text, &mut d)
        }
        None => Vec::new(),
    };

    let has_errors = d.iter().any(|x| x.is_error());
    let design = match base {
        Some(base) if !has_errors => Some(Design {
            project,
            revisions,
            purpose,
            assumptions,
            notes,
            base,
            cases,
            requirements,
            pumps: pump_list,
            motor,
            energy,
        }),
        _ => None,
    };
    (design, d)
}

fn bad_line(span: Span) -> Diagnostic {
    Diagnostic::error(
        "bad-line",
        "a line is `line NAME from A to B { ... }`",
        Some(span),
    )
    .with_help("e.g. `line discharge from pump to reservoir { ... }`")
}

fn check_date(date: &str) -> Result<(), String> {
    let parts: Vec<u32> = date.split('-').filter_map(|p| p.parse().ok()).collect();
    match parts.as_slice() {
        [_, m, day] if (1..=12).contains(m) && (1..=31).contains(day) => Ok(()),
        _ => Err(format!("`{date}` is not a valid date (YYYY-MM-DD)")),
    }
}

const PROJECT_FIELDS: &[&str] = &[
    "title", "number", "client", "prepared", "checked", "approved", "units", "style",
];

fn lower_project(p: &mut Project, body: &[Statement], env: &Env, d: &mut Vec<Diagnostic>) {
    let f = read_fields(body, "project", PROJECT_FIELDS, d);
    for field in &f.fields {
        let r = match field.name {
            "units" => {
                eval::expect_word(field.value, env, "report units", &["us", "si"]).map(|w| {
                    p.units = if w == "us" {
                        ReportUnits::Us
                    } else {
                        ReportUnits::Si
                    };
                })
            }
            "style" => match eval::eval(field.value, env) {
                Ok(eval::Value::Word(w)) | Ok(eval::Value::Text(w)) => {
                    p.style = Some(w);
                    p.style_span = Some(field.value.span);
                    Ok(())
                }
                Ok(other) => Err(Diagnostic::error(
                    "expected-word",
                    format!(
                        "style: expected a style name or a quoted path, found {}",
                        other.describe()
                    ),
                    Some(field.value.span),
                )),
                Err(e) => Err(e),
            },
            name => eval::expect_text(field.value, env, name).map(|t| {
                let slot = match name {
                    "title" => &mut p.title,
                    "number" => &mut p.number,
                    "client" => &mut p.client,
                    "prepared" => &mut p.prepared,
                    "checked" => &mut p.checked,
                    _ => &mut p.approved,
                };
                *slot = t;
            }),
        };
        if let Err(e) = r {
            d.push(e);
        }
    }
    if p.title.is_empty() {
        d.push(
            Diagnostic::warning("no-title", "the project has no title", None)
                .with_help("add `title = \"...\"` to `project`"),
        );
    }
}

fn lower_motor(
    body: Option<&[Statement]>,
    units: ReportUnits,
    env: &Env,
    d: &mut Vec<Diagnostic>,
) -> MotorSettings {
    let standard = if units == ReportUnits::Us {
        MotorStandardChoice::Nema
    } else {
        MotorStandardChoice::Iec
    };
    let mut m = MotorSettings {
        standard,
        service_factor: f64::NAN,
        efficiency: None,
        drive_efficiency: None,
    };
    let f = read_fields(
        body.unwrap_or(&[]),
        "motor",
        &[
            "standard",
            "service_factor",
            "efficiency",
            "drive_efficiency",
        ],
        d,
    );
    for field in &f.fields {
        let r: Result<(), Diagnostic> = (|| {
            match field.name {
                "standard" => {
                    m.standard =
                        if eval::expect_word(field.value, env, "motor standard", &["nema", "iec"])?
                            == "nema"
                        {
                            MotorStandardChoice::Nema
                        } else {
                            MotorStandardChoice::Iec
                        }
                }
                "service_factor" => {
                    let v = expect_number(field.value, env, "service factor")?;
                    if !(1.0..=1.5).contains(&v) {
                        return Err(Diagnostic::error(
                            "out-of-range",
                            "a service factor lies between 1.0 and 1.5",
                            Some(field.value.span),
                        ));
                    }
                    m.service_factor = v;
                }
                name => {
                    let v = expect_number(field.value, env, name)?;
                    if !(v > 0.3 && v <= 1.0) {
                        return Err(Diagnostic::error(
                            "out-of-range",
                            format!("{name} lies between 30 % and 100 %"),
                            Some(field.value.span),
                        )
                        .with_help("write it as a percentage, e.g. `93.6 %`"));
                    }
                    if name == "efficiency" {
                        m.efficiency = Some(v)
                    } else {
                        m.drive_efficiency = Some(v)
                    }
                }
            }
            Ok(())
        })();
        if let Err(e) = r {
            d.push(e);
        }
    }
    if m.service_factor.is_nan() {
        // Common practice: NEMA open drip-proof motors carry SF 1.15; IEC ratings are used at SF 1.0.
        m.service_factor = if m.standard == MotorStandardChoice::Nema {
            1.15
        } else {
            1.0
        };
    }
    m
}

fn lower_energy(body: Option<&[Statement]>, env: &Env, d: &mut Vec<Diagnostic>) -> EnergySettings {
    let mut e = EnergySettings {
        price_per_joule: None,
        currency: "cu".into(),
        years: 0.0,
        discount_rate: 0.0,
        escalation: 0.0,
    };
    let f = read_fields(
        body.unwrap_or(&[]),
        "energy",
        &["price", "years", "discount_rate", "escalation"],
        d,
    );
    for field in &f.fields {
        let r: Result<(), Diagnostic> = (|| {
            match field.name {
                "price" => {
                    let q = expect_dim(
                        field.value,
                        env,
                        Dimension::MONEY_PER_ENERGY,
                        "energy price",
                    )?;
                    if q.si < 0.0 {
                        return Err(Diagnostic::error(
                            "out-of-range",
                            "an energy price must not be negative",
                            Some(field.value.span),
                        ));
                    }
                    e.price_per_joule = Some(q.si);
                    if let crate::syntax::ast::ExprKind::Quantity { unit, .. } = &field.value.kind {
                        e.currency = unit.text.split('/').next().unwrap_or("cu").to_string();
                    }
                }
                "years" => {
                    let v = expect_number(field.value, env, "years")?;
                    if !(0.0..=100.0).contains(&v) {
                        return Err(Diagnostic::error(
                            "out-of-range",
                            "the life in years lies between 0 and 100",
                            Some(field.value.span),
                        ));
                    }
                    e.years = v;
                }
                name => {
                    let v = expect_number(field.value, env, name)?;
                    if !(-0.5..=1.0).contains(&v) {
                        return Err(Diagnostic::error(
                            "out-of-range",
                            format!("{name} is a yearly rate, e.g. `5 %`"),
                            Some(field.value.span),
                        ));
                    }
                    if name == "discount_rate" {
                        e.discount_rate = v
                    } else {
                        e.escalation = v
                    }
                }
            }
            Ok(())
        })();
        if let Err(x) = r {
            d.push(x);
        }
    }
    e
}

fn lower_requirements(
    body: &[Statement],
    cases: &[Case],
    env: &Env,
    text: &dyn Fn(Span) -> String,
    d: &mut Vec<Diagnostic>,
) -> Vec<Requirement> {
    let mut out = Vec::new();
    for st in body {
        let StatementKind::Condition {
            path,
            op,
            value,
            cases: scope,
        } = &st.kind
        else {
            d.push(
                Diagnostic::error(
                    "bad-requirement",
                    "a requirement is `QUANTITY >= VALUE [for CASE, ...]`",
                    Some(st.span),
                )
                .with_help("e.g. `flow >= 700 gpm for normal` or `npsh_margin >= 1.3`"),
            );
            continue;
        };
        let name = path.dotted();
        let Some((_, metric)) = Metric::ALL.iter().find(|(k, _)| *k == name) else {
            let near = nearest(&name, Metric::ALL.iter().map(|(k, _)| *k));
            d.push(
                Diagnostic::error(
                    "unknown-field",
                    format!("`{name}` cannot be required"),
                    Some(path.span),
                )
                .with_label("unknown quantity")
                .with_help(format!(
                    "{}requirements constrain {}",
                    if near.is_empty() {
                        String::new()
                    } else {
                        format!("did you mean {}? ", eval::quote_list(&near))
                    },
                    eval::quote_list(&Metric::ALL.iter().map(|(k, _)| *k).collect::<Vec<_>>())
                )),
            );
            continue;
        };
        let dim = match metric {
            Metric::Flow => Dimension::VOLUME_RATE,
            Metric::Head | Metric::NpshExcess => Dimension::LENGTH,
            Metric::NpshMargin | Metric::Efficiency => Dimension::NONE,
            Metric::SuctionVelocity | Metric::DischargeVelocity => Dimension::VELOCITY,
            Metric::ShaftPower => Dimension::POWER,
        };
        let limit = match expect_dim(value, env, dim, &name) {
            Ok(q) => q.si,
            Err(e) => {
                d.push(e);
                continue;
            }
        };
        let mut names = Vec::new();
        for c in scope {
            if cases.iter().any(|k| k.name == c.name) {
                names.push(c.name.clone());
            } else {
                let near = nearest(&c.name, cases.iter().map(|k| k.name.as_str()));
                d.push(
                    Diagnostic::error(
                        "unknown-name",
                        format!("there is no case `{}`", c.name),
                        Some(c.span),
                    )
                    .with_label("unknown case")
                    .with_help(if near.is_empty() {
                        "requirements name cases defined with `case NAME { ... }`".to_string()
                    } else {
                        format!("did you mean {}?", eval::quote_list(&near))
                    }),
                );
            }
        }
        out.push(Requirement {
            metric: *metric,
            at_least: *op == crate::syntax::ast::CompareOp::AtLeast,
            limit_si: limit,
            text: text(st.span),
            cases: names,
            span: st.span,
        });
    }
    out
}
