//! One case × one candidate: the pump as installed (impeller, speed, arrangement),
//! its duty point on the case's system curve, power, NPSH and energy.

use uom::si::{
    frequency::cycle_per_minute, length::meter, power::watt, ratio::ratio,
    volume_rate::cubic_meter_per_second,
};

use super::checks::{self, Check};
use super::system::{CaseSystem, G};
use crate::diagnostics::Span;
use crate::model::{Adjust, ArrangementKind, Case, Design, Metric, PumpCandidate, Side};
use crate::pumps::{self, DutyOutcome, PumpCurves, ScaledPump};

/// Flow range allowed past the end of the published curve, as a fraction of it.
/// Points beyond the data are flagged as extrapolated.
pub const EXTRAPOLATION_ALLOWANCE: f64 = 0.10;
/// Points of each tabulated pump curve.
pub const PUMP_CURVE_POINTS: usize = 41;

/// The fitted published curves of one candidate, shared by every case.
#[derive(Clone, Debug)]
pub struct CandidateCurves {
    pub name: String,
    pub span: Span,
    /// One per published curve, in file order; `Err` holds why a table could not be fitted.
    pub published: Vec<Result<PumpCurves, String>>,
    /// The curve evaluated (the chosen impeller at the curves' speed), and its trim ratio
    /// relative to that curve.
    pub evaluated: Option<(PumpCurves, f64)>,
    /// Best efficiency point of the evaluated curve (before trim and speed), found once.
    pub evaluated_bep: Option<pumps::Bep>,
    /// Each usable published curve's head fit sampled over its data range (flow m³/s,
    /// head m), at its published speed, for plots of the whole impeller family.
    pub published_head_samples: Vec<Vec<(f64, f64)>>,
    pub warnings: Vec<String>,
}

impl CandidateCurves {
    pub fn fit(p: &PumpCandidate) -> CandidateCurves {
        let mut warnings = Vec::new();
        let published: Vec<Result<PumpCurves, String>> = p
            .curves
            .iter()
            .map(|c| {
                let t = pumps::CurveTable {
                    speed_rpm: c.speed.get::<cycle_per_minute>(),
                    impeller_diameter_m: c.impeller.map(|d| d.get::<meter>()),
                    flow: c
                        .flow
                        .iter()
                        .map(|q| q.get::<cubic_meter_per_second>())
                        .collect(),
                    head: c.head.iter().map(|h| h.get::<meter>()).collect(),
                    efficiency: c
                        .efficiency
                        .iter()
                        .map(|e| e.map(|e| e.get::<ratio>()))
                        .collect(),
                    npshr: c
                        .npshr
                        .iter()
                        .map(|e| e.map(|e| e.get::<meter>()))
                        .collect(),
                    shaft_power: c
                        .shaft_power
                        .iter()
                        .map(|e| e.map(|e| e.get::<watt>()))
                        .collect(),
                };
                pumps::fit_table(&t).map_err(|e| e.message)
            })
            .collect();
        for (i, r) in published.iter().enumerate() {
            match r {
                Ok(c) => {
                    warnings.extend(c.warnings.iter().map(|w| format!("curve {}: {w}", i + 1)))
                }
                Err(e) => warnings.push(format!("curve {} cannot be used: {e}", i + 1)),
            }
        }
        let good: Vec<&PumpCurves> = published.iter().filter_map(|r| r.as_ref().ok()).collect();
        let evaluated = choose(p, &good, &mut warnings);
        let evaluated_bep = evaluated
            .as_ref()
            .and_then(|(c, _)| pumps::best_efficiency_point(c));
        let published_head_samples = good
            .iter()
            .map(|c| {
                let (a, b) = c.head.domain();
                (0..PUMP_CURVE_POINTS)
                    .map(|i| {
                        let q = a + (b - a) * i as f64 / (PUMP_CURVE_POINTS - 1) as f64;
                        (q, c.head.eval(q))
                    })
                    .collect()
            })
            .collect();
        CandidateCurves {
            name: p.name.clone(),
            span: p.span,
            published,
            evaluated,
            evaluated_bep,
            published_head_samples,
            warnings,
        }
    }
}

