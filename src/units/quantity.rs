//! Quantities: an SI value with its dimension and kind, and their checked arithmetic.

use std::fmt;

use super::dimension::Dimension;
use super::unit::Unit;

/// A value in SI with its dimension and what kind of value it is.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Quantity {
    /// The value in coherent SI units (kelvin from absolute zero for a temperature point).
    pub si: f64,
    /// The dimension of the value.
    pub dim: Dimension,
    /// What kind of value it is.
    pub kind: QuantityKind,
}

/// What kind of value a quantity is: the algebra of points differs from that of differences.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum QuantityKind {
    /// An ordinary value, including temperature and pressure differences.
    Plain,
    /// A temperature on a scale (written in degC, degF, K or degR standing alone).
    TemperaturePoint,
    /// A pressure above the local barometric pressure.
    GaugePressure,
    /// A pressure above a perfect vacuum.
    AbsolutePressure,
}

/// An error of quantity arithmetic or conversion.
#[derive(Clone, Debug, PartialEq)]
pub struct QuantityError {
    /// What is wrong, in one sentence.
    pub message: String,
}

impl fmt::Display for QuantityError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.message)
    }
}

impl std::error::Error for QuantityError {}

fn fail<T>(message: impl Into<String>) -> Result<T, QuantityError> {
    Err(QuantityError {
        message: message.into(),
    })
}

const TOO_LARGE: &str = "result is too large";
const TOO_LARGE_DIM: &str = "result is too large: its dimension exponents overflow";

impl Quantity {
    /// A number written in `unit`: applies factor and offset and sets the kind
    /// (`20 degC` is the point 293.15 K; `20 psig` is a gauge pressure). A non-finite
    /// `value` gives a non-finite `si`; use [`Quantity::try_from_value`] to reject it.
    pub fn from_value(value: f64, unit: &Unit) -> Quantity {
        let offset = if unit.affine { unit.offset } else { 0.0 };
        Quantity {
            si: value * unit.factor + offset,
            dim: unit.dim,
            kind: unit.kind(),
        }
    }

    /// Like [`Quantity::from_value`], but an error if the SI value is not finite.
    pub fn try_from_value(value: f64, unit: &Unit) -> Result<Quantity, QuantityError> {
        let q = Quantity::from_value(value, unit);
        q.finite()
    }

    /// A dimensionless number.
    pub fn number(v: f64) -> Quantity {
        Quantity {
            si: v,
            dim: Dimension::NONE,
            kind: QuantityKind::Plain,
        }
    }

    /// "a temperature", "a temperature difference", "a gauge pressure", "a length", ...
    pub fn describe(&self) -> String {
        match self.kind {
            QuantityKind::TemperaturePoint => "a temperature".to_string(),
            QuantityKind::GaugePressure => "a gauge pressure".to_string(),
            QuantityKind::AbsolutePressure => "an absolute pressure".to_string(),
            QuantityKind::Plain if self.dim == Dimension::TEMPERATURE => {
                "a temperature difference".to_string()
            }
            QuantityKind::Plain => self.dim.describe(),
        }
    }

    fn finite(self) -> Result<Quantity, QuantityError> {
        if self.si.is_finite() {
            Ok(self)
        } else {
            fail(TOO_LARGE)
        }
    }

    fn same_dim(&self, o: &Quantity, verb: &str, joint: &str) -> Result<(), QuantityError> {
        if self.dim == o.dim {
            Ok(())
        } else {
            let (a, b) = (self.describe(), o.describe());
            fail(format!("cannot {verb} {a} {joint} {b}"))
        }
    }

    /// Sum. A point plus a difference is a point; two points cannot be added; gauge and
    /// absolute pressures never meet.
    pub fn add(self, o: Quantity) -> Result<Quantity, QuantityError> {
        use QuantityKind::*;
        self.same_dim(&o, "add", "and")?;
        let kind = match (self.kind, o.kind) {
            (k, Plain) | (Plain, k) => k,
            (TemperaturePoint, TemperaturePoint) => {
                return fail(
                    "cannot add two temperatures; did you mean a temperature difference \
                     (delta_degC)?",
                )
            }
            (GaugePressure, GaugePressure) | (AbsolutePressure, AbsolutePressure) => {
                let what = if self.kind == GaugePressure {
                    "gauge"
                } else {
                    "absolute"
                };
                return fail(format!(
                    "cannot add two {what} pressures; write one of them as a pressure \
                     difference (psi, kPa, bar without a reference)"
                ));
            }
            _ => return fail(mixed_references()),
        };
        Quantity {
            si: self.si + o.si,
            ..self
        }
        .with_kind(kind)
        .finite()
    }

