//! The unit registry: every accepted unit name with its SI factor, offset, dimension
//! and the source of its factor.

use super::dimension::Dimension as D;
use super::unit::PressureReference;

/// One unit name of the registry. `SI value = value * factor + offset`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct UnitDef {
    /// The name as it is written in a design file.
    pub name: &'static str,
    /// Multiplier to the coherent SI unit of `dim`.
    pub factor: f64,
    /// Added after the factor; non-zero only for the Celsius and Fahrenheit scales.
    pub offset: f64,
    /// The dimension of the unit.
    pub dim: D,
    /// Where the factor comes from.
    pub source: &'static str,
    /// What the unit is, in words.
    pub note: &'static str,
}

/// Standard acceleration of gravity g_n = 9.80665 m/s², exact by the 3rd CGPM (1901); the
/// value NIST SP 811 (2008) uses for the force units of B.8 (from memory).
const G_N: f64 = 9.80665;
/// NIST SP 811 (2008) B.8: foot = 3.048 E-01 m (exact).
const FT: f64 = 0.3048;
/// NIST SP 811 (2008) B.8: inch = 2.54 E-02 m (exact).
const IN: f64 = 0.0254;
/// NIST SP 811 (2008) B.8: pound (avoirdupois) = 4.535 924 E-01 kg; exactly 0.453 592 37 kg
/// by the 1959 international yard and pound agreement (from memory).
const LB: f64 = 0.453_592_37;
/// Pound-force = 1 lb × g_n = 4.448 221 615 260 5 N; NIST SP 811 (2008) B.8: 4.448 222 E+00 N.
const LBF: f64 = LB * G_N;
/// US gallon = 231 in³ = 3.785 411 784 E-03 m³ (exact); NIST SP 811 (2008) B.8: 3.785 412 E-03.
const GAL: f64 = 3.785_411_784e-3;
/// Conventional density of mercury, 13 595.1 kg/m³ (0 °C), with g_n: the "conventional"
/// mercury column units. 0.0254 m × 13 595.1 × 9.80665 = 3386.3886 Pa, matching NIST SP 811
/// (2008) B.8 inch of mercury, conventional = 3.386 389 E+03 Pa.
const HG_DENSITY: f64 = 13_595.1;
const MIN: f64 = 60.0;
const HOUR: f64 = 3600.0;
const DAY: f64 = 86_400.0;

#[rustfmt::skip]
const fn def(name: &'static str, factor: f64, dim: D, source: &'static str, note: &'static str) -> UnitDef {
    UnitDef { name, factor, offset: 0.0, dim, source, note }
}

const SI: &str = "SI Brochure, 9th ed. (BIPM 2019): SI unit or decimal multiple";
const DEF: &str = "definition";
const C_OFFSET: f64 = 273.15;
const F_OFFSET: f64 = 459.67 * 5.0 / 9.0;