/// The curve to evaluate: the requested impeller (published, interpolated in the
/// family, or trimmed from the nearest larger one), else the largest published.
fn choose(
    p: &PumpCandidate,
    good: &[&PumpCurves],
    warnings: &mut Vec<String>,
) -> Option<(PumpCurves, f64)> {
    let largest = good.iter().max_by(|a, b| {
        a.impeller_diameter_m
            .unwrap_or(0.0)
            .total_cmp(&b.impeller_diameter_m.unwrap_or(0.0))
    })?;
    let Some(want) = p.impeller.map(|d| d.get::<meter>()) else {
        return Some(((*largest).clone(), 1.0));
    };
    let with_d: Vec<&&PumpCurves> = good
        .iter()
        .filter(|c| c.impeller_diameter_m.is_some())
        .collect();
    if let Some(exact) = with_d
        .iter()
        .find(|c| (c.impeller_diameter_m.unwrap_or(0.0) - want).abs() < 1e-6)
    {
        return Some(((**exact).clone(), 1.0));
    }
    if with_d.len() >= 2 {
        let fam = pumps::family(with_d.iter().map(|c| (***c).clone()).collect()).ok()?;
        let (lo, hi) = fam.range();
        if want >= lo && want <= hi {
            let point = fam.at(want).ok()?;
            warnings.extend(point.warnings().iter().cloned());
            warnings.push(format!(
                "impeller {:.1} mm interpolated between the published diameters",
                want * 1000.0
            ));
            let (a, b) = point.domain();
            let n = 25;
            let flow: Vec<f64> = (0..n)
                .map(|i| a + (b - a) * i as f64 / (n - 1) as f64)
                .collect();
            let t = pumps::CurveTable {
                speed_rpm: point.speed_rpm(),
                impeller_diameter_m: Some(want),
                head: flow.iter().map(|&q| point.eval_head(q)).collect(),
                efficiency: flow.iter().map(|&q| point.eval_efficiency(q)).collect(),
                npshr: flow.iter().map(|&q| point.eval_npshr(q)).collect(),
                shaft_power: flow.iter().map(|&q| point.eval_shaft_power(q)).collect(),
                flow,
            };
            return match pumps::fit_table(&t) {
                Ok(c) => Some((c, 1.0)),
                Err(e) => {
                    warnings.push(format!(
                        "interpolated impeller could not be fitted: {}",
                        e.message
                    ));
                    None
                }
            };
        }
    }
    // Trim the smallest published impeller larger than the one wanted.
    let base = with_d
        .iter()
        .filter(|c| c.impeller_diameter_m.unwrap_or(0.0) > want)
        .min_by(|a, b| {
            a.impeller_diameter_m
                .unwrap_or(0.0)
                .total_cmp(&b.impeller_diameter_m.unwrap_or(0.0))
        });
    match base {
        Some(b) => {
            let r = want / b.impeller_diameter_m.unwrap_or(want);
            warnings.push(format!("impeller {:.1} mm from the published {:.1} mm by the trim law (ratio {:.3}): confirm with the manufacturer", want * 1000.0, b.impeller_diameter_m.unwrap_or(0.0) * 1000.0, r));
            Some(((**b).clone(), r))
        }
        None => {
            warnings.push(format!(
                "impeller {:.1} mm is larger than any published curve; the largest is used",
                want * 1000.0
            ));
            Some(((*largest).clone(), 1.0))
        }
    }
}

/// One point of a pump (or arrangement) curve as installed in a case.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PumpPoint {
    pub flow: f64,
    pub head: f64,
    pub efficiency: Option<f64>,
    pub npshr: Option<f64>,
    /// Shaft power of the whole arrangement, W.
    pub shaft_power: Option<f64>,
}

/// The duty of one candidate in one case.
#[derive(Clone, Debug, PartialEq)]
pub struct Duty {
    /// Total flow of the arrangement, m³/s.
    pub flow: f64,
    pub head: f64,
    /// Flow and head of each running pump.
    pub flow_per_pump: f64,
    pub head_per_pump: f64,
    pub efficiency: Option<f64>,
    pub hydraulic_power: f64,
    /// Shaft power of all running pumps, W.
    pub shaft_power: Option<f64>,
    /// Electrical input of all running pumps (motor and drive efficiency), W.
    pub input_power: Option<f64>,
    pub bep_flow: Option<f64>,
    pub flow_ratio_to_bep: Option<f64>,
    pub npsh_available: f64,
    pub npsh_required: Option<f64>,
    pub suction_velocity: Option<f64>,
    pub discharge_velocity: Option<f64>,
    pub extrapolated: bool,
    pub crossings: usize,
}

/// Energy of one case × candidate over a year.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct YearEnergy {
    pub energy_j: f64,
    pub cost: Option<f64>,
}

