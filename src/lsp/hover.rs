//! Hover: what the text under the cursor means. A quantity (`40 ft`, a curve-table cell
//! in its column's unit) shows its kind, its value in SI and in the design's report
//! units; a `let` constant shows its definition; a fitting shows what it is and the
//! source of its K.

use crate::display::{Shown, Units};
use crate::model::ReportUnits;
use crate::syntax::ast::{Arg, ArgKind, Expr, ExprKind, File, Statement, StatementKind};
use crate::units::{parse_unit, Dimension, Quantity, QuantityKind};

/// A number written with a unit, found under the cursor: its text, value, unit text
/// and the byte span of the whole.
struct Written<'a> {
    number: &'a str,
    value: f64,
    unit: &'a str,
}

/// The hover text (Markdown) at byte `offset` of `source` parsed as `file`, if any;
/// `design` is the checked design when the document has no error.
pub fn hover(
    file: &File,
    design: Option<&crate::model::Design>,
    source: &str,
    offset: usize,
) -> Option<(String, (usize, usize))> {
    let units = report_units(file);
    if let Some((w, span)) = quantity_at(&file.statements, offset) {
        return Some((describe_quantity(&w, units)?, span));
    }
    if let Some((word, span)) = super::symbols::word_at(source, offset) {
        if let Some(text) = word_meaning(file, design, source, &word, units) {
            return Some((text, span));
        }
    }
    super::meaning::pipe(design?, offset)
}

/// What a word means: a `let` constant, a fitting, a pump candidate.
fn word_meaning(
    file: &File,
    design: Option<&crate::model::Design>,
    source: &str,
    word: &str,
    units: ReportUnits,
) -> Option<String> {
    if let Some(value) = constant(file, word) {
        let text = &source[value.span.start..value.span.end];
        let mut out = format!("`let {word} = {text}`");
        if let ExprKind::Quantity { value: n, unit } = &value.kind {
            let w = Written {
                number: &n.text,
                value: n.value,
                unit: &unit.text,
            };
            if let Some(d) = describe_quantity(&w, units) {
                out.push_str("\n\n");
                out.push_str(&d);
            }
        }
        return Some(out);
    }
    if let Some(spec) = crate::hydraulics::fittings::fitting(word) {
        return Some(format!(
            "fitting `{}`: {}\n\nK: {}",
            spec.name, spec.description, spec.source
        ));
    }
    super::meaning::pump(design?, word)
}

/// The report units the file's `project { units = ... }` names (SI when absent).
fn report_units(file: &File) -> ReportUnits {
    let us = file.statements.iter().any(|s| match &s.kind {
        StatementKind::Block {
            keyword,
            body: Some(body),
            ..
        } if keyword.name == "project" => body.iter().any(|f| {
            matches!(&f.kind, StatementKind::Assign { path, value }
                    if path.dotted() == "units"
                        && matches!(&value.kind, ExprKind::Name(p) if p.dotted() == "us"))
        }),
        _ => false,
    });
    if us {
        ReportUnits::Us
    } else {
        ReportUnits::Si
    }
}

/// The value of the top-level `let NAME = ...`.
fn constant<'a>(file: &'a File, name: &str) -> Option<&'a Expr> {
    file.statements.iter().find_map(|s| match &s.kind {
        StatementKind::Let { name: n, value } if n.name == name => Some(value),
        _ => None,
    })
}

/// The quantity whose span holds `offset`, in statements, arguments, expressions and
/// curve-table cells.
fn quantity_at(statements: &[Statement], offset: usize) -> Option<(Written<'_>, (usize, usize))> {
    let inside = |a: usize, b: usize| a <= offset && offset <= b;
    for s in statements
        .iter()
        .filter(|s| inside(s.span.start, s.span.end))
    {
        let found = match &s.kind {
            StatementKind::Let { value, .. }
            | StatementKind::Assign { value, .. }
            | StatementKind::Condition { value, .. } => in_expr(value, offset),
            StatementKind::Block { args, body, .. } => in_args(args, offset)
                .or_else(|| body.as_deref().and_then(|b| quantity_at(b, offset))),
            StatementKind::Curve { args, table, .. } => in_args(args, offset).or_else(|| {
                let table = table.as_ref()?;
                table.rows.iter().find_map(|row| {
                    row.cells
                        .iter()
                        .zip(&table.columns)
                        .find_map(|(cell, column)| {
                            let n = cell.value.as_ref()?;
                            inside(cell.span.start, cell.span.end).then(|| {
                                let w = Written {
                                    number: &n.text,
                                    value: n.value,
                                    unit: &column.unit.text,
                                };
                                (w, (cell.span.start, cell.span.end))
                            })
                        })
                })
            }),
        };
        if found.is_some() {
            return found;
        }
    }
    None
}

fn in_args(args: &[Arg], offset: usize) -> Option<(Written<'_>, (usize, usize))> {
    args.iter().find_map(|a| match &a.kind {
        ArgKind::Quantity { value, unit } if a.span.start <= offset && offset <= a.span.end => {
            let w = Written {
                number: &value.text,
                value: value.value,
                unit: &unit.text,
            };
            Some((w, (a.span.start, a.span.end)))
        }
        _ => None,
    })
}

