//! The Colebrook–White equation, solved to convergence, and its two asymptotes.
//!
//! Colebrook, C. F. (1939), "Turbulent flow in pipes, with particular reference to the
//! transition region between the smooth and rough pipe laws", J. Institution of Civil
//! Engineers 11(4):133–156:
//!
//! 1/sqrt(f) = -2 log10( (eps/D)/3.7 + 2.51 / (Re sqrt(f)) ).
//!
//! Physically valid for turbulent flow, Re >= 4000 (common practice), and the range of
//! Moody's (1944) chart, eps/D <= 0.05, Re <= 1e8. Mathematically it has exactly one root
//! for every Re > 0 and 0 <= eps/D < 3.7; the solver accepts that whole domain.

use super::{valid_inputs, FrictionError};

/// Relative tolerance on x = 1/sqrt(f) at which Newton's method stops; the Newton step
/// bounds the remaining error, so f is then correct to about 2e-13 relative, well inside
/// the 1e-10 required.
const TOLERANCE: f64 = 1e-13;
/// Iteration cap. From the explicit start Newton needs 2–4 steps; the cap only guards
/// against a defect, and hitting it is reported as an error.
const MAX_ITERATIONS: u32 = 100;

/// A converged Colebrook solution.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ColebrookSolution {
    /// Darcy friction factor.
    pub f: f64,
    /// Newton (or safeguarding bisection) steps taken.
    pub iterations: u32,
}

/// Darcy friction factor from Colebrook (1939), solved to about 1e-13 relative.
///
/// Method: Newton's method on g(x) = x + 2 log10(eps/D/3.7 + 2.51 x / Re), x = 1/sqrt(f),
/// started from the Swamee–Jain (1976) explicit value. g is increasing and concave, so
/// Newton converges monotonically once an iterate lies left of the root; a bracket
/// [lo, hi] with bisection fallback keeps every iterate inside the domain. At most 100
/// iterations.
///
/// Returns `f64::NAN` when there is no solution (non-finite input, Re <= 0,
/// eps/D < 0 or eps/D >= 3.7); [`solve_colebrook`] returns the error instead.
/// Worked number: Re = 1e5, eps/D = 1e-4 gives f = 0.018513866 (same value in the
/// `fluids` package docs for `Colebrook`).
pub fn colebrook(re: f64, relative_roughness: f64) -> f64 {
    solve_colebrook(re, relative_roughness, None)
        .map(|solution| solution.f)
        .unwrap_or(f64::NAN)
}

/// As [`colebrook`], but starting from a previous solution `guess_f` (for example the
/// neighbouring point of a flow grid), which usually saves one or two iterations.
/// A non-finite or non-positive guess falls back to the explicit starting value.
pub fn colebrook_warm(re: f64, rr: f64, guess_f: f64) -> f64 {
    solve_colebrook(re, rr, Some(guess_f))
        .map(|solution| solution.f)
        .unwrap_or(f64::NAN)
}

/// Solves Colebrook (1939) and reports the iteration count, or an error for inputs
/// without a solution or (not expected in practice) a solver that fails to converge
/// within the iteration cap.
pub fn solve_colebrook(
    re: f64,
    rr: f64,
    guess_f: Option<f64>,
) -> Result<ColebrookSolution, FrictionError> {
    if !valid_inputs(re, rr) {
        return Err(FrictionError::invalid(re, rr));
    }
    let a = rr / 3.7;
    if a >= 1.0 {
        return Err(FrictionError::new(format!(
            "Colebrook has no solution for relative roughness {rr} (it needs eps/D < 3.7)"
        )));
    }
    let b = 2.51 / re;
    let two_over_ln10 = 2.0 / std::f64::consts::LN_10;
    let g = |x: f64| x + 2.0 * (a + b * x).log10();
    let dg = |x: f64| 1.0 + two_over_ln10 * b / (a + b * x);

    // g(0+) = 2 log10(a) < 0 and g(x_upper) = x_upper > 0 where a + b x_upper = 1,
    // so the root lies in (0, x_upper).
    let x_upper = (1.0 - a) / b;
    let mut lo = 0.0_f64;
    let mut hi = x_upper;
    let mut x = guess_f
        .filter(|f| f.is_finite() && *f > 0.0)
        .map(|f| 1.0 / f.sqrt())
        .filter(|x| *x < x_upper)
        .unwrap_or_else(|| explicit_start(re, rr, x_upper));
    for iteration in 1..=MAX_ITERATIONS {
        let gx = g(x);
        if gx == 0.0 {
            return Ok(ColebrookSolution {
                f: 1.0 / (x * x),
                iterations: iteration,
            });
        }
        if gx < 0.0 {
            lo = lo.max(x);
        } else {
            hi = hi.min(x);
        }
        let newton = x - gx / dg(x);
        // A Newton step this small bounds the remaining error (quadratic convergence);
        // a bisection step is accepted as converged only once the bracket is that narrow.
        if (newton - x).abs() <= TOLERANCE * x || hi - lo <= TOLERANCE * x {
            let root = if newton > lo && newton < hi {
                newton
            } else {
                x
            };
            return Ok(ColebrookSolution {
                f: 1.0 / (root * root),
                iterations: iteration,
            });
        }
        x = if newton > lo && newton < hi {
            newton
        } else {
            0.5 * (lo + hi)
        };
    }
    Err(FrictionError::new(format!(
        "Colebrook solver did not converge in {MAX_ITERATIONS} iterations \
         (Re {re}, eps/D {rr})"
    )))
}

