//! A well field per case × candidate (issue 12): the candidate, as arranged, installed
//! at every running well pump of the design, the field solved as one network
//! ([`network::field`]), each well's duty checked by the same rules as a station's duty
//! ([`checks::pump_checks`]), and the field's total (flow and power summed) standing
//! for the candidate in the motor pass, the requirements and the ranking.
//!
//! Each well's source is its **pumping level**, static level less the drawdown
//! s = B·Q + C·Q² at that well's own flow (Jacob 1947), so NPSH available and head follow
//! the flow; NPSH available per pump is p_b/ρg + p_s/ρg + (pumping level − z_pump)
//! − p_v/ρg − suction losses (ANSI/HI 9.6.1), term by term in [`NpshTerms`], compared
//! with NPSH required by the design's margin rule (ANSI/HI 9.6.1 ratio, 1.3 unless the
//! design requires another, [`checks::npsh_limits`]).
//!
//! The field's total in `PumpResult::duty`: flow Q = ΣQᵢ, hydraulic and shaft power
//! summed, head the flow-weighted mean ΣQᵢHᵢ/ΣQᵢ (so ρgQH is the summed hydraulic
//! power), efficiency the field's ΣρgQᵢHᵢ / ΣPᵢ; the per-pump fields (flow and head per
//! pump, NPSH, BEP ratio, velocities) are those of the **governing well**, the one with
//! the least NPSH excess (NPSH available − NPSH required; the least NPSH available when
//! the curve gives no NPSH required). `count` is the pumps running over the field, so
//! the motor pass's per-pump power is the field's mean; the motor check is then
//! restated per well ([`motor_checks_per_well`]) with that well's own shaft power.
//!
//! Not applied in a well field (stated in grammar/LANGUAGE.md): `adjust = speed`/`trim`
//! to a requirement (the case's speed and the evaluated impeller are used), station
//! piping lines, the system curve (there is no single station flow), one pump of a
//! parallel set alone, the safety screen, the yearly operation and the duty envelopes.

use std::sync::Arc;

use uom::si::{length::meter, volume_rate::cubic_meter_per_second};

use super::checks::{self, Check, Status};
use super::duty::{self, CandidateCurves, Duty, PumpResult};
use super::limits::{CheckId, Source};
use super::network::{self, field::FieldSolution, HeadCurve, Network, NodeKind};
use super::system::{
    resolve_segment, segment_losses_in, CaseSystem, FluidState, NpshTerms, WellDrawdown, G,
};
use crate::message::{flow, Message};
use crate::model::network::NetworkLayout;
use crate::model::{Case, Design, PumpCandidate, Scenario, Side, Tank};
use crate::pumps::{PumpCurves, ScaledPump};

/// True when the scenario is a well field (its network has well pumps).
pub fn is_field(s: &Scenario) -> bool {
    s.network.as_ref().is_some_and(|n| !n.wells.is_empty())
}

/// One well of the field at the candidate's duty there.
#[derive(Clone, Debug)]
pub struct WellDuty {
    /// The well pump's name.
    pub name: String,
    /// The well (tank) it draws from.
    pub well: String,
    /// Static water level, m on the design's datum.
    pub static_level: f64,
    /// Drawdown at the well's flow, m.
    pub drawdown: f64,
    /// Pumping level: static level − drawdown, m.
    pub pumping_level: f64,
    /// The pump's setting (suction datum), m.
    pub pump_elevation: f64,
    /// The duty of the candidate's set in this well (flow and head of the set, NPSH
    /// available term by term, power, efficiency).
    pub duty: Duty,
    /// True when the pump's check valve holds it at zero flow (it cannot lift against
    /// the collector).
    pub closed: bool,
}

/// A candidate's head curve at its speed and impeller for the network solve: the
/// affinity laws on the evaluated published curve, H(q) = (N·D)²·H₀(q/(N·D)).
#[derive(Debug)]
struct CandidateHead {
    curves: PumpCurves,
    speed_ratio: f64,
    diameter_ratio: f64,
    max_flow: f64,
}

