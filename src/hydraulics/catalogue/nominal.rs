//! Spelling of nominal sizes and schedules: parsing what a user writes and printing
//! the canonical form.
//!
//! Nominal sizes are held as a whole number of eighths of an inch (every inch
//! nominal size in the tables is a multiple of 1/8 in), so matching is exact.

use super::Material;

/// Metric DN designations and the inch nominal pipe size (in eighths) they stand
/// for, as paired in the DN column of ASME B36.10M / B36.19M (from memory).
const DN_TO_EIGHTHS: &[(u32, u16)] = &[
    (6, 1),
    (8, 2),
    (10, 3),
    (15, 4),
    (20, 6),
    (25, 8),
    (32, 10),
    (40, 12),
    (50, 16),
    (65, 20),
    (80, 24),
    (90, 28),
    (100, 32),
    (125, 40),
    (150, 48),
    (200, 64),
    (250, 80),
    (300, 96),
    (350, 112),
    (400, 128),
    (450, 144),
    (500, 160),
    (550, 176),
    (600, 192),
];

/// Largest nominal size accepted by the parser, in eighths (a 120 in pipe), so
/// absurd inputs are refused before any table lookup.
const MAX_EIGHTHS: u16 = 960;

/// Why a nominal size could not be read.
#[derive(Clone, Debug, PartialEq)]
pub(super) enum NominalProblem {
    /// Not a number, fraction or DN designation.
    Unreadable,
    /// A DN designation with no NPS equivalent in the DN table.
    UnknownDn(u32),
    /// A DN designation for a material whose sizes are not NPS based.
    DnNotAccepted,
}

/// Reads an inch nominal size ("1/2", "1-1/4", "1 1/4", "1.25", "4", "4 in",
/// "NPS 4", "4\"") or a DN designation ("DN100", "DN 100"; only for materials whose
/// sizes follow the NPS series) and returns it in eighths of an inch.
pub(super) fn parse_nominal(material: Material, text: &str) -> Result<u16, NominalProblem> {
    let mut s = text.trim().to_ascii_lowercase();
    if let Some(rest) = s.strip_prefix("dn") {
        let digits = rest.trim();
        let dn: u32 = digits.parse().map_err(|_| NominalProblem::Unreadable)?;
        if !accepts_dn(material) {
            return Err(NominalProblem::DnNotAccepted);
        }
        return DN_TO_EIGHTHS
            .iter()
            .find(|(d, _)| *d == dn)
            .map(|(_, e)| *e)
            .ok_or(NominalProblem::UnknownDn(dn));
    }
    if let Some(rest) = s.strip_prefix("nps") {
        s = rest.trim().to_string();
    }
    for unit in ["inches", "inch", "in.", "in", "\""] {
        if let Some(rest) = s.strip_suffix(unit) {
            s = rest.trim().to_string();
            break;
        }
    }
    let inches = parse_inches(&s).ok_or(NominalProblem::Unreadable)?;
    let eighths = inches * 8.0;
    let rounded = eighths.round();
    if !(rounded >= 1.0 && rounded <= f64::from(MAX_EIGHTHS)) || (eighths - rounded).abs() > 1e-9 {
        return Err(NominalProblem::Unreadable);
    }
    // Range-checked above, so the conversion is exact.
    Ok(rounded as u16)
}

/// A pipe's size designation for print in the other unit system: an inch nominal
/// size ("16 in class 350") as its DN ("DN 400 class 350", by the DN column of ASME
/// B36.10M / B36.19M; ductile iron by the same series, common practice), copper tube by
/// its ASTM B88 size number, and a DN ("DN150 schedule 40") as its inch size ("6 in
/// schedule 40"). `metric` is the system printed; a label already in it, or one this
/// cannot read, comes back unchanged.
pub fn size_for_print(material: Material, label: &str, metric: bool) -> String {
    let (size, rest) = match label.split_once(" in ") {
        Some((size, rest)) if metric => (size, rest),
        _ => return dn_as_inches(label, metric).unwrap_or_else(|| label.to_string()),
    };
    let Ok(eighths) = parse_nominal(Material::Steel, size) else {
        return label.to_string();
    };
    let dn = DN_TO_EIGHTHS
        .iter()
        .find(|(_, e)| *e == eighths)
        .map(|(d, _)| *d);
    match (material, dn) {
        (Material::Copper, _) | (_, None) => format!("ASTM size {size} {rest}"),
        (_, Some(dn)) => format!("DN {dn} {rest}"),
    }
}

