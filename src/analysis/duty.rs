//! One case × one candidate: the pump as installed (impeller, speed, arrangement),
//! its duty point on the case's system curve, power, NPSH and energy.

use uom::si::{
    frequency::cycle_per_minute, length::meter, power::watt, ratio::ratio,
    volume_rate::cubic_meter_per_second,
};

use super::checks::{self, Check};
use super::limits::{CheckId, Source};
use super::system::{CaseSystem, NpshTerms, SegmentAtFlow, G};
use super::system_table;
use crate::diagnostics::Span;
use crate::message::{flow, head, Kind, Message, Part};
use crate::model::{Adjust, ArrangementKind, Case, Design, Metric, PumpCandidate, Side};
use crate::pumps::{self, DutyOutcome, PumpCurves, ScaledPump};
use std::sync::{Arc, LazyLock};

/// How far past the end of the published curve the duty solve searches, as a fraction
/// of it, so that a crossing just beyond the data is found and reported as a failure
/// ("no published data there") rather than as no crossing at all.
pub const SEARCH_BEYOND_CURVE: f64 = 0.10;
/// Points of each tabulated pump curve.
pub const PUMP_CURVE_POINTS: usize = 41;

/// The fitted published curves of one candidate, shared by every case.
#[derive(Clone, Debug)]
pub struct CandidateCurves {
    /// Candidate name.
    pub name: String,
    /// Where the candidate is written.
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
    /// Remarks on the fits (a rising head, few points).
    pub warnings: Vec<Message>,
    /// Where the evaluated head curve rises on the duty solve's grid, searched to
    /// [`SEARCH_BEYOND_CURVE`] past its data: the same for every case, speed and trim
    /// (see [`pumps::PumpScan`]).
    pub duty_scan: Option<pumps::PumpScan>,
    /// The same scan searched to the data end only: the capacity solve's
    /// ([`meeting_flow`]), again the same for every case, speed and trim.
    pub capacity_scan: Option<pumps::PumpScan>,
}

impl CandidateCurves {
    /// The candidate's curves fitted, with remarks on the fits.
    pub fn fit(p: &PumpCandidate) -> CandidateCurves {
        let mut warnings: Vec<Message> = Vec::new();
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
                Ok(c) => warnings.extend(
                    c.warnings
                        .iter()
                        .map(|w| format!("curve {}: {w}", i + 1).into()),
                ),
                Err(e) => warnings.push(format!("curve {} cannot be used: {e}", i + 1).into()),
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
        let scan_to = |beyond: f64| {
            evaluated.as_ref().map(|(c, _)| {
                let (_, end) = c.head.domain();
                pumps::PumpScan::new(&|q| c.head.eval(q), end * beyond)
            })
        };
        let (duty_scan, capacity_scan) = (scan_to(1.0 + SEARCH_BEYOND_CURVE), scan_to(1.0));
        CandidateCurves {
            name: p.name.clone(),
            span: p.span,
            published,
            duty_scan,
            capacity_scan,
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
    warnings: &mut Vec<Message>,
) -> Option<(PumpCurves, f64)> {
    let dia = |si| Part::Typeset(Kind::Diameter, si);
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
            warnings.extend(point.warnings().iter().map(|w| Message::text(w.clone())));
            warnings.push(Message::text(format!(
                "impeller {:.1} mm interpolated between the published diameters",
                want * 1000.0
            )));
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
                    warnings.push(Message::text(format!(
                        "interpolated impeller could not be fitted: {}",
                        e.message
                    )));
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
            warnings.push(crate::message![
                "impeller ",
                dia(want),
                " from the published ",
                dia(b.impeller_diameter_m.unwrap_or(0.0)),
                format!(" by the trim law (ratio {r:.3}): confirm with the manufacturer")
            ]);
            Some(((**b).clone(), r))
        }
        None => {
            warnings.push(crate::message![
                "impeller ",
                dia(want),
                " is larger than any published curve; the largest is used"
            ]);
            Some(((*largest).clone(), 1.0))
        }
    }
}

/// One point of a pump (or arrangement) curve as installed in a case.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PumpPoint {
    /// Flow, m³/s.
    pub flow: f64,
    /// Head, m.
    pub head: f64,
    /// Pump efficiency (fraction), where published.
    pub efficiency: Option<f64>,
    /// NPSH required, m, where published.
    pub npshr: Option<f64>,
    /// Shaft power of the whole arrangement, W.
    pub shaft_power: Option<f64>,
}

/// What limits an adjusted pump: its speed (variable-speed drive) or its impeller (trim).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum AdjustLimit {
    /// The speed of a variable-speed drive.
    Speed,
    /// The impeller diameter.
    Trim,
}

impl AdjustLimit {
    /// The keyword as written in a design (`speed`, `trim`).
    pub fn keyword(self) -> &'static str {
        match self {
            AdjustLimit::Speed => "speed",
            AdjustLimit::Trim => "trim",
        }
    }
}

