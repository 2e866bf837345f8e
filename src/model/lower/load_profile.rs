//! Yearly operation: `load_profile CASE { ... }` blocks (a table of flow against hours per
//! year, the control strategy, staging) and `cost PUMP { ... }` blocks (life-cycle
//! cost elements). See grammar/LANGUAGE.md, "Operation over the year".

use super::{duplicate_name, Block, Blocks};
use crate::diagnostics::{Code, Diagnostic, Span};
use crate::model::design::{Case, PumpCandidate, Requirement};
use crate::model::eval::{self, expect_dim, expect_number, Env};
use crate::model::fields::{block_name, read_fields, Field};
use crate::model::operation::*;
use crate::model::FileAccess;
use crate::syntax::ast::{Arg, ArgKind, Statement, StatementKind, Table};
use crate::units::{Dimension, Quantity};

const PROFILE_FIELDS: &[&str] = &[
    "control",
    "control_head",
    "staging",
    "design_flow",
    "deadhead_margin",
    "min_flow",
    "storage",
    "level_band",
    "max_starts_per_hour",
    "bins",
];
const CONTROLS: &[&str] = &[
    "constant_pressure",
    "system_curve",
    "proportional",
    "throttle",
    "on_off",
];
const COST_FIELDS: &[&str] = &[
    "initial",
    "installation",
    "operation",
    "maintenance",
    "downtime",
    "environmental",
    "disposal",
];

/// Every `profile` block, one per case at most.
pub fn lower_profiles(
    blocks: &Blocks,
    cases: &[Case],
    requirements: &[Requirement],
    env: &Env,
    files: &dyn FileAccess,
    d: &mut Vec<Diagnostic>,
) -> Vec<LoadProfile> {
    let mut out: Vec<LoadProfile> = Vec::new();
    let mut seen: Vec<(String, Span)> = Vec::new();
    for block in blocks.all("load_profile") {
        let Some((name, at)) = block_name(
            block.args,
            block.keyword_span(),
            Code::MissingName,
            "a profile",
            "load_profile average { ... }",
            d,
        ) else {
            continue;
        };
        if let Some((_, first)) = seen.iter().find(|(n, _)| n == name) {
            d.push(duplicate_name(
                &format!("profile for case `{name}`"),
                at,
                *first,
            ));
            continue;
        }
        seen.push((name.clone(), at));
        if !cases.iter().any(|c| &c.name == name) {
            let names: Vec<&str> = cases.iter().map(|c| c.name.as_str()).collect();
            d.push(
                Diagnostic::error(
                    Code::UnknownCase,
                    format!("profile: no case `{name}`"),
                    Some(at),
                )
                .with_help(format!(
                    "a profile runs on a case's system curve; cases are {}",
                    eval::quote_list(&names)
                )),
            );
            continue;
        }
        if out.len() == MAX_PROFILES {
            d.push(Diagnostic::error(
                Code::TooMany,
                format!("a design may have at most {MAX_PROFILES} profiles"),
                Some(block.span),
            ));
            break;
        }
        if let Some(p) = lower_profile(block, name, requirements, env, files, d) {
            out.push(p);
        }
    }
    out
}

/// The largest `flow >=` requirement of a case, m³/s: what `100 %` means by default.
fn required_flow(requirements: &[Requirement], case: &str) -> Option<f64> {
    requirements
        .iter()
        .filter(|r| {
            r.metric == crate::model::Metric::Flow
                && r.at_least
                && (r.cases.is_empty() || r.cases.iter().any(|c| c == case))
        })
        .map(|r| r.limit_si)
        .reduce(f64::max)
}

/// Where a profile's table comes from.
enum Source<'a> {
    /// `curve { flow ... hours ... }` in the design.
    Inline(&'a Table),
    /// `curve hourly from "file.csv"`: the file and where its name is written.
    Hourly(String, Span),
}