impl CandidateHead {
    /// N·D, the flow factor of the affinity laws ([`ScaledPump::flow_scale`]).
    fn flow_scale(&self) -> f64 {
        self.speed_ratio * self.diameter_ratio
    }
}

impl HeadCurve for CandidateHead {
    /// H(q) = (N·D)²·H₀(q/(N·D)), as [`ScaledPump::eval_head`].
    fn head(&self, q: f64) -> f64 {
        let k = self.flow_scale();
        k * k * self.curves.head.eval(q / k)
    }
    /// dH/dq = (N·D)·H₀′(q/(N·D)), as [`ScaledPump::head_derivative`].
    fn slope(&self, q: f64) -> f64 {
        let k = self.flow_scale();
        k * self.curves.head.derivative(q / k)
    }
    fn max_flow(&self) -> f64 {
        self.max_flow
    }
}

/// A tank of the case by name: the scenario's source or destination, or a tank of the
/// network (case overrides reach each of them there).
fn tank<'a>(s: &'a Scenario, layout: &'a NetworkLayout, name: &str) -> Option<&'a Tank> {
    [&s.source, &s.destination]
        .into_iter()
        .chain(&layout.tanks)
        .find(|t| t.name == name)
}

/// The case's collector: junctions and deliveries, the tanks no well pump draws from,
/// and the links between them.
fn collector(
    s: &Scenario,
    layout: &NetworkLayout,
    fluid: &FluidState,
    barometric: f64,
) -> Result<Network, String> {
    let mut nodes = network::station::junction_nodes(layout);
    let is_well = |name: &str| layout.wells.iter().any(|w| w.well == name);
    for t in std::iter::once(&s.destination).chain(&layout.tanks) {
        let reached = layout
            .links
            .iter()
            .any(|l| l.from == t.name || l.to == t.name)
            || layout.wells.iter().any(|w| w.to == t.name);
        if reached && !is_well(&t.name) && !nodes.iter().any(|n| n.name == t.name) {
            nodes.push(network::station::tank_node(t, barometric));
        }
    }
    let at = |name: &str| nodes.iter().position(|n| n.name == name);
    let mut links = Vec::with_capacity(layout.links.len());
    for l in &layout.links {
        let (Some(from), Some(to)) = (at(&l.from), at(&l.to)) else {
            return Err(format!("link `{}` names an unknown node", l.name));
        };
        links.push(network::Link {
            name: l.name.clone(),
            from,
            to,
            element: network::station::element(s, &l.name, &l.kind, fluid)
                .map_err(|e| e.message)?,
            check: l.check,
        });
    }
    Ok(Network {
        fluid: fluid.clone(),
        nodes,
        links,
    })
}

/// The wells of the case's running well pumps, in the network's form.
fn field_wells(
    s: &Scenario,
    layout: &NetworkLayout,
    net: &Network,
    barometric: f64,
) -> Result<Vec<(network::field::FieldWell, String)>, String> {
    let mut out = Vec::new();
    for w in layout.wells.iter().filter(|w| w.running) {
        let t =
            tank(s, layout, &w.well).ok_or_else(|| format!("well `{}` is not defined", w.well))?;
        let run = |segs: &[crate::model::Segment], side: Side| {
            segs.iter()
                .enumerate()
                .map(|(i, seg)| resolve_segment(s, &w.name, side, i, seg))
                .collect::<Result<Vec<_>, _>>()
                .map(|segments| network::PipeRun { segments })
                .map_err(|e| e.message)
        };
        let collector_node = net
            .nodes
            .iter()
            .position(|n| n.name == w.to)
            .ok_or_else(|| format!("well pump `{}` discharges into an unknown node", w.name))?;
        out.push((
            network::field::FieldWell {
                name: w.name.clone(),
                static_level: t.level.get::<meter>(),
                surface_pressure: network::station::gauge(t.surface_pressure, barometric),
                drawdown: drawdown_of(t),
                pump_elevation: w.elevation.get::<meter>(),
                suction: run(&w.suction, Side::Suction)?,
                discharge: run(&w.discharge, Side::Discharge)?,
                collector_node,
            },
            w.well.clone(),
        ));
    }
    if out.is_empty() {
        return Err("no well pump runs in this case (every `running = 0`)".into());
    }
    Ok(out)
}

