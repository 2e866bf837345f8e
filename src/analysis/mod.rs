//! Analysis: every case's system curve, every case × candidate duty point,
//! the checks a reviewer asks for, power and energy, and the ranking.
//!
//! Pure functions of a [`Design`]; the outputs (report, results, diff) read an
//! [`Analysis`] and never recompute engineering values.

use crate::diagnostics::Code;
pub mod capacity;
pub mod checks;
pub mod closed_loop;
pub mod concurrent;
pub mod duty;
pub mod envelope;
pub mod limits;
pub mod motor;
pub mod network;
pub mod operation;
pub mod parallel;
pub mod safety;
pub mod selection;
pub mod shared;
pub mod stability;
pub mod system;
pub mod system_table;
pub mod well_field;

use crate::model::{ArrangementKind, Design, Side};
pub use system::{CaseSystem, FluidState, Losses, NpshTerms, SegmentAtFlow, SegmentState, G};

/// Most cases the outputs show one by one; a design with more is summarised (the
/// governing cases in full, tables over every case), and its safety screen keeps its
/// line screens only when asked for ([`safety::CaseSafety::lines`]).
pub const SUMMARY_CASES: usize = 40;

/// Number of points of each tabulated system curve.
pub const SYSTEM_CURVE_POINTS: usize = 31;

/// The whole analysis of a design.
#[derive(Clone, Debug)]
pub struct Analysis {
    /// The design's report units: the system the outputs word its messages in.
    pub report_units: crate::model::ReportUnits,
    /// One result per case, in the design's order.
    pub cases: Vec<CaseResult>,
    /// Per candidate, the fitted published curves (shared by all cases).
    pub candidates: Vec<duty::CandidateCurves>,
    /// The ranking of the candidates and the recommendation.
    pub selection: selection::Selection,
    /// Engineering warnings that belong to no single check.
    pub warnings: Vec<Warning>,
    /// The largest flow of the tabulated curves, m³/s (same for all cases, for plots).
    pub flow_max: f64,
    /// Per candidate, the motor selected over all cases (None without power data).
    pub motors: Vec<Option<crate::pumps::MotorChoice>>,
    /// Per candidate, the motor with the findings behind it (largest duty, run-out).
    pub motor_sizing: Vec<Option<motor::MotorSizing>>,
    /// Per candidate, one pump of a parallel set alone (`None` for other arrangements).
    pub one_alone: Vec<Option<parallel::OneAlone>>,
    /// Per candidate, per case: the flow at the limit (maximum speed, largest impeller), m³/s.
    pub capacity: Vec<Vec<Option<f64>>>,
    /// The requirement × case matrix.
    pub requirement_matrix: Vec<capacity::RequirementRow>,
    /// Safety screening: grade lines, ratings, surge (issue 14).
    pub safety: safety::Safety,
    /// Per candidate, the operation over the design's load profiles (empty without one).
    pub operation: Vec<operation::CandidateOperation>,
    /// Duty envelopes from test tolerances and input ranges (issue 15); `None` when the
    /// design asks for none.
    pub envelope: Option<envelope::Envelopes>,
}

/// A remark of the analysis, with the design-file line where it applies when known.
#[derive(Clone, Debug, PartialEq)]
pub struct Warning {
    /// What kind of remark.
    pub code: crate::diagnostics::Code,
    /// The remark in words and typed quantities (printed in the design's report units).
    pub message: crate::message::Message,
    /// Where in the design it applies, when known.
    pub span: Option<crate::diagnostics::Span>,
}

impl Warning {
    /// The warning as a [`crate::diagnostics::Diagnostic`], rendered like the design's own,
    /// its message worded by `render` (the outputs' report units).
    pub fn diagnostic(
        &self,
        render: impl Fn(&crate::message::Message) -> String,
    ) -> crate::diagnostics::Diagnostic {
        crate::diagnostics::Diagnostic::warning(self.code, render(&self.message), self.span)
    }
}

