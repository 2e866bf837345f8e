//! Lowering `uncertainty { ... }`: the fields `combine` and `samples`, and one range per
//! statement, written as a keyword and its arguments (`roughness 50 % to 200 %`,
//! `level clearwell 0.4 m`), so the grammar needs no new form.

use super::Blocks;
use crate::diagnostics::{Code, Diagnostic, Span};
use crate::model::design::{Fluid, PumpCandidate, Scenario};
use crate::model::eval::{self, Env};
use crate::model::fields::read_fields;
use crate::model::uncertainty::*;
use crate::syntax::ast::{Arg, ArgKind, StatementKind};
use crate::units::{Dimension, QuantityKind};

/// The fields of `uncertainty { ... }`.
pub(crate) const UNCERTAINTY_FIELDS: &[&str] = &["combine", "samples"];
/// The range statements of `uncertainty { ... }`.
pub(crate) const UNCERTAINTY_ITEMS: &[&str] = &[
    "roughness",
    "hazen_williams_c",
    "level",
    "temperature",
    "loss",
];

fn bad(message: impl Into<String>, span: Span, help: &str) -> Diagnostic {
    Diagnostic::error(Code::BadUncertainty, message, Some(span)).with_help(help.to_string())
}

/// The uncertainty of the design: the block's, or corners with no input range when only
/// a pump's `test_grade` asks for an envelope, or `None` (no envelope at all).
pub fn lower_uncertainty(
    blocks: &Blocks,
    base: Option<&Scenario>,
    pumps: &[PumpCandidate],
    env: &Env,
    d: &mut Vec<Diagnostic>,
) -> Option<Uncertainty> {
    let Some(block) = blocks.one("uncertainty") else {
        return pumps
            .iter()
            .any(|p| p.test_grade.is_some())
            .then_some(Uncertainty {
                combine: Combine::Corners,
                inputs: Vec::new(),
                span: None,
            });
    };
    let f = read_fields(block.statements(), "uncertainty", UNCERTAINTY_FIELDS, d);
    let combine = combine(&f, env, d);
    let mut inputs: Vec<InputRange> = Vec::new();
    for st in &f.rest {
        let StatementKind::Block { keyword, args, .. } = &st.kind else {
            d.push(bad(
                "`uncertainty` holds `combine`, `samples` and ranges",
                st.span,
                "write a range as e.g. `roughness 50 % to 200 %` or `level clearwell 0.4 m`",
            ));
            continue;
        };
        let Some(item) = UNCERTAINTY_ITEMS.iter().find(|k| **k == keyword.name) else {
            d.push(bad(
                format!("`{}` is not a range of `uncertainty`", keyword.name),
                keyword.span,
                &format!("ranges are {}", eval::quote_list(UNCERTAINTY_ITEMS)),
            ));
            continue;
        };
        match range(item, args, st.span, base) {
            Ok(kind) if inputs.iter().any(|i| same_input(&i.kind, &kind)) => d.push(bad(
                format!("the range of `{item}` is given twice"),
                st.span,
                "keep one of them",
            )),
            Ok(kind) => inputs.push(InputRange {
                kind,
                span: st.span,
            }),
            Err(e) => d.push(e),
        }
    }
    if inputs.len() > MAX_INPUTS {
        d.push(bad(
            format!("{} ranges; at most {MAX_INPUTS} are accepted", inputs.len()),
            block.span,
            "drop the ranges that move the duty least",
        ));
    }
    Some(Uncertainty {
        combine,
        inputs,
        span: Some(block.span),
    })
}

/// `combine = corners | samples` with `samples = N`.
fn combine(f: &crate::model::fields::Fields, env: &Env, d: &mut Vec<Diagnostic>) -> Combine {
    let word = match f.get("combine") {
        Some(c) => eval::expect_word(c.value, env, "combine", &["corners", "samples"])
            .map_err(|e| d.push(e))
            .unwrap_or_else(|_| "corners".into()),
        None => "corners".into(),
    };
    let n = f.get("samples").map(|s| {
        let v = eval::expect_number(s.value, env, "samples").map_err(|e| d.push(e));
        match v {
            Ok(v) if v.fract() == 0.0 && (SAMPLES.0 as f64..=SAMPLES.1 as f64).contains(&v) => {
                Some(v as u32)
            }
            Ok(_) => {
                d.push(bad(
                    format!(
                        "`samples` is a whole number from {} to {}",
                        SAMPLES.0, SAMPLES.1
                    ),
                    s.value.span,
                    "e.g. `samples = 64`",
                ));
                None
            }
            Err(()) => None,
        }
    });
    match (word.as_str(), n) {
        ("samples", Some(Some(n))) => Combine::Samples(n),
        ("samples", None) => {
            d.push(bad(
                "`combine = samples` needs `samples = N`",
                f.get("combine").map_or(Span::new(0, 0), |c| c.span),
                "add e.g. `samples = 64`",
            ));
            Combine::Corners
        }
        ("corners", Some(_)) => {
            let s = f.get("samples").map_or(Span::new(0, 0), |s| s.span);
            d.push(bad(
                "`samples` is given but the ranges combine by corners",
                s,
                "add `combine = samples`, or drop `samples`",
            ));
            Combine::Corners
        }
        _ => Combine::Corners,
    }
}