/// A tank's drawdown law; a tank without `drawdown` (a sump) has none.
fn drawdown_of(t: &Tank) -> WellDrawdown {
    match (t.drawdown, t.test_flow) {
        (Some(d), Some(q)) => WellDrawdown {
            drawdown: d.get::<meter>(),
            test_flow: q.get::<cubic_meter_per_second>(),
            well_loss: t.well_loss.map_or(0.0, |l| l.get::<meter>()),
        },
        _ => WellDrawdown {
            drawdown: 0.0,
            test_flow: 1.0,
            well_loss: 0.0,
        },
    }
}

/// A stand-in scenario for the case's fluid and barometric pressure: the first well as
/// source, no lines and no network (the field has no single station system curve).
fn stand_in(s: &Scenario) -> Scenario {
    let mut t = s.clone();
    t.network = None;
    t.lines = Default::default();
    t.source.drawdown = None;
    t.source.test_flow = None;
    t.source.well_loss = None;
    t
}

/// A well-field design's inputs that its analysis does not use (module doc): a warning
/// each, so nothing is dropped silently.
pub fn unused_inputs(design: &Design) -> Vec<super::Warning> {
    if !is_field(&design.base) {
        return Vec::new();
    }
    let mut out = Vec::new();
    let mut warn = |what: &str, span| {
        out.push(super::Warning {
            code: crate::diagnostics::Code::WellFieldNotAnalysed,
            message: format!("{what} is not computed for a well field in this version").into(),
            span,
        })
    };
    if let Some(u) = &design.uncertainty {
        warn("the duty envelope (`uncertainty`)", u.span);
    }
    if let Some(p) = design.operation.profiles.first() {
        warn("the yearly operation (`load_profile`)", Some(p.span));
    }
    out
}

/// One case of a well-field design: its stand-in system (fluid, barometric pressure)
/// and every candidate at every well.
pub fn solve_case(
    design: &Design,
    case: &Case,
    candidates: &[CandidateCurves],
) -> Result<(CaseSystem, Vec<PumpResult>), String> {
    let s = &case.scenario;
    let layout = s
        .network
        .as_ref()
        .ok_or_else(|| "the well field has no network".to_string())?;
    let sys = CaseSystem::new(&stand_in(s)).map_err(|e| e.message)?;
    let barometric = sys.barometric.pa();
    let net = collector(s, layout, &sys.fluid, barometric)?;
    let (wells, names): (Vec<_>, Vec<_>) = field_wells(s, layout, &net, barometric)?
        .into_iter()
        .unzip();
    let field = Field {
        sys: &sys,
        net: &net,
        wells: &wells,
        names: &names,
        entry: &layout.entry,
    };
    let pumps = design
        .pumps
        .iter()
        .zip(candidates)
        .map(|(p, cc)| evaluate(design, case, &field, p, cc))
        .collect();
    Ok((sys, pumps))
}

/// A case's field, ready for every candidate.
struct Field<'a> {
    sys: &'a CaseSystem,
    net: &'a Network,
    wells: &'a [network::field::FieldWell],
    /// The well (tank) of each well pump.
    names: &'a [String],
    /// The first well pump's collector node (where a valve's branch walk stops).
    entry: &'a str,
}

