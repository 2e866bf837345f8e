//! Pump test acceptance grades of ISO 9906:2012 (Rotodynamic pumps — Hydraulic
//! performance acceptance tests — Grades 1, 2 and 3), Table 8 and the NPSH3 tolerance,
//! as **recalled from memory** (check against the standard before relying on a value).
//!
//! A grade's tolerance is a cross at the guarantee point (flow Q_G, head H_G): the
//! measured curve must pass through the cross Q_G(1 ± t_Q), H_G(1 ± t_H). The U grades
//! are one-sided (0 to +), so they have no minus side; the E grade allows no negative
//! efficiency tolerance. This module gives the factors only; how the curve is shifted
//! is the analysis' decision ([`Shift`]).

/// An acceptance grade of ISO 9906:2012.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Grade {
    /// Grade 1B (precision, bilateral).
    G1B,
    /// Grade 1E (precision, no negative efficiency tolerance; for energy-critical pumps).
    G1E,
    /// Grade 1U (precision, unilateral: 0 to +).
    G1U,
    /// Grade 2B (bilateral).
    G2B,
    /// Grade 2U (unilateral: 0 to +).
    G2U,
    /// Grade 3B (the widest; the usual grade of catalogue pumps).
    G3B,
}

/// The grade assumed where a candidate states none (the widest of the standard).
pub const DEFAULT_GRADE: Grade = Grade::G3B;

/// Shaft power at or below which the small-pump tolerances apply, W (ISO 9906:2012,
/// the clause on pumps of 10 kW and less, recalled).
pub const SMALL_PUMP_POWER_W: f64 = 10_000.0;

/// The tolerance factors of a grade, as fractions (0.05 = 5 %); minus factors are
/// magnitudes (0.05 means −5 %).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Tolerance {
    /// The grade the factors belong to.
    pub grade: Grade,
    /// Flow below the guarantee point, fraction (t_Q minus; 0 for U grades).
    pub flow_minus: f64,
    /// Flow above the guarantee point, fraction (t_Q plus).
    pub flow_plus: f64,
    /// Head below the guarantee point, fraction (t_H minus; 0 for U grades).
    pub head_minus: f64,
    /// Head above the guarantee point, fraction (t_H plus).
    pub head_plus: f64,
    /// Power above the guarantee value, fraction (t_P, reported only).
    pub power_plus: f64,
    /// Efficiency below the guarantee value, relative fraction (t_η; 0 for 1E and 1U).
    pub efficiency_minus: f64,
    /// NPSH3 above the guarantee value, relative fraction.
    pub npsh3_relative: f64,
    /// NPSH3 above the guarantee value at least, m.
    pub npsh3_minimum_m: f64,
    /// The small-pump tolerances were applied (shaft power ≤ 10 kW, grade 3B).
    pub small_pump: bool,
}

impl Grade {
    /// Every grade, in the standard's order.
    pub const ALL: [Grade; 6] = [
        Grade::G1B,
        Grade::G1E,
        Grade::G1U,
        Grade::G2B,
        Grade::G2U,
        Grade::G3B,
    ];

    /// The grade as the standard writes it (`2B`).
    pub fn label(self) -> &'static str {
        match self {
            Grade::G1B => "1B",
            Grade::G1E => "1E",
            Grade::G1U => "1U",
            Grade::G2B => "2B",
            Grade::G2U => "2U",
            Grade::G3B => "3B",
        }
    }

    /// The grade written `2B` (any case), or `None`.
    pub fn parse(text: &str) -> Option<Grade> {
        Grade::ALL
            .into_iter()
            .find(|g| g.label().eq_ignore_ascii_case(text.trim()))
    }

    /// Whether the grade is one-sided (0 to +): no minus corner.
    pub fn unilateral(self) -> bool {
        matches!(self, Grade::G1U | Grade::G2U)
    }

    /// The tolerance factors of ISO 9906:2012 Table 8 (recalled from memory), with the
    /// small-pump widening for grade 3B at a guarantee shaft power ≤ 10 kW:
    /// t_Q = ±10 %, t_H = ±8 %, t_η = −(10·(1 − P/10 kW) + 7) % (recalled), and the NPSH3
    /// tolerance: grade 1 +3 % or +0.15 m, grades 2 and 3 +6 % or +0.30 m, whichever is
    /// larger (recalled).
    pub fn tolerance(self, guarantee_shaft_power_w: Option<f64>) -> Tolerance {
        // (t_Q−, t_Q+, t_H−, t_H+, t_P+, t_η−), from memory.
        let (qm, qp, hm, hp, pp, em) = match self {
            Grade::G1B => (0.05, 0.05, 0.03, 0.03, 0.04, 0.03),
            Grade::G1E => (0.05, 0.05, 0.03, 0.03, 0.04, 0.0),
            Grade::G1U => (0.0, 0.10, 0.0, 0.06, 0.10, 0.0),
            Grade::G2B => (0.08, 0.08, 0.05, 0.05, 0.08, 0.05),
            Grade::G2U => (0.0, 0.16, 0.0, 0.10, 0.16, 0.05),
            Grade::G3B => (0.09, 0.09, 0.07, 0.07, 0.09, 0.07),
        };
        let (npsh_rel, npsh_min) = match self {
            Grade::G1B | Grade::G1E | Grade::G1U => (0.03, 0.15),
            _ => (0.06, 0.30),
        };
        let mut t = Tolerance {
            grade: self,
            flow_minus: qm,
            flow_plus: qp,
            head_minus: hm,
            head_plus: hp,
            power_plus: pp,
            efficiency_minus: em,
            npsh3_relative: npsh_rel,
            npsh3_minimum_m: npsh_min,
            small_pump: false,
        };
        let small = guarantee_shaft_power_w
            .filter(|p| p.is_finite() && *p > 0.0 && *p <= SMALL_PUMP_POWER_W);
        if let (Grade::G3B, Some(p)) = (self, small) {
            t.flow_minus = 0.10;
            t.flow_plus = 0.10;
            t.head_minus = 0.08;
            t.head_plus = 0.08;
            t.efficiency_minus = (10.0 * (1.0 - p / SMALL_PUMP_POWER_W) + 7.0) / 100.0;
            t.small_pump = true;
        }
        t
    }
}

