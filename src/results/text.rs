//! The text view of an analysis: stable, readable, one fact per line, in the
//! design's report units, so that `git diff` of two revisions reads well.

use std::fmt::Write as _;

use crate::analysis::duty::PumpResult;
use crate::analysis::system::CaseSystem;
use crate::analysis::{Analysis, CaseResult};
use crate::display::{percent, Units};
use crate::model::Design;
use crate::numbers::{fixed, Fixed};
use crate::report::sections::summary::SUMMARY_CASES;

/// The text summary, whole.
pub fn to_text(design: &Design, analysis: &Analysis) -> String {
    let mut o = Sink::memory();
    text_into(&mut o, design, analysis);
    o.text
}

/// The text summary written to `out` as it is made, in pieces of about
/// [`Sink::PIECE`] bytes: the same bytes as [`to_text`], without holding a many-case
/// text whole (10 000 cases make 12 MB). The first write error ends the writing and is
/// returned.
pub fn write_text(
    out: &mut dyn std::io::Write,
    design: &Design,
    analysis: &Analysis,
) -> std::io::Result<()> {
    let mut o = Sink::writer(out);
    text_into(&mut o, design, analysis);
    o.finish()
}

/// Where the text goes: a string that, when it writes to a stream, is handed on in
/// pieces ([`Sink::pass_on`]) at the places that call for it (between the cases).
struct Sink<'a> {
    text: String,
    out: Option<&'a mut dyn std::io::Write>,
    error: Option<std::io::Error>,
}

impl<'a> Sink<'a> {
    /// About how much text is held before it is handed on, bytes.
    const PIECE: usize = 64 * 1024;

    fn memory() -> Sink<'a> {
        Sink {
            text: String::new(),
            out: None,
            error: None,
        }
    }

    fn writer(out: &'a mut dyn std::io::Write) -> Sink<'a> {
        Sink {
            text: String::with_capacity(Self::PIECE + Self::PIECE / 4),
            out: Some(out),
            error: None,
        }
    }

    /// Hands the text held on to the stream once it reaches [`Sink::PIECE`] (a string
    /// sink keeps it all).
    fn pass_on(&mut self) {
        if self.text.len() >= Self::PIECE {
            self.write_held();
        }
    }

    fn write_held(&mut self) {
        let Some(out) = self.out.as_mut() else { return };
        if self.error.is_none() {
            if let Err(e) = out.write_all(self.text.as_bytes()) {
                self.error = Some(e);
            }
        }
        self.text.clear();
    }

    /// Writes the rest and says whether every write succeeded.
    fn finish(mut self) -> std::io::Result<()> {
        self.write_held();
        match self.error {
            Some(e) => Err(e),
            None => Ok(()),
        }
    }
}

impl std::ops::Deref for Sink<'_> {
    type Target = String;
    fn deref(&self) -> &String {
        &self.text
    }
}

impl std::ops::DerefMut for Sink<'_> {
    fn deref_mut(&mut self) -> &mut String {
        &mut self.text
    }
}

fn text_into(o: &mut Sink, design: &Design, analysis: &Analysis) {
    let u = Units::new(design.project.units);
    header(o, design);
    let field = super::well_field_text::is_field(design);
    if analysis.cases.len() > SUMMARY_CASES {
        summarised_cases(o, design, analysis, &u);
    } else {
        for c in &analysis.cases {
            case(o, &u, c, None, field);
            o.pass_on();
        }
    }
    candidates(o, design, analysis);
    super::operation_text::operation(o, design, analysis);
    super::envelope_text::envelope(o, design, analysis);
    selection(o, design, analysis, &u);
    safety(o, analysis, &u);
    for w in &analysis.warnings {
        let _ = writeln!(o, "warning {}: {}", w.code, u.render(&w.message));
    }
}