/// One candidate at every well of the case.
fn evaluate(
    design: &Design,
    case: &Case,
    f: &Field,
    p: &PumpCandidate,
    cc: &CandidateCurves,
) -> PumpResult {
    let (sys, net, wells) = (f.sys, f.net, f.wells);
    let (par, ser) = duty::stages_in(p, case);
    let mut out = duty::new_result(design, p, par);
    let fail = |out: &mut PumpResult, why: Message| {
        out.checks.push(Check::typed(
            CheckId::DutyPoint,
            Status::Fail,
            None,
            None,
            why.clone(),
            Source::DesignData("the well field's network solve"),
        ));
        out.failure = Some(why);
    };
    let Some((base, trim)) = &cc.evaluated else {
        fail(&mut out, "no usable pump curve".into());
        return out;
    };
    let speed_ratio = s_speed(case, p, base) / base.speed_rpm;
    let Ok(scaled) = ScaledPump::new(base, speed_ratio, *trim) else {
        fail(
            &mut out,
            "the pump's speed or impeller cannot be scaled".into(),
        );
        return out;
    };
    out.speed_rpm = scaled.speed_rpm();
    out.affinity_scale = scaled.flow_scale();
    out.impeller_diameter_m = scaled.impeller_diameter_m();
    out.warnings
        .extend(scaled.warnings().iter().map(|w| Message::text(w.clone())));
    if !matches!(p.adjust, crate::model::Adjust::None) {
        out.warnings.push(Message::text(
            "`adjust` is not applied in a well field: every well pump runs at the case's speed with the evaluated impeller",
        ));
    }
    // The viscous-liquid screen (ANSI/HI 9.6.7) at the best efficiency point, as for a
    // station's duty.
    let bep = cc.evaluated_bep.map(|b| b.flow * scaled.flow_scale());
    if let (false, Some(b)) = (
        matches!(case.scenario.fluid, crate::model::Fluid::Water { .. }),
        bep,
    ) {
        let nu = sys.fluid.viscosity / sys.fluid.density;
        let w = crate::pumps::viscosity_warning(nu, b, scaled.eval_head(b), scaled.speed_rpm());
        out.warnings.extend(w.into_iter().map(Message::text));
    }
    let (_, q_end) = scaled.domain();
    let set = network::PumpSet {
        curve: Arc::new(CandidateHead {
            curves: base.clone(),
            speed_ratio,
            diameter_ratio: *trim,
            max_flow: q_end,
        }),
        parallel: par,
        series: ser,
    };
    let sol = match network::field::solve_field_set(net, wells, &set, sys.barometric.pa()) {
        Ok(sol) => sol,
        Err(e) => {
            fail(&mut out, format!("the well field: {e}").into());
            return out;
        }
    };
    out.count = par * wells.len() as u32;
    if let Ok(full) = network::field::field_network_set(net, wells, &set) {
        let at = at_duty(&full, &sol, sys.barometric.pa());
        let entry = full
            .nodes
            .iter()
            .position(|n| n.name == f.entry)
            .unwrap_or(0);
        out.checks.extend(network::checks::node_checks(&at));
        out.checks
            .extend(network::checks::requirement_checks(design, &case.name, &at));
        out.checks
            .extend(network::valves::valve_checks_in(&full, entry, &at));
        out.network = Some(Box::new(at));
    }
    out.wells = well_duties(design, f, &sol, &scaled, cc, p, (par, ser));
    for w in &out.wells {
        for c in checks::pump_checks(design, case, &w.duty, p) {
            out.checks.push(about_well(c, &w.name));
        }
        if let Some(c) = beyond_data(w, q_end * par as f64) {
            out.checks.push(c);
        }
    }
    let total = field_total(design, p, &out.wells);
    if let Some(t) = &total {
        out.checks
            .extend(checks::requirement_checks(design, case, t));
    }
    out.duty = total;
    duty::set_input_power(design, case, &mut out, None);
    out
}

fn s_speed(case: &Case, p: &PumpCandidate, base: &PumpCurves) -> f64 {
    case.scenario
        .pump_speed_rpm(&p.name)
        .unwrap_or(base.speed_rpm)
}

/// A check about one well pump (the velocity checks keep their side).
fn about_well(c: Check, well: &str) -> Check {
    let subject = match &c.subject {
        Some(side) => format!("{well} {side}"),
        None => well.to_string(),
    };
    let mut c = c.about(subject);
    c.message = c
        .message
        .get()
        .into_owned()
        .prefixed(format!("well pump {well}: "))
        .into();
    c
}