/// Depth-first through an expression; the depth is bounded by the parser's nesting limit.
fn in_expr(e: &Expr, offset: usize) -> Option<(Written<'_>, (usize, usize))> {
    if offset < e.span.start || offset > e.span.end {
        return None;
    }
    match &e.kind {
        ExprKind::Quantity { value, unit } => Some((
            Written {
                number: &value.text,
                value: value.value,
                unit: &unit.text,
            },
            (e.span.start, e.span.end),
        )),
        ExprKind::Neg(inner) | ExprKind::Paren(inner) => in_expr(inner, offset),
        ExprKind::Power { base, .. } => in_expr(base, offset),
        ExprKind::Binary { left, right, .. } => {
            in_expr(left, offset).or_else(|| in_expr(right, offset))
        }
        _ => None,
    }
}

/// "`40 ft`: a length — SI 12.192 m — report units 40.0 ft".
fn describe_quantity(w: &Written<'_>, units: ReportUnits) -> Option<String> {
    let unit = parse_unit(w.unit).ok()?;
    let q = Quantity::try_from_value(w.value, &unit).ok()?;
    let mut out = format!(
        "`{} {}`: {}\n\nSI: {} {}",
        w.number,
        w.unit,
        q.describe(),
        significant(q.si),
        si_symbol(q.dim, q.kind)
    );
    if q.kind == QuantityKind::TemperaturePoint {
        out.push_str(&format!(" ({} °C)", significant(q.si - 273.15)));
    }
    if let Some(shown) = report_shown(q.dim, q.kind, units) {
        let name = match units {
            ReportUnits::Si => "SI",
            ReportUnits::Us => "US customary",
        };
        out.push_str(&format!("\n\nReport units ({name}): {}", shown.fmt(q.si)));
    }
    Some(out)
}

/// The report unit of a dimension, where the package has one.
fn report_shown(dim: Dimension, kind: QuantityKind, units: ReportUnits) -> Option<Shown> {
    let u = Units::new(units);
    Some(match dim {
        d if d == Dimension::VOLUME_RATE => u.flow(),
        d if d == Dimension::LENGTH => u.length(),
        d if d == Dimension::PRESSURE => u.pressure(),
        d if d == Dimension::POWER => u.power(),
        d if d == Dimension::VELOCITY => u.velocity(),
        d if d == Dimension::TEMPERATURE && kind == QuantityKind::TemperaturePoint => {
            u.temperature()
        }
        d if d == Dimension::DENSITY => u.density(),
        d if d == Dimension::FREQUENCY => u.speed(),
        d if d == Dimension::VOLUME => u.volume(),
        d if d == Dimension::ENERGY => u.energy(),
        _ => return None,
    })
}

/// The coherent SI unit of a dimension: a named one where there is one, else the base
/// units with exponents.
fn si_symbol(dim: Dimension, kind: QuantityKind) -> String {
    const NAMED: &[(Dimension, &str)] = &[
        (Dimension::NONE, "(a number)"),
        (Dimension::LENGTH, "m"),
        (Dimension::MASS, "kg"),
        (Dimension::TIME, "s"),
        (Dimension::TEMPERATURE, "K"),
        (Dimension::AREA, "m²"),
        (Dimension::VOLUME, "m³"),
        (Dimension::VELOCITY, "m/s"),
        (Dimension::ACCELERATION, "m/s²"),
        (Dimension::VOLUME_RATE, "m³/s"),
        (Dimension::MASS_RATE, "kg/s"),
        (Dimension::FORCE, "N"),
        (Dimension::PRESSURE, "Pa"),
        (Dimension::DENSITY, "kg/m³"),
        (Dimension::DYNAMIC_VISCOSITY, "Pa·s"),
        (Dimension::KINEMATIC_VISCOSITY, "m²/s"),
        (Dimension::POWER, "W"),
        (Dimension::ENERGY, "J"),
        (Dimension::FREQUENCY, "1/s"),
        (Dimension::MONEY_PER_ENERGY, "(currency)/J"),
        (Dimension::MONEY_PER_TIME, "(currency)/s"),
        (Dimension::SPECIFIC_WEIGHT, "N/m³"),
    ];
    let base = NAMED
        .iter()
        .find(|(d, _)| *d == dim)
        .map_or_else(|| format!("({dim} in m, kg, s, K)"), |(_, s)| s.to_string());
    match kind {
        QuantityKind::GaugePressure => format!("{base} (gauge)"),
        QuantityKind::AbsolutePressure => format!("{base} (absolute)"),
        _ => base,
    }
}

/// Six significant digits, trailing zeros dropped; exponent form for very large or
/// small magnitudes.
pub(super) fn significant(x: f64) -> String {
    if x == 0.0 {
        return "0".into();
    }
    let magnitude = x.abs().log10().floor() as i32;
    if !(-4..=9).contains(&magnitude) {
        return format!("{x:.5e}");
    }
    let decimals = (5 - magnitude).max(0) as usize;
    let text = format!("{x:.decimals$}");
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        text
    }
}

#[cfg(test)]
mod tests {
    use super::significant;

    #[test]
    fn six_significant_digits() {
        assert_eq!(significant(12.192), "12.192");
        assert_eq!(significant(0.0441631), "0.0441631");
        assert_eq!(significant(101325.0), "101325");
        assert_eq!(significant(1.0e-7), "1.00000e-7");
    }
}