#[rustfmt::skip]
static REGISTRY: &[UnitDef] = &[
    // Length (head is a length too: write m or ft).
    def("m", 1.0, D::LENGTH, SI, "metre"),
    def("mm", 1e-3, D::LENGTH, SI, "millimetre"),
    def("cm", 1e-2, D::LENGTH, SI, "centimetre"),
    def("km", 1e3, D::LENGTH, SI, "kilometre"),
    def("in", IN, D::LENGTH, "NIST SP 811 (2008) B.8: inch = 2.54 E-02 m, exact", "inch"),
    def("ft", FT, D::LENGTH, "NIST SP 811 (2008) B.8: foot = 3.048 E-01 m, exact", "foot"),
    def("yd", 3.0 * FT, D::LENGTH, "NIST SP 811 (2008) B.8: yard = 9.144 E-01 m, exact", "yard"),
    def("mi", 5280.0 * FT, D::LENGTH, "NIST SP 811 (2008) B.8: mile = 1.609 344 E+03 m, exact", "international mile"),
    // Volume.
    def("L", 1e-3, D::VOLUME, "NIST SP 811 (2008) B.8: liter = 1.0 E-03 m^3, exact", "litre"),
    def("mL", 1e-6, D::VOLUME, "NIST SP 811 (2008) B.8: liter = 1.0 E-03 m^3, exact", "millilitre"),
    def("gal", GAL, D::VOLUME, "NIST SP 811 (2008) B.8: gallon (U.S.) = 3.785 412 E-03 m^3", "US liquid gallon, 231 in^3 exactly"),
    // Volume flow.
    def("gpm", GAL / MIN, D::VOLUME_RATE, "from the exact US gallon and minute", "US gallon per minute"),
    def("MGD", 1e6 * GAL / DAY, D::VOLUME_RATE, "from the exact US gallon and day", "million US gallons per day"),
    def("cfs", FT * FT * FT, D::VOLUME_RATE, "from the exact foot", "cubic foot per second"),
    // Mass.
    def("kg", 1.0, D::MASS, SI, "kilogram"),
    def("g", 1e-3, D::MASS, SI, "gram"),
    def("t", 1e3, D::MASS, "NIST SP 811 (2008) B.8: ton, metric = 1.0 E+03 kg, exact", "tonne"),
    def("lb", LB, D::MASS, "NIST SP 811 (2008) B.8: pound (avoirdupois) = 4.535 924 E-01 kg", "pound mass, 0.45359237 kg exactly"),
    def("lbm", LB, D::MASS, "NIST SP 811 (2008) B.8: pound (avoirdupois) = 4.535 924 E-01 kg", "pound mass, same as lb"),
    // Time.
    def("s", 1.0, D::TIME, SI, "second"),
    def("min", MIN, D::TIME, "NIST SP 811 (2008) B.8: minute = 6.0 E+01 s, exact", "minute"),
    def("h", HOUR, D::TIME, "NIST SP 811 (2008) B.8: hour = 3.6 E+03 s, exact", "hour"),
    def("hr", HOUR, D::TIME, "NIST SP 811 (2008) B.8: hour = 3.6 E+03 s, exact", "hour, same as h"),
    def("day", DAY, D::TIME, "NIST SP 811 (2008) B.8: day = 8.64 E+04 s, exact", "day"),
    def("week", 7.0 * DAY, D::TIME, DEF, "week of 7 days"),
    def("year", 365.0 * DAY, D::TIME, "NIST SP 811 (2008) B.8: year (365 days) = 3.1536 E+07 s", "year of 365 days"),
    def("yr", 365.0 * DAY, D::TIME, "NIST SP 811 (2008) B.8: year (365 days) = 3.1536 E+07 s", "year of 365 days, same as year"),
    // Frequency and rotational speed (a revolution counts as one cycle).
    def("Hz", 1.0, D::FREQUENCY, SI, "hertz = 1/s"),
    def("rpm", 1.0 / MIN, D::FREQUENCY, DEF, "revolution per minute = 1/60 s^-1 (2π/60 rad/s)"),
    def("rps", 1.0, D::FREQUENCY, DEF, "revolution per second = 1 s^-1"),
    // Temperature scales (points when standing alone) and differences.
    def("K", 1.0, D::TEMPERATURE, SI, "kelvin"),
    celsius("degC"),
    celsius("°C"),
    fahrenheit("degF"),
    fahrenheit("°F"),
    def("degR", 5.0 / 9.0, D::TEMPERATURE, "NIST SP 811 (2008) B.9: T/K = (T/°R)/1.8", "degree Rankine"),
    def("delta_K", 1.0, D::TEMPERATURE, SI, "temperature difference in kelvin"),
    def("delta_degC", 1.0, D::TEMPERATURE, "NIST SP 811 (2008) B.9: 1 °C = 1 K (interval)", "temperature difference in degC"),
    def("delta_degF", 5.0 / 9.0, D::TEMPERATURE, "NIST SP 811 (2008) B.9: 1 °F = 5/9 K (interval)", "temperature difference in degF"),
    def("delta_degR", 5.0 / 9.0, D::TEMPERATURE, "NIST SP 811 (2008) B.9: 1 °R = 5/9 K (interval)", "temperature difference in degR"),
    // Force.
    def("N", 1.0, D::FORCE, SI, "newton"),
    def("kN", 1e3, D::FORCE, SI, "kilonewton"),
    def("lbf", LBF, D::FORCE, "NIST SP 811 (2008) B.8: pound-force = 4.448 222 E+00 N", "lb × 9.80665 m/s^2"),
    // Pressure.
    def("Pa", 1.0, D::PRESSURE, SI, "pascal, reference not stated"),
    def("kPa", 1e3, D::PRESSURE, SI, "kilopascal, reference not stated"),
    def("MPa", 1e6, D::PRESSURE, SI, "megapascal, reference not stated"),
    def("bar", 1e5, D::PRESSURE, BAR, "bar, reference not stated"),
    def("psi", PSI, D::PRESSURE, PSI_SRC, "lbf/in^2, reference not stated"),
    def("atm", 101_325.0, D::PRESSURE, "NIST SP 811 (2008) B.8: atmosphere, standard = 1.013 25 E+05 Pa, exact", "standard atmosphere"),
    def("in_Hg", IN * HG_DENSITY * G_N, D::PRESSURE, IN_HG, "inch of mercury, conventional"),
    def("inHg", IN * HG_DENSITY * G_N, D::PRESSURE, IN_HG, "inch of mercury, same as in_Hg"),
    def("mmHg", 1e-3 * HG_DENSITY * G_N, D::PRESSURE, "NIST SP 811 (2008) B.8: millimeter of mercury, conventional = 1.333 224 E+02 Pa", "millimetre of mercury, conventional"),
    def("Pa(g)", 1.0, D::PRESSURE, SI, "pascal, gauge"),
    def("Pa(a)", 1.0, D::PRESSURE, SI, "pascal, absolute"),
    def("kPa(g)", 1e3, D::PRESSURE, SI, "kilopascal, gauge"),
    def("kPa(a)", 1e3, D::PRESSURE, SI, "kilopascal, absolute"),
    def("MPa(g)", 1e6, D::PRESSURE, SI, "megapascal, gauge"),
    def("MPa(a)", 1e6, D::PRESSURE, SI, "megapascal, absolute"),
    def("bar(g)", 1e5, D::PRESSURE, BAR, "bar, gauge"),
    def("bar(a)", 1e5, D::PRESSURE, BAR, "bar, absolute"),
    def("barg", 1e5, D::PRESSURE, BAR, "bar, gauge, same as bar(g)"),
    def("bara", 1e5, D::PRESSURE, BAR, "bar, absolute, same as bar(a)"),
    def("psig", PSI, D::PRESSURE, PSI_SRC, "pound-force per square inch, gauge"),
    def("psia", PSI, D::PRESSURE, PSI_SRC, "pound-force per square inch, absolute"),
    // Power.
    def("W", 1.0, D::POWER, SI, "watt"),
    def("kW", 1e3, D::POWER, SI, "kilowatt"),
    def("MW", 1e6, D::POWER, SI, "megawatt"),
    def("hp", 550.0 * FT * LBF, D::POWER, "NIST SP 811 (2008) B.8: horsepower (550 ft·lbf/s) = 7.456 999 E+02 W", "mechanical horsepower, 550 ft·lbf/s"),
    // Energy.
    def("J", 1.0, D::ENERGY, SI, "joule"),
    def("kJ", 1e3, D::ENERGY, SI, "kilojoule"),
    def("MJ", 1e6, D::ENERGY, SI, "megajoule"),
    def("Wh", HOUR, D::ENERGY, WH, "watt hour"),
    def("kWh", 1e3 * HOUR, D::ENERGY, WH, "kilowatt hour"),
    def("MWh", 1e6 * HOUR, D::ENERGY, WH, "megawatt hour"),
    def("Btu", 1_055.055_852_62, D::ENERGY, "NIST SP 811 (2008) B.8: British thermal unit_IT = 1.055 056 E+03 J", "IT Btu, 1055.05585262 J exactly (from memory)"),
    // Viscosity.
    def("P", 0.1, D::DYNAMIC_VISCOSITY, "NIST SP 811 (2008) B.8: poise = 1.0 E-01 Pa·s, exact", "poise"),
    def("cP", 1e-3, D::DYNAMIC_VISCOSITY, "NIST SP 811 (2008) B.8: centipoise = 1.0 E-03 Pa·s, exact", "centipoise"),
    def("St", 1e-4, D::KINEMATIC_VISCOSITY, "NIST SP 811 (2008) B.8: stokes = 1.0 E-04 m^2/s, exact", "stokes"),
    def("cSt", 1e-6, D::KINEMATIC_VISCOSITY, "NIST SP 811 (2008) B.8: centistokes = 1.0 E-06 m^2/s, exact", "centistokes"),
    // Money: one dimension, no exchange rates.
    def("USD", 1.0, D::MONEY, DEF, "US dollar"),
    def("EUR", 1.0, D::MONEY, DEF, "euro"),
    def("GBP", 1.0, D::MONEY, DEF, "pound sterling"),
    def("CAD", 1.0, D::MONEY, DEF, "Canadian dollar"),
    def("AUD", 1.0, D::MONEY, DEF, "Australian dollar"),
    def("cu", 1.0, D::MONEY, DEF, "currency unit, currency-neutral"),
    // Dimensionless.
    def("%", 0.01, D::NONE, DEF, "percent = 0.01"),
    def("deg", std::f64::consts::PI / 180.0, D::NONE, "NIST SP 811 (2008) B.8: degree (angle) = 1.745 329 E-02 rad", "degree of angle"),
    def("rad", 1.0, D::NONE, SI, "radian (angles are dimensionless)"),
];