/// The speed or diameter a case needs against the limit the design allows.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Headroom {
    /// What is adjusted.
    pub limit: AdjustLimit,
    /// Needed ratio to the published curve's speed or diameter; `None` when the
    /// requirement cannot be reached at any ratio.
    pub needed: Option<f64>,
    /// The largest ratio allowed: `max_speed` for speed, 1.0 (the published impeller) for trim.
    pub limit_value: f64,
}

impl Headroom {
    /// (limit − needed) / limit, negative when the limit is short of the need.
    pub fn fraction(&self) -> Option<f64> {
        self.needed
            .map(|n| (self.limit_value - n) / self.limit_value)
    }
}

/// The duty of one candidate in one case.
#[derive(Clone, Debug, PartialEq)]
pub struct Duty {
    /// Total flow of the arrangement, m³/s.
    pub flow: f64,
    /// Total head of the arrangement, m.
    pub head: f64,
    /// Flow and head of each running pump.
    pub flow_per_pump: f64,
    /// Head of each running pump, m.
    pub head_per_pump: f64,
    /// Pump efficiency at duty (fraction), where published.
    pub efficiency: Option<f64>,
    /// ρ·g·Q·H of the arrangement, W.
    pub hydraulic_power: f64,
    /// Shaft power of all running pumps, W.
    pub shaft_power: Option<f64>,
    /// Electrical input of all running pumps (motor and drive efficiency), W.
    pub input_power: Option<f64>,
    /// Motor efficiency used for the input power (fraction).
    pub motor_efficiency: f64,
    /// Drive efficiency used (1.0 without a variable-frequency drive).
    pub drive_efficiency: f64,
    /// Input energy per volume delivered, J/m³ (input power / flow).
    pub specific_energy: Option<f64>,
    /// Hydraulic power / electrical input (fraction).
    pub wire_to_water_efficiency: Option<f64>,
    /// Best-efficiency flow of one pump at the duty speed and diameter, m³/s.
    pub bep_flow: Option<f64>,
    /// Flow per pump / BEP flow (dimensionless).
    pub flow_ratio_to_bep: Option<f64>,
    /// NPSH available at the pump suction, m.
    pub npsh_available: f64,
    /// NPSH available term by term; the terms sum to `npsh_available`.
    pub npsh_terms: NpshTerms,
    /// NPSH required at duty, m, where published.
    pub npsh_required: Option<f64>,
    /// Velocity in the suction segment next to the pump, m/s.
    pub suction_velocity: Option<f64>,
    /// Velocity in the discharge segment next to the pump, m/s.
    pub discharge_velocity: Option<f64>,
    /// Each pump's own station piping at the duty (`serves = each_pump` lines), or `None`.
    pub station: Option<StationPiping>,
    /// The source well at the duty flow, or `None` for a tank.
    pub well: Option<WellAtDuty>,
    /// Always false: a duty beyond the published curve fails (kept for the JSON field).
    pub extrapolated: bool,
    /// How many times the pump and system curves cross (more than one warns).
    pub crossings: usize,
}

impl Duty {
    /// Every segment of `sys`, the system of the case this duty was solved on, at the duty
    /// flow (station piping at the flow per pump). Made when an output asks rather than
    /// kept with every duty: a design of many cases holds a duty per case × candidate,
    /// and the segments were a seventh of its memory. A well field's system has no
    /// segments (its wells' piping is in its network).
    pub fn segments(&self, sys: &CaseSystem) -> Vec<SegmentAtFlow> {
        sys.segments_at_set(self.flow, self.flow_per_pump)
    }
}

/// One pump's own station piping at a duty: the branch losses taken from its head and
/// the suction path NPSH available is computed along.
#[derive(Clone, Debug, PartialEq)]
pub struct StationPiping {
    /// Flow through each pump and its own piping, m³/s.
    pub flow_per_pump: f64,
    /// Loss of one pump's own suction branch, m.
    pub suction_head: f64,
    /// Loss of one pump's own discharge branch, m.
    pub discharge_head: f64,
    /// The suction path of NPSH available, from the source to the pump: (line name,
    /// segment index in its line, the flow it carries, m³/s).
    pub npsh_path: Vec<(String, usize, f64)>,
}

/// A source well at a duty: its drawdown s = B·Q + C·Q² in parts and its pumping level.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WellAtDuty {
    /// Static water level, m on the design's datum.
    pub static_level: f64,
    /// Aquifer loss B·Q at the duty flow, m.
    pub aquifer_loss: f64,
    /// Well loss C·Q² at the duty flow, m.
    pub well_loss: f64,
    /// Pumping level: static level − aquifer loss − well loss, m on the datum.
    pub pumping_level: f64,
}

