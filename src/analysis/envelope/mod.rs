//! Duty envelopes (issue 15): every case × candidate with the pump anywhere within its
//! ISO 9906:2012 test tolerance and the inputs anywhere within their stated ranges.
//! A stage of its own: it reads the cases' scenarios, the nominal results and the fitted
//! curves, and changes none of them.
//!
//! Method: the pump's speed and impeller stay those of the nominal duty; the published
//! curve is scaled in flow and head as a whole ([`crate::pumps::tolerance::Shift`]), so
//! it passes through the corner of the grade's cross at the guarantee point (taken as
//! the case's nominal duty). Corners: each input at both ends and the pump at minus,
//! nominal and plus tolerance (exact bounds for effects monotone in each input);
//! samples: a Halton sequence (Halton 1960) over the same box. Motor load is the
//! largest shaft power along the shifted curves between the envelope's flows, not at
//! the corners only (a mixed-flow pump's power can peak inside the curve).

pub mod inputs;
pub mod pump;

use super::checks::{self, Check, Status};
use super::duty::{stages_in, CandidateCurves, PumpResult};
use super::limits::{CheckId, Source};
use super::system::CaseSystem;
use super::{CaseResult, Warning};
use crate::diagnostics::Code;
use crate::message::{self, Kind};
use crate::model::uncertainty::{Combine, InputRange, Uncertainty};
use crate::model::{Case, Design};
use crate::pumps::tolerance::{Shift, Tolerance, DEFAULT_GRADE};
use crate::pumps::ScaledPump;
use pump::Shifted;

/// The envelopes of a design.
#[derive(Clone, Debug)]
pub struct Envelopes {
    /// How the ranges were combined.
    pub combine: Combine,
    /// The input ranges as the design states them.
    pub inputs: Vec<InputRange>,
    /// Per candidate: its grade's tolerances and whether the grade was assumed.
    pub grades: Vec<(Tolerance, bool)>,
    /// Per case, in the design's order.
    pub cases: Vec<CaseEnvelope>,
    /// Per candidate: it has a duty at every point of every case's envelope and no
    /// worst-point check fails.
    pub across: Vec<bool>,
}

/// One case's envelopes.
#[derive(Clone, Debug)]
pub struct CaseEnvelope {
    /// The case's name.
    pub case: String,
    /// The system band at the flows of the nominal system curve: (flow m³/s, lowest
    /// head m, highest head m) over the input points.
    pub system_band: Vec<(f64, f64, f64)>,
    /// Per candidate (`None` without a nominal duty or when the case failed).
    pub pumps: Vec<Option<DutyEnvelope>>,
}

/// What one point of the envelope gives.
#[derive(Clone, Debug, PartialEq)]
pub struct CornerDuty {
    /// Total flow, m³/s.
    pub flow: f64,
    /// Head, m.
    pub head: f64,
    /// Flow per pump, m³/s.
    pub flow_per_pump: f64,
    /// Shaft power per pump at the duty, W.
    pub shaft_power: Option<f64>,
    /// NPSH available, m.
    pub npsh_available: f64,
    /// NPSH3 at the upper end of its tolerance, m.
    pub npsh_required: Option<f64>,
}

/// One point of the envelope (a corner or a sample).
#[derive(Clone, Debug, PartialEq)]
pub struct Corner {
    /// Its name ("pump minus, roughness high").
    pub name: String,
    /// The pump within its tolerance, −1 (minus corner) to +1 (plus corner).
    pub pump: f64,
    /// Each input at 0 (low end) to 1 (high end).
    pub inputs: Vec<f64>,
    /// The duty, or why there is none.
    pub duty: Result<CornerDuty, String>,
}

/// An extreme of the envelope: the value and the index of the corner giving it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Extreme {
    /// The value (flow m³/s, head m, NPSH ratio, power W: see the field).
    pub value: f64,
    /// Index into [`DutyEnvelope::corners`].
    pub corner: usize,
}

