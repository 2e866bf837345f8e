//! Lowering pump candidates and their curve tables (inline or from CSV).

use crate::diagnostics::Code;
use uom::si::f64::{Frequency, Length, Power, Ratio, VolumeRate};
use uom::si::{
    frequency::hertz, length::meter, power::watt, ratio::ratio, volume_rate::cubic_meter_per_second,
};

use super::design::*;
use super::eval::{self, expect_dim, expect_number, Env};
use super::fields::{block_name, missing, read_fields, Field};
use super::{ranges, FileAccess};
use crate::diagnostics::{Diagnostic, Span};
use crate::syntax::ast::{
    Arg, ArgKind, Cell, Column, Ident, Number, Row, Statement, StatementKind, Table, UnitText,
};
use crate::units::Dimension;

/// Most points accepted in one curve table (grammar/LANGUAGE.md, "Limits").
pub const MAX_CURVE_POINTS: usize = 200;
/// Most curves per pump.
pub const MAX_CURVES: usize = 12;

pub const PUMP_FIELDS: &[&str] = &[
    "speed",
    "arrangement",
    "count",
    "standby",
    "impeller",
    "adjust",
    "min_speed",
    "max_speed",
    "min_trim",
    "motor_rating",
    "min_flow",
    "test_grade",
];

const COLUMNS: &[(&str, Dimension)] = &[
    ("flow", Dimension::VOLUME_RATE),
    ("head", Dimension::LENGTH),
    ("efficiency", Dimension::NONE),
    ("npshr", Dimension::LENGTH),
    ("power", Dimension::POWER),
];

/// The ISO 9906:2012 acceptance grade of `test_grade = 2B` (written bare, as the standard
/// does, or quoted).
fn test_grade(e: &crate::syntax::ast::Expr) -> Result<crate::pumps::tolerance::Grade, Diagnostic> {
    use crate::syntax::ast::ExprKind;
    let text = match &e.kind {
        ExprKind::Quantity { value, unit } => format!("{}{}", value.text, unit.text),
        ExprKind::Text(t) => t.clone(),
        _ => String::new(),
    };
    crate::pumps::tolerance::Grade::parse(&text).ok_or_else(|| {
        Diagnostic::error(
            Code::BadUncertainty,
            "a test grade is one of the ISO 9906:2012 grades 1B, 1E, 1U, 2B, 2U, 3B",
            Some(e.span),
        )
        .with_label("not an ISO 9906 grade")
        .with_help(
            "write e.g. `test_grade = \"2B\"`; a catalogue curve without a stated grade is taken as 3B",
        )
    })
}