/// The source well at total flow q (m³/s), when the source is one.
fn well_at(sys: &CaseSystem, q: f64) -> Option<WellAtDuty> {
    let w = sys.well?;
    let (aquifer_loss, well_loss) = w.parts(q);
    Some(WellAtDuty {
        static_level: sys.source_level.m(),
        aquifer_loss,
        well_loss,
        pumping_level: sys.source_level.m() - aquifer_loss - well_loss,
    })
}

/// The station piping of a set carrying `q` with `qp` per pump (m³/s), when the design
/// gives any.
fn station_piping(sys: &CaseSystem, q: f64, qp: f64) -> Option<StationPiping> {
    if !sys.has_station_piping() {
        return None;
    }
    let (suction_head, discharge_head) = sys.station_losses(qp);
    let npsh_path = sys
        .segments
        .iter()
        .filter(|s| s.side == Side::Suction)
        .map(|s| (s.line.to_string(), s.index, sys.segment_flow(s, q, qp)))
        .collect();
    Some(StationPiping {
        flow_per_pump: qp,
        suction_head,
        discharge_head,
        npsh_path,
    })
}

/// Energy of one case × candidate over a year.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct YearEnergy {
    /// Electrical input energy per year, J.
    pub energy_j: f64,
    /// Energy cost per year, currency units (when priced).
    pub cost: Option<f64>,
    /// Running hours per year: the case's hours, or the fixed volume ÷ delivered flow.
    pub hours: f64,
    /// Volume delivered per year, m³.
    pub volume_m3: f64,
}

/// One candidate in one case: its duty, checks, curve and energy.
#[derive(Clone, Debug)]
pub struct PumpResult {
    /// Candidate name.
    pub name: String,
    /// Single, parallel or series.
    pub arrangement: ArrangementKind,
    /// Running pumps.
    pub count: u32,
    /// Installed standby pumps.
    pub standby: u32,
    /// Speed in this case, rpm (the rated speed until a usable curve says otherwise).
    pub speed_rpm: f64,
    /// Impeller diameter evaluated (after trim), m, when known.
    pub impeller_diameter_m: Option<f64>,
    /// The duty point, when there is one.
    pub duty: Option<Duty>,
    /// Why there is no duty point, when there is none.
    pub failure: Option<Message>,
    /// The checks of this case × candidate.
    pub checks: Vec<Check>,
    /// The arrangement's curve as installed in this case.
    pub operating_curve: std::sync::Arc<[PumpPoint]>,
    /// Energy over a year, when the case has hours.
    pub energy: Option<YearEnergy>,
    /// Remarks on this case × candidate.
    pub warnings: Vec<Message>,
    /// Motor input efficiency used, and where it comes from.
    pub motor_efficiency: (f64, Arc<str>),
    /// Speed or diameter needed against its limit (`adjust = speed` or `trim` only).
    pub headroom: Option<Headroom>,
    /// Flow of the arrangement at the limit (maximum speed, largest impeller allowed),
    /// m³/s; `None` when the curves do not meet within the published data.
    pub capacity_flow: Option<f64>,
    /// Affinity factor N·D of this case's pump against the evaluated published curve
    /// (speed ratio × impeller diameter ratio, dimensionless); 1 when not evaluated.
    pub affinity_scale: f64,
    /// The network at the duty point (general-form designs with a duty only; boxed, as
    /// most results have none).
    pub network: Option<Box<crate::analysis::network::station::NetworkAtDuty>>,
    /// With station piping only: NPSH available per pump at each flow of the case's
    /// system curve (m, the set's flow shared by the pumps in parallel); else empty.
    pub npsh_available_curve: Vec<f64>,
    /// A well field only: the candidate at each well at its own duty (`duty` is then the
    /// field's total, see [`crate::analysis::well_field`]); else empty.
    pub wells: Vec<crate::analysis::well_field::WellDuty>,
}

impl PumpResult {
    /// Gives back the spare capacity of its growing lists (checks, warnings; a check's
    /// message is made tight by [`Check::typed`]), keeping room for the motor pass's
    /// check: an analysis of thousands of cases holds every result, and a list grown by
    /// doubling is up to half spare.
    pub fn compact(&mut self) {
        self.checks.shrink_to(self.checks.len() + 1);
        self.warnings.shrink_to_fit();
    }
}

/// Motor efficiency used before the motor is sized (the sizing pass replaces it by the
/// class value of the selected rating): 93 %, a typical premium-efficiency motor of
/// 10–50 kW at full load (common practice).
pub const DEFAULT_MOTOR_EFFICIENCY: f64 = 0.93;
/// Variable-frequency drive efficiency when the design gives none: 97 % at full load
/// (common practice).
pub const DEFAULT_DRIVE_EFFICIENCY: f64 = 0.97;