/// A well's duty beyond the published curve, or held shut by its check valve: the
/// duty-point check fails for that well (no extrapolation, DEVELOPERS.md).
fn beyond_data(w: &WellDuty, q_end: f64) -> Option<Check> {
    let why = if w.closed {
        crate::message![
            format!("well pump {}: ", w.name),
            "the pump cannot open its check valve: its shut-off head is below the collector's head there"
        ]
    } else if w.duty.flow > q_end * (1.0 + 1e-9) {
        crate::message![
            format!("well pump {}: the field's solve puts the pump at ", w.name),
            flow(w.duty.flow_per_pump),
            " per pump, beyond the end of the published curve: no published data there"
        ]
    } else {
        return None;
    };
    Some(
        Check::typed(
            CheckId::DutyPoint,
            Status::Fail,
            Some(w.duty.flow),
            Some(q_end),
            why,
            Source::DesignData("the published curve's flow range"),
        )
        .about(w.name.clone()),
    )
}

/// Each running well's duty from the field's solution.
fn well_duties(
    design: &Design,
    f: &Field,
    sol: &FieldSolution,
    scaled: &ScaledPump,
    cc: &CandidateCurves,
    p: &PumpCandidate,
    (par, ser): (u32, u32),
) -> Vec<WellDuty> {
    let sys = f.sys;
    let rho = sys.fluid.density;
    let rho_g = rho * G;
    let (parf, serf) = (par as f64, ser as f64);
    let bep = cc.evaluated_bep.map(|b| b.flow * scaled.flow_scale());
    f.wells
        .iter()
        .zip(f.names)
        .zip(&sol.pumps)
        .map(|((w, well), fp)| {
            let q = fp.flow.max(0.0);
            let qp = q / parf;
            let h = fp.head;
            let (mut friction, mut minor) = (0.0, 0.0);
            for seg in &w.suction.segments {
                let (f, m) = segment_losses_in(&sys.fluid, seg, q);
                friction += f;
                minor += m;
            }
            let terms = NpshTerms {
                barometric_head: sys.barometric.pa() / rho_g,
                surface_pressure_head: w.surface_pressure / rho_g,
                static_suction_head: fp.pumping_level - w.pump_elevation,
                vapour_pressure_head: -sys.fluid.vapor_pressure.pa() / rho_g,
                suction_friction_head: -friction,
                suction_minor_head: -minor,
            };
            let velocity = |seg: Option<&super::SegmentState>| seg.map(|s| q / s.area);
            let duty = Duty {
                flow: q,
                head: h,
                flow_per_pump: qp,
                head_per_pump: h / serf,
                efficiency: scaled.eval_efficiency(qp).filter(|e| *e > 0.0),
                hydraulic_power: crate::pumps::hydraulic_power_w(rho, q, h),
                shaft_power: duty::arrangement_power(scaled, rho, parf, serf, q),
                input_power: None,
                motor_efficiency: duty::DEFAULT_MOTOR_EFFICIENCY,
                drive_efficiency: duty::drive_efficiency(design, p),
                specific_energy: None,
                wire_to_water_efficiency: None,
                bep_flow: bep,
                flow_ratio_to_bep: bep.filter(|b| *b > 0.0).map(|b| qp / b),
                npsh_available: fp.npsh_available,
                npsh_terms: terms,
                npsh_required: scaled.eval_npshr(qp),
                suction_velocity: velocity(w.suction.segments.last()),
                discharge_velocity: velocity(w.discharge.segments.first()),
                station: None,
                well: None,
                extrapolated: false,
                crossings: 1,
            };
            WellDuty {
                name: w.name.clone(),
                well: well.clone(),
                static_level: w.static_level,
                drawdown: fp.drawdown,
                pumping_level: fp.pumping_level,
                pump_elevation: w.pump_elevation,
                duty,
                closed: fp.closed,
            }
        })
        .collect()
}