/// One case in full: overrides, system, every candidate's duty and checks; `why` says
/// why a summarised design shows it.
fn case(o: &mut String, u: &Units, c: &CaseResult, why: Option<&str>, field: bool) {
    {
        let _ = writeln!(o, "\ncase {}", c.name);
        if let Some(why) = why {
            let _ = writeln!(o, "  governing: {why}");
        }
        for ov in &c.overrides {
            let _ = writeln!(o, "  override: {ov}");
        }
        let Some(s) = &c.system else {
            let _ = writeln!(
                o,
                "  error: {}",
                c.error.as_deref().unwrap_or("not analysed")
            );
            return;
        };
        if field {
            super::well_field_text::case_field(o, u, c, s);
        } else {
            case_system(o, u, c, s);
        }
        for r in &c.pumps {
            pump(o, u, r, s);
        }
    }
}

/// A design of more than [`SUMMARY_CASES`] cases (the package's threshold): the
/// governing cases in full (the package's choice, `report::sections::summary`), then
/// every case in one line per candidate — duty, efficiency, shaft power, NPSH ratio
/// and the checks counted by status with the first of the worst. The JSON keeps every
/// case's detail.
fn summarised_cases(o: &mut Sink, design: &Design, analysis: &Analysis, u: &Units) {
    let names: Vec<&str> = design.pumps.iter().map(|p| p.name.as_str()).collect();
    let kept = crate::report::sections::summary::governing(analysis);
    let _ = writeln!(
        o,
        "\nsummary: {} cases, more than {SUMMARY_CASES}: the {} governing cases in full, then every case in one line per candidate (results --format json has every case in full)",
        analysis.cases.len(),
        kept.len()
    );
    for g in &kept {
        if let Some(c) = analysis.cases.get(g.index) {
            let field = super::well_field_text::is_field(design);
            case(o, u, c, Some(&g.why(&names)), field);
        }
    }
    let (fl, hd, pw) = (u.flow(), u.head(), u.power());
    let _ = writeln!(
        o,
        "\nevery case (case candidate: flow at head, efficiency, shaft power, NPSHa/NPSHr, capacity at the limit; checks):"
    );
    for c in &analysis.cases {
        o.pass_on();
        let Some(s) = &c.system else {
            let _ = writeln!(
                o,
                "  {}: error: {}",
                c.name,
                c.error.as_deref().unwrap_or("not analysed")
            );
            continue;
        };
        let _ = writeln!(o, "  {}: static head {}", c.name, hd.fmt(s.static_head));
        for r in &c.pumps {
            let _ = write!(o, "  {} {}: ", c.name, r.name);
            match &r.duty {
                Some(d) => {
                    let _ = write!(o, "{} at {}", fl.fmt(d.flow), hd.fmt(d.head));
                    if let Some(e) = d.efficiency {
                        let _ = write!(o, ", {}", percent(e));
                    }
                    if let Some(p) = d.shaft_power {
                        let _ = write!(o, ", {}", pw.fmt(p));
                    }
                    if let Some(n) = d.npsh_required.filter(|n| *n > 0.0) {
                        let _ = write!(o, ", NPSH ratio {}", Fixed(d.npsh_available / n, 2));
                    }
                }
                None => o.push_str("no duty point"),
            }
            if let Some(q) = r.capacity_flow {
                let _ = write!(o, ", capacity {}", fl.fmt(q));
            }
            let _ = writeln!(o, "; {}", check_tally(&r.checks));
        }
    }
}

/// Checks counted by status, with the first check of the worst status that is not a
/// pass: "9 pass, 1 warn (operating-region)".
fn check_tally(checks: &[crate::analysis::checks::Check]) -> String {
    use crate::analysis::checks::Status;
    let mut out = Vec::new();
    for st in [Status::Pass, Status::Warn, Status::Fail] {
        let n = checks.iter().filter(|c| c.status == st).count();
        if n > 0 {
            out.push(format!("{n} {}", st.keyword()));
        }
    }
    let worst = [Status::Fail, Status::Warn]
        .into_iter()
        .find_map(|st| checks.iter().find(|c| c.status == st));
    let mut s = if out.is_empty() {
        "no checks".to_string()
    } else {
        out.join(", ")
    };
    if let Some(w) = worst {
        let _ = write!(s, " (first {}: {})", w.status.keyword(), w.id.as_str());
    }
    s
}