/// The largest `flow >=` requirement of a case, m³/s.
pub fn required_flow(design: &Design, case_name: &str) -> Option<f64> {
    design
        .requirements
        .iter()
        .filter(|r| {
            r.metric == Metric::Flow
                && r.at_least
                && (r.cases.is_empty() || r.cases.iter().any(|c| c == case_name))
        })
        .map(|r| r.limit_si)
        .fold(None, |a: Option<f64>, b| Some(a.map_or(b, |a| a.max(b))))
}

/// Pumps in parallel and in series of an arrangement as it runs in `case`: a parallel
/// set runs the pumps the case says (`PUMP.running = N`), else all of them.
pub fn stages_in(p: &PumpCandidate, case: &Case) -> (u32, u32) {
    match (p.arrangement, case.scenario.running(&p.name)) {
        (ArrangementKind::Parallel, Some(n)) => (n.max(1), 1),
        _ => stages(p),
    }
}

/// Pumps in parallel and in series of an arrangement.
pub fn stages(p: &PumpCandidate) -> (u32, u32) {
    match p.arrangement {
        ArrangementKind::Single => (1, 1),
        ArrangementKind::Parallel => (p.count.max(1), 1),
        ArrangementKind::Series => (1, p.count.max(1)),
    }
}

/// Drive efficiency of a candidate: the design's, or the default, on `adjust = speed`.
pub fn drive_efficiency(design: &Design, p: &PumpCandidate) -> f64 {
    if matches!(p.adjust, Adjust::Speed { .. }) {
        design
            .motor
            .drive_efficiency
            .unwrap_or(DEFAULT_DRIVE_EFFICIENCY)
    } else {
        1.0
    }
}

/// Shaft power of `parallel` × `series` pumps at total flow q (m³/s), W: ρgQH/η per
/// pump where the curve gives an efficiency, else the published shaft power.
pub fn arrangement_power(
    scaled: &ScaledPump,
    density: f64,
    parallel: f64,
    series: f64,
    q: f64,
) -> Option<f64> {
    let qp = q / parallel;
    let hp = scaled.eval_head(qp);
    let per = match scaled.eval_efficiency(qp) {
        Some(e) if e > 0.02 => Some(density * G * qp * hp / e),
        _ => scaled.eval_shaft_power(qp),
    };
    per.map(|w| w * parallel * series)
}

/// The speed and diameter ratios of a case and its headroom, adjusted to the case's
/// flow requirement for `adjust = speed` or `trim`.
fn adjust_to_requirement(
    design: &Design,
    case: &Case,
    sys: &CaseSystem,
    p: &PumpCandidate,
    base: &PumpCurves,
    ratios: (f64, f64),
    out: &mut PumpResult,
) -> (f64, f64) {
    let (n_par, n_ser) = stages_in(p, case);
    let (mut speed_ratio, mut diameter_ratio) = ratios;
    let required = required_flow(design, &case.name);
    match (p.adjust, required) {
        (
            Adjust::Speed {
                min_ratio,
                max_ratio,
            },
            Some(q),
        ) => {
            let qp = q / n_par as f64;
            let h = sys.head(q) / n_ser as f64 + sys.station_loss(qp);
            let needed = pumps::speed_for_duty(base, qp, h, 0.05, 3.0_f64.max(max_ratio))
                .ok()
                .map(|s| s.speed_ratio);
            out.headroom = Some(Headroom {
                limit: AdjustLimit::Speed,
                needed,
                limit_value: max_ratio,
            });
            match needed {
                Some(r) if r < min_ratio => speed_ratio = min_ratio,
                Some(r) if r <= max_ratio * (1.0 + 1e-12) => speed_ratio = r,
                Some(_) | None => {
                    speed_ratio = max_ratio;
                    out.warnings.push(crate::message![
                        "the flow requirement ",
                        flow(q),
                        format!(" cannot be met within the maximum speed ({:.0} % of the published speed): the pump runs at its maximum speed", 100.0 * max_ratio)
                    ]);
                }
            }
            if let Some(r) = needed.filter(|r| *r < min_ratio) {
                out.warnings.push(Message::text(format!(
                    "the flow requirement needs {:.0} % speed, below the minimum speed {:.0} %: the pump runs at its minimum speed",
                    100.0 * r,
                    100.0 * min_ratio
                )));
            }
        }
        (Adjust::Trim { min_ratio }, Some(q)) => {
            let qp = q / n_par as f64;
            let h = sys.head(q) / n_ser as f64 + sys.station_loss(qp);
            let needed = pumps::trim_for_duty(base, qp, h, 0.05).ok().map(|(d, _)| d);
            out.headroom = Some(Headroom {
                limit: AdjustLimit::Trim,
                needed,
                limit_value: 1.0,
            });
            match needed {
                Some(d) if d >= min_ratio => diameter_ratio = d,
                Some(_) => {
                    diameter_ratio = min_ratio;
                    out.warnings.push(crate::message![
                        "the flow requirement ",
                        flow(q),
                        format!(" needs a trim below the smallest allowed ({:.0} %): the impeller is trimmed to the smallest allowed", 100.0 * min_ratio)
                    ]);
                }
                None => out.warnings.push(crate::message![
                    "the flow requirement ",
                    flow(q),
                    " cannot be met even with the published impeller: it is not trimmed"
                ]),
            }
        }
        (Adjust::Speed { .. } | Adjust::Trim { .. }, None) => out.warnings.push(
            "this case states no flow requirement to adjust to: the pump runs as published".into(),
        ),
        _ => {}
    }
    (speed_ratio, diameter_ratio)
}

