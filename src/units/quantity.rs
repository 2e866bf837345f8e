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
const TWO_POINTS: &str =
    "cannot add two temperatures; did you mean a temperature difference (delta_degC)?";
const MIXED_REFERENCES: &str = "cannot combine a gauge and an absolute pressure: converting \
     between them needs the barometric pressure, which is not known here";

// The arithmetic returns `Result`, so the agreed names `add`, `sub`, ... are plain
// methods rather than operator traits.
#[allow(clippy::should_implement_trait)]
impl Quantity {
    fn new(si: f64, dim: Dimension, kind: QuantityKind) -> Quantity {
        Quantity { si, dim, kind }
    }

    /// A number written in `unit`: applies factor and offset and sets the kind
    /// (`20 degC` is the point 293.15 K; `20 psig` is a gauge pressure). A non-finite
    /// `value` gives a non-finite `si`; use [`Quantity::try_from_value`] to reject it.
    pub fn from_value(value: f64, unit: &Unit) -> Quantity {
        let offset = if unit.affine { unit.offset } else { 0.0 };
        Quantity::new(value * unit.factor + offset, unit.dim, unit.kind())
    }

    /// Like [`Quantity::from_value`], but an error if the SI value is not finite.
    pub fn try_from_value(value: f64, unit: &Unit) -> Result<Quantity, QuantityError> {
        Quantity::from_value(value, unit).finite()
    }

    /// A dimensionless number.
    pub fn number(v: f64) -> Quantity {
        Quantity::new(v, Dimension::NONE, QuantityKind::Plain)
    }

    /// "a temperature", "a temperature difference", "a gauge pressure", "a length", ...
    pub fn describe(&self) -> String {
        let text = match self.kind {
            QuantityKind::TemperaturePoint => "a temperature",
            QuantityKind::GaugePressure => "a gauge pressure",
            QuantityKind::AbsolutePressure => "an absolute pressure",
            _ if self.dim == Dimension::TEMPERATURE => "a temperature difference",
            _ => return self.dim.describe(),
        };
        text.to_string()
    }

    fn finite(self) -> Result<Quantity, QuantityError> {
        if self.si.is_finite() {
            Ok(self)
        } else {
            fail(TOO_LARGE)
        }
    }

    fn same_dim(&self, o: &Quantity, verb: &str) -> Result<(), QuantityError> {
        if self.dim == o.dim {
            return Ok(());
        }
        fail(format!(
            "cannot {verb} {} and {}",
            self.describe(),
            o.describe()
        ))
    }

    /// Sum. A point plus a difference is a point; two points (temperatures, two gauge or
    /// two absolute pressures) cannot be added; gauge and absolute pressures never meet.
    pub fn add(self, o: Quantity) -> Result<Quantity, QuantityError> {
        use QuantityKind::*;
        self.same_dim(&o, "add")?;
        let kind = match (self.kind, o.kind) {
            (k, Plain) | (Plain, k) => k,
            (TemperaturePoint, TemperaturePoint) => return fail(TWO_POINTS),
            (a, b) if a == b => {
                let what = if a == GaugePressure {
                    "gauge"
                } else {
                    "absolute"
                };
                return fail(format!(
                    "cannot add two {what} pressures; write one of them as a pressure \
                     difference (psi, kPa, bar without a reference)"
                ));
            }
            _ => return fail(MIXED_REFERENCES),
        };
        Quantity::new(self.si + o.si, self.dim, kind).finite()
    }

