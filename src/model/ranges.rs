//! The range every numeric input must lie in, checked where the value is read.
//!
//! Each input has a *possible* range (outside it the value cannot describe a pumped
//! water system, or would overflow the engine: an error at `check`) and a narrower
//! *usual* band (outside it the value is legal but rare enough that a unit slip is the
//! likelier cause: a warning). Where no standard fixes a bound, the bound is common
//! practice, generous on purpose, and its doc comment says why. Legitimate extremes stay
//! legal: levels below the datum, vacuum vessels, heads of 2 000 m, lines of 100 km.
//! The table is printed in grammar/LANGUAGE.md, "Limits".

use crate::diagnostics::Code;
use crate::diagnostics::{Diagnostic, Span};

/// A possible range and a usual band for one kind of input, in SI units, with the unit
/// the messages show it in.
#[derive(Clone, Copy, Debug)]
pub struct Range {
    /// What the value is, as a message names it ("a pipe bore").
    pub what: &'static str,
    /// The unit of the messages and its size in SI units.
    pub unit: (&'static str, f64),
    /// Outside this (inclusive) range: an error.
    pub possible: (f64, f64),
    /// Outside this (inclusive) band but possible: a warning.
    pub usual: (f64, f64),
}

/// Inner diameter given as `bore`. Below 1 mm water is not pumped through pipe (the
/// smallest instrument tubing is about 3 mm bore), above 20 m no conduit has been built
/// (the largest penstocks are about 12 m): common practice. Usual 6 mm (1/4 in tube)
/// to 4 m (large aqueduct mains).
pub const PIPE_BORE: Range = Range {
    what: "a pipe bore",
    unit: ("m", 1.0),
    possible: (1e-3, 20.0),
    usual: (6e-3, 4.0),
};

/// Length of a pipe segment or an equivalent length. Zero carries fittings only; 5 000 km
/// is longer than any pipeline system built (common practice). Usual up to 200 km:
/// lines of 100 km are real transfer mains.
pub const PIPE_LENGTH: Range = Range {
    what: "a pipe length",
    unit: ("m", 1.0),
    possible: (0.0, 5.0e6),
    usual: (0.0, 2.0e5),
};

/// Absolute roughness. 50 mm exceeds the roughest conduits tabulated (riveted steel
/// 0.9–9 mm, rough concrete up to 3 mm; Moody's chart stops at a relative roughness of
/// 0.05): common practice. Usual up to 10 mm.
pub const ROUGHNESS: Range = Range {
    what: "a roughness",
    unit: ("mm", 1e-3),
    possible: (0.0, 0.05),
    usual: (0.0, 0.01),
};

/// Hazen-Williams C. Published tables run from about 40 (badly tuberculated iron) to
/// 150–155 (plastic, lined); below 10 or above 200 no pipe was ever rated: common practice.
pub const HAZEN_WILLIAMS_C: Range = Range {
    what: "a Hazen-Williams C",
    unit: ("", 1.0),
    possible: (10.0, 200.0),
    usual: (40.0, 160.0),
};

/// A tank level or the pump centreline, from the design's datum. Datums are local, and
/// survey grids add false origins (1 000 m, 10 000 m), so only magnitudes beyond 100 km
/// are impossible; beyond the range of the Earth's surface (−11 km to +9 km) is unusual:
/// common practice.
pub const LEVEL: Range = Range {
    what: "a level",
    unit: ("m", 1.0),
    possible: (-1.0e5, 1.0e5),
    usual: (-11_000.0, 9_000.0),
};

/// Site elevation: the span of the U.S. Standard Atmosphere 1976 as the engine uses it
/// (`fluid::atmosphere`); usual from the Dead Sea shore (−430 m) to 5 000 m.
pub const SITE_ELEVATION: Range = Range {
    what: "a site elevation",
    unit: ("m", 1.0),
    possible: (
        crate::fluid::atmosphere::MIN_ELEVATION_M,
        crate::fluid::atmosphere::MAX_ELEVATION_M,
    ),
    usual: (-430.0, 5_000.0),
};

/// Barometric pressure (absolute). The summit of Everest has about 33.7 kPa and the
/// sea-level record is 108.4 kPa (from memory); 20–110 kPa is possible, 60–106 kPa
/// (up to about 4 000 m) usual.
pub const BAROMETRIC_PRESSURE: Range = Range {
    what: "a barometric pressure",
    unit: ("kPa", 1e3),
    possible: (20e3, 110e3),
    usual: (60e3, 106e3),
};

/// A tank's gauge surface pressure. A vacuum cannot go below absolute zero, about
/// −110 kPa gauge at the highest barometric pressure (from memory); 100 MPa is where the
/// engine's water properties stop (`fluid::water::MAX_PRESSURE_PA`). Usual from a deep
/// vacuum (−100 kPa) to 5 MPa.
pub const GAUGE_PRESSURE: Range = Range {
    what: "a gauge surface pressure",
    unit: ("kPa", 1e3),
    possible: (-110e3, crate::fluid::water::MAX_PRESSURE_PA),
    usual: (-100e3, 5e6),
};

/// A tank's absolute surface pressure: above absolute zero, up to where the water
/// properties stop; usual from a deep vacuum (1 kPa) to 5 MPa.
pub const ABSOLUTE_PRESSURE: Range = Range {
    what: "an absolute surface pressure",
    unit: ("kPa", 1e3),
    possible: (1.0, crate::fluid::water::MAX_PRESSURE_PA),
    usual: (1e3, 5e6),
};

/// Energy price per kWh in the design's currency. Currencies differ by four orders of
/// magnitude in what a kWh costs, so only above 10⁶ per kWh is impossible (it would
/// overflow life-cycle sums long before); above 10⁴ per kWh is unusual: common practice.
pub const ENERGY_PRICE: Range = Range {
    what: "an energy price",
    unit: ("per kWh", 1.0 / 3.6e6),
    possible: (0.0, 1e6 / 3.6e6),
    usual: (0.0, 1e4 / 3.6e6),
};

/// Pump speed. 60 000 rpm exceeds the fastest high-speed process pumps (about 25 000
/// rpm); usual 300–7 200 rpm (large slow vertical pumps to 2-pole 60 Hz motors with a
/// gear): common practice.
pub const PUMP_SPEED: Range = Range {
    what: "a pump speed",
    unit: ("rpm", 1.0 / 60.0),
    possible: (1.0 / 60.0, 1000.0),
    usual: (5.0, 120.0),
};

/// Impeller diameter: 5 mm to 5 m possible, 50 mm to 2 m usual (common practice).
pub const IMPELLER: Range = Range {
    what: "an impeller diameter",
    unit: ("mm", 1e-3),
    possible: (5e-3, 5.0),
    usual: (50e-3, 2.0),
};

/// Flow on a pump curve. The largest pumps move about 60 m³/s; 1 000 m³/s is impossible,
/// above 100 m³/s unusual (common practice).
pub const CURVE_FLOW: Range = Range {
    what: "a curve flow",
    unit: ("m^3/s", 1.0),
    possible: (0.0, 1000.0),
    usual: (0.0, 100.0),
};

/// Head on a pump curve. Multistage boiler-feed and injection pumps reach about 3 000 m;
/// 10 000 m is impossible (common practice). Heads of 2 000 m stay quiet.
pub const CURVE_HEAD: Range = Range {
    what: "a curve head",
    unit: ("m", 1.0),
    possible: (0.0, 10_000.0),
    usual: (0.0, 3_000.0),
};

/// NPSH required on a pump curve: above 1 000 m impossible, above 100 m unusual (common
/// practice; typical values are 1–15 m).
pub const CURVE_NPSHR: Range = Range {
    what: "an NPSH required",
    unit: ("m", 1.0),
    possible: (0.0, 1000.0),
    usual: (0.0, 100.0),
};

/// Shaft power on a pump curve: the largest pump-turbines absorb about 500 MW; 1 GW is
/// impossible, above 100 MW unusual (common practice).
pub const CURVE_POWER: Range = Range {
    what: "a curve power",
    unit: ("kW", 1e3),
    possible: (0.0, 1e9),
    usual: (0.0, 1e8),
};

/// Density of a named liquid: liquefied gases (about 400 kg/m³) to mercury (13 534
/// kg/m³); 100–25 000 possible, 500–2 000 usual (common practice).
pub const DENSITY: Range = Range {
    what: "a density",
    unit: ("kg/m^3", 1.0),
    possible: (100.0, 25_000.0),
    usual: (500.0, 2_000.0),
};

/// Dynamic viscosity of a named liquid: 10⁻⁶ Pa·s (below any liquid) to 1 000 Pa·s
/// (beyond anything a rotodynamic pump moves); usual 0.1–1 000 cP (common practice).
pub const VISCOSITY: Range = Range {
    what: "a viscosity",
    unit: ("cP", 1e-3),
    possible: (1e-6, 1000.0),
    usual: (1e-4, 1.0),
};

/// Vapour pressure (absolute): up to the engine's pressure limit; above 1 MPa unusual
/// for a liquid pumped from an open tank (common practice).
pub const VAPOUR_PRESSURE: Range = Range {
    what: "a vapour pressure",
    unit: ("kPa", 1e3),
    possible: (0.0, crate::fluid::water::MAX_PRESSURE_PA),
    usual: (0.0, 1e6),
};

/// A liquid's bulk modulus of elasticity: water is about 2.2 GPa at 20 °C, light oils
/// 1.2–1.8 GPa, glycols 2.5–3 GPa (handbook values, from memory); below 0.1 GPa or above
/// 10 GPa no liquid of a pumped system.
pub const BULK_MODULUS: Range = Range {
    what: "a bulk modulus",
    unit: ("GPa", 1e9),
    possible: (1e7, 1e11),
    usual: (1e8, 1e10),
};

/// A loss coefficient K: a throttled valve reaches a few thousand; 10⁵ is impossible,
/// above 1 000 unusual (common practice).
pub const LOSS_K: Range = Range {
    what: "a loss coefficient K",
    unit: ("", 1.0),
    possible: (0.0, 1e5),
    usual: (0.0, 1000.0),
};

/// A yearly discount or escalation rate: the existing limits −50 % to 100 % are possible,
/// −5 % to 20 % usual (common practice).
pub const YEARLY_RATE: Range = Range {
    what: "a yearly rate",
    unit: ("%", 0.01),
    possible: (-0.5, 1.0),
    usual: (-0.05, 0.2),
};

/// A pressure rating stated for a pipe or fitting (gauge). Above zero; 1 000 MPa is
/// beyond any pressure piping; usual 100 kPa (low-head plastic) to 50 MPa (high-pressure
/// steel, ASME B16.5 Class 2500 is about 42 MPa at ambient): common practice.
pub const PRESSURE_RATING: Range = Range {
    what: "a pressure rating",
    unit: ("kPa", 1e3),
    possible: (1.0, 1.0e9),
    usual: (1.0e5, 5.0e7),
};

/// A pipe wall thickness (`wall`). From 0.1 mm (thin tube) to 1 m; usual 1–150 mm:
/// common practice.
pub const WALL_THICKNESS: Range = Range {
    what: "a wall thickness",
    unit: ("mm", 1e-3),
    possible: (1e-4, 1.0),
    usual: (1e-3, 0.15),
};

/// A modulus of elasticity of a pipe wall (`modulus`). Soft elastomer hose (about 1 MPa)
/// to 1 000 GPa (above steel, 200 GPa, and tungsten, about 400 GPa); usual 100 MPa
/// (long-term polyethylene) to 300 GPa: common practice.
pub const ELASTIC_MODULUS: Range = Range {
    what: "a modulus of elasticity",
    unit: ("MPa", 1e6),
    possible: (1.0e6, 1.0e12),
    usual: (1.0e8, 3.0e11),
};

/// A steel's specified minimum yield strength: 100 MPa to 1 500 MPa possible; usual
/// 205–485 MPa (30–70 ksi, the grades of AWWA C200 and ASTM A53/A106/A1018; common
/// practice).
pub const YIELD_STRENGTH: Range = Range {
    what: "a minimum yield strength",
    unit: ("MPa", 1e6),
    possible: (1.0e8, 1.5e9),
    usual: (2.05e8, 4.85e8),
};

/// A corrosion allowance. 0 to 50 mm; usual up to 6 mm (1/4 in, heavy-service steel):
/// common practice.
pub const CORROSION_ALLOWANCE: Range = Range {
    what: "a corrosion allowance",
    unit: ("mm", 1e-3),
    possible: (0.0, 0.05),
    usual: (0.0, 0.006),
};

/// A valve stroke (closure) time. 10 ms (a slamming disc) to a day; usual 0.5 s to 1 h:
/// common practice.
pub const CLOSURE_TIME: Range = Range {
    what: "a valve closure time",
    unit: ("s", 1.0),
    possible: (0.01, 86_400.0),
    usual: (0.5, 3_600.0),
};

/// A well's drawdown (or its well-loss part) at the test flow. Deeper than the deepest
/// water wells (about 3 km) is impossible; beyond 300 m unusual (common practice).
pub const DRAWDOWN: Range = Range {
    what: "a drawdown",
    unit: ("m", 1.0),
    possible: (0.0, 3000.0),
    usual: (0.0, 300.0),
};

/// The flow of a well's drawdown test: above zero; above 1 m³/s (about 16 000 gpm) a
/// single well is unusual (common practice).
pub const TEST_FLOW: Range = Range {
    what: "a test flow",
    unit: ("m^3/s", 1.0),
    possible: (1e-9, 100.0),
    usual: (1e-5, 1.0),
};

/// Every range, for the language reference and its test.
pub const ALL: &[Range] = &[
    PIPE_BORE,
    PIPE_LENGTH,
    ROUGHNESS,
    HAZEN_WILLIAMS_C,
    LEVEL,
    SITE_ELEVATION,
    BAROMETRIC_PRESSURE,
    GAUGE_PRESSURE,
    ABSOLUTE_PRESSURE,
    ENERGY_PRICE,
    PUMP_SPEED,
    IMPELLER,
    CURVE_FLOW,
    CURVE_HEAD,
    CURVE_NPSHR,
    CURVE_POWER,
    DENSITY,
    VISCOSITY,
    VAPOUR_PRESSURE,
    BULK_MODULUS,
    LOSS_K,
    YEARLY_RATE,
    PRESSURE_RATING,
    WALL_THICKNESS,
    ELASTIC_MODULUS,
    CORROSION_ALLOWANCE,
    CLOSURE_TIME,
    DRAWDOWN,
    TEST_FLOW,
];

impl Range {
    /// The value when it is possible (with a warning when it is unusual), else an error
    /// located at `span`.
    pub fn check(&self, si: f64, span: Span) -> Result<(f64, Option<Diagnostic>), Diagnostic> {
        let (low, high) = self.possible;
        if !si.is_finite() || si < low || si > high {
            return Err(Diagnostic::error(
                Code::OutOfRange,
                format!(
                    "{} of {} is outside what is possible ({})",
                    self.what,
                    self.show(si),
                    self.span_text(self.possible)
                ),
                Some(span),
            )
            .with_label("not a possible value")
            .with_help("check the number and its unit; grammar/LANGUAGE.md, \"Limits\", gives every range and its reason"));
        }
        let (usual_low, usual_high) = self.usual;
        let warning = (si < usual_low || si > usual_high).then(|| {
            Diagnostic::warning(
                Code::UnusualValue,
                format!(
                    "{} of {} is unusual (usually {})",
                    self.what,
                    self.show(si),
                    self.span_text(self.usual)
                ),
                Some(span),
            )
            .with_label("unusual value")
            .with_help("check the number and its unit")
        });
        Ok((si, warning))
    }