/// Lower `pump NAME "description" { ... }`.
pub fn lower_pump(
    args: &[Arg],
    body: &[Statement],
    span: Span,
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> Option<PumpCandidate> {
    let (name, _) = block_name(
        args,
        span,
        Code::BadPump,
        "a pump",
        "pump P1 \"description\" { ... }",
        diags,
    )?;
    let name = name.clone();
    let description = pump_description(args, diags);
    let f = read_fields(body, &format!("pump {name}"), PUMP_FIELDS, diags);
    let mut p = PumpCandidate {
        name: name.clone(),
        description,
        rated_speed: Frequency::new::<hertz>(0.0),
        arrangement: ArrangementKind::Single,
        count: 1,
        standby: 0,
        curves: Vec::new(),
        impeller: None,
        adjust: Adjust::None,
        motor_rating: None,
        min_flow: None,
        test_grade: None,
        span,
    };
    let mut a = AdjustFields {
        word: "none".to_string(),
        min_speed: 0.5,
        max_speed: 1.0,
        min_trim: 0.8,
    };
    for field in &f.fields {
        if let Err(d) = pump_field(&mut p, &mut a, field, env) {
            diags.push(d);
        }
    }
    if p.arrangement == ArrangementKind::Single && p.count > 1 {
        if let Some(c) = f.get("count") {
            diags.push(Diagnostic::error(Code::ConflictingFields, "a single pump has a count of 1", Some(c.value.span))
                .with_help("set `arrangement = parallel` or `arrangement = series` for several running pumps"));
        }
    }
    p.adjust = match a.word.as_str() {
        "speed" => Adjust::Speed {
            min_ratio: a.min_speed,
            max_ratio: a.max_speed,
        },
        "trim" => Adjust::Trim {
            min_ratio: a.min_trim,
        },
        _ => Adjust::None,
    };
    if f.get("speed").is_none() {
        diags.push(missing(
            "speed",
            &format!("pump {name}"),
            span,
            "speed = 1780 rpm",
        ));
    }
    pump_curves(&mut p, &f.rest, span, env, files, diags);
    Some(p)
}

/// The pump's description, the quoted text after its name.
fn pump_description(args: &[Arg], diags: &mut Vec<Diagnostic>) -> String {
    match args.get(1) {
        Some(Arg {
            kind: ArgKind::Text(t),
            ..
        }) => t.clone(),
        Some(a) => {
            diags.push(Diagnostic::error(
                Code::BadPump,
                "after the pump's name only a quoted description may follow",
                Some(a.span),
            ));
            String::new()
        }
        None => String::new(),
    }
}

/// The adjustment fields of a pump, read before the `Adjust` they make.
struct AdjustFields {
    /// `none`, `speed` or `trim`.
    word: String,
    /// Lowest speed, a fraction of the rated speed.
    min_speed: f64,
    /// Highest speed, a fraction of the rated speed.
    max_speed: f64,
    /// Smallest trim, a fraction of the impeller diameter.
    min_trim: f64,
}

/// One field of a pump into `p` (or, for the adjustment, into `a`).
fn pump_field(
    p: &mut PumpCandidate,
    a: &mut AdjustFields,
    field: &Field,
    env: &Env,
) -> Result<(), Diagnostic> {
    let e = field.value;
    match field.name {
        "speed" => {
            let v = expect_dim(e, env, Dimension::FREQUENCY, "pump speed")?.si;
            if v <= 0.0 {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    "the speed must be greater than zero",
                    Some(e.span),
                ));
            }
            p.rated_speed =
                Frequency::new::<hertz>(env.in_range(&ranges::PUMP_SPEED, v, e.span)?);
        }
        "arrangement" => {
            p.arrangement =
                match eval::expect_word(e, env, "arrangement", &["single", "parallel", "series"])?
                    .as_str()
                {
                    "parallel" => ArrangementKind::Parallel,
                    "series" => ArrangementKind::Series,
                    _ => ArrangementKind::Single,
                }
        }
        "count" | "standby" => {
            let v = expect_number(e, env, field.name)?;
            let lo = if field.name == "count" { 1.0 } else { 0.0 };
            if v.fract() != 0.0 || v < lo || v > 12.0 {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    format!("`{}` is a whole number from {lo} to 12", field.name),
                    Some(e.span),
                ));
            }
            if field.name == "count" {
                p.count = v as u32
            } else {
                p.standby = v as u32
            }
        }
        "impeller" => {
            let v = expect_dim(e, env, Dimension::LENGTH, "impeller diameter")?.si;
            if v <= 0.0 {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    "the impeller diameter must be greater than zero",
                    Some(e.span),
                ));
            }
            p.impeller = Some(Length::new::<meter>(env.in_range(
                &ranges::IMPELLER,
                v,
                e.span,
            )?));
        }
        "motor_rating" => {
            let v = expect_dim(e, env, Dimension::POWER, "motor rating")?.si;
            if v.is_nan() || v <= 0.0 {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    "the motor rating must be greater than zero",
                    Some(e.span),
                ));
            }
            p.motor_rating = Some(uom::si::f64::Power::new::<watt>(v));
        }
        "min_flow" => {
            let v = expect_dim(e, env, Dimension::VOLUME_RATE, "minimum continuous flow")?.si;
            if !(v.is_finite() && v > 0.0) {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    "the minimum continuous flow must be greater than zero",
                    Some(e.span),
                ));
            }
            p.min_flow = Some(uom::si::f64::VolumeRate::new::<
                uom::si::volume_rate::cubic_meter_per_second,
            >(v));
        }
        "test_grade" => p.test_grade = Some(test_grade(e)?),
        "adjust" => a.word = eval::expect_word(e, env, "adjust", &["none", "speed", "trim"])?,
        "min_speed" | "max_speed" | "min_trim" => {
            let v = expect_number(e, env, field.name)?;
            let hi = if field.name == "max_speed" { 1.2 } else { 1.0 };
            if !(v > 0.0 && v <= hi) {
                return Err(Diagnostic::error(
                    Code::OutOfRange,
                    format!(
                        "`{}` is a fraction of the rated value, above 0 and at most {:.0} %",
                        field.name,
                        hi * 100.0
                    ),
                    Some(e.span),
                )
                .with_help("write it as a percentage, e.g. `min_speed = 60 %`"));
            }
            match field.name {
                "min_speed" => a.min_speed = v,
                "max_speed" => a.max_speed = v,
                _ => a.min_trim = v,
            }
        }
        _ => {}
    }
    Ok(())
}

