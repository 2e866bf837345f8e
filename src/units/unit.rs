//! A parsed unit, its errors, and the one-currency rule.

use std::fmt;

use super::dimension::Dimension;
use super::quantity::QuantityKind;
use super::registry;

/// How a pressure value is referenced.
#[derive(Clone, Copy, PartialEq, Eq, Debug)]
pub enum PressureReference {
    /// Above the local barometric pressure (psig, kPa(g), bar(g), ...).
    Gauge,
    /// Above a perfect vacuum (psia, kPa(a), bar(a), ...).
    Absolute,
}

/// A unit expression resolved to SI: `SI value = value * factor + offset`.
#[derive(Clone, Debug, PartialEq)]
pub struct Unit {
    /// The unit as written.
    pub text: String,
    /// Multiplier to the coherent SI unit of `dim`.
    pub factor: f64,
    /// Non-zero only for the affine temperature scales (degC, degF) standing alone.
    pub offset: f64,
    /// The dimension of the unit.
    pub dim: Dimension,
    /// True for degC/degF/K/degR standing alone: the value is a temperature point.
    pub affine: bool,
    /// `Some` for psig/psia/kPa(g)/bar(a)...; `None` for plain Pa/psi/bar.
    pub pressure_ref: Option<PressureReference>,
}

impl Unit {
    /// The kind of value a number written in this unit is.
    pub fn kind(&self) -> QuantityKind {
        match (self.affine, self.pressure_ref) {
            (true, _) => QuantityKind::TemperaturePoint,
            (false, Some(PressureReference::Gauge)) => QuantityKind::GaugePressure,
            (false, Some(PressureReference::Absolute)) => QuantityKind::AbsolutePressure,
            (false, None) => QuantityKind::Plain,
        }
    }

    /// The currency code this unit mentions (`"USD"` for `USD/kWh`), if any. A unit that
    /// parsed successfully mentions at most one currency.
    pub fn currency(&self) -> Option<&'static str> {
        currency_in(&self.text).map(|(_, code)| code)
    }
}

/// The first currency name in a unit text, with its byte offset.
pub(crate) fn currency_in(text: &str) -> Option<(usize, &'static str)> {
    let is_name_char = |c: char| c.is_ascii_alphanumeric() || c == '_';
    let mut start = None;
    for (i, c) in text
        .char_indices()
        .chain(std::iter::once((text.len(), ' ')))
    {
        match (is_name_char(c), start) {
            (true, None) => start = Some(i),
            (false, Some(s)) => {
                start = None;
                let found = registry::lookup(&text[s..i]).filter(|d| registry::is_currency(d));
                if let Some(d) = found {
                    return Some((s, d.name));
                }
            }
            _ => {}
        }
    }
    None
}

/// An error in a unit expression. `offset`/`len` are a byte range inside the unit text.
#[derive(Clone, Debug, PartialEq)]
pub struct UnitError {
    /// What is wrong, in one sentence.
    pub message: String,
    /// Byte offset of the offending part inside the unit text.
    pub offset: usize,
    /// Byte length of the offending part (0 for "something is missing at the end").
    pub len: usize,
    /// Known unit names the writer may have meant, best first.
    pub suggestions: Vec<String>,
}

impl UnitError {
    pub(crate) fn new(message: impl Into<String>, offset: usize, len: usize) -> Self {
        UnitError {
            message: message.into(),
            offset,
            len,
            suggestions: Vec::new(),
        }
    }
}

impl fmt::Display for UnitError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)?;
        if !self.suggestions.is_empty() {
            write!(f, " (did you mean {}?)", self.suggestions.join(", "))?;
        }
        Ok(())
    }
}

impl std::error::Error for UnitError {}

/// Enforces "one design, one currency": dutyline has no exchange rates, so money values in
/// different currencies must not meet. Feed it every unit of a design; the first currency
/// seen wins and any other is an error pointing at the currency name.
#[derive(Clone, Debug, Default)]
pub struct CurrencyGuard {
    first: Option<&'static str>,
}

impl CurrencyGuard {
    /// A guard that has seen no currency yet.
    pub fn new() -> Self {
        Self::default()
    }

    /// The currency of the design so far.
    pub fn currency(&self) -> Option<&'static str> {
        self.first
    }

    /// Accepts a unit without a currency or with the design's currency.
    pub fn check(&mut self, unit: &Unit) -> Result<(), UnitError> {
        let Some((offset, code)) = currency_in(&unit.text) else {
            return Ok(());
        };
        match self.first {
            None => {
                self.first = Some(code);
                Ok(())
            }
            Some(first) if first == code => Ok(()),
            Some(first) => {
                let message = format!(
                    "this design already uses {first}; dutyline does not convert currencies, \
                     so {code} cannot be mixed in"
                );
                let mut err = UnitError::new(message, offset, code.len());
                err.suggestions = vec![first.to_string()];
                Err(err)
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::super::parse_unit;
    use super::*;

    #[test]
    fn units_know_their_currency() {
        let price = parse_unit("USD/kWh").expect("valid unit");
        assert_eq!(price.currency(), Some("USD"));
        let neutral = parse_unit("cu/MWh").expect("valid unit");
        assert_eq!(neutral.currency(), Some("cu"));
        assert_eq!(parse_unit("kPa(g)").expect("valid").currency(), None);
    }

    #[test]
    fn guard_rejects_a_second_currency_and_points_at_it() {
        let mut guard = CurrencyGuard::new();
        let usd = parse_unit("USD/kWh").expect("valid unit");
        let eur = parse_unit("kWh/EUR").expect("valid unit");
        assert!(guard.check(&parse_unit("m").expect("valid")).is_ok());
        assert!(guard.check(&usd).is_ok());
        assert!(guard.check(&usd).is_ok());
        let err = guard.check(&eur).expect_err("EUR after USD");
        assert_eq!((err.offset, err.len), (4, 3));
        assert_eq!(err.suggestions, vec!["USD".to_string()]);
        assert_eq!(guard.currency(), Some("USD"));
    }
}