/// One point of a system curve.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SystemPoint {
    /// Flow, m³/s.
    pub flow: f64,
    /// System head, m: static + friction + minor.
    pub head: f64,
    /// Static head, m.
    pub static_head: f64,
    /// Wall friction, m.
    pub friction: f64,
    /// Fittings and stated losses, m.
    pub minor: f64,
    /// The network's part (entry head above its zero-flow value), m; 0 for a chain.
    pub network: f64,
    /// A source well's drawdown at the flow, m; 0 for a tank.
    pub drawdown: f64,
}

/// The analysis of one case.
#[derive(Clone, Debug)]
pub struct CaseResult {
    /// Case name.
    pub name: String,
    /// The case's overrides as written.
    pub overrides: Vec<String>,
    /// Operating hours per year, h.
    pub hours_per_year: f64,
    /// `None` when the case could not be set up (the error is in `error`); shared with
    /// the safety screen, which may make its line screens again from it
    /// ([`safety::CaseSafety::lines`]).
    pub system: Option<std::sync::Arc<CaseSystem>>,
    /// Why the case could not be set up, if it could not.
    pub error: Option<String>,
    /// The system curve, tabulated from zero flow.
    pub system_curve: Vec<SystemPoint>,
    /// NPSH available at each flow of `system_curve`, m.
    pub npsh_available_curve: Vec<f64>,
    /// One result per candidate, in the design's order.
    pub pumps: Vec<duty::PumpResult>,
}

/// Analyse a design.
pub fn analyse(design: &Design) -> Analysis {
    let mut warnings = Vec::new();
    let candidates: Vec<duty::CandidateCurves> = design
        .pumps
        .iter()
        .map(duty::CandidateCurves::fit)
        .collect();
    for c in &candidates {
        for w in &c.warnings {
            warnings.push(Warning {
                code: Code::PumpCurve,
                message: w.clone().prefixed(format!("pump {}: ", c.name)),
                span: Some(c.span),
            });
        }
    }
    let shared = shared::Shared::default();
    let solved = concurrent::map(&design.cases, |case| {
        solve_case(design, case, &candidates, &shared)
    });
    let mut cases: Vec<CaseResult> = Vec::new();
    for (case, solved) in design.cases.iter().zip(solved) {
        let (system, error, pumps) = match solved {
            Ok((s, pumps)) => (Some(std::sync::Arc::new(s)), None, pumps),
            Err(e) => {
                warnings.push(Warning {
                    code: Code::CaseFailed,
                    message: format!("case {}: {e}", case.name).into(),
                    span: Some(case.span),
                });
                (None, Some(e), Vec::new())
            }
        };
        cases.push(CaseResult {
            name: case.name.clone(),
            overrides: case.overrides.clone(),
            hours_per_year: case.scenario.hours_per_year.get::<uom::si::time::hour>(),
            system,
            error,
            system_curve: Vec::new(),
            npsh_available_curve: Vec::new(),
            pumps,
        });
    }
    let flow_max = flow_range(design, &cases);
    // A well field has no single station flow, so no system curve (`well_field`).
    if !well_field::is_field(&design.base) {
        tabulate_cases(&mut cases, flow_max);
    }
    warnings.extend(system_warnings(design, &cases));
    let mut motor_sizing = motor::motor_pass(design, &candidates, &mut cases, &mut warnings);
    well_field::motor_checks_per_well(design, &mut cases, &mut motor_sizing);
    let field = well_field::is_field(&design.base);
    warnings.extend(well_field::unused_inputs(design));
    let one_alone = if field {
        vec![None; candidates.len()]
    } else {
        parallel::one_pump_alone(design, &candidates, &motor_sizing, &mut cases)
    };
    warnings.extend(capacity::governing_warnings(design, &cases));
    let rising = stability::rising_regions(&candidates);
    warnings.extend(stability::unstable_warnings(
        design,
        &candidates,
        &rising,
        &cases,
    ));
    let mut selection = selection::rank(design, &cases);
    stability::annotate_selection(&mut selection, design, &rising);
    // A well field has no station line to screen (module doc of `well_field`).
    let safety = if field {
        safety::Safety::default()
    } else {
        safety::screen(
            design,
            &cases,
            &candidates,
            selection.recommended.as_deref(),
        )
    };
    for c in &safety.cases {
        for n in &c.notes {
            warnings.push(Warning {
                code: Code::SafetyScreen,
                message: n.clone().into(),
                span: None,
            });
        }
    }
    let (envelope, yearly) = if field {
        (None, Vec::new())
    } else {
        (
            envelope::analyse(design, &cases, &candidates, &motor_sizing, &mut warnings),
            operation::analyse(design, &cases, &candidates, &motor_sizing),
        )
    };
    if !yearly.is_empty() {
        selection::rank_by_profile(design, &mut selection, &yearly);
    }
    safety::annotate_selection(&mut selection, &safety);
    Analysis {
        report_units: design.project.units,
        safety,
        envelope,
        operation: yearly,
        capacity: capacity::capacity_table(design, &cases),
        requirement_matrix: capacity::requirement_matrix(design, &cases),
        motors: motor_sizing
            .iter()
            .map(|m| m.as_ref().map(|m| m.choice.clone()))
            .collect(),
        motor_sizing,
        one_alone,
        cases,
        candidates,
        selection,
        warnings,
        flow_max,
    }
}

