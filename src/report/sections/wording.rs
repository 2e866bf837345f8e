//! Plain language for print: requirements in words and report units, and texts that
//! quote the design file's syntax (field paths, `>=`, `m^3/h`, `degC`, backticks)
//! set as a reader expects them. Input syntax belongs to `check`, not the package.

use crate::display::{typeset, Units};
use crate::model::{Metric, Requirement};

/// A requirement in words and report units: "flow ≥ 700 gpm".
pub fn requirement(requirement: &Requirement, units: &Units) -> String {
    let value = requirement.limit_si;
    let (name, shown) = match requirement.metric {
        Metric::Flow => ("flow", units.flow().text(value)),
        Metric::Head => ("head", units.head().text(value)),
        Metric::NpshMargin => ("NPSH margin ratio", typeset(value, 2)),
        Metric::NpshExcess => ("NPSH excess", units.head().text(value)),
        Metric::Efficiency => ("efficiency", crate::display::percent(value)),
        Metric::SuctionVelocity => ("suction velocity", units.velocity().text(value)),
        Metric::DischargeVelocity => ("discharge velocity", units.velocity().text(value)),
        Metric::ShaftPower => ("shaft power", units.power().text(value)),
    };
    let relation = if requirement.at_least { "≥" } else { "≤" };
    format!("{name} {relation} {shown}")
}

/// Field words of the design language and how the package names them.
const FIELD_WORDS: [(&str, &str); 16] = [
    ("test_flow", "test flow"),
    ("well_loss", "well loss"),
    ("npsh_margin", "NPSH margin"),
    ("npsh_excess", "NPSH excess"),
    ("suction_velocity", "suction velocity"),
    ("discharge_velocity", "discharge velocity"),
    ("shaft_power", "shaft power"),
    ("hazen_williams_c", "Hazen-Williams C"),
    ("hours_per_year", "hours per year"),
    ("max_speed", "maximum speed"),
    ("min_speed", "minimum speed"),
    ("vapor_pressure", "vapour pressure"),
    ("service_factor", "service factor"),
    ("barometric_pressure", "barometric pressure"),
    ("pipe_condition", "pipe condition"),
    ("centreline", "centreline"),
];

/// Symbols and units as typed in a design file, and as printed.
const SYMBOLS: [(&str, &str); 12] = [
    (">=", "≥"),
    ("<=", "≤"),
    ("->", "→"),
    ("m^3", "m³"),
    ("ft^3", "ft³"),
    ("^2", "²"),
    ("^3", "³"),
    ("degC", "°C"),
    ("degF", "°F"),
    ("theta", "θ"),
    ("beta", "β"),
    ("Kinf", "K∞"),
];

/// A fitting as a reader names it, from its table description without the remark in
/// brackets: "90° long-radius elbow, r/D = 1.5" (never the keyword `elbow_90_long`).
pub fn fitting(description: &str) -> String {
    let head = match description.rfind(" (") {
        Some(at)
            if description.ends_with(')')
                && ["Darby", "Hooper", "lists", "geometries"]
                    .iter()
                    .any(|w| description[at..].contains(w)) =>
        {
            &description[..at]
        }
        _ => description,
    };
    let mut out = String::new();
    let mut rest = head;
    while let Some(at) = rest.find(" deg") {
        let after = &rest[at + 4..];
        if after.starts_with(|c: char| c.is_ascii_alphabetic()) {
            out.push_str(&rest[..at + 4]);
        } else {
            out.push_str(&rest[..at]);
            out.push('°');
        }
        rest = after;
    }
    out.push_str(rest);
    plain(&out)
}

/// A text with the design file's syntax set for print: backticks dropped, relations,
/// exponents and degree units as symbols, dotted field paths in words
/// ("discharge.2.hazen_williams_c" → "discharge segment 2 Hazen-Williams C").
pub fn plain(text: &str) -> String {
    let mut out = text.replace('`', "");
    for (typed, printed) in SYMBOLS {
        if out.contains(typed) {
            out = out.replace(typed, printed);
        }
    }
    let mut joined = String::with_capacity(out.len() + 16);
    for (i, word) in out.split(' ').enumerate() {
        if i > 0 {
            joined.push(' ');
        }
        joined.push_str(&field_path(word));
    }
    joined
}

/// One word: a dotted field path or a field keyword in words; anything else as is.
fn field_path(word: &str) -> std::borrow::Cow<'_, str> {
    let core = word.trim_end_matches([',', ';', ':', ')']);
    let tail = &word[core.len()..];
    let parts: Vec<&str> = core.split('.').collect();
    let is_path = parts.len() > 1
        && parts.iter().all(|p| {
            !p.is_empty()
                && p.chars()
                    .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_')
        })
        && parts
            .iter()
            .any(|p| p.chars().any(|c| c.is_ascii_lowercase()));
    let field = |p: &str| {
        FIELD_WORDS
            .iter()
            .find(|(typed, _)| *typed == p)
            .map(|(_, printed)| printed.to_string())
            .unwrap_or_else(|| p.to_string())
    };
    if core == "deg" {
        return format!("°{tail}").into();
    }
    if is_path {
        let words: Vec<String> = parts
            .iter()
            .map(|p| {
                if p.chars().all(|c| c.is_ascii_digit()) {
                    format!("segment {p}")
                } else {
                    field(p)
                }
            })
            .collect();
        format!("{}{tail}", words.join(" ")).into()
    } else if FIELD_WORDS.iter().any(|(typed, _)| *typed == core) {
        format!("{}{tail}", field(core)).into()
    } else {
        word.into()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fittings_print_their_description() {
        assert_eq!(
            fitting("90 deg long-radius elbow, r/D = 1.5 (Darby's only r/D = 1.5 entry)"),
            "90° long-radius elbow, r/D = 1.5"
        );
        assert_eq!(
            fitting("ball valve, reduced trim, beta = 0.9"),
            "ball valve, reduced trim, β = 0.9"
        );
        assert_eq!(
            fitting("angle valve, 45 deg, full line size"),
            "angle valve, 45°, full line size"
        );
        for spec in crate::hydraulics::fittings::all_fittings() {
            let shown = fitting(spec.description);
            assert!(!shown.contains('_') && !shown.contains(" deg"), "{shown}");
        }
    }

    #[test]
    fn design_syntax_is_set_for_print() {
        // Texts of the kind the engine writes (requirement findings, case overrides).
        assert_eq!(
            plain("`flow >= 400 m^3/h for average`: met"),
            "flow ≥ 400 m³/h for average: met"
        );
        assert_eq!(
            plain("fluid.temperature = 26 degC; discharge.2.hazen_williams_c = 100"),
            "fluid temperature = 26 °C; discharge segment 2 Hazen-Williams C = 100"
        );
        assert_eq!(plain("`npsh_margin >= 1.3`: met"), "NPSH margin ≥ 1.3: met");
        // Ordinary prose and numbers stay as they are.
        assert_eq!(
            plain("pump A at 1780 rpm, 12.5 in."),
            "pump A at 1780 rpm, 12.5 in."
        );
    }
}