/// A check at the nominal point and at its worst point of the envelope.
#[derive(Clone, Debug)]
pub struct WorstCheck {
    /// The check at the nominal duty.
    pub nominal: Check,
    /// The check at the worst point.
    pub worst: Check,
    /// The name of the worst point.
    pub corner: String,
}

/// A head curve: (flow m³/s, head m) points.
pub type HeadCurve = Vec<(f64, f64)>;

/// The envelope of one case × candidate.
#[derive(Clone, Debug)]
pub struct DutyEnvelope {
    /// Every point evaluated.
    pub corners: Vec<Corner>,
    /// Lowest total flow, m³/s.
    pub flow_min: Extreme,
    /// Highest total flow, m³/s.
    pub flow_max: Extreme,
    /// Lowest head, m.
    pub head_min: Extreme,
    /// Highest head, m.
    pub head_max: Extreme,
    /// Lowest NPSH ratio (available / NPSH3 at its tolerance), dimensionless.
    pub npsh_margin_worst: Option<Extreme>,
    /// Largest shaft power per pump along the shifted curves between the envelope's
    /// flows, W, with the pump state (−1, 0, +1) and the flow per pump (m³/s) there.
    pub shaft_power_max: Option<(f64, f64, f64)>,
    /// The minus and plus head curves of the arrangement (flow m³/s, head m).
    pub pump_band: (HeadCurve, HeadCurve),
    /// NPSH margin and motor load at nominal and at their worst point.
    pub checks: Vec<WorstCheck>,
    /// The duty region where the pump band and the system band overlap, as a closed
    /// outline (flow m³/s, head m): the upper edge left to right, the lower edge back.
    pub region: Vec<(f64, f64)>,
}

/// The envelopes, or `None` when the design asks for none.
pub fn analyse(
    design: &Design,
    cases: &[CaseResult],
    candidates: &[CandidateCurves],
    motors: &[Option<super::motor::MotorSizing>],
    warnings: &mut Vec<Warning>,
) -> Option<Envelopes> {
    let u = design.uncertainty.as_ref()?;
    let grades: Vec<(Tolerance, bool)> = design
        .pumps
        .iter()
        .map(|p| {
            if p.test_grade.is_none() {
                warnings.push(Warning {
                    code: Code::NoTestGrade,
                    message: format!("pump {}: no test acceptance grade stated: the envelope takes grade {} of ISO 9906:2012 (the widest); state the grade of the purchase specification", p.name, DEFAULT_GRADE.label()).into(),
                    span: Some(p.span),
                });
            }
            let g = p.test_grade.unwrap_or(DEFAULT_GRADE);
            (g.tolerance(guarantee_power(cases, &p.name)), p.test_grade.is_none())
        })
        .collect();
    let mut out = Vec::new();
    for (case, result) in design.cases.iter().zip(cases) {
        out.push(case_envelope(
            design, u, case, result, candidates, &grades, motors,
        ));
    }
    let across = (0..design.pumps.len())
        .map(|i| {
            out.iter().all(|c| match c.pumps.get(i) {
                Some(Some(e)) => {
                    e.corners.iter().all(|k| k.duty.is_ok())
                        && e.checks.iter().all(|w| w.worst.status != Status::Fail)
                }
                _ => false,
            })
        })
        .collect();
    Some(Envelopes {
        combine: u.combine,
        inputs: u.inputs.clone(),
        grades,
        cases: out,
        across,
    })
}

/// Shaft power per pump at the guarantee point for the small-pump rule, W: the largest
/// over the cases' nominal duties.
fn guarantee_power(cases: &[CaseResult], pump: &str) -> Option<f64> {
    cases
        .iter()
        .flat_map(|c| c.pumps.iter().filter(|p| p.name == pump))
        .filter_map(|p| {
            let d = p.duty.as_ref()?;
            // The arrangement's power over its pumps (parallel × series = count).
            d.shaft_power.map(|w| w / f64::from(p.count.max(1)))
        })
        .reduce(f64::max)
}