/// "DN150 schedule 40" → "6 in schedule 40" for a US-units print.
fn dn_as_inches(label: &str, metric: bool) -> Option<String> {
    if metric {
        return None;
    }
    let rest = label.strip_prefix("DN")?;
    let (digits, tail) = rest
        .trim_start()
        .split_once(' ')
        .unwrap_or((rest.trim_start(), ""));
    let dn: u32 = digits.parse().ok()?;
    let eighths = DN_TO_EIGHTHS.iter().find(|(d, _)| *d == dn)?.1;
    Some(
        format!("{} in {tail}", format_nominal(eighths))
            .trim_end()
            .to_string(),
    )
}

/// Whether DN designations map onto the material's sizes (NPS-based series only).
fn accepts_dn(material: Material) -> bool {
    matches!(
        material,
        Material::Steel
            | Material::Galvanized
            | Material::Stainless
            | Material::Pvc
            | Material::Hdpe
    )
}

/// Parses "a", "a.b", "n/d", "a-n/d" or "a n/d" into inches.
fn parse_inches(s: &str) -> Option<f64> {
    let s = s.trim();
    if s.is_empty() || s.len() > 16 {
        return None;
    }
    let (whole, fraction) = match s.find('/') {
        None => return parse_plain(s),
        Some(_) => match s.rfind(['-', ' ']) {
            Some(split) => (parse_plain(&s[..split])?, &s[split + 1..]),
            None => (0.0, s),
        },
    };
    let (num, den) = fraction.split_once('/')?;
    let num: f64 = parse_plain(num)?;
    let den: f64 = parse_plain(den)?;
    if den <= 0.0 || num >= den {
        return None;
    }
    Some(whole + num / den)
}

/// A plain non-negative decimal number.
fn parse_plain(s: &str) -> Option<f64> {
    let s = s.trim();
    if s.is_empty() || !s.chars().all(|c| c.is_ascii_digit() || c == '.') {
        return None;
    }
    s.parse::<f64>().ok().filter(|v| v.is_finite())
}

/// Canonical inch spelling of a nominal size in eighths: "1/8", "3/4", "1-1/4", "24".
pub(super) fn format_nominal(eighths: u16) -> String {
    let whole = eighths / 8;
    let rest = eighths % 8;
    if rest == 0 {
        return whole.to_string();
    }
    let mut num = rest;
    let mut den = 8;
    while num.is_multiple_of(2) {
        num /= 2;
        den /= 2;
    }
    if whole == 0 {
        format!("{num}/{den}")
    } else {
        format!("{whole}-{num}/{den}")
    }
}

/// Normalises a schedule, type, class or DR spelling to the catalogue key.
///
/// Rules (case-insensitive; spaces, '-' and '_' ignored):
/// - steel and galvanized: "40", "sch 40", "schedule 40" -> "40"; "STD"/"standard"
///   -> "STD"; "XS"/"XH"/"extra strong" -> "XS"; "XXS"/"XXH"/"double extra strong" -> "XXS";
/// - stainless: "10S", "sch 10s" -> "10S" (a plain "40" is not taken as "40S": the two
///   differ at NPS 12, so it is refused with suggestions);
/// - PVC: "40", "80"; AWWA C900 "DR 18", "DR18" -> "DR18";
/// - copper: "K", "L", "M", "type L" -> "L";
/// - ductile iron: "350", "class 350", "pressure class 350", "PC350" -> "350";
/// - HDPE: "11", "DR11", "DR 11", "SDR11" -> "DR11"; "13.5" -> "DR13.5".
pub(super) fn normalise_schedule(material: Material, text: &str) -> String {
    let mut s: String = text
        .trim()
        .to_ascii_uppercase()
        .chars()
        .filter(|c| !matches!(c, ' ' | '-' | '_' | '\t'))
        .collect();
    let dr_written = s.starts_with("DR") || s.starts_with("SDR");
    for prefix in [
        "SCHEDULE",
        "SCH.",
        "SCH",
        "PRESSURECLASS",
        "CLASS",
        "PC",
        "TYPE",
        "SDR",
        "DR",
    ] {
        if let Some(rest) = s.strip_prefix(prefix) {
            if !rest.is_empty() {
                s = rest.to_string();
            }
            break;
        }
    }
    let alias = match s.as_str() {
        "STANDARD" => "STD",
        "XH" | "EXTRASTRONG" | "EXTRAHEAVY" => "XS",
        "XXH" | "DOUBLEEXTRASTRONG" | "DOUBLEEXTRAHEAVY" => "XXS",
        _ => "",
    };
    if !alias.is_empty() {
        s = alias.to_string();
    }
    if (material == Material::Hdpe || (material == Material::Pvc && dr_written))
        && !s.starts_with("DR")
    {
        s = format!("DR{s}");
    }
    s
}