/// One flow range for all tables and plots, m³/s: past the largest duty (by 25 %) and
/// the pump curves, or 1.5 times a flow requirement; without either, 3 m/s in the
/// discharge pipe next to the pump.
fn flow_range(design: &Design, cases: &[CaseResult]) -> f64 {
    let mut flow_max: f64 = 0.0;
    for c in cases {
        for p in &c.pumps {
            if let Some(d) = &p.duty {
                flow_max = flow_max.max(1.25 * d.flow);
            }
            if let Some(last) = p.operating_curve.last() {
                flow_max = flow_max.max(last.flow);
            }
        }
    }
    for r in &design.requirements {
        if r.metric == crate::model::Metric::Flow {
            flow_max = flow_max.max(1.5 * r.limit_si);
        }
    }
    if flow_max <= 0.0 {
        // No pumps and no flow requirement: up to 3 m/s in the discharge pipe next to the pump.
        flow_max = cases
            .iter()
            .filter_map(|c| c.system.as_ref())
            .filter_map(|s| {
                s.segments
                    .iter()
                    .find(|x| x.side == Side::Discharge)
                    .map(|x| 3.0 * x.area)
            })
            .fold(0.0, f64::max);
    }
    if flow_max <= 0.0 || !flow_max.is_finite() {
        flow_max = 0.1;
    }
    flow_max
}

/// Every case's system curve and NPSH available (per pump with station piping) at
/// [`SYSTEM_CURVE_POINTS`] flows from zero to `flow_max` (m³/s). Cases with the same
/// losses ([`system_table::LossKey`]: levels aside) share one evaluation of them.
fn tabulate_cases(cases: &mut [CaseResult], flow_max: f64) {
    let flows: Vec<f64> = (0..SYSTEM_CURVE_POINTS)
        .map(|i| flow_max * i as f64 / (SYSTEM_CURVE_POINTS - 1) as f64)
        .collect();
    let kept: shared::Kept<system_table::LossKey, [Losses]> = shared::Kept::default();
    for c in cases {
        let Some(s) = &c.system else { continue };
        let build = || Some(flows.iter().map(|&q| s.losses(q)).collect());
        let losses: std::sync::Arc<[Losses]> = match system_table::LossKey::of(s) {
            Some(key) => kept.get_or(key, build),
            None => build(),
        }
        .unwrap_or_default();
        let (curve, npsh): (Vec<SystemPoint>, Vec<f64>) = flows
            .iter()
            .zip(losses.iter())
            .map(|(&q, l)| {
                let point = SystemPoint {
                    flow: q,
                    head: s.static_head + l.friction + l.minor + l.network + l.drawdown,
                    static_head: s.static_head,
                    friction: l.friction,
                    minor: l.minor,
                    network: l.network,
                    drawdown: l.drawdown,
                };
                (point, s.npsh_available_after(l.suction + l.drawdown))
            })
            .unzip();
        if s.has_station_piping() {
            for p in &mut c.pumps {
                let par = match p.arrangement {
                    ArrangementKind::Parallel => p.count.max(1) as f64,
                    _ => 1.0,
                };
                p.npsh_available_curve = curve
                    .iter()
                    .map(|x| s.npsh_available_per_pump(x.flow, x.flow / par))
                    .collect();
            }
        }
        c.system_curve = curve;
        c.npsh_available_curve = npsh;
    }
}

