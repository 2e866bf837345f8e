//! Evaluating expressions to values, with dimension checks at the literal.

use crate::diagnostics::Code;
use std::collections::BTreeMap;

use crate::diagnostics::{Diagnostic, Span};
use crate::syntax::ast::{BinaryOp, Expr, ExprKind, Number, UnitText};
use crate::units::{self, Dimension, Quantity, QuantityKind};

/// The value of an expression.
#[derive(Clone, Debug, PartialEq)]
pub enum Value {
    /// A number with its unit (dimension and SI value).
    Quantity(Quantity),
    /// A quoted text.
    Text(String),
    /// A date, `YYYY-MM-DD`.
    Date(String),
    /// A bare keyword value such as `aged`, `nema` or `us`.
    Word(String),
}

impl Value {
    /// The kind of value in words, for messages ("a length", "a quoted text").
    pub fn describe(&self) -> String {
        match self {
            Value::Quantity(q) => describe_quantity(q),
            Value::Text(_) => "a quoted text".into(),
            Value::Date(_) => "a date".into(),
            Value::Word(w) => format!("the word `{w}`"),
        }
    }
}

fn describe_quantity(q: &Quantity) -> String {
    match q.kind {
        QuantityKind::TemperaturePoint => "a temperature".into(),
        QuantityKind::GaugePressure => "a gauge pressure".into(),
        QuantityKind::AbsolutePressure => "an absolute pressure".into(),
        QuantityKind::Plain => q.dim.describe(),
    }
}

/// `let` constants in scope, by name.
#[derive(Default)]
pub struct Env {
    /// Each constant's value and where it is defined.
    pub constants: BTreeMap<String, (Value, Span)>,
    /// Warnings of setters that return only an error (unusual values); `lower` drains them.
    pub warnings: std::cell::RefCell<Vec<Diagnostic>>,
}

impl Env {
    /// Check a value against its range ([`super::ranges`]): an error outside the possible
    /// range; a warning, kept here, outside the usual band.
    pub fn in_range(
        &self,
        range: &super::ranges::Range,
        si: f64,
        span: Span,
    ) -> Result<f64, Diagnostic> {
        let (v, warning) = range.check(si, span)?;
        self.warnings.borrow_mut().extend(warning);
        Ok(v)
    }
}

/// Turn a unit as written into a unit, or a located diagnostic with suggestions.
pub fn unit(text: &UnitText) -> Result<units::Unit, Diagnostic> {
    units::parse_unit(&text.text).map_err(|e| {
        let start = text.span.start + e.offset.min(text.text.len());
        let end = (start + e.len.max(1)).min(text.span.end.max(start + 1));
        let mut d = Diagnostic::error(
            Code::UnknownUnit,
            e.message.clone(),
            Some(Span::new(start, end)),
        )
        .with_label("not a known unit");
        d = if e.suggestions.is_empty() {
            d.with_help("see grammar/LANGUAGE.md for the accepted units")
        } else {
            d.with_help(format!("did you mean {}?", quote_list(&e.suggestions)))
        };
        d
    })
}

/// "`a`, `b` or `c`"
pub fn quote_list<S: AsRef<str>>(items: &[S]) -> String {
    let q: Vec<String> = items.iter().map(|s| format!("`{}`", s.as_ref())).collect();
    match q.len() {
        0 => String::new(),
        1 => q[0].clone(),
        n => format!("{} or {}", q[..n - 1].join(", "), q[n - 1]),
    }
}

/// A number with its unit as a quantity.
pub fn quantity_literal(value: &Number, text: &UnitText) -> Result<Quantity, Diagnostic> {
    let u = unit(text)?;
    let q = Quantity::from_value(value.value, &u);
    if !q.si.is_finite() {
        return Err(Diagnostic::error(
            Code::NumberOutOfRange,
            format!("`{} {}` is too large to represent", value.text, text.text),
            Some(text.span),
        ));
    }
    Ok(q)
}

