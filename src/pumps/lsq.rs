//! Linear least squares by Householder QR, and the scaled polynomial it fits.
//!
//! Method: Householder reflections reduce the design matrix to upper-triangular form
//! without forming the normal equations, so the condition number enters once, not
//! squared (Golub and Van Loan, *Matrix Computations*, 4th ed., 2013, §5.2 and §5.3).
//! The polynomial basis is built in the scaled variable t = (q − c)/h, which maps the
//! data interval onto [−1, 1]; this keeps the Vandermonde columns of similar size
//! (the same reason `numpy.polyfit` scales its columns).

use super::PumpError;

/// Solves min ‖A·x − y‖₂ for a tall matrix `a` (rows of length `m`) of full column rank.
///
/// Errors when the matrix is not tall enough, has rows of unequal length, or is
/// numerically rank deficient (a diagonal entry of R below 1e-12 of the largest).
pub fn least_squares(a: &[Vec<f64>], y: &[f64]) -> Result<Vec<f64>, PumpError> {
    let n = a.len();
    let m = a.first().map_or(0, Vec::len);
    if m == 0 || n < m || y.len() != n || a.iter().any(|row| row.len() != m) {
        return Err(PumpError::new(format!(
            "least squares needs at least as many rows as unknowns and consistent sizes \
             (rows {n}, unknowns {m}, right-hand sides {})",
            y.len()
        )));
    }
    // Columns of the matrix, reduced in place to R (upper triangle) by reflections.
    let mut cols: Vec<Vec<f64>> = (0..m)
        .map(|j| a.iter().map(|row| row[j]).collect())
        .collect();
    let mut rhs = y.to_vec();
    // Applies the reflection H = I − 2·v·vᵀ/(vᵀv), v acting on entries k.., to one column.
    let reflect = |v: &[f64], v_norm2: f64, col: &mut [f64]| {
        let tail = &mut col[n - v.len()..];
        let s: f64 = v.iter().zip(tail.iter()).map(|(vi, ci)| vi * ci).sum();
        let factor = 2.0 * s / v_norm2;
        for (ci, vi) in tail.iter_mut().zip(v) {
            *ci -= factor * vi;
        }
    };
    for k in 0..m {
        let norm = cols[k][k..].iter().map(|x| x * x).sum::<f64>().sqrt();
        if norm == 0.0 {
            continue;
        }
        let alpha = if cols[k][k] > 0.0 { -norm } else { norm };
        let mut v: Vec<f64> = cols[k][k..].to_vec();
        v[0] -= alpha;
        let v_norm2: f64 = v.iter().map(|x| x * x).sum();
        if v_norm2 == 0.0 {
            continue;
        }
        for col in cols.iter_mut().skip(k) {
            reflect(&v, v_norm2, col);
        }
        reflect(&v, v_norm2, &mut rhs);
    }
    let largest = (0..m).map(|k| cols[k][k].abs()).fold(0.0_f64, f64::max);
    if !(largest.is_finite() && largest > 0.0) {
        return Err(PumpError::new(
            "least squares: the design matrix is zero or not finite",
        ));
    }
    let mut x = vec![0.0; m];
    for k in (0..m).rev() {
        let diagonal = cols[k][k];
        if diagonal.abs() <= 1e-12 * largest {
            return Err(PumpError::new(
                "least squares: the design matrix is rank deficient (too few distinct flows \
                 for the polynomial degree)",
            ));
        }
        let s: f64 = ((k + 1)..m).map(|j| cols[j][k] * x[j]).sum();
        x[k] = (rhs[k] - s) / diagonal;
    }
    Ok(x)
}

/// A polynomial p(q) = Σ b_k·t^k in the scaled variable t = (q − centre)/half_width.
#[derive(Clone, Debug, PartialEq)]
pub struct ScaledPolynomial {
    /// Centre c of the data interval (m³/s for flow curves).
    pub centre: f64,
    /// Half width h of the data interval; always > 0.
    pub half_width: f64,
    /// Coefficients b_0..b_d in ascending powers of t.
    pub coefficients: Vec<f64>,
}

impl ScaledPolynomial {
    /// Least-squares fit of the given degree to (x, y), x spanning a non-empty interval.
    pub fn fit(x: &[f64], y: &[f64], degree: usize) -> Result<Self, PumpError> {
        let lo = x.iter().copied().fold(f64::INFINITY, f64::min);
        let hi = x.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        if !(lo.is_finite() && hi.is_finite() && hi > lo) {
            return Err(PumpError::new(
                "a polynomial fit needs flows spanning an interval of non-zero width",
            ));
        }
        let centre = 0.5 * (lo + hi);
        let half_width = 0.5 * (hi - lo);
        let rows: Vec<Vec<f64>> = x
            .iter()
            .map(|&xi| {
                let t = (xi - centre) / half_width;
                let mut row = Vec::with_capacity(degree + 1);
                let mut power = 1.0;
                for _ in 0..=degree {
                    row.push(power);
                    power *= t;
                }
                row
            })
            .collect();
        let coefficients = least_squares(&rows, y)?;
        Ok(Self {
            centre,
            half_width,
            coefficients,
        })
    }

