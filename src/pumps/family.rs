//! A family of published curves: several impeller diameters at one speed, or one
//! impeller at several speeds, and the pump at an intermediate diameter or speed.
//!
//! Method (our documented choice): for a parameter p (diameter or speed) between two
//! published members p₁ < p < p₂, each member is first carried to p by its own scaling
//! law — the constant-width trim law for diameters, the exact affinity laws for speeds
//! (see [`super::affinity`]) — which evaluates each member at the same relative flow
//! q·p₁/p and q·p₂/p. The two predictions are then blended linearly in p:
//! H(q) = (1 − w)·H₁→p(q) + w·H₂→p(q), w = (p − p₁)/(p₂ − p₁). At p = p₁ or p₂ the
//! published curve is returned unchanged, and between them the blend corrects the
//! trim law's error by the second published curve. Efficiency and shaft power are
//! blended the same way; NPSHr follows the scaling rules of [`super::ScaledPump`]
//! (for diameters: both members at the same flow).
//!
//! Outside the published range the nearest member is scaled alone (trim or affinity law)
//! and a warning says so.

use super::affinity::ScaledPump;
use super::curves::PumpCurves;
use super::{require_positive, PumpError};

/// Which parameter varies across the family.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum FamilyKind {
    /// Several impeller diameters at one speed.
    Diameter,
    /// One impeller at several speeds.
    Speed,
}

/// Published curves of one pump ordered by diameter or by speed.
#[derive(Clone, Debug, PartialEq)]
pub struct PumpFamily {
    kind: FamilyKind,
    members: Vec<PumpCurves>,
}

/// Builds a family from at least two curves that share the speed and differ in stated
/// diameter, or share the diameter (or state none) and differ in speed.
pub fn family(curves: Vec<PumpCurves>) -> Result<PumpFamily, PumpError> {
    if curves.len() < 2 {
        return Err(PumpError::new(format!(
            "a curve family needs at least 2 published curves, got {}",
            curves.len()
        )));
    }
    let same = |a: f64, b: f64| (a - b).abs() <= 1e-9 * a.abs().max(b.abs());
    let s0 = curves[0].speed_rpm;
    let d0 = curves[0].impeller_diameter_m;
    let one_speed = curves.iter().all(|c| same(c.speed_rpm, s0));
    let one_diameter = curves.iter().all(|c| match (c.impeller_diameter_m, d0) {
        (Some(a), Some(b)) => same(a, b),
        (None, None) => true,
        _ => false,
    });
    let kind = match (one_speed, one_diameter) {
        (true, false) => {
            if curves.iter().any(|c| c.impeller_diameter_m.is_none()) {
                return Err(PumpError::new(
                    "a diameter family needs the impeller diameter of every curve",
                ));
            }
            FamilyKind::Diameter
        }
        (false, true) => FamilyKind::Speed,
        (true, true) => {
            return Err(PumpError::new(
                "the curves share both speed and diameter: nothing to interpolate between",
            ))
        }
        (false, false) => {
            return Err(PumpError::new(
                "the curves differ in both speed and diameter: a family varies one of them",
            ))
        }
    };
    let mut members = curves;
    let key = |c: &PumpCurves| match kind {
        FamilyKind::Diameter => c.impeller_diameter_m.unwrap_or(0.0),
        FamilyKind::Speed => c.speed_rpm,
    };
    members.sort_by(|a, b| key(a).total_cmp(&key(b)));
    if members.windows(2).any(|w| same(key(&w[0]), key(&w[1]))) {
        return Err(PumpError::new(
            "two curves of the family have the same diameter or speed",
        ));
    }
    Ok(PumpFamily { kind, members })
}

impl PumpFamily {
    /// Which parameter varies.
    pub fn kind(&self) -> FamilyKind {
        self.kind
    }

    /// The published curves, ascending in the varying parameter.
    pub fn members(&self) -> &[PumpCurves] {
        &self.members
    }

    fn parameter(&self, c: &PumpCurves) -> f64 {
        match self.kind {
            FamilyKind::Diameter => c.impeller_diameter_m.unwrap_or(0.0),
            FamilyKind::Speed => c.speed_rpm,
        }
    }

    /// Smallest and largest published parameter (m for diameters, rpm for speeds).
    pub fn range(&self) -> (f64, f64) {
        let first = self.members.first().map_or(0.0, |c| self.parameter(c));
        let last = self.members.last().map_or(0.0, |c| self.parameter(c));
        (first, last)
    }

