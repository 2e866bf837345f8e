//! Motor sizing over all cases of a candidate (issue 10.1).
//!
//! Rule (common practice, after NEMA MG 1 and IEC 60034-1; see
//! [`crate::pumps::select_motor`]): the nameplate rating, without the service factor,
//! covers the largest shaft power per pump along the whole published curve to its end
//! (run-out) at the maximum speed and the largest impeller the design allows, in every
//! case's fluid, so the coldest (densest) case gives the cold-start power: a
//! non-overloading motor. A stated rating is judged by the same measure. The service factor is
//! reported as margin only, and taken as 1.0 on a variable-frequency drive (makers
//! commonly void it on inverter supply; NEMA MG 1 Parts 30 and 31).

use crate::diagnostics::Code;
use uom::si::{frequency::cycle_per_minute, power::watt};

use super::checks::{Check, Status};
use super::duty::{self, CandidateCurves};
use super::limits::{self, CheckId};
use super::{CaseResult, Warning};
use crate::message::{self, Kind, Part};
use crate::model::{Adjust, Design, MotorStandardChoice, PumpCandidate};
use crate::numbers::Fixed;
use crate::pumps::{self, motor_efficiency, MotorChoice, MotorStandard};
use std::sync::Arc;

/// Points sampled along the published curve for the run-out power.
pub const RUN_OUT_POINTS: usize = 81;

/// The motor of one candidate and the findings behind it.
#[derive(Clone, Debug, PartialEq)]
pub struct MotorSizing {
    /// The rating chosen (or stated) and its standard.
    pub choice: MotorChoice,
    /// The design states the rating (`motor_rating` of the pump); otherwise selected.
    pub rating_stated: bool,
    /// The pump runs on a variable-frequency drive (`adjust = speed`).
    pub variable_speed: bool,
    /// Largest shaft power per pump at an operating point, W, and its case.
    pub max_operating_shaft_power: f64,
    /// The case of the largest operating shaft power.
    pub max_operating_case: String,
    /// Largest shaft power per pump along the curve to run-out, W, its case, and the
    /// flow per pump (m³/s), speed (rpm) and fluid density (kg/m³) where it occurs.
    pub run_out_shaft_power: f64,
    /// The case of the largest shaft power to run-out.
    pub run_out_case: String,
    /// Flow per pump there, m³/s.
    pub run_out_flow: f64,
    /// Speed there, rpm.
    pub run_out_speed_rpm: f64,
    /// Fluid density there, kg/m³.
    pub run_out_density: f64,
    /// The largest run-out power is at the end of the published curve with the power
    /// still rising there, so "non-overloading" holds over the published range only.
    pub run_out_at_data_end: bool,
    /// Full-load motor efficiency used for input power (fraction), and its source.
    pub efficiency: f64,
    /// Where the motor efficiency comes from.
    pub efficiency_source: String,
    /// Poles inferred from the rated speed, and the supply frequency assumed, Hz.
    pub poles: u32,
    /// Supply frequency assumed, Hz.
    pub supply_hz: f64,
}

impl MotorSizing {
    /// The curve to run-out loads the motor above its nameplate × service factor.
    fn beyond_service_factor(&self) -> bool {
        self.choice.runout_loading_ratio > self.choice.service_factor * (1.0 + 1e-9)
    }
}

fn standard(design: &Design) -> MotorStandard {
    match design.motor.standard {
        MotorStandardChoice::Nema => MotorStandard::Nema,
        MotorStandardChoice::Iec => MotorStandard::Iec,
    }
}

/// Where a candidate's shaft power per pump is largest along the curve to run-out.
struct RunOut {
    /// Shaft power per pump, W.
    power: f64,
    /// The case.
    case: String,
    /// Flow per pump, m³/s.
    flow: f64,
    /// Speed, rpm.
    speed_rpm: f64,
    /// Fluid density, kg/m³.
    density: f64,
    /// It is the curve's last point, with the power still rising there.
    rising_at_end: bool,
}

