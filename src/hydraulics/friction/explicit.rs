//! Closed-form Darcy friction factors: laminar, Churchill (1977), Swamee–Jain (1976)
//! and Haaland (1983).
//!
//! Every function returns `f64::NAN` for inputs outside its mathematical domain
//! (non-finite, `re <= 0`, negative roughness); use
//! [`super::checked_darcy_friction_factor`] for an error value and
//! [`super::friction_warnings`] for validity-range warnings.

use super::valid_inputs;

/// Laminar (Hagen–Poiseuille) Darcy friction factor f = 64/Re.
///
/// Source: Hagen (1839), Poiseuille (1840); in this form e.g. Moody, L. F. (1944),
/// "Friction factors for pipe flow", Trans. ASME 66(8):671–684, laminar line of the chart.
/// Valid for fully developed laminar flow, Re below about 2000 (common practice).
/// Worked number: Re = 1000 gives f = 0.064.
pub fn laminar(re: f64) -> f64 {
    if re.is_finite() && re > 0.0 {
        64.0 / re
    } else {
        f64::NAN
    }
}

/// Churchill (1977) all-regime Darcy friction factor
/// f = 8 [ (8/Re)^12 + (A + B)^(-1.5) ]^(1/12),
/// A = [2.457 ln(1 / ((7/Re)^0.9 + 0.27 eps/D))]^16, B = (37530/Re)^16.
///
/// Source: Churchill, S. W. (1977), "Friction-factor equation spans all fluid-flow
/// regimes", Chemical Engineering 84(24):91–92. Continuous over laminar, transitional
/// and turbulent flow; in turbulent flow (4000 <= Re <= 1e8, eps/D <= 0.05) it stays
/// within 3.1 % of the converged Colebrook value (measured in tests/friction_reference.rs;
/// largest near Re 4000).
/// Evaluated in logarithms so that no intermediate power overflows.
/// Worked number: Re = 1e5, eps/D = 1e-4 gives f = 0.01846 (Colebrook: 0.01851).
pub fn churchill_1977(re: f64, rr: f64) -> f64 {
    if !valid_inputs(re, rr) {
        return f64::NAN;
    }
    let inner = (7.0 / re).powf(0.9) + 0.27 * rr;
    let a_base = 2.457 * (1.0 / inner).ln();
    // ln A, ln B (A = a_base^16 is an even power, so use |a_base|).
    let ln_a = 16.0 * a_base.abs().ln();
    let ln_b = 16.0 * (37_530.0 / re).ln();
    let ln_a_plus_b = log_sum_exp(ln_a, ln_b);
    let ln_laminar_term = 12.0 * (8.0 / re).ln();
    let ln_turbulent_term = -1.5 * ln_a_plus_b;
    let ln_sum = log_sum_exp(ln_laminar_term, ln_turbulent_term);
    8.0 * (ln_sum / 12.0).exp()
}

/// Swamee–Jain (1976) explicit approximation of Colebrook:
/// f = 0.25 / [log10(eps/D / 3.7 + 5.74 / Re^0.9)]^2.
///
/// Source: Swamee, P. K. and Jain, A. K. (1976), "Explicit equations for pipe-flow
/// problems", J. Hydraulics Division, ASCE 102(HY5):657–664. Stated validity
/// 5000 <= Re <= 1e8 and 1e-6 <= eps/D <= 1e-2, within about 1 % of Colebrook; measured
/// against the converged Colebrook value it is within 1 % over most of that range but
/// reaches 2.8 % at its corner Re = 5000, eps/D = 1e-2 (tests/friction_reference.rs).
/// Returns NaN where the logarithm's argument reaches 1 (very low Re), since the
/// formula then has no meaning.
/// Worked number: Re = 1e5, eps/D = 1e-4 gives f = 0.01845.
pub fn swamee_jain_1976(re: f64, rr: f64) -> f64 {
    if !valid_inputs(re, rr) {
        return f64::NAN;
    }
    let argument = rr / 3.7 + 5.74 / re.powf(0.9);
    if argument >= 1.0 {
        return f64::NAN;
    }
    0.25 / argument.log10().powi(2)
}

/// Haaland (1983) explicit approximation of Colebrook:
/// 1/sqrt(f) = -1.8 log10[ (eps/D / 3.7)^1.11 + 6.9 / Re ].
///
/// Source: Haaland, S. E. (1983), "Simple and explicit formulas for the friction factor
/// in turbulent pipe flow", J. Fluids Engineering, ASME 105(1):89–90. Stated to agree
/// with Colebrook within about 1.5 % for 4000 <= Re <= 1e8 and eps/D <= 0.05 (measured
/// here: 1.42 % at most).
/// Returns NaN where the logarithm's argument reaches 1 (very low Re).
/// Worked number: Re = 1e5, eps/D = 1e-4 gives f = 0.01827.
pub fn haaland_1983(re: f64, rr: f64) -> f64 {
    if !valid_inputs(re, rr) {
        return f64::NAN;
    }
    let argument = (rr / 3.7).powf(1.11) + 6.9 / re;
    if argument >= 1.0 {
        return f64::NAN;
    }
    let inv_sqrt_f = -1.8 * argument.log10();
    1.0 / (inv_sqrt_f * inv_sqrt_f)
}

/// ln(e^a + e^b) without overflow; either argument may be -inf.
fn log_sum_exp(a: f64, b: f64) -> f64 {
    let (high, low) = if a >= b { (a, b) } else { (b, a) };
    if high == f64::NEG_INFINITY {
        return f64::NEG_INFINITY;
    }
    high + (low - high).exp().ln_1p()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn worked_numbers_in_doc_comments() {
        assert!((laminar(1000.0) - 0.064).abs() < 1e-15);
        assert!((churchill_1977(1e5, 1e-4) - 0.01846).abs() < 5e-5);
        assert!((swamee_jain_1976(1e5, 1e-4) - 0.01845).abs() < 5e-5);
        assert!((haaland_1983(1e5, 1e-4) - 0.01827).abs() < 5e-5);
    }

    #[test]
    fn churchill_is_laminar_at_low_re() {
        for re in [1e-3, 1.0, 100.0, 1000.0] {
            let rel = churchill_1977(re, 1e-3) / laminar(re) - 1.0;
            assert!(rel.abs() < 1e-6, "Re {re}: {rel}");
        }
    }

    #[test]
    fn churchill_has_no_overflow_over_wide_ranges() {
        for &re in &[1e-12, 1e-6, 7.0, 1e4, 1e12, 1e100] {
            for &rr in &[0.0, 1e-9, 0.05, 1.0] {
                let f = churchill_1977(re, rr);
                assert!(f.is_finite() && f > 0.0, "Re {re} rr {rr}: {f}");
            }
        }
    }

    #[test]
    fn invalid_inputs_give_nan() {
        for f in [
            laminar(0.0),
            laminar(f64::NAN),
            churchill_1977(-1.0, 0.0),
            churchill_1977(1e5, -1e-3),
            swamee_jain_1976(1e5, f64::NAN),
            haaland_1983(f64::INFINITY, 0.0),
            swamee_jain_1976(1.0, 0.0),
            haaland_1983(1.0, 0.0),
        ] {
            assert!(f.is_nan());
        }
    }
}