    /// Difference. Point − point is a difference (Plain); point − difference is a point;
    /// a difference minus a point is an error.
    pub fn sub(self, o: Quantity) -> Result<Quantity, QuantityError> {
        use QuantityKind::*;
        self.same_dim(&o, "subtract")?;
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
            _ => return fail(MIXED_REFERENCES),
        };
        Quantity::new(self.si - o.si, self.dim, kind).finite()
    }

    /// Product. Points enter by their SI value (kelvin from absolute zero, pascal above the
    /// stated reference); the result is always Plain.
    pub fn mul(self, o: Quantity) -> Result<Quantity, QuantityError> {
        let dim = self
            .dim
            .checked_mul(o.dim)
            .map_or_else(|| fail(TOO_LARGE_DIM), Ok)?;
        Quantity::new(self.si * o.si, dim, QuantityKind::Plain).finite()
    }

    /// Quotient, with the same rules as [`Quantity::mul`]; division by zero is an error.
    pub fn div(self, o: Quantity) -> Result<Quantity, QuantityError> {
        let dim = self
            .dim
            .checked_div(o.dim)
            .map_or_else(|| fail(TOO_LARGE_DIM), Ok)?;
        if o.si == 0.0 {
            return fail("division by zero");
        }
        Quantity::new(self.si / o.si, dim, QuantityKind::Plain).finite()
    }

    /// Negation. A negated temperature point is no longer a point (Plain, in kelvin);
    /// gauge and absolute pressures keep their kind. Write a negative literal as
    /// `from_value(-5.0, degC)`, never as the negation of `5 degC`.
    pub fn neg(self) -> Quantity {
        let kind = match self.kind {
            QuantityKind::TemperaturePoint => QuantityKind::Plain,
            k => k,
        };
        Quantity::new(-self.si, self.dim, kind)
    }

    /// Integer power; the result is Plain. Points enter by their SI value.
    pub fn powi(self, n: i32) -> Result<Quantity, QuantityError> {
        let dim = i8::try_from(n).ok().and_then(|n| self.dim.powi(n));
        let dim = dim.map_or_else(|| fail(TOO_LARGE_DIM), Ok)?;
        if n < 0 && self.si == 0.0 {
            return fail("division by zero");
        }
        Quantity::new(self.si.powi(n), dim, QuantityKind::Plain).finite()
    }

    /// Convert to a number in the given unit (inverse of `from_value`); Err if dimensions
    /// differ. A temperature point is read on the unit's scale (offset applied); a difference
    /// written in a scale unit (degC) is read as a degree count (no offset); a point cannot
    /// be read in a delta unit. Gauge and absolute pressures cannot be read in each other's
    /// units (that needs the barometric pressure).
    pub fn in_unit(&self, unit: &Unit) -> Result<f64, QuantityError> {
        use QuantityKind::*;
        if self.dim != unit.dim {
            let (what, measures) = (self.describe(), unit.dim.describe());
            return fail(format!(
                "cannot express {what} in {}, which measures {measures}",
                unit.text
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
                return fail(MIXED_REFERENCES)
            }
            _ => self.si / unit.factor,
        };
        Quantity::number(value).finite().map(|q| q.si)
    }
}

#[cfg(test)]
mod tests {
    use super::super::parse_unit;
    use super::*;
    use QuantityKind::*;

    fn q(value: f64, unit: &str) -> Quantity {
        let u = parse_unit(unit).unwrap_or_else(|e| panic!("{unit}: {e}"));
        Quantity::from_value(value, &u)
    }

    /// The value of `x` in `unit`, or NaN if it cannot be expressed there.
    fn read(x: Result<Quantity, QuantityError>, unit: &str) -> f64 {
        let u = parse_unit(unit).unwrap_or_else(|e| panic!("{unit}: {e}"));
        x.and_then(|x| x.in_unit(&u)).unwrap_or(f64::NAN)
    }

    fn near(a: f64, b: f64) -> bool {
        (a - b).abs() <= 1e-12 * b.abs().max(1.0)
    }

    #[test]
    fn temperature_points_and_differences() {
        assert_eq!(
            (q(20.0, "degC").kind, q(300.0, "K").kind),
            (TemperaturePoint, TemperaturePoint)
        );
        assert_eq!(q(5.0, "delta_degC").kind, Plain);
        let diff = q(20.0, "degC").sub(q(10.0, "degC"));
        assert!(diff
            .as_ref()
            .is_ok_and(|d| d.kind == Plain && d.dim == Dimension::TEMPERATURE));
        assert!(near(read(diff.clone(), "delta_degF"), 18.0));
        assert!(near(read(diff, "degF"), 18.0)); // a difference read in a scale unit: no offset
        let warmer = q(20.0, "degC").add(q(9.0, "delta_degF"));
        assert!(warmer.as_ref().is_ok_and(|w| w.kind == TemperaturePoint));
        assert!(near(read(warmer, "degC"), 25.0));
        assert!(near(
            read(q(20.0, "degC").sub(q(5.0, "delta_K")), "degC"),
            15.0
        ));
        assert!(near(read(Ok(q(0.0, "degC")), "degR"), 491.67)); // NIST SP 811 (2008) B.9
        assert!(q(5.0, "delta_K").sub(q(20.0, "degC")).is_err());
        assert!(read(Ok(q(20.0, "degC")), "delta_degC").is_nan());
    }