/// The largest shaft power per pump along the curve to its end at the limit (maximum
/// speed, largest impeller allowed) over the analysed cases.
fn run_out(
    design: &Design,
    p: &PumpCandidate,
    cc: &CandidateCurves,
    cases: &[CaseResult],
) -> Option<RunOut> {
    let (base, trim) = cc.evaluated.as_ref()?;
    let mut best: Option<RunOut> = None;
    // The scan is a function of the speed, the impeller and the liquid: a case that scans
    // the same curve as an earlier one cannot raise `best` (only a larger power does).
    let mut scanned = std::collections::HashSet::new();
    for (c, dc) in cases.iter().zip(&design.cases) {
        let Some(sys) = &c.system else { continue };
        let case_ratio = dc
            .scenario
            .pump_speed_rpm(&p.name)
            .map_or(1.0, |rpm| rpm / base.speed_rpm);
        let (speed, diameter) = match p.adjust {
            Adjust::Speed { max_ratio, .. } => (max_ratio.max(case_ratio), *trim),
            Adjust::Trim { .. } => (case_ratio, 1.0),
            Adjust::None => (case_ratio, *trim),
        };
        let fluid = &sys.fluid;
        let viscosity = match fluid.is_water() {
            true => 0,
            false => fluid.kinematic_viscosity().to_bits(),
        };
        let key = (
            speed.to_bits(),
            diameter.to_bits(),
            fluid.is_water(),
            viscosity,
            fluid.density.to_bits(),
        );
        if !scanned.insert(key) {
            continue;
        }
        let Ok(scaled) = duty::pump_in_case(base, speed, diameter, sys, cc.evaluated_bep.as_ref())
        else {
            continue;
        };
        let (_, end) = scaled.domain();
        let mut previous: Option<f64> = None;
        for i in 0..RUN_OUT_POINTS {
            let q = end * i as f64 / (RUN_OUT_POINTS - 1) as f64;
            let Some(w) = duty::arrangement_power(&scaled, sys.fluid.density, 1.0, 1.0, q) else {
                continue;
            };
            if best.as_ref().is_none_or(|b| w > b.power) {
                best = Some(RunOut {
                    power: w,
                    case: c.name.clone(),
                    flow: q,
                    speed_rpm: scaled.speed_rpm(),
                    density: sys.fluid.density,
                    rising_at_end: i == RUN_OUT_POINTS - 1 && previous.is_some_and(|p| w > p),
                });
            }
            previous = Some(w);
        }
    }
    best
}

/// Size each candidate's motor over all its cases, set the input power of every duty
/// with the motor's efficiency, and add the `motor` check to each duty.
pub fn motor_pass(
    design: &Design,
    candidates: &[CandidateCurves],
    cases: &mut [CaseResult],
    warnings: &mut Vec<Warning>,
) -> Vec<Option<MotorSizing>> {
    let mut out = Vec::new();
    for (i, (p, cc)) in design.pumps.iter().zip(candidates).enumerate() {
        let sizing = size(design, p, cc, i, cases);
        let words = sizing.as_ref().map(MotorWords::of);
        let source: Option<Arc<str>> = sizing.as_ref().map(|m| {
            if design.motor.efficiency.is_some() {
                "given in the design".into()
            } else {
                m.efficiency_source.as_str().into()
            }
        });
        for (c, dc) in cases.iter_mut().zip(&design.cases) {
            let Some(r) = c.pumps.get_mut(i) else {
                continue;
            };
            if let (Some(m), Some(source)) = (&sizing, &source) {
                duty::set_input_power(design, dc, r, Some((m.efficiency, source.clone())));
            }
            match (&sizing, &words, &r.duty) {
                (Some(m), Some(words), Some(d)) => {
                    let per_pump = d.shaft_power.unwrap_or(0.0) / r.count.max(1) as f64;
                    r.checks.push(motor_check(m, words, per_pump));
                }
                (None, _, Some(d)) if d.shaft_power.is_some() => r.checks.push(Check::typed(
                    CheckId::Motor,
                    Status::Fail,
                    None,
                    None,
                    "no standard motor rating carries the shaft power",
                    limits::MOTOR_RATING_SOURCE,
                )),
                _ => {}
            }
        }
        out.push(sizing);
    }
    warnings.extend(altitude_warning(design));
    out
}