fn same_input(a: &RangeKind, b: &RangeKind) -> bool {
    match (a, b) {
        (RangeKind::Level { tank: x, .. }, RangeKind::Level { tank: y, .. }) => x == y,
        _ => std::mem::discriminant(a) == std::mem::discriminant(b),
    }
}

/// A literal argument as a quantity (a plain number is dimensionless).
fn literal(a: &Arg) -> Result<crate::units::Quantity, Diagnostic> {
    match &a.kind {
        ArgKind::Quantity { value, unit } => eval::quantity_literal(value, unit),
        ArgKind::Number(n) => Ok(crate::units::Quantity::number(n.value)),
        _ => Err(bad(
            "a range takes numbers with their units",
            a.span,
            "e.g. `roughness 50 % to 200 %`",
        )),
    }
}

/// `A to B` (two values) or `A` (one value, a ± half-range).
fn values(args: &[Arg], span: Span) -> Result<Vec<crate::units::Quantity>, Diagnostic> {
    match args {
        [a] => Ok(vec![literal(a)?]),
        [a, Arg {
            kind: ArgKind::Word(w),
            ..
        }, b]
            if w == "to" =>
        {
            Ok(vec![literal(a)?, literal(b)?])
        }
        _ => Err(bad(
            "a range is `LOW to HIGH` or a single ± value",
            span,
            "e.g. `roughness 50 % to 200 %`, `loss 20 %`",
        )),
    }
}

fn range(
    item: &str,
    args: &[Arg],
    span: Span,
    base: Option<&Scenario>,
) -> Result<RangeKind, Diagnostic> {
    match item {
        "roughness" | "hazen_williams_c" => {
            let v = values(args, span)?;
            let spread = spread(item, &v, span)?;
            Ok(if item == "roughness" {
                RangeKind::Roughness(spread)
            } else {
                RangeKind::HazenWilliamsC(spread)
            })
        }
        "level" => level_range(args, span, base),
        "temperature" => temperature_range(args, span, base),
        _ => {
            let v = one_value(args, span, Dimension::NONE, "a percentage, e.g. `20 %`")?;
            positive(
                v,
                1.0,
                span,
                "the tolerance on stated losses is ± above 0 and at most 100 %",
            )?;
            Ok(RangeKind::Loss { plus_minus: v })
        }
    }
}

fn one_value(args: &[Arg], span: Span, dim: Dimension, what: &str) -> Result<f64, Diagnostic> {
    match args {
        [a] => {
            let q = literal(a)?;
            if q.dim != dim {
                return Err(bad(
                    format!("expected {what}"),
                    a.span,
                    "the range is ± about each case's value",
                ));
            }
            Ok(q.si)
        }
        _ => Err(bad(
            format!("expected one value, {what}"),
            span,
            "the range is ± about each case's value",
        )),
    }
}

fn positive(v: f64, max: f64, span: Span, message: &str) -> Result<(), Diagnostic> {
    if v.is_finite() && v > 0.0 && v <= max {
        Ok(())
    } else {
        Err(bad(
            message,
            span,
            "write the half-range, e.g. `0.4 m` for ±0.4 m",
        ))
    }
}

