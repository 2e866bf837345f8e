//! One pump of a parallel set running alone (issue 10.4): after the other pumps trip,
//! the remaining one runs out along its curve against the lowest-head case. It is
//! evaluated at the limit the design allows (maximum speed, largest impeller): a
//! speed controller holding the flow drives it there. Its duty point, its power
//! against the motor nameplate and its NPSH margin become the `one-pump-alone` check
//! of that case. A point beyond the end of the published curve fails: no published
//! data there.
//!
//! Unequal pumps in parallel (a weaker pump deadheading against the header) cannot be
//! written in a design yet: a set is `count` identical pumps.

use super::checks::{self, Check, Status};
use super::duty::{self, CandidateCurves};
use super::limits::{CheckId, Source};
use super::motor::MotorSizing;
use super::CaseResult;
use crate::message::{self, flow, head, Kind, Message};
use crate::model::{Adjust, ArrangementKind, Design, PumpCandidate};

/// One pump of a parallel set alone.
#[derive(Clone, Debug, PartialEq)]
pub struct OneAlone {
    /// The case it is evaluated against (the lowest system head).
    pub case: String,
    /// Speed of the one pump, rpm.
    pub speed_rpm: f64,
    /// Flow (m³/s) and head (m) of the one pump; `None` beyond the published curve.
    pub flow: Option<f64>,
    /// Head of the one pump, m.
    pub head: Option<f64>,
    /// Shaft power, W.
    pub shaft_power: Option<f64>,
    /// NPSH available at its flow, m.
    pub npsh_available: Option<f64>,
    /// NPSH required at its flow, m, where published.
    pub npsh_required: Option<f64>,
    /// The one-pump-alone check (within the published curve).
    pub check: Check,
}

/// The case of lowest system head at flow q (m³/s) among the analysed cases (the
/// first of equal ones).
fn lowest_head_case(cases: &[CaseResult], q: f64) -> Option<usize> {
    cases
        .iter()
        .enumerate()
        .filter_map(|(i, c)| c.system.as_ref().map(|s| (i, s.head(q))))
        .min_by(|a, b| a.1.total_cmp(&b.1).then(a.0.cmp(&b.0)))
        .map(|(i, _)| i)
}

/// Evaluate one pump alone for every parallel candidate, adding its check to the case
/// it was evaluated against. Per candidate, `None` for sets that are not parallel.
pub fn one_pump_alone(
    design: &Design,
    candidates: &[CandidateCurves],
    motors: &[Option<MotorSizing>],
    cases: &mut [CaseResult],
) -> Vec<Option<OneAlone>> {
    let mut out = Vec::new();
    for (k, (p, cc)) in design.pumps.iter().zip(candidates).enumerate() {
        let found = (p.arrangement == ArrangementKind::Parallel && p.count >= 2)
            .then(|| evaluate(design, p, cc, motors.get(k).and_then(|m| m.as_ref()), cases))
            .flatten();
        if let Some((i, alone)) = &found {
            if let Some(r) = cases[*i].pumps.get_mut(k) {
                r.checks.push(alone.check.clone());
            }
        }
        out.push(found.map(|(_, a)| a));
    }
    out
}

fn evaluate(
    design: &Design,
    p: &PumpCandidate,
    cc: &CandidateCurves,
    motor: Option<&MotorSizing>,
    cases: &[CaseResult],
) -> Option<(usize, OneAlone)> {
    let (base, trim) = cc.evaluated.as_ref()?;
    let i = lowest_head_case(cases, base.head.domain().1)?;
    let case = &cases[i];
    let sys = case.system.as_ref()?;
    let dc = design.cases.iter().find(|d| d.name == case.name)?;
    let case_ratio = dc
        .scenario
        .pump_speed_rpm(&p.name)
        .map_or(1.0, |rpm| rpm / base.speed_rpm);
    let (speed, diameter) = match p.adjust {
        Adjust::Speed { max_ratio, .. } => (max_ratio, *trim),
        Adjust::Trim { .. } => (case_ratio, 1.0),
        Adjust::None => (case_ratio, *trim),
    };
    let scaled = duty::pump_in_case(base, speed, diameter, sys, cc.evaluated_bep.as_ref()).ok()?;
    let (_, end) = scaled.domain();
    let outcome = super::system_table::solve_duty(
        &|q| duty::set_head(&scaled, sys, 1.0, 1.0, q),
        sys,
        end * (1.0 + duty::SEARCH_BEYOND_CURVE),
        sys.scan(cc).filter(|_| scaled.viscous().is_none()),
    );
    let mut alone = OneAlone {
        case: case.name.clone(),
        speed_rpm: scaled.speed_rpm(),
        flow: None,
        head: None,
        shaft_power: None,
        npsh_available: None,
        npsh_required: None,
        check: Check::typed(
            CheckId::OnePumpAlone,
            Status::Fail,
            None,
            Some(end),
            Message::new(),
            Source::DesignData("the published curve's flow range"),
        ),
    };
    let prefix = format!(
        "one pump of the set alone at {:.0} rpm in case {} (lowest system head)",
        scaled.speed_rpm(),
        case.name
    );
    let Some((q, h)) = outcome.point().filter(|(q, _)| *q <= end * (1.0 + 1e-9)) else {
        alone.check.message = crate::message![
            format!("{prefix}: it runs out beyond the end of the published curve at "),
            flow(end),
            ": no published data there"
        ]
        .into();
        return Some((i, alone));
    };
    let shaft = duty::arrangement_power(&scaled, sys.fluid.density, 1.0, 1.0, q);
    let npsha = sys.npsh_available_per_pump(q, q);
    let npshr = scaled.eval_npshr(q);
    let npsh = checks::npsh_margin(npsha, npshr, checks::npsh_limits(design, dc));
    let mut status = npsh.status;
    let mut msg = crate::message![format!("{prefix}: "), flow(q), " at ", head(h)];
    if let (Some(w), Some(m)) = (shaft, motor) {
        let rating = m.choice.rating_w;
        let over = w > rating * (1.0 + 1e-9);
        msg.push(", shaft power ");
        msg.push(message::against(Kind::Power, w, rating));
        msg.push(" against the nameplate ");
        msg.push(message::against(Kind::Power, rating, w));
        msg.push(if over { " (above the nameplate)" } else { "" });
        if over {
            status = status.max(Status::Warn);
        }
    }
    msg.push("; ");
    msg.append(&npsh.message.get());
    alone.flow = Some(q);
    alone.head = Some(h);
    alone.shaft_power = shaft;
    alone.npsh_available = Some(npsha);
    alone.npsh_required = npshr;
    alone.check = Check::typed(
        CheckId::OnePumpAlone,
        status,
        Some(q),
        Some(end),
        msg,
        npsh.origin,
    );
    Some((i, alone))
}