/// The project's lines: title, number, last revision, units.
fn header(o: &mut String, design: &Design) {
    let p = &design.project;
    let _ = writeln!(o, "dutyline results {}", crate::VERSION);
    let _ = writeln!(o, "project: {}", p.title);
    let _ = writeln!(o, "number: {}", p.number);
    if let Some(r) = design.revisions.last() {
        let _ = writeln!(o, "revision: {} {} {}", r.id, r.date, r.description);
    }
    let _ = writeln!(o, "units: {}", p.units.keyword());
}

/// A case's fluid (its properties at the case's temperature) and barometric pressure.
pub(super) fn fluid_and_barometric(o: &mut String, u: &Units, s: &CaseSystem) {
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
        u.absolute_pressure().fmt(s.fluid.vapor_pressure.pa())
    );
    let _ = writeln!(
        o,
        "  barometric pressure: {}",
        u.absolute_pressure().fmt(s.barometric.pa())
    );
}

/// One case's system: fluid, barometric pressure, static head, levels, segments and
/// the system curve (every third point).
fn case_system(o: &mut String, u: &Units, c: &CaseResult, s: &CaseSystem) {
    let (fl, hd, len, dia) = (u.flow(), u.head(), u.length(), u.diameter());
    fluid_and_barometric(o, u, s);
    let _ = writeln!(o, "  static head: {}", hd.fmt(s.static_head));
    let _ = writeln!(
        o,
        "  levels: source {}, destination {}, pump datum {}; surface pressures {} / {}; pipe condition {}",
        u.elevation().fmt(s.source_level.m()),
        u.elevation().fmt(s.destination_level.m()),
        u.elevation().fmt(s.centreline.m()),
        u.absolute_pressure().fmt(s.source_surface.pa()),
        u.absolute_pressure().fmt(s.destination_surface.pa()),
        s.pipe_condition.keyword()
    );
    for g in s.segments.iter() {
        let _ = writeln!(
            o,
            "  segment {} {}: {}, ID {}, length {}, {}",
            g.line,
            g.index + 1,
            crate::display::pipe(g.material, &g.size_label, g.inner_diameter, u),
            dia.fmt(g.inner_diameter),
            len.fmt(g.length),
            match g.hazen_williams_c {
                Some(cv) => format!("Hazen-Williams C {cv}"),
                None => format!(
                    "roughness {} (source: {})",
                    u.roughness().fmt(g.roughness),
                    crate::report::sections::sources::publication(
                        g.roughness_source.trim_start_matches("roughness: "),
                        u
                    )
                ),
            }
        );
    }
    let networked = s.network.is_some();
    let well = s.well.is_some();
    let _ = writeln!(
        o,
        "  system curve ({} | {} = static + friction + minor{}{}):",
        fl.label,
        hd.label,
        if networked { " + network" } else { "" },
        if well { " + drawdown" } else { "" }
    );
    for pt in c.system_curve.iter().step_by(3) {
        let _ = writeln!(
            o,
            "    {:>9} | {:>8} = {} + {} + {}{}{}",
            fl.num(pt.flow),
            hd.num(pt.head),
            hd.num(pt.static_head),
            hd.num(pt.friction),
            hd.num(pt.minor),
            if networked {
                format!(" + {}", hd.num(pt.network))
            } else {
                String::new()
            },
            if well {
                format!(" + {}", hd.num(pt.drawdown))
            } else {
                String::new()
            }
        );
    }
}