/// dF/dRe of the Colebrook (1939) friction factor `f` solved at (re, eps/D = rr), 1/(unit
/// of Re), by implicit differentiation of the equation in x = 1/sqrt(f):
/// g(x, Re) = x + 2 log10(a + b x) = 0 with a = (eps/D)/3.7, b = 2.51/Re, so
/// dx/dRe = c b x / (Re (1 + c b)) with c = 2 / (ln 10 (a + b x)), and df/dRe = -2 x^-3 dx/dRe.
/// One division-only step after the solve, instead of a second solve for a difference
/// quotient. NaN when `f` is not a positive finite number.
pub fn colebrook_slope(re: f64, rr: f64, f: f64) -> f64 {
    if !(f.is_finite() && f > 0.0 && re > 0.0) {
        return f64::NAN;
    }
    let x = 1.0 / f.sqrt();
    let b = 2.51 / re;
    let c = 2.0 / (std::f64::consts::LN_10 * (rr / 3.7 + b * x));
    let dx = c * b * x / (re * (1.0 + c * b));
    -2.0 * dx / (x * x * x)
}

/// Starting value for x = 1/sqrt(f): Swamee–Jain (1976) where it lies inside the
/// bracket (0, x_upper), else x_upper / 2 (very low Re, where Swamee–Jain has no
/// meaning), from which the bracketed Newton iteration converges in a few steps.
fn explicit_start(re: f64, rr: f64, x_upper: f64) -> f64 {
    let x = -2.0 * (rr / 3.7 + 5.74 / re.powf(0.9)).log10();
    if x.is_finite() && x > 0.0 && x < x_upper {
        x
    } else {
        0.5 * x_upper
    }
}

/// Fully rough (Re -> infinity) limit of Colebrook, the von Kármán–Nikuradse rough-pipe
/// law 1/sqrt(f) = 2 log10(3.7 / (eps/D)).
///
/// Source: von Kármán, T. (1930), "Mechanische Ähnlichkeit und Turbulenz"; constants as
/// in Colebrook (1939), fitted to Nikuradse, J. (1933), "Strömungsgesetze in rauhen
/// Rohren", VDI-Forschungsheft 361. Valid for wholly rough turbulent flow,
/// 0 < eps/D < 3.7 (NaN otherwise).
/// Worked number: eps/D = 0.001 gives f = 0.019635.
pub fn von_karman_fully_rough(rr: f64) -> f64 {
    if !(rr.is_finite() && rr > 0.0 && rr < 3.7) {
        return f64::NAN;
    }
    let inv_sqrt_f = 2.0 * (3.7 / rr).log10();
    1.0 / (inv_sqrt_f * inv_sqrt_f)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn worked_numbers() {
        assert!((colebrook(1e5, 1e-4) - 0.018513866077471).abs() < 1e-12); // fluids Colebrook docstring
        assert!((von_karman_fully_rough(0.001) - 0.019635).abs() < 1e-6); // hand calc: 1/(2 log10 3700)^2 = 1/7.1364^2
    }

    #[test]
    fn solution_satisfies_the_equation() {
        for &re in &[1e-3, 1.0, 100.0, 4e3, 1e5, 1e8, 1e12] {
            for &rr in &[0.0, 1e-6, 1e-3, 0.05, 1.0, 3.6] {
                let s = solve_colebrook(re, rr, None).expect("solvable");
                let x = 1.0 / s.f.sqrt();
                let residual = x + 2.0 * (rr / 3.7 + 2.51 * x / re).log10();
                assert!(
                    residual.abs() <= 1e-11 * x.max(1.0),
                    "Re {re} rr {rr}: {residual}"
                );
                assert!(
                    s.iterations <= 8,
                    "Re {re} rr {rr}: {} iterations",
                    s.iterations
                );
            }
        }
    }

    #[test]
    fn slope_matches_a_central_difference() {
        // The implicit derivative against a difference quotient of the solved equation
        // (Colebrook 1939), over smooth to rough pipes and Re 4e3..1e8.
        for &re in &[4e3, 3e4, 1e5, 2e6, 1e8] {
            for &rr in &[0.0, 1e-5, 1e-3, 0.05] {
                let h = re * 1e-5;
                let numeric = (colebrook(re + h, rr) - colebrook(re - h, rr)) / (2.0 * h);
                let analytic = colebrook_slope(re, rr, colebrook(re, rr));
                assert!(analytic < 0.0, "Re {re} rr {rr}: {analytic}");
                let scale = colebrook(re, rr) / re;
                assert!(
                    (analytic - numeric).abs() <= 1e-6 * scale,
                    "Re {re} rr {rr}: {analytic} vs {numeric}"
                );
            }
        }
        assert!(colebrook_slope(1e5, 1e-4, f64::NAN).is_nan());
    }

    #[test]
    fn warm_start_agrees_and_saves_work() {
        let cold = solve_colebrook(1.01e5, 1e-4, None).expect("ok");
        let warm = solve_colebrook(1.01e5, 1e-4, Some(colebrook(1e5, 1e-4))).expect("ok");
        assert!((cold.f / warm.f - 1.0).abs() < 1e-12);
        assert!(warm.iterations <= cold.iterations);
        // Bad guesses fall back or still converge.
        for guess in [f64::NAN, -1.0, 0.0, 1e-30, 1e30] {
            assert!((colebrook_warm(1.01e5, 1e-4, guess) / cold.f - 1.0).abs() < 1e-12);
        }
    }

    #[test]
    fn no_solution_is_an_error() {
        assert!(solve_colebrook(1e5, 3.7, None).is_err());
        assert!(solve_colebrook(0.0, 0.0, None).is_err());
        assert!(colebrook(f64::NAN, 0.0).is_nan());
        assert!(von_karman_fully_rough(0.0).is_nan());
    }
}