    /// Difference. Point − point is a difference (Plain); point − difference is a point;
    /// a difference minus a point is an error.
    pub fn sub(self, o: Quantity) -> Result<Quantity, QuantityError> {
        use QuantityKind::*;
        self.same_dim(&o, "subtract", "and")?;
        let kind = match (self.kind, o.kind) {
            (k, Plain) => k,
            (Plain, _) => {
                return fail(format!(
                    "cannot subtract {} from {}",
                    o.describe(),
                    self.describe()
                ))
            }
            (a, b) if a == b => Plain,
            _ => return fail(mixed_references()),
        };
        Quantity {
            si: self.si - o.si,
            ..self
        }
        .with_kind(kind)
        .finite()
    }

    fn with_kind(self, kind: QuantityKind) -> Quantity {
        Quantity { kind, ..self }
    }

    /// Product. Points enter by their SI value (kelvin from absolute zero, pascal above the
    /// stated reference); the result is always Plain.
    pub fn mul(self, o: Quantity) -> Result<Quantity, QuantityError> {
        let Some(dim) = self.dim.checked_mul(o.dim) else {
            return fail(TOO_LARGE_DIM);
        };
        Quantity::plain(self.si * o.si, dim).finite()
    }

    /// Quotient, with the same rules as [`Quantity::mul`]; division by zero is an error.
    pub fn div(self, o: Quantity) -> Result<Quantity, QuantityError> {
        let Some(dim) = self.dim.checked_div(o.dim) else {
            return fail(TOO_LARGE_DIM);
        };
        if o.si == 0.0 {
            return fail("division by zero");
        }
        Quantity::plain(self.si / o.si, dim).finite()
    }

    fn plain(si: f64, dim: Dimension) -> Quantity {
        Quantity {
            si,
            dim,
            kind: QuantityKind::Plain,
        }
    }

    /// Negation. A negated temperature point is no longer a point (Plain, in kelvin);
    /// gauge and absolute pressures keep their kind. Write a negative literal as
    /// `from_value(-5.0, degC)`, never as the negation of `5 degC`.
    pub fn neg(self) -> Quantity {
        let kind = match self.kind {
            QuantityKind::TemperaturePoint => QuantityKind::Plain,
            k => k,
        };
        Quantity {
            si: -self.si,
            dim: self.dim,
            kind,
        }
    }

    /// Integer power; the result is Plain. Points enter by their SI value.
    pub fn powi(self, n: i32) -> Result<Quantity, QuantityError> {
        let dim = i8::try_from(n).ok().and_then(|n| self.dim.powi(n));
        let Some(dim) = dim else {
            return fail(TOO_LARGE_DIM);
        };
        if n < 0 && self.si == 0.0 {
            return fail("division by zero");
        }
        Quantity::plain(self.si.powi(n), dim).finite()
    }

    /// Convert to a number in the given unit (inverse of `from_value`); Err if dimensions
    /// differ. A temperature point is read on the unit's scale (offset applied); a difference
    /// written in a scale unit (degC) is read as a degree count (no offset); a point cannot
    /// be read in a delta unit. Gauge and absolute pressures cannot be read in each other's
    /// units (that needs the barometric pressure).
    pub fn in_unit(&self, unit: &Unit) -> Result<f64, QuantityError> {
        use QuantityKind::*;
        if self.dim != unit.dim {
            return fail(format!(
                "cannot express {} in {}, which measures {}",
                self.describe(),
                unit.text,
                unit.dim.describe()
            ));
        }
        let value = match (self.kind, unit.kind()) {
            (TemperaturePoint, TemperaturePoint) => (self.si - unit.offset) / unit.factor,
            (TemperaturePoint, _) => {
                return fail(format!(
                    "cannot express a temperature in {}, a temperature-difference unit; use \
                     degC, degF, K or degR",
                    unit.text
                ))
            }
            (GaugePressure, AbsolutePressure) | (AbsolutePressure, GaugePressure) => {
                return fail(mixed_references())
            }
            _ => self.si / unit.factor,
        };
        if value.is_finite() {
            Ok(value)
        } else {
            fail(TOO_LARGE)
        }
    }
}

fn mixed_references() -> &'static str {
    "cannot combine a gauge and an absolute pressure: converting between them needs the \
     barometric pressure, which is not known here"
}

#[cfg(test)]
mod tests {
    use super::super::parse_unit;
    use super::*;

    fn q(value: f64, unit: &str) -> Quantity {
        let u = parse_unit(unit).unwrap_or_else(|e| panic!("{unit}: {e}"));
        Quantity::from_value(value, &u)
    }

    fn read(x: Quantity, unit: &str) -> f64 {
        let u = parse_unit(unit).unwrap_or_else(|e| panic!("{unit}: {e}"));
        x.in_unit(&u).unwrap_or_else(|e| panic!("{unit}: {e}"))
    }

    fn near(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs().max(1.0)
    }