/// One pump of a case: its duty and what follows from it, or why there is none; its
/// checks and warnings.
fn pump(o: &mut String, u: &Units, r: &PumpResult, sys: &CaseSystem) {
    let (fl, hd, vel, dia) = (u.flow(), u.head(), u.velocity(), u.diameter());
    let _ = writeln!(
        o,
        "  pump {} at {} rpm{}:",
        r.name,
        Fixed(r.speed_rpm, 0),
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
            duty_detail(o, u, d, sys);
            if let (Some(v1), Some(v2)) = (d.suction_velocity, d.discharge_velocity) {
                let _ = writeln!(
                    o,
                    "    velocity suction / discharge: {} / {}",
                    vel.fmt(v1),
                    vel.fmt(v2)
                );
            }
            super::well_field_text::wells(o, u, r);
            if let Some(n) = &r.network {
                network_detail(o, u, n);
            }
        }
        None => {
            let _ = writeln!(
                o,
                "    {}",
                r.failure
                    .as_ref()
                    .map_or("no duty point".to_string(), |m| u.render(m))
            );
        }
    }
    if let Some(q) = r.capacity_flow {
        let _ = writeln!(o, "    capacity at the limit: {}", fl.fmt(q));
    }
    if let Some(e) = r.energy {
        let _ = writeln!(
            o,
            "    per year: {} h, {}, {}",
            Fixed(e.hours, 0),
            u.volume().fmt(e.volume_m3),
            u.energy().fmt(e.energy_j)
        );
    }
    for ch in &r.checks {
        let _ = writeln!(
            o,
            "    check {} {}: {}",
            ch.id,
            ch.status.keyword(),
            u.render(&ch.message.get())
        );
    }
    for w in &r.warnings {
        let _ = writeln!(o, "    warning: {}", u.render(w));
    }
}