/// Why a solve found no duty point.
fn describe_failure(outcome: &DutyOutcome) -> Message {
    match outcome {
        DutyOutcome::ShutoffBelowStatic {
            shutoff_head,
            static_head,
        } => crate::message![
            "no duty point: the shut-off head ",
            head(*shutoff_head),
            " is below the static head ",
            head(*static_head)
        ],
        DutyOutcome::CurveEndsBeforeSystem {
            end_flow,
            pump_head,
            system_head,
        } => crate::message![
            "no duty point within the published data: at ",
            flow(*end_flow),
            " the pump still gives ",
            head(*pump_head),
            " against ",
            head(*system_head),
            " of system head; no published data there"
        ],
        DutyOutcome::NoSolution { message } => Message::text(format!("no duty point: {message}")),
        DutyOutcome::Point {
            flow: q, head: h, ..
        } => crate::message!["duty point at ", flow(*q), " and ", head(*h)],
    }
}

/// The head an arrangement offers its headers at total flow q (m³/s), m: each pump's
/// head less its own station piping's loss ([`CaseSystem::station_loss`]), × pumps in
/// series, at q / pumps in parallel per pump.
pub fn set_head(scaled: &ScaledPump, sys: &CaseSystem, parallel: f64, series: f64, q: f64) -> f64 {
    let qp = q / parallel;
    series * (scaled.eval_head(qp) - sys.station_loss(qp))
}

/// The flow of an arrangement (m³/s) where its curve meets the system curve within the
/// published data, or `None`; `scan` is the candidate's [`CandidateCurves::capacity_scan`]
/// where it holds ([`CaseSystem::scan`]), else the pump is scanned here.
pub fn meeting_flow(
    scaled: &ScaledPump,
    sys: &CaseSystem,
    (parallel, series): (f64, f64),
    scan: Option<&pumps::PumpScan>,
) -> Option<f64> {
    let (_, end) = scaled.domain();
    let head = |q: f64| set_head(scaled, sys, parallel, series, q);
    let scan = scan.filter(|_| scaled.viscous().is_none());
    system_table::solve_duty(&head, sys, end * parallel, scan)
        .point()
        .map(|(q, _)| q)
}

/// The largest flow (m³/s) a duty solve of any candidate can search in a case: the
/// published data end × pumps in parallel × the largest speed (the case's, or the
/// maximum of `adjust = speed`) × the impeller ratio (at least 1) × (1 +
/// [`SEARCH_BEYOND_CURVE`]); the range of the case's system table. 0 without a curve.
pub fn search_reach(case: &Case, design: &Design, candidates: &[CandidateCurves]) -> f64 {
    let mut reach: f64 = 0.0;
    for (p, cc) in design.pumps.iter().zip(candidates) {
        let Some((base, trim)) = &cc.evaluated else {
            continue;
        };
        let case_speed = case
            .scenario
            .pump_speed_rpm(&p.name)
            .map_or(1.0, |rpm| rpm / base.speed_rpm);
        let speed = match p.adjust {
            Adjust::Speed { max_ratio, .. } => max_ratio.max(case_speed),
            _ => case_speed,
        };
        let (n_par, _) = stages(p);
        let end = base.head.domain().1 * n_par as f64 * speed * trim.max(1.0);
        reach = reach.max(end * (1.0 + SEARCH_BEYOND_CURVE));
    }
    reach
}

