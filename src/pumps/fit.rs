//! Fitting one pump-curve quantity (head, efficiency, NPSHr, shaft power) against flow.
//!
//! Two methods:
//! - least-squares polynomial of a chosen degree, by Householder QR in a scaled
//!   variable (see [`super::lsq`]); this is the same least-squares problem that
//!   `numpy.polyfit` solves, so the coefficients agree to rounding;
//! - the Fritsch–Carlson (1980) monotone piecewise cubic Hermite interpolant
//!   (see [`super::spline`]), which passes through every point.
//!
//! Defaults per quantity ([`fit_default`]), our documented choice:
//! - **head**: at least 3 points. Least-squares quadratic; if it misses the data by more
//!   than [`ACCEPT_RELATIVE_RESIDUAL`] of their range and there are 5 or more points,
//!   the cubic. A candidate must also be monotone non-increasing on the data domain
//!   whenever the data are. If no candidate qualifies, the monotone spline is used and
//!   a warning says so and why.
//! - **efficiency**: at least 3 points. Least-squares cubic (quadratic with exactly
//!   3 points), through the data as given: not forced through zero at shut-off unless
//!   the table has a zero-flow point. Warnings when it misses the data by more than
//!   [`ACCEPT_RELATIVE_RESIDUAL`] or exceeds 1 on the domain.
//! - **NPSHr and shaft power**: at least 2 points (a straight line for exactly 2, with
//!   a warning); otherwise as for head, with "monotone in the direction of the data"
//!   (usually rising) instead of non-increasing.
//!
//! Validity: the fitted curve is valid on its data domain [q_first, q_last] (for a
//! table that starts at shut-off, [0, q_max]). Outside it the value is an
//! extrapolation; [`FittedCurve::is_extrapolating`] says so and callers warn.

use super::lsq::ScaledPolynomial;
use super::spline::MonotoneSpline;
use super::PumpError;

/// Highest polynomial degree accepted; higher degrees oscillate between pump data points.
pub const MAX_POLYNOMIAL_DEGREE: usize = 8;

/// A default polynomial is accepted when its largest deviation is at most this fraction
/// of the data range (2 %). Our choice, stated so that a reviewer can change it.
pub const ACCEPT_RELATIVE_RESIDUAL: f64 = 0.02;

/// How to fit one quantity against flow.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FitMethod {
    /// Least-squares polynomial of this degree (1..=[`MAX_POLYNOMIAL_DEGREE`]);
    /// needs degree + 1 points.
    Polynomial {
        /// Polynomial degree.
        degree: usize,
    },
    /// Fritsch–Carlson monotone piecewise cubic Hermite interpolation; needs 2 points.
    MonotoneSpline,
}

/// How far a fitted curve misses its data points.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FitResiduals {
    /// Largest |fit − data| over the points, in the quantity's unit.
    pub max_abs: f64,
    /// Root-mean-square of the deviations, in the quantity's unit.
    pub rms: f64,
    /// `max_abs` divided by the data range (max − min of the values); when all values
    /// are equal, divided by the largest |value| instead (0 when that is 0 too).
    pub max_relative: f64,
}

/// The quantity a curve describes; selects the default fit and the error wording.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Quantity {
    /// Total head, m.
    Head,
    /// Pump efficiency, fraction.
    Efficiency,
    /// Net positive suction head required, m.
    Npshr,
    /// Shaft (brake) power, W.
    ShaftPower,
}

impl Quantity {
    /// Lower-case name used in messages.
    pub fn name(self) -> &'static str {
        match self {
            Quantity::Head => "head",
            Quantity::Efficiency => "efficiency",
            Quantity::Npshr => "NPSHr",
            Quantity::ShaftPower => "shaft power",
        }
    }
}

#[derive(Clone, Debug, PartialEq)]
enum Shape {
    Polynomial(ScaledPolynomial),
    Spline(MonotoneSpline),
}