const BAR: &str = "NIST SP 811 (2008) B.8: bar = 1.0 E+05 Pa, exact";
const PSI: f64 = LBF / (IN * IN);
const PSI_SRC: &str = "NIST SP 811 (2008) B.8: pound-force per square inch = 6.894 757 E+03 Pa";
const IN_HG: &str = "NIST SP 811 (2008) B.8: inch of mercury, conventional = 3.386 389 E+03 Pa";
const WH: &str = "NIST SP 811 (2008) B.8: kilowatt hour = 3.6 E+06 J, exact";

const CELSIUS: &str = "NIST SP 811 (2008) 4.2.1.1: t/°C = T/K − 273.15";
const FAHRENHEIT: &str = "NIST SP 811 (2008) B.9: T/K = (t/°F + 459.67)/1.8";

const fn celsius(name: &'static str) -> UnitDef {
    let note = "degree Celsius: K = degC + 273.15";
    let offset = C_OFFSET;
    UnitDef {
        offset,
        ..def(name, 1.0, D::TEMPERATURE, CELSIUS, note)
    }
}

const fn fahrenheit(name: &'static str) -> UnitDef {
    let note = "degree Fahrenheit: K = (degF + 459.67)/1.8";
    let offset = F_OFFSET;
    UnitDef {
        offset,
        ..def(name, 5.0 / 9.0, D::TEMPERATURE, FAHRENHEIT, note)
    }
}