/// Evaluate one candidate in one case.
pub fn evaluate(
    design: &Design,
    case: &Case,
    sys: &CaseSystem,
    p: &PumpCandidate,
    cc: &CandidateCurves,
    shared: &SharedCurves,
) -> PumpResult {
    let (n_par, n_ser) = stages_in(p, case);
    let mut out = new_result(design, p, n_par);
    let Some((base, trim)) = &cc.evaluated else {
        fail_duty(
            &mut out,
            "no usable pump curve".into(),
            None,
            None,
            Source::DesignData("the curve tables of the design"),
        );
        return out;
    };
    let case_speed = case
        .scenario
        .pump_speed_rpm(&p.name)
        .unwrap_or(base.speed_rpm);
    let (speed_ratio, diameter_ratio) = adjust_to_requirement(
        design,
        case,
        sys,
        p,
        base,
        (case_speed / base.speed_rpm, *trim),
        &mut out,
    );
    let bep = cc.evaluated_bep.as_ref();
    let scaled = match pump_in_case(base, speed_ratio, diameter_ratio, sys, bep) {
        Ok(s) => s,
        Err(e) => {
            fail_duty(
                &mut out,
                e.message.into(),
                None,
                None,
                Source::DesignData("affinity laws"),
            );
            return out;
        }
    };
    let (par, ser) = (n_par as f64, n_ser as f64);
    out.capacity_flow = capacity(p, cc, case_speed / base.speed_rpm, sys, par, ser);
    out.warnings
        .extend(scaled.warnings().iter().map(|w| Message::text(w.clone())));
    out.speed_rpm = scaled.speed_rpm();
    out.affinity_scale = scaled.flow_scale();
    out.impeller_diameter_m = scaled.impeller_diameter_m();
    let rho = sys.fluid.density;
    let head_arr = |q: f64| set_head(&scaled, sys, par, ser, q);
    let (_, q_data_end) = scaled.domain();
    let q_end = q_data_end * par;
    out.operating_curve = shared.curve(&scaled, sys, (par, ser), q_end);
    let search_end = q_end * (1.0 + SEARCH_BEYOND_CURVE);
    // The candidate's grid scan holds for affinity scalings only, not a viscous curve.
    let scan = sys.scan(cc).filter(|_| scaled.viscous().is_none());
    let outcome = system_table::solve_duty(&head_arr, sys, search_end, scan);
    let (q, h, crossings) = match &outcome {
        DutyOutcome::Point {
            flow,
            head,
            crossings,
            warnings,
            ..
        } => {
            out.warnings
                .extend(warnings.iter().map(|w| Message::text(w.clone())));
            (*flow, *head, *crossings)
        }
        other => {
            let (value, limit) = failure_values(other);
            let why = describe_failure(other);
            fail_duty(
                &mut out,
                why,
                value,
                limit,
                Source::DesignData("pump curve against system curve"),
            );
            return out;
        }
    };
    let qp = q / par;
    if qp > q_data_end * (1.0 + 1e-9) {
        let why = crate::message![
            "the pump and system curves meet at ",
            flow(qp),
            " per pump, beyond the end of the published curve at ",
            flow(q_data_end),
            ": no published data there"
        ];
        fail_duty(
            &mut out,
            why,
            Some(qp),
            Some(q_data_end),
            Source::DesignData("the published curve's flow range"),
        );
        return out;
    }
    let efficiency = scaled.eval_efficiency(qp).filter(|e| *e > 0.0);
    let shaft_power = arrangement_power(&scaled, rho, par, ser, q);
    let bep = cc.evaluated_bep.map(|b| scaled.bep_flow(b.flow));
    out.warnings.extend(viscosity_warning(sys, cc, &scaled));
    let station = station_piping(sys, q, qp);
    let branch = station
        .as_ref()
        .map_or(0.0, |s| s.suction_head + s.discharge_head);
    let duty = Duty {
        flow: q,
        head: h,
        flow_per_pump: qp,
        head_per_pump: h / ser + branch,
        efficiency,
        hydraulic_power: pumps::hydraulic_power_w(rho, q, h + ser * branch),
        shaft_power,
        input_power: None,
        motor_efficiency: out.motor_efficiency.0,
        drive_efficiency: drive_efficiency(design, p),
        specific_energy: None,
        wire_to_water_efficiency: None,
        bep_flow: bep,
        flow_ratio_to_bep: bep.filter(|b| *b > 0.0).map(|b| qp / b),
        npsh_available: sys.npsh_available_per_pump(q, qp),
        npsh_terms: sys.npsh_terms_per_pump(q, qp),
        npsh_required: scaled.eval_npshr(qp),
        suction_velocity: sys.pump_velocity_set(Side::Suction, q, qp),
        discharge_velocity: sys.pump_velocity_set(Side::Discharge, q, qp),
        station,
        well: well_at(sys, q),
        extrapolated: false,
        crossings,
    };
    let custom_fluid = match &case.scenario.fluid {
        crate::model::Fluid::Custom(f) => Some(f.name.as_str()),
        crate::model::Fluid::Glycol(g) => Some(g.glycol.name()),
        crate::model::Fluid::Water { .. } => None,
    };
    out.warnings
        .extend(sys.flow_warnings_set(q, qp, custom_fluid));
    out.checks = checks::duty_checks(design, case, &duty, p);
    out.checks.extend(checks::headroom_check(&out.headroom));
    out.duty = Some(duty);
    set_input_power(design, case, &mut out, None);
    out
}

