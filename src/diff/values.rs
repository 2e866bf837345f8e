//! Values as a reviewer reads them: SI numbers shown in the design's report units.
//!
//! | quantity | `us` | `si` |
//! |---|---|---|
//! | length, level, head | ft | m |
//! | pipe bore, impeller, roughness | in | mm |
//! | flow | gpm | m³/h |
//! | pressure | psi (psig, psia) | kPa (kPa(g), kPa(a)) |
//! | power | hp | kW |
//! | temperature | degF | degC |
//! | velocity | ft/s | m/s |
//! | density | lb/ft³ | kg/m³ |
//!
//! Speeds are in rpm, operating hours in h, viscosity in cP, ratios in % in both.
//! Conversion factors come from the crate's unit registry ([`crate::units`]).
//! Input values print with 6 significant digits, trailing zeros dropped, so a
//! value written `1208.5 ft` prints `1208.5 ft` and `2650 ft + 38 ft` prints `2688 ft`.

use crate::model::ReportUnits;
use crate::units::parse_unit;

/// What a number measures, which decides its report unit.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Measure {
    /// A length or level (m or ft).
    Length,
    /// A diameter (mm or in).
    Diameter,
    /// A volume flow (m³/h or gpm).
    Flow,
    /// A pressure of unstated reference (kPa or psi).
    Pressure,
    /// A gauge pressure (kPa(g) or psig).
    GaugePressure,
    /// An absolute pressure (kPa(a) or psia).
    AbsolutePressure,
    /// A power (kW or hp).
    Power,
    /// A temperature (°C or °F).
    Temperature,
    /// A velocity (m/s or ft/s).
    Velocity,
    /// A density (kg/m³ or lb/ft³).
    Density,
    /// A dynamic viscosity (cP).
    Viscosity,
    /// A rotational speed (rpm).
    Speed,
    /// A time in hours (h).
    Hours,
    /// A fraction shown as a percentage (%).
    Percent,
}

/// Unit as read by the registry, and as printed.
fn unit_of(m: Measure, units: ReportUnits) -> (&'static str, &'static str) {
    let us = units == ReportUnits::Us;
    match m {
        Measure::Length if us => ("ft", "ft"),
        Measure::Length => ("m", "m"),
        Measure::Diameter if us => ("in", "in"),
        Measure::Diameter => ("mm", "mm"),
        Measure::Flow if us => ("gpm", "gpm"),
        Measure::Flow => ("m^3/h", "m³/h"),
        Measure::Pressure if us => ("psi", "psi"),
        Measure::Pressure => ("kPa", "kPa"),
        Measure::GaugePressure if us => ("psi", "psig"),
        Measure::GaugePressure => ("kPa", "kPa(g)"),
        Measure::AbsolutePressure if us => ("psi", "psia"),
        Measure::AbsolutePressure => ("kPa", "kPa(a)"),
        Measure::Power if us => ("hp", "hp"),
        Measure::Power => ("kW", "kW"),
        Measure::Temperature if us => ("degF", "degF"),
        Measure::Temperature => ("degC", "degC"),
        Measure::Velocity if us => ("ft/s", "ft/s"),
        Measure::Velocity => ("m/s", "m/s"),
        Measure::Density if us => ("lb/ft^3", "lb/ft³"),
        Measure::Density => ("kg/m^3", "kg/m³"),
        Measure::Viscosity => ("cP", "cP"),
        Measure::Speed => ("rpm", "rpm"),
        Measure::Hours => ("h", "h"),
        Measure::Percent => ("%", "%"),
    }
}

/// The report unit of a measure, as printed (`gpm`, `m³/h`).
pub fn unit_label(m: Measure, units: ReportUnits) -> &'static str {
    unit_of(m, units).1
}

/// An SI value in the report unit of `m`. A unit the registry does not know
/// (a defect) leaves the SI value unchanged.
pub fn convert(si: f64, m: Measure, units: ReportUnits) -> f64 {
    match parse_unit(unit_of(m, units).0) {
        Ok(u) if u.factor != 0.0 => (si - u.offset) / u.factor,
        _ => si,
    }
}

/// An SI value with its report unit, at 6 significant digits: `2688 ft`, `94.1 %`.
pub fn show(si: f64, m: Measure, units: ReportUnits) -> String {
    format!("{} {}", number(convert(si, m, units)), unit_label(m, units))
}

/// A plain number at 6 significant digits, trailing zeros dropped: `1.15`, `2688`.
pub fn number(v: f64) -> String {
    significant(v, 6)
}

/// `v` rounded to `digits` significant digits, without trailing zeros.
pub fn significant(v: f64, digits: i32) -> String {
    if !v.is_finite() {
        return format!("{v}");
    }
    if v == 0.0 {
        return "0".to_string();
    }
    let magnitude = v.abs().log10().floor() as i32;
    let decimals = (digits - 1 - magnitude).clamp(0, 15) as usize;
    let mut s = format!("{v:.decimals$}");
    if s.contains('.') {
        s = s.trim_end_matches('0').trim_end_matches('.').to_string();
    }
    if s == "-0" {
        s = "0".to_string();
    }
    s
}

/// `v` with a fixed number of decimals, for result tables.
pub fn fixed(v: f64, decimals: usize) -> String {
    let s = format!("{v:.decimals$}");
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        s.trim_start_matches('-').to_string()
    } else {
        s
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn significant_digits_drop_trailing_zeros() {
        assert_eq!(number(2688.0000000000005), "2688");
        assert_eq!(number(1208.5), "1208.5");
        assert_eq!(number(0.000045), "0.000045");
        assert_eq!(number(-0.0), "0");
        assert_eq!(number(7.98100000001), "7.981");
        assert_eq!(significant(123456789.0, 6), "123456789");
    }

    #[test]
    fn report_units_follow_the_project() {
        // 2688 ft = 819.3024 m exactly (NIST SP 811 B.8: 1 ft = 0.3048 m).
        assert_eq!(show(819.3024, Measure::Length, ReportUnits::Us), "2688 ft");
        assert_eq!(
            show(819.3024, Measure::Length, ReportUnits::Si),
            "819.302 m"
        );
        // 700 gpm = 0.04416313748 m³/s (1 gal = 3.785411784e-3 m³, NIST SP 811 B.8).
        assert_eq!(
            show(0.04416313748, Measure::Flow, ReportUnits::Us),
            "700 gpm"
        );
        assert_eq!(
            show(0.04416313748, Measure::Flow, ReportUnits::Si),
            "158.987 m³/h"
        );
        // 64 degF = 290.927777... K (K = (degF + 459.67) / 1.8).
        assert_eq!(
            show(290.92777777777775, Measure::Temperature, ReportUnits::Us),
            "64 degF"
        );
        assert_eq!(show(0.941, Measure::Percent, ReportUnits::Si), "94.1 %");
        assert_eq!(fixed(-0.001, 1), "0.0");
    }
}