/// The governing well: the least NPSH excess (available − required), or the least
/// NPSH available where the curve gives no NPSH required.
fn governing(wells: &[WellDuty]) -> Option<&WellDuty> {
    let excess = |w: &WellDuty| w.duty.npsh_available - w.duty.npsh_required.unwrap_or(0.0);
    wells.iter().min_by(|a, b| excess(a).total_cmp(&excess(b)))
}

/// The field's total as one duty (see the module's doc); `None` without a running well.
fn field_total(design: &Design, p: &PumpCandidate, wells: &[WellDuty]) -> Option<Duty> {
    let g = governing(wells)?;
    let q: f64 = wells.iter().map(|w| w.duty.flow).sum();
    let hydraulic: f64 = wells.iter().map(|w| w.duty.hydraulic_power).sum();
    let shaft: Option<f64> = wells.iter().map(|w| w.duty.shaft_power).sum();
    let head = if q > 0.0 {
        wells.iter().map(|w| w.duty.flow * w.duty.head).sum::<f64>() / q
    } else {
        g.duty.head
    };
    Some(Duty {
        flow: q,
        head,
        efficiency: shaft.filter(|s| *s > 0.0).map(|s| hydraulic / s),
        hydraulic_power: hydraulic,
        shaft_power: shaft,
        drive_efficiency: duty::drive_efficiency(design, p),
        ..g.duty.clone()
    })
}

/// After the motor pass: each well's input power with the candidate's motor, and the
/// motor check restated per well with its own shaft power per pump (the motor pass
/// checked the field's mean).
pub fn motor_checks_per_well(
    design: &Design,
    cases: &mut [super::CaseResult],
    sizing: &mut [Option<super::motor::MotorSizing>],
) {
    if !is_field(&design.base) {
        return;
    }
    largest_per_well(cases, sizing);
    let words: Vec<_> = sizing
        .iter()
        .map(|m| m.as_ref().map(super::motor::MotorWords::of))
        .collect();
    for c in cases.iter_mut() {
        for ((r, m), words) in c.pumps.iter_mut().zip(sizing.iter()).zip(&words) {
            let eff = r
                .duty
                .as_ref()
                .map(|d| (d.motor_efficiency, d.drive_efficiency));
            let par = r.count.max(1) as f64 / r.wells.len().max(1) as f64;
            for w in &mut r.wells {
                if let Some((me, de)) = eff {
                    let d = &mut w.duty;
                    d.motor_efficiency = me;
                    d.input_power = d.shaft_power.map(|s| s / me / de);
                    d.specific_energy = d.input_power.filter(|_| d.flow > 0.0).map(|x| x / d.flow);
                    d.wire_to_water_efficiency = d
                        .input_power
                        .filter(|x| *x > 0.0)
                        .map(|x| d.hydraulic_power / x);
                }
            }
            let (Some(m), Some(words)) = (m, words) else {
                continue;
            };
            let per_well: Vec<Check> = r
                .wells
                .iter()
                .filter_map(|w| {
                    let per_pump = w.duty.shaft_power? / par;
                    Some(about_well(
                        super::motor::motor_check(m, words, per_pump),
                        &w.name,
                    ))
                })
                .collect();
            r.checks.retain(|c| c.id != CheckId::Motor);
            r.checks.extend(per_well);
        }
    }
}

/// The motor's largest operating shaft power per pump taken over every well (the motor
/// pass saw the field's mean per pump); the rating itself covers the curve to run-out.
fn largest_per_well(cases: &[super::CaseResult], sizing: &mut [Option<super::motor::MotorSizing>]) {
    for (i, m) in sizing.iter_mut().enumerate() {
        let Some(m) = m else { continue };
        for c in cases {
            let Some(r) = c.pumps.get(i) else { continue };
            let par = r.count.max(1) as f64 / r.wells.len().max(1) as f64;
            for w in &r.wells {
                let per_pump = w.duty.shaft_power.unwrap_or(0.0) / par;
                if per_pump > m.max_operating_shaft_power {
                    m.max_operating_shaft_power = per_pump;
                    m.max_operating_case = c.name.clone();
                    // The loading printed beside it is of this power, not the mean's.
                    m.choice.loading_ratio = per_pump / m.choice.rating_w;
                }
            }
        }
    }
}