/// `curve { ... }` or `curve hourly from "file.csv"`; a diagnostic for anything else.
fn source_of(st: &crate::syntax::ast::Statement) -> Result<Source<'_>, Diagnostic> {
    match &st.kind {
        StatementKind::Curve {
            table: Some(t),
            args,
            ..
        } if args.is_empty() => Ok(Source::Inline(t)),
        StatementKind::Curve {
            table: None, args, ..
        } => match args.as_slice() {
            [Arg {
                kind: ArgKind::Word(h),
                ..
            }, Arg {
                kind: ArgKind::Word(f),
                ..
            }, Arg {
                kind: ArgKind::Text(path),
                span,
            }] if h == "hourly" && f == "from" => Ok(Source::Hourly(path.clone(), *span)),
            _ => Err(Diagnostic::error(
                Code::UnexpectedStatement,
                "a profile's file is read with `curve hourly from \"file.csv\"`",
                Some(st.span),
            )
            .with_help("the file holds one hourly flow per row, 8760 rows (8784 in a leap year)")),
        },
        _ => Err(Diagnostic::error(
            Code::UnexpectedStatement,
            "a profile holds fields and one `curve { flow ... hours ... }` table or `curve hourly from \"file.csv\"`",
            Some(st.span),
        )),
    }
}

fn lower_profile(
    block: &Block,
    case: &str,
    requirements: &[Requirement],
    env: &Env,
    files: &dyn FileAccess,
    d: &mut Vec<Diagnostic>,
) -> Option<LoadProfile> {
    let before = d.len();
    let f = read_fields(block.statements(), "load_profile", PROFILE_FIELDS, d);
    let mut p = LoadProfile {
        case: case.to_string(),
        control: Control::Throttle,
        staging: Staging::LeastPower,
        design_flow: required_flow(requirements, case).unwrap_or(f64::NAN),
        points: Vec::new(),
        deadhead_margin: None,
        min_flow_ratio: None,
        storage_volume: None,
        level_band: 0.0,
        max_starts_per_hour: None,
        binning: None,
        span: block.span,
    };
    let mut x = ProfileExtras {
        bins: DEFAULT_HOURLY_BINS,
        bins_span: None,
        control_word: "throttle".to_string(),
        control_head: None,
    };
    for field in &f.fields {
        if let Err(e) = profile_field(&mut p, &mut x, field, env) {
            d.push(e);
        }
    }
    p.control = control_of(&x.control_word, x.control_head, block, d)?;
    if p.control == Control::OnOff && p.storage_volume.is_none() {
        d.push(
            crate::model::fields::missing("storage", "an on/off profile", block.keyword_span(), "storage = 180 m^3")
                .with_help("on/off control needs the active storage volume between the start and stop levels, e.g. `storage = 180 m^3`"),
        );
    }
    profile_table(&mut p, &f.rest, &x, block, env, files, d);
    (d.len() == before).then_some(p)
}

/// What a profile's fields say beyond the `LoadProfile` itself.
struct ProfileExtras {
    /// Flow bins of an hourly profile.
    bins: usize,
    /// Where `bins` was written, if it was.
    bins_span: Option<Span>,
    /// The control keyword.
    control_word: String,
    /// `control_head`, m, where it was written.
    control_head: Option<(f64, Span)>,
}