/// The input points of the combination: (pump state, input positions).
fn points(u: &Uncertainty, unilateral: bool) -> Vec<(f64, Vec<f64>)> {
    let k = u.inputs.len();
    match u.combine {
        Combine::Corners => {
            let pumps: &[f64] = if unilateral {
                &[0.0, 1.0]
            } else {
                &[-1.0, 0.0, 1.0]
            };
            let mut v = Vec::new();
            for &p in pumps {
                for mask in 0..(1u32 << k) {
                    v.push((p, (0..k).map(|j| f64::from((mask >> j) & 1)).collect()));
                }
            }
            v
        }
        Combine::Samples(n) => (1..=u64::from(n))
            .map(|i| {
                let p = 2.0 * inputs::radical_inverse(i, inputs::PRIMES[0]) - 1.0;
                let p = if unilateral { p.abs() } else { p };
                let x = (0..k)
                    .map(|j| inputs::radical_inverse(i, inputs::PRIMES[j + 1]))
                    .collect();
                (p, x)
            })
            .collect(),
    }
}

fn corner_name(u: &Uncertainty, sample: Option<usize>, pump: f64, x: &[f64]) -> String {
    if let Some(i) = sample {
        return format!("sample {}", i + 1);
    }
    let p = if pump < 0.0 {
        "pump minus"
    } else if pump > 0.0 {
        "pump plus"
    } else {
        "pump nominal"
    };
    std::iter::once(p.to_string())
        .chain(
            u.inputs
                .iter()
                .zip(x)
                .map(|(r, &x)| inputs::end_words(r, x > 0.5)),
        )
        .collect::<Vec<_>>()
        .join(", ")
}

/// One case: its input systems once, then every candidate on them.
fn case_envelope(
    design: &Design,
    u: &Uncertainty,
    case: &Case,
    result: &CaseResult,
    candidates: &[CandidateCurves],
    grades: &[(Tolerance, bool)],
    motors: &[Option<super::motor::MotorSizing>],
) -> CaseEnvelope {
    let mut env = CaseEnvelope {
        case: case.name.clone(),
        system_band: Vec::new(),
        pumps: vec![None; design.pumps.len()],
    };
    if result.system.is_none() {
        return env;
    }
    // Input points are shared by the candidates; the pump state varies per candidate.
    let all = points(u, false);
    let mut systems: Vec<(Vec<f64>, Result<CaseSystem, String>)> = Vec::new();
    for (_, x) in &all {
        if !systems.iter().any(|(y, _)| y == x) {
            systems.push((x.clone(), inputs::system_at(&case.scenario, &u.inputs, x)));
        }
    }
    env.system_band = result
        .system_curve
        .iter()
        .map(|pt| {
            let heads = systems
                .iter()
                .filter_map(|(_, s)| s.as_ref().ok().map(|s| s.head(pt.flow)));
            let (lo, hi) = heads.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), h| {
                (a.min(h), b.max(h))
            });
            (pt.flow, lo.min(pt.head), hi.max(pt.head))
        })
        .collect();
    for (i, (p, pr)) in design.pumps.iter().zip(&result.pumps).enumerate() {
        let (t, _) = &grades[i];
        let Some(cc) = candidates.get(i) else {
            continue;
        };
        let motor = motors
            .get(i)
            .and_then(|m| m.as_ref())
            .map(|m| m.choice.rating_w);
        let ctx = Ctx {
            design,
            case,
            u,
            systems: &systems,
            tolerance: t,
            motor_w: motor,
        };
        env.pumps[i] = duty_envelope(&ctx, p, pr, cc);
    }
    env
}

struct Ctx<'a> {
    design: &'a Design,
    case: &'a Case,
    u: &'a Uncertainty,
    systems: &'a [(Vec<f64>, Result<CaseSystem, String>)],
    tolerance: &'a Tolerance,
    motor_w: Option<f64>,
}

