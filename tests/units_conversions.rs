//! Unit conversions checked against NIST SP 811 (2008) Appendix B and against pint.

use dutyline::units::{parse_unit, registry, Dimension, Quantity, QuantityKind, Unit};
use proptest::prelude::*;

fn unit(text: &str) -> Unit {
    parse_unit(text).unwrap_or_else(|e| panic!("{text}: {e}"))
}

/// SI value of 1 `text`, checked against `expected` to relative tolerance `rel`.
fn check(text: &str, expected: f64, rel: f64) {
    let si = Quantity::from_value(1.0, &unit(text)).si;
    let err = (si - expected).abs() / expected.abs();
    assert!(
        err <= rel.max(1e-15),
        "1 {text} = {si}, expected {expected} (rel {err:e})"
    );
}

/// Relative tolerance that a NIST value rounded to 7 significant digits allows.
const SEVEN: f64 = 1e-6;

#[test]
fn lengths_volumes_and_masses_match_nist_sp_811() {
    check("in", 2.54e-2, 0.0); // NIST SP 811 (2008) B.8: inch = 2.54 E-02 m (exact)
    check("ft", 3.048e-1, 0.0); // NIST SP 811 (2008) B.8: foot = 3.048 E-01 m (exact)
    check("yd", 9.144e-1, 0.0); // NIST SP 811 (2008) B.8: yard = 9.144 E-01 m (exact)
    check("mi", 1.609344e3, 0.0); // NIST SP 811 (2008) B.8: mile = 1.609 344 E+03 m (exact)
    check("L", 1.0e-3, 0.0); // NIST SP 811 (2008) B.8: liter = 1.0 E-03 m^3 (exact)
    check("gal", 3.785412e-3, SEVEN); // NIST SP 811 (2008) B.8: gallon (U.S.) = 3.785 412 E-03 m^3
    check("gal", 3.785411784e-3, 0.0); // US gallon = 231 in^3 exactly (from memory), 0.0254^3 * 231
    let in3 = unit("in^3").factor * 231.0;
    assert!((in3 - 3.785411784e-3).abs() < 1e-17); // US gallon = 231 in^3 (exact definition, from memory)
    check("ft^3", 2.831685e-2, SEVEN); // NIST SP 811 (2008) B.8: cubic foot = 2.831 685 E-02 m^3
    check("lb", 4.535924e-1, SEVEN); // NIST SP 811 (2008) B.8: pound (avoirdupois) = 4.535 924 E-01 kg
    check("t", 1.0e3, 0.0); // NIST SP 811 (2008) B.8: ton, metric = 1.0 E+03 kg
    check("lb/ft^3", 1.601846e1, SEVEN); // NIST SP 811 (2008) B.8: pound per cubic foot = 1.601 846 E+01 kg/m^3
}

#[test]
fn flows_match_nist_sp_811_and_common_practice() {
    check("gpm", 6.309020e-5, SEVEN); // NIST SP 811 (2008) B.8: gallon (U.S.) per minute = 6.309 020 E-05 m^3/s
    check("cfs", 2.831685e-2, SEVEN); // NIST SP 811 (2008) B.8: cubic foot per second = 2.831 685 E-02 m^3/s
    check("ft^3/s", 2.831685e-2, SEVEN); // NIST SP 811 (2008) B.8: cubic foot per second = 2.831 685 E-02 m^3/s
    check("m^3/h", 1.0 / 3600.0, 1e-15); // NIST SP 811 (2008) B.8: hour = 3.6 E+03 s (exact)
    check("L/min", 1.0e-3 / 60.0, 1e-15); // NIST SP 811 (2008) B.8: liter and minute (exact)
    let one_gpm = Quantity::from_value(1.0, &unit("gpm"));
    let in_cfs = one_gpm.in_unit(&unit("ft^3/s")).expect("same dimension");
    assert!((in_cfs - 0.00223).abs() / 0.00223 < 0.005, "{in_cfs}"); // common practice: 1 US gpm is about 0.00223 ft^3/s
    let one_mgd = Quantity::from_value(1.0, &unit("MGD"));
    let mgd_cfs = one_mgd.in_unit(&unit("cfs")).expect("same dimension");
    assert!((mgd_cfs - 1.547).abs() / 1.547 < 0.001, "{mgd_cfs}"); // common practice: 1 MGD is about 1.547 cfs
    let mgd_gpm = one_mgd.in_unit(&unit("gpm")).expect("same dimension");
    assert!((mgd_gpm - 694.444_444).abs() < 1e-6, "{mgd_gpm}"); // 1e6 gal / 1440 min, definition
}

