//! The checks a reviewer asks for, each with its value, limit, status and the
//! source of its limit.

use super::duty::Duty;
use crate::model::{Case, Design, Metric, MotorStandardChoice, PumpCandidate};
use crate::pumps::{self, MotorStandard};

#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Status {
    Pass,
    Warn,
    Fail,
}

impl Status {
    pub fn keyword(self) -> &'static str {
        match self {
            Status::Pass => "pass",
            Status::Warn => "warn",
            Status::Fail => "fail",
        }
    }
}

/// One check of one duty.
#[derive(Clone, Debug, PartialEq)]
pub struct Check {
    /// `operating-region`, `npsh-margin`, `motor`, `velocity`, `requirement`, `duty-point`.
    pub id: &'static str,
    pub status: Status,
    pub value: Option<f64>,
    pub limit: Option<f64>,
    pub message: String,
    /// Where the limit comes from.
    pub source: String,
}

impl Check {
    pub fn new(
        id: &'static str,
        status: Status,
        value: Option<f64>,
        limit: Option<f64>,
        message: String,
        source: &str,
    ) -> Check {
        Check {
            id,
            status,
            value,
            limit,
            message,
            source: source.to_string(),
        }
    }
    pub fn fail(
        id: &'static str,
        value: Option<f64>,
        limit: Option<f64>,
        message: &str,
        source: &str,
    ) -> Check {
        Check::new(id, Status::Fail, value, limit, message.to_string(), source)
    }
}

/// Preferred operating region, fraction of BEP flow: 70–120 % (ANSI/HI 9.6.3, from memory).
pub const POR: (f64, f64) = (0.70, 1.20);
/// Wider band outside which operation is a failure: 50–130 % of BEP flow (common practice
/// as a stand-in for the manufacturer's allowable operating region).
pub const AOR: (f64, f64) = (0.50, 1.30);
/// Default NPSH margin ratio NPSHa/NPSHr when the design gives none: 1.3, within the
/// 1.1–2.0 range ANSI/HI 9.6.1 gives for general water services (from memory).
pub const DEFAULT_NPSH_RATIO: f64 = 1.3;
/// Smallest NPSH excess NPSHa − NPSHr, m: about 1 m (3 ft), common practice.
pub const MIN_NPSH_EXCESS_M: f64 = 1.0;
/// Typical velocities, m/s (common practice): suction 0.6–1.5 m/s (2–5 ft/s),
/// discharge 1.5–3 m/s (5–10 ft/s).
pub const SUCTION_VELOCITY: (f64, f64) = (0.6, 1.5);
pub const DISCHARGE_VELOCITY: (f64, f64) = (1.5, 3.0);

fn applies(r: &crate::model::Requirement, case: &Case) -> bool {
    r.cases.is_empty() || r.cases.contains(&case.name)
}