#[derive(Clone, Debug)]
pub struct PumpResult {
    pub name: String,
    pub arrangement: ArrangementKind,
    pub count: u32,
    pub standby: u32,
    pub speed_rpm: f64,
    pub impeller_diameter_m: Option<f64>,
    pub duty: Option<Duty>,
    /// Why there is no duty point, when there is none.
    pub failure: Option<String>,
    pub checks: Vec<Check>,
    pub operating_curve: Vec<PumpPoint>,
    pub energy: Option<YearEnergy>,
    pub warnings: Vec<String>,
    /// Motor input efficiency used, and where it comes from.
    pub motor_efficiency: (f64, &'static str),
}

/// Default motor efficiency when the design gives none: 93 %, a typical premium-efficiency
/// (IE3 / NEMA Premium) motor of 10–50 kW at full load (common practice).
pub const DEFAULT_MOTOR_EFFICIENCY: f64 = 0.93;

/// Evaluate one candidate in one case.
pub fn evaluate(
    design: &Design,
    case: &Case,
    sys: &CaseSystem,
    p: &PumpCandidate,
    cc: &CandidateCurves,
) -> PumpResult {
    let (n_par, n_ser) = match p.arrangement {
        ArrangementKind::Single => (1u32, 1u32),
        ArrangementKind::Parallel => (p.count, 1),
        ArrangementKind::Series => (1, p.count),
    };
    let motor_efficiency = match design.motor.efficiency {
        Some(e) => (e, "given in the design"),
        None => (
            DEFAULT_MOTOR_EFFICIENCY,
            "assumed: typical premium-efficiency motor (common practice)",
        ),
    };
    let mut out = PumpResult {
        name: p.name.clone(),
        arrangement: p.arrangement,
        count: p.count,
        standby: p.standby,
        // The rated speed until a usable curve says otherwise: an unusable curve must
        // not print "pump P at 0 rpm" (issue 11).
        speed_rpm: p.rated_speed.get::<cycle_per_minute>(),
        impeller_diameter_m: None,
        duty: None,
        failure: None,
        checks: Vec::new(),
        operating_curve: Vec::new(),
        energy: None,
        warnings: Vec::new(),
        motor_efficiency,
    };
    let Some((base, trim)) = &cc.evaluated else {
        let why = "no usable pump curve".to_string();
        out.checks.push(Check::fail(
            "duty-point",
            None,
            None,
            &why,
            "the curve tables of the design",
        ));
        out.failure = Some(why);
        return out;
    };
    let case_speed = case
        .scenario
        .pump_speeds
        .iter()
        .find(|(n, _)| *n == p.name)
        .map(|(_, s)| s.get::<cycle_per_minute>())
        .unwrap_or(base.speed_rpm);
    let mut speed_ratio = case_speed / base.speed_rpm;
    let mut diameter_ratio = *trim;
    let required_flow = design
        .requirements
        .iter()
        .filter(|r| {
            r.metric == Metric::Flow
                && r.at_least
                && (r.cases.is_empty() || r.cases.contains(&case.name))
        })
        .map(|r| r.limit_si)
        .fold(None, |a: Option<f64>, b| Some(a.map_or(b, |a| a.max(b))));
    match (p.adjust, required_flow) {
        (
            Adjust::Speed {
                min_ratio,
                max_ratio,
            },
            Some(q),
        ) => {
            let h = sys.head(q) / n_ser as f64;
            match pumps::speed_for_duty(base, q / n_par as f64, h, min_ratio, max_ratio) {
                Ok(s) => {
                    speed_ratio = s.speed_ratio;
                    out.warnings.extend(s.warnings);
                }
                Err(e) => out
                    .warnings
                    .push(format!("speed not adjusted: {}", e.message)),
            }
        }
        (Adjust::Trim { min_ratio }, Some(q)) => {
            let h = sys.head(q) / n_ser as f64;
            match pumps::trim_for_duty(base, q / n_par as f64, h, min_ratio) {
                Ok((r, w)) => {
                    diameter_ratio = r;
                    out.warnings.extend(w);
                }
                Err(e) => out
                    .warnings
                    .push(format!("impeller not trimmed: {}", e.message)),
            }
        }
        (Adjust::Speed { .. } | Adjust::Trim { .. }, None) => out.warnings.push(
            "`adjust` needs a `flow >=` requirement for this case; the pump runs as published"
                .into(),
        ),
        _ => {}
    }
    let scaled = match ScaledPump::new(base, speed_ratio, diameter_ratio) {
        Ok(s) => s,
        Err(e) => {
            out.checks.push(Check::fail(
                "duty-point",
                None,
                None,
                &e.message,
                "affinity laws",
            ));
            out.failure = Some(e.message);
            return out;
        }
    };
    out.warnings.extend(scaled.warnings().iter().cloned());
    out.speed_rpm = scaled.speed_rpm();
    out.impeller_diameter_m = scaled.impeller_diameter_m();
    let rho = sys.fluid.density;
    let par = n_par as f64;
    let ser = n_ser as f64;
    let head_arr = |q: f64| ser * scaled.eval_head(q / par);
    let power_arr = |q: f64| -> Option<f64> {
        let qp = q / par;
        let hp = scaled.eval_head(qp);
        let per = match scaled.eval_efficiency(qp) {
            Some(e) if e > 0.02 => Some(rho * G * qp * hp / e),
            _ => scaled.eval_shaft_power(qp),
        };
        per.map(|w| w * par * ser)
    };
    let (_, q_data_end) = scaled.domain();
    let q_end = q_data_end * par;
    out.operating_curve = (0..PUMP_CURVE_POINTS)
        .map(|i| {
            let q = q_end * i as f64 / (PUMP_CURVE_POINTS - 1) as f64;
            PumpPoint {
                flow: q,
                head: head_arr(q),
                efficiency: scaled.eval_efficiency(q / par),
                npshr: scaled.eval_npshr(q / par),
                shaft_power: power_arr(q),
            }
        })
        .collect();
    let outcome = pumps::solve_duty(
        &head_arr,
        &|q| sys.head(q),
        q_end * (1.0 + EXTRAPOLATION_ALLOWANCE),
    );
    let (q, h, crossings) = match &outcome {
        DutyOutcome::Point {
            flow,
            head,
            crossings,
            warnings,
            ..
        } => {
            out.warnings.extend(warnings.iter().cloned());
            (*flow, *head, *crossings)
        }
        other => {
            let why = other.describe();
            let (value, limit) = match other {
                DutyOutcome::ShutoffBelowStatic {
                    shutoff_head,
                    static_head,
                } => (Some(*shutoff_head), Some(*static_head)),
                DutyOutcome::CurveEndsBeforeSystem {
                    pump_head,
                    system_head,
                    ..
                } => (Some(*pump_head), Some(*system_head)),
                _ => (None, None),
            };
            out.checks.push(Check::fail(
                "duty-point",
                value,
                limit,
                &why,
                "pump curve against system curve",
            ));
            out.failure = Some(why);
            return out;
        }
    };
    let qp = q / par;
    let extrapolated = qp > q_data_end * (1.0 + 1e-9);
    if extrapolated {
        out.warnings.push(format!(
            "the duty flow per pump lies {:.1} % beyond the end of the published curve: extrapolated",
            100.0 * (qp / q_data_end - 1.0)
        ));
    }
    let efficiency = scaled.eval_efficiency(qp).filter(|e| *e > 0.0);
    let hydraulic_power = pumps::hydraulic_power_w(rho, q, h);
    let shaft_power = power_arr(q);
    let drive = if matches!(p.adjust, Adjust::Speed { .. }) {
        design.motor.drive_efficiency.unwrap_or(1.0)
    } else {
        1.0
    };
    let input_power = shaft_power.map(|s| s / motor_efficiency.0 / drive);
    let bep = cc.evaluated_bep.map(|b| b.flow * scaled.flow_scale());
    if let (crate::model::Fluid::Custom(_), Some(b)) = (&case.scenario.fluid, bep) {
        let nu = sys.fluid.viscosity / sys.fluid.density;
        let w = pumps::viscosity_warning(nu, b, scaled.eval_head(b), scaled.speed_rpm());
        out.warnings.extend(w);
    }
    let duty = Duty {
        flow: q,
        head: h,
        flow_per_pump: qp,
        head_per_pump: h / ser,
        efficiency,
        hydraulic_power,
        shaft_power,
        input_power,
        bep_flow: bep,
        flow_ratio_to_bep: bep.filter(|b| *b > 0.0).map(|b| qp / b),
        npsh_available: sys.npsh_available(q),
        npsh_required: scaled.eval_npshr(qp),
        suction_velocity: sys.pump_velocity(Side::Suction, q),
        discharge_velocity: sys.pump_velocity(Side::Discharge, q),
        extrapolated,
        crossings,
    };
    out.energy = input_power.map(|w| {
        let e =
            pumps::annual_energy_j(w, case.scenario.hours_per_year.get::<uom::si::time::hour>());
        YearEnergy {
            energy_j: e,
            cost: design.energy.price_per_joule.map(|pr| pr * e),
        }
    });
    let custom_fluid = match &case.scenario.fluid {
        crate::model::Fluid::Custom(f) => Some(f.name.as_str()),
        crate::model::Fluid::Water { .. } => None,
    };
    out.warnings.extend(sys.flow_warnings(q, custom_fluid));
    out.checks = checks::duty_checks(design, case, &duty, p);
    out.duty = Some(duty);
    out
}