    /// [`Range::check`], with the warning pushed to `diags`.
    pub fn check_into(
        &self,
        si: f64,
        span: Span,
        diags: &mut Vec<Diagnostic>,
    ) -> Result<f64, Diagnostic> {
        let (v, warning) = self.check(si, span)?;
        diags.extend(warning);
        Ok(v)
    }

    /// "1 mm to 20 m"-style text of a range, in the range's unit.
    fn span_text(&self, (low, high): (f64, f64)) -> String {
        format!("{} to {}", self.show(low), self.show(high))
    }

    /// A value in the range's unit, short: plain decimals for ordinary magnitudes,
    /// scientific notation beyond them.
    fn show(&self, si: f64) -> String {
        let v = si / self.unit.1;
        let number = if !v.is_finite() {
            "a non-finite value".to_string()
        } else if v != 0.0 && !(1e-3..1e7).contains(&v.abs()) {
            format!("{v:e}")
        } else {
            let text = format!("{v:.4}");
            text.trim_end_matches('0').trim_end_matches('.').to_string()
        };
        match self.unit.0 {
            "" => number,
            "%" => format!("{number} %"),
            unit => format!("{number} {unit}"),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn usual_band_lies_inside_the_possible_range() {
        for r in ALL {
            assert!(
                r.possible.0 <= r.usual.0 && r.usual.1 <= r.possible.1,
                "{}",
                r.what
            );
            assert!(r.usual.0 < r.usual.1, "{}", r.what);
        }
    }

    #[test]
    fn outside_is_an_error_inside_unusual_a_warning() {
        let at = Span::new(3, 7);
        assert!(PIPE_BORE.check(1e-300, at).is_err());
        assert!(PIPE_BORE.check(f64::NAN, at).is_err());
        assert!(PIPE_BORE.check(5.0, at).unwrap().1.is_some());
        assert!(PIPE_BORE.check(0.154, at).unwrap().1.is_none());
        // Heads of 2 000 m and lines of 100 km stay quiet (issue 11).
        assert!(CURVE_HEAD.check(2000.0, at).unwrap().1.is_none());
        assert!(PIPE_LENGTH.check(1e5, at).unwrap().1.is_none());
        // A level below the datum is legal.
        assert!(LEVEL.check(-35.0, at).unwrap().1.is_none());
    }

    #[test]
    fn messages_show_the_value_in_the_range_unit() {
        let e = PIPE_BORE.check(1e-300, Span::new(0, 1)).unwrap_err();
        assert!(e.message.contains("1e-300 m"), "{}", e.message);
        assert!(e.message.contains("0.001 m to 20 m"), "{}", e.message);
    }
}