/// A fitted curve of one quantity against flow, valid on its data domain, with
/// extrapolation flagged by [`FittedCurve::is_extrapolating`].
#[derive(Clone, Debug, PartialEq)]
pub struct FittedCurve {
    shape: Shape,
    domain: (f64, f64),
    residuals: FitResiduals,
}

impl FittedCurve {
    /// Value at flow q (m³/s). Outside the domain this extrapolates (polynomial: the
    /// polynomial itself; spline: a straight line with the end slope).
    pub fn eval(&self, q: f64) -> f64 {
        match &self.shape {
            Shape::Polynomial(p) => p.eval(q),
            Shape::Spline(s) => s.eval(q),
        }
    }

    /// Derivative with respect to flow at q.
    pub fn derivative(&self, q: f64) -> f64 {
        match &self.shape {
            Shape::Polynomial(p) => p.derivative(q),
            Shape::Spline(s) => s.derivative(q),
        }
    }

    /// The data domain (first flow, last flow) in m³/s.
    pub fn domain(&self) -> (f64, f64) {
        self.domain
    }

    /// Deviations of the fit from its data.
    pub fn residuals(&self) -> FitResiduals {
        self.residuals
    }

    /// Name of the method, for reports.
    pub fn method(&self) -> &'static str {
        match &self.shape {
            Shape::Spline(_) => "Fritsch-Carlson monotone cubic spline",
            Shape::Polynomial(p) => match p.degree() {
                1 => "least-squares polynomial, degree 1",
                2 => "least-squares polynomial, degree 2",
                3 => "least-squares polynomial, degree 3",
                4 => "least-squares polynomial, degree 4",
                5 => "least-squares polynomial, degree 5",
                6 => "least-squares polynomial, degree 6",
                7 => "least-squares polynomial, degree 7",
                _ => "least-squares polynomial, degree 8",
            },
        }
    }

    /// The method as a [`FitMethod`] value.
    pub fn fit_method(&self) -> FitMethod {
        match &self.shape {
            Shape::Spline(_) => FitMethod::MonotoneSpline,
            Shape::Polynomial(p) => FitMethod::Polynomial { degree: p.degree() },
        }
    }

    /// Polynomial coefficients in ascending powers of q (SI), or `None` for a spline.
    pub fn monomial_coefficients(&self) -> Option<Vec<f64>> {
        match &self.shape {
            Shape::Polynomial(p) => Some(p.monomial_coefficients()),
            Shape::Spline(_) => None,
        }
    }

    /// True when q lies outside the data domain (beyond a relative slack of 1e-9).
    pub fn is_extrapolating(&self, q: f64) -> bool {
        let (lo, hi) = self.domain;
        let slack = 1e-9 * hi.abs().max(hi - lo);
        !(q >= lo - slack && q <= hi + slack)
    }

    /// Smallest and largest derivative on the data domain (exact for polynomials up to
    /// degree 3; a spline is sampled at 1001 points).
    pub fn derivative_range_on_domain(&self) -> (f64, f64) {
        let (lo, hi) = self.domain;
        match &self.shape {
            Shape::Polynomial(p) => p.derivative_range(lo, hi),
            Shape::Spline(s) => (0..=1000).fold((f64::INFINITY, f64::NEG_INFINITY), |acc, i| {
                let d = s.derivative(lo + (hi - lo) * i as f64 / 1000.0);
                (acc.0.min(d), acc.1.max(d))
            }),
        }
    }

    /// Largest value on the data domain, sampled at 1001 points.
    pub fn max_on_domain(&self) -> f64 {
        let (lo, hi) = self.domain;
        (0..=1000)
            .map(|i| self.eval(lo + (hi - lo) * i as f64 / 1000.0))
            .fold(f64::NEG_INFINITY, f64::max)
    }
}