#[test]
fn forces_pressures_powers_and_energies_match_nist_sp_811() {
    check("lbf", 4.448222, SEVEN); // NIST SP 811 (2008) B.8: pound-force = 4.448 222 E+00 N
    check("psi", 6.894757e3, SEVEN); // NIST SP 811 (2008) B.8: pound-force per square inch = 6.894 757 E+03 Pa
    check("atm", 1.01325e5, 0.0); // NIST SP 811 (2008) B.8: atmosphere, standard = 1.013 25 E+05 Pa (exact)
    check("bar", 1.0e5, 0.0); // NIST SP 811 (2008) B.8: bar = 1.0 E+05 Pa (exact)
    check("in_Hg", 3.386389e3, SEVEN); // NIST SP 811 (2008) B.8: inch of mercury, conventional = 3.386 389 E+03 Pa
    check("in_Hg", 3.38638e3, 3e-6); // NIST SP 811 (2008) B.8: inch of mercury (32 °F) = 3.386 38 E+03 Pa
    check("mmHg", 1.333224e2, SEVEN); // NIST SP 811 (2008) B.8: millimeter of mercury, conventional = 1.333 224 E+02 Pa
    check("hp", 7.456999e2, SEVEN); // NIST SP 811 (2008) B.8: horsepower (550 ft·lbf/s) = 7.456 999 E+02 W
    check("Btu", 1.055056e3, SEVEN); // NIST SP 811 (2008) B.8: British thermal unit_IT = 1.055 056 E+03 J
    check("kWh", 3.6e6, 0.0); // NIST SP 811 (2008) B.8: kilowatt hour = 3.6 E+06 J (exact)
    check("cP", 1.0e-3, 0.0); // NIST SP 811 (2008) B.8: centipoise = 1.0 E-03 Pa·s (exact)
    check("P", 1.0e-1, 0.0); // NIST SP 811 (2008) B.8: poise = 1.0 E-01 Pa·s (exact)
    check("cSt", 1.0e-6, 0.0); // NIST SP 811 (2008) B.8: centistokes = 1.0 E-06 m^2/s (exact)
    check("St", 1.0e-4, 0.0); // NIST SP 811 (2008) B.8: stokes = 1.0 E-04 m^2/s (exact)
    check("Pa*s", 1.0, 0.0); // SI coherent unit of dynamic viscosity
}

#[test]
fn compound_units_equal_their_named_forms() {
    let rel = |a: &str, b: &str| (unit(a).factor - unit(b).factor).abs() / unit(b).factor;
    assert!(rel("lbf/in^2", "psi") < 1e-6); // psi is lbf/in^2 by definition (NIST SP 811 (2008) B.8)
    assert!(rel("kg/(m*s)", "Pa*s") < 1e-15); // SI Brochure 9th ed.: Pa·s = kg·m^-1·s^-1
    assert!(rel("kg/(m·s)", "Pa·s") < 1e-15); // same, with the middle dot
    assert!((unit("hp").factor / unit("ft*lbf/s").factor - 550.0).abs() < 1e-9); // NIST SP 811 (2008) B.8: hp (550 ft·lbf/s)
    assert!(rel("gal/min", "gpm") < 1e-15); // gpm is gal/min
    assert!(rel("N*m", "J") < 1e-15); // SI Brochure 9th ed.: J = N·m
    assert_eq!(unit("m^3/h").dim, Dimension::VOLUME_RATE);
    assert_eq!(unit("kg/(m*s)").dim, Dimension::DYNAMIC_VISCOSITY);
    assert_eq!(unit("USD/kWh").dim, Dimension::MONEY_PER_ENERGY);
}

#[test]
fn temperatures_are_affine_and_differences_are_not() {
    let t = Quantity::from_value(68.0, &unit("degF"));
    assert!((t.si - 293.15).abs() < 1e-12); // NIST SP 811 (2008) B.9: T/K = (t/°F + 459.67)/1.8
    assert_eq!(t.kind, QuantityKind::TemperaturePoint);
    let r = Quantity::from_value(527.67, &unit("degR"));
    assert!((r.si - 293.15).abs() < 1e-12); // NIST SP 811 (2008) B.9: T/K = (T/°R)/1.8
    let c = Quantity::from_value(20.0, &unit("°C"));
    assert!((c.si - 293.15).abs() < 1e-12); // NIST SP 811 (2008) 4.2.1.1: t/°C = T/K − 273.15
    let cold = Quantity::from_value(10.0, &unit("degC"));
    let diff = c.sub(cold).expect("point - point");
    assert_eq!(diff.kind, QuantityKind::Plain);
    assert!((diff.si - 10.0).abs() < 1e-12); // 20 degC − 10 degC is a 10 K difference
    let err = c.add(c).expect_err("point + point");
    assert_eq!(
        err.message,
        "cannot add two temperatures; did you mean a temperature difference (delta_degC)?"
    );
}

