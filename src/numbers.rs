//! Numbers for print without units: signs, significant figures, counted nouns. Used by
//! every stage that words a sentence; quantities with units are shown only by
//! [`crate::display`].

/// A number with `decimals` places for print: the minus sign U+2212 for negatives,
/// and a value that rounds to zero printed without a sign ("0.0", never "-0.0").
pub fn typeset(value: f64, decimals: usize) -> String {
    let text = format!("{value:.decimals$}");
    match text.strip_prefix('-') {
        Some(digits) if digits.chars().any(|c| c.is_ascii_digit() && c != '0') => {
            format!("\u{2212}{digits}")
        }
        Some(digits) => digits.to_string(),
        None => text,
    }
}

/// A number with `decimals` places in plain ASCII (the text results, messages): a
/// hyphen-minus for negatives, and a value that rounds to zero without a sign ("0.00",
/// never "-0.00").
pub fn plain(value: f64, decimals: usize) -> String {
    let text = format!("{value:.decimals$}");
    match text.strip_prefix('-') {
        Some(digits) if !digits.chars().any(|c| c.is_ascii_digit() && c != '0') => {
            digits.to_string()
        }
        _ => text,
    }
}

/// A count with its noun: "1 warning", "5 warnings".
pub fn count(n: usize, one: &str, many: &str) -> String {
    format!("{n} {}", if n == 1 { one } else { many })
}

/// `value` to `digits` significant figures for print (trailing zeros kept, so a column
/// of costs reads alike: "0.04924", "0.03290"), with the minus sign of [`typeset`].
pub fn significant(value: f64, digits: usize) -> String {
    typeset(value, significant_decimals(value, digits))
}

/// As [`significant`] with trailing zeros dropped, for a value quoted in a sentence
/// ("0.118 USD/kWh").
pub fn significant_trimmed(value: f64, digits: usize) -> String {
    let text = significant(value, digits);
    if text.contains('.') {
        text.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        text
    }
}

/// Decimals that give `value` `digits` significant figures (none for large values).
fn significant_decimals(value: f64, digits: usize) -> usize {
    if value == 0.0 || !value.is_finite() {
        return digits.saturating_sub(1);
    }
    let magnitude = value.abs().log10().floor() as i64;
    (digits as i64 - 1 - magnitude).clamp(0, 12) as usize
}

#[cfg(test)]
mod significant_tests {
    use super::*;

    #[test]
    fn significant_figures_keep_or_drop_zeros() {
        assert_eq!(significant(0.049236, 4), "0.04924");
        assert_eq!(significant(0.0329, 4), "0.03290");
        assert_eq!(significant(-0.0329, 2), "\u{2212}0.033");
        assert_eq!(plain(-0.001, 2), "0.00");
        assert_eq!(plain(-0.006, 2), "-0.01");
        assert_eq!(plain(-0.0, 1), "0.0");
        assert_eq!(plain(2.5, 0), "2");
        assert_eq!(significant(70692.4, 4), "70692");
        assert_eq!(significant_trimmed(0.118, 4), "0.118");
        assert_eq!(significant_trimmed(0.21, 4), "0.21");
    }
}