/// The field's network at the candidate's duty: every node's head and pressure with the
/// flags of [`network::station::NodeAtDuty`] (the same rules as a station's network:
/// below the required pressure, below atmospheric, within
/// [`NEAR_VAPOUR_HEAD_M`](network::station::NEAR_VAPOUR_HEAD_M) of the vapour pressure),
/// and every link's flow; `station_flow` is the field's total.
fn at_duty(net: &Network, sol: &FieldSolution, barometric: f64) -> network::station::NetworkAtDuty {
    use network::station::{LinkAtDuty, NodeAtDuty, NEAR_VAPOUR_HEAD_M};
    let rho_g = net.fluid.density * G;
    let sol_net = &sol.network;
    // Each well's pumping-level node (the one after its static level) and its surface
    // pressure, Pa.
    let pumping_levels: std::collections::HashMap<usize, f64> = net
        .nodes
        .iter()
        .enumerate()
        .filter_map(|(i, n)| match n.kind {
            NodeKind::FixedHead {
                surface_pressure, ..
            } if i + 1 < net.nodes.len() && n.name.ends_with(" static level") => {
                Some((i + 1, surface_pressure))
            }
            _ => None,
        })
        .collect();
    let nodes = net
        .nodes
        .iter()
        .enumerate()
        .map(|(i, n)| {
            let st = sol_net.nodes[i];
            let fixed = matches!(n.kind, NodeKind::FixedHead { .. });
            let inflow = fixed.then(|| {
                net.links
                    .iter()
                    .zip(&sol_net.links)
                    .map(|(l, x)| match (l.to == i, l.from == i) {
                        (true, _) => x.flow,
                        (_, true) => -x.flow,
                        _ => 0.0,
                    })
                    .sum()
            });
            let demand = match n.kind {
                NodeKind::Junction { demand } => demand,
                NodeKind::FixedHead { .. } => 0.0,
            };
            // A well's pumping level is a free surface at the solved head (less its
            // surface pressure's head): its pressure is the surface's, never a vacuum.
            let surface = pumping_levels.get(&i).copied();
            let (elevation, pressure) = match surface {
                Some(p) => (st.head - p / rho_g, p),
                None => (n.elevation, st.pressure),
            };
            let fixed = fixed || surface.is_some();
            NodeAtDuty {
                name: n.name.clone(),
                kind: n.word,
                elevation,
                head: st.head,
                pressure,
                demand,
                inflow,
                required_pressure: n.required_pressure,
                below_required: n.required_pressure.is_some_and(|r| st.pressure < r),
                below_atmospheric: !fixed && st.pressure < 0.0,
                near_vapour: !fixed
                    && st.pressure + barometric
                        < net.fluid.vapor_pressure.pa() + NEAR_VAPOUR_HEAD_M * rho_g,
            }
        })
        .collect();
    let links = net
        .links
        .iter()
        .zip(&sol_net.links)
        .map(|(l, x)| LinkAtDuty {
            name: l.name.clone(),
            kind: l.element.kind(),
            from: net.nodes[l.from].name.clone(),
            to: net.nodes[l.to].name.clone(),
            // A flow at rounding level is shown as zero (never "-0").
            flow: if x.flow.abs() < 1e-12 { 0.0 } else { x.flow },
            velocity: x.velocity.map(|v| if v < 1e-12 { 0.0 } else { v }),
            head_loss: x.head_loss,
            closed: x.closed,
        })
        .collect();
    network::station::NetworkAtDuty {
        station_flow: sol.total_flow,
        nodes,
        links,
        iterations: sol_net.iterations,
        demand_scale: None,
    }
}