/// The pump's `curve` tables (anything else in its braces is an error), and the error
/// for a pump without any.
fn pump_curves(
    p: &mut PumpCandidate,
    rest: &[&Statement],
    span: Span,
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) {
    let mut curve_written = false;
    for st in rest {
        match &st.kind {
            StatementKind::Curve {
                keyword,
                args,
                table,
            } if keyword.name == "curve" => {
                curve_written = true;
                if p.curves.len() >= MAX_CURVES {
                    diags.push(Diagnostic::error(
                        Code::TooMany,
                        format!("a pump may have at most {MAX_CURVES} curves"),
                        Some(st.span),
                    ));
                    continue;
                }
                if let Some(c) = lower_curve(
                    args,
                    table.as_ref(),
                    st.span,
                    p.rated_speed,
                    env,
                    files,
                    diags,
                ) {
                    p.curves.push(c);
                }
            }
            _ => diags.push(
                Diagnostic::error(
                    Code::Unexpected,
                    "a pump holds fields and `curve` tables",
                    Some(st.span),
                )
                .with_help("see grammar/LANGUAGE.md, section \"pump\""),
            ),
        }
    }
    // A curve that failed has its own error; only a pump without any is missing one.
    if !curve_written {
        diags.push(missing(
            "curve",
            &format!("pump {}", p.name),
            span,
            "curve impeller 10 in { ... }",
        ));
    }
}