/// Parses one row of tests/reference/units_pint.csv: unit, factor, offset, expression, version.
fn pint_row(line: &str) -> (String, f64, f64) {
    let cells: Vec<&str> = line.split(',').collect();
    assert_eq!(cells.len(), 5, "bad CSV row {line}");
    let number = |s: &str| s.parse::<f64>().unwrap_or_else(|e| panic!("{s}: {e}"));
    (cells[0].to_string(), number(cells[1]), number(cells[2]))
}

#[test]
fn factors_match_the_pint_reference_table() {
    let table = include_str!("reference/units_pint.csv"); // written by tests/reference/gen_units.py (pint)
    let rows: Vec<_> = table
        .lines()
        .skip(1)
        .filter(|l| !l.is_empty())
        .map(pint_row)
        .collect();
    assert!(rows.len() >= 30, "only {} rows", rows.len());
    for (text, factor, offset) in rows {
        let u = unit(&text);
        let rel = (u.factor - factor).abs() / factor;
        assert!(
            rel <= 1e-9,
            "{text}: ours {} pint {factor} (rel {rel:e})",
            u.factor
        );
        assert!(
            (u.offset - offset).abs() <= 1e-9 * 273.15,
            "{text}: offset {}",
            u.offset
        );
    }
}

#[test]
fn every_registry_name_parses_and_round_trips() {
    for def in registry() {
        let u = unit(def.name);
        assert_eq!((u.factor, u.dim), (def.factor, def.dim), "{}", def.name);
        let back = Quantity::from_value(12.5, &u)
            .in_unit(&u)
            .expect("same unit");
        assert!((back - 12.5).abs() < 1e-9, "{}: {back}", def.name);
    }
}

#[test]
fn garbage_unit_text_is_an_error_inside_the_text() {
    let garbage = [
        "",
        "^",
        "m^",
        "m^999",
        "((m",
        "m/",
        "m^-",
        ")",
        "*",
        "//",
        "m**2",
        "°",
        "\u{0}",
        "ｍ",
        "m^(",
        "1",
        "1/",
        "kPa(g",
        "kPa(g)(g)",
        "m^(-)",
        "1e3/s",
        "m^-0",
        "m^+2",
        "ft-lbf",
    ];
    for text in garbage {
        let e = parse_unit(text).expect_err(text);
        assert!(e.offset + e.len <= text.len(), "{text:?}: {e:?}");
        assert!(!e.message.is_empty());
    }
    let e = parse_unit("gmp/ft").expect_err("unknown");
    assert_eq!((e.offset, e.len), (0, 3));
    assert_eq!(e.suggestions.first().map(String::as_str), Some("gpm"));
}

fn check_outcome(text: &str) -> Result<(), TestCaseError> {
    match parse_unit(text) {
        Ok(u) => prop_assert!(u.factor.is_finite() && u.factor > 0.0 && u.offset.is_finite()),
        Err(e) => {
            prop_assert!(e.offset + e.len <= text.len());
            prop_assert!(text.is_char_boundary(e.offset));
            prop_assert!(text.is_char_boundary(e.offset + e.len));
        }
    }
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn any_text_parses_or_errors_without_panicking(text in any::<String>()) {
        check_outcome(&text)?;
    }

    #[test]
    fn unit_like_text_parses_or_errors_without_panicking(
        text in "[mskgPaftinlbhHzWJ°CF%()*/^·0-9_\\-−²⁻ ]{0,14}"
    ) {
        check_outcome(&text)?;
    }

    #[test]
    fn random_bytes_parse_or_error_without_panicking(bytes in prop::collection::vec(any::<u8>(), 0..24)) {
        check_outcome(&String::from_utf8_lossy(&bytes))?;
    }

    #[test]
    fn quantity_arithmetic_stays_finite(a in any::<f64>(), b in any::<f64>(), n in -200i32..200) {
        let (x, y) = (Quantity::number(a), Quantity::number(b));
        let results = [x.add(y), x.sub(y), x.mul(y), x.div(y), x.powi(n)];
        for r in results.into_iter().flatten() {
            prop_assert!(r.si.is_finite());
        }
    }
}