/// Evaluate an expression.
pub fn eval(expr: &Expr, env: &Env) -> Result<Value, Diagnostic> {
    match &expr.kind {
        ExprKind::Number(n) => Ok(Value::Quantity(Quantity::number(n.value))),
        ExprKind::Quantity { value, unit } => quantity_literal(value, unit).map(Value::Quantity),
        ExprKind::Text(t) => Ok(Value::Text(t.clone())),
        ExprKind::Date(d) => Ok(Value::Date(d.clone())),
        ExprKind::Name(path) => {
            let name = path.dotted();
            match env.constants.get(&name) {
                Some((v, _)) => Ok(v.clone()),
                None if path.parts.len() == 1 => Ok(Value::Word(name)),
                None => Err(Diagnostic::error(
                    Code::UnknownName,
                    format!("`{name}` is not a known constant"),
                    Some(path.span),
                )
                .with_label("unknown name")
                .with_help("constants are defined with `let name = value` before they are used")),
            }
        }
        ExprKind::Paren(inner) => eval(inner, env),
        ExprKind::Neg(inner) => match &inner.kind {
            // `-5 degC` is a negative temperature, not the negation of one.
            ExprKind::Quantity { value, unit } => {
                let neg = Number {
                    text: format!("-{}", value.text),
                    value: -value.value,
                };
                quantity_literal(&neg, unit).map(Value::Quantity)
            }
            _ => match eval(inner, env)? {
                Value::Quantity(q) => Ok(Value::Quantity(q.neg())),
                other => Err(not_a_number(&other, inner.span)),
            },
        },
        ExprKind::Power { base, exponent } => {
            let q = eval_quantity(base, env)?;
            q.powi(*exponent)
                .map(Value::Quantity)
                .map_err(|e| Diagnostic::error(Code::BadArithmetic, e.message, Some(expr.span)))
        }
        ExprKind::Binary { op, left, right } => {
            let a = eval_quantity(left, env)?;
            let b = eval_quantity(right, env)?;
            let r = match op {
                BinaryOp::Add => a.add(b),
                BinaryOp::Sub => a.sub(b),
                BinaryOp::Mul => a.mul(b),
                BinaryOp::Div => a.div(b),
            };
            r.map(Value::Quantity).map_err(|e| {
                Diagnostic::error(Code::BadArithmetic, e.message, Some(expr.span)).with_label(
                    format!(
                        "{} {} {}",
                        describe_quantity(&a),
                        op.symbol(),
                        describe_quantity(&b)
                    ),
                )
            })
        }
    }
}

fn not_a_number(v: &Value, span: Span) -> Diagnostic {
    let mut d = Diagnostic::error(
        Code::ExpectedNumber,
        format!("expected a number, found {}", v.describe()),
        Some(span),
    )
    .with_label("not a number");
    if let Value::Word(w) = v {
        d = d.with_help(format!(
            "`{w}` is not a defined constant; define it with `let {w} = ...` first"
        ));
    }
    d
}

/// Evaluate to a quantity (any dimension).
pub fn eval_quantity(expr: &Expr, env: &Env) -> Result<Quantity, Diagnostic> {
    match eval(expr, env)? {
        Value::Quantity(q) => Ok(q),
        other => Err(not_a_number(&other, expr.span)),
    }
}

/// The span of the literal that gave an expression its unit, for pointing at `40 psi`.
fn literal_span(expr: &Expr) -> Span {
    expr.span
}

/// Evaluate to a quantity of the expected dimension; `what` names the field.
pub fn expect_dim(
    expr: &Expr,
    env: &Env,
    dim: Dimension,
    what: &str,
) -> Result<Quantity, Diagnostic> {
    let q = eval_quantity(expr, env)?;
    if q.dim != dim {
        let found = match &expr.kind {
            ExprKind::Quantity { unit, .. } => format!("{} ({})", describe_quantity(&q), unit.text),
            _ => describe_quantity(&q),
        };
        let mut d = Diagnostic::error(
            Code::UnitMismatch,
            format!("{what}: expected {}, found {found}", dim.describe()),
            Some(literal_span(expr)),
        )
        .with_label(format!("expected {}", dim.describe()));
        d = d.with_help(example_units(dim));
        return Err(d);
    }
    if q.kind == QuantityKind::TemperaturePoint && dim == Dimension::TEMPERATURE {
        return Ok(q);
    }
    Ok(q)
}