/// Lower `curve [impeller D] [speed N] [from "file.csv"] [{ table }]`.
fn lower_curve(
    args: &[Arg],
    table: Option<&Table>,
    span: Span,
    rated: Frequency,
    env: &Env,
    files: &dyn FileAccess,
    diags: &mut Vec<Diagnostic>,
) -> Option<CurveData> {
    let mut impeller = None;
    let mut speed = rated;
    let mut csv: Option<(String, Span)> = None;
    let mut i = 0;
    while i < args.len() {
        let (
            Arg {
                kind: ArgKind::Word(w),
                span: ws,
            },
            next,
        ) = (&args[i], args.get(i + 1))
        else {
            diags.push(Diagnostic::error(
                Code::BadCurve,
                "expected `impeller`, `speed` or `from`",
                Some(args[i].span),
            ));
            return None;
        };
        let q = |dim: Dimension, what: &str, diags: &mut Vec<Diagnostic>| -> Option<f64> {
            match next.map(|a| &a.kind) {
                Some(ArgKind::Quantity { value, unit }) => {
                    match eval::quantity_literal(value, unit) {
                        Ok(q) if q.dim == dim && q.si > 0.0 => Some(q.si),
                        Ok(q) => {
                            diags.push(Diagnostic::error(
                                Code::UnitMismatch,
                                format!(
                                    "{what}: expected {} greater than zero, found {}",
                                    dim.describe(),
                                    q.dim.describe()
                                ),
                                next.map(|a| a.span),
                            ));
                            None
                        }
                        Err(d) => {
                            diags.push(d);
                            None
                        }
                    }
                }
                _ => {
                    diags.push(Diagnostic::error(
                        Code::BadCurve,
                        format!("`{w}` needs {} after it", dim.describe()),
                        Some(*ws),
                    ));
                    None
                }
            }
        };
        match w.as_str() {
            "impeller" => {
                impeller = Some(Length::new::<meter>(q(
                    Dimension::LENGTH,
                    "impeller diameter",
                    diags,
                )?))
            }
            "speed" => {
                speed = Frequency::new::<hertz>(q(Dimension::FREQUENCY, "curve speed", diags)?)
            }
            "from" => match next.map(|a| &a.kind) {
                Some(ArgKind::Text(t)) => {
                    csv = Some((t.clone(), next.map(|a| a.span).unwrap_or(*ws)))
                }
                _ => {
                    diags.push(Diagnostic::error(
                        Code::BadCurve,
                        "`from` needs a quoted file name",
                        Some(*ws),
                    ));
                    return None;
                }
            },
            _ => {
                diags.push(Diagnostic::error(Code::BadCurve, format!("a curve has no `{w}`"), Some(*ws)).with_help("write `curve impeller 12.5 in { ... }`, `curve speed 1480 rpm { ... }` or `curve impeller 12.5 in from \"curve.csv\"`"));
                return None;
            }
        }
        i += 2;
    }
    let owned;
    let table = match (table, csv) {
        (Some(_), Some((_, s))) => {
            diags.push(Diagnostic::error(
                Code::ConflictingFields,
                "a curve takes its table inline or from a file, not both",
                Some(s),
            ));
            return None;
        }
        (Some(t), None) => t,
        (None, Some((path, s))) => {
            match read_csv_table(files, &path, s, "flow gpm, head ft, efficiency %") {
                Ok(t) => {
                    owned = t;
                    &owned
                }
                Err(d) => {
                    diags.push(d);
                    return None;
                }
            }
        }
        (None, None) => {
            diags.push(
                Diagnostic::error(Code::BadCurve, "the curve has no table", Some(span))
                    .with_help("give the table in braces, or `from \"file.csv\"`"),
            );
            return None;
        }
    };
    lower_table(table, impeller, speed, env, diags)
}

/// Read `path` through `files` and parse it with [`csv_table`]; a located file error or
/// `bad-csv` (its help showing `columns`, e.g. `flow gpm, head ft`) otherwise.
pub(crate) fn read_csv_table(
    files: &dyn FileAccess,
    path: &str,
    at: Span,
    columns: &str,
) -> Result<Table, Diagnostic> {
    read_csv_table_lines(files, path, at, columns).map(|(t, _)| t)
}

/// [`read_csv_table`] with the file's line number (1-based) of every row, so a
/// reader can locate a bad value in the file (comment and blank lines are skipped).
pub(crate) fn read_csv_table_lines(
    files: &dyn FileAccess,
    path: &str,
    at: Span,
    columns: &str,
) -> Result<(Table, Vec<usize>), Diagnostic> {
    let text = files.read_text(path).map_err(|error| {
        Diagnostic::error(
            error.code(),
            format!("cannot read `{path}`: {error}"),
            Some(at),
        )
        .with_help(error.help())
    })?;
    csv_table(&text, at).map_err(|msg| {
        Diagnostic::error(Code::BadCsv, format!("{path}: {msg}"), Some(at)).with_help(format!(
            "the first line names the columns with units, e.g. `{columns}`; then one row of numbers per line"
        ))
    })
}