    /// Degree of the polynomial (number of coefficients minus one).
    pub fn degree(&self) -> usize {
        self.coefficients.len().saturating_sub(1)
    }

    /// Value at q (Horner's rule in t).
    pub fn eval(&self, q: f64) -> f64 {
        let t = (q - self.centre) / self.half_width;
        self.coefficients
            .iter()
            .rev()
            .fold(0.0, |acc, &b| acc * t + b)
    }

    /// First derivative dp/dq at q.
    pub fn derivative(&self, q: f64) -> f64 {
        let t = (q - self.centre) / self.half_width;
        let mut acc = 0.0;
        for (k, &b) in self.coefficients.iter().enumerate().skip(1).rev() {
            acc = acc * t + k as f64 * b;
        }
        acc / self.half_width
    }

    /// Second derivative d²p/dq² at q.
    pub fn second_derivative(&self, q: f64) -> f64 {
        let t = (q - self.centre) / self.half_width;
        let mut acc = 0.0;
        for (k, &b) in self.coefficients.iter().enumerate().skip(2).rev() {
            acc = acc * t + (k * (k - 1)) as f64 * b;
        }
        acc / (self.half_width * self.half_width)
    }

    /// Coefficients a_0..a_d of the same polynomial in ascending powers of q itself
    /// (p(q) = Σ a_j·q^j), for comparison with other tools such as `numpy.polyfit`
    /// (which lists them in descending order).
    pub fn monomial_coefficients(&self) -> Vec<f64> {
        let d = self.degree();
        let mut a = vec![0.0; d + 1];
        // ((q − c)/h)^k = h^−k · Σ_j C(k, j) q^j (−c)^(k−j)
        for (k, &b) in self.coefficients.iter().enumerate() {
            let scale = b / self.half_width.powi(k as i32);
            let mut binom = 1.0;
            for (j, slot) in a.iter_mut().enumerate().take(k + 1) {
                if j > 0 {
                    binom = binom * (k + 1 - j) as f64 / j as f64;
                }
                *slot += scale * binom * (-self.centre).powi((k - j) as i32);
            }
        }
        a
    }

    /// Largest and smallest of dp/dq on [lo, hi].
    ///
    /// Exact for degree ≤ 3 (p′ is at most quadratic, so its extremes lie at the ends
    /// or where p″ = 0); for higher degrees p′ is sampled at 1001 points, which is
    /// stated as approximate.
    pub fn derivative_range(&self, lo: f64, hi: f64) -> (f64, f64) {
        let mut candidates = vec![lo, hi];
        if self.degree() <= 3 {
            if self.degree() == 3 {
                // p″(t) = 2 b2 + 6 b3 t = 0
                let b2 = self.coefficients[2];
                let b3 = self.coefficients[3];
                if b3 != 0.0 {
                    let q = self.centre + self.half_width * (-b2 / (3.0 * b3));
                    if q > lo && q < hi {
                        candidates.push(q);
                    }
                }
            }
        } else {
            candidates.extend((0..=1000).map(|i| lo + (hi - lo) * i as f64 / 1000.0));
        }
        candidates
            .iter()
            .fold((f64::INFINITY, f64::NEG_INFINITY), |(mn, mx), &q| {
                let d = self.derivative(q);
                (mn.min(d), mx.max(d))
            })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_quadratic_is_recovered() {
        let x = [0.0, 0.01, 0.02, 0.03, 0.04];
        let y: Vec<f64> = x
            .iter()
            .map(|q| 40.0 - 100.0 * q - 9000.0 * q * q)
            .collect();
        let p = ScaledPolynomial::fit(&x, &y, 2).expect("fit");
        let a = p.monomial_coefficients();
        assert!((a[0] - 40.0).abs() < 1e-10);
        assert!((a[1] + 100.0).abs() < 1e-8);
        assert!((a[2] + 9000.0).abs() < 1e-6);
        assert!((p.derivative(0.02) - (-100.0 - 2.0 * 9000.0 * 0.02)).abs() < 1e-8);
        assert!((p.second_derivative(0.02) + 18000.0).abs() < 1e-6);
    }

    #[test]
    fn rank_deficiency_is_an_error() {
        let rows = vec![vec![1.0, 2.0], vec![2.0, 4.0], vec![3.0, 6.0]];
        assert!(least_squares(&rows, &[1.0, 2.0, 3.0]).is_err());
    }

    #[test]
    fn overdetermined_line_matches_hand_solution() {
        // Points (0,1), (1,3), (2,4): normal equations give slope 1.5, intercept 7/6.
        let rows = vec![vec![1.0, 0.0], vec![1.0, 1.0], vec![1.0, 2.0]];
        let x = least_squares(&rows, &[1.0, 3.0, 4.0]).expect("solve");
        assert!((x[0] - 7.0 / 6.0).abs() < 1e-14);
        assert!((x[1] - 1.5).abs() < 1e-14);
    }
}