/// Checks of one duty point that need nothing beyond the case.
pub fn duty_checks(design: &Design, case: &Case, d: &Duty, _p: &PumpCandidate) -> Vec<Check> {
    let mut out = Vec::new();
    let units = crate::display::Units::new(design.project.units);
    let (hd, vel) = (units.head(), units.velocity());
    // Operating region.
    out.push(match d.flow_ratio_to_bep {
        Some(r) => {
            let status = if (POR.0..=POR.1).contains(&r) {
                Status::Pass
            } else if (AOR.0..=AOR.1).contains(&r) {
                Status::Warn
            } else {
                Status::Fail
            };
            let limit = if r < 1.0 { POR.0 } else { POR.1 };
            Check::new(
                "operating-region",
                status,
                Some(r),
                Some(limit),
                format!("flow per pump is {:.0} % of BEP flow (preferred {:.0}–{:.0} %)", 100.0 * r, 100.0 * POR.0, 100.0 * POR.1),
                "ANSI/HI 9.6.3 preferred operating region 70–120 % of BEP flow (from memory); outside 50–130 % fails (common practice)",
            )
        }
        None => Check::new("operating-region", Status::Warn, None, None, "no efficiency data: the best efficiency point is unknown".into(), "pump curve data"),
    });
    // NPSH margin.
    let required_ratio = design
        .requirements
        .iter()
        .filter(|r| r.metric == Metric::NpshMargin && r.at_least && applies(r, case))
        .map(|r| r.limit_si)
        .fold(None, |a: Option<f64>, b| Some(a.map_or(b, |a| a.max(b))));
    let (ratio_limit, ratio_source) = match required_ratio {
        Some(r) => (r, "the design's requirement".to_string()),
        None => (DEFAULT_NPSH_RATIO, "default ratio 1.3 after ANSI/HI 9.6.1 guidance (from memory); 1 m excess (common practice)".to_string()),
    };
    out.push(match d.npsh_required {
        Some(nr) if nr > 0.0 => {
            let ratio = d.npsh_available / nr;
            let excess = d.npsh_available - nr;
            let status = if d.npsh_available <= nr || ratio < ratio_limit {
                Status::Fail
            } else if excess < MIN_NPSH_EXCESS_M {
                Status::Warn
            } else {
                Status::Pass
            };
            let mut msg = if d.npsh_available <= 0.0 {
                format!(
                    "NPSH available is {} (zero or negative): the liquid boils before it reaches the impeller; NPSH required {} (limit ratio {:.2})",
                    hd.fmt(d.npsh_available),
                    hd.fmt(nr),
                    ratio_limit
                )
            } else {
                format!(
                    "NPSH available {} is {:.2} times the NPSH required {} (limit {:.2}); excess {}",
                    hd.fmt(d.npsh_available),
                    ratio,
                    hd.fmt(nr),
                    ratio_limit,
                    hd.fmt(excess)
                )
            };
            if d.npsh_available <= nr {
                msg.push_str(": the pump will cavitate");
            }
            Check::new("npsh-margin", status, Some(ratio), Some(ratio_limit), msg, &ratio_source)
        }
        _ => Check::new(
            "npsh-margin",
            if d.npsh_available <= 0.0 { Status::Fail } else { Status::Warn },
            None,
            Some(ratio_limit),
            format!("NPSH available is {}; the curve gives no NPSH required at this flow: obtain it from the manufacturer", hd.fmt(d.npsh_available)),
            &ratio_source,
        ),
    });
    // Velocities.
    for (label, v, (lo, hi)) in [
        ("suction", d.suction_velocity, SUCTION_VELOCITY),
        ("discharge", d.discharge_velocity, DISCHARGE_VELOCITY),
    ] {
        let Some(v) = v else { continue };
        let (status, note) = if v > hi {
            (
                Status::Warn,
                "above the typical range: check losses, noise, erosion and surge",
            )
        } else if v < lo {
            (
                Status::Pass,
                "below the typical range (larger pipe than usual)",
            )
        } else {
            (Status::Pass, "within the typical range")
        };
        out.push(Check::new(
            "velocity",
            status,
            Some(v),
            Some(hi),
            format!(
                "{label} velocity at the pump {}, {note} ({}–{})",
                vel.fmt(v),
                vel.num(lo),
                vel.fmt(hi)
            ),
            "typical velocities, common practice",
        ));
    }
    // The design's own requirements.
    for r in design.requirements.iter().filter(|r| applies(r, case)) {
        let value = match r.metric {
            Metric::Flow => Some(d.flow),
            Metric::Head => Some(d.head),
            Metric::NpshMargin => d
                .npsh_required
                .filter(|n| *n > 0.0)
                .map(|n| d.npsh_available / n),
            Metric::NpshExcess => d.npsh_required.map(|n| d.npsh_available - n),
            Metric::Efficiency => d.efficiency,
            Metric::SuctionVelocity => d.suction_velocity,
            Metric::DischargeVelocity => d.discharge_velocity,
            Metric::ShaftPower => d.shaft_power,
        };
        let check = match value {
            Some(v) => {
                // A solved duty meets its target to the solver's tolerance (1e-9 relative).
                let tol = 1e-7 * r.limit_si.abs();
                let ok = if r.at_least {
                    v >= r.limit_si - tol
                } else {
                    v <= r.limit_si + tol
                };
                Check::new(
                    "requirement",
                    if ok { Status::Pass } else { Status::Fail },
                    Some(v),
                    Some(r.limit_si),
                    format!("`{}`: {}", r.text, if ok { "met" } else { "not met" }),
                    "the design's requirement",
                )
            }
            None => Check::new(
                "requirement",
                Status::Fail,
                None,
                Some(r.limit_si),
                format!("`{}`: no value to compare (missing curve data)", r.text),
                "the design's requirement",
            ),
        };
        out.push(check);
    }
    out
}

/// The motor check of a candidate over all its cases: the smallest standard rating that
/// carries the largest operating shaft power within its service factor, and whether it is
/// non-overloading to the end of the curve (run-out).
pub fn motor_check(
    design: &Design,
    max_shaft_per_pump: f64,
    runout_per_pump: f64,
) -> (Check, Option<pumps::MotorChoice>) {
    let std = match design.motor.standard {
        MotorStandardChoice::Nema => MotorStandard::Nema,
        MotorStandardChoice::Iec => MotorStandard::Iec,
    };
    let series = match std {
        MotorStandard::Nema => "NEMA MG 1 standard horsepower ratings",
        MotorStandard::Iec => "IEC 60072-1 standard output ratings",
    };
    match pumps::select_motor(
        std,
        max_shaft_per_pump,
        runout_per_pump,
        design.motor.service_factor,
    ) {
        Ok(m) => {
            let status = if m.non_overloading && m.within_nameplate {
                Status::Pass
            } else {
                Status::Warn
            };
            let mut msg = format!(
                "{} motor per pump (service factor {:.2}): largest operating shaft power {:.2} kW is {:.0} % of rating; run-out {:.2} kW is {:.0} %",
                m.rating_label,
                m.service_factor,
                max_shaft_per_pump / 1000.0,
                100.0 * m.loading_ratio,
                runout_per_pump / 1000.0,
                100.0 * m.runout_loading_ratio
            );
            msg.push_str(if m.non_overloading {
                "; non-overloading to run-out"
            } else {
                "; OVERLOADS at run-out: size up or limit the flow"
            });
            (
                Check::new(
                    "motor",
                    status,
                    Some(m.loading_ratio),
                    Some(m.service_factor),
                    msg,
                    series,
                ),
                Some(m),
            )
        }
        Err(e) => (
            Check::new(
                "motor",
                Status::Fail,
                Some(max_shaft_per_pump),
                None,
                e.message,
                series,
            ),
            None,
        ),
    }
}