/// Checks the data common to every fit: equal lengths, enough points, finite numbers,
/// flows ≥ 0 and strictly increasing, values ≥ 0 (heads, efficiencies, NPSHr and powers
/// are never negative).
fn validate(flow: &[f64], values: &[f64], needed: usize) -> Result<(), PumpError> {
    if flow.len() != values.len() {
        return Err(PumpError::new(format!(
            "{} flows but {} values: every flow needs one value",
            flow.len(),
            values.len()
        )));
    }
    if flow.len() < needed {
        return Err(PumpError::new(format!(
            "{} given but the fit needs at least {needed}",
            match flow.len() {
                1 => "1 point".to_string(),
                n => format!("{n} points"),
            }
        )));
    }
    if let Some(i) = flow.iter().position(|q| !q.is_finite()) {
        return Err(PumpError::new(format!(
            "flow of point {} is not a finite number ({})",
            i + 1,
            flow[i]
        )));
    }
    if let Some(i) = values.iter().position(|v| !v.is_finite()) {
        return Err(PumpError::new(format!(
            "value of point {} is not a finite number ({})",
            i + 1,
            values[i]
        )));
    }
    if let Some(i) = flow.iter().position(|&q| q < 0.0) {
        return Err(PumpError::new(format!(
            "flow of point {} is negative ({} m3/s)",
            i + 1,
            flow[i]
        )));
    }
    if let Some(i) = flow.windows(2).position(|w| w[1] <= w[0]) {
        return Err(PumpError::new(format!(
            "flows must be strictly increasing, but point {} ({} m3/s) does not exceed \
             point {} ({} m3/s)",
            i + 2,
            flow[i + 1],
            i + 1,
            flow[i]
        )));
    }
    if let Some(i) = values.iter().position(|&v| v < 0.0) {
        return Err(PumpError::new(format!(
            "value of point {} is negative ({})",
            i + 1,
            values[i]
        )));
    }
    Ok(())
}

fn residuals_of(shape: &Shape, flow: &[f64], values: &[f64]) -> FitResiduals {
    let eval = |q: f64| match shape {
        Shape::Polynomial(p) => p.eval(q),
        Shape::Spline(s) => s.eval(q),
    };
    let dev: Vec<f64> = flow
        .iter()
        .zip(values)
        .map(|(&q, &v)| (eval(q) - v).abs())
        .collect();
    let max_abs = dev.iter().copied().fold(0.0, f64::max);
    let rms = (dev.iter().map(|d| d * d).sum::<f64>() / dev.len().max(1) as f64).sqrt();
    let lo = values.iter().copied().fold(f64::INFINITY, f64::min);
    let hi = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let scale = if hi > lo {
        hi - lo
    } else {
        hi.abs().max(lo.abs())
    };
    let max_relative = if scale > 0.0 { max_abs / scale } else { 0.0 };
    FitResiduals {
        max_abs,
        rms,
        max_relative,
    }
}

/// Fits `values` against `flow` by the given method.
///
/// Errors: fewer points than the method needs (degree + 1, or 2 for the spline), a
/// degree of 0 or above [`MAX_POLYNOMIAL_DEGREE`], unequal lengths, NaN or infinite
/// numbers, negative flows or values, flows that are not strictly increasing.
pub fn fit(flow: &[f64], values: &[f64], method: FitMethod) -> Result<FittedCurve, PumpError> {
    let needed = match method {
        FitMethod::Polynomial { degree } => {
            if degree == 0 || degree > MAX_POLYNOMIAL_DEGREE {
                return Err(PumpError::new(format!(
                    "polynomial degree must be 1 to {MAX_POLYNOMIAL_DEGREE}, got {degree}"
                )));
            }
            degree + 1
        }
        FitMethod::MonotoneSpline => 2,
    };
    validate(flow, values, needed)?;
    let shape = match method {
        FitMethod::Polynomial { degree } => {
            Shape::Polynomial(ScaledPolynomial::fit(flow, values, degree)?)
        }
        FitMethod::MonotoneSpline => Shape::Spline(MonotoneSpline::new(flow, values)?),
    };
    let residuals = residuals_of(&shape, flow, values);
    let domain = (flow[0], flow[flow.len() - 1]);
    Ok(FittedCurve {
        shape,
        domain,
        residuals,
    })
}

/// Direction of the data, if they are monotone.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Trend {
    NonIncreasing,
    NonDecreasing,
    Neither,
}