/// One field of a profile into `p` (or `x`).
fn profile_field(
    p: &mut LoadProfile,
    x: &mut ProfileExtras,
    field: &Field,
    env: &Env,
) -> Result<(), Diagnostic> {
    let positive = |dim: Dimension, what: &str| -> Result<f64, Diagnostic> {
        let q = expect_dim(field.value, env, dim, what)?;
        if !(q.si.is_finite() && q.si > 0.0) {
            return Err(Diagnostic::error(
                Code::OutOfRange,
                format!("{what} must be greater than zero"),
                Some(field.value.span),
            ));
        }
        Ok(q.si)
    };
    match field.name {
        "control" => x.control_word = eval::expect_word(field.value, env, "control", CONTROLS)?,
        "control_head" => {
            let q = expect_dim(field.value, env, Dimension::LENGTH, "control head")?;
            if !(0.0..=3000.0).contains(&q.si) {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    "a control head lies between 0 and 3000 m",
                    Some(field.value.span),
                ));
            }
            x.control_head = Some((q.si, field.value.span));
        }
        "staging" => {
            p.staging = match eval::expect_word(
                field.value,
                env,
                "staging",
                &["least_power", "all_running"],
            )?
            .as_str()
            {
                "all_running" => Staging::AllRunning,
                _ => Staging::LeastPower,
            }
        }
        "design_flow" => p.design_flow = positive(Dimension::VOLUME_RATE, "design flow")?,
        "deadhead_margin" => {
            p.deadhead_margin = Some(
                expect_dim(field.value, env, Dimension::LENGTH, "deadhead margin")?
                    .si
                    .max(0.0),
            )
        }
        "min_flow" => {
            let v = expect_number(field.value, env, "minimum continuous flow")?;
            if !(0.05..=1.0).contains(&v) {
                return Err(Diagnostic::error(Code::OutOfRange, "the minimum continuous flow is a share of the best-efficiency flow, 5 % to 100 %", Some(field.value.span)).with_help("write e.g. `min_flow = 40 %`"));
            }
            p.min_flow_ratio = Some(v);
        }
        "storage" => p.storage_volume = Some(positive(Dimension::VOLUME, "storage volume")?),
        "level_band" => {
            p.level_band = expect_dim(field.value, env, Dimension::LENGTH, "level band")?
                .si
                .clamp(0.0, 100.0)
        }
        "bins" => {
            let v = expect_number(field.value, env, "number of bins")?;
            if !(v.fract() == 0.0 && (1.0..=MAX_HOURLY_BINS as f64).contains(&v)) {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    format!("the bins of an hourly profile are a whole number from 1 to {MAX_HOURLY_BINS}"),
                    Some(field.value.span),
                ));
            }
            x.bins = v as usize;
            x.bins_span = Some(field.value.span);
        }
        _ => {
            let v = expect_number(field.value, env, "starts per hour")?;
            if !(0.5..=60.0).contains(&v) {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    "starts per hour lie between 0.5 and 60",
                    Some(field.value.span),
                ));
            }
            p.max_starts_per_hour = Some(v);
        }
    }
    Ok(())
}

/// The profile's one table: inline points, or an hourly CSV summarised into bins.
fn profile_table(
    p: &mut LoadProfile,
    rest: &[&Statement],
    x: &ProfileExtras,
    block: &Block,
    env: &Env,
    files: &dyn FileAccess,
    d: &mut Vec<Diagnostic>,
) {
    let tables: Vec<(Source, Span)> = rest
        .iter()
        .filter_map(|st| match source_of(st) {
            Ok(s) => Some((s, st.span)),
            Err(e) => {
                d.push(e);
                None
            }
        })
        .collect();
    match tables.as_slice() {
        [(Source::Inline(t), _)] => {
            if let Some(at) = x.bins_span {
                d.push(Diagnostic::error(Code::UnusedField, "`bins` has no meaning for a profile table", Some(at))
                    .with_help("`bins` sets how many flow bins `curve hourly from \"file.csv\"` summarises a year of hourly flows into"));
            }
            p.points = lower_points(t, p.design_flow, env, d)
        }
        [(Source::Hourly(path, at), _)] => {
            if let Some((points, binning)) =
                super::hourly::hourly_points(files, path, *at, x.bins, p.design_flow, d)
            {
                p.points = points;
                p.binning = Some(binning);
            }
        }
        [] => d.push(
            Diagnostic::error(Code::MissingTable, "a profile needs a table of flow against hours per year", Some(block.keyword_span()))
                .with_help("add `curve {` then a header `flow %   hours h` and one row per load point, then `}`"),
        ),
        [_, (_, second), ..] => d.push(Diagnostic::error(Code::DuplicateField, "a profile has one table", Some(*second))),
    }
}