/// The nominal pump as installed: the nominal duty's speed and impeller, on the case's
/// liquid (corrected for viscosity as the duty is: [`crate::analysis::duty::pump_in_case`]).
fn installed<'a>(
    pr: &PumpResult,
    cc: &'a CandidateCurves,
    sys: &CaseSystem,
) -> Option<ScaledPump<'a>> {
    let (base, trim) = cc.evaluated.as_ref()?;
    let speed = pr.speed_rpm / base.speed_rpm;
    let diameter = match (pr.impeller_diameter_m, base.impeller_diameter_m) {
        (Some(a), Some(b)) if b > 0.0 => a / b,
        _ => *trim,
    };
    crate::analysis::duty::pump_in_case(base, speed, diameter, sys, cc.evaluated_bep.as_ref()).ok()
}

fn duty_envelope(
    ctx: &Ctx,
    p: &crate::model::PumpCandidate,
    pr: &PumpResult,
    cc: &CandidateCurves,
) -> Option<DutyEnvelope> {
    let nominal = pr.duty.as_ref()?;
    // The pump curve on the nominal liquid (the corner with every input at its nominal
    // value; a temperature corner moves the viscosity only a little against the
    // correction's own uncertainty), else the first corner analysed.
    let nominal_sys = ctx
        .systems
        .iter()
        .find(|(x, s)| s.is_ok() && x.iter().all(|v| *v == 0.0))
        .or_else(|| ctx.systems.iter().find(|(_, s)| s.is_ok()));
    let sys = nominal_sys?.1.as_ref().ok()?;
    let scaled = installed(pr, cc, sys)?;
    // The pumps running in this case (`PUMP.running`), as the nominal duty has them.
    let (par, ser) = stages_in(p, ctx.case);
    let (par, ser) = (f64::from(par), f64::from(ser));
    let shifted = |u: f64| Shifted {
        scaled: &scaled,
        shift: Shift::at(ctx.tolerance, u),
        parallel: par,
        series: ser,
    };
    let corners = evaluate_points(ctx, &shifted);
    let extreme = |f: &dyn Fn(&CornerDuty) -> Option<f64>, max: bool| extreme(&corners, f, max);
    let flow_min = extreme(&|d| Some(d.flow), false)?;
    let flow_max = extreme(&|d| Some(d.flow), true)?;
    let head_min = extreme(&|d| Some(d.head), false)?;
    let head_max = extreme(&|d| Some(d.head), true)?;
    let npsh_margin_worst = extreme(
        &|d| {
            d.npsh_required
                .filter(|n| *n > 0.0)
                .map(|n| d.npsh_available / n)
        },
        false,
    );
    let density = ctx
        .systems
        .iter()
        .filter_map(|(_, s)| s.as_ref().ok().map(|s| s.fluid.density))
        .fold(0.0, f64::max);
    let (lo, hi) = (
        flow_min.value.min(nominal.flow) / par,
        flow_max.value.max(nominal.flow) / par,
    );
    let shaft_power_max = [-1.0, 0.0, 1.0]
        .into_iter()
        .filter_map(|s| {
            shifted(s)
                .max_power(density, lo, hi)
                .map(|(w, q)| (w, s, q))
        })
        .reduce(|a, b| if b.0 > a.0 { b } else { a });
    let band = (shifted(-1.0).curve(), shifted(1.0).curve());
    let mut env = DutyEnvelope {
        corners,
        flow_min,
        flow_max,
        head_min,
        head_max,
        npsh_margin_worst,
        shaft_power_max,
        pump_band: band,
        checks: Vec::new(),
        region: Vec::new(),
    };
    env.region = region(ctx.systems, &shifted(-1.0), &shifted(1.0), &env);
    env.checks = worst_checks(ctx, pr, nominal, &env, par * ser);
    Some(env)
}