fn trend(values: &[f64]) -> Trend {
    if values.windows(2).all(|w| w[1] <= w[0]) {
        Trend::NonIncreasing
    } else if values.windows(2).all(|w| w[1] >= w[0]) {
        Trend::NonDecreasing
    } else {
        Trend::Neither
    }
}

/// True when the curve follows the data's direction on the data domain.
fn follows_trend(curve: &FittedCurve, values: &[f64], t: Trend) -> bool {
    let (lo, hi) = curve.domain();
    let scale = values.iter().fold(0.0_f64, |m, v| m.max(v.abs()));
    let tol = 1e-9 * scale / (hi - lo);
    let (dmin, dmax) = curve.derivative_range_on_domain();
    match t {
        Trend::NonIncreasing => dmax <= tol,
        Trend::NonDecreasing => dmin >= -tol,
        Trend::Neither => true,
    }
}

/// Fits one quantity with its default method (see the module documentation) and
/// returns the curve with the warnings that explain any fallback.
pub fn fit_default(
    flow: &[f64],
    values: &[f64],
    quantity: Quantity,
) -> Result<(FittedCurve, Vec<String>), PumpError> {
    let name = quantity.name();
    let label = |e: PumpError| PumpError::new(format!("{name} curve: {}", e.message));
    let n = flow.len();
    let mut warnings = Vec::new();
    let min_points = match quantity {
        Quantity::Head | Quantity::Efficiency => 3,
        Quantity::Npshr | Quantity::ShaftPower => 2,
    };
    validate(flow, values, min_points).map_err(label)?;

    if quantity == Quantity::Efficiency {
        let degree = 3.min(n - 1);
        let curve = fit(flow, values, FitMethod::Polynomial { degree }).map_err(label)?;
        let r = curve.residuals();
        if r.max_relative > ACCEPT_RELATIVE_RESIDUAL {
            warnings.push(format!(
                "efficiency curve: the least-squares degree-{degree} fit misses a data point \
                 by {:.1} % of the efficiency range ({:.1} efficiency points)",
                100.0 * r.max_relative,
                100.0 * r.max_abs
            ));
        }
        let peak = curve.max_on_domain();
        if peak > 1.0 {
            warnings.push(format!(
                "efficiency curve: the fit reaches {peak:.3} (above 1) inside the data domain"
            ));
        }
        return Ok((curve, warnings));
    }

    let data_trend = trend(values);
    if quantity == Quantity::Head && data_trend != Trend::NonIncreasing {
        warnings.push(
            "head curve: the head data rise with flow somewhere (a drooping curve); the duty \
             point may not be unique"
                .to_string(),
        );
    }
    let mut degrees = if n == 2 { vec![1] } else { vec![2] };
    if n >= 5 {
        degrees.push(3);
    }
    if n == 2 {
        warnings.push(format!(
            "{name} curve: only 2 points, fitted by a straight line"
        ));
    }
    let mut reasons = Vec::new();
    for &degree in &degrees {
        let curve = fit(flow, values, FitMethod::Polynomial { degree }).map_err(label)?;
        let r = curve.residuals();
        let monotone = follows_trend(&curve, values, data_trend);
        if monotone && r.max_relative <= ACCEPT_RELATIVE_RESIDUAL {
            return Ok((curve, warnings));
        }
        if !monotone {
            reasons.push(format!(
                "the degree-{degree} least-squares polynomial is not monotone on the data \
                 domain although the data are"
            ));
        } else {
            reasons.push(format!(
                "the degree-{degree} least-squares polynomial misses a point by {:.1} % of \
                 the data range (limit {:.0} %)",
                100.0 * r.max_relative,
                100.0 * ACCEPT_RELATIVE_RESIDUAL
            ));
        }
    }
    let curve = fit(flow, values, FitMethod::MonotoneSpline).map_err(label)?;
    warnings.push(format!(
        "{name} curve: {}; using the Fritsch-Carlson monotone spline through the points instead",
        reasons.join("; ")
    ));
    Ok((curve, warnings))
}