/// The control strategy from its keyword and `control_head`.
fn control_of(
    word: &str,
    head: Option<(f64, Span)>,
    block: &Block,
    d: &mut Vec<Diagnostic>,
) -> Option<Control> {
    let need = |d: &mut Vec<Diagnostic>, example: &str| {
        d.push(crate::model::fields::missing(
            "control_head",
            &format!("`control = {word}`"),
            block.keyword_span(),
            example,
        ));
        None
    };
    match (word, head) {
        ("constant_pressure", Some((h, _))) => Some(Control::ConstantPressure { head: h }),
        ("constant_pressure", None) => need(d, "control_head = 62 m"),
        ("proportional", Some((h, _))) => Some(Control::Proportional { zero_flow_head: h }),
        ("proportional", None) => need(d, "control_head = 40 m"),
        ("system_curve", h) => Some(Control::SystemCurve {
            residual: h.map_or(0.0, |(h, _)| h),
        }),
        (_, Some((_, at))) => {
            d.push(Diagnostic::error(Code::UnusedField, format!("`control_head` has no meaning for `control = {word}`"), Some(at))
                .with_help("`control_head` sets the held head of `constant_pressure`, the zero-flow head of `proportional` and the residual head of `system_curve`"));
            None
        }
        ("on_off", None) => Some(Control::OnOff),
        _ => Some(Control::Throttle),
    }
}

/// The rows of a profile table: `flow` (a flow, or `%` of the design flow) and `hours`.
fn lower_points(t: &Table, design_flow: f64, env: &Env, d: &mut Vec<Diagnostic>) -> Vec<LoadPoint> {
    let _ = env;
    let before = d.len();
    let mut flow_col = None;
    let mut hours_col = None;
    for (i, c) in t.columns.iter().enumerate() {
        let unit = match eval::unit(&c.unit) {
            Ok(u) => u,
            Err(e) => {
                d.push(e);
                continue;
            }
        };
        let want = match c.name.name.as_str() {
            "flow" if unit.dim == Dimension::NONE || unit.dim == Dimension::VOLUME_RATE => {
                flow_col = Some((i, unit));
                continue;
            }
            "hours" if unit.dim == Dimension::TIME => {
                hours_col = Some((i, unit));
                continue;
            }
            "flow" => "a flow (m^3/h, L/s, gpm) or `%` of the design flow",
            "hours" => "a time (h) per year",
            other => {
                d.push(
                    Diagnostic::error(
                        Code::UnknownColumn,
                        format!("a profile table has no column `{other}`"),
                        Some(c.name.span),
                    )
                    .with_help("columns are `flow` (a flow or %) and `hours` (h per year)"),
                );
                continue;
            }
        };
        d.push(Diagnostic::error(
            Code::UnitMismatch,
            format!("column `{}`: expected {want}", c.name.name),
            Some(c.unit.span),
        ));
    }
    let (Some((fi, fu)), Some((hi, hu))) = (flow_col, hours_col) else {
        if d.len() == before {
            d.push(Diagnostic::error(
                Code::MissingColumn,
                "a profile table needs a `flow` and an `hours` column",
                Some(t.span),
            ));
        }
        return Vec::new();
    };
    if fu.dim == Dimension::NONE && !design_flow.is_finite() {
        d.push(Diagnostic::error(Code::MissingField, "flows in % need the design flow they are a share of", Some(t.columns[fi].unit.span))
            .with_help("add `design_flow = 560 m^3/h` to the profile, or a `flow >=` requirement for its case"));
        return Vec::new();
    }
    if t.rows.len() > MAX_PROFILE_POINTS || t.rows.is_empty() {
        d.push(Diagnostic::error(
            Code::TooMany,
            format!(
                "a profile has 1 to {MAX_PROFILE_POINTS} rows; this one has {}",
                t.rows.len()
            ),
            Some(t.span),
        ));
        return Vec::new();
    }
    let mut points = Vec::new();
    let mut total_hours = 0.0;
    for row in &t.rows {
        let cell = |i: usize| {
            row.cells
                .get(i)
                .and_then(|c| c.value.as_ref().map(|v| (v.value, c.span)))
        };
        let (Some((qv, qs)), Some((hv, hs)), 2) = (cell(fi), cell(hi), row.cells.len()) else {
            d.push(Diagnostic::error(
                Code::BadRow,
                "each profile row has a flow and hours",
                Some(row.span),
            ));
            continue;
        };
        let q = Quantity::from_value(qv, &fu).si;
        let q = if fu.dim == Dimension::NONE {
            q * design_flow
        } else {
            q
        };
        let h = Quantity::from_value(hv, &hu).si / 3600.0;
        if !(q.is_finite() && q > 0.0 && q < 1.0e3) {
            d.push(Diagnostic::error(
                Code::OutOfRange,
                "a profile flow must be greater than zero",
                Some(qs),
            ));
            continue;
        }
        if !(h.is_finite() && (0.0..=8760.0).contains(&h)) {
            d.push(Diagnostic::error(
                Code::OutOfRange,
                "hours per year lie between 0 and 8760",
                Some(hs),
            ));
            continue;
        }
        total_hours += h;
        points.push(LoadPoint {
            flow: q,
            hours: h,
            span: row.span,
        });
    }
    if total_hours > 8760.0 + 1e-6 {
        d.push(Diagnostic::error(
            Code::OutOfRange,
            format!(
                "the profile's hours add up to {total_hours:.0} h, more than the 8760 h of a year"
            ),
            Some(t.span),
        ));
    }
    points
}