/// A candidate's result before its duty: name, arrangement, rated speed, the motor
/// efficiency and its source; nothing solved yet.
pub(crate) fn new_result(design: &Design, p: &PumpCandidate, n_par: u32) -> PumpResult {
    // One copy of each source text for all results (an analysis may hold 100 000).
    static GIVEN: LazyLock<Arc<str>> = LazyLock::new(|| "given in the design".into());
    static ASSUMED: LazyLock<Arc<str>> =
        LazyLock::new(|| "assumed: typical premium-efficiency motor (common practice)".into());
    let motor_efficiency = match design.motor.efficiency {
        Some(e) => (e, GIVEN.clone()),
        None => (DEFAULT_MOTOR_EFFICIENCY, ASSUMED.clone()),
    };
    PumpResult {
        name: p.name.clone(),
        arrangement: p.arrangement,
        count: match p.arrangement {
            ArrangementKind::Parallel => n_par,
            _ => p.count,
        },
        standby: p.standby,
        // The rated speed until a usable curve says otherwise: an unusable curve must
        // not print "pump P at 0 rpm" (issue 11).
        speed_rpm: p.rated_speed.get::<cycle_per_minute>(),
        impeller_diameter_m: None,
        duty: None,
        failure: None,
        checks: Vec::new(),
        operating_curve: std::sync::Arc::from(Vec::new()),
        energy: None,
        warnings: Vec::new(),
        motor_efficiency,
        network: None,
        npsh_available_curve: Vec::new(),
        wells: Vec::new(),
        headroom: None,
        capacity_flow: None,
        affinity_scale: 1.0,
    }
}

/// Record why there is no duty: a failed duty-point check with its value and limit,
/// and the reason.
fn fail_duty(
    out: &mut PumpResult,
    why: Message,
    value: Option<f64>,
    limit: Option<f64>,
    source: Source,
) {
    out.checks.push(Check::typed(
        CheckId::DutyPoint,
        checks::Status::Fail,
        value,
        limit,
        why.clone(),
        source,
    ));
    out.failure = Some(why);
}

/// The value and the limit a failed duty solve reports: the shut-off head against the
/// static head, or the pump head at the curve's end against the system head there.
fn failure_values(outcome: &DutyOutcome) -> (Option<f64>, Option<f64>) {
    match outcome {
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
    }
}

/// The arrangement's operating curve at [`PUMP_CURVE_POINTS`] flows from zero to
/// `q_end` (m³/s): head, efficiency, NPSHr and shaft power.
fn operating_curve(
    scaled: &ScaledPump,
    sys: &CaseSystem,
    (par, ser): (f64, f64),
    q_end: f64,
) -> std::sync::Arc<[PumpPoint]> {
    let rho = sys.fluid.density;
    (0..PUMP_CURVE_POINTS)
        .map(|i| {
            let q = q_end * i as f64 / (PUMP_CURVE_POINTS - 1) as f64;
            PumpPoint {
                flow: q,
                head: set_head(scaled, sys, par, ser, q),
                efficiency: scaled.eval_efficiency(q / par),
                npshr: scaled.eval_npshr(q / par),
                shaft_power: arrangement_power(scaled, rho, par, ser, q),
            }
        })
        .collect()
}

/// What an operating curve ([`operating_curve`]) depends on: the published curve it is
/// scaled from (by address: one per candidate), the speed and impeller ratios, the
/// viscous correction, the liquid's density, the pumps in parallel and in series and
/// the flow range, as bits. Station piping (each pump's own losses) is not in it, so a
/// system with station piping is never shared.
#[derive(Clone, Debug, PartialEq)]
struct CurveKey {
    base: usize,
    bits: [u64; 6],
    viscous: Option<pumps::viscous::ViscousCorrection>,
}

/// Operating curves shared between cases where the candidate runs alike
/// ([`super::shared`]): an hourly design at one speed computes each candidate's once.
#[derive(Debug, Default)]
pub struct SharedCurves(super::shared::Kept<CurveKey, [PumpPoint]>);

impl SharedCurves {
    /// The operating curve of `scaled` in `sys` with (parallel, series) pumps to total
    /// flow `q_end` (m³/s): a kept one where the key matches, else computed.
    fn curve(
        &self,
        scaled: &ScaledPump,
        sys: &CaseSystem,
        stages: (f64, f64),
        q_end: f64,
    ) -> std::sync::Arc<[PumpPoint]> {
        let build = || operating_curve(scaled, sys, stages, q_end);
        if sys.has_station_piping() {
            return build();
        }
        let key = CurveKey {
            base: std::ptr::from_ref(scaled.base()) as usize,
            bits: [
                scaled.speed_ratio(),
                scaled.diameter_ratio(),
                sys.fluid.density,
                stages.0,
                stages.1,
                q_end,
            ]
            .map(f64::to_bits),
            viscous: scaled.viscous().copied(),
        };
        self.0.get_or(key, || Some(build())).unwrap_or_else(build)
    }
}