/// One case on its own (no other case's data): its system (tabulated for the duty
/// solves), every candidate's duty, and the network at every duty; `Err` with why the
/// case could not be set up or its network failed.
fn solve_case(
    design: &Design,
    case: &crate::model::Case,
    candidates: &[duty::CandidateCurves],
    shared: &shared::Shared,
) -> Result<(CaseSystem, Vec<duty::PumpResult>), String> {
    if well_field::is_field(&case.scenario) {
        return well_field::solve_case(design, case, candidates);
    }
    if closed_loop::is_closed_loop(&case.scenario)
        && case.scenario.source.reference.on_discharge.is_some()
    {
        return Err(format!("the expansion tank {} connects on the pump discharge: the pressure at the pump suction is the reference less the pump head, which this version does not calculate; connect it at the suction", case.scenario.source.name));
    }
    let mut sys =
        CaseSystem::new_shared(&case.scenario, &shared.segments).map_err(|e| e.message)?;
    sys.tabulate_shared(duty::search_reach(case, design, candidates), &shared.tables);
    let mut pumps: Vec<duty::PumpResult> = candidates
        .iter()
        .zip(&design.pumps)
        .map(|(cc, p)| duty::evaluate(design, case, &sys, p, cc, &shared.curves))
        .collect();
    network::checks::at_duties(design, &case.name, &sys, &mut pumps)?;
    let loop_checks = closed_loop::case_checks(&case.scenario, &sys);
    for p in pumps.iter_mut().filter(|p| p.duty.is_some()) {
        p.checks.extend(loop_checks.iter().cloned());
    }
    pumps.iter_mut().for_each(duty::PumpResult::compact);
    Ok((sys, pumps))
}

/// Warnings about the piping that do not depend on a pump: missing entrance or exit losses.
fn system_warnings(design: &Design, cases: &[CaseResult]) -> Vec<Warning> {
    let mut out = Vec::new();
    let base = &design.base;
    let has = |side: Side, prefix: &str| {
        base.lines
            .iter()
            .filter(|l| l.side == side)
            .flat_map(|l| &l.segments)
            .flat_map(|s| &s.fittings)
            .any(|f| f.spec.name.starts_with(prefix))
    };
    // A closed loop's reference tank is a tee off the loop, not an entrance or an exit.
    let open = !closed_loop::is_closed_loop(base);
    if let Some(l) = base.lines.iter().find(|l| open && l.side == Side::Suction) {
        if !has(Side::Suction, "entrance") && !has(Side::Suction, "foot_valve") {
            out.push(Warning { code: Code::NoEntranceLoss, message: format!("line {}: no entrance fitting on the suction side; the entrance loss is not counted", l.name).into(), span: Some(l.span) });
        }
    }
    if let Some(l) = base
        .lines
        .iter()
        .rev()
        .find(|l| open && l.side == Side::Discharge)
    {
        if !has(Side::Discharge, "exit") {
            out.push(Warning {
                code: Code::NoExitLoss,
                message: format!(
                    "line {}: no exit fitting; the exit loss (one velocity head) is not counted",
                    l.name
                )
                .into(),
                span: Some(l.span),
            });
        }
    }
    for c in cases.iter().filter(|_| !well_field::is_field(base)) {
        if let Some(s) = &c.system {
            if s.static_head <= 0.0 && open {
                out.push(Warning {
                    code: Code::StaticHead,
                    message: crate::message![format!("case {}: the static head is ", c.name), crate::message::head(s.static_head), " (zero or negative): the fluid would flow by gravity; a pump may only be needed for the friction"],
                    span: None,
                });
            }
            let npsh0 = s.npsh_available(0.0);
            if npsh0 <= 0.0 {
                out.push(Warning {
                    code: Code::NpshNegative,
                    message: crate::message![
                        format!("case {}: NPSH available is ", c.name),
                        crate::message::head(npsh0),
                        " even at zero flow: the liquid would boil at the pump suction"
                    ],
                    span: None,
                });
            }
        }
    }
    out
}