    fn scaled<'a>(&self, member: &'a PumpCurves, p: f64) -> ScaledPump<'a> {
        let ratio = p / self.parameter(member);
        match self.kind {
            FamilyKind::Diameter => ScaledPump::quiet(member, 1.0, ratio),
            FamilyKind::Speed => ScaledPump::quiet(member, ratio, 1.0),
        }
    }

    /// The pump at diameter (m) or speed (rpm) `p`, by the method of the module docs.
    pub fn at(&self, p: f64) -> Result<FamilyPoint<'_>, PumpError> {
        require_positive("family parameter (diameter m or speed rpm)", p)?;
        let (lo, hi) = self.range();
        let unit = match self.kind {
            FamilyKind::Diameter => "m",
            FamilyKind::Speed => "rpm",
        };
        let n = self.members.len();
        // A parameter within 1e-9 (relative) of a published end counts as on it.
        if p < lo * (1.0 - 1e-9) || p > hi * (1.0 + 1e-9) {
            let nearest = if p < lo {
                &self.members[0]
            } else {
                &self.members[n - 1]
            };
            let scaled = match self.kind {
                FamilyKind::Diameter => ScaledPump::new(nearest, 1.0, p / self.parameter(nearest))?,
                FamilyKind::Speed => ScaledPump::new(nearest, p / self.parameter(nearest), 1.0)?,
            };
            let law = match self.kind {
                FamilyKind::Diameter => "the trim law",
                FamilyKind::Speed => "the affinity laws",
            };
            let mut warnings = vec![format!(
                "{p} {unit} is outside the published range {lo} to {hi} {unit}: scaled from the \
                 nearest curve ({} {unit}) by {law}",
                self.parameter(nearest)
            )];
            warnings.extend(scaled.warnings().iter().cloned());
            return Ok(FamilyPoint {
                lower: scaled.clone(),
                upper: scaled,
                weight: 0.0,
                warnings,
            });
        }
        let upper_index = self
            .members
            .iter()
            .position(|c| self.parameter(c) >= p)
            .unwrap_or(n - 1)
            .max(1);
        let (m1, m2) = (&self.members[upper_index - 1], &self.members[upper_index]);
        let (p1, p2) = (self.parameter(m1), self.parameter(m2));
        let weight = ((p - p1) / (p2 - p1)).clamp(0.0, 1.0);
        let mut warnings = Vec::new();
        if weight > 0.0 && weight < 1.0 {
            warnings.push(format!(
                "{p} {unit} interpolated between the published curves at {p1} and {p2} {unit}"
            ));
        }
        if self.kind == FamilyKind::Diameter && weight > 0.0 && weight < 1.0 {
            warnings.push(
                "interpolated impeller diameter: efficiency blended from the published curves"
                    .to_string(),
            );
        }
        Ok(FamilyPoint {
            lower: self.scaled(m1, p),
            upper: self.scaled(m2, p),
            weight,
            warnings,
        })
    }
}

/// The pump of a family at one diameter or speed: a blend of two scaled members.
#[derive(Clone, Debug, PartialEq)]
pub struct FamilyPoint<'a> {
    lower: ScaledPump<'a>,
    upper: ScaledPump<'a>,
    weight: f64,
    warnings: Vec<String>,
}

impl FamilyPoint<'_> {
    fn blend(&self, a: f64, b: f64) -> f64 {
        if self.weight == 0.0 {
            a
        } else if self.weight == 1.0 {
            b
        } else {
            (1.0 - self.weight) * a + self.weight * b
        }
    }

    fn blend_option(&self, a: Option<f64>, b: Option<f64>) -> Option<f64> {
        Some(self.blend(a?, b?))
    }

    /// Head, m, at flow q, m³/s.
    pub fn eval_head(&self, q: f64) -> f64 {
        self.blend(self.lower.eval_head(q), self.upper.eval_head(q))
    }
    /// Efficiency (fraction) at q; `None` unless both members have efficiency data.
    pub fn eval_efficiency(&self, q: f64) -> Option<f64> {
        self.blend_option(self.lower.eval_efficiency(q), self.upper.eval_efficiency(q))
    }
    /// NPSHr, m, at q; `None` unless both members have NPSHr data.
    pub fn eval_npshr(&self, q: f64) -> Option<f64> {
        self.blend_option(self.lower.eval_npshr(q), self.upper.eval_npshr(q))
    }
    /// Shaft power, W, at q; `None` unless both members have power data.
    pub fn eval_shaft_power(&self, q: f64) -> Option<f64> {
        self.blend_option(
            self.lower.eval_shaft_power(q),
            self.upper.eval_shaft_power(q),
        )
    }
    /// Flows where both blended members are inside their data, m³/s.
    pub fn domain(&self) -> (f64, f64) {
        let (a, b) = (self.lower.domain(), self.upper.domain());
        (a.0.max(b.0), a.1.min(b.1))
    }
    /// Speed, rpm.
    pub fn speed_rpm(&self) -> f64 {
        self.lower.speed_rpm()
    }
    /// Impeller diameter, m, when the members state one.
    pub fn impeller_diameter_m(&self) -> Option<f64> {
        self.lower.impeller_diameter_m()
    }
    /// Weight of the upper member in the blend (0 at the lower, 1 at the upper curve).
    pub fn weight(&self) -> f64 {
        self.weight
    }
    /// Remarks on interpolation and extrapolation.
    pub fn warnings(&self) -> &[String] {
        &self.warnings
    }
}