/// The arrangement's flow at the limit the design allows: the maximum speed and the
/// largest impeller (the published one before trim for `adjust = trim`).
fn capacity(
    p: &PumpCandidate,
    cc: &CandidateCurves,
    case_speed_ratio: f64,
    sys: &CaseSystem,
    par: f64,
    ser: f64,
) -> Option<f64> {
    let (base, trim) = cc.evaluated.as_ref()?;
    let (speed, diameter) = match p.adjust {
        Adjust::Speed { max_ratio, .. } => (max_ratio, *trim),
        Adjust::Trim { .. } => (case_speed_ratio, 1.0),
        Adjust::None => (case_speed_ratio, *trim),
    };
    let scaled = pump_in_case(base, speed, diameter, sys, cc.evaluated_bep.as_ref()).ok()?;
    let scan = sys.scan(cc).and(cc.capacity_scan.as_ref());
    meeting_flow(&scaled, sys, (par, ser), scan)
}

/// The volume a case fixes per year, m³: its hours × its largest `flow >=` requirement.
/// A closed loop fixes no volume: it circulates for its hours, whatever the flow (the
/// flow requirement is its design flow, a check).
pub fn fixed_volume(design: &Design, case: &Case) -> Option<f64> {
    if super::closed_loop::is_closed_loop(&case.scenario) {
        return None;
    }
    let hours = case.scenario.hours_per_year.get::<uom::si::time::hour>();
    let q = required_flow(design, &case.name)?;
    (hours > 0.0 && q > 0.0).then_some(hours * 3600.0 * q)
}

/// The ANSI/HI 9.6.7 warning of a liquid other than water, from the water BEP of the
/// candidate at this speed and impeller ([`pumps::viscosity_warning`]).
fn viscosity_warning(
    sys: &CaseSystem,
    cc: &CandidateCurves,
    scaled: &ScaledPump,
) -> Option<Message> {
    let b = cc.evaluated_bep.filter(|_| !sys.fluid.is_water())?;
    let (q_w, h_w) = (b.flow * scaled.flow_scale(), b.head * scaled.head_scale());
    let nu = sys.fluid.kinematic_viscosity();
    pumps::viscosity_warning(nu, q_w, h_w, scaled.speed_rpm()).map(Message::text)
}

/// The candidate's curve `base` at `speed` and `diameter` ratios on the case's liquid:
/// [`ScaledPump::new`], and on a liquid other than water the water curve corrected for
/// viscosity by ANSI/HI 9.6.7 ([`ScaledPump::on_liquid`], from the base curve's best-
/// efficiency point `bep`). Every stage that evaluates a candidate in a case takes its
/// curve from here, so the correction is applied once, the same way, everywhere.
pub fn pump_in_case<'a>(
    base: &'a PumpCurves,
    speed: f64,
    diameter: f64,
    sys: &CaseSystem,
    bep: Option<&pumps::Bep>,
) -> Result<ScaledPump<'a>, pumps::PumpError> {
    let scaled = ScaledPump::new(base, speed, diameter)?;
    Ok(if sys.fluid.is_water() {
        scaled
    } else {
        scaled.on_liquid(sys.fluid.kinematic_viscosity(), bep)
    })
}

/// Input power, specific energy, wire-to-water efficiency and the year's energy of a
/// result, with a motor efficiency (and its source) when the motor pass gives one.
/// Where the case fixes a volume the running hours are volume ÷ delivered flow.
pub fn set_input_power(
    design: &Design,
    case: &Case,
    out: &mut PumpResult,
    motor_efficiency: Option<(f64, Arc<str>)>,
) {
    if let Some(m) = motor_efficiency {
        out.motor_efficiency = m;
    }
    let Some(d) = out.duty.as_mut() else { return };
    d.motor_efficiency = out.motor_efficiency.0;
    d.input_power = d
        .shaft_power
        .map(|s| s / d.motor_efficiency / d.drive_efficiency);
    d.specific_energy = d.input_power.filter(|_| d.flow > 0.0).map(|w| w / d.flow);
    d.wire_to_water_efficiency = d
        .input_power
        .filter(|w| *w > 0.0)
        .map(|w| d.hydraulic_power / w);
    let case_hours = case.scenario.hours_per_year.get::<uom::si::time::hour>();
    let (hours, volume) = match fixed_volume(design, case) {
        Some(v) if d.flow > 0.0 => (v / d.flow / 3600.0, v),
        _ => (case_hours, case_hours * 3600.0 * d.flow),
    };
    out.energy = d.input_power.map(|w| {
        let e = pumps::annual_energy_j(w, hours);
        YearEnergy {
            energy_j: e,
            cost: design.energy.price_per_joule.map(|pr| pr * e),
            hours,
            volume_m3: volume,
        }
    });
}
