//! Numbers for print without units: signs, significant figures, counted nouns. Used by
//! every stage that words a sentence; quantities with units are shown only by
//! [`crate::display`].

/// A number with `decimals` places for print: the minus sign U+2212 for negatives,
/// and a value that rounds to zero printed without a sign ("0.0", never "-0.0").
pub fn typeset(value: f64, decimals: usize) -> String {
    let text = fixed(value, decimals);
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
    let text = fixed(value, decimals);
    match text.strip_prefix('-') {
        Some(digits) if !digits.chars().any(|c| c.is_ascii_digit() && c != '0') => {
            digits.to_string()
        }
        _ => text,
    }
}

/// `value` with `decimals` places: the text of `format!("{value:.decimals$}")`, made
/// faster (see [`Fixed`]).
pub fn fixed(value: f64, decimals: usize) -> String {
    Fixed(value, decimals).to_string()
}

/// A number printed with a fixed count of decimals, byte for byte as the standard
/// library's `{:.N}` prints it: the exact binary value rounded to N decimals, a tie to
/// the even last digit, a minus sign whenever the value is negative (also "-0.0").
/// `Display` pads to the formatter's width and alignment like a string (so write
/// `{:>8}`, never `{:.2}` or `{:08}`, around it).
///
/// The standard library falls back to Steele and White's (Dragon4) bignum method for
/// many such values, about a thousand instructions each; the results and packages
/// print hundreds of thousands. Here, for |value| < 10¹⁵ and N ≤ 9: value = m·2^e
/// exactly (m < 2⁵³), so value·10^N = m·10^N·2^e, an integer of at most 83 bits
/// shifted right by −e, rounded half to even on the bits shifted out — exact integer
/// arithmetic, no floating-point rounding. Other values go to the standard library. A
/// unit test compares the two over every kind of value, ties included.
#[derive(Clone, Copy, Debug)]
pub struct Fixed(pub f64, pub usize);

impl std::fmt::Display for Fixed {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let Fixed(value, decimals) = *self;
        let mut buffer = [0u8; 40];
        match fixed_exact(value, decimals, &mut buffer) {
            // The buffer holds only ASCII digits, '-' and '.'.
            Some(len) => f.pad(std::str::from_utf8(&buffer[..len]).unwrap_or_default()),
            None => f.pad(&format!("{value:.decimals$}")),
        }
    }
}

/// [`Fixed`]'s exact path: the text of `value` with `decimals` places written into
/// `out`, its length returned; `None` outside |value| < 10¹⁵, decimals ≤ 9 (and for
/// NaN and infinities).
fn fixed_exact(value: f64, decimals: usize, out: &mut [u8; 40]) -> Option<usize> {
    if value.is_nan() || value.abs() >= 1e15 || decimals > 9 {
        return None;
    }
    let bits = value.to_bits();
    let exponent_bits = ((bits >> 52) & 0x7ff) as i32;
    let fraction = bits & ((1u64 << 52) - 1);
    let (mantissa, exponent) = match exponent_bits {
        0 => (fraction, -1074),
        _ => (fraction | (1u64 << 52), exponent_bits - 1075),
    };
    let scale = 10u128.pow(decimals as u32);
    let scaled = u128::from(mantissa) * scale;
    let rounded = if exponent >= 0 {
        // Not reached below 10¹⁵ (m ≥ 2⁵² there means e < 0), kept for completeness:
        // value·10^N < 10²⁴ < 2⁸⁰.
        scaled << exponent
    } else {
        let shift = exponent.unsigned_abs();
        if shift >= 128 {
            0 // m·10^N < 2⁸³, so value·10^N < 2⁻⁴⁵: rounds to 0, no tie
        } else {
            let kept = scaled >> shift;
            let rest = scaled - (kept << shift);
            let half = 1u128 << (shift - 1);
            kept + u128::from(rest > half || (rest == half && kept & 1 == 1))
        }
    };
    // The whole part is below 10¹⁵ and the decimals below 10⁹: both fit 64 bits, and so
    // does `rounded` for every value below about 1.8·10¹⁹ / 10^N (64-bit division is
    // several times faster than 128-bit).
    let (whole, part) = match u64::try_from(rounded) {
        Ok(r) => (
            r / 10u64.pow(decimals as u32),
            r % 10u64.pow(decimals as u32),
        ),
        Err(_) => ((rounded / scale) as u64, (rounded % scale) as u64),
    };
    let mut len = 0;
    if value.is_sign_negative() {
        out[0] = b'-';
        len = 1;
    }
    len += write_digits(whole, 1, &mut out[len..]);
    if decimals > 0 {
        out[len] = b'.';
        len += 1;
        len += write_digits(part, decimals, &mut out[len..]);
    }
    Some(len)
}

/// The decimal digits of `n`, at least `width` of them (leading zeros), into `out`;
/// their count (at most 20, the digits of a `u64`).
fn write_digits(mut n: u64, width: usize, out: &mut [u8]) -> usize {
    let mut digits = [0u8; 24];
    let mut count = 0;
    while n > 0 || count < width {
        digits[count] = b'0' + (n % 10) as u8;
        n /= 10;
        count += 1;
    }
    for (slot, digit) in out.iter_mut().zip(digits[..count].iter().rev()) {
        *slot = *digit;
    }
    count
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
mod fixed_tests {
    use super::*;

    fn check(value: f64) {
        for decimals in 0..=11 {
            assert_eq!(
                fixed(value, decimals),
                format!("{value:.decimals$}"),
                "{value:e} ({:#x}) to {decimals} places",
                value.to_bits()
            );
        }
    }

    #[test]
    fn fixed_prints_what_the_standard_library_prints() {
        // Ties (exact halves at some number of places), both signs, zeros, tiny and
        // subnormal values, the edge of the exact path, NaN and infinities.
        let specials = [
            0.0,
            -0.0,
            0.5,
            1.5,
            2.5,
            -2.5,
            0.125,
            0.375,
            -0.625,
            1e-3,
            0.045,
            0.0625,
            1.0 / 3.0,
            2.675,
            999.9995,
            9.5,
            99.5,
            1e14 + 0.5,
            999_999_999_999_999.9,
            1e15,
            1e16,
            123_456_789.012_345,
            5e-10,
            5e-324,
            2.2e-308,
            f64::MAX,
            f64::MIN_POSITIVE,
            f64::NAN,
            f64::INFINITY,
            f64::NEG_INFINITY,
        ];
        for v in specials {
            check(v);
            check(-v);
        }
        // Every k/2^j for small j: exact ties at several numbers of places.
        for j in 0..12 {
            for k in 0..300 {
                check(f64::from(k) / f64::from(1u32 << j));
            }
        }
        // Values of every magnitude, from a fixed pseudo-random sequence of bit patterns
        // (xorshift64), and decimal values as designs and results have them.
        let mut x: u64 = 0x9e37_79b9_7f4a_7c15;
        for _ in 0..20_000 {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            let v = f64::from_bits(x);
            check(v);
            let scaled = (x >> 11) as f64 / (1u64 << 53) as f64 * 10f64.powi((x % 19) as i32 - 6);
            check(scaled);
        }
    }

    #[test]
    fn fixed_pads_like_a_string() {
        assert_eq!(format!("{:>8}", Fixed(1.23456, 2)), "    1.23");
        assert_eq!(format!("{:<6}|", Fixed(-0.5, 0)), "-0    |");
    }
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
