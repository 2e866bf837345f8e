//! Source texts as the package prints them: the publication only. Whether a value was
//! recalled is said once per reference in the References chapter, not in every cell,
//! and the open transcriptions the test suite compares with are cross-checks, never
//! sources, so both kinds of remark are left out of cells here.

use crate::display::Units;

/// A source text from the engine cut to its publication: remarks "from memory" and
/// notes naming a software transcription are removed, lengths it quotes are shown in
/// the report's units, and input syntax is set for print.
pub fn publication(raw: &str, units: &Units) -> String {
    let mut out = String::new();
    let mut rest = raw;
    while let Some(open) = rest.find('(') {
        let Some(len) = rest[open..].find(')') else {
            break;
        };
        out.push_str(&rest[..open]);
        let inner = &rest[open + 1..open + len];
        let kept: Vec<String> = inner
            .split(';')
            .map(|part| {
                part.split(", ")
                    .map(str::trim)
                    .filter(|piece| {
                        *piece != "from memory"
                            && *piece != "recalled"
                            && !names_a_transcription(piece)
                    })
                    .collect::<Vec<_>>()
                    .join(", ")
            })
            .filter(|part| !part.is_empty())
            .collect();
        if kept.is_empty() {
            out.truncate(out.trim_end().len());
        } else {
            out.push('(');
            out.push_str(&kept.join("; "));
            out.push(')');
        }
        rest = &rest[open + len + 1..];
    }
    out.push_str(rest);
    let out = out
        .split("; ")
        .filter(|piece| !names_a_transcription(piece))
        .collect::<Vec<_>>()
        .join("; ");
    let text = super::wording::plain(&out)
        .replace(", from memory", "")
        .replace("; from memory", "")
        .replace(" - ", " − ")
        .replace(" x ", " × ");
    in_report_units(&text, units)
}

/// Lengths quoted in a source ("0.00085 ft", "0.015 mm", "367 m") in the report's
/// units: small ones as roughness, those given in metres as lengths, others as
/// diameters. A value already in the report's unit stays as written.
fn in_report_units(text: &str, units: &Units) -> String {
    let words: Vec<&str> = text.split_whitespace().collect();
    let mut out: Vec<String> = Vec::new();
    let mut k = 0;
    while k < words.len() {
        let unit = words
            .get(k + 1)
            .map(|w| w.trim_end_matches([',', ';', ')']));
        let factor = match unit {
            Some("ft") => Some(0.3048),
            Some("mm") => Some(1e-3),
            Some("m") => Some(1.0),
            _ => None,
        };
        match (words[k].parse::<f64>(), factor, unit) {
            (Ok(value), Some(factor), Some(unit)) if value.is_finite() => {
                let metres = value * factor;
                let shown = if metres < 0.01 {
                    units.roughness()
                } else if unit == "m" {
                    units.length()
                } else {
                    units.diameter()
                };
                let tail = &words[k + 1][unit.len()..];
                if shown.label == unit {
                    out.push(format!("{} {unit}{tail}", words[k]));
                } else {
                    out.push(format!("{}{tail}", shown.text(metres)));
                }
                k += 2;
            }
            _ => {
                out.push(words[k].to_string());
                k += 1;
            }
        }
    }
    out.join(" ")
}

/// Whether a note refers to a software transcription (a cross-check, not a source).
fn names_a_transcription(part: &str) -> bool {
    part.contains("fluids.") || part.contains("fluids package")
}

// "from memory" inside a longer remark ("design value ..., from memory") is cut by
// the ", " split above; a remark that is only "from memory" goes with its brackets.

/// "label: text" unless the text already starts with the label.
pub fn labelled(label: &str, text: &str, units: &Units) -> String {
    let text = publication(text, units);
    if text.starts_with(&format!("{label}:")) {
        text
    } else {
        format!("{label}: {text}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::ReportUnits;

    fn us() -> Units {
        Units::new(ReportUnits::Us)
    }

    fn publication_us(raw: &str) -> String {
        publication(raw, &us())
    }

    #[test]
    fn quoted_lengths_follow_the_report_units() {
        // Moody (1944) tabulates commercial steel as 0.00015 ft: 0.00015 × 304.8 =
        // 0.04572 mm, shown to the roughness column's 4 decimals.
        let si = Units::new(ReportUnits::Si);
        assert_eq!(
            publication(
                "Moody (1944), commercial steel 0.00015 ft; at 367 m elevation",
                &si
            ),
            "Moody (1944), commercial steel 0.0457 mm; at 367 m elevation"
        );
        // 367 m / 0.3048 = 1204.07 ft (length, 0 decimals); 0.015 mm / 25.4 = 0.000591 in.
        assert_eq!(
            publication("welded stainless 0.015 mm, at 367 m elevation", &us()),
            "welded stainless 0.00059 in, at 1204 ft elevation"
        );
    }

    #[test]
    fn memory_and_transcription_remarks_leave_the_cell() {
        // A fitting source of the engine's table (src/hydraulics/fittings/table.rs).
        assert_eq!(
            publication_us("Crane TP-410 (2009), p. A-29, K = 75 fT (from memory; as fluids.fittings.K_foot_valve_Crane style 1)"),
            "Crane TP-410 (2009), p. A-29, K = 75 fT"
        );
        assert_eq!(
            publication_us("Hooper (1981) 2-K inlet table, K1 = 160, Kinf = 0.5 (from memory; Kinf equals Crane TP-410's 0.5, fluids.fittings.entrance_sharp)"),
            "Hooper (1981) 2-K inlet table, K1 = 160, K∞ = 0.5 (K∞ equals Crane TP-410's 0.5)"
        );
        assert_eq!(
            publication_us("ASME B36.10M (ID = OD - 2 x nominal wall)"),
            "ASME B36.10M (ID = OD − 2 × nominal wall)"
        );
    }

    #[test]
    fn a_label_is_not_repeated() {
        assert_eq!(
            labelled(
                "roughness",
                "roughness: Moody (1944), Fig. 2 (from memory)",
                &us()
            ),
            "roughness: Moody (1944), Fig. 2"
        );
        assert_eq!(
            labelled("diameter", "ASME B36.10M", &us()),
            "diameter: ASME B36.10M"
        );
    }
}