/// Every point of the combination on its system, for the pump shifted by `shifted(u)`.
fn evaluate_points<'a>(ctx: &Ctx, shifted: &dyn Fn(f64) -> Shifted<'a>) -> Vec<Corner> {
    let sample = matches!(ctx.u.combine, Combine::Samples(_));
    // The pump's grid scan depends on its state alone: one per state (three for
    // corners), not one per point.
    let mut scans: Vec<(u64, Option<crate::pumps::PumpScan>)> = Vec::new();
    points(ctx.u, ctx.tolerance.grade.unilateral())
        .into_iter()
        .enumerate()
        .map(|(i, (pump, x))| {
            let sys = ctx.systems.iter().find(|(y, _)| *y == x).map(|(_, s)| s);
            let duty = match sys {
                Some(Ok(sys)) => {
                    let s = shifted(pump);
                    let at = match scans.iter().position(|(b, _)| *b == pump.to_bits()) {
                        Some(at) => at,
                        None => {
                            scans.push((pump.to_bits(), s.scan()));
                            scans.len() - 1
                        }
                    };
                    corner_duty(&s, sys, scans[at].1.as_ref(), ctx.tolerance)
                }
                Some(Err(e)) => Err(e.clone()),
                None => Err("no system".into()),
            };
            Corner {
                name: corner_name(ctx.u, sample.then_some(i), pump, &x),
                pump,
                inputs: x,
                duty,
            }
        })
        .collect()
}

/// The smallest (or largest, `max`) value of `f` over the points with a duty, with the
/// first point giving it.
fn extreme(
    corners: &[Corner],
    f: &dyn Fn(&CornerDuty) -> Option<f64>,
    max: bool,
) -> Option<Extreme> {
    corners
        .iter()
        .enumerate()
        .filter_map(|(i, c)| {
            c.duty.as_ref().ok().and_then(f).map(|v| Extreme {
                value: v,
                corner: i,
            })
        })
        .reduce(|a, b| {
            if (b.value > a.value) == max && b.value != a.value {
                b
            } else {
                a
            }
        })
}

/// The overlap of the pump band and the system band between the envelope's flows, on
/// 41 flows: lower edge max(system low, pump minus), upper edge min(system high, pump
/// plus), where the lower lies below the upper.
fn region(
    systems: &[(Vec<f64>, Result<CaseSystem, String>)],
    minus: &Shifted,
    plus: &Shifted,
    env: &DutyEnvelope,
) -> Vec<(f64, f64)> {
    let (a, b) = (env.flow_min.value, env.flow_max.value);
    let minus_end = minus.end_per_pump() * minus.parallel;
    let edges: Vec<(f64, f64, f64)> = (0..=40)
        .filter_map(|i| {
            let q = a + (b - a) * i as f64 / 40.0;
            let heads = systems
                .iter()
                .filter_map(|(_, s)| s.as_ref().ok().map(|s| s.head(q)));
            let (lo, hi) = heads.fold((f64::INFINITY, f64::NEG_INFINITY), |(x, y), h| {
                (x.min(h), y.max(h))
            });
            let pump_lo = if q <= minus_end {
                minus.head(q)
            } else {
                f64::NEG_INFINITY
            };
            let (low, up) = (lo.max(pump_lo), hi.min(plus.head(q)));
            (low.is_finite() && up.is_finite() && low <= up).then_some((q, low, up))
        })
        .collect();
    let mut out: Vec<(f64, f64)> = edges.iter().map(|e| (e.0, e.2)).collect();
    out.extend(edges.iter().rev().map(|e| (e.0, e.1)));
    out
}

fn corner_duty(
    s: &Shifted,
    sys: &CaseSystem,
    scan: Option<&crate::pumps::PumpScan>,
    t: &Tolerance,
) -> Result<CornerDuty, String> {
    let d = s.duty_scanned(sys, scan)?;
    Ok(CornerDuty {
        flow: d.flow,
        head: d.head,
        flow_per_pump: d.flow_per_pump,
        shaft_power: s.power_per_pump(sys.fluid.density, d.flow_per_pump),
        npsh_available: sys.npsh_available(d.flow),
        npsh_required: s.npshr(d.flow_per_pump).map(|n| t.npsh3_upper(n)),
    })
}