/// How a schedule key is written in a suggestion: "schedule 40", "type L",
/// "class 350", "DR11".
pub(super) fn schedule_phrase(material: Material, key: &str) -> String {
    match material {
        Material::Copper => format!("type {key}"),
        Material::DuctileIron | Material::CementLinedDuctileIron => format!("class {key}"),
        Material::Hdpe => key.to_string(),
        Material::Pvc if key.starts_with("DR") => key.to_string(),
        _ => format!("schedule {key}"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn sizes_print_in_the_other_system() {
        let m = Material::DuctileIron;
        assert_eq!(
            size_for_print(m, "16 in class 350", true),
            "DN 400 class 350"
        );
        assert_eq!(
            size_for_print(Material::Stainless, "10 in schedule 10S", true),
            "DN 250 schedule 10S"
        );
        assert_eq!(
            size_for_print(Material::Steel, "1-1/2 in schedule 40", true),
            "DN 40 schedule 40"
        );
        assert_eq!(
            size_for_print(Material::Copper, "1 in type L", true),
            "ASTM size 1 type L"
        );
        assert_eq!(
            size_for_print(Material::Steel, "DN150 schedule 40", false),
            "6 in schedule 40"
        );
        assert_eq!(
            size_for_print(Material::Steel, "8 in schedule 40", false),
            "8 in schedule 40"
        );
        assert_eq!(
            size_for_print(Material::Steel, "DN150 schedule 40", true),
            "DN150 schedule 40"
        );
    }

    #[test]
    fn reads_fractions_decimals_and_dn() {
        let m = Material::Steel;
        assert_eq!(parse_nominal(m, "1/2"), Ok(4));
        assert_eq!(parse_nominal(m, "1-1/4"), Ok(10));
        assert_eq!(parse_nominal(m, "1 1/2 in"), Ok(12));
        assert_eq!(parse_nominal(m, "2.5"), Ok(20));
        assert_eq!(parse_nominal(m, "NPS 24"), Ok(192));
        assert_eq!(parse_nominal(m, "4\""), Ok(32));
        assert_eq!(parse_nominal(m, "DN100"), Ok(32)); // ASME B36.10M DN column: DN 100 = NPS 4
        assert_eq!(parse_nominal(m, "dn 15"), Ok(4));
        assert_eq!(
            parse_nominal(m, "DN 123"),
            Err(NominalProblem::UnknownDn(123))
        );
        assert_eq!(
            parse_nominal(Material::Copper, "DN50"),
            Err(NominalProblem::DnNotAccepted)
        );
        for bad in ["", "abc", "1/0", "3/2", "-4", "1.3", "1e3", "99999"] {
            assert_eq!(
                parse_nominal(m, bad),
                Err(NominalProblem::Unreadable),
                "{bad}"
            );
        }
    }

    #[test]
    fn formats_round_trip() {
        for e in [1u16, 2, 3, 4, 5, 6, 8, 10, 12, 16, 20, 28, 192] {
            let text = format_nominal(e);
            assert_eq!(parse_nominal(Material::Steel, &text), Ok(e), "{text}");
        }
        assert_eq!(format_nominal(10), "1-1/4");
        assert_eq!(format_nominal(5), "5/8");
    }

    #[test]
    fn normalises_schedule_spellings() {
        assert_eq!(normalise_schedule(Material::Steel, "Schedule 40"), "40");
        assert_eq!(normalise_schedule(Material::Steel, "sch80"), "80");
        assert_eq!(normalise_schedule(Material::Steel, "standard"), "STD");
        assert_eq!(normalise_schedule(Material::Steel, "extra strong"), "XS");
        assert_eq!(normalise_schedule(Material::Stainless, "sch 10s"), "10S");
        assert_eq!(normalise_schedule(Material::Copper, "type l"), "L");
        assert_eq!(
            normalise_schedule(Material::DuctileIron, "Pressure Class 350"),
            "350"
        );
        assert_eq!(normalise_schedule(Material::Hdpe, "11"), "DR11");
        assert_eq!(normalise_schedule(Material::Hdpe, "SDR 13.5"), "DR13.5");
        assert_eq!(normalise_schedule(Material::Hdpe, "dr32.5"), "DR32.5");
    }
}
