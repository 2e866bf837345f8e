//! The text summary of a well field (issue 12): in place of the station's system (a
//! field has no single station flow), and each well pump's duty under the candidate's
//! total.

use std::fmt::Write as _;

use crate::analysis::duty::PumpResult;
use crate::analysis::{CaseResult, CaseSystem};
use crate::display::{percent, Units};
use crate::model::Design;

/// True when the design is a well field.
pub(super) fn is_field(design: &Design) -> bool {
    crate::analysis::well_field::is_field(&design.base)
}

/// A well-field case's fluid and barometric pressure, and what stands in for the
/// system curve.
pub(super) fn case_field(o: &mut String, u: &Units, c: &CaseResult, s: &CaseSystem) {
    super::text::fluid_and_barometric(o, u, s);
    let running = c.pumps.first().map_or(0, |p| p.wells.len());
    let _ = writeln!(
        o,
        "  well field: {running} well pump(s) running, solved as one network with the collector; no system curve (no single station flow)"
    );
}

/// Each well pump of a candidate's field at its duty.
pub(super) fn wells(o: &mut String, u: &Units, r: &PumpResult) {
    if r.wells.is_empty() {
        return;
    }
    let (fl, hd, el, pw) = (u.flow(), u.head(), u.elevation(), u.power());
    let _ = writeln!(
        o,
        "    field total of {} well(s): flow and power summed, head flow-weighted; NPSH, BEP ratio and velocities above are the governing well's (least NPSH excess)",
        r.wells.len()
    );
    for w in &r.wells {
        let d = &w.duty;
        let _ = writeln!(
            o,
            "    well pump {} (well {}): static level {}, drawdown {}, pumping level {}, pump at {}; {} at {}{}; NPSHa {}{}; shaft power {}{}",
            w.name,
            w.well,
            el.fmt(w.static_level),
            hd.fmt(w.drawdown),
            el.fmt(w.pumping_level),
            el.fmt(w.pump_elevation),
            fl.fmt(d.flow),
            hd.fmt(d.head),
            d.efficiency
                .map(|e| format!(", efficiency {}", percent(e)))
                .unwrap_or_default(),
            hd.fmt(d.npsh_available),
            d.npsh_required
                .map(|n| format!(" / NPSHr {}", hd.fmt(n)))
                .unwrap_or_default(),
            d.shaft_power.map_or("–".to_string(), |p| pw.fmt(p)),
            if w.closed { "; check valve closed" } else { "" }
        );
    }
}
