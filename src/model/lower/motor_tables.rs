//! The design's own motor and drive tables inside `motor { ... }` (issue 13): a table of
//! motor efficiency at stated load fractions (`load %  efficiency %`) and a table of
//! drive losses at the eight IEC 61800-9-2 reference points (`speed %  torque %  loss
//! %`). Used over the load profile instead of the typical published curves. See
//! grammar/LANGUAGE.md, "motor and energy".

use crate::diagnostics::{Code, Diagnostic, Span};
use crate::model::design::MotorSettings;
use crate::model::eval;
use crate::pumps::part_load::IEC_61800_9_2_POINTS;
use crate::syntax::ast::{Statement, StatementKind, Table};
use crate::units::{Dimension, Quantity};

/// Most rows of a motor efficiency table.
const MAX_MOTOR_ROWS: usize = 20;

/// Read the tables among the motor block's non-field statements into `m`.
pub fn lower_motor_tables(rest: &[&Statement], m: &mut MotorSettings, d: &mut Vec<Diagnostic>) {
    for st in rest {
        let StatementKind::Curve {
            table: Some(t),
            args,
            ..
        } = &st.kind
        else {
            d.push(unexpected(st.span));
            continue;
        };
        if !args.is_empty() {
            d.push(unexpected(st.span));
            continue;
        }
        let Some(cols) = columns(t, d) else { continue };
        let names: Vec<&str> = cols.iter().map(|(n, _)| n.as_str()).collect();
        match names.as_slice() {
            ["load", "efficiency"] => set_once(&mut m.motor_table, motor_rows(t, d), st.span, d),
            ["speed", "torque", "loss"] => set_once(&mut m.drive_losses, drive_rows(t, d), st.span, d),
            _ => d.push(
                Diagnostic::error(
                    Code::UnknownColumn,
                    "a motor table has the columns `load % efficiency %` (motor) or `speed % torque % loss %` (drive)",
                    Some(t.span),
                )
                .with_help("each column is a percentage: load fraction of the nameplate, efficiency, speed and torque of rated, loss of the drive rating"),
            ),
        }
    }
}

fn unexpected(at: Span) -> Diagnostic {
    Diagnostic::error(
        Code::UnexpectedStatement,
        "a motor block holds fields and `curve { ... }` tables of motor efficiency or drive losses",
        Some(at),
    )
}

fn set_once<T>(slot: &mut Option<T>, value: Option<T>, at: Span, d: &mut Vec<Diagnostic>) {
    if slot.is_some() && value.is_some() {
        d.push(Diagnostic::error(
            Code::DuplicateField,
            "a motor block has one table of each kind",
            Some(at),
        ));
    } else if value.is_some() {
        *slot = value;
    }
}

/// The column names, each with a `%` unit; `None` after a diagnostic.
fn columns(t: &Table, d: &mut Vec<Diagnostic>) -> Option<Vec<(String, Span)>> {
    let mut out = Vec::new();
    for c in &t.columns {
        match eval::unit(&c.unit) {
            Ok(u) if u.dim == Dimension::NONE => out.push((c.name.name.clone(), c.span)),
            Ok(_) => {
                d.push(Diagnostic::error(
                    Code::UnitMismatch,
                    format!("column `{}`: expected a percentage (`%`)", c.name.name),
                    Some(c.unit.span),
                ));
                return None;
            }
            Err(e) => {
                d.push(e);
                return None;
            }
        }
    }
    Some(out)
}

/// The cells of a row as fractions (`%` → /100 through the unit); `None` with a
/// diagnostic when a cell is missing.
fn fractions(t: &Table, d: &mut Vec<Diagnostic>) -> Option<Vec<(Vec<f64>, Span)>> {
    let units: Vec<_> = t
        .columns
        .iter()
        .filter_map(|c| eval::unit(&c.unit).ok())
        .collect();
    let mut rows = Vec::new();
    for row in &t.rows {
        let vals: Option<Vec<f64>> = (row.cells.len() == units.len())
            .then(|| {
                row.cells
                    .iter()
                    .zip(&units)
                    .map(|(c, u)| {
                        c.value
                            .as_ref()
                            .map(|n| Quantity::from_value(n.value, u).si)
                    })
                    .collect()
            })
            .flatten();
        match vals {
            Some(v) => rows.push((v, row.span)),
            None => {
                d.push(Diagnostic::error(
                    Code::BadRow,
                    format!("each row of this table has {} values", units.len()),
                    Some(row.span),
                ));
                return None;
            }
        }
    }
    Some(rows)
}

fn out_of_range(msg: &str, at: Span) -> Diagnostic {
    Diagnostic::error(Code::OutOfRange, msg.to_string(), Some(at))
}

/// Motor rows: 2 to 20, loads strictly ascending in (0, 150 %], efficiency 30–100 %.
fn motor_rows(t: &Table, d: &mut Vec<Diagnostic>) -> Option<Vec<(f64, f64)>> {
    let rows = fractions(t, d)?;
    if !(2..=MAX_MOTOR_ROWS).contains(&rows.len()) {
        d.push(out_of_range(
            &format!("a motor efficiency table has 2 to {MAX_MOTOR_ROWS} rows"),
            t.span,
        ));
        return None;
    }
    let mut out: Vec<(f64, f64)> = Vec::new();
    for (v, at) in rows {
        let (x, e) = (v[0], v[1]);
        if !(x > 0.0 && x <= 1.5) || out.last().is_some_and(|p| x <= p.0) {
            d.push(out_of_range(
                "loads rise from row to row, above 0 % and at most 150 %",
                at,
            ));
            return None;
        }
        if !(0.3..=1.0).contains(&e) {
            d.push(out_of_range(
                "a motor efficiency lies between 30 % and 100 %",
                at,
            ));
            return None;
        }
        out.push((x, e));
    }
    Some(out)
}

/// Drive rows: exactly the eight IEC 61800-9-2 points, each once, losses 0–50 %.
fn drive_rows(t: &Table, d: &mut Vec<Diagnostic>) -> Option<[f64; 8]> {
    let rows = fractions(t, d)?;
    let mut out = [f64::NAN; 8];
    for (v, at) in rows {
        let Some(i) = IEC_61800_9_2_POINTS
            .iter()
            .position(|(s, q)| (s / 100.0 - v[0]).abs() < 1e-9 && (q / 100.0 - v[1]).abs() < 1e-9)
        else {
            d.push(out_of_range("not an IEC 61800-9-2 reference point: speed 0, 50 or 90 % with torque 25, 50 or 100 % (no 90/25)", at));
            return None;
        };
        if !out[i].is_nan() {
            d.push(Diagnostic::error(
                Code::DuplicateField,
                "this reference point is given twice",
                Some(at),
            ));
            return None;
        }
        if !(0.0..=0.5).contains(&v[2]) {
            d.push(out_of_range(
                "a drive loss lies between 0 % and 50 % of its rating",
                at,
            ));
            return None;
        }
        out[i] = v[2];
    }
    if out.iter().any(|x| x.is_nan()) {
        d.push(
            Diagnostic::error(Code::MissingColumn, "a drive loss table gives all eight IEC 61800-9-2 points", Some(t.span))
                .with_help("rows (speed %, torque %): (0, 25) (0, 50) (0, 100) (50, 25) (50, 50) (50, 100) (90, 50) (90, 100)"),
        );
        return None;
    }
    Some(out)
}