    #[test]
    fn products_of_points_use_absolute_si_values_and_are_plain() {
        let twice = Quantity::number(2.0).mul(q(20.0, "degC"));
        assert!(twice.is_ok_and(|t| t.kind == Plain && near(t.si, 586.3)));
        assert_eq!(
            q(0.6, "W/(m*degC)"),
            Quantity::new(0.6, q(0.6, "W/(m*K)").dim, Plain)
        );
        assert_eq!(q(20.0, "degC").neg().kind, Plain);
        assert_eq!(q(3.0, "psig").neg().kind, GaugePressure);
    }

    #[test]
    fn gauge_and_absolute_pressures() {
        assert_eq!(
            (q(1.0, "psig").kind, q(1.0, "bar(a)").kind),
            (GaugePressure, AbsolutePressure)
        );
        assert_eq!(q(10.0, "psi").kind, Plain);
        assert!(q(10.0, "psig").add(q(14.7, "psia")).is_err());
        assert!(q(10.0, "psia").sub(q(1.0, "kPa(g)")).is_err());
        assert!(q(1.0, "psi").sub(q(1.0, "psig")).is_err());
        assert!(q(1.0, "psig").add(q(1.0, "psig")).is_err());
        assert!(q(1.0, "bar(a)").add(q(1.0, "bar(a)")).is_err());
        let d = q(30.0, "psig").sub(q(10.0, "psig"));
        assert!(d.as_ref().is_ok_and(|d| d.kind == Plain));
        assert!(near(read(d, "psi"), 20.0));
        let g = q(30.0, "psig").add(q(2.0, "psi"));
        assert!(g.as_ref().is_ok_and(|g| g.kind == GaugePressure));
        assert!(near(read(g, "psig"), 32.0));
        let a = q(2.0, "bar(a)").sub(q(50.0, "kPa"));
        assert!(a.as_ref().is_ok_and(|a| a.kind == AbsolutePressure));
        assert!(near(read(a, "kPa(a)"), 150.0));
        assert!(read(Ok(q(1.0, "psig")), "psia").is_nan());
        assert!(near(read(Ok(q(1.0, "psig")), "kPa"), 6.894_757_293_168)); // NIST SP 811 (2008) B.8: 6.894 757 E+03 Pa
    }

    #[test]
    fn dimension_mismatch_and_overflow_are_errors() {
        let e = q(1.0, "m").add(q(1.0, "psi")).map_err(|e| e.message);
        assert_eq!(e, Err("cannot add a length and a pressure".to_string()));
        let e = q(1.0, "m")
            .in_unit(&parse_unit("gpm").expect("unit"))
            .map_err(|e| e.message);
        assert!(e.is_err_and(|m| m.contains("volume flow rate")));
        let (big, max) = (Quantity::number(1e300), Quantity::number(f64::MAX));
        for overflow in [
            big.mul(big),
            max.add(max),
            max.neg().sub(max),
            big.div(Quantity::number(1e-300)),
        ] {
            assert_eq!(overflow.map_err(|e| e.message), Err(TOO_LARGE.to_string()));
        }
        assert!(Quantity::number(1.0).div(Quantity::number(0.0)).is_err());
        assert!(Quantity::number(0.0).powi(-1).is_err());
        assert!(q(1.0, "m").powi(200).is_err());
        assert!(q(2.0, "m")
            .powi(3)
            .is_ok_and(|v| v.dim == Dimension::VOLUME && near(v.si, 8.0)));
        assert!(Quantity::try_from_value(f64::NAN, &parse_unit("m").expect("unit")).is_err());
    }
}