/// A temperature point (not a difference).
pub fn expect_temperature(expr: &Expr, env: &Env, what: &str) -> Result<f64, Diagnostic> {
    let q = expect_dim(expr, env, Dimension::TEMPERATURE, what)?;
    if q.kind != QuantityKind::TemperaturePoint {
        return Err(Diagnostic::error(
            Code::UnitMismatch,
            format!("{what}: expected a temperature, found a temperature difference"),
            Some(expr.span),
        )
        .with_label("a difference, not a temperature")
        .with_help("write a temperature as `15 degC`, `59 degF` or `288.15 K`"));
    }
    if q.si <= 0.0 {
        return Err(Diagnostic::error(
            Code::OutOfRange,
            format!("{what}: below absolute zero"),
            Some(expr.span),
        ));
    }
    Ok(q.si)
}

/// A dimensionless number; `%` is accepted.
pub fn expect_number(expr: &Expr, env: &Env, what: &str) -> Result<f64, Diagnostic> {
    Ok(expect_dim(expr, env, Dimension::NONE, what)?.si)
}

/// A text value.
pub fn expect_text(expr: &Expr, env: &Env, what: &str) -> Result<String, Diagnostic> {
    match eval(expr, env)? {
        Value::Text(t) => Ok(t),
        other => Err(Diagnostic::error(
            Code::ExpectedText,
            format!("{what}: expected a quoted text, found {}", other.describe()),
            Some(expr.span),
        )
        .with_help("put text in double quotes: \"...\"")),
    }
}

/// One of a set of keyword values.
pub fn expect_word(
    expr: &Expr,
    env: &Env,
    what: &str,
    allowed: &[&str],
) -> Result<String, Diagnostic> {
    match eval(expr, env)? {
        Value::Word(w) if allowed.contains(&w.as_str()) => Ok(w),
        other => Err(Diagnostic::error(
            Code::ExpectedWord,
            format!(
                "{what}: expected {}, found {}",
                quote_list(allowed),
                other.describe()
            ),
            Some(expr.span),
        )
        .with_label(format!("expected {}", quote_list(allowed)))),
    }
}

/// Typical units for a dimension, for help lines.
pub fn example_units(dim: Dimension) -> String {
    let ex = if dim == Dimension::LENGTH {
        "m, mm, ft or in"
    } else if dim == Dimension::PRESSURE {
        "kPa, bar, psi, psig or kPa(g)"
    } else if dim == Dimension::VOLUME_RATE {
        "m^3/h, L/s, gpm or ft^3/s"
    } else if dim == Dimension::TEMPERATURE {
        "degC, degF or K"
    } else if dim == Dimension::DENSITY {
        "kg/m^3 or lb/ft^3"
    } else if dim == Dimension::DYNAMIC_VISCOSITY {
        "cP or Pa*s"
    } else if dim == Dimension::KINEMATIC_VISCOSITY {
        "cSt or m^2/s"
    } else if dim == Dimension::POWER {
        "kW, W or hp"
    } else if dim == Dimension::TIME {
        "h, day or year"
    } else if dim == Dimension::FREQUENCY {
        "rpm or 1/s"
    } else if dim == Dimension::MONEY_PER_ENERGY {
        "USD/kWh or cu/kWh"
    } else if dim == Dimension::NONE {
        "a plain number or a percentage such as 85 %"
    } else if dim == Dimension::VELOCITY {
        "m/s or ft/s"
    } else {
        "see grammar/LANGUAGE.md"
    };
    format!("write it with a unit such as {ex}")
}