/// How the published curve is moved for one state of the pump within its tolerance:
/// flow and head scaled as a whole, H'(Q) = k_H·H(Q/k_Q), so that the curve passes
/// through the cross's corner (Q_G·k_Q, H_G·k_H) whatever the guarantee point on it;
/// efficiency η'(Q) = k_η·η(Q/k_Q); shaft power P'(Q) = (k_Q·k_H/k_η)·P(Q/k_Q), which is
/// ρgQH'/η' where the curve gives an efficiency.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Shift {
    /// Flow factor k_Q (dimensionless).
    pub flow: f64,
    /// Head factor k_H (dimensionless).
    pub head: f64,
    /// Efficiency factor k_η (dimensionless, ≤ 1).
    pub efficiency: f64,
}

impl Shift {
    /// The published curve unchanged.
    pub const NOMINAL: Shift = Shift {
        flow: 1.0,
        head: 1.0,
        efficiency: 1.0,
    };

    /// The pump at `u` of its tolerance: u = −1 the minus corner, 0 nominal, +1 the plus
    /// corner, linear between (for quasi-random samples). Away from nominal the
    /// efficiency is at its minus tolerance scaled by |u| (conservative for power).
    pub fn at(t: &Tolerance, u: f64) -> Shift {
        let u = u.clamp(-1.0, 1.0);
        let (q, h) = if u < 0.0 {
            (t.flow_minus, t.head_minus)
        } else {
            (t.flow_plus, t.head_plus)
        };
        Shift {
            flow: 1.0 + u * q,
            head: 1.0 + u * h,
            efficiency: 1.0 - u.abs() * t.efficiency_minus,
        }
    }

    /// The power factor k_Q·k_H/k_η (dimensionless).
    pub fn power(&self) -> f64 {
        self.flow * self.head / self.efficiency
    }
}

impl Tolerance {
    /// NPSH3 at the upper end of its tolerance, m: N + max(relative·N, minimum).
    pub fn npsh3_upper(&self, npsh3_m: f64) -> f64 {
        npsh3_m + (self.npsh3_relative * npsh3_m).max(self.npsh3_minimum_m)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn unilateral_grades_have_no_minus_side() {
        for g in [Grade::G1U, Grade::G2U] {
            let t = g.tolerance(None);
            assert_eq!((t.flow_minus, t.head_minus), (0.0, 0.0));
            assert_eq!(Shift::at(&t, -1.0).flow, 1.0);
        }
        assert_eq!(Grade::G1E.tolerance(None).efficiency_minus, 0.0);
    }

    #[test]
    fn small_pump_rule_widens_grade_3b_only() {
        // ISO 9906:2012, pumps of 10 kW and less (recalled): t_η = −(10(1 − 5/10) + 7) % = −12 %.
        let t = Grade::G3B.tolerance(Some(5_000.0));
        assert!(t.small_pump && (t.efficiency_minus - 0.12).abs() < 1e-12);
        assert_eq!((t.flow_plus, t.head_plus), (0.10, 0.08));
        assert!(!Grade::G3B.tolerance(Some(10_001.0)).small_pump);
        assert!(!Grade::G2B.tolerance(Some(5_000.0)).small_pump);
    }

    #[test]
    fn npsh3_tolerance_takes_the_larger_of_relative_and_minimum() {
        let t = Grade::G2B.tolerance(None);
        // 6 % of 3 m = 0.18 m < 0.30 m minimum; 6 % of 8 m = 0.48 m.
        assert!((t.npsh3_upper(3.0) - 3.30).abs() < 1e-12);
        assert!((t.npsh3_upper(8.0) - 8.48).abs() < 1e-12);
    }
}
