//! Monotone piecewise cubic Hermite interpolation after Fritsch and Carlson.
//!
//! Source: F. N. Fritsch and R. E. Carlson, "Monotone Piecewise Cubic Interpolation",
//! SIAM Journal on Numerical Analysis 17(2), 238–246 (1980). Steps used here:
//! 1. secant slopes δ_k = (y_{k+1} − y_k)/(x_{k+1} − x_k);
//! 2. initial tangents: the mean of the neighbouring secants at interior points, zero
//!    where the secants differ in sign or either is zero (a local extremum of the data);
//!    the one-sided secant at the two ends;
//! 3. on every interval with δ_k ≠ 0, with α = m_k/δ_k and β = m_{k+1}/δ_k, if
//!    α² + β² > 9 both tangents are scaled by τ = 3/√(α² + β²) (the paper's sufficient
//!    circle condition), and on intervals with δ_k = 0 both tangents are set to zero.
//!
//! The result interpolates the data exactly, is C¹, and is monotone on every interval
//! where the data are. Validity: inside [x_0, x_{n−1}]. Outside that interval the
//! curve is continued as a straight line with the end tangent (C¹, monotone); such
//! values are extrapolations and [`super::FittedCurve::is_extrapolating`] flags them.

use super::PumpError;

/// A Fritsch–Carlson monotone cubic Hermite interpolant.
#[derive(Clone, Debug, PartialEq)]
pub struct MonotoneSpline {
    x: Vec<f64>,
    y: Vec<f64>,
    tangents: Vec<f64>,
}

impl MonotoneSpline {
    /// Builds the interpolant; `x` must be strictly increasing with at least two points.
    pub fn new(x: &[f64], y: &[f64]) -> Result<Self, PumpError> {
        let n = x.len();
        if n < 2 || y.len() != n {
            return Err(PumpError::new(format!(
                "a monotone spline needs at least 2 points with as many values as flows \
                 (got {} flows, {} values)",
                n,
                y.len()
            )));
        }
        if x.windows(2)
            .any(|w| w[1].partial_cmp(&w[0]) != Some(std::cmp::Ordering::Greater))
        {
            return Err(PumpError::new("spline flows must be strictly increasing"));
        }
        let secants: Vec<f64> = (0..n - 1)
            .map(|k| (y[k + 1] - y[k]) / (x[k + 1] - x[k]))
            .collect();
        let mut m = vec![0.0; n];
        m[0] = secants[0];
        m[n - 1] = secants[n - 2];
        for k in 1..n - 1 {
            let (a, b) = (secants[k - 1], secants[k]);
            m[k] = if a * b > 0.0 { 0.5 * (a + b) } else { 0.0 };
        }
        for k in 0..n - 1 {
            let d = secants[k];
            if d == 0.0 {
                m[k] = 0.0;
                m[k + 1] = 0.0;
                continue;
            }
            let alpha = m[k] / d;
            let beta = m[k + 1] / d;
            let s = alpha * alpha + beta * beta;
            if s > 9.0 {
                let tau = 3.0 / s.sqrt();
                m[k] = tau * alpha * d;
                m[k + 1] = tau * beta * d;
            }
        }
        Ok(Self {
            x: x.to_vec(),
            y: y.to_vec(),
            tangents: m,
        })
    }

    /// Index k of the interval [x_k, x_{k+1}] that holds q (clamped to the ends).
    fn interval(&self, q: f64) -> usize {
        let n = self.x.len();
        let idx = self.x.partition_point(|&xi| xi <= q);
        idx.saturating_sub(1).min(n - 2)
    }

    /// Value at q; straight-line continuation outside the data.
    pub fn eval(&self, q: f64) -> f64 {
        let n = self.x.len();
        if q < self.x[0] {
            return self.y[0] + self.tangents[0] * (q - self.x[0]);
        }
        if q > self.x[n - 1] {
            return self.y[n - 1] + self.tangents[n - 1] * (q - self.x[n - 1]);
        }
        let k = self.interval(q);
        let h = self.x[k + 1] - self.x[k];
        let t = (q - self.x[k]) / h;
        let t2 = t * t;
        let t3 = t2 * t;
        let h00 = 2.0 * t3 - 3.0 * t2 + 1.0;
        let h10 = t3 - 2.0 * t2 + t;
        let h01 = -2.0 * t3 + 3.0 * t2;
        let h11 = t3 - t2;
        h00 * self.y[k]
            + h10 * h * self.tangents[k]
            + h01 * self.y[k + 1]
            + h11 * h * self.tangents[k + 1]
    }

    /// Derivative at q; the end tangent outside the data.
    pub fn derivative(&self, q: f64) -> f64 {
        let n = self.x.len();
        if q < self.x[0] {
            return self.tangents[0];
        }
        if q > self.x[n - 1] {
            return self.tangents[n - 1];
        }
        let k = self.interval(q);
        let h = self.x[k + 1] - self.x[k];
        let t = (q - self.x[k]) / h;
        let t2 = t * t;
        let d00 = (6.0 * t2 - 6.0 * t) / h;
        let d10 = 3.0 * t2 - 4.0 * t + 1.0;
        let d01 = (-6.0 * t2 + 6.0 * t) / h;
        let d11 = 3.0 * t2 - 2.0 * t;
        d00 * self.y[k] + d10 * self.tangents[k] + d01 * self.y[k + 1] + d11 * self.tangents[k + 1]
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn interpolates_and_stays_monotone() {
        let x = [0.0, 1.0, 2.0, 3.0, 4.0];
        let y = [10.0, 9.9, 9.0, 5.0, 0.0];
        let s = MonotoneSpline::new(&x, &y).expect("spline");
        for (xi, yi) in x.iter().zip(y.iter()) {
            assert!((s.eval(*xi) - yi).abs() < 1e-12);
        }
        let mut prev = s.eval(0.0);
        for i in 1..=400 {
            let v = s.eval(4.0 * i as f64 / 400.0);
            assert!(v <= prev + 1e-12, "rises at {i}");
            assert!(s.derivative(4.0 * i as f64 / 400.0) <= 1e-12);
            prev = v;
        }
    }

    #[test]
    fn derivative_matches_finite_difference() {
        let s = MonotoneSpline::new(&[0.0, 1.0, 3.0], &[0.0, 2.0, 2.5]).expect("spline");
        for &q in &[0.3, 1.7, 2.9] {
            let h = 1e-6;
            let fd = (s.eval(q + h) - s.eval(q - h)) / (2.0 * h);
            assert!((fd - s.derivative(q)).abs() < 1e-6);
        }
    }

    #[test]
    fn rejects_unsorted_flows() {
        assert!(MonotoneSpline::new(&[0.0, 0.0], &[1.0, 2.0]).is_err());
        assert!(MonotoneSpline::new(&[0.0], &[1.0]).is_err());
    }
}
