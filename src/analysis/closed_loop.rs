//! Closed loops and glycol mixtures (issue 12): the checks a case adds to each
//! candidate's checks — the glycol's freeze margin and the loop's high point.
//!
//! A closed loop is a design whose network returns to the tank the pumps draw from: that
//! tank (an expansion vessel or fill point) is the loop's pressure reference. Static head
//! cancels around the loop (source and destination are the one surface), so the system
//! curve is friction and equipment only; its `pressure` is the minimum (cold fill,
//! precharge), used for NPSH available and every pressure check, and `max_pressure` the
//! maximum, used by the pressure-rating screen. With the reference at the pump suction
//! the pumps add pressure everywhere downstream of it, so the loop's lowest pressure at
//! its high point is the static one at rest: p_hp = p_min − ρ·g·(z_hp − z_ref)
//! (hydrostatics). Air vents at the high point need a positive pressure to keep air out
//! (30 kPa, common practice, when the design states none).

use super::checks::{Check, Status};
use super::limits::{self, CheckId, Source};
use super::CaseSystem;
use crate::message::{self, Kind};
use crate::model::{Fluid, Scenario};

/// Standard gravity, m/s² (CGPM 1901).
const G: f64 = 9.806_65;

/// Whether a scenario is a closed loop: its network (or its discharge line) returns to
/// the source tank.
pub fn is_closed_loop(s: &Scenario) -> bool {
    s.destination.name == s.source.name
}

/// The case's checks for every candidate: the freeze margin of a glycol mixture, and a
/// closed loop's high point.
pub fn case_checks(s: &Scenario, sys: &CaseSystem) -> Vec<Check> {
    let mut out = Vec::new();
    if let Fluid::Glycol(g) = &s.fluid {
        out.push(freeze_margin(
            g.temperature
                .get::<uom::si::thermodynamic_temperature::kelvin>(),
            g.freezing_point_k(),
        ));
    }
    if is_closed_loop(s) {
        out.push(high_point(s, sys));
    }
    out
}

/// The glycol's temperature `t_k` against its freezing point `tf_k` plus
/// [`limits::FREEZE_MARGIN_K`]: fail at or below the freezing point, warn within the
/// margin.
pub fn freeze_margin(t_k: f64, tf_k: f64) -> Check {
    let limit = tf_k + limits::FREEZE_MARGIN_K.value;
    let status = if t_k <= tf_k {
        Status::Fail
    } else if t_k < limit {
        Status::Warn
    } else {
        Status::Pass
    };
    let t = |v| message::value(Kind::Temperature, v);
    let verdict = match status {
        Status::Pass => " is above",
        Status::Warn => " is below",
        Status::Fail => " is at or below the freezing point itself, and below",
    };
    Check::typed(
        CheckId::FreezeMargin,
        status,
        Some(t_k),
        Some(limit),
        crate::message![
            "fluid temperature ",
            t(t_k),
            verdict,
            " the freeze-protection limit ",
            t(limit),
            " (freezing point ",
            t(tf_k),
            ", Melinder 2010, plus the usual margin)",
            if status == Status::Pass {
                ""
            } else {
                ": raise the glycol fraction"
            }
        ],
        limits::FREEZE_MARGIN_K.source,
    )
}

/// Highest point of a closed loop on the datum, m: the stated `high_point`, every
/// network node, the reference level and the pump centreline.
pub fn high_point_m(s: &Scenario) -> f64 {
    let nodes = s.network.iter().flat_map(|n| &n.nodes);
    nodes
        .map(|n| n.elevation.get::<uom::si::length::meter>())
        .chain(
            s.source
                .reference
                .high_point
                .map(|h| h.get::<uom::si::length::meter>()),
        )
        .chain([
            s.source.level.get::<uom::si::length::meter>(),
            s.centreline.get::<uom::si::length::meter>(),
        ])
        .fold(f64::NEG_INFINITY, f64::max)
}

fn high_point(s: &Scenario, sys: &CaseSystem) -> Check {
    let z = high_point_m(s);
    let p_ref = sys.source_gauge().pa();
    let p = p_ref - sys.fluid.density * G * (z - sys.source_level.m());
    let (limit, origin) = match s.source.reference.high_point_pressure {
        Some(v) => (
            v.get::<uom::si::pressure::pascal>(),
            Source::DesignRequirement,
        ),
        None => (
            limits::LOOP_HIGH_POINT_PA.value,
            limits::LOOP_HIGH_POINT_PA.source,
        ),
    };
    let ok = p >= limit;
    let pr = |v| message::value(Kind::GaugePressure, v);
    Check::typed(
        CheckId::LoopHighPoint,
        if ok { Status::Pass } else { Status::Fail },
        Some(p),
        Some(limit),
        crate::message![
            "high point at ",
            message::value(Kind::Elevation, z),
            ": at rest, at the minimum pressure ",
            pr(p_ref),
            " at the reference (level ",
            message::value(Kind::Elevation, sys.source_level.m()),
            "), the pressure there is ",
            pr(p),
            if ok {
                ", at or above the least "
            } else {
                ", below the least "
            },
            pr(limit),
            if ok {
                ""
            } else {
                ": air enters at the vents; raise the fill pressure"
            }
        ],
        origin,
    )
}

/// A closed loop's case system at its maximum reference pressure (`max_pressure`), for
/// the pressure-rating screen; `None` for an open system or a loop that states none.
pub fn rating_system(s: &Scenario) -> Option<CaseSystem> {
    let max = s
        .source
        .reference
        .max_pressure
        .filter(|_| is_closed_loop(s))?;
    let mut raised = s.clone();
    raised.source.surface_pressure = crate::model::SurfacePressure::Gauge(max);
    raised.destination = raised.source.clone();
    CaseSystem::new(&raised).ok()
}