/// Every `cost PUMP { ... }` block.
pub fn lower_costs(
    blocks: &Blocks,
    pumps: &[PumpCandidate],
    env: &Env,
    d: &mut Vec<Diagnostic>,
) -> Vec<CostElements> {
    let mut out: Vec<CostElements> = Vec::new();
    for block in blocks.all("cost") {
        let Some((name, at)) = block_name(
            block.args,
            block.keyword_span(),
            Code::MissingName,
            "a cost block",
            "cost KR1 { initial = 48000 EUR }",
            d,
        ) else {
            continue;
        };
        if !pumps.iter().any(|p| &p.name == name) {
            let names: Vec<&str> = pumps.iter().map(|p| p.name.as_str()).collect();
            d.push(
                // A warning, so that dropping a candidate in a revision keeps its costs harmless.
                Diagnostic::warning(
                    Code::UnknownPump,
                    format!("cost: no pump `{name}`; these costs are not used"),
                    Some(at),
                )
                .with_help(format!("pumps are {}", eval::quote_list(&names))),
            );
            continue;
        }
        if let Some(first) = out.iter().find(|c| &c.pump == name) {
            d.push(duplicate_name(
                &format!("cost of pump `{name}`"),
                at,
                first.span,
            ));
            continue;
        }
        let mut c = CostElements {
            pump: name.clone(),
            span: at,
            ..Default::default()
        };
        for field in &read_fields(block.statements(), "cost", COST_FIELDS, d).fields {
            let yearly = matches!(
                field.name,
                "operation" | "maintenance" | "downtime" | "environmental"
            );
            let (dim, what) = if yearly {
                (Dimension::MONEY_PER_TIME, "a cost per year")
            } else {
                (Dimension::MONEY, "an amount of money")
            };
            match expect_dim(field.value, env, dim, what) {
                Ok(q) if q.si.is_finite() && (0.0..1e13).contains(&q.si) => {
                    // Money per time is per second in SI; the cost elements are per year.
                    let v = if yearly { q.si * 365.0 * 86400.0 } else { q.si };
                    match field.name {
                        "initial" => c.initial = v,
                        "installation" => c.installation = v,
                        "operation" => c.operation = v,
                        "maintenance" => c.maintenance = v,
                        "downtime" => c.downtime = v,
                        "environmental" => c.environmental = v,
                        _ => c.disposal = v,
                    }
                }
                Ok(_) => d.push(Diagnostic::error(
                    Code::OutOfRange,
                    "a cost is zero or more",
                    Some(field.value.span),
                )),
                Err(e) => d.push(e.with_help(if yearly {
                    "write a yearly cost as e.g. `1500 EUR/year`"
                } else {
                    "write an amount as e.g. `48000 EUR`"
                })),
            }
        }
        out.push(c);
    }
    out
}