fn size(
    design: &Design,
    p: &PumpCandidate,
    cc: &CandidateCurves,
    i: usize,
    cases: &[CaseResult],
) -> Option<MotorSizing> {
    let (max_shaft, max_case) = cases
        .iter()
        .filter_map(|c| {
            // Per pump: the shaft power of the pumps running in that case.
            let r = c.pumps.get(i)?;
            Some((
                r.duty.as_ref()?.shaft_power? / r.count.max(1) as f64,
                &c.name,
            ))
        })
        .fold((0.0, String::new()), |a, (w, n)| {
            if w > a.0 {
                (w, n.clone())
            } else {
                a
            }
        });
    if max_shaft <= 0.0 {
        return None;
    }
    let ro = run_out(design, p, cc, cases).unwrap_or(RunOut {
        power: max_shaft,
        case: max_case.clone(),
        flow: 0.0,
        speed_rpm: 0.0,
        density: 0.0,
        rising_at_end: false,
    });
    let variable_speed = matches!(p.adjust, Adjust::Speed { .. });
    let service_factor = if variable_speed {
        1.0
    } else {
        design.motor.service_factor
    };
    let std = standard(design);
    let run_out_w = ro.power.max(max_shaft);
    let choice = match p.motor_rating {
        Some(r) => {
            pumps::motor_of_rating(std, r.get::<watt>(), max_shaft, run_out_w, service_factor)
        }
        None => pumps::select_motor(std, max_shaft, run_out_w, service_factor),
    }
    .ok()?;
    let supply_hz = design
        .motor
        .supply_hz
        .unwrap_or_else(|| motor_efficiency::supply_hz(std));
    let poles = motor_efficiency::poles(p.rated_speed.get::<cycle_per_minute>(), supply_hz);
    let (efficiency, efficiency_source) = match design.motor.efficiency {
        Some(e) => (e, "given in the design".to_string()),
        None => {
            let d = motor_efficiency::default_efficiency(choice.rating_w, poles, supply_hz);
            (d.efficiency, d.source)
        }
    };
    Some(MotorSizing {
        choice,
        rating_stated: p.motor_rating.is_some(),
        variable_speed,
        max_operating_shaft_power: max_shaft,
        max_operating_case: max_case,
        run_out_shaft_power: run_out_w,
        run_out_at_data_end: ro.rising_at_end && ro.power >= max_shaft,
        run_out_case: ro.case,
        run_out_flow: ro.flow,
        run_out_speed_rpm: ro.speed_rpm,
        run_out_density: ro.density,
        efficiency,
        efficiency_source,
        poles,
        supply_hz,
    })
}

/// The motor check of one duty: fail when this duty's shaft power per pump is above
/// the nameplate, or when the curve to run-out loads the motor above its nameplate ×
/// service factor (it would trip or overheat where the pump can run: one pump of a set
/// alone, a low static head); warn when the run-out is above the nameplate but within
/// the service factor (NEMA MG 1: margin for abnormal conditions, not for continuous
/// duty); else pass (rule: common practice).
pub(crate) fn motor_check(m: &MotorSizing, words: &MotorWords, shaft_per_pump: f64) -> Check {
    let rating = m.choice.rating_w;
    let above_at_duty = shaft_per_pump > rating * (1.0 + 1e-9);
    let status = if above_at_duty || m.beyond_service_factor() {
        Status::Fail
    } else if !m.choice.non_overloading {
        Status::Warn
    } else {
        Status::Pass
    };
    let power = |si, other| message::against(Kind::Power, si, other);
    let mut msg = crate::message![
        Part::Shared(words.rating.clone()),
        power(shaft_per_pump, rating),
        format!(
            " is {} % of the nameplate ",
            Fixed(100.0 * shaft_per_pump / rating, 0)
        ),
        power(rating, shaft_per_pump),
        Part::Shared(words.largest.clone()),
    ];
    if above_at_duty {
        msg.push_str(": above the nameplate at duty, choose a larger motor");
    }
    msg.push(Part::Shared(words.run_out.clone()));
    Check::typed(
        CheckId::Motor,
        status,
        Some(shaft_per_pump / rating),
        Some(1.0),
        msg,
        limits::MOTOR_RATING_SOURCE,
    )
}