/// All unit names in the registry with their dimension and factor, for documentation and
/// suggestions. Compound units (`m^3/h`, `kg/m^3`, `Pa*s`) are built by [`super::parse_unit`].
pub fn registry() -> &'static [UnitDef] {
    REGISTRY
}

/// The registry entry of one unit name (case-sensitive), if any.
pub fn lookup(name: &str) -> Option<&'static UnitDef> {
    REGISTRY.iter().find(|d| d.name == name)
}

/// Whether a registry unit is a temperature scale: a temperature point when it stands alone.
pub(crate) fn is_temperature_scale(def: &UnitDef) -> bool {
    def.dim == D::TEMPERATURE && !def.name.starts_with("delta_")
}

/// The pressure reference a registry unit states, if any.
pub(crate) fn pressure_reference(def: &UnitDef) -> Option<PressureReference> {
    let n = def.name;
    if n.ends_with("(g)") || n == "psig" || n == "barg" {
        Some(PressureReference::Gauge)
    } else if n.ends_with("(a)") || n == "psia" || n == "bara" {
        Some(PressureReference::Absolute)
    } else {
        None
    }
}

/// Whether a registry unit is a currency code.
pub(crate) fn is_currency(def: &UnitDef) -> bool {
    def.dim == D::MONEY
}

/// The temperature scale meant by a common spelling that is not a unit name here:
/// `C`, `celsius` → `degC`; `F`, `fahrenheit` → `degF` (the letter after a `deg ` or
/// `° ` written apart, or the scale's name spelt out).
pub fn temperature_spelling(name: &str) -> Option<&'static str> {
    match name.to_lowercase().as_str() {
        "c" | "celsius" | "centigrade" => Some("degC"),
        "f" | "fahrenheit" => Some("degF"),
        _ => None,
    }
}

/// Nearest known unit names to an unknown one (edit distance, case-insensitive), best first,
/// at most 3. Names farther than 2 edits (1 for names of up to 2 characters) are not offered.
pub fn suggest(name: &str) -> Vec<String> {
    let wanted = name.to_lowercase().chars().count();
    let limit = if wanted <= 2 { 1 } else { 2 };
    let mut scored: Vec<(usize, usize, &str)> = REGISTRY
        .iter()
        .filter_map(|d| {
            let dist = crate::names::edit_distance(name, d.name);
            let length_gap = d.name.to_lowercase().chars().count().abs_diff(wanted);
            (dist <= limit).then_some((dist, length_gap, d.name))
        })
        .collect();
    scored.sort_by_key(|&(dist, gap, _)| (dist, gap));
    scored
        .into_iter()
        .take(3)
        .map(|s| s.2.to_string())
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_unique_and_factors_positive_and_finite() {
        for (i, d) in REGISTRY.iter().enumerate() {
            assert!(d.factor.is_finite() && d.factor > 0.0, "{}", d.name);
            assert!(d.offset == 0.0 || is_temperature_scale(d), "{}", d.name);
            assert!(!d.source.is_empty() && !d.note.is_empty(), "{}", d.name);
            assert!(
                REGISTRY[i + 1..].iter().all(|o| o.name != d.name),
                "{}",
                d.name
            );
        }
    }

    #[test]
    fn suggestions_rank_transpositions_and_case_first() {
        assert_eq!(suggest("gmp").first().map(String::as_str), Some("gpm"));
        assert_eq!(suggest("KPA").first().map(String::as_str), Some("kPa"));
        assert_eq!(suggest("degc").first().map(String::as_str), Some("degC"));
        assert_eq!(suggest("psig").first().map(String::as_str), Some("psig"));
        assert!(suggest("zzzzzzzz").is_empty());
        assert!(suggest("").len() <= 3);
    }
}