/// Factors (`50 % to 200 %`: low ≤ 100 % ≤ high) or absolute values (`0.03 mm to 0.3 mm`,
/// `100 to 130` for C).
fn spread(item: &str, v: &[crate::units::Quantity], span: Span) -> Result<Spread, Diagnostic> {
    let [lo, hi] = v else {
        return Err(bad(
            format!("`{item}` takes `LOW to HIGH`"),
            span,
            "e.g. `roughness 50 % to 200 %`",
        ));
    };
    let percent = |q: &crate::units::Quantity| {
        q.dim == Dimension::NONE && item == "roughness"
            || q.dim == Dimension::NONE && item == "hazen_williams_c" && q.si <= 3.0
    };
    let s = if percent(lo) && percent(hi) {
        if !(lo.si > 0.0 && lo.si <= 1.0 && hi.si >= 1.0 && hi.si <= 10.0) {
            return Err(bad(
                "factors run from above 0 to at most 100 % (low) and from 100 % to 1000 % (high)",
                span,
                "e.g. `roughness 50 % to 200 %`; each pipe's own value is 100 %",
            ));
        }
        Spread::Factor(lo.si, hi.si)
    } else if item == "roughness" && lo.dim == Dimension::LENGTH && hi.dim == Dimension::LENGTH {
        if !(lo.si >= 0.0 && hi.si > lo.si && hi.si <= 0.01) {
            return Err(bad(
                "an absolute roughness range runs from LOW to a larger HIGH, at most 10 mm",
                span,
                "e.g. `roughness 0.03 mm to 0.3 mm`",
            ));
        }
        Spread::Absolute(lo.si, hi.si)
    } else if item == "hazen_williams_c" && lo.dim == Dimension::NONE && hi.dim == Dimension::NONE {
        if !(lo.si >= 40.0 && hi.si > lo.si && hi.si <= 160.0) {
            return Err(bad(
                "a Hazen-Williams C range runs from LOW to a larger HIGH within 40 to 160",
                span,
                "e.g. `hazen_williams_c 100 to 130`, or factors `90 % to 105 %`",
            ));
        }
        Spread::Absolute(lo.si, hi.si)
    } else {
        return Err(bad(
            format!(
                "`{item}` takes factors (`%`) or {}",
                if item == "roughness" {
                    "lengths"
                } else {
                    "C values"
                }
            ),
            span,
            "e.g. `roughness 50 % to 200 %`",
        ));
    };
    Ok(s)
}

/// `level TANK D`: the source or destination tank, ± D.
fn level_range(args: &[Arg], span: Span, base: Option<&Scenario>) -> Result<RangeKind, Diagnostic> {
    let (tank, rest) = match args.split_first() {
        Some((
            Arg {
                kind: ArgKind::Word(t),
                span: ts,
            },
            rest,
        )) => {
            let known = base.is_none_or(|b| b.source.name == *t || b.destination.name == *t);
            if !known {
                return Err(bad(
                    format!("`{t}` is neither the source nor the destination tank"),
                    *ts,
                    "a level range applies to the tank the pump draws from or delivers to",
                ));
            }
            (t.clone(), rest)
        }
        _ => {
            return Err(bad(
                "a level range names its tank",
                span,
                "e.g. `level clearwell 0.4 m`",
            ))
        }
    };
    let v = one_value(rest, span, Dimension::LENGTH, "a length, e.g. `0.4 m`")?;
    positive(
        v,
        50.0,
        span,
        "the level range is ± a length above zero and at most 50 m",
    )?;
    Ok(RangeKind::Level {
        tank,
        plus_minus_m: v,
    })
}

/// `temperature D`: water only, ± a temperature difference.
fn temperature_range(
    args: &[Arg],
    span: Span,
    base: Option<&Scenario>,
) -> Result<RangeKind, Diagnostic> {
    if let Some(Fluid::Custom(_)) = base.map(|b| &b.fluid) {
        return Err(bad("a temperature range needs water: a named liquid states its properties at one temperature", span, "drop the range, or give cases at the other temperatures"));
    }
    let q = match args {
        [a] => literal(a)?,
        _ => {
            return Err(bad(
                "a temperature range is one ± value",
                span,
                "e.g. `temperature 4 K`",
            ))
        }
    };
    if q.dim != Dimension::TEMPERATURE {
        return Err(bad(
            "a temperature range is a temperature difference",
            span,
            "e.g. `temperature 4 K` or `temperature 5 delta_degF`",
        ));
    }
    // A scale unit standing alone (`4 K`, `5 degC`) is read as that many degrees.
    let dt = match (q.kind, &args[0].kind) {
        (QuantityKind::TemperaturePoint, ArgKind::Quantity { unit, value }) => {
            let zero = crate::syntax::ast::Number {
                text: "0".into(),
                value: 0.0,
            };
            q.si - eval::quantity_literal(&zero, unit)?.si + 0.0 * value.value
        }
        _ => q.si,
    };
    positive(
        dt,
        40.0,
        span,
        "the temperature range is ± a difference above zero and at most 40 K",
    )?;
    Ok(RangeKind::Temperature { plus_minus_k: dt })
}
