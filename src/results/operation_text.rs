//! The text summary of the operation over the load profiles, per candidate, in
//! report units.

use std::fmt::Write;

use crate::analysis::operation::CandidateOperation;
use crate::analysis::Analysis;
use crate::display::{percent, Units};
use crate::model::Design;

/// One block per candidate: each load point, the year's totals, the checks, the LCC.
pub(super) fn operation(o: &mut String, design: &Design, analysis: &Analysis) {
    let u = Units::new(design.project.units);
    for op in &analysis.operation {
        let _ = writeln!(o, "\noperation of {} over the profile", op.name);
        if let Some(why) = &op.failure {
            let _ = writeln!(o, "  not run: {why}");
            continue;
        }
        points(o, &u, op);
        let y = &op.yearly;
        let _ = writeln!(
            o,
            "  per year: {}, {}, {}{}; mean wire-to-water {}, mean pump efficiency {}",
            u.energy().fmt(y.energy_j),
            u.volume().fmt(y.volume_m3),
            y.specific_energy
                .map(|e| u.specific_energy().fmt(e))
                .unwrap_or_else(|| "—".into()),
            y.cost
                .map(|c| format!(", cost {c:.0} {}", design.energy.currency))
                .unwrap_or_default(),
            y.mean_wire_to_water
                .map(percent)
                .unwrap_or_else(|| "—".into()),
            y.mean_pump_efficiency
                .map(percent)
                .unwrap_or_else(|| "—".into()),
        );
        for (case, sw) in &op.switching {
            for s in sw {
                let _ = writeln!(
                    o,
                    "  switching ({case}): {} → {} pumps at {}",
                    s.from,
                    s.to,
                    u.flow().fmt(s.flow)
                );
            }
        }
        for c in &op.checks {
            let _ = writeln!(
                o,
                "  check {} {}: {}",
                c.id,
                c.status.keyword(),
                u.render(&c.message.get())
            );
        }
        if let Some(l) = &op.lcc {
            let _ = writeln!(
                o,
                "  life-cycle cost ({} rates, {:.0} years): {:.0} {} = initial {:.0} + installation {:.0} + energy {:.0} + operation {:.0} + maintenance {:.0} + downtime {:.0} + environmental {:.0} + disposal {:.0}",
                l.rates.keyword(), l.years, l.total, design.energy.currency, l.initial, l.installation, l.energy, l.operation, l.maintenance, l.downtime, l.environmental, l.disposal
            );
        }
    }
}

fn points(o: &mut String, u: &Units, op: &CandidateOperation) {
    let (fl, hd, pw) = (u.flow(), u.head(), u.power());
    for p in &op.points {
        let Some(s) = &p.state else {
            let _ = writeln!(
                o,
                "  {} for {:.0} h ({}): not delivered: {}",
                fl.fmt(p.flow),
                p.hours,
                p.case,
                p.failure.as_ref().map(|m| u.render(m)).unwrap_or_default()
            );
            continue;
        };
        let _ = writeln!(
            o,
            "  {} for {:.0} h ({}): {} running at {:.0} rpm, {} per pump at {}, efficiency {}, {} of BEP flow, NPSHa {} / NPSHr {}; shaft {}, motor load {} at {}, drive {}, input {}, wire-to-water {}{}",
            fl.fmt(p.flow),
            p.hours,
            p.case,
            s.running,
            s.speed_rpm,
            fl.fmt(s.flow_per_pump),
            hd.fmt(s.head_per_pump),
            s.efficiency.map(percent).unwrap_or_else(|| "—".into()),
            s.bep_ratio.map(percent).unwrap_or_else(|| "—".into()),
            hd.fmt(s.npsh_available),
            s.npsh_required.map(|n| hd.fmt(n)).unwrap_or_else(|| "—".into()),
            pw.fmt(s.shaft_power),
            percent(s.motor_load),
            percent(s.motor_efficiency),
            if op.variable_speed {
                percent(s.drive_efficiency)
            } else {
                "none".to_string()
            },
            pw.fmt(s.input_power),
            p.wire_to_water.map(percent).unwrap_or_else(|| "—".into()),
            if p.duty_cycle < 1.0 { format!(", running {} of the time", percent(p.duty_cycle)) } else { String::new() }
        );
    }
}
