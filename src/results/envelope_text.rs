//! The text results' duty envelopes (issue 15).

use std::fmt::Write;

use crate::analysis::Analysis;
use crate::display::Units;
use crate::model::Design;

/// The envelope of every case × candidate, when the design asks for one.
pub fn envelope(o: &mut String, design: &Design, analysis: &Analysis) {
    let Some(e) = &analysis.envelope else { return };
    let u = Units::new(design.project.units);
    let (fl, hd, pw) = (u.flow(), u.head(), u.power());
    let _ = writeln!(o, "\nduty envelopes:");
    let _ = writeln!(o, "  method: {}", e.method_words());
    for (p, (t, assumed)) in design.pumps.iter().zip(&e.grades) {
        let _ = writeln!(
            o,
            "  pump {}: grade {}{}{}: flow -{:.0} % / +{:.0} %, head -{:.0} % / +{:.0} %, efficiency -{:.0} %, NPSH3 +{:.0} % or +{} (ISO 9906:2012, from memory)",
            p.name,
            t.grade.label(),
            if *assumed { " (assumed: none stated)" } else { "" },
            if t.small_pump { ", small-pump tolerances" } else { "" },
            100.0 * t.flow_minus,
            100.0 * t.flow_plus,
            100.0 * t.head_minus,
            100.0 * t.head_plus,
            100.0 * t.efficiency_minus,
            100.0 * t.npsh3_relative,
            hd.fmt(t.npsh3_minimum_m)
        );
    }
    for c in &e.cases {
        for (p, d) in design.pumps.iter().zip(&c.pumps) {
            let Some(d) = d else { continue };
            let name = |i: usize| d.corners[i].name.as_str();
            let _ = writeln!(o, "  case {} pump {}:", c.case, p.name);
            let _ = writeln!(
                o,
                "    flow {} ({}) to {} ({})",
                fl.fmt(d.flow_min.value),
                name(d.flow_min.corner),
                fl.fmt(d.flow_max.value),
                name(d.flow_max.corner)
            );
            let _ = writeln!(
                o,
                "    head {} ({}) to {} ({})",
                hd.fmt(d.head_min.value),
                name(d.head_min.corner),
                hd.fmt(d.head_max.value),
                name(d.head_max.corner)
            );
            if let Some((w, _, q)) = d.shaft_power_max {
                let _ = writeln!(
                    o,
                    "    largest shaft power per pump {} at {} per pump",
                    pw.fmt(w),
                    fl.fmt(q)
                );
            }
            let failed = d.corners.iter().filter(|k| k.duty.is_err()).count();
            if failed > 0 {
                let _ = writeln!(
                    o,
                    "    {failed} of {} points have no duty within the published data",
                    d.corners.len()
                );
            }
            for w in &d.checks {
                let _ = writeln!(
                    o,
                    "    check {} nominal {} / worst {} ({}): {}",
                    w.worst.id,
                    w.nominal.status.keyword(),
                    w.worst.status.keyword(),
                    w.corner,
                    u.render(&w.worst.message.get())
                );
            }
        }
    }
}