/// NPSH margin and motor load, nominal and at their worst point.
fn worst_checks(
    ctx: &Ctx,
    pr: &PumpResult,
    nominal: &super::duty::Duty,
    env: &DutyEnvelope,
    pumps: f64,
) -> Vec<WorstCheck> {
    let mut out = Vec::new();
    let nominal_npsh = pr
        .checks
        .iter()
        .find(|c| c.id == CheckId::NpshMargin)
        .cloned();
    if let (Some(n), Some(w)) = (nominal_npsh, env.npsh_margin_worst) {
        if let Ok(d) = &env.corners[w.corner].duty {
            let limit = checks::npsh_limits(ctx.design, ctx.case);
            out.push(WorstCheck {
                nominal: n,
                worst: checks::npsh_margin(d.npsh_available, d.npsh_required, limit),
                corner: env.corners[w.corner].name.clone(),
            });
        }
    }
    if let (Some(rating), Some((w, state, q)), Some(p0)) =
        (ctx.motor_w, env.shaft_power_max, nominal.shaft_power)
    {
        let check = |v: f64, what: message::Message| {
            let ok = v <= rating * (1.0 + 1e-9);
            Check::typed(
                CheckId::Motor,
                if ok { Status::Pass } else { Status::Fail },
                Some(v),
                Some(rating),
                {
                    let mut m = what;
                    m.append(&crate::message![
                        ": shaft power per pump ",
                        message::against(Kind::Power, v, rating),
                        if ok { " within" } else { " above" },
                        " the nameplate ",
                        message::against(Kind::Power, rating, v),
                    ]);
                    m
                },
                Source::DesignData("the motor rating and the shifted pump curves"),
            )
        };
        let state_name = if state < 0.0 {
            "minus"
        } else if state > 0.0 {
            "plus"
        } else {
            "nominal"
        };
        out.push(WorstCheck {
            nominal: check(p0 / pumps, message::Message::text("at the nominal duty")),
            worst: check(
                w,
                crate::message![
                    format!("along the {state_name} curve at "),
                    message::flow(q),
                    " per pump",
                ],
            ),
            corner: format!("pump {state_name}"),
        });
    }
    out
}

impl Envelopes {
    /// The ranking's word on candidate `pump` given whether it qualifies at nominal.
    pub fn standing(&self, pump: usize, qualifies_nominal: bool) -> &'static str {
        match (
            qualifies_nominal,
            self.across.get(pump).copied().unwrap_or(false),
        ) {
            (true, true) => "qualifies across the envelope",
            (true, false) => "qualifies at nominal only",
            (false, _) => "does not qualify at nominal",
        }
    }

    /// The method in words, for the text results and the package (ISO 9906 named).
    pub fn method_words(&self) -> String {
        let combine = match self.combine {
            Combine::Corners => "every corner (each input range at both ends, the pump at its minus, nominal and plus tolerance; exact bounds where each effect is monotone in its input)".to_string(),
            Combine::Samples(n) => format!("{n} quasi-random points of a Halton sequence over the input ranges and the pump's tolerance (the same points every run)"),
        };
        format!("Each candidate keeps the speed and impeller of its nominal duty. Its published curve is moved within the tolerance of its ISO 9906:2012 acceptance grade, a cross at the guarantee point (taken as the case's nominal duty): flow and head are scaled as a whole, H'(Q) = kH·H(Q/kQ), so that the curve passes through the cross's corner (kQ = 1 ± tQ, kH = 1 ± tH); this is conservative, as the standard accepts a curve through either end of the cross. Away from nominal the efficiency is at its minus tolerance, and NPSH3 at its plus tolerance at every point. Combination: {combine}. Motor load is the largest shaft power along the shifted curves between the lowest and highest flow of the envelope, not at the corners only.")
    }
}