    #[test]
    fn temperature_points_and_differences() {
        use QuantityKind::*;
        assert!(near(q(68.0, "degF").si, 293.15)); // NIST SP 811 (2008) B.9: T/K = (t/°F + 459.67)/1.8
        assert_eq!(q(20.0, "degC").kind, TemperaturePoint);
        assert_eq!(q(300.0, "K").kind, TemperaturePoint);
        assert_eq!(q(5.0, "delta_degC").kind, Plain);
        let diff = q(20.0, "degC").sub(q(10.0, "degC")).expect("point - point");
        assert_eq!((diff.kind, diff.dim), (Plain, Dimension::TEMPERATURE));
        assert!(near(diff.si, 10.0));
        assert!(near(read(diff, "delta_degF"), 18.0));
        assert!(near(read(diff, "degF"), 18.0)); // a difference read in a scale unit: no offset
        let warmer = q(20.0, "degC")
            .add(q(9.0, "delta_degF"))
            .expect("point + diff");
        assert_eq!(warmer.kind, TemperaturePoint);
        assert!(near(read(warmer, "degC"), 25.0));
        let cooler = q(20.0, "degC")
            .sub(q(5.0, "delta_K"))
            .expect("point - diff");
        assert!(near(read(cooler, "degC"), 15.0));
        let e = q(20.0, "degC")
            .add(q(20.0, "degC"))
            .expect_err("point + point");
        assert!(e.message.contains("delta_degC"));
        assert!(q(5.0, "delta_K").sub(q(20.0, "degC")).is_err());
        assert!(q(20.0, "degC")
            .in_unit(&parse_unit("delta_degC").expect("u"))
            .is_err());
        assert!(near(read(q(0.0, "degC"), "degR"), 491.67));
    }

    #[test]
    fn products_of_points_use_absolute_si_values_and_are_plain() {
        let t = q(20.0, "degC");
        let twice = Quantity::number(2.0).mul(t).expect("product");
        assert_eq!(twice.kind, QuantityKind::Plain);
        assert!(near(twice.si, 586.3));
        let k = q(0.6, "W/(m*degC)");
        assert!(near(k.si, 0.6) && k.kind == QuantityKind::Plain);
        assert_eq!(t.neg().kind, QuantityKind::Plain);
        assert_eq!(q(3.0, "psig").neg().kind, QuantityKind::GaugePressure);
    }

    #[test]
    fn gauge_and_absolute_pressures() {
        use QuantityKind::*;
        assert_eq!(q(10.0, "psig").kind, GaugePressure);
        assert_eq!(q(10.0, "bar(a)").kind, AbsolutePressure);
        assert_eq!(q(10.0, "psi").kind, Plain);
        assert!(q(10.0, "psig").add(q(14.7, "psia")).is_err());
        assert!(q(10.0, "psia").sub(q(1.0, "kPa(g)")).is_err());
        let d = q(30.0, "psig").sub(q(10.0, "psig")).expect("gauge - gauge");
        assert_eq!(d.kind, Plain);
        assert!(near(read(d, "psi"), 20.0));
        let g = q(30.0, "psig").add(q(2.0, "psi")).expect("gauge + plain");
        assert_eq!(g.kind, GaugePressure);
        assert!(near(read(g, "psig"), 32.0));
        let a = q(2.0, "bar(a)").sub(q(50.0, "kPa")).expect("abs - plain");
        assert_eq!(a.kind, AbsolutePressure);
        assert!(near(read(a, "kPa(a)"), 150.0));
        assert!(q(1.0, "psi").sub(q(1.0, "psig")).is_err());
        assert!(q(1.0, "psig").add(q(1.0, "psig")).is_err());
        assert!(q(1.0, "psig")
            .in_unit(&parse_unit("psia").expect("u"))
            .is_err());
        assert!(near(read(q(1.0, "psig"), "kPa"), 6.894_757_293_168));
    }

    #[test]
    fn dimension_mismatch_and_overflow_are_errors() {
        let e = q(1.0, "m")
            .add(q(1.0, "psi"))
            .expect_err("length + pressure");
        assert_eq!(e.message, "cannot add a length and a pressure");
        let e = q(1.0, "m")
            .in_unit(&parse_unit("gpm").expect("u"))
            .expect_err("in gpm");
        assert!(e.message.contains("volume flow rate"));
        let big = Quantity::number(1e300);
        assert_eq!(big.mul(big).expect_err("overflow").message, TOO_LARGE);
        let max = Quantity::number(f64::MAX);
        assert_eq!(max.add(max).expect_err("overflow").message, TOO_LARGE);
        assert_eq!(max.neg().sub(max).expect_err("overflow").message, TOO_LARGE);
        assert!(Quantity::number(1.0).div(Quantity::number(0.0)).is_err());
        assert!(Quantity::number(0.0).powi(-1).is_err());
        assert!(q(1.0, "m").powi(200).is_err());
        assert!(q(2.0, "m")
            .powi(3)
            .is_ok_and(|v| v.dim == Dimension::VOLUME && near(v.si, 8.0)));
        assert!(Quantity::try_from_value(f64::NAN, &parse_unit("m").expect("u")).is_err());
    }
}