/// The selection: the ranking with its basis, the recommendation or the refusal.
fn selection(o: &mut String, design: &Design, analysis: &Analysis, u: &Units) {
    let sel = &analysis.selection;
    let _ = writeln!(o, "\nselection by {}:", sel.criterion);
    let _ = writeln!(o, "  basis: {}", u.render(&sel.basis));
    for (i, r) in sel.ranking.iter().enumerate() {
        let _ = writeln!(o, "  {}. {}: {}", i + 1, r.name, r.why);
        if let Some(e) = &analysis.envelope {
            let j = design.pumps.iter().position(|p| p.name == r.name);
            let _ = writeln!(
                o,
                "     {}",
                e.standing(j.unwrap_or(usize::MAX), r.qualifies)
            );
        }
        if let Some(se) = r.specific_energy_j_m3 {
            let _ = writeln!(
                o,
                "     energy per volume {}{}",
                u.specific_energy().fmt(se),
                r.life_cost_per_m3
                    .map(|c| format!(
                        ", {} per volume {:.4} {} per {}",
                        if analysis.operation.is_empty() {
                            "life-cycle energy cost"
                        } else {
                            "life-cycle cost"
                        },
                        c * u.volume_per_cost_unit(),
                        design.energy.currency,
                        u.volume_cost_unit()
                    ))
                    .unwrap_or_default()
            );
        }
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
    if let Some(remark) = &sel.close_call {
        let _ = writeln!(o, "close call: {remark}");
    }
}

/// The pressure and surge screen: the checks that do not pass, per case (screening
/// estimates; the package has the full screen).
fn safety(o: &mut String, analysis: &Analysis, u: &Units) {
    use crate::analysis::checks::Status;
    let s = &analysis.safety;
    let Some(candidate) = &s.candidate else {
        return;
    };
    let _ = writeln!(o, "\npressure and surge screening (candidate {candidate}; screening estimates, not a transient analysis):");
    if s.cases.len() > SUMMARY_CASES {
        safety_tally(o, analysis, u);
        return;
    }
    let mut any = false;
    for c in &s.cases {
        for k in c.checks.iter().filter(|k| k.status != Status::Pass) {
            any = true;
            let _ = writeln!(
                o,
                "  {} {} {}: {}",
                c.case,
                k.id,
                k.status.keyword(),
                u.render(&k.message.get())
            );
        }
    }
    if !any {
        let _ = writeln!(o, "  every screen passes");
    }
}

/// The terms a reviewer recomputes at one duty.
fn duty_detail(o: &mut String, u: &Units, d: &crate::analysis::duty::Duty, sys: &CaseSystem) {
    let (hd, pw, fl, vel) = (u.head(), u.power(), u.flow(), u.velocity());
    let t = &d.npsh_terms;
    let _ = writeln!(
        o,
        "    NPSHa: {} = barometric {} + surface pressure {} + static suction {} + vapour pressure {} + suction friction {} + suction minor {}",
        hd.fmt(d.npsh_available),
        hd.num(t.barometric_head),
        hd.num(t.surface_pressure_head),
        hd.num(t.static_suction_head),
        hd.num(t.vapour_pressure_head),
        hd.num(t.suction_friction_head),
        hd.num(t.suction_minor_head)
    );
    if let Some(n) = d.npsh_required {
        let _ = writeln!(
            o,
            "    NPSHr (NPSH3): {}; margin ratio {}; excess {}",
            hd.fmt(n),
            if n > 0.0 {
                fixed(d.npsh_available / n, 2)
            } else {
                "—".to_string()
            },
            hd.fmt(d.npsh_available - n)
        );
    }
    if let Some(w) = &d.well {
        let _ = writeln!(
            o,
            "    well: pumping level {} = static {} − aquifer loss {} − well loss {}",
            u.elevation().fmt(w.pumping_level),
            u.elevation().num(w.static_level),
            hd.num(w.aquifer_loss),
            hd.num(w.well_loss)
        );
    }
    if let Some(st) = &d.station {
        let _ = writeln!(
            o,
            "    station piping per pump: {} each; own suction {}, own discharge {}; pump head {}",
            fl.fmt(st.flow_per_pump),
            hd.fmt(st.suction_head),
            hd.fmt(st.discharge_head),
            hd.fmt(d.head_per_pump)
        );
    }
    let _ = writeln!(o, "    hydraulic power: {}", pw.fmt(d.hydraulic_power));
    if let Some(sp) = d.shaft_power {
        let _ = writeln!(o, "    shaft power: {}", pw.fmt(sp));
    }
    if let Some(ip) = d.input_power {
        let _ = writeln!(
            o,
            "    input power: {} (motor {}, {})",
            pw.fmt(ip),
            percent(d.motor_efficiency),
            if d.drive_efficiency < 1.0 {
                format!("drive {}", percent(d.drive_efficiency))
            } else {
                "no drive".to_string()
            }
        );
    }
    if let (Some(se), Some(w)) = (d.specific_energy, d.wire_to_water_efficiency) {
        let _ = writeln!(
            o,
            "    energy per volume: {}; wire-to-water efficiency {}",
            u.specific_energy().fmt(se),
            percent(w)
        );
    }
    for g in &d.segments(sys) {
        let _ = writeln!(
            o,
            "    at duty, segment {} {}: {}, {}, Re {}, f {}, friction {}, minor {}, K {}",
            g.line,
            g.index + 1,
            fl.fmt(g.flow),
            vel.fmt(g.velocity),
            Fixed(g.reynolds, 0),
            g.friction_factor
                .map(|f| fixed(f, 5))
                .unwrap_or_else(|| "— (Hazen-Williams)".into()),
            hd.fmt(g.friction_head),
            hd.fmt(g.minor_head),
            if g.fittings_k.is_empty() {
                "—".to_string()
            } else {
                g.fittings_k
                    .iter()
                    .map(|k| fixed(*k, 4))
                    .collect::<Vec<_>>()
                    .join(", ")
            }
        );
    }
}

/// Per candidate: the motor, one pump alone, and the requirement × case matrix.
fn candidates(o: &mut String, design: &Design, analysis: &Analysis) {
    let u = Units::new(design.project.units);
    let (pw, fl) = (u.power(), u.flow());
    for (k, p) in design.pumps.iter().enumerate() {
        let _ = writeln!(o, "\ncandidate {}", p.name);
        if let Some(Some(m)) = analysis.motor_sizing.get(k) {
            let _ = writeln!(
                o,
                "  motor: {} per pump{}, service factor {}{}; efficiency {} ({})",
                m.choice.rating_label,
                if m.rating_stated { " (stated)" } else { "" },
                Fixed(m.choice.service_factor, 2),
                if m.variable_speed {
                    " (variable-frequency drive)"
                } else {
                    " (margin only)"
                },
                percent(m.efficiency),
                m.efficiency_source
            );
            let _ = writeln!(
                o,
                "  largest shaft power at duty: {} (case {}); to run-out at {} rpm: {} at {} per pump (case {}); {}",
                pw.fmt(m.max_operating_shaft_power),
                m.max_operating_case,
                Fixed(m.run_out_speed_rpm, 0),
                pw.fmt(m.run_out_shaft_power),
                fl.fmt(m.run_out_flow),
                m.run_out_case,
                if m.choice.non_overloading {
                    "non-overloading"
                } else {
                    "overloads towards run-out"
                }
            );
        }
        if let Some(Some(alone)) = analysis.one_alone.get(k) {
            let _ = writeln!(
                o,
                "  one pump alone {}: {}",
                alone.check.status.keyword(),
                u.render(&alone.check.message.get())
            );
        }
        if analysis.cases.len() > SUMMARY_CASES {
            capacity_range(o, analysis, k, &u);
            continue;
        }
        let caps: Vec<String> = analysis
            .cases
            .iter()
            .enumerate()
            .map(|(i, c)| {
                let q = analysis
                    .capacity
                    .get(k)
                    .and_then(|r| r.get(i))
                    .copied()
                    .flatten();
                format!(
                    "{} {}",
                    c.name,
                    q.map(|q| fl.fmt(q)).unwrap_or_else(|| "—".into())
                )
            })
            .collect();
        let _ = writeln!(o, "  capacity at the limit: {}", caps.join("; "));
    }
    for row in &analysis.requirement_matrix {
        if analysis.cases.len() > SUMMARY_CASES {
            requirement_tally(o, design, analysis, row, &u);
            continue;
        }
        let cells: Vec<String> = analysis
            .cases
            .iter()
            .enumerate()
            .filter(|(i, _)| row.applies.get(*i).copied().unwrap_or(false))
            .map(|(i, c)| {
                let st: Vec<String> = design
                    .pumps
                    .iter()
                    .enumerate()
                    .map(|(k, p)| {
                        let s = row.status.get(k).and_then(|r| r.get(i)).copied().flatten();
                        format!("{} {}", p.name, s.map(|s| s.keyword()).unwrap_or("—"))
                    })
                    .collect();
                format!("{}: {}", c.name, st.join(", "))
            })
            .collect();
        let _ = writeln!(
            o,
            "requirement {}: {}",
            u.render(&row.text),
            cells.join("; ")
        );
    }
}

/// The network at a duty point: every node (head, pressure, flags) and link.
fn network_detail(o: &mut String, u: &Units, n: &crate::analysis::network::station::NetworkAtDuty) {
    let (fl, hd, pr, vel) = (u.flow(), u.head(), u.gauge_pressure(), u.velocity());
    if let Some(scale) = n.demand_scale {
        let _ = writeln!(
            o,
            "    demands: the design demands {} scaled by {scale:.4} to the duty (no downstream tank)",
            fl.fmt(n.station_flow / scale)
        );
    }
    for x in &n.nodes {
        let mut flags = Vec::new();
        if x.below_required {
            flags.push("BELOW REQUIRED");
        }
        if x.below_atmospheric {
            flags.push("BELOW ATMOSPHERIC");
        }
        if x.near_vapour {
            flags.push("NEAR VAPOUR PRESSURE");
        }
        let _ = writeln!(
            o,
            "    node {} ({}): elevation {}, head {}, pressure {}{}{}{}{}",
            x.name,
            x.kind,
            u.elevation().fmt(x.elevation),
            hd.fmt(x.head),
            pr.fmt(x.pressure),
            if x.demand > 0.0 {
                format!(", demand {}", fl.fmt(x.demand))
            } else {
                String::new()
            },
            x.inflow
                .map(|q| format!(", inflow {}", fl.fmt(q)))
                .unwrap_or_default(),
            x.required_pressure
                .map(|r| format!(", required {}", pr.fmt(r)))
                .unwrap_or_default(),
            if flags.is_empty() {
                String::new()
            } else {
                format!(" [{}]", flags.join(", "))
            }
        );
    }
    for l in &n.links {
        let _ = writeln!(
            o,
            "    link {} ({}, {} to {}): flow {}{}, head loss {}{}",
            l.name,
            l.kind,
            l.from,
            l.to,
            fl.fmt(l.flow),
            l.velocity
                .map(|v| format!(", velocity {}", vel.fmt(v)))
                .unwrap_or_default(),
            hd.fmt(l.head_loss),
            if l.closed { " [closed]" } else { "" }
        );
    }
}

/// A summarised design's capacity at the limit: the smallest and largest over the
/// cases, with the case of each.
fn capacity_range(o: &mut String, analysis: &Analysis, k: usize, u: &Units) {
    let fl = u.flow();
    let caps = analysis.capacity.get(k);
    let mut least: Option<(usize, f64)> = None;
    let mut most: Option<(usize, f64)> = None;
    let mut none = 0usize;
    for i in 0..analysis.cases.len() {
        match caps.and_then(|r| r.get(i)).copied().flatten() {
            Some(q) if q.is_finite() => {
                if least.is_none_or(|(_, b)| q < b) {
                    least = Some((i, q));
                }
                if most.is_none_or(|(_, b)| q > b) {
                    most = Some((i, q));
                }
            }
            _ => none += 1,
        }
    }
    let name = |i: usize| analysis.cases.get(i).map_or("?", |c| c.name.as_str());
    if let (Some((a, qa)), Some((b, qb))) = (least, most) {
        let _ = write!(
            o,
            "  capacity at the limit: smallest {} (case {}), largest {} (case {})",
            fl.fmt(qa),
            name(a),
            fl.fmt(qb),
            name(b)
        );
    } else {
        o.push_str("  capacity at the limit: —");
    }
    if none > 0 {
        let _ = write!(
            o,
            "; none in {}",
            crate::display::count(none, "case", "cases")
        );
    }
    o.push('\n');
}

/// A summarised design's requirement: per candidate the cases counted by status and
/// the first case of the worst.
fn requirement_tally(
    o: &mut String,
    design: &Design,
    analysis: &Analysis,
    row: &crate::analysis::capacity::RequirementRow,
    u: &Units,
) {
    use crate::analysis::checks::Status;
    let cells: Vec<String> = design
        .pumps
        .iter()
        .enumerate()
        .map(|(k, p)| {
            let statuses: Vec<(usize, Option<Status>)> = (0..analysis.cases.len())
                .filter(|i| row.applies.get(*i).copied().unwrap_or(false))
                .map(|i| {
                    (
                        i,
                        row.status.get(k).and_then(|r| r.get(i)).copied().flatten(),
                    )
                })
                .collect();
            let mut parts = Vec::new();
            for st in [
                Some(Status::Pass),
                Some(Status::Warn),
                Some(Status::Fail),
                None,
            ] {
                let n = statuses.iter().filter(|(_, s)| *s == st).count();
                if n > 0 {
                    parts.push(format!("{n} {}", st.map_or("—", |s| s.keyword())));
                }
            }
            let worst = [Some(Status::Fail), None, Some(Status::Warn)]
                .into_iter()
                .find_map(|st| statuses.iter().find(|(_, s)| *s == st));
            let first = worst
                .and_then(|(i, _)| analysis.cases.get(*i))
                .map(|c| format!(" (first {})", c.name))
                .unwrap_or_default();
            format!("{} {}{first}", p.name, parts.join(", "))
        })
        .collect();
    let _ = writeln!(
        o,
        "requirement {}: {}",
        u.render(&row.text),
        cells.join("; ")
    );
}

/// A summarised design's pressure and surge screen: each check that does not pass,
/// counted over the cases, with the first case's message.
fn safety_tally(o: &mut String, analysis: &Analysis, u: &Units) {
    use crate::analysis::checks::Status;
    let mut seen: Vec<(&str, Status, usize, String)> = Vec::new();
    for c in &analysis.safety.cases {
        for k in c.checks.iter().filter(|k| k.status != Status::Pass) {
            let id = k.id.as_str();
            if let Some(x) = seen.iter_mut().find(|x| x.0 == id && x.1 == k.status) {
                x.2 += 1;
            } else {
                let first = format!("first {}: {}", c.case, u.render(&k.message.get()));
                seen.push((id, k.status, 1, first));
            }
        }
    }
    if seen.is_empty() {
        let _ = writeln!(o, "  every screen passes");
    }
    for (id, st, n, first) in seen {
        let _ = writeln!(
            o,
            "  {id} {} in {}; {first}",
            st.keyword(),
            crate::display::count(n, "case", "cases")
        );
    }
}
