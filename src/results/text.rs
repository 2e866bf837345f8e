//! The text view of an analysis: stable, readable, one fact per line, in the
//! design's report units, so that `git diff` of two revisions reads well.

use std::fmt::Write as _;

use crate::analysis::Analysis;
use crate::display::{percent, Units};
use crate::model::Design;

/// The text summary.
pub fn to_text(design: &Design, analysis: &Analysis) -> String {
    let u = Units::new(design.project.units);
    let (fl, hd, pw, vel, len, dia) = (
        u.flow(),
        u.head(),
        u.power(),
        u.velocity(),
        u.length(),
        u.diameter(),
    );
    let mut o = String::new();
    let p = &design.project;
    let _ = writeln!(o, "dutyline results {}", crate::VERSION);
    let _ = writeln!(o, "project: {}", p.title);
    let _ = writeln!(o, "number: {}", p.number);
    if let Some(r) = design.revisions.last() {
        let _ = writeln!(o, "revision: {} {} {}", r.id, r.date, r.description);
    }
    let _ = writeln!(o, "units: {}", p.units.keyword());
    for c in &analysis.cases {
        let _ = writeln!(o, "\ncase {}", c.name);
        for ov in &c.overrides {
            let _ = writeln!(o, "  override: {ov}");
        }
        let Some(s) = &c.system else {
            let _ = writeln!(
                o,
                "  error: {}",
                c.error.as_deref().unwrap_or("not analysed")
            );
            continue;
        };
        let _ = writeln!(
            o,
            "  fluid: {}{}, density {}, viscosity {}, vapour pressure {}",
            s.fluid.name,
            s.fluid
                .temperature_k
                .map(|t| format!(" at {}", u.temperature().fmt(t)))
                .unwrap_or_default(),
            u.density().fmt(s.fluid.density),
            u.viscosity().fmt(s.fluid.viscosity),
            u.pressure().fmt(s.fluid.vapor_pressure)
        );
        let _ = writeln!(
            o,
            "  barometric pressure: {}",
            u.pressure().fmt(s.barometric_pa)
        );
        let _ = writeln!(o, "  static head: {}", hd.fmt(s.static_head));
        for g in &s.segments {
            let _ = writeln!(
                o,
                "  segment {} {}: {} {}, ID {}, length {}, {}",
                g.line,
                g.index + 1,
                g.material,
                g.size_label,
                dia.fmt(g.inner_diameter),
                len.fmt(g.length),
                match g.hazen_williams_c {
                    Some(cv) => format!("Hazen-Williams C {cv}"),
                    None => format!("roughness {}", u.roughness().fmt(g.roughness)),
                }
            );
        }
        let _ = writeln!(
            o,
            "  system curve ({} | {} = static + friction + minor):",
            fl.label, hd.label
        );
        for pt in c.system_curve.iter().step_by(3) {
            let _ = writeln!(
                o,
                "    {:>9} | {:>8} = {} + {} + {}",
                fl.num(pt.flow),
                hd.num(pt.head),
                hd.num(pt.static_head),
                hd.num(pt.friction),
                hd.num(pt.minor)
            );
        }
        for r in &c.pumps {
            let _ = writeln!(
                o,
                "  pump {} at {:.0} rpm{}:",
                r.name,
                r.speed_rpm,
                r.impeller_diameter_m
                    .map(|d| format!(", impeller {}", dia.fmt(d)))
                    .unwrap_or_default()
            );
            match &r.duty {
                Some(d) => {
                    let _ = writeln!(o, "    duty: {} at {}", fl.fmt(d.flow), hd.fmt(d.head));
                    if let Some(e) = d.efficiency {
                        let _ = writeln!(o, "    efficiency: {}", percent(e));
                    }
                    if let Some(b) = d.flow_ratio_to_bep {
                        let _ = writeln!(o, "    flow / BEP flow: {}", percent(b));
                    }
                    let _ = writeln!(o, "    NPSHa: {}", hd.fmt(d.npsh_available));
                    if let Some(n) = d.npsh_required {
                        let _ = writeln!(o, "    NPSHr: {}", hd.fmt(n));
                    }
                    if let Some(sp) = d.shaft_power {
                        let _ = writeln!(o, "    shaft power: {}", pw.fmt(sp));
                    }
                    if let (Some(v1), Some(v2)) = (d.suction_velocity, d.discharge_velocity) {
                        let _ = writeln!(
                            o,
                            "    velocity suction / discharge: {} / {}",
                            vel.fmt(v1),
                            vel.fmt(v2)
                        );
                    }
                }
                None => {
                    let _ = writeln!(
                        o,
                        "    no duty point: {}",
                        r.failure.as_deref().unwrap_or("unknown")
                    );
                }
            }
            for ch in &r.checks {
                let _ = writeln!(
                    o,
                    "    check {} {}: {}",
                    ch.id,
                    ch.status.keyword(),
                    ch.message
                );
            }
            for w in &r.warnings {
                let _ = writeln!(o, "    warning: {w}");
            }
        }
    }
    let sel = &analysis.selection;
    let _ = writeln!(o, "\nselection by {}:", sel.criterion);
    for (i, r) in sel.ranking.iter().enumerate() {
        let _ = writeln!(o, "  {}. {}: {}", i + 1, r.name, r.why);
    }
    match (&sel.recommended, &sel.refusal) {
        (Some(n), _) => {
            let _ = writeln!(o, "recommended: {n}");
        }
        (None, Some(why)) => {
            let _ = writeln!(o, "recommended: none ({why})");
        }
        _ => {}
    }
    for w in &analysis.warnings {
        let _ = writeln!(o, "warning {}: {}", w.code, w.message);
    }
    o
}
