//! Operation settings: the motor standard and margins, and the energy price and life.

use crate::diagnostics::Code;
use crate::diagnostics::Diagnostic;
use crate::model::design::*;
use crate::model::eval::{self, expect_dim, expect_number, Env};
use crate::model::fields::read_fields;
use crate::model::ranges;
use crate::syntax::ast::Statement;
use crate::units::Dimension;

/// The fields of `motor { ... }`.
pub(crate) const MOTOR_FIELDS: &[&str] = &[
    "standard",
    "service_factor",
    "efficiency",
    "drive_efficiency",
    "supply",
];
/// The fields of `energy { ... }`.
pub(crate) const ENERGY_FIELDS: &[&str] = &[
    "price",
    "years",
    "discount_rate",
    "escalation",
    "rates",
    "inflation",
];

pub fn lower_motor(
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
        supply_hz: None,
        motor_table: None,
        drive_losses: None,
    };
    let f = read_fields(body.unwrap_or(&[]), "motor", MOTOR_FIELDS, d);
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
                            Code::OutOfRange,
                            "a service factor lies between 1.0 and 1.5",
                            Some(field.value.span),
                        ));
                    }
                    m.service_factor = v;
                }
                "supply" => {
                    let q = expect_dim(field.value, env, Dimension::FREQUENCY, "supply frequency")?;
                    if !((q.si - 50.0).abs() < 1e-9 || (q.si - 60.0).abs() < 1e-9) {
                        return Err(Diagnostic::error(
                            Code::OutOfRange,
                            "the supply frequency is 50 Hz or 60 Hz",
                            Some(field.value.span),
                        )
                        .with_help("IEC 60034-30-1 tabulates motor efficiency classes for 50 Hz and 60 Hz supplies only; write `supply = 50 Hz` or `supply = 60 Hz`"));
                    }
                    m.supply_hz = Some(q.si);
                }
                name => {
                    let v = expect_number(field.value, env, name)?;
                    if !(v > 0.3 && v <= 1.0) {
                        return Err(Diagnostic::error(
                            Code::OutOfRange,
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
    super::motor_tables::lower_motor_tables(&f.rest, &mut m, d);
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

pub fn lower_energy(
    body: Option<&[Statement]>,
    env: &Env,
    d: &mut Vec<Diagnostic>,
) -> EnergySettings {
    let mut e = EnergySettings {
        price_per_joule: None,
        currency: "cu".into(),
        years: 0.0,
        discount_rate: 0.0,
        escalation: 0.0,
        rates: crate::model::operation::RateBasis::Real,
        inflation: 0.0,
    };
    let f = read_fields(body.unwrap_or(&[]), "energy", ENERGY_FIELDS, d);
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
                            Code::OutOfRange,
                            "an energy price must not be negative",
                            Some(field.value.span),
                        ));
                    }
                    e.price_per_joule =
                        Some(env.in_range(&ranges::ENERGY_PRICE, q.si, field.value.span)?);
                    if let crate::syntax::ast::ExprKind::Quantity { unit, .. } = &field.value.kind {
                        e.currency = unit.text.split('/').next().unwrap_or("cu").to_string();
                    }
                }
                "years" => {
                    let v = expect_number(field.value, env, "years")?;
                    if !(0.0..=100.0).contains(&v) {
                        return Err(Diagnostic::error(
                            Code::OutOfRange,
                            "the life in years lies between 0 and 100",
                            Some(field.value.span),
                        ));
                    }
                    e.years = v;
                }
                "rates" => {
                    e.rates =
                        match eval::expect_word(field.value, env, "rates", &["real", "nominal"])?
                            .as_str()
                        {
                            "nominal" => crate::model::operation::RateBasis::Nominal,
                            _ => crate::model::operation::RateBasis::Real,
                        }
                }
                name => {
                    let v = expect_number(field.value, env, name)?;
                    if !(-0.5..=1.0).contains(&v) {
                        return Err(Diagnostic::error(
                            Code::OutOfRange,
                            format!("{name} is a yearly rate, e.g. `5 %`"),
                            Some(field.value.span),
                        ));
                    }
                    let v = env.in_range(&ranges::YEARLY_RATE, v, field.value.span)?;
                    match name {
                        "discount_rate" => e.discount_rate = v,
                        "inflation" => e.inflation = v,
                        _ => e.escalation = v,
                    }
                }
            }
            Ok(())
        })();
        if let Err(x) = r {
            d.push(x);
        }
    }
    if let (crate::model::operation::RateBasis::Real, Some(at)) =
        (e.rates, f.get("inflation").map(|x| x.value.span))
    {
        // Real and nominal rates are never mixed (HI/Europump, Pump Life Cycle Costs, 2001).
        d.push(
            Diagnostic::error(
                Code::MixedRates,
                "`inflation` is only used with `rates = nominal`; real rates already exclude general inflation",
                Some(at),
            )
            .with_help("write `rates = nominal` with nominal discount and escalation rates, or drop `inflation`"),
        );
    }
    e
}
