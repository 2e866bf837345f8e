//! Reals of the content streams, written as Rust's `{}` writes an `f32` (the bytes
//! printpdf and lopdf gave), but faster.
//!
//! Rust's `Display` for `f32` prints the shortest decimal that reads back as the same
//! `f32` (the closest one when several are as short), in plain notation: no exponent,
//! no trailing `.0`, `-0` for negative zero (`core::fmt::float`,
//! `float_to_decimal_common_shortest` with no minimum precision). The digits are the
//! same shortest round-trip digits any correct shortest algorithm finds; they come here
//! from `zmij` (Schubfach, R. Giulietti, "The Schubfach way to render doubles", 2020;
//! already in the build through `serde_json`), whose own layout (`1.0`, `1e-7`,
//! `1.5e+20`) is turned into `Display`'s. Equality with `{}` is tested over every demo
//! and over random and swept `f32` values (`tests` below).

/// Appends `v` to `out` exactly as `write!(out, "{v}")` would.
pub(super) fn push_f32(out: &mut String, v: f32) {
    match shortest(v) {
        Some((negative, digits, exponent)) => plain(out, negative, digits, exponent),
        None => {
            // Not finite (not drawn by the layout), or a tie out of the exact range:
            // as `{}` writes it.
            use std::fmt::Write;
            let _ = write!(out, "{v}");
        }
    }
}

/// The shortest round-trip decimal of a finite `v` as `(negative, digits, exponent)`,
/// `|v| ≈ digits · 10^exponent`, `digits` without trailing zeros (0 for zero), with
/// `Display`'s choice between two equally close candidates: zmij rounds such a tie to
/// the even digit, `core`'s Grisu/Dragon to the larger magnitude (e.g. 229.078125 →
/// 229.07813). `None` for NaN and the infinities, and for a tie that could not be
/// decided exactly.
fn shortest(v: f32) -> Option<(bool, u64, i32)> {
    if !v.is_finite() {
        return None;
    }
    let mut buffer = zmij::Buffer::new();
    let printed = buffer.format_finite(v);
    let negative = printed.starts_with('-');
    let (mantissa, exponent) = match printed.split_once('e') {
        Some((m, e)) => (m, e.trim_start_matches('+').parse::<i32>().ok()?),
        None => (printed, 0),
    };
    let mut digits: u64 = 0;
    let mut exponent = exponent;
    let mut after_point = false;
    for b in mantissa.bytes() {
        match b {
            b'0'..=b'9' => {
                digits = digits.checked_mul(10)? + u64::from(b - b'0');
                if after_point {
                    exponent -= 1;
                }
            }
            b'.' => after_point = true,
            _ => {}
        }
    }
    if digits == 0 {
        return Some((negative, 0, 0));
    }
    if is_tie(v.abs(), digits, exponent)? {
        digits += 1;
    }
    while digits.is_multiple_of(10) {
        digits /= 10;
        exponent += 1;
    }
    Some((negative, digits, exponent))
}

/// Whether `v` (positive, finite) lies exactly halfway between `digits · 10^k` and the
/// next decimal up, `(digits + 1) · 10^k`: `2·v = (2·digits + 1) · 10^k`, in integers
/// (`v = m · 2^e`). `None` when the integers do not fit in 128 bits.
fn is_tie(v: f32, digits: u64, k: i32) -> Option<bool> {
    let bits = v.to_bits();
    let raw_exp = (bits >> 23) as i32;
    let fraction = u128::from(bits & 0x7f_ffff);
    let (m, e) = if raw_exp == 0 {
        (fraction, -149)
    } else {
        (fraction | 0x80_0000, raw_exp - 150)
    };
    let pow = |base: u128, n: u32| base.checked_pow(n);
    // 2·m·2^e·10^max(−k, 0)·2^max(−e, 0) against (2·digits + 1)·10^max(k, 0)·2^max(−e, 0),
    // the common factor 2^max(−e, 0) taken off the left side's 2^e.
    let left = (2 * m)
        .checked_mul(pow(2, e.max(0) as u32)?)?
        .checked_mul(pow(10, (-k).max(0) as u32)?)?;
    let right = (2 * u128::from(digits) + 1)
        .checked_mul(pow(10, k.max(0) as u32)?)?
        .checked_mul(pow(2, (-e).max(0) as u32)?)?;
    Some(left == right)
}

/// Writes `digits · 10^exponent` in plain notation, as
/// `core::num::flt2dec::digits_to_dec_str` does with no fractional minimum.
fn plain(out: &mut String, negative: bool, digits: u64, exponent: i32) {
    if negative {
        out.push('-');
    }
    if digits == 0 {
        out.push('0');
        return;
    }
    let mut text = [0u8; 20];
    let mut n = 0;
    let mut rest = digits;
    while rest > 0 {
        text[n] = b'0' + (rest % 10) as u8;
        rest /= 10;
        n += 1;
    }
    text[..n].reverse();
    let text = &text[..n];
    let ascii = |out: &mut String, d: &[u8]| out.extend(d.iter().map(|&b| char::from(b)));
    // The decimal point after `point` digits.
    let point = n as i32 + exponent;
    if point <= 0 {
        out.push_str("0.");
        out.extend(std::iter::repeat_n('0', point.unsigned_abs() as usize));
        ascii(out, text);
    } else if (point as usize) < n {
        let (a, b) = text.split_at(point as usize);
        ascii(out, a);
        out.push('.');
        ascii(out, b);
    } else {
        ascii(out, text);
        out.extend(std::iter::repeat_n('0', point as usize - n));
    }
}

#[cfg(test)]
mod tests {
    use super::push_f32;
    use proptest::prelude::*;

    fn same_as_display(v: f32) {
        let mut fast = String::new();
        push_f32(&mut fast, v);
        assert_eq!(fast, format!("{v}"), "bits {:#010x}", v.to_bits());
    }

    #[test]
    fn known_values_print_as_display() {
        for v in [
            0.0,
            -0.0,
            1.0,
            -1.0,
            0.5,
            0.1,
            1.0 / 3.0,
            255.0 / 255.0,
            128.0 / 255.0,
            43210.0,
            1e-7,
            1e-5,
            1.5e-5,
            1e7,
            1.342_178e8,
            1e20,
            3.402_823_5e38,
            f32::MIN_POSITIVE,
            1e-45,
            f32::NAN,
            f32::INFINITY,
            f32::NEG_INFINITY,
            841.889_8,
            595.275_6,
            229.078_13, // exactly 229.078125: a tie of two 8-digit candidates
            0.5e-3,
            9.999_999e8,
        ] {
            same_as_display(v);
        }
    }

    #[test]
    fn a_sweep_of_page_coordinates_prints_as_display() {
        // Every 1073rd f32 from 0 to 5000 (about a million values over all the
        // exponents a coordinate, colour or width can have), and their negatives.
        let end = 5000.0f32.to_bits();
        let mut bits = 0u32;
        while bits < end {
            same_as_display(f32::from_bits(bits));
            same_as_display(-f32::from_bits(bits));
            bits += 37 * 29;
        }
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(20_000))]
        #[test]
        fn any_f32_prints_as_display(bits in any::<u32>()) {
            same_as_display(f32::from_bits(bits));
        }

        #[test]
        fn page_reals_print_as_display(v in -2000.0f32..2000.0) {
            same_as_display(v);
        }
    }
}