/// The words of a candidate's motor check that are the same in every case (the rating,
/// the largest duty, the run-out and the service factor), made once per candidate and
/// shared by the checks of all its cases ([`Part::Shared`]).
pub(crate) struct MotorWords {
    /// `"<rating> motor per pump: shaft power here "`.
    rating: Arc<[Part]>,
    /// `"; largest at any duty <power> (case <name>)"`.
    largest: Arc<[Part]>,
    /// The run-out finding and the service factor.
    run_out: Arc<[Part]>,
}

impl MotorWords {
    /// The shared words of `m`'s motor check.
    pub(crate) fn of(m: &MotorSizing) -> MotorWords {
        let rating = m.choice.rating_w;
        let power = |si, other| message::against(Kind::Power, si, other);
        let stated = if m.rating_stated {
            " (stated in the design)"
        } else {
            ""
        };
        let finding = if m.choice.non_overloading && m.run_out_at_data_end {
            ": non-overloading over the published curve, but the largest is at its last point with the power still rising: beyond it (filling an empty main, a burst) the motor may overload; confirm the manufacturer's maximum flow or protect the motor"
        } else if m.choice.non_overloading {
            ": non-overloading"
        } else if m.beyond_service_factor() {
            ": above the nameplate × service factor towards run-out, choose a larger motor or limit the flow"
        } else {
            ": overloads towards run-out within the service factor, protect the motor, limit the flow or choose a larger motor"
        };
        let service_factor = if m.variable_speed {
            "; on a variable-frequency drive the service factor is taken as 1.0".to_string()
        } else {
            format!(
                "; service factor {} is margin only, not used for sizing",
                Fixed(m.choice.service_factor, 2)
            )
        };
        MotorWords {
            rating: Arc::from([Part::from(format!(
                "{} motor per pump{stated}: shaft power here ",
                m.choice.rating_label
            ))]),
            largest: Arc::from([
                Part::from("; largest at any duty "),
                message::value(Kind::Power, m.max_operating_shaft_power),
                Part::from(format!(" (case {})", m.max_operating_case)),
            ]),
            run_out: Arc::from([
                Part::from(format!(
                    "; along the curve to run-out at {} rpm and the largest impeller allowed the largest is ",
                    Fixed(m.run_out_speed_rpm, 0)
                )),
                power(m.run_out_shaft_power, rating),
                Part::from(" at "),
                message::flow(m.run_out_flow),
                Part::from(format!(
                    " per pump (case {}), {} % of nameplate",
                    m.run_out_case,
                    Fixed(100.0 * m.choice.runout_loading_ratio, 0),
                )),
                Part::from(finding),
                Part::from(service_factor),
            ]),
        }
    }
}

/// Motor ratings hold to 1000 m altitude and 40 °C ambient: a warning above that.
fn altitude_warning(design: &Design) -> Option<Warning> {
    let (z, case) = design
        .cases
        .iter()
        .map(|c| (c.scenario.site.elevation.get::<uom::si::length::meter>(), c))
        .max_by(|a, b| a.0.total_cmp(&b.0))?;
    let limit = limits::MOTOR_ALTITUDE_M.value;
    (z > limit && !design.pumps.is_empty()).then(|| {
        let limit_shown = message::against(Kind::Elevation, limit, z);
        Warning {
            code: Code::MotorAltitude,
            message: crate::message![
                "site elevation ",
                message::against(Kind::Elevation, z, limit),
                " is above ",
                limit_shown.clone(),
                ": motor ratings hold up to ",
                limit_shown,
                " altitude and ",
                message::value(Kind::Temperature, limits::MOTOR_AMBIENT_K.value),
                " ambient; derate the motor as its manufacturer states"
            ],
            span: Some(case.span),
        }
    })
}