/// A CSV curve table turned into the same table form as an inline one, with the
/// file line of each row. Spans point at the `from "..."` text; messages carry the
/// CSV line number.
pub(crate) fn csv_table(text: &str, at: Span) -> Result<(Table, Vec<usize>), String> {
    let mut lines = text
        .lines()
        .enumerate()
        .filter(|(_, l)| !l.trim().is_empty() && !l.trim_start().starts_with('#'));
    let (_, head) = lines.next().ok_or("the file is empty")?;
    let mut columns = Vec::new();
    for h in head.split(',') {
        let mut it = h.split_whitespace();
        let (Some(n), Some(u), None) = (it.next(), it.next(), it.next()) else {
            return Err(format!(
                "the header (the first line) must name each column with its unit, e.g. `flow m^3/h, head m`; column {} does not",
                columns.len() + 1
            ));
        };
        // Names and units are quoted in later messages: only short ones are taken.
        if n.chars().count() > MAX_QUOTED_CHARS || u.chars().count() > MAX_QUOTED_CHARS {
            return Err(format!(
                "column {} of the header is longer than a column name and a unit",
                columns.len() + 1
            ));
        }
        columns.push(Column {
            name: Ident {
                name: n.into(),
                span: at,
            },
            unit: UnitText {
                text: u.into(),
                span: at,
            },
            span: at,
        });
    }
    let mut rows = Vec::new();
    let mut numbers = Vec::new();
    for (no, line) in lines {
        numbers.push(no + 1);
        let mut cells = Vec::new();
        for c in line.split(',') {
            let c = c.trim();
            let value = if c == "-" || c.is_empty() {
                None
            } else {
                let v: f64 = c
                    .parse()
                    .map_err(|_| format!("line {}: `{}` is not a number", no + 1, quoted(c)))?;
                if !v.is_finite() {
                    return Err(format!(
                        "line {}: `{}` is not a finite number",
                        no + 1,
                        quoted(c)
                    ));
                }
                Some(Number {
                    text: c.into(),
                    value: v,
                })
            };
            cells.push(Cell { value, span: at });
        }
        rows.push(Row { cells, span: at });
    }
    let table = Table {
        columns,
        rows,
        span: at,
    };
    Ok((table, numbers))
}

/// Most characters of a CSV file quoted in a diagnostic.
const MAX_QUOTED_CHARS: usize = 24;

/// A cell of a curve row as quoted in a diagnostic: at most 24 characters, so a file
/// that is not a curve table never shows more than a fragment of itself.
fn quoted(cell: &str) -> String {
    let mut cut: String = cell.chars().take(MAX_QUOTED_CHARS).collect();
    if cell.chars().nth(MAX_QUOTED_CHARS).is_some() {
        cut.push('…');
    }
    cut
}

fn lower_table(
    t: &Table,
    impeller: Option<Length>,
    speed: Frequency,
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) -> Option<CurveData> {
    let before = diags.len();
    let units = table_units(t, diags);
    if diags.len() > before || !table_size_ok(t, diags) {
        return None;
    }
    let mut c = CurveData {
        impeller,
        speed,
        flow: vec![],
        head: vec![],
        efficiency: vec![],
        npshr: vec![],
        shaft_power: vec![],
        span: t.span,
    };
    for row in &t.rows {
        table_row(&mut c, row, &units, env, diags);
    }
    if diags.len() > before {
        return None;
    }
    Some(c)
}

/// The unit of each known column of a curve table, in order; errors for an unknown
/// column, a unit of the wrong dimension, and a missing `flow` or `head`.
fn table_units<'t>(
    t: &'t Table,
    diags: &mut Vec<Diagnostic>,
) -> Vec<(&'t str, crate::units::Unit)> {
    let mut units = Vec::new();
    for c in &t.columns {
        let Some((_, dim)) = COLUMNS.iter().find(|(n, _)| *n == c.name.name) else {
            diags.push(Diagnostic::error(Code::UnknownColumn, format!("a curve table has no column `{}`", c.name.name), Some(c.name.span))
                .with_help("columns are `flow`, `head`, `efficiency`, `npshr` and `power`, each with its unit"));
            continue;
        };
        match eval::unit(&c.unit) {
            Ok(u) if u.dim == *dim => units.push((c.name.name.as_str(), u)),
            Ok(u) => diags.push(
                Diagnostic::error(
                    Code::UnitMismatch,
                    format!(
                        "column `{}`: expected {}, found {} ({})",
                        c.name.name,
                        dim.describe(),
                        u.dim.describe(),
                        c.unit.text
                    ),
                    Some(c.unit.span),
                )
                .with_label(format!("expected {}", dim.describe()))
                .with_help(eval::example_units(*dim)),
            ),
            Err(d) => diags.push(d),
        }
    }
    for need in ["flow", "head"] {
        if !t.columns.iter().any(|c| c.name.name == need) {
            diags.push(Diagnostic::error(
                Code::MissingColumn,
                format!("the curve table needs a `{need}` column"),
                Some(t.span),
            ));
        }
    }
    units
}

/// Whether the table has from 3 to [`MAX_CURVE_POINTS`] rows (an error if not).
fn table_size_ok(t: &Table, diags: &mut Vec<Diagnostic>) -> bool {
    if t.rows.len() > MAX_CURVE_POINTS {
        diags.push(Diagnostic::error(
            Code::TooMany,
            format!(
                "a curve may have at most {MAX_CURVE_POINTS} points; this one has {}",
                t.rows.len()
            ),
            Some(t.span),
        ));
        return false;
    }
    if t.rows.len() < 3 {
        diags.push(
            Diagnostic::error(
                Code::TooFewPoints,
                "a curve needs at least 3 points",
                Some(t.span),
            )
            .with_help("give points from shut-off to beyond the expected duty"),
        );
        return false;
    }
    true
}

/// One row of a curve table into `c`: every value in its column's unit, in its range;
/// flows increasing.
fn table_row(
    c: &mut CurveData,
    row: &Row,
    units: &[(&str, crate::units::Unit)],
    env: &Env,
    diags: &mut Vec<Diagnostic>,
) {
    if row.cells.len() != units.len() {
        diags.push(Diagnostic::error(
            Code::BadRow,
            format!(
                "this row has {} values; the table has {} columns",
                row.cells.len(),
                units.len()
            ),
            Some(row.span),
        ));
        return;
    }
    let mut eff = None;
    let mut npsh = None;
    let mut pow = None;
    let mut flow = None;
    let mut head = None;
    for ((name, u), cell) in units.iter().zip(&row.cells) {
        let Some(v) = &cell.value else {
            if matches!(*name, "flow" | "head") {
                diags.push(Diagnostic::error(
                    Code::BadRow,
                    format!("every point needs a {name}"),
                    Some(cell.span),
                ));
            }
            continue;
        };
        let si = crate::units::Quantity::from_value(v.value, u).si;
        if si < 0.0 {
            diags.push(
                Diagnostic::error(
                    Code::OutOfRange,
                    format!("negative values are not allowed in the `{name}` column"),
                    Some(cell.span),
                )
                .with_label("negative")
                .with_help("a curve table gives magnitudes from shut-off (zero flow) upwards"),
            );
            continue;
        }
        let range = match *name {
            "flow" => Some(&ranges::CURVE_FLOW),
            "head" => Some(&ranges::CURVE_HEAD),
            "npshr" => Some(&ranges::CURVE_NPSHR),
            "power" => Some(&ranges::CURVE_POWER),
            _ => None,
        };
        if let Some(range) = range {
            if let Err(d) = env.in_range(range, si, cell.span) {
                diags.push(d);
                continue;
            }
        }
        match *name {
            "flow" => flow = Some(VolumeRate::new::<cubic_meter_per_second>(si)),
            "head" => head = Some(Length::new::<meter>(si)),
            "efficiency" => {
                if si > 1.0 {
                    diags.push(
                        Diagnostic::error(
                            Code::OutOfRange,
                            "an efficiency cannot exceed 100 %",
                            Some(cell.span),
                        )
                        .with_help("is the column's unit `%`?"),
                    );
                }
                eff = Some(Ratio::new::<ratio>(si))
            }
            "npshr" => npsh = Some(Length::new::<meter>(si)),
            _ => pow = Some(Power::new::<watt>(si)),
        }
    }
    if let (Some(q), Some(h)) = (flow, head) {
        if let Some(prev) = c.flow.last() {
            if q <= *prev {
                diags.push(Diagnostic::error(
                    Code::BadRow,
                    "flows must increase down the table",
                    Some(row.span),
                ));
            }
        }
        c.flow.push(q);
        c.head.push(h);
        c.efficiency.push(eff);
        c.npshr.push(npsh);
        c.shaft_power.push(pow);
    }
}
